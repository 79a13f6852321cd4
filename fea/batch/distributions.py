"""The laws of the random variables of ``[reliability]``: normal, lognormal, uniform and Gumbel (largest values).

Each is held by two parameters in SI and turns standard normal numbers ``z`` into values by
``x = F^-1(Phi(z))`` (:meth:`Distribution.from_normal`), the transformation that keeps a Gaussian copula:
variables built from correlated standard normals have the dependence the correlation matrix of those
normals gives (Nataf's model with the correlation given in the normal space).

Formulas (any text on probability in structural engineering, e.g. Melchers, *Structural Reliability Analysis
and Prediction*, chapter on probability distributions; recalled from memory):

* normal ``N(mu, sigma)``: ``x = mu + sigma z``;
* lognormal with mean ``m`` and coefficient of variation ``V``: ``zeta^2 = ln(1 + V^2)``,
  ``lambda = ln m - zeta^2 / 2``, ``x = exp(lambda + zeta z)``;
* uniform on ``[a, b]``: ``x = a + (b - a) Phi(z)``;
* Gumbel (largest values), ``F(x) = exp(-exp(-(x - u) / beta))``: mean ``u + gamma beta`` and standard
  deviation ``pi beta / sqrt(6)`` (``gamma`` = 0.5772156649..., Euler's constant), ``x = u - beta ln(-ln Phi(z))``.

Pure: numbers in and out; scipy.special is imported inside the functions that need it.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..errors import CaseError

__all__ = ["Distribution", "DISTRIBUTIONS", "EULER_GAMMA", "make_distribution"]

#: The laws a variable may have.
DISTRIBUTIONS = ("normal", "lognormal", "uniform", "gumbel")
#: Euler's constant (the mean of the standard Gumbel law).
EULER_GAMMA = 0.57721566490153286


@dataclass(frozen=True)
class Distribution:
    """A law by its kind and two SI parameters ``a``, ``b``.

    ``normal``: mean, standard deviation; ``lognormal``: mean and standard deviation of ``ln x``;
    ``uniform``: lower and upper bounds; ``gumbel``: location ``u`` and scale ``beta``.
    """

    kind: str
    a: float
    b: float

    def __post_init__(self) -> None:
        if self.kind not in DISTRIBUTIONS:
            raise CaseError("distribution", f"expected one of {', '.join(DISTRIBUTIONS)}, got {self.kind!r}")
        if not (math.isfinite(self.a) and math.isfinite(self.b)):
            raise CaseError("distribution", f"parameters must be finite, got {self.a!r}, {self.b!r}")
        if self.kind == "uniform" and not self.a < self.b:
            raise CaseError("distribution", f"a uniform law needs lower < upper, got {self.a!r}, {self.b!r}")
        if self.kind != "uniform" and not self.b > 0:
            raise CaseError("distribution", f"the spread must be positive, got {self.b!r}")

    def from_normal(self, z):
        """Values for standard normal numbers ``z`` (scalar or array): ``F^-1(Phi(z))``."""
        z = np.asarray(z, dtype=float)
        if self.kind == "normal":
            return self.a + self.b * z
        if self.kind == "lognormal":
            return np.exp(self.a + self.b * z)
        from scipy.special import log_ndtr, ndtr

        if self.kind == "uniform":
            return self.a + (self.b - self.a) * ndtr(z)
        # gumbel: -ln Phi(z) from log_ndtr keeps its precision in the upper tail, where Phi(z) is near 1
        return self.a - self.b * np.log(-log_ndtr(z))

    def cdf(self, x):
        """The cumulative distribution function at ``x``."""
        x = np.asarray(x, dtype=float)
        from scipy.special import ndtr

        if self.kind == "normal":
            return ndtr((x - self.a) / self.b)
        if self.kind == "lognormal":
            with np.errstate(divide="ignore", invalid="ignore"):
                return np.where(x > 0, ndtr((np.log(np.maximum(x, 1e-300)) - self.a) / self.b), 0.0)
        if self.kind == "uniform":
            return np.clip((x - self.a) / (self.b - self.a), 0.0, 1.0)
        return np.exp(-np.exp(-(x - self.a) / self.b))

    @property
    def mean(self) -> float:
        if self.kind == "normal":
            return self.a
        if self.kind == "lognormal":
            return math.exp(self.a + self.b**2 / 2)
        if self.kind == "uniform":
            return (self.a + self.b) / 2
        return self.a + EULER_GAMMA * self.b

    @property
    def sd(self) -> float:
        if self.kind == "normal":
            return self.b
        if self.kind == "lognormal":
            return self.mean * math.sqrt(math.expm1(self.b**2))
        if self.kind == "uniform":
            return (self.b - self.a) / math.sqrt(12.0)
        return math.pi * self.b / math.sqrt(6.0)

    def parameters(self) -> dict[str, float]:
        """The parameters by name (SI), for the JSON result."""
        names = {"normal": ("mean", "sd"), "lognormal": ("mean_of_ln", "sd_of_ln"), "uniform": ("lower", "upper"),
                 "gumbel": ("location", "scale")}[self.kind]
        return {names[0]: self.a, names[1]: self.b}


def _spread(mean: float | None, sd: float | None, cov: float | None, where: str) -> float:
    """The standard deviation from ``sd`` or from ``cov`` times the mean's size."""
    if (sd is None) == (cov is None):
        raise CaseError(f"{where}.sd", "give the spread as sd or as cov (not both)")
    if mean is None:
        raise CaseError(f"{where}.mean", "missing: this law is given by its mean and sd or cov")
    if cov is not None:
        if not cov > 0:
            raise CaseError(f"{where}.cov", f"expected a coefficient of variation > 0, got {cov!r}")
        if mean == 0:
            raise CaseError(f"{where}.cov", "a coefficient of variation needs a mean other than 0: give sd")
        return cov * abs(mean)
    assert sd is not None
    if not sd > 0:
        raise CaseError(f"{where}.sd", f"expected a standard deviation > 0, got {sd!r}")
    return sd


def make_distribution(kind: str, where: str, *, mean: float | None = None, sd: float | None = None,
                      cov: float | None = None, lower: float | None = None, upper: float | None = None,
                      location: float | None = None, scale: float | None = None) -> Distribution:
    """A law from the parameters a ``[[reliability.variable]]`` gives (SI); errors name ``where``'s keys.

    normal, lognormal and gumbel: ``mean`` with ``sd`` or ``cov`` (gumbel also ``location`` and ``scale``);
    uniform: ``lower`` and ``upper``.
    """
    given = {k for k, v in dict(mean=mean, sd=sd, cov=cov, lower=lower, upper=upper, location=location,
                                scale=scale).items() if v is not None}
    allowed = {"normal": {"mean", "sd", "cov"}, "lognormal": {"mean", "sd", "cov"}, "uniform": {"lower", "upper"},
               "gumbel": {"mean", "sd", "cov", "location", "scale"}}.get(kind)
    if allowed is None:
        raise CaseError(f"{where}.distribution", f"expected one of {', '.join(DISTRIBUTIONS)}, got {kind!r}")
    extra = sorted(given - allowed)
    if extra:
        raise CaseError(f"{where}.{extra[0]}", f"is not a parameter of a {kind} law; it takes "
                                               f"{', '.join(sorted(allowed))}")
    if kind == "uniform":
        if lower is None or upper is None:
            raise CaseError(f"{where}.{'lower' if lower is None else 'upper'}", "missing: a uniform law needs "
                                                                                "lower and upper")
        if not lower < upper:
            raise CaseError(f"{where}.upper", f"must be above lower ({lower!r}), got {upper!r}")
        return Distribution("uniform", lower, upper)
    if kind == "gumbel" and (location is not None or scale is not None):
        if location is None or scale is None or given & {"mean", "sd", "cov"}:
            raise CaseError(f"{where}.location", "give a Gumbel law by location and scale, or by mean and sd "
                                                 "or cov")
        if not scale > 0:
            raise CaseError(f"{where}.scale", f"expected a scale > 0, got {scale!r}")
        return Distribution("gumbel", location, scale)
    s = _spread(mean, sd, cov, where)
    assert mean is not None
    if kind == "normal":
        return Distribution("normal", mean, s)
    if kind == "lognormal":
        if not mean > 0:
            raise CaseError(f"{where}.mean", f"a lognormal variable is positive: expected a mean > 0, got {mean!r}")
        zeta2 = math.log1p((s / mean) ** 2)
        return Distribution("lognormal", math.log(mean) - zeta2 / 2, math.sqrt(zeta2))
    beta = s * math.sqrt(6.0) / math.pi
    return Distribution("gumbel", mean - EULER_GAMMA * beta, beta)
