"""Fin-plate layout geometry for the rule sets: re-exported from :mod:`engine.layout`, where the
code-neutral geometry lives (the drawings use it too)."""

from engine.layout import (  # noqa: F401
    bolt_group_centroid_x,
    bolt_xy,
    edge_distance_along,
    plate_rectangle,
    web_region,
)

__all__ = ["bolt_xy", "bolt_group_centroid_x", "plate_rectangle", "web_region", "edge_distance_along"]
