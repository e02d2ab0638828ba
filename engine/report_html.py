"""The HTML issue list: one self-contained page (no external assets, works offline, prints well).

Every joint whose status is ``fail``, ``needs-design`` or ``incomplete`` is an issue, numbered by its
stable joint id. A failing or incomplete joint gets a full entry: the two members (names and
GlobalIds), storey and location, demand and its source, governing check and utilisation, every check
with its clause, the stiffness reasons, and two drawings (the connection elevation and the storey
plan marking the joint). A joint that needs design has no connection to draw or check, so it is one
row of a table (members, kind, stiffness and why, storey, end shear, copes): a model with no
connections yet has tens of thousands of them, and a page of full entries would not open. The page
filters by status, storey and kind and sorts by utilisation by itself (a few lines of inline script);
without script every issue is simply listed.

The page is produced in pieces (:func:`report_parts`) so that a large one can be written to disk
without holding it whole in memory.

All text that comes from the model or the inputs is escaped.

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

import re
import tempfile
from html import escape
from typing import Any, Iterator, Mapping

from engine.cautions import CAUTION
from engine.errors import OutputError
from engine.evaluate import ISSUE_STATUSES
from engine.memo import BoundedMemo

__all__ = ["render_report", "report_parts", "IssueList"]

_CSS = """
body{font:15px/1.45 system-ui,-apple-system,"Segoe UI",Roboto,sans-serif;color:#1d1d1d;margin:0;background:#fbfbf8}
header,main,footer{max-width:1100px;margin:0 auto;padding:0 18px}
h1{font-size:1.45em;margin:18px 0 4px} h2{font-size:1.1em;margin:0 0 6px}
.meta{color:#555;margin:0 0 10px}
.caution{border:2px solid #7a4f00;background:#fff7e6;padding:10px 14px;margin:12px 0;font-weight:600}
table{border-collapse:collapse} td,th{padding:3px 8px;border-bottom:1px solid #ddd;text-align:left;vertical-align:top}
th{background:#efefea} td.num,th.num{text-align:right;font-variant-numeric:tabular-nums}
.summary td{min-width:70px}
.controls{display:flex;flex-wrap:wrap;gap:12px;align-items:center;margin:14px 0;padding:8px 10px;background:#efefea}
.controls label{font-weight:600} select,button{font:inherit}
.issue{background:#fff;border:1px solid #cfcfc8;border-left:6px solid #888;margin:14px 0;padding:12px 14px;page-break-inside:avoid}
.issue[data-status=fail]{border-left-color:#8e1b12} .issue[data-status=needs-design]{border-left-color:#8a6d00}
.issue[data-status=incomplete]{border-left-color:#3d5a80}
.tag{display:inline-block;border:1px solid #777;border-radius:3px;padding:0 6px;font-size:.85em;margin-right:6px;text-transform:uppercase;letter-spacing:.03em}
.issue[data-status=fail] .tag.status{background:#8e1b12;color:#fff;border-color:#8e1b12}
.issue[data-status=needs-design] .tag.status{background:#8a6d00;color:#fff;border-color:#8a6d00}
.issue[data-status=incomplete] .tag.status{background:#3d5a80;color:#fff;border-color:#3d5a80}
.facts{display:grid;grid-template-columns:max-content 1fr;gap:2px 14px;margin:8px 0}
.facts dt{color:#555} .facts dd{margin:0}
.drawings{display:flex;flex-wrap:wrap;gap:16px;margin-top:8px} figure{margin:0} figcaption{color:#555;font-size:.85em}
tr.failed td{color:#8e1b12;font-weight:600} tr.incomplete td{color:#3d5a80}
code{font-size:.9em}
table.nd{width:100%;background:#fff;font-size:.9em} table.nd tr.issue td:first-child{border-left:6px solid #8a6d00}
table.nd td.why{color:#555;max-width:260px}
.none{padding:20px;background:#fff;border:1px solid #ddd}
@media print{.controls{display:none} body{background:#fff} .issue{border-color:#999}}
"""

_JS = """
(function(){
  var list=document.getElementById('issues'); if(!list) return;
  var items=Array.prototype.slice.call(document.querySelectorAll('.issue'));
  var arts=Array.prototype.slice.call(list.querySelectorAll('article.issue'));
  var fs=document.getElementById('f-status'), fst=document.getElementById('f-storey'),
      fk=document.getElementById('f-kind'), sortb=document.getElementById('sort-util'),
      count=document.getElementById('shown-count'), desc=true;
  function apply(){
    var n=0;
    items.forEach(function(el){
      var ok=(!fs.value||el.dataset.status===fs.value)&&(!fst.value||el.dataset.storey===fst.value)&&
             (!fk.value||el.dataset.kind===fk.value);
      el.hidden=!ok; if(ok) n++;
    });
    count.textContent=n;
  }
  function sort(){
    arts.sort(function(a,b){var x=parseFloat(a.dataset.util)||-1, y=parseFloat(b.dataset.util)||-1;
      return desc? y-x : x-y;});
    arts.forEach(function(el){list.appendChild(el);});
    sortb.textContent='Utilisation '+(desc?'\\u2193 highest first':'\\u2191 lowest first');
    desc=!desc;
  }
  [fs,fst,fk].forEach(function(s){s.addEventListener('change',apply);});
  sortb.addEventListener('click',sort);
  apply();
})();
"""


def _fmt(v: Any, nd: int = 2) -> str:
    if v is None:
        return "–"
    if isinstance(v, float):
        return f"{v:.{nd}f}"
    return escape(str(v))


def _options(values: list[str], label_all: str) -> str:
    opts = [f'<option value="">{escape(label_all)}</option>']
    opts += [f'<option value="{escape(v, quote=True)}">{escape(v) or "(none)"}</option>' for v in values]
    return "".join(opts)


def _checks_table(checks: list[Mapping[str, Any]]) -> str:
    if not checks:
        return ""
    rows = []
    for c in checks:
        cls = "incomplete" if c.get("incomplete") else ("" if c["passed"] else "failed")
        verdict = "incomplete" if c.get("incomplete") else ("ok" if c["passed"] else "FAILS")
        rows.append(
            f'<tr class="{cls}"><td>{escape(c["name"])}</td><td>{escape(c["clause"])}</td>'
            f'<td class="num">{_fmt(c["demand"])}</td><td class="num">{_fmt(c["capacity"])}</td>'
            f'<td>{escape(c["unit"])}</td><td class="num">{_fmt(c["utilisation"], 3)}</td><td>{verdict}</td>'
            f'<td>{escape(c.get("note") or "")}</td></tr>'
        )
    return (
        '<table class="checks"><thead><tr><th>check</th><th>clause</th><th class="num">demand</th>'
        '<th class="num">capacity</th><th>unit</th><th class="num">utilisation</th><th>result</th><th>note</th>'
        "</tr></thead><tbody>" + "".join(rows) + "</tbody></table>"
    )


def _issue(j: Mapping[str, Any], drawings: Mapping[str, str]) -> str:
    d = j.get("demand")
    demand = "not known" if d is None else f"V* = {_fmt(d['V_kN'], 1)} kN, N* = {_fmt(d['N_kN'], 1)} kN — {escape(d['source'])}" + (
        f" ({escape(d['combination'])})" if d.get("combination") else "")
    loc = j.get("location_mm") or []
    loc_txt = ", ".join(f"{v / 1000:.3f}" for v in loc if v is not None) + " m" if loc else "–"
    util = j.get("utilisation")
    reasons = "".join(f"<li>{escape(r)}</li>" for r in j.get("stiffness_reasons") or [])
    missing = "".join(f"<li>{escape(m)}</li>" for m in j.get("missing") or [])
    conn = j.get("connection")
    baseline = f'<span class="tag">{escape(j["baseline"])}</span>' if j.get("baseline") else ""
    title = f"{escape(j['end'])} of {escape(j.get('beam_name') or j['beam'])} on {escape(j.get('support_name') or j.get('support') or 'no support')}"
    figs = ""
    if drawings.get("elevation"):
        figs += f"<figure>{drawings['elevation']}<figcaption>Connection elevation (schematic, mm)</figcaption></figure>"
    if drawings.get("plan"):
        figs += f"<figure>{drawings['plan']}<figcaption>Plan of {escape(j.get('storey') or 'the storey')}; the ring marks the joint</figcaption></figure>"
    return (
        f'<article class="issue" id="{escape(j["id"], quote=True)}" data-status="{escape(j["status"], quote=True)}" '
        f'data-storey="{escape(j.get("storey") or "", quote=True)}" data-kind="{escape(j["kind"], quote=True)}" '
        f'data-util="{"" if util is None else util}">'
        f'<h2><span class="tag status">{escape(j["status"])}</span>{baseline}Issue {escape(j["id"])} — {title}</h2>'
        '<dl class="facts">'
        f'<dt>beam</dt><dd>{escape(j.get("beam_name") or "")} <code>{escape(j["beam"])}</code> {escape(j.get("beam_section") or "")}</dd>'
        f'<dt>support</dt><dd>{escape(j.get("support_name") or "")} <code>{escape(j.get("support") or "none")}</code> {escape(j.get("support_section") or "")}</dd>'
        f'<dt>joint</dt><dd>{escape(j["kind"])}, support {escape(j["stiffness"])}</dd>'
        f'<dt>storey</dt><dd>{escape(j.get("storey") or "–")}; location {escape(loc_txt)}</dd>'
        f'<dt>demand</dt><dd>{demand}</dd>'
        f'<dt>connection</dt><dd>{escape(conn["summary"]) + " (" + escape(conn["source"]) + ")" if conn else "none"}</dd>'
        f'<dt>governing</dt><dd>{escape(j.get("governing") or "–")}; utilisation {_fmt(util, 3)}</dd>'
        + (f'<dt>note</dt><dd>{escape(j["note"])}</dd>' if j.get("note") else "")
        + "</dl>"
        + (f"<p><strong>Missing:</strong></p><ul>{missing}</ul>" if missing else "")
        + (f"<p><strong>Why the support is {escape(j['stiffness'])}:</strong></p><ul>{reasons}</ul>" if reasons else "")
        + _checks_table(j.get("checks") or [])
        + (f'<div class="drawings">{figs}</div>' if figs else "")
        + "</article>"
    )


_ND_HEAD = (
    "<h2>Joints that need a connection designed</h2>"
    "<p class='meta'>No connection is modelled or scheduled at these beam ends: each needs one designed "
    "(or scheduled) for the end shear shown, then a new audit.</p>"
    "<table class='nd'><thead><tr><th>issue</th><th>beam</th><th>support</th><th>joint</th><th>storey</th>"
    "<th class='num'>V* kN</th><th>copes, note</th></tr></thead><tbody id='needs-design'>"
)


def _escaped() -> BoundedMemo:
    """html.escape of texts that repeat from row to row (sections, storeys, kinds, sources,
    reasons), each escaped once."""
    return BoundedMemo(escape, limit=65536)


_NO_CONNECTION = "no connection modelled or scheduled"
_SPOOL_IN_MEMORY = 4 << 20  # characters of needs-design rows held in memory before they go to a file


_MARKUP = re.compile(r"[&<>\"']")


def _escape_once(text: str) -> str:
    """html.escape (quotes too) of a text met once (ids, names): most have nothing to escape, and
    finding that out is cheaper than escaping."""
    return escape(text) if _MARKUP.search(text) else text


def _cope_text(c: Mapping[str, Any]) -> str:
    return f"{escape(str(c.get('where')))} cope {_fmt(c.get('depth'), 0)} x {_fmt(c.get('length'), 0)} mm"


def _needs_design_row(j: Mapping[str, Any], esc: BoundedMemo | None = None) -> str:
    esc = _escaped() if esc is None else esc
    d = j.get("demand")
    shear = "–" if d is None or d.get("V_kN") is None else _fmt(d["V_kN"], 1)
    src = "" if d is None else f"<br><small>{esc[d['source']]}</small>"
    copes = (j.get("geometry") or {}).get("copes") or []
    cope_txt = "; ".join([_cope_text(c) for c in copes])
    raw_note = j.get("note") or ""
    if raw_note == _NO_CONNECTION:  # what the table's heading already says
        raw_note = ""
    note = "; ".join([x for x in (cope_txt, esc[raw_note]) if x])
    baseline = f' <span class="tag">{esc[j["baseline"]]}</span>' if j.get("baseline") else ""
    reasons = "; ".join([esc[r] for r in j.get("stiffness_reasons") or []])  # escaping commutes with joining
    jid = _escape_once(j["id"])  # quotes escaped too, so the same text serves attributes
    return (
        f'<tr class="issue" id="{jid}" data-status="needs-design" '
        f'data-storey="{esc[j.get("storey") or ""]}" data-kind="{esc[j["kind"]]}" data-util="">'
        f'<td><code>{jid}</code>{baseline}</td>'
        f'<td>{esc[j["end"]]} of {_escape_once(j.get("beam_name") or "")} {esc[j.get("beam_section") or ""]}<br><code>{_escape_once(j["beam"])}</code></td>'
        f'<td>{esc[j.get("support_name") or ""]} {esc[j.get("support_section") or ""]}<br><code>{esc[j.get("support") or "none"]}</code></td>'
        f'<td>{esc[j["kind"]]}, {esc[j["stiffness"]]}<br><small class="why">{reasons}</small></td>'
        f'<td>{esc[j.get("storey") or "–"]}</td><td class="num">{shear}{src}</td><td>{note}</td></tr>'
    )


def report_parts(
    doc: Mapping[str, Any], drawings: Mapping[str, Mapping[str, str]] | None = None, symbols: str = "",
    gathered: "IssueList | None" = None,
) -> Iterator[str]:
    """The HTML page for a results document, in pieces (join them, or write them one after the
    other). ``drawings`` maps joint id → ``{"elevation": svg, "plan": svg}`` (SVG made by this
    program, inserted as is). ``gathered``: the issues already gathered from the document's joints
    (an :class:`IssueList` fed while another writer went through them); ``doc["joints"]`` is then
    not read."""
    if gathered is None:
        gathered = IssueList()
        for j in doc["joints"]:
            gathered.add(j)
    return gathered.parts(doc, drawings or {}, symbols)


class IssueList:
    """The issues of a results document gathered one joint at a time (:meth:`add`), in one pass
    over the joints (a list, or a one-pass iterator: ``results_document(stream=True)``). The
    failing and incomplete joints are kept (few; drawn, in utilisation order); the rows of those
    that need design (most, on a large model) are written out as they come, to a spool that stays
    in memory while small and goes to a temporary file beyond that. :meth:`parts` then gives the
    page, once."""

    def __init__(self, spool_dir: str | None = None, target: str = "the issue list") -> None:
        self.target = target  # named in a write error (the spool is written while others are)
        self.others: list[Mapping[str, Any]] = []
        self.nd_held: list[Mapping[str, Any]] | None = None   # rows out of order: sorted at the end
        self.storeys: set[str] = set()
        self.kinds: set[str] = set()
        self.present: set[str] = set()
        self.n_nd = 0
        self.last_key: tuple | None = None
        self.esc = _escaped()
        self.spool = tempfile.SpooledTemporaryFile(max_size=_SPOOL_IN_MEMORY, mode="w+", encoding="utf-8",
                                                   dir=spool_dir)

    def add(self, j: Mapping[str, Any]) -> None:
        status = j["status"]
        if status not in ISSUE_STATUSES:
            return
        self.storeys.add(j.get("storey") or "")
        self.kinds.add(j["kind"])
        self.present.add(status)
        if status != "needs-design":
            self.others.append(j)
            return
        self.n_nd += 1
        key = (-(j.get("utilisation") or 0.0), j["id"])
        if self.nd_held is None and self.last_key is not None and key < self.last_key:
            self.nd_held = []  # not in the page's order (none of ours: they come in id order); sort them all
        self.last_key = key
        if self.nd_held is not None:
            self.nd_held.append(j)
        else:
            try:
                self.spool.write(_needs_design_row(j, self.esc))
            except OSError as exc:  # raised while another output is written: say which
                raise OutputError(f"cannot write {self.target}: {exc.strerror or exc}") from None

    def parts(self, doc: Mapping[str, Any], drawings: Mapping[str, Mapping[str, str]], symbols: str) -> Iterator[str]:
        """The page in pieces (see :func:`report_parts`)."""
        rank = {"fail": 0, "incomplete": 1, "needs-design": 2}
        others = sorted(self.others, key=lambda j: (rank[j["status"]], -(j.get("utilisation") or 0.0), j["id"]))
        n_nd, spool = self.n_nd, self.spool
        n_issues = len(others) + n_nd
        storeys_l, kinds_l = sorted(self.storeys), sorted(self.kinds)
        statuses = [st for st in ISSUE_STATUSES if st in self.present]
        s = doc["summary"]
        summary_cells = "".join(f"<th class='num'>{escape(k)}</th>" for k in ("joints", "pass", "fail", "needs-design", "incomplete", "not-checked"))
        summary_vals = "".join(f"<td class='num'>{s.get(k, 0)}</td>" for k in ("joints", "pass", "fail", "needs-design", "incomplete", "not-checked"))
        model = doc["model"]
        yield (
            "<!DOCTYPE html><html lang='en'><head><meta charset='utf-8'>"
            f"<title>Connection audit — {escape(model['file'])}</title>"
            "<meta name='viewport' content='width=device-width, initial-scale=1'>"
            f"<style>{_CSS}</style></head><body><header>"
            f"<h1>Connection audit — {escape(model['file'])}</h1>"
            f"<p class='meta'>{escape(model.get('schema', ''))}, lengths in {escape(model.get('length_unit', ''))} · "
            f"design code {escape(doc.get('code_title') or doc.get('code', ''))} · support policy {escape(doc.get('policy') or '')} · "
            f"{escape(doc['tool']['name'])} {escape(doc['tool']['version'])} · {escape((doc.get('run') or {}).get('date', ''))}</p>"
            f"<div class='caution' role='note'>CAUTION: {escape(CAUTION)}</div>"
            f"<table class='summary'><tr>{summary_cells}</tr><tr>{summary_vals}</tr></table>"
            "</header><main>"
            f"{symbols}"
            "<div class='controls'>"
            f"<label for='f-status'>Status</label><select id='f-status'>{_options(statuses, 'all statuses')}</select>"
            f"<label for='f-storey'>Storey</label><select id='f-storey'>{_options(storeys_l, 'all storeys')}</select>"
            f"<label for='f-kind'>Kind</label><select id='f-kind'>{_options(kinds_l, 'all kinds')}</select>"
            "<button type='button' id='sort-util'>Utilisation ↓ highest first</button>"
            f"<span><strong id='shown-count'>{n_issues}</strong> of {n_issues} issues shown</span>"
            "</div>"
        )
        with spool:
            if not n_issues:
                yield "<p class='none'>No issues: every checked joint passes.</p><section id='issues'></section>"
            else:
                yield "<section id='issues'>"
                for i in range(0, len(others), 500):
                    yield "".join(_issue(j, drawings.get(j["id"], {})) for j in others[i:i + 500])
                yield "</section>"
                if n_nd:
                    yield _ND_HEAD
                    if self.nd_held is not None:
                        spool.seek(0)
                        spool.truncate()
                        self.nd_held.sort(key=lambda j: (-(j.get("utilisation") or 0.0), j["id"]))
                        for j in self.nd_held:
                            spool.write(_needs_design_row(j, self.esc))
                    spool.seek(0)
                    while True:
                        block = spool.read(1 << 20)
                        if not block:
                            break
                        yield block
                    yield "</tbody></table>"
        removed = doc.get("baseline_removed") or []
        if removed:
            items = "".join(f"<li><code>{escape(r['id'])}</code> beam <code>{escape(str(r.get('beam')))}</code> ({escape(str(r.get('end')))}) — was {escape(str(r.get('status')))}, joint no longer in the model</li>" for r in removed)
            yield f"<h2>Resolved since the baseline (joint removed)</h2><ul>{items}</ul>"
        yield (
            "</main><footer><p class='meta'>Generated by joint-audit. Drawings are schematic. "
            f"{escape(CAUTION)}</p></footer>"
            f"<script>{_JS}</script></body></html>"
        )


def render_report(doc: Mapping[str, Any], drawings: Mapping[str, Mapping[str, str]] | None = None, symbols: str = "") -> str:
    """The whole HTML page for a results document (:func:`report_parts` joined)."""
    return "".join(report_parts(doc, drawings, symbols))
