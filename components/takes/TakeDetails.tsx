"use client";
import { useMemo, type ReactNode } from "react";
import { Alert, Button, Card, Mono, Spinner } from "@/components/ui";
import { AnalysesTable } from "./AnalysesTable";
import { FocusedNotes } from "./FocusedNotes";
import { NotesTable } from "./NotesTable";
import { ReanalyseForm, startingSettings } from "./ReanalyseForm";
import { TakeTeachingPanel } from "./TakeTeachingPanel";
import { isRunning, type AnalysisDto } from "./types";
import { useNotes } from "./use-notes";

/**
 * The take page below the recording and the roll: the finished analysis's card, the notes as a
 * table, teaching (assignment, share links, comments), the analyses and re-analyse. Its own chunk,
 * loaded after the roll (see TakeView).
 */
export function TakeDetails({
  takeId,
  projectId,
  canEdit,
  analysis,
  focusSec,
  analysisCard,
}: {
  takeId: string;
  projectId: string;
  canEdit: boolean;
  analysis: AnalysisDto | null;
  focusSec: number | null;
  /** The analysis's card, when it goes below the roll (a finished analysis). */
  analysisCard: ReactNode;
}) {
  const notes = useNotes(takeId);
  const initialSettings = useMemo(() => startingSettings(analysis?.settings), [analysis?.settings]);
  return (
    <>
      {analysisCard}

      <Card
        title="Notes"
        description={
          notes.data
            ? notes.data.source === "revision"
              ? <>Revision <Mono>{notes.data.revision}</Mono> · A4 = <Mono>{notes.data.referenceHz.toFixed(1)} Hz</Mono></>
              : <>The analysis’s draft · A4 = <Mono>{notes.data.referenceHz.toFixed(1)} Hz</Mono></>
            : undefined
        }
      >
        {notes.isPending ? (
          <Spinner label="Loading the notes" />
        ) : notes.isError ? (
          <Alert tone="error" title="The notes could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => notes.refetch()}>Try again</Button>}>
            {notes.error.message}
          </Alert>
        ) : notes.data ? (
          <div className="space-y-3">
            {focusSec !== null ? <FocusedNotes notes={notes.data.notes} atSec={focusSec} /> : null}
            <NotesTable notes={notes.data} />
          </div>
        ) : (
          <p className="text-sm text-ink-muted">
            {isRunning(analysis) ? "The notes appear here when the analysis is ready." : analysis?.state === "failed" ? "No notes: the analysis failed." : "No notes yet."}
          </p>
        )}
      </Card>

      <TakeTeachingPanel takeId={takeId} projectId={projectId} canEdit={canEdit} />

      <Card title="Analyses" description="Every run of the engine over this take, newest first." flush>
        <div className="px-5 pb-4">
          <AnalysesTable takeId={takeId} canEdit={canEdit} />
        </div>
      </Card>

      {canEdit ? (
        <Card title="Re-analyse" description="Run the engine again with other settings. The earlier analyses are kept.">
          <ReanalyseForm takeId={takeId} initial={initialSettings} />
        </Card>
      ) : null}
    </>
  );
}
