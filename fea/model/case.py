"""The parsed, typed case: one column per bending plane and what the case file says beside them (SI)."""

from __future__ import annotations

from dataclasses import dataclass, field
from types import MappingProxyType
from typing import TYPE_CHECKING, Any, Mapping

from .column import Column

if TYPE_CHECKING:
    from ..units import DisplayUnits

__all__ = ["Case", "LoadInfo", "SegmentInfo", "TableRef"]


@dataclass(frozen=True)
class SegmentInfo:
    """What the case file says about a segment beyond the stiffness model (SI)."""

    name: str
    bottom: float
    top: float
    A: float | None
    fy: float | None
    I_major: float | None
    I_minor: float | None
    section: dict | None = None
    #: the section built from ``section`` (a :mod:`fea.sections` shape), parsed once; None without one
    shape: Any = None
    #: its properties (I_major, I_minor, A, r_least, theta, J, shape name), SI; None without one
    properties: Mapping[str, Any] | None = None


@dataclass(frozen=True)
class LoadInfo:
    """What a ``[[load]]`` says beyond its axial force (SI; None where not given): the eccentricities [m] and the
    lateral force [N] that the imperfect-column analysis applies (kept for the record of the inputs)."""

    eccentricity: float | None = None
    eccentricity_major: float | None = None
    eccentricity_minor: float | None = None
    lateral: float | None = None


@dataclass(frozen=True)
class TableRef:
    """Where one input table of the case file went in the model.

    ``kind`` names the column's tuple (``"restraints"``, ``"foundations"``,
    ``"leaning_loads"``, ``"segments"``, ``"point_loads"``, ``"distributed_loads"``)
    and ``index`` the position in it, in the plane ``axis``.
    """

    axis: str
    kind: str
    index: int


@dataclass(frozen=True)
class Case:
    """A parsed, validated case.

    Attributes
    ----------
    title : the case title
    planes : tuple of (axis, Column): ("major", ...), ("minor", ...), or a
        single ("in-plane", ...) for a one-plane study
    segments : per-segment information (names, areas, yield strengths, sections)
    E, fy : material defaults [Pa] (fy may be None)
    n_modes, tolerance : analysis options
    display : display units
    source : path of the case file ("" when parsed from text)
    sha256 : hash of the case file's bytes
    extras : parsed optional sections (imperfection, design, study, ...)
    """

    title: str
    planes: tuple[tuple[str, Column], ...]
    segments: tuple[SegmentInfo, ...]
    E: float
    fy: float | None
    n_modes: int
    tolerance: float
    display: DisplayUnits
    source: str = ""
    sha256: str = ""
    extras: dict = field(default_factory=dict)
    material: dict = field(default_factory=dict)
    #: input table key path (``"restraint[2]"``, ``"segment[1]"``, ...) -> the model objects it became
    origins: Mapping[str, tuple[TableRef, ...]] = field(default_factory=dict)
    #: the case document as parsed (plain TOML data, read-only view) for rebuilding with changed values
    document: Mapping[str, Any] = field(default_factory=lambda: MappingProxyType({}))
    #: per ``[[load]]`` table, in file order (``point_loads`` of every plane in the same order)
    loads: tuple[LoadInfo, ...] = ()

    def model_objects(self, table: str) -> tuple[tuple[str, Any], ...]:
        """(axis, model object) pairs an input table became, e.g. ``model_objects("restraint[1]")``."""
        return tuple((r.axis, getattr(self.column(r.axis), r.kind)[r.index]) for r in self.origins.get(table, ()))

    def column(self, axis: str) -> Column:
        for a, col in self.planes:
            if a == axis:
                return col
        raise KeyError(axis)

    @property
    def height(self) -> float:
        return self.planes[0][1].height
