"""Demand schedules (engine.demand_schedule): reading CSV/TOML, matching beams, clear errors.

Values are test inputs (kN → N by ×1000, SI definition of the kilo prefix); nothing here is a
design value.
"""

from __future__ import annotations

import pytest

from engine.demand_schedule import read_demand_schedule
from engine.errors import BadInputError
from engine.model import Member, Section


def beam(gid, tag="", name=""):
    return Member(global_id=gid, ifc_class="IfcBeam", role="beam", start=(0.0, 0.0, 0.0),
                  end=(6000.0, 0.0, 0.0), section=Section("310UB", "I", depth=300.0), tag=tag, name=name)


MEMBERS = [beam("2O2Fr$t4X7Zf8NOew3FLOH", tag="B1", name="Beam 1"),
           beam("0K7w8C$Xr0ZRGnPpNnU7Mq", tag="B2", name="Beam 2"),
           beam("3vB2YO$MX4xv5uCqZZG05x", tag="B3", name="Typical"),
           beam("1x9QdK$OP3uf3n3ZJ8Fw1Q", tag="B4", name="Typical")]


def write(tmp_path, name, text):
    p = tmp_path / name
    p.write_text(text, encoding="utf-8")
    return p


def test_csv_rows_match_beams_by_global_id_tag_and_name(tmp_path):
    p = write(tmp_path, "demands.csv",
              "# design end shears, kN\n"
              "beam,end,V_kN,N_kN\n"
              "2O2Fr$t4X7Zf8NOew3FLOH,start,85.5,20\n"
              "B2,both,-60\n"
              "Beam 1,end,40\n"
              "\n")
    sched = read_demand_schedule(p)
    assert [r.line for r in sched.rows] == [3, 4, 5]
    rows, warnings = sched.match(MEMBERS)
    assert warnings == []
    r = rows[("2O2Fr$t4X7Zf8NOew3FLOH", "start")]           # by GlobalId
    assert (r.V, r.N) == (85.5e3, 20e3)                       # 85.5 kN, 20 kN → N
    assert rows[("2O2Fr$t4X7Zf8NOew3FLOH", "end")].V == 40e3  # by Name
    assert rows[("0K7w8C$Xr0ZRGnPpNnU7Mq", "start")].V == 60e3  # by Tag, sign dropped
    assert rows[("0K7w8C$Xr0ZRGnPpNnU7Mq", "end")].N is None


def test_global_id_row_beats_tag_row_and_end_row_beats_both_row(tmp_path):
    p = write(tmp_path, "d.csv", "beam,end,V_kN\nB1,both,10\n2O2Fr$t4X7Zf8NOew3FLOH,end,30\n"
                                 "Beam 1,start,99\n")
    rows, _ = read_demand_schedule(p).match(MEMBERS)
    assert rows[("2O2Fr$t4X7Zf8NOew3FLOH", "end")].V == 30e3   # GlobalId beats Tag
    assert rows[("2O2Fr$t4X7Zf8NOew3FLOH", "start")].V == 10e3  # Tag beats Name


def test_shared_name_applies_to_each_beam_with_a_warning(tmp_path):
    p = write(tmp_path, "d.csv", "beam,end,V_kN\nTypical,both,50\n")
    rows, warnings = read_demand_schedule(p).match(MEMBERS)
    assert rows[("3vB2YO$MX4xv5uCqZZG05x", "start")].V == 50e3
    assert rows[("1x9QdK$OP3uf3n3ZJ8Fw1Q", "end")].V == 50e3
    assert len(warnings) == 1 and "matches 2 beams by Name" in warnings[0].message


def test_row_matching_no_beam_is_a_data_warning_naming_file_and_line(tmp_path):
    p = write(tmp_path, "d.csv", "beam,end,V_kN\nB1,start,10\nB99,end,20\n")
    rows, warnings = read_demand_schedule(p).match(MEMBERS)
    assert len(rows) == 1
    assert len(warnings) == 1
    assert "d.csv line 3" in warnings[0].message and "'B99' matches no beam" in warnings[0].message


def test_semicolon_csv_with_byte_order_mark_is_read(tmp_path):
    p = tmp_path / "d.csv"
    p.write_bytes("\ufeffBeam;End;v_kn;Note\nB3;START;12.5;from frame run 7\n".encode("utf-8"))
    (row,) = read_demand_schedule(p).rows
    assert (row.key, row.end, row.V, row.note) == ("B3", "start", 12.5e3, "from frame run 7")


def test_toml_schedule_rows_carry_their_line(tmp_path):
    p = write(tmp_path, "d.toml",
              '# schedule\n[[demand]]\nbeam = "B1"\nend = "both"\nV_kN = 85.0\nN_kN = 30\n\n'
              '[[demand]]\nbeam = "B2"\nend = "start"\nV_kN = 40\ncombination = "1.2G + 1.5Q"\n')
    rows = read_demand_schedule(p).rows
    assert [(r.key, r.line, r.V, r.N) for r in rows] == [("B1", 2, 85e3, 30e3), ("B2", 8, 40e3, None)]
    assert rows[1].combination == "1.2G + 1.5Q"


@pytest.mark.parametrize("text, match", [
    ("beam,end,V_kN\nB1,middle,10\n", r"d\.csv line 2: unknown end 'middle' \(use start, end, both\)"),
    ("beam,end,V_kN\nB1,start,ten\n", r"d\.csv line 2: V_kN 'ten' is not a number"),
    ("beam,end,V_kN,N_kN\nB1,start,10,x\n", r"d\.csv line 2: N_kN 'x' is not a number"),
    ("beam,end,V_kN\nB1,start,nan\n", r"d\.csv line 2: V_kN 'nan' is not a finite number"),
    ("beam,end,V_kN\nB1,start,10\nB1,start,12\n",
     r"d\.csv line 3: duplicate key: beam 'B1' end 'start' is already given on line 2"),
    ("beam,end,V_kN\nB1,both,10\nB1,end,12\n", r"d\.csv line 3: duplicate key: beam 'B1' end 'end'.*line 2"),
    ("beam,end,V_kN,M_kNm\nB1,start,10,5\n", r"d\.csv line 1: unknown column 'M_kNm'"),
    ("beam,V_kN\nB1,10\n", r"d\.csv line 1: missing column\(s\) end"),
    ("beam,end,V_kN\n,start,10\n", r"d\.csv line 2: the beam key is empty"),
    ("beam,end,V_kN\nB1,start,10,7\n", r"d\.csv line 2: 4 cells but the header on line 1 names 3"),
    ("", r"d\.csv: empty demand schedule"),
])
def test_bad_csv_schedule_names_file_line_and_problem(tmp_path, text, match):
    p = write(tmp_path, "d.csv", text)
    with pytest.raises(BadInputError, match=match):
        read_demand_schedule(p)


@pytest.mark.parametrize("text, match", [
    ('[[demand]]\nbeam = "B1"\nend = "start"\nV_kN = "85"\n', r"d\.toml line 1: V_kN must be a number"),
    ('[[demand]]\nbeam = "B1"\nend = "start"\nV_kN = 1\n\n[[demand]]\nbeam = "B1"\nend = "top"\nV_kN = 2\n',
     r"d\.toml line 6: unknown end 'top'"),
    ('[[demand]]\nbeam = "B1"\nend = "start"\nVkN = 1\n', r"d\.toml line 1: unknown key 'VkN'"),
    ('[[demand]]\nbeam = "B1"\nV_kN = 1\n', r"d\.toml line 1: \[\[demand\]\] lacks end"),
    ('[[row]]\nbeam = "B1"\n', r"d\.toml: unknown key 'row'"),
    ('[[demand]\n', r"d\.toml: not valid TOML"),
])
def test_bad_toml_schedule_names_file_line_and_problem(tmp_path, text, match):
    p = write(tmp_path, "d.toml", text)
    with pytest.raises(BadInputError, match=match):
        read_demand_schedule(p)


def test_missing_file_and_unknown_format_are_clear_errors(tmp_path):
    with pytest.raises(BadInputError, match=r"nope\.csv does not exist"):
        read_demand_schedule(tmp_path / "nope.csv")
    p = write(tmp_path, "d.xlsx", "x")
    with pytest.raises(BadInputError, match=r"d\.xlsx: unknown format '\.xlsx'"):
        read_demand_schedule(p)
