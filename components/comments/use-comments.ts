"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { commentKeys } from "./keys";
import type { CommentDto } from "./types";

/** The take's comments, oldest first. */
export function useComments(takeId: string) {
  return useQuery({
    queryKey: commentKeys.list(takeId),
    queryFn: () => apiFetch<{ comments: CommentDto[] }>(`/api/v1/takes/${takeId}/comments`).then((r) => r.comments),
  });
}
