"""Stanchion: buckling, imperfect-column and design checks of single compression members.

Public API
----------
Model (SI units): :class:`Column`, :class:`Segment`, :class:`Restraint`,
:class:`PointLoad`, :class:`DistributedLoad`, :class:`Foundation`,
:class:`LeaningLoad`, :data:`FREE`, :data:`RIGID`.

Analysis: :func:`buckling` returns a :class:`BucklingResult`.

Errors: :class:`FeaError` and its subclasses.

The tool assists the engineer; it does not replace the governing design code
or a licensed engineer's judgement.
"""

from .errors import CaseError, FeaError, ModelError, SolverError, UnitError
from .model import FREE, RIGID, Column, DistributedLoad, Foundation, LeaningLoad, PointLoad, Restraint, Segment
from .results import BucklingResult, SegmentBuckling
from .solve.eigen import buckling
from .version import __version__

__all__ = (
    "__version__",
    "Column",
    "Segment",
    "Restraint",
    "PointLoad",
    "DistributedLoad",
    "Foundation",
    "LeaningLoad",
    "FREE",
    "RIGID",
    "buckling",
    "BucklingResult",
    "SegmentBuckling",
    "FeaError",
    "ModelError",
    "CaseError",
    "UnitError",
    "SolverError",
)
