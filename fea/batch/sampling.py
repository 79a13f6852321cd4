"""The values of the random variables for one sample, from that sample's own seed.

Sample ``i`` draws its standard normal numbers from ``numpy.random.SeedSequence([seed, i])`` (PCG64), so its
values depend only on the root seed and its index: however the samples are split among tasks and workers,
and in whatever order they run, sample ``i`` is the same.  Correlated variables are made from the standard
normals ``z`` by the lower Cholesky factor ``L`` of the correlation matrix ``R`` of the normal space
(``u = L z`` has correlation ``R``) and each marginal law's ``F^-1(Phi(u))`` (a Gaussian copula: Nataf's
model with the correlation given in the normal space).

Pure: numbers in and out.
"""

from __future__ import annotations

from typing import Sequence

import numpy as np

from .distributions import Distribution

__all__ = ["standard_normals", "sample_values", "cholesky_factor", "SEEDING"]

#: How a sample's random numbers are seeded, in words (for outputs).
SEEDING = "numpy.random.SeedSequence([seed, index]) -> PCG64, one stream per sample index"


def standard_normals(seed: int, index: int, n: int) -> np.ndarray:
    """``n`` independent standard normal numbers of sample ``index``."""
    rng = np.random.Generator(np.random.PCG64(np.random.SeedSequence([int(seed), int(index)])))
    return rng.standard_normal(n)


def cholesky_factor(correlation: Sequence[Sequence[float]] | None) -> np.ndarray | None:
    """The lower Cholesky factor of a correlation matrix (None for independent variables)."""
    if correlation is None:
        return None
    return np.linalg.cholesky(np.asarray(correlation, dtype=float))


def sample_values(distributions: Sequence[Distribution], seed: int, index: int,
                  factor: np.ndarray | None = None) -> np.ndarray:
    """The values (SI) of every variable in sample ``index``; ``factor`` is :func:`cholesky_factor`'s."""
    z = standard_normals(seed, index, len(distributions))
    u = z if factor is None else factor @ z
    return np.array([float(d.from_normal(u[i])) for i, d in enumerate(distributions)])
