"use client";
import { useRef, useState } from "react";
import { formatRulerSec, rulerStepSec } from "@/components/piano-roll/geometry";
import { Button, Spinner } from "@/components/ui";
import { rangeMinMax, type TakeAudioState } from "./audio-data";
import { drawPlayheadAndLoop, useLayeredDraw, useTimeWheel } from "./canvas-view";
import { TIMELINE_GUTTER_PX, type TimeView } from "./time-view";

export const RULER_HEIGHT_PX = 22;
const WAVE_HEIGHT_PX = 76;
const HEIGHT_PX = RULER_HEIGHT_PX + WAVE_HEIGHT_PX;
/** A press on the ruler that moves less than this (px) is a click (seek), more is a loop drag. */
const DRAG_PX = 4;

/**
 * The recording's waveform under a seconds ruler, on the shared time window: min/max of the
 * samples under each device pixel, so it lines up with the piano roll at every zoom. A click
 * seeks; a drag along the ruler sets the loop region.
 */
export function Waveform({ view, audio, widthPx }: { view: TimeView; audio: TakeAudioState & { retry: () => void }; widthPx: number }) {
  const base = useRef<HTMLCanvasElement>(null);
  const overlay = useRef<HTMLCanvasElement>(null);
  const host = useRef<HTMLDivElement>(null);
  const drag = useRef<{ x0: number; t0: number; looping: boolean; onRuler: boolean } | null>(null);
  const [dragging, setDragging] = useState(false);
  useTimeWheel(host, view);
  const take = audio.status === "ready" ? audio.take : null;

  useLayeredDraw(
    view,
    base,
    overlay,
    {
      base: (ctx, s, theme) => {
        const w = widthPx;
        const area = w - TIMELINE_GUTTER_PX;
        // ruler
        ctx.fillStyle = theme.surface;
        ctx.fillRect(0, 0, w, RULER_HEIGHT_PX);
        ctx.fillStyle = theme.rule;
        ctx.fillRect(0, RULER_HEIGHT_PX - 1, w, 1);
        const step = rulerStepSec(s.window.pxPerSec);
        const t0 = Math.floor(s.window.startSec / step) * step;
        const t1 = s.window.startSec + area / s.window.pxPerSec;
        ctx.font = `11px ${theme.monoFont}`;
        ctx.textBaseline = "middle";
        for (let t = t0; t <= t1 + step; t += step) {
          const x = view.secToX(t);
          if (x < TIMELINE_GUTTER_PX - 0.5) continue;
          ctx.fillStyle = theme.rule;
          ctx.fillRect(Math.round(x), RULER_HEIGHT_PX - 7, 1, 6);
          ctx.fillRect(Math.round(x), RULER_HEIGHT_PX, 1, WAVE_HEIGHT_PX);
          ctx.fillStyle = theme.muted;
          ctx.fillText(formatRulerSec(Math.max(0, t), step), Math.round(x) + 3, RULER_HEIGHT_PX / 2);
        }
        // waveform
        const mid = RULER_HEIGHT_PX + WAVE_HEIGHT_PX / 2;
        const half = WAVE_HEIGHT_PX / 2 - 3;
        ctx.fillStyle = theme.rule;
        ctx.fillRect(TIMELINE_GUTTER_PX, Math.round(mid), area, 1);
        if (take) {
          const dpr = window.devicePixelRatio || 1;
          const cols = Math.round(area * dpr);
          const perCol = take.sampleRateHz / (s.window.pxPerSec * dpr);
          const s0 = s.window.startSec * take.sampleRateHz;
          ctx.fillStyle = theme.ink;
          ctx.globalAlpha = 0.72;
          for (let c = 0; c < cols; c++) {
            const a = s0 + c * perCol;
            if (a >= take.mono.length) break;
            const [lo, hi] = rangeMinMax(take, a, a + Math.max(1, perCol));
            const y0 = mid - hi * half;
            const y1 = mid - lo * half;
            ctx.fillRect(TIMELINE_GUTTER_PX + c / dpr, y0, 1 / dpr, Math.max(1 / dpr, y1 - y0));
          }
          ctx.globalAlpha = 1;
        }
        // gutter label
        ctx.fillStyle = theme.surface;
        ctx.fillRect(0, 0, TIMELINE_GUTTER_PX, HEIGHT_PX);
        ctx.fillStyle = theme.rule;
        ctx.fillRect(TIMELINE_GUTTER_PX - 1, 0, 1, HEIGHT_PX);
        ctx.fillStyle = theme.muted;
        ctx.font = `11px ${theme.monoFont}`;
        ctx.fillText("s", 8, RULER_HEIGHT_PX / 2);
        ctx.fillText("wave", 8, mid);
      },
      overlay: (ctx, s, theme) => drawPlayheadAndLoop(ctx, view, s, theme, widthPx, 0, HEIGHT_PX),
    },
    widthPx,
    HEIGHT_PX,
    [take],
  );

  const timeAt = (e: React.PointerEvent) => {
    const rect = e.currentTarget.getBoundingClientRect();
    return { x: e.clientX - rect.left, y: e.clientY - rect.top };
  };

  return (
    <div
      ref={host}
      className="relative select-none"
      style={{ height: HEIGHT_PX }}
      data-testid="waveform"
      data-state={audio.status}
      onPointerDown={(e) => {
        const { x, y } = timeAt(e);
        if (x < TIMELINE_GUTTER_PX || e.button !== 0) return;
        e.currentTarget.setPointerCapture(e.pointerId);
        drag.current = { x0: x, t0: view.xToSec(x), looping: false, onRuler: y < RULER_HEIGHT_PX };
      }}
      onPointerMove={(e) => {
        const d = drag.current;
        if (!d || !d.onRuler) return;
        const { x } = timeAt(e);
        if (!d.looping && Math.abs(x - d.x0) < DRAG_PX) return;
        d.looping = true;
        setDragging(true);
        const t = Math.max(0, Math.min(view.get().durationSec, view.xToSec(x)));
        view.setLoop({ startSec: Math.min(d.t0, t), endSec: Math.max(d.t0, t) });
      }}
      onPointerUp={(e) => {
        const d = drag.current;
        drag.current = null;
        setDragging(false);
        if (!d) return;
        if (!d.looping) view.seek(view.xToSec(timeAt(e).x));
      }}
      onPointerCancel={() => {
        drag.current = null;
        setDragging(false);
      }}
    >
      <canvas
        ref={base}
        className="absolute inset-0 block h-full w-full"
        role="img"
        aria-label="The recording's waveform under a seconds ruler. Click to move the playhead; drag along the ruler to set a loop."
      />
      <canvas ref={overlay} className={`absolute inset-0 block h-full w-full ${dragging ? "cursor-ew-resize" : "cursor-pointer"}`} aria-hidden="true" />
      {audio.status === "loading" ? (
        <div className="pointer-events-none absolute inset-y-0 right-0 flex items-center gap-2 text-sm text-ink-muted" style={{ left: TIMELINE_GUTTER_PX + 12, top: RULER_HEIGHT_PX }}>
          <Spinner label="Decoding the recording" /> Decoding the recording…
        </div>
      ) : null}
      {audio.status === "error" ? (
        <div role="alert" className="absolute inset-y-0 right-0 flex items-center gap-3 text-sm" style={{ left: TIMELINE_GUTTER_PX + 12, top: RULER_HEIGHT_PX }}>
          <span className="text-[var(--tn-danger)]">{audio.message}</span>
          <Button size="sm" variant="secondary" onClick={audio.retry} onPointerDown={(e) => e.stopPropagation()}>
            Try again
          </Button>
        </div>
      ) : null}
    </div>
  );
}
