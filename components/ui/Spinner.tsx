import { cx } from "./cx";

export type SpinnerSize = "sm" | "md" | "lg";

export interface SpinnerProps {
  size?: SpinnerSize;
  /** When given, the spinner is announced (role="status") with this text. */
  label?: string;
  className?: string;
}

const sizes: Record<SpinnerSize, string> = {
  sm: "size-3.5",
  md: "size-5",
  lg: "size-8",
};

/** A small turning arc in the current text colour. */
export function Spinner({ size = "md", label, className }: SpinnerProps) {
  const svg = (
    <svg
      viewBox="0 0 24 24"
      fill="none"
      aria-hidden="true"
      className={cx("shrink-0 animate-spin motion-reduce:animate-[spin_2.4s_linear_infinite]", sizes[size], className)}
    >
      <circle cx="12" cy="12" r="9" stroke="currentColor" strokeOpacity="0.2" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
  if (!label) return svg;
  return (
    <span role="status" className="inline-flex items-center gap-2">
      {svg}
      <span className="sr-only">{label}</span>
    </span>
  );
}
