"use client";
import { useState } from "react";
import { Alert, Button, ConfirmDialog, EmptyState, Spinner } from "@/components/ui";
import { CommentList } from "./CommentList";
import { NewCommentForm, ReplyForm, type PickableNote } from "./CommentForm";
import { useComments } from "./use-comments";
import { useDeleteComment } from "./use-delete-comment";

/**
 * The comments of a take for signed-in members: teachers (editors) start comments on the
 * take, a range or a note; everyone who can read the take replies; authors and editors delete.
 */
export function CommentsPanel({
  takeId,
  notes,
  canComment,
  canModerate,
  canReply = true,
  onSeek,
}: {
  takeId: string;
  notes: PickableNote[];
  /** May start a new comment (editors and owners). */
  canComment: boolean;
  /** May delete anyone's comment (editors and owners). */
  canModerate: boolean;
  canReply?: boolean;
  onSeek?: (sec: number) => void;
}) {
  const comments = useComments(takeId);
  const remove = useDeleteComment(takeId);
  const [replyTo, setReplyTo] = useState<string | null>(null);
  const [deleting, setDeleting] = useState<string | null>(null);
  const [deleteError, setDeleteError] = useState<string | null>(null);

  return (
    <div className="space-y-5">
      {comments.isPending ? (
        <div className="flex items-center gap-2 text-sm text-ink-muted"><Spinner size="sm" label="Loading the comments" /> Loading the comments…</div>
      ) : comments.isError ? (
        <Alert tone="error" title="The comments could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => comments.refetch()}>Try again</Button>}>
          {comments.error.message}
        </Alert>
      ) : comments.data.length === 0 ? (
        <EmptyState title="No comments yet" description={canComment ? "Comment on the whole take, a stretch of it or one note." : "Your teacher’s comments appear here."} />
      ) : (
        <CommentList
          comments={comments.data}
          onSeek={onSeek}
          renderActions={(c) =>
            c.mine || canModerate ? (
              <Button size="sm" variant="ghost" className="-ml-3 text-ink-muted" onClick={() => { setDeleteError(null); setDeleting(c.id); }}>
                Delete
              </Button>
            ) : null
          }
          renderReply={
            canReply
              ? (c) =>
                  replyTo === c.id ? (
                    <ReplyForm takeId={takeId} parentId={c.id} onDone={() => setReplyTo(null)} />
                  ) : (
                    <Button size="sm" variant="secondary" onClick={() => setReplyTo(c.id)}>Reply</Button>
                  )
              : undefined
          }
        />
      )}
      {canComment ? (
        <div className="border-t border-rule pt-4">
          <h3 className="mb-2 text-sm font-semibold">New comment</h3>
          <NewCommentForm takeId={takeId} notes={notes} />
        </div>
      ) : null}
      <ConfirmDialog
        open={deleting !== null}
        title="Delete this comment?"
        message={
          <>
            The comment and its replies are removed for everyone.
            {deleteError ? <span className="mt-2 block text-danger" role="alert">{deleteError}</span> : null}
          </>
        }
        confirmLabel="Delete comment"
        danger
        busy={remove.isPending}
        onCancel={() => setDeleting(null)}
        onConfirm={async () => {
          try {
            await remove.mutateAsync(deleting!);
            setDeleting(null);
          } catch (e) {
            setDeleteError(e instanceof Error ? e.message : "Deleting failed.");
          }
        }}
      />
    </div>
  );
}
