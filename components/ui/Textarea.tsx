"use client";

import type { ComponentProps } from "react";
import { controlClass } from "./control-styles";
import { useControlProps } from "./field-context";

export interface TextareaProps extends ComponentProps<"textarea"> {
  /** Marks the value as wrong: sets aria-invalid and the error styling. */
  invalid?: boolean;
}

/** A multi-line text field (comments, notes to students). Accepts `ref`. */
export function Textarea({
  invalid,
  className,
  id,
  rows = 4,
  "aria-describedby": ariaDescribedBy,
  ...rest
}: TextareaProps) {
  const control = useControlProps({ id, invalid, "aria-describedby": ariaDescribedBy });
  return (
    <textarea
      id={control.id}
      rows={rows}
      aria-invalid={control.invalid || undefined}
      aria-describedby={control.describedBy}
      className={controlClass(control.invalid, "min-h-20 py-2 leading-relaxed", className)}
      {...rest}
    />
  );
}
