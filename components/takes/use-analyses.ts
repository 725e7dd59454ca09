"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import { isRunning, type AnalysisDto } from "./types";

/** Every analysis of a take, newest first; polls while one of them runs. */
export function useAnalyses(takeId: string) {
  return useQuery({
    queryKey: takeKeys.analyses(takeId),
    queryFn: () => apiFetch<{ analyses: AnalysisDto[] }>(`/api/v1/takes/${takeId}/analyses`).then((r) => r.analyses),
    refetchInterval: (query) => (query.state.data?.some(isRunning) ? 1000 : false),
  });
}
