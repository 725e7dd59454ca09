import { Cents, Mono } from "@/components/ui";
import { describeDrift, describeTendency, formatAbsCents, formatDrift, formatShare } from "./format";
import type { TuningSummary } from "./types";

/** The take's figures at a glance: shares in tune, mean deviation, tendency, drift. */
export function SummaryStats({ summary, compact = false }: { summary: TuningSummary; compact?: boolean }) {
  const items: { label: string; value: React.ReactNode; note?: string; testId?: string }[] = [
    { label: "Notes", value: <Mono>{summary.noteCount}</Mono> },
    { label: "Within ±5 ¢", value: <Mono>{formatShare(summary.within5)}</Mono>, testId: "within5" },
    { label: "Within ±10 ¢", value: <Mono>{formatShare(summary.within10)}</Mono> },
    { label: "Within ±20 ¢", value: <Mono>{formatShare(summary.within20)}</Mono> },
    { label: "Mean |deviation|", value: <Mono>{formatAbsCents(summary.meanAbsCents)}</Mono>, note: `against just: ${formatAbsCents(summary.meanAbsCentsJust)}` },
    { label: "Tendency", value: <Cents value={summary.tendencyCents} gauge />, note: describeTendency(summary.tendencyCents) },
    { label: "Drift", value: <Mono>{formatDrift(summary.driftCentsPerMin)}</Mono>, note: describeDrift(summary.driftCentsPerMin) },
  ];
  return (
    <dl className={compact ? "grid grid-cols-2 gap-3 sm:grid-cols-4" : "grid grid-cols-2 gap-3 sm:grid-cols-4 lg:grid-cols-7 print:grid-cols-4"}>
      {items.map((it) => (
        <div key={it.label} className="rounded-md border border-rule bg-paper/50 px-3 py-2 break-inside-avoid" data-testid={it.testId}>
          <dt className="text-xs text-ink-muted">{it.label}</dt>
          <dd className="mt-0.5 text-lg font-semibold">{it.value}</dd>
          {it.note ? <dd className="text-xs text-ink-muted">{it.note}</dd> : null}
        </div>
      ))}
    </dl>
  );
}
