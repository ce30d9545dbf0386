"""The extension's icon, drawn here in plain Python and written as a PNG.

A dark sky disc over a faint grid of cells, the celestial equator (pale blue) and the
ecliptic tilted to it (gold), with the Sun on the ecliptic: a sheet of the sky.  The
Extension Manager shows extension icons at 42 x 42 pixels.

The PNG is written with uncompressed (stored) deflate blocks, so the bytes depend only
on the drawing and ``extension/generated/icon.png`` can be checked for staleness
byte by byte on any machine.
"""

import math
import struct
import zlib

SIZE = 42
SUPERSAMPLE = 4
TILT = math.radians(23.44)  # obliquity of the ecliptic, rounded (common practice)

NIGHT = (22, 36, 72)
NIGHT_LIGHT = (48, 78, 138)
GRID = (120, 150, 200)
EQUATOR = (170, 205, 240)
ECLIPTIC = (240, 190, 60)
SUN = (255, 225, 120)


def _mix(under, over, alpha):
    return tuple(u + (o - u) * alpha for u, o in zip(under, over))


def _ellipse_distance(x, y, a, b, angle):
    """Approximate distance of (x, y) from an ellipse of semi-axes a, b turned by angle,
    and whether the point is on its near (lower) half."""
    c, s = math.cos(angle), math.sin(angle)
    u, v = x * c + y * s, -x * s + y * c
    g = (u / a) ** 2 + (v / b) ** 2 - 1.0
    grad = math.hypot(2 * u / a**2, 2 * v / b**2) or 1.0
    return abs(g) / grad, v > 0


def _sample(x, y):
    """Colour and coverage of one sub-pixel; x, y in units of the disc radius, y down."""
    r = math.hypot(x, y)
    if r > 1.0:
        return (0, 0, 0), 0.0
    colour = _mix(NIGHT_LIGHT, NIGHT, min(1.0, math.hypot(x + 0.5, y + 0.5) / 1.6))
    if min(abs(x - g) for g in (-0.5, 0.0, 0.5)) < 0.03 or min(abs(y - g) for g in (-0.5, 0.0, 0.5)) < 0.03:
        colour = _mix(colour, GRID, 0.35)
    if r > 0.93:
        colour = _mix(colour, EQUATOR, 0.5)
    layers = []
    for circle, angle, width in ((EQUATOR, 0.0, 0.045), (ECLIPTIC, -TILT, 0.07)):
        dist, near = _ellipse_distance(x, y, 0.86, 0.30, angle)
        if dist < width:
            layers.append((near, circle))
    for near, circle in sorted(layers, key=lambda layer: layer[0]):
        colour = _mix(colour, circle, 1.0 if near else 0.45)
    # The Sun on the near half of the ecliptic.
    sx, sy = 0.86 * math.cos(2.2), 0.30 * math.sin(2.2)
    c, s = math.cos(-TILT), math.sin(-TILT)
    sun_x, sun_y = sx * c - sy * s, sx * s + sy * c
    if math.hypot(x - sun_x, y - sun_y) < 0.14:
        colour = SUN
    return colour, 1.0


def pixels(size=SIZE, supersample=SUPERSAMPLE):
    """Rows of RGBA tuples, each pixel the mean of supersample x supersample samples."""
    rows = []
    n = supersample * supersample
    radius = size / 2 - 1
    for py in range(size):
        row = []
        for px in range(size):
            acc = [0.0, 0.0, 0.0]
            cover = 0.0
            for j in range(supersample):
                for i in range(supersample):
                    x = (px + (i + 0.5) / supersample - size / 2) / radius
                    y = (py + (j + 0.5) / supersample - size / 2) / radius
                    colour, alpha = _sample(x, y)
                    cover += alpha
                    for k in range(3):
                        acc[k] += colour[k] * alpha
            if cover:
                rgb = tuple(int(round(a / cover)) for a in acc)
            else:
                rgb = (0, 0, 0)
            row.append(rgb + (int(round(255 * cover / n)),))
        rows.append(row)
    return rows


def _stored_zlib(data):
    """A zlib stream of stored (uncompressed) deflate blocks: byte-for-byte the same
    with every zlib."""
    out = bytearray(b"\x78\x01")
    for start in range(0, max(len(data), 1), 65535):
        block = data[start:start + 65535]
        final = 1 if start + 65535 >= len(data) else 0
        out += struct.pack("<BHH", final, len(block), 0xFFFF ^ len(block)) + block
    out += struct.pack(">I", zlib.adler32(data))
    return bytes(out)


def _chunk(kind, body):
    return struct.pack(">I", len(body)) + kind + body + struct.pack(">I", zlib.crc32(kind + body))


def png_bytes(rows):
    height, width = len(rows), len(rows[0])
    raw = b"".join(b"\x00" + bytes(v for px in row for v in px) for row in rows)
    return (
        b"\x89PNG\r\n\x1a\n"
        + _chunk(b"IHDR", struct.pack(">IIBBBBB", width, height, 8, 6, 0, 0, 0))
        + _chunk(b"IDAT", _stored_zlib(raw))
        + _chunk(b"IEND", b"")
    )


def icon_png():
    return png_bytes(pixels())


if __name__ == "__main__":
    import sys

    with open(sys.argv[1] if len(sys.argv) > 1 else "icon.png", "wb") as f:
        f.write(icon_png())
