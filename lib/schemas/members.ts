import { z } from "zod";
import { ROLES } from "@/lib/auth/permissions";

export const roleSchema = z.enum(ROLES, { error: "Choose owner, editor or listener." });

export const inviteSchema = z.object({
  email: z.email({ error: "Enter a valid e-mail address." }).trim().toLowerCase().max(254),
  role: roleSchema,
});
export type InviteInput = z.infer<typeof inviteSchema>;

export const changeRoleSchema = z.object({ role: roleSchema });

export const studioNameSchema = z.object({
  name: z.string().trim().min(1, "Give the studio a name.").max(80, "Keep the name to 80 characters or fewer."),
});

export type MemberDto = { id: string; userId: string; name: string; email: string; role: (typeof ROLES)[number]; joinedAt: string };
export type InvitationDto = { id: string; email: string; role: (typeof ROLES)[number]; expiresAt: string; createdAt: string };
