"""Builders of small result documents for the output tests (invented test data)."""

from __future__ import annotations

from engine.model import (BoltSpec, Check, Demand, FinPlate, Frame, Joint, JointGeometry, JointResult,
                          Member, Section, Steel, Weld)
from engine.results import results_document


def plate() -> FinPlate:
    return FinPlate(10, 230, 110, Steel("250", 260, 410), BoltSpec("M20", 20, "8.8", hole_diameter=22), 3, 1, 70, 0,
                    45, 50, 50, 60, 60, Weld(6, "E48XX"), source="modelled")


def members(beam_gid: str, support_gid: str, beam_name: str = "B1", storey: str = "Level 1") -> dict[str, Member]:
    beam = Member(beam_gid, "IfcBeam", "beam", (0, 0, 4200), (7200, 0, 4200),
                  Section("310UB40.4", "I", 304, 165, 6.1, 10.2, 11.4, 5210), name=beam_name, storey=storey)
    col = Member(support_gid, "IfcColumn", "column", (0, 0, 0), (0, 0, 8000),
                 Section("250UC89.5", "I", 260, 256, 10.5, 17.3, 13), name="C1", storey=storey)
    return {beam_gid: beam, support_gid: col}


def result(beam_gid: str, support_gid: str, status: str, end: str = "start", util: float = 1.2) -> JointResult:
    from engine.model import joint_id

    j = Joint(joint_id(beam_gid, end, support_gid), beam_gid, end, support_gid, "column-flange",
              JointGeometry((0.0, 0.0, 4200.0), 90.0, 10.0), "stiff", ("column flange, column continuous → stiff",))
    checks = (
        Check("bolt shear", "AS 4100 9.3.2.1", 120e3, 100e3, "N", 1.2, False),
        Check("plate bending", "AS 4100 5.1", 5e6, 10e6, "N·mm", 0.5, True),
    )
    if status == "pass":
        checks = (Check("bolt shear", "AS 4100 9.3.2.1", 50e3, 100e3, "N", 0.5, True),)
        util = 0.5
    if status in ("fail", "pass"):
        return JointResult(j, Demand(120e3 if status == "fail" else 50e3, 0.0, "schedule", "1.2G + 1.5Q"), plate(), checks,
                           checks[0].name, util, status)
    return JointResult(j, Demand(120e3, 0.0, "schedule"), None, (), None, None, status,
                       missing=("end shear",) if status == "incomplete" else ())


def doc(results, mem, baseline=None, removed=(), file="model.ifc", date="2026-12-02T01:30:00+00:00"):
    frame = Frame(file, "IFC4", "MILLIMETRE", 1.0)
    return results_document(results, frame, mem, code="as4100", code_title="AS 4100", baseline=baseline,
                            removed=removed, run_date=date)
