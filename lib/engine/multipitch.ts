/**
 * Concurrent pitches of one frame from its spectral peaks: harmonic-amplitude summation with
 * iterative estimation and cancellation (A. Klapuri, "Multiple fundamental frequency estimation
 * by summing harmonic amplitudes", ISMIR 2006); octave and twelfth pairs are checked with
 * the spectral-smoothness principle (A. Klapuri, "Multiple fundamental frequency estimation
 * based on harmonicity and spectral smoothness", IEEE TSAP 11(6), 2003).
 *
 * Salience of a candidate fundamental f0 (one candidate per equal-tempered semitone at
 * A4 = 440 Hz, each searched ±50 cents so mistuned voices are found):
 *   s(f0) = Σ_{h=1}^{H} g(f0, h) · r_h^γ,   g(f0, h) = (f0 + α) / (h·f0 + β)
 * with r_h the largest residual peak amplitude within the window of harmonic h,
 * α = 52 Hz, β = 320 Hz (Klapuri 2006, 93 ms frames), γ = amplitude compression.
 * The best candidate is refined (anchor partial, then partials within a tolerance that widens
 * with h for string inharmonicity, f_h = h·f0·√(1 + B h²)), its partials (up to 40) are
 * removed from the residual, and the search repeats while the salience stays within
 * `sensitivityDb` of the first voice.
 */
export interface MultiPitchConfig {
  lowMidi: number;
  highMidi: number;
  voiceLimit: number;
  sensitivityDb: number;
  /** Highest partial frequency considered (Hz). */
  maxFreqHz: number;
  maxHarmonics?: number;
  gamma?: number;
  alphaHz?: number;
  betaHz?: number;
  /** Salience factor for a candidate supported by one peak only. */
  lonePenalty?: number;
  /** Octave/twelfth check: the upper voice stays when its partials exceed κ × the lower voice's neighbours. */
  octaveKappa?: number;
  /** Salience factor for a candidate detected in the previous frame (hysteresis). */
  continuityBonus?: number;
  /** Salience factor for a sub-harmonic of a detected voice without a fundamental of its own. */
  subPenalty?: number;
}

const MIDI_TABLE = 160;
/** Partials followed (and cancelled) per detected sound. */
const HCANCEL = 40;
/** 12·log2(h) for h = 1 … 40, and the partial windows (semitones): 15 + 2h cents, at most 50. */
const LOG2H = Float32Array.from({ length: HCANCEL }, (_, i) => 12 * Math.log2(i + 1));
const TOL_SEMIS = Float32Array.from({ length: HCANCEL }, (_, i) => Math.min(0.5, (15 + 2 * (i + 1)) / 100));

export class MultiPitchEstimator {
  readonly cfg: Required<MultiPitchConfig>;
  private readonly nCand: number;
  private readonly H: number;
  private readonly centre: Float32Array; // [cand*H + h-1] fractional MIDI of harmonic h
  private readonly weight: Float32Array; // g(f0, h)
  private readonly f0Nominal: Float32Array;
  private readonly sal: Float32Array;
  private readonly peakMidi: Float32Array;
  private readonly resid: Float32Array;
  private readonly residC: Float32Array; // resid^γ
  private readonly first: Int32Array;
  private readonly matched: Int32Array;
  private nMatched = 0;
  private readonly matchedAmp: Float32Array;
  private readonly done: Uint8Array;
  private readonly order: Uint8Array;
  /** Candidates detected in the previous frame (hysteresis). */
  private readonly prev: Uint8Array;
  private readonly cur: Uint8Array;

  constructor(cfg: MultiPitchConfig, maxPeaks: number) {
    this.cfg = { maxHarmonics: 10, gamma: 0.5, alphaHz: 52, betaHz: 320, lonePenalty: 0.3, octaveKappa: 2, continuityBonus: 1.3, subPenalty: 0, ...cfg };
    this.nCand = this.cfg.highMidi - this.cfg.lowMidi + 1;
    this.H = this.cfg.maxHarmonics;
    this.centre = new Float32Array(this.nCand * this.H);
    this.weight = new Float32Array(this.nCand * this.H);
    this.f0Nominal = new Float32Array(this.nCand);
    for (let c = 0; c < this.nCand; c++) {
      const m = this.cfg.lowMidi + c;
      const f0 = 440 * Math.pow(2, (m - 69) / 12);
      this.f0Nominal[c] = f0;
      for (let h = 1; h <= this.H; h++) {
        const i = c * this.H + h - 1;
        this.centre[i] = m + 12 * Math.log2(h);
        this.weight[i] = h * f0 > this.cfg.maxFreqHz ? 0 : (f0 + this.cfg.alphaHz) / (h * f0 + this.cfg.betaHz);
      }
    }
    this.sal = new Float32Array(this.nCand);
    this.peakMidi = new Float32Array(maxPeaks);
    this.resid = new Float32Array(maxPeaks);
    this.residC = new Float32Array(maxPeaks);
    this.first = new Int32Array(MIDI_TABLE + 2);
    this.matched = new Int32Array(HCANCEL);
    this.matchedAmp = new Float32Array(HCANCEL);
    this.done = new Uint8Array(this.nCand);
    this.order = new Uint8Array(this.nCand);
    this.prev = new Uint8Array(this.nCand);
    this.cur = new Uint8Array(this.nCand);
  }

  /** Largest residual (compressed) in the ±0.5-semitone window around fractional MIDI c; returns peak index or −1. */
  private bestIn(c: number, halfWidth: number, n: number): number {
    const lo = c - halfWidth;
    const hi = c + halfWidth;
    const s = Math.floor(lo);
    if (s < 0 || s >= MIDI_TABLE) return -1;
    let best = -1;
    let bestA = 0;
    const pm = this.peakMidi;
    const r = this.resid;
    for (let i = this.first[s]; i < n; i++) {
      const m = pm[i];
      if (m > hi) break;
      if (m >= lo && r[i] > bestA) {
        bestA = r[i];
        best = i;
      }
    }
    return best;
  }

  /**
   * Estimate the pitches of one frame. Peaks must be sorted by frequency.
   * Writes up to voiceLimit detections at outOffset: fundamental (Hz, from the fundamental or
   * the lowest strong partial), level (linear amplitude, root-sum-square of the voice's
   * partials) and salience; outSharedLevel (optional) receives the levels with shared
   * partials split between the voices (see sharedLevels). Returns the number of detections.
   */
  estimate(
    freqHz: Float32Array,
    amp: Float32Array,
    n: number,
    outF0Hz: Float32Array,
    outLevel: Float32Array,
    outSalience: Float32Array,
    outOffset: number,
    outSharedLevel?: Float32Array,
  ): number {
    if (n === 0) {
      this.prev.fill(0);
      return 0;
    }
    const { voiceLimit, sensitivityDb, gamma } = this.cfg;
    const pm = this.peakMidi;
    const r = this.resid;
    const rc = this.residC;
    for (let i = 0; i < n; i++) {
      pm[i] = 69 + 12 * Math.log2(freqHz[i] / 440);
      r[i] = amp[i];
      this.residC[i] = gamma === 0.5 ? Math.sqrt(amp[i]) : Math.pow(amp[i], gamma);
    }
    // first[s] = index of the first peak with MIDI ≥ s
    let j = 0;
    for (let s = 0; s <= MIDI_TABLE + 1; s++) {
      while (j < n && pm[j] < s) j++;
      this.first[s] = j;
    }
    const H = this.H;
    const nC = this.nCand;
    this.done.fill(0);
    this.cur.fill(0);
    let firstSal = 0;
    let count = 0;
    const minRatio = Math.pow(10, (-sensitivityDb * gamma) / 20);
    while (count < voiceLimit) {
      let bestC = -1;
      let bestS = 0;
      if (count === 0) {
        for (let c = 0; c < nC; c++) {
          const s = this.salienceOf(c, n, freqHz, count, outF0Hz, outOffset);
          this.sal[c] = s;
          if (s > bestS) {
            bestS = s;
            bestC = c;
          }
        }
      } else {
        // lazy greedy: residuals only shrink, so a candidate's last salience bounds its next
        // one; re-evaluate in order of those bounds (highest first, ties by index) until no
        // remaining bound can beat the best found
        const sal = this.sal;
        const order = this.order;
        let m = 0;
        for (let c = 0; c < nC; c++) {
          if (this.done[c] || !(sal[c] > 0)) continue;
          // insertion sort, descending and stable: candidates arrive in index order
          let i = m++;
          const v = sal[c];
          while (i > 0 && sal[order[i - 1]] < v) {
            order[i] = order[i - 1];
            i--;
          }
          order[i] = c;
        }
        for (let i = 0; i < m; i++) {
          const c = order[i];
          if (!(sal[c] > bestS)) break;
          const s = this.salienceOf(c, n, freqHz, count, outF0Hz, outOffset);
          sal[c] = s;
          if (s > bestS) {
            bestS = s;
            bestC = c;
          }
        }
      }
      if (bestC < 0 || bestS <= 0) break;
      if (count === 0) firstSal = bestS;
      else if (bestS < firstSal * minRatio) break;
      this.done[bestC] = 1;
      this.cur[bestC] = 1;
      const f0 = this.refine(bestC, n, freqHz, amp);
      if (f0 <= 0) continue;
      // level and cancellation
      const HM = this.nMatched;
      let e = 0;
      const ma = this.matchedAmp;
      for (let h = 0; h < HM; h++) {
        const k = this.matched[h];
        ma[h] = k >= 0 ? r[k] : 0;
        if (h < H) e += ma[h] * ma[h];
      }
      // cancel the detected sound: its matched partials leave the residual. (Leaving the excess
      // of partials far above their neighbours — Klapuri's spectral smoothness — scored lower on
      // the dev split; octave and twelfth doublings are judged by dropOctaveShadows instead.)
      for (let h = 0; h < HM; h++) {
        const k = this.matched[h];
        if (k < 0) continue;
        r[k] = 0;
        rc[k] = 0;
      }
      outF0Hz[outOffset + count] = f0;
      outLevel[outOffset + count] = Math.sqrt(e);
      outSalience[outOffset + count] = bestS;
      count++;
    }
    this.prev.set(this.cur);
    const kept = this.dropOctaveShadows(freqHz, amp, n, outF0Hz, outLevel, outSalience, outOffset, count);
    if (outSharedLevel) this.sharedLevels(freqHz, amp, n, outF0Hz, outLevel, outSharedLevel, outOffset, kept);
    return kept;
  }

  /**
   * Level of each detected voice with shared partials split between the voices they belong
   * to: L_i = √(Σ_{h ≤ H} a_h² / m_h), a_h the original peak amplitude at h·f0_i (±30 cents),
   * m_h the number of detected voices (itself included) with a partial within ±30 cents of it.
   * Concurrent harmonic sounds overlap at their common partials (Klapuri 2003, IEEE TSAP 11(6),
   * the reason for the spectral-smoothness principle), and the iterative cancellation gives each
   * overlapping partial to the voice found first, so residual levels overstate that voice
   * against the rest (the third of a piano triad came out 11 dB under its fifth). Splitting the
   * energy of an overlapping partial equally between its candidates is Tapernote's
   * simplification; the note stage compares concurrent notes on this level.
   */
  private sharedLevels(freqHz: Float32Array, amp: Float32Array, n: number, f0s: Float32Array, lev: Float32Array, out: Float32Array, off: number, count: number): void {
    if (count < 2) {
      if (count === 1) out[off] = lev[off];
      return;
    }
    const H = this.H;
    const tol = 30 / 1200;
    const lv = this.matchedAmp;
    for (let i = 0; i < count; i++) {
      const f0 = f0s[off + i];
      let e = 0;
      for (let h = 1; h <= H && h * f0 <= this.cfg.maxFreqHz; h++) {
        const f = h * f0;
        const a = this.ampAt(f, n, freqHz, amp);
        if (a === 0) continue;
        let m = 1;
        for (let j = 0; j < count; j++) {
          if (j === i) continue;
          const k = Math.round(f / f0s[off + j]);
          if (k >= 1 && Math.abs(Math.log2(f / (k * f0s[off + j]))) < tol) m++;
        }
        e += (a * a) / m;
      }
      lv[i] = Math.sqrt(e);
    }
    for (let i = 0; i < count; i++) out[off + i] = lv[i];
  }

  /** Salience of candidate c on the current residual (see the class comment). */
  private salienceOf(c: number, n: number, freqHz: Float32Array, count: number, outF0Hz: Float32Array, outOffset: number): number {
    const H = this.H;
    const rc = this.residC;
    let s = 0;
    let parts = 0;
    const base = c * H;
    // the candidate's own series: anchored on its fundamental (or 2nd/3rd partial), then
    // every partial within a narrow window, so two voices in one semitone window never merge
    const f0a = this.anchorOf(c, n, freqHz);
    if (f0a > 0) {
      const m0 = 69 + 12 * Math.log2(f0a / 440);
      for (let h = 0; h < H; h++) {
        const w = this.weight[base + h];
        if (w === 0) break;
        const k = this.bestIn(m0 + LOG2H[h], TOL_SEMIS[h], n);
        if (k >= 0) {
          s += w * rc[k];
          parts++;
        }
      }
    }
    // a lone peak is weak evidence for a harmonic sound wherever its 2nd partial could show
    if (parts < 2 && this.weight[base + 1] > 0) s *= this.cfg.lonePenalty;
    // a fundamental below a detected voice, at 1/2, 1/3 or 1/4 of it, must show its own
    // fundamental, else it is only that voice's partials seen again
    if (count > 0 && this.isSubharmonic(c, count, outF0Hz, outOffset) && !(this.bestIn(this.centre[base], 0.5, n) >= 0)) s *= this.cfg.subPenalty;
    if (this.prev[c]) s *= this.cfg.continuityBonus;
    return s;
  }

  /**
   * Spectral-smoothness check of octave and twelfth pairs (Klapuri 2003): when a detected
   * voice sits at 2× or 3× another detected voice, its partials are that lower voice's
   * partials k·j. Unless those partials stand clearly above the lower voice's neighbouring
   * partials (k·j ± 1), the upper voice adds nothing and is dropped. Returns the new count.
   */
  private dropOctaveShadows(
    freqHz: Float32Array,
    amp: Float32Array,
    n: number,
    f0s: Float32Array,
    lev: Float32Array,
    sal: Float32Array,
    off: number,
    count: number,
  ): number {
    if (count < 2) return count;
    const kappa = this.cfg.octaveKappa;
    let keep = count;
    for (let i = 0; i < keep; i++) {
      const hiM = 69 + 12 * Math.log2(f0s[off + i] / 440);
      let drop = false;
      for (let j = 0; j < keep && !drop; j++) {
        if (j === i) continue;
        const lo = f0s[off + j];
        const d = hiM - (69 + 12 * Math.log2(lo / 440));
        const k = Math.abs(d - 12) < 0.4 ? 2 : Math.abs(d - 19.02) < 0.4 ? 3 : 0;
        if (!k) continue;
        let shared = 0;
        let neigh = 0;
        for (let q = 1; q * k + 1 <= 16 && (q * k + 1) * lo <= this.cfg.maxFreqHz; q++) {
          shared += this.ampAt(lo * q * k, n, freqHz, amp);
          neigh += 0.5 * (this.ampAt(lo * (q * k - 1), n, freqHz, amp) + this.ampAt(lo * (q * k + 1), n, freqHz, amp));
        }
        if (shared <= kappa * neigh) drop = true;
      }
      if (drop) {
        for (let q = i; q < keep - 1; q++) {
          f0s[off + q] = f0s[off + q + 1];
          lev[off + q] = lev[off + q + 1];
          sal[off + q] = sal[off + q + 1];
        }
        keep--;
        i--;
      }
    }
    return keep;
  }

  /** Largest original peak amplitude within ±30 cents of freqHz (0 if none). */
  private ampAt(fHz: number, n: number, freqHz: Float32Array, amp: Float32Array): number {
    const c = 69 + 12 * Math.log2(fHz / 440);
    const lo = c - 0.3;
    const hi = c + 0.3;
    const s = Math.floor(lo);
    if (s < 0 || s >= MIDI_TABLE) return 0;
    let best = 0;
    for (let i = this.first[s]; i < n; i++) {
      const m = this.peakMidi[i];
      if (m > hi) break;
      if (m >= lo && amp[i] > best) best = amp[i];
    }
    return best;
  }

  private isSubharmonic(c: number, count: number, f0s: Float32Array, off: number): boolean {
    const m = this.cfg.lowMidi + c;
    for (let i = 0; i < count; i++) {
      const d = 69 + 12 * Math.log2(f0s[off + i] / 440) - m;
      if (Math.abs(d - 12) < 0.5 || Math.abs(d - 19.02) < 0.5 || Math.abs(d - 24) < 0.5) return true;
    }
    return false;
  }

  /**
   * Fundamental the candidate's series hangs on: the strongest residual peak in the
   * fundamental's ±50-cent window, unless it is > 20 dB under the 2nd/3rd partials' windows;
   * else the 2nd partial / 2, else the 3rd / 3. 0 when there is none.
   */
  private anchorOf(c: number, n: number, freqHz: Float32Array): number {
    const base = c * this.H;
    const r = this.resid;
    const k1 = this.bestIn(this.centre[base], 0.5, n);
    const k2 = this.weight[base + 1] > 0 ? this.bestIn(this.centre[base + 1], 0.5, n) : -1;
    const k3 = this.weight[base + 2] > 0 ? this.bestIn(this.centre[base + 2], 0.5, n) : -1;
    const a2 = k2 >= 0 ? r[k2] : 0;
    const a3 = k3 >= 0 ? r[k3] : 0;
    if (k1 >= 0 && r[k1] >= 0.1 * Math.max(a2, a3)) return freqHz[k1];
    if (k2 >= 0 && a2 >= 0.1 * a3) return freqHz[k2] / 2;
    if (k3 >= 0) return freqHz[k3] / 3;
    return 0;
  }

  /** Fill `matched` for candidate c around its refined fundamental; return that fundamental (Hz) or 0. */
  private refine(c: number, n: number, freqHz: Float32Array, amp: Float32Array): number {
    const H = this.H;
    const base = c * H;
    const r = this.resid;
    const anchorF0 = this.anchorOf(c, n, freqHz);
    this.matched.fill(-1);
    this.nMatched = 0;
    if (anchorF0 <= 0) return 0;
    const maxF = this.cfg.maxFreqHz;
    let amax = 0;
    // follow the series upward; the ratio of each found partial to h·f0 predicts the next,
    // so stretched (inharmonic) partials, f_h = h·f0·√(1 + B h²), stay in the window
    let stretch = 1;
    let hTop = 0;
    for (let h = 1; h <= HCANCEL && h * anchorF0 <= maxF; h++) {
      const pred = h * anchorF0 * stretch;
      const tolSemis = Math.min(0.5, (20 + 2 * h) / 100);
      const k = this.bestIn(69 + 12 * Math.log2(pred / 440), tolSemis, n);
      this.matched[h - 1] = k;
      hTop = h;
      if (k >= 0) {
        if (h <= 4 && amp[k] > amax) amax = amp[k];
        const s = freqHz[k] / (h * anchorF0);
        if (h >= 2) stretch = Math.max(1, s);
      }
    }
    this.nMatched = hTop;
    // tuning rule: the fundamental unless it is > 20 dB below the strongest of h = 1 … 4,
    // else the lowest partial within 6 dB of that strongest, divided by its number
    const k1 = this.matched[0];
    if (k1 >= 0 && amp[k1] >= 0.1 * amax) return freqHz[k1];
    for (let h = 1; h < Math.min(4, H); h++) {
      const k = this.matched[h];
      if (k >= 0 && amp[k] >= 0.5 * amax) return freqHz[k] / (h + 1);
    }
    return anchorF0;
  }
}
