import type { ReactNode } from "react";
import { cx } from "./cx";

export type AlertTone = "info" | "error" | "success";

export interface AlertProps {
  tone?: AlertTone;
  title?: ReactNode;
  children?: ReactNode;
  /** A button or link shown at the end (e.g. "Try again"). */
  action?: ReactNode;
  className?: string;
}

const tones: Record<AlertTone, { box: string; icon: string; path: string }> = {
  info: {
    box: "border-voice-slate/45 bg-voice-slate/[0.07]",
    icon: "text-voice-slate",
    path: "M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13ZM7.25 7h1.5v4.5h-1.5V7Zm0-2.75h1.5v1.5h-1.5v-1.5Z",
  },
  error: {
    box: "border-danger/50 bg-danger/[0.07]",
    icon: "text-danger",
    path: "M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13Zm-.75 3.25h1.5v4.5h-1.5v-4.5Zm0 5.75h1.5V12h-1.5v-1.5Z",
  },
  success: {
    box: "border-success/50 bg-success/[0.08]",
    icon: "text-success",
    path: "M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13Zm3.03 4.47-3.75 4.5a.75.75 0 0 1-1.1.05l-2-2 1.06-1.06 1.42 1.42 3.22-3.87 1.15.96Z",
  },
};

/**
 * A message box. Errors are announced at once (role="alert"); info and
 * success politely (role="status"). The icon and wording carry the meaning,
 * not only the colour.
 */
export function Alert({ tone = "info", title, children, action, className }: AlertProps) {
  const t = tones[tone];
  return (
    <div
      role={tone === "error" ? "alert" : "status"}
      data-tone={tone}
      className={cx("flex items-start gap-3 rounded-md border border-l-[3px] px-4 py-3 text-sm text-ink", t.box, className)}
    >
      <svg aria-hidden="true" viewBox="0 0 16 16" className={cx("mt-0.5 size-4 shrink-0", t.icon)} fill="currentColor">
        <path fillRule="evenodd" d={t.path} />
      </svg>
      <div className="min-w-0 flex-1">
        {title ? <p className="font-semibold">{title}</p> : null}
        {children ? <div className={cx(title ? "mt-0.5" : undefined, "text-ink/90")}>{children}</div> : null}
      </div>
      {action ? <div className="shrink-0 self-center">{action}</div> : null}
    </div>
  );
}
