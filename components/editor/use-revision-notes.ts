"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import type { CurveNotesDto } from "@/components/report/types";
import { editorKeys } from "./keys";

/** One saved revision's notes with their pitch curves (a revision never changes, so it is cached for good). */
export function useRevisionNotes(takeId: string, revision: number | null) {
  return useQuery({
    queryKey: editorKeys.revisionNotes(takeId, revision ?? -1),
    enabled: revision !== null && revision > 0,
    staleTime: Infinity,
    queryFn: () => apiFetch<CurveNotesDto>(`/api/v1/takes/${takeId}/notes?revision=${revision}&curves=1`),
  });
}
