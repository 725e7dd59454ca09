"use client";
/**
 * What the timeline's canvas views share: sizing to the device's pixels, redrawing a base layer
 * when the window or the data change and an overlay (playhead, loop) when those change, and the
 * wheel gestures that write the shared time view.
 */
import { useEffect, useLayoutEffect, useRef, useState, type RefObject } from "react";
import { readTheme, type RollTheme } from "@/components/piano-roll/theme";
import { TIMELINE_GUTTER_PX, type TimeView, type TimeViewState } from "./time-view";

export type CanvasSize = { widthPx: number; heightPx: number; dpr: number };

/** The CSS size of an element, kept up to date; measured before the first frame that shows it. */
export function useElementWidth(ref: RefObject<HTMLElement | null>): number {
  const [width, setWidth] = useState(0);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    const ro = new ResizeObserver(([entry]) => setWidth(Math.round(entry!.contentRect.width)));
    ro.observe(el);
    setWidth(Math.round(el.getBoundingClientRect().width));
    return () => ro.disconnect();
  }, [ref]);
  return width;
}

/** Sizes a canvas's backing store to CSS size × devicePixelRatio and returns a context in CSS px. */
export function prepareCanvas(canvas: HTMLCanvasElement, widthPx: number, heightPx: number): CanvasRenderingContext2D | null {
  const dpr = window.devicePixelRatio || 1;
  const w = Math.max(1, Math.round(widthPx * dpr));
  const h = Math.max(1, Math.round(heightPx * dpr));
  if (canvas.width !== w) canvas.width = w;
  if (canvas.height !== h) canvas.height = h;
  const ctx = canvas.getContext("2d");
  if (!ctx) return null;
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  ctx.clearRect(0, 0, widthPx, heightPx);
  return ctx;
}

/**
 * Draws `base` whenever the time window (or `deps`) change and `overlay` whenever the playhead
 * or the loop change, each at most once per animation frame.
 */
export function useLayeredDraw(
  view: TimeView,
  baseRef: RefObject<HTMLCanvasElement | null>,
  overlayRef: RefObject<HTMLCanvasElement | null>,
  draw: {
    base: (ctx: CanvasRenderingContext2D, s: TimeViewState, theme: RollTheme) => void;
    overlay: (ctx: CanvasRenderingContext2D, s: TimeViewState, theme: RollTheme) => void;
  },
  widthPx: number,
  heightPx: number,
  deps: readonly unknown[],
): void {
  const drawRef = useRef(draw);
  drawRef.current = draw;
  const pending = useRef({ base: true, overlay: true, frame: 0 as number });
  useEffect(() => {
    if (widthPx <= 0) return;
    const p = pending.current;
    const run = () => {
      p.frame = 0;
      const s = view.get();
      const host = baseRef.current;
      if (!host) return;
      const theme = readTheme(host);
      if (p.base) {
        const ctx = prepareCanvas(host, widthPx, heightPx);
        if (ctx) drawRef.current.base(ctx, s, theme);
      }
      if (p.overlay && overlayRef.current) {
        const ctx = prepareCanvas(overlayRef.current, widthPx, heightPx);
        if (ctx) drawRef.current.overlay(ctx, s, theme);
      }
      p.base = false;
      p.overlay = false;
    };
    const request = (base: boolean, overlay: boolean) => {
      p.base ||= base;
      p.overlay ||= overlay;
      if (!p.frame) p.frame = requestAnimationFrame(run);
    };
    request(true, true);
    const unsubscribe = view.subscribe((_s, c) => request(c.window, c.window || c.playhead || c.loop));
    return () => {
      unsubscribe();
      if (p.frame) cancelAnimationFrame(p.frame);
      p.frame = 0;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [view, widthPx, heightPx, baseRef, overlayRef, ...deps]);
}

/** The copper playhead and the loop region, over any time-aligned view (rows y0…y1). */
export function drawPlayheadAndLoop(ctx: CanvasRenderingContext2D, view: TimeView, s: TimeViewState, theme: RollTheme, widthPx: number, y0: number, y1: number): void {
  ctx.save();
  ctx.beginPath();
  ctx.rect(TIMELINE_GUTTER_PX, 0, widthPx - TIMELINE_GUTTER_PX, y1);
  ctx.clip();
  if (s.loop) {
    const a = view.secToX(s.loop.startSec);
    const b = view.secToX(s.loop.endSec);
    ctx.fillStyle = theme.copper;
    ctx.globalAlpha = 0.1;
    ctx.fillRect(a, y0, b - a, y1 - y0);
    ctx.globalAlpha = 0.85;
    ctx.fillRect(Math.round(a) - 0.5, y0, 1, y1 - y0);
    ctx.fillRect(Math.round(b) - 0.5, y0, 1, y1 - y0);
    ctx.globalAlpha = 1;
  }
  const x = view.secToX(s.playheadSec);
  ctx.fillStyle = theme.copper;
  ctx.fillRect(Math.round(x) - 1, y0, 2, y1 - y0);
  ctx.restore();
}

/**
 * Ctrl/⌘ + wheel zooms time about the pointer, Shift + wheel (or a sideways swipe) scrolls it;
 * a plain wheel is left to the page. A non-passive listener, so the page does not zoom instead.
 */
export function useTimeWheel(ref: RefObject<HTMLElement | null>, view: TimeView): void {
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      const unit = e.deltaMode === 1 ? 16 : e.deltaMode === 2 ? 400 : 1;
      const rect = el.getBoundingClientRect();
      if (e.ctrlKey || e.metaKey) {
        e.preventDefault();
        const x = e.clientX - rect.left;
        view.zoomAt(view.xToSec(Math.max(TIMELINE_GUTTER_PX, x)), Math.exp(-e.deltaY * unit * 0.0015));
      } else if (e.shiftKey) {
        e.preventDefault();
        view.scrollByPx((e.deltaY || e.deltaX) * unit);
      } else if (Math.abs(e.deltaX) > Math.abs(e.deltaY)) {
        e.preventDefault();
        view.scrollByPx(e.deltaX * unit);
      }
    };
    el.addEventListener("wheel", onWheel, { passive: false });
    return () => el.removeEventListener("wheel", onWheel);
  }, [ref, view]);
}
