"use client";
import { useCallback } from "react";
import { usePlayback, useSpaceToPlay, useTimeView, useTimeViewState, type ListenMode, type PlayNote } from "@/components/timeline";

export type ReplayNote = PlayNote;

/**
 * The replay page's player: Tapernote's one player (components/timeline, the same as the take
 * page's) on a time view of its own, with the position as React state for the page's controls.
 */
export function useReplayPlayer(notes: ReplayNote[], durationSec = 0) {
  const view = useTimeView(durationSec);
  const player = usePlayback(notes, view);
  const { playheadSec } = useTimeViewState(view);
  useSpaceToPlay(player.toggle);
  const { engine } = player;
  const setMode = useCallback((m: ListenMode) => engine.setMode(m), [engine]);
  const setLevel = useCallback((l: number) => engine.setLevel(l), [engine]);
  return {
    audioRef: player.audioRef,
    view,
    mode: player.mode,
    setMode,
    level: player.level,
    setLevel,
    playing: player.playing,
    starting: player.starting,
    play: player.play,
    pause: player.pause,
    seek: player.seek,
    positionSec: playheadSec,
    durationSec: player.durationSec,
    error: player.error ?? (player.audioError ? "The recording could not be loaded; the notes can still be played." : null),
  };
}
