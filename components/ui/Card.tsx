import type { ComponentProps, ReactNode } from "react";
import { cx } from "./cx";

export interface CardProps extends Omit<ComponentProps<"section">, "title"> {
  /** Optional heading (an h2) with the description and actions beside it. */
  title?: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  /** Removes the inner padding, e.g. for a DataTable or a piano roll that fills the card. */
  flush?: boolean;
}

/** A sheet of slightly lighter paper with a rule-coloured edge. */
export function Card({ title, description, actions, flush = false, className, children, ...rest }: CardProps) {
  const hasHeader = Boolean(title || description || actions);
  return (
    <section className={cx("rounded-lg border border-rule bg-surface shadow-card", className)} {...rest}>
      {hasHeader ? (
        <div className={cx("flex flex-wrap items-start justify-between gap-3 px-5 pt-4", flush ? "pb-4" : "pb-0")}>
          <div className="min-w-0">
            {title ? <h2 className="text-base font-semibold text-ink">{title}</h2> : null}
            {description ? <p className="mt-0.5 text-sm text-ink-muted">{description}</p> : null}
          </div>
          {actions ? <div className="flex shrink-0 items-center gap-2">{actions}</div> : null}
        </div>
      ) : null}
      <div className={flush ? undefined : "px-5 py-4"}>{children}</div>
    </section>
  );
}
