import { z } from "zod";

/** One note as the API and the command line give it (../shared/NAMES.md). */
export const noteSchema = z
  .object({
    onsetSec: z.number().min(0).max(24 * 3600),
    offsetSec: z.number().min(0).max(24 * 3600),
    pitch: z.number().int().min(0).max(127),
    cents: z.number().min(-100).max(100).default(0),
    velocity: z.number().int().min(1).max(127).default(80),
    voice: z.number().int().min(0).max(64).default(1),
    pitchCurve: z
      .object({ timeSec: z.array(z.number()).max(100_000), cents: z.array(z.number()).max(100_000) })
      .optional(),
  })
  .refine((n) => n.offsetSec > n.onsetSec, { message: "offsetSec must be after onsetSec", path: ["offsetSec"] });
export type NoteDto = z.output<typeof noteSchema>;

export const MAX_NOTES = 100_000;

export const putNotesSchema = z.object({
  /** The revision the edit started from; 0 when it started from the draft. */
  baseRevision: z.number().int().min(0),
  notes: z.array(noteSchema).max(MAX_NOTES),
  referenceHz: z.number().min(380).max(500).optional(),
});
export type PutNotesInput = z.infer<typeof putNotesSchema>;
