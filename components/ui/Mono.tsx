import type { ComponentProps } from "react";
import { cx } from "./cx";

/** Inline numbers in IBM Plex Mono with tabular figures: times, Hz, counts. */
export function Mono({ className, ...rest }: ComponentProps<"span">) {
  return <span className={cx("font-mono tabular-nums", className)} {...rest} />;
}
