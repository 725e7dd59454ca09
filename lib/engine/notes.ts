/**
 * Note tracking: frame detections → pitch tracks (continuity in cents, a gap tolerance as
 * hysteresis) → notes, split at re-articulations (an onset of the detection function where
 * the track's own level rises), with a shortest note, onsets snapped to detected onsets and
 * offsets corrected for the frame length of the note's register.
 */
import { firstAtOrAfter, type PeakStore } from "./peaks";
import { riseNear, type Attack } from "./attacks";

export interface FrameDetections {
  /** Frames and slots per frame. */
  frames: number;
  slots: number;
  count: Uint8Array;
  f0Hz: Float32Array;
  level: Float32Array;
  /** Level with shared partials split between the voices (multipitch `sharedLevels`); optional. */
  sharedLevel?: Float32Array;
}

export interface TrackingConfig {
  hopSec: number;
  shortestNoteSec: number;
  /** 95th percentile of the detection function, when the caller has it (odfP95). */
  p95Odf?: number;
  /** Frame length (s) of the register a fundamental falls in. */
  frameLengthSecFor: (f0Hz: number) => number;
  /** A track continues to a detection within this many cents. */
  continuityCents?: number;
  /** Frames a track survives without a detection. */
  maxGapFrames?: number;
  /** Level rise (dB) at an onset that splits a track (re-articulation). */
  riseDb?: number;
  /** Tracks whose peak level is this many dB under the take's loudest are dropped. */
  rangeDb?: number;
  /** A harmonic or sub-harmonic of a louder concurrent note this many dB weaker is dropped. */
  shadowDb?: number;
  /** How far before a track's first frame its onset is searched (s). */
  onsetBackSec?: number;
  /** Lead of an attack's start before its steepest rise (s). */
  attackLeadSec?: number;
  /** Below this fundamental (Hz) the detection-function onset may precede the partials' rise. */
  lowRegisterHz?: number;
  /** A split needs a detection-function peak ≥ this fraction of its 95th percentile. */
  splitOdfFraction?: number;
  /** A rise of the note's partials (dB over 30 ms) that counts as an attack without a detection-function peak. */
  attackRiseDb?: number;
  /** Notes this many dB under the loudest overlapping note are dropped. */
  concurrentRangeDb?: number;
  /** A detection-function peak at a note's start counts as its attack. */
  attackFromOdf?: boolean;
  /** How far back (s) a late-detected note's attack may lie while its partials were present. */
  backtrackSec?: number;
  /** The offset is the last frame's centre minus this fraction of the register's frame length: a frame still sees a note that ended up to half a frame before its centre. */
  offsetFrameFraction?: number;
  /** Backtracking stops at an onset of at least this fraction of the detection function's 95th percentile. */
  backtrackOdf?: number;
  /** Notes this many dB under the take's loudest note are dropped. */
  takeRangeDb?: number;
  /**
   * A detection-function peak of at least this multiple of its 95th percentile is a clear
   * onset: a note whose own partials rise by `clearRiseDb` there is re-articulated, and the
   * part after the split is an attack of its own.
   */
  clearOnsetOdf?: number;
  clearRiseDb?: number;
  /** Release: the note ends where its own partials fall this many dB within 30 ms (and twice that 30 ms later). */
  releaseDropDb?: number;
  /** Per-pitch attacks (attacks.ts): the pitches whose energy is new at each onset. */
  attacks?: Attack[];
  /**
   * A note whose onset lies more than attackCheckSec before its first detection, with no
   * attack of its pitch there, starts at the first attack of its pitch after it (new share
   * ≥ attackShare, at most attackRangeDb under the note).
   */
  attackCheckSec?: number;
  attackShare?: number;
  attackRangeDb?: number;
  /** The onset stands where the note's own partials rise at an attack to at most this many dB under the note. */
  attackSupportDb?: number;
  /** A short attack-less note is kept where its pitch is found at an attack within ±40 ms with this share new, at most attackShownDb under it (share > 1: not). */
  attackShownShare?: number;
  attackShownDb?: number;
  /** A re-articulation split needs the attack spectrum to show the note's own pitch or its unshared partials rising. */
  attackSplitCheck?: boolean;
  /** …below a detection-function peak of this multiple of its 95th percentile (stronger onsets split without it). */
  replayCheckOdf?: number;
  /** A note (≥ sustainMinHz) whose detections end while its own partials hold within sustainDb of their level goes on. */
  sustainMinHz?: number;
  sustainDb?: number;
  /** …within this many dB below 250 Hz (the short frames see only upper partials of a low note, shared with others). */
  sustainLowDb?: number;
  /** A fragment this long (s) after a note of its pitch ended, without an attack, continues it (a held note lost for a while behind other voices). */
  joinGapSec?: number;
  /** Join a fragment to the note of its pitch just before unless an attack shows it played again. */
  attackJoin?: boolean;
  /** Lead (s) of a note's start before the attack it is moved to by the start check (attacks of held voices swell). */
  attackStartLeadSec?: number;
  /** Lead (s) of a note's start before its attack frame. */
  attackFrameLeadSec?: number;
  /** Notes from attacks alone (see addAttackNotes); least new share, range under the loudest new pitch (dB), least detection-function peak (× its 95th percentile). */
  attackNotes?: boolean;
  attackNoteShare?: number;
  attackNoteDb?: number;
  attackNoteOdf?: number;
  /** …least new share at its fundamental, and least number of its first 10 partials in the attack spectrum. */
  attackNoteF0Share?: number;
  attackNoteParts?: number;
  /** A note from an attack alone is at most this many dB under the loudest note sounding there (shared-split levels). */
  attackNoteRangeDb?: number;
  /** …no harmonic of a note that started less than this long before it (s)… */
  attackNoteYoungSec?: number;
  /** …no octave or twelfth of a sounding note more than this many dB louder… */
  attackNoteOctaveDb?: number;
  /** …and no harmonic or sub-harmonic of a sounding note whose unshared partials rose by at least this share of its energy. */
  attackHostShare?: number;
}

/** Attacks by pitch: per semitone, frames, fractional MIDI and levels (dB), in frame order. */
class AttackIndex {
  private readonly bySemi = new Map<number, { t: number[]; m: number[]; db: number[]; share: number[] }>();
  constructor(attacks: Attack[], minOdf: number) {
    for (const a of attacks) {
      if (a.odf < minOdf) continue;
      for (let i = 0; i < a.f0Hz.length; i++) {
        const m = 69 + 12 * Math.log2(a.f0Hz[i] / 440);
        const k = Math.round(m);
        let e = this.bySemi.get(k);
        if (!e) this.bySemi.set(k, (e = { t: [], m: [], db: [], share: [] }));
        e.t.push(a.frame);
        e.m.push(m);
        e.db.push(20 * Math.log10(a.level[i] + 1e-12));
        e.share.push(a.newShare[i]);
      }
    }
  }
  /** Attacks within ±50 cents of fractional MIDI m in frames [from, to], level ≥ minDb, new share ≥ minShare: in frame order. */
  find(m: number, from: number, to: number, minDb: number, minShare = 0): Array<{ t: number; db: number; share: number }> {
    const out: Array<{ t: number; db: number; share: number }> = [];
    for (let k = Math.round(m) - 1; k <= Math.round(m) + 1; k++) {
      const e = this.bySemi.get(k);
      if (!e) continue;
      for (let i = firstAtOrAfter(e.t, from); i < e.t.length && e.t[i] <= to; i++) {
        if (Math.abs(e.m[i] - m) > 0.5 || e.db[i] < minDb || e.share[i] < minShare) continue;
        out.push({ t: e.t[i], db: e.db[i], share: e.share[i] });
      }
    }
    return out.sort((a, b) => a.t - b.t);
  }
}

/** One tracked note: frame span and per-frame fundamental and level. */
export interface TrackedNote {
  /** True when the onset was snapped to a detected onset. */
  hasOnset: boolean;
  onsetSec: number;
  offsetSec: number;
  /** Frame indices, fundamentals (Hz) and levels (linear) of the note's frames. */
  frames: Int32Array;
  f0Hz: Float32Array;
  level: Float32Array;
  /** Levels with shared partials split between voices (for comparing concurrent notes). */
  shared: Float32Array;
  /** Where the note's pitch is measured up to when its end lies past its detections (s). */
  pitchUntilSec?: number;
}

interface Track {
  f0: number;
  t: number[];
  f: number[];
  l: number[];
  s: number[];
  miss: number;
  matched: boolean;
}

export function trackNotes(det: FrameDetections, odf: Float32Array, onsetFrames: Int32Array, cfg: TrackingConfig, store?: PeakStore): TrackedNote[] {
  const cont = cfg.continuityCents ?? 60;
  const maxGap = cfg.maxGapFrames ?? 6;
  const riseDb = cfg.riseDb ?? 7.5;
  const rangeDb = cfg.rangeDb ?? 50;
  const active: Track[] = [];
  const done: Track[] = [];
  const order: number[] = [];
  for (let t = 0; t < det.frames; t++) {
    const n = det.count[t];
    const base = t * det.slots;
    order.length = 0;
    for (let i = 0; i < n; i++) order.push(i);
    order.sort((a, b) => det.level[base + b] - det.level[base + a]);
    for (const tr of active) tr.matched = false;
    for (const i of order) {
      const f = det.f0Hz[base + i];
      let best: Track | null = null;
      let bestD = cont;
      for (const tr of active) {
        if (tr.matched) continue;
        const d = Math.abs(1200 * Math.log2(f / tr.f0));
        if (d < bestD) {
          bestD = d;
          best = tr;
        }
      }
      if (!best) {
        best = { f0: f, t: [], f: [], l: [], s: [], miss: 0, matched: false };
        active.push(best);
      }
      best.matched = true;
      best.miss = 0;
      best.f0 = f;
      best.t.push(t);
      best.f.push(f);
      best.l.push(det.level[base + i]);
      best.s.push(det.sharedLevel ? det.sharedLevel[base + i] : det.level[base + i]);
    }
    for (let k = active.length - 1; k >= 0; k--) {
      const tr = active[k];
      if (tr.matched) continue;
      if (++tr.miss > maxGap) {
        done.push(tr);
        active.splice(k, 1);
      }
    }
  }
  done.push(...active);
  let maxLevel = 0;
  for (const tr of done) for (const l of tr.l) if (l > maxLevel) maxLevel = l;
  const minLevel = maxLevel * Math.pow(10, -rangeDb / 20);
  const out: TrackedNote[] = [];
  const hop = cfg.hopSec;
  // a re-articulation needs a real attack: a detection-function peak of at least this height
  const p95Odf = cfg.p95Odf ?? odfP95(odf);
  const splitOdf = (cfg.splitOdfFraction ?? 0.3) * p95Odf;
  const attackIx = cfg.attacks ? new AttackIndex(cfg.attacks, 0) : null;
  for (const tr of done) {
    let peak = 0;
    for (const l of tr.l) if (l > peak) peak = l;
    if (peak < minLevel || tr.t.length < 2) continue;
    if ((tr.t[tr.t.length - 1] - tr.t[0] + 1) * hop < cfg.shortestNoteSec) continue;
    const fTrack = median(tr.f);
    // the track's own partial level per frame, computed once over the span searched
    const envFrom = Math.max(0, tr.t[0] - Math.round((cfg.backtrackSec ?? 2) / cfg.hopSec) - 25);
    const envTo = Math.min(det.frames - 1, tr.t[tr.t.length - 1] + 8);
    const envDb = new Float32Array(envTo - envFrom + 1).fill(-200);
    if (store) for (let t = envFrom; t <= envTo; t++) envDb[t - envFrom] = store.harmonicLevelDb(t, fTrack);
    const env = (t: number) => (t >= envFrom && t <= envTo ? envDb[t - envFrom] : -200);
    const clearOdf = (cfg.clearOnsetOdf ?? 2) * p95Odf;
    // a re-articulation shows in the attack spectrum as the note's own pitch, or as new energy
    // on its partials that no other pitch starting there shares (a melody note starting on a
    // held note's partials raises them too)
    const fT = fTrack;
    const replayed = attackIx && (cfg.attackSplitCheck ?? true)
      ? (o: number) => {
          const m = 69 + 12 * Math.log2(fT / 440);
          let peak = -200;
          for (const l of tr.l) peak = Math.max(peak, 20 * Math.log10(l + 1e-12));
          if (attackIx.find(m, o - 4, o + 4, peak - (cfg.attackRangeDb ?? 20), cfg.attackShare ?? 0.3).length) return true;
          const atts = cfg.attacks!;
          for (let k = firstAttackAtOrAfter(atts, o - 4); k < atts.length && atts[k].frame <= o + 4; k++) {
            if (ownRiseDb(atts[k], fT) >= peak - (cfg.attackSupportDb ?? 15)) return true;
          }
          return false;
        }
      : null;
    const segs = splitTrack(tr, onsetFrames, riseDb, store ? env : null, odf, splitOdf, clearOdf, cfg.clearRiseDb ?? 4, replayed, (cfg.replayCheckOdf ?? 1) * p95Odf);
    for (let si = 0; si < segs.length; si++) {
      const seg = segs[si];
      const t0 = tr.t[seg[0]];
      const t1 = tr.t[seg[1] - 1];
      const fMed = median(tr.f.slice(seg[0], seg[1]));
      const frameSec = cfg.frameLengthSecFor(fMed);
      // onset: the strongest detected onset from just before the first frame to where the
      // note's own frames stop reaching back before its attack
      const look = Math.ceil((0.5 * frameSec) / hop);
      const back = Math.round((cfg.onsetBackSec ?? 0.2) / hop);
      // the earliest strong detected onset from a little before the first frame (a voice
      // competing at its attack is found late) to where the note's frames stop reaching back
      let onMax = 0;
      const firstOn = firstAtOrAfter(onsetFrames, t0 - back);
      for (let q = firstOn; q < onsetFrames.length; q++) {
        const o = onsetFrames[q];
        if (o > t0 + look) break;
        if (odf[o] > onMax) onMax = odf[o];
      }
      let on = -1;
      for (let q = firstOn; q < onsetFrames.length; q++) {
        const o = onsetFrames[q];
        if (o > t0 + look) break;
        if (odf[o] >= 0.5 * onMax) {
          on = o;
          break;
        }
      }
      let onsetSec = on >= 0 ? on * hop : t0 * hop + 0.25 * frameSec;
      let hasOnset = on >= 0;
      if (store) {
        // the note's own attack: the steepest rise of its partials' level in the short frames
        // a voice masked by louder ones at its attack is detected late: while its own partials
        // were already there (within 8 dB of their level at the first detection), look further back
        let tb = t0;
        const ref = Math.max(env(t0), env(t0 + 1), env(t0 + 2));
        let limit = t0 - Math.round((cfg.backtrackSec ?? 2) / hop);
        // …but not past the last clear onset of the take before it: earlier, its partials
        // may be another voice's
        for (let q = firstAtOrAfter(onsetFrames, limit + 3); q < onsetFrames.length; q++) {
          const o = onsetFrames[q];
          if (o > t0) break;
          if (odf[o] >= (cfg.backtrackOdf ?? 2) * p95Odf) limit = Math.max(limit, o - 3);
        }
        while (tb > limit && tb > 2 && env(tb - 1) >= ref - 8) tb--;
        const a = Math.max(2, Math.min(t0 - back, tb - 5));
        const b = Math.min(det.frames - 2, t0 + look);
        let peakEnv = -200;
        for (let t = a; t <= Math.min(det.frames - 1, t1); t++) peakEnv = Math.max(peakEnv, env(t));
        let best = -1;
        let bestRise = 3; // dB over 30 ms, at least
        const riseAt = (t: number) => {
          const e1 = env(t + 1);
          return e1 < peakEnv - 20 ? 0 : e1 - Math.max(env(t - 2), peakEnv - 40);
        };
        for (let t = a; t <= b; t++) {
          const rise = riseAt(t);
          if (rise > bestRise) {
            bestRise = rise;
            best = t;
          }
        }
        // when the window reaches back past the first detection, another sound's attack may
        // be the steepest: take the latest rise that is at least half as steep
        if (best >= 0 && tb < t0) {
          for (let t = b; t > best; t--) {
            const rise = riseAt(t);
            if (rise >= 0.5 * bestRise && rise >= 6 && (t === b || rise >= riseAt(t + 1)) && rise >= riseAt(t - 1)) {
              best = t;
              bestRise = rise;
              break;
            }
          }
        }
        if (best >= 0) {
          let snap = -1;
          for (let q = firstAtOrAfter(onsetFrames, best - 3); q < onsetFrames.length && onsetFrames[q] <= best + 3; q++) {
            const o = onsetFrames[q];
            if (snap < 0 || Math.abs(o - best) < Math.abs(snap - best)) snap = o;
          }
          // the steepest rise lies past the start of an attack: 20 ms earlier on average (measured
          // on rendered instruments, docs/engine.md)
          const envOnset = Math.max(0, (snap >= 0 ? snap : best) * hop - (cfg.attackLeadSec ?? 0.02));
          // a low voice's upper partials (all the short frames see of it) swell after its
          // attack: an earlier detected onset close before wins
          onsetSec = on >= 0 && fMed < (cfg.lowRegisterHz ?? 250) && on * hop < envOnset && on * hop > envOnset - 0.12 ? on * hop : envOnset;
          // an attack of its own: a clear detection-function peak there, or a steep rise
          hasOnset = bestRise >= (cfg.attackRiseDb ?? 10) || ((cfg.attackFromOdf ?? false) && snap >= 0 && odf[snap] >= splitOdf);
        }
        // a re-articulation split at a clear onset is an attack of its own (so the fragment
        // joining below does not glue it back onto the previous note)
        if (si > 0) {
          for (let q = firstAtOrAfter(onsetFrames, t0 - 3); q < onsetFrames.length && onsetFrames[q] <= t0 + 3; q++) if (odf[onsetFrames[q]] >= clearOdf) hasOnset = true;
        }
      }
      if (attackIx && onsetSec < t0 * hop - (cfg.attackCheckSec ?? 0.06)) {
        // placed well before the first detection (walking back through partials that other
        // voices may share): unless an attack of the note's pitch supports that start, the
        // first attack of its pitch after it is the note's own
        let segPeakDb = -200;
        for (let j = seg[0]; j < seg[1]; j++) segPeakDb = Math.max(segPeakDb, 20 * Math.log10(tr.l[j] + 1e-12));
        const mMed = 69 + 12 * Math.log2(fMed / 440);
        const from = Math.round(onsetSec / hop);
        const minDb = segPeakDb - (cfg.attackRangeDb ?? 20);
        const share = cfg.attackShare ?? 0.3;
        const later = attackIx.find(mMed, from + 5, t0 + look, minDb, share);
        let supported = attackIx.find(mMed, from - 5, from + 5, minDb, share).length > 0;
        // …or the note's own partials rise at an attack there (the pitch search on the attack
        // spectrum may have given that energy to another voice starting with it)
        const atts = cfg.attacks!;
        for (let k = firstAttackAtOrAfter(atts, from - 5); k < atts.length && !supported; k++) {
          const a = atts[k];
          if (a.frame > from + 5) break;
          let e = 0;
          for (let h = 1; h <= 10; h++) e += riseNear(a, h * fMed) ** 2;
          if (10 * Math.log10(e + 1e-24) >= segPeakDb - (cfg.attackSupportDb ?? 15)) supported = true;
        }
        if (later.length && !supported) {
          onsetSec = Math.max(0, later[0].t * hop - (cfg.attackStartLeadSec ?? 0.04));
          hasOnset = true;
        }
      }
      let offsetSec = t1 * hop - (cfg.offsetFrameFraction ?? 0.5) * frameSec + hop;
      if (store) {
        // the release: in the note's last half second, the first frame where its own partials
        // (short frames) fall D dB under their level of the 30 ms before and keep falling
        // (2·D within 30 ms more). A sustained note's release falls faster than its sustain,
        // a damped string faster than its free decay; the frame is centred on the fall.
        const D = cfg.releaseDropDb ?? 6;
        for (let t = Math.max(t0 + 8, t1 - 50); t <= t1 + 4; t++) {
          const pre = Math.max(env(t - 3), env(t - 2), env(t - 1));
          if (pre < -150) continue;
          if (env(t) <= pre - D && env(t + 3) <= pre - 2 * D) {
            offsetSec = Math.min(offsetSec, t * hop);
            break;
          }
        }
      }
      let measureUntil: number | undefined;
      if (store && attackIx && fMed >= (cfg.sustainMinHz ?? 130) && si === segs.length - 1) {
        // detections lost while the note still sounds (masked by other voices): its own
        // partials in the short frames hold within 6 dB of their level in the note, with no
        // attack of its pitch, for as long as 3 s more
        const lv: number[] = [];
        for (let t = t0; t <= t1; t++) lv.push(env(t));
        const ref = median(lv);
        const mMed = 69 + 12 * Math.log2(fMed / 440);
        const limit = Math.min(det.frames - 1, t1 + Math.round(3 / hop));
        let t = t1 + 1;
        const dbHold = fMed >= 250 ? cfg.sustainDb ?? 6 : cfg.sustainLowDb ?? 2;
        while (t <= limit && store.harmonicLevelDb(t, fMed) >= ref - dbHold) t++;
        if (t - t1 > 10) {
          const again = attackIx.find(mMed, t1 + 1, t, -200, cfg.attackShare ?? 0.3);
          const end = again.length ? Math.min(t, again[0].t) : t;
          if (end * hop > offsetSec) {
            measureUntil = offsetSec;
            offsetSec = end * hop;
          }
        }
      }
      if (offsetSec < onsetSec + cfg.shortestNoteSec) offsetSec = onsetSec + cfg.shortestNoteSec;
      if ((t1 - t0 + 1) * hop < cfg.shortestNoteSec) continue;
      out.push({
        hasOnset,
        onsetSec,
        offsetSec,
        ...(measureUntil !== undefined ? { pitchUntilSec: measureUntil } : {}),
        frames: Int32Array.from(tr.t.slice(seg[0], seg[1])),
        f0Hz: Float32Array.from(tr.f.slice(seg[0], seg[1])),
        level: Float32Array.from(tr.l.slice(seg[0], seg[1])),
        shared: Float32Array.from(tr.s.slice(seg[0], seg[1])),
      });
    }
  }
  out.sort((a, b) => a.onsetSec - b.onsetSec || a.f0Hz[0] - b.f0Hz[0]);
  // a fragment close after a note of its pitch is played again only where an attack shows it:
  // its pitch among the attack's new pitches, or its own partials rising there
  const attackOf = attackIx && (cfg.attackJoin ?? true)
    ? (n: TrackedNote) => {
        const f = median(n.f0Hz);
        const m = 69 + 12 * Math.log2(f / 440);
        const at = Math.round((n.onsetSec + (cfg.attackFrameLeadSec ?? 0.02)) / hop);
        const peak = peakDbOf(n.level);
        if (attackIx.find(m, at - 6, at + 6, peak - (cfg.attackRangeDb ?? 20), cfg.attackShare ?? 0.3).length) return true;
        const atts = cfg.attacks!;
        for (let k = firstAttackAtOrAfter(atts, at - 6); k < atts.length; k++) {
          const a = atts[k];
          if (a.frame > at + 6) break;
          let e = 0;
          for (let h = 1; h <= 10; h++) e += riseNear(a, h * f) ** 2;
          if (10 * Math.log10(e + 1e-24) >= peak - (cfg.attackSupportDb ?? 15)) return true;
        }
        return false;
      }
    : undefined;
  // a short note without a steep rise of its own (a legato note) is kept where an attack shows
  // its pitch start: found there with most of its energy new, not far under the note
  const shown = new WeakSet<TrackedNote>();
  if (attackIx && (cfg.attackShownShare ?? 0.6) <= 1) {
    for (const n of out) {
      if (n.hasOnset || n.offsetSec - n.onsetSec >= 0.3) continue;
      const m = 69 + 12 * Math.log2(median(n.f0Hz) / 440);
      const at = Math.round((n.onsetSec + (cfg.attackFrameLeadSec ?? 0.02)) / hop);
      if (attackIx.find(m, at - 4, at + 4, peakDbOf(n.level) - (cfg.attackShownDb ?? 10), cfg.attackShownShare ?? 0.6).length) shown.add(n);
    }
  }
  const kept = dropWeak(pruneShadows(mergeFragments(out, cont, attackOf, cfg.joinGapSec ?? 1.2, shown), cfg.shadowDb ?? 6), cfg.concurrentRangeDb ?? 9, cfg.takeRangeDb ?? 30);
  if (!cfg.attacks || (cfg.attackNotes ?? true) === false) return kept;
  return addAttackNotes(kept, cfg.attacks, cfg, det.frames, p95Odf, store ? (t, f) => store.harmonicLevelDb(t, f) : null);
}

/**
 * Level (dB) of the new energy at an attack on the partials of f0Hz (h ≤ 10) that are no
 * partial of another pitch found starting there (those rise with that pitch; overlapping
 * partials, Klapuri 2003).
 */
function ownRiseDb(a: Attack, f0Hz: number): number {
  let e = 0;
  for (let h = 1; h <= 10; h++) {
    const f = h * f0Hz;
    let shared = false;
    for (let j = 0; j < a.f0Hz.length && !shared; j++) {
      const g = a.f0Hz[j];
      if (Math.abs(Math.log2(g / f0Hz)) < 0.5 / 12) continue;
      const k = Math.round(f / g);
      if (k >= 1 && Math.abs(f - k * g) < 0.03 * f) shared = true;
    }
    if (!shared) e += riseNear(a, f) ** 2;
  }
  return 10 * Math.log10(e + 1e-24);
}

/**
 * Notes that the frame detections never showed but whose attack does: a pitch whose energy
 * is nearly all new at an onset (a melody note on a held note's partials, cancelled with that
 * note in every frame) and as loud as the other pitches starting there. No note of that pitch
 * may start near the attack or sound through it. The note lasts until the next attack of a
 * different pitch near it in the same register (a line moving on), until its own partials fall
 * 10 dB under their level at the attack, or a second at most.
 */
function addAttackNotes(
  notes: TrackedNote[],
  attacks: Attack[],
  cfg: TrackingConfig,
  frames: number,
  p95Odf: number,
  env: ((t: number, f0: number) => number) | null,
): TrackedNote[] {
  const hop = cfg.hopSec;
  const minShare = cfg.attackNoteShare ?? 0.7;
  const relDb = cfg.attackNoteDb ?? 6;
  let takeMax = 0;
  for (const n of notes) for (const l of n.level) if (l > takeMax) takeMax = l;
  const takeMaxDb = 20 * Math.log10(takeMax + 1e-12);
  const lead = cfg.attackFrameLeadSec ?? 0.02;
  const added: TrackedNote[] = [];
  const midiOf = (f: number) => 69 + 12 * Math.log2(f / 440);
  const noteMidi = notes.map((n) => midiOf(median(n.f0Hz)));
  const noteHz = noteMidi.map((m) => 440 * Math.pow(2, (m - 69) / 12));
  const noteShared = notes.map((n) => peakDbOf(n.shared));
  // notes are in onset order: the ones sounding at t start within the longest note before it
  const onsets = notes.map((n) => n.onsetSec);
  let longest = 0;
  for (const n of notes) longest = Math.max(longest, n.offsetSec - n.onsetSec);
  for (let ai = 0; ai < attacks.length; ai++) {
    const a = attacks[ai];
    if (a.odf < (cfg.attackNoteOdf ?? 0.5) * p95Odf) continue;
    let loud = 0;
    for (const l of a.level) loud = Math.max(loud, l);
    for (let i = 0; i < a.f0Hz.length; i++) {
      if (a.newShare[i] < minShare || a.level[i] < loud * Math.pow(10, -relDb / 20)) continue;
      if (a.f0Share[i] < (cfg.attackNoteF0Share ?? 0.75) || a.parts[i] < (cfg.attackNoteParts ?? 3)) continue;
      const lvDb = 20 * Math.log10(a.level[i] + 1e-12);
      if (lvDb < takeMaxDb - (cfg.takeRangeDb ?? 30)) continue;
      const m = midiOf(a.f0Hz[i]);
      const onsetSec = Math.max(0, a.frame * hop - lead);
      // as loud as what sounds there: new energy far under the notes held through the onset
      // is their vibrato or beating
      const j0 = firstAtOrAfter(onsets, onsetSec - longest - 0.1);
      let sounding = -200;
      for (let j = j0; j < notes.length && onsets[j] <= onsetSec + 0.1; j++) {
        const n = notes[j];
        if (n.onsetSec > onsetSec + 0.05 || n.offsetSec < onsetSec) continue;
        sounding = Math.max(sounding, noteShared[j]);
      }
      if (lvDb < sounding - (cfg.attackNoteRangeDb ?? 6)) continue;
      // a harmonic of a note whose attack is still developing (a brass or bowed note's upper
      // partials swell after its start), or a sub-harmonic of a sounding note, is that note's
      let related = false;
      for (let j = j0; j < notes.length && !related && onsets[j] <= onsetSec + 0.1; j++) {
        const n = notes[j];
        if (n.onsetSec > onsetSec + 0.05 || n.offsetSec < onsetSec) continue;
        const d = m - noteMidi[j];
        const up = d > 0.5 && HARMONIC_SEMIS.some((x) => Math.abs(d - x) < 0.5);
        const down = d < -0.5 && [12, 19.02, 24].some((x) => Math.abs(-d - x) < 0.5);
        if (!up && !down) continue;
        // a harmonic of a note that has just started is its attack's partials swelling (one
        // that starts with it is told apart by the pitch search on the attack spectrum)
        if (up && onsetSec - n.onsetSec < (cfg.attackNoteYoungSec ?? 0.25) && onsetSec - n.onsetSec > 0.05) {
          related = true;
          break;
        }
        // an octave or twelfth above a louder sounding note: its swell or vibrato, unless it is as loud
        if ((Math.abs(d - 12) < 0.5 || Math.abs(d - 19.02) < 0.5) && lvDb < noteShared[j] - (cfg.attackNoteOctaveDb ?? 0)) {
          related = true;
          break;
        }
        // …when the sounding note's partials that it does not share rose as well
        const fX = noteHz[j];
        const fC = a.f0Hz[i];
        let host = 0;
        let own = 0;
        for (let k = 1; k <= 10; k++) {
          const fk = k * fX;
          const r = fk / fC;
          if (Math.abs(r - Math.round(r)) * fC > 0.03 * fk || Math.round(r) < 1) {
            const x = riseNear(a, fk);
            host += x * x;
          }
          const fc = k * fC;
          const q = fc / fX;
          if (Math.abs(q - Math.round(q)) * fX > 0.03 * fc) {
            const x = riseNear(a, fc);
            own += x * x;
          }
        }
        const cand = a.level[i] * a.level[i];
        if (host + own > 0 && host >= (cfg.attackHostShare ?? 0.25) * cand && own < host) related = true;
      }
      if (related) continue;
      let clash = false;
      for (let j = j0; j < notes.length && !clash && onsets[j] <= onsetSec + 0.1; j++) {
        if (Math.abs(noteMidi[j] - m) > 0.5) continue;
        const n = notes[j];
        if (Math.abs(n.onsetSec - onsetSec) < 0.1 || (n.onsetSec < onsetSec && n.offsetSec > onsetSec)) clash = true;
      }
      // (added notes are in onset order and last a second at most)
      for (let k = added.length - 1; k >= 0 && added[k].onsetSec > onsetSec - 1.5; k--) {
        const n = added[k];
        if (Math.abs(midiOf(n.f0Hz[0]) - m) <= 0.5 && n.offsetSec > onsetSec - 0.05) clash = true;
      }
      if (clash) continue;
      // the end: the next attack of another pitch within 5 semitones, or the partials' fall
      let end = Math.min(frames - 1, a.frame + Math.round(1 / hop));
      for (let k = ai + 1; k < attacks.length && attacks[k].frame < end; k++) {
        const b = attacks[k];
        let moved = false;
        for (let q = 0; q < b.f0Hz.length; q++) {
          const d = Math.abs(midiOf(b.f0Hz[q]) - m);
          if (d > 0.5 && d <= 5.5 && b.newShare[q] >= minShare && b.level[q] >= a.level[i] * 0.5) moved = true;
        }
        if (moved) {
          end = b.frame;
          break;
        }
      }
      if (env) {
        let ref = -200;
        for (let t = a.frame; t <= Math.min(end, a.frame + 5); t++) ref = Math.max(ref, env(t, a.f0Hz[i]));
        for (let t = a.frame + 6; t < end; t++) {
          if (env(t, a.f0Hz[i]) < ref - 10) {
            end = t;
            break;
          }
        }
      }
      const offsetSec = Math.max(onsetSec + cfg.shortestNoteSec, end * hop - lead);
      added.push({
        hasOnset: true,
        onsetSec,
        offsetSec,
        frames: Int32Array.of(a.frame),
        f0Hz: Float32Array.of(a.f0Hz[i]),
        level: Float32Array.of(a.level[i]),
        shared: Float32Array.of(a.level[i]),
      });
    }
  }
  return notes.concat(added).sort((x, y) => x.onsetSec - y.onsetSec || x.f0Hz[0] - y.f0Hz[0]);
}

/**
 * Join fragments of one held note: a note of the same pitch (within `cents`) that starts
 * before the previous one ended (+30 ms), or without an attack of its own within 150 ms of it,
 * continues that note. Attack-less fragments standing alone and shorter than 300 ms are dropped.
 */
function mergeFragments(notes: TrackedNote[], cents: number, attackOf?: (n: TrackedNote) => boolean, longGapSec = 0.15, shown?: WeakSet<TrackedNote>): TrackedNote[] {
  const out: TrackedNote[] = [];
  const outF: number[] = [];
  for (const n of notes) {
    const f = median(n.f0Hz);
    let joined = false;
    let attacked: boolean | undefined;
    for (let i = out.length - 1; i >= 0 && !joined; i--) {
      const p = out[i];
      const gap = n.onsetSec - p.offsetSec;
      if (gap > (attackOf ? longGapSec : 0.15)) continue;
      if (gap > 0.15 && (attacked ??= attackOf!(n))) continue;
      if (Math.abs(1200 * Math.log2(f / outF[i])) > cents) continue;
      if (n.onsetSec < p.offsetSec - 0.03 || !n.hasOnset || gap > 0.15 || (attackOf && !(attacked ??= attackOf(n)))) {
        out[i] = {
          hasOnset: p.hasOnset,
          onsetSec: p.onsetSec,
          offsetSec: Math.max(p.offsetSec, n.offsetSec),
          frames: concatI(p.frames, n.frames),
          f0Hz: concatF(p.f0Hz, n.f0Hz),
          level: concatF(p.level, n.level),
          shared: concatF(p.shared, n.shared),
        };
        joined = true;
      }
    }
    if (!joined) {
      out.push(n);
      outF.push(f);
    }
  }
  return out.filter((n) => n.hasOnset || n.offsetSec - n.onsetSec >= 0.3 || shown?.has(n)).sort((a, b) => a.onsetSec - b.onsetSec);
}

/** Index of the first attack at or after frame t (attacks are in frame order). */
function firstAttackAtOrAfter(attacks: Attack[], t: number): number {
  let l = 0;
  let r = attacks.length;
  while (l < r) {
    const m = (l + r) >> 1;
    if (attacks[m].frame < t) l = m + 1;
    else r = m;
  }
  return l;
}

function peakDbOf(xs: Float32Array): number {
  let p = 0;
  for (const l of xs) if (l > p) p = l;
  return 20 * Math.log10(p + 1e-12);
}

function concatF(a: Float32Array, b: Float32Array): Float32Array {
  const r = new Float32Array(a.length + b.length);
  r.set(a);
  r.set(b, a.length);
  return r;
}
function concatI(a: Int32Array, b: Int32Array): Int32Array {
  const r = new Int32Array(a.length + b.length);
  r.set(a);
  r.set(b, a.length);
  return r;
}

/**
 * Drop notes far below what sounds with them: more than `concurrentDb` under the loudest note
 * overlapping them (compared on the levels with shared partials split between the voices,
 * `TrackedNote.shared`), or more than `takeDb` under the loudest note of the take. On rendered
 * instruments nearly every such note was a leftover partial or noise (docs/engine.md).
 */
function dropWeak(notes: TrackedNote[], concurrentDb: number, takeDb: number): TrackedNote[] {
  const peakOf = (xs: Float32Array) => {
    let p = 0;
    for (const l of xs) if (l > p) p = l;
    return 20 * Math.log10(p + 1e-12);
  };
  const peakDb = notes.map((n) => peakOf(n.level));
  const takeMax = Math.max(-200, ...peakDb);
  // concurrent notes are compared on their shared-split levels: the residual level of the
  // voice found first in a frame holds the partials it shares with the others
  const cmpDb = notes.map((n) => peakOf(n.shared));
  return notes.filter((n, i) => {
    if (peakDb[i] < takeMax - takeDb) return false;
    for (let j = 0; j < notes.length; j++) {
      const o = notes[j];
      if (o.onsetSec < n.offsetSec && o.offsetSec > n.onsetSec && cmpDb[j] > cmpDb[i] + concurrentDb) return false;
    }
    return true;
  });
}

/** Interval in semitones of harmonic h above a fundamental: 12·log2(h). */
const HARMONIC_SEMIS = [2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12].map((h) => 12 * Math.log2(h));

/**
 * Drop "shadow" notes: a note whose pitch is a harmonic (2nd … 12th partial) or a
 * sub-harmonic (½, ⅓, ¼) of a louder note sounding over most of its length, and which is
 * more than `shadowDb` weaker than it. Such notes are that louder note's partials seen again;
 * a real doubling at a comparable level is kept.
 */
function pruneShadows(notes: TrackedNote[], shadowDb: number): TrackedNote[] {
  const info = notes.map((n) => {
    let peak = 0;
    for (const l of n.level) {
      if (l > peak) peak = l;
    }
    return { midi: 69 + 12 * Math.log2(median(n.f0Hz) / 440), levelDb: 20 * Math.log10(peak + 1e-12) };
  });
  const keep = notes.map(() => true);
  const ratio = shadowDb;
  for (let i = 0; i < notes.length; i++) {
    const a = notes[i];
    const len = a.offsetSec - a.onsetSec;
    for (let j = 0; j < notes.length; j++) {
      if (i === j) continue;
      const b = notes[j];
      if (b.onsetSec > a.offsetSec) break;
      const ov = Math.min(a.offsetSec, b.offsetSec) - Math.max(a.onsetSec, b.onsetSec);
      if (ov < 0.6 * len) continue;
      if (info[i].levelDb > info[j].levelDb - ratio) continue;
      const d = info[i].midi - info[j].midi;
      const near = (x: number) => Math.abs(Math.abs(d) - x) < 0.4;
      if ((d > 0 && HARMONIC_SEMIS.some(near)) || (d < 0 && info[i].levelDb < info[j].levelDb - 2.5 * ratio && (near(12) || near(19.02) || near(24)))) {
        keep[i] = false;
        break;
      }
    }
  }
  return notes.filter((_, i) => keep[i]);
}

/**
 * Index ranges [start, end) of a track split at onsets where its level rises by riseDb
 * (clearRiseDb at a clear onset, odf ≥ clearOdf).
 */
function splitTrack(
  tr: Track,
  onsetFrames: Int32Array,
  riseDb: number,
  env: ((t: number) => number) | null,
  odf: Float32Array,
  minOdf: number,
  clearOdf = Infinity,
  clearRiseDb = riseDb,
  replayed: ((o: number) => boolean) | null = null,
  replayOdf = clearOdf,
): Array<[number, number]> {
  const segs: Array<[number, number]> = [];
  const n = tr.t.length;
  const db = tr.l.map((l) => 20 * Math.log10(l + 1e-12));
  let start = 0;
  let oi = 0;
  const tFirst = tr.t[0];
  const tLast = tr.t[n - 1];
  while (oi < onsetFrames.length && onsetFrames[oi] <= tFirst + 3) oi++;
  let idx = 0;
  for (; oi < onsetFrames.length; oi++) {
    const o = onsetFrames[oi];
    if (o >= tLast - 2) break;
    while (idx < n && tr.t[idx] < o) idx++;
    if (idx - start < 8 || n - idx < 6 || odf[o] < minOdf) continue;
    let before = Infinity;
    let after = -Infinity;
    if (env) {
      // the note's own partials in the short frames dip and rise again
      for (let t = o - 5; t <= o; t++) before = Math.min(before, env(t));
      for (let t = o; t <= o + 4; t++) after = Math.max(after, env(t));
    } else {
      for (let j = Math.max(start, idx - 5); j < idx; j++) before = Math.min(before, db[j]);
      for (let j = idx; j < Math.min(n, idx + 4); j++) after = Math.max(after, db[j]);
    }
    if (after - before >= (odf[o] >= clearOdf ? clearRiseDb : riseDb) && (!replayed || odf[o] >= replayOdf || replayed(o))) {
      segs.push([start, idx]);
      start = idx;
    }
  }
  segs.push([start, n]);
  return segs;
}

/** 95th percentile of the detection function (the scale of its onsets). */
export function odfP95(odf: Float32Array): number {
  const sorted = Float32Array.from(odf).sort();
  return sorted[Math.floor(0.95 * (sorted.length - 1))] || 0;
}

export function median(xs: ArrayLike<number>): number {
  // a typed array sorts numerically, without a comparator call per step
  const a = Float64Array.from(xs).sort();
  const n = a.length;
  if (n === 0) return NaN;
  return n % 2 ? a[(n - 1) >> 1] : 0.5 * (a[n / 2 - 1] + a[n / 2]);
}
