"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { apiKeyKeys } from "@/lib/client/query-keys";
import type { ApiKeyDto } from "./types";

export function useApiKeys(enabled = true) {
  return useQuery({
    queryKey: apiKeyKeys.list(),
    queryFn: () => apiFetch<{ apiKeys: ApiKeyDto[] }>("/api/v1/api-keys").then((r) => r.apiKeys),
    enabled,
  });
}
