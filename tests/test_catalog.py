"""The section catalog and steel-grade tables (rules/catalog.py, rules/data/*.toml).

Where the tables come from is written in each file's header (values recalled from memory are
marked so there). These tests check the look-up and name normalisation, and check every table
row against itself: its area and second moments must agree with those computed from its own
depth, widths, thicknesses and root radius (plates plus fillets), and its mass with the area ×
7850 kg/m³ (common practice), which catches a mistyped or misremembered number.
"""

from __future__ import annotations

import pytest

from engine.model import Section, Steel
from ifc_io.read_profiles import i_section_properties
from rules.catalog import (SECTION_TABLES, lookup_section, lookup_steel, normalise_grade_label,
                           normalise_section_name, parse_designation)
from rules.tables import load_table


@pytest.mark.parametrize("name, key", [
    ("310UB40.4", "310UB40.4"), ("UB 310x40.4", "310UB40.4"), ("310 UB 40.4", "310UB40.4"),
    ("530UB82.0", "530UB82"), ("IPE300", "IPE300"), ("IPE 300", "IPE300"), ("ipe-300", "IPE300"),
    ("HEA200", "HEA200"), ("HE 200 A", "HEA200"), ("HE200A", "HEA200"), ("HE 300 B", "HEB300"),
    ("W12X26", "W12X26"), ("W12x26", "W12X26"), ("W 12 x 26", "W12X26"), ("150PFC", "150PFC"),
    ("not a section", None), ("UC254*254*73", None),
])
def test_normalise_section_name(name, key):
    assert normalise_section_name(name) == key


@pytest.mark.parametrize("name, table, depth, width", [
    ("310UB40.4", "sections_asnzs", 304, 165),
    ("UB 310x40.4", "sections_asnzs", 304, 165),
    ("310UC96.8", "sections_asnzs", 308, 305),
    ("150PFC17.7", "sections_asnzs", 150, 75),   # Revit writes the PFC mass after the designation
    ("IPE300", "sections_en", 300, 150),
    ("IPE 300", "sections_en", 300, 150),
    ("HEA200", "sections_en", 190, 200),
    ("HE 200 A", "sections_en", 190, 200),
    ("W12X26", "sections_us", 12.2 * 25.4, 6.49 * 25.4),
    ("W12x26", "sections_us", 12.2 * 25.4, 6.49 * 25.4),
])
def test_lookup_section(name, table, depth, width):
    s = lookup_section(name)
    assert isinstance(s, Section)
    assert s.source == f"catalog:{table}" and s.name == name
    assert s.depth == pytest.approx(depth) and s.width == pytest.approx(width)
    assert s.known


def test_lookup_section_units_are_mm():
    s = lookup_section("IPE300")  # the table is in cm² and cm⁴
    assert s.area == pytest.approx(5380.0) and s.I_major == pytest.approx(8356e4) and s.I_minor == pytest.approx(604e4)
    w = lookup_section("W12X26")  # the table is in inches
    assert w.area == pytest.approx(7.65 * 645.16) and w.I_major == pytest.approx(204 * 25.4**4)
    assert w.root_radius == pytest.approx((0.680 - 0.380) * 25.4)  # k_des − tf


@pytest.mark.parametrize("name, kind, d, b, t", [
    ("100x6.0SHS", "RHS", 100, 100, 6.0),
    ("SHS 100x100x6", "RHS", 100, 100, 6.0),
    ("150x50x3.0RHS", "RHS", 150, 50, 3.0),
    ("168.3x6.4CHS", "CHS", 168.3, 168.3, 6.4),
    ("CHS 168.3x6.4", "CHS", 168.3, 168.3, 6.4),
    ("100x100x10EA", "angle", 100, 100, 10),
    ("150x90x8UA", "angle", 150, 90, 8),
    ("L100x100x10", "angle", 100, 100, 10),
    ("HSS6X6X1/4", "RHS", 6 * 25.4, 6 * 25.4, 0.25 * 25.4),
    ("HSS6.625X.280", "CHS", 6.625 * 25.4, 6.625 * 25.4, 0.280 * 25.4),
    ("L3-1/2X3X3/8", "angle", 3.5 * 25.4, 3 * 25.4, 0.375 * 25.4),
    ("L2-1/2X2-1/2X1/4", "angle", 2.5 * 25.4, 2.5 * 25.4, 0.25 * 25.4),
])
def test_designations_that_spell_out_their_dimensions(name, kind, d, b, t):
    s = lookup_section(name)
    assert s is not None and s.source == "catalog:designation"
    assert (s.kind, s.depth, s.width, s.web_thickness) == (kind, pytest.approx(d), pytest.approx(b), pytest.approx(t))
    assert s.area > 0


@pytest.mark.parametrize("name", ["", "   ", "Beam A", "300x300", "Concrete-Rectangular-Column", "UB", "X99"])
def test_unknown_names(name):
    assert lookup_section(name) is None
    assert parse_designation(name) is None


@pytest.mark.parametrize("table", SECTION_TABLES)
def test_tables_name_their_source(table):
    data = load_table(table)
    meta = data["meta"]
    assert meta["table"] == table and meta["standard"] and meta["source"]
    assert meta["from_memory"] is True
    from importlib import resources

    header = resources.files("rules").joinpath("data", f"{table}.toml").read_text(encoding="utf-8")
    assert "Source:" in header and "# from memory" in header
    assert len(data["sections"]) >= 20


def _rows():
    for table in SECTION_TABLES:
        for name in load_table(table)["sections"]:
            yield table, name


@pytest.mark.parametrize("table, name", list(_rows()))
def test_each_row_agrees_with_its_own_dimensions(table, name):
    s = lookup_section(name)
    row = load_table(table)["sections"][name]
    assert s.kind in ("I", "channel")
    assert s.depth > s.width / 3 and 0 < s.web_thickness < s.flange_thickness * 1.2 < s.depth / 4
    if s.kind == "I":
        area, ix, iy = i_section_properties(s.depth, s.width, s.web_thickness, s.flange_thickness, s.root_radius)
        assert s.area == pytest.approx(area, rel=0.03)
        assert s.I_major == pytest.approx(ix, rel=0.03)
        assert s.I_minor == pytest.approx(iy, rel=0.03)
    else:
        hw = s.depth - 2 * s.flange_thickness
        area = 2 * s.width * s.flange_thickness + hw * s.web_thickness + 2 * (1 - 3.14159265 / 4) * s.root_radius**2
        assert s.area == pytest.approx(area, rel=0.03)
    # mass per length: kg/m = A[mm²] × 7850e-6 (AS, EN); lb/ft = A[in²] × 3.40 (US, 490 lb/ft³)
    if table == "sections_us":
        assert row["mass"] == pytest.approx(row["A"] * 3.40, rel=0.03)
    else:
        assert row["mass"] == pytest.approx(s.area * 7850e-6, rel=0.03)


@pytest.mark.parametrize("label, grade, fy, fu", [
    ("S355", "S355", 355, 470),
    ("S355JR", "S355", 355, 470),
    ("STEEL/S275J0", "S275", 275, 410),
    ("S275", "S275", 275, 410),
    ("s235jr", "S235", 235, 360),
    ("Grade 300", "AS/NZS 3679.1-300", 320, 440),
    ("AS/NZS 3679.1-300", "AS/NZS 3679.1-300", 320, 440),
    ("300PLUS", "AS/NZS 3679.1-300", 320, 440),
    ("300", "AS/NZS 3679.1-300", 320, 440),
    ("Grade 350", "AS/NZS 3679.1-350", 360, 480),
    ("AS/NZS 3678-250", "AS/NZS 3678-250", 280, 410),
    ("A992", "A992", 345, 450),
    ("ASTM A992", "A992", 345, 450),
    ("A36", "A36", 250, 400),
    ("ASTM A572 Gr. 50", "A572 Gr. 50", 345, 450),
    ("A572-65", "A572 Gr. 65", 450, 550),
    ("A500 Gr. C", "A500 Gr. C", 345, 425),
    ("default", "default", 235, 360),
])
def test_lookup_steel(label, grade, fy, fu):
    s = lookup_steel(label)
    assert isinstance(s, Steel)
    assert (s.grade, s.fy, s.fu) == (grade, fy, fu)
    assert s.source.startswith("rules/data/steel_grades.toml")


@pytest.mark.parametrize("label", ["", "Concrete", "Metal - Steel - 345 MPa", "StructuralTimber",
                                   "Concrete-Rectangular-Column:300x300", "Unknown"])
def test_labels_naming_no_grade(label):
    assert lookup_steel(label) is None


def test_en_values_are_table_7_of_en10025_2():
    # EN 10025-2:2019 Table 7 (as reproduced at readle.co.uk): fy for t <= 16 mm, fu for 3..100 mm
    for grade, fy, fu in [("S235", 235, 360), ("S275", 275, 410), ("S355", 355, 470), ("S450", 450, 550)]:
        s = lookup_steel(grade)
        assert (s.fy, s.fu) == (fy, fu)
        assert "EN 10025-2" in s.source and "Table 7" in s.source


def test_every_grade_row_is_complete():
    rows = load_table("steel_grades")["grade"]
    names = [r["grade"] for r in rows]
    assert len(names) == len(set(names)) and "default" in names
    for r in rows:
        assert 200 <= r["fy"] < r["fu"] <= 800, r["grade"]
        assert r["standard"] and r["table"]
        assert lookup_steel(r["grade"]).grade == r["grade"]
        for alias in r.get("aliases", []):
            assert lookup_steel(alias).grade == r["grade"], alias


def test_grade_label_tokens():
    assert normalise_grade_label("AS/NZS 3679.1-300") == ("AS", "NZS", "3679.1", "300")
    assert normalise_grade_label("S355J0") == ("S", "355", "J", "0")
