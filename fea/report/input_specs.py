"""Inputs of the design check and of the restraint studies: the ``[design]`` and ``[study]`` tables as parsed.

The study settings are read from the parsed case (``case:extras/study/...``).
The design parameters are held by the check's specification in a read-only
mapping; each number is shown with the path of the same value in the JSON
result of the check that applied it (``json:design/checks/<n>/details/...``),
so a parameter no check of the case applies is named without a number.
"""

from __future__ import annotations

from typing import Any

from ..model.case import Case
from ..units import DisplayUnits
from .document import Em, Heading, Para, Q, Sub, T, Table, q, unit_label

__all__ = ["design_input_blocks", "study_input_blocks", "PARAMETER_WORDS"]

#: Each design parameter in words, with its symbol: key -> (words, symbol base, subscript).
PARAMETER_WORDS = {
    "gamma_M0": ("partial factor, resistance of cross-sections", "γ", "M0"),
    "gamma_M1": ("partial factor, resistance to member buckling", "γ", "M1"),
    "gamma_M2": ("partial factor, resistance in tension to fracture", "γ", "M2"),
    "curve": ("buckling curve", "", ""), "method": ("design method", "", ""),
    "alpha_b": ("member section constant", "α", "b"), "kf": ("form factor", "k", "f"),
    "phi": ("capacity factor", "φ", ""), "coefficient": ("Robertson coefficient", "η", ""),
    "factor_of_safety": ("factor of safety", "", ""), "a": ("Rankine constant", "a", ""),
    "crushing_stress": ("crushing stress", "f", "c"), "sigma_allow": ("allowable stress", "σ", "allow"),
    "A_net": ("net area at holes", "A", "net"),
}
_AXIS = {"_major": ", major axis", "_minor": ", minor axis"}
#: Parameters that are stresses or areas (SI in the case, shown in display units).
_UNIT = {"crushing_stress": "stress", "sigma_allow": "stress", "A_net": "area"}
#: JSON keys under which a check records a parameter, when not the parameter's own name.
_JSON_KEYS = {"A_net": ("A_net_m2",), "sigma_allow": ("sigma_allow_Pa",), "crushing_stress": ("crushing_stress_Pa",),
              "a": ("a",)}


def _words(key: str) -> tuple:
    base, axis = key, ""
    for suffix, words in _AXIS.items():
        if key.endswith(suffix):
            base, axis = key[: -len(suffix)], words
    words, sym, sub = PARAMETER_WORDS.get(base, (base.replace("_", " "), "", ""))
    if not sym:
        return (words[:1].upper() + words[1:] + axis,)
    symbol: tuple = (Em(sym), Sub(T(sub, f"name:{sub}") if any(c.isdigit() for c in sub) else sub)) if sub \
        else (Em(sym),)
    return (words[:1].upper() + words[1:] + axis, " ", *symbol)


def _applied(design: dict, key: str, value: Any, segment: int | None, u: DisplayUnits) -> tuple:
    """The cell of a parameter: text as given, or the number as the check applied it (sourced to the JSON)."""
    if isinstance(value, str):
        if not any(c.isdigit() for c in value):
            return (value,)
    base = key.removesuffix("_major").removesuffix("_minor")
    axis = key[len(base) + 1:] if key != base else None
    names = (key, base, *_JSON_KEYS.get(base, ()))
    for n, c in enumerate(design.get("checks") or []):
        if segment is not None and c.get("segment") != segment + 1:
            continue
        if axis is not None and c.get("axis") != axis:
            continue
        for where in ("details", "labels", ""):
            holder = c.get(where) if where else c
            for name in names:
                if isinstance(holder, dict) and name in holder and holder[name] is not None:
                    path = f"json:design/checks/{n}/{where + '/' if where else ''}{name}"
                    got = holder[name]
                    if isinstance(got, str):
                        return (T(got, path),)
                    kind = _UNIT.get(base)
                    unit = u.stress if kind == "stress" else u.area if kind == "area" else ""
                    return (q(got, path, unit, 4), f" {unit_label(unit)}" if unit else "")
    return ("not applied by the checks of this case",)


def design_input_blocks(case: Case, u: DisplayUnits, design: dict | None) -> list:
    """The ``[design]`` table: the standard, the design load factor and every parameter (``design``: the JSON
    design part of the run, which records the parameters each check applied; None without a design check)."""
    spec: Any = case.extras.get("design")
    if spec is None:
        return []
    d = design or {}
    rows: list[tuple] = [(("Standard or method",), (T(spec.standard, "case:extras/design/standard"),)),
                         (("Design load factor on the case loads",),
                          (q(spec.load_factor, "case:extras/design/load_factor", "", 4),))]
    for key, value in spec.parameters.items():
        rows.append((_words(key), _applied(d, key, value, None, u)))
    for idx, over in sorted(spec.overrides.items()):
        name = case.segments[idx].name if idx < len(case.segments) else ""
        for key, value in over.items():
            rows.append(((*_words(key), ", segment ", Q(idx + 1, f"ord:{idx + 1}", "", 6), " (",
                          T(name, f"case:segments/{idx}/name"), ")"), _applied(d, key, value, idx, u)))
    return [Heading(3, "Design parameters"), Table((("Parameter",), ("Value",)), tuple(rows), numeric=(1,),
                                                   caption=("As given in the [design] table, with the defaults of "
                                                            "the standard where none is given.",))]


def _unit_of(key: str, u: DisplayUnits) -> str:
    """The display unit of a studied value by the name of the input it changes."""
    last = key.rsplit(".", 1)[-1]
    if last in ("rotation",):
        return u.rotational
    if last in ("lateral",):
        return u.lateral
    if last.startswith("modulus"):
        return u.modulus
    return ""


def _value(x: float, src: str, unit: str) -> tuple:
    if x == float("inf"):
        return (T("rigid", src),)
    return (q(x, src, unit), f" {unit_label(unit)}" if unit else "")


def study_input_blocks(case: Case, u: DisplayUnits) -> list:
    """The ``[study]`` table: what ``stanchion sweep``, ``brace``, ``bounds`` and ``sensitivity`` study."""
    spec: Any = case.extras.get("study")
    if spec is None:
        return []
    b = "case:extras/study"
    rows: list[tuple] = []
    if spec.sweep is not None:
        for j, p in enumerate(spec.sweep.parameters):
            s = f"{b}/sweep/parameters/{j}"
            unit = _unit_of(p.key, u)
            rows.append((("sweep",), (T(p.key, f"{s}/key"),),
                         (*_value(p.start, f"{s}/start", unit), " to ", *_value(p.stop, f"{s}/stop", unit), ", ",
                          Q(p.points, f"{s}/points", "", 6), " points, ", T(p.scale, f"{s}/scale"), " scale")))
    if spec.brace is not None:
        br = spec.brace
        restraints: list = []
        for k, r in enumerate(br.restraints):
            restraints += [", " if k else "", Q(r, f"{b}/brace/restraints/{k}", "", 6)]
        plane: tuple = (T(br.axis, f"{b}/brace/axis"),) if br.axis else ("every plane",)
        rows.append((("brace stiffness",), ("restraint ", *restraints),
                     ("kind ", T(br.kind, f"{b}/brace/kind"), ", plane ", *plane, "; stiffness for ",
                      q(br.fraction, f"{b}/brace/fraction", "%", 3), " % of the rigid-brace load; bow ", Em("L"),
                      " / ", q(br.bow, f"{b}/brace/bow", "", 4))))
    for j, bd in enumerate(spec.bounds):
        s = f"{b}/bounds/{j}"
        unit = _unit_of(bd.key, u)
        rows.append((("bounds",), (T(bd.key, f"{s}/key"),),
                     ("from ", *_value(bd.low, f"{s}/low", unit), " to ", *_value(bd.high, f"{s}/high", unit))))
    if spec.sensitivity:
        rows.append((("sensitivity",), ("every spring of the case",), ("derivative of the load factor",)))
    if not rows:
        return []
    return [Heading(3, "Restraint studies"),
            Table((("Study",), ("Input studied",), ("Range and settings",)), tuple(rows),
                  caption=("The [study] table, read by the study commands (",
                           "stanchion sweep, brace, bounds, sensitivity); the results of this record are those of "
                           "the case as given.",)),
            Para(("Inputs are named by their table and number in the case file, e.g. the rotation of the first "
                  "restraint.",))]
