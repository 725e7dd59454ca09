/** Draws one frame of the piano roll on a 2D canvas: only what the viewport shows. */
import { midiToNoteName } from "@/lib/music/pitch";
import { voiceSlot } from "@/components/report/voices";
import { gridStepSec, type Marquee, type NoteList, type Selection, type SnapGrid } from "@/lib/editor";
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
import type { RollTheme } from "./theme";

export type Frame = {
  viewport: Viewport;
  notes: NoteList;
  selection: Selection;
  theme: RollTheme;
  durationSec: number;
  playheadSec?: number;
  marquee?: Marquee | null;
  grid: SnapGrid;
  hoverId?: string | null;
};

/** Cents shown across a note's height by its pitch-curve line: ±50 c fills the row. */
const CURVE_SPAN_CENTS = 100;

export function drawFrame(ctx: CanvasRenderingContext2D, f: Frame): void {
  const { viewport: v, theme: t } = f;
  const { t0Sec, t1Sec, lowPitch, highPitch } = visibleRange(v);
  const right = v.widthPx;
  const bottom = v.heightPx;

  ctx.clearRect(0, 0, right, bottom);
  ctx.fillStyle = t.paper;
  ctx.fillRect(0, 0, right, bottom);

  // rows: black-key rows shaded, a firmer line under each C
  ctx.save();
  ctx.beginPath();
  ctx.rect(KEYBOARD_PX, RULER_PX, right - KEYBOARD_PX, bottom - RULER_PX);
  ctx.clip();
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

  // time lines: the snap grid when on (faint), the ruler's steps
  const step = rulerStepSec(v.pxPerSec);
  const gridStep = gridStepSec(f.grid);
  if (gridStep !== null && gridStep * v.pxPerSec >= 6) {
    ctx.fillStyle = t.rule;
    ctx.globalAlpha = 0.45;
    for (let k = Math.max(0, Math.floor(t0Sec / gridStep)); k * gridStep <= t1Sec; k++) {
      ctx.fillRect(Math.round(secToX(v, k * gridStep)), RULER_PX, 1, bottom - RULER_PX);
    }
    ctx.globalAlpha = 1;
  }
  ctx.fillStyle = t.rule;
  for (let k = Math.max(0, Math.floor(t0Sec / step)); k * step <= t1Sec; k++) {
    ctx.fillRect(Math.round(secToX(v, k * step)), RULER_PX, 1, bottom - RULER_PX);
  }
  // past the end of the take
  const endX = secToX(v, f.durationSec);
  if (endX < right) {
    ctx.fillStyle = t.rule;
    ctx.globalAlpha = 0.35;
    ctx.fillRect(Math.max(KEYBOARD_PX, endX), RULER_PX, right - Math.max(KEYBOARD_PX, endX), bottom - RULER_PX);
    ctx.globalAlpha = 1;
  }

  // notes (only the visible ones), then the selection's copper outlines on top
  const selected: { x: number; y: number; w: number; h: number; r: number }[] = [];
  const curveColour = t.dark ? "rgba(20,24,31,0.75)" : "rgba(255,253,248,0.85)";
  for (const n of f.notes) {
    if (n.offsetSec < t0Sec || n.onsetSec > t1Sec || n.pitch < lowPitch || n.pitch > highPitch) continue;
    const r = noteRect(v, n);
    const x = Math.max(r.x, KEYBOARD_PX - 4);
    const w = Math.min(r.x + r.w, right + 4) - x;
    const inset = v.rowPx >= 8 ? 1 : 0.5;
    const y = r.y + inset;
    const h = r.h - 2 * inset;
    const radius = Math.min(3, h / 3, w / 2);
    ctx.fillStyle = t.voices[voiceSlot(n.voice)]!;
    ctx.beginPath();
    ctx.roundRect(x, y, Math.max(1, w), Math.max(1, h), radius);
    ctx.fill();
    if (n.pitchCurve && n.pitchCurve.timeSec.length > 1 && w > 6 && h >= 6) drawCurve(ctx, v, n.pitchCurve, x, y, w, h, curveColour);
    if (f.selection.has(n.id)) selected.push({ x, y, w: Math.max(1, w), h: Math.max(1, h), r: radius });
    else if (f.hoverId === n.id) {
      ctx.strokeStyle = t.ink;
      ctx.globalAlpha = 0.5;
      ctx.lineWidth = 1;
      ctx.beginPath();
      ctx.roundRect(x + 0.5, y + 0.5, Math.max(0, w - 1), Math.max(0, h - 1), radius);
      ctx.stroke();
      ctx.globalAlpha = 1;
    }
  }
  ctx.strokeStyle = t.copper;
  ctx.lineWidth = 2;
  for (const s of selected) {
    ctx.beginPath();
    ctx.roundRect(s.x - 1, s.y - 1, s.w + 2, s.h + 2, s.r + 1);
    ctx.stroke();
  }

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
  ctx.restore();

  drawRuler(ctx, f, step);
  drawKeyboard(ctx, f, lowPitch, highPitch);

  // the playhead, across ruler and notes
  if (f.playheadSec !== undefined) {
    const x = secToX(v, f.playheadSec);
    if (x >= KEYBOARD_PX && x <= right) {
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
}

function drawCurve(
  ctx: CanvasRenderingContext2D,
  v: Viewport,
  curve: { timeSec: number[]; cents: number[] },
  x: number,
  y: number,
  w: number,
  h: number,
  colour: string,
) {
  const mid = y + h / 2;
  ctx.save();
  ctx.beginPath();
  ctx.rect(x, y, w, h);
  ctx.clip();
  ctx.strokeStyle = colour;
  ctx.lineWidth = 1;
  ctx.beginPath();
  let started = false;
  let lastX = -Infinity;
  for (let i = 0; i < curve.timeSec.length; i++) {
    const px = secToX(v, curve.timeSec[i]!);
    if (px < x - 2 || px > x + w + 2) continue;
    if (px - lastX < 1 && i < curve.timeSec.length - 1) continue; // at most one point per pixel
    lastX = px;
    const c = curve.cents[i] ?? 0;
    const py = mid - (Math.max(-CURVE_SPAN_CENTS / 2, Math.min(CURVE_SPAN_CENTS / 2, c)) / CURVE_SPAN_CENTS) * (h - 2);
    if (started) ctx.lineTo(px, py);
    else ctx.moveTo(px, py);
    started = true;
  }
  if (started) ctx.stroke();
  ctx.restore();
}

function drawRuler(ctx: CanvasRenderingContext2D, f: Frame, step: number) {
  const { viewport: v, theme: t } = f;
  const { t0Sec, t1Sec } = visibleRange(v);
  ctx.fillStyle = t.surface;
  ctx.fillRect(KEYBOARD_PX, 0, v.widthPx - KEYBOARD_PX, RULER_PX);
  ctx.fillStyle = t.rule;
  ctx.fillRect(0, RULER_PX - 1, v.widthPx, 1);
  ctx.font = `10px ${t.monoFont}`;
  ctx.textBaseline = "middle";
  const minor = step / 5;
  for (let k = Math.max(0, Math.floor(t0Sec / minor)); k * minor <= t1Sec; k++) {
    const x = Math.round(secToX(v, k * minor));
    if (x < KEYBOARD_PX) continue;
    const major = k % 5 === 0;
    ctx.fillStyle = major ? t.muted : t.rule;
    ctx.fillRect(x, major ? RULER_PX - 9 : RULER_PX - 5, 1, major ? 8 : 4);
    if (major) {
      ctx.fillStyle = t.muted;
      ctx.fillText(formatRulerSec(k * minor, step), x + 3, 8);
    }
  }
}

function drawKeyboard(ctx: CanvasRenderingContext2D, f: Frame, lowPitch: number, highPitch: number) {
  const { viewport: v, theme: t } = f;
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
