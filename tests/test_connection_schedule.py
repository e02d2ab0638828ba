"""The connection schedule: matching by GlobalId, Tag, Name, section and depth (most specific wins);
errors name the file, the line and the problem."""

from __future__ import annotations

import pytest

from engine.connection_schedule import bolt_diameter_mm, read_connection_schedule
from engine.errors import BadInputError
from engine.model import Joint, JointGeometry, Member, Section, Steel

HEADER = ("match,value,end,plate_thickness,plate_depth,plate_width,bolt_size,bolt_grade,rows,lines,pitch,gauge,"
          "plate_end_edge,plate_side_edge,beam_end_edge,beam_top_edge,a,weld_leg,weld_electrode\n")


def _row(match, value, end="both", t=10, rows=3, size="M20"):
    return f"{match},{value},{end},{t},210,105,{size},8.8,{rows},1,70,0,35,45,50,55,60,6,E48XX\n"


def _beam(gid="2O2Fr$t4X7Zf8NOew3FLOH", tag="B12", name="Beam 12", section="310UB40.4", depth=304.0):
    return Member(gid, "IfcBeam", "beam", (0, 0, 0), (6000, 0, 0), Section(section, "I", depth), name=name, tag=tag)


def _joint(beam, end="start"):
    return Joint("J-1", beam.global_id, end, "C", "column-flange", JointGeometry((0, 0, 0)))


def _steel(label):
    return Steel(label, 260.0, 410.0) if label == "250" else None


def test_most_specific_entry_wins_globalid_over_tag_over_section_over_depth(tmp_path):
    f = tmp_path / "s.csv"
    f.write_text(HEADER + _row("depth", "300-320", t=6) + _row("section", "310UB*", t=8)
                 + _row("tag", "B12", t=12) + _row("globalid", "2O2Fr$t4X7Zf8NOew3FLOH", "start", t=16))
    s = read_connection_schedule(f)
    b = _beam()
    assert s.lookup(_joint(b, "start"), b).fields["plate_thickness"] == 16   # GlobalId, start end only
    assert s.lookup(_joint(b, "end"), b).fields["plate_thickness"] == 12     # then Tag
    other = _beam(gid="0uA7yfWrz4wBs1xbFHhyKq", tag="B99")
    assert s.lookup(_joint(other), other).fields["plate_thickness"] == 8     # then section glob
    deep = _beam(gid="0uA7yfWrz4wBs1xbFHhyKq", tag="", section="UB 12", depth=310.0)
    assert s.lookup(_joint(deep), deep).fields["plate_thickness"] == 6       # then depth range
    shallow = _beam(gid="0uA7yfWrz4wBs1xbFHhyKq", tag="", section="200UB25.4", depth=203.0)
    assert s.lookup(_joint(shallow), shallow) is None


def test_name_match_and_toml_schedule(tmp_path):
    f = tmp_path / "s.toml"
    f.write_text("""
[[connection]]
match = "name"
value = "Beam 12"
end = "end"
plate_thickness = 10
plate_depth = 210
plate_width = 105
bolt_size = "3/4"
bolt_grade = "A325"
rows = 3
lines = 1
pitch = 76
gauge = 0
plate_end_edge = 38
plate_side_edge = 38
beam_end_edge = 45
beam_top_edge = 60
a = 64
weld_leg = 8
weld_electrode = "E70XX"
plate_grade = "250"
""")
    s = read_connection_schedule(f)
    b = _beam()
    e = s.lookup(_joint(b, "end"), b)
    assert e is not None and s.lookup(_joint(b, "start"), b) is None
    p = e.fin_plate(_steel, "250")
    assert p.bolts.diameter == pytest.approx(19.05)  # 3/4 in x 25.4 mm/in
    assert p.source == "scheduled" and p.steel.fy == 260.0


@pytest.mark.parametrize("size, mm", [("M16", 16.0), ("M20", 20.0), ("M24", 24.0), ("3/4", 19.05), ("7/8", 22.225),
                                      ("1", 25.4), ("1-1/8", 28.575)])
def test_bolt_sizes_as_the_trade_writes_them(size, mm):
    assert bolt_diameter_mm(size) == pytest.approx(mm)


@pytest.mark.parametrize(
    "body, match",
    [
        (_row("tag", "B1", end="middle"), r"line 2: end 'middle' must be start, end or both"),
        (_row("colour", "red"), r"line 2: match 'colour' must be one of globalid, tag, name, section, depth"),
        (_row("tag", "B1", t="thick"), r"line 2: 'plate_thickness' must be a number in mm, not 'thick'"),
        (_row("tag", "B1", rows="2.5"), r"line 2: 'rows' must be a whole number"),
        (_row("tag", "B1", size="X20"), r"line 2: bolt size 'X20' is not a metric size"),
        (_row("depth", "deep"), r"line 2: depth range 'deep' must look like '300-460'"),
        (_row("tag", "B1") + "tag,B2,both,10\n", r"line 3: 'plate_depth' is missing"),
    ],
)
def test_bad_schedule_names_the_file_line_and_problem(tmp_path, body, match):
    f = tmp_path / "bad.csv"
    f.write_text(HEADER + body)
    with pytest.raises(BadInputError, match=match) as info:
        read_connection_schedule(f)
    assert str(f) in str(info.value)


def test_unknown_column_and_wrong_suffix_are_errors(tmp_path):
    f = tmp_path / "bad.csv"
    f.write_text(HEADER.strip() + ",colour\n" + _row("tag", "B1").strip() + ",red\n")
    with pytest.raises(BadInputError, match="unknown column 'colour'"):
        read_connection_schedule(f)
    g = tmp_path / "s.xlsx"
    g.write_text("x")
    with pytest.raises(BadInputError, match="use a .csv or .toml file"):
        read_connection_schedule(g)
