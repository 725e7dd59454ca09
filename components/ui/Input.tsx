"use client";

import type { ComponentProps } from "react";
import { controlClass } from "./control-styles";
import { useControlProps } from "./field-context";

export interface InputProps extends ComponentProps<"input"> {
  /** Marks the value as wrong: sets aria-invalid and the error styling. */
  invalid?: boolean;
}

/**
 * A text-like <input>. Accepts every input prop, including `ref`. Inside a
 * Field it takes the Field's id, error state and aria-describedby by itself.
 */
export function Input({ invalid, className, id, "aria-describedby": ariaDescribedBy, ...rest }: InputProps) {
  const control = useControlProps({ id, invalid, "aria-describedby": ariaDescribedBy });
  return (
    <input
      id={control.id}
      aria-invalid={control.invalid || undefined}
      aria-describedby={control.describedBy}
      className={controlClass(control.invalid, "h-10", className)}
      {...rest}
    />
  );
}
