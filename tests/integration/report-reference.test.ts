/**
 * The tuning report says where the take's own reference pitch came from: the engine's estimate
 * from the audio, or the value set in the analysis settings (a teacher who knows the ensemble
 * tuned to 442 Hz). A tone generated at the equal-tempered A4 = 440 Hz is analysed both ways.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runQueuedJobs } from "../support/jobs";
import { call, signUpVerified, startTestApp, type TestApp } from "../support/app";
import { toneWav, uploadForm } from "../support/audio";

let app: TestApp;
let cookie = "";
let projectId = "";

beforeAll(async () => {
  app = await startTestApp();
  cookie = await signUpVerified("reference@example.org", "Orla Venn");
  projectId = (await (await call("POST", "/api/v1/projects", { cookie, body: { name: "Reference pitch" } })).json()).project.id;
}, 60_000);
afterAll(async () => app.close());

async function reportFor(settings: object) {
  const wav = toneWav({ freqsHz: [440], durationSec: 2 });
  const form = uploadForm({ file: wav, name: "A4, two seconds", settings: JSON.stringify(settings) });
  const res = await call("POST", `/api/v1/projects/${projectId}/takes`, { cookie, rawBody: form });
  expect(res.status).toBe(201);
  const takeId = (await res.json()).take.id as string;
  await runQueuedJobs();
  const report = await call("GET", `/api/v1/takes/${takeId}/tuning-report`, { cookie });
  expect(report.status).toBe(200);
  return report.json();
}

describe("the tuning report's reference pitch", () => {
  it("is reported as estimated when the analysis estimated it", async () => {
    const report = await reportFor({});
    expect(report.takeReferenceSource).toBe("estimated");
    // 440 Hz is A4 in 12-TET at A4 = 440 (ISO 16:1975): the estimate lands near it
    expect(Math.abs(1200 * Math.log2(report.estimatedReferenceHz / 440))).toBeLessThan(5);
  });

  it("is reported as set when the analysis was given it, with that value", async () => {
    const report = await reportFor({ referenceHz: 442 });
    expect(report.takeReferenceSource).toBe("set");
    expect(report.estimatedReferenceHz).toBe(442);
    expect(report.referenceHz).toBe(442);
  });
});
