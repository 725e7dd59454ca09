"use client";
import { useEffect, useRef, useState } from "react";
import { readVoiceColours, voiceSlot } from "@/components/report/voices";
import type { ReplayNote } from "./use-replay-player";

const HEIGHT_PX = 168;

/**
 * A small piano-roll strip: the take's notes as flat rounded rectangles coloured by voice,
 * time across, pitch up, with the copper playhead. A click moves the playhead there.
 */
export function NoteStrip({ notes, durationSec, positionSec, onSeek }: { notes: ReplayNote[]; durationSec: number; positionSec: number; onSeek: (sec: number) => void }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const layer = useRef<HTMLCanvasElement | null>(null);
  const [width, setWidth] = useState(0);
  const end = Math.max(durationSec, ...notes.map((n) => n.offsetSec), 1);

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const ro = new ResizeObserver(([entry]) => setWidth(Math.round(entry!.contentRect.width)));
    ro.observe(canvas);
    return () => ro.disconnect();
  }, []);

  // the notes, drawn once per size into a layer of their own
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas || width === 0) return;
    const dpr = window.devicePixelRatio || 1;
    const off = document.createElement("canvas");
    off.width = Math.round(width * dpr);
    off.height = Math.round(HEIGHT_PX * dpr);
    const ctx = off.getContext("2d");
    if (!ctx) return;
    ctx.scale(dpr, dpr);
    const style = getComputedStyle(canvas);
    const rule = style.getPropertyValue("--tn-rule").trim() || "#d9d3c7";
    const muted = style.getPropertyValue("--tn-ink-muted").trim() || "#5b6373";
    const colours = readVoiceColours(canvas);
    const lo = Math.min(...notes.map((n) => n.pitch), 60) - 1;
    const hi = Math.max(...notes.map((n) => n.pitch), 67) + 1;
    const rowH = (HEIGHT_PX - 4) / (hi - lo + 1);
    const y = (p: number) => 2 + (hi - p) * rowH;
    ctx.font = "9px var(--font-plex-mono), monospace";
    for (let p = Math.ceil(lo / 12) * 12; p <= hi; p += 12) {
      ctx.fillStyle = rule;
      ctx.fillRect(0, Math.round(y(p) + rowH), width, 1);
      ctx.fillStyle = muted;
      ctx.fillText(`C${p / 12 - 1}`, 2, y(p) + rowH - 2);
    }
    for (const n of notes) {
      const x0 = (n.onsetSec / end) * width;
      const w = Math.max(2, ((n.offsetSec - n.onsetSec) / end) * width);
      ctx.fillStyle = colours[voiceSlot(n.voice)]!;
      ctx.beginPath();
      ctx.roundRect(x0, y(n.pitch) + 0.5, w, Math.max(2, rowH - 1), Math.min(2, rowH / 2));
      ctx.fill();
    }
    layer.current = off;
  }, [notes, width, end]);

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas || width === 0) return;
    const dpr = window.devicePixelRatio || 1;
    if (canvas.width !== Math.round(width * dpr)) canvas.width = Math.round(width * dpr);
    if (canvas.height !== Math.round(HEIGHT_PX * dpr)) canvas.height = Math.round(HEIGHT_PX * dpr);
    const ctx = canvas.getContext("2d");
    if (!ctx) return;
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.clearRect(0, 0, canvas.width, canvas.height);
    if (layer.current) ctx.drawImage(layer.current, 0, 0);
    ctx.scale(dpr, dpr);
    const x = (positionSec / end) * width;
    ctx.fillStyle = getComputedStyle(canvas).getPropertyValue("--tn-copper").trim() || "#b4532a";
    ctx.fillRect(Math.round(x) - 1, 0, 2, HEIGHT_PX);
  }, [positionSec, width, end, notes]);

  const voices = [...new Set(notes.map((n) => n.voice))].sort((a, b) => a - b);
  return (
    <div className="space-y-1.5">
      <canvas
        ref={canvasRef}
        data-testid="note-strip"
        className="block h-[168px] w-full cursor-pointer rounded-md border border-rule bg-paper"
        role="img"
        aria-label={`The take's ${notes.length} notes over time, coloured by voice, with the playhead`}
        onClick={(e) => {
          const rect = e.currentTarget.getBoundingClientRect();
          onSeek(((e.clientX - rect.left) / rect.width) * end);
        }}
      />
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-muted" aria-label="Voices">
        {voices.map((v) => (
          <li key={v} className="inline-flex items-center gap-1.5">
            <span aria-hidden="true" className="inline-block size-2.5 rounded-[2px]" style={{ backgroundColor: `var(--tn-voice-${["teal", "plum", "ochre", "slate", "rose", "olive"][voiceSlot(v)]})` }} />
            Voice <span className="font-mono">{v}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}
