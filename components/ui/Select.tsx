"use client";

import type { ComponentProps } from "react";
import { controlClass } from "./control-styles";
import { cx } from "./cx";
import { useControlProps } from "./field-context";

export interface SelectProps extends ComponentProps<"select"> {
  /** Marks the value as wrong: sets aria-invalid and the error styling. */
  invalid?: boolean;
  /** Classes for the wrapping element (width, margins). */
  wrapperClassName?: string;
}

/** A native <select> with the Tapernote look. Pass <option>s as children. Accepts `ref`. */
export function Select({
  invalid,
  className,
  wrapperClassName,
  id,
  multiple,
  "aria-describedby": ariaDescribedBy,
  children,
  ...rest
}: SelectProps) {
  const control = useControlProps({ id, invalid, "aria-describedby": ariaDescribedBy });
  return (
    <div className={cx("relative", wrapperClassName)}>
      <select
        id={control.id}
        multiple={multiple}
        aria-invalid={control.invalid || undefined}
        aria-describedby={control.describedBy}
        className={controlClass(
          control.invalid,
          multiple ? "py-2" : "h-10 appearance-none pr-9",
          className,
        )}
        {...rest}
      >
        {children}
      </select>
      {multiple ? null : (
        <svg
          aria-hidden="true"
          viewBox="0 0 16 16"
          className="pointer-events-none absolute top-1/2 right-3 size-4 -translate-y-1/2 text-ink-muted"
          fill="none"
          stroke="currentColor"
          strokeWidth="1.6"
          strokeLinecap="round"
          strokeLinejoin="round"
        >
          <path d="M4 6.5 8 10.5 12 6.5" />
        </svg>
      )}
    </div>
  );
}
