"use client";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { reportKeys } from "./keys";
import type { TuningReportDto } from "./types";

/** The take's tuning report, at the take's own reference pitch (null) or at the one asked for. */
export function useTuningReport(takeId: string, referenceHz: number | null) {
  return useQuery({
    queryKey: reportKeys.report(takeId, referenceHz),
    queryFn: () =>
      apiFetch<TuningReportDto>(
        `/api/v1/takes/${takeId}/tuning-report${referenceHz === null ? "" : `?referenceHz=${encodeURIComponent(referenceHz)}`}`,
      ),
    // keep the last report on screen while another reference pitch loads
    placeholderData: keepPreviousData,
  });
}
