"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import type { AnalysisDto } from "./types";

/** Cancels a queued or running analysis. */
export function useCancelAnalysis() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (analysisId: string) =>
      apiFetch<{ analysis: AnalysisDto }>(`/api/v1/analyses/${analysisId}/cancel`, { method: "POST" }).then((r) => r.analysis),
    onSuccess: (analysis) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: takeKeys.detail(analysis.takeId) }),
        queryClient.invalidateQueries({ queryKey: takeKeys.analyses(analysis.takeId) }),
        queryClient.invalidateQueries({ queryKey: [...takeKeys.all, "list"] }),
      ]),
  });
}
