"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { shareLinkKeys } from "./keys";
import type { ShareLinkDto } from "./types";

/** Creates a read-only link; its URL (with the token) comes back this once. */
export function useCreateShareLink(takeId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (expiresInDays: number) =>
      apiFetch<{ shareLink: ShareLinkDto; url: string }>(`/api/v1/takes/${takeId}/share-links`, { method: "POST", json: { expiresInDays } }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: shareLinkKeys.list(takeId) }),
  });
}
