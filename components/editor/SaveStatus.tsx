"use client";
import { Button, Mono, Spinner, cx } from "@/components/ui";
import type { SaveStatus as Status } from "@/lib/editor";

/** Saved / unsaved / saving / failed (with the message and Retry) / conflict, announced politely. */
export function SaveStatus({ status, revision, error, onRetry }: { status: Status; revision: number; error: string | null; onRetry: () => void }) {
  return (
    <div data-testid="save-status" data-state={status} data-revision={revision} className="flex min-h-8 items-center gap-2 text-sm" role="status" aria-live="polite">
      <span aria-hidden="true" className={cx("inline-block size-2 rounded-full", status === "saved" ? "bg-voice-teal" : status === "failed" || status === "conflict" ? "bg-danger" : "bg-copper")} />
      {status === "saved" ? (
        <span>{revision === 0 ? "The analysis's draft — no changes yet" : <>Saved as revision <Mono>{revision}</Mono></>}</span>
      ) : status === "unsaved" ? (
        <span>Unsaved changes…</span>
      ) : status === "saving" ? (
        <span className="flex items-center gap-1.5">
          <Spinner size="sm" /> Saving…
        </span>
      ) : status === "conflict" ? (
        <span className="font-medium">Not saved: someone else saved a newer revision</span>
      ) : (
        <>
          <span className="text-danger">
            <span className="font-medium">Not saved.</span> {error}
          </span>
          <Button size="sm" variant="secondary" onClick={onRetry}>
            Retry
          </Button>
        </>
      )}
    </div>
  );
}
