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

# The public names are imported on first use (module ``__getattr__``), so ``import fea`` and the
# command's entry point stay light and an interrupt during the heavy imports is caught by the command.
_HOMES = {
    "__version__": "version",
    "Column": "model", "Segment": "model", "Restraint": "model", "PointLoad": "model",
    "DistributedLoad": "model", "Foundation": "model", "LeaningLoad": "model", "FREE": "model", "RIGID": "model",
    "buckling": "solve.eigen",
    "BucklingResult": "results", "SegmentBuckling": "results",
    "FeaError": "errors", "ModelError": "errors", "CaseError": "errors", "UnitError": "errors",
    "SolverError": "errors",
}

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


def __getattr__(name: str):
    home = _HOMES.get(name)
    if home is None:
        raise AttributeError(f"module 'fea' has no attribute {name!r}")
    import importlib

    value = getattr(importlib.import_module(f".{home}", __name__), name)
    globals()[name] = value
    return value


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(__all__))
