import type { ComponentProps } from "react";
import { cx } from "./cx";
import { Spinner } from "./Spinner";

export type ButtonVariant = "primary" | "secondary" | "ghost" | "danger";
export type ButtonSize = "sm" | "md";

export interface ButtonProps extends ComponentProps<"button"> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shows a small spinner, sets aria-busy and disables the button. */
  loading?: boolean;
}

const base =
  "inline-flex items-center justify-center gap-2 rounded-md font-medium whitespace-nowrap select-none " +
  "transition-[background-color,border-color,color,filter] duration-150 " +
  "disabled:cursor-not-allowed disabled:opacity-55";

const variants: Record<ButtonVariant, string> = {
  primary: "bg-copper text-on-copper shadow-sm enabled:hover:brightness-95 enabled:active:brightness-90",
  secondary:
    "border border-rule bg-surface text-ink shadow-sm enabled:hover:border-ink/35 enabled:active:bg-paper",
  ghost: "text-ink enabled:hover:bg-ink/[0.06] enabled:active:bg-ink/10",
  danger: "bg-danger text-paper shadow-sm enabled:hover:brightness-95 enabled:active:brightness-90",
};

const sizes: Record<ButtonSize, string> = {
  sm: "h-8 px-3 text-sm",
  md: "h-10 px-4 text-[0.9375rem]",
};

/**
 * Tapernote's button. Accepts every <button> prop, including `ref`
 * (React 19 passes ref as a prop). `type` defaults to "button" so a button
 * inside a form never submits by accident; pass type="submit" to submit.
 */
export function Button({
  variant = "primary",
  size = "md",
  loading = false,
  disabled,
  type = "button",
  className,
  children,
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || loading}
      aria-busy={loading || undefined}
      data-variant={variant}
      className={cx(base, variants[variant], sizes[size], className)}
      {...rest}
    >
      {loading ? <Spinner size="sm" /> : null}
      {children}
    </button>
  );
}
