"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { assignmentKeys } from "./keys";

/** Removes the take's assignment. */
export function useDeleteAssignment(takeId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch<void>(`/api/v1/takes/${takeId}/assignment`, { method: "DELETE" }),
    onSuccess: () => {
      queryClient.setQueryData(assignmentKeys.detail(takeId), null);
      return queryClient.invalidateQueries({ queryKey: assignmentKeys.detail(takeId) });
    },
  });
}
