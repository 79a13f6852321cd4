"""Monte Carlo strength of an imperfect column: samples of the ``[reliability]`` variables -> load factors.

Sample ``i`` sets every random input of the case document to its value (:mod:`fea.batch.sampling`: its own
seed), the case is parsed from that document by the case-file parser (every check applies) and the
imperfect-column analysis alone runs on it: the fully nonlinear analysis for ``strength = "ultimate"``
(the peak of the load-deflection path), the second-order elastic one for ``"first-yield"``.  The strength of
the sample is the lowest of its bending planes' load factors (the factor on the case's variable loads,
permanent loads held).  A sample whose inputs the parser refuses, or whose analysis finds no such load
factor, has no strength; it is counted, named in the warnings and left out of the statistics.

:func:`run_samples` is the task function (a chunk of sample indices); :func:`summarise` turns the outcomes,
sorted by index, into a :class:`ReliabilityResult`.  Pure apart from the analyses: no files.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Sequence

from ..errors import FeaError
from .keys import parse_doc_key, plain, set_value
from .reliability_input import STRENGTHS, RandomVariable, ReliabilitySpec
from .sampling import cholesky_factor, sample_values
from .statistics import FailureProbability, Fractile, Moments, failure_probability, fractile, moments

__all__ = ["SamplePayload", "Sample", "ReliabilityResult", "sample_payload", "run_samples", "summarise",
           "strength_of", "variable_axial_load", "design_load_factor", "TABLES_LEFT_OUT"]

#: Tables of the case that no sample needs (left out of every sample's document).
TABLES_LEFT_OUT = ("design", "study", "record", "reliability")


@dataclass(frozen=True)
class SamplePayload:
    """What every task needs: the case document (plain data), the variables, the seed and the strength."""

    document: dict
    source: str
    variables: tuple[RandomVariable, ...]
    seed: int
    correlation: tuple[tuple[float, ...], ...] | None
    strength: str


@dataclass(frozen=True)
class Sample:
    """One sample: its index, its inputs (SI, in variable order), its strength (load factor) and governing
    plane, or None and the reason."""

    index: int
    values: tuple[float, ...]
    strength: float | None
    axis: str | None
    message: str = ""


@dataclass(frozen=True)
class ReliabilityResult:
    """The samples sorted by index and their statistics."""

    spec: ReliabilitySpec
    samples: tuple[Sample, ...]
    moments: Moments | None
    fractile: Fractile | None
    design_load: float | None
    failure: FailureProbability | None
    variable_load: float
    warnings: tuple[str, ...] = ()

    @property
    def strengths(self) -> list[float]:
        return [s.strength for s in self.samples if s.strength is not None]

    @property
    def n_missing(self) -> int:
        return sum(1 for s in self.samples if s.strength is None)


def sample_payload(document: Any, spec: ReliabilitySpec, source: str = "") -> SamplePayload:
    """The shared payload of the tasks: the case document with the analysis the strength needs."""
    doc = plain(document)
    for name in TABLES_LEFT_OUT:
        doc.pop(name, None)
    doc["imperfection"]["analysis"] = "nonlinear" if spec.strength == "ultimate" else "second-order"
    return SamplePayload(document=doc, source=source, variables=spec.variables, seed=spec.seed,
                         correlation=spec.correlation, strength=spec.strength)


def strength_of(res, strength: str) -> tuple[float | None, str | None, str]:
    """(lowest load factor over the planes, its plane, "") of a run, or (None, None, why)."""
    imperfect = res.extras.get("imperfect") or {}
    if not imperfect:
        return None, None, "no imperfect-column analysis ran"
    best: tuple[float, str] | None = None
    for axis, r in imperfect.items():
        lam = r.limit_load_factor if strength == "ultimate" else r.second_order_first_yield_load_factor
        if lam is None or not math.isfinite(lam):
            what = "no ultimate load" if strength == "ultimate" else "no first yield"
            return None, None, f"{axis} axis: {what} ({' '.join(str(r.message).split())})"
        if best is None or lam < best[0]:
            best = (float(lam), axis)
    assert best is not None
    return best[0], best[1], ""


def _one(payload: SamplePayload, keys, factor, index: int) -> Sample:
    from ..io.case import parse_document
    from ..pipeline import CASE_TABLES, run_case

    values = sample_values([v.distribution for v in payload.variables], payload.seed, index, factor)
    try:
        doc = plain(payload.document)
        for key, var, x in zip(keys, payload.variables, values):
            set_value(doc, key, var.case_value(float(x)))
        case = parse_document(doc, source=payload.source, tables=CASE_TABLES)
        res = run_case(case, n_modes=1, skip=("fixity", "spatial", "design"))
        lam, axis, why = strength_of(res, payload.strength)
    except FeaError as exc:
        lam, axis, why = None, None, " ".join(str(exc).split())
    except Exception as exc:  # a bug: the sample says so, the others go on
        lam, axis, why = None, None, " ".join(f"internal error: {type(exc).__name__}: {exc}".split())
    return Sample(index=index, values=tuple(float(x) for x in values), strength=lam, axis=axis, message=why)


def run_samples(payload: SamplePayload, indices: list[int]) -> list[Sample]:
    """The samples of a chunk of indices (the task function shipped to the workers)."""
    keys = [parse_doc_key(v.key, "reliability.variable") for v in payload.variables]
    factor = cholesky_factor(payload.correlation)
    return [_one(payload, keys, factor, int(i)) for i in indices]


def variable_axial_load(case) -> float:
    """The case's total variable axial load at load factor 1 [N] (variable point and distributed loads, as
    carried to the base; the first plane's, the loads being the same in every plane)."""
    col = case.planes[0][1]
    total = math.fsum(p.P for p in col.point_loads if not p.permanent)
    total += math.fsum(d.q * (d.top - d.bottom) for d in col.distributed_loads if not d.permanent)
    return total


def design_load_factor(spec: ReliabilitySpec, case) -> tuple[float | None, float]:
    """(the design load as a load factor or None, the case's variable axial load [N])."""
    p_var = variable_axial_load(case)
    if spec.design_force is None:
        return spec.design_load, p_var
    if not p_var > 0:
        raise FeaError("reliability.design_load: a force needs variable axial loads in the case (the load "
                       "factor scales them); this case has none: give design_load as a load factor")
    return spec.design_force / p_var, p_var


def summarise(spec: ReliabilitySpec, samples: Sequence[Sample], design_load: float | None,
              variable_load: float) -> ReliabilityResult:
    """Statistics of the samples (sorted here by index)."""
    ordered = tuple(sorted(samples, key=lambda s: s.index))
    x = [s.strength for s in ordered if s.strength is not None]
    warns = []
    missing = [s for s in ordered if s.strength is None]
    if missing:
        first = missing[0]
        warns.append(f"{len(missing)} of {len(ordered)} samples have no {STRENGTHS[spec.strength].split(' (')[0]} "
                     f"and are left out of the statistics (sample {first.index}: {first.message})")
    mom = moments(x) if x else None
    frac = fractile(x, spec.fractile, spec.confidence) if x else None
    fail = None
    if design_load is not None and x:
        k = sum(1 for v in x if v < design_load)
        fail = failure_probability(k, len(x), spec.confidence)
        if missing:
            worst = failure_probability(k + len(missing), len(x) + len(missing), spec.confidence)
            warns.append(f"counting the {len(missing)} samples without a strength as failures gives pf = "
                         f"{worst.pf:.3g} (beta = {worst.beta:.3g})")
        if k == 0:
            warns.append(f"no sample failed: pf is below {fail.upper:.2g} at {spec.confidence:.0%} confidence "
                         f"(beta above {fail.beta_lower:.3g}); more samples narrow this")
    return ReliabilityResult(spec=spec, samples=ordered, moments=mom, fractile=frac, design_load=design_load,
                             failure=fail, variable_load=variable_load, warnings=tuple(warns))
