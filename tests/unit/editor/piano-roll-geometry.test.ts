import { describe, expect, it } from "vitest";
import {
  KEYBOARD_PX,
  RULER_PX,
  clampViewport,
  fitViewport,
  formatRulerSec,
  hitTest,
  isBlackKey,
  pitchToY,
  rulerStepSec,
  secToX,
  visibleRange,
  xToSec,
  yToPitch,
  zoomPitchAt,
  zoomTimeAt,
  type Viewport,
} from "@/components/piano-roll/geometry";
import { note } from "./helpers";

const v: Viewport = { startSec: 1, pxPerSec: 100, topPitch: 72, rowPx: 10, widthPx: KEYBOARD_PX + 800, heightPx: RULER_PX + 240 };

describe("piano roll geometry", () => {
  it("maps seconds and pitches both ways", () => {
    expect(secToX(v, 1)).toBe(KEYBOARD_PX);
    expect(secToX(v, 2.5)).toBe(KEYBOARD_PX + 150);
    expect(xToSec(v, secToX(v, 3.21))).toBeCloseTo(3.21, 12);
    // row of pitch 72 spans y = RULER_PX … RULER_PX + 10
    expect(pitchToY(v, 72)).toBe(RULER_PX);
    expect(yToPitch(v, RULER_PX + 1)).toBe(72);
    expect(yToPitch(v, RULER_PX + 9.9)).toBe(72);
    expect(yToPitch(v, RULER_PX + 10.1)).toBe(71);
    for (const p of [0, 40, 60, 127]) expect(yToPitch(v, pitchToY(v, p) + 5)).toBe(p);
  });
  it("knows the visible time and pitch range", () => {
    expect(visibleRange(v)).toEqual({ t0Sec: 1, t1Sec: 9, lowPitch: 48, highPitch: 72 });
  });
  it("zooms about the cursor", () => {
    const x = secToX(v, 4);
    const z = zoomTimeAt(v, x, 2);
    expect(z.pxPerSec).toBe(200);
    expect(xToSec(z, x)).toBeCloseTo(4, 12);
    const y = pitchToY(v, 60) + 5;
    const zp = zoomPitchAt(v, y, 1.5);
    expect(zp.rowPx).toBe(15);
    expect(yToPitch(zp, y)).toBe(60);
  });
  it("clamps the view to the take and the MIDI range", () => {
    const c = clampViewport({ ...v, startSec: -5, topPitch: 500, pxPerSec: 1e9 }, 10);
    expect(c.startSec).toBe(0);
    expect(c.topPitch).toBe(127);
    expect(c.pxPerSec).toBeLessThanOrEqual(4000);
  });
  it("fits the notes' pitch range", () => {
    const f = fitViewport([note("a", 0, 1, 55), note("b", 1, 2, 67)], 900, 400, 30);
    const r = visibleRange(f);
    expect(r.lowPitch).toBeLessThanOrEqual(55);
    expect(r.highPitch).toBeGreaterThanOrEqual(67);
    expect(f.startSec).toBe(0);
  });
  it("hit-tests a note's body and ends, the last drawn first", () => {
    const notes = [note("a", 2, 3, 60), note("b", 2.5, 4, 60)];
    const y = pitchToY(v, 60) + 5;
    expect(hitTest(v, notes, secToX(v, 2.2), y)).toEqual({ id: "a", part: "body" });
    expect(hitTest(v, notes, secToX(v, 2) + 1, y)).toEqual({ id: "a", part: "onset" });
    expect(hitTest(v, notes, secToX(v, 4) - 1, y)).toEqual({ id: "b", part: "offset" });
    expect(hitTest(v, notes, secToX(v, 2.7), y)?.id).toBe("b");
    expect(hitTest(v, notes, secToX(v, 2.2), pitchToY(v, 61) + 5)).toBeNull();
    expect(hitTest(v, notes, KEYBOARD_PX - 1, y)).toBeNull();
  });
  it("picks 1-2-5 ruler steps and formats them", () => {
    expect(rulerStepSec(100)).toBe(1);
    expect(rulerStepSec(1000)).toBeCloseTo(0.1, 12);
    expect(rulerStepSec(30)).toBe(5);
    expect(formatRulerSec(2, 1)).toBe("2");
    expect(formatRulerSec(2.5, 0.5)).toBe("2.5");
    expect(formatRulerSec(65, 5)).toBe("1:05");
  });
  it("knows the black keys", () => {
    expect([60, 61, 62, 63, 64, 65, 66].map(isBlackKey)).toEqual([false, true, false, true, false, false, true]);
  });
});
