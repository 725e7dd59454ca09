/**
 * The bars-and-beats ruler, when a tempo is set: which beat lines to draw and label at a zoom.
 * Bar 1 starts at 0 s; bars and beats are numbered from 1 ("3.2" is bar 3, beat 2). Pure (no
 * DOM), unit-tested beside lib/editor.
 */

export type Meter = { tempoBpm: number; beatsPerBar: number };
export type BeatTick = { sec: number; bar: number; beat: number; kind: "bar" | "beat"; label: string | null };

/** Beat lines closer than this (px) are not drawn. */
export const MIN_BEAT_PX = 8;

export function beatSec(m: Meter): number {
  return 60 / m.tempoBpm;
}

export function validMeter(m: Meter | null | undefined): m is Meter {
  return !!m && Number.isFinite(m.tempoBpm) && m.tempoBpm >= 20 && m.tempoBpm <= 400 && Number.isInteger(m.beatsPerBar) && m.beatsPerBar >= 1 && m.beatsPerBar <= 16;
}

/** Every how many bars a bar number fits (1, 2, 4, 8 …) with labels at least `minLabelPx` apart. */
export function barLabelEvery(m: Meter, pxPerSec: number, minLabelPx = 44): number {
  const barPx = beatSec(m) * m.beatsPerBar * pxPerSec;
  let every = 1;
  while (every * barPx < minLabelPx && every < 1 << 20) every *= 2;
  return every;
}

/**
 * The ticks between t0Sec and t1Sec: every beat when beats are at least `MIN_BEAT_PX` apart,
 * else every bar (or every `barLabelEvery` bars when even bars crowd). Bars get their number
 * when they are `barLabelEvery` apart; beats get "bar.beat" when there is room for it.
 */
export function beatTicks(m: Meter, t0Sec: number, t1Sec: number, pxPerSec: number, minLabelPx = 44): BeatTick[] {
  if (!validMeter(m) || !(t1Sec > t0Sec)) return [];
  const beat = beatSec(m);
  const beatPx = beat * pxPerSec;
  const labelEvery = barLabelEvery(m, pxPerSec, minLabelPx);
  const labelBeats = beatPx >= minLabelPx;
  const out: BeatTick[] = [];
  if (beatPx >= MIN_BEAT_PX) {
    for (let k = Math.max(0, Math.floor(t0Sec / beat)); k * beat <= t1Sec; k++) {
      const bar = Math.floor(k / m.beatsPerBar) + 1;
      const b = (k % m.beatsPerBar) + 1;
      const isBar = b === 1;
      const label = isBar ? ((bar - 1) % labelEvery === 0 ? String(bar) : null) : labelBeats ? `${bar}.${b}` : null;
      out.push({ sec: round9(k * beat), bar, beat: b, kind: isBar ? "bar" : "beat", label });
    }
    return out;
  }
  const barLen = beat * m.beatsPerBar;
  // when even bars crowd, draw only the labelled ones (and their halves when those fit)
  const stepBars = Math.max(1, labelEvery / 2 >= 1 && (labelEvery / 2) * barLen * pxPerSec >= MIN_BEAT_PX ? labelEvery / 2 : labelEvery);
  for (let k = Math.max(0, Math.floor(t0Sec / barLen / stepBars) * stepBars); k * barLen <= t1Sec; k += stepBars) {
    const bar = k + 1;
    out.push({ sec: round9(k * barLen), bar, beat: 1, kind: "bar", label: k % labelEvery === 0 ? String(bar) : null });
  }
  return out;
}

/** The bar and beat (1-based, beat fractional) at a time, e.g. for the inspector: { bar: 3, beat: 2.5 }. */
export function barBeatAt(m: Meter, sec: number): { bar: number; beat: number } {
  const beats = sec / beatSec(m);
  const bar = Math.floor(beats / m.beatsPerBar + 1e-9);
  return { bar: bar + 1, beat: round9(beats - bar * m.beatsPerBar + 1) };
}

function round9(x: number): number {
  return Number(x.toFixed(9));
}
