import { describe, expect, it } from "vitest";
import { threadComments, type CommentDto } from "@/components/comments/types";
import { describeDrift, formatDrift, formatShare, formatVibrato } from "@/components/report/format";
import { soundingHz } from "@/components/replay/sounding";

describe("soundingHz: the frequency a note is resynthesised at", () => {
  // 12-TET at A4 = 440 Hz (ISO 16; MIDI 69 = A4): C4 = 261.6256 Hz, A3 = 220 Hz, A5 = 880 Hz
  it.each([
    [69, 0, 440],
    [60, 0, 261.6256],
    [57, 0, 220],
    [81, 0, 880],
  ])("MIDI %i at %i cents → %f Hz", (pitch, cents, hz) => {
    expect(soundingHz(pitch, cents)).toBeCloseTo(hz, 3);
  });

  it("carries the note's cents, so a flat note sounds flat: −100 cents is the semitone below", () => {
    expect(soundingHz(70, -100)).toBeCloseTo(440, 9);
    // 14 cents flat on E4 (329.6276 Hz): 329.6276 · 2^(−14/1200) = 326.9727 Hz
    expect(soundingHz(64, -14)).toBeCloseTo(326.9727, 3);
  });
});

describe("threadComments", () => {
  const c = (id: string, parentId: string | null, createdAt: string): CommentDto => ({
    id,
    parentId,
    author: { name: "Teacher" },
    body: id,
    target: { kind: "take" },
    createdAt,
    mine: false,
  });

  it("puts replies under their comment, oldest first, and replies to replies under the top of the thread", () => {
    const threads = threadComments([
      c("a", null, "2026-01-01T10:00:00Z"),
      c("b", null, "2026-01-01T10:01:00Z"),
      c("a1", "a", "2026-01-01T10:02:00Z"),
      c("a1x", "a1", "2026-01-01T10:03:00Z"),
      c("b1", "b", "2026-01-01T10:04:00Z"),
    ]);
    expect(threads.map((t) => [t.comment.id, t.replies.map((r) => r.id)])).toEqual([
      ["a", ["a1", "a1x"]],
      ["b", ["b1"]],
    ]);
  });

  it("keeps a reply whose comment is gone as a thread of its own", () => {
    expect(threadComments([c("r", "deleted", "2026-01-01T10:00:00Z")]).map((t) => t.comment.id)).toEqual(["r"]);
  });
});

describe("report figures in words and numbers", () => {
  it("writes shares, drift and vibrato", () => {
    expect(formatShare(0.4857)).toBe("49 %");
    expect(formatShare(null)).toBe("—");
    expect(formatDrift(-3.24)).toBe("\u22123.2 ¢/min");
    expect(describeDrift(-3.24)).toMatch(/sagging/);
    expect(describeDrift(2)).toMatch(/rising/);
    expect(formatVibrato({ rateHz: 5.62, extentCents: 23.04 })).toBe("5.6 Hz, ±23.0 ¢");
    expect(formatVibrato({ rateHz: null, extentCents: 6.86 })).toBe("rate not measured, ±6.9 ¢");
  });
});
