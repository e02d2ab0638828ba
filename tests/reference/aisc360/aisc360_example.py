"""Shared inputs for the aisc360 reference tests: the published single-plate worked example.

AISC Design Examples V15.0 (AISC, 2017), Example II.A-17A "Single-plate connection (conventional -
beam-to-column flange)": an ASTM A992 W16×50 beam to an ASTM A992 W14×90 column flange,
RD = 8 kips, RL = 25 kips; PL 1/4 × 4-1/2 × 11-1/2 ASTM A36, four 3/4 in. Group A (A325) bolts,
threads included (N), standard holes, a = 3 in., pitch 3 in., Lev = 1-1/4 in., Leh = 1-1/2 in.,
3/16 in. E70 fillet welds both sides. The example takes φRn = 52.2 kips from Manual Table 10-10a.

The problem statement and the 52.2 kips answer are recalled from the publication (# from memory);
the Design Examples pages themselves could not be read in the stored material.
Section properties W16×50 (d = 16.3, bf = 7.07, tw = 0.380, tf = 0.630, kdes = 1.03 in.) and
W14×90 (d = 14.0, bf = 14.5, tw = 0.440, tf = 0.710 in.): AISC Manual Table 1-1 # from memory, except
tf = 0.710 in., found by search in AISC Design Examples V14.1, Example II.A-1 ("From AISC Manual
Table 1-1 ... W14×90 tf = 0.710 in.", scribd.com/document/455849748).
"""

from __future__ import annotations

from engine.model import BoltSpec, Cope, Demand, FinPlate, Joint, JointGeometry, Member, Section, Steel, Weld

IN = 25.4          # mm per inch
KSI = 6.894757     # MPa per ksi
KIP = 4448.222     # N per kip

A36 = Steel("A36", 36 * KSI, 58 * KSI, "AISC Manual Table 2-4")
A992 = Steel("A992", 50 * KSI, 65 * KSI, "AISC Manual Table 2-4")

W16X50 = Section("W16X50", "I", 16.3 * IN, 7.07 * IN, 0.380 * IN, 0.630 * IN, (1.03 - 0.630) * IN,
                 source="catalog:aisc")
W14X90 = Section("W14X90", "I", 14.0 * IN, 14.5 * IN, 0.440 * IN, 0.710 * IN, (1.31 - 0.710) * IN,
                 source="catalog:aisc")

RU_KIPS = 1.2 * 8.0 + 1.6 * 25.0   # = 49.6 kips, ASCE/SEI 7-16 §2.3.1 comb. 2


def plate(**kw) -> FinPlate:
    """The II.A-17A plate; keyword arguments replace fields."""
    base = dict(
        thickness=0.25 * IN, depth=11.5 * IN, width=4.5 * IN, steel=A36,
        bolts=BoltSpec("3/4", 0.75 * IN, "A325", True, "standard"),
        rows=4, lines=1, pitch=3.0 * IN, gauge=0.0,
        plate_end_edge=1.25 * IN, plate_side_edge=1.5 * IN,
        beam_end_edge=2.5 * IN,    # a = 3 in. less the 1/2 in. setback
        beam_top_edge=3.0 * IN,    # top of beam to the top bolt
        a=3.0 * IN, weld=Weld(3 / 16 * IN, "E70XX", True),
    )
    base.update(kw)
    return FinPlate(**base)


def beam(section: Section = W16X50, steel: Steel | None = A992) -> Member:
    return Member("BEAM-1", "IfcBeam", "beam", (0.0, 0.0, 0.0), (6000.0, 0.0, 0.0), section, steel)


def column(section: Section = W14X90) -> Member:
    return Member("COL-1", "IfcColumn", "column", (0.0, 0.0, 0.0), (0.0, 0.0, 4000.0), section, A992)


def joint(stiffness: str = "stiff", kind: str = "column-flange", copes: tuple[Cope, ...] = (),
          back_to_back: str | None = None) -> Joint:
    return Joint("J-TEST", "BEAM-1", "start", "COL-1", kind,
                 JointGeometry((0.0, 0.0, 0.0), copes=copes, back_to_back=back_to_back), stiffness)


def demand(V_kips: float = RU_KIPS, N_kips: float = 0.0) -> Demand:
    return Demand(V_kips * KIP, N_kips * KIP, "schedule", "1.2D + 1.6L")


def by_name(checks, name: str):
    """The one check called ``name`` (exact)."""
    found = [c for c in checks if c.name == name]
    assert len(found) == 1, f"{name!r}: {[c.name for c in checks]}"
    return found[0]
