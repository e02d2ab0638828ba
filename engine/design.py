"""``--design``: the lightest fin plate that passes every check of the chosen rule set.

Search over bolt size, rows, lines, plate thickness and weld leg within the candidate table
(``rules/data/design_space.toml``, per code), in three steps:

1. **Enumerate** every combination as numpy arrays and lay each out by the table's pitch and edge
   distances: the plate top sits ``top_clearance`` below the root radius of the top flange (or below
   a top cope), ``a`` = joint gap + beam end edge (or the table's clearance when the model has no
   gap).
2. **Screen** (vectorised) with necessary conditions only — a candidate that fails one cannot pass
   the rule set: the plate ends above the inside face of the bottom flange (or a bottom cope); n × (one bolt's design shear) ≥ V (an
   eccentric group carries less than that); 0.6 fu × plate area ≥ V (no code gives a plate more shear
   capacity than 0.6 fy × area — AS 4100 0.9 × 0.6 fy, EN 1993 fy/√3, AISC 1.0 × 0.6 Fy — and fu
   bounds the thickness-dependent fy a rule set may use); two welds × capacity per mm × plate depth
   ≥ V.
3. **Check** the survivors in order of weight with the rule set's full ``check_fin_plate``; the first
   that passes every check (none failed, none incomplete) is the lightest passing design.

Weight model: plate mass (t × depth × width × 7850 kg/m³) + bolts (the table's mass per bolt with
nut and washer) + the two fillet welds (leg²/2 × plate depth × 7850 kg/m³ each). Ties are broken by
fewer bolts, then thinner plate, then smaller weld. Steel density 7850 kg/m³ is common practice.

Lengths mm, forces N, masses kg. An aid to a competent engineer: a proposed connection is a starting
point to be checked and detailed by a competent engineer; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Mapping, Sequence

import numpy as np

from engine.connection_schedule import bolt_diameter_mm
from engine.model import BoltSpec, Check, Demand, FinPlate, Joint, Member, Steel, Weld

__all__ = ["DesignSpace", "Proposal", "enumerate_candidates", "propose_fin_plate", "candidate_plate", "DENSITY_KG_MM3"]

DENSITY_KG_MM3 = 7850e-9  # common practice: steel density 7850 kg/m³


@dataclass(frozen=True)
class DesignSpace:
    """The candidate table of one code (see ``rules/data/design_space.toml``), mm and kg."""

    bolt_sizes: tuple[str, ...]
    bolt_grade: str
    plate_thicknesses: tuple[float, ...]
    weld_legs: tuple[float, ...]
    max_rows: int
    max_lines: int
    pitch: Mapping[str, float]
    edge: Mapping[str, float]
    beam_end_edge: Mapping[str, float]
    bolt_mass_kg: Mapping[str, float]
    clearance: float
    top_clearance: float
    electrode: str
    plate_steel: Steel

    @classmethod
    def from_table(cls, table: Mapping[str, Any], electrode: str, plate_steel: Steel) -> "DesignSpace":
        return cls(
            tuple(table["bolt_sizes"]), str(table["bolt_grade"]), tuple(float(t) for t in table["plate_thicknesses"]),
            tuple(float(w) for w in table["weld_legs"]), int(table["max_rows"]), int(table["max_lines"]),
            dict(table["pitch"]), dict(table["edge"]), dict(table["beam_end_edge"]), dict(table["bolt_mass_kg"]),
            float(table["clearance"]), float(table["top_clearance"]), electrode, plate_steel,
        )


@dataclass(frozen=True)
class Proposal:
    """The outcome of the search: the plate and its checks, or ``None`` and the reason."""

    plate: FinPlate | None
    checks: tuple[Check, ...]
    reason: str
    candidates: int
    screened: int
    checked: int


def _web_band(beam: Member, joint: Joint, space: DesignSpace) -> tuple[float, float]:
    """(distance from the top of the beam to the plate top, the most plate depth there is room for)
    in mm. The plate top sits ``top_clearance`` below the top flange's root radius (or a top cope);
    the plate may run down to the inside face of the bottom flange (or a bottom cope) — a physical
    limit only; the rule set's own detailing checks decide the rest."""
    s = beam.section
    d = s.depth or 0.0
    tf = s.flange_thickness or 0.0
    root = tf + (s.root_radius or 0.0)
    top_cope = max((c.depth for c in joint.geometry.copes if c.where == "top"), default=0.0)
    bot_cope = max((c.depth for c in joint.geometry.copes if c.where == "bottom"), default=0.0)
    top = max(root, top_cope) + space.top_clearance
    return top, max(d - top - max(tf, bot_cope), 0.0)


def enumerate_candidates(space: DesignSpace) -> dict[str, np.ndarray]:
    """Every combination of (bolt size index, rows, lines, plate thickness, weld leg) as arrays."""
    grids = np.meshgrid(
        np.arange(len(space.bolt_sizes)), np.arange(2, space.max_rows + 1), np.arange(1, space.max_lines + 1),
        np.array(space.plate_thicknesses), np.array(space.weld_legs), indexing="ij",
    )
    size, rows, lines, t, leg = (g.ravel() for g in grids)
    return {"size": size, "rows": rows, "lines": lines, "t": t, "leg": leg}


def candidate_plate(space: DesignSpace, i_size: int, rows: int, lines: int, t: float, leg: float,
                    joint: Joint, beam: Member) -> FinPlate:
    """The fin plate of one candidate, laid out by the table (see the module docstring)."""
    size = space.bolt_sizes[i_size]
    p, e, be = space.pitch[size], space.edge[size], space.beam_end_edge[size]
    gap = joint.geometry.gap if joint.geometry.gap is not None and joint.geometry.gap > 0 else space.clearance
    a = gap + be
    top, _ = _web_band(beam, joint, space)
    return FinPlate(
        thickness=float(t), depth=2 * e + (rows - 1) * p, width=a + (lines - 1) * p + e, steel=space.plate_steel,
        bolts=BoltSpec(size, bolt_diameter_mm(size), space.bolt_grade), rows=int(rows), lines=int(lines),
        pitch=p, gauge=p if lines > 1 else 0.0, plate_end_edge=e, plate_side_edge=e, beam_end_edge=be,
        beam_top_edge=top + e, a=a, weld=Weld(float(leg), space.electrode, True), source="proposed",
    )


def propose_fin_plate(joint: Joint, demand: Demand, beam: Member, support: Member | None, ruleset,
                      policy: str, space: DesignSpace) -> Proposal:
    """The lightest passing fin plate for ``joint`` under ``demand`` (see the module docstring)."""
    c = enumerate_candidates(space)
    n_all = len(c["size"])
    V = abs(float(demand.V))
    sizes = space.bolt_sizes
    p = np.array([space.pitch[s] for s in sizes])[c["size"]]
    e = np.array([space.edge[s] for s in sizes])[c["size"]]
    be = np.array([space.beam_end_edge[s] for s in sizes])[c["size"]]
    mass_bolt = np.array([space.bolt_mass_kg[s] for s in sizes])[c["size"]]
    phi_vf = np.array([ruleset.bolt_shear_capacity(s, space.bolt_grade) for s in sizes])[c["size"]]
    weld_cap = {leg: ruleset.fillet_weld_capacity(leg, space.electrode) for leg in space.weld_legs}
    w_cap = np.array([weld_cap[leg] for leg in c["leg"]])
    gap = joint.geometry.gap if joint.geometry.gap is not None and joint.geometry.gap > 0 else space.clearance
    depth = 2 * e + (c["rows"] - 1) * p
    width = gap + be + (c["lines"] - 1) * p + e
    n = c["rows"] * c["lines"]
    _, band = _web_band(beam, joint, space)
    ok = (depth <= band) & (n * phi_vf >= V) & (0.6 * space.plate_steel.fu * depth * c["t"] >= V) & (2 * w_cap * depth >= V)
    mass = DENSITY_KG_MM3 * (c["t"] * depth * width + c["leg"] ** 2 * depth) + n * mass_bolt
    idx = np.flatnonzero(ok)
    order = idx[np.lexsort((c["leg"][idx], c["t"][idx], n[idx], mass[idx]))]
    closest: tuple[float, str] | None = None
    for k, i in enumerate(order, 1):
        plate = candidate_plate(space, int(c["size"][i]), int(c["rows"][i]), int(c["lines"][i]), float(c["t"][i]),
                                float(c["leg"][i]), joint, beam)
        checks = tuple(ruleset.check_fin_plate(joint, demand, plate, beam, support, policy))
        bad = [x for x in checks if not x.passed or x.incomplete]
        if not bad:
            return Proposal(plate, checks, f"lightest of {n_all} candidates ({mass[i]:.1f} kg)", n_all, len(idx), k)
        worst = max(bad, key=lambda x: (x.incomplete, x.utilisation if x.utilisation == x.utilisation else 9e9))
        if closest is None or len(bad) == 1:
            closest = (float(mass[i]), f"{worst.name} ({worst.clause})")
    if not len(idx):
        reason = (f"no fin plate in the design table fits the clear web depth ({band:.0f} mm) and carries "
                  f"V* = {V / 1e3:.1f} kN" if band > 0 else "the beam's section is unknown or has no clear web depth")
    else:
        reason = f"none of {len(idx)} candidate fin plates passes; e.g. {closest[1] if closest else 'checks fail'}"
    return Proposal(None, (), reason, n_all, len(idx), len(idx))
