"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { commentKeys } from "./keys";
import type { CommentDto } from "./types";

/** Deletes a comment (its author, or an editor). */
export function useDeleteComment(takeId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (commentId: string) => apiFetch<void>(`/api/v1/comments/${commentId}`, { method: "DELETE" }),
    onSuccess: (_d, commentId) => {
      queryClient.setQueryData<CommentDto[]>(commentKeys.list(takeId), (list) => list?.filter((c) => c.id !== commentId && c.parentId !== commentId));
      return queryClient.invalidateQueries({ queryKey: commentKeys.list(takeId) });
    },
  });
}
