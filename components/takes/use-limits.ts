"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { limitsKeys } from "@/lib/client/query-keys";
import type { LimitsDto } from "./types";

/** Upload limits (size, length, accepted types); they change only with the server's config. */
export function useLimits() {
  return useQuery({
    queryKey: limitsKeys.current,
    queryFn: () => apiFetch<LimitsDto>("/api/v1/limits"),
    staleTime: Infinity,
  });
}
