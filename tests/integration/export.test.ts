/**
 * Exports through the real handler: the file is checked with an independent MIDI parser
 * (the `midi-file` package) and credits are used in the same transaction as the file.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import midiFile from "midi-file";
import { call, signUpVerified, startTestApp, type TestApp } from "../support/app";
import { toneWav, uploadForm } from "../support/audio";

let app: TestApp;
let owner = "";
let takeId = "";
const NOTES = [
  { onsetSec: 0, offsetSec: 0.5, pitch: 60, cents: 0, velocity: 90, voice: 1 },
  { onsetSec: 0.5, offsetSec: 1, pitch: 64, cents: -14, velocity: 70, voice: 2 },
  { onsetSec: 1, offsetSec: 2, pitch: 67, cents: 6, velocity: 80, voice: 1 },
];

beforeAll(async () => {
  app = await startTestApp({ FREE_MONTHLY_EXPORTS: "10" });
  owner = await signUpVerified("vera@example.org", "Vera Lund");
  const { project } = await (await call("POST", "/api/v1/projects", { cookie: owner, body: { name: "Exports" } })).json();
  const up = await call("POST", `/api/v1/projects/${project.id}/takes`, { cookie: owner, rawBody: uploadForm({ file: toneWav({ freqsHz: [261.63], durationSec: 0.5 }), name: "Étude nº 3 / take" }) });
  takeId = (await up.json()).take.id;
  expect((await call("PUT", `/api/v1/takes/${takeId}/notes`, { cookie: owner, body: { baseRevision: 0, notes: NOTES } })).status).toBe(201);
});
afterAll(async () => app.close());

describe("exports", () => {
  it("MIDI: format 1, one track per voice, the revision's notes to the tick, bends carrying cents", async () => {
    const res = await call("GET", `/api/v1/takes/${takeId}/export?format=midi&pitchBend=1&tempo=120`, { cookie: owner });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("audio/midi");
    expect(res.headers.get("content-disposition")).toBe('attachment; filename="Etude-no-3-take-rev1.mid"');
    expect(res.headers.get("x-tapernote-credits-left")).toBe("9");
    const parsed = midiFile.parseMidi(new Uint8Array(await res.arrayBuffer()));
    expect(parsed.header.format).toBe(1);
    const ticksPerQuarter = parsed.header.ticksPerBeat!;
    const noteOns: { tick: number; pitch: number; velocity: number; channel: number }[] = [];
    const bends: { channel: number; value: number }[] = [];
    for (const track of parsed.tracks) {
      let tick = 0;
      for (const ev of track) {
        tick += ev.deltaTime;
        if (ev.type === "noteOn" && ev.velocity > 0) noteOns.push({ tick, pitch: ev.noteNumber, velocity: ev.velocity, channel: ev.channel });
        if (ev.type === "pitchBend") bends.push({ channel: ev.channel, value: ev.value });
      }
    }
    // at 120 bpm a quarter is 0.5 s (MIDI 1.0: tempo in µs per quarter; 500 000 = 120 bpm)
    noteOns.sort((a, b) => a.tick - b.tick);
    expect(noteOns.map((n) => [n.tick, n.pitch, n.velocity])).toEqual(NOTES.map((n) => [Math.round((n.onsetSec / 0.5) * ticksPerQuarter), n.pitch, n.velocity]));
    // midi-file reports bends as signed offsets from the centre 8192; ±2 semitones = ±8192 (GM default range)
    const centsOf = (v: number) => (v / 8192) * 200;
    const e4 = noteOns.find((n) => n.pitch === 64)!;
    expect(bends.filter((b) => b.channel === e4.channel).some((b) => Math.abs(centsOf(b.value) - -14) < 1)).toBe(true);
  });

  it("CSV is free; MusicXML uses a credit", async () => {
    const csv = await call("GET", `/api/v1/takes/${takeId}/export?format=csv`, { cookie: owner });
    expect(csv.status).toBe(200);
    expect((await csv.text()).split(/\r?\n/)[0]).toBe("onsetSec,offsetSec,pitch,noteName,cents,velocity,voice");
    expect(csv.headers.get("x-tapernote-credits-left")).toBe("9");
    const xml = await call("GET", `/api/v1/takes/${takeId}/export?format=musicxml&quantize=1/8`, { cookie: owner });
    expect(xml.status).toBe(200);
    expect(await xml.text()).toContain("<score-partwise");
    expect(xml.headers.get("x-tapernote-credits-left")).toBe("8");
  });

  it("bad queries are 422 and use nothing; an unknown revision is 404", async () => {
    expect((await call("GET", `/api/v1/takes/${takeId}/export?format=pdf`, { cookie: owner })).status).toBe(422);
    expect((await call("GET", `/api/v1/takes/${takeId}/export?format=midi&quantize=1/5`, { cookie: owner })).status).toBe(422);
    expect((await call("GET", `/api/v1/takes/${takeId}/export?format=midi&revision=7`, { cookie: owner })).status).toBe(404);
    expect((await (await call("GET", "/api/v1/credits", { cookie: owner })).json()).balance).toBe(8);
  });

  it("50 parallel export requests with 8 credits left give exactly 8 files and 42 × 402 no_credits", async () => {
    const responses = await Promise.all(Array.from({ length: 50 }, () => call("GET", `/api/v1/takes/${takeId}/export?format=midi`, { cookie: owner })));
    const ok = responses.filter((r) => r.status === 200);
    const refused = responses.filter((r) => r.status === 402);
    expect(ok).toHaveLength(8);
    expect(refused).toHaveLength(42);
    expect((await refused[0]!.json()).error.code).toBe("no_credits");
    const credits = await (await call("GET", "/api/v1/credits", { cookie: owner })).json();
    expect(credits.balance).toBe(0);
    expect(credits.ledger.filter((l: { kind: string }) => l.kind === "use")).toHaveLength(10);
  });
});
