#!/usr/bin/env python3
"""Draws Outstage's application icon (our own design): a sine whose zero crossings carry a small crossover step,
in amber on a dark rounded square. Writes src/main/package/outstage.png (256x256, RGBA) with the standard library
only. Run: python3 tools/make-icon.py"""
import math
import os
import struct
import zlib

N = 256
px = [[(0, 0, 0, 0)] * N for _ in range(N)]


def blend(x, y, rgb, a):
    if 0 <= x < N and 0 <= y < N and a > 0:
        r0, g0, b0, a0 = px[y][x]
        a1 = a + a0 * (1 - a)
        if a1 == 0:
            return
        px[y][x] = tuple(int((c * a + c0 * a0 * (1 - a)) / a1) for c, c0 in zip(rgb, (r0, g0, b0))) + (int(a1 * 255) / 255,)


# rounded square background
R = 44
for y in range(N):
    for x in range(N):
        dx = max(R - x, 0, x - (N - 1 - R))
        dy = max(R - y, 0, y - (N - 1 - R))
        d = math.hypot(dx, dy)
        a = min(1.0, max(0.0, R - d + 0.5))
        shade = 0.85 + 0.15 * (1 - y / N)
        blend(x, y, (int(28 * shade), int(34 * shade), int(44 * shade)), a)

# faint axis
for x in range(28, N - 28):
    blend(x, N // 2, (90, 100, 115), 0.8)


def stage(v):
    """a transfer curve with a crossover dead band: what an under-biased output stage does"""
    dead = 0.11
    return math.copysign(max(abs(v) - dead, 0) / (1 - dead), v)


pts = []
for i in range(2000):
    t = i / 1999
    v = math.sin(2 * math.pi * 1.5 * t)
    pts.append((30 + t * (N - 60), N / 2 - 88 * stage(v)))
for (x0, y0), (x1, y1) in zip(pts, pts[1:]):
    steps = int(max(abs(x1 - x0), abs(y1 - y0)) * 3) + 1
    for s in range(steps):
        x = x0 + (x1 - x0) * s / steps
        y = y0 + (y1 - y0) * s / steps
        for oy in range(-6, 7):
            for ox in range(-6, 7):
                d = math.hypot(ox + (x - int(x)), oy + (y - int(y)))
                a = min(1.0, max(0.0, 5.5 - d))
                if a > 0:
                    blend(int(x) + ox, int(y) + oy, (255, 176, 46), a * 0.35)

raw = b"".join(b"\x00" + b"".join(struct.pack("BBBB", r, g, b, int(a * 255)) for r, g, b, a in row) for row in px)


def chunk(tag, data):
    return struct.pack(">I", len(data)) + tag + data + struct.pack(">I", zlib.crc32(tag + data) & 0xFFFFFFFF)


out = os.path.join(os.path.dirname(__file__), "..", "src", "main", "package", "outstage.png")
with open(out, "wb") as f:
    f.write(b"\x89PNG\r\n\x1a\n" + chunk(b"IHDR", struct.pack(">IIBBBBB", N, N, 8, 6, 0, 0, 0))
            + chunk(b"IDAT", zlib.compress(raw, 9)) + chunk(b"IEND", b""))
print(out)
