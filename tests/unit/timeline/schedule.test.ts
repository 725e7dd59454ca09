import { describe, expect, it } from "vitest";
import { MediaClock } from "@/components/timeline/clock";
import { MIN_REMAINDER_SEC, firstOnsetAtOrAfter, followLoop, notesSoundingAt, notesStartingIn, sortByOnset, type PlayNote } from "@/components/timeline/schedule";
import { LOOKAHEAD_SEC, TICK_SEC } from "@/components/timeline/playback-engine";
import { rng } from "@/tests/support/random";

const note = (onsetSec: number, offsetSec: number, pitch = 60): PlayNote => ({ onsetSec, offsetSec, pitch, cents: 0, velocity: 80, voice: 1 });

describe("the note scheduler's windows", () => {
  it("hands every note over exactly once as the lookahead window sweeps the take", () => {
    const random = rng(11);
    const notes = sortByOnset(Array.from({ length: 500 }, () => {
      const on = random() * 60;
      return note(on, on + 0.05 + random() * 2, 40 + Math.floor(random() * 40));
    }));
    const handed = new Map<PlayNote, number>();
    // ticks every 25 ms with jitter, each handing over [scheduledUntil, position + lookahead)
    let until = 0;
    for (let pos = 0; pos < 62; pos += TICK_SEC * (0.5 + random())) {
      const to = pos + LOOKAHEAD_SEC;
      for (const s of notesStartingIn(notes, until, to)) {
        handed.set(s.note, (handed.get(s.note) ?? 0) + 1);
        // handed before its time: the onset is still ahead of the position
        expect(s.startSec).toBeGreaterThanOrEqual(pos);
        expect(s.durationSec).toBeCloseTo(s.note.offsetSec - s.note.onsetSec, 12);
      }
      until = to;
    }
    expect(handed.size).toBe(notes.length);
    expect([...handed.values()].every((n) => n === 1)).toBe(true);
  });

  it("finds the first onset at or after a time (binary search)", () => {
    const notes = [note(0, 1), note(1, 2), note(1, 3), note(2.5, 3)];
    expect(firstOnsetAtOrAfter(notes, -1)).toBe(0);
    expect(firstOnsetAtOrAfter(notes, 1)).toBe(1);
    expect(firstOnsetAtOrAfter(notes, 1.0001)).toBe(3);
    expect(firstOnsetAtOrAfter(notes, 9)).toBe(4);
  });

  it("a seek into the middle of a chord starts the notes sounding there for the rest of their length", () => {
    const notes = sortByOnset([note(1, 3, 60), note(1, 1.5, 64), note(2, 4, 67), note(2.98, 3.01, 72), note(5, 6, 72)]);
    const starts = notesSoundingAt(notes, 2.5);
    expect(starts.map((s) => [s.note.pitch, s.startSec, +s.durationSec.toFixed(6)])).toEqual([
      [60, 2.5, 0.5],
      [67, 2.5, 1.5],
    ]);
    // a remainder under MIN_REMAINDER_SEC would only click
    expect(notesSoundingAt(notes, 3.0 - MIN_REMAINDER_SEC / 2).map((s) => s.note.pitch)).toEqual([67]);
    // a note starting exactly there is started once: by notesSoundingAt, not by the next window
    const atOnset = notesSoundingAt(notes, 2);
    expect(atOnset.map((s) => s.note.pitch)).toEqual([60, 67]);
    expect(notesStartingIn(notes, 2 + 1e-6, 2.2)).toEqual([]);
  });

  it("inside a loop the window stops at the loop's end and notes are cut there; the wrap is due on crossing it", () => {
    const loop = { startSec: 1, endSec: 2 };
    // inside once between the ends; before the loop or never inside: play on
    expect(followLoop(false, 1.5, loop)).toEqual({ inside: true, wrap: false });
    expect(followLoop(false, 0.5, loop)).toEqual({ inside: false, wrap: false });
    expect(followLoop(false, 2.5, loop)).toEqual({ inside: false, wrap: false });
    expect(followLoop(true, 0.5, loop)).toEqual({ inside: false, wrap: false }); // a seek before it
    expect(followLoop(true, 1.5, null)).toEqual({ inside: false, wrap: false });
    // inside and past the end, however far a late tick overshoots: wrap
    expect(followLoop(true, 2.0, loop)).toEqual({ inside: true, wrap: true });
    expect(followLoop(true, 2.3, loop)).toEqual({ inside: true, wrap: true });
    // the window inside the loop ends at the loop's end, and notes are cut there
    const notes = sortByOnset([note(1.9, 2.5), note(1.95, 1.97), note(2.01, 3)]);
    const cut = loop.endSec;
    const starts = notesStartingIn(notes, 1.88, Math.min(1.88 + LOOKAHEAD_SEC, cut), cut);
    expect(starts.map((s) => [s.note.onsetSec, +s.durationSec.toFixed(6)])).toEqual([
      [1.9, 0.1],
      [1.95, 0.02],
    ]);
    // after the wrap, what sounds at the loop's start starts at once
    expect(notesSoundingAt(sortByOnset([note(0.5, 1.5), note(1, 1.2)]), loop.startSec, loop.endSec).map((s) => s.note.onsetSec)).toEqual([0.5, 1]);
  });
});

describe("MediaClock: the recording's position on the AudioContext's clock", () => {
  it("is the median offset, so a stale reading does not move it", () => {
    const c = new MediaClock();
    const offset = -0.0321;
    const random = rng(3);
    for (let i = 0; i < 40; i++) {
      const ctx = 10 + i * 0.025;
      // a reading now and then from a currentTime cached earlier in the task (up to 10 ms stale)
      const stale = random() < 0.2 ? random() * 0.01 : 0;
      c.add(ctx + offset - stale, ctx);
    }
    expect(Math.abs(c.offsetSec() - offset)).toBeLessThan(0.0005);
    expect(c.contextAt(c.mediaAt(12.345))).toBeCloseTo(12.345, 12);
  });

  it("starts afresh after a run of readings far from the median (a stall or a missed seek)", () => {
    const c = new MediaClock();
    for (let i = 0; i < 10; i++) c.add(i * 0.025 - 0.03, i * 0.025);
    c.add(5, 0.3); // one stray is ignored
    expect(c.offsetSec()).toBeCloseTo(-0.03, 9);
    c.add(5.025, 0.325);
    c.add(5.05, 0.35);
    expect(c.offsetSec()).toBeCloseTo(4.7, 9);
    expect(c.count).toBe(1);
  });

  it("stays within 1 ms over three minutes of rate-locked readings with jitter", () => {
    const c = new MediaClock();
    const random = rng(8);
    let worst = 0;
    for (let ctx = 0; ctx < 180; ctx += 0.025) {
      c.add(ctx - 0.04 + (random() - 0.5) * 0.004, ctx);
      if (ctx > 0.5) worst = Math.max(worst, Math.abs(c.offsetSec() + 0.04));
    }
    expect(worst).toBeLessThan(0.001);
  });
});
