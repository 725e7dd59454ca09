"""Dump a Standard MIDI File as JSON with mido (Debian's python3-mido), for the export tests.

Usage: python3 mido_dump.py FILE.mid
Prints {"type", "ticks_per_beat", "tracks": [[message, ...], ...]}; each message is mido's
dict of it with "time" made absolute (ticks from the start of its track).
"""
import json
import sys

import mido


def main() -> None:
    midi = mido.MidiFile(sys.argv[1])
    tracks = []
    for track in midi.tracks:
        now = 0
        messages = []
        for msg in track:
            now += msg.time
            d = msg.dict()
            d["time"] = now
            d["is_meta"] = msg.is_meta
            messages.append(d)
        tracks.append(messages)
    json.dump({"type": midi.type, "ticks_per_beat": midi.ticks_per_beat, "tracks": tracks}, sys.stdout)


if __name__ == "__main__":
    main()
