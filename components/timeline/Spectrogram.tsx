"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import type { RollTheme } from "@/components/piano-roll/theme";
import { midiToNoteName } from "@/lib/music/pitch";
import { Spinner } from "@/components/ui";
import { spectrogramFor, type SpectrogramData, type TakeAudioState } from "./audio-data";
import { drawPlayheadAndLoop, useLayeredDraw, useTimeWheel } from "./canvas-view";
import { axisForRange, pitchToBand, pitchToRowY, type PitchAxis } from "./freq-axis";
import { TIMELINE_GUTTER_PX, type TimeView } from "./time-view";

const HEIGHT_PX = 168;

/** paper → slate → ink (the manuscript's own colours), 256 steps; in dark mode the same hues on #14181F. */
export function spectrogramColours(theme: Pick<RollTheme, "paper" | "ink">): Uint8ClampedArray {
  const hex = (h: string): [number, number, number] => {
    const m = /^#?([0-9a-f]{6})$/i.exec(h.trim());
    const n = m ? parseInt(m[1]!, 16) : 0;
    return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
  };
  const stops = [hex(theme.paper), hex("#4a5d73"), hex(theme.ink)];
  const lut = new Uint8ClampedArray(256 * 4);
  for (let i = 0; i < 256; i++) {
    const v = Math.pow(i / 255, 1.7) * 2;
    const k = Math.min(1, Math.floor(v));
    const f = v - k;
    for (let c = 0; c < 3; c++) lut[i * 4 + c] = stops[k]![c]! + (stops[k + 1]![c]! - stops[k]![c]!) * f;
    lut[i * 4 + 3] = 255;
  }
  return lut;
}

/**
 * The spectrogram: log-frequency (one row per semitone, the piano roll's row maths, note names
 * down the gutter), time on the shared window. The columns are made in a Web Worker and cached
 * per recording; only the visible part is drawn.
 */
export function Spectrogram({ view, audio, audioUrl, widthPx }: { view: TimeView; audio: TakeAudioState; audioUrl: string; widthPx: number }) {
  const base = useRef<HTMLCanvasElement>(null);
  const overlay = useRef<HTMLCanvasElement>(null);
  const host = useRef<HTMLDivElement>(null);
  const scratchRef = useRef<HTMLCanvasElement | null>(null);
  useTimeWheel(host, view);
  const take = audio.status === "ready" ? audio.take : null;
  const [data, setData] = useState<SpectrogramData | null>(null);
  const [progress, setProgress] = useState(0);
  useEffect(() => {
    if (!take) {
      setData(null);
      return;
    }
    const d = spectrogramFor(audioUrl, take);
    setData(d);
    setProgress(d.ready);
    return d.subscribe(() => setProgress(d.ready));
  }, [take, audioUrl]);

  const axis: PitchAxis | null = useMemo(() => (data ? axisForRange(data.spec.lowPitch, data.spec.highPitch, HEIGHT_PX) : null), [data]);

  useLayeredDraw(
    view,
    base,
    overlay,
    {
      base: (ctx, s, theme) => {
        const area = widthPx - TIMELINE_GUTTER_PX;
        ctx.fillStyle = theme.paper;
        ctx.fillRect(0, 0, widthPx, HEIGHT_PX);
        if (data && axis && data.bands > 0) {
          const dpr = window.devicePixelRatio || 1;
          const W = Math.round(area * dpr);
          const H = Math.round(HEIGHT_PX * dpr);
          const img = ctx.createImageData(W, H);
          const lut = spectrogramColours(theme);
          const px = img.data;
          const bandOfRow = new Int32Array(H);
          for (let y = 0; y < H; y++) {
            // the pitch at this device row's centre, on the piano roll's row maths
            const pitch = axis.topPitch - ((y + 0.5) / dpr - axis.topPx - axis.rowPx / 2) / axis.rowPx;
            bandOfRow[y] = pitchToBand(data.spec, pitch);
          }
          const colsPerSec = data.spec.sampleRateHz / data.spec.hopSamples;
          for (let x = 0; x < W; x++) {
            const t = s.window.startSec + (x + 0.5) / dpr / s.window.pxPerSec;
            const col = Math.round(t * colsPerSec);
            if (col < 0 || col >= data.ready) continue;
            const off = col * data.bands;
            for (let y = 0; y < H; y++) {
              const b = bandOfRow[y]!;
              if (b < 0 || b >= data.bands) continue;
              const v = data.data[off + b]!;
              const i = (y * W + x) * 4;
              px[i] = lut[v * 4]!;
              px[i + 1] = lut[v * 4 + 1]!;
              px[i + 2] = lut[v * 4 + 2]!;
              px[i + 3] = 255;
            }
          }
          // putImageData ignores the transform and clipping: go through a scratch canvas in device pixels
          const scratch = (scratchRef.current ??= document.createElement("canvas"));
          if (scratch.width !== W) scratch.width = W;
          if (scratch.height !== H) scratch.height = H;
          scratch.getContext("2d")!.putImageData(img, 0, 0);
          ctx.save();
          ctx.setTransform(1, 0, 0, 1, 0, 0);
          ctx.drawImage(scratch, Math.round(TIMELINE_GUTTER_PX * dpr), 0);
          ctx.restore();
        }
        // the gutter: octave labels on the C rows, like the keyboard below
        ctx.fillStyle = theme.surface;
        ctx.fillRect(0, 0, TIMELINE_GUTTER_PX, HEIGHT_PX);
        ctx.fillStyle = theme.rule;
        ctx.fillRect(TIMELINE_GUTTER_PX - 1, 0, 1, HEIGHT_PX);
        if (axis && data) {
          ctx.font = `10px ${theme.monoFont}`;
          ctx.textBaseline = "middle";
          for (let p = Math.ceil(data.spec.lowPitch / 12) * 12; p <= data.spec.highPitch; p += 12) {
            const y = pitchToRowY(axis, p) + axis.rowPx / 2;
            ctx.fillStyle = theme.rule;
            ctx.fillRect(TIMELINE_GUTTER_PX - 6, Math.round(y), 5, 1);
            ctx.fillStyle = theme.muted;
            ctx.fillText(midiToNoteName(p), 6, Math.min(HEIGHT_PX - 6, Math.max(6, y)));
          }
        }
      },
      overlay: (ctx, s, theme) => drawPlayheadAndLoop(ctx, view, s, theme, widthPx, 0, HEIGHT_PX),
    },
    widthPx,
    HEIGHT_PX,
    [data, progress, axis],
  );

  const computing = data !== null && !data.done;
  return (
    <div
      ref={host}
      className="relative select-none"
      style={{ height: HEIGHT_PX }}
      data-testid="spectrogram"
      data-via={data?.via}
      data-state={audio.status === "ready" ? (computing || !data ? "computing" : "ready") : audio.status}
      onClick={(e) => {
        const x = e.clientX - e.currentTarget.getBoundingClientRect().left;
        if (x >= TIMELINE_GUTTER_PX) view.seek(view.xToSec(x));
      }}
    >
      <canvas
        ref={base}
        className="absolute inset-0 block h-full w-full"
        role="img"
        aria-label="Spectrogram of the recording: frequency on a note scale from E1 to C8, time as in the piano roll. Click to move the playhead."
      />
      <canvas ref={overlay} className="absolute inset-0 block h-full w-full cursor-pointer" aria-hidden="true" />
      {audio.status === "loading" || computing ? (
        <div className="pointer-events-none absolute right-3 top-2 flex items-center gap-2 rounded bg-surface/85 px-2 py-1 text-xs text-ink-muted">
          <Spinner size="sm" label="Drawing the spectrogram" />
          {data ? <>Spectrogram <span className="font-mono">{Math.round((100 * data.ready) / Math.max(1, data.total))} %</span></> : "Decoding…"}
        </div>
      ) : null}
    </div>
  );
}
