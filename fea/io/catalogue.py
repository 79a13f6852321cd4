"""Section catalogues: a CSV file the engineer supplies -> candidate sections (SI).

Format (documented in ``docs/design.md``)::

    # comment lines start with '#'
    name,shape,b [mm],h [mm],tf [mm],tw [mm],r [mm],mass [kg/m]
    demo-I 200,i,200,200,15,9,18,61.3

* ``name`` and ``mass`` (mass per length, unit in the header) are required.
* A section is given either by ``shape`` and its dimensions (the keys of the
  ``section`` table of a case file, units in the header), or by its
  properties ``A``, ``I_major`` and ``I_minor`` (units in the header), with
  ``shape`` empty or ``properties``.  Empty cells are ignored.
"""

from __future__ import annotations

import csv
import io
import math
import re
from pathlib import Path

from ..design.sizing import Candidate
from ..errors import CaseError
from ..units import parse, registry

__all__ = ["Candidate", "load_catalogue", "parse_catalogue"]

_HEADER = re.compile(r"^\s*([A-Za-z_][A-Za-z_0-9]*)\s*(?:\[(.*)\])?\s*$")
_PROPS = {"A": "area", "I_major": "second moment of area", "I_minor": "second moment of area"}


def load_catalogue(path: str | Path) -> tuple[Candidate, ...]:
    """Read a catalogue CSV file."""
    p = Path(path)
    try:
        text = p.read_text(encoding="utf-8")
    except FileNotFoundError:
        raise CaseError("--catalogue", f"file {str(p)!r} does not exist") from None
    except (OSError, UnicodeDecodeError) as exc:
        raise CaseError("--catalogue", f"cannot read {str(p)!r}: {exc}") from None
    return parse_catalogue(text, source=p.name)


def _mass(where: str, text: str) -> float:
    ureg = registry()
    try:
        q = ureg.Quantity(text)
    except Exception:
        raise CaseError(where, f"{text!r} is not a mass per length such as '61.3 kg/m'") from None
    if not isinstance(q, ureg.Quantity) or q.dimensionality != ureg.get_dimensionality("[mass] / [length]"):
        raise CaseError(where, f"{text!r} is not a mass per length: expected units like kg/m")
    v = float(q.to_base_units().magnitude)
    if not (math.isfinite(v) and v > 0):
        raise CaseError(where, f"{text!r} must be a positive mass per length")
    return v


def parse_catalogue(text: str, source: str = "catalogue") -> tuple[Candidate, ...]:
    """Parse catalogue CSV text into candidates (see the module docstring for the format)."""
    from .section_input import build_shape

    lines = [(n + 1, ln) for n, ln in enumerate(text.splitlines()) if ln.strip() and not ln.lstrip().startswith("#")]
    if not lines:
        raise CaseError(source, "the catalogue is empty: it needs a header line and at least one section")
    rows = list(csv.reader(io.StringIO("\n".join(ln for _, ln in lines))))
    header = []
    for cell in rows[0]:
        m = _HEADER.match(cell)
        if not m:
            raise CaseError(f"{source}:{lines[0][0]}", f"header cell {cell!r} is not 'key' or 'key [unit]'")
        header.append((m.group(1), (m.group(2) or "").strip()))
    keys = [k for k, _ in header]
    for need in ("name", "mass"):
        if need not in keys:
            raise CaseError(f"{source}:{lines[0][0]}", f"the header needs a `{need}` column"
                            + (" with its unit, e.g. 'mass [kg/m]'" if need == "mass" else ""))
    out = []
    for (lineno, _), row in zip(lines[1:], rows[1:]):
        where = f"{source}:{lineno}"
        if len(row) > len(header):
            raise CaseError(where, f"{len(row)} cells but the header has {len(header)}")
        cells = {k: (u, c.strip()) for (k, u), c in zip(header, row) if c.strip()}
        name = cells.get("name", ("", ""))[1]
        if not name:
            raise CaseError(f"{where}.name", "missing: every section needs a name")
        if "mass" not in cells:
            raise CaseError(f"{where}.mass", "missing: every section needs its mass per length")
        u, v = cells["mass"]
        mass = _mass(f"{where}.mass", f"{v} {u}".strip())
        shape = cells.get("shape", ("", "properties"))[1].lower()

        def q(key: str, dimension: str) -> float:
            u, v = cells[key]
            return parse(f"{where}.{key}", f"{v} {u}".strip(), dimension)

        if shape in ("", "properties"):
            missing = [k for k in _PROPS if k not in cells]
            if missing:
                raise CaseError(f"{where}.{missing[0]}", "missing: give a shape and dimensions, or A, I_major "
                                                         "and I_minor")
            A, I1, I2 = (q(k, d) for k, d in _PROPS.items())
            if min(A, I1, I2) <= 0:
                raise CaseError(where, "A, I_major and I_minor must be positive")
            out.append(Candidate(name, "properties", A, max(I1, I2), min(I1, I2), mass, lineno))
            continue
        dims = {k: q(k, "length") for k in cells if k not in ("name", "shape", "mass", *_PROPS)}
        p = build_shape(shape, dims, where).properties()
        out.append(Candidate(name, shape, p.area, p.I_major, p.I_minor, mass, lineno))
    if not out:
        raise CaseError(source, "the catalogue lists no sections")
    names = [c.name for c in out]
    dup = next((n for n in names if names.count(n) > 1), None)
    if dup is not None:
        raise CaseError(source, f"section name {dup!r} appears more than once")
    return tuple(out)
