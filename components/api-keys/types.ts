import { z } from "zod";
import type { Role } from "@/lib/auth/permissions";
import { roleSchema } from "@/lib/schemas/members";

/** An API key as `GET /api/v1/api-keys` lists it: never the key itself. */
export type ApiKeyDto = {
  id: string;
  name: string;
  prefix: string;
  role: Role;
  createdAt: string;
  lastUsedAt?: string;
  createdBy?: string;
};

/**
 * The create form's schema; the same rules as the handler of `POST /api/v1/api-keys`
 * (which declares them inline): a name of 1–80 characters and a role.
 */
export const createApiKeySchema = z.object({
  name: z.string().trim().min(1, "Give the key a name.").max(80, "Keep the name to 80 characters or fewer."),
  role: roleSchema,
});
export type CreateApiKeyInput = z.infer<typeof createApiKeySchema>;
