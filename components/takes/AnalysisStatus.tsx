"use client";
import { Alert, AnalysisBadge, Button, Mono } from "@/components/ui";
import { dateTimeFormat } from "./format";
import { summariseSettings } from "./settings-summary";
import { isRunning, type AnalysisDto } from "./types";
import { useCancelAnalysis } from "./use-cancel-analysis";

/** The latest analysis of a take: state, live progress, the error when it failed, Cancel while it runs. */
export function AnalysisStatus({ analysis, canEdit }: { analysis: AnalysisDto | null; canEdit: boolean }) {
  const cancel = useCancelAnalysis();
  if (!analysis) return <p className="text-sm text-ink-muted">This take has not been analysed yet.</p>;
  const running = isRunning(analysis);
  const percent = Math.round(Math.min(100, Math.max(0, analysis.progress)));
  return (
    <div className="space-y-3" data-testid="analysis-status" data-state={analysis.state}>
      <div className="flex flex-wrap items-center gap-3">
        <AnalysisBadge state={analysis.state} progressPercent={analysis.progress} />
        <span className="text-sm text-ink-muted">{summariseSettings(analysis.settings)}</span>
        {canEdit && running ? (
          <Button size="sm" variant="secondary" className="ml-auto" loading={cancel.isPending} onClick={() => cancel.mutate(analysis.id)}>
            Cancel analysis
          </Button>
        ) : null}
      </div>
      {running ? (
        <div>
          <div
            role="progressbar"
            aria-label="Analysis progress"
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={percent}
            className="h-2 overflow-hidden rounded-full bg-rule/70"
          >
            <div className="h-full rounded-full bg-copper transition-[width] duration-500" style={{ width: `${analysis.state === "queued" ? 0 : percent}%` }} />
          </div>
          <p className="mt-1 text-sm text-ink-muted">
            {analysis.state === "queued" ? "Waiting for a free worker…" : <>Analysing: <Mono>{percent}%</Mono></>}
          </p>
        </div>
      ) : null}
      {analysis.state === "failed" ? (
        <Alert tone="error" title="The analysis failed">{analysis.error || "No reason was given."}</Alert>
      ) : null}
      {analysis.state === "ready" && analysis.finishedAt ? (
        <p className="text-sm text-ink-muted">Finished <Mono>{dateTimeFormat.format(new Date(analysis.finishedAt))}</Mono>.</p>
      ) : null}
      {cancel.isError ? <Alert tone="error">{cancel.error.message}</Alert> : null}
    </div>
  );
}
