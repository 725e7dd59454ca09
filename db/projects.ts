import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { db } from "./client";
import { newId } from "./ids";
import { project } from "./schema";
import { AppError, notFound } from "@/lib/errors";

export type ProjectRow = { id: string; name: string; description: string; createdAt: Date; updatedAt: Date };

const columns = {
  id: project.id,
  name: project.name,
  description: project.description,
  createdAt: project.createdAt,
  updatedAt: project.updatedAt,
};

function isUniqueViolation(e: unknown): boolean {
  const text = String((e as { cause?: unknown })?.cause ?? "") + String((e as Error)?.message ?? "");
  return /UNIQUE constraint failed/i.test(text);
}

const duplicateName = () =>
  new AppError("conflict", "A project with this name already exists in the studio.", {
    name: ["A project with this name already exists."],
  });

export async function listProjects(studioId: string): Promise<ProjectRow[]> {
  return db().select(columns).from(project).where(eq(project.studioId, studioId)).orderBy(desc(project.updatedAt));
}

export async function getProject(studioId: string, projectId: string): Promise<ProjectRow> {
  const [row] = await db()
    .select(columns)
    .from(project)
    .where(and(eq(project.id, projectId), eq(project.studioId, studioId)));
  if (!row) throw notFound("This project");
  return row;
}

export async function createProject(
  studioId: string,
  input: { name: string; description?: string },
  createdByUserId: string,
): Promise<ProjectRow> {
  const id = newId();
  try {
    await db()
      .insert(project)
      .values({ id, studioId, name: input.name, description: input.description ?? "", createdByUserId });
  } catch (e) {
    if (isUniqueViolation(e)) throw duplicateName();
    throw e;
  }
  return getProject(studioId, id);
}

export async function updateProject(
  studioId: string,
  projectId: string,
  input: { name?: string; description?: string },
): Promise<ProjectRow> {
  try {
    const updated = await db()
      .update(project)
      .set({ ...input, updatedAt: new Date() })
      .where(and(eq(project.id, projectId), eq(project.studioId, studioId)))
      .returning({ id: project.id });
    if (updated.length === 0) throw notFound("This project");
  } catch (e) {
    if (isUniqueViolation(e)) throw duplicateName();
    throw e;
  }
  return getProject(studioId, projectId);
}

export async function deleteProject(studioId: string, projectId: string): Promise<void> {
  const deleted = await db()
    .delete(project)
    .where(and(eq(project.id, projectId), eq(project.studioId, studioId)))
    .returning({ id: project.id });
  if (deleted.length === 0) throw notFound("This project");
}
