"use client";
import { useMemo, useState } from "react";
import { Badge, DataTable, Mono, createDataTableColumns, cx, type BadgeTone } from "@/components/ui";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatClock, formatShare } from "@/components/report/format";
import type { AssignmentDto } from "./types";

type Result = "matched" | "missed" | "extra" | "off-pitch";
// The word carries the meaning; the tint only supports it.
const RESULT_TONE: Record<Result, BadgeTone> = { matched: "teal", missed: "neutral", extra: "plum", "off-pitch": "ochre" };

export function ResultLabel({ result }: { result: Result }) {
  return <Badge tone={RESULT_TONE[result]} className="font-mono">{result}</Badge>;
}

type Row = { index: number; onsetSec: number; pitch: number; voice: number | null; result: Result; other: { onsetSec: number; pitch: number } | null };
const col = createDataTableColumns<Row>();

/** The comparison with the assignment: score, counts, and every expected and played note with its result. */
export function AssignmentResult({ data }: { data: AssignmentDto }) {
  const { result } = data;
  const [side, setSide] = useState<"expected" | "played">("expected");
  const rows = useMemo<Row[]>(() => {
    if (side === "expected")
      return result.expected.map((e) => {
        const p = e.playedIndex !== null ? result.played[e.playedIndex] : undefined;
        return { index: e.index, onsetSec: e.onsetSec, pitch: e.pitch, voice: e.voice, result: e.result, other: p ? { onsetSec: p.onsetSec, pitch: p.pitch } : null };
      });
    return result.played.map((p) => {
      const e = p.expectedIndex !== null ? result.expected[p.expectedIndex] : undefined;
      return { index: p.index, onsetSec: p.onsetSec, pitch: p.pitch, voice: p.voice, result: p.result, other: e ? { onsetSec: e.onsetSec, pitch: e.pitch } : null };
    });
  }, [result, side]);
  const columns = useMemo(
    () =>
      col.columns([
        col.accessor("onsetSec", { header: side === "expected" ? "Expected at" : "Played at", sortFn: "basic", meta: { align: "end" }, cell: (c) => <Mono>{formatClock(c.getValue())}</Mono> }),
        col.accessor("pitch", { header: "Note", sortFn: "basic", cell: (c) => <span className="font-medium">{midiToNoteName(c.getValue())}</span> }),
        col.accessor("result", { header: "Result", cell: (c) => <ResultLabel result={c.getValue()} /> }),
        col.display({
          id: "other",
          header: side === "expected" ? "Played as" : "Expected",
          cell: ({ row }) =>
            row.original.other ? (
              <span className={cx(row.original.other.pitch !== row.original.pitch && "font-medium")}>
                {midiToNoteName(row.original.other.pitch)} <Mono className="text-ink-muted">{formatClock(row.original.other.onsetSec)}</Mono>
              </span>
            ) : (
              <span className="text-ink-muted">—</span>
            ),
        }),
      ]),
    [side],
  );
  const c = result.counts;
  return (
    <div className="space-y-4" data-testid="assignment-result">
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Stat label="Score (matched of expected)" value={formatShare(result.score)} />
        <Stat label="F-measure" value={result.fMeasure === null ? "—" : result.fMeasure.toFixed(2)} />
        <Stat label="Tempo" value={result.tempoRatio === null ? "—" : `${result.tempoRatio.toFixed(2)} ×`} note={result.tempoRatio === null ? undefined : result.tempoRatio > 1.02 ? "played slower" : result.tempoRatio < 0.98 ? "played faster" : "as written"} />
        <Stat label="Started at" value={result.offsetSec === null ? "—" : `${result.offsetSec.toFixed(2)} s`} />
      </dl>
      <p className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        <span><Mono>{c.expected}</Mono> expected</span>
        <span><Mono>{c.played}</Mono> played</span>
        <span><Mono>{c.matched}</Mono> matched</span>
        <span><Mono>{c.offPitch}</Mono> off-pitch</span>
        <span><Mono>{c.missed}</Mono> missed</span>
        <span><Mono>{c.extra}</Mono> extra</span>
      </p>
      <div role="radiogroup" aria-label="Notes to list" className="flex gap-1">
        {(["expected", "played"] as const).map((s) => (
          <button key={s} type="button" role="radio" aria-checked={side === s} onClick={() => setSide(s)} className={cx("h-8 rounded-md border px-3 text-sm", side === s ? "border-copper bg-copper/10" : "border-rule bg-surface hover:border-ink/35")}>
            {s === "expected" ? "Expected notes" : "Played notes"}
          </button>
        ))}
      </div>
      <div className="max-h-[26rem] overflow-y-auto rounded-lg">
        <DataTable columns={columns} data={rows} getRowId={(r) => `${side}-${r.index}`} caption={side === "expected" ? "Expected notes and their results" : "Played notes and their results"} initialSorting={[{ id: "onsetSec", desc: false }]} emptyState="No notes." />
      </div>
    </div>
  );
}

function Stat({ label, value, note }: { label: string; value: string; note?: string }) {
  return (
    <div className="rounded-md border border-rule bg-paper/50 px-3 py-2">
      <dt className="text-xs text-ink-muted">{label}</dt>
      <dd className="mt-0.5 font-mono text-lg font-semibold tabular-nums">{value}</dd>
      {note ? <dd className="text-xs text-ink-muted">{note}</dd> : null}
    </div>
  );
}
