"use client";
import Link from "next/link";
import { useCallback, useEffect, useMemo, useState } from "react";
import { Alert, Button, Card, EmptyState, Mono, PageHeader, Select, Spinner, cx } from "@/components/ui";
import { ApiClientError } from "@/lib/client/api";
import { useTake } from "@/components/takes/use-take";
import { DeviationPlots, type Against } from "./DeviationPlot";
import { formatHz } from "./format";
import { PitchCurvePanel } from "./PitchCurvePlot";
import { PrintStyles, type Paper } from "./PrintStyles";
import { ReferenceControl } from "./ReferenceControl";
import { ChordsTable, ReportNotesTable, VoicesTable, WorstNotesTable } from "./ReportTables";
import { SummaryStats } from "./SummaryStats";
import type { CurveNote, ReportNote } from "./types";
import { useCurveNotes } from "./use-curve-notes";
import { useTuningReport } from "./use-tuning-report";

/** The curve of a report note: the notes list entry with the same onset, pitch and voice. */
export function findCurveNote(notes: CurveNote[] | undefined, note: ReportNote | undefined): CurveNote | null {
  if (!notes || !note) return null;
  return notes.find((n) => n.pitch === note.pitch && n.voice === note.voice && Math.abs(n.onsetSec - note.onsetSec) < 1e-3) ?? null;
}

/** The tuning report page of a take: printable on A4 and Letter. */
export function ReportView({ projectId, projectName, takeId }: { projectId: string; projectName: string; takeId: string }) {
  const take = useTake(takeId);
  const [referenceHz, setReferenceHz] = useState<number | null>(null);
  const report = useTuningReport(takeId, referenceHz);
  const curves = useCurveNotes(takeId);
  const [against, setAgainst] = useState<Against>("equal");
  const [selected, setSelected] = useState<number | null>(null);
  const [paper, setPaper] = useState<Paper>("A4");
  useEffect(() => {
    // Letter where it is the usual paper (the United States and Canada), A4 elsewhere.
    if (/^en-(US|CA)$|^(es-MX|fr-CA)$/.test(navigator.language)) setPaper("letter");
  }, []);
  const select = useCallback((i: number) => setSelected(i), []);

  const data = report.data;
  const takeHref = `/projects/${projectId}/takes/${takeId}`;
  const selectedNote = data && selected !== null ? data.notes[selected] : undefined;
  const selectedCurve = useMemo(() => findCurveNote(curves.data?.notes, selectedNote), [curves.data, selectedNote]);
  // the note shown first: the worst one
  useEffect(() => {
    if (selected === null && data?.summary.worst[0]) setSelected(data.summary.worst[0].noteIndex);
  }, [data, selected]);

  const name = take.data?.take.name ?? "…";
  return (
    <div className="space-y-6">
      <PrintStyles paper={paper} />
      <p className="text-sm" data-print="hide">
        <Link href={takeHref} className="text-ink-muted underline-offset-2 hover:underline">← {name}</Link>
        <span className="text-ink-muted"> · {projectName}</span>
      </p>
      <PageHeader
        title={<>Tuning report <span className="text-ink-muted">·</span> {name}</>}
        description={
          data ? (
            <span className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
              <span>
                Measured against A4 = <Mono className="text-ink" data-testid="report-reference">{formatHz(data.referenceHz)}</Mono>
              </span>
              <span>
                {data.takeReferenceSource === "set" ? "Set for the analysis: " : "Estimated from the take: "}
                <Mono className="text-ink">{formatHz(data.estimatedReferenceHz ?? null)}</Mono>
              </span>
              <span>{projectName}</span>
            </span>
          ) : undefined
        }
        actions={
          <div className="flex items-end gap-2" data-print="hide">
            <Link href={`${takeHref}/replay`} className="inline-flex h-10 items-center rounded-md border border-rule bg-surface px-4 text-[0.9375rem] font-medium shadow-sm hover:border-ink/35">
              Replay
            </Link>
            <label className="sr-only" htmlFor="report-paper">Paper</label>
            <Select id="report-paper" value={paper} onChange={(e) => setPaper(e.target.value as Paper)} wrapperClassName="w-28" aria-label="Paper size">
              <option value="A4">A4</option>
              <option value="letter">Letter</option>
            </Select>
            <Button onClick={() => window.print()}>Print…</Button>
          </div>
        }
      />

      {report.isPending ? (
        <div className="flex items-center gap-2 text-ink-muted"><Spinner label="Loading the tuning report" /> Measuring the notes…</div>
      ) : report.isError && !data ? (
        report.error instanceof ApiClientError && report.error.status === 404 ? (
          <EmptyState title="No tuning report yet" description="The report appears when the take has notes: wait for its analysis to finish." action={<Link href={takeHref} className="underline">Back to the take</Link>} />
        ) : (
          <Alert tone="error" title="The tuning report could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => report.refetch()}>Try again</Button>}>
            {report.error.message}
          </Alert>
        )
      ) : data ? (
        <>
          <div className="space-y-2">
            <ReferenceControl value={referenceHz} takeReferenceHz={data.estimatedReferenceHz ?? null} onChange={setReferenceHz} busy={report.isFetching} />
            {report.isError ? <Alert tone="error">{report.error.message}</Alert> : null}
            {report.isFetching ? <p className="text-xs text-ink-muted" data-print="hide" role="status">Measuring again…</p> : null}
          </div>

          <Card title="Summary" description={<>Deviation from equal temperament at A4 = <Mono>{formatHz(data.referenceHz)}</Mono>; the notes’ mean against just intervals above each chord’s root beside it.</>}>
            <SummaryStats summary={data.summary} />
          </Card>

          <Card title="Per voice" flush>
            <div className="px-5 pb-4"><VoicesTable voices={data.voices} /></div>
          </Card>

          <Card
            title="Deviation over time"
            description="Each dot is a note: above the line sharp, below flat. Point at a dot for its numbers; click it for its pitch curve."
            actions={
              <div role="radiogroup" aria-label="Deviation against" className="flex gap-1" data-print="hide">
                {(["equal", "just"] as const).map((a) => (
                  <button
                    key={a}
                    type="button"
                    role="radio"
                    aria-checked={against === a}
                    onClick={() => setAgainst(a)}
                    className={cx("h-8 rounded-md border px-3 text-sm", against === a ? "border-copper bg-copper/10" : "border-rule bg-surface hover:border-ink/35")}
                  >
                    {a === "equal" ? "Against equal" : "Against just"}
                  </button>
                ))}
              </div>
            }
          >
            <p className="mb-2 hidden text-sm print:block">Against {against === "equal" ? "equal temperament" : "just intervals above the chord’s root"}.</p>
            <DeviationPlots notes={data.notes} durationSec={take.data?.take.durationSec ?? 0} against={against} selected={selected} onSelect={select} />
          </Card>

          <Card title="Pitch curve" description="The selected note’s pitch over its length, against its equal-tempered pitch at the reference.">
            {selectedNote ? (
              <PitchCurvePanel note={selectedNote} curveNote={selectedCurve} referenceOffsetCents={data.referenceOffsetCents} />
            ) : (
              <p className="text-sm text-ink-muted">Choose a note in the plot or a table.</p>
            )}
          </Card>

          <Card title="The ten worst notes" description="Furthest from equal temperament. “Open in take” goes to the take page at that moment." flush>
            <div className="px-5 pb-4"><WorstNotesTable report={data} takeHref={takeHref} onSelect={select} /></div>
          </Card>

          <Card title="Chords" description="Chord symbols per time segment; the just comparison measures above each chord’s root." flush>
            <div className="px-5 pb-4"><ChordsTable chords={data.chords} /></div>
          </Card>

          <Card title="Every note" description="Deviation from equal temperament and from just intervals, with vibrato where a note has it." flush>
            <div className="px-5 pb-4"><ReportNotesTable notes={data.notes} selected={selected} onSelect={select} /></div>
          </Card>
        </>
      ) : null}
    </div>
  );
}
