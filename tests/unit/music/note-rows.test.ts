import { describe, expect, it } from "vitest";
import { fromNoteRows, toNoteRows } from "@/lib/music/note-rows";
import type { CurvedNoteEvent } from "@/lib/music/note";
import { rng } from "../../support/random";

type Answer = { source: "draft" | "revision"; revision?: number; referenceHz: number; notes: CurvedNoteEvent[] };

function answer(count: number, seed: number, curves: boolean): Answer {
  const random = rng(seed);
  const notes: CurvedNoteEvent[] = [];
  for (let i = 0; i < count; i++) {
    const onsetSec = Math.round(i * 0.12 * 1000) / 1000;
    const note: CurvedNoteEvent = {
      onsetSec,
      offsetSec: Math.round((onsetSec + 0.1 + random()) * 1000) / 1000,
      pitch: 36 + Math.floor(random() * 61),
      cents: Math.round((random() - 0.5) * 400) / 10,
      velocity: 1 + Math.floor(random() * 127),
      voice: i % 4,
    };
    // some notes have a pitch curve, some not (imported notes, very short ones)
    if (curves && random() < 0.7) note.pitchCurve = { timeSec: [onsetSec, onsetSec + 0.05, onsetSec + 0.1], cents: [random() * 10 - 5, 0, -3.5] };
    notes.push(note);
  }
  return { source: "revision", revision: 3, referenceHz: 441.5, notes };
}

describe("notes as rows (the take page's compact notes)", () => {
  it("give back the same answer, field for field, with and without pitch curves", () => {
    for (const [count, seed, curves] of [[0, 1, false], [1, 2, true], [500, 3, false], [500, 4, true]] as const) {
      const a = answer(count, seed, curves);
      const back = fromNoteRows<Answer>(JSON.parse(JSON.stringify(toNoteRows(a))));
      // against the API's own answer, which is JSON too (−0 arrives as 0 either way)
      expect(back).toEqual(JSON.parse(JSON.stringify(a)));
      // a note without a curve has no pitchCurve field at all, as in the API's answer
      for (let i = 0; i < a.notes.length; i++) expect(Object.keys(back.notes[i]!).sort()).toEqual(Object.keys(a.notes[i]!).sort());
    }
  });

  it("a draft's answer (no revision number) keeps its shape", () => {
    const { revision: _r, ...draft } = answer(20, 5, true);
    const back = fromNoteRows<typeof draft>(JSON.parse(JSON.stringify(toNoteRows({ ...draft, source: "draft" as const }))));
    expect(back).toEqual(JSON.parse(JSON.stringify({ ...draft, source: "draft" })));
    expect("revision" in back).toBe(false);
  });

  it("are well under half the JSON of the answer for a big take", () => {
    const a = answer(5000, 6, false);
    const ratio = JSON.stringify(toNoteRows(a)).length / JSON.stringify(a).length;
    expect(ratio).toBeLessThan(0.45);
  });
});
