#!/usr/bin/env python3
"""The comparable job in NumPy alone (no SciPy import), a speed yardstick for `outstage analyze --json`.

Reads each WAV with the standard library, applies a 7-term Blackman-Harris window (coefficients typed from the
published table; see docs/references.md §5), finds the fundamental (FFT peak + parabolic interpolation), sums the
main-lobe power of harmonics 2..10 and computes band-limited (20 Hz - 20 kHz) THD and THD+N; prints one JSON line
per file. Several files are run in one process, as a batch. It is not a reference for the figures (the tests use
published sources for that), only for elapsed time.
"""
import json
import sys
import wave

import numpy as np

# 7-term Blackman-Harris (minimum 4-term family extended to 7 terms), periodic form
BH7 = [0.27105140069342, -0.43329793923448, 0.21812299954311, -0.06592544638803,
       0.01081174209837, -0.00077658482522, 0.00001388721735]


def read(path):
    with wave.open(path, "rb") as f:
        ch, width, fs, n = f.getnchannels(), f.getsampwidth(), f.getframerate(), f.getnframes()
        raw = f.readframes(n)
    if width == 3:
        b = np.frombuffer(raw, dtype=np.uint8).reshape(-1, 3)
        codes = (b[:, 0].astype(np.int32) | (b[:, 1].astype(np.int32) << 8) | (b[:, 2].astype(np.int32) << 16))
        codes = np.where(codes >= 1 << 23, codes - (1 << 24), codes)
        x = codes / 2.0**23
    elif width == 2:
        x = np.frombuffer(raw, dtype="<i2") / 2.0**15
    else:
        x = np.frombuffer(raw, dtype="<i4") / 2.0**31
    return fs, x.reshape(-1, ch)[:, 0].astype(np.float64)


def analyse(path):
    fs, x = read(path)
    n = len(x)
    ph = 2 * np.pi * np.arange(n) / n
    w = sum(c * np.cos(k * ph) for k, c in enumerate(BH7))
    spec = np.fft.rfft((x - x.mean()) * w)
    p = (spec.real ** 2 + spec.imag ** 2) * 2 / (np.sum(w) ** 2)
    f = np.fft.rfftfreq(n, 1 / fs)
    k = int(np.argmax(p[2:])) + 2
    a, b, c = np.log(p[k - 1: k + 2])
    f0 = (k + 0.5 * (a - c) / (a - 2 * b + c)) * fs / n
    lobe = 7
    enbw = n * np.sum(w ** 2) / np.sum(w) ** 2

    def line_power(freq):
        kk = int(round(freq * n / fs))
        return p[max(kk - lobe, 0): kk + lobe + 1].sum() / 2.0 / enbw

    fund = line_power(f0)
    harm = [line_power(h * f0) for h in range(2, 11) if h * f0 < min(20000, fs / 2)]
    band = (f >= 20) & (f <= 20000)
    total = p[band].sum() / 2.0 / enbw
    thd = float(np.sqrt(sum(harm) / fund))
    thdn = float(np.sqrt(max(total - fund, 0) / total))
    return {"file": path, "frequency_hz": f0, "thd": thd, "thd_n": thdn}


if __name__ == "__main__":
    for path in sys.argv[1:]:
        print(json.dumps(analyse(path)))
