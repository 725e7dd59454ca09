/**
 * The run command (`npm start`, or `npm run dev` with --dev): applies migrations, seeds
 * the demo studio and starts the local fakes outside production, then runs Next.js
 * (a production build, built first when missing or older than the sources) and the
 * analysis job runner (scripts/worker.ts), each in its own process group, and stops
 * everything together. A job runner that dies is restarted with a back-off; it never
 * takes the web server down.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, readdirSync, rmSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { openDb } from "@/db/client";
import { migrateDb } from "@/db/migrate";
import { seedDemo, seedDemoTakes } from "@/db/seed";
import { stripeConfig } from "@/lib/billing/stripe";
import { appUrl } from "@/lib/env";
import { startFakeStripe, type FakeStripe } from "./fakes/stripe";
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

const LOCK_DIR = ".next-run.lock";

/**
 * With TAPERNOTE_EXCLUSIVE_BUILD=1 (the browser tests and the load script set it), one run of
 * the app at a time uses this folder's `.next`: another run would rebuild it under a running
 * server. Waits for the holder (a live process) to stop; a lock left by a dead one is taken over.
 */
async function takeBuildLock(): Promise<() => void> {
  let announced = false;
  for (;;) {
    try {
      mkdirSync(LOCK_DIR);
      writeFileSync(path.join(LOCK_DIR, "pid"), String(process.pid));
      return () => rmSync(LOCK_DIR, { recursive: true, force: true });
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== "EEXIST") throw e;
      const holder = Number(readFileSafe(path.join(LOCK_DIR, "pid")));
      if (!holder || !alive(holder)) {
        rmSync(LOCK_DIR, { recursive: true, force: true });
        continue;
      }
      if (!announced) console.log(`[start] waiting for another run of the app from this folder (pid ${holder}) to stop …`);
      announced = true;
      await new Promise((r) => setTimeout(r, 2000));
    }
  }
}

function readFileSafe(file: string): string {
  try {
    return readFileSync(file, "utf8");
  } catch {
    return "";
  }
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

async function main() {
  const releaseLock = process.env.TAPERNOTE_EXCLUSIVE_BUILD === "1" && !dev ? await takeBuildLock() : () => undefined;
  process.on("exit", releaseLock);
  mkdirSync("data", { recursive: true });
  mkdirSync(env.DATA_DIR, { recursive: true });

  const database = openDb(env.DATABASE_URL, env.DATABASE_AUTH_TOKEN);
  await migrateDb(database);
  console.log("[start] database migrated");
  if (!production) {
    const { created } = await seedDemo(database);
    console.log(created ? "[start] demo studio seeded" : "[start] demo studio present");
    const takes = await seedDemoTakes(database);
    if (takes) console.log(`[start] ${takes} demo takes added; the job runner analyses them`);
  }
  database.$client.close();

  // Stripe: the local fake unless real keys are configured.
  let fakeStripe: FakeStripe | undefined;
  if (!production && !process.env.STRIPE_SECRET_KEY) {
    const cfg = stripeConfig();
    fakeStripe = await startFakeStripe({ port: Number(cfg.port), webhookUrl: `${appUrl()}/api/stripe/webhook`, webhookSecret: cfg.webhookSecret });
    console.log(`[start] fake Stripe on ${fakeStripe.url} (test cards: 4242 4242 4242 4242 pays, 4000 0000 0000 0002 is declined)`);
  }

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
      await fakeStripe?.close();
      process.exit(build.status ?? 1);
    }
  }

  const worker = superviseWorker();

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
    await worker.stop();
    await smtp?.close();
    await fakeStripe?.close();
    process.exit(code);
  };
  process.on("SIGINT", () => void stop(0));
  process.on("SIGTERM", () => void stop(0));
  child.on("exit", (code) => void stop(code ?? 0));
}

// Back-off between restarts of a job runner that died: 1 s, 2 s, 4 s … at most 30 s; a runner
// that stayed up for a minute starts the count again.
const RESTART_MIN_MS = 1000;
const RESTART_MAX_MS = 30_000;
const STABLE_MS = 60_000;
// The runner needs a moment to put its running jobs back in the queue before it exits.
const WORKER_STOP_MS = 12_000;

/** Runs the analysis job runner in its own process group and restarts it when it dies. */
function superviseWorker(): { stop: () => Promise<void> } {
  let current: ChildProcess | undefined;
  let restartTimer: NodeJS.Timeout | undefined;
  let delayMs = RESTART_MIN_MS;
  let stopping = false;

  const launch = () => {
    const startedAtMs = Date.now();
    const proc = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", path.join("scripts", "worker.ts")], {
      stdio: "inherit",
      detached: true, // its own process group, like Next.js: we decide when it stops
      env: process.env,
    });
    current = proc;
    proc.on("exit", (code, signal) => {
      current = undefined;
      if (stopping) return;
      if (Date.now() - startedAtMs >= STABLE_MS) delayMs = RESTART_MIN_MS;
      console.error(`[start] the job runner exited (${signal ?? `code ${code}`}); restarting in ${delayMs / 1000} s`);
      restartTimer = setTimeout(launch, delayMs);
      delayMs = Math.min(RESTART_MAX_MS, delayMs * 2);
    });
    proc.on("error", (e) => console.error("[start] the job runner could not start:", e.message));
  };
  launch();

  return {
    stop: async () => {
      stopping = true;
      clearTimeout(restartTimer);
      const proc = current;
      if (!proc?.pid || proc.exitCode !== null || proc.signalCode !== null) return;
      const exited = new Promise<void>((resolve) => proc.once("exit", () => resolve()));
      const signal = (name: NodeJS.Signals) => {
        try {
          process.kill(-proc.pid!, name);
        } catch {
          // already gone
        }
      };
      signal("SIGTERM");
      const timer = setTimeout(() => signal("SIGKILL"), WORKER_STOP_MS);
      await exited;
      clearTimeout(timer);
    },
  };
}

main().catch((e) => {
  console.error("[start]", e instanceof Error ? e.message : e);
  process.exit(1);
});
