import { describe, it, expect } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import m from "@tonejs/midi";

const root = fileURLToPath(new URL("../../../", import.meta.url));
const run = (args: string[]) => spawnSync(process.execPath, [join(root, "scripts/transcribe-cli.mjs"), ...args], { cwd: root, encoding: "utf8" });

describe("command line", () => {
  const tmp = mkdtempSync(join(tmpdir(), "tapernote-cli-"));
  it("--help documents every option", () => {
    const r = run(["--help"]);
    expect(r.status).toBe(0);
    for (const opt of ["--json", "--midi", "--bend", "--taper", "--a4", "--frame-low", "--frame-mid", "--frame-high", "--hop", "--voices", "--shortest", "--sensitivity", "--low", "--high"]) expect(r.stdout).toContain(opt);
  });
  it("bad input: exit ≠ 0 and one line on stderr", () => {
    const bad = join(tmp, "bad.wav");
    writeFileSync(bad, "not a recording");
    const r = run([bad, "--json", join(tmp, "x.json")]);
    expect(r.status).not.toBe(0);
    expect(r.stderr.trim().split("\n").length).toBe(1);
    expect(r.stderr).toMatch(/not a WAV or FLAC/);
  });
  it("writes the JSON and a MIDI file with the same notes", () => {
    const out = join(tmp, "o.json");
    const mid = join(tmp, "o.mid");
    const r = run([join(root, "tests/fixtures/engine/single.wav"), "--json", out, "--midi", mid, "--bend", "--quiet"]);
    expect(r.status).toBe(0);
    const j = JSON.parse(readFileSync(out, "utf8"));
    for (const k of ["durationSec", "sampleRateHz", "referenceHz", "settings", "notes"]) expect(j).toHaveProperty(k);
    expect(j.notes.length).toBeGreaterThan(0);
    const midi = new m.Midi(readFileSync(mid));
    const count = midi.tracks.reduce((s, t) => s + t.notes.length, 0);
    expect(count).toBe(j.notes.length);
    rmSync(tmp, { recursive: true, force: true });
  });
});
