"use client";
import type { ReactNode } from "react";
import { Mono } from "@/components/ui";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatClock } from "@/components/report/format";
import { threadComments, type CommentDto, type CommentTarget } from "./types";

const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });

/** Where a comment points: the whole take, a note, or a time range. */
export function describeTarget(target: CommentTarget): string {
  if (target.kind === "note") return `Note ${midiToNoteName(target.pitch)} at ${formatClock(target.onsetSec)}`;
  if (target.kind === "range") return `${formatClock(target.startSec)}–${formatClock(target.endSec)}`;
  return "Whole take";
}

/** The start time a comment points at, or null for the whole take. */
export function targetStartSec(target: CommentTarget): number | null {
  return target.kind === "note" ? target.onsetSec : target.kind === "range" ? target.startSec : null;
}

function TargetChip({ target, onSeek }: { target: CommentTarget; onSeek?: (sec: number) => void }) {
  const start = targetStartSec(target);
  const text = describeTarget(target);
  const cls = "inline-flex items-center rounded-full border border-rule bg-paper px-2 py-0.5 text-xs";
  if (start !== null && onSeek)
    return (
      <button type="button" className={`${cls} hover:border-copper`} onClick={() => onSeek(start)} title="Play from here">
        <Mono>{text}</Mono>
      </button>
    );
  return <span className={cls}>{target.kind === "take" ? text : <Mono>{text}</Mono>}</span>;
}

function CommentItem({ comment, actions }: { comment: CommentDto; actions?: ReactNode }) {
  return (
    <div className="min-w-0" data-testid="comment" data-comment-id={comment.id}>
      <p className="flex flex-wrap items-baseline gap-x-2 text-sm">
        <span className="font-semibold">{comment.author.name}</span>
        <time dateTime={comment.createdAt} className="text-xs text-ink-muted">{dateFormat.format(new Date(comment.createdAt))}</time>
      </p>
      <p className="mt-1 text-[0.9375rem] whitespace-pre-wrap break-words">{comment.body}</p>
      {actions ? <div className="mt-1 flex gap-2">{actions}</div> : null}
    </div>
  );
}

/**
 * The take's comments as threads, oldest first. Read-only unless `renderActions` and
 * `renderReply` are given (the signed-in replay page); `onSeek` lets a target chip move the playhead.
 */
export function CommentList({
  comments,
  onSeek,
  renderActions,
  renderReply,
}: {
  comments: CommentDto[];
  onSeek?: (sec: number) => void;
  renderActions?: (comment: CommentDto) => ReactNode;
  renderReply?: (thread: CommentDto) => ReactNode;
}) {
  const threads = threadComments(comments);
  return (
    <ol className="space-y-4" aria-label="Comments">
      {threads.map(({ comment, replies }) => (
        <li key={comment.id} className="rounded-md border border-rule bg-surface px-4 py-3" data-testid="comment-thread">
          <div className="mb-1.5"><TargetChip target={comment.target} onSeek={onSeek} /></div>
          <CommentItem comment={comment} actions={renderActions?.(comment)} />
          {replies.length > 0 ? (
            <ol className="mt-3 space-y-3 border-l-2 border-rule pl-4" aria-label="Replies">
              {replies.map((r) => (
                <li key={r.id}>
                  <CommentItem comment={r} actions={renderActions?.(r)} />
                </li>
              ))}
            </ol>
          ) : null}
          {renderReply ? <div className="mt-3">{renderReply(comment)}</div> : null}
        </li>
      ))}
    </ol>
  );
}
