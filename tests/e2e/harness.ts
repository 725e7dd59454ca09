/**
 * End-to-end harness: starts the real app with the run command (migrations, seed,
 * SMTP catcher, Next.js) on free loopback ports with a throw-away data folder, and
 * drives Debian's Chromium with playwright-core.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { mkdirSync, mkdtempSync, rmSync } from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";

export const ARTIFACTS = path.join(process.cwd(), "tests", "artifacts");

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const port = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(port));
    });
  });
}

export type RunningApp = { baseUrl: string; dataDir: string; stop: () => Promise<void> };

export async function startApp(extraEnv: Record<string, string> = {}): Promise<RunningApp> {
  const [port, smtpPort, stripePort] = [await freePort(), await freePort(), await freePort()];
  const dataDir = mkdtempSync(path.join(os.tmpdir(), "tapernote-e2e-"));
  const env = {
    ...process.env,
    PORT: String(port),
    APP_URL: `http://localhost:${port}`,
    DATABASE_URL: `file:${path.join(dataDir, "tapernote.db")}`,
    DATA_DIR: path.join(dataDir, "uploads"),
    MAILBOX_DIR: path.join(dataDir, "mailbox"),
    SMTP_PORT: String(smtpPort),
    STRIPE_API_PORT: String(stripePort),
    AUTH_RATE_LIMIT_MAX: "1000",
    NEXT_TELEMETRY_DISABLED: "1",
    // one test run at a time builds and serves this folder's .next (scripts/start.ts)
    TAPERNOTE_EXCLUSIVE_BUILD: "1",
    ...extraEnv,
  };
  const child: ChildProcess = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "scripts/start.ts"], {
    env,
    stdio: ["ignore", "pipe", "pipe"],
    detached: true,
  });
  let log = "";
  child.stdout!.on("data", (d) => (log += d));
  child.stderr!.on("data", (d) => (log += d));
  const baseUrl = `http://localhost:${port}`;
  // generous: the app may first wait for another test run in this folder, then build
  const deadline = Date.now() + 30 * 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the app exited early:\n${log}`);
    try {
      const res = await fetch(`${baseUrl}/sign-in`);
      if (res.status === 200) break;
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) throw new Error(`the app did not start in time:\n${log}`);
    await new Promise((r) => setTimeout(r, 500));
  }
  return {
    baseUrl,
    dataDir,
    stop: async () => {
      try {
        process.kill(-child.pid!, "SIGTERM");
      } catch {
        // already gone
      }
      await new Promise((r) => setTimeout(r, 500));
      try {
        process.kill(-child.pid!, "SIGKILL");
      } catch {
        // gone
      }
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export async function openBrowser(): Promise<{ context: BrowserContext; page: Page; close: () => Promise<void> }> {
  const profile = mkdtempSync(path.join(os.tmpdir(), "tapernote-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: "/usr/bin/chromium",
    viewport: { width: 1280, height: 860 },
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function shot(page: Page, name: string): Promise<void> {
  mkdirSync(ARTIFACTS, { recursive: true });
  await page.screenshot({ path: path.join(ARTIFACTS, `${name}.png`), fullPage: true });
}

/** Opens the projects page and signs out if someone is signed in; ends on the sign-in form. */
export async function signOutIfSignedIn(page: Page, baseUrl: string): Promise<void> {
  await page.goto(`${baseUrl}/projects`);
  // signed out, the page moves on to the sign-in form (on the client, so wait for either)
  const signOut = page.getByRole("button", { name: "Sign out" });
  await page.locator("#email").or(signOut).first().waitFor();
  if (!(await signOut.count())) return;
  await signOut.first().click();
  await page.waitForURL(/\/sign-in/);
}

/**
 * Signs in as a demo account (password tapernote-demo, README) from wherever the page is:
 * signs out first if someone is signed in, and waits for the form to hydrate (before that it
 * would submit natively).
 */
export async function signInAs(page: Page, baseUrl: string, email: string): Promise<void> {
  await signOutIfSignedIn(page, baseUrl);
  await page.waitForLoadState("networkidle");
  await page.fill("#email", email);
  await page.fill("#password", "tapernote-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/projects/);
}

/** A tiny runner: each step prints ok/FAIL; the last line is "N passed, N failed". */
export async function runSteps(steps: [string, () => Promise<void>][]): Promise<number> {
  let passed = 0;
  let failed = 0;
  for (const [name, fn] of steps) {
    try {
      await fn();
      passed++;
      console.log(`ok   ${name}`);
    } catch (e) {
      failed++;
      console.log(`FAIL ${name}\n     ${(e as Error).stack ?? e}`);
      break; // later steps depend on earlier ones
    }
  }
  const skipped = steps.length - passed - failed;
  console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
  return failed + skipped;
}
