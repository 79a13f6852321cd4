"""Case-file ``section = {...}`` tables: a shape by name and dimensions -> the built section and its properties (SI).

Keys are documented in ``docs/design.md``.
"""

from __future__ import annotations

import difflib
from dataclasses import MISSING, fields
from typing import Any

from ..errors import CaseError, ModelError
from ..sections import SHAPES
from ..units import parse

__all__ = ["SHAPE_ALIASES", "build_shape", "section_properties", "parse_section"]

#: Short names accepted for ``shape`` besides the names of :data:`fea.sections.SHAPES`.
SHAPE_ALIASES = {"i": "i_section", "h": "i_section", "rhs": "rectangular_hollow", "shs": "rectangular_hollow",
                 "chs": "circular_hollow", "solid_rectangle": "rectangle", "solid_round": "round"}



def _shape_class(name: Any, path: str):
    if not isinstance(name, str):
        raise CaseError(f"{path}.shape", f"expected a shape name such as 'i', got {name!r}")
    key = SHAPE_ALIASES.get(name.strip().lower(), name.strip().lower())
    if key not in SHAPES:
        names = sorted(set(SHAPES) | set(SHAPE_ALIASES))
        close = difflib.get_close_matches(name, names, n=1)
        hint = f"; did you mean {close[0]!r}?" if close else f"; expected one of {', '.join(names)}"
        raise CaseError(f"{path}.shape", f"{name!r} is not a known shape{hint}")
    return key, SHAPES[key]


def build_shape(shape: Any, dims: dict[str, float], path: str):
    """A section shape from its name and dimensions in metres (``shs`` takes ``h = b``)."""
    key, cls = _shape_class(shape, path)
    allowed = [f.name for f in fields(cls)]
    dims = dict(dims)
    if str(shape).strip().lower() == "shs" and "h" not in dims and "b" in dims:
        dims["h"] = dims["b"]
    for k in dims:
        if k not in allowed:
            close = difflib.get_close_matches(k, allowed, n=1, cutoff=0.5)
            hint = f"; did you mean `{close[0]}`?" if close else f"; a {key} takes {', '.join(allowed)}"
            raise CaseError(f"{path}.{k}", f"unknown dimension{hint}")
    try:
        return cls(**dims)
    except TypeError:
        required = [f.name for f in fields(cls) if f.default is MISSING and f.default_factory is MISSING]
        missing = next((k for k in required if k not in dims), allowed[0])
        raise CaseError(f"{path}.{missing}", f"missing: a {key} needs {', '.join(required)}") from None
    except ModelError as exc:
        raise CaseError(f"{path}.{exc.field}", exc.message) from None


def parse_section(table: dict, path: str) -> tuple[Any, dict[str, Any]]:
    """A ``section = {shape = "i", b = "150 mm", ...}`` table -> (the built shape, its properties, SI).

    The properties are I_major, I_minor (principal axes), A and, for reports,
    r_least, theta [rad], J and the shape name.
    """
    if "shape" not in table:
        raise CaseError(f"{path}.shape", "missing: give a shape such as 'i', 'rhs', 'chs', 'angle'")
    dims = {k: parse(f"{path}.{k}", v, "length") for k, v in table.items() if k != "shape"}
    shape = build_shape(table["shape"], dims, path)
    p = shape.properties()
    return shape, {"I_major": p.I_major, "I_minor": p.I_minor, "A": p.area, "r_least": p.r_least,
                   "theta": p.theta, "J": p.J, "shape": type(shape).kind}


def section_properties(table: dict, path: str) -> dict[str, Any]:
    """The properties of a ``section`` table (see :func:`parse_section`)."""
    return parse_section(table, path)[1]
