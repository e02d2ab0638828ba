"""Write the audit's issues as a BCF file (buildingSMART BCF-XML 2.1, or 3.0 on request).

One topic per failing or incomplete joint. Joints that need design are, by default, one topic per
storey (``needs_design="per-storey"``) selecting every beam of that storey with an end that needs a
connection designed, its description listing the joints: a model with no connections yet has
thousands of them, which as separate topics would bury the real failures in a coordination tool and
make the file too large for it to load; ``needs_design="per-joint"`` gives each its own topic. A
baseline run's issues that are now resolved get a *closed* topic (a storey's group is closed once no
joint on it needs design), so a coordination tool that re-imports the file updates its topics instead
of piling up duplicates:

* topic, viewpoint and comment GUIDs derive from the joint id (uuid5 in a namespace of our own), so a
  re-run writes the same GUIDs;
* each topic has one viewpoint (``viewpoint.bcfv``) selecting the beam and its support by IfcGuid,
  with a perspective camera looking at the joint, and a comment that points at that viewpoint;
* a snapshot (``snapshot.png``) where one is given;
* the markup ``Header`` names the model file and its IfcProject GlobalId.

BCF coordinates are metres in the model's world coordinate system; joint locations arrive in mm.
The zip is deterministic: fixed entry order and a fixed entry timestamp (the run date).

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

import io
import math
import re
import uuid
import zipfile
from typing import Any, Mapping, Sequence

from xml.sax.saxutils import escape, quoteattr

from lxml import etree

from engine.errors import OutputError

__all__ = ["topic_guid", "storey_topic_guid", "bcf_archive", "BcfTopics", "BCF_VERSIONS", "ISSUE_STATUSES", "NEEDS_DESIGN_TOPICS",
           "GROUP_LISTED"]

BCF_VERSIONS = ("2.1", "3.0")
NEEDS_DESIGN_TOPICS = ("per-storey", "per-joint")
GROUP_LISTED = 200
"""How many joints a storey topic's description names (the viewpoint selects all their beams): a
coordination tool shows the description as one block of text."""
ISSUE_STATUSES = ("fail", "needs-design", "incomplete")
_NS = uuid.UUID("0d6f4a0e-3c1b-5e7a-9b8c-5a4d3e2f1b0c")
_AUTHOR = "joint-audit"

_TITLES = {
    "fail": "Connection fails",
    "needs-design": "Connection needs design",
    "incomplete": "Connection check incomplete",
}


def topic_guid(joint_id: str) -> str:
    """The BCF topic GUID of a joint's issue (lower-case, stable across runs)."""
    return str(uuid.uuid5(_NS, f"topic|{joint_id}"))


def storey_topic_guid(storey: str) -> str:
    """The BCF topic GUID of a storey's group of joints that need design (stable across runs)."""
    return topic_guid(f"needs-design-storey|{storey}")


def _guid(joint_id: str, what: str) -> str:
    return str(uuid.uuid5(_NS, f"{what}|{joint_id}"))


# characters XML 1.0 does not allow (C0 controls other than tab, newline and return; lone
# surrogates; U+FFFE and U+FFFF): names in a model may hold them, a BCF file may not
_NOT_XML = re.compile("[\x00-\x08\x0b\x0c\x0e-\x1f\ud800-\udfff\ufffe\uffff]")


def xml_safe(text: str) -> str:
    """``text`` with every character XML 1.0 cannot hold replaced by U+FFFD (the replacement mark)."""
    return _NOT_XML.sub("\ufffd", text)


def _sub(parent, tag: str, text: str | None = None, **attrs: str):
    el = etree.SubElement(parent, tag, {k: xml_safe(v) for k, v in attrs.items() if v is not None})
    if text is not None:
        el.text = xml_safe(text)
    return el


def _xml(root) -> bytes:
    return etree.tostring(root, xml_declaration=True, encoding="UTF-8", pretty_print=True)


def _fmt(x: float) -> str:
    return f"{x:.6f}".rstrip("0").rstrip(".") if x != 0 else "0"


def _camera(location_mm: Sequence[float], back_m: float = 4.0) -> tuple[tuple[float, ...], tuple[float, ...], tuple[float, ...]]:
    """A perspective camera ``back_m`` (4 m) back along (-1, -1, +0.6) from the point, looking at it
    (metres)."""
    target = [v / 1000.0 for v in location_mm]
    d = (1.0, 1.0, -0.6)
    n = math.sqrt(sum(c * c for c in d))
    d = tuple(c / n for c in d)
    eye = tuple(t - back_m * c for t, c in zip(target, d))
    # up vector: world Z made orthogonal to the view direction
    z = (0.0, 0.0, 1.0)
    dot = sum(a * b for a, b in zip(z, d))
    up = tuple(a - dot * b for a, b in zip(z, d))
    un = math.sqrt(sum(c * c for c in up))
    return eye, d, tuple(c / un for c in up)


def _describe(j: Mapping[str, Any]) -> str:
    parts = [f"Joint {j['id']}: {j['end']} of {j.get('beam_name') or j['beam']} on "
             f"{j.get('support_name') or j.get('support') or 'no support'}, {j['kind']}, support {j['stiffness']}."]
    d = j.get("demand")
    if d:
        parts.append(f"V* = {d['V_kN']} kN ({d['source']}).")
    if j.get("governing"):
        parts.append(f"Governing check: {j['governing']}, utilisation {j['utilisation']}.")
    if j.get("missing"):
        parts.append("Missing: " + "; ".join(j["missing"]) + ".")
    if j.get("note"):
        parts.append(j["note"])
    parts.append("joint-audit is an aid to a competent engineer; check this result.")
    return " ".join(parts)


def _t(text: str) -> str:
    """Element text: XML-safe and escaped."""
    return escape(xml_safe(text))


def _a(value: str) -> str:
    """An attribute value, quoted: XML-safe and escaped."""
    return quoteattr(xml_safe(value))


_DECL = "<?xml version='1.0' encoding='UTF-8'?>\n"


def _labels(j: Mapping[str, Any]) -> list[str]:
    return ["joint-audit", j["status"], j["kind"]] + ([j["storey"]] if j.get("storey") else [])


def _markup(j: Mapping[str, Any], doc: Mapping[str, Any], version: str, date: str, project_guid: str | None,
            closed: bool, snapshot: bool) -> bytes:
    """markup.bcf of one joint's topic."""
    jid = j["id"]
    title = f"{'Resolved: ' if closed else ''}{_TITLES.get(j['status'], 'Connection issue')} — {j['end']} of {j.get('beam_name') or j['beam']}"
    return _topic_xml(topic_guid(jid), _guid(jid, "viewpoint"), _guid(jid, "comment"), title, _labels(j),
                      _describe(j), doc, version, date, project_guid, closed, snapshot)


def _topic_xml(guid: str, vp_guid: str, comment_guid: str, title: str, labels: Sequence[str], description: str,
               doc: Mapping[str, Any], version: str, date: str, project_guid: str | None, closed: bool,
               snapshot: bool) -> bytes:
    """markup.bcf of one topic (built as text: this runs once per issue on large models)."""
    v3 = version == "3.0"
    status = "Closed" if closed else "Open"
    when = _t(date or "1970-01-01T00:00:00Z")
    proj = f" IfcProject={_a(project_guid)}" if project_guid else ""
    ext = "IsExternal" if v3 else "isExternal"
    file_el = (f"<File{proj} {ext}=\"true\"><Filename>{_t(doc['model']['file'])}</Filename>"
               + (f"<Date>{_t(date)}</Date>" if date else "") + "</File>")
    header = f"<Header><Files>{file_el}</Files></Header>" if v3 else f"<Header>{file_el}</Header>"
    if v3:
        label_xml = "<Labels>" + "".join(f"<Label>{_t(x)}</Label>" for x in labels) + "</Labels>"
    else:
        label_xml = "".join(f"<Labels>{_t(x)}</Labels>" for x in labels)
    comment = (f"<Comment Guid=\"{comment_guid}\"><Date>{when}</Date><Author>{_AUTHOR}</Author>"
               f"<Comment>{_t(('Resolved in this run: ' if closed else '') + description)}</Comment>"
               f"<Viewpoint Guid=\"{vp_guid}\"/></Comment>")
    vp_inner = "<Viewpoint>viewpoint.bcfv</Viewpoint>" + ("<Snapshot>snapshot.png</Snapshot>" if snapshot else "")
    topic_open = (f"<Topic Guid=\"{guid}\" TopicType=\"Structural connection\" TopicStatus=\"{status}\">"
                  f"<Title>{_t(title)}</Title>{label_xml}<CreationDate>{when}</CreationDate>"
                  f"<CreationAuthor>{_AUTHOR}</CreationAuthor><Description>{_t(description)}</Description>")
    if v3:
        body = (topic_open + f"<Comments>{comment}</Comments>"
                f"<Viewpoints><ViewPoint Guid=\"{vp_guid}\">{vp_inner}</ViewPoint></Viewpoints></Topic>")
    else:
        body = topic_open + "</Topic>" + comment + f"<Viewpoints Guid=\"{vp_guid}\">{vp_inner}</Viewpoints>"
    return (_DECL + f"<Markup>{header}{body}</Markup>\n").encode("utf-8")


def _xyz(tag: str, v: Sequence[float]) -> str:
    return f"<{tag}><X>{_fmt(v[0])}</X><Y>{_fmt(v[1])}</Y><Z>{_fmt(v[2])}</Z></{tag}>"


def _visinfo(j: Mapping[str, Any], version: str) -> bytes:
    """viewpoint.bcfv of one joint's topic: the beam and its support selected, a camera on the joint."""
    return _visinfo_xml(_guid(j["id"], "viewpoint"), [g for g in (j["beam"], j.get("support")) if g],
                        _camera(j.get("location_mm") or (0.0, 0.0, 0.0)), version)


def _visinfo_xml(guid: str, components: Sequence[str], camera, version: str) -> bytes:
    comps = "".join(f"<Component IfcGuid={_a(g)}/>" for g in components)
    eye, direction, up = camera
    cam = (_xyz("CameraViewPoint", eye) + _xyz("CameraDirection", direction) + _xyz("CameraUpVector", up)
           + "<FieldOfView>60</FieldOfView>" + ("<AspectRatio>1.5</AspectRatio>" if version == "3.0" else ""))
    return (_DECL + f"<VisualizationInfo Guid=\"{guid}\"><Components>"
            f"<Selection>{comps}</Selection><Visibility DefaultVisibility=\"true\"/></Components>"
            f"<PerspectiveCamera>{cam}</PerspectiveCamera></VisualizationInfo>\n").encode("utf-8")


def _group_labels(storey: str) -> list[str]:
    return ["joint-audit", "needs-design"] + ([storey] if storey else [])


class _Group:
    """What a storey's topic of joints needing design says about them, gathered joint by joint
    (so the joints themselves need not be kept): count, kinds, largest end shear, the first
    ``GROUP_LISTED`` named, the beams to select and the extent of their locations."""

    def __init__(self) -> None:
        self.n = 0
        self.kinds: dict[str, int] = {}
        self.shear: float | None = None
        self.listed: list[str] = []
        self.beams: dict[str, None] = {}
        self.lo = [math.inf] * 3
        self.hi = [-math.inf] * 3

    def add(self, j: Mapping[str, Any]) -> None:
        self.n += 1
        self.kinds[j["kind"]] = self.kinds.get(j["kind"], 0) + 1
        d = j.get("demand")
        if d and d.get("V_kN") is not None:
            self.shear = d["V_kN"] if self.shear is None else max(self.shear, d["V_kN"])
        if len(self.listed) < GROUP_LISTED:
            self.listed.append(f"{j['id']}: {j['end']} of {j.get('beam_name') or j['beam']} on "
                               f"{j.get('support_name') or j.get('support') or 'no support'}")
        self.beams.setdefault(j["beam"], None)
        loc = j.get("location_mm") or (0.0, 0.0, 0.0)
        for i in range(3):
            self.lo[i] = min(self.lo[i], loc[i])
            self.hi[i] = max(self.hi[i], loc[i])


class BcfTopics:
    """The joints of a results document that get BCF topics, gathered one joint at a time
    (:meth:`add`): failing and incomplete joints (and, per joint, those that need design) are kept,
    the joints that need design grouped by storey are summed up in their storey's group."""

    def __init__(self, needs_design: str = "per-storey") -> None:
        if needs_design not in NEEDS_DESIGN_TOPICS:
            raise OutputError(f"BCF topics for joints that need design: {needs_design!r} is not one of "
                              f"{', '.join(NEEDS_DESIGN_TOPICS)}")
        self.grouped = needs_design == "per-storey"
        self.topics: list[tuple[Mapping[str, Any], bool]] = []
        self.open_groups: dict[str, _Group] = {}
        self.resolved_groups: dict[str, _Group] = {}

    def add(self, j: Mapping[str, Any]) -> None:
        if j["status"] in ISSUE_STATUSES:
            if self.grouped and j["status"] == "needs-design":
                self.open_groups.setdefault(j.get("storey") or "", _Group()).add(j)
            else:
                self.topics.append((j, False))
        elif j.get("baseline") == "resolved":
            if self.grouped and j.get("baseline_was") == "needs-design":
                self.resolved_groups.setdefault(j.get("storey") or "", _Group()).add(j)
            else:
                self.topics.append((j, True))


def _group_topic(storey: str, group: _Group, doc: Mapping[str, Any], version: str, date: str,
                 project_guid: str | None, closed: bool) -> tuple[bytes, bytes]:
    """markup.bcf and viewpoint.bcfv of a storey's group of joints that need design (``closed``:
    none does any more; ``group`` then holds the ones resolved since the baseline)."""
    guid = storey_topic_guid(storey)
    where = storey or "no storey"
    n = group.n
    if closed:
        title = f"Resolved: connections need design — {where}"
        description = (f"No beam end on {where} needs a connection designed any more; {n} did in the baseline run "
                       f"and are resolved.")
    else:
        title = f"Connections need design — {where}: {n} beam end{'s' if n != 1 else ''}"
        description = (
            f"{n} beam end{'s' if n != 1 else ''} on {where} have no connection modelled or scheduled; each needs one "
            f"designed for its end shear"
            + (f" (largest V* = {group.shear:g} kN)" if group.shear is not None else "") + ". By kind: "
            + ", ".join(f"{k} {c}" for k, c in sorted(group.kinds.items())) + ". Joints (id: end of beam on support): "
            + "; ".join(group.listed)
            + (f"; and {n - GROUP_LISTED} more" if n > GROUP_LISTED else "")
            + ". Every joint is listed in issues.html and results.json. "
            "joint-audit is an aid to a competent engineer; check this result.")
    vp_guid = _guid(guid, "viewpoint")
    markup = _topic_xml(guid, vp_guid, _guid(guid, "comment"), title, _group_labels(storey),
                        description, doc, version, date, project_guid, closed, False)
    centre = [(a + b) / 2.0 for a, b in zip(group.lo, group.hi)]
    extent_m = max(b - a for a, b in zip(group.lo, group.hi)) / 1000.0
    return markup, _visinfo_xml(vp_guid, list(group.beams), _camera(centre, 4.0 + extent_m), version)


def _version(version: str) -> bytes:
    root = etree.Element("Version", VersionId=version)
    if version == "2.1":
        _sub(root, "DetailedVersion", "2.1")
    return _xml(root)


def _project(doc: Mapping[str, Any], version: str, project_guid: str | None, project_name: str) -> bytes:
    pid = project_guid or doc["model"]["file"]
    if version == "3.0":
        root = etree.Element("ProjectInfo")
        p = _sub(root, "Project", ProjectId=pid)
        _sub(p, "Name", project_name or doc["model"]["file"])
        return _xml(root)
    root = etree.Element("ProjectExtension")
    p = _sub(root, "Project", ProjectId=pid)
    _sub(p, "Name", project_name or doc["model"]["file"])
    _sub(root, "ExtensionSchema", "")
    return _xml(root)


def _extensions(labels: Sequence[str] = ()) -> bytes:
    root = etree.Element("Extensions")
    tt = _sub(root, "TopicTypes")
    _sub(tt, "TopicType", "Structural connection")
    ts = _sub(root, "TopicStatuses")
    for s in ("Open", "Closed"):
        _sub(ts, "TopicStatus", s)
    tl = _sub(root, "TopicLabels")
    base = ["joint-audit", "fail", "needs-design", "incomplete", "column-flange", "column-web", "beam-web"]
    for s in base + sorted(set(labels) - set(base)):
        _sub(tl, "TopicLabel", s)
    return _xml(root)


def _zip_time(date: str) -> tuple[int, int, int, int, int, int]:
    try:
        y, mo, d = int(date[0:4]), int(date[5:7]), int(date[8:10])
        h, mi, s = int(date[11:13]), int(date[14:16]), int(date[17:19])
        if y >= 1980:
            return (y, mo, d, h, mi, s)
    except (ValueError, IndexError):
        pass
    return (1980, 1, 1, 0, 0, 0)


def bcf_archive(
    doc: Mapping[str, Any],
    *,
    version: str = "2.1",
    project_guid: str | None = None,
    project_name: str = "",
    snapshots: Mapping[str, bytes] | None = None,
    needs_design: str = "per-storey",
    gathered: "BcfTopics | None" = None,
) -> bytes:
    """The BCF zip (bytes) for the results document ``doc``: a topic per failing or incomplete joint,
    the joints that need design one topic per storey (``needs_design="per-storey"``) or per joint
    (``"per-joint"``), and closed topics for the baseline's resolved issues. ``snapshots`` maps joint
    id → PNG bytes. ``gathered``: the topics already gathered from the document's joints (a
    :class:`BcfTopics` fed while another writer went through them); ``doc["joints"]`` is then not read."""
    if version not in BCF_VERSIONS:
        raise OutputError(f"BCF version {version!r} is not supported (use {' or '.join(BCF_VERSIONS)})")
    if needs_design not in NEEDS_DESIGN_TOPICS:
        raise OutputError(f"BCF topics for joints that need design: {needs_design!r} is not one of "
                          f"{', '.join(NEEDS_DESIGN_TOPICS)}")
    grouped = needs_design == "per-storey"
    date = (doc.get("run") or {}).get("date") or ""
    zt = _zip_time(date)
    snapshots = snapshots or {}
    entries: list[tuple[str, bytes | None]] = [("bcf.version", _version(version)),
                                               ("project.bcfp", _project(doc, version, project_guid, project_name))]
    if gathered is None:
        gathered = BcfTopics(needs_design)
        for j in doc["joints"]:
            gathered.add(j)
    elif gathered.grouped != grouped:
        raise OutputError("the BCF topics were gathered for another needs-design grouping")
    topics, open_groups, resolved_groups = gathered.topics, gathered.open_groups, gathered.resolved_groups
    closed_groups = {st: js for st, js in resolved_groups.items() if st not in open_groups}
    if version == "3.0":
        labels = [x for j, _ in topics for x in _labels(j)]
        labels += [x for st in list(open_groups) + list(closed_groups) for x in _group_labels(st)]
        entries.append(("extensions.xml", _extensions(labels)))
    folders: list[tuple[str, list[tuple[str, bytes]]]] = []
    for j, closed in topics:
        png = snapshots.get(j["id"])
        files = [("markup.bcf", _markup(j, doc, version, date, project_guid, closed, png is not None)),
                 ("viewpoint.bcfv", _visinfo(j, version))]
        if png is not None:
            files.append(("snapshot.png", png))
        folders.append((topic_guid(j["id"]), files))
    for groups, closed in ((open_groups, False), (closed_groups, True)):
        for storey, group in groups.items():
            markup, vis = _group_topic(storey, group, doc, version, date, project_guid, closed)
            folders.append((storey_topic_guid(storey), [("markup.bcf", markup), ("viewpoint.bcfv", vis)]))
    for folder, files in sorted(folders, key=lambda f: f[0]):
        entries.append((folder + "/", None))
        entries.extend((f"{folder}/{name}", data) for name, data in files)
    buf = io.BytesIO()
    with zipfile.ZipFile(buf, "w", compression=zipfile.ZIP_DEFLATED) as zf:
        for name, data in entries:
            info = zipfile.ZipInfo(name, date_time=zt)
            if data is None:
                info.external_attr = 0o40755 << 16 | 0x10
                zf.writestr(info, b"")
            else:
                info.compress_type = zipfile.ZIP_DEFLATED
                info.external_attr = 0o644 << 16
                zf.writestr(info, data)
    return buf.getvalue()
