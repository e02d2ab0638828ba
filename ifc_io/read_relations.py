"""One pass over the model's relationships, indexed by entity id, so per-element look-ups are
dictionary reads instead of inverse-attribute walks.

Covers: spatial containment (IfcRelContainedInSpatialStructure), aggregation (IfcRelAggregates,
assemblies and the spatial tree), types (IfcRelDefinesByType), materials
(IfcRelAssociatesMaterial), element connections (IfcRelConnectsElements and subtypes, with the
realizing elements of IfcRelConnectsWithRealizingElements), openings (IfcRelVoidsElement /
IfcRelFillsElement) and, when asked for, property sets (IfcRelDefinesByProperties). The same code
reads IFC2X3, IFC4 and IFC4X3 (in IFC2X3 a type is also reached through IfcRelDefinesByType).
"""

from __future__ import annotations

from collections import defaultdict

from ifc_io.read_geometry import arg, text_value

__all__ = ["RelationIndex"]


def _entity(x) -> bool:
    """Is ``x`` an entity instance? A damaged file can leave ``None`` (a dangling reference) or a
    plain value where a relationship expects an entity; such links are ignored."""
    return x is not None and hasattr(x, "id") and hasattr(x, "is_a")


def _entities(seq) -> list:
    """The entity instances of an aggregate attribute (``None`` or a non-list gives none)."""
    if not isinstance(seq, (tuple, list)):
        return []
    return [x for x in seq if _entity(x)]


def _by_type(model, cls: str):
    try:
        return model.by_type(cls)
    except RuntimeError:  # the class does not exist in this schema
        return []


def elements_once(model, classes):
    """Every element of the given IFC classes (subtypes included), each once, in class order then
    file order; a class the schema does not have is skipped. ``model``: an ``ifcopenshell.file``
    or a :class:`RelationIndex` (which keeps each class's list for the rest of the read)."""
    seen: set[int] = set()
    for cls in classes:
        for el in _by_type(model, cls):
            key = el.id()
            if key not in seen:
                seen.add(key)
                yield el


class RelationIndex:
    """Relationship look-ups for one model (ids are ``entity.id()``)."""

    def __init__(self, model, with_properties: bool = False) -> None:
        self.model = model
        self.container: dict[int, object] = {}
        self.parent: dict[int, object] = {}
        self.children: dict[int, list] = defaultdict(list)
        self.type_of: dict[int, object] = {}
        self.material: dict[int, object] = {}
        self.connected: dict[int, list] = defaultdict(list)
        self.opening_host: dict[int, object] = {}
        self.filled_opening: dict[int, list] = defaultdict(list)
        self.psets: dict[int, list] = defaultdict(list)
        self._storey_cache: dict[int, str] = {}
        self._storey_names: dict[int, str] = {}
        self._storey_of_structure: dict[int, str] = {}  # spatial structure id → storey name
        self.material_cache: dict[int, object] = {}  # read_materials: per material select
        self._class_lists: dict[str, list] = {}

        # Positional reads (attributes 4 and 5 of these relationships are the same in IFC2X3,
        # IFC4 and IFC4X3) keep this pass cheap on large models.
        for rel in _by_type(model, "IfcRelContainedInSpatialStructure"):
            structure = arg(rel, 5)  # RelatingStructure
            if not _entity(structure):
                continue
            for el in _entities(arg(rel, 4)):  # RelatedElements
                self.container.setdefault(el.id(), structure)
        for rel in _by_type(model, "IfcRelAggregates"):
            whole = arg(rel, 4)  # RelatingObject
            if not _entity(whole):
                continue
            for part in _entities(arg(rel, 5)):  # RelatedObjects
                self.parent.setdefault(part.id(), whole)
                self.children[whole.id()].append(part)
        for rel in _by_type(model, "IfcRelDefinesByType"):
            t = arg(rel, 5)  # RelatingType
            if not _entity(t):
                continue
            for obj in _entities(arg(rel, 4)):  # RelatedObjects
                self.type_of.setdefault(obj.id(), t)
        for rel in _by_type(model, "IfcRelAssociatesMaterial"):
            mat = arg(rel, 5)  # RelatingMaterial
            if not _entity(mat):
                continue
            for obj in _entities(arg(rel, 4)):  # RelatedObjects
                self.material.setdefault(obj.id(), mat)
        for rel in _by_type(model, "IfcRelConnectsElements"):
            a, b = rel.RelatingElement, rel.RelatedElement
            if not (_entity(a) and _entity(b)):
                continue
            self.connected[a.id()].append(b)
            self.connected[b.id()].append(a)
            for r in _entities(getattr(rel, "RealizingElements", None)):
                self.connected[r.id()].extend((a, b))
        for rel in _by_type(model, "IfcRelVoidsElement"):
            if _entity(rel.RelatedOpeningElement) and _entity(rel.RelatingBuildingElement):
                self.opening_host[rel.RelatedOpeningElement.id()] = rel.RelatingBuildingElement
        for rel in _by_type(model, "IfcRelFillsElement"):
            if _entity(rel.RelatedBuildingElement) and _entity(rel.RelatingOpeningElement):
                self.filled_opening[rel.RelatedBuildingElement.id()].append(rel.RelatingOpeningElement)
        if with_properties:
            for rel in _by_type(model, "IfcRelDefinesByProperties"):
                pdef = rel.RelatingPropertyDefinition
                if not _entity(pdef):
                    continue
                for obj in _entities(rel.RelatedObjects):
                    self.psets[obj.id()].append(pdef)

    # ------------------------------------------------------------------------------------
    def by_type(self, cls: str) -> list:
        """``model.by_type(cls)``, kept for the rest of the read: the members, bearings and parts
        read the same lists the class counts need (RuntimeError, as the model raises it, for a
        class the schema does not have)."""
        hit = self._class_lists.get(cls)
        if hit is None:
            hit = self._class_lists[cls] = self.model.by_type(cls)
        return hit

    def element_type(self, element):
        """The element's type object (IfcTypeObject) or ``None``; IFC2X3 and IFC4 alike."""
        return self.type_of.get(element.id())

    def storey_name(self, element) -> str:
        """Name of the building storey the element is in: its spatial container, or the
        container of the assembly (or other whole) it is part of, walked up to a storey."""
        key = element.id()
        hit = self._storey_cache.get(key)
        if hit is not None:
            return hit
        node_id, container = key, None
        for _ in range(16):
            container = self.container.get(node_id)
            if container is not None:
                break
            whole = self.parent.get(node_id)
            if whole is None:
                break
            node_id = whole.id()
        name = ""
        if container is not None:
            cid = container.id()
            name = self._storey_of_structure.get(cid)
            if name is None:
                name = self._storey_of_structure[cid] = self._structure_storey(container)
        self._storey_cache[key] = name
        return name

    def _structure_storey(self, struct) -> str:
        """Name of the storey a spatial structure element is, or is in (walked up the spatial
        tree), or ``""``."""
        name = ""
        for _ in range(16):
            if struct is None:
                break
            if struct.is_a("IfcBuildingStorey"):
                sid = struct.id()
                name = self._storey_names.get(sid)
                if name is None:
                    name = self._storey_names[sid] = (text_value(struct.Name) or text_value(getattr(struct, "LongName", None))).strip()
                break
            struct = self.parent.get(struct.id()) or self.container.get(struct.id())
        return name

    def assembly_of(self, element):
        """The IfcElementAssembly the element is aggregated into, or ``None``."""
        whole = self.parent.get(element.id())
        if whole is not None and whole.is_a("IfcElementAssembly"):
            return whole
        return None

    def hosts(self, element) -> list:
        """Elements a connection part is related to: explicit element connections, the host of
        an opening it fills, and the whole it is aggregated into when that is not an assembly."""
        out = list(self.connected.get(element.id(), ()))
        for opening in self.filled_opening.get(element.id(), ()):
            host = self.opening_host.get(opening.id())
            if host is not None:
                out.append(host)
        whole = self.parent.get(element.id())
        if whole is not None and whole.is_a("IfcElement") and not whole.is_a("IfcElementAssembly"):
            out.append(whole)
        return out

    def property_value(self, element, pset_name: str, prop_name: str):
        """A single property value (unwrapped) from the element's, else its type's, property set."""
        sources = list(self.psets.get(element.id(), ()))
        t = self.element_type(element)
        if t is not None:
            sources += _entities(getattr(t, "HasPropertySets", None))
        for pdef in sources:
            if not _entity(pdef) or not pdef.is_a("IfcPropertySet") or (pdef.Name or "") != pset_name:
                continue
            for prop in _entities(pdef.HasProperties):
                if prop.Name == prop_name and prop.is_a("IfcPropertySingleValue"):
                    v = prop.NominalValue
                    v = getattr(v, "wrappedValue", v)
                    return v if isinstance(v, (str, int, float, bool)) else None
        return None
