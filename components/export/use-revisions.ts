"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";

export type RevisionInfo = { number: number; noteCount: number; createdAt: string };

export function useRevisions(takeId: string, enabled: boolean) {
  return useQuery({
    queryKey: ["takes", takeId, "revisions"],
    enabled,
    queryFn: () => apiFetch<{ revisions: RevisionInfo[] }>(`/api/v1/takes/${takeId}/revisions`).then((r) => r.revisions),
  });
}
