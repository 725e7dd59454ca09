"use client";
import { useEffect, useState, useSyncExternalStore } from "react";
import { PlaybackEngine, type PlaybackState } from "./playback-engine";
import type { PlayNote } from "./schedule";
import type { TimeView } from "./time-view";

export type Playback = PlaybackState & {
  engine: PlaybackEngine;
  /** Give this to the one <audio> element that plays the recording (no controls of its own). */
  audioRef: (el: HTMLAudioElement | null) => void;
  play: () => Promise<void>;
  pause: () => void;
  toggle: () => void;
  seek: (sec: number) => void;
};

/**
 * The player of a page (take page, replay page): one PlaybackEngine for the component's
 * lifetime, on `timeView` (its playhead, loop and seek). `notes` may change (edits): the
 * scheduler reads the latest list.
 */
export function usePlayback(notes: readonly PlayNote[], timeView: TimeView): Playback {
  const [engine] = useState(() => new PlaybackEngine(timeView));
  useEffect(() => engine.setNotes(notes), [engine, notes]);
  useEffect(() => {
    // fetch Tone.js while the page is idle, so the first Play starts at once
    const id = setTimeout(() => void import("tone").catch(() => undefined), 1500);
    return () => {
      clearTimeout(id);
    };
  }, []);
  useEffect(() => {
    engine.activate();
    return () => engine.dispose();
  }, [engine]);
  const state = useSyncExternalStore(
    (cb) => engine.subscribe(cb),
    () => engine.get(),
    () => engine.get(),
  );
  const [api] = useState(() => ({
    audioRef: (el: HTMLAudioElement | null) => engine.attach(el),
    play: () => engine.play(),
    pause: () => engine.pause(),
    toggle: () => engine.toggle(),
    seek: (sec: number) => engine.seek(sec),
  }));
  return { ...state, ...api, engine };
}

/** Whether a key event's target takes typing (space must not toggle playback there). */
export function isTypingTarget(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target.isContentEditable) return true;
  const tag = target.tagName;
  if (tag === "TEXTAREA" || tag === "SELECT") return true;
  if (tag === "INPUT") {
    const type = (target as HTMLInputElement).type;
    return !["range", "checkbox", "radio", "button", "submit", "reset"].includes(type);
  }
  return false;
}

/** Space plays and pauses, wherever the focus is but in a text field. */
export function useSpaceToPlay(toggle: () => void, enabled = true): void {
  useEffect(() => {
    if (!enabled) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.code !== "Space" && e.key !== " ") return;
      if (e.repeat || e.ctrlKey || e.metaKey || e.altKey || isTypingTarget(e.target)) return;
      e.preventDefault(); // no page scroll, and no click on a focused button as well
      toggle();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [toggle, enabled]);
}
