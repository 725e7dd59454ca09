"use client";
import Link from "next/link";
import { useMemo } from "react";
import { Button, Cents, DataTable, Mono, createDataTableColumns } from "@/components/ui";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatAbsCents, formatClock, formatDrift, formatShare, formatVibrato } from "./format";
import type { ReportChord, ReportNote, TuningReportDto, VoiceSummary } from "./types";
import { VoiceSwatch } from "./voices";

const voiceCol = createDataTableColumns<VoiceSummary>();
const voiceColumns = voiceCol.columns([
  voiceCol.accessor("voice", {
    header: "Voice",
    sortFn: "basic",
    cell: (c) => (
      <span className="inline-flex items-center gap-2">
        <VoiceSwatch voice={c.getValue()} /> <Mono>{c.getValue()}</Mono>
      </span>
    ),
  }),
  voiceCol.accessor("noteCount", { header: "Notes", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{c.getValue()}</Mono> }),
  voiceCol.accessor((v) => v.within5 ?? -1, { id: "within5", header: "±5 ¢", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatShare(c.row.original.within5)}</Mono> }),
  voiceCol.accessor((v) => v.within10 ?? -1, { id: "within10", header: "±10 ¢", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatShare(c.row.original.within10)}</Mono> }),
  voiceCol.accessor((v) => v.within20 ?? -1, { id: "within20", header: "±20 ¢", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatShare(c.row.original.within20)}</Mono> }),
  voiceCol.accessor((v) => v.meanAbsCents ?? -1, { id: "meanAbs", header: "Mean |dev|", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatAbsCents(c.row.original.meanAbsCents)}</Mono> }),
  voiceCol.accessor((v) => v.tendencyCents ?? 0, { id: "tendency", header: "Tendency", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Cents value={c.row.original.tendencyCents} /> }),
  voiceCol.accessor((v) => v.driftCentsPerMin ?? 0, { id: "drift", header: "Drift", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatDrift(c.row.original.driftCentsPerMin)}</Mono> }),
  voiceCol.accessor((v) => v.meanAbsCentsJust ?? -1, { id: "meanAbsJust", header: "Mean |dev| just", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatAbsCents(c.row.original.meanAbsCentsJust)}</Mono> }),
]);

export function VoicesTable({ voices }: { voices: VoiceSummary[] }) {
  return <DataTable columns={voiceColumns} data={voices} getRowId={(v) => String(v.voice)} caption="Tuning per voice" initialSorting={[{ id: "voice", desc: false }]} emptyState="No voices." />;
}

type WorstRow = { rank: number; noteIndex: number; onsetSec: number; pitch: number; voice: number; centsEqual: number; centsJust: number | null; chord: string | null };
const worstCol = createDataTableColumns<WorstRow>();

/** The ten notes furthest from equal temperament, each with a link into the take. */
export function WorstNotesTable({
  report,
  takeHref,
  onSelect,
}: {
  report: TuningReportDto;
  /** The take page; `?t=<onsetSec>` is added. */
  takeHref: string | null;
  onSelect: (noteIndex: number) => void;
}) {
  const rows = useMemo<WorstRow[]>(
    () =>
      report.summary.worst.map((w, i) => ({
        rank: i + 1,
        noteIndex: w.noteIndex,
        onsetSec: w.onsetSec,
        pitch: w.pitch,
        voice: w.voice,
        centsEqual: w.centsEqual,
        centsJust: report.notes[w.noteIndex]?.centsJust ?? null,
        chord: report.notes[w.noteIndex]?.chord ?? null,
      })),
    [report],
  );
  const columns = useMemo(
    () =>
      worstCol.columns([
        worstCol.accessor("rank", { header: "#", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{c.getValue()}</Mono> }),
        worstCol.accessor("onsetSec", { header: "At", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatClock(c.getValue())}</Mono> }),
        worstCol.accessor("pitch", { header: "Note", sortFn: "basic", cell: (c) => <span className="font-medium">{midiToNoteName(c.getValue())}</span> }),
        worstCol.accessor("voice", { header: "Voice", sortFn: "basic", cell: (c) => <span className="inline-flex items-center gap-2"><VoiceSwatch voice={c.getValue()} /><Mono>{c.getValue()}</Mono></span> }),
        worstCol.accessor("centsEqual", { header: "Equal", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Cents value={c.getValue()} gauge /> }),
        worstCol.accessor((r) => r.centsJust ?? 0, { id: "centsJust", header: "Just", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Cents value={c.row.original.centsJust} /> }),
        worstCol.accessor((r) => r.chord ?? "", { id: "chord", header: "Chord", cell: (c) => <Mono>{c.getValue() || "—"}</Mono> }),
        worstCol.display({
          id: "go",
          header: "",
          cell: ({ row }) => (
            <span className="flex justify-end gap-2" data-print="hide">
              <Button size="sm" variant="ghost" onClick={() => onSelect(row.original.noteIndex)}>Pitch curve</Button>
              {takeHref ? (
                <Link className="inline-flex h-8 items-center rounded-md px-2 text-sm underline-offset-2 hover:underline" href={`${takeHref}?t=${row.original.onsetSec.toFixed(3)}`}>
                  Open in take
                </Link>
              ) : null}
            </span>
          ),
        }),
      ]),
    [takeHref, onSelect],
  );
  return <DataTable columns={columns} data={rows} getRowId={(r) => String(r.noteIndex)} caption="The ten notes furthest from equal temperament" initialSorting={[{ id: "rank", desc: false }]} emptyState="No notes." />;
}

const chordCol = createDataTableColumns<ReportChord>();
const chordColumns = chordCol.columns([
  chordCol.accessor("startSec", { header: "From", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatClock(c.getValue())}</Mono> }),
  chordCol.accessor("endSec", { header: "To", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatClock(c.getValue())}</Mono> }),
  chordCol.accessor((c) => c.symbol ?? "", { id: "symbol", header: "Chord", cell: (c) => <span className="font-mono font-medium">{c.getValue() || <span className="text-ink-muted">unnamed</span>}</span> }),
  chordCol.accessor((c) => c.quality ?? "", { id: "quality", header: "Quality", cell: (c) => <span className="text-ink-muted">{c.getValue().replace(/-/g, " ") || "—"}</span> }),
]);

/** Chords named per time segment; their roots are what the just comparison stands on. */
export function ChordsTable({ chords }: { chords: ReportChord[] }) {
  return (
    <div className="max-h-[28rem] overflow-y-auto rounded-lg" data-print="expand">
      <DataTable columns={chordColumns} data={chords} getRowId={(c, i) => `${i}`} caption="Chords per time segment" initialSorting={[{ id: "startSec", desc: false }]} emptyState="No chords found." />
    </div>
  );
}

type NoteRow = ReportNote & { index: number };
const noteCol = createDataTableColumns<NoteRow>();

/** Every note with both deviations: the plot's numbers in a table. */
export function ReportNotesTable({ notes, selected, onSelect }: { notes: ReportNote[]; selected: number | null; onSelect: (i: number) => void }) {
  const rows = useMemo(() => notes.map((n, index) => ({ ...n, index })), [notes]);
  const columns = useMemo(
    () =>
      noteCol.columns([
        noteCol.accessor("onsetSec", { header: "At", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatClock(c.getValue())}</Mono> }),
        noteCol.accessor("pitch", { header: "Note", sortFn: "basic", cell: (c) => <span className="font-medium">{midiToNoteName(c.getValue())}</span> }),
        noteCol.accessor("voice", { header: "Voice", sortFn: "basic", cell: (c) => <span className="inline-flex items-center gap-2"><VoiceSwatch voice={c.getValue()} /><Mono>{c.getValue()}</Mono></span> }),
        noteCol.accessor((n) => n.chord ?? "", { id: "chord", header: "Chord", cell: (c) => <Mono>{c.getValue() || "—"}</Mono> }),
        noteCol.accessor("centsEqual", { header: "Equal", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Cents value={c.getValue()} gauge /> }),
        noteCol.accessor((n) => n.centsJust ?? 0, { id: "centsJust", header: "Just", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Cents value={c.row.original.centsJust} gauge /> }),
        noteCol.accessor((n) => n.vibrato?.rateHz ?? 0, {
          id: "vibrato",
          header: "Vibrato",
          sortFn: "basic",
          meta: { align: "end" },
          cell: (c) => {
            const v = c.row.original.vibrato;
            return v ? <Mono>{formatVibrato(v)}</Mono> : <span className="text-ink-muted">—</span>;
          },
        }),
        noteCol.display({
          id: "pick",
          header: "",
          cell: ({ row }) => (
            <span data-print="hide">
              <Button size="sm" variant={selected === row.original.index ? "secondary" : "ghost"} aria-pressed={selected === row.original.index} onClick={() => onSelect(row.original.index)}>
                Curve
              </Button>
            </span>
          ),
        }),
      ]),
    [selected, onSelect],
  );
  return (
    <div className="max-h-[30rem] overflow-y-auto rounded-lg" data-print="expand">
      <DataTable columns={columns} data={rows} getRowId={(r) => String(r.index)} caption="Every note's deviation" initialSorting={[{ id: "onsetSec", desc: false }]} emptyState="No notes." />
    </div>
  );
}
