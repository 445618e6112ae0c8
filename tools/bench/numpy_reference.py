#!/usr/bin/env python3
"""Comparable job in NumPy/SciPy, used only as a speed yardstick for `outstage analyze --json`.

Reads a WAV, finds the fundamental (windowed FFT peak + parabolic interpolation), estimates harmonics 2..10 by
summing window main-lobe power, and computes band-limited (20 Hz - 20 kHz) THD and THD+N; prints JSON.
It is not a reference for the figures (the tests use published sources for that), only for elapsed time.
"""
import json
import sys

import numpy as np
from scipy.io import wavfile
from scipy.signal import windows


def main(path):
    fs, data = wavfile.read(path)
    if data.dtype == np.int32:
        x = data.astype(np.float64) / 2**31
    elif data.dtype == np.int16:
        x = data.astype(np.float64) / 2**15
    else:
        x = data.astype(np.float64)
    if x.ndim > 1:
        x = x[:, 0]
    n = len(x)
    w = windows.blackmanharris(n, sym=False)  # 4-term; a 7-term would be needed for -150 dBc
    spec = np.fft.rfft((x - x.mean()) * w)
    p = (np.abs(spec) ** 2) * 2 / (np.sum(w) ** 2)
    f = np.fft.rfftfreq(n, 1 / fs)
    k = np.argmax(p[2:]) + 2
    a, b, c = np.log(p[k - 1 : k + 2])
    delta = 0.5 * (a - c) / (a - 2 * b + c)
    f0 = (k + delta) * fs / n
    lobe = 4
    def line_power(freq):
        kk = int(round(freq * n / fs))
        return p[max(kk - lobe, 0) : kk + lobe + 1].sum() / 2.0  # rms^2 (ENBW-free: main-lobe energy sum)
    enbw = n * np.sum(w**2) / np.sum(w) ** 2
    fund = line_power(f0) / enbw
    harm = [line_power(h * f0) / enbw for h in range(2, 11) if h * f0 < min(20000, fs / 2)]
    band = (f >= 20) & (f <= 20000)
    total = p[band].sum() / 2.0 / enbw
    kk = int(round(f0 * n / fs))
    notch = p[max(kk - lobe, 0) : kk + lobe + 1].sum() / 2.0 / enbw
    thd = np.sqrt(sum(harm) / fund)
    thdn = np.sqrt(max(total - notch, 0) / total)
    print(json.dumps({"frequency_hz": f0, "thd": thd, "thd_n": thdn, "harmonics": harm}))


if __name__ == "__main__":
    main(sys.argv[1])
