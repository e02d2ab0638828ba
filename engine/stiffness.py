"""Stiff / flexible classification of a joint's support, with reasons a reviewer can check.

Why it matters. A simple shear connection (fin plate) has a hinge somewhere between the support face
and the bolt line. Against a support that is stiff in rotation (a continuous column's flange) the
hinge sits at the bolt line and the weld and plate carry the eccentricity moment; against a support
that rotates with the beam end (a girder web, free to twist, loaded from one side) the hinge sits at
the support face and the bolt group carries it. # common practice (the support-rigidity distinction
used for single-plate shear connections in steel design handbooks; recalled, # from memory).

Method. Each joint gets a verdict from its support kind, whether the support is continuous through
the joint, whether a back-to-back beam of similar span balances it, and, where both sections are
known rolled I/channel shapes, a relative rotational stiffness ``k_support / (E I_beam / L_beam)``:

- column bending (flange side): ``k = Σ 3 E I_col / h`` over the column lengths above and below the
  joint (far ends taken pinned, the lower bound; # common practice);
- girder twist (web side): ``k = G J (1/a + 1/b)`` with ``a``, ``b`` the distances to the girder's
  ends, taken as torsion restraints, and ``J ≈ (2 b tf³ + (d − 2 tf) tw³) / 3`` (thin-walled open
  section; # common practice).

The ratio is judged against the boundaries EN 1993-1-8 §5.2.2.5 uses to classify joints
(rigid ≥ 8, nominally pinned ≤ 0.5, times ``E I_b / L_b``; # from memory), used here by analogy for the
support. E = 200 000 MPa and G = 80 000 MPa (steel; # from memory).

Rules (each joint's reasons name the rule that applied; # common practice unless stated):

- column flange, column continuous through the joint → stiff; at the column's end (top) or
  continuity unknown → not clearly stiff; a column slender relative to the beam → not clearly stiff;
- column web between the flanges of a continuous column → stiff; at the column's end → not clearly
  stiff (balanced) or leaning flexible (one side);
- girder web, one side only, girder free to twist → flexible; balanced by a back-to-back beam of
  similar span and depth → not clearly stiff, leaning stiff (pattern loading unbalances it);
  back-to-back but dissimilar → flexible; a girder torsionally stiff relative to the beam → leaning
  stiff;
- bearing on the top flange of a beam below → flexible (the end rotates on the bearing);
- wall or slab (bearing or embed) → stiff (a concrete or masonry support does not rotate with the
  beam end);
- splice → stiff; free end, brace end, unrecognised type → flexible (recorded, not a hinge choice).

Verdicts are ``stiff``, ``flexible``, or *not clear* leaning one way. The policy maps them to the
joint's stiffness: ``conservative`` (default) — only a clearly stiff support is stiff; ``classified``
— the leaning decides; ``envelope`` — as classified, and downstream checks both hinge positions.

An aid to a competent engineer: the classification must be checked, and the governing local code and
licensed practice take precedence.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

import numpy as np

from engine.errors import ConfigError
from engine.model import Section

__all__ = ["POLICIES", "SupportFacts", "Verdict", "classify", "classify_batch", "apply_policy",
           "relative_stiffness", "relative_stiffness_batch",
           "E_STEEL", "G_STEEL", "RIGID_RATIO", "PINNED_RATIO"]

POLICIES = ("conservative", "classified", "envelope")

E_STEEL = 200_000.0  # MPa, # from memory (AS 4100 / EN 1993-1-1 value for structural steel)
G_STEEL = 80_000.0   # MPa, # from memory
RIGID_RATIO = 8.0    # EN 1993-1-8 5.2.2.5 braced-frame rigid boundary, # from memory, used by analogy
PINNED_RATIO = 0.5   # EN 1993-1-8 5.2.2.5 nominally pinned boundary, # from memory, used by analogy

STIFF, FLEXIBLE, LEAN_STIFF, LEAN_FLEXIBLE = "stiff", "flexible", "lean-stiff", "lean-flexible"


@dataclass(frozen=True)
class SupportFacts:
    """What the classifier needs to know about one joint (lengths mm).

    ``continuous``: the support runs on through the joint (``None`` unknown). ``partner_similar``:
    ``None`` when there is no back-to-back joint, else whether the partner's span and depth are within
    the balance ratio. ``h_before``/``h_after``: support length on either side of the joint (column
    heights below/above, girder lengths to its ends), ``None`` when unknown.
    """

    kind: str
    support_label: str = ""
    continuous: bool | None = None
    partner_label: str | None = None
    partner_similar: bool | None = None
    span_ratio: float | None = None
    beam_section: Section | None = None
    support_section: Section | None = None
    beam_length: float | None = None
    h_before: float | None = None
    h_after: float | None = None
    orientation_known: bool = True
    support_is_i: bool = True


@dataclass(frozen=True)
class Verdict:
    """A classification before the policy: ``level`` is stiff / flexible / lean-stiff / lean-flexible."""

    level: str
    reasons: tuple[str, ...]


def _i_major(s: Section) -> float | None:
    if s.I_major:
        return s.I_major
    if None in (s.depth, s.width, s.web_thickness, s.flange_thickness) or s.kind not in ("I", "channel"):
        return None
    d, b, tw, tf = s.depth, s.width, s.web_thickness, s.flange_thickness
    return (b * d ** 3 - (b - tw) * (d - 2 * tf) ** 3) / 12.0  # type: ignore[operator]


def _i_minor(s: Section) -> float | None:
    if s.I_minor:
        return s.I_minor
    if None in (s.depth, s.width, s.web_thickness, s.flange_thickness) or s.kind != "I":
        return None
    d, b, tw, tf = s.depth, s.width, s.web_thickness, s.flange_thickness
    return (2 * tf * b ** 3 + (d - 2 * tf) * tw ** 3) / 12.0  # type: ignore[operator]


def _torsion_j(s: Section) -> float | None:
    if None in (s.depth, s.width, s.web_thickness, s.flange_thickness) or s.kind not in ("I", "channel"):
        return None
    d, b, tw, tf = s.depth, s.width, s.web_thickness, s.flange_thickness
    return (2 * b * tf ** 3 + (d - 2 * tf) * tw ** 3) / 3.0  # type: ignore[operator]


def relative_stiffness(f: SupportFacts) -> float | None:
    """``k_support / (E I_beam / L_beam)`` (dimensionless) for column-flange, column-web and beam-web
    supports, or ``None`` when the sections, lengths or kind do not allow it (see module docstring).
    One joint of :func:`relative_stiffness_batch`."""
    return relative_stiffness_batch([f.kind], [f.beam_section], [f.support_section], [f.beam_length],
                                    [f.h_before], [f.h_after])[0]


def _support_value(kind: str, s: Section) -> float | None:
    """The support's section property the ratio uses for ``kind`` (mm⁴): I major (column flange),
    I minor (column web), J (girder web); ``None`` for other kinds or unknown sections."""
    if kind == "column-flange":
        return _i_major(s)
    if kind == "column-web":
        return _i_minor(s)
    if kind == "beam-web":
        return _torsion_j(s)
    return None


def relative_stiffness_batch(kinds: Sequence[str], beam_sections: Sequence[Section | None],
                             support_sections: Sequence[Section | None],
                             beam_lengths: Sequence[float | None], h_before: Sequence[float | None],
                             h_after: Sequence[float | None]) -> list[float | None]:
    """``k_support / (E I_beam / L_beam)`` for many joints at once (sequences of equal length;
    lengths mm), ``None`` where the sections, lengths or kind do not allow it: k_support is the sum
    over the column lengths (or girder arms) either side longer than 1 mm of 3 E I / h (I major for a
    column flange, I minor for a column web) or G J / h (girder web). Vectorised with numpy over the
    joints; the section properties (I, J) are worked out once per distinct section object.
    """
    n = len(kinds)
    if n == 0:
        return []
    ib_of: dict[int, float | None] = {}
    sv_of: dict[tuple[str, int], float | None] = {}
    ib_l: list[float | None] = []
    sv_l: list[float | None] = []
    for kind, bs, ss in zip(kinds, beam_sections, support_sections):
        if kind not in _RATIO_KINDS or bs is None or ss is None:
            ib_l.append(None)
            sv_l.append(None)
            continue
        key_b = id(bs)
        ib_l.append(ib_of[key_b] if key_b in ib_of else ib_of.setdefault(key_b, _i_major(bs)))
        key_s = (kind, id(ss))
        sv_l.append(sv_of[key_s] if key_s in sv_of else sv_of.setdefault(key_s, _support_value(kind, ss)))
    ok = np.array([bool(ib) and sv is not None and bool(bl) for ib, sv, bl in
                   zip(ib_l, sv_l, beam_lengths)], dtype=bool)
    ib = _floats(ib_l)
    sv = _floats(sv_l)
    bl = _floats(beam_lengths)
    hb, ha = _floats(h_before), _floats(h_after)
    use_b, use_a = hb > 1.0, ha > 1.0          # NaN (unknown) compares False
    kinds_a = np.array(kinds, dtype=object)
    col = (kinds_a == "column-flange") | (kinds_a == "column-web")
    factor = np.where(col, 3.0 * E_STEEL, G_STEEL)   # 3 E I / h per column length, G J / h per arm
    with np.errstate(divide="ignore", invalid="ignore"):
        t_b = factor * sv / hb
        t_a = factor * sv / ha
        k = np.where(use_b & use_a, t_b + t_a, np.where(use_b, t_b, t_a))
        ratio = k / (E_STEEL * ib / bl)
    ok &= use_b | use_a
    return [r if o else None for r, o in zip(ratio.tolist(), ok.tolist())]


def _floats(values: Sequence[float | None]) -> np.ndarray:
    """Array of floats, ``None`` as NaN."""
    return np.array([np.nan if v is None else v for v in values], dtype=float)


_RATIO_KINDS = frozenset(("column-flange", "column-web", "beam-web"))


def _ratio_text(ratio: float, what: str) -> str:
    return f"relative stiffness {what} / (E·I_beam/L_beam) = {ratio:.2g} {_BOUNDS_TEXT}"


_BOUNDS_TEXT = f"(stiff ≥ {RIGID_RATIO:g}, flexible ≤ {PINNED_RATIO:g})"


def classify(f: SupportFacts) -> Verdict:
    """Classify one joint's support (before the policy); see the module docstring for the method."""
    level, reasons = _verdict(f.kind, f.support_label, f.continuous, f.partner_label,
                              f.partner_similar, f.span_ratio, f.orientation_known, f.support_is_i,
                              relative_stiffness(f))
    return Verdict(level, reasons)


def classify_batch(kinds: Sequence[str], support_labels: Sequence[str],
                   continuous: Sequence[bool | None], partner_labels: Sequence[str | None],
                   partner_similar: Sequence[bool | None], span_ratios: Sequence[float | None],
                   orientation_known: Sequence[bool], support_is_i: Sequence[bool],
                   ratios: Sequence[float | None], policy: str) -> list[tuple[str, tuple[str, ...]]]:
    """:func:`classify` then :func:`apply_policy` for many joints at once, without building a
    :class:`SupportFacts` per joint.

    The sequences (equal length) hold the fields of :class:`SupportFacts` joint by joint, and
    ``ratios`` the :func:`relative_stiffness` of each (see :func:`relative_stiffness_batch`; lengths
    mm). Same rules as :func:`classify`. Returns (stiffness, reasons) per joint.
    """
    if policy not in POLICIES:
        raise ConfigError(f"[support] policy {policy!r} is not one of {', '.join(POLICIES)}")
    # one string object per distinct reason text, shared from the start: most texts recur from joint
    # to joint, and holding every joint's own copies until the caller shares them doubled the peak
    texts: dict[str, str] = {}
    share = texts.setdefault
    out = []
    for row in zip(kinds, support_labels, continuous, partner_labels, partner_similar, span_ratios,
                   orientation_known, support_is_i, ratios):
        level, reasons = _policy(*_verdict(*row), policy)
        out.append((level, tuple([share(r, r) for r in reasons])))
    return out


def _verdict(k: str, support_label: str, continuous: bool | None, partner_label: str | None,
             partner_similar: bool | None, span_ratio: float | None, orientation_known: bool,
             support_is_i: bool, ratio: float | None) -> tuple[str, tuple[str, ...]]:
    """The rules of :func:`classify` on plain values: (level, reasons)."""
    r: list[str] = []
    sup = support_label or "the support"
    if k == "column-flange" and not support_is_i:
        r.append(f"face of column {sup} (not an I section): the wall of a hollow or solid section "
                 "bends locally; rotational restraint not assessed → not clearly stiff")
        return LEAN_FLEXIBLE, tuple(r)
    if k == "column-flange":
        if not orientation_known:
            r.append(f"column {sup}: section orientation not in the model; face inferred from the "
                     "distance → not clearly stiff")
            return LEAN_FLEXIBLE, tuple(r)
        if continuous:
            r.append(f"column flange, column {sup} continuous through the joint → stiff")
            level = STIFF
        elif continuous is None:
            r.append(f"column flange of {sup}; continuity of the column not known → not clearly stiff")
            level = LEAN_STIFF
        else:
            r.append(f"column flange at the end of column {sup} (column not continuous through the "
                     "joint): restrained by one column length only → not clearly stiff")
            level = LEAN_STIFF
        if ratio is not None:
            r.append(_ratio_text(ratio, "column bending"))
            if ratio <= PINNED_RATIO:
                r.append("column slender relative to the beam → not clearly stiff")
                level = LEAN_FLEXIBLE
        return level, tuple(r)
    if k == "column-web":
        if not orientation_known:
            r.append(f"column {sup}: section orientation not in the model; the web is assumed "
                     "(the more flexible face) → not clearly stiff")
            return LEAN_FLEXIBLE, tuple(r)
        if not support_is_i:
            r.append(f"face of column {sup} (not an I section): local flexibility not assessed → "
                     "not clearly stiff")
            return LEAN_FLEXIBLE, tuple(r)
        if continuous:
            r.append(f"column web between the flanges of column {sup}, column continuous through the "
                     "joint: the web is held by both flanges and the column runs on → stiff "
                     "(common practice)")
            level = STIFF
            if partner_label:
                r.append(f"back-to-back beam {partner_label} on the other side of the web"
                         + (" (similar span: balanced)" if partner_similar else
                            f" (span ratio {span_ratio:.2f}: unbalanced)"))
        elif partner_label and partner_similar:
            r.append(f"column web, balanced by back-to-back beam {partner_label}, but column {sup} "
                     f"{'is not continuous' if continuous is False else 'may not be continuous'} "
                     "through the joint → not clearly stiff")
            level = LEAN_STIFF
        else:
            r.append(f"column web of {sup}, column "
                     f"{'not continuous' if continuous is False else 'continuity not known'}"
                     + (", one side only" if not partner_label else ", unbalanced back-to-back")
                     + ": the web bends out of plane under the end rotation → not clearly stiff")
            level = LEAN_FLEXIBLE
        if ratio is not None:
            r.append(_ratio_text(ratio, "column minor-axis bending (web local bending not included)"))
            if ratio <= PINNED_RATIO:
                r.append("even without web flexibility the column is slender about its minor axis "
                         "→ not clearly stiff")
                level = LEAN_FLEXIBLE
        return level, tuple(r)
    if k == "beam-web":
        if partner_label and partner_similar:
            r.append(f"girder web of {sup}, balanced by back-to-back beam {partner_label} of similar "
                     "span: girder twist largely cancels under balanced load (pattern loading "
                     "unbalances it) → not clearly stiff, leaning stiff")
            level = LEAN_STIFF
        elif partner_label:
            r.append(f"girder web of {sup}, back-to-back beam {partner_label} of dissimilar span "
                     f"(ratio {span_ratio:.2f}): unbalanced, girder twists → flexible")
            level = FLEXIBLE
        else:
            r.append(f"girder web of {sup}, one side only, girder free to twist → flexible")
            level = FLEXIBLE
        if ratio is not None:
            r.append(_ratio_text(ratio, "girder torsion"))
            if ratio >= RIGID_RATIO and level == FLEXIBLE:
                r.append("girder torsionally stiff relative to the beam → not clearly flexible")
                level = LEAN_STIFF
            elif ratio <= PINNED_RATIO and level == LEAN_STIFF:
                r.append("girder torsionally flexible relative to the beam")
        return level, tuple(r)
    if k == "beam-over":
        r.append(f"bears on the top flange of {sup}: the end rotates on the bearing (no fin plate) → "
                 "flexible")
        return FLEXIBLE, tuple(r)
    if k == "wall":
        r.append(f"wall or slab {sup}: a concrete or masonry support does not rotate with the beam end "
                 "→ stiff (check the bearing or embed detail)")
        return STIFF, tuple(r)
    if k == "splice":
        r.append(f"splice with {sup}: the member is made continuous → stiff (not a shear-connection "
                 "hinge)")
        return STIFF, tuple(r)
    if k == "free-end":
        r.append("free end: no support, no connection; stiffness not applicable (recorded as flexible)")
        return FLEXIBLE, tuple(r)
    r.append(f"joint type not classified (at {sup}) → flexible")
    return FLEXIBLE, tuple(r)


def apply_policy(v: Verdict, policy: str) -> tuple[str, tuple[str, ...]]:
    """Map a verdict to ``"stiff"``/``"flexible"`` under ``policy``; returns (stiffness, reasons)."""
    if policy not in POLICIES:
        raise ConfigError(f"[support] policy {policy!r} is not one of {', '.join(POLICIES)}")
    return _policy(v.level, v.reasons, policy)


def _policy(level: str, reasons: tuple[str, ...], policy: str) -> tuple[str, tuple[str, ...]]:
    """:func:`apply_policy` on plain values (``policy`` already checked)."""
    if level in (STIFF, FLEXIBLE):
        out = level
    elif policy == "conservative":
        return "flexible", reasons + ("policy conservative: not clearly stiff → flexible",)
    else:
        out = "stiff" if level == LEAN_STIFF else "flexible"
        reasons = reasons + (f"policy {policy}: not clearly either, leaning {out} → {out}",)
    if policy == "envelope":
        reasons = reasons + ("policy envelope: both hinge positions (bolt line and support face) are "
                             "checked downstream",)
    return out, reasons
