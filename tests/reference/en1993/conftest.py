"""Fixtures for the EN 1993 rule-set tests: the fin plate of the published worked example.

Source of the example: "Steel Buildings in Europe, Multi-Storey Steel Buildings, Part 5: Joint
Design" (SCI/CTICM; the EN 1993 version of the SCI P358 fin-plate model), section 3.4 "Worked
Example – Fin Plate", sheets 4, 6, 9 and 11 of 13 (pp. 5-41, 5-43, 5-46, 5-48), read via search
(infosteel.be / scoormetstaal.be copies). Data taken from those sheets: 5 rows × 2 lines of M20
8.8 bolts in 22 mm holes, p1 = 70, p2 = 60, e1 = 40, e2 = 50 mm; plate 360 × 10 S275
(f_y = 275, f_u = 430 MPa); V_Ed = 350 kN; beam web t_w = 9 mm S275 (275/430), e2,b = 40 mm.
z = 80 mm (support face to bolt-group centroid) is inferred from the published α = 0.022 and
β = 0.105 (α = z p2 / (2 I), I = 107 000 mm²), so a = 50 mm to the first bolt line. The sheets
that name the beam and column section (1-2 of 13) were not retrievable; the beam is taken as an
IPE A 550 with its dimensions # from memory (h 547, b 210, t_w 9.0, t_f 15.7, r 24, A 11 740 mm²),
used only where a check needs more than t_w.
"""

from __future__ import annotations

import pytest

from engine.model import BoltSpec, Demand, FinPlate, Joint, JointGeometry, Member, Section, Steel, Weld


@pytest.fixture()
def s275() -> Steel:
    return Steel("S275", 275.0, 430.0, "EN 1993-1-1 Table 3.1")


@pytest.fixture()
def example_plate(s275: Steel) -> FinPlate:
    return FinPlate(
        thickness=10.0, depth=360.0, width=160.0, steel=s275,
        bolts=BoltSpec("M20", 20.0, "8.8", threads_in_shear_plane=True),
        rows=5, lines=2, pitch=70.0, gauge=60.0,
        plate_end_edge=40.0, plate_side_edge=50.0, beam_end_edge=40.0, beam_top_edge=95.0, a=50.0,
        weld=Weld(8.0, "S275", both_sides=True),
    )


@pytest.fixture()
def example_beam(s275: Steel) -> Member:
    sec = Section("IPE A 550", "I", depth=547.0, width=210.0, web_thickness=9.0, flange_thickness=15.7,
                  root_radius=24.0, area=11740.0, source="test (dimensions from memory)")
    return Member("BEAM-1", "IfcBeam", "beam", (0.0, 0.0, 0.0), (6000.0, 0.0, 0.0), sec, s275)


@pytest.fixture()
def example_column(s275: Steel) -> Member:
    sec = Section("HEB 300", "I", depth=300.0, width=300.0, web_thickness=11.0, flange_thickness=19.0,
                  root_radius=27.0, area=14910.0, source="test (dimensions from memory)")
    return Member("COL-1", "IfcColumn", "column", (0.0, 0.0, 0.0), (0.0, 0.0, 3500.0), sec, s275)


@pytest.fixture()
def example_joint() -> Joint:
    return Joint("J-example", "BEAM-1", "start", "COL-1", "column-flange", JointGeometry((0.0, 0.0, 0.0)),
                 stiffness="flexible", reasons=("test",))


@pytest.fixture()
def example_demand() -> Demand:
    return Demand(V=350e3, N=0.0, source="schedule", combination="published example")
