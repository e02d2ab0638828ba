"""The real public IFC files in shared/models (see its SOURCES.md) that the reader tests go through."""

REAL_FILES = [
    "small-steel-frame-ifc2x3-mm.ifc",
    "simple-frame-ifc4-m.ifc",
    "named-profiles-frame-ifc2x3-mm.ifc",
    "beam-parametric-cross-section-ifc4x3.ifc",
    "beam-cardinal-points-ifc4x3.ifc",
    "grid-placement-ifc4x3.ifc",
    "timber-frame-path-connections-ifc4-mm.ifc",
    "analysis-model-building-ifc4.ifc",
]
