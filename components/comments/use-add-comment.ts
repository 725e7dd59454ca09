"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { commentKeys } from "./keys";
import type { CommentDto, CommentTarget } from "./types";

export type NewComment = { body: string; target?: CommentTarget; parentId?: string };

/** Adds a comment (editors) or a reply (everyone who can read the take). */
export function useAddComment(takeId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NewComment) => apiFetch<{ comment: CommentDto }>(`/api/v1/takes/${takeId}/comments`, { method: "POST", json: input }).then((r) => r.comment),
    onSuccess: (comment) => {
      queryClient.setQueryData<CommentDto[]>(commentKeys.list(takeId), (list) => (list ? [...list, comment] : [comment]));
      return queryClient.invalidateQueries({ queryKey: commentKeys.list(takeId) });
    },
  });
}
