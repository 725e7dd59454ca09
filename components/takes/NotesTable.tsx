"use client";
import { useMemo, useState } from "react";
import { Button, Cents, DataTable, EmptyState, Mono, createDataTableColumns } from "@/components/ui";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatSeconds } from "./format";
import type { TakeNote, TakeNotesDto } from "./types";

type Row = TakeNote & { index: number; lengthSec: number };
const col = createDataTableColumns<Row>();
/** Longer lists render on request; the piano roll (a later issue) is the place for big takes. */
const FIRST_ROWS = 300;

const columns = col.columns([
  col.accessor("onsetSec", { header: "Onset (s)", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatSeconds(c.getValue())}</Mono> }),
  col.accessor("lengthSec", { header: "Length (s)", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatSeconds(c.getValue())}</Mono> }),
  col.accessor("pitch", {
    header: "Note",
    sortFn: "basic",
    cell: (c) => (
      <span className="whitespace-nowrap">
        <span className="font-medium">{midiToNoteName(c.getValue())}</span>{" "}
        <Mono className="text-ink-muted">({c.getValue()})</Mono>
      </span>
    ),
  }),
  col.accessor("cents", { header: "Cents", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Cents value={c.getValue()} gauge /> }),
  col.accessor("velocity", { header: "Velocity", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{c.getValue()}</Mono> }),
  col.accessor("voice", { header: "Voice", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{c.getValue()}</Mono> }),
]);

/** The notes of a take as a plain sortable table. */
export function NotesTable({ notes }: { notes: TakeNotesDto }) {
  const [showAll, setShowAll] = useState(false);
  const rows = useMemo(
    () =>
      [...notes.notes]
        .sort((a, b) => a.onsetSec - b.onsetSec || a.pitch - b.pitch)
        .map((n, index) => ({ ...n, index, lengthSec: n.offsetSec - n.onsetSec })),
    [notes.notes],
  );
  const shown = useMemo(() => (showAll ? rows : rows.slice(0, FIRST_ROWS)), [rows, showAll]);
  if (rows.length === 0) {
    return <EmptyState title="No notes found" description="The analysis heard no notes in this take. Try a higher sensitivity or a wider pitch range." />;
  }
  return (
    <div className="space-y-2">
      {/* a long take's list scrolls inside the card, so the analyses and settings below stay in reach;
          `relative` keeps the visually hidden (absolutely placed) texts of the rows inside the scroller */}
      <div className="relative max-h-[34rem] overflow-y-auto rounded-lg" tabIndex={0} aria-label="Notes, scrollable">
        <DataTable columns={columns} data={shown} getRowId={(r) => String(r.index)} caption="Notes of this take" initialSorting={[{ id: "onsetSec", desc: false }]} />
      </div>
      {rows.length > FIRST_ROWS ? (
        <div className="flex items-center justify-between text-sm text-ink-muted">
          <span>
            Showing <Mono>{shown.length}</Mono> of <Mono>{rows.length}</Mono> notes.
          </span>
          <Button size="sm" variant="secondary" onClick={() => setShowAll((v) => !v)}>
            {showAll ? `Show the first ${FIRST_ROWS}` : "Show all notes"}
          </Button>
        </div>
      ) : null}
    </div>
  );
}
