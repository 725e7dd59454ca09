"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { memberKeys } from "@/lib/client/query-keys";

export function useRevokeInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => apiFetch<void>(`/api/v1/invitations/${invitationId}`, { method: "DELETE" }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: memberKeys.invitations() }),
  });
}
