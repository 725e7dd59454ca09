"use client";
import { useState } from "react";
import { Button, Field, Input, cx } from "@/components/ui";
import { formatHz } from "./format";

const COMMON_HZ = [440, 442, 415] as const;

/**
 * Which reference pitch (A4) the deviations are measured against: the take's own, one of the
 * common ones, or any value from 380 to 500 Hz.
 */
export function ReferenceControl({
  value,
  takeReferenceHz,
  onChange,
  busy,
}: {
  /** null: the take's own reference pitch. */
  value: number | null;
  takeReferenceHz: number | null;
  onChange: (hz: number | null) => void;
  busy: boolean;
}) {
  const [other, setOther] = useState("");
  const [error, setError] = useState<string | undefined>();
  const choice = (active: boolean) =>
    cx(
      "h-8 rounded-md border px-3 text-sm font-mono tabular-nums",
      active ? "border-copper bg-copper/10 text-ink" : "border-rule bg-surface text-ink hover:border-ink/35",
    );
  return (
    <div className="flex flex-wrap items-end gap-3" data-print="hide">
      <div role="radiogroup" aria-label="Compare at reference pitch" className="flex flex-wrap items-center gap-1.5">
        <span className="mr-1 text-sm text-ink-muted">Compare at A4 =</span>
        <button type="button" role="radio" aria-checked={value === null} className={choice(value === null)} onClick={() => onChange(null)}>
          take’s {takeReferenceHz ? formatHz(takeReferenceHz) : ""}
        </button>
        {COMMON_HZ.map((hz) => (
          <button key={hz} type="button" role="radio" aria-checked={value === hz} className={choice(value === hz)} onClick={() => onChange(hz)}>
            {hz} Hz
          </button>
        ))}
      </div>
      <form
        className="flex items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          const hz = Number(other.replace(",", "."));
          if (!Number.isFinite(hz) || hz < 380 || hz > 500) {
            setError("Between 380 and 500 Hz.");
            return;
          }
          setError(undefined);
          onChange(Math.round(hz * 100) / 100);
        }}
      >
        <Field label="Other (Hz)" htmlFor="reference-other" error={error} className="w-32">
          <Input inputMode="decimal" value={other} onChange={(e) => setOther(e.target.value)} className="font-mono" placeholder="443" />
        </Field>
        <Button type="submit" variant="secondary" size="sm" className="mb-1" loading={busy && value !== null && !COMMON_HZ.includes(value as 440)}>
          Compare
        </Button>
      </form>
    </div>
  );
}
