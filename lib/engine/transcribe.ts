import { parseSettings, type Settings, type SettingsInput } from "./settings";
import { checkSamples } from "./decode";
import { resample } from "./resample";
import { SpectrumPlan } from "./stft";
import { findPeaks, PeakScratch, PeakStore, type PeakParams } from "./peaks";
import { MultiPitchEstimator } from "./multipitch";
import { SpectralFlux, pickOnsets } from "./onsets";
import { AttackAnalyser } from "./attacks";
import { noteFeatures, checkNotes, NOTE_CHECK_THRESHOLD } from "./note-check";
import { onsetCandidates, scoreCandidates, addRuleFeatures, type MlpWeights, type OnsetCandidate } from "./onset-model";
import { trackNotes, median, odfP95, type FrameDetections, type TrackedNote } from "./notes";
import { steadyPitchHz, estimateReferenceHz, pitchAndCents, attackSkipSec } from "./tuning";
import { midiToHz } from "../music/pitch";
import type { CurvedNoteEvent } from "../music/note";

/**
 * One note of a draft (the shared note event, lib/music/note.ts). `pitch` is the nearest 12-TET
 * MIDI note at A4 = 440 Hz, `cents` the deviation; velocity 1 … 127 from the note's level
 * (SoundFont 2 default curve: −40·log10(127/v) dB); voices numbered from 1 so a voice never
 * overlaps itself; the pitch curve at the frame hop (10 ms by default).
 */
export type Note = CurvedNoteEvent;

/** Looks inside the pipeline (training and diagnostics only). */
export interface TranscribeInspector {
  onCandidates?: (candidates: OnsetCandidate[], hopSec: number) => void;
  onNotes?: (notes: readonly TrackedNote[], features: Float32Array[]) => void;
  /** Weights in place of the committed ones (training: after the features changed, the old weights no longer fit). */
  onsetModel?: MlpWeights;
  noteModel?: MlpWeights;
}

export interface Transcription {
  durationSec: number;
  /** Sample rate of the input. */
  sampleRateHz: number;
  /** The take's reference pitch A4 (Hz): the setting, or the estimate. */
  referenceHz: number;
  settings: Settings;
  notes: Note[];
}

/** Analysis rate of the top register; the lower registers are decimated from it. */
export const ANALYSIS_RATE_HZ = 16000;

/** Register plan: sample rate, frame length setting and frequency span of each register. */
export function registerPlan(settings: Settings) {
  const fl = settings.frameLengthsMs;
  return [
    { name: "low", rateHz: 2000, frameMs: fl.low, loHz: 27, hiHz: 250 },
    { name: "mid", rateHz: 4000, frameMs: fl.mid, loHz: 250, hiHz: 800 },
    { name: "high", rateHz: ANALYSIS_RATE_HZ, frameMs: fl.high, loHz: 800, hiHz: 7000 },
  ] as const;
}

const PEAKS_PER_REGISTER = 48;

/**
 * Note-stage settings for proposing notes: shadows (octaves, twelfths) are not pruned and the
 * level ranges are wide, because the note check decides those cases with more evidence.
 */
const PROPOSAL_TRACKING = { shadowDb: Infinity, concurrentRangeDb: 40, takeRangeDb: 60 } as const;

/**
 * Transcribe a mono take into notes.
 * samples: mono, full scale ±1, at sampleRateHz (explicit). Pipeline: resample (SpeexDSP) →
 * per-register tapered spectra (fft.js) → peaks → concurrent pitches → notes → tuning.
 * onProgress receives 0 … 1.
 */
export async function transcribe(
  samples: Float32Array,
  sampleRateHz: number,
  settingsInput: SettingsInput | Settings = {},
  onProgress?: (fraction: number) => void,
  inspect?: TranscribeInspector,
): Promise<Transcription> {
  const settings = parseSettings(settingsInput);
  checkSamples(samples, sampleRateHz);
  const durationSec = samples.length / sampleRateHz;
  const x16 = await resample(samples, sampleRateHz, ANALYSIS_RATE_HZ);
  onProgress?.(0.05);
  const plan = registerPlan(settings);
  const signals: Float32Array[] = [];
  // decimate step by step (16 → 4 → 2 kHz): each step filters at its own, lower rate
  for (let i = plan.length - 1; i >= 0; i--) {
    const r = plan[i];
    const prevRate = i === plan.length - 1 ? ANALYSIS_RATE_HZ : plan[i + 1].rateHz;
    const prevSig = i === plan.length - 1 ? x16 : signals[0];
    signals.unshift(r.rateHz === prevRate ? prevSig : await resample(prevSig, prevRate, r.rateHz));
  }
  onProgress?.(0.1);
  const taperParams = { kaiserBeta: settings.kaiserBeta, gaussianAlpha: settings.gaussianAlpha };
  const lowHz = midiToHz(settings.pitchRange.lowMidi) * 0.97;
  const regs = plan.map((r, i) => {
    const N = Math.max(8, Math.round((r.frameMs * r.rateHz) / 1000));
    let M = 1;
    while (M < N) M <<= 1;
    M <<= 1; // zero-pad 2×: parabolic-interpolation bias of Hann drops ~10× (Abe & Smith 2004)
    const spec = new SpectrumPlan(N, M, r.rateHz, settings.taper, taperParams);
    const nativeBinHz = r.rateHz / N;
    const peak: PeakParams = {
      binLo: Math.floor(Math.max(r.loHz, i === 0 ? lowHz : r.loHz) / spec.binHz),
      binHi: Math.ceil(Math.min(r.hiHz, 0.45 * r.rateHz) / spec.binHz),
      binHz: spec.binHz,
      taperSum: spec.taperSum,
      rangeDb: 70,
      minPower: Math.pow((1e-4 * spec.taperSum) / 2, 2),
      floorHalfWidth: Math.max(4, Math.round((6 * nativeBinHz) / spec.binHz)),
      floorFactor: 4, // 6 dB over the local mean power
    };
    // long frames move little in one hop: analyse them every other hop and reuse the peaks
    const stride = r.frameMs >= 100 ? 2 : 1;
    return {
      ...r,
      signal: signals[i],
      spec,
      peak,
      scratch: new PeakScratch(spec.bins),
      frameSec: N / r.rateHz,
      stride,
      // bins the peak picker (±floor window) and the onset function read
      powerLo: Math.max(0, Math.min(peak.binLo - peak.floorHalfWidth - 2, i === 2 ? Math.floor(50 / spec.binHz) : Infinity)),
      powerHi: Math.min(spec.bins, Math.max(peak.binHi + peak.floorHalfWidth + 3, i === 2 ? Math.ceil(6000 / spec.binHz) + 1 : 0)),
      keptF: new Float32Array(PEAKS_PER_REGISTER),
      keptA: new Float32Array(PEAKS_PER_REGISTER),
      keptN: 0,
    };
  });
  const hopSec = settings.hopMs / 1000;
  const frames = Math.floor(durationSec / hopSec) + 1;
  const V = settings.voiceLimit;
  const det: FrameDetections = {
    frames,
    slots: V,
    count: new Uint8Array(frames),
    f0Hz: new Float32Array(frames * V),
    level: new Float32Array(frames * V),
    sharedLevel: new Float32Array(frames * V),
  };
  const salience = new Float32Array(frames * V);
  const odf = new Float32Array(frames);
  const maxPeaks = PEAKS_PER_REGISTER * regs.length;
  const pf = new Float32Array(maxPeaks);
  const pa = new Float32Array(maxPeaks);
  // the frames' pitch search and the attack spectra's use the same settings
  const pitchSearch = {
    lowMidi: settings.pitchRange.lowMidi,
    highMidi: settings.pitchRange.highMidi,
    voiceLimit: V,
    sensitivityDb: settings.sensitivityDb,
    maxFreqHz: 7000,
  };
  const est = new MultiPitchEstimator(pitchSearch, maxPeaks);
  const high = regs[regs.length - 1];
  const flux = new SpectralFlux(Math.floor(50 / high.spec.binHz), Math.ceil(6000 / high.spec.binHz));
  const store = new PeakStore(frames, PEAKS_PER_REGISTER, high.loHz, high.hiHz);
  const attacks = new AttackAnalyser(
    frames,
    maxPeaks,
    hopSec,
    regs.map((r) => ({ hiHz: r.hiHz, frameSec: r.frameSec })),
    pitchSearch,
  );
  const progressEvery = Math.max(1, Math.floor(frames / 20));
  for (let t = 0; t < frames; t++) {
    let n = 0;
    for (const r of regs) {
      if (r.stride > 1 && t % r.stride !== 0) {
        pf.set(r.keptF.subarray(0, r.keptN), n);
        pa.set(r.keptA.subarray(0, r.keptN), n);
        n += r.keptN;
        continue;
      }
      const centre = Math.round(t * hopSec * r.rateHz);
      const power = r.spec.analyse(r.signal, centre, undefined, r.powerLo, r.powerHi);
      const from = n;
      n = findPeaks(power, r.peak, r.scratch, pf, pa, Math.min(n, maxPeaks), Math.min(maxPeaks, from + PEAKS_PER_REGISTER));
      if (r.stride > 1) {
        r.keptN = n - from;
        r.keptF.set(pf.subarray(from, n));
        r.keptA.set(pa.subarray(from, n));
      }
      if (r === high) {
        odf[t] = flux.next(power);
        store.put(t, pf, pa, from, n);
      }
    }
    det.count[t] = est.estimate(pf, pa, n, det.f0Hz, det.level, salience, t * V, det.sharedLevel);
    attacks.push(t, pf, pa, n, odf[t]);
    if (onProgress && t % progressEvery === 0) onProgress(0.1 + (0.8 * t) / frames);
  }
  attacks.finish(frames - 1);
  const onsetFrames = pickOnsets(odf, hopSec);
  const p95Odf = odfP95(odf);
  const frameLengthSecFor = (f0: number) => (f0 < regs[0].hiHz ? regs[0].frameSec : f0 < regs[1].hiHz ? regs[1].frameSec : regs[2].frameSec);
  // the note stage proposes generously (no shadow pruning, wide level ranges); the note check
  // (note-check.ts) then judges every proposed note with the onset model's (onset-model.ts) help
  const proposed = trackNotes(det, odf, onsetFrames, {
    hopSec,
    shortestNoteSec: settings.shortestNoteMs / 1000,
    frameLengthSecFor,
    attacks: attacks.attacks,
    p95Odf,
    ...PROPOSAL_TRACKING,
  }, store);
  const candidates = onsetCandidates(attacks.attacks, {
    det,
    lowMidi: settings.pitchRange.lowMidi,
    highMidi: settings.pitchRange.highMidi,
    p95Odf,
    maxHz: 7000,
    hopSec,
    harmonicLevelDb: (t, f) => store.harmonicLevelDb(t, f),
  });
  addRuleFeatures(candidates, attacks.attacks, proposed, hopSec);
  scoreCandidates(candidates, inspect?.onsetModel);
  inspect?.onCandidates?.(candidates, hopSec);
  const noteX = noteFeatures(proposed, candidates, attacks.attacks, odf, p95Odf, hopSec);
  inspect?.onNotes?.(proposed, noteX);
  const noteP = checkNotes(noteX, inspect?.noteModel);
  const tracked = proposed.filter((_, i) => noteP[i] >= NOTE_CHECK_THRESHOLD);
  onProgress?.(0.95);
  const notes: Note[] = [];
  const centsList: number[] = [];
  const weights: number[] = [];
  for (const tn of tracked) {
    const times = Array.from(tn.frames, (f) => f * hopSec);
    // the pitch is measured where the note was detected (its end may lie past that)
    const until = tn.pitchUntilSec ?? tn.offsetSec;
    const fTrack = steadyPitchHz(times, tn.f0Hz, tn.onsetSec, until);
    if (!(fTrack > 0)) continue;
    // measure on every frame of the note's span where this pitch was detected (a track may
    // have lost frames to a competing voice), not only on the track's own frames
    const fHz = spanPitchHz(det, hopSec, tn.onsetSec, until, fTrack) || fTrack;
    const { pitch, cents } = pitchAndCents(fHz);
    if (pitch < settings.pitchRange.lowMidi - 1 || pitch > settings.pitchRange.highMidi + 1) continue;
    let peak = 0;
    for (const l of tn.level) if (l > peak) peak = l;
    const levelDb = 20 * Math.log10(peak + 1e-12);
    const velocity = Math.max(1, Math.min(127, Math.round(127 * Math.pow(10, levelDb / 40))));
    const note: Note = {
      onsetSec: round(tn.onsetSec, 3),
      offsetSec: round(Math.min(durationSec, tn.offsetSec), 3),
      pitch,
      cents: round(cents, 2),
      velocity,
      voice: 0,
    };
    if (settings.pitchCurves) {
      note.pitchCurve = {
        timeSec: times.map((x) => round(x, 3)),
        cents: Array.from(tn.f0Hz, (f) => round(1200 * Math.log2(f / midiToHz(pitch)), 1)),
      };
    }
    notes.push(note);
    centsList.push(cents);
    weights.push(tn.offsetSec - tn.onsetSec);
  }
  const kept = limitVoices(notes, V, settings.shortestNoteMs / 1000);
  for (let i = notes.length - 1; i >= 0; i--) {
    if (kept.has(i)) continue;
    notes.splice(i, 1);
    centsList.splice(i, 1);
    weights.splice(i, 1);
  }
  assignVoices(notes);
  const referenceHz = settings.referenceHz === "estimate" ? round(estimateReferenceHz(centsList, weights), 2) : settings.referenceHz;
  onProgress?.(1);
  return { durationSec, sampleRateHz, referenceHz, settings, notes };
}

/** Median fundamental of detections within ±40 cents of fNearHz over the note's steady span (0 if < 3). */
function spanPitchHz(det: FrameDetections, hopSec: number, onsetSec: number, offsetSec: number, fNearHz: number): number {
  const dur = offsetSec - onsetSec;
  const a = Math.max(0, Math.ceil((onsetSec + attackSkipSec(dur)) / hopSec));
  const b = Math.min(det.frames - 1, Math.floor((offsetSec - Math.min(0.05, 0.15 * dur)) / hopSec));
  const sel: number[] = [];
  const lo = fNearHz / 1.0234;
  const hi = fNearHz * 1.0234;
  for (let t = a; t <= b; t++) {
    for (let i = 0; i < det.count[t]; i++) {
      const f = det.f0Hz[t * det.slots + i];
      if (f >= lo && f <= hi) sel.push(f);
    }
  }
  return sel.length >= 3 ? median(sel) : 0;
}

/**
 * The voice limit holds for the notes, not only for each frame's search: notes found by
 * different evidence (frame detections, attack spectra, held partials) may overlap more than
 * `limit` deep. In onset order, a note starting while `limit` notes sound is dropped when it
 * is the softest of them; otherwise the softest sounding note ends where it starts (or is
 * dropped when that leaves it shorter than the shortest note). Returns the indices kept;
 * offsets of cut notes are changed in place.
 */
function limitVoices(notes: Note[], limit: number, shortestSec: number): Set<number> {
  const order = notes.map((_, i) => i).sort((a, b) => notes[a].onsetSec - notes[b].onsetSec || a - b);
  const kept = new Set<number>();
  let sounding: number[] = [];
  for (const i of order) {
    const n = notes[i];
    sounding = sounding.filter((j) => kept.has(j) && notes[j].offsetSec > n.onsetSec + 1e-6);
    if (sounding.length >= limit) {
      let softest = sounding[0];
      for (const j of sounding) if (notes[j].velocity < notes[softest].velocity) softest = j;
      if (n.velocity <= notes[softest].velocity) continue;
      const cut = notes[softest];
      if (n.onsetSec - cut.onsetSec >= shortestSec) {
        cut.offsetSec = n.onsetSec;
        if (cut.pitchCurve) {
          const end = cut.pitchCurve.timeSec.findIndex((x) => x > cut.offsetSec);
          if (end >= 0) cut.pitchCurve = { timeSec: cut.pitchCurve.timeSec.slice(0, end), cents: cut.pitchCurve.cents.slice(0, end) };
        }
      } else kept.delete(softest);
      sounding = sounding.filter((j) => j !== softest);
    }
    kept.add(i);
    sounding.push(i);
  }
  return kept;
}

/** Greedy voice assignment in onset order: the free voice whose last pitch is nearest. */
function assignVoices(notes: Note[]): void {
  const lastOff: number[] = [];
  const lastPitch: number[] = [];
  for (const n of notes) {
    let best = -1;
    let bestD = Infinity;
    for (let v = 0; v < lastOff.length; v++) {
      if (lastOff[v] > n.onsetSec + 1e-6) continue;
      const d = Math.abs(lastPitch[v] - n.pitch);
      if (d < bestD) {
        bestD = d;
        best = v;
      }
    }
    if (best < 0) {
      best = lastOff.length;
      lastOff.push(0);
      lastPitch.push(0);
    }
    lastOff[best] = n.offsetSec;
    lastPitch[best] = n.pitch;
    n.voice = best + 1;
  }
}

function round(x: number, digits: number): number {
  const k = Math.pow(10, digits);
  return Math.round(x * k) / k;
}
