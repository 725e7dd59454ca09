import { z } from "zod";
import { TAPER_NAMES } from "./tapers";
import { EngineError } from "./errors";

/**
 * Analysis settings (vocabulary: ../shared/NAMES.md). Every field has a default, so
 * `settingsSchema.parse({})` gives the standard analysis. Same input + same settings → same output.
 */
export const settingsSchema = z
  .object({
    /** Taper applied to every analysis frame. */
    taper: z.enum(TAPER_NAMES).default("hann"),
    /** Kaiser β (only for taper "kaiser"). */
    kaiserBeta: z.number().min(0).max(40).default(9.42),
    /** Gaussian α, σ = N/(2α) (only for taper "gaussian"). */
    gaussianAlpha: z.number().min(0.5).max(10).default(2.5),
    /**
     * Frame lengths per register (ms). Low notes need long frames to separate semitones,
     * high and fast notes short ones; see docs/engine.md.
     */
    frameLengthsMs: z
      .object({
        low: z.number().min(64).max(1024).default(256),
        mid: z.number().min(32).max(512).default(128),
        high: z.number().min(16).max(256).default(64),
      })
      .prefault({}),
    /** Hop between frames (ms), the same in every register. */
    hopMs: z.number().min(2).max(50).default(10),
    /** Reference pitch A4 in Hz, or "estimate" to estimate it from the take. */
    referenceHz: z.union([z.number().min(380).max(500), z.literal("estimate")]).default("estimate"),
    /** Most notes sounding at once. */
    voiceLimit: z.number().int().min(1).max(16).default(8),
    /** Shortest note kept (ms). */
    shortestNoteMs: z.number().min(10).max(2000).default(70),
    /** Sensitivity (dB): how far below the loudest pitch in a frame a voice is still reported. */
    sensitivityDb: z.number().min(6).max(80).default(30),
    /** Pitch range searched, MIDI numbers at A4 = 440 Hz. */
    pitchRange: z
      .object({
        lowMidi: z.number().int().min(12).max(120).default(28),
        highMidi: z.number().int().min(12).max(120).default(100),
      })
      .prefault({})
      .refine((r) => r.lowMidi < r.highMidi, { message: "lowMidi must be below highMidi" }),
    /** Add a pitch curve (time, cents) to each note. */
    pitchCurves: z.boolean().default(true),
  })
  .strict();

export type Settings = z.output<typeof settingsSchema>;
export type SettingsInput = z.input<typeof settingsSchema>;

/** Parse settings or throw an EngineError("bad_settings") naming the first problem. */
export function parseSettings(input: unknown): Settings {
  const r = settingsSchema.safeParse(input ?? {});
  if (!r.success) {
    const issue = r.error.issues[0];
    throw new EngineError("bad_settings", `bad setting ${issue.path.join(".") || "(root)"}: ${issue.message}`);
  }
  return r.data;
}
