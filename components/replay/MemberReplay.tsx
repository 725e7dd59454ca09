"use client";
import Link from "next/link";
import { Alert, Button, EmptyState, Mono, Spinner } from "@/components/ui";
import { ApiClientError } from "@/lib/client/api";
import { CommentsPanel } from "@/components/comments/CommentsPanel";
import { useCurveNotes } from "@/components/report/use-curve-notes";
import { useTuningReport } from "@/components/report/use-tuning-report";
import { formatDuration } from "@/components/takes/format";
import { useTake } from "@/components/takes/use-take";
import { ReplayView } from "./ReplayView";

/** The replay page for the studio's members: listeners replay, read and reply; editors also comment. */
export function MemberReplay({ projectId, projectName, takeId, canEdit }: { projectId: string; projectName: string; takeId: string; canEdit: boolean }) {
  const take = useTake(takeId);
  const notes = useCurveNotes(takeId);
  const report = useTuningReport(takeId, null);
  const takeHref = `/projects/${projectId}/takes/${takeId}`;

  if (take.isPending || notes.isPending) {
    return <div className="flex items-center gap-2 text-ink-muted"><Spinner label="Loading the take" /> Loading the take…</div>;
  }
  if (take.isError) {
    const missing = take.error instanceof ApiClientError && take.error.status === 404;
    return missing ? (
      <EmptyState title="This take does not exist" description="It may have been deleted for good." action={<Link href={`/projects/${projectId}`} className="underline">Back to {projectName}</Link>} />
    ) : (
      <Alert tone="error" title="The take could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => take.refetch()}>Try again</Button>}>{take.error.message}</Alert>
    );
  }
  if (notes.isError) {
    return <Alert tone="error" title="The notes could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => notes.refetch()}>Try again</Button>}>{notes.error.message}</Alert>;
  }
  const t = take.data.take;
  const list = notes.data?.notes ?? [];
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link href={takeHref} className="text-ink-muted underline-offset-2 hover:underline">← {t.name}</Link>
        <span className="text-ink-muted"> · {projectName}</span>
      </p>
      {notes.data === null ? <Alert tone="info">The notes appear when the take’s analysis is ready; the recording can be played already.</Alert> : null}
      <ReplayView
        title={<>Replay <span className="text-ink-muted">·</span> {t.name}</>}
        description={<span>Length <Mono className="text-ink">{formatDuration(t.durationSec)}</Mono> · <Mono className="text-ink">{list.length}</Mono> notes{notes.data?.source === "revision" ? <> · revision <Mono>{notes.data.revision}</Mono></> : null}</span>}
        actions={<Link href={`${takeHref}/report`} className="inline-flex h-10 items-center rounded-md border border-rule bg-surface px-4 text-[0.9375rem] font-medium shadow-sm hover:border-ink/35">Tuning report</Link>}
        audioSrc={`/api/v1/takes/${takeId}/audio`}
        durationSec={t.durationSec}
        notes={list}
        report={report.data ?? null}
        renderComments={(seek) => <CommentsPanel takeId={takeId} notes={list} canComment={canEdit} canModerate={canEdit} onSeek={seek} />}
      />
    </div>
  );
}
