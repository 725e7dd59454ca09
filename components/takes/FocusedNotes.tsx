"use client";
import { Alert, Cents, Mono } from "@/components/ui";
import { soundingAt } from "@/lib/editor";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatSeconds } from "./format";
import type { TakeNote } from "./types";

/**
 * The notes sounding at a moment of the take (the tuning report's "open in take" links pass
 * `?t=<seconds>`), in words; the piano roll scrolls there and selects the same notes.
 */
export function FocusedNotes({ notes, atSec }: { notes: TakeNote[]; atSec: number }) {
  const sounding = soundingAt(notes, atSec).sort((a, b) => a.pitch - b.pitch);
  return (
    <Alert tone="info" title={<>At <Mono>{formatSeconds(atSec)} s</Mono> — selected in the piano roll</>}>
      {sounding.length === 0 ? (
        "No note sounds at this moment."
      ) : (
        <ul className="mt-1 flex flex-wrap gap-x-5 gap-y-1" aria-label="Notes sounding at this moment">
          {sounding.map((n, i) => (
            <li key={i} className="whitespace-nowrap">
              <span className="font-medium">{midiToNoteName(n.pitch)}</span> <Cents value={n.cents} />{" "}
              <span className="text-ink-muted">voice <Mono>{n.voice}</Mono>, from <Mono>{formatSeconds(n.onsetSec)}</Mono> s</span>
            </li>
          ))}
        </ul>
      )}
    </Alert>
  );
}
