import { z } from "zod";

/** The same schemas validate the forms in the browser and the requests on the server. */
export const projectNameSchema = z
  .string({ error: "Give the project a name." })
  .trim()
  .min(1, "Give the project a name.")
  .max(80, "Keep the name to 80 characters or fewer.");

export const createProjectSchema = z.object({
  name: projectNameSchema,
  description: z.string().trim().max(500, "Keep the description to 500 characters or fewer.").optional(),
});
export type CreateProjectInput = z.infer<typeof createProjectSchema>;

export const updateProjectSchema = z
  .object({
    name: projectNameSchema.optional(),
    description: z.string().trim().max(500, "Keep the description to 500 characters or fewer.").optional(),
  })
  .refine((v) => v.name !== undefined || v.description !== undefined, { message: "Nothing to change." });
export type UpdateProjectInput = z.infer<typeof updateProjectSchema>;

/** A project as the API returns it. */
export type ProjectDto = { id: string; name: string; description: string; createdAt: string; updatedAt: string };
