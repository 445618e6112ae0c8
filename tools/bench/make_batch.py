#!/usr/bin/env python3
"""Writes the batch benchmark set: N two-second, 48 kHz, 24-bit mono captures (default 120) into a folder,
each a 997 Hz sine at a different level with a little H2/H3 and seeded noise."""
import os
import sys
import wave

import numpy as np

out, count = sys.argv[1], int(sys.argv[2]) if len(sys.argv) > 2 else 120
os.makedirs(out, exist_ok=True)
fs, secs = 48000, 2
t = np.arange(fs * secs) / fs
rng = np.random.default_rng(7)
for i in range(count):
    a = 10 ** (-(1 + 30 * i / count) / 20)
    x = a * (np.sin(2 * np.pi * 997 * t) + 3e-4 * np.sin(2 * 2 * np.pi * 997 * t) + 1e-4 * np.sin(3 * 2 * np.pi * 997 * t))
    x += rng.normal(0, 2e-6, len(t))
    codes = np.clip(np.round(x * 2**23), -(2**23), 2**23 - 1).astype(np.int32)
    b = codes.astype("<i4").view(np.uint8).reshape(-1, 4)[:, :3].tobytes()
    with wave.open(os.path.join(out, "batch-%03d.wav" % i), "wb") as f:
        f.setnchannels(1)
        f.setsampwidth(3)
        f.setframerate(fs)
        f.writeframes(b)
