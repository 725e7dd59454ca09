"use client";
import { useLayoutEffect, useRef, type ReactNode } from "react";
import { useTakeAudio } from "./audio-data";
import { useElementWidth } from "./canvas-view";
import type { PlayNote } from "./schedule";
import { Spectrogram } from "./Spectrogram";
import { TIMELINE_GUTTER_PX, type TimeView } from "./time-view";
import { TransportBar } from "./TransportBar";
import { usePlayback, useSpaceToPlay } from "./use-playback";
import { Waveform } from "./Waveform";

export type TakeTimelineProps = {
  takeId: string;
  /** The recording (`/api/v1/takes/{id}/audio`: the original upload, with byte ranges). */
  audioUrl: string;
  durationSec: number;
  /** The take's A4 (shown; the notes' frequencies come from pitch + cents alone, see sounding.ts). */
  referenceHz: number;
  /** The notes as currently edited; playback follows edits. */
  notes: readonly PlayNote[];
  timeView: TimeView;
  /** The piano roll, drawn on the same time view under the spectrogram. */
  children?: ReactNode;
};

/**
 * The take page's time-aligned views, top to bottom: the transport, the waveform, the
 * spectrogram and `children` (the piano roll), all on `timeView` (x = gutter + (t − startSec) ·
 * pxPerSec, the same TIMELINE_GUTTER_PX gutter), with one player for the recording and the notes.
 *
 * For the browser test a read-only probe is always on the page: `window.__tapernotePlayback`
 * (audioSec, playheadSec, contextSec, playing, mode, notesScheduled, stats, resetStats — see
 * PlaybackProbe in playback-engine.ts); the <audio> element also carries data-notes-scheduled.
 */
export function TakeTimeline({ takeId, audioUrl, durationSec, referenceHz, notes, timeView, children }: TakeTimelineProps) {
  const root = useRef<HTMLDivElement>(null);
  const width = useElementWidth(root);
  const player = usePlayback(notes, timeView);
  const audio = useTakeAudio(audioUrl);
  const hasNotes = notes.length > 0;
  // one "Try again" for the waveform's data and the player's element
  const retry = () => {
    audio.retry();
    if (player.audioError) player.engine.reload();
  };
  useSpaceToPlay(player.toggle);

  // The widest view's time area; on first sight, the first 20 s (or the whole take) across it
  // (before the first frame, so the roll inside draws that window from the start).
  const fitted = useRef(false);
  useLayoutEffect(() => {
    if (width <= TIMELINE_GUTTER_PX) return;
    timeView.setAreaWidth(width - TIMELINE_GUTTER_PX);
    if (!fitted.current) {
      fitted.current = true;
      const w = timeView.get().window;
      if (w.startSec === 0 && w.pxPerSec === 100) timeView.setWindow({ startSec: 0, pxPerSec: (width - TIMELINE_GUTTER_PX) / Math.max(1, Math.min(durationSec, 20)) });
    }
  }, [width, timeView, durationSec]);

  return (
    <div ref={root} className="overflow-hidden rounded-md border border-rule bg-paper" data-testid="take-timeline" data-take={takeId}>
      {/* the recording is the clock; it has no controls of its own */}
      <audio ref={player.audioRef} src={audioUrl} preload="auto" className="hidden" aria-hidden="true" />
      <TransportBar player={player} view={timeView} lengthSec={player.durationSec ?? durationSec} hasNotes={hasNotes} referenceHz={referenceHz} />
      {width > 0 ? (
        <>
          <Waveform view={timeView} audio={{ ...audio, retry }} widthPx={width} />
          <div className="border-t border-rule">
            <Spectrogram view={timeView} audio={audio} audioUrl={audioUrl} widthPx={width} />
          </div>
        </>
      ) : null}
      {children ? <div className="border-t border-rule">{children}</div> : null}
    </div>
  );
}
