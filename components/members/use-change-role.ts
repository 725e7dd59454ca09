"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { memberKeys } from "@/lib/client/query-keys";
import type { Role } from "@/lib/auth/permissions";

export function useChangeRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: Role }) =>
      apiFetch(`/api/v1/members/${memberId}`, { method: "PATCH", json: { role } }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: memberKeys.list() }),
  });
}
