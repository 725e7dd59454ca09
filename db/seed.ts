import "server-only";
import { hashPassword } from "better-auth/crypto";
import { and, eq } from "drizzle-orm";
import type { Db } from "./client";
import { newId } from "./ids";
import { account, project, studio, studioMember, take, user } from "./schema";
import { readFile } from "node:fs/promises";
import path from "node:path";
import { createTake } from "./takes";
import { decodeAudio } from "@/lib/engine";
import type { Role } from "@/lib/auth/permissions";

/** The invented demo studio: listed in the README, seeded by the run command outside production. */
export const DEMO_PASSWORD = "tapernote-demo";
export const DEMO_STUDIO = { id: "demo-studio", name: "Linden Row Music School" };
export const DEMO_ACCOUNTS: { email: string; name: string; role: Role }[] = [
  { email: "owner@example.com", name: "Maren Ostrova", role: "owner" },
  { email: "editor@example.com", name: "Julian Petrescu", role: "editor" },
  { email: "listener@example.com", name: "Noa Lindqvist", role: "listener" },
];
export const DEMO_PROJECTS = [
  { name: "Grade 3 chord exercises", description: "Weekly triad and seventh-chord exercises, recorded at home." },
  { name: "Spring concert chorale", description: "Four-part chorale takes from the string ensemble." },
];

/** Idempotent: running it again changes nothing. */
export async function seedDemo(database: Db): Promise<{ created: boolean }> {
  const [existing] = await database.select({ id: studio.id }).from(studio).where(eq(studio.id, DEMO_STUDIO.id));
  if (!existing) await database.insert(studio).values(DEMO_STUDIO);
  let created = !existing;

  const hash = await hashPassword(DEMO_PASSWORD);
  for (const demo of DEMO_ACCOUNTS) {
    let [row] = await database.select({ id: user.id }).from(user).where(eq(user.email, demo.email));
    if (!row) {
      const id = newId();
      await database.batch([
        database.insert(user).values({ id, name: demo.name, email: demo.email, emailVerified: true }),
        database.insert(account).values({ id: newId(), accountId: id, providerId: "credential", userId: id, password: hash, updatedAt: new Date() }),
      ]);
      row = { id };
      created = true;
    }
    const [member] = await database
      .select({ id: studioMember.id })
      .from(studioMember)
      .where(and(eq(studioMember.studioId, DEMO_STUDIO.id), eq(studioMember.userId, row.id)));
    if (!member) {
      await database.insert(studioMember).values({ id: newId(), studioId: DEMO_STUDIO.id, userId: row.id, role: demo.role });
    }
  }

  const [owner] = await database.select({ id: user.id }).from(user).where(eq(user.email, DEMO_ACCOUNTS[0]!.email));
  for (const p of DEMO_PROJECTS) {
    const [found] = await database
      .select({ id: project.id })
      .from(project)
      .where(and(eq(project.studioId, DEMO_STUDIO.id), eq(project.name, p.name)));
    if (!found) {
      await database.insert(project).values({ id: newId(), studioId: DEMO_STUDIO.id, ...p, createdByUserId: owner?.id });
      created = true;
    }
  }
  return { created };
}

/** The demo takes (rendered by `npm run demo:render`, committed under demo/), in the first demo project. */
export const DEMO_TAKES = [
  { file: "chord-exercise.flac", name: "Chord exercise in C — Mila, week 4" },
  { file: "two-hand-study.flac", name: "Two-hand study — Jonas" },
  { file: "string-chorale.flac", name: "Chorale, string quartet run-through" },
];

/**
 * Adds the demo takes to the first demo project and queues their analyses (the job runner
 * analyses them). Idempotent by take name. Uses the process-wide database (db/client).
 */
export async function seedDemoTakes(database: Db): Promise<number> {
  const [demoProject] = await database
    .select({ id: project.id })
    .from(project)
    .where(and(eq(project.studioId, DEMO_STUDIO.id), eq(project.name, DEMO_PROJECTS[0]!.name)));
  const [owner] = await database.select({ id: user.id }).from(user).where(eq(user.email, DEMO_ACCOUNTS[0]!.email));
  if (!demoProject || !owner) return 0;
  let added = 0;
  for (const demo of DEMO_TAKES) {
    const [existing] = await database
      .select({ id: take.id })
      .from(take)
      .where(and(eq(take.projectId, demoProject.id), eq(take.name, demo.name)));
    if (existing) continue;
    const bytes = new Uint8Array(await readFile(path.join(process.cwd(), "demo", demo.file)));
    const decoded = await decodeAudio(bytes);
    await createTake({
      studioId: DEMO_STUDIO.id,
      projectId: demoProject.id,
      name: demo.name,
      createdByUserId: owner.id,
      original: { bytes, ext: "flac", mime: "audio/flac" },
      decoded: { durationSec: decoded.durationSec, sampleRateHz: decoded.sourceRateHz, channels: decoded.channels },
      settings: {},
    });
    added++;
  }
  return added;
}
