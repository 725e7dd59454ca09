"use client";
import { NoteEditor, type RollFrame } from "@/components/editor/NoteEditor";
import { TakeTimeline, type TimeView } from "@/components/timeline";

/**
 * The take page's recording and piano roll: the timeline (transport, waveform, spectrogram)
 * with the editor workspace's roll inside it, for editors and owners; the same read-only for
 * listeners (selection, zoom and full playback).
 */
export function TakePianoRoll({
  takeId,
  durationSec,
  canEdit,
  timeView,
  focusSec,
  draftAt,
  noNotesText,
}: {
  takeId: string;
  durationSec: number;
  canEdit: boolean;
  timeView: TimeView;
  focusSec: number | null;
  draftAt: string | null;
  noNotesText: string;
}) {
  // transport, waveform and spectrogram above the roll, all on the page's one time view
  const frame: RollFrame = (roll, notes, referenceHz) => (
    <TakeTimeline takeId={takeId} audioUrl={`/api/v1/takes/${takeId}/audio`} durationSec={durationSec} referenceHz={referenceHz} notes={notes} timeView={timeView}>
      {roll}
    </TakeTimeline>
  );
  return (
    <NoteEditor
      takeId={takeId}
      durationSec={durationSec}
      canEdit={canEdit}
      timeView={timeView}
      focusSec={focusSec}
      frame={frame}
      draftAt={draftAt}
      noNotesText={noNotesText}
    />
  );
}
