/**
 * Draws the piano roll on two stacked 2D canvases: the base (rows, grid, notes, outlines, loop,
 * ruler, keyboard) and a light top layer (playhead, marquee, the hovered note's cents) that is
 * redrawn alone while playing. Only what the viewport shows is drawn: the notes come through a
 * time index (sorted onsets + binary search), so a frame's cost follows the visible notes, not
 * the take's.
 */
import { midiToNoteName } from "@/lib/music/pitch";
import { voiceSlot } from "@/components/report/voices";
import { DARK_CENTS_PALETTE, LIGHT_CENTS_PALETTE, centsColour, formatCents } from "@/components/ui/cents-scale";
import { buildTimeIndex, gridStepSec, visibleSlice, type EditorNote, type Marquee, type NoteList, type Selection, type SnapGrid, type TimeIndex } from "@/lib/editor";
import {
  KEYBOARD_PX,
  RULER_PX,
  formatRulerSec,
  isBlackKey,
  noteRect,
  pitchToY,
  rulerStepSec,
  secToX,
  visibleRange,
  type Viewport,
} from "./geometry";
import { beatTicks, validMeter, type Meter } from "./ruler";
import type { RollTheme } from "./theme";

/** A note drawn as an outline only: the assignment's expected notes, a revision compared, theirs in a conflict. */
export type OutlineNote = { onsetSec: number; offsetSec: number; pitch: number };
export type OutlineStyle = "assignment" | "compare" | "theirs";
export type Outlines = { notes: readonly OutlineNote[]; style: OutlineStyle };

export type BaseFrame = {
  viewport: Viewport;
  notes: NoteList;
  selection: Selection;
  theme: RollTheme;
  durationSec: number;
  grid: SnapGrid;
  meter: Meter | null;
  loop: { startSec: number; endSec: number } | null;
  outlines: readonly Outlines[];
};

export type TopFrame = {
  viewport: Viewport;
  theme: RollTheme;
  playheadSec: number | null;
  marquee: Marquee | null;
  hover: EditorNote | null;
  selected: boolean;
};

/** Cents shown across a note's height by its pitch-curve line: ±50 c fills the row. */
const CURVE_SPAN_CENTS = 100;
/** The ruler's rows: seconds on top, bars and beats below when a tempo is set. */
const SECONDS_ROW_PX = 17;

const indexes = new WeakMap<readonly OutlineNote[], TimeIndex>();
/** One time index per list (lists are immutable), built on first use. */
export function timeIndexOf(notes: readonly OutlineNote[]): TimeIndex {
  let index = indexes.get(notes);
  if (!index) {
    index = buildTimeIndex(notes);
    indexes.set(notes, index);
  }
  return index;
}

const DASHES: Record<OutlineStyle, number[]> = { assignment: [5, 3], compare: [2, 2], theirs: [] };

export function drawBase(ctx: CanvasRenderingContext2D, f: BaseFrame): void {
  const { viewport: v, theme: t } = f;
  const { t0Sec, t1Sec, lowPitch, highPitch } = visibleRange(v);
  const right = v.widthPx;
  const bottom = v.heightPx;

  ctx.fillStyle = t.paper;
  ctx.fillRect(0, 0, right, bottom);

  ctx.save();
  ctx.beginPath();
  ctx.rect(KEYBOARD_PX, RULER_PX, right - KEYBOARD_PX, bottom - RULER_PX);
  ctx.clip();
  // rows: black-key rows shaded, a firmer line under each C
  for (let p = lowPitch; p <= highPitch; p++) {
    const y = pitchToY(v, p);
    if (isBlackKey(p)) {
      ctx.fillStyle = t.rule;
      ctx.globalAlpha = t.dark ? 0.35 : 0.28;
      ctx.fillRect(KEYBOARD_PX, y, right - KEYBOARD_PX, v.rowPx);
      ctx.globalAlpha = 1;
    }
    if (p % 12 === 0) {
      ctx.fillStyle = t.rule;
      ctx.fillRect(KEYBOARD_PX, Math.round(y + v.rowPx) - 0.5, right - KEYBOARD_PX, 1);
    }
  }

  // time lines: the snap grid (faint), then bars and beats when a tempo is set, else the seconds
  const step = rulerStepSec(v.pxPerSec);
  const gridStep = gridStepSec(f.grid);
  if (gridStep !== null && gridStep * v.pxPerSec >= 6) {
    ctx.fillStyle = t.rule;
    ctx.globalAlpha = 0.4;
    for (let k = Math.max(0, Math.floor(t0Sec / gridStep)); k * gridStep <= t1Sec; k++) {
      ctx.fillRect(Math.round(secToX(v, k * gridStep)), RULER_PX, 1, bottom - RULER_PX);
    }
    ctx.globalAlpha = 1;
  }
  const meter = validMeter(f.meter) ? f.meter : null;
  if (meter) {
    for (const tick of beatTicks(meter, t0Sec, t1Sec, v.pxPerSec)) {
      ctx.fillStyle = tick.kind === "bar" ? t.muted : t.rule;
      ctx.globalAlpha = tick.kind === "bar" ? 0.45 : 0.8;
      ctx.fillRect(Math.round(secToX(v, tick.sec)), RULER_PX, 1, bottom - RULER_PX);
    }
    ctx.globalAlpha = 1;
  } else {
    ctx.fillStyle = t.rule;
    for (let k = Math.max(0, Math.floor(t0Sec / step)); k * step <= t1Sec; k++) {
      ctx.fillRect(Math.round(secToX(v, k * step)), RULER_PX, 1, bottom - RULER_PX);
    }
  }
  // past the end of the take
  const endX = secToX(v, f.durationSec);
  if (endX < right) {
    ctx.fillStyle = t.rule;
    ctx.globalAlpha = 0.35;
    ctx.fillRect(Math.max(KEYBOARD_PX, endX), RULER_PX, right - Math.max(KEYBOARD_PX, endX), bottom - RULER_PX);
    ctx.globalAlpha = 1;
  }
  // the loop region, faint across the notes
  if (f.loop) {
    const x0 = Math.max(KEYBOARD_PX, secToX(v, f.loop.startSec));
    const x1 = Math.min(right, secToX(v, f.loop.endSec));
    if (x1 > x0) {
      ctx.fillStyle = t.copper;
      ctx.globalAlpha = 0.07;
      ctx.fillRect(x0, RULER_PX, x1 - x0, bottom - RULER_PX);
      ctx.globalAlpha = 0.5;
      ctx.fillRect(Math.round(x0), RULER_PX, 1, bottom - RULER_PX);
      ctx.fillRect(Math.round(x1) - 1, RULER_PX, 1, bottom - RULER_PX);
      ctx.globalAlpha = 1;
    }
  }

  // notes (only the visible ones), then the selection's copper outlines on top
  const notes = f.notes;
  const index = timeIndexOf(notes);
  const { from, to } = visibleSlice(index, t0Sec, t1Sec);
  const curveColour = t.dark ? "rgba(20,24,31,0.75)" : "rgba(255,253,248,0.85)";
  const inset = v.rowPx >= 8 ? 1 : 0.5;
  // one path and one fill per voice colour, then every pitch-curve line in one stroke: a frame
  // costs a handful of canvas calls whatever the number of visible notes
  const slots = t.voices.length;
  let selectedVisible = 0;
  for (let slot = 0; slot < slots; slot++) {
    ctx.fillStyle = t.voices[slot]!;
    ctx.beginPath();
    let any = false;
    for (let k = from; k < to; k++) {
      const n = notes[index.order[k]!]!;
      if (n.offsetSec < t0Sec || n.pitch < lowPitch || n.pitch > highPitch || voiceSlot(n.voice) !== slot) continue;
      const r = noteRect(v, n);
      const x = Math.max(r.x, KEYBOARD_PX - 4);
      const w = Math.max(1, Math.min(r.x + r.w, right + 4) - x);
      const h = Math.max(1, r.h - 2 * inset);
      ctx.roundRect(x, r.y + inset, w, h, Math.min(3, h / 3, w / 2));
      any = true;
      if (f.selection.has(n.id)) selectedVisible++;
    }
    if (any) ctx.fill();
  }
  ctx.strokeStyle = curveColour;
  ctx.lineWidth = 1;
  ctx.beginPath();
  let curves = false;
  for (let k = from; k < to; k++) {
    const n = notes[index.order[k]!]!;
    if (!n.pitchCurve || n.pitchCurve.timeSec.length < 2 || n.offsetSec < t0Sec || n.pitch < lowPitch || n.pitch > highPitch) continue;
    const r = noteRect(v, n);
    const x = Math.max(r.x, KEYBOARD_PX - 4);
    const w = Math.min(r.x + r.w, right + 4) - x;
    const h = r.h - 2 * inset;
    if (w > 6 && h >= 6) curves = traceCurve(ctx, v, n.pitchCurve, x, r.y + inset, w, h) || curves;
  }
  if (curves) ctx.stroke();
  if (selectedVisible > 0) {
    ctx.strokeStyle = t.copper;
    ctx.lineWidth = 2;
    ctx.beginPath();
    for (let k = from; k < to; k++) {
      const n = notes[index.order[k]!]!;
      if (!f.selection.has(n.id) || n.offsetSec < t0Sec || n.pitch < lowPitch || n.pitch > highPitch) continue;
      const r = noteRect(v, n);
      const x = Math.max(r.x, KEYBOARD_PX - 4);
      const w = Math.max(1, Math.min(r.x + r.w, right + 4) - x);
      const h = Math.max(1, r.h - 2 * inset);
      ctx.roundRect(x - 1, r.y + inset - 1, w + 2, h + 2, Math.min(3, h / 3, w / 2) + 1);
    }
    ctx.stroke();
  }

  // outlines: the assignment, a compared revision, theirs — ink, told apart by their dashes
  for (const o of f.outlines) {
    const oi = timeIndexOf(o.notes);
    const s = visibleSlice(oi, t0Sec, t1Sec);
    ctx.strokeStyle = t.ink;
    ctx.globalAlpha = o.style === "theirs" ? 0.85 : 0.7;
    ctx.lineWidth = o.style === "compare" ? 1.25 : 1.5;
    ctx.setLineDash(DASHES[o.style]);
    ctx.beginPath();
    for (let k = s.from; k < s.to; k++) {
      const n = o.notes[oi.order[k]!]!;
      if (n.offsetSec < t0Sec || n.pitch < lowPitch || n.pitch > highPitch) continue;
      const r = noteRect(v, n);
      ctx.rect(Math.round(r.x) + 0.5, Math.round(r.y) + 1.5, Math.max(2, Math.round(r.w) - 1), Math.max(2, Math.round(r.h) - 3));
    }
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.globalAlpha = 1;
  }
  ctx.restore();

  drawRuler(ctx, f, step, meter);
  drawKeyboard(ctx, v, t, lowPitch, highPitch);
}

/** The top layer: playhead, marquee and the hovered note's outline and cents. Cheap, redrawn alone while playing. */
export function drawTop(ctx: CanvasRenderingContext2D, f: TopFrame): void {
  const { viewport: v, theme: t } = f;
  const right = v.widthPx;
  const bottom = v.heightPx;
  ctx.clearRect(0, 0, right, bottom);

  ctx.save();
  ctx.beginPath();
  ctx.rect(KEYBOARD_PX, 0, right - KEYBOARD_PX, bottom);
  ctx.clip();
  if (f.marquee) {
    const x0 = secToX(v, Math.min(f.marquee.t0Sec, f.marquee.t1Sec));
    const x1 = secToX(v, Math.max(f.marquee.t0Sec, f.marquee.t1Sec));
    const y0 = pitchToY(v, Math.max(f.marquee.pitchA, f.marquee.pitchB));
    const y1 = pitchToY(v, Math.min(f.marquee.pitchA, f.marquee.pitchB)) + v.rowPx;
    ctx.fillStyle = t.copper;
    ctx.globalAlpha = 0.1;
    ctx.fillRect(x0, y0, x1 - x0, y1 - y0);
    ctx.globalAlpha = 1;
    ctx.strokeStyle = t.copper;
    ctx.lineWidth = 1;
    ctx.setLineDash([4, 3]);
    ctx.strokeRect(Math.round(x0) + 0.5, Math.round(y0) + 0.5, Math.round(x1 - x0), Math.round(y1 - y0));
    ctx.setLineDash([]);
  }

  if (f.hover) {
    const n = f.hover;
    const r = noteRect(v, n);
    if (!f.selected) {
      ctx.strokeStyle = t.ink;
      ctx.globalAlpha = 0.55;
      ctx.lineWidth = 1;
      ctx.beginPath();
      ctx.roundRect(r.x + 0.5, r.y + 1.5, Math.max(0, r.w - 1), Math.max(0, r.h - 3), Math.min(3, r.h / 3));
      ctx.stroke();
      ctx.globalAlpha = 1;
    }
    // the cents as a number, in the intonation scale's colour (ink when in tune)
    const label = `${midiToNoteName(n.pitch)} ${formatCents(n.cents)}`;
    ctx.font = `11px ${t.monoFont}`;
    const w = ctx.measureText(label).width + 10;
    const h = 17;
    const x = Math.min(Math.max(KEYBOARD_PX + 2, r.x), right - w - 2);
    const above = r.y - h - 3 >= RULER_PX;
    const y = above ? r.y - h - 3 : r.y + r.h + 3;
    ctx.fillStyle = t.surface;
    ctx.strokeStyle = t.rule;
    ctx.beginPath();
    ctx.roundRect(x + 0.5, y + 0.5, w, h, 3);
    ctx.fill();
    ctx.stroke();
    ctx.fillStyle = centsColour(n.cents, t.dark ? DARK_CENTS_PALETTE : LIGHT_CENTS_PALETTE);
    ctx.textBaseline = "middle";
    ctx.textAlign = "left";
    ctx.fillText(label, x + 5.5, y + h / 2 + 1);
  }

  // the playhead, across ruler and notes
  if (f.playheadSec !== null) {
    const x = secToX(v, f.playheadSec);
    if (x >= KEYBOARD_PX - 1 && x <= right + 1) {
      ctx.fillStyle = t.copper;
      ctx.fillRect(Math.round(x) - 1, 0, 2, bottom);
      ctx.beginPath();
      ctx.moveTo(x - 5, 0);
      ctx.lineTo(x + 5, 0);
      ctx.lineTo(x, 7);
      ctx.closePath();
      ctx.fill();
    }
  }
  ctx.restore();
}

/**
 * Adds a note's pitch-curve line to the current path: the points inside the note's visible part
 * (at most one per pixel), cents clamped to ±50 so the line stays inside the note. True when
 * something was added.
 */
function traceCurve(ctx: CanvasRenderingContext2D, v: Viewport, curve: { timeSec: number[]; cents: number[] }, x: number, y: number, w: number, h: number): boolean {
  const mid = y + h / 2;
  const ts = curve.timeSec;
  // the curve's times are sorted: start at the first point inside the note's visible part
  const fromSec = v.startSec + (x - KEYBOARD_PX) / v.pxPerSec;
  let lo = 0;
  let hi = ts.length;
  while (lo < hi) {
    const m = (lo + hi) >>> 1;
    if (ts[m]! < fromSec) lo = m + 1;
    else hi = m;
  }
  let started = false;
  let lastX = -Infinity;
  const span = (h - 2) / CURVE_SPAN_CENTS;
  for (let i = lo; i < ts.length; i++) {
    const px = secToX(v, ts[i]!);
    if (px > x + w) break;
    if (px - lastX < 1 && i < ts.length - 1) continue; // at most one point per pixel
    lastX = px;
    const c = curve.cents[i] ?? 0;
    const py = mid - Math.max(-CURVE_SPAN_CENTS / 2, Math.min(CURVE_SPAN_CENTS / 2, c)) * span;
    if (started) ctx.lineTo(px, py);
    else ctx.moveTo(px, py);
    started = true;
  }
  return started;
}

function drawRuler(ctx: CanvasRenderingContext2D, f: BaseFrame, step: number, meter: Meter | null) {
  const { viewport: v, theme: t } = f;
  const { t0Sec, t1Sec } = visibleRange(v);
  ctx.fillStyle = t.surface;
  ctx.fillRect(KEYBOARD_PX, 0, v.widthPx - KEYBOARD_PX, RULER_PX);
  // the loop region, as a copper band on the ruler
  if (f.loop) {
    const x0 = Math.max(KEYBOARD_PX, secToX(v, f.loop.startSec));
    const x1 = Math.min(v.widthPx, secToX(v, f.loop.endSec));
    if (x1 > x0) {
      ctx.fillStyle = t.copper;
      ctx.globalAlpha = 0.22;
      ctx.fillRect(x0, 0, x1 - x0, RULER_PX - 1);
      ctx.globalAlpha = 1;
    }
  }
  ctx.fillStyle = t.rule;
  ctx.fillRect(0, RULER_PX - 1, v.widthPx, 1);
  ctx.font = `10px ${t.monoFont}`;
  ctx.textBaseline = "middle";
  ctx.textAlign = "left";
  const secBottom = meter ? SECONDS_ROW_PX : RULER_PX;
  const minor = step / 5;
  for (let k = Math.max(0, Math.floor(t0Sec / minor)); k * minor <= t1Sec; k++) {
    const x = Math.round(secToX(v, k * minor));
    if (x < KEYBOARD_PX) continue;
    const major = k % 5 === 0;
    ctx.fillStyle = major ? t.muted : t.rule;
    ctx.fillRect(x, secBottom - (major ? 8 : 4) - 1, 1, major ? 8 : 4);
    if (major) {
      ctx.fillStyle = t.muted;
      ctx.fillText(formatRulerSec(k * minor, step), x + 3, 7);
    }
  }
  if (meter) {
    ctx.fillStyle = t.rule;
    ctx.fillRect(KEYBOARD_PX, SECONDS_ROW_PX, v.widthPx - KEYBOARD_PX, 1);
    for (const tick of beatTicks(meter, t0Sec, t1Sec, v.pxPerSec)) {
      const x = Math.round(secToX(v, tick.sec));
      if (x < KEYBOARD_PX) continue;
      const bar = tick.kind === "bar";
      ctx.fillStyle = bar ? t.ink : t.muted;
      ctx.fillRect(x, bar ? SECONDS_ROW_PX : RULER_PX - 6, 1, bar ? RULER_PX - SECONDS_ROW_PX - 1 : 5);
      if (tick.label) {
        ctx.fillStyle = bar ? t.ink : t.muted;
        ctx.fillText(tick.label, x + 3, SECONDS_ROW_PX + (RULER_PX - SECONDS_ROW_PX) / 2);
      }
    }
  }
}

function drawKeyboard(ctx: CanvasRenderingContext2D, v: Viewport, t: RollTheme, lowPitch: number, highPitch: number) {
  ctx.save();
  ctx.beginPath();
  ctx.rect(0, RULER_PX, KEYBOARD_PX, v.heightPx - RULER_PX);
  ctx.clip();
  ctx.fillStyle = t.surface;
  ctx.fillRect(0, RULER_PX, KEYBOARD_PX, v.heightPx - RULER_PX);
  ctx.font = `${Math.min(10, Math.max(8, v.rowPx - 3))}px ${t.monoFont}`;
  ctx.textBaseline = "middle";
  const blackW = Math.round(KEYBOARD_PX * 0.55);
  const allNames = v.rowPx >= 13;
  for (let p = lowPitch; p <= highPitch; p++) {
    const y = pitchToY(v, p);
    if (isBlackKey(p)) {
      ctx.fillStyle = t.ink;
      ctx.globalAlpha = t.dark ? 0.55 : 0.8;
      ctx.fillRect(0, y + 0.5, blackW, v.rowPx - 1);
      ctx.globalAlpha = 1;
    }
    if (p % 12 === 0 || p % 12 === 5) {
      ctx.fillStyle = t.rule;
      ctx.fillRect(0, Math.round(y + v.rowPx) - 0.5, KEYBOARD_PX, 1);
    }
    if ((p % 12 === 0 && v.rowPx >= 6) || (allNames && !isBlackKey(p))) {
      ctx.fillStyle = p % 12 === 0 ? t.ink : t.muted;
      ctx.textAlign = "right";
      ctx.fillText(midiToNoteName(p), KEYBOARD_PX - 5, y + v.rowPx / 2 + 0.5);
      ctx.textAlign = "left";
    }
  }
  ctx.restore();
  ctx.fillStyle = t.rule;
  ctx.fillRect(KEYBOARD_PX - 1, 0, 1, v.heightPx);
  ctx.fillStyle = t.surface;
  ctx.fillRect(0, 0, KEYBOARD_PX - 1, RULER_PX - 1);
}
