#!/usr/bin/env python3
"""Writes the synthetic scope-CSV fixtures of this folder (see README.md). Run from this folder: python3 make_fixtures.py"""
import math

FS = 100_000.0          # 100 kHz sampling, 10 µs interval
N = 200                 # two cycles of 1 kHz
def sig(i):             # 1 V peak 1 kHz sine plus 10 mV peak 3rd harmonic (1 % THD)
    t = i / FS
    return math.sin(2 * math.pi * 1000 * t) + 0.01 * math.sin(2 * math.pi * 3000 * t)

def e(x):
    return "%.6e" % x

def write(name, text, newline="\n", bom=False):
    with open(name, "w", encoding="utf-8-sig" if bom else "utf-8", newline="") as f:
        f.write(text.replace("\n", newline))

# 1. two-line Start/Increment header, index column, trailing comma; CH2 = -CH1/2
rows = ["X,CH1,CH2,Start,Increment,", "Sequence,Volt,Volt,%s,%s," % (e(-1e-3), e(1 / FS))]
rows += ["%d,%s,%s," % (i, e(sig(i)), e(-0.5 * sig(i))) for i in range(N)]
write("start-increment.csv", "\n".join(rows) + "\n")

# 2. key/value pairs in the first three columns beside time and value
meta = ["Record Length,%d,Points" % N, "Sample Interval,%s,s" % e(1 / FS), "Trigger Point,100,Samples",
        "Source,CH1,", "Vertical Units,V,", "Vertical Scale,0.5,", "Horizontal Units,s,", "Probe Atten,10,"]
rows = ["%s,%s,%s," % (meta[i] if i < len(meta) else ",,", e(i / FS - 1e-3), e(sig(i))) for i in range(N)]
write("pairs-beside-data.csv", "\n".join(rows) + "\n")

# 3. semicolons, decimal commas, UTF-8 BOM, CRLF; CH2 = CH1/10
rows = ["Time;CH1;CH2"] + ["%s;%s;%s" % (e(i / FS).replace(".", ","), e(sig(i)).replace(".", ","),
                                         e(0.1 * sig(i)).replace(".", ",")) for i in range(N)]
write("semicolon-decimal-comma.csv", "\n".join(rows) + "\n", newline="\r\n", bom=True)

# 4. units row with prefixes: time in ms, value in mV
rows = ["Time,CH1", "ms,mV"] + ["%s,%s" % (e(i / FS * 1e3), e(sig(i) * 1e3)) for i in range(N)]
write("units-ms-mv.csv", "\n".join(rows) + "\n")
