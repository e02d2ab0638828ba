"""The HTML issue list: self-contained, cautions on top, every issue listed, model text escaped."""

from __future__ import annotations

import re

from helpers_results import doc, members, result
from engine.report_html import render_report

B, C, B2 = "2O2Fr$t4X7Zf8NOew3FLOH", "1kTvXnbbzCWw8lcMd1dR4o", "0uA7yfWrz4wBs1xbFHhyKq"


def test_markup_in_model_names_is_escaped():
    evil = '<script>alert("x")</script><img src=x onerror=alert(1)>'
    mem = members(B, C, beam_name=evil, storey='L1"><b>')
    html = render_report(doc([result(B, C, "fail")], mem))
    assert "<script>alert" not in html
    assert "<img src=x" not in html
    assert "&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;" in html or "&lt;script&gt;alert(\"x\")&lt;/script&gt;" in html
    assert 'data-storey="L1&quot;&gt;&lt;b&gt;"' in html
    # the only scripts are our own inline one
    assert html.count("<script>") == 1


def test_page_is_self_contained_with_cautions_first():
    html = render_report(doc([result(B, C, "fail")], members(B, C)))
    assert not re.search(r'(src|href)="(https?:)?//', html)
    assert "<link" not in html
    assert html.index("CAUTION") < html.index('class="issue"')
    assert "aid to a competent structural engineer" in html


def test_every_issue_is_listed_and_passing_joints_are_not():
    mem = {**members(B, C), **members(B2, C, "B2")}
    d = doc([result(B, C, "fail"), result(B2, C, "incomplete", end="end"), result(B, C, "pass", end="end")], mem)
    html = render_report(d)
    assert html.count('<article class="issue"') == 2
    assert 'data-status="fail"' in html and 'data-status="incomplete"' in html
    assert "bolt shear" in html and "AS 4100 9.3.2.1" in html
    assert "column flange, column continuous → stiff" in html


def test_no_issue_page_says_so():
    html = render_report(doc([result(B, C, "pass")], members(B, C)))
    assert "No issues: every checked joint passes." in html


def test_joints_needing_design_are_escaped_table_rows_without_drawings():
    evil = '<script>alert("x")</script>'
    mem = members(B, C, beam_name=evil, storey='L1"><b>')
    d = doc([result(B, C, "needs-design")], mem)
    d["joints"][0]["stiffness_reasons"] = ["flange <b>", "web & 'stem'"]
    html = render_report(d)
    assert html.count('<tr class="issue"') == 1 and '<article class="issue"' not in html
    assert "<script>alert" not in html and "&lt;script&gt;" in html
    assert 'data-storey="L1&quot;&gt;&lt;b&gt;"' in html
    assert "flange &lt;b&gt;; web &amp; &#x27;stem&#x27;" in html
    assert "<svg" not in html.split("<main>")[1]  # no drawing for a joint with no connection


def test_a_spool_that_cannot_be_written_names_the_issue_list(tmp_path, monkeypatch):
    # the rows of joints needing design go to a spool beside the outputs while results.json is
    # written: a failure there must name the issue list, not the file being written at the time
    import pytest

    import engine.report_html as report_html
    from engine.errors import OutputError

    monkeypatch.setattr(report_html, "_SPOOL_IN_MEMORY", 1)  # to a file with the first row
    issues = report_html.IssueList(str(tmp_path / "no-such-folder"), "out/issues.html")
    row = {"id": "J-1", "status": "needs-design", "kind": "beam-web", "storey": "Level 1", "end": "start",
           "beam": "B1", "beam_name": "B1", "beam_section": "S", "support": "G1", "support_name": "G1",
           "support_section": "S", "stiffness": "flexible", "stiffness_reasons": ["why"], "demand": None,
           "geometry": {"copes": []}, "note": "", "baseline": None, "utilisation": None}
    with pytest.raises(OutputError, match="out/issues.html"):
        issues.add(row)
