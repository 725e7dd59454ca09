import type { z } from "zod";
import type { commentTargetSchema } from "@/lib/schemas/comments";

export type CommentTarget = z.output<typeof commentTargetSchema>;

/** A comment as `GET /api/v1/takes/{takeId}/comments` gives it (a flat list, oldest first). */
export type CommentDto = {
  id: string;
  parentId: string | null;
  author: { name: string };
  body: string;
  target: CommentTarget;
  createdAt: string;
  mine: boolean;
};

export type CommentThread = { comment: CommentDto; replies: CommentDto[] };

/** Top-level comments with their replies, both oldest first; a reply whose parent is gone stands alone. */
export function threadComments(comments: CommentDto[]): CommentThread[] {
  const byId = new Map(comments.map((c) => [c.id, c]));
  const threads = new Map<string, CommentThread>();
  for (const c of comments) if (!c.parentId || !byId.has(c.parentId)) threads.set(c.id, { comment: c, replies: [] });
  for (const c of comments) {
    if (!c.parentId || !byId.has(c.parentId)) continue;
    // replies to replies join the top of their thread
    let root = byId.get(c.parentId)!;
    while (root.parentId && byId.has(root.parentId)) root = byId.get(root.parentId)!;
    threads.get(root.id)?.replies.push(c);
  }
  return [...threads.values()];
}
