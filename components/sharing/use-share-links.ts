"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { shareLinkKeys } from "./keys";
import type { ShareLinkDto } from "./types";

/** The take's share links (editors). */
export function useShareLinks(takeId: string, enabled = true) {
  return useQuery({
    queryKey: shareLinkKeys.list(takeId),
    queryFn: () => apiFetch<{ shareLinks: ShareLinkDto[] }>(`/api/v1/takes/${takeId}/share-links`).then((r) => r.shareLinks),
    enabled,
  });
}
