/**
 * `npm run load`: a bounded load test on loopback only. Starts the app with the run command
 * on free ports (throw-away data), then at once
 *   - 20 concurrent uploads of a 30-second take through the API (with an API key), and
 *   - 200 concurrent readers of a ready take's notes while the uploaded takes are analysed:
 *     each on its own keep-alive connection, reading once a second (as the take page polls
 *     while an analysis runs) at its own random phase, so the reads arrive spread over the
 *     second as real readers' do (autocannon's overallRate lets them out together, once a
 *     second, and would measure its own burst);
 * (after a 5-second warm-up of the same reads, not measured), and waits (bounded) until every
 * uploaded take is `ready` with notes. Then, with the jobs
 * done, the same 200 connections read as fast as they can (each sends its next request when
 * the answer arrives) for the most reads a second this machine serves; in that closed loop the
 * latency is 200 / throughput by Little's law, so it is reported, not held to the target.
 * Prints p50/p95 latencies, errors and whether any job was lost. Exits non-zero if a target
 * (reads p95 < 50 ms while jobs run, no errors, no job lost) is missed.
 */
import { Worker } from "node:worker_threads";
import autocannon from "autocannon";
import { startApp } from "../tests/e2e/harness";
import { toneWav } from "../tests/support/audio";

const UPLOADS = 20;
const READ_CONNECTIONS = 200;
const READ_SECONDS = 20;
const WARM_UP_SECONDS = 5;
const P95_TARGET_MS = 50;
const DEADLINE_MS = 15 * 60 * 1000;

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))] ?? NaN;
};

/**
 * `readers` readers, each on its own keep-alive connection, each reading `url` once a second at
 * a random phase; a reader whose answer is late sends its next read at once. They first read
 * for `warmUpSeconds` unmeasured (a fresh server loads its route code on the first requests,
 * and the readers open their connections, as a page's polling has long done when an upload
 * arrives), then say so and read `seconds` more, measured.
 * They run in a worker thread of their own, so the uploads' client-side work (building 20
 * multipart bodies of 1.3 MB in this thread) never delays a reader's clock; the thread's own
 * event-loop delay is reported beside the figures, so a late client shows as such.
 * (Plain JavaScript: worker threads do not inherit tsx's hooks on Node.js 20.)
 */
const READER_THREAD = `
const http = require("node:http");
const { parentPort, workerData } = require("node:worker_threads");
const { monitorEventLoopDelay } = require("node:perf_hooks");
const { url, headers, readers, warmUpSeconds, seconds } = workerData;
const result = { latenciesMs: [], errors: 0, timeouts: 0, non2xx: 0, loopDelayP99Ms: 0, loopDelayMaxMs: 0 };
const loop = monitorEventLoopDelay({ resolution: 5 });
const measureFrom = performance.now() + warmUpSeconds * 1000;
const endAt = measureFrom + seconds * 1000;
setTimeout(() => {
  loop.enable();
  parentPort.postMessage({ type: "measuring" });
}, warmUpSeconds * 1000);
const get = (agent) =>
  new Promise((resolve) => {
    const t0 = performance.now();
    const measured = t0 >= measureFrom;
    const req = http.get(url, { agent, headers, timeout: 10000 }, (res) => {
      res.resume();
      res.on("end", () => {
        if (measured) {
          result.latenciesMs.push(performance.now() - t0);
          if ((res.statusCode || 0) >= 300) result.non2xx++;
        }
        resolve();
      });
    });
    req.on("timeout", () => {
      if (measured) result.timeouts++;
      req.destroy();
    });
    req.on("error", () => {
      if (measured) result.errors++;
      resolve();
    });
  });
Promise.all(
  Array.from({ length: readers }, async () => {
    const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    let next = performance.now() + Math.random() * 1000;
    while (next < endAt) {
      const wait = next - performance.now();
      if (wait > 0) await new Promise((r) => setTimeout(r, wait));
      await get(agent);
      next += 1000;
    }
    agent.destroy();
  }),
).then(() => {
  loop.disable();
  result.loopDelayP99Ms = loop.percentile(99) / 1e6;
  result.loopDelayMaxMs = loop.max / 1e6;
  parentPort.postMessage({ type: "done", result });
});
`;

type ReadResult = { latenciesMs: number[]; errors: number; timeouts: number; non2xx: number; loopDelayP99Ms: number; loopDelayMaxMs: number };

/** Starts the readers; `measuring` resolves when the warm-up is over, `done` with the measured reads. */
function readAtRate(url: string, headers: Record<string, string>, readers: number, warmUpSeconds: number, seconds: number) {
  const worker = new Worker(READER_THREAD, { eval: true, workerData: { url, headers, readers, warmUpSeconds, seconds } });
  let measuringNow!: () => void;
  const measuring = new Promise<void>((resolve) => (measuringNow = resolve));
  const done = new Promise<ReadResult>((resolve, reject) => {
    worker.on("message", (m: { type: "measuring" } | { type: "done"; result: ReadResult }) => {
      if (m.type === "measuring") measuringNow();
      else {
        resolve(m.result);
        void worker.terminate();
      }
    });
    worker.once("error", reject);
  });
  return { measuring, done };
}

async function main() {
  const started = Date.now();
  const app = await startApp({ AUTH_RATE_LIMIT_MAX: "100000" });
  // 127.0.0.1, not localhost: resolving "localhost" for each of 200 new connections cost the
  // load's client seconds of its own (seen here), which is not the server's answer time
  const base = app.baseUrl.replace("//localhost", "//127.0.0.1");
  try {
    const signIn = await fetch(`${base}/api/auth/sign-in/email`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: app.baseUrl },
      body: JSON.stringify({ email: "editor@example.com", password: "tapernote-demo" }),
    });
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const keyRes = await fetch(`${base}/api/v1/api-keys`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie, origin: app.baseUrl },
      body: JSON.stringify({ name: "Load test", role: "editor" }),
    });
    const { key } = (await keyRes.json()) as { key: string };
    const auth = { authorization: `Bearer ${key}` };
    const { projects } = (await (await fetch(`${base}/api/v1/projects`, { headers: auth })).json()) as { projects: { id: string; name: string }[] };
    const projectId = projects.find((p) => p.name === "Grade 3 chord exercises")!.id;

    // a take that is ready before the load starts, for the reads: the demo takes are analysed on first start
    let readTakeId = "";
    while (!readTakeId) {
      const { takes } = (await (await fetch(`${base}/api/v1/projects/${projectId}/takes`, { headers: auth })).json()) as {
        takes: { id: string; analysis: { state: string } | null }[];
      };
      readTakeId = takes.find((t) => t.analysis?.state === "ready")?.id ?? "";
      if (!readTakeId) await new Promise((r) => setTimeout(r, 500));
      if (Date.now() - started > DEADLINE_MS) throw new Error("no demo take became ready");
    }

    // the readers start with a warm-up, not measured: a fresh server loads and compiles its route
    // code on the first requests (200 first requests at once took up to 7 s), and 200 new
    // connections at once queue for the server; readers of a running server see neither
    const readers = readAtRate(`${base}/api/v1/takes/${readTakeId}/notes`, auth, READ_CONNECTIONS, WARM_UP_SECONDS, READ_SECONDS);
    await readers.measuring;

    const wav = toneWav({ freqsHz: [261.63, 329.63, 392], durationSec: 30, sampleRateHz: 22050 });
    const uploadLatencies: number[] = [];
    let uploadErrors = 0;
    const uploadedIds: string[] = [];
    const uploads = Promise.all(
      Array.from({ length: UPLOADS }, async (_, i) => {
        const form = new FormData();
        form.set("file", new File([wav as BlobPart], `load-${i}.wav`));
        const t0 = performance.now();
        const res = await fetch(`${base}/api/v1/projects/${projectId}/takes`, { method: "POST", headers: auth, body: form });
        uploadLatencies.push(performance.now() - t0);
        if (res.status !== 201) uploadErrors++;
        else uploadedIds.push(((await res.json()) as { take: { id: string } }).take.id);
      }),
    );

    const [readResult] = await Promise.all([readers.done, uploads]);

    // every uploaded take must end ready with notes; none lost
    const states = new Map<string, string>();
    for (;;) {
      for (const id of uploadedIds) {
        const r = (await (await fetch(`${base}/api/v1/takes/${id}`, { headers: auth })).json()) as { analysis: { state: string } | null };
        states.set(id, r.analysis?.state ?? "missing");
      }
      const pending = [...states.values()].filter((s) => s === "queued" || s === "analysing").length;
      if (pending === 0 || Date.now() - started > DEADLINE_MS) break;
      await new Promise((r) => setTimeout(r, 2000));
    }
    // with the jobs done: the most reads a second, closed loop
    const saturation = await autocannon({
      url: `${base}/api/v1/takes/${readTakeId}/notes`,
      headers: auth,
      connections: READ_CONNECTIONS,
      duration: 10,
    });

    let withNotes = 0;
    for (const id of uploadedIds) {
      const res = await fetch(`${base}/api/v1/takes/${id}/notes`, { headers: auth });
      if (res.status === 200 && ((await res.json()) as { notes: unknown[] }).notes.length > 0) withNotes++;
    }

    const ready = [...states.values()].filter((s) => s === "ready").length;
    const readErrors = readResult.errors + readResult.timeouts + readResult.non2xx;
    const readP95Ms = pct(readResult.latenciesMs, 95);
    console.log(`uploads: ${UPLOADS} × 30 s take, concurrent`);
    console.log(`  latency p50 ${pct(uploadLatencies, 50).toFixed(0)} ms, p95 ${pct(uploadLatencies, 95).toFixed(0)} ms, errors ${uploadErrors}`);
    console.log(`note reads while the jobs ran: ${READ_CONNECTIONS} readers × 1 read/s, own connections, random phases, ${READ_SECONDS} s`);
    console.log(
      `  ${readResult.latenciesMs.length} requests, p50 ${pct(readResult.latenciesMs, 50).toFixed(1)} ms, p95 ${readP95Ms.toFixed(1)} ms, p99 ${pct(readResult.latenciesMs, 99).toFixed(1)} ms, max ${Math.max(...readResult.latenciesMs).toFixed(0)} ms; errors ${readErrors} (non-2xx ${readResult.non2xx}, connection ${readResult.errors}, timeouts ${readResult.timeouts})`,
    );
    console.log(`  the readers' own event loop: delay p99 ${readResult.loopDelayP99Ms.toFixed(1)} ms, max ${readResult.loopDelayMaxMs.toFixed(0)} ms`);
    console.log(`most note reads, jobs done: ${READ_CONNECTIONS} connections, closed loop, 10 s`);
    console.log(`  ${saturation.requests.average.toFixed(0)} reads/s, p50 ${saturation.latency.p50} ms, p97.5 ${saturation.latency.p97_5} ms, errors ${saturation.errors + saturation.timeouts + saturation.non2xx}`);
    console.log(`jobs: ${ready}/${UPLOADS} ready, ${withNotes}/${UPLOADS} with notes, lost ${UPLOADS - uploadedIds.length + [...states.values()].filter((s) => s === "missing").length}`);
    console.log(`wall time ${((Date.now() - started) / 1000).toFixed(0)} s`);
    const ok = uploadErrors === 0 && readErrors === 0 && readP95Ms < P95_TARGET_MS && ready === UPLOADS && withNotes === UPLOADS;
    console.log(ok ? "targets met" : `target missed (reads p95 < ${P95_TARGET_MS} ms while jobs run, no errors, every job ready with notes)`);
    if (!ok) process.exitCode = 1;
  } finally {
    await app.stop();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
