"use client";
import { useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from "react";
import { Alert, Button, Mono, Spinner } from "@/components/ui";
import { PianoRoll, type Outlines, type PianoRollTool } from "@/components/piano-roll";
import type { TimeView } from "@/components/timeline/time-view";
import { useAssignment } from "@/components/assignment/use-assignment";
import { assignmentKeys } from "@/components/assignment/keys";
import { reportKeys } from "@/components/report/keys";
import type { CurveNotesDto } from "@/components/report/types";
import { useCurveNotes } from "@/components/report/use-curve-notes";
import { ApiClientError, apiFetch } from "@/lib/client/api";
import { takeKeys } from "@/lib/client/query-keys";
import {
  EMPTY_SELECTION,
  diffNotes,
  gridStepSec,
  sameNotes,
  soundingAt,
  withIds,
  withoutIds,
  type EditorNote,
  type NoteList,
  type SnapGrid,
} from "@/lib/editor";
import { ConflictPanel } from "./ConflictPanel";
import { EditorToolbar } from "./EditorToolbar";
import { Inspector } from "./Inspector";
import { editorKeys } from "./keys";
import { RevisionsPanel, type CompareState } from "./RevisionsPanel";
import { SaveStatus } from "./SaveStatus";
import { commandFor, fromField } from "./shortcuts";
import { useMemberNames } from "./use-member-names";
import { useMeter } from "./use-meter";
import { useNoteEditor } from "./use-note-editor";
import { useRevisionList } from "./use-revision-list";
import { useRevisionNotes } from "./use-revision-notes";
import { useSaveQueue, type SavedRevision } from "./use-save-queue";
import { ViewControls } from "./ViewControls";

/** Arrow-key step in time when the grid is off (s). */
const NUDGE_SEC = 0.05;
const OFF: SnapGrid = { kind: "off" };

/** Lays the roll out in the page's time-aligned views (the timeline), given the notes as edited. */
export type RollFrame = (roll: ReactNode, notes: NoteList, referenceHz: number) => ReactNode;

export type NoteEditorProps = {
  takeId: string;
  durationSec: number;
  /** Editors and owners; listeners get the same page read-only. */
  canEdit: boolean;
  timeView: TimeView;
  /** `?t=` from the tuning report: scroll there and select the notes sounding then. */
  focusSec?: number | null;
  frame?: RollFrame;
  /** When the analysis that made the draft finished, for the revision list. */
  draftAt?: string | null;
  /** A short text for when there are no notes yet (analysis running or failed). */
  noNotesText: string;
};

/**
 * The take's piano roll workspace: toolbar (tools, undo/redo, clipboard, snap), tempo and zoom,
 * the roll with the inspector beside it, the save state (every change a new revision), a
 * conflict's two sides, and the revisions to compare and restore. Loads the notes with their
 * pitch curves.
 */
export function NoteEditor(props: NoteEditorProps) {
  const source = useCurveNotes(props.takeId);
  // the timeline (recording, transport) is there in every state; the roll only with notes
  const framed = (content: ReactNode) => (props.frame ? props.frame(<div className="px-4 py-6">{content}</div>, NO_NOTES, 440) : content);
  if (source.isPending) {
    return framed(
      <p className="flex items-center gap-2 text-sm text-ink-muted">
        <Spinner label="Loading the notes" /> Loading the notes…
      </p>,
    );
  }
  if (source.isError) {
    return framed(
      <Alert tone="error" title="The notes could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => source.refetch()}>Try again</Button>}>
        {source.error.message}
      </Alert>,
    );
  }
  if (!source.data) return framed(<p className="text-sm text-ink-muted">{props.noNotesText}</p>);
  return <Workspace {...props} dto={source.data} />;
}

const NO_NOTES: NoteList = [];

/** DTOs this page wrote into the cache itself (after a save): not news from elsewhere. */
const ownWrites = new WeakSet<object>();

function Workspace({ takeId, durationSec, canEdit, timeView, focusSec = null, frame, draftAt = null, dto }: NoteEditorProps & { dto: CurveNotesDto }) {
  const queryClient = useQueryClient();
  const [initial] = useState(() => withIds(dto.notes));
  const [draftNotes] = useState<EditorNote[] | null>(() => (dto.source === "draft" ? initial : null));
  const editor = useNoteEditor(initial);
  const [tool, setTool] = useState<PianoRollTool>("select");
  const [snap, setSnap] = useState(0);
  const meter = useMeter(takeId);
  const [showAssignment, setShowAssignment] = useState(false);
  const [showTheirs, setShowTheirs] = useState(true);
  const [compareRev, setCompareRev] = useState<number | null>(null);
  const [showCompare, setShowCompare] = useState(true);
  const [restoring, setRestoring] = useState<number | null>(null);
  const [notice, setNotice] = useState<{ tone: "info" | "error"; text: ReactNode } | null>(null);
  const referenceHz = dto.referenceHz;

  const onSaved = useCallback(
    (revision: SavedRevision, notes: NoteList) => {
      const withCurves: CurveNotesDto = { source: "revision", revision: revision.number, referenceHz, notes: withoutIds(notes) };
      ownWrites.add(withCurves);
      queryClient.setQueryData(reportKeys.curves(takeId), withCurves);
      queryClient.setQueryData(takeKeys.notes(takeId), { ...withCurves, notes: withCurves.notes.map(({ pitchCurve: _c, ...n }) => n) });
      void queryClient.invalidateQueries({ queryKey: editorKeys.revisions(takeId) });
      void queryClient.invalidateQueries({ queryKey: [...takeKeys.notes(takeId), "tuning-report"] });
      void queryClient.invalidateQueries({ queryKey: takeKeys.detail(takeId) });
      void queryClient.invalidateQueries({ queryKey: assignmentKeys.detail(takeId) });
    },
    [queryClient, takeId, referenceHz],
  );

  const save = useSaveQueue({ takeId, referenceHz, enabled: canEdit, onSaved, initialBase: dto.revision ?? 0, initialNotes: initial });

  // every edit (and undo, redo, restore) goes to the save queue
  const flushNext = useRef(false);
  useEffect(() => {
    if (!canEdit) return;
    save.edited(editor.notes);
    if (flushNext.current) {
      flushNext.current = false;
      save.flush();
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [editor.notes, canEdit]);

  // notes from elsewhere (a revision saved in another tab, a new draft): load them when nothing is unsaved
  const seen = useRef(dto);
  useEffect(() => {
    if (dto === seen.current) return;
    seen.current = dto;
    if (ownWrites.has(dto) || save.hasUnsaved) return;
    const rev = dto.revision ?? 0;
    if (rev === save.baseRevision && sameNotes(dto.notes, save.saved)) return;
    const notes = withIds(dto.notes);
    save.reset(rev, notes);
    editor.load(notes, EMPTY_SELECTION);
    setNotice({ tone: "info", text: rev === 0 ? "A new draft was loaded." : <>Revision <Mono>{rev}</Mono>, saved elsewhere, was loaded.</> });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [dto]);

  // ?t=: scroll there and select what sounds then
  useEffect(() => {
    if (focusSec === null) return;
    const ids = soundingAt(editor.notes, focusSec).map((n) => n.id);
    editor.select(new Set(ids));
    const s = timeView.get();
    const visibleSec = s.areaWidthPx > 0 ? s.areaWidthPx / s.window.pxPerSec : 10;
    timeView.setWindow({ startSec: Math.max(0, focusSec - visibleSec / 3), pxPerSec: s.window.pxPerSec });
    timeView.seek(focusSec);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [focusSec, timeView]);

  const grid = useMemo<SnapGrid>(() => (meter.meter && snap > 0 ? { kind: "beat", tempoBpm: meter.meter.tempoBpm, subdivision: snap } : OFF), [meter.meter, snap]);

  const pasteAt = useCallback(() => {
    const s = timeView.get();
    const visibleSec = s.areaWidthPx > 0 ? s.areaWidthPx / s.window.pxPerSec : 10;
    const inView = s.playheadSec >= s.window.startSec && s.playheadSec <= s.window.startSec + visibleSec;
    editor.paste(inView ? s.playheadSec : s.window.startSec + visibleSec * 0.1);
  }, [editor, timeView]);

  // keyboard shortcuts, in the workspace (and from the page itself, so Ctrl/⌘+Z works after a click elsewhere)
  const workspaceRef = useRef<HTMLDivElement>(null);
  const live = useRef({ editor, canEdit, grid, pasteAt });
  live.current = { editor, canEdit, grid, pasteAt };
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const inside = workspaceRef.current?.contains(e.target as Node);
      if (!inside && e.target !== document.body) return;
      if (fromField(e.target) || e.defaultPrevented) return;
      if ((e.target as Element | null)?.closest?.("dialog,[role=dialog]")) return;
      if (!inside && !(e.ctrlKey || e.metaKey)) return; // from the page: only Ctrl/⌘ shortcuts
      const { editor: ed, canEdit: editable, grid: g, pasteAt: paste } = live.current;
      const cmd = commandFor(e, editable);
      if (!cmd) return;
      if ((cmd.kind === "copy" || cmd.kind === "cut") && ed.selection.size === 0) return; // let the page copy text
      e.preventDefault();
      switch (cmd.kind) {
        case "tool":
          setTool(cmd.tool);
          break;
        case "undo":
          ed.undo();
          break;
        case "redo":
          ed.redo();
          break;
        case "copy":
          ed.copy();
          break;
        case "cut":
          ed.cut();
          break;
        case "paste":
          paste();
          break;
        case "delete":
          ed.remove();
          break;
        case "selectAll":
          ed.selectAll();
          break;
        case "clearSelection":
          ed.clearSelection();
          break;
        case "resetCents":
          ed.resetCents();
          break;
        case "nudge":
          ed.nudge(cmd.steps * (gridStepSec(g) ?? NUDGE_SEC), cmd.semitones);
          break;
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, []);

  // overlays
  const assignment = useAssignment(takeId);
  const expected = useMemo(() => {
    const r = assignment.data?.result;
    if (!r) return null;
    // the assignment's own times, placed on the take by the alignment's fit: played ≈ tempoRatio · expected + offsetSec
    const k = r.tempoRatio ?? 1;
    const o = r.offsetSec ?? 0;
    return r.expected.map((e) => ({ onsetSec: k * e.onsetSec + o, offsetSec: k * e.offsetSec + o, pitch: e.pitch }));
  }, [assignment.data]);
  const compared = useRevisionNotes(takeId, compareRev !== null && compareRev > 0 ? compareRev : null);
  const compareNotes = compareRev === 0 ? draftNotes : (compared.data?.notes ?? null);
  const compareDiff = useMemo(() => (compareNotes ? diffNotes(compareNotes, editor.notes) : null), [compareNotes, editor.notes]);
  const theirs = save.theirs?.state === "ready" ? save.theirs : null;
  const outlines = useMemo<Outlines[]>(() => {
    const out: Outlines[] = [];
    if (showAssignment && expected) out.push({ notes: expected, style: "assignment" });
    if (showCompare && compareNotes) out.push({ notes: compareNotes, style: "compare" });
    if (save.status === "conflict" && showTheirs && theirs) out.push({ notes: theirs.notes, style: "theirs" });
    return out;
  }, [showAssignment, expected, showCompare, compareNotes, save.status, showTheirs, theirs]);

  const compareState: CompareState | null =
    compareRev === null
      ? null
      : compareNotes && compareDiff
        ? { revision: compareRev, state: "ready", diff: compareDiff, noteCount: compareNotes.length }
        : compared.isError
          ? { revision: compareRev, state: "error", message: compared.error.message }
          : { revision: compareRev, state: "loading" };

  const revisions = useRevisionList(takeId);
  const who = useMemberNames();
  // a conflict: the list learns who saved the newer revision, and when
  useEffect(() => {
    if (save.status === "conflict") void queryClient.invalidateQueries({ queryKey: editorKeys.revisions(takeId) });
  }, [save.status, queryClient, takeId]);

  const restore = async (revision: number) => {
    setRestoring(revision);
    setNotice(null);
    try {
      let notes: EditorNote[];
      if (revision === 0) {
        if (!draftNotes) throw new Error("The draft's notes are not available on this page.");
        notes = draftNotes;
      } else {
        const d = await queryClient.fetchQuery({
          queryKey: editorKeys.revisionNotes(takeId, revision),
          staleTime: Infinity,
          queryFn: () => apiFetch<CurveNotesDto>(`/api/v1/takes/${takeId}/notes?revision=${revision}&curves=1`),
        });
        notes = withIds(d.notes);
      }
      flushNext.current = true;
      editor.edit(notes, EMPTY_SELECTION);
      setNotice({ tone: "info", text: <>{revision === 0 ? "The draft" : <>Revision <Mono>{revision}</Mono></>} is restored and saved as a new revision. Undo brings your notes back.</> });
    } catch (e) {
      setNotice({ tone: "error", text: `It could not be restored: ${e instanceof ApiClientError || e instanceof Error ? e.message : "unknown error"}` });
    } finally {
      setRestoring(null);
    }
  };

  const roll = (
    <div className="relative">
      <PianoRoll
        notes={editor.notes}
        selection={editor.selection}
        onSelectionChange={editor.select}
        onEdit={canEdit ? editor.edit : undefined}
        readOnly={!canEdit}
        tool={tool}
        grid={grid}
        meter={meter.meter}
        timeView={timeView}
        outlines={outlines}
        heightPx={440}
        bordered={!frame}
      />
      {editor.notes.length === 0 ? (
        <p className="pointer-events-none absolute inset-x-0 top-1/2 text-center text-sm text-ink-muted">
          {canEdit ? "No notes in this take. Choose Draw (D) and drag on a row to add one." : "No notes in this take."}
        </p>
      ) : null}
    </div>
  );

  return (
    <div ref={workspaceRef} className="space-y-3" data-testid="note-editor" data-editable={canEdit}>
      {canEdit ? (
        <div className="flex flex-wrap items-center justify-between gap-x-3 gap-y-2">
          <EditorToolbar
            tool={tool}
            onTool={setTool}
            canUndo={editor.canUndo}
            canRedo={editor.canRedo}
            onUndo={editor.undo}
            onRedo={editor.redo}
            hasSelection={editor.selection.size > 0}
            canPaste={!!editor.clipboard && editor.clipboard.notes.length > 0}
            onCopy={editor.copy}
            onPaste={pasteAt}
            onDelete={editor.remove}
            onResetCents={editor.resetCents}
          />
          <SaveStatus status={save.status} revision={save.baseRevision} error={save.error} onRetry={save.retry} />
        </div>
      ) : null}
      {save.status === "conflict" ? (
        <ConflictPanel
          mine={editor.notes}
          myBase={save.baseRevision}
          theirs={save.theirs}
          theirInfo={theirs ? revisions.data?.find((r) => r.number === theirs.revision) : undefined}
          who={who}
          showTheirs={showTheirs}
          onShowTheirs={setShowTheirs}
          onKeepMine={() => save.keepMine(editor.notes)}
          onTakeTheirs={() => {
            const t = save.takeTheirs();
            if (t) editor.load(t.notes, EMPTY_SELECTION);
          }}
          onReload={() => void save.reloadTheirs()}
        />
      ) : null}
      {notice ? (
        <Alert tone={notice.tone} action={<Button size="sm" variant="ghost" onClick={() => setNotice(null)}>Dismiss</Button>}>
          {notice.text}
        </Alert>
      ) : null}
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_16rem]">
        <div className="min-w-0 space-y-2">
          {frame ? frame(roll, editor.notes, referenceHz) : roll}
          <ViewControls
            timeView={timeView}
            meter={meter}
            snap={canEdit ? { value: snap, onChange: setSnap } : null}
            assignment={{ available: !!expected, shown: showAssignment, onToggle: setShowAssignment, loading: assignment.isPending }}
          />
          <p className="text-xs text-ink-muted">
            Ctrl/⌘ + wheel zooms time, Alt + wheel zooms pitch, Shift + wheel scrolls time. Click the ruler to move the playhead, drag on it to
            loop a stretch, double-click it to clear the loop. Hover a note for its cents; colours show voices.
            {canEdit ? " Arrow keys move the selection (Shift: an octave), Delete removes it." : null}
          </p>
        </div>
        <Inspector notes={editor.notes} selection={editor.selection} editable={canEdit} meter={meter.meter} onVelocity={editor.setVelocity} onResetCents={editor.resetCents} />
      </div>
      <section aria-labelledby="revisions-title" className="space-y-2 pt-2">
        <h3 id="revisions-title" className="text-sm font-semibold text-ink">
          Revisions
        </h3>
        <RevisionsPanel
          revisions={revisions}
          current={save.baseRevision}
          draft={{ noteCount: draftNotes?.length ?? 0, available: !!draftNotes, createdAt: draftAt }}
          who={who}
          editable={canEdit}
          compare={compareState}
          showOutlines={showCompare}
          onShowOutlines={setShowCompare}
          onCompare={(n) => {
            setCompareRev(n);
            setShowCompare(true);
          }}
          onRestore={(n) => void restore(n)}
          restoring={restoring}
        />
      </section>
    </div>
  );
}
