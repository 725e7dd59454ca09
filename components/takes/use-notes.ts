"use client";
import { useQuery } from "@tanstack/react-query";
import { ApiClientError, apiFetch } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import type { TakeNotesDto } from "./types";

/** The notes of a take (latest revision, else latest ready draft); null while there are none yet. */
export function useNotes(takeId: string) {
  return useQuery({
    queryKey: takeKeys.notes(takeId),
    queryFn: () =>
      apiFetch<TakeNotesDto>(`/api/v1/takes/${takeId}/notes`).catch((e) => {
        if (e instanceof ApiClientError && e.status === 404) return null;
        throw e;
      }),
  });
}
