/**
 * `npm run load`: a bounded load test on loopback only. Starts the app with the run command
 * on free ports (throw-away data), then at once
 *   - 20 concurrent uploads of a 30-second take through the API (with an API key), and
 *   - 200 concurrent connections reading a ready take's notes with autocannon, while the
 *     uploaded takes are being analysed;
 * and waits (bounded) until every uploaded take is `ready` with notes. Prints p50/p95
 * latencies, errors and whether any job was lost. Exits non-zero if a target is missed.
 */
import autocannon from "autocannon";
import { startApp } from "../tests/e2e/harness";
import { toneWav } from "../tests/support/audio";

const UPLOADS = 20;
const READ_CONNECTIONS = 200;
const READ_SECONDS = 20;
const DEADLINE_MS = 15 * 60 * 1000;

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))] ?? NaN;
};

async function main() {
  const started = Date.now();
  const app = await startApp({ AUTH_RATE_LIMIT_MAX: "100000" });
  try {
    const signIn = await fetch(`${app.baseUrl}/api/auth/sign-in/email`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: app.baseUrl },
      body: JSON.stringify({ email: "editor@example.com", password: "tapernote-demo" }),
    });
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const keyRes = await fetch(`${app.baseUrl}/api/v1/api-keys`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie, origin: app.baseUrl },
      body: JSON.stringify({ name: "Load test", role: "editor" }),
    });
    const { key } = (await keyRes.json()) as { key: string };
    const auth = { authorization: `Bearer ${key}` };
    const { projects } = (await (await fetch(`${app.baseUrl}/api/v1/projects`, { headers: auth })).json()) as { projects: { id: string; name: string }[] };
    const projectId = projects.find((p) => p.name === "Grade 3 chord exercises")!.id;

    // a take that is ready before the load starts, for the reads: the demo takes are analysed on first start
    let readTakeId = "";
    while (!readTakeId) {
      const { takes } = (await (await fetch(`${app.baseUrl}/api/v1/projects/${projectId}/takes`, { headers: auth })).json()) as {
        takes: { id: string; analysis: { state: string } | null }[];
      };
      readTakeId = takes.find((t) => t.analysis?.state === "ready")?.id ?? "";
      if (!readTakeId) await new Promise((r) => setTimeout(r, 500));
      if (Date.now() - started > DEADLINE_MS) throw new Error("no demo take became ready");
    }

    const wav = toneWav({ freqsHz: [261.63, 329.63, 392], durationSec: 30, sampleRateHz: 22050 });
    const uploadLatencies: number[] = [];
    let uploadErrors = 0;
    const uploadedIds: string[] = [];
    const uploads = Promise.all(
      Array.from({ length: UPLOADS }, async (_, i) => {
        const form = new FormData();
        form.set("file", new File([wav as BlobPart], `load-${i}.wav`));
        const t0 = performance.now();
        const res = await fetch(`${app.baseUrl}/api/v1/projects/${projectId}/takes`, { method: "POST", headers: auth, body: form });
        uploadLatencies.push(performance.now() - t0);
        if (res.status !== 201) uploadErrors++;
        else uploadedIds.push(((await res.json()) as { take: { id: string } }).take.id);
      }),
    );

    const reads = autocannon({
      url: `${app.baseUrl}/api/v1/takes/${readTakeId}/notes`,
      headers: auth,
      connections: READ_CONNECTIONS,
      duration: READ_SECONDS,
    });
    const [readResult] = await Promise.all([reads, uploads]);

    // every uploaded take must end ready with notes; none lost
    const states = new Map<string, string>();
    for (;;) {
      for (const id of uploadedIds) {
        const r = (await (await fetch(`${app.baseUrl}/api/v1/takes/${id}`, { headers: auth })).json()) as { analysis: { state: string } | null };
        states.set(id, r.analysis?.state ?? "missing");
      }
      const pending = [...states.values()].filter((s) => s === "queued" || s === "analysing").length;
      if (pending === 0 || Date.now() - started > DEADLINE_MS) break;
      await new Promise((r) => setTimeout(r, 2000));
    }
    let withNotes = 0;
    for (const id of uploadedIds) {
      const res = await fetch(`${app.baseUrl}/api/v1/takes/${id}/notes`, { headers: auth });
      if (res.status === 200 && ((await res.json()) as { notes: unknown[] }).notes.length > 0) withNotes++;
    }

    const ready = [...states.values()].filter((s) => s === "ready").length;
    const readErrors = readResult.errors + readResult.timeouts + readResult.non2xx;
    console.log(`uploads: ${UPLOADS} × 30 s take, concurrent`);
    console.log(`  latency p50 ${pct(uploadLatencies, 50).toFixed(0)} ms, p95 ${pct(uploadLatencies, 95).toFixed(0)} ms, errors ${uploadErrors}`);
    console.log(`note reads: ${READ_CONNECTIONS} connections for ${READ_SECONDS} s while jobs ran (autocannon)`);
    console.log(`  ${readResult.requests.total} requests, p50 ${readResult.latency.p50} ms, p90 ${readResult.latency.p90} ms, p97.5 ${readResult.latency.p97_5} ms (so p95 ≤ that), errors ${readErrors}`);
    console.log(`  status codes: ${JSON.stringify(readResult.statusCodeStats)}; connection errors ${readResult.errors}, timeouts ${readResult.timeouts}, resets ${readResult.resets}`);
    console.log(`jobs: ${ready}/${UPLOADS} ready, ${withNotes}/${UPLOADS} with notes, lost ${UPLOADS - uploadedIds.length + [...states.values()].filter((s) => s === "missing").length}`);
    console.log(`wall time ${((Date.now() - started) / 1000).toFixed(0)} s`);
    const ok = uploadErrors === 0 && readErrors === 0 && ready === UPLOADS && withNotes === UPLOADS;
    if (!ok) process.exitCode = 1;
  } finally {
    await app.stop();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
