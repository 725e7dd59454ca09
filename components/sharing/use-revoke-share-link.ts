"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { shareLinkKeys } from "./keys";
import type { ShareLinkDto } from "./types";

/** Withdraws a share link: it opens nothing from then on. */
export function useRevokeShareLink(takeId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => apiFetch<void>(`/api/v1/share-links/${id}`, { method: "DELETE" }),
    onSuccess: (_d, id) => {
      queryClient.setQueryData<ShareLinkDto[]>(shareLinkKeys.list(takeId), (links) => links?.filter((l) => l.id !== id));
      return queryClient.invalidateQueries({ queryKey: shareLinkKeys.list(takeId) });
    },
  });
}
