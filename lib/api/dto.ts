import type { ProjectRow } from "@/db/projects";
import type { InvitationRow, MemberRow } from "@/db/studios";
import type { ProjectDto } from "@/lib/schemas/project";
import type { InvitationDto, MemberDto } from "@/lib/schemas/members";

export const projectDto = (p: ProjectRow): ProjectDto => ({
  id: p.id,
  name: p.name,
  description: p.description,
  createdAt: p.createdAt.toISOString(),
  updatedAt: p.updatedAt.toISOString(),
});

export const memberDto = (m: MemberRow): MemberDto => ({
  id: m.id,
  userId: m.userId,
  name: m.name,
  email: m.email,
  role: m.role,
  joinedAt: m.joinedAt.toISOString(),
});

export const invitationDto = (i: InvitationRow): InvitationDto => ({
  id: i.id,
  email: i.email,
  role: i.role,
  expiresAt: i.expiresAt.toISOString(),
  createdAt: i.createdAt.toISOString(),
});
