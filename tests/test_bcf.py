"""BCF output: every XML part validates against the buildingSMART XSDs (2.1 and 3.0); topic GUIDs
are stable across runs; each topic selects the two members and has a viewpoint and a comment; joints
that need design are grouped one topic per storey unless asked otherwise, and a storey's group is
closed once none of its joints needs design."""

from __future__ import annotations

import io
import zipfile
from pathlib import Path

import pytest
from lxml import etree

from helpers_results import doc, members, result
from ifc_io.write_bcf import bcf_archive, storey_topic_guid, topic_guid

SCHEMAS = Path(__file__).resolve().parents[2] / "shared" / "schemas" / "bcf"
PARTS = {"markup.bcf": "markup.xsd", "viewpoint.bcfv": "visinfo.xsd", "bcf.version": "version.xsd",
         "project.bcfp": "project.xsd", "extensions.xml": "extensions.xsd"}
B, C, B2 = "2O2Fr$t4X7Zf8NOew3FLOH", "1kTvXnbbzCWw8lcMd1dR4o", "0uA7yfWrz4wBs1xbFHhyKq"


def _schema(version: str, name: str) -> etree.XMLSchema:
    return etree.XMLSchema(etree.parse(str(SCHEMAS / version / name)))


def _doc():
    mem = {**members(B, C), **members(B2, C, "B2")}
    return doc([result(B, C, "fail"), result(B2, C, "needs-design", end="end"), result(B, C, "pass", end="end")], mem)


@pytest.mark.parametrize("version", ["2.1", "3.0"])
def test_every_bcf_part_validates_against_the_xsd(version):
    data = bcf_archive(_doc(), version=version, project_guid=B, snapshots={})
    z = zipfile.ZipFile(io.BytesIO(data))
    checked = 0
    for name in z.namelist():
        base = name.rsplit("/", 1)[-1]
        if base not in PARTS or (version == "2.1" and base == "extensions.xml"):
            continue  # 2.1's extensions.xsd does not compile (shared/schemas/bcf/README.md)
        schema = _schema(version, PARTS[base])
        ok = schema.validate(etree.fromstring(z.read(name)))
        assert ok, f"{name}: {schema.error_log.last_error}"
        checked += 1
    # version + project (+ extensions in 3.0) + 2 issues x (markup + viewpoint)
    assert checked == (2 + 4 if version == "2.1" else 3 + 4)


def test_one_topic_per_issue_with_stable_guids_and_a_viewpoint_selecting_both_members():
    d = _doc()
    z1 = zipfile.ZipFile(io.BytesIO(bcf_archive(d, needs_design="per-joint")))
    z2 = zipfile.ZipFile(io.BytesIO(bcf_archive(d, needs_design="per-joint")))
    assert z1.namelist() == z2.namelist()
    folders = sorted({n.split("/")[0] for n in z1.namelist() if "/" in n})
    issues = [j for j in d["joints"] if j["status"] in ("fail", "needs-design", "incomplete")]
    assert folders == sorted(topic_guid(j["id"]) for j in issues)
    for j in issues:
        g = topic_guid(j["id"])
        markup = etree.fromstring(z1.read(f"{g}/markup.bcf"))
        assert markup.find("Topic").get("Guid") == g
        assert markup.find("Comment/Viewpoint").get("Guid") == markup.find("Viewpoints").get("Guid")
        vis = etree.fromstring(z1.read(f"{g}/viewpoint.bcfv"))
        selected = [c.get("IfcGuid") for c in vis.findall("Components/Selection/Component")]
        assert selected == [j["beam"], j["support"]]
        assert vis.find("PerspectiveCamera/FieldOfView").text == "60"


def test_rerun_gives_identical_bytes_and_resolved_issue_becomes_a_closed_topic():
    d = _doc()
    assert bcf_archive(d) == bcf_archive(d)
    d2 = dict(d)
    d2["joints"] = [dict(j, baseline="resolved", status="pass") if j["status"] == "fail" else j for j in d["joints"]]
    z = zipfile.ZipFile(io.BytesIO(bcf_archive(d2)))
    fail_j = next(j for j in d["joints"] if j["status"] == "fail")
    markup = etree.fromstring(z.read(f"{topic_guid(fail_j['id'])}/markup.bcf"))
    assert markup.find("Topic").get("TopicStatus") == "Closed"


B3, B4, C2 = "3vKq8Yx0n9Bf1VfQwZ2Lr_", "2gH7TtYb1D5u0mLp3xZcQe", "0aS9dF8gH7jK6lZ5xC4vB3"


def _needs_design_doc(baseline=None, statuses=("needs-design", "needs-design", "needs-design")):
    mem = {**members(B, C, "B1", storey="Level 1"), **members(B2, C, "B2", storey="Level 1"),
           **members(B3, C2, "B3", storey="Level 2"), **members(B4, C2, "B4", storey="Level 2")}
    res = [result(B, C, "fail"), result(B2, C, statuses[0], end="end"), result(B3, C2, statuses[1]),
           result(B4, C2, statuses[2], end="end")]
    return doc(res, mem, baseline=baseline)


def test_joints_needing_design_are_one_topic_per_storey_selecting_their_beams():
    d = _needs_design_doc()
    z = zipfile.ZipFile(io.BytesIO(bcf_archive(d)))
    folders = {n.split("/")[0] for n in z.namelist() if "/" in n}
    fail_j = next(j for j in d["joints"] if j["status"] == "fail")
    assert folders == {topic_guid(fail_j["id"]), storey_topic_guid("Level 1"), storey_topic_guid("Level 2")}
    level2 = etree.fromstring(z.read(f"{storey_topic_guid('Level 2')}/markup.bcf"))
    assert level2.find("Topic/Title").text == "Connections need design — Level 2: 2 beam ends"
    nd2 = [j for j in d["joints"] if j["status"] == "needs-design" and j["storey"] == "Level 2"]
    description = level2.find("Topic/Description").text
    assert all(j["id"] in description for j in nd2)
    assert "largest V* = 120 kN" in description
    vis = etree.fromstring(z.read(f"{storey_topic_guid('Level 2')}/viewpoint.bcfv"))
    assert sorted(c.get("IfcGuid") for c in vis.findall("Components/Selection/Component")) == sorted([B3, B4])
    schema = _schema("2.1", "markup.xsd")
    assert schema.validate(level2), schema.error_log.last_error
    assert _schema("2.1", "visinfo.xsd").validate(vis)


def test_storey_group_closes_when_none_of_its_joints_needs_design_any_more():
    before = _needs_design_doc()
    old = {j["id"]: j for j in before["joints"]}
    from engine.results import baseline_marks  # noqa: F401  (marks come from the results document here)

    marks = {jid: ("resolved" if j["storey"] == "Level 2" and j["status"] == "needs-design" else
                   "open" if j["status"] in ("fail", "needs-design") else None) for jid, j in old.items()}
    after = _needs_design_doc(baseline=marks, statuses=("needs-design", "pass", "pass"))
    for j in after["joints"]:
        if j["baseline"] == "resolved":
            j["baseline_was"] = "needs-design"
    z = zipfile.ZipFile(io.BytesIO(bcf_archive(after)))
    level2 = etree.fromstring(z.read(f"{storey_topic_guid('Level 2')}/markup.bcf"))
    assert level2.find("Topic").get("TopicStatus") == "Closed"
    level1 = etree.fromstring(z.read(f"{storey_topic_guid('Level 1')}/markup.bcf"))
    assert level1.find("Topic").get("TopicStatus") == "Open"
    # a resolved joint of a grouped storey gets no topic of its own
    resolved = [j for j in after["joints"] if j["baseline"] == "resolved"]
    assert resolved and not any(n.startswith(topic_guid(j["id"])) for j in resolved for n in z.namelist())


def test_snapshot_is_packed_and_referenced():
    d = _doc()
    issue = next(j for j in d["joints"] if j["status"] == "fail")
    z = zipfile.ZipFile(io.BytesIO(bcf_archive(d, snapshots={issue["id"]: b"\x89PNG\r\n\x1a\n"})))
    g = topic_guid(issue["id"])
    assert z.read(f"{g}/snapshot.png").startswith(b"\x89PNG")
    assert etree.fromstring(z.read(f"{g}/markup.bcf")).find("Viewpoints/Snapshot").text == "snapshot.png"


def test_a_storey_topic_names_at_most_its_limit_of_joints_and_selects_every_beam(monkeypatch):
    import ifc_io.write_bcf as W

    monkeypatch.setattr(W, "GROUP_LISTED", 1)
    d = _needs_design_doc()
    z = zipfile.ZipFile(io.BytesIO(bcf_archive(d)))
    g = storey_topic_guid("Level 2")
    description = etree.fromstring(z.read(f"{g}/markup.bcf")).find("Topic/Description").text
    nd2 = sorted(j["id"] for j in d["joints"] if j["status"] == "needs-design" and j["storey"] == "Level 2")
    assert sum(jid in description for jid in nd2) == 1 and "; and 1 more." in description
    vis = etree.fromstring(z.read(f"{g}/viewpoint.bcfv"))
    assert len(vis.findall("Components/Selection/Component")) == 2
