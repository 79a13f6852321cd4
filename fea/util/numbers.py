"""Numbers and arrays: finite floats for JSON (which has no NaN), read-only arrays, nested lists."""

from __future__ import annotations

import math
from typing import Any

import numpy as np

__all__ = ["finite_or_none", "finite_list", "json_clean", "readonly"]


def finite_or_none(x: Any) -> float | None:
    """``float(x)``, or None for None, NaN and infinities (JSON has no NaN)."""
    if x is None:
        return None
    x = float(x)
    return x if math.isfinite(x) else None


def finite_list(a: Any) -> list:
    """An array as nested lists of floats with NaN and infinities as None."""
    a = np.asarray(a, dtype=float)
    return json_clean(a.tolist()) if a.size else []


def json_clean(obj: Any) -> Any:
    """Replace NaN and infinities by None, recursively through lists, tuples and dicts."""
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else None
    if isinstance(obj, (list, tuple)):
        return [json_clean(v) for v in obj]
    if isinstance(obj, dict):
        return {k: json_clean(v) for k, v in obj.items()}
    return obj


def readonly(a: Any, dtype: Any = float) -> np.ndarray:
    """A new array of ``a`` that cannot be written to (result objects hold these)."""
    out = np.array(a, dtype=dtype)
    out.setflags(write=False)
    return out
