#!/usr/bin/env python3
"""Writes the benchmark capture: 10 s, 96 kHz, 24-bit mono, 997 Hz at -1 dBFS with H3 at -80 dBc, seeded noise."""
import sys
import wave

import numpy as np

fs, secs = 96000, 10
t = np.arange(fs * secs) / fs
a = 10 ** (-1 / 20)
x = a * np.sin(2 * np.pi * 997 * t) + a * 1e-4 * np.sin(3 * 2 * np.pi * 997 * t)
x += np.random.default_rng(1).normal(0, 1e-6, len(t))
codes = np.clip(np.round(x * 2**23), -(2**23), 2**23 - 1).astype(np.int32)
b = codes.astype("<i4").view(np.uint8).reshape(-1, 4)[:, :3].tobytes()
with wave.open(sys.argv[1], "wb") as f:
    f.setnchannels(1)
    f.setsampwidth(3)
    f.setframerate(fs)
    f.writeframes(b)
