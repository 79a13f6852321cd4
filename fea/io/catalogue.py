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
import re
from pathlib import Path

from ..design.sizing import Candidate
from ..errors import CaseError, UnitError
from ..quantity import GrammarError, split_quantity
from ..units import parse
from .limits import MAX_CATALOGUE_BYTES, MAX_CATALOGUE_ROWS, check_count, read_limited

__all__ = ["Candidate", "load_catalogue", "parse_catalogue"]

_HEADER = re.compile(r"^\s*([A-Za-z_][A-Za-z_0-9]*)\s*(?:\[(.*)\])?\s*$")
_PROPS = {"A": "area", "I_major": "second moment of area", "I_minor": "second moment of area"}


def load_catalogue(path: str | Path) -> tuple[Candidate, ...]:
    """Read a catalogue CSV file (at most :data:`~fea.io.limits.MAX_CATALOGUE_BYTES`).

    Errors name the file; the content of a file that is not a catalogue is never quoted.
    """
    p = Path(path)
    raw = read_limited(p, MAX_CATALOGUE_BYTES, "--catalogue", "catalogue")
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise CaseError("--catalogue", f"{str(p)!r} is not a UTF-8 text file, so not a catalogue") from None
    if "\x00" in text:
        raise CaseError("--catalogue", f"{str(p)!r} is not a text file, so not a catalogue")
    return parse_catalogue(text, source=p.name)


def _cell(where: str, text: str, dimension: str) -> float:
    """A catalogue cell with the unit of its column, by the grammar of case-file values (SI)."""
    try:
        return parse(where, text, dimension)
    except UnitError as exc:
        raise CaseError(exc.field, exc.message) from None


def _header(source: str, lineno: int, cells: list[str]) -> list[tuple[str, str]]:
    """(key, unit) of every header cell; a file whose first line is not such a header is not quoted."""
    header = []
    for n, cell in enumerate(cells, start=1):
        m = _HEADER.match(cell)
        if not m or len(cell) > 40:
            raise CaseError(source, f"is not a section catalogue: cell {n} of its first line is not 'key' or "
                                    "'key [unit]' (a catalogue starts with a header such as "
                                    "'name,shape,b [mm],h [mm],tf [mm],tw [mm],r [mm],mass [kg/m]')")
        key, unit = m.group(1), (m.group(2) or "").strip()
        if unit:
            try:
                split_quantity(f"1 {unit}")
            except GrammarError:
                raise CaseError(f"{source}:{lineno}.{key}", f"the unit {unit!r} in the header is not a unit "
                                                            "expression such as 'mm', 'cm^4' or 'kg/m'") from None
        header.append((key, unit))
    return header


def parse_catalogue(text: str, source: str = "catalogue") -> tuple[Candidate, ...]:
    """Parse catalogue CSV text into candidates (see the module docstring for the format).

    A UTF-8 byte-order mark at the start is skipped.
    """
    from .section_input import build_shape

    if len(text) > MAX_CATALOGUE_BYTES:
        raise CaseError(source, f"the catalogue is larger than the limit of {MAX_CATALOGUE_BYTES:,} bytes")
    text = text.removeprefix("\ufeff")
    lines = [(n + 1, ln) for n, ln in enumerate(text.splitlines()) if ln.strip() and not ln.lstrip().startswith("#")]
    if not lines:
        raise CaseError(source, "the catalogue is empty: it needs a header line and at least one section")
    check_count(len(lines) - 1, MAX_CATALOGUE_ROWS, source, "sections")
    try:
        rows = list(csv.reader(io.StringIO("\n".join(ln for _, ln in lines))))
    except csv.Error:
        raise CaseError(source, "is not a readable CSV file") from None
    header = _header(source, lines[0][0], rows[0])
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
        mass = _cell(f"{where}.mass", f"{v} {u}".strip(), "mass per length")
        if not mass > 0:
            raise CaseError(f"{where}.mass", "must be a positive mass per length")
        shape = cells.get("shape", ("", "properties"))[1].lower()

        def q(key: str, dimension: str) -> float:
            u, v = cells[key]
            return _cell(f"{where}.{key}", f"{v} {u}".strip(), dimension)

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
    seen: set[str] = set()
    dup = next((c.name for c in out if c.name in seen or seen.add(c.name)), None)
    if dup is not None:
        raise CaseError(source, f"section name {dup!r} appears more than once")
    return tuple(out)
