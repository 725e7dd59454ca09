"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import type { SettingsInput } from "@/lib/engine/settings";
import type { AnalysisDto } from "./types";

/** Starts a new analysis of a take with other settings; the earlier ones are kept. */
export function useReanalyse(takeId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (settings: SettingsInput) =>
      apiFetch<{ analysis: AnalysisDto }>(`/api/v1/takes/${takeId}/analyses`, { method: "POST", json: { settings } }).then(
        (r) => r.analysis,
      ),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: takeKeys.detail(takeId) }),
        queryClient.invalidateQueries({ queryKey: takeKeys.analyses(takeId) }),
        queryClient.invalidateQueries({ queryKey: [...takeKeys.all, "list"] }),
      ]),
  });
}
