import { cx } from "./cx";

/** Shared look of text inputs, selects and text areas. */
export function controlClass(invalid: boolean, ...extra: Array<string | undefined>): string {
  return cx(
    "block w-full rounded-md border bg-surface px-3 text-[0.9375rem] text-ink shadow-[inset_0_1px_0_0_rgb(29_36_51/0.04)]",
    "placeholder:text-ink-muted/75 transition-colors duration-150",
    "focus-visible:outline-2 focus-visible:outline-offset-1",
    "disabled:cursor-not-allowed disabled:bg-paper disabled:text-ink-muted",
    invalid
      ? "border-danger focus-visible:outline-danger"
      : "border-rule hover:border-ink/30 focus-visible:border-copper",
    ...extra,
  );
}
