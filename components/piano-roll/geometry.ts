/**
 * The piano roll's coordinate maths: seconds ↔ x, MIDI pitch ↔ y, hit tests and ruler steps.
 * Pure (no DOM), so it is unit-tested beside lib/editor.
 */
import type { EditorNote, NoteList } from "@/lib/editor";

/** Width of the keyboard down the left and height of the time ruler along the top (CSS px: seconds above, bars and beats below). */
export const KEYBOARD_PX = 56;
export const RULER_PX = 34;
/** How near (px) to a note's end a press grabs that end for stretching. */
export const EDGE_GRAB_PX = 6;

export const MIN_PX_PER_SEC = 4;
export const MAX_PX_PER_SEC = 4000;
export const MIN_ROW_PX = 4;
export const MAX_ROW_PX = 40;

/**
 * What is on screen: `startSec` at the left edge of the note area, `pxPerSec` across,
 * `topPitch` (fractional) at the top edge of the note area and `rowPx` per semitone.
 */
export type Viewport = { startSec: number; pxPerSec: number; topPitch: number; rowPx: number; widthPx: number; heightPx: number };

export const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/** x (CSS px in the canvas) of a time. */
export function secToX(v: Viewport, sec: number): number {
  return KEYBOARD_PX + (sec - v.startSec) * v.pxPerSec;
}
export function xToSec(v: Viewport, x: number): number {
  return v.startSec + (x - KEYBOARD_PX) / v.pxPerSec;
}
/** y of the top edge of a pitch's row. Pitch rises upward: row `topPitch` is at the top. */
export function pitchToY(v: Viewport, pitch: number): number {
  return RULER_PX + (v.topPitch - pitch) * v.rowPx;
}
/** The integer pitch whose row contains y. */
export function yToPitch(v: Viewport, y: number): number {
  return Math.floor(v.topPitch - (y - RULER_PX) / v.rowPx) + 1;
}

export function noteAreaWidth(v: Viewport): number {
  return Math.max(0, v.widthPx - KEYBOARD_PX);
}
export function noteAreaHeight(v: Viewport): number {
  return Math.max(0, v.heightPx - RULER_PX);
}

/** Time and pitch ranges visible in the note area (pitches inclusive). */
export function visibleRange(v: Viewport): { t0Sec: number; t1Sec: number; lowPitch: number; highPitch: number } {
  const t1Sec = v.startSec + noteAreaWidth(v) / v.pxPerSec;
  const highPitch = Math.min(127, Math.ceil(v.topPitch));
  const lowPitch = Math.max(0, Math.floor(v.topPitch - noteAreaHeight(v) / v.rowPx));
  return { t0Sec: v.startSec, t1Sec, lowPitch, highPitch };
}

/** Keeps the view inside 0…durationSec and pitches 0–127, with zooms inside their limits. */
export function clampViewport(v: Viewport, durationSec: number): Viewport {
  const pxPerSec = clamp(v.pxPerSec, MIN_PX_PER_SEC, MAX_PX_PER_SEC);
  const rowPx = clamp(v.rowPx, MIN_ROW_PX, MAX_ROW_PX);
  const visibleSec = noteAreaWidth(v) / pxPerSec;
  const startSec = clamp(v.startSec, 0, Math.max(0, durationSec - visibleSec * 0.5));
  const visibleRows = noteAreaHeight(v) / rowPx;
  const topPitch = clamp(v.topPitch, Math.min(127, visibleRows - 1), 127);
  return { ...v, pxPerSec, rowPx, startSec, topPitch };
}

/** Zooms time by `factor` keeping the time under x where it is. */
export function zoomTimeAt(v: Viewport, x: number, factor: number): Viewport {
  const at = xToSec(v, x);
  const pxPerSec = clamp(v.pxPerSec * factor, MIN_PX_PER_SEC, MAX_PX_PER_SEC);
  return { ...v, pxPerSec, startSec: at - (x - KEYBOARD_PX) / pxPerSec };
}

/** Zooms pitch rows by `factor` keeping the pitch under y where it is. */
export function zoomPitchAt(v: Viewport, y: number, factor: number): Viewport {
  const at = v.topPitch - (y - RULER_PX) / v.rowPx;
  const rowPx = clamp(v.rowPx * factor, MIN_ROW_PX, MAX_ROW_PX);
  return { ...v, rowPx, topPitch: at + (y - RULER_PX) / rowPx };
}

/** A view that shows the notes' pitch range (or C3–C6 with none), from the start. */
export function fitViewport(notes: NoteList, widthPx: number, heightPx: number, durationSec: number): Viewport {
  let lo = 127;
  let hi = 0;
  for (const n of notes) {
    lo = Math.min(lo, n.pitch);
    hi = Math.max(hi, n.pitch);
  }
  if (lo > hi) [lo, hi] = [48, 84];
  const rows = hi - lo + 5;
  const rowPx = clamp(Math.floor((heightPx - RULER_PX) / rows), 8, 18);
  const pxPerSec = clamp((widthPx - KEYBOARD_PX) / Math.max(1, Math.min(durationSec, 20)), MIN_PX_PER_SEC, MAX_PX_PER_SEC);
  const mid = (lo + hi) / 2;
  const topPitch = mid + (heightPx - RULER_PX) / rowPx / 2;
  return clampViewport({ startSec: 0, pxPerSec, topPitch, rowPx, widthPx, heightPx }, durationSec);
}

export type NoteRect = { x: number; y: number; w: number; h: number };

export function noteRect(v: Viewport, n: Pick<EditorNote, "onsetSec" | "offsetSec" | "pitch">): NoteRect {
  const x = secToX(v, n.onsetSec);
  return { x, y: pitchToY(v, n.pitch), w: Math.max(1, secToX(v, n.offsetSec) - x), h: v.rowPx };
}

export type Hit = { id: string; part: "body" | "onset" | "offset" };

/**
 * The note under (x, y), topmost (last drawn) first, and which part: an end within
 * `EDGE_GRAB_PX` (but never more than a third of a short note) or the body.
 */
export function hitTest(v: Viewport, notes: NoteList, x: number, y: number): Hit | null {
  if (x < KEYBOARD_PX || y < RULER_PX) return null;
  const pitch = yToPitch(v, y);
  for (let i = notes.length - 1; i >= 0; i--) {
    const n = notes[i]!;
    if (n.pitch !== pitch) continue;
    const r = noteRect(v, n);
    if (x < r.x - 2 || x > r.x + r.w + 2) continue;
    const grab = Math.min(EDGE_GRAB_PX, r.w / 3);
    if (x >= r.x + r.w - grab) return { id: n.id, part: "offset" };
    if (x <= r.x + grab) return { id: n.id, part: "onset" };
    return { id: n.id, part: "body" };
  }
  return null;
}

/** A ruler step (1, 2 or 5 × 10^k s) giving labels at least `minPx` apart. */
export function rulerStepSec(pxPerSec: number, minPx = 70): number {
  const raw = minPx / pxPerSec;
  const p = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 5, 10]) if (m * p >= raw - 1e-12) return m * p;
  return 10 * p;
}

/** A ruler label: seconds, with as many decimals as the step needs ("1:05" past a minute). */
export function formatRulerSec(sec: number, stepSec: number): string {
  const decimals = Math.max(0, Math.min(3, -Math.floor(Math.log10(stepSec) + 1e-9)));
  if (sec >= 60) {
    const m = Math.floor(sec / 60);
    const s = sec - m * 60;
    return `${m}:${s.toFixed(decimals).padStart(decimals ? 3 + decimals : 2, "0")}`;
  }
  return sec.toFixed(decimals);
}

const BLACK = new Set([1, 3, 6, 8, 10]);
export function isBlackKey(pitch: number): boolean {
  return BLACK.has(((pitch % 12) + 12) % 12);
}
