"use client";
import { useQuery } from "@tanstack/react-query";
import { ApiClientError, apiFetch } from "@/lib/client/api";
import { reportKeys } from "./keys";
import type { CurveNotesDto } from "./types";

/** The take's notes with their pitch curves; null while the take has no notes yet. */
export function useCurveNotes(takeId: string) {
  return useQuery({
    queryKey: reportKeys.curves(takeId),
    queryFn: () =>
      apiFetch<CurveNotesDto>(`/api/v1/takes/${takeId}/notes?curves=1`).catch((e) => {
        if (e instanceof ApiClientError && e.status === 404) return null;
        throw e;
      }),
  });
}
