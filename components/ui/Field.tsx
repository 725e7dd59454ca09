"use client";

import { useMemo, type ReactNode } from "react";
import { cx } from "./cx";
import { FieldContext } from "./field-context";

export interface FieldProps {
  label: ReactNode;
  /** The id of the control inside; also the base of the hint and error ids. */
  htmlFor: string;
  /** Shown below the control, in an element with role="alert" and id `${htmlFor}-error`. */
  error?: string;
  /** Help text, shown under the label (id `${htmlFor}-hint`). */
  hint?: string;
  /** Marks the label as required with a quiet "required" note. */
  required?: boolean;
  className?: string;
  children: ReactNode;
}

/**
 * Label above, control, error below. Input, Select and Textarea placed inside
 * pick up the id, aria-invalid and aria-describedby from the Field.
 */
export function Field({ label, htmlFor, error, hint, required, className, children }: FieldProps) {
  const hintId = hint ? `${htmlFor}-hint` : undefined;
  const errorId = error ? `${htmlFor}-error` : undefined;
  const context = useMemo(
    () => ({
      controlId: htmlFor,
      describedBy: [errorId, hintId].filter(Boolean).join(" ") || undefined,
      invalid: Boolean(error),
    }),
    [htmlFor, errorId, hintId, error],
  );

  return (
    <div className={cx("flex flex-col gap-1.5", className)}>
      <label htmlFor={htmlFor} className="text-sm font-medium text-ink">
        {label}
        {required ? <span className="ml-1.5 text-xs font-normal text-ink-muted">required</span> : null}
      </label>
      {hint ? (
        <p id={hintId} className="-mt-0.5 text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      <FieldContext.Provider value={context}>{children}</FieldContext.Provider>
      {error ? (
        <p id={errorId} role="alert" className="flex items-start gap-1.5 text-sm text-danger">
          <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-3.5 shrink-0" fill="currentColor">
            <path d="M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13Zm-.75 3.25h1.5v4.5h-1.5v-4.5Zm0 5.75h1.5V12h-1.5v-1.5Z" />
          </svg>
          <span>{error}</span>
        </p>
      ) : null}
    </div>
  );
}
