"""ICR coefficients C against published tables of C for eccentrically loaded bolt groups.

What is compared. Each case is a bolt pattern of the AISC Steel Construction Manual, Part 7 tables
of C ("Coefficients C for Eccentrically Loaded Bolt Groups", Tables 7-6 to 7-13 in the 14th to
16th editions): ``lines`` vertical lines of ``rows`` bolts at pitch s, lines at gauge g, a load at
angle theta from the vertical whose line of action crosses the horizontal through the centroid of
the pattern at ex. Geometry is written in inches, as printed, and converted to mm (x 25.4) for the
engine. The engine's C (``normalisation="ultimate"``, C = P_u / R_ult) must agree with the printed
C within 2 % or half a unit of the last printed digit, whichever is larger.

Status of the values (read this first). The acceptance point asks for at least six PUBLISHED
values with their table and edition. None could be read: a search of about 65 look-ups (stored
web pages, documentation sites and public repositories: AISC Manual Part 7 tables of the 13th to
16th and LRFD editions, the AISC Design Examples, Segui, McCormac, Salmon and Johnson, the Kulak,
Fisher and Struik Guide, the CISC Handbook, university notes and solved problems) found contents
pages, introductions and problem statements, but no page on which a printed C with its pattern
and eccentricity could be read. Numbers shown by bolt-group calculators or programs were not used.
So ``CASES`` holds, for now, only a value recalled from memory (``published=False``), which does
NOT count towards the six. Each published value added later gets ``published=True`` and its
source (document, edition, table or example, page) in ``source``.

Normalisation. The one recalled value is reproduced to its printed digits by C = P_u / R_ult (the
engine's default) and not by C = P_u / R(0.34 in.) (1.9 % higher); see
``test_ultimate_normalisation_reproduces_the_printed_digits``. Being from memory, this is an
indication, not a confirmation from a printed page.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import pytest

from engine.boltgroup import R_AT_DELTA_MAX, icr_coefficient

IN = 25.4  # mm per inch


@dataclass(frozen=True)
class TableCase:
    """One tabulated C: pattern (inches), load (ex inches, angle degrees), printed value."""

    name: str
    rows: int  # bolts in one vertical line
    lines: int  # vertical lines of bolts
    pitch_in: float  # s, vertical spacing
    gauge_in: float  # spacing of the vertical lines (0 for one line)
    ex_in: float  # horizontal distance from the centroid to the line of action of the load
    angle_deg: float  # angle of the load from the vertical
    C_printed: float
    decimals: int  # digits printed after the decimal point
    source: str
    published: bool  # False: recalled from memory, does not count as a published check

    def bolts_mm(self) -> np.ndarray:
        """Bolt centres in mm: lines at x = 0, g, 2g, ...; bolts at y = 0, -s, -2s, ..."""
        x = np.repeat(np.arange(self.lines) * self.gauge_in, self.rows)
        y = np.tile(-np.arange(self.rows) * self.pitch_in, self.lines)
        return np.column_stack([x, y]) * IN

    def tolerance(self) -> float:
        """2 % of the printed value or half a unit of its last printed digit, the larger."""
        return max(0.02 * self.C_printed, 0.5 * 10.0 ** (-self.decimals))


CASES = [
    TableCase(
        name="2x6-s3-g5.5-ex16-a0",
        rows=6,
        lines=2,
        pitch_in=3.0,
        gauge_in=5.5,
        ex_in=16.0,
        angle_deg=0.0,
        C_printed=3.55,  # from memory
        decimals=2,
        # from memory: AISC Design Examples (companion to the Steel Construction Manual), example
        # "Eccentrically Loaded Bolt Group (IC Method)" (II.A-28 in v14.0, as recalled), quoting
        # Manual Table 7-8 (angle 0 deg, s = 3 in., ex = 16 in., n = 6, two lines at 5 1/2 in.).
        # Not re-read on a printed page; does not count towards the acceptance point.
        source="AISC Design Examples, Eccentrically Loaded Bolt Group (IC Method), "
        "Table 7-8 (from memory)",
        published=False,
    ),
]
IDS = [c.name for c in CASES]


@pytest.mark.parametrize("case", CASES, ids=IDS)
def test_icr_coefficient_within_2_percent_of_tabulated_value(case):
    C = icr_coefficient(case.bolts_mm(), case.ex_in * IN, case.angle_deg)
    assert abs(C - case.C_printed) <= case.tolerance(), (
        f"{case.name}: engine C = {C:.4f}, printed C = {case.C_printed} ({case.source})"
    )


@pytest.mark.parametrize("case", CASES, ids=IDS)
def test_every_case_names_its_source_and_status(case):
    # a value without a source, or a memory value passed off as published, is a defect
    assert case.source.strip()
    assert case.published == ("from memory" not in case.source)


def test_ultimate_normalisation_reproduces_the_printed_digits():
    # from memory: the recalled Design Examples value C = 3.55 (see CASES). C = P_u/R_ult rounds
    # to it; C = P_u/R(0.34 in.), 1/0.9815 = 1.9 % higher, prints as 3.62 and does not.
    case = CASES[IDS.index("2x6-s3-g5.5-ex16-a0")]
    half_digit = 0.5 * 10.0 ** (-case.decimals)
    C_ult = icr_coefficient(case.bolts_mm(), case.ex_in * IN, case.angle_deg)
    C_dm = icr_coefficient(
        case.bolts_mm(), case.ex_in * IN, case.angle_deg, normalisation="delta-max"
    )
    assert abs(C_ult - case.C_printed) <= half_digit
    assert abs(C_dm - case.C_printed) > half_digit
    assert C_dm == pytest.approx(C_ult / R_AT_DELTA_MAX, rel=1e-12)
