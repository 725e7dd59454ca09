"use client";
import { useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useRouter, useSearchParams } from "next/navigation";
import dynamic from "next/dynamic";
import { useDeferredValue, useEffect, useRef, useState } from "react";
import { Alert, Button, Card, DeleteForGoodDialog, EmptyState, Mono, PageHeader, Spinner } from "@/components/ui";
import { ApiClientError } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import { AnalysisStatus } from "./AnalysisStatus";
import { formatBytes, formatChannels, formatDuration, formatSampleRate } from "./format";
import { isRunning } from "./types";
import { useDeleteTake } from "./use-delete-take";
import { ExportDialog } from "@/components/export/ExportDialog";
import { TakePianoRoll } from "./TakePianoRoll";
import { useNotes } from "./use-notes";
import { useCurveNotes } from "@/components/report/use-curve-notes";
import { useTake } from "./use-take";
import { takeDeleteMessage } from "./take-delete";
import { useTimeView } from "@/components/timeline/time-view";

const TakeDetails = dynamic(() => import("./TakeDetails").then((m) => m.TakeDetails));

/** The take page: header, analysis with live progress, player, notes, analyses, re-analyse. */
export function TakeView({
  projectId,
  projectName,
  takeId,
  canEdit,
  canExport = false,
  canBuy = false,
}: {
  projectId: string;
  projectName: string;
  takeId: string;
  canEdit: boolean;
  canExport?: boolean;
  canBuy?: boolean;
}) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const focusParam = useSearchParams().get("t");
  const focusSec = focusParam !== null && Number.isFinite(Number(focusParam)) && Number(focusParam) >= 0 ? Number(focusParam) : null;
  const take = useTake(takeId);
  const notes = useNotes(takeId);
  // the piano roll's notes (with pitch curves) load beside the take, not after it
  useCurveNotes(takeId);
  // one time axis for the take page's aligned views (timeline and piano roll)
  const timeView = useTimeView(take.data?.take.durationSec ?? 0);
  const remove = useDeleteTake();
  const [deleting, setDeleting] = useState(false);
  const [exporting, setExporting] = useState(false);

  const analysis = take.data?.analysis ?? null;
  // When an analysis finishes (or a new one starts), the notes and the list of analyses change.
  const lastSeen = useRef<string | null>(null);
  const stamp = analysis ? `${analysis.id}:${analysis.state}` : null;
  useEffect(() => {
    if (stamp === null || stamp === lastSeen.current) return;
    const first = lastSeen.current === null;
    lastSeen.current = stamp;
    if (first) return;
    void queryClient.invalidateQueries({ queryKey: takeKeys.analyses(takeId) });
    if (stamp.endsWith(":ready")) void queryClient.invalidateQueries({ queryKey: takeKeys.notes(takeId) });
    void queryClient.invalidateQueries({ queryKey: takeKeys.list(projectId) });
  }, [stamp, takeId, projectId, queryClient]);

  // The recording and the roll come first: the cards below them (the notes as a table, teaching,
  // the analyses, re-analyse) render in a pass of their own right after, not in the server's
  // HTML nor in hydration, and their code loads apart, so the roll is not kept waiting for them.
  const showBelow = useDeferredValue(true, false);

  if (take.isPending) {
    return (
      <div className="flex items-center gap-2 text-ink-muted">
        <Spinner label="Loading the take" /> Loading the take…
      </div>
    );
  }
  if (take.isError) {
    const missing = take.error instanceof ApiClientError && take.error.status === 404;
    return (
      <div className="space-y-4">
        <BackLink projectId={projectId} projectName={projectName} />
        {missing ? (
          <EmptyState title="This take does not exist" description="It may have been deleted for good." action={<Link href={`/projects/${projectId}`} className="underline">Back to {projectName}</Link>} />
        ) : (
          <Alert tone="error" title="The take could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => take.refetch()}>Try again</Button>}>
            {take.error.message}
          </Alert>
        )}
      </div>
    );
  }

  const t = take.data.take;
  const analysisCard = (
    <Card title="Analysis">
      <AnalysisStatus analysis={analysis} canEdit={canEdit} />
    </Card>
  );
  return (
    <div className="space-y-6">
      <BackLink projectId={projectId} projectName={projectName} />
      <PageHeader
        title={t.name}
        description={
          <span className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
            <span>Length <Mono className="text-ink">{formatDuration(t.durationSec)}</Mono></span>
            <span>Sample rate <Mono className="text-ink">{formatSampleRate(t.sampleRateHz)}</Mono></span>
            <span>{formatChannels(t.channels)}</span>
            <span>Original <Mono className="text-ink">{formatBytes(t.originalBytes)}</Mono></span>
          </span>
        }
        actions={
          <div className="flex gap-2">
            {canExport && notes.data ? <Button onClick={() => setExporting(true)}>Export…</Button> : null}
            {canEdit ? (
              <Button variant="secondary" onClick={() => setDeleting(true)}>
                Delete take
              </Button>
            ) : null}
          </div>
        }
      />

      {/* while the engine works (or failed) its state comes first; once ready, the recording and the roll do */}
      {analysis?.state !== "ready" ? analysisCard : null}

      <Card
        title="Recording and piano roll"
        description={
          canEdit
            ? "Correct the notes here: every change is saved as a new numbered revision."
            : "Read-only: select notes, zoom and listen."
        }
      >
        <TakePianoRoll
          takeId={t.id}
          durationSec={t.durationSec}
          canEdit={canEdit}
          timeView={timeView}
          focusSec={focusSec}
          draftAt={analysis?.state === "ready" ? (analysis.finishedAt ?? null) : null}
          noNotesText={isRunning(analysis) ? "The piano roll appears when the analysis is ready." : analysis?.state === "failed" ? "No notes: the analysis failed." : "No notes yet."}
        />
      </Card>

      {showBelow ? (
        <TakeDetails takeId={t.id} projectId={projectId} canEdit={canEdit} analysis={analysis} focusSec={focusSec} analysisCard={analysis?.state === "ready" ? analysisCard : null} />
      ) : null}

      {canExport ? <ExportDialog takeId={t.id} open={exporting} onClose={() => setExporting(false)} canBuy={canBuy} /> : null}

      <DeleteForGoodDialog
        item={deleting ? t : null}
        title="Delete this take?"
        message={takeDeleteMessage}
        onCancel={() => setDeleting(false)}
        onDelete={(take) => remove.mutateAsync(take.id)}
        onDeleted={() => {
          setDeleting(false);
          router.push(`/projects/${projectId}`);
        }}
      />
    </div>
  );
}

function BackLink({ projectId, projectName }: { projectId: string; projectName: string }) {
  return (
    <p className="text-sm">
      <Link href={`/projects/${projectId}`} className="text-ink-muted underline-offset-2 hover:underline">← {projectName}</Link>
    </p>
  );
}
