"use client";
import { useCallback, useEffect, useLayoutEffect, useRef, type PointerEvent } from "react";
import {
  EMPTY_SELECTION,
  MIN_NOTE_SEC,
  addNote,
  clickSelect,
  freshIds,
  gridStepSec,
  joinNotes,
  marqueeSelect,
  moveNotes,
  nextOfPitch,
  removeNotes,
  sameSelection,
  snapTime,
  splitNote,
  stretchNotes,
  type EditorNote,
  type Marquee,
  type NoteEdge,
  type NoteList,
  type Selection,
  type SnapGrid,
} from "@/lib/editor";
import type { TimeView, TimeViewState } from "@/components/timeline/time-view";
import { drawBase, drawTop, type Outlines } from "./draw";
import {
  KEYBOARD_PX,
  MAX_ROW_PX,
  MIN_ROW_PX,
  RULER_PX,
  clamp,
  hitTest,
  noteAreaHeight,
  xToSec,
  yToPitch,
  zoomPitchAt,
  type Viewport,
} from "./geometry";
import type { Meter } from "./ruler";
import { readTheme, type RollTheme } from "./theme";

export type PianoRollTool = "select" | "draw" | "erase" | "split" | "join";

export type PianoRollProps = {
  /** The notes as currently edited (the editor's present). */
  notes: NoteList;
  /** Committed edits (a drag ends, a click with the draw/erase/split/join tools), with the selection that goes with them. */
  onEdit?: (next: NoteList, selection?: Selection) => void;
  selection: Selection;
  onSelectionChange: (next: Selection) => void;
  /** Listeners: selection, scroll, zoom and seeking only. Also read-only without `onEdit`. */
  readOnly?: boolean;
  tool?: PianoRollTool;
  /** Snap grid for drawing, moving and stretching; off by default. */
  grid?: SnapGrid;
  /** When set, the ruler shows bars and beats below the seconds. */
  meter?: Meter | null;
  /** The shared time axis: the roll reads its window, playhead and loop there and writes zoom, scroll, seek and loop back. */
  timeView: TimeView;
  /** Notes drawn as outlines (assignment, a compared revision, theirs). */
  outlines?: readonly Outlines[];
  /** Keys pressed while the roll has focus (the editor's shortcuts). */
  onKeyDown?: (e: React.KeyboardEvent<HTMLCanvasElement>) => void;
  /** CSS height of the roll (px). */
  heightPx?: number;
  className?: string;
  label?: string;
  /** Its own rounded border; off inside a frame that has one (the timeline). */
  bordered?: boolean;
};

/** Length of a drawn note when the grid is off (s). */
const DRAWN_NOTE_SEC = 0.25;
/** A press that moves less than this (px) is a click. */
const CLICK_SLOP_PX = 3;
const OFF: SnapGrid = { kind: "off" };
const NO_OUTLINES: readonly Outlines[] = [];

type Drag =
  | { kind: "move"; x0: number; y0: number; base: NoteList; ids: string[]; anchor: EditorNote; pitch0: number; sec0: number; moved: boolean; clickedId: string }
  | { kind: "stretch"; base: NoteList; ids: string[]; edge: NoteEdge; anchorSec: number }
  | { kind: "marquee"; x0: number; y0: number; sec0: number; pitch0: number; baseSelection: Selection; shift: boolean }
  | { kind: "draw"; base: NoteList; id: string; onsetSec: number; pitch: number; minOffsetSec: number }
  | { kind: "erase"; base: NoteList; erased: Set<string> }
  | { kind: "ruler"; x0: number; sec0: number; moved: boolean };

/**
 * The piano roll, controlled: a keyboard down the left (C4 = MIDI 60), a ruler (seconds, and
 * bars and beats when a tempo is set), the notes as flat rounded rectangles coloured by voice
 * with their pitch-curve lines, the copper selection, playhead and loop. The notes, the selection
 * and the undo history belong to the owner (components/editor); the time window to the shared
 * TimeView, so the waveform and spectrogram above follow its zoom and scroll. Vertical zoom is
 * the roll's own. Drawing is on canvas, in animation frames: a playhead or window change never
 * re-renders React.
 */
export function PianoRoll({
  notes,
  onEdit,
  selection,
  onSelectionChange,
  readOnly = false,
  tool = "select",
  grid = OFF,
  meter = null,
  timeView,
  outlines = NO_OUTLINES,
  onKeyDown,
  heightPx = 420,
  className,
  label,
  bordered = true,
}: PianoRollProps) {
  const baseRef = useRef<HTMLCanvasElement>(null);
  const topRef = useRef<HTMLCanvasElement>(null);
  const pitchView = useRef<{ topPitch: number; rowPx: number } | null>(null);
  const size = useRef({ widthPx: 0, heightPx: 0 });
  const preview = useRef<NoteList | null>(null);
  const liveSelection = useRef<Selection>(selection);
  const drag = useRef<Drag | null>(null);
  const marquee = useRef<Marquee | null>(null);
  const hover = useRef<string | null>(null);
  const theme = useRef<RollTheme | null>(null);
  const raf = useRef(0);
  const dirty = useRef({ base: true, top: true });
  const timeFitted = useRef(false);

  const editable = !readOnly && !!onEdit;
  // the latest props, for handlers and the frame callback
  const props = useRef({ notes, onEdit, onSelectionChange, editable, tool, grid, meter, outlines, timeView });
  props.current = { notes, onEdit, onSelectionChange, editable, tool, grid, meter, outlines, timeView };
  if (!drag.current) liveSelection.current = selection;

  const shown = () => preview.current ?? props.current.notes;

  const viewport = useCallback((): Viewport | null => {
    const p = pitchView.current;
    const { widthPx, heightPx: h } = size.current;
    if (!p || widthPx === 0) return null;
    const w = props.current.timeView.get().window;
    return { startSec: w.startSec, pxPerSec: w.pxPerSec, topPitch: p.topPitch, rowPx: p.rowPx, widthPx, heightPx: h };
  }, []);

  const paint = useCallback(() => {
    raf.current = 0;
    if (!timeFitted.current && size.current.widthPx > 0) {
      // a fresh time view (nobody has zoomed yet, nor fitted it, as the timeline around the roll
      // does) starts showing the first 30 s, or the whole take
      timeFitted.current = true;
      const tv = props.current.timeView;
      const s = tv.get();
      if (s.window.startSec === 0 && s.window.pxPerSec === 100 && s.durationSec > 0) {
        tv.setWindow({ startSec: 0, pxPerSec: (size.current.widthPx - KEYBOARD_PX) / Math.min(s.durationSec, 30) });
      }
    }
    const v = viewport();
    const base = baseRef.current;
    const top = topRef.current;
    if (!v || !base || !top) return;
    const t = (theme.current ??= readTheme(base));
    const dpr = window.devicePixelRatio || 1;
    const w = Math.round(v.widthPx * dpr);
    const h = Math.round(v.heightPx * dpr);
    const state: TimeViewState = props.current.timeView.get();
    if (dirty.current.base || base.width !== w || base.height !== h) {
      const startedMs = performance.now();
      if (base.width !== w) base.width = w;
      if (base.height !== h) base.height = h;
      const ctx = base.getContext("2d", { alpha: false });
      if (ctx) {
        ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
        drawBase(ctx, {
          viewport: v,
          notes: shown(),
          selection: liveSelection.current,
          theme: t,
          durationSec: state.durationSec,
          grid: props.current.grid,
          meter: props.current.meter,
          loop: state.loop,
          outlines: props.current.outlines,
        });
      }
      // what the roll shows, for tests and tools that need to aim at a note
      const d = base.dataset;
      d.startSec = String(v.startSec);
      d.pxPerSec = String(v.pxPerSec);
      d.topPitch = String(v.topPitch);
      d.rowPx = String(v.rowPx);
      dirty.current.base = false;
      const stats = rollStats();
      const endedMs = performance.now();
      if (stats.drawMs.length >= 10_000) stats.drawMs.splice(0, 5_000);
      stats.drawMs.push(endedMs - startedMs);
      if (stats.firstNotesPaintMs === null && shown().length > 0) stats.firstNotesPaintMs = endedMs;
    }
    if (top.width !== w) top.width = w;
    if (top.height !== h) top.height = h;
    const tctx = top.getContext("2d");
    if (tctx) {
      tctx.setTransform(dpr, 0, 0, dpr, 0, 0);
      const hovered = hover.current && !drag.current ? (shown().find((n) => n.id === hover.current) ?? null) : null;
      drawTop(tctx, {
        viewport: v,
        theme: t,
        playheadSec: state.playheadSec,
        marquee: marquee.current,
        hover: hovered,
        selected: hovered ? liveSelection.current.has(hovered.id) : false,
      });
    }
    dirty.current.top = false;
  }, [viewport]);

  const request = useCallback(
    (layer: "base" | "top" = "base") => {
      if (layer === "base") dirty.current.base = true;
      dirty.current.top = true;
      if (!raf.current) raf.current = requestAnimationFrame(paint);
    },
    [paint],
  );

  // (a layout effect: it runs before the first frame, so before the first paint)
  useLayoutEffect(() => {
    const stats = rollStats();
    stats.mountMs = performance.now();
    stats.firstNotesPaintMs = null;
  }, []);

  useEffect(
    () => () => {
      cancelAnimationFrame(raf.current);
      raf.current = 0; // (strict mode mounts twice: a stale id would block every later frame)
    },
    [],
  );

  // the time view: window and loop repaint the base, the playhead only the top layer
  useEffect(
    () =>
      timeView.subscribe((_s, changed) => {
        if (changed.window || changed.loop) request("base");
        else if (changed.playhead) request("top");
      }),
    [timeView, request],
  );

  // a colour scheme change re-reads the theme
  useEffect(() => {
    const mq = window.matchMedia("(prefers-color-scheme: dark)");
    const onChange = () => {
      theme.current = null;
      request("base");
    };
    mq.addEventListener("change", onChange);
    return () => mq.removeEventListener("change", onChange);
  }, [request]);

  // new notes, selection, grid, outlines from the owner: the preview of a finished drag is done
  useEffect(() => {
    if (!drag.current) preview.current = null;
    request("base");
  }, [notes, selection, grid, meter, outlines, tool, readOnly, request]);

  // size: measured at mount, so the notes are drawn in the first frame that shows the roll (not
  // a frame later, when the ResizeObserver first reports), then followed; the first size fits the
  // notes' pitch range
  useLayoutEffect(() => {
    const canvas = baseRef.current;
    if (!canvas) return;
    const resize = (widthPx: number, h: number): boolean => {
      if (widthPx === 0 || h === 0) return false;
      if (pitchView.current && size.current.widthPx === widthPx && size.current.heightPx === h) return false;
      size.current = { widthPx, heightPx: h };
      props.current.timeView.setAreaWidth(widthPx - KEYBOARD_PX);
      pitchView.current = pitchView.current ? clampPitch(pitchView.current, h) : fitPitch(props.current.notes, h);
      return true;
    };
    resize(canvas.clientWidth, canvas.clientHeight);
    request("base");
    const ro = new ResizeObserver(([entry]) => {
      if (resize(Math.round(entry!.contentRect.width), Math.round(entry!.contentRect.height))) request("base");
    });
    ro.observe(canvas);
    return () => ro.disconnect();
  }, [request]);

  // wheel: ctrl/cmd zooms time, alt zooms pitch, shift (or a sideways wheel) scrolls time, else pitch
  useEffect(() => {
    const canvas = baseRef.current;
    if (!canvas) return;
    const onWheel = (e: WheelEvent) => {
      const v = viewport();
      if (!v) return;
      e.preventDefault();
      const { x, y } = localPoint(canvas, e);
      const dy = e.deltaMode === 1 ? e.deltaY * 16 : e.deltaY;
      const dx = e.deltaMode === 1 ? e.deltaX * 16 : e.deltaX;
      const tv = props.current.timeView;
      if (e.ctrlKey || e.metaKey) tv.zoomAt(xToSec(v, Math.max(x, KEYBOARD_PX)), Math.exp(-dy * 0.0015));
      else if (e.altKey) {
        const z = zoomPitchAt(v, Math.max(y, RULER_PX), Math.exp(-dy * 0.0015));
        pitchView.current = clampPitch({ topPitch: z.topPitch, rowPx: z.rowPx }, v.heightPx);
        request("base");
      } else if (e.shiftKey || Math.abs(dx) > Math.abs(dy)) tv.scrollByPx(Math.abs(dx) > Math.abs(dy) ? dx : dy);
      else {
        pitchView.current = clampPitch({ topPitch: v.topPitch - dy / v.rowPx, rowPx: v.rowPx }, v.heightPx);
        request("base");
      }
    };
    canvas.addEventListener("wheel", onWheel, { passive: false });
    return () => canvas.removeEventListener("wheel", onWheel);
  }, [viewport, request]);

  const snap = (sec: number) => snapTime(sec, props.current.grid);

  const select = (next: Selection) => {
    if (sameSelection(next, liveSelection.current)) return;
    liveSelection.current = next;
    props.current.onSelectionChange(next);
    request("base");
  };

  const commit = (next: NoteList, nextSelection?: Selection) => {
    const { onEdit: edit, notes: present } = props.current;
    if (nextSelection) liveSelection.current = nextSelection;
    if (edit && next !== present) edit(next, nextSelection);
    else {
      preview.current = null;
      if (nextSelection) props.current.onSelectionChange(nextSelection);
    }
    request("base");
  };

  const onPointerDown = (e: PointerEvent<HTMLCanvasElement>) => {
    const v = viewport();
    if (!v || e.button !== 0) return;
    const canvas = e.currentTarget;
    canvas.focus();
    const { x, y } = localPoint(canvas, e);
    if (x < KEYBOARD_PX) return;
    const sec = xToSec(v, x);
    canvas.setPointerCapture(e.pointerId);
    if (y < RULER_PX) {
      drag.current = { kind: "ruler", x0: x, sec0: Math.max(0, sec), moved: false };
      return;
    }
    const present = props.current.notes;
    const hit = hitTest(v, present, x, y);
    const pitch = yToPitch(v, y);
    const { editable: canEdit, tool: t } = props.current;

    if (canEdit && t === "erase") {
      const erased = new Set(hit ? [hit.id] : []);
      drag.current = { kind: "erase", base: present, erased };
      preview.current = removeNotes(present, erased);
      request("base");
      return;
    }
    if (canEdit && t === "split") {
      if (hit) commit(splitNote(present, hit.id, snap(sec)));
      return;
    }
    if (canEdit && t === "join") {
      const partner = hit ? nextOfPitch(present, hit.id) : undefined;
      if (hit && partner) commit(joinNotes(present, hit.id, partner.id), new Set([hit.id]));
      return;
    }
    if (canEdit && t === "draw" && !hit) {
      const onsetSec = Math.max(0, snap(sec));
      const id = freshIds(present, 1)[0]!;
      const length = gridStepSec(props.current.grid) ?? DRAWN_NOTE_SEC;
      const p = clamp(pitch, 0, 127);
      drag.current = { kind: "draw", base: present, id, onsetSec, pitch: p, minOffsetSec: onsetSec + length };
      preview.current = addNote(present, { id, onsetSec, offsetSec: onsetSec + length, pitch: p, cents: 0, velocity: 80, voice: 1 });
      liveSelection.current = new Set([id]);
      request("base");
      return;
    }
    // select (and draw over an existing note): select, move, stretch, marquee
    if (!hit) {
      drag.current = { kind: "marquee", x0: x, y0: y, sec0: sec, pitch0: pitch, baseSelection: liveSelection.current, shift: e.shiftKey };
      return;
    }
    if (e.shiftKey) {
      select(clickSelect(liveSelection.current, hit.id, true));
      if (!liveSelection.current.has(hit.id)) return;
    } else if (!liveSelection.current.has(hit.id)) {
      select(clickSelect(liveSelection.current, hit.id, false));
    }
    const anchor = present.find((n) => n.id === hit.id)!;
    const ids = [...liveSelection.current];
    if (!canEdit) {
      drag.current = { kind: "move", x0: x, y0: y, base: present, ids, anchor, pitch0: pitch, sec0: sec, moved: false, clickedId: hit.id };
      return;
    }
    if (hit.part !== "body") {
      drag.current = { kind: "stretch", base: present, ids, edge: hit.part, anchorSec: hit.part === "onset" ? anchor.onsetSec : anchor.offsetSec };
    } else {
      drag.current = { kind: "move", x0: x, y0: y, base: present, ids, anchor, pitch0: pitch, sec0: sec, moved: false, clickedId: hit.id };
    }
  };

  const onPointerMove = (e: PointerEvent<HTMLCanvasElement>) => {
    const v = viewport();
    if (!v) return;
    const canvas = e.currentTarget;
    const { x, y } = localPoint(canvas, e);
    const sec = xToSec(v, x);
    const pitch = yToPitch(v, y);
    const d = drag.current;
    if (!d) {
      const hit = y >= RULER_PX ? hitTest(v, props.current.notes, x, y) : null;
      if ((hit?.id ?? null) !== hover.current) {
        hover.current = hit?.id ?? null;
        request("top");
      }
      canvas.style.cursor = y < RULER_PX && x >= KEYBOARD_PX ? "text" : cursorFor(props.current.tool, !props.current.editable, hit?.part ?? null);
      return;
    }
    switch (d.kind) {
      case "ruler": {
        if (!d.moved && Math.abs(x - d.x0) < CLICK_SLOP_PX) return;
        d.moved = true;
        const a = snap(d.sec0);
        const b = snap(Math.max(0, sec));
        props.current.timeView.setLoop({ startSec: Math.min(a, b), endSec: Math.max(a, b) });
        return;
      }
      case "move": {
        if (!d.moved && Math.hypot(x - d.x0, y - d.y0) < CLICK_SLOP_PX) return;
        if (!props.current.editable) return;
        d.moved = true;
        const onset = snap(d.anchor.onsetSec + (sec - d.sec0));
        preview.current = moveNotes(d.base, d.ids, onset - d.anchor.onsetSec, pitch - d.pitch0);
        break;
      }
      case "stretch":
        preview.current = stretchNotes(d.base, d.ids, d.edge, snap(sec) - d.anchorSec);
        break;
      case "draw": {
        const offsetSec = Math.max(d.minOffsetSec, snap(sec), d.onsetSec + MIN_NOTE_SEC);
        preview.current = addNote(d.base, { id: d.id, onsetSec: d.onsetSec, offsetSec, pitch: d.pitch, cents: 0, velocity: 80, voice: 1 });
        break;
      }
      case "erase": {
        const hit = hitTest(v, d.base, x, y);
        if (hit && !d.erased.has(hit.id)) {
          d.erased.add(hit.id);
          preview.current = removeNotes(d.base, d.erased);
        }
        break;
      }
      case "marquee": {
        if (Math.hypot(x - d.x0, y - d.y0) < CLICK_SLOP_PX && !marquee.current) return;
        marquee.current = { t0Sec: d.sec0, t1Sec: sec, pitchA: d.pitch0, pitchB: pitch };
        select(marqueeSelect(props.current.notes, d.baseSelection, marquee.current, d.shift));
        request("top");
        return;
      }
    }
    request("base");
  };

  const onPointerUp = (e: PointerEvent<HTMLCanvasElement>) => {
    const d = drag.current;
    drag.current = null;
    if (e.currentTarget.hasPointerCapture(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
    if (!d) return;
    switch (d.kind) {
      case "ruler":
        if (!d.moved) props.current.timeView.seek(d.sec0);
        break;
      case "move":
        if (d.moved && preview.current) commit(preview.current, liveSelection.current);
        else {
          preview.current = null;
          // a plain click on a note of a larger selection selects just that note
          if (!e.shiftKey) select(new Set([d.clickedId]));
        }
        break;
      case "draw":
        if (preview.current) commit(preview.current, new Set([d.id]));
        break;
      case "stretch":
      case "erase":
        if (preview.current) commit(preview.current, d.kind === "erase" ? EMPTY_SELECTION : liveSelection.current);
        break;
      case "marquee":
        if (!marquee.current && !d.shift) select(EMPTY_SELECTION);
        marquee.current = null;
        break;
    }
    request("base");
  };

  const onPointerCancel = () => {
    drag.current = null;
    preview.current = null;
    marquee.current = null;
    liveSelection.current = selection;
    request("base");
  };

  const count = shown().length;
  return (
    <div className={`relative ${className ?? ""}`} style={{ height: heightPx }}>
      <canvas
        ref={baseRef}
        data-testid="piano-roll"
        tabIndex={0}
        role="application"
        aria-label={
          label ??
          `Piano roll: ${count} notes, ${editable ? `${tool} tool` : "read-only"}. Click the ruler to move the playhead, drag on it to set a loop.`
        }
        aria-roledescription="piano roll"
        className={`block h-full w-full touch-none select-none bg-paper focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-copper ${bordered ? "rounded-md border border-rule" : ""}`}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={onPointerUp}
        onPointerCancel={onPointerCancel}
        onDoubleClick={(e) => {
          const { x, y } = localPoint(e.currentTarget, e);
          if (y < RULER_PX && x >= KEYBOARD_PX) props.current.timeView.setLoop(null);
        }}
        onPointerLeave={() => {
          if (hover.current !== null && !drag.current) {
            hover.current = null;
            request("top");
          }
        }}
        onKeyDown={onKeyDown}
      />
      {/* the playhead, marquee and hover layer; the base canvas under it takes the pointer */}
      <canvas
        ref={topRef}
        aria-hidden="true"
        className={`pointer-events-none absolute ${bordered ? "inset-px h-[calc(100%-2px)] w-[calc(100%-2px)]" : "inset-0 h-full w-full"}`}
      />
    </div>
  );
}

/**
 * The roll's timings, for `npm run bench:editor` (scripts/bench-editor.ts): when it mounted, when
 * it first drew notes (ms on the page's clock) and how long each full draw took.
 */
export type RollStats = { mountMs: number | null; firstNotesPaintMs: number | null; drawMs: number[] };

function rollStats(): RollStats {
  const w = window as unknown as { __tapernoteRollStats?: RollStats };
  return (w.__tapernoteRollStats ??= { mountMs: null, firstNotesPaintMs: null, drawMs: [] });
}

function fitPitch(notes: NoteList, heightPx: number): { topPitch: number; rowPx: number } {
  let lo = 127;
  let hi = 0;
  for (const n of notes) {
    if (n.pitch < lo) lo = n.pitch;
    if (n.pitch > hi) hi = n.pitch;
  }
  if (lo > hi) [lo, hi] = [48, 84];
  const areaPx = Math.max(1, heightPx - RULER_PX);
  const rows = hi - lo + 5;
  const rowPx = clamp(Math.floor(areaPx / rows), 8, 18);
  return clampPitch({ rowPx, topPitch: (lo + hi) / 2 + areaPx / rowPx / 2 }, heightPx);
}

function clampPitch(p: { topPitch: number; rowPx: number }, heightPx: number): { topPitch: number; rowPx: number } {
  const rowPx = clamp(p.rowPx, MIN_ROW_PX, MAX_ROW_PX);
  const visibleRows = noteAreaHeight({ startSec: 0, pxPerSec: 1, topPitch: 0, rowPx, widthPx: 0, heightPx }) / rowPx;
  return { rowPx, topPitch: clamp(p.topPitch, Math.min(127, visibleRows - 1), 127) };
}

function localPoint(canvas: HTMLCanvasElement, e: { clientX: number; clientY: number }): { x: number; y: number } {
  // content-box coordinates: the drawing starts inside the border
  const rect = canvas.getBoundingClientRect();
  return { x: e.clientX - rect.left - canvas.clientLeft, y: e.clientY - rect.top - canvas.clientTop };
}

function cursorFor(tool: PianoRollTool, readOnly: boolean, part: "body" | "onset" | "offset" | null): string {
  if (readOnly) return part ? "pointer" : "default";
  if (tool === "erase") return part ? "not-allowed" : "default";
  if (tool === "split") return part ? "col-resize" : "default";
  if (tool === "join") return part ? "pointer" : "default";
  if (part === "onset" || part === "offset") return "ew-resize";
  if (part === "body") return "move";
  return tool === "draw" ? "crosshair" : "default";
}
