"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { editorKeys } from "./keys";

export type RevisionDto = { number: number; noteCount: number; createdAt: string; createdBy: string | null };

/** The take's saved revisions, newest first (`GET /api/v1/takes/{id}/revisions`). */
export function useRevisionList(takeId: string) {
  return useQuery({
    queryKey: editorKeys.revisions(takeId),
    queryFn: () => apiFetch<{ revisions: RevisionDto[] }>(`/api/v1/takes/${takeId}/revisions`).then((r) => r.revisions),
  });
}
