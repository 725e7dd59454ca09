/**
 * The spectrogram's frequency axis: logarithmic in frequency, i.e. linear in (fractional) MIDI
 * pitch, with the same row maths as the piano roll (components/piano-roll/geometry.ts): the row
 * of integer pitch p spans [top + (topPitch − p)·rowPx, … + rowPx), and the frequency of p in
 * 12-TET at A4 = 440 Hz lies on that row's centre. So a partial at a note's frequency is drawn
 * on the same row the piano roll gives the note.
 */
import { hzToMidi, midiToHz } from "@/lib/music/pitch";

export type PitchAxis = {
  /** The pitch whose row starts at `topPx` (fractional allowed). */
  topPitch: number;
  rowPx: number;
  topPx: number;
};

/** y of the top edge of pitch p's row (the piano roll's `pitchToY` with its ruler at `topPx`). */
export function pitchToRowY(axis: PitchAxis, pitch: number): number {
  return axis.topPx + (axis.topPitch - pitch) * axis.rowPx;
}

/** y of a frequency: the centre of its (fractional) pitch's row. */
export function hzToY(axis: PitchAxis, freqHz: number): number {
  return pitchToRowY(axis, hzToMidi(freqHz)) + axis.rowPx / 2;
}

/** The frequency drawn at y (inverse of hzToY). */
export function yToHz(axis: PitchAxis, y: number): number {
  return midiToHz(axis.topPitch - (y - axis.topPx - axis.rowPx / 2) / axis.rowPx);
}

/** An axis showing pitches lowPitch…highPitch (inclusive rows) in heightPx. */
export function axisForRange(lowPitch: number, highPitch: number, heightPx: number, topPx = 0): PitchAxis {
  const rows = highPitch - lowPitch + 1;
  return { topPitch: highPitch, rowPx: (heightPx - topPx) / rows, topPx };
}

/** Centre frequency (Hz) of FFT bin k: k · sampleRateHz / fftSize. */
export function binToHz(bin: number, fftSize: number, sampleRateHz: number): number {
  return (bin * sampleRateHz) / fftSize;
}

export function hzToBin(freqHz: number, fftSize: number, sampleRateHz: number): number {
  return (freqHz * fftSize) / sampleRateHz;
}

/**
 * The spectrogram's bands: `bandsPerSemitone` bands per semitone from `lowPitch − ½` to
 * `highPitch + ½` (so the centre band of every pitch sits on its row's centre). Band b covers
 * fractional pitches [lo + b/k, lo + (b+1)/k) with lo = lowPitch − ½; its magnitude is read
 * from FFT bins [binLo, binHi] (the widest bins holding the band, at least one).
 */
export type Bands = { lowPitch: number; highPitch: number; bandsPerSemitone: number; count: number; binLo: Float64Array; binHi: Float64Array };

export function makeBands(lowPitch: number, highPitch: number, bandsPerSemitone: number, fftSize: number, sampleRateHz: number): Bands {
  const count = (highPitch - lowPitch + 1) * bandsPerSemitone;
  const binLo = new Float64Array(count);
  const binHi = new Float64Array(count);
  const lo = lowPitch - 0.5;
  for (let b = 0; b < count; b++) {
    binLo[b] = hzToBin(midiToHz(lo + b / bandsPerSemitone), fftSize, sampleRateHz);
    binHi[b] = hzToBin(midiToHz(lo + (b + 1) / bandsPerSemitone), fftSize, sampleRateHz);
  }
  return { lowPitch, highPitch, bandsPerSemitone, count, binLo, binHi };
}

/** The fractional pitch at a band's centre. */
export function bandPitch(bands: Pick<Bands, "lowPitch" | "bandsPerSemitone">, band: number): number {
  return bands.lowPitch - 0.5 + (band + 0.5) / bands.bandsPerSemitone;
}

/** The band holding a fractional pitch (may be outside 0…count−1). */
export function pitchToBand(bands: Pick<Bands, "lowPitch" | "bandsPerSemitone">, pitch: number): number {
  return Math.floor((pitch - (bands.lowPitch - 0.5)) * bands.bandsPerSemitone);
}
