/**
 * Note check: a second small learned classifier that judges each note of the note stage as a
 * whole — is it a note that was played, or a partial of another note (an octave, a twelfth,
 * a sub-harmonic), a fragment of a held note or a noise burst?
 *
 * Its features describe the note (length, level against the take and against the notes
 * sounding with it, pitch, how steady its pitch is, how much of its level it shares with other
 * voices' partials, how often its pitch was detected over its span), its onset (the onset
 * model's probability there and in its first 200 ms, the detection function, the nearest
 * attack) and its neighbours: for each interval of the harmonic series (±12, +19, +24, +28,
 * +31, −19, −24 semitones) how much of the note a louder or softer note at that interval
 * covers and how much louder it is, and the gap to the previous note of the same pitch. The
 * same MLP form as the onset model (onset-model.ts); weights from scripts/train/.
 */
import type { Attack } from "./attacks";
import { median, type TrackedNote } from "./notes";
import { firstAtOrAfter } from "./peaks";
import { hzToMidi } from "../music/pitch";
import { scoreFeatures, type MlpWeights, type OnsetCandidate } from "./onset-model";
import { NOTE_MODEL } from "./note-weights";

/** Notes the check gives a lower probability are left out. */
export const NOTE_CHECK_THRESHOLD = 0.2;

const INTERVALS = [12, 19.02, 24, 27.86, 31.02, -12, -19.02, -24] as const;

export const NOTE_FEATURE_NAMES = [
  "logDuration",
  "levelVsTake",
  "levelVsLoudestWith",
  "pitch",
  "pitchSpread",
  "sharedShare",
  "detectedShare",
  "hasOnset",
  "onsetProbability",
  "earlyProbability",
  "odf",
  "attackDistance",
  "previousGap",
  "concurrent",
  ...INTERVALS.flatMap((k) => [`cover${Math.round(k)}`, `level${Math.round(k)}`]),
] as const;
export const NOTE_FEATURE_COUNT = NOTE_FEATURE_NAMES.length;

interface Info {
  midi: number;
  levelDb: number;
  on: number;
  off: number;
}

export function noteFeatures(
  notes: readonly TrackedNote[],
  cands: readonly OnsetCandidate[],
  attacks: readonly Attack[],
  odf: Float32Array,
  p95Odf: number,
  hopSec: number,
): Float32Array[] {
  const info: Info[] = notes.map((n) => {
    let peak = 0;
    for (const l of n.level) peak = Math.max(peak, l);
    return { midi: hzToMidi(median(n.f0Hz) || 440), levelDb: 20 * Math.log10(peak + 1e-12), on: n.onsetSec, off: n.offsetSec };
  });
  let takeDb = -200;
  for (const i of info) takeDb = Math.max(takeDb, i.levelDb);
  const byMidi = new Map<number, OnsetCandidate[]>();
  for (const c of cands) {
    const l = byMidi.get(c.midi) ?? [];
    l.push(c);
    byMidi.set(c.midi, l);
  }
  const framesOf = new Map<number, Int32Array>();
  for (const [m, l] of byMidi) {
    l.sort((a, b) => a.frame - b.frame);
    framesOf.set(m, Int32Array.from(l, (c) => c.frame));
  }
  const attackFrames = Int32Array.from(attacks, (a) => a.frame).sort();
  // notes by onset: the notes that can overlap a note, or end just before it, start within
  // (longest note + 2 s) before it
  const order = info.map((_, i) => i).sort((a, b) => info[a].on - info[b].on);
  const onsets = Float64Array.from(order, (i) => info[i].on);
  let longest = 0;
  for (const o of info) longest = Math.max(longest, o.off - o.on);
  const near = Math.round(0.05 / hopSec);
  const early = Math.round(0.2 / hopSec);
  return notes.map((n, i) => {
    const me = info[i];
    const len = Math.max(hopSec, me.off - me.on);
    const x = new Float32Array(NOTE_FEATURE_COUNT);
    let k = 0;
    x[k++] = Math.log2(len);
    x[k++] = Math.max(-60, me.levelDb - takeDb) / 60;
    let loudest = -200;
    let concurrent = 0;
    const cover = new Float32Array(INTERVALS.length);
    const lvl = new Float32Array(INTERVALS.length).fill(-1);
    let prevGap = 2;
    const from = firstAtOrAfter(onsets, me.on - longest - 2);
    const to = firstAtOrAfter(onsets, me.off);
    for (let q0 = from; q0 < to; q0++) {
      const j = order[q0];
      if (j === i) continue;
      const o = info[j];
      const ov = Math.min(o.off, me.off) - Math.max(o.on, me.on);
      if (Math.abs(o.midi - me.midi) <= 0.5 && o.off <= me.on + 0.02 && me.on - o.off < prevGap) prevGap = Math.max(0, me.on - o.off);
      if (ov <= 0) continue;
      if (ov >= 0.5 * len) concurrent++;
      loudest = Math.max(loudest, o.levelDb);
      const d = o.midi - me.midi;
      INTERVALS.forEach((iv, q) => {
        if (Math.abs(d - iv) > 0.5) return;
        const c = ov / len;
        if (c > cover[q]) {
          cover[q] = c;
          lvl[q] = Math.max(-30, Math.min(30, o.levelDb - me.levelDb)) / 30;
        }
      });
    }
    x[k++] = loudest > -200 ? Math.max(-40, Math.min(40, me.levelDb - loudest)) / 40 : 1;
    x[k++] = (me.midi - 64) / 36;
    const mid = median(n.f0Hz);
    const cents = Float64Array.from(n.f0Hz, (f) => 1200 * Math.log2(f / (mid || f))).sort();
    x[k++] = cents.length >= 4 ? Math.min(100, cents[Math.floor(0.9 * (cents.length - 1))] - cents[Math.floor(0.1 * (cents.length - 1))]) / 50 : 0;
    let sl = 0;
    let ll = 0;
    for (let q = 0; q < n.level.length; q++) {
      sl += n.shared[q];
      ll += n.level[q];
    }
    x[k++] = ll > 0 ? sl / ll : 0;
    x[k++] = Math.min(1, (n.frames.length * hopSec) / len);
    x[k++] = n.hasOnset ? 1 : 0;
    const f = Math.round(me.on / hopSec);
    let pOn = -1;
    let pEarly = -1;
    const list = byMidi.get(Math.round(me.midi)) ?? [];
    for (let q = firstAtOrAfter(framesOf.get(Math.round(me.midi)) ?? [], f - near); q < list.length && list[q].frame <= f + early; q++) {
      const c = list[q];
      if (Math.abs(c.frame - f) <= near) pOn = Math.max(pOn, c.probability);
      pEarly = Math.max(pEarly, c.probability);
    }
    x[k++] = pOn;
    x[k++] = pEarly;
    const fo = Math.max(0, Math.min(odf.length - 1, f));
    let o = 0;
    for (let t = Math.max(0, fo - 3); t <= Math.min(odf.length - 1, fo + 3); t++) o = Math.max(o, odf[t]);
    x[k++] = Math.log2((o + 1e-9) / (p95Odf + 1e-9)) / 4;
    let ad = 1;
    const at = firstAtOrAfter(attackFrames, f);
    if (at < attackFrames.length) ad = Math.min(ad, (attackFrames[at] - f) * hopSec);
    if (at > 0) ad = Math.min(ad, (f - attackFrames[at - 1]) * hopSec);
    x[k++] = ad;
    x[k++] = Math.min(2, prevGap) / 2;
    x[k++] = Math.min(8, concurrent) / 4;
    for (let q = 0; q < INTERVALS.length; q++) {
      x[k++] = cover[q];
      x[k++] = lvl[q];
    }
    return x;
  });
}

/** Probability that each note was played (one per note, in order). */
export function checkNotes(features: readonly Float32Array[], model: MlpWeights = NOTE_MODEL): Float32Array {
  return scoreFeatures(features, model, NOTE_FEATURE_COUNT);
}
