"""Statistics of a sample of strengths, each with its sampling error.

* mean, standard deviation, coefficient of variation; the standard error of the mean ``s / sqrt(N)``;
* the ``p`` fractile (the characteristic value for ``p = 0.05``): the order statistic ``x_(k)``,
  ``k = ceil(N p)`` (the smallest sample value whose empirical distribution reaches ``p``), with a
  distribution-free two-sided confidence interval ``[x_(r), x_(s)]`` from the order statistics: the number
  ``B`` of samples below the true fractile is binomial ``(N, p)``, and
  ``P(x_(r) <= x_p < x_(s)) = P(r <= B <= s - 1)``; ``r`` is the largest with ``P(B <= r - 1) <= alpha / 2``
  and ``s`` the smallest with ``P(B <= s - 1) >= 1 - alpha / 2`` (any text on order statistics, e.g.
  David & Nagaraja, *Order Statistics*, section on distribution-free confidence intervals for quantiles;
  from memory);
* the probability of failure ``pf = k / N`` (``k`` samples below the design load), its standard error
  ``sqrt(pf (1 - pf) / N)`` and coefficient of variation ``sqrt((1 - pf) / (N pf))``, the exact
  (Clopper-Pearson) binomial confidence interval, and the reliability index ``beta = -Phi^-1(pf)`` with its
  interval (the same interval mapped through ``-Phi^-1``) and its standard error by the delta method,
  ``SE(pf) / phi(beta)`` (Monte Carlo estimation of ``pf``: e.g. Melchers, *Structural Reliability Analysis
  and Prediction*, chapter on simulation; from memory).

Pure: numbers in and out; scipy.special is imported inside the functions.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

__all__ = ["Moments", "Fractile", "FailureProbability", "moments", "fractile", "failure_probability",
           "reliability_index", "FRACTILE_METHOD", "PF_METHOD"]

FRACTILE_METHOD = ("order statistic x_(k), k = ceil(N p); distribution-free confidence interval from the "
                   "order statistics (binomial)")
PF_METHOD = ("pf = failures / N; exact binomial (Clopper-Pearson) confidence interval; beta = -Phi^-1(pf), its "
             "interval mapped from pf's, its standard error SE(pf) / phi(beta) (delta method)")


@dataclass(frozen=True)
class Moments:
    """Mean, standard deviation (``N - 1``), coefficient of variation, standard error of the mean, extremes."""

    n: int
    mean: float
    sd: float
    cov: float
    mean_se: float
    minimum: float
    maximum: float


@dataclass(frozen=True)
class Fractile:
    """The ``p`` fractile ``x_(rank)`` and its two-sided interval ``[x_(lower_rank), x_(upper_rank)]``
    (None where the sample is too small for it); ranks count from 1."""

    p: float
    value: float | None
    rank: int
    confidence: float
    lower: float | None
    lower_rank: int | None
    upper: float | None
    upper_rank: int | None


@dataclass(frozen=True)
class FailureProbability:
    """``pf`` of ``failures`` in ``n`` samples with its errors and interval, and ``beta`` likewise
    (``inf`` when no sample failed, ``-inf`` when all did)."""

    n: int
    failures: int
    pf: float
    se: float
    cov: float | None
    confidence: float
    lower: float
    upper: float
    beta: float
    beta_se: float | None
    beta_lower: float
    beta_upper: float


def moments(x) -> Moments:
    """Moments of a sample (at least one value)."""
    a = np.asarray(x, dtype=float)
    n = a.size
    if n == 0:
        raise ValueError("no sample values")
    mean = float(a.mean())
    sd = float(a.std(ddof=1)) if n > 1 else 0.0
    cov = sd / abs(mean) if mean != 0 else math.inf
    return Moments(n=n, mean=mean, sd=sd, cov=cov, mean_se=sd / math.sqrt(n), minimum=float(a.min()),
                   maximum=float(a.max()))


def fractile(x, p: float, confidence: float = 0.95) -> Fractile:
    """The ``p`` fractile of a sample and its distribution-free confidence interval (see the module)."""
    from scipy.special import bdtr

    a = np.sort(np.asarray(x, dtype=float))
    n = a.size
    if n == 0:
        raise ValueError("no sample values")
    rank = max(1, math.ceil(n * p - 1e-12))
    alpha = 1.0 - confidence
    ks = np.arange(0, n + 1)
    cdf = bdtr(ks, n, p)  # P(B <= k)
    # lower rank r: the largest r >= 1 with P(B <= r - 1) <= alpha / 2
    ok = np.nonzero(cdf[: n] <= alpha / 2)[0]  # indices k = r - 1
    r = int(ok[-1]) + 1 if ok.size else None
    # upper rank s: the smallest s <= n with P(B <= s - 1) >= 1 - alpha / 2
    hi = np.nonzero(cdf[: n] >= 1 - alpha / 2)[0]
    s = int(hi[0]) + 1 if hi.size else None
    return Fractile(p=p, value=float(a[rank - 1]), rank=rank, confidence=confidence,
                    lower=float(a[r - 1]) if r else None, lower_rank=r,
                    upper=float(a[s - 1]) if s else None, upper_rank=s)


def reliability_index(pf: float) -> float:
    """``beta = -Phi^-1(pf)`` (``inf`` for ``pf = 0``, ``-inf`` for ``pf = 1``)."""
    from scipy.special import ndtri

    if pf <= 0:
        return math.inf
    if pf >= 1:
        return -math.inf
    return float(-ndtri(pf))


def failure_probability(failures: int, n: int, confidence: float = 0.95) -> FailureProbability:
    """``pf`` from ``failures`` of ``n`` samples, with its sampling errors (see the module)."""
    from scipy.special import betaincinv

    if n <= 0 or not 0 <= failures <= n:
        raise ValueError(f"need 0 <= failures <= n, n > 0; got {failures}, {n}")
    pf = failures / n
    se = math.sqrt(pf * (1 - pf) / n)
    alpha = 1.0 - confidence
    lower = 0.0 if failures == 0 else float(betaincinv(failures, n - failures + 1, alpha / 2))
    upper = 1.0 if failures == n else float(betaincinv(failures + 1, n - failures, 1 - alpha / 2))
    beta = reliability_index(pf)
    beta_se = None
    if 0 < pf < 1:
        beta_se = se / (math.exp(-beta * beta / 2) / math.sqrt(2 * math.pi))
    return FailureProbability(n=n, failures=failures, pf=pf, se=se,
                              cov=math.sqrt((1 - pf) / (n * pf)) if pf > 0 else None, confidence=confidence,
                              lower=lower, upper=upper, beta=beta, beta_se=beta_se,
                              beta_lower=reliability_index(upper), beta_upper=reliability_index(lower))
