"use client";
import { useMemo } from "react";
import { Button, Mono, Spinner } from "@/components/ui";
import { dateTimeFormat } from "@/components/takes/format";
import { diffNotes, type NoteList } from "@/lib/editor";
import { DiffSummary } from "./DiffSummary";
import type { RevisionDto } from "./use-revision-list";
import type { TheirSide } from "./use-save-queue";

/**
 * A 409: someone saved a newer revision while these edits waited. Both sides, what differs, and
 * the choice — nothing is overwritten until the user picks one.
 */
export function ConflictPanel({
  mine,
  myBase,
  theirs,
  theirInfo,
  who,
  showTheirs,
  onShowTheirs,
  onKeepMine,
  onTakeTheirs,
  onReload,
}: {
  mine: NoteList;
  myBase: number;
  theirs: TheirSide | null;
  theirInfo: RevisionDto | undefined;
  who: (userId: string | null) => string;
  showTheirs: boolean;
  onShowTheirs: (show: boolean) => void;
  onKeepMine: () => void;
  onTakeTheirs: () => void;
  onReload: () => void;
}) {
  const ready = theirs?.state === "ready" ? theirs : null;
  const diff = useMemo(() => (ready ? diffNotes(ready.notes, mine) : null), [ready, mine]);
  return (
    <section role="alert" aria-labelledby="conflict-title" data-testid="conflict" className="rounded-lg border-2 border-copper/60 bg-copper/[0.05] p-4">
      <h3 id="conflict-title" className="font-semibold text-ink">
        {ready ? <>Revision <Mono>{ready.revision}</Mono> was saved while you were editing</> : "A newer revision was saved while you were editing"}
      </h3>
      <p className="mt-1 text-sm text-ink-muted">
        Your changes started from {myBase === 0 ? "the draft" : <>revision <Mono>{myBase}</Mono></>} and are not saved yet. Nothing is overwritten until you choose.
      </p>
      {theirs === null || theirs.state === "loading" ? (
        <p className="mt-3 flex items-center gap-2 text-sm"><Spinner size="sm" /> Loading the newest revision…</p>
      ) : theirs.state === "error" ? (
        <p className="mt-3 flex items-center gap-2 text-sm text-danger">
          The newest revision could not be loaded: {theirs.message}
          <Button size="sm" variant="secondary" onClick={onReload}>Try again</Button>
        </p>
      ) : (
        <>
          <div className="mt-3 grid gap-3 text-sm sm:grid-cols-2">
            <div className="rounded-md border border-rule bg-surface p-3">
              <p className="font-medium">Yours (not saved)</p>
              <p><Mono>{mine.length}</Mono> notes</p>
            </div>
            <div className="rounded-md border border-rule bg-surface p-3">
              <p className="font-medium">Theirs — revision <Mono>{ready!.revision}</Mono></p>
              <p>
                <Mono>{ready!.notes.length}</Mono> notes
                {theirInfo ? <>, saved by {who(theirInfo.createdBy)} at <Mono>{dateTimeFormat.format(new Date(theirInfo.createdAt))}</Mono></> : null}
              </p>
            </div>
          </div>
          <p className="mt-3 text-sm">
            Compared with theirs, yours has {diff ? <DiffSummary diff={diff} /> : null}.
          </p>
          <label className="mt-2 flex items-center gap-2 text-sm">
            <input type="checkbox" checked={showTheirs} onChange={(e) => onShowTheirs(e.target.checked)} />
            Show theirs in the piano roll <span className="text-ink-muted">(solid outlines over your notes)</span>
          </label>
          <div className="mt-3 flex flex-wrap gap-2">
            <Button onClick={onKeepMine}>Keep mine (save as revision {ready!.revision + 1})</Button>
            <Button variant="secondary" onClick={onTakeTheirs}>Take theirs (discard my changes)</Button>
          </div>
        </>
      )}
    </section>
  );
}
