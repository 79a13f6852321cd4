"""The parsed, typed case: one column per bending plane and what the case file says beside them (SI)."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import TYPE_CHECKING

from .column import Column

if TYPE_CHECKING:
    from ..units import DisplayUnits

__all__ = ["Case", "SegmentInfo"]


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

    def column(self, axis: str) -> Column:
        for a, col in self.planes:
            if a == axis:
                return col
        raise KeyError(axis)

    @property
    def height(self) -> float:
        return self.planes[0][1].height
