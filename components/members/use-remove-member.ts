"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { memberKeys } from "@/lib/client/query-keys";

export function useRemoveMember() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (memberId: string) => apiFetch<void>(`/api/v1/members/${memberId}`, { method: "DELETE" }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: memberKeys.list() }),
  });
}
