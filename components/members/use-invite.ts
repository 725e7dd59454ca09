"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { memberKeys } from "@/lib/client/query-keys";
import type { InviteInput } from "@/lib/schemas/members";

export function useInvite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteInput) => apiFetch("/api/v1/invitations", { method: "POST", json: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.invitations() }),
  });
}
