import { Mono } from "@/components/ui";
import type { NoteDiff } from "@/lib/editor";

/** "2 added, 1 removed, 4 changed" — or that the two lists hold the same notes. */
export function DiffSummary({ diff, className }: { diff: NoteDiff; className?: string }) {
  const same = diff.added.length + diff.removed.length + diff.changed.length === 0;
  return (
    <span className={className} data-testid="diff-summary">
      {same ? (
        "the same notes"
      ) : (
        <>
          <Mono>{diff.added.length}</Mono> added, <Mono>{diff.removed.length}</Mono> removed, <Mono>{diff.changed.length}</Mono> changed
          {diff.unchanged ? <> (<Mono>{diff.unchanged}</Mono> alike)</> : null}
        </>
      )}
    </span>
  );
}
