"""The settings of the restraint studies: what the optional ``[study]`` table of a case file asks for (SI).

Read from the case file by :func:`fea.io.study_input.parse_study`; the layout
of the table is documented there and in ``docs/studies.md``.  The commands
take these as defaults beside their options.
"""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["StudySpec", "SweepSpec", "ParameterSpec", "BraceSpec", "BoundSpec"]


@dataclass(frozen=True)
class ParameterSpec:
    key: str
    start: float
    stop: float
    points: int
    scale: str


@dataclass(frozen=True)
class SweepSpec:
    parameters: tuple[ParameterSpec, ...]
    segments: tuple[int, ...] | None  # 0-based
    method: str


@dataclass(frozen=True)
class BraceSpec:
    restraints: tuple[int, ...]  # 1-based table numbers
    kind: str
    axis: str | None
    fraction: float
    eps: float
    bow: float


@dataclass(frozen=True)
class BoundSpec:
    key: str
    low: float
    high: float


@dataclass(frozen=True)
class StudySpec:
    jobs: int | None = None
    sweep: SweepSpec | None = None
    brace: BraceSpec | None = None
    bounds: tuple[BoundSpec, ...] = ()
    sensitivity: bool = False
