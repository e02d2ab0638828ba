"""The state one read shares between its stages: the model, its length scale, the placement
resolver, the relationship index, per-profile caches and the warnings collected so far."""

from __future__ import annotations

from dataclasses import dataclass, field

from engine.model import DataWarning
from ifc_io.read_geometry import PlacementResolver, profile_bbox
from ifc_io.read_relations import RelationIndex

__all__ = ["ReadContext"]


@dataclass
class ReadContext:
    model: object
    mm: float
    index: RelationIndex
    resolver: PlacementResolver = field(default_factory=PlacementResolver)
    warnings: list[DataWarning] = field(default_factory=list)
    _bbox: dict[int, object] = field(default_factory=dict)

    def warn(self, message: str, global_id: str | None = None) -> None:
        # a damaged file may hold something other than text where the GlobalId belongs
        self.warnings.append(DataWarning(message, global_id if isinstance(global_id, str) else None, "read"))

    def bbox(self, profile):
        """:func:`profile_bbox`, cached per profile entity."""
        key = profile.id()
        if key in self._bbox:
            return self._bbox[key]
        result = profile_bbox(profile)
        self._bbox[key] = result
        return result
