import { z } from "zod";

/** Query of GET /api/v1/takes/{takeId}/export (URL values are strings: coerced here). */
export const exportQuerySchema = z.object({
  format: z.enum(["midi", "musicxml", "csv"], { error: "format must be midi, musicxml or csv." }),
  revision: z.coerce.number().int().min(1).optional(),
  pitchBend: z.enum(["0", "1"]).default("0").transform((v) => v === "1"),
  quantize: z
    .string()
    .regex(/^1\/(1|2|3|4|6|8|12|16|24|32)$/, "quantize is a note value such as 1/8 or 1/16.")
    .optional(),
  tempo: z.coerce.number().min(40).max(240).optional(),
  timeSignature: z
    .string()
    .regex(/^([1-9][0-9]?)\/(1|2|4|8|16|32)$/, "timeSignature looks like 4/4 or 6/8.")
    .optional(),
});
export type ExportQuery = z.output<typeof exportQuerySchema>;
