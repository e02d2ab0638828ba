"""Render drawing primitives (:mod:`engine.drawing`) to PNG with Pillow, for BCF snapshots.

Pillow is used because it is a well-kept, self-contained wheel (no system graphics libraries), so the
snapshot works on any machine the tool installs on.
"""

from __future__ import annotations

import io
import math
from typing import Sequence

from engine.drawing import _STYLE, Prim, _bounds

__all__ = ["to_png"]


def _rgb(colour: str) -> tuple[int, int, int] | None:
    if colour == "none":
        return None
    c = colour.lstrip("#")
    return (int(c[0:2], 16), int(c[2:4], 16), int(c[4:6], 16))


def to_png(prims: Sequence[Prim], *, width_px: int = 640, height_px: int = 480) -> bytes:
    """A PNG (bytes) of the primitives fitted into ``width_px`` × ``height_px`` on white."""
    from PIL import Image, ImageDraw, ImageFont

    x0, y0, x1, y1 = _bounds(prims)
    pad = 0.06 * max(x1 - x0, y1 - y0, 1.0)
    x0, y0, x1, y1 = x0 - pad, y0 - pad, x1 + pad, y1 + pad
    s = min(width_px / (x1 - x0), height_px / (y1 - y0))
    ox = (width_px - s * (x1 - x0)) / 2.0
    oy = (height_px - s * (y1 - y0)) / 2.0

    def P(x: float, y: float) -> tuple[float, float]:
        return (ox + (x - x0) * s, oy + (y1 - y) * s)

    img = Image.new("RGB", (width_px, height_px), (255, 255, 255))
    d = ImageDraw.Draw(img)
    try:
        font = ImageFont.load_default(size=15)
    except TypeError:  # Pillow < 10.1 has one fixed-size default font
        font = ImageFont.load_default()
    for p in prims:
        fill, stroke, sw = _STYLE[p.role]
        f, o, w = _rgb(fill), _rgb(stroke), max(1, int(round(sw * 1.5)))
        c = p.coords
        if p.kind == "rect":
            a, b = P(c[0], c[1] + c[3]), P(c[0] + c[2], c[1])
            d.rectangle([a, b], fill=f, outline=o, width=w)
        elif p.kind == "circle":
            cx, cy = P(c[0], c[1])
            r = c[2] * s
            d.ellipse([cx - r, cy - r, cx + r, cy + r], fill=f, outline=o, width=w)
        elif p.kind == "line":
            d.line([P(c[0], c[1]), P(c[2], c[3])], fill=o, width=w)
        elif p.kind == "arrow":
            a, b = P(c[0], c[1]), P(c[2], c[3])
            d.line([a, b], fill=o, width=w)
            ang = math.atan2(b[1] - a[1], b[0] - a[0])
            if math.hypot(b[0] - a[0], b[1] - a[1]) > 1:
                hl = 10.0
                left = (b[0] - hl * math.cos(ang - 0.4), b[1] - hl * math.sin(ang - 0.4))
                right = (b[0] - hl * math.cos(ang + 0.4), b[1] - hl * math.sin(ang + 0.4))
                d.polygon([b, left, right], fill=o)
        elif p.kind == "poly":
            d.polygon([P(x, y) for x, y in zip(c[0::2], c[1::2])], fill=f, outline=o, width=w)
        elif p.kind == "text":
            d.text(P(c[0], c[1]), p.label, fill=f or (0, 0, 0), font=font, anchor="ls")
    buf = io.BytesIO()
    img.save(buf, format="PNG", optimize=False, compress_level=1)
    return buf.getvalue()
