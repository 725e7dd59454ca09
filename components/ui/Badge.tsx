import type { ReactNode } from "react";
import { cx } from "./cx";

export type BadgeTone = "neutral" | "copper" | "teal" | "plum" | "ochre" | "slate" | "success" | "danger";

export interface BadgeProps {
  tone?: BadgeTone;
  children: ReactNode;
  /** A small dot before the text; `pulse` makes it breathe (work in progress). */
  dot?: boolean | "pulse";
  className?: string;
}

const tones: Record<BadgeTone, { box: string; dot: string }> = {
  neutral: { box: "border-rule bg-paper", dot: "bg-ink-muted" },
  copper: { box: "border-copper/45 bg-copper/[0.08]", dot: "bg-copper" },
  teal: { box: "border-voice-teal/45 bg-voice-teal/[0.08]", dot: "bg-voice-teal" },
  plum: { box: "border-voice-plum/45 bg-voice-plum/[0.08]", dot: "bg-voice-plum" },
  ochre: { box: "border-voice-ochre/55 bg-voice-ochre/[0.10]", dot: "bg-voice-ochre" },
  slate: { box: "border-voice-slate/45 bg-voice-slate/[0.08]", dot: "bg-voice-slate" },
  success: { box: "border-success/45 bg-success/[0.08]", dot: "bg-success" },
  danger: { box: "border-danger/45 bg-danger/[0.08]", dot: "bg-danger" },
};

/** A small label. The text is always ink; the tint and dot only support it. */
export function Badge({ tone = "neutral", dot = false, children, className }: BadgeProps) {
  const t = tones[tone];
  return (
    <span
      data-tone={tone}
      className={cx(
        "inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-xs leading-4 font-medium whitespace-nowrap text-ink",
        t.box,
        className,
      )}
    >
      {dot ? (
        <span
          aria-hidden="true"
          className={cx("size-1.5 shrink-0 rounded-full", t.dot, dot === "pulse" && "animate-pulse")}
        />
      ) : null}
      {children}
    </span>
  );
}

export type StudioRole = "owner" | "editor" | "listener";

const roleTone: Record<StudioRole, BadgeTone> = { owner: "copper", editor: "teal", listener: "slate" };

/** A member's role in a studio: owner, editor or listener. */
export function RoleBadge({ role, className }: { role: StudioRole; className?: string }) {
  return (
    <Badge tone={roleTone[role]} className={className}>
      {role}
    </Badge>
  );
}

export type AnalysisState = "queued" | "analysing" | "ready" | "failed";

const analysisTone: Record<AnalysisState, BadgeTone> = {
  queued: "neutral",
  analysing: "ochre",
  ready: "success",
  failed: "danger",
};

/** The state of an analysis; "analysing" may show its progress, e.g. 42 (%). */
export function AnalysisBadge({
  state,
  progressPercent,
  className,
}: {
  state: AnalysisState;
  progressPercent?: number;
  className?: string;
}) {
  const showProgress = state === "analysing" && typeof progressPercent === "number" && Number.isFinite(progressPercent);
  return (
    <Badge tone={analysisTone[state]} dot={state === "analysing" ? "pulse" : true} className={className}>
      {state}
      {showProgress ? (
        <span className="font-mono tabular-nums">{Math.round(Math.min(100, Math.max(0, progressPercent)))}%</span>
      ) : null}
    </Badge>
  );
}
