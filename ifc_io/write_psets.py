"""Write the audit results into a model as property sets ``JointAudit_Start`` / ``JointAudit_End``.

One property set per checked beam end, typed IFC values (DESIGN.md §5): forces as
``IfcForceMeasure`` in the model's force unit, utilisation as ``IfcRatioMeasure``, statuses and codes
as ``IfcLabel``, reasons and summaries as ``IfcText``, ids as ``IfcIdentifier``.

* Custom property sets never take the ``Pset_`` prefix.
* Idempotent: an existing ``JointAudit_*`` set on the beam is removed (with its properties and, when
  it relates nothing else, its relationship) before the new one is added, so a re-run replaces rather
  than duplicates.
* Deterministic: the GlobalIds of the new sets and relationships derive from the beam's GlobalId and
  the set's name, so two runs on the same input write the same entities.
* Works on an open ``ifcopenshell.file`` (the plug-in path); writing a file is the caller's job
  (:func:`ifc_io.write_model.write_model_copy`).

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

from typing import Any, Iterable, Mapping

import ifcopenshell

from engine.pset_text import NAMESPACE, PSET_BY_END, PSET_NAMES, derived_guid, pset_properties

__all__ = ["PSET_BY_END", "PSET_NAMES", "write_joint_psets", "remove_joint_psets", "remove_all_joint_psets",
           "read_joint_psets", "iter_joint_beams"]

# the sets' names, content and derived GlobalIds are defined once, in engine.pset_text
_NS = NAMESPACE
_guid = derived_guid
_properties = pset_properties


def _rels_of(element) -> list:
    rels = []
    for rel in getattr(element, "IsDefinedBy", None) or ():
        if rel.is_a("IfcRelDefinesByProperties"):
            rels.append(rel)
    return rels


def remove_joint_psets(model: ifcopenshell.file, element) -> int:
    """Remove every ``JointAudit_*`` property set from ``element``; returns how many were removed."""
    removed = 0
    for rel in _rels_of(element):
        pset = rel.RelatingPropertyDefinition
        if pset is not None and pset.is_a("IfcPropertySet") and pset.Name in PSET_NAMES:  # None: damaged file
            _remove_one(model, element, rel)
            removed += 1
    return removed


def remove_all_joint_psets(model: ifcopenshell.file) -> int:
    """Remove every ``JointAudit_*`` property set from every element of ``model``; returns how many
    were removed."""
    owners: dict[int, Any] = {}
    for pset in model.by_type("IfcPropertySet"):
        if pset.Name in PSET_NAMES:
            for rel in model.get_inverse(pset):
                if rel.is_a("IfcRelDefinesByProperties"):
                    for obj in rel.RelatedObjects or ():
                        owners[obj.id()] = obj
    return sum(remove_joint_psets(model, obj) for obj in owners.values())


def _owner_history(model: ifcopenshell.file):
    if model.schema != "IFC2X3":
        return None
    existing = model.by_type("IfcOwnerHistory")
    if existing:
        return existing[0]
    person = model.create_entity("IfcPerson", FamilyName="joint-audit")
    org = model.create_entity("IfcOrganization", Name="joint-audit")
    pao = model.create_entity("IfcPersonAndOrganization", ThePerson=person, TheOrganization=org)
    app = model.create_entity(
        "IfcApplication", ApplicationDeveloper=org, Version="0", ApplicationFullName="joint-audit",
        ApplicationIdentifier="joint-audit",
    )
    return model.create_entity(
        "IfcOwnerHistory", OwningUser=pao, OwningApplication=app, ChangeAction="ADDED", CreationDate=0
    )


def _value(model: ifcopenshell.file, ifc_type: str, value: Any):
    if model.schema == "IFC2X3" and ifc_type == "IfcDateTime":
        ifc_type = "IfcLabel"
    return model.create_entity(ifc_type, value)




def iter_joint_beams(model: ifcopenshell.file, doc: Mapping[str, Any], statuses: Iterable[str]):
    """``(joint, beam entity, pset name)`` for each joint of ``doc`` whose status is in ``statuses``
    and whose beam is in ``model``."""
    wanted = set(statuses)
    for joint in doc["joints"]:
        if joint["status"] not in wanted:
            continue
        try:
            beam = model.by_guid(joint["beam"])
        except RuntimeError:
            continue
        yield joint, beam, PSET_BY_END[joint["end"]]


def write_joint_psets(
    model: ifcopenshell.file,
    doc: Mapping[str, Any],
    *,
    n_per_force_unit: float = 1.0,
    statuses: Iterable[str] = ("pass", "fail", "needs-design", "incomplete"),
) -> int:
    """Write one property set per joint of the results document ``doc`` whose status is in
    ``statuses`` onto its beam in ``model`` (replacing earlier ``JointAudit_*`` sets of that end).

    ``n_per_force_unit`` is newtons per model force unit (``Frame.n_per_force_unit``). Returns the
    number of property sets written. Joints whose beam is not in the model are skipped.
    """
    owner = _owner_history(model)
    written = 0
    for joint, beam, pset_name in iter_joint_beams(model, doc, statuses):
        for rel in _rels_of(beam):
            pset = rel.RelatingPropertyDefinition
            if pset is not None and pset.is_a("IfcPropertySet") and pset.Name == pset_name:
                _remove_one(model, beam, rel)
        props = [
            model.create_entity("IfcPropertySingleValue", Name=n, NominalValue=_value(model, t, v))
            for n, t, v in _properties(joint, doc, n_per_force_unit)
        ]
        pset = model.create_entity(
            "IfcPropertySet", GlobalId=_guid(beam.GlobalId, pset_name), OwnerHistory=owner, Name=pset_name,
            Description="joint-audit result for this beam end (an aid to a competent engineer; check it)",
            HasProperties=props,
        )
        model.create_entity(
            "IfcRelDefinesByProperties", GlobalId=_guid(beam.GlobalId, pset_name, "rel"), OwnerHistory=owner,
            RelatedObjects=[beam], RelatingPropertyDefinition=pset,
        )
        written += 1
    return written


def _remove_one(model: ifcopenshell.file, element, rel) -> None:
    pset = rel.RelatingPropertyDefinition
    others = [o for o in rel.RelatedObjects if o != element]
    if others:
        rel.RelatedObjects = others
        return
    props = list(pset.HasProperties or ())
    model.remove(rel)
    if not model.get_inverse(pset):
        for prop in props:
            if not [r for r in model.get_inverse(prop) if r != pset]:
                model.remove(prop)
        model.remove(pset)


def read_joint_psets(model: ifcopenshell.file, element) -> dict[str, dict[str, Any]]:
    """The ``JointAudit_*`` sets on ``element`` as ``{pset name: {property: value}}`` (for tests and
    for tools reading results back)."""
    out: dict[str, dict[str, Any]] = {}
    for rel in _rels_of(element):
        pset = rel.RelatingPropertyDefinition
        if pset is not None and pset.is_a("IfcPropertySet") and pset.Name in PSET_NAMES:  # None: damaged file
            out[pset.Name] = {
                p.Name: (p.NominalValue.wrappedValue if p.NominalValue is not None else None)
                for p in pset.HasProperties
            }
    return out
