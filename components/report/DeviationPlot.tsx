"use client";
import { FULL_SCALE_CENTS, centsCssColour, describeCents, formatCents } from "@/components/ui";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatClock } from "./format";
import type { ReportNote } from "./types";
import { VoiceSwatch } from "./voices";

const W = 720;
const H = 118;
const PAD = { left: 44, right: 10, top: 8, bottom: 22 };
const GRID = [-50, -20, -5, 0, 5, 20, 50];

export type Against = "equal" | "just";

/**
 * Deviation over time, one small plot per voice: x the take's time, y cents −50 … +50
 * (beyond that the dot sits on the edge as a triangle). Each dot names its note and
 * deviation in a tooltip; the same numbers are in the tables below.
 */
export function DeviationPlots({
  notes,
  durationSec,
  against,
  selected,
  onSelect,
}: {
  notes: ReportNote[];
  durationSec: number;
  against: Against;
  selected: number | null;
  onSelect: (noteIndex: number) => void;
}) {
  const voices = [...new Set(notes.map((n) => n.voice))].sort((a, b) => a - b);
  const end = Math.max(durationSec, ...notes.map((n) => n.offsetSec), 1);
  if (voices.length === 0) return <p className="text-sm text-ink-muted">No notes to plot.</p>;
  return (
    <div className="space-y-3">
      {voices.map((voice) => (
        <VoicePlot key={voice} voice={voice} notes={notes} endSec={end} against={against} selected={selected} onSelect={onSelect} />
      ))}
    </div>
  );
}

function VoicePlot({
  voice,
  notes,
  endSec,
  against,
  selected,
  onSelect,
}: {
  voice: number;
  notes: ReportNote[];
  endSec: number;
  against: Against;
  selected: number | null;
  onSelect: (noteIndex: number) => void;
}) {
  const x = (sec: number) => PAD.left + (sec / endSec) * (W - PAD.left - PAD.right);
  const y = (cents: number) => PAD.top + ((FULL_SCALE_CENTS - Math.max(-FULL_SCALE_CENTS, Math.min(FULL_SCALE_CENTS, cents))) / (2 * FULL_SCALE_CENTS)) * (H - PAD.top - PAD.bottom);
  const ticks = timeTicks(endSec);
  const points = notes
    .map((n, index) => ({ n, index, cents: against === "equal" ? n.centsEqual : n.centsJust }))
    .filter((p) => p.n.voice === voice && typeof p.cents === "number") as { n: ReportNote; index: number; cents: number }[];
  const label = `Voice ${voice}: deviation from ${against === "equal" ? "equal temperament" : "just intervals"} over time, ${points.length} notes`;
  return (
    <figure className="break-inside-avoid" data-testid={`deviation-plot-voice-${voice}`}>
      <figcaption className="mb-1 flex items-center gap-2 text-sm font-medium">
        <VoiceSwatch voice={voice} /> Voice <span className="font-mono">{voice}</span>
        <span className="font-normal text-ink-muted">· {points.length} notes</span>
      </figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full overflow-visible" role="img" aria-label={label}>
        {GRID.map((c) => (
          <g key={c}>
            <line
              x1={PAD.left}
              x2={W - PAD.right}
              y1={y(c)}
              y2={y(c)}
              stroke="var(--tn-rule)"
              strokeWidth={c === 0 ? 1.2 : 0.6}
              strokeDasharray={c === 0 || Math.abs(c) === 50 ? undefined : "3 3"}
            />
            {Math.abs(c) === 5 ? null : (
              <text x={PAD.left - 6} y={y(c) + 3} textAnchor="end" className="fill-ink-muted font-mono" fontSize={9}>
                {c > 0 ? `+${c}` : c === 0 ? "0" : `\u2212${-c}`}
              </text>
            )}
          </g>
        ))}
        {ticks.map((t) => (
          <text key={t} x={x(t)} y={H - 6} textAnchor="middle" className="fill-ink-muted font-mono" fontSize={9}>
            {formatTick(t)}
          </text>
        ))}
        <text x={PAD.left} y={PAD.top - 1} className="fill-ink-muted" fontSize={8.5}>sharp</text>
        <text x={PAD.left} y={H - PAD.bottom + 9} className="fill-ink-muted" fontSize={8.5} dy={-11}>flat</text>
        {points.map(({ n, index, cents }) => {
          const cx = x((n.onsetSec + n.offsetSec) / 2);
          const cy = y(cents);
          const clipped = Math.abs(cents) > FULL_SCALE_CENTS;
          const isSelected = selected === index;
          const title = `${midiToNoteName(n.pitch)} at ${formatClock(n.onsetSec)}: ${formatCents(cents)} (${describeCents(cents)})${n.chord ? `, in ${n.chord}` : ""}`;
          const fill = centsCssColour(cents, "fill");
          return (
            <g key={index} onClick={() => onSelect(index)} className="cursor-pointer" data-note-index={index}>
              <title>{title}</title>
              {/* the note's length as a faint bar, its deviation as the dot */}
              <line x1={x(n.onsetSec)} x2={x(n.offsetSec)} y1={cy} y2={cy} style={{ stroke: fill }} strokeOpacity={0.35} strokeWidth={2} />
              {clipped ? (
                <path
                  d={cents > 0 ? `M${cx - 4},${cy + 5} L${cx + 4},${cy + 5} L${cx},${cy - 2} Z` : `M${cx - 4},${cy - 5} L${cx + 4},${cy - 5} L${cx},${cy + 2} Z`}
                  style={{ fill }}
                />
              ) : (
                <circle cx={cx} cy={cy} r={isSelected ? 4.6 : 3.2} style={{ fill }} />
              )}
              {isSelected ? <circle cx={cx} cy={cy} r={7} fill="none" stroke="var(--tn-copper)" strokeWidth={1.5} /> : null}
            </g>
          );
        })}
      </svg>
    </figure>
  );
}

function timeTicks(endSec: number): number[] {
  const steps = [0.5, 1, 2, 5, 10, 15, 30, 60, 120, 300, 600];
  const step = steps.find((s) => endSec / s <= 10) ?? 1200;
  const out: number[] = [];
  for (let t = 0; t <= endSec + 1e-9; t += step) out.push(Math.round(t * 1000) / 1000);
  return out;
}

function formatTick(t: number): string {
  if (t < 60) return `${Number.isInteger(t) ? t : t.toFixed(1)} s`;
  return `${Math.floor(t / 60)}:${String(Math.round(t % 60)).padStart(2, "0")}`;
}
