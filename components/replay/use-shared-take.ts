"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import type { CommentDto } from "@/components/comments/types";
import type { CurveNote, TuningReportDto } from "@/components/report/types";

export type SharedTakeDto = {
  take: { name: string; durationSec: number };
  referenceHz: number;
  notes: CurveNote[];
  report: TuningReportDto | null;
  comments: CommentDto[];
};

export const sharedKeys = { take: (token: string) => ["shared", token] as const };

/** A take behind a share link (no account); 404 when the link expired, was withdrawn or never existed. */
export function useSharedTake(token: string) {
  return useQuery({
    queryKey: sharedKeys.take(token),
    queryFn: () => apiFetch<SharedTakeDto>(`/api/v1/shared/${encodeURIComponent(token)}`),
  });
}
