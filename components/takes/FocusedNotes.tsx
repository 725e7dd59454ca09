"use client";
import { Alert, Cents, Mono } from "@/components/ui";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatSeconds } from "./format";
import type { TakeNote } from "./types";

/**
 * The notes sounding at a moment of the take (the tuning report's "open in take" links pass
 * `?t=<seconds>`), until the piano roll can scroll there itself.
 */
export function FocusedNotes({ notes, atSec }: { notes: TakeNote[]; atSec: number }) {
  const sounding = notes
    .filter((n) => n.onsetSec - 0.05 <= atSec && atSec < n.offsetSec)
    .sort((a, b) => a.pitch - b.pitch);
  return (
    <Alert tone="info" title={<>At <Mono>{formatSeconds(atSec)} s</Mono></>}>
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
