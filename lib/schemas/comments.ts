import { z } from "zod";

export const commentTargetSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("take") }),
  z.object({ kind: z.literal("note"), noteIndex: z.number().int().min(0), onsetSec: z.number().min(0), pitch: z.number().int().min(0).max(127) }),
  z
    .object({ kind: z.literal("range"), startSec: z.number().min(0), endSec: z.number().min(0) })
    .refine((r) => r.endSec > r.startSec, { message: "The range must end after it starts.", path: ["endSec"] }),
]);

export const newCommentSchema = z.object({
  body: z.string().trim().min(1, "Write something first.").max(2000, "Keep a comment to 2000 characters."),
  target: commentTargetSchema.default({ kind: "take" }),
  parentId: z.string().min(1).optional(),
});

export const newShareLinkSchema = z.object({
  expiresInDays: z.number().int().min(1, "At least one day.").max(90, "At most 90 days.").default(14),
});
