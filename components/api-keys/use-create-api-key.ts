"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { apiKeyKeys } from "@/lib/client/query-keys";
import type { ApiKeyDto, CreateApiKeyInput } from "./types";

/** Creates a key; the answer holds the full key, which is never shown again. */
export function useCreateApiKey() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateApiKeyInput) =>
      apiFetch<{ apiKey: ApiKeyDto; key: string }>("/api/v1/api-keys", { method: "POST", json: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: apiKeyKeys.all }),
  });
}
