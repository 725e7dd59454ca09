/**
 * Intonation and teaching through the real handlers, on audio rendered from real sampled
 * instruments (FluidSynth + FluidR3 GM; tests/fixtures/engine, written by `npm run fixtures`
 * with their ground truth): reference pitch, detuned voices, assignments, comments, share links.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import m from "@tonejs/midi";
import wf from "wavefile";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, cookiesFrom, signUpVerified, startTestApp, waitForMail, type TestApp } from "../support/app";
import { uploadForm } from "../support/audio";
import { claimNext, completeAnalysis } from "@/db/analyses";
import { shareLink } from "@/db/schema";
import { decodeAudio, transcribe } from "@/lib/engine";
import { readStored } from "@/lib/storage/files";

const { Midi } = m;
const { WaveFile } = wf;
const FIXTURES = path.join(process.cwd(), "tests", "fixtures", "engine");
let app: TestApp;
let teacher = "";
let student = "";
let projectId = "";

async function runQueuedJobs() {
  for (;;) {
    const job = await claimNext("test-worker", 60_000);
    if (!job) return;
    const audio = await decodeAudio(await readStored(job.analysisKey));
    await completeAnalysis(job.id, "test-worker", await transcribe(audio.samples, audio.sampleRateHz, job.settings));
  }
}

async function uploadFixture(name: string): Promise<string> {
  const res = await call("POST", `/api/v1/projects/${projectId}/takes`, { cookie: teacher, rawBody: uploadForm({ file: readFileSync(path.join(FIXTURES, `${name}.wav`)), name }) });
  expect(res.status).toBe(201);
  return (await res.json()).take.id;
}

type Truth = { a4Hz: number; notes: { onsetSec: number; offsetSec: number; pitch: number; cents: number; voice: number }[] };
const truth = (name: string): Truth => JSON.parse(readFileSync(path.join(FIXTURES, `${name}.json`), "utf8"));

beforeAll(async () => {
  app = await startTestApp();
  teacher = await signUpVerified("ilse@example.org", "Ilse Marten");
  projectId = (await (await call("POST", "/api/v1/projects", { cookie: teacher, body: { name: "Intonation" } })).json()).project.id;
  student = await signUpVerified("kai@example.org", "Kai");
  await call("POST", "/api/v1/invitations", { cookie: teacher, body: { email: "kai@example.org", role: "listener" } });
  const mail = await waitForMail("kai@example.org", "Invitation");
  const token = decodeURIComponent(mail.text.match(/invitations\/(\S+)/)![1]!);
  student = cookiesFrom(await call("POST", "/api/v1/invitations/accept", { cookie: student, body: { token } }), student);
}, 60_000);
afterAll(async () => app.close());

describe("tuning report on rendered takes", () => {
  // The FluidR3 GM samples themselves sit a few cents off their nominal pitch (../shared/eval/
  // README.md, "Intonation ground truth"), the same in every render. So each take is judged
  // against a render of the same notes at A4 = 440 Hz without bends: for the reference pitch,
  // the shift FluidSynth really rendered, measured without the engine by scripts/render-shift.py
  // (numpy FFT cross-correlation against the 440 render: +7.00 c for 442 Hz, whose nominal
  // +7.85 c comes out in whole cents: FluidSynth quantises pitch so, ../shared/eval/README.md;
  // −101.12 c for 415 Hz). A take at 415 Hz is a
  // semitone below 440 within 1.3 c and cannot be told from a flat 440 take by its sound alone:
  // the estimate is compared modulo a semitone (the teacher sets 415 for a baroque-pitch take).
  const RENDERED_SHIFT_CENTS: Record<string, number> = { a442: 7.0, a415: -101.12 };
  const reportOf = async (name: string, query = "") => {
    const takeId = await uploadFixture(name);
    await runQueuedJobs();
    return (await call("GET", `/api/v1/takes/${takeId}/tuning-report${query}`, { cookie: student })).json();
  };

  it("estimates the reference pitch of takes tuned to A4 = 442 and 415 Hz within ±1 cent", async () => {
    const base = await reportOf("a440");
    const baseCents = 1200 * Math.log2(base.estimatedReferenceHz / 440);
    expect(Math.abs(baseCents)).toBeLessThan(3); // the sound set itself, a few cents from 440
    for (const name of ["a442", "a415"]) {
      const report = await reportOf(name);
      const rawCents = 1200 * Math.log2(report.estimatedReferenceHz / 440) - baseCents - RENDERED_SHIFT_CENTS[name]!;
      const errCents = rawCents - 100 * Math.round(rawCents / 100);
      expect(Math.abs(errCents), `${name}: estimated ${report.estimatedReferenceHz} Hz`).toBeLessThanOrEqual(1);
      // the nominal tuning too, within the sound set's few cents and FluidSynth's whole-cent bend
      const nominal = 1200 * Math.log2(report.estimatedReferenceHz / truth(name).a4Hz);
      expect(Math.abs(nominal - 100 * Math.round(nominal / 100))).toBeLessThanOrEqual(2.5);
      // measured at its own reference, the take is in tune: REFERENCES.md §4 (442 Hz = +7.85 c)
      expect(report.referenceOffsetCents).toBeCloseTo(1200 * Math.log2(report.referenceHz / 440), 2);
      expect(Math.abs(report.summary.tendencyCents)).toBeLessThan(5);
    }
  });

  it("reports voices detuned by known pitch bends within ±2 cents of the truth", async () => {
    // the truth of each note: its bend on top of the same note rendered without a bend
    const plain = await reportOf("dyads", "?referenceHz=440");
    const report = await reportOf("mistuned", "?referenceHz=440");
    const t = truth("mistuned");
    type Row = { pitch: number; onsetSec: number; centsEqual: number };
    const at = (rows: Row[], n: { pitch: number; onsetSec: number }) => rows.find((r) => r.pitch === n.pitch && Math.abs(r.onsetSec - n.onsetSec) < 0.1);
    let compared = 0;
    for (const expected of t.notes) {
      const found = at(report.notes, expected);
      const own = at(plain.notes, expected);
      if (!found || !own) continue;
      compared++;
      expect(Math.abs(found.centsEqual - (own.centsEqual + expected.cents)), `pitch ${expected.pitch} bent ${expected.cents} c`).toBeLessThanOrEqual(2);
      // and against the bend alone, with the samples' own few cents
      expect(Math.abs(found.centsEqual - expected.cents)).toBeLessThanOrEqual(3);
    }
    expect(compared).toBeGreaterThanOrEqual(t.notes.length - 1);
  });

  it("checks the reference pitch a teacher sets", async () => {
    const takeId = await uploadFixture("triads");
    await runQueuedJobs();
    expect((await call("GET", `/api/v1/takes/${takeId}/tuning-report?referenceHz=9000`, { cookie: teacher })).status).toBe(422);
    const at442 = await (await call("GET", `/api/v1/takes/${takeId}/tuning-report?referenceHz=442`, { cookie: teacher })).json();
    expect(at442.referenceHz).toBe(442);
    expect(at442.referenceOffsetCents).toBeCloseTo(7.85, 2); // REFERENCES.md §4
  });
});

describe("assignments", () => {
  it("a take played 10 % slower and 2 s late still matches; a wrong note is off-pitch, a left-out one missed", async () => {
    // The played take: the rendered triads with 2 s of silence in front.
    const audio = await decodeAudio(readFileSync(path.join(FIXTURES, "triads.wav")));
    const padded = new Float32Array(audio.samples.length + 2 * audio.sampleRateHz);
    padded.set(audio.samples, 2 * audio.sampleRateHz);
    const wav = new WaveFile();
    wav.fromScratch(1, audio.sampleRateHz, "32f", padded);
    const up = await call("POST", `/api/v1/projects/${projectId}/takes`, { cookie: teacher, rawBody: uploadForm({ file: wav.toBuffer(), name: "late and slow" }) });
    const takeId = (await up.json()).take.id;
    await runQueuedJobs();
    const played = (await (await call("GET", `/api/v1/takes/${takeId}/notes`, { cookie: teacher })).json()).notes as { onsetSec: number; offsetSec: number; pitch: number }[];
    expect(played.length).toBeGreaterThan(6);
    // The assignment: what was played, 10 % faster and 2 s earlier (so the take is 10 % slower and
    // 2 s late), with one note left out of it (→ extra), one a semitone off (→ off-pitch) and one
    // the take never plays (→ missed); written as a MIDI file.
    const toAssignment = (sec: number) => (sec - 2) / 1.1;
    const midi = new Midi();
    const track = midi.addTrack();
    const leftOut = 3;
    const wrong = 0;
    played.forEach((n, i) => {
      if (i === leftOut) return;
      track.addNote({ midi: i === wrong ? n.pitch + 1 : n.pitch, time: Math.max(0, toAssignment(n.onsetSec)), duration: (n.offsetSec - n.onsetSec) / 1.1, velocity: 0.7 });
    });
    track.addNote({ midi: 96, time: toAssignment(played[played.length - 1]!.offsetSec) + 0.5, duration: 0.4, velocity: 0.7 });
    const form = new FormData();
    form.set("file", new File([midi.toArray() as BlobPart], "exercise.mid"));
    const put = await call("PUT", `/api/v1/takes/${takeId}/assignment`, { cookie: teacher, rawBody: form });
    expect(put.status, await put.clone().text()).toBe(201);
    const { result } = await (await call("GET", `/api/v1/takes/${takeId}/assignment`, { cookie: student })).json();
    type R = { pitch: number; onsetSec: number; result: string };
    expect(result.expected.find((e: R) => e.pitch === 96).result).toBe("missed");
    expect(result.expected.find((e: R) => e.pitch === played[wrong]!.pitch + 1 && Math.abs(e.onsetSec - toAssignment(played[wrong]!.onsetSec)) < 0.05).result).toBe("off-pitch");
    const leftOutNote = result.played.find((p: R) => Math.abs(p.onsetSec - played[leftOut]!.onsetSec) < 1e-6 && p.pitch === played[leftOut]!.pitch);
    expect(leftOutNote.result).toBe("extra");
    const rest = result.expected.filter((e: R) => e.pitch !== 96 && !(e.pitch === played[wrong]!.pitch + 1 && Math.abs(e.onsetSec - toAssignment(played[wrong]!.onsetSec)) < 0.05));
    const matched = rest.filter((e: R) => e.result === "matched").length;
    expect(matched / rest.length).toBeGreaterThanOrEqual(0.95);
    expect(result.tempoRatio).toBeCloseTo(1.1, 1);
    expect(result.offsetSec).toBeCloseTo(2, 0);
  });

  it("a file that is neither MIDI nor MusicXML is 415; listeners cannot set assignments", async () => {
    const takeId = await uploadFixture("single");
    const form = new FormData();
    form.set("file", new File(["just some words"], "exercise.mid"));
    expect((await call("PUT", `/api/v1/takes/${takeId}/assignment`, { cookie: teacher, rawBody: form })).status).toBe(415);
    expect((await call("PUT", `/api/v1/takes/${takeId}/assignment`, { cookie: student, body: { fromTakeId: takeId } })).status).toBe(403);
    expect((await call("GET", `/api/v1/takes/${takeId}/assignment`, { cookie: teacher })).status).toBe(404);
  });
});

describe("comments and share links", () => {
  let takeId = "";
  it("teachers comment on a note, listeners are e-mailed and reply, but cannot start a thread", async () => {
    takeId = await uploadFixture("repeated");
    await runQueuedJobs();
    const res = await call("POST", `/api/v1/takes/${takeId}/comments`, {
      cookie: teacher,
      body: { body: "Listen to the third G: it is rushed.", target: { kind: "note", noteIndex: 2, onsetSec: 0.8, pitch: 67 } },
    });
    expect(res.status).toBe(201);
    const { comment } = await res.json();
    const notice = await waitForMail("kai@example.org", "New comment");
    expect(notice.text).toContain("it is rushed");
    expect((await call("POST", `/api/v1/takes/${takeId}/comments`, { cookie: student, body: { body: "A new thread" } })).status).toBe(403);
    const reply = await call("POST", `/api/v1/takes/${takeId}/comments`, { cookie: student, body: { body: "I will slow down.", parentId: comment.id } });
    expect(reply.status).toBe(201);
    const list = (await (await call("GET", `/api/v1/takes/${takeId}/comments`, { cookie: student })).json()).comments;
    expect(list.map((c: { body: string; parentId: string | null }) => [c.body, c.parentId])).toEqual([
      ["Listen to the third G: it is rushed.", null],
      ["I will slow down.", comment.id],
    ]);
    expect(list[0].target).toMatchObject({ kind: "note", pitch: 67 });
    expect((await call("POST", `/api/v1/takes/${takeId}/comments`, { cookie: teacher, body: { body: "" } })).status).toBe(422);
  });

  it("a share link opens one take without an account; expired or revoked links are 404", async () => {
    const created = await (await call("POST", `/api/v1/takes/${takeId}/share-links`, { cookie: teacher, body: { expiresInDays: 7 } })).json();
    const token = created.url.split("/share/")[1];
    const open = await call("GET", `/api/v1/shared/${token}`);
    expect(open.status).toBe(200);
    const shared = await open.json();
    expect(shared.take.name).toBe("repeated");
    expect(shared.comments).toHaveLength(2);
    expect(JSON.stringify(shared)).not.toMatch(/ilse@example|kai@example|authorUserId/);
    expect((await call("GET", `/api/v1/shared/${token}/audio`, { headers: { range: "bytes=0-3" } })).status).toBe(206);
    // the token opens its own take only: no route takes a take id next to it
    expect((await call("GET", `/api/v1/takes/${takeId}`, { headers: { authorization: `Bearer ${token}` } })).status).toBe(401);
    // listeners cannot make links
    expect((await call("POST", `/api/v1/takes/${takeId}/share-links`, { cookie: student, body: {} })).status).toBe(403);

    await app.db.update(shareLink).set({ expiresAt: new Date(Date.now() - 1000) }).where(sql`1 = 1`);
    expect((await call("GET", `/api/v1/shared/${token}`)).status).toBe(404);

    const second = await (await call("POST", `/api/v1/takes/${takeId}/share-links`, { cookie: teacher, body: { expiresInDays: 1 } })).json();
    const token2 = second.url.split("/share/")[1];
    expect((await call("GET", `/api/v1/shared/${token2}`)).status).toBe(200);
    expect((await call("DELETE", `/api/v1/share-links/${second.shareLink.id}`, { cookie: teacher })).status).toBe(204);
    expect((await call("GET", `/api/v1/shared/${token2}`)).status).toBe(404);
    expect((await call("GET", `/api/v1/shared/${token2}/audio`)).status).toBe(404);
    expect((await call("GET", "/api/v1/shared/not-a-real-token-at-all-000000")).status).toBe(404);
  });
});
