/**
 * `npm run bench:editor`: how fast the take page's piano roll is with a big take, in headless
 * Chromium against the real app (started by the run command on free ports, throw-away data).
 *
 * Set-up: a 10-minute take (a quiet generated WAV, uploaded through the API) whose notes are
 * replaced by a revision of 5 000 notes (seeded, 4 voices, MIDI 36–96, spread over the take).
 * Then, on the take page:
 *   - first paint: from the start of navigation, and from the roll's mount, until the roll has
 *     drawn the notes (the roll's probe `window.__tapernoteRollStats`, see PianoRoll.tsx). The
 *     target's three loads each start from a blank tab, as when a take is opened afresh; three
 *     reloads follow, each started as soon as the previous load drew its notes, so they also pay
 *     for that load's leftovers (its recording still loading and decoding, its spectrogram being
 *     made, the cards below its roll rendering): printed beside, not held to the target;
 *   - pan and zoom: wheel events over the roll (Shift+wheel pans, Ctrl+wheel zooms), one per
 *     animation frame; the roll's own draw time per frame (median, p95) and the interval
 *     between animation frames while it happens (median → frames per second).
 * Prints the figures with the targets (first paint < 1 s, median frame < 16 ms); not a test.
 */
import { openBrowser, startApp } from "../tests/e2e/harness";
import { toneWav } from "../tests/support/audio";
import { rng } from "../tests/support/random";

const NOTES = 5000;
const DURATION_SEC = 600;
const PAN_STEPS = 240;
const ZOOM_STEPS = 120;

type RollStats = { mountMs: number | null; firstNotesPaintMs: number | null; drawMs: number[] };
declare global {
  interface Window {
    __tapernoteRollStats?: RollStats;
  }
}

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))]! : NaN;
};

function bigTake(): { onsetSec: number; offsetSec: number; pitch: number; cents: number; velocity: number; voice: number }[] {
  const random = rng(5000);
  const notes = [];
  for (let i = 0; i < NOTES; i++) {
    const onsetSec = (i / NOTES) * (DURATION_SEC - 2) + random() * 0.1;
    notes.push({
      onsetSec: Math.round(onsetSec * 1000) / 1000,
      offsetSec: Math.round((onsetSec + 0.15 + random() * 1.2) * 1000) / 1000,
      pitch: 36 + Math.floor(random() * 61),
      cents: Math.round((random() - 0.5) * 40 * 10) / 10,
      velocity: 40 + Math.floor(random() * 80),
      voice: 1 + (i % 4),
    });
  }
  return notes;
}

async function main() {
  const app = await startApp({ AUTH_RATE_LIMIT_MAX: "100000" });
  const browser = await openBrowser();
  try {
    const { page } = browser;
    const base = app.baseUrl;
    // sign in through the form, so the browser has the session; the API calls reuse its cookies
    await page.goto(`${base}/sign-in`);
    await page.fill("#email", "editor@example.com");
    await page.fill("#password", "tapernote-demo");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(/\/projects/);
    const api = page.context().request;

    const project = (await (await api.post(`${base}/api/v1/projects`, { data: { name: "Editor bench" }, headers: { origin: base } })).json()) as {
      project: { id: string };
    };
    const wav = toneWav({ freqsHz: [220], durationSec: DURATION_SEC, sampleRateHz: 16000, partials: 3 });
    const upload = await api.post(`${base}/api/v1/projects/${project.project.id}/takes`, {
      headers: { origin: base },
      multipart: { file: { name: "bench-10-minutes.wav", mimeType: "audio/wav", buffer: Buffer.from(wav) }, name: "Ten minutes, 5 000 notes" },
    });
    if (upload.status() !== 201) throw new Error(`upload answered ${upload.status()}: ${await upload.text()}`);
    const { take } = (await upload.json()) as { take: { id: string } };
    for (const started = Date.now(); ; ) {
      const t = (await (await api.get(`${base}/api/v1/takes/${take.id}`)).json()) as { analysis: { state: string } | null };
      if (t.analysis?.state === "ready") break;
      if (t.analysis?.state === "failed" || Date.now() - started > 10 * 60_000) throw new Error(`analysis ${t.analysis?.state ?? "missing"}`);
      await new Promise((r) => setTimeout(r, 1000));
    }
    const current = (await (await api.get(`${base}/api/v1/takes/${take.id}/notes`)).json()) as { revision?: number };
    const put = await api.put(`${base}/api/v1/takes/${take.id}/notes`, {
      headers: { origin: base },
      data: { baseRevision: current.revision ?? 0, notes: bigTake() },
    });
    if (put.status() !== 201) throw new Error(`saving the 5 000 notes answered ${put.status()}: ${await put.text()}`);

    const url = `${base}/projects/${project.project.id}/takes/${take.id}`;
    type FirstPaint = { fromNavigationMs: number; fromMountMs: number; mountMs: number; responseEndMs: number; domContentLoadedMs: number };
    const load = async (): Promise<FirstPaint> => {
      await page.goto(url);
      await page.waitForFunction(() => window.__tapernoteRollStats?.firstNotesPaintMs != null, null, { timeout: 60_000 });
      const s = (await page.evaluate(() => window.__tapernoteRollStats))!;
      const nav = await page.evaluate(() => {
        const n = performance.getEntriesByType("navigation")[0] as PerformanceNavigationTiming;
        return { responseEndMs: n.responseEnd, domContentLoadedMs: n.domContentLoadedEventEnd };
      });
      return { fromNavigationMs: s.firstNotesPaintMs!, fromMountMs: s.firstNotesPaintMs! - (s.mountMs ?? 0), mountMs: s.mountMs ?? NaN, ...nav };
    };
    // opened afresh (the target), then reloaded at once, while the previous load still works
    const firstPaints: FirstPaint[] = [];
    for (let run = 0; run < 3; run++) {
      await page.goto("about:blank");
      firstPaints.push(await load());
    }
    const reloads: FirstPaint[] = [];
    for (let run = 0; run < 3; run++) reloads.push(await load());

    // pan and zoom over the middle of the roll, one wheel event per animation frame
    const roll = page.getByTestId("piano-roll");
    await roll.scrollIntoViewIfNeeded();
    const box = (await roll.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.5);
    // a string, not a function: tsx would wrap named inner functions in a helper the page lacks
    await page.evaluate(`(() => {
      window.__tapernoteRollStats.drawMs.length = 0;
      window.__frameGaps = [];
      window.__frameRun = true;
      let last = performance.now();
      const tick = (t) => {
        window.__frameGaps.push(t - last);
        last = t;
        if (window.__frameRun) requestAnimationFrame(tick);
      };
      requestAnimationFrame(tick);
    })()`);
    const oneFrame = () => page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r(null))));
    await page.keyboard.down("Control");
    for (let i = 0; i < ZOOM_STEPS; i++) {
      await page.mouse.wheel(0, i < ZOOM_STEPS / 2 ? -60 : 60);
      await oneFrame();
    }
    await page.keyboard.up("Control");
    await page.keyboard.down("Shift");
    for (let i = 0; i < PAN_STEPS; i++) {
      await page.mouse.wheel(0, i < PAN_STEPS / 2 ? 80 : -80);
      await oneFrame();
    }
    await page.keyboard.up("Shift");
    const { drawMs, gaps } = await page.evaluate(() => {
      const w = window as unknown as { __frameGaps: number[]; __frameRun: boolean };
      w.__frameRun = false;
      return { drawMs: [...window.__tapernoteRollStats!.drawMs], gaps: w.__frameGaps.slice(1) };
    });

    const nav = firstPaints.map((f) => f.fromNavigationMs);
    const renav = reloads.map((f) => f.fromNavigationMs);
    const mount = firstPaints.map((f) => f.fromMountMs);
    console.log(`piano roll, ${NOTES} notes on a ${DURATION_SEC / 60}-minute take, headless Chromium (${firstPaints.length} loads)`);
    console.log(`  first paint from navigation: median ${pct(nav, 50).toFixed(0)} ms (runs ${nav.map((x) => x.toFixed(0)).join(", ")}) — target < 1000 ms`);
    console.log(`  first paint from the roll's mount: median ${pct(mount, 50).toFixed(0)} ms`);
    console.log(`  reloaded at once, while the previous load still decodes and renders: median ${pct(renav, 50).toFixed(0)} ms (runs ${renav.map((x) => x.toFixed(0)).join(", ")})`);
    console.log(
      `  on the way (medians from navigation): page answered ${pct(firstPaints.map((f) => f.responseEndMs), 50).toFixed(0)} ms, DOM ready ${pct(firstPaints.map((f) => f.domContentLoadedMs), 50).toFixed(0)} ms, roll mounted ${pct(firstPaints.map((f) => f.mountMs), 50).toFixed(0)} ms`,
    );
    console.log(`  pan/zoom: ${drawMs.length} frames drawn; draw time median ${pct(drawMs, 50).toFixed(2)} ms, p95 ${pct(drawMs, 95).toFixed(2)} ms, max ${Math.max(...drawMs).toFixed(2)} ms — target median < 16 ms`);
    console.log(`  animation-frame interval while panning/zooming: median ${pct(gaps, 50).toFixed(1)} ms (${(1000 / pct(gaps, 50)).toFixed(0)} fps), p95 ${pct(gaps, 95).toFixed(1)} ms`);
  } finally {
    await browser.close();
    await app.stop();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
