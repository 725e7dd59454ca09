"use client";
import { useCallback, useEffect, useRef, useState, type KeyboardEvent, type PointerEvent } from "react";
import {
  EMPTY_SELECTION,
  MIN_NOTE_SEC,
  addNote,
  apply,
  canRedo,
  canUndo,
  clickSelect,
  copyNotes,
  createHistory,
  freshIds,
  gridStepSec,
  joinNotes,
  marqueeSelect,
  moveNotes,
  nextOfPitch,
  pasteNotes,
  pruneSelection,
  redo,
  removeNotes,
  sameSelection,
  snapTime,
  splitNote,
  stretchNotes,
  undo,
  type Clipboard,
  type EditorNote,
  type History,
  type Marquee,
  type NoteEdge,
  type NoteList,
  type Selection,
  type SnapGrid,
} from "@/lib/editor";
import { drawFrame } from "./draw";
import {
  KEYBOARD_PX,
  RULER_PX,
  clampViewport,
  fitViewport,
  hitTest,
  xToSec,
  yToPitch,
  zoomPitchAt,
  zoomTimeAt,
  type Viewport,
} from "./geometry";
import { readTheme } from "./theme";

export type PianoRollTool = "select" | "draw" | "erase" | "split" | "join";

export type PianoRollProps = {
  notes: NoteList;
  /** Called with the new list after every edit, undo and redo. */
  onChange: (notes: NoteList) => void;
  /** Listeners: selection, scroll and zoom only; no edits. */
  readOnly?: boolean;
  playheadSec?: number;
  durationSec: number;
  tool: PianoRollTool;
  onSelectionChange?: (ids: string[]) => void;
  /** Snap grid for drawing, moving and stretching; off by default. */
  grid?: SnapGrid;
  /** CSS height of the roll (px). */
  heightPx?: number;
  className?: string;
};

/** Arrow-key step in time when the grid is off (s). */
const NUDGE_SEC = 0.05;
/** Length of a drawn note when the grid is off (s). */
const DRAWN_NOTE_SEC = 0.25;
/** A press that moves less than this (px) is a click. */
const CLICK_SLOP_PX = 3;

type Drag =
  | { kind: "move"; x0: number; y0: number; base: NoteList; ids: string[]; anchor: EditorNote; pitch0: number; sec0: number; moved: boolean; clickedId: string }
  | { kind: "stretch"; base: NoteList; ids: string[]; edge: NoteEdge; anchorSec: number }
  | { kind: "marquee"; x0: number; y0: number; sec0: number; pitch0: number; baseSelection: Selection; shift: boolean }
  | { kind: "draw"; base: NoteList; id: string; onsetSec: number; pitch: number; minOffsetSec: number }
  | { kind: "erase"; base: NoteList; erased: Set<string> };

const OFF: SnapGrid = { kind: "off" };

/**
 * The piano roll: a keyboard down the left (C4 = MIDI 60), a time ruler in seconds and the
 * notes as flat rounded rectangles coloured by voice on one canvas, with the copper playhead
 * and selection. Edits go through lib/editor and its history (undo/redo without a limit).
 */
export function PianoRoll({
  notes,
  onChange,
  readOnly = false,
  playheadSec,
  durationSec,
  tool,
  onSelectionChange,
  grid = OFF,
  heightPx = 420,
  className,
}: PianoRollProps) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const history = useRef<History<NoteList>>(createHistory<NoteList>(notes));
  const preview = useRef<NoteList | null>(null);
  const selection = useRef<Selection>(EMPTY_SELECTION);
  const viewport = useRef<Viewport | null>(null);
  const drag = useRef<Drag | null>(null);
  const marquee = useRef<Marquee | null>(null);
  const hover = useRef<string | null>(null);
  const clipboard = useRef<{ clip: Clipboard; fromSec: number } | null>(null);
  const raf = useRef(0);
  const [, setHistoryTick] = useState(0);

  // the latest props, for handlers and the frame callback
  const props = useRef({ onChange, onSelectionChange, readOnly, playheadSec, durationSec, tool, grid });
  props.current = { onChange, onSelectionChange, readOnly, playheadSec, durationSec, tool, grid };

  const shown = () => preview.current ?? history.current.present;

  const draw = useCallback(() => {
    raf.current = 0;
    const canvas = canvasRef.current;
    const v = viewport.current;
    if (!canvas || !v) return;
    const dpr = window.devicePixelRatio || 1;
    const w = Math.round(v.widthPx * dpr);
    const h = Math.round(v.heightPx * dpr);
    if (canvas.width !== w) canvas.width = w;
    if (canvas.height !== h) canvas.height = h;
    const ctx = canvas.getContext("2d");
    if (!ctx) return;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    drawFrame(ctx, {
      viewport: v,
      notes: shown(),
      selection: selection.current,
      theme: readTheme(canvas),
      durationSec: props.current.durationSec,
      playheadSec: props.current.playheadSec,
      marquee: marquee.current,
      grid: props.current.grid,
      hoverId: hover.current,
    });
  }, []);

  const requestDraw = useCallback(() => {
    if (!raf.current) raf.current = requestAnimationFrame(draw);
  }, [draw]);

  useEffect(() => () => cancelAnimationFrame(raf.current), []);

  const setSelection = useCallback(
    (next: Selection) => {
      if (sameSelection(next, selection.current)) return;
      selection.current = next;
      props.current.onSelectionChange?.([...next]);
      requestDraw();
    },
    [requestDraw],
  );

  /** Records an edit in the history and hands the new list to the owner. */
  const commit = useCallback(
    (next: NoteList) => {
      preview.current = null;
      const before = history.current;
      history.current = apply(before, next);
      if (history.current !== before) {
        props.current.onChange(next);
        setHistoryTick((t) => t + 1);
      }
      setSelection(pruneSelection(history.current.present, selection.current));
      requestDraw();
    },
    [requestDraw, setSelection],
  );

  const step = useCallback(
    (dir: "undo" | "redo") => {
      const h = history.current;
      if (dir === "undo" ? !canUndo(h) : !canRedo(h)) return;
      history.current = dir === "undo" ? undo(h) : redo(h);
      props.current.onChange(history.current.present);
      setHistoryTick((t) => t + 1);
      setSelection(pruneSelection(history.current.present, selection.current));
      requestDraw();
    },
    [requestDraw, setSelection],
  );

  // a list from outside (another revision loaded) starts a new history
  useEffect(() => {
    if (notes !== history.current.present) {
      history.current = createHistory<NoteList>(notes);
      preview.current = null;
      drag.current = null;
      setSelection(pruneSelection(notes, selection.current));
    }
    requestDraw();
  }, [notes, requestDraw, setSelection]);

  useEffect(requestDraw, [playheadSec, durationSec, grid, tool, readOnly, requestDraw]);

  // size: follow the element; the first size fits the notes
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const ro = new ResizeObserver(([entry]) => {
      const widthPx = Math.round(entry!.contentRect.width);
      const height = Math.round(entry!.contentRect.height);
      if (widthPx === 0 || height === 0) return;
      const v = viewport.current;
      viewport.current = v
        ? clampViewport({ ...v, widthPx, heightPx: height }, props.current.durationSec)
        : fitViewport(history.current.present, widthPx, height, props.current.durationSec);
      draw();
    });
    ro.observe(canvas);
    return () => ro.disconnect();
  }, [draw]);

  // wheel: ctrl/cmd zooms time, alt zooms pitch, shift (or a sideways wheel) scrolls time, else pitch
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const onWheel = (e: WheelEvent) => {
      const v = viewport.current;
      if (!v) return;
      e.preventDefault();
      const { x, y } = localPoint(canvas, e);
      const dy = e.deltaMode === 1 ? e.deltaY * 16 : e.deltaY;
      const dx = e.deltaMode === 1 ? e.deltaX * 16 : e.deltaX;
      let next: Viewport;
      if (e.ctrlKey || e.metaKey) next = zoomTimeAt(v, Math.max(x, KEYBOARD_PX), Math.exp(-dy * 0.0015));
      else if (e.altKey) next = zoomPitchAt(v, Math.max(y, RULER_PX), Math.exp(-dy * 0.0015));
      else if (e.shiftKey || Math.abs(dx) > Math.abs(dy)) next = { ...v, startSec: v.startSec + (Math.abs(dx) > Math.abs(dy) ? dx : dy) / v.pxPerSec };
      else next = { ...v, topPitch: v.topPitch - dy / v.rowPx };
      viewport.current = clampViewport(next, props.current.durationSec);
      requestDraw();
    };
    canvas.addEventListener("wheel", onWheel, { passive: false });
    return () => canvas.removeEventListener("wheel", onWheel);
  }, [requestDraw]);

  const snap = (sec: number) => snapTime(sec, props.current.grid);

  const onPointerDown = (e: PointerEvent<HTMLCanvasElement>) => {
    const v = viewport.current;
    if (!v || e.button !== 0) return;
    const canvas = e.currentTarget;
    canvas.focus();
    const { x, y } = localPoint(canvas, e);
    if (x < KEYBOARD_PX || y < RULER_PX) return;
    const present = history.current.present;
    const hit = hitTest(v, present, x, y);
    const sec = xToSec(v, x);
    const pitch = yToPitch(v, y);
    const { readOnly: ro, tool: t } = props.current;
    canvas.setPointerCapture(e.pointerId);

    if (!ro && t === "erase") {
      const erased = new Set(hit ? [hit.id] : []);
      drag.current = { kind: "erase", base: present, erased };
      preview.current = removeNotes(present, erased);
      requestDraw();
      return;
    }
    if (!ro && t === "split") {
      if (hit) commit(splitNote(present, hit.id, snap(sec)));
      return;
    }
    if (!ro && t === "join") {
      const partner = hit ? nextOfPitch(present, hit.id) : undefined;
      if (hit && partner) commit(joinNotes(present, hit.id, partner.id));
      return;
    }
    if (!ro && t === "draw" && !hit) {
      const onsetSec = Math.max(0, snap(sec));
      const id = freshIds(present, 1)[0]!;
      const length = gridStepSec(props.current.grid) ?? DRAWN_NOTE_SEC;
      const p = Math.min(127, Math.max(0, pitch));
      drag.current = { kind: "draw", base: present, id, onsetSec, pitch: p, minOffsetSec: onsetSec + length };
      preview.current = addNote(present, { id, onsetSec, offsetSec: onsetSec + length, pitch: p, cents: 0, velocity: 80, voice: 1 });
      setSelection(new Set([id]));
      requestDraw();
      return;
    }
    // select (and draw over an existing note): select, move, stretch, marquee
    if (!hit) {
      drag.current = { kind: "marquee", x0: x, y0: y, sec0: sec, pitch0: pitch, baseSelection: selection.current, shift: e.shiftKey };
      return;
    }
    if (e.shiftKey) {
      setSelection(clickSelect(selection.current, hit.id, true));
      if (!selection.current.has(hit.id)) return;
    } else if (!selection.current.has(hit.id)) {
      setSelection(clickSelect(selection.current, hit.id, false));
    }
    if (ro) return;
    const anchor = present.find((n) => n.id === hit.id)!;
    const ids = [...selection.current];
    if (hit.part !== "body") {
      drag.current = { kind: "stretch", base: present, ids, edge: hit.part, anchorSec: hit.part === "onset" ? anchor.onsetSec : anchor.offsetSec };
    } else {
      drag.current = { kind: "move", x0: x, y0: y, base: present, ids, anchor, pitch0: pitch, sec0: sec, moved: false, clickedId: hit.id };
    }
  };

  const onPointerMove = (e: PointerEvent<HTMLCanvasElement>) => {
    const v = viewport.current;
    if (!v) return;
    const canvas = e.currentTarget;
    const { x, y } = localPoint(canvas, e);
    const sec = xToSec(v, x);
    const pitch = yToPitch(v, y);
    const d = drag.current;
    if (!d) {
      const hit = hitTest(v, history.current.present, x, y);
      if ((hit?.id ?? null) !== hover.current) {
        hover.current = hit?.id ?? null;
        requestDraw();
      }
      canvas.style.cursor = cursorFor(props.current.tool, props.current.readOnly, hit?.part ?? null);
      return;
    }
    switch (d.kind) {
      case "move": {
        if (!d.moved && Math.hypot(x - d.x0, y - d.y0) < CLICK_SLOP_PX) return;
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
        setSelection(marqueeSelect(history.current.present, d.baseSelection, marquee.current, d.shift));
        break;
      }
    }
    requestDraw();
  };

  const onPointerUp = (e: PointerEvent<HTMLCanvasElement>) => {
    const d = drag.current;
    drag.current = null;
    if (e.currentTarget.hasPointerCapture(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
    if (!d) return;
    switch (d.kind) {
      case "move":
        if (d.moved && preview.current) commit(preview.current);
        else {
          preview.current = null;
          // a plain click on a note of a larger selection selects just that note
          if (!e.shiftKey) setSelection(new Set([d.clickedId]));
        }
        break;
      case "stretch":
      case "draw":
      case "erase":
        if (preview.current) commit(preview.current);
        break;
      case "marquee":
        if (!marquee.current && !d.shift) setSelection(EMPTY_SELECTION);
        marquee.current = null;
        break;
    }
    requestDraw();
  };

  const onPointerCancel = () => {
    drag.current = null;
    preview.current = null;
    marquee.current = null;
    requestDraw();
  };

  const onKeyDown = (e: KeyboardEvent<HTMLCanvasElement>) => {
    const mod = e.ctrlKey || e.metaKey;
    const key = e.key.toLowerCase();
    const present = history.current.present;
    const sel = [...selection.current];
    const ro = props.current.readOnly;
    if (drag.current) return;
    if (mod && key === "a") {
      e.preventDefault();
      setSelection(new Set(present.map((n) => n.id)));
      return;
    }
    if (key === "escape") {
      setSelection(EMPTY_SELECTION);
      return;
    }
    if (mod && key === "c") {
      if (sel.length === 0) return;
      e.preventDefault();
      const clip = copyNotes(present, sel);
      const fromSec = Math.min(...present.filter((n) => selection.current.has(n.id)).map((n) => n.onsetSec));
      clipboard.current = { clip, fromSec };
      return;
    }
    if (ro) return;
    if (mod && (key === "z" || key === "y")) {
      e.preventDefault();
      step(key === "y" || e.shiftKey ? "redo" : "undo");
      return;
    }
    if (mod && key === "v") {
      const c = clipboard.current;
      if (!c || c.clip.notes.length === 0) return;
      e.preventDefault();
      const at = props.current.playheadSec ?? c.fromSec + c.clip.spanSec;
      const ids = freshIds(present, c.clip.notes.length);
      commit(pasteNotes(present, c.clip, at, ids));
      setSelection(new Set(ids));
      return;
    }
    if (sel.length === 0) return;
    if (key === "delete" || key === "backspace") {
      e.preventDefault();
      commit(removeNotes(present, sel));
      setSelection(EMPTY_SELECTION);
      return;
    }
    const timeStep = gridStepSec(props.current.grid) ?? NUDGE_SEC;
    const moves: Record<string, [number, number]> = {
      arrowleft: [-timeStep, 0],
      arrowright: [timeStep, 0],
      arrowup: [0, e.shiftKey ? 12 : 1],
      arrowdown: [0, e.shiftKey ? -12 : -1],
    };
    const m = moves[key];
    if (m) {
      e.preventDefault();
      commit(moveNotes(present, sel, m[0], m[1]));
    }
  };

  return (
    <canvas
      ref={canvasRef}
      data-testid="piano-roll"
      tabIndex={0}
      role="application"
      aria-label={`Piano roll: ${shown().length} notes, ${readOnly ? "read-only" : `${tool} tool`}. Arrow keys move the selection, Delete removes it, Ctrl or Cmd+Z undoes.`}
      aria-roledescription="piano roll"
      className={`block w-full touch-none select-none rounded-md border border-rule bg-paper focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-copper ${className ?? ""}`}
      style={{ height: heightPx }}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={onPointerUp}
      onPointerCancel={onPointerCancel}
      onPointerLeave={() => {
        if (hover.current !== null && !drag.current) {
          hover.current = null;
          requestDraw();
        }
      }}
      onKeyDown={onKeyDown}
    />
  );
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
