// `npm run test:e2e`: the browser tests, against the real app started by the run command.
import assert from "node:assert/strict";
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import wf from "wavefile";
import { openBrowser, runSteps, shot, startApp } from "./harness";
import { teachingSteps } from "./teaching";
import { editorSteps } from "./editor";
import { playbackSteps } from "./playback";

const { WaveFile } = wf;

const app = await startApp();
// the app runs in its own process group: stop it when the browser cannot start, or it keeps the port
const browser = await openBrowser().catch(async (e: unknown) => {
  await app.stop();
  throw e;
});
const { page } = browser;
const errors: string[] = [];
page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
page.on("response", (r) => {
  if (r.status() >= 400 && !r.url().includes("/api/")) errors.push(`http ${r.status()}: ${r.url()}`);
});
page.on("console", (m) => {
  if (m.type() === "error" && /Failed to load resource/.test(m.text())) return; // reported with its URL above

  if (m.type() === "error") errors.push(`console: ${m.text()}`);
});

// Test recordings, written into a throw-away folder: 3 s of a C major triad (C4 E4 G4) at 44.1 kHz, and a
// text file that only pretends to be a WAV by its name.
const filesDir = mkdtempSync(path.join(os.tmpdir(), "tapernote-e2e-files-"));
const triadPath = path.join(filesDir, "triad-c-major.wav");
const fakePath = path.join(filesDir, "not-really-audio.wav");
// Committed: 2.5 s of OGG Vorbis, a sawtooth G3 on the left channel and B3 on the right, made with
// `sox -n -r 44100 -c 2 -C 0 g3-b3-stereo.ogg synth 2.5 sawtooth 196 sawtooth 246.94 gain -12 lowpass 3000 fade 0.01 2.5 0.05`.
const oggPath = path.join(process.cwd(), "tests", "e2e", "fixtures", "g3-b3-stereo.ogg");
{
  const sampleRateHz = 44100;
  const n = 3 * sampleRateHz;
  const samples = new Int16Array(n);
  const freqsHz = [261.63, 329.63, 392.0]; // C4, E4, G4 at A4 = 440 Hz
  for (let i = 0; i < n; i++) {
    const t = i / sampleRateHz;
    // a gentle piano-like envelope: 10 ms attack, slow decay, 50 ms release
    const env = Math.min(1, t / 0.01) * Math.exp(-0.6 * t) * Math.min(1, (3 - t) / 0.05);
    let v = 0;
    for (const f of freqsHz) for (let h = 1; h <= 4; h++) v += Math.sin(2 * Math.PI * f * h * t) / (h * h);
    samples[i] = Math.round(0.22 * env * v * 32767);
  }
  const wav = new WaveFile();
  wav.fromScratch(1, sampleRateHz, "16", samples);
  writeFileSync(triadPath, wav.toBuffer());
  writeFileSync(fakePath, "This is a shopping list, not a recording.\n".repeat(20));
}

/** Signs in on the sign-in page as a demo account (README: password tapernote-demo). */
async function signInAs(demoEmail: string) {
  await page.fill("#email", demoEmail);
  await page.fill("#password", "tapernote-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/projects/);
}

/** Signs out from any signed-in page and back in as another demo account. */
async function switchTo(demoEmail: string) {
  await page.getByRole("button", { name: "Sign out" }).first().click();
  await page.waitForURL(/\/sign-in/);
  await signInAs(demoEmail);
}

const email = `ada.quill.${Date.now()}@example.org`;
let expectedBalance = 0;
const projectName = "Wednesday theory group";

const failures = await runSteps([
  ["landing page says what Tapernote does", async () => {
    await page.goto(app.baseUrl);
    await page.getByRole("link", { name: /create an account/i }).first().waitFor();
    assert.match(await page.textContent("body") ?? "", /cents/i);
    await shot(page, "01-landing");
  }],
  ["sign-up form shows field errors next to the fields", async () => {
    await page.goto(`${app.baseUrl}/sign-up`);
    await page.getByRole("button", { name: "Create account" }).click();
    await page.locator("#email-error").waitFor();
    assert.match(await page.locator("#password-error").textContent() ?? "", /8 characters/);
    await shot(page, "02-sign-up-errors");
  }],
  ["sign up", async () => {
    await page.fill("#name", "Ada Quill");
    await page.fill("#email", email);
    await page.fill("#password", "scales and arpeggios");
    await page.getByRole("button", { name: "Create account" }).click();
    await page.getByText("Check your e-mail").waitFor();
    await shot(page, "03-check-email");
  }],
  ["verify through the mailbox page", async () => {
    await page.goto(`${app.baseUrl}/dev/mailbox`);
    const mail = page.locator('[data-testid="mail"]', { hasText: email }).first();
    await mail.waitFor();
    await shot(page, "04-mailbox");
    await mail.locator("a").first().click();
    await page.waitForURL(/\/projects/);
    await page.getByRole("heading", { name: "Projects" }).waitFor();
    await page.getByText("No projects yet").waitFor();
    await shot(page, "05-projects-empty");
  }],
  ["create a project and see it in the table", async () => {
    await page.getByRole("button", { name: "New project" }).first().click();
    await page.getByRole("button", { name: "Create project" }).click();
    await page.locator("#project-name-error").waitFor();
    await page.fill("#project-name", projectName);
    await page.fill("#project-description", "Triads and inversions, autumn term.");
    await page.getByRole("button", { name: "Create project" }).click();
    await page.getByRole("link", { name: projectName }).waitFor();
    await shot(page, "06-projects-table");
  }],
  ["sign out", async () => {
    await page.getByRole("button", { name: "Sign out" }).first().click();
    await page.waitForURL(/\/sign-in/);
    await page.goto(`${app.baseUrl}/projects`);
    await page.waitForURL(/\/sign-in/);
    await shot(page, "07-signed-out");
  }],
  ["the demo owner sees the demo studio's members", async () => {
    await signInAs("owner@example.com");
    await page.getByRole("link", { name: "Grade 3 chord exercises" }).waitFor();
    await page.goto(`${app.baseUrl}/members`);
    await page.getByText("listener@example.com").waitFor();
    await shot(page, "08-members");
  }],
  ["the demo editor opens the demo project", async () => {
    await switchTo("editor@example.com");
    await page.getByRole("link", { name: "Grade 3 chord exercises" }).click();
    await page.getByRole("heading", { name: "Grade 3 chord exercises" }).waitFor();
    await page.getByRole("heading", { name: "Upload takes" }).waitFor();
  }],
  ["a file waits for the consent notice; a fake WAV is refused by its content", async () => {
    const input = page.getByLabel("Choose recordings to upload");
    await input.setInputFiles([fakePath]);
    await page.getByText("1 file is waiting").waitFor();
    assert.equal(await page.locator('[data-testid="upload-row"]').first().getAttribute("data-status"), "queued");
    await shot(page, "09-upload-consent");
    await page.getByLabel("I have the consent needed for these recordings.").check();
    const row = page.locator('[data-testid="upload-row"][data-status="failed"]', { hasText: "not-really-audio.wav" });
    await row.waitFor();
    assert.match(await row.textContent() ?? "", /not a WAV, FLAC, MP3, OGG or M4A/);
    await row.getByRole("button", { name: /Remove/ }).click();
  }],
  ["upload a WAV and watch its progress bar", async () => {
    // Slow the link down so that the upload takes a few seconds and the bar is seen moving.
    const cdp = await page.context().newCDPSession(page);
    await cdp.send("Network.enable");
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 80 * 1024 });
    await page.getByLabel("Choose recordings to upload").setInputFiles([triadPath]);
    const row = page.locator('[data-testid="upload-row"]', { hasText: "triad-c-major.wav" });
    const bar = row.getByRole("progressbar");
    await page.waitForFunction(
      () => {
        const el = [...document.querySelectorAll('[data-testid="upload-row"]')].find((r) => r.textContent?.includes("triad-c-major.wav"));
        const now = Number(el?.querySelector('[role="progressbar"]')?.getAttribute("aria-valuenow") ?? 0);
        return el?.getAttribute("data-status") === "uploading" && now > 0 && now < 100;
      },
      undefined,
      { timeout: 20_000 },
    );
    const midway = Number(await bar.getAttribute("aria-valuenow"));
    await shot(page, "10-upload-progress");
    await page.locator('[data-testid="upload-row"][data-status="done"]', { hasText: "triad-c-major.wav" }).waitFor({ timeout: 30_000 });
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    assert.ok(midway > 0 && midway < 100, `progress seen mid-way: ${midway}%`);
    assert.equal(await bar.getAttribute("aria-valuenow"), "100");
  }],
  ["cancel an upload half-way: nothing is kept", async () => {
    const cancelPath = path.join(filesDir, "cancel-me.wav");
    copyFileSync(triadPath, cancelPath);
    const cdp = await page.context().newCDPSession(page);
    await cdp.send("Network.enable");
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 40 * 1024 });
    await page.getByLabel("Choose recordings to upload").setInputFiles([cancelPath]);
    const row = page.locator('[data-testid="upload-row"]', { hasText: "cancel-me.wav" });
    await row.and(page.locator('[data-status="uploading"]')).waitFor();
    await row.getByRole("button", { name: /Cancel upload/ }).click();
    await row.and(page.locator('[data-status="cancelled"]')).waitFor();
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    assert.match(await row.textContent() ?? "", /nothing was kept/);
    const res = await page.request.get(`${app.baseUrl}/api/v1/projects/${page.url().split("/projects/")[1]}/takes`);
    const { takes } = (await res.json()) as { takes: { name: string }[] };
    assert.ok(!takes.some((t) => t.name === "cancel-me"), "the cancelled upload left no take");
    await row.getByRole("button", { name: /Remove/ }).click();
  }],
  ["the take becomes ready in the takes table", async () => {
    const takeRow = page.getByRole("row", { name: /triad-c-major/ });
    await takeRow.waitFor();
    await takeRow.getByText("ready").waitFor({ timeout: 120_000 });
    await shot(page, "11-take-ready");
  }],
  ["an OGG file is decoded in the browser and sent with its WAV rendering", async () => {
    // dropped on the drop zone, as a person drags it from their file manager
    const dataTransfer = await page.evaluateHandle(
      ({ base64, name }) => {
        const bytes = Uint8Array.from(atob(base64), (c) => c.charCodeAt(0));
        const transfer = new DataTransfer();
        transfer.items.add(new File([bytes], name, { type: "audio/ogg" }));
        return transfer;
      },
      { base64: readFileSync(oggPath).toString("base64"), name: "g3-b3-stereo.ogg" },
    );
    await page.getByTestId("drop-zone").dispatchEvent("dragover", { dataTransfer });
    await page.getByTestId("drop-zone").dispatchEvent("drop", { dataTransfer });
    await page.locator('[data-testid="upload-row"][data-status="done"]', { hasText: "g3-b3-stereo.ogg" }).waitFor({ timeout: 30_000 });
    const takeRow = page.getByRole("row", { name: /g3-b3-stereo/ });
    await takeRow.getByText("ready").waitFor({ timeout: 120_000 });
    await page.getByRole("table", { name: "Takes in this project" }).getByRole("link", { name: "g3-b3-stereo" }).click();
    const notes = page.getByRole("table", { name: "Notes of this take" });
    await notes.waitFor();
    const text = await notes.textContent() ?? "";
    // both channels reach the analysis: the browser mixed them to mono
    for (const name of ["G3", "B3"]) assert.match(text, new RegExp(name), `${name} among the notes`);
    await page.goBack();
    await page.getByRole("heading", { name: "Upload takes" }).waitFor();
  }],
  ["the take page shows the triad's notes", async () => {
    await page.getByRole("table", { name: "Takes in this project" }).getByRole("link", { name: "triad-c-major" }).click();
    await page.getByRole("heading", { name: "triad-c-major" }).waitFor();
    await page.locator('[data-testid="analysis-status"][data-state="ready"]').waitFor();
    const notes = page.getByRole("table", { name: "Notes of this take" });
    await notes.waitFor();
    const text = await notes.textContent() ?? "";
    for (const name of ["C4", "E4", "G4"]) assert.match(text, new RegExp(name), `${name} among the notes`);
    assert.equal(await page.locator("audio").evaluate((a: HTMLAudioElement) => a.volume), 0.25);
    await shot(page, "12-take-page");
  }],
  ["the re-analyse form shows field errors next to the fields", async () => {
    await page.fill("#s-hop", "500");
    await page.getByRole("button", { name: "Re-analyse" }).click();
    await page.locator("#s-hop-error").waitFor();
    await page.locator("#s-hop-error").scrollIntoViewIfNeeded();
    await shot(page, "13-reanalyse-errors");
  }],
  ["re-analyse with another taper and reference pitch; the earlier analysis is kept", async () => {
    await page.fill("#s-hop", "10");
    await page.selectOption("#s-taper", "blackman-harris");
    await page.selectOption("#s-reference", "442");
    await page.getByRole("button", { name: "Re-analyse" }).click();
    const outcome = page.getByText("A new analysis is queued").or(page.locator('form[aria-label="Re-analyse with other settings"] [role="alert"]'));
    await outcome.first().waitFor();
    assert.match(await outcome.first().textContent() ?? "", /A new analysis is queued/);
    const analyses = page.getByRole("table", { name: "Analyses of this take" });
    await analyses.locator("tbody tr").nth(1).waitFor();
    await page.locator('[data-testid="analysis-status"][data-state="ready"]', { hasText: "Blackman–Harris" }).waitFor({ timeout: 120_000 });
    await page.getByText("A4 = 442.0 Hz").waitFor();
    assert.equal(await analyses.locator("tbody tr").count(), 2);
    await shot(page, "14-reanalysed");
  }],
  ["delete the take for good from its page", async () => {
    await page.getByRole("button", { name: "Delete take" }).click();
    await page.getByText("will be deleted for good").waitFor();
    await page.waitForTimeout(300); // let the dialog finish fading in
    await shot(page, "15-delete-take");
    await page.getByRole("button", { name: "Delete for good" }).click();
    await page.waitForURL((url) => /\/projects\/[^/]+$/.test(url.pathname));
    await page.getByRole("table", { name: "Takes in this project" }).getByRole("link", { name: "g3-b3-stereo" }).waitFor();
    assert.equal(await page.getByRole("link", { name: "triad-c-major" }).count(), 0);
  }],
  ["an API key is shown once", async () => {
    await page.getByRole("link", { name: "API keys" }).click();
    await page.getByRole("heading", { name: "API keys" }).waitFor();
    await page.getByRole("button", { name: "New API key" }).first().click();
    const roles = await page.locator("#api-key-role option").allTextContents();
    assert.ok(!roles.some((r) => /^Owner/.test(r)), "an editor cannot make an owner key");
    await page.fill("#api-key-name", "Nightly export script");
    await page.getByRole("button", { name: "Create key" }).click();
    const key = await page.getByTestId("new-api-key").inputValue();
    await page.waitForTimeout(300); // let the dialog finish fading in
    assert.match(key, /^tn_/);
    await shot(page, "16-api-key-once");
    await page.getByRole("button", { name: "I have saved the key" }).click();
    await page.getByRole("row", { name: /Nightly export script/ }).waitFor();
    assert.ok(!(await page.textContent("body"))?.includes(key), "the key is not shown again");
    await shot(page, "17-api-keys");
  }],
  ["a listener sees the takes without upload or delete", async () => {
    await switchTo("listener@example.com");
    await page.getByRole("link", { name: "Grade 3 chord exercises" }).click();
    await page.getByRole("table", { name: "Takes in this project" }).getByRole("link", { name: "g3-b3-stereo" }).waitFor();
    assert.equal(await page.getByRole("heading", { name: "Upload takes" }).count(), 0);
    assert.equal(await page.getByRole("button", { name: /^Delete/ }).count(), 0);
    await shot(page, "18-listener-project");
    await page.getByRole("link", { name: "API keys" }).click();
    await page.getByText("Only owners and editors manage API keys.").waitFor();
    assert.equal(await page.getByRole("button", { name: "New API key" }).count(), 0);
  }],
  ["the owner buys a 25-pack through the test checkout; the balance rises by 25", async () => {
    await switchTo("owner@example.com");
    await page.getByRole("link", { name: "Billing" }).click();
    const balance = page.getByTestId("balance");
    await balance.filter({ hasText: /\d/ }).waitFor();
    const before = Number(await balance.textContent());
    await shot(page, "19-billing");
    await page.getByRole("button", { name: "Buy 25 credits" }).click();
    await page.getByLabel("Card number").waitFor();
    await shot(page, "20-test-checkout");
    await page.fill("#card", "4242 4242 4242 4242");
    await page.getByRole("button", { name: /^Pay/ }).click();
    await page.waitForURL(/\/billing\?checkout=success/);
    await balance.filter({ hasText: String(before + 25) }).waitFor({ timeout: 15_000 });
    await shot(page, "21-billing-credited");
    expectedBalance = before + 25;
  }],
  ["the receipt is in the mailbox page", async () => {
    await page.goto(`${app.baseUrl}/dev/mailbox`);
    await page.locator('[data-testid="mail"]', { hasText: "Your Tapernote receipt: 25 export credits" }).first().waitFor();
  }],
  ["an editor exports a MIDI file; the balance falls by one", async () => {
    await page.goto(`${app.baseUrl}/projects`);
    await switchTo("editor@example.com");
    await page.getByRole("link", { name: "Grade 3 chord exercises" }).click();
    await page.getByRole("link", { name: /Chord exercise in C/ }).click();
    await page.getByRole("button", { name: "Export…" }).click({ timeout: 120_000 });
    await page.getByLabel(/Carry each note/).check();
    await shot(page, "22-export-dialog");
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "Export", exact: true }).click()]);
    assert.match(download.suggestedFilename(), /\.mid$/);
    const bytes = readFileSync((await download.path())!);
    assert.equal(bytes.subarray(0, 4).toString("latin1"), "MThd");
    await page.getByText(/^Downloaded /).waitFor();
    await page.goto(`${app.baseUrl}/billing`);
    await page.getByTestId("balance").filter({ hasText: String(expectedBalance - 1) }).waitFor();
    await shot(page, "23-billing-after-export");
  }],
  ...teachingSteps({ page, baseUrl: app.baseUrl, shot }),
  ...editorSteps({ page, baseUrl: app.baseUrl, shot }),
  ...playbackSteps({ page, baseUrl: app.baseUrl, shot }),
  ["no CSP violations or page errors", async () => {
    assert.deepEqual(errors.filter((e) => !/favicon/.test(e)), []);
  }],
]);

await browser.close();
await app.stop();
rmSync(filesDir, { recursive: true, force: true });
process.exit(failures ? 1 : 0);
