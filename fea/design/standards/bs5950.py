"""BS 5950-1:2000 compressive strength (Annex C) and tension (4.6.1), as one record.

Pure functions, SI units (Pa, m^2, N).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any, Mapping

from fea.errors import ModelError
from fea.formulas import euler_stress, perry_root

from .record import MemberData, Standard, Step, axis_value, positive, slenderness_source

__all__ = ["BS5950_ROBERTSON", "BS5950Compression", "bs5950_compression", "BS5950"]

NAME = "BS 5950-1"
_F = "BS 5950-1 Annex C"

BS5950_ROBERTSON: dict[str, float] = {"a": 2.0, "b": 3.5, "c": 5.5, "d": 8.0}
"""Robertson constants a of BS 5950-1:2000 Annex C.2, by strut curve."""

STEPS = {
    # Annex C.1 and C.2
    "pE": Step("pE_Pa", "pi**2 * E_Pa / slenderness**2", _F,
               kernel=lambda E_Pa, slenderness, **_: euler_stress(E_Pa, slenderness)),
    "lambda0": Step("lambda0", "0.2 * sqrt(pi**2 * E_Pa / py_Pa)", _F),
    "eta": Step("eta", "max(a * (slenderness - lambda0) / 1000, 0)", _F),
    "phi": Step("phi_Pa", "(py_Pa + (eta + 1) * pE_Pa) / 2", _F),
    # Perry's root, computed by fea.formulas.perry_root (which also takes eta)
    "pc": Step("pc_Pa", "min(pE_Pa * py_Pa / (phi_Pa + sqrt(phi_Pa**2 - pE_Pa * py_Pa)), py_Pa)", _F,
               kernel=lambda pE_Pa, py_Pa, eta, **_: min(perry_root(py_Pa, pE_Pa, eta), py_Pa)),
    "Pc": Step("resistance_N", "pc_Pa * A_m2", _F),
    # 4.6.1 (from memory): Pt = py Ae, Ae = A_net (Ke = 1) or A
    "Pt": Step("resistance_N", "py_Pa * Ae", "BS 5950-1 4.6.1"),
}


@dataclass(frozen=True, slots=True)
class BS5950Compression:
    """Compressive strength pc of BS 5950-1:2000 Annex C.

    Attributes
    ----------
    clause : str
    curve : str
        Strut curve a, b, c or d.
    a : float
        Robertson constant [-].
    slenderness : float
        lambda = L_E / r [-].
    py : float
        Design strength [Pa].
    pE : float
        Euler strength pi^2 E / lambda^2 [Pa] (inf at lambda = 0).
    lambda0 : float
        Limiting slenderness 0.2 sqrt(pi^2 E / py) [-].
    eta : float
        Perry factor a (lambda - lambda0) / 1000, >= 0 [-].
    phi : float
        (py + (eta + 1) pE) / 2 [Pa].
    pc : float
        Compressive strength, <= py [Pa].
    reduction : float
        pc / py [-].
    force : float
        pc A when an area was given, else NaN [N].
    """

    clause: str
    curve: str
    a: float
    slenderness: float
    py: float
    pE: float
    lambda0: float
    eta: float
    phi: float
    pc: float
    reduction: float
    force: float

    @property
    def stress(self) -> float:
        """pc [Pa]."""
        return self.pc


def bs5950_compression(
    py: float,
    curve: str,
    *,
    slenderness: float | None = None,
    N_cr: float | None = None,
    A: float | None = None,
    E: float = 205e9,
) -> BS5950Compression:
    """Perry-Robertson strut strength, BS 5950-1:2000 Annex C.1/C.2.

    ``pc = pE py / (phi + sqrt(phi^2 - pE py))``,
    ``phi = (py + (eta + 1) pE) / 2``, ``pE = pi^2 E / lambda^2``,
    ``eta = a (lambda - lambda0) / 1000 >= 0``,
    ``lambda0 = 0.2 sqrt(pi^2 E / py)``; Robertson constant a = 2.0, 3.5,
    5.5, 8.0 for strut curves a, b, c, d.

    Parameters
    ----------
    py : float
        Design strength [Pa].
    curve : str
        Strut curve "a", "b", "c" or "d" (Table 23).
    slenderness : float, optional
        lambda = L_E / r [-].
    N_cr : float, optional
        Elastic critical force [N] instead of ``slenderness``; needs ``A``.
    A : float, optional
        Area [m^2]; gives ``force = pc A``.
    E : float
        Elastic modulus [Pa] (205 GPa in BS 5950-1).

    Returns
    -------
    BS5950Compression
    """
    py = positive("py", py, "Pa")
    E = positive("E", E, "Pa")
    if curve not in BS5950_ROBERTSON:
        raise ModelError("curve", f"{curve!r} is not a BS 5950-1 strut curve; expected one of a, b, c, d")
    if A is not None:
        A = positive("A", A, "m^2")
    elif N_cr is not None:
        raise ModelError("A", "the area A is needed to turn N_cr into a slenderness")
    lam = slenderness_source(A if A is not None else 1.0, E, slenderness, N_cr, "slenderness")
    v: dict[str, float] = {"a": BS5950_ROBERTSON[curve], "slenderness": lam, "py_Pa": py, "E_Pa": E}
    for name in ("pE", "lambda0", "eta", "phi", "pc"):  # each step takes the values before it
        v[STEPS[name].key] = STEPS[name](**v)
    pc = v["pc_Pa"]
    force = STEPS["Pc"](pc_Pa=pc, A_m2=A) if A is not None else math.nan
    return BS5950Compression("BS 5950-1:2000 Annex C", curve, v["a"], lam, py, v["pE_Pa"], v["lambda0"], v["eta"],
                             v["phi_Pa"], pc, pc / py, force)


# ---------------------------------------------------------------------------
# the member check's view


def _compression(params: Mapping[str, Any], axis: str, m: MemberData, N_cr: float, N_Ed: float) -> dict:
    A, E, fy = m.A, m.E, m.fy
    curve = axis_value(params, "curve", axis)
    if curve is None:
        raise ModelError(f"design.curve_{axis}", "missing: BS 5950-1 needs a strut curve (a, b, c, d)")
    r = bs5950_compression(fy, curve, N_cr=N_cr, A=A, E=E)  # type: ignore[arg-type]
    return dict(clause=r.clause, parameter=f"strut curve {curve} (Robertson a = {r.a:g}), py = fy",
                slenderness=r.slenderness, slenderness_name="L_E/r", reduction=r.reduction,
                resistance=r.force, governs="buckling" if r.reduction < 1.0 else "material",
                details={"pc_Pa": r.pc, "pE_Pa": r.pE, "lambda0": r.lambda0, "eta": r.eta, "A_m2": A,
                         "py_Pa": fy, "E_Pa": E, "a": r.a, "phi_Pa": r.phi},
                labels={"curve": curve})


def _tension(params: Mapping[str, Any], m: MemberData, A_net: float | None, base: dict) -> dict:
    return dict(clause="BS 5950-1 4.6.1", formula="Pt = py Ae, Ae = A_net (Ke = 1) or A",
                parameter="py = fy", resistance=STEPS["Pt"](py_Pa=m.fy, Ae=m.A if A_net is None else A_net),
                governs="net" if A_net is not None else "gross", details={**base, "py_Pa": m.fy})


BS5950 = Standard(
    name=NAME,
    parameters={"curve": None},
    constants={"robertson": BS5950_ROBERTSON},
    curve=bs5950_compression,
    formula="Pc = pc A (Perry-Robertson, Robertson constant), lambda = pi sqrt(E A / N_cr), py = fy",
    steps=STEPS,
    compression=_compression,
    tension=_tension,
    # members resisting loads other than wind: 180 (from memory; check the clause against the document)
    slenderness_limit=(180.0, "BS 5950-1:2000 4.7.3.2 for members resisting loads other than wind, from memory"),
)
