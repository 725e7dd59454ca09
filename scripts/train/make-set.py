#!/usr/bin/python3
"""Training takes for the engine's onset model: random pieces rendered from real sampled
instruments.

Usage: /usr/bin/python3 scripts/train/make-set.py [--count N] [--seed S] [--out DIR]

Each piece is invented here at random (not the evaluation pieces): melodies, block chords,
held chords under a moving voice, repeated notes, octave and fifth doublings, quiet voices,
voices mistuned by pitch bend and whole takes off A4 = 440. It is written as MIDI (mido),
rendered dry by FluidSynth with one of the General MIDI sound sets Debian ships
(fluid-soundfont-gm, timgm6mb-soundfont, musescore-general-soundfont),
and degraded by sox: clean, pink or white noise at 12-30 dB SNR, room reverb, or a
telephone-like band (300-3400 Hz, 8 kHz). Ground truth (onset, offset, MIDI pitch, cents)
goes beside each WAV as JSON. Needs: fluidsynth, sox, python3-mido, python3-numpy,
python3-soundfile and the sound-set packages above.
"""
import argparse, json, os, random, subprocess, sys
import numpy as np
import soundfile as sf
import mido

SETS = [
    "/usr/share/sounds/sf2/FluidR3_GM.sf2",
    "/usr/share/sounds/sf2/TimGM6mb.sf2",
    "/usr/share/sounds/sf3/MuseScore_General.sf3",
]
# General MIDI programs (0-based) of pitched, sustained or decaying instruments
PROGRAMS = {
    "keys": [0, 1, 2, 4, 6, 7],
    "mallets": [8, 11, 12, 13],
    "organ": [16, 17, 19, 20, 21],
    "guitar": [24, 25, 26, 27],
    "bass": [32, 33, 34],
    "strings": [40, 41, 42, 43, 48, 49],
    "choir": [52, 53],
    "brass": [56, 57, 58, 60, 61],
    "reed": [64, 65, 66, 67, 68, 69, 70, 71],
    "pipe": [72, 73, 74, 75],
}
RANGES = {  # comfortable MIDI ranges per family
    "keys": (28, 100), "mallets": (53, 96), "organ": (36, 96), "guitar": (40, 84), "bass": (28, 60),
    "strings": (36, 96), "choir": (48, 81), "brass": (40, 82), "reed": (38, 91), "pipe": (60, 96),
}
SCALES = [[0, 2, 4, 5, 7, 9, 11], [0, 2, 3, 5, 7, 8, 10], [0, 2, 3, 5, 7, 8, 11], [0, 2, 4, 7, 9]]


def pick_program(rng, low=None):
    fams = list(PROGRAMS)
    fam = rng.choice(fams)
    lo, hi = RANGES[fam]
    return rng.choice(PROGRAMS[fam]), fam, lo, hi


def scale_notes(rng, lo, hi, tonic, scale):
    return [m for m in range(lo, hi + 1) if (m - tonic) % 12 in scale]


def piece(rng, dur_s):
    """A list of voices: {program, notes: [(onset, offset, midi, velocity)], bend_cents}."""
    bpm = rng.uniform(60, 150)
    beat = 60.0 / bpm
    tonic = rng.randrange(12)
    scale = rng.choice(SCALES)
    kind = rng.choice(["melody", "chords", "chorale", "melody+chords", "repeated", "doubling", "intervals", "arpeggio"])
    voices = []

    def voice(program, fam, lo, hi, span=None):
        v = {"program": program, "family": fam, "notes": [], "bend_cents": 0.0}
        if rng.random() < 0.25:
            v["bend_cents"] = rng.choice([-1, 1]) * rng.choice([3, 6, 10, 15, 25, 35])
        voices.append(v)
        return v

    def melody(v, lo, hi, sub, legato, t0=0.5):
        pool = scale_notes(rng, lo, hi, tonic, scale)
        if not pool:
            return
        t = t0
        i = rng.randrange(len(pool))
        while t < dur_s - 1:
            d = beat * rng.choice(sub)
            i = max(0, min(len(pool) - 1, i + rng.choice([-3, -2, -1, -1, 1, 1, 2, 3, 0])))
            if rng.random() < 0.1:
                t += d
                continue
            off = t + d * (legato if rng.random() < 0.8 else rng.uniform(0.3, 0.9))
            v["notes"].append((t, off, pool[i], rng.randint(45, 120)))
            t += d

    def chords(vs, ranges, beats, t0=0.5, hold=0.95):
        t = t0
        root = rng.randrange(7)
        while t < dur_s - 1.2:
            d = beat * rng.choice(beats)
            root = (root + rng.choice([1, 3, 4, 5, 2])) % 7
            for k, v in enumerate(vs):
                lo, hi = ranges[k]
                pool = scale_notes(rng, lo, hi, tonic, scale)
                deg = scale[(root + 2 * k) % len(scale)]
                cands = [m for m in pool if (m - tonic) % 12 == deg] or pool or [lo]
                m = rng.choice(cands)
                if v["notes"] and v["notes"][-1][2] == m and v["notes"][-1][1] >= t - 0.01 and rng.random() < 0.4:
                    o = v["notes"][-1]
                    v["notes"][-1] = (o[0], t + d * hold, o[2], o[3])  # common tone tied
                else:
                    v["notes"].append((t, t + d * hold, m, rng.randint(50, 115)))
            t += d

    if kind in ("melody", "arpeggio"):
        p, fam, lo, hi = pick_program(rng)
        v = voice(p, fam, lo, hi)
        sub = [0.25, 0.5, 0.5, 1, 1, 1.5, 2] if kind == "melody" else [0.25, 0.25, 0.5]
        melody(v, lo, hi, sub, rng.uniform(0.6, 1.0))
    elif kind in ("chords", "chorale"):
        n = rng.randint(2, 4) if kind == "chords" else 4
        if kind == "chorale" and rng.random() < 0.5:
            fams = [rng.choice(list(PROGRAMS))] * n
        else:
            fams = [rng.choice(list(PROGRAMS)) for _ in range(n)]
        vs, ranges = [], []
        base = rng.randint(36, 55)
        for k in range(n):
            p = rng.choice(PROGRAMS[fams[k]])
            lo, hi = RANGES[fams[k]]
            c = max(lo, min(hi - 12, base + 7 * k))
            vs.append(voice(p, fams[k], lo, hi))
            ranges.append((c, min(hi, c + 12)))
        chords(vs, ranges, [1, 2, 2, 3, 4] if kind == "chorale" else [0.5, 1, 2, 4], hold=rng.uniform(0.7, 1.0))
    elif kind == "melody+chords":
        p, fam, lo, hi = pick_program(rng)
        v = voice(p, fam, lo, hi)
        mlo = max(lo, 60)
        melody(v, mlo, min(hi, mlo + 24), [0.25, 0.25, 0.5, 0.5, 1], rng.uniform(0.6, 1.0))
        n = rng.randint(1, 3)
        vs, ranges = [], []
        for k in range(n):
            p2, f2, lo2, hi2 = pick_program(rng)
            c = max(lo2, min(hi2 - 12, 40 + 5 * k))
            vs.append(voice(p2, f2, lo2, hi2))
            ranges.append((c, min(hi2, c + 12, mlo - 1 if mlo - 1 > c else c + 12)))
        chords(vs, ranges, [2, 4, 4])
    elif kind == "repeated":
        p, fam, lo, hi = pick_program(rng)
        v = voice(p, fam, lo, hi)
        pool = scale_notes(rng, lo, hi, tonic, scale) or [lo]
        t = 0.5
        while t < dur_s - 1:
            m = rng.choice(pool)
            k = rng.randint(2, 6)
            d = beat * rng.choice([0.25, 0.5, 0.5, 1])
            leg = rng.uniform(0.5, 0.97)
            for _ in range(k):
                v["notes"].append((t, t + d * leg, m, rng.randint(50, 120)))
                t += d
            t += beat * rng.choice([0, 0.5, 1])
    elif kind == "doubling":
        p, fam, lo, hi = pick_program(rng)
        p2, f2, lo2, hi2 = pick_program(rng)
        a, b = voice(p, fam, lo, hi), voice(p2, f2, lo2, hi2)
        iv = rng.choice([12, 12, 7, 19, 24])
        melody(a, max(lo, lo2 - iv), min(hi, hi2 - iv), [0.5, 1, 1, 2], rng.uniform(0.7, 1.0))
        for (on, off, m, vel) in a["notes"]:
            b["notes"].append((on, off, m + iv, max(30, min(127, vel + rng.randint(-30, 10)))))
    else:  # intervals, with quiet voices
        p, fam, lo, hi = pick_program(rng)
        p2, f2, lo2, hi2 = pick_program(rng)
        a, b = voice(p, fam, lo, hi), voice(p2, f2, lo2, hi2)
        t = 0.5
        while t < dur_s - 1.5:
            d = beat * rng.choice([1, 2, 3])
            m = rng.randint(max(lo, 36), min(hi, 84))
            iv = rng.choice([1, 2, 3, 4, 5, 7, 8, 9, 12, 16, 19])
            m2 = max(lo2, min(hi2, m + iv))
            v1 = rng.randint(70, 120)
            v2 = max(20, v1 - rng.choice([0, 10, 25, 40]))
            if rng.random() < 0.5:
                v1, v2 = v2, v1
            a["notes"].append((t, t + d * 0.9, m, v1))
            b["notes"].append((t + rng.choice([0, 0, 0.25 * beat]), t + d * 0.9, m2, v2))
            t += d
    return voices, bpm


def write_midi(voices, path, global_cents):
    mid = mido.MidiFile(ticks_per_beat=960)
    tempo = 500000  # 120 bpm: 1 s = 1920 ticks
    tps = 1920
    tr0 = mido.MidiTrack()
    tr0.append(mido.MetaMessage("set_tempo", tempo=tempo, time=0))
    mid.tracks.append(tr0)
    ch_of = [c for c in range(16) if c != 9]
    for k, v in enumerate(voices):
        ch = ch_of[k]
        tr = mido.MidiTrack()
        ev = [(0, mido.Message("program_change", channel=ch, program=v["program"], time=0))]
        # pitch-bend range ±2 semitones (RPN 0)
        for c, val in ((101, 0), (100, 0), (6, 2), (38, 0), (101, 127), (100, 127)):
            ev.append((0, mido.Message("control_change", channel=ch, control=c, value=val, time=0)))
        bend = (v["bend_cents"] + global_cents) / 200.0
        ev.append((0, mido.Message("pitchwheel", channel=ch, pitch=max(-8192, min(8191, round(bend * 8192))), time=0)))
        for (on, off, m, vel) in v["notes"]:
            ev.append((round(on * tps), mido.Message("note_on", channel=ch, note=m, velocity=vel, time=0)))
            ev.append((round(off * tps) - 1, mido.Message("note_off", channel=ch, note=m, velocity=0, time=0)))
        ev.sort(key=lambda e: (e[0], 0 if e[1].type == "note_off" else 1))
        last = 0
        for (tk, msg) in ev:
            msg.time = max(0, tk - last)
            last = max(last, tk)
            tr.append(msg)
        mid.tracks.append(tr)
    mid.save(path)


def degrade(rng, raw, out):
    x, sr = sf.read(raw, dtype="float32", always_2d=True)
    x = x.mean(axis=1)
    kind = rng.choices(["clean", "pink", "white", "reverb", "phone"], [5, 2, 1, 2, 2])[0]
    if kind in ("pink", "white"):
        snr = rng.uniform(12, 30)
        n = np.random.default_rng(rng.randrange(1 << 30)).standard_normal(len(x)).astype(np.float32)
        if kind == "pink":
            spec = np.fft.rfft(n)
            f = np.arange(len(spec)); f[0] = 1
            n = np.fft.irfft(spec / np.sqrt(f), len(x)).astype(np.float32)
        fr = x[: len(x) // 2205 * 2205].reshape(-1, 2205)
        p = (fr ** 2).mean(axis=1)
        act = p[p > p.max() * 1e-3]
        sig = act.mean() if len(act) else 1e-6
        n *= np.sqrt(sig / (n ** 2).mean() / 10 ** (snr / 10))
        x = x + n
    tmp = out + ".tmp.wav"
    sf.write(tmp, x / (np.abs(x).max() + 1e-9) * 0.7, sr, subtype="FLOAT")
    chain = {"clean": [], "pink": [], "white": [],
             "reverb": ["reverb", str(rng.randint(20, 60)), "50", str(rng.randint(30, 90)), "100", "8", "-4"],
             "phone": ["sinc", "300-3400", "rate", "-v", "8000"]}[kind]
    # -R: repeatable (the dither to 16 bits is seeded), so the set is the same from run to run
    subprocess.run(["sox", "-R", tmp, "-b", "16", out] + chain + ["gain", "-n", "-3"], check=True)
    os.remove(tmp)
    return kind


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--count", type=int, default=400)
    ap.add_argument("--seed", type=int, default=1)
    ap.add_argument("--out", default=os.path.expanduser("~/.cache/tapernote-train"))
    ap.add_argument("--dur", type=float, default=20.0)
    a = ap.parse_args()
    os.makedirs(a.out, exist_ok=True)
    sets = [s for s in SETS if os.path.exists(s)]
    for i in range(a.count):
        rng = random.Random(a.seed * 100003 + i)
        name = "t%04d" % i
        if os.path.exists(os.path.join(a.out, name + ".json")):
            continue
        voices, bpm = piece(rng, a.dur)
        g = rng.choice([0.0, 0.0, 0.0, 0.0, 7.85, -101.7, rng.uniform(-40, 40)])
        mid = os.path.join(a.out, name + ".mid")
        write_midi(voices, mid, g)
        sset = rng.choice(sets)
        raw = os.path.join(a.out, name + ".raw.wav")
        subprocess.run(["fluidsynth", "-ni", "-q", "-R", "0", "-C", "0", "-g", "0.4", "-r", "44100", "-O", "float",
                        "-T", "wav", "-F", raw, sset, mid], check=True, stdout=subprocess.DEVNULL)
        kind = degrade(rng, raw, os.path.join(a.out, name + ".wav"))
        os.remove(raw)
        notes = []
        for v in voices:
            c = v["bend_cents"] + g
            for (on, off, m, vel) in v["notes"]:
                notes.append({"onset": round(on, 4), "offset": round(off, 4), "pitch": m + round(c / 100),
                              "cents": round(c - 100 * round(c / 100), 2), "velocity": vel,
                              "program": v["program"]})
        notes.sort(key=lambda n: (n["onset"], n["pitch"]))
        with open(os.path.join(a.out, name + ".json"), "w") as f:
            json.dump({"soundSet": os.path.basename(sset), "variant": kind, "notes": notes}, f)
        print(name, os.path.basename(sset), kind, len(notes), file=sys.stderr)


if __name__ == "__main__":
    main()
