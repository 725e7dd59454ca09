import { cx } from "./cx";
import {
  FULL_SCALE_CENTS,
  centsCssColour,
  centsDirection,
  describeCents,
  formatCents,
} from "./cents-scale";

export interface CentsProps {
  /** Deviation in cents; null/undefined shows a dash (no tuning measured). */
  value: number | null | undefined;
  /** Adds a tiny gauge: a centre tick and a mark left (flat) or right (sharp). */
  gauge?: boolean;
  className?: string;
}

/**
 * A deviation in cents, e.g. "+11.8 ¢", in IBM Plex Mono, coloured on the
 * diverging intonation scale (ink within ±5, toward flat blue or sharp
 * orange up to ±50). The signed number is always there, and screen readers
 * hear "11.8 cents sharp", so colour is never the only signal.
 */
export function Cents({ value, gauge = false, className }: CentsProps) {
  const cents = typeof value === "number" ? value : Number.NaN;
  const measured = Number.isFinite(cents);
  const direction = measured ? centsDirection(cents) : "in-tune";
  const spoken = describeCents(cents);
  const position = measured ? Math.max(-1, Math.min(1, cents / FULL_SCALE_CENTS)) : 0;

  return (
    <span
      data-cents-direction={measured ? direction : "none"}
      title={spoken}
      className={cx("inline-flex items-center gap-1.5 font-mono tabular-nums whitespace-nowrap", className)}
    >
      {gauge ? (
        <span aria-hidden="true" className="relative inline-block h-2.5 w-8 shrink-0">
          <span className="absolute inset-x-0 top-1/2 h-px -translate-y-1/2 bg-rule" />
          <span className="absolute top-0 left-1/2 h-full w-px -translate-x-1/2 bg-ink-muted/60" />
          {measured ? (
            <span
              className="absolute top-1/2 size-2 -translate-x-1/2 -translate-y-1/2 rounded-[2px]"
              style={{ left: `${50 + position * 50}%`, backgroundColor: centsCssColour(cents, "fill") }}
            />
          ) : null}
        </span>
      ) : null}
      <span aria-hidden="true" style={{ color: measured ? centsCssColour(cents, "text") : undefined }}>
        {formatCents(cents)}
      </span>
      <span className="sr-only">{spoken}</span>
    </span>
  );
}
