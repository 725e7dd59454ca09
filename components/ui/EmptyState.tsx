import type { ReactNode } from "react";
import { cx } from "./cx";

export interface EmptyStateProps {
  title: ReactNode;
  description?: ReactNode;
  /** The next step, e.g. an "Upload a take" button. */
  action?: ReactNode;
  /** Replaces the default drawing (an empty staff). */
  icon?: ReactNode;
  className?: string;
}

function EmptyStaff() {
  return (
    <svg aria-hidden="true" viewBox="0 0 96 40" className="h-10 w-24 text-rule" fill="none">
      {[4, 12, 20, 28, 36].map((y) => (
        <line key={y} x1="2" x2="94" y1={y} y2={y} stroke="currentColor" strokeWidth="1.25" />
      ))}
      <line x1="2" x2="2" y1="4" y2="36" stroke="currentColor" strokeWidth="1.25" />
      <line x1="94" x2="94" y1="4" y2="36" stroke="currentColor" strokeWidth="1.25" />
      <rect x="58" y="13.5" width="22" height="5" rx="2" className="fill-copper/55" />
    </svg>
  );
}

/** What to show when a list has nothing in it yet, and what to do next. */
export function EmptyState({ title, description, action, icon, className }: EmptyStateProps) {
  return (
    <div
      className={cx(
        "flex flex-col items-center rounded-lg border border-dashed border-rule px-6 py-10 text-center",
        className,
      )}
    >
      {icon ?? <EmptyStaff />}
      <p className="mt-4 text-base font-semibold text-ink">{title}</p>
      {description ? <p className="mt-1 max-w-sm text-sm text-ink-muted">{description}</p> : null}
      {action ? <div className="mt-5">{action}</div> : null}
    </div>
  );
}
