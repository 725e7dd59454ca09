"use client";
/**
 * The take page's shared time axis: one horizontal zoom and scroll, the playhead and the loop
 * region, read by the waveform, the spectrogram and the piano roll so they stay lined up.
 *
 * It is a small external store (not React state): panning, zooming and the playhead change
 * many times a second, and each view redraws its own canvas on a change instead of React
 * re-rendering the page. Every view draws time from the same left edge: `TIMELINE_GUTTER_PX`
 * (the piano roll's keyboard width) is left for labels, so x = gutter + (t − startSec)·pxPerSec
 * in all of them.
 */
import { useEffect, useRef, useState, useSyncExternalStore } from "react";
import { MAX_PX_PER_SEC, MIN_PX_PER_SEC } from "@/components/piano-roll/geometry";
import { TIMELINE_GUTTER_PX } from "./gutter";

export { TIMELINE_GUTTER_PX };

/** The visible time window: `startSec` at the gutter's right edge, `pxPerSec` across. */
export type TimeWindow = { startSec: number; pxPerSec: number };
export type LoopRegion = { startSec: number; endSec: number };

export type TimeViewState = {
  window: TimeWindow;
  /** Where playback is (s); updated every animation frame while playing. */
  playheadSec: number;
  loop: LoopRegion | null;
  durationSec: number;
  /** Width of the time area (CSS px, without the gutter) of the widest view, once known. */
  areaWidthPx: number;
};

type Listener = (state: TimeViewState, changed: { window: boolean; playhead: boolean; loop: boolean }) => void;

export class TimeView {
  private state: TimeViewState;
  private listeners = new Set<Listener>();
  private seekHandler: ((sec: number) => void) | null = null;

  constructor(durationSec: number, window: TimeWindow = { startSec: 0, pxPerSec: 100 }) {
    this.state = { window, playheadSec: 0, loop: null, durationSec: Math.max(0, durationSec), areaWidthPx: 0 };
  }

  get(): TimeViewState {
    return this.state;
  }

  subscribe(listener: Listener): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  /** Sets the window (clamped to the take and the zoom limits); every view redraws. */
  setWindow(next: TimeWindow): void {
    const w = this.clampWindow(next);
    const cur = this.state.window;
    if (w.startSec === cur.startSec && w.pxPerSec === cur.pxPerSec) return;
    this.emit({ ...this.state, window: w }, { window: true, playhead: false, loop: false });
  }

  /** Zooms about a time (s) that stays under the same x. */
  zoomAt(anchorSec: number, factor: number): void {
    const { startSec, pxPerSec } = this.state.window;
    const next = Math.min(MAX_PX_PER_SEC, Math.max(MIN_PX_PER_SEC, pxPerSec * factor));
    const x = (anchorSec - startSec) * pxPerSec;
    this.setWindow({ pxPerSec: next, startSec: anchorSec - x / next });
  }

  /** Scrolls by a number of CSS pixels. */
  scrollByPx(dxPx: number): void {
    const { startSec, pxPerSec } = this.state.window;
    this.setWindow({ startSec: startSec + dxPx / pxPerSec, pxPerSec });
  }

  /** Shows the whole take across `areaWidthPx`. */
  fit(areaWidthPx = this.state.areaWidthPx): void {
    if (areaWidthPx <= 0 || this.state.durationSec <= 0) return;
    this.setWindow({ startSec: 0, pxPerSec: areaWidthPx / this.state.durationSec });
  }

  setAreaWidth(px: number): void {
    if (px === this.state.areaWidthPx) return;
    this.state = { ...this.state, areaWidthPx: px };
    this.setWindow(this.state.window); // re-clamp
  }

  setDuration(durationSec: number): void {
    if (durationSec === this.state.durationSec) return;
    this.emit({ ...this.state, durationSec: Math.max(0, durationSec) }, { window: true, playhead: false, loop: false });
  }

  /** The playhead as the player reports it. Views only draw it; use `seek` to move playback. */
  setPlayhead(sec: number): void {
    if (sec === this.state.playheadSec) return;
    this.emit({ ...this.state, playheadSec: sec }, { window: false, playhead: true, loop: false });
  }

  setLoop(loop: LoopRegion | null): void {
    const l = loop && loop.endSec > loop.startSec ? loop : null;
    const cur = this.state.loop;
    if (l === cur || (l && cur && l.startSec === cur.startSec && l.endSec === cur.endSec)) return;
    this.emit({ ...this.state, loop: l }, { window: false, playhead: false, loop: true });
  }

  /** The player registers how to seek; views (a click on a ruler) call `seek`. */
  onSeek(handler: ((sec: number) => void) | null): void {
    this.seekHandler = handler;
  }

  seek(sec: number): void {
    const t = Math.min(Math.max(0, sec), this.state.durationSec || Infinity);
    if (this.seekHandler) this.seekHandler(t);
    else this.setPlayhead(t);
  }

  /** x within a view's canvas (CSS px, gutter included) of a time, and back. */
  secToX(sec: number): number {
    const { startSec, pxPerSec } = this.state.window;
    return TIMELINE_GUTTER_PX + (sec - startSec) * pxPerSec;
  }

  xToSec(x: number): number {
    const { startSec, pxPerSec } = this.state.window;
    return startSec + (x - TIMELINE_GUTTER_PX) / pxPerSec;
  }

  private clampWindow(w: TimeWindow): TimeWindow {
    const pxPerSec = Math.min(MAX_PX_PER_SEC, Math.max(MIN_PX_PER_SEC, Number.isFinite(w.pxPerSec) ? w.pxPerSec : 100));
    const visibleSec = this.state.areaWidthPx > 0 ? this.state.areaWidthPx / pxPerSec : 0;
    const maxStart = Math.max(0, this.state.durationSec - visibleSec);
    const startSec = Math.min(maxStart, Math.max(0, Number.isFinite(w.startSec) ? w.startSec : 0));
    return { startSec, pxPerSec };
  }

  private emit(next: TimeViewState, changed: { window: boolean; playhead: boolean; loop: boolean }): void {
    this.state = next;
    for (const l of this.listeners) l(next, changed);
  }
}

/** One TimeView for the lifetime of a component (a take page). */
export function useTimeView(durationSec: number): TimeView {
  const [view] = useState(() => new TimeView(durationSec));
  useEffect(() => view.setDuration(durationSec), [view, durationSec]);
  return view;
}

/**
 * Calls `onChange` on every change without re-rendering (for canvas views). The callback may
 * change between renders; the latest one is used.
 */
export function useTimeViewListener(view: TimeView, onChange: Listener): void {
  const ref = useRef(onChange);
  ref.current = onChange;
  useEffect(() => view.subscribe((s, c) => ref.current(s, c)), [view]);
}

/** The state as React state, for controls that show numbers (not for per-frame drawing). */
export function useTimeViewState(view: TimeView): TimeViewState {
  return useSyncExternalStore(
    (cb) => view.subscribe(cb),
    () => view.get(),
    () => view.get(),
  );
}
