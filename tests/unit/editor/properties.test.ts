import { describe, expect, it } from "vitest";
import {
  MAX_PITCH,
  MIN_NOTE_SEC,
  MIN_PITCH,
  addNote,
  apply,
  copyNotes,
  createHistory,
  joinNotes,
  moveNotes,
  pasteNotes,
  redo,
  removeNotes,
  resetCents,
  setNoteEdge,
  setVelocity,
  snapNotes,
  splitNote,
  stretchNotes,
  undo,
  type EditorNote,
  type History,
  type NoteList,
} from "@/lib/editor";
import { frozen, note, rng } from "./helpers";

type Rand = () => number;
const pick = <T,>(r: Rand, xs: readonly T[]): T | undefined => xs[Math.floor(r() * xs.length)];
const some = (r: Rand, notes: NoteList) => notes.filter(() => r() < 0.3).map((n) => n.id);

/** One random edit, as a user could make it with the piano roll's tools and keys. */
function randomEdit(r: Rand, notes: NoteList): NoteList {
  const n = pick(r, notes);
  switch (Math.floor(r() * 12)) {
    case 0: {
      const onsetSec = r() * 10 - 1;
      return addNote(notes, { onsetSec, offsetSec: onsetSec + r() * 2 - 0.5, pitch: Math.floor(r() * 150) - 10, cents: 0, velocity: 80, voice: 1 });
    }
    case 1:
      return removeNotes(notes, some(r, notes));
    case 2:
      return moveNotes(notes, some(r, notes), (r() - 0.5) * 6, Math.round((r() - 0.5) * 200));
    case 3:
      return stretchNotes(notes, some(r, notes), r() < 0.5 ? "onset" : "offset", (r() - 0.5) * 4);
    case 4:
      return n ? setNoteEdge(notes, n.id, r() < 0.5 ? "onset" : "offset", r() * 10 - 2) : notes;
    case 5:
      return n ? splitNote(notes, n.id, n.onsetSec + (n.offsetSec - n.onsetSec) * r()) : notes;
    case 6: {
      const m = pick(r, notes);
      return n && m ? joinNotes(notes, n.id, m.id) : notes;
    }
    case 7:
      return setVelocity(notes, some(r, notes), r() * 200 - 20);
    case 8:
      return resetCents(notes, some(r, notes));
    case 9:
      return snapNotes(notes, some(r, notes), { kind: "beat", tempoBpm: 60 + Math.floor(r() * 120), subdivision: 1 + Math.floor(r() * 4) });
    case 10:
      return pasteNotes(notes, copyNotes(notes, some(r, notes)), r() * 10 - 1);
    default: {
      // a joinable pair: split a note, then join its halves back
      if (!n) return notes;
      const split = splitNote(notes, n.id, (n.onsetSec + n.offsetSec) / 2);
      const other = split.find((x) => !notes.some((y) => y.id === x.id));
      return other ? joinNotes(split, n.id, other.id) : split;
    }
  }
}

function checkInvariants(notes: NoteList) {
  const ids = notes.map((n) => n.id);
  expect(new Set(ids).size).toBe(ids.length);
  for (const n of notes) {
    expect(n.onsetSec).toBeGreaterThanOrEqual(0);
    expect(n.offsetSec - n.onsetSec).toBeGreaterThanOrEqual(MIN_NOTE_SEC - 1e-9);
    expect(Number.isInteger(n.pitch)).toBe(true);
    expect(n.pitch).toBeGreaterThanOrEqual(MIN_PITCH);
    expect(n.pitch).toBeLessThanOrEqual(MAX_PITCH);
    expect(n.velocity).toBeGreaterThanOrEqual(1);
    expect(n.velocity).toBeLessThanOrEqual(127);
    expect(Number.isFinite(n.onsetSec) && Number.isFinite(n.offsetSec)).toBe(true);
  }
}

function startList(r: Rand): EditorNote[] {
  const out: EditorNote[] = [];
  const count = Math.floor(r() * 12);
  for (let i = 0; i < count; i++) {
    const onset = Math.round(r() * 8 * 1000) / 1000;
    out.push(note(`n${i + 1}`, onset, onset + 0.05 + Math.round(r() * 1000) / 1000, 40 + Math.floor(r() * 40), { cents: Math.round((r() - 0.5) * 60) }));
  }
  return frozen(out);
}

describe("random edit sequences (seeded)", () => {
  for (let seed = 1; seed <= 60; seed++) {
    it(`seed ${seed}: invariants hold, nothing is mutated, undo all → the original, redo all → the last`, () => {
      const r = rng(seed);
      const original = startList(r);
      const snapshot = JSON.stringify(original);
      let h: History<NoteList> = createHistory<NoteList>(original);
      // a model of the history: every recorded state and where we stand
      let stack: NoteList[] = [original];
      let pos = 0;
      for (let step = 0; step < 60; step++) {
        const next = frozen(randomEdit(r, h.present));
        checkInvariants(next);
        const before = h;
        h = apply(h, next);
        if (h !== before) {
          stack = [...stack.slice(0, pos + 1), next];
          pos++;
        }
        expect(h.present).toBe(stack[pos]);
        // now and then undo a few before the next edit: the redo branch must go
        if (r() < 0.15) {
          const times = 1 + Math.floor(r() * 3);
          for (let i = 0; i < times; i++) {
            h = undo(h);
            pos = Math.max(0, pos - 1);
          }
          expect(h.present).toBe(stack[pos]);
          expect(h.future).toHaveLength(stack.length - 1 - pos);
        }
      }
      expect(JSON.stringify(original)).toBe(snapshot);
      while (h.past.length) h = undo(h);
      expect(h.present).toBe(original);
      for (let k = 1; k < stack.length; k++) {
        h = redo(h);
        expect(h.present).toBe(stack[k]);
      }
      expect(h.future).toHaveLength(0);
    });
  }
});
