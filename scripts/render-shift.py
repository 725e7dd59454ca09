"""Measures how far FluidSynth actually shifted the fixtures rendered at A4 = 442 and 415 Hz
against the same notes rendered at 440 Hz (tests/fixtures/engine/a440.wav), independently of
Tapernote's engine: numpy's FFT of each whole file (Hann), magnitudes on a log-frequency grid
(100 Hz ... 4 kHz, 0.05-cent steps), and the shift that maximises their cross-correlation.

    python3 scripts/render-shift.py
    a442: nominal +7.85 c, rendered +7.00 c
    a415: nominal -101.27 c, rendered -101.12 c

(FluidSynth applies a pitch bend in whole cents, so 442 Hz's +7.85 c comes out as +7.) The
engine's tests compare its reference-pitch estimates with these rendered shifts.
"""
import math

import numpy as np
import scipy.io.wavfile as wavfile

DIR = "tests/fixtures/engine/"
STEP = 0.05


def log_spectrum(name):
    rate, x = wavfile.read(DIR + name + ".wav")
    x = x.astype(float)
    if x.ndim > 1:
        x = x.mean(axis=1)
    n = 1 << 22
    mag = np.abs(np.fft.rfft(x * np.hanning(len(x)), n))
    freqs = np.arange(len(mag)) * rate / n
    grid = 440 * 2 ** (np.arange(1200 * math.log2(100 / 440), 1200 * math.log2(4000 / 440), STEP) / 1200)
    return np.interp(grid, freqs, mag)


base = log_spectrum("a440")
for name, a4 in (("a442", 442), ("a415", 415)):
    other = log_spectrum(name)
    nominal = 1200 * math.log2(a4 / 440)
    best = None
    for shift in np.arange(nominal - 5, nominal + 5, STEP):
        k = int(round(shift / STEP))
        v = np.dot(base[: len(base) - k], other[k:]) if k >= 0 else np.dot(base[-k:], other[: len(other) + k])
        if best is None or v > best[0]:
            best = (v, shift)
    print(f"{name}: nominal {nominal:+.2f} c, rendered {best[1]:+.2f} c")
