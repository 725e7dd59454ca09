"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import { isRunning, type TakeDto } from "./types";

/** The takes of a project; polls every second while any analysis is queued or analysing. */
export function useTakes(projectId: string) {
  return useQuery({
    queryKey: takeKeys.list(projectId),
    queryFn: () => apiFetch<{ takes: TakeDto[] }>(`/api/v1/projects/${projectId}/takes`).then((r) => r.takes),
    refetchInterval: (query) => (query.state.data?.some((t) => isRunning(t.analysis)) ? 1000 : false),
  });
}
