/**
 * Onset model: which pitches start at each attack, decided by a small learned classifier.
 *
 * At every attack (attacks.ts: a peak of the spectral-flux function, with the peaks of the
 * frames just before and after it and the energy that is new), each semitone p of the pitch
 * range whose first partials show new energy is a candidate. Its features describe the
 * candidate's harmonic series (partials 1 … 8 and the sub-harmonics f0/2, f0/3) in the frame
 * after the onset, the frame before it and the new energy, all in dB against the attack's
 * loudest peak; what the concurrent-pitch estimator (multipitch.ts) found in the attack
 * spectrum and in the frames around the onset; the detection function's height; and the
 * pitch itself. A multilayer perceptron (one hidden layer, ReLU, logistic output) maps them
 * to the probability that a note of pitch p starts there.
 *
 * The weights come from `scripts/train/`: random pieces (not the evaluation pieces) rendered
 * by FluidSynth with three General MIDI sound sets, clean and with noise, reverb and a
 * telephone band, labelled with their MIDI notes (docs/engine.md, "Onset model").
 */
import { strongestNear, type Attack } from "./attacks";
import { firstAtOrAfter } from "./peaks";
import { hzToMidi } from "../music/pitch";
import type { FrameDetections } from "./notes";
import { ONSET_MODEL } from "./onset-weights";

export const FEATURE_NAMES = [
  ...[1, 2, 3, 4, 5, 6, 7, 8].flatMap((h) => [`after${h}`, `before${h}`, `rise${h}`]),
  "afterSub2",
  "riseSub2",
  "afterSub3",
  "riseSub3",
  "odf",
  "attackLevel",
  "inAttack",
  "attackNewShare",
  "attackF0Share",
  "attackParts",
  "detAfter",
  "detBefore",
  "detLevelAfter",
  "detLevelBefore",
  "pitch",
  "takeLevel",
  "riseSum",
  "afterSum",
  // later: does the pitch go on sounding, or begin to, in the next 250 ms?
  "detFuture",
  "detLevelFuture",
  "partials3",
  "partials8",
  "partials15",
  "partials25",
  "partialsBefore",
  // the rule-based note stage (notes.ts) around the attack
  "ruleOnset",
  "ruleOnsetDist",
  "ruleHeld",
  "ruleLevel",
  "ruleBelow12",
  "ruleBelow19",
  "ruleBelow24",
  "ruleAbove12",
  "ruleOnsetsHere",
] as const;
const RULE_FEATURES = 9;
export const FEATURE_COUNT = FEATURE_NAMES.length;

const FLOOR_DB = -60;
const CENTS40 = Math.pow(2, 40 / 1200);
const CENTS50 = Math.pow(2, 50 / 1200);

const ampNear = strongestNear;

/** Frequency of the strongest peak within ±50 cents of f (0 if none). */
function freqNear(hz: Float32Array, amp: Float32Array, f: number): number {
  const lo = f / CENTS50;
  const hi = f * CENTS50;
  let best = 0;
  let bf = 0;
  for (let i = firstAtOrAfter(hz, lo); i < hz.length; i++) {
    if (hz[i] > hi) break;
    if (amp[i] > best) {
      best = amp[i];
      bf = hz[i];
    }
  }
  return bf;
}

function db(a: number, refDb: number): number {
  if (!(a > 0)) return FLOOR_DB;
  return Math.max(FLOOR_DB, 20 * Math.log10(a) - refDb);
}

function maxOf(a: Float32Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) if (a[i] > m) m = a[i];
  return m;
}

export interface OnsetCandidate {
  attack: number;
  frame: number;
  midi: number;
  features: Float32Array;
  probability: number;
}

export interface OnsetContext {
  det: FrameDetections;
  lowMidi: number;
  highMidi: number;
  /** 95th percentile of the detection function. */
  p95Odf: number;
  /** Loudest peak amplitude of the take's attacks. */
  takeMaxAmp: number;
  maxHz: number;
  /** Frame hop (s): the windows below are set in seconds. */
  hopSec: number;
  /** Level (dB) of the partials of f0 in frame t (peak store of the top register). */
  harmonicLevelDb?: (t: number, f0Hz: number) => number;
}

/** Fraction of frames [from, to] where a detection lies within ±50 cents of fHz, and its strongest level. */
function detected(det: FrameDetections, from: number, to: number, fHz: number): [number, number] {
  let hit = 0;
  let k = 0;
  let lv = 0;
  const lo = fHz / CENTS50;
  const hi = fHz * CENTS50;
  for (let t = Math.max(0, from); t <= Math.min(det.frames - 1, to); t++) {
    k++;
    for (let i = 0; i < det.count[t]; i++) {
      const f = det.f0Hz[t * det.slots + i];
      if (f >= lo && f <= hi) {
        hit++;
        lv = Math.max(lv, det.level[t * det.slots + i]);
        break;
      }
    }
  }
  return [k ? hit / k : 0, lv];
}

/** The candidates of one attack, with their features (probability not yet set). */
export function attackCandidates(a: Attack, index: number, ctx: OnsetContext): OnsetCandidate[] {
  const out: OnsetCandidate[] = [];
  const refAmp = Math.max(maxOf(a.afterAmp), 1e-9);
  const refDb = 20 * Math.log10(refAmp);
  const riseMax = maxOf(a.riseAmp);
  if (!(riseMax > 0)) return out;
  for (let m = ctx.lowMidi; m <= ctx.highMidi; m++) {
    const nominal = 440 * Math.pow(2, (m - 69) / 12);
    // a candidate needs new energy on one of its first three partials
    let any = false;
    for (let h = 1; h <= 3 && !any; h++) if (h * nominal < ctx.maxHz && ampNear(a.riseHz, a.riseAmp, h * nominal, CENTS50) > 0) any = true;
    if (!any) continue;
    const f0 = freqNear(a.afterHz, a.afterAmp, nominal) || freqNear(a.riseHz, a.riseAmp, nominal) || nominal;
    const x = new Float32Array(FEATURE_COUNT);
    let k = 0;
    let riseSum = 0;
    let afterSum = 0;
    for (let h = 1; h <= 8; h++) {
      const f = h * f0;
      const inBand = f < ctx.maxHz;
      const aa = inBand ? ampNear(a.afterHz, a.afterAmp, f) : 0;
      const bb = inBand ? ampNear(a.beforeHz, a.beforeAmp, f) : 0;
      const rr = inBand ? ampNear(a.riseHz, a.riseAmp, f) : 0;
      riseSum += rr;
      afterSum += aa;
      x[k++] = db(aa, refDb) / 60;
      x[k++] = db(bb, refDb) / 60;
      x[k++] = db(rr, refDb) / 60;
    }
    x[k++] = db(ampNear(a.afterHz, a.afterAmp, f0 / 2), refDb) / 60;
    x[k++] = db(ampNear(a.riseHz, a.riseAmp, f0 / 2), refDb) / 60;
    x[k++] = db(ampNear(a.afterHz, a.afterAmp, f0 / 3), refDb) / 60;
    x[k++] = db(ampNear(a.riseHz, a.riseAmp, f0 / 3), refDb) / 60;
    x[k++] = Math.log2((a.odf + 1e-9) / (ctx.p95Odf + 1e-9)) / 4;
    let inAtt = -1;
    for (let i = 0; i < a.f0Hz.length; i++) if (a.f0Hz[i] >= nominal / CENTS50 && a.f0Hz[i] <= nominal * CENTS50) inAtt = i;
    x[k++] = inAtt >= 0 ? db(a.level[inAtt], refDb) / 60 : -1;
    x[k++] = inAtt >= 0 ? 1 : 0;
    x[k++] = inAtt >= 0 ? a.newShare[inAtt] : 0;
    x[k++] = inAtt >= 0 ? a.f0Share[inAtt] : 0;
    x[k++] = inAtt >= 0 ? a.parts[inAtt] / 10 : 0;
    const fr = (sec: number) => a.frame + Math.round(sec / ctx.hopSec);
    const [dA, lA] = detected(ctx.det, fr(0.01), fr(0.08), f0);
    const [dB, lB] = detected(ctx.det, fr(-0.12), fr(-0.03), f0);
    x[k++] = dA;
    x[k++] = dB;
    x[k++] = db(lA, refDb) / 60;
    x[k++] = db(lB, refDb) / 60;
    x[k++] = (m - 64) / 36;
    x[k++] = db(refAmp, 20 * Math.log10(ctx.takeMaxAmp + 1e-12)) / 60;
    x[k++] = db(riseSum, refDb) / 60;
    x[k++] = db(afterSum, refDb) / 60;
    const [dF, lF] = detected(ctx.det, fr(0.09), fr(0.25), f0);
    x[k++] = dF;
    x[k++] = db(lF, refDb) / 60;
    const hl = ctx.harmonicLevelDb;
    const hb = hl ? Math.max(-120, hl(fr(-0.04), f0)) : -120;
    for (const d of [0.03, 0.08, 0.15, 0.25]) x[k++] = hl ? Math.max(-2, Math.min(2, (Math.max(-120, hl(fr(d), f0)) - hb) / 30)) : 0;
    x[k++] = Math.max(FLOOR_DB, hb - refDb) / 60;
    // rule features are filled in by addRuleFeatures
    out.push({ attack: index, frame: a.frame, midi: m, features: x, probability: 0 });
  }
  return out;
}

/** Candidates of every attack of the take. */
export function onsetCandidates(attacks: readonly Attack[], ctx: Omit<OnsetContext, "takeMaxAmp">): OnsetCandidate[] {
  let takeMaxAmp = 1e-9;
  for (const a of attacks) takeMaxAmp = Math.max(takeMaxAmp, maxOf(a.afterAmp));
  const full = { ...ctx, takeMaxAmp };
  const out: OnsetCandidate[] = [];
  attacks.forEach((a, i) => {
    for (const c of attackCandidates(a, i, full)) out.push(c);
  });
  return out;
}

interface RuleNote {
  onsetSec: number;
  offsetSec: number;
  midi: number;
  levelDb: number;
}

/**
 * Fill in the features that describe the rule-based note stage's notes (notes.ts) near each
 * candidate: a note of the same pitch starting within ±50 ms (and how far), one held through
 * the attack, notes starting an octave, a twelfth or two octaves below or an octave above,
 * and how many notes start there.
 */
export function addRuleFeatures(
  cands: OnsetCandidate[],
  attacks: readonly Attack[],
  notes: ReadonlyArray<{ onsetSec: number; offsetSec: number; f0Hz: Float32Array; level: Float32Array }>,
  hopSec: number,
): void {
  const rule: RuleNote[] = notes.map((n) => {
    const f = n.f0Hz.slice().sort();
    let peak = 0;
    for (const l of n.level) peak = Math.max(peak, l);
    return { onsetSec: n.onsetSec, offsetSec: n.offsetSec, midi: hzToMidi(f[f.length >> 1] || 440), levelDb: 20 * Math.log10(peak + 1e-12) };
  });
  rule.sort((a, b) => a.onsetSec - b.onsetSec);
  const starts = rule.map((r) => r.onsetSec);
  for (const c of cands) {
    const a = attacks[c.attack];
    const refDb = 20 * Math.log10(Math.max(maxOf(a.afterAmp), 1e-9));
    const t = c.frame * hopSec;
    let k = FEATURE_COUNT - RULE_FEATURES;
    const x = c.features;
    let best = Infinity;
    let lv = FLOOR_DB;
    let held = 0;
    const rel = [0, 0, 0, 0];
    let here = 0;
    for (let i = firstAtOrAfter(starts, t - 3); i < rule.length && rule[i].onsetSec <= t + 0.05; i++) {
      const r = rule[i];
      const d = r.midi - c.midi;
      const near = Math.abs(r.onsetSec - t) <= 0.05;
      if (near) here++;
      if (Math.abs(d) <= 0.5) {
        if (near && Math.abs(r.onsetSec - t) < best) {
          best = Math.abs(r.onsetSec - t);
          lv = Math.max(FLOOR_DB, r.levelDb - refDb);
        } else if (r.onsetSec < t - 0.05 && r.offsetSec > t + 0.03) held = 1;
      } else if (near) {
        if (Math.abs(d + 12) <= 0.5) rel[0] = 1;
        if (Math.abs(d + 19.02) <= 0.5) rel[1] = 1;
        if (Math.abs(d + 24) <= 0.5) rel[2] = 1;
        if (Math.abs(d - 12) <= 0.5) rel[3] = 1;
      }
    }
    x[k++] = best <= 0.05 ? 1 : 0;
    x[k++] = best <= 0.05 ? best / 0.05 : 1;
    x[k++] = held;
    x[k++] = lv / 60;
    for (const r of rel) x[k++] = r;
    x[k++] = Math.min(here, 8) / 4;
  }
}

export interface MlpWeights {
  inputs: number;
  hidden: number;
  mean: number[];
  scale: number[];
  w1: number[];
  b1: number[];
  w2: number[];
  b2: number;
}

/** Probability of each candidate (one hidden ReLU layer, logistic output). */
export function scoreCandidates(cands: OnsetCandidate[], model: MlpWeights = ONSET_MODEL): void {
  const p = scoreFeatures(cands.map((c) => c.features), model, FEATURE_COUNT);
  cands.forEach((c, i) => (c.probability = p[i]));
}

/** Each model's weights as typed arrays, made once. */
const PACKED = new WeakMap<MlpWeights, { w1: Float32Array; b1: Float32Array; w2: Float32Array; mean: Float32Array; scale: Float32Array }>();

/** An MLP's output for each feature vector: one hidden ReLU layer, logistic output. */
export function scoreFeatures(rows: readonly Float32Array[], model: MlpWeights, inputs: number): Float32Array {
  const H = model.hidden;
  const D = model.inputs;
  if (D !== inputs) throw new Error(`model expects ${D} features, the code makes ${inputs}`);
  let packed = PACKED.get(model);
  if (!packed) {
    packed = { w1: Float32Array.from(model.w1), b1: Float32Array.from(model.b1), w2: Float32Array.from(model.w2), mean: Float32Array.from(model.mean), scale: Float32Array.from(model.scale) };
    PACKED.set(model, packed);
  }
  const { w1, b1, w2, mean, scale } = packed;
  const z = new Float32Array(D);
  const out = new Float32Array(rows.length);
  for (let r = 0; r < rows.length; r++) {
    const x = rows[r];
    for (let d = 0; d < D; d++) z[d] = (x[d] - mean[d]) * scale[d];
    let y = model.b2;
    for (let j = 0; j < H; j++) {
      let s = b1[j];
      const row = j * D;
      for (let d = 0; d < D; d++) s += w1[row + d] * z[d];
      if (s > 0) y += w2[j] * s;
    }
    out[r] = 1 / (1 + Math.exp(-y));
  }
  return out;
}
