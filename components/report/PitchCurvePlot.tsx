"use client";
import { Cents, centsCssColour, formatCents } from "@/components/ui";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatClock, formatVibrato } from "./format";
import type { CurveNote, ReportNote } from "./types";

const W = 720;
const H = 170;
const PAD = { left: 44, right: 12, top: 10, bottom: 24 };

/**
 * One note's pitch curve against its equal-tempered pitch at the report's reference
 * (the engine's curve is against A4 = 440, so the reference offset is taken off), with
 * the vibrato rate and extent when the note has vibrato.
 */
export function PitchCurvePanel({
  note,
  curveNote,
  referenceOffsetCents,
}: {
  note: ReportNote;
  curveNote: CurveNote | null;
  referenceOffsetCents: number;
}) {
  const curve = curveNote?.pitchCurve;
  const name = midiToNoteName(note.pitch);
  return (
    <div className="space-y-3" data-testid="pitch-curve">
      <div className="flex flex-wrap items-baseline gap-x-5 gap-y-1 text-sm">
        <span className="text-base font-semibold">{name}</span>
        <span>
          Voice <span className="font-mono">{note.voice}</span>
        </span>
        <span>
          <span className="font-mono">{formatClock(note.onsetSec)}</span>–<span className="font-mono">{formatClock(note.offsetSec)}</span>
        </span>
        <span>Equal <Cents value={note.centsEqual} gauge /></span>
        <span>Just <Cents value={note.centsJust} gauge /></span>
        {note.chord ? <span>in <span className="font-mono">{note.chord}</span></span> : null}
        <span data-testid="vibrato">
          {note.vibrato ? (
            <>
              Vibrato <span className="font-mono">{formatVibrato(note.vibrato)}</span>
            </>
          ) : (
            <span className="text-ink-muted">No vibrato measured</span>
          )}
        </span>
      </div>
      {curve && curve.timeSec.length > 1 ? (
        <CurveSvg timeSec={curve.timeSec} cents={curve.cents.map((c) => c - referenceOffsetCents)} mean={note.centsEqual} label={`Pitch curve of ${name} at ${formatClock(note.onsetSec)}`} />
      ) : (
        <p className="text-sm text-ink-muted">This note has no pitch curve (too short, or measured before curves were kept).</p>
      )}
    </div>
  );
}

function CurveSvg({ timeSec, cents, mean, label }: { timeSec: number[]; cents: number[]; mean: number; label: string }) {
  const t0 = timeSec[0]!;
  const t1 = timeSec[timeSec.length - 1]!;
  const finite = cents.filter(Number.isFinite);
  const span = Math.max(25, Math.ceil((Math.max(...finite.map(Math.abs), Math.abs(mean)) + 5) / 25) * 25);
  const x = (t: number) => PAD.left + ((t - t0) / Math.max(1e-6, t1 - t0)) * (W - PAD.left - PAD.right);
  const y = (c: number) => PAD.top + ((span - c) / (2 * span)) * (H - PAD.top - PAD.bottom);
  let d = "";
  cents.forEach((c, i) => {
    if (!Number.isFinite(c)) return;
    d += `${d === "" || !Number.isFinite(cents[i - 1]!) ? "M" : "L"}${x(timeSec[i]!).toFixed(1)},${y(c).toFixed(1)} `;
  });
  const grid = [-span, -span / 2, 0, span / 2, span];
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={`${label}; mean ${formatCents(mean)}`}>
      {grid.map((c) => (
        <g key={c}>
          <line x1={PAD.left} x2={W - PAD.right} y1={y(c)} y2={y(c)} stroke="var(--tn-rule)" strokeWidth={c === 0 ? 1.2 : 0.6} strokeDasharray={c === 0 ? undefined : "3 3"} />
          <text x={PAD.left - 6} y={y(c) + 3} textAnchor="end" className="fill-ink-muted font-mono" fontSize={9}>
            {c > 0 ? `+${c}` : c === 0 ? "0" : `\u2212${-c}`}
          </text>
        </g>
      ))}
      <line x1={PAD.left} x2={W - PAD.right} y1={y(mean)} y2={y(mean)} style={{ stroke: centsCssColour(mean, "fill") }} strokeDasharray="6 3" strokeWidth={1} />
      <text x={W - PAD.right} y={y(mean) - 4} textAnchor="end" className="font-mono" fontSize={9} style={{ fill: centsCssColour(mean, "text") }}>
        mean {formatCents(mean)}
      </text>
      <path d={d} fill="none" stroke="var(--tn-ink)" strokeWidth={1.4} strokeLinejoin="round" />
      <text x={PAD.left} y={H - 6} className="fill-ink-muted font-mono" fontSize={9}>{formatClock(t0)}</text>
      <text x={W - PAD.right} y={H - 6} textAnchor="end" className="fill-ink-muted font-mono" fontSize={9}>{formatClock(t1)}</text>
    </svg>
  );
}
