"use client";
import { useState } from "react";
import { Alert, Button, ConfirmDialog, Mono, Spinner, cx } from "@/components/ui";
import { dateTimeFormat } from "@/components/takes/format";
import type { NoteDiff } from "@/lib/editor";
import { DiffSummary } from "./DiffSummary";
import type { RevisionDto } from "./use-revision-list";

export type CompareState =
  | { revision: number; state: "loading" }
  | { revision: number; state: "error"; message: string }
  | { revision: number; state: "ready"; diff: NoteDiff; noteCount: number };

/**
 * The take's revisions, newest first, and the analysis's draft as revision 0: who saved each,
 * when, how many notes. Compare one with the notes as they are now (counts, and outlines in the
 * roll), or restore it — its notes are saved as a new revision; history is never rewritten.
 */
export function RevisionsPanel({
  revisions,
  current,
  draft,
  who,
  editable,
  compare,
  showOutlines,
  onShowOutlines,
  onCompare,
  onRestore,
  restoring,
}: {
  revisions: { isPending: boolean; isError: boolean; error: Error | null; data: RevisionDto[] | undefined; refetch: () => void };
  /** The revision the editor's notes build on (0 = the draft). */
  current: number;
  /** The draft's notes count, when this page has them (the API serves the draft only until the first revision). */
  draft: { noteCount: number; available: boolean; createdAt: string | null };
  who: (userId: string | null) => string;
  editable: boolean;
  compare: CompareState | null;
  showOutlines: boolean;
  onShowOutlines: (show: boolean) => void;
  onCompare: (revision: number | null) => void;
  onRestore: (revision: number) => void;
  restoring: number | null;
}) {
  const [confirming, setConfirming] = useState<RevisionDto | { number: 0; noteCount: number } | null>(null);
  if (revisions.isPending) return <p className="flex items-center gap-2 text-sm text-ink-muted"><Spinner size="sm" /> Loading the revisions…</p>;
  if (revisions.isError)
    return (
      <Alert tone="error" title="The revisions could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => revisions.refetch()}>Try again</Button>}>
        {revisions.error?.message}
      </Alert>
    );
  const rows: (RevisionDto & { isDraft?: boolean })[] = [
    ...(revisions.data ?? []),
    { number: 0, noteCount: draft.noteCount, createdAt: draft.createdAt ?? "", createdBy: null, isDraft: true },
  ];
  const latest = revisions.data?.[0]?.number ?? 0;
  return (
    <div className="space-y-3">
      {compare ? (
        <div className="rounded-md border border-rule bg-paper p-3 text-sm" data-testid="revision-compare">
          {compare.state === "loading" ? (
            <span className="flex items-center gap-2"><Spinner size="sm" /> Loading {compare.revision === 0 ? "the draft" : <>revision <Mono>{compare.revision}</Mono></>}…</span>
          ) : compare.state === "error" ? (
            <span className="text-danger">{compare.message}</span>
          ) : (
            <>
              <p>
                Since {compare.revision === 0 ? "the draft" : <>revision <Mono>{compare.revision}</Mono></>} (<Mono>{compare.noteCount}</Mono> notes), the notes now have{" "}
                <DiffSummary diff={compare.diff} />.
              </p>
              <label className="mt-2 flex items-center gap-2">
                <input type="checkbox" checked={showOutlines} onChange={(e) => onShowOutlines(e.target.checked)} />
                Show {compare.revision === 0 ? "the draft" : `revision ${compare.revision}`} in the piano roll <span className="text-ink-muted">(dotted outlines)</span>
              </label>
            </>
          )}
          <Button size="sm" variant="ghost" className="mt-2" onClick={() => onCompare(null)}>Stop comparing</Button>
        </div>
      ) : null}
      <div className="overflow-x-auto">
        <table className="w-full text-sm" aria-label="Revisions of this take">
          <thead>
            <tr className="border-b border-rule text-left text-ink-muted">
              <th className="py-1.5 pr-3 font-medium">Revision</th>
              <th className="py-1.5 pr-3 font-medium">Saved by</th>
              <th className="py-1.5 pr-3 font-medium">When</th>
              <th className="py-1.5 pr-3 text-right font-medium">Notes</th>
              <th className="py-1.5 font-medium"><span className="sr-only">Actions</span></th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => {
              const isCurrent = r.number === current;
              const usable = !r.isDraft || draft.available;
              return (
                <tr key={r.number} className={cx("border-b border-rule/60", isCurrent && "bg-copper/[0.05]")} data-testid="revision-row" data-revision={r.number}>
                  <td className="py-1.5 pr-3">
                    {r.isDraft ? "Draft" : <Mono>{r.number}</Mono>}
                    {isCurrent ? <span className="ml-2 text-xs text-ink-muted">{r.number === latest ? "current" : "shown"}</span> : null}
                  </td>
                  <td className="py-1.5 pr-3">{r.isDraft ? "the analysis" : who(r.createdBy)}</td>
                  <td className="py-1.5 pr-3"><Mono>{r.createdAt ? dateTimeFormat.format(new Date(r.createdAt)) : "—"}</Mono></td>
                  <td className="py-1.5 pr-3 text-right"><Mono>{r.isDraft && !draft.available ? "—" : r.noteCount}</Mono></td>
                  <td className="py-1.5 text-right whitespace-nowrap">
                    {usable ? (
                      <>
                        <Button size="sm" variant="ghost" onClick={() => onCompare(r.number)} aria-pressed={compare?.revision === r.number}>
                          Compare
                        </Button>
                        {editable && !isCurrent ? (
                          <Button size="sm" variant="ghost" loading={restoring === r.number} onClick={() => setConfirming(r.isDraft ? { number: 0, noteCount: r.noteCount } : r)}>
                            Restore
                          </Button>
                        ) : null}
                      </>
                    ) : (
                      <span className="text-xs text-ink-muted" title="The API serves the draft's notes only until the first revision is saved">not available</span>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <ConfirmDialog
        open={confirming !== null}
        title={confirming?.number === 0 ? "Restore the draft?" : `Restore revision ${confirming?.number ?? ""}?`}
        message={
          <>
            Its <Mono>{confirming?.noteCount ?? 0}</Mono> notes replace the notes in the piano roll and are saved as revision <Mono>{latest + 1}</Mono>. The
            revisions in between stay as they are, and Undo brings your notes back.
          </>
        }
        confirmLabel="Restore"
        onCancel={() => setConfirming(null)}
        onConfirm={() => {
          if (confirming) onRestore(confirming.number);
          setConfirming(null);
        }}
      />
    </div>
  );
}
