"use client";
import { useMemo } from "react";
import { TakeTimeline, useTimeView } from "@/components/timeline";
import { useNotes } from "./use-notes";
import { useTake } from "./use-take";

/** The level playback starts at: quiet, so a loud take does not startle or harm anyone's ears. */
export { INITIAL_LEVEL as INITIAL_VOLUME } from "@/components/timeline";

const NO_NOTES: never[] = [];

/**
 * The take's recording and notes on their own time view (transport, waveform, spectrogram): the
 * take page's player until the piano roll is drawn inside a TakeTimeline of its own.
 */
export function TakePlayer({ takeId, takeName, durationSec: given }: { takeId: string; takeName: string; durationSec?: number }) {
  const take = useTake(takeId);
  const durationSec = given ?? take.data?.take.durationSec ?? 0;
  const notes = useNotes(takeId);
  const view = useTimeView(durationSec);
  const list = useMemo(() => notes.data?.notes ?? NO_NOTES, [notes.data]);
  return (
    <div aria-label={`Recording of ${takeName}`} role="group">
      <TakeTimeline takeId={takeId} audioUrl={`/api/v1/takes/${takeId}/audio`} durationSec={durationSec} referenceHz={notes.data?.referenceHz ?? 440} notes={list} timeView={view} />
    </div>
  );
}
