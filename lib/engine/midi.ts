import m from "@tonejs/midi";
import type { Note } from "./transcribe";

const { Midi } = m;

/**
 * Standard MIDI File of a draft with @tonejs/midi: one track per voice, each on its own channel
 * (channel 10 skipped), optionally a pitch bend before every note carrying its cents
 * (General MIDI default bend range ±2 semitones: value = cents / 200, written as
 * round(v·8192) clamped to −8192 … 8191).
 */
export function notesToMidi(notes: Note[], opts: { pitchBend?: boolean } = {}): Uint8Array {
  const midi = new Midi();
  const byVoice = new Map<number, Note[]>();
  for (const n of notes) {
    const list = byVoice.get(n.voice) ?? [];
    list.push(n);
    byVoice.set(n.voice, list);
  }
  const channels = [0, 1, 2, 3, 4, 5, 6, 7, 8, 10, 11, 12, 13, 14, 15];
  [...byVoice.keys()].sort((a, b) => a - b).forEach((voice, i) => {
    const track = midi.addTrack();
    track.name = `voice ${voice}`;
    track.channel = channels[i % channels.length];
    for (const n of byVoice.get(voice)!) {
      if (opts.pitchBend) {
        const raw = Math.max(-8192, Math.min(8191, Math.round((n.cents / 200) * 8192)));
        track.addPitchBend({ time: n.onsetSec, value: raw });
      }
      track.addNote({ midi: n.pitch, time: n.onsetSec, duration: Math.max(0.001, n.offsetSec - n.onsetSec), velocity: n.velocity / 127 });
    }
  });
  return midi.toArray();
}
