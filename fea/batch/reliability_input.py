"""The case file's ``[reliability]`` table -> :class:`ReliabilitySpec` (keys in ``docs/reliability.md``).

``stanchion check`` parses the table (so that its mistakes are found at once) and ignores it;
``stanchion reliability`` samples the variables it declares.  Each variable addresses one numeric input of
the case file by its key path (:mod:`fea.batch.keys`) and gives its law in that input's units::

    [reliability]
    samples = 1000
    seed = 2026
    strength = "ultimate"          # or "first-yield"
    design_load = 1.0              # a load factor, or a force such as "900 kN"
    correlation = [[1.0, 0.3], [0.3, 1.0]]   # of the standard normal variables (Gaussian copula)

    [[reliability.variable]]
    key = "material.fy"
    distribution = "lognormal"
    mean = "390 MPa"
    cov = 0.07

Pure: the table and the document in, a frozen spec out; no files.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from typing import Any

from ..errors import CaseError, FeaError
from ..quantity import NUMBER_PATTERN
from ..units import DIMENSIONS, parse
from ..util.checks import as_number, as_str, as_table, as_text, check_keys
from .distributions import DISTRIBUTIONS, Distribution, make_distribution
from .keys import DocKey, get_value, has_table, parse_doc_key

__all__ = ["ReliabilitySpec", "RandomVariable", "parse_reliability", "STRENGTHS", "RELIABILITY_KEYS",
           "VARIABLE_KEYS", "MAX_SAMPLES", "MAX_VARIABLES"]

RELIABILITY_KEYS = {"samples", "seed", "strength", "design_load", "fractile", "confidence", "correlation",
                    "variable", "note"}
VARIABLE_KEYS = {"key", "distribution", "mean", "sd", "cov", "lower", "upper", "location", "scale", "note"}
#: What each sample's strength is: the ultimate load factor of the fully nonlinear analysis, or the load factor
#: at first yield of the second-order (elastic) analysis.
STRENGTHS = {"ultimate": "ultimate load factor (fully nonlinear analysis: peak of the load-deflection path)",
             "first-yield": "first-yield load factor (second-order elastic analysis)"}
MAX_SAMPLES = 1_000_000
MAX_VARIABLES = 50
DEFAULT_SAMPLES = 1000
DEFAULT_SEED = 1
DEFAULT_FRACTILE = 0.05
DEFAULT_CONFIDENCE = 0.95

#: Keys whose quantity this module knows beyond the restraint studies' table (names without numbers);
#: None: a plain number.
_KNOWN: dict[tuple[str, ...], str | None] = {
    ("imperfection", "bow"): "length",
    ("imperfection", "residual_stress"): None,
    ("imperfection", "hardening"): None,
    ("imperfection", "W"): "section modulus",
    ("imperfection", "W_major"): "section modulus",
    ("imperfection", "W_minor"): "section modulus",
    ("load", "eccentricity"): "length",
    ("load", "eccentricity_major"): "length",
    ("load", "eccentricity_minor"): "length",
    ("load", "lateral"): "force",
    ("lateral", "point", "force"): "force",
    ("lateral", "distributed", "per_length"): "force per length",
    ("lateral", "distributed", "per_length_top"): "force per length",
    ("lateral", "moment", "moment"): "moment",
}
_NUMBER_HEAD = re.compile(rf"^\s*{NUMBER_PATTERN}")


@dataclass(frozen=True)
class RandomVariable:
    """One random input: its key path, its law (SI) and how its values are written and shown.

    ``dimension`` is a key of :data:`fea.units.DIMENSIONS`, or None for a plain number (a fraction such as
    ``imperfection.residual_stress``); ``unit`` and ``unit_si`` are the unit the mean was written in and
    the SI value of one of it (for display; ``""`` and 1 for plain numbers).
    """

    key: str
    distribution: Distribution
    dimension: str | None
    unit: str = ""
    unit_si: float = 1.0
    note: str = ""

    @property
    def si_unit(self) -> str:
        return DIMENSIONS[self.dimension][1] if self.dimension else ""

    def case_value(self, value: float) -> Any:
        """An SI value as the case file writes it: a quantity string that parses back to the same float, or
        a plain number."""
        if self.dimension is None:
            return float(value)
        return f"{float(value)!r} {self.si_unit}"


@dataclass(frozen=True)
class ReliabilitySpec:
    """The parsed ``[reliability]`` table.

    Attributes
    ----------
    variables : the random inputs, in the order given (the order of the correlation matrix)
    samples : number of samples N
    seed : root seed; sample ``i`` draws from ``numpy.random.SeedSequence([seed, i])``
    strength : "ultimate" or "first-yield" (see :data:`STRENGTHS`)
    design_load : the design load as a load factor on the case's variable loads, or None
    design_force : the design load as given when it is a force [N] (turned into ``design_load`` by the
        engine from the case's variable axial load), else None
    design_text : the design load as written ("" when absent)
    fractile : the fractile of the strength reported (0.05: the characteristic value)
    confidence : two-sided confidence of the intervals reported
    correlation : correlation matrix of the standard normal variables (Gaussian copula), or None
    """

    variables: tuple[RandomVariable, ...]
    samples: int = DEFAULT_SAMPLES
    seed: int = DEFAULT_SEED
    strength: str = "ultimate"
    design_load: float | None = None
    design_force: float | None = None
    design_text: str = ""
    fractile: float = DEFAULT_FRACTILE
    confidence: float = DEFAULT_CONFIDENCE
    correlation: tuple[tuple[float, ...], ...] | None = None
    note: str = ""


def _infer_dimension(value: Any, where: str) -> str | None:
    """The quantity of a value written in the case file: a plain number -> None; a quantity string -> the
    first quantity of :data:`fea.units.DIMENSIONS` it parses as."""
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        return None
    if isinstance(value, str):
        for dim in DIMENSIONS:
            try:
                parse(where, value, dim)
            except FeaError:
                continue
            return dim
    raise CaseError(where, f"{value!r} is not a number or a quantity: a random variable replaces a numeric input")


def _dimension(key: DocKey, doc: dict, where: str) -> str | None:
    """The quantity of the input at ``key``: from the tables this tool knows, else from its value in the
    document."""
    names = key.names
    if names in _KNOWN:
        return _KNOWN[names]
    from ..study.paths import parse_key

    try:
        return parse_key(key.text).dimension
    except CaseError:
        pass
    try:
        value = get_value(doc, key)
    except CaseError:
        raise CaseError(where, f"{key.text!r}: not given in the case file, and not an input whose quantity this "
                               "tool knows: give the input in the case file first") from None
    return _infer_dimension(value, where)


def _quantity(value: Any, where: str, dimension: str | None, what: str) -> float:
    if dimension is None:
        return float(as_number(value, where, what=f"{what} (a plain number, as the key takes)"))
    return parse(where, value, dimension)


def _display_unit(text: Any, dimension: str | None, where: str) -> tuple[str, float]:
    """The unit the mean (or lower bound) was written in and the SI value of one of it."""
    if dimension is None or not isinstance(text, str):
        return "", 1.0
    m = _NUMBER_HEAD.match(text)
    unit = text[m.end():].strip() if m else ""
    if not unit:
        return DIMENSIONS[dimension][1], 1.0
    return unit, parse(where, f"1 {unit}", dimension)


def _variable(t: dict, where: str, doc: dict) -> RandomVariable:
    check_keys(t, where, VARIABLE_KEYS)
    if "key" not in t:
        raise CaseError(f"{where}.key", "missing: the key path of the input, such as 'material.fy'")
    key = parse_doc_key(t["key"], f"{where}.key")
    if key.names[0] in ("reliability", "study", "record", "units", "analysis"):
        raise CaseError(f"{where}.key", f"{key.text!r} is not an input of the column")
    if not has_table(doc, key):
        try:
            get_value(doc, key)
        except CaseError as exc:
            raise CaseError(f"{where}.key", f"{key.text!r}: {exc.message}") from None
    try:
        current = get_value(doc, key)
    except CaseError:
        current = None
    if isinstance(current, (dict, list)):
        raise CaseError(f"{where}.key", f"{key.text!r} is a table, not a numeric input")
    dim = _dimension(key, doc, f"{where}.key")
    kind = as_str(t.get("distribution", ""), f"{where}.distribution")
    if kind not in DISTRIBUTIONS:
        raise CaseError(f"{where}.distribution", f"expected one of {', '.join(DISTRIBUTIONS)}, got {kind!r}")
    values: dict[str, float | None] = {}
    for name in ("mean", "sd", "lower", "upper", "location", "scale"):
        values[name] = _quantity(t[name], f"{where}.{name}", dim, name) if name in t else None
    values["cov"] = float(as_number(t["cov"], f"{where}.cov", 0.0, 10.0, low_open=True,
                                    what="a coefficient of variation")) if "cov" in t else None
    dist = make_distribution(kind, where, **values)
    first = next((t[k] for k in ("mean", "lower", "location") if k in t), None)
    unit, unit_si = _display_unit(first, dim, f"{where}.mean")
    note = as_text(t.get("note", ""), f"{where}.note")
    return RandomVariable(key=key.text, distribution=dist, dimension=dim, unit=unit, unit_si=unit_si, note=note)


def _correlation(value: Any, n: int) -> tuple[tuple[float, ...], ...]:
    where = "reliability.correlation"
    if not isinstance(value, list) or len(value) != n or not all(isinstance(r, list) and len(r) == n for r in value):
        raise CaseError(where, f"expected a {n} x {n} matrix (one row per variable, in their order), "
                               f"such as [[1.0, 0.3], [0.3, 1.0]]")
    rows = tuple(tuple(float(as_number(v, f"{where}[{i + 1}][{j + 1}]", -1.0, 1.0, what="a correlation"))
                       for j, v in enumerate(r)) for i, r in enumerate(value))
    for i in range(n):
        if rows[i][i] != 1.0:
            raise CaseError(f"{where}[{i + 1}][{i + 1}]", f"the diagonal must be 1, got {rows[i][i]!r}")
        for j in range(i):
            if rows[i][j] != rows[j][i]:
                raise CaseError(f"{where}[{i + 1}][{j + 1}]", f"the matrix must be symmetric: {rows[i][j]!r} "
                                                              f"against {rows[j][i]!r} at [{j + 1}][{i + 1}]")
    import numpy as np

    try:
        np.linalg.cholesky(np.array(rows))
    except np.linalg.LinAlgError:
        raise CaseError(where, "is not positive definite: no set of variables can have these correlations "
                               "(reduce the largest ones)") from None
    return rows


def _design_load(value: Any) -> tuple[float | None, float | None, str]:
    where = "reliability.design_load"
    if isinstance(value, str):
        force = parse(where, value, "force")
        if not force > 0:
            raise CaseError(where, f"{value!r}: expected a compression > 0")
        return None, force, value.strip()
    lam = float(as_number(value, where, 0.0, 1e6, low_open=True,
                          what="a load factor (a number) or a force such as '900 kN'"))
    return lam, None, f"{value!r}"


def parse_reliability(table: dict, doc: dict) -> ReliabilitySpec:
    """Parse ``[reliability]`` against the case document ``doc`` (every key path is looked up in it)."""
    check_keys(table, "reliability", RELIABILITY_KEYS)
    if "imperfection" not in doc:
        raise CaseError("reliability", "needs an [imperfection] table: each sample's strength is the imperfect "
                                       "column's (ultimate or first-yield load factor)")
    samples = int(as_number(table.get("samples", DEFAULT_SAMPLES), "reliability.samples", 1, MAX_SAMPLES,
                            integer=True, what="a whole number of samples"))
    seed = int(as_number(table.get("seed", DEFAULT_SEED), "reliability.seed", 0, 2**63 - 1, integer=True,
                         what="a whole number >= 0"))
    strength = table.get("strength", "ultimate")
    if strength not in STRENGTHS:
        raise CaseError("reliability.strength", f"expected one of {', '.join(STRENGTHS)}, got {strength!r}")
    fractile = float(as_number(table.get("fractile", DEFAULT_FRACTILE), "reliability.fractile", 0.0, 0.5,
                               low_open=True, what="a fraction"))
    confidence = float(as_number(table.get("confidence", DEFAULT_CONFIDENCE), "reliability.confidence", 0.5,
                                 0.9999, what="a confidence level"))
    raw = table.get("variable", [])
    raw = [raw] if isinstance(raw, dict) else raw
    if not isinstance(raw, list) or not raw:
        raise CaseError("reliability.variable", "missing: give at least one [[reliability.variable]] table")
    if len(raw) > MAX_VARIABLES:
        raise CaseError("reliability.variable", f"{len(raw)} variables: at most {MAX_VARIABLES}")
    variables: list[RandomVariable] = []
    for i, t in enumerate(raw):
        where = f"reliability.variable[{i + 1}]"
        v = _variable(as_table(t, where), where, doc)
        same = next((k + 1 for k, u in enumerate(variables) if u.key == v.key), None)
        if same is not None:
            raise CaseError(f"{where}.key", f"{v.key!r} is already reliability.variable[{same}]")
        variables.append(v)
    corr = _correlation(table["correlation"], len(variables)) if "correlation" in table else None
    lam, force, text = _design_load(table["design_load"]) if "design_load" in table else (None, None, "")
    if force is not None:
        axial = ("axial", "axial_force", "axial_force_permanent")
        loads = [v.key for v in variables if v.key.rsplit(".", 1)[-1] in axial]
        if loads:
            raise CaseError("reliability.design_load", f"a force needs fixed loads, but {loads[0]!r} is random: "
                                                       "give design_load as a load factor (1: the sampled loads)")
    note = as_text(table.get("note", ""), "reliability.note")
    return ReliabilitySpec(variables=tuple(variables), samples=samples, seed=seed, strength=strength,
                           design_load=lam, design_force=force, design_text=text, fractile=fractile,
                           confidence=confidence, correlation=corr, note=note)
