/**
 * The run command (`npm start`, or `npm run dev` with --dev): applies migrations, seeds
 * the demo studio and starts the local fakes outside production, then runs Next.js
 * (a production build, built first when missing or older than the sources) in its own
 * process group, and stops everything together.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { openDb } from "@/db/client";
import { migrateDb } from "@/db/migrate";
import { seedDemo } from "@/db/seed";
import { isProductionEnv, serverEnv } from "@/lib/env";
import { startSmtpCatcher, type SmtpCatcher } from "./fakes/smtp-catcher";

const dev = process.argv.includes("--dev");
const env = serverEnv();
const production = isProductionEnv();
const nextBin = path.join(process.cwd(), "node_modules", "next", "dist", "bin", "next");

function newestMtimeMs(dir: string): number {
  let newest = 0;
  if (!existsSync(dir)) return 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === "node_modules" || entry.name.startsWith(".")) continue;
    const full = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtimeMs(full) : statSync(full).mtimeMs);
  }
  return newest;
}

function buildIsStale(): boolean {
  const buildId = path.join(".next", "BUILD_ID");
  if (!existsSync(buildId)) return true;
  const built = statSync(buildId).mtimeMs;
  const sources = ["app", "components", "lib", "db", "public"].map(newestMtimeMs);
  const configs = ["next.config.mjs", "tailwind.config.ts", "package-lock.json", "proxy.ts"].map((f) =>
    existsSync(f) ? statSync(f).mtimeMs : 0,
  );
  return Math.max(...sources, ...configs) > built;
}

async function main() {
  mkdirSync("data", { recursive: true });
  mkdirSync(env.DATA_DIR, { recursive: true });

  const database = openDb(env.DATABASE_URL, env.DATABASE_AUTH_TOKEN);
  await migrateDb(database);
  console.log("[start] database migrated");
  if (!production) {
    const { created } = await seedDemo(database);
    console.log(created ? "[start] demo studio seeded" : "[start] demo studio present");
  }
  database.$client.close();

  let smtp: SmtpCatcher | undefined;
  const loopbackSmtp = env.SMTP_HOST === "127.0.0.1" || env.SMTP_HOST === "localhost";
  if (!production && loopbackSmtp) {
    smtp = await startSmtpCatcher({ port: env.SMTP_PORT, dir: env.MAILBOX_DIR });
    console.log(`[start] SMTP catcher on 127.0.0.1:${smtp.port}; mailbox at http://localhost:${env.PORT}/dev/mailbox`);
  }

  if (!dev && buildIsStale()) {
    console.log("[start] building the app (first start, or sources changed) …");
    const build = spawnSync(process.execPath, [nextBin, "build"], { stdio: "inherit", env: { ...process.env, NODE_ENV: "production" } });
    if (build.status !== 0) {
      console.error("[start] build failed");
      await smtp?.close();
      process.exit(build.status ?? 1);
    }
  }

  const args = dev ? ["dev", "-p", String(env.PORT)] : ["start", "-p", String(env.PORT)];
  const child: ChildProcess = spawn(process.execPath, [nextBin, ...args], {
    stdio: "inherit",
    detached: true, // its own process group, so stopping us stops Next's forked server too
    env: { ...process.env, NODE_ENV: dev ? "development" : "production" },
  });
  console.log(`[start] Tapernote on http://localhost:${env.PORT}`);

  let stopping = false;
  const stop = async (code: number) => {
    if (stopping) return;
    stopping = true;
    try {
      if (child.pid) process.kill(-child.pid, "SIGTERM");
    } catch {
      // already gone
    }
    await smtp?.close();
    process.exit(code);
  };
  process.on("SIGINT", () => void stop(0));
  process.on("SIGTERM", () => void stop(0));
  child.on("exit", (code) => void stop(code ?? 0));
}

main().catch((e) => {
  console.error("[start]", e instanceof Error ? e.message : e);
  process.exit(1);
});
