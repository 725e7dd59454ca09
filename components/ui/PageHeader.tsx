import type { ReactNode } from "react";
import { cx } from "./cx";

export interface PageHeaderProps {
  title: ReactNode;
  description?: ReactNode;
  /** Buttons or links at the right (they wrap below on narrow screens). */
  actions?: ReactNode;
  className?: string;
}

/** The page's h1, a line of description and its main actions, over a double rule. */
export function PageHeader({ title, description, actions, className }: PageHeaderProps) {
  return (
    <header
      className={cx(
        "mb-6 flex flex-wrap items-end justify-between gap-x-6 gap-y-3 border-b-[3px] border-double border-rule pb-4",
        className,
      )}
    >
      <div className="min-w-0">
        <h1 className="text-2xl font-semibold text-ink sm:text-[1.75rem]">{title}</h1>
        {description ? <p className="mt-1.5 max-w-prose text-[0.9375rem] text-ink-muted">{description}</p> : null}
      </div>
      {actions ? <div className="flex flex-wrap items-center gap-2">{actions}</div> : null}
    </header>
  );
}
