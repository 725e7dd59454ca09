"use client";
import { useQuery } from "@tanstack/react-query";
import { ApiClientError, apiFetch } from "@/lib/client/api";
import { assignmentKeys } from "./keys";
import type { AssignmentDto } from "./types";

/** The take's assignment and how the take compares with it; null when it has none. */
export function useAssignment(takeId: string) {
  return useQuery({
    queryKey: assignmentKeys.detail(takeId),
    queryFn: () =>
      apiFetch<AssignmentDto>(`/api/v1/takes/${takeId}/assignment`).catch((e) => {
        if (e instanceof ApiClientError && e.status === 404) return null;
        throw e;
      }),
  });
}
