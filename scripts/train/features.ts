/**
 * Features and labels of the engine's two learned stages for a set of takes.
 * Usage: node --import tsx scripts/train/features.ts DIR OUT.bin
 * DIR holds NAME.wav + NAME.json ({notes: [{onset, pitch, cents}]}, scripts/train/make-set.py).
 * Each take is transcribed with the current weights and looked into (TranscribeInspector):
 * - OUT.bin: per onset candidate (onset-model.ts), FEATURE_COUNT float32 features, then the
 *   label (1 when a note of its pitch starts within ±50 ms of its attack), take index, attack
 *   time (s) and MIDI note; OUT.bin.json names the takes and the features.
 * - OUT.bin.notes: per proposed note (note-check.ts), NOTE_FEATURE_COUNT features, then the
 *   label (1 when it matches a note of the take as the MIREX onset criterion does: onset within
 *   ±50 ms, pitch within ±50 cents, each true note matched once), take index, onset (s), 0.
 */
import { readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { decodeAudio, transcribe } from "../../lib/engine/index";
import { FEATURE_COUNT, FEATURE_NAMES, type MlpWeights } from "../../lib/engine/onset-model";
import { NOTE_FEATURE_COUNT, NOTE_FEATURE_NAMES } from "../../lib/engine/note-check";
import { ONSET_MODEL } from "../../lib/engine/onset-weights";
import { NOTE_MODEL } from "../../lib/engine/note-weights";

/**
 * A model that fits the current features when the committed one does not (its probability is
 * ½ everywhere): the onset features do not depend on any weights, and the note features only on
 * the onset model's, which the first pass of run.sh retrains.
 */
function fitting(model: MlpWeights, inputs: number, name: string): MlpWeights | undefined {
  if (model.inputs === inputs) return undefined;
  console.error(`${name} was trained on ${model.inputs} features, the code makes ${inputs}: using a neutral model for this pass`);
  const H = 1;
  return { inputs, hidden: H, mean: new Array(inputs).fill(0), scale: new Array(inputs).fill(1), w1: new Array(inputs * H).fill(0), b1: [0], w2: [0], b2: 0 };
}
const onsetModel = fitting(ONSET_MODEL, FEATURE_COUNT, "the onset model");
const noteModel = fitting(NOTE_MODEL, NOTE_FEATURE_COUNT, "the note check");

const [dir, out] = process.argv.slice(2);
if (!dir || !out) {
  console.error("usage: features.ts DIR OUT.bin");
  process.exit(2);
}
const names = readdirSync(dir).filter((f) => f.endsWith(".wav")).map((f) => f.slice(0, -4)).sort();
const rows: number[] = [];
const W = FEATURE_COUNT + 4;
const noteRows: number[] = [];
const NW = NOTE_FEATURE_COUNT + 4;
let pos = 0;
for (let ti = 0; ti < names.length; ti++) {
  const name = names[ti];
  const truth = JSON.parse(readFileSync(join(dir, name + ".json"), "utf8")).notes as Array<{ onset: number; pitch: number; cents: number }>;
  const audio = await decodeAudio(readFileSync(join(dir, name + ".wav")));
  let cands: Array<{ frame: number; midi: number; features: Float32Array }> = [];
  let hop = 0.01;
  await transcribe(audio.samples, audio.sampleRateHz, {}, undefined, {
    onsetModel,
    noteModel,
    onCandidates: (c, h) => {
      cands = c;
      hop = h;
    },
    onNotes: (notes, xs) => {
      // label: matched to a truth note (onset within 50 ms, pitch within 50 cents), each truth note once, nearest first
      const used = new Set<number>();
      const order = notes.map((_, i) => i).sort((a, b) => notes[a].onsetSec - notes[b].onsetSec);
      const lab = new Array(notes.length).fill(0);
      for (const i of order) {
        const n = notes[i];
        const f = Array.from(n.f0Hz).sort((a, b) => a - b);
        const m = 69 + 12 * Math.log2((f[f.length >> 1] || 440) / 440);
        let best = -1;
        let bd = Infinity;
        truth.forEach((r, j) => {
          const d = Math.abs(r.onset - n.onsetSec);
          if (used.has(j) || d > 0.05 || Math.abs(r.pitch + r.cents / 100 - m) > 0.5) return;
          if (d < bd) {
            bd = d;
            best = j;
          }
        });
        if (best >= 0) {
          used.add(best);
          lab[i] = 1;
        }
      }
      notes.forEach((n, i) => {
        for (let d = 0; d < NOTE_FEATURE_COUNT; d++) noteRows.push(xs[i][d]);
        noteRows.push(lab[i], ti, n.onsetSec, 0);
      });
    },
  });
  for (const c of cands) {
    const t = c.frame * hop;
    const label = truth.some((n) => Math.round(n.pitch + n.cents / 100) === c.midi && Math.abs(n.onset - t) <= 0.05) ? 1 : 0;
    for (let d = 0; d < FEATURE_COUNT; d++) rows.push(c.features[d]);
    rows.push(label, ti, t, c.midi);
    if (label) pos++;
  }
  process.stderr.write(`${name} ${cands.length} candidates\n`);
}
writeFileSync(out, Buffer.from(Float32Array.from(rows).buffer));
writeFileSync(out + ".json", JSON.stringify({ takes: names, features: FEATURE_NAMES, width: W }));
writeFileSync(out + ".notes", Buffer.from(Float32Array.from(noteRows).buffer));
writeFileSync(out + ".notes.json", JSON.stringify({ takes: names, features: NOTE_FEATURE_NAMES, width: NW }));
console.error(`${rows.length / W} candidates, ${pos} positive`);
