/**
 * The synthesiser voices the notes can be played with: Tone.js's built-in synths, so nothing is
 * downloaded. Each is a PolySynth, one voice per sounding note.
 */
type ToneModule = typeof import("tone");

export type SynthVoiceId = "soft" | "warm" | "bell";

export const SYNTH_VOICES: readonly { id: SynthVoiceId; label: string; hint: string }[] = [
  { id: "soft", label: "Soft", hint: "a mellow triangle wave, clear on chords" },
  { id: "warm", label: "Warm", hint: "a gentle FM tone, like a soft electric piano" },
  { id: "bell", label: "Bell", hint: "a struck, fading tone: onsets stand out" },
];

export const DEFAULT_SYNTH_VOICE: SynthVoiceId = "soft";

export function isSynthVoice(x: unknown): x is SynthVoiceId {
  return SYNTH_VOICES.some((v) => v.id === x);
}

export type AnyPolySynth = InstanceType<ToneModule["PolySynth"]>;

export function makeSynth(T: ToneModule, id: SynthVoiceId): AnyPolySynth {
  let synth: AnyPolySynth;
  if (id === "warm") {
    synth = new T.PolySynth(T.FMSynth, {
      harmonicity: 1,
      modulationIndex: 1.2,
      oscillator: { type: "sine" },
      modulation: { type: "triangle" },
      envelope: { attack: 0.02, decay: 0.3, sustain: 0.6, release: 0.45 },
      modulationEnvelope: { attack: 0.05, decay: 0.4, sustain: 0.35, release: 0.45 },
    }) as unknown as AnyPolySynth;
  } else if (id === "bell") {
    synth = new T.PolySynth(T.FMSynth, {
      harmonicity: 3.01,
      modulationIndex: 6,
      oscillator: { type: "sine" },
      modulation: { type: "sine" },
      envelope: { attack: 0.002, decay: 1.2, sustain: 0.08, release: 0.9 },
      modulationEnvelope: { attack: 0.002, decay: 0.6, sustain: 0, release: 0.6 },
    }) as unknown as AnyPolySynth;
  } else {
    synth = new T.PolySynth(T.Synth, {
      oscillator: { type: "triangle" },
      envelope: { attack: 0.015, decay: 0.25, sustain: 0.55, release: 0.35 },
    }) as unknown as AnyPolySynth;
  }
  synth.maxPolyphony = 64;
  return synth;
}
