"""What a design standard is made of: written-out formula steps, its record, shared checks of the inputs.

A :class:`Step` is one written-out formula, ``key = expr``, with ``expr`` in
Python syntax over the names of the check's numbers (the JSON keys of a design
check and its ``details``, see docs/design.md), the numbers of the published
formula written as they are printed, and ``pi``, ``sqrt``, ``min``, ``max``.
The curve functions of a standard evaluate their steps, and the report prints
and evaluates the same steps, so every formula and constant has one home: the
standard's module.  A :class:`Standard` record gathers a standard's constants,
its curve function, its steps and the adapters the member check calls.
"""

from __future__ import annotations

import ast
import math
from dataclasses import dataclass, field
from types import MappingProxyType
from typing import Any, Callable, Mapping

from fea.errors import ModelError
from fea.formulas import euler_slenderness

__all__ = ["Step", "Standard", "MemberData", "EQUIVALENT_SLENDERNESS", "UTILISATION", "PASSES", "finite",
           "positive", "non_negative", "slenderness_source", "equivalent_slenderness", "need", "axis_value"]

#: Names a step may use besides the check's numbers.
NAMESPACE: Mapping[str, Any] = MappingProxyType({"pi": math.pi, "sqrt": math.sqrt, "min": min, "max": max,
                                                 "MPa": 1e6})
_NODES = (ast.Expression, ast.BinOp, ast.UnaryOp, ast.Call, ast.Name, ast.Constant, ast.Load, ast.Compare,
          ast.Add, ast.Sub, ast.Mult, ast.Div, ast.Pow, ast.USub, ast.LtE, ast.Lt, ast.GtE, ast.Gt)


@dataclass(frozen=True)
class Step:
    """One written-out formula: ``key = expr`` (or a condition ``expr`` such as ``x <= 0.2``).

    Attributes
    ----------
    key : the name of the result (a JSON key of the check or of its details)
    expr : the formula in Python syntax (see the module notes)
    ref : the published formula it belongs to; its numbers are shown as constants of ``ref``
    kernel : evaluates the step in place of ``expr`` (given every value the caller passes) where the
        written form is not the safe way to compute it: Perry's root, written as printed but computed by
        :func:`fea.formulas.perry_root`; the test of the written-out formulas holds the two to the same
        numbers
    """

    key: str
    expr: str
    ref: str = ""
    kernel: Callable[..., float] | None = field(default=None, compare=False)

    def __post_init__(self) -> None:
        tree = ast.parse(self.expr, mode="eval")
        bad = [type(n).__name__ for n in ast.walk(tree) if not isinstance(n, _NODES)]
        if bad:
            raise ValueError(f"step {self.key}: {bad[0]} is not allowed in a written-out formula")
        object.__setattr__(self, "_tree", tree)
        object.__setattr__(self, "_code", compile(tree, f"<{self.key}>", "eval"))

    @property
    def tree(self) -> ast.Expression:
        """The parsed formula (for printing it)."""
        return self._tree  # type: ignore[attr-defined]

    @property
    def names(self) -> tuple[str, ...]:
        """The numbers the formula takes, in order of first use."""
        seen: dict[str, None] = {}
        for n in ast.walk(self.tree):
            if isinstance(n, ast.Name) and n.id not in NAMESPACE:
                seen.setdefault(n.id)
        return tuple(seen)

    @property
    def constants(self) -> frozenset[str]:
        """The numbers of the published formula, as written (and printed)."""
        squares = {id(n.right) for n in ast.walk(self.tree) if isinstance(n, ast.BinOp) and isinstance(n.op, ast.Pow)
                   and isinstance(n.right, ast.Constant) and n.right.value == 2}  # printed as a superscript
        return frozenset(ast.get_source_segment(self.expr, n) or "" for n in ast.walk(self.tree)
                         if isinstance(n, ast.Constant) and id(n) not in squares)

    def __call__(self, **values: Any) -> Any:
        """The formula evaluated with ``values`` (its kernel when it has one)."""
        if self.kernel is not None:
            return self.kernel(**values)
        out = eval(self._code, dict(NAMESPACE), values)  # type: ignore[attr-defined]  # noqa: S307 - parsed above
        return out if isinstance(out, bool) else float(out)


#: Equivalent geometric slenderness from the critical force (Euler): computed by
#: :func:`fea.formulas.euler_slenderness`.
EQUIVALENT_SLENDERNESS = Step("slenderness", "pi * sqrt(E_Pa * A_m2 / N_cr_N)", "Euler",
                              kernel=lambda E_Pa, A_m2, N_cr_N, **_: euler_slenderness(E_Pa, A_m2, N_cr_N))
#: Utilisation of a check and its pass condition (common practice in every standard here).
UTILISATION = Step("utilisation", "N_Ed_N / resistance_N", "check")
PASSES = Step("passed", "utilisation <= 1", "check")


@dataclass(frozen=True)
class MemberData:
    """Section and material data of one segment for the design check (SI).

    Attributes
    ----------
    name : segment name
    A : gross area [m^2]
    fy : yield strength [Pa] (None where the method does not need it)
    E : elastic modulus [Pa]
    length : [m]
    fu : ultimate strength [Pa] or None
    sigma_allow : material allowable stress [Pa] or None
    """

    name: str
    A: float
    fy: float | None
    E: float
    length: float
    fu: float | None = None
    sigma_allow: float | None = None


@dataclass(frozen=True)
class Standard:
    """One design standard (or classical method) as one record.

    Attributes
    ----------
    name : as a case names it, e.g. "EN 1993-1-1"
    parameters : the case parameters it takes, with defaults (``None``: required)
    constants : its published constants and tables (imperfection factors, curve tables, factors)
    curve : its curve function (a pure function of SI floats returning a result dataclass)
    formula : the one-line formula recorded with each compression check
    steps : its written-out formulas by name: what the report prints and evaluates
    compression : ``(params, axis, member, N_cr, N_Ed) -> dict`` of one compression check
    tension : ``(params, member, A_net, base_details) -> dict`` of one tension check
    needs_fy : whether a compression check needs the member's yield strength
    slenderness_limit : the standard's own limit on K L / r of a compression member and its clause, or None
        when it sets none (then common practice, 200, applies: see fea.model.plausibility)
    """

    name: str
    parameters: Mapping[str, Any]
    constants: Mapping[str, Any]
    curve: Callable[..., Any]
    formula: str
    steps: Mapping[str, Step]
    compression: Callable[..., dict]
    tension: Callable[..., dict]
    needs_fy: bool = True
    slenderness_limit: tuple[float, str] | None = None

    def __post_init__(self) -> None:
        for name in ("parameters", "constants", "steps"):
            object.__setattr__(self, name, MappingProxyType(dict(getattr(self, name))))

    def formula_constants(self) -> dict[str, frozenset[str]]:
        """The numbers its written-out formulas print, by published formula (``Step.ref``)."""
        out: dict[str, set[str]] = {}
        for s in self.steps.values():
            out.setdefault(s.ref, set()).update(s.constants)
        return {k: frozenset(v) for k, v in out.items()}


# ---------------------------------------------------------------------------
# checks of the inputs of the curve functions


def finite(name: str, value: float) -> float:
    try:
        x = float(value)
    except (TypeError, ValueError):
        raise ModelError(name, f"{value!r} is not a number") from None
    if not math.isfinite(x):
        raise ModelError(name, f"{value!r} is not finite; expected a finite number")
    return x


def positive(name: str, value: float, unit: str) -> float:
    x = finite(name, value)
    if x <= 0.0:
        raise ModelError(name, f"{x:g} {unit} is not positive; expected a value > 0")
    return x


def non_negative(name: str, value: float, unit: str) -> float:
    x = finite(name, value)
    if x < 0.0:
        raise ModelError(name, f"{x:g} {unit} is negative; expected a value >= 0")
    return x


def axis_value(params: Mapping[str, Any], name: str, axis: str) -> Any:
    """A per-axis parameter: ``<name>_<axis>`` when given, else ``<name>``."""
    v = params.get(f"{name}_{axis}")
    return params.get(name) if v is None else v


def need(params: Mapping[str, Any], name: str, standard: str) -> Any:
    """A required parameter of a standard."""
    v = params.get(name)
    if v is None:
        raise ModelError(f"design.{name}", f"missing: {standard} needs {name}")
    return v


def equivalent_slenderness(A: float, N_cr: float, E: float) -> float:
    """Geometric slenderness that gives ``N_cr`` by Euler's formula.

    ``L/r = pi sqrt(E A / N_cr)`` (from ``N_cr / A = pi^2 E / (L/r)^2``,
    :func:`fea.formulas.euler_slenderness`).

    Parameters
    ----------
    A : float
        Area used with ``N_cr`` [m^2].
    N_cr : float
        Elastic critical force [N].
    E : float
        Elastic modulus [Pa].

    Returns
    -------
    float
        Equivalent slenderness L/r [-].
    """
    A = positive("A", A, "m^2")
    N_cr = positive("N_cr", N_cr, "N")
    E = positive("E", E, "Pa")
    return EQUIVALENT_SLENDERNESS(E_Pa=E, A_m2=A, N_cr_N=N_cr)


def slenderness_source(
    A: float, E: float | None, slenderness: float | None, N_cr: float | None, slenderness_name: str
) -> float:
    """Geometric slenderness L/r from exactly one of (slenderness) or (N_cr with E)."""
    if (slenderness is None) == (N_cr is None):
        raise ModelError(slenderness_name, f"give exactly one of {slenderness_name} and N_cr")
    if slenderness is not None:
        return non_negative(slenderness_name, slenderness, "(L/r)")
    if E is None:
        raise ModelError("E", "the elastic modulus E is needed to turn N_cr into a slenderness")
    return equivalent_slenderness(A, positive("N_cr", N_cr, "N"), E)  # type: ignore[arg-type]
