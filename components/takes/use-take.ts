"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import { isRunning, type AnalysisDto, type TakeDto } from "./types";

/** One take with its latest analysis; polls every second while that analysis runs. */
export function useTake(takeId: string) {
  return useQuery({
    queryKey: takeKeys.detail(takeId),
    queryFn: () => apiFetch<{ take: TakeDto; analysis: AnalysisDto | null }>(`/api/v1/takes/${takeId}`),
    refetchInterval: (query) => (isRunning(query.state.data?.analysis) ? 1000 : false),
  });
}
