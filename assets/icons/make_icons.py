#!/usr/bin/env python3
"""Draws Tidewright's own app icons (a tide wave under a rising sun-disc on deep teal) and
writes them as PNG with a tiny encoder (zlib + struct only, no imaging library).
Run: python3 assets/icons/make_icons.py  -> icon-192.png, icon-512.png, icon-maskable-512.png"""
import math
import os
import struct
import zlib

BG = (11, 20, 24)
TILE = (20, 52, 60)
DISC = (79, 194, 176)
WAVE = (234, 244, 246)


def png(path, w, h, rows):
    def chunk(tag, data):
        c = struct.pack(">I", len(data)) + tag + data
        return c + struct.pack(">I", zlib.crc32(tag + data) & 0xFFFFFFFF)
    raw = b"".join(b"\x00" + bytes(r) for r in rows)
    data = b"\x89PNG\r\n\x1a\n" + chunk(b"IHDR", struct.pack(">IIBBBBB", w, h, 8, 6, 0, 0, 0))
    data += chunk(b"IDAT", zlib.compress(raw, 9)) + chunk(b"IEND", b"")
    with open(path, "wb") as f:
        f.write(data)


def mix(a, b, t):
    return tuple(a[i] + (b[i] - a[i]) * t for i in range(3))


def cover(d, px):
    """Coverage of a shape at signed distance d (negative inside), antialiased over one pixel."""
    return max(0.0, min(1.0, 0.5 - d / px))


def draw(size, maskable):
    rows = []
    px = 1.0 / size
    for y in range(size):
        row = []
        for x in range(size):
            u, v = (x + 0.5) / size, (y + 0.5) / size
            # tile: full square when maskable (safe zone is the inner 80 %), rounded otherwise
            if maskable:
                col, alpha = TILE, 1.0
            else:
                r = 0.18
                qx, qy = max(abs(u - 0.5) - (0.5 - r), 0), max(abs(v - 0.5) - (0.5 - r), 0)
                d = math.hypot(qx, qy) - r
                col, alpha = TILE, cover(d, px)
            s = 0.8 if maskable else 1.0  # shrink the drawing into the maskable safe zone
            cu, cv = (u - 0.5) / s + 0.5, (v - 0.5) / s + 0.5
            # disc
            d = math.hypot(cu - 0.5, cv - 0.42) - 0.2
            col = mix(col, DISC, cover(d, px / s))
            # two waves: thick strokes y = base + a sin(...)
            for base, thick in ((0.62, 0.045), (0.76, 0.035)):
                wy = base + 0.04 * math.sin((cu - 0.1) * 2 * math.pi * 1.6)
                if 0.14 < cu < 0.86:
                    d = abs(cv - wy) - thick
                    col = mix(col, WAVE, cover(d, px / s))
            row += [round(c) for c in col] + [round(255 * alpha)]
        rows.append(row)
    return rows


if __name__ == "__main__":
    here = os.path.dirname(os.path.abspath(__file__))
    for name, size, maskable in (("icon-192.png", 192, False), ("icon-512.png", 512, False),
                                 ("icon-maskable-512.png", 512, True)):
        png(os.path.join(here, name), size, size, draw(size, maskable))
        print("wrote", name)
