"use client";
import { useMemo } from "react";
import { PianoRoll } from "@/components/piano-roll";
import { withIds } from "@/lib/editor";
import type { TakeNote } from "./types";

/**
 * The take's notes in the piano roll, read-only for now: selecting, scrolling and zooming
 * work; editing and saving revisions from it are the next step of the editor.
 */
export function TakePianoRoll({ notes, durationSec }: { notes: TakeNote[]; durationSec: number }) {
  // a stable list: a new array would look like another revision and restart the roll's history
  const editorNotes = useMemo(() => withIds(notes), [notes]);
  return (
    <div className="space-y-2">
      <PianoRoll notes={editorNotes} onChange={() => undefined} readOnly durationSec={durationSec} tool="select" heightPx={360} />
      <p className="text-xs text-ink-muted">
        Ctrl/⌘ + wheel zooms time, Alt + wheel zooms pitch, Shift + wheel scrolls time. Colours show voices.
      </p>
    </div>
  );
}
