"""Section and material data used by the demo model generator (invented demo project only).

Dimensions are those of Australian hot-rolled universal beams (UB) and columns (UC) to
AS/NZS 3679.1, as printed in the steel maker's hot rolled sections dimensions table. They were
written down **from memory** of that table (not looked up while writing this file); they are used
only to give the demo members realistic parametric profiles, never by a design check. All values
in mm: ``d`` overall depth, ``bf`` flange width, ``tf`` flange thickness, ``tw`` web thickness,
``r`` root radius.

The demo is an aid to exercise joint-audit; it is not a design. Results of the tool must be
checked by a competent engineer, and local codes and licensed practice take precedence.
"""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["SectionDims", "SECTIONS", "MEMBER_GRADE", "PLATE_GRADE", "BOLT_GRADE", "section"]


@dataclass(frozen=True)
class SectionDims:
    """An I section's designation and its dimensions in mm."""

    name: str
    d: float
    bf: float
    tf: float
    tw: float
    r: float

    def as_truth(self) -> dict[str, float]:
        """The dimensions under the key names the demo truth file uses (mm)."""
        return {
            "depth": self.d,
            "width": self.bf,
            "web_thickness": self.tw,
            "flange_thickness": self.tf,
            "root_radius": self.r,
        }


# AS/NZS 3679.1 Grade 300 universal sections; d, bf, tf, tw, r in mm.  # from memory
SECTIONS: dict[str, SectionDims] = {
    s.name: s
    for s in (
        SectionDims("250UB31.4", d=252.0, bf=146.0, tf=8.6, tw=6.1, r=8.9),  # from memory
        SectionDims("310UB40.4", d=304.0, bf=165.0, tf=10.2, tw=6.1, r=11.4),  # from memory
        SectionDims("360UB50.7", d=356.0, bf=171.0, tf=11.5, tw=7.3, r=11.4),  # from memory
        SectionDims("410UB53.7", d=403.0, bf=178.0, tf=10.9, tw=7.6, r=11.4),  # from memory
        SectionDims("460UB74.6", d=457.0, bf=190.0, tf=14.5, tw=9.1, r=11.4),  # from memory
        SectionDims("250UC89.5", d=260.0, bf=256.0, tf=17.3, tw=10.5, r=12.7),  # from memory
        SectionDims("310UC96.8", d=308.0, bf=305.0, tf=15.4, tw=9.9, r=16.5),  # from memory
        SectionDims("310UC118", d=315.0, bf=307.0, tf=18.7, tw=11.9, r=16.5),  # from memory
    )
}

MEMBER_GRADE = ("300", "AS/NZS 3679.1-300")
"""(grade label, material name) of the hot-rolled members."""

PLATE_GRADE = ("250", "AS/NZS 3678-250")
"""(grade label, material name) of the fin plates."""

BOLT_GRADE = ("8.8", "8.8/S")
"""(material name = property class, AS 4100 bolting category) of the bolts."""


def section(name: str) -> SectionDims:
    """The dimensions of the named demo section; ``KeyError`` names the missing designation."""
    try:
        return SECTIONS[name]
    except KeyError:
        raise KeyError(f"section {name!r} is not in the demo section table") from None
