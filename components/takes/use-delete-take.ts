"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import type { TakeDto } from "./types";

/** Deletes a take for good: its files, analyses, drafts and revisions. */
export function useDeleteTake() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (takeId: string) => apiFetch<void>(`/api/v1/takes/${takeId}`, { method: "DELETE" }),
    onSuccess: (_data, takeId) => {
      // Drop it from every cached list at once, so no page shows it again while refetching.
      queryClient.setQueriesData<TakeDto[]>({ queryKey: [...takeKeys.all, "list"] }, (takes) => takes?.filter((t) => t.id !== takeId));
      queryClient.removeQueries({ queryKey: takeKeys.detail(takeId) });
      queryClient.removeQueries({ queryKey: takeKeys.notes(takeId) });
      queryClient.removeQueries({ queryKey: takeKeys.analyses(takeId) });
      return queryClient.invalidateQueries({ queryKey: [...takeKeys.all, "list"] });
    },
  });
}
