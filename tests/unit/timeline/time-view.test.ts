import { describe, expect, it } from "vitest";
import { MAX_PX_PER_SEC, MIN_PX_PER_SEC } from "@/components/piano-roll/geometry";
import { TIMELINE_GUTTER_PX, TimeView } from "@/components/timeline/time-view";
import { rng } from "@/tests/support/random";

describe("TimeView: the shared window", () => {
  it("clamps the zoom to the piano roll's limits and the start to the take", () => {
    const v = new TimeView(60);
    v.setAreaWidth(1000);
    v.setWindow({ startSec: -5, pxPerSec: 1e9 });
    expect(v.get().window).toEqual({ startSec: 0, pxPerSec: MAX_PX_PER_SEC });
    v.setWindow({ startSec: 0, pxPerSec: 0.001 });
    expect(v.get().window.pxPerSec).toBe(MIN_PX_PER_SEC);
    // 1000 px at 100 px/s shows 10 s: the start can go no further than 50 s
    v.setWindow({ startSec: 200, pxPerSec: 100 });
    expect(v.get().window).toEqual({ startSec: 50, pxPerSec: 100 });
    v.setWindow({ startSec: Number.NaN, pxPerSec: Number.NaN });
    expect(v.get().window).toEqual({ startSec: 0, pxPerSec: 100 });
  });

  it("zoomAt keeps the time under the pointer where it was (grid of anchors and factors)", () => {
    const random = rng(5);
    for (let i = 0; i < 200; i++) {
      const v = new TimeView(600);
      v.setAreaWidth(1200);
      v.setWindow({ startSec: random() * 300, pxPerSec: 20 + random() * 400 });
      const before = v.get().window;
      const anchor = before.startSec + (random() * 1200) / before.pxPerSec;
      const x = v.secToX(anchor);
      const factor = Math.exp((random() - 0.5) * 2);
      v.zoomAt(anchor, factor);
      const after = v.get().window;
      expect(after.pxPerSec).toBeCloseTo(before.pxPerSec * factor, 9);
      // unless the start had to be clamped at 0 or at the end, the anchor stays put
      if (after.startSec > 0 && after.startSec < 600 - 1200 / after.pxPerSec) expect(v.secToX(anchor)).toBeCloseTo(x, 6);
    }
  });

  it("secToX and xToSec are inverse, and time starts right of the gutter", () => {
    const v = new TimeView(30, { startSec: 2, pxPerSec: 50 });
    expect(v.secToX(2)).toBe(TIMELINE_GUTTER_PX);
    expect(v.secToX(3)).toBe(TIMELINE_GUTTER_PX + 50);
    for (const t of [0, 1.234, 7.5, 29.99]) expect(v.xToSec(v.secToX(t))).toBeCloseTo(t, 12);
  });

  it("seek goes to the player's handler, clamped to the take; without a player it moves the playhead", () => {
    const v = new TimeView(10);
    v.seek(4);
    expect(v.get().playheadSec).toBe(4);
    const asked: number[] = [];
    v.onSeek((s) => asked.push(s));
    v.seek(-3);
    v.seek(25);
    v.seek(6.5);
    expect(asked).toEqual([0, 10, 6.5]);
    expect(v.get().playheadSec).toBe(4); // the player reports the playhead, not the view
  });

  it("a loop needs its end after its start; setting the same loop again tells nobody", () => {
    const v = new TimeView(10);
    let loops = 0;
    v.subscribe((_s, c) => c.loop && loops++);
    v.setLoop({ startSec: 3, endSec: 3 });
    expect(v.get().loop).toBeNull();
    v.setLoop({ startSec: 2, endSec: 5 });
    v.setLoop({ startSec: 2, endSec: 5 });
    expect(v.get().loop).toEqual({ startSec: 2, endSec: 5 });
    expect(loops).toBe(1);
  });
});
