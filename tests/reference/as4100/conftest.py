"""Shared inputs of the AS 4100 reference tests: one typical web side plate, built from dimensions.

Section dimensions of 310UB40.4 and 250UC72.9 (d, bf, tf, tw, r1) are from the Australian hot-rolled
section tables (OneSteel / InfraBuild "Hot rolled and structural steel products") # from memory.
"""

from __future__ import annotations

from dataclasses import replace

import pytest

from engine.model import BoltSpec, Cope, Demand, FinPlate, Joint, JointGeometry, Member, Section, Steel, Weld
from rules.as4100 import AS4100


@pytest.fixture(scope="module")
def rs() -> AS4100:
    return AS4100()


@pytest.fixture()
def beam() -> Member:
    return Member("BEAM-310UB40", "IfcBeam", "beam", (0.0, 0.0, 0.0), (6000.0, 0.0, 0.0),
                  Section("310UB40.4", "I", 304.0, 165.0, 6.1, 10.2, 11.4, 5210.0),
                  Steel("300", 320.0, 440.0))


@pytest.fixture()
def column() -> Member:
    return Member("COL-250UC73", "IfcColumn", "column", (0.0, 0.0, 0.0), (0.0, 0.0, 4000.0),
                  Section("250UC72.9", "I", 254.0, 254.0, 8.6, 14.2, 13.0, 9320.0),
                  Steel("300", 300.0, 440.0))


@pytest.fixture()
def make_plate():
    """Factory: 3 × M20 8.8/S at 70 pitch, 10 mm Grade 250 plate 230 deep, a = 60 mm, one bolt line,
    8 mm E48XX SP fillet welds both sides; keyword arguments replace fields."""

    def _make(**kw) -> FinPlate:
        base = FinPlate(
            thickness=10.0, depth=230.0, width=95.0, steel=Steel("250", 260.0, 410.0),
            bolts=BoltSpec("M20", 20.0, "8.8/S"), rows=3, lines=1, pitch=70.0, gauge=0.0,
            plate_end_edge=45.0, plate_side_edge=35.0, beam_end_edge=40.0, beam_top_edge=80.0, a=60.0,
            weld=Weld(8.0, "E48XX", True),
        )
        return replace(base, **kw)

    return _make


@pytest.fixture()
def make_joint():
    def _make(stiffness: str = "flexible", kind: str = "column-flange", copes: tuple[Cope, ...] = ()) -> Joint:
        return Joint("J-test", "BEAM-310UB40", "start", "COL-250UC73", kind,
                     JointGeometry((0.0, 0.0, 0.0), copes=copes), stiffness)

    return _make


@pytest.fixture()
def by_name():
    def _by(checks) -> dict:
        out = {}
        for c in checks:
            assert c.name not in out, f"check {c.name!r} appears twice"
            out[c.name] = c
        return out

    return _by


@pytest.fixture()
def demand150() -> Demand:
    return Demand(150e3, 0.0, "schedule", "1.2G + 1.5Q")
