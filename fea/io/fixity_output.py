"""The depth of fixity -> its JSON part (SI) and its summary lines.

JSON ``"fixity"``: a list, one entry per bending plane that has a foundation::

    {"axis": "in-plane", "ground_line_m": 9.0, "free_length_m": 4.0, "embedded_length_m": 9.0,
     "head": "free head (equivalent cantilever)", "EI_Nm2": 6.3e7, "critical_force_N": 2.39e6,
     "equivalent_length_m": 8.06, "depth_of_fixity_m": 4.06,
     "rule_of_thumb": {"n_h_N_per_m3": 1e6, "T_m": 2.29, "depth_m": 4.12, "depth_of_fixity_in_T": 1.77,
                       "long_pile": false, "source": "..."},   # null unless the modulus grows linearly from zero
     "definition": "...", "notes": ["..."]}

``equivalent_length_m`` and ``depth_of_fixity_m`` are null where the depth is not defined (``notes`` says why).
"""

from __future__ import annotations

from typing import Any

from ..units import DisplayUnits
from ..util.numbers import finite_or_none as _num
from .summary import fmt

__all__ = ["fixity_json", "fixity_summary", "RULE_SOURCE"]

#: Where the rule of thumb comes from, as the outputs state it.
RULE_SOURCE = ("common practice: depth of fixity about 1.8 T, T = (EI / n_h)^(1/5), for long free-headed piles "
               "in soil whose modulus grows linearly with depth (Davisson and Robinson, 1965, from memory)")


def _rule(f: Any) -> dict[str, Any] | None:
    if f.n_h is None:
        return None
    return {"n_h_N_per_m3": f.n_h, "T_m": f.T, "depth_m": f.rule_depth, "depth_of_fixity_in_T": _num(f.depth_in_T),
            "long_pile": f.long_pile, "source": RULE_SOURCE}


def fixity_json(result: tuple) -> list[dict[str, Any]]:
    """The ``"fixity"`` part: one entry per plane with a foundation (SI)."""
    return [{"axis": f.axis, "ground_line_m": f.ground_line, "free_length_m": f.free_length,
             "embedded_length_m": f.embedded_length, "head": f.head, "EI_Nm2": _num(f.EI),
             "critical_force_N": _num(f.critical_force), "equivalent_length_m": _num(f.equivalent_length),
             "depth_of_fixity_m": _num(f.depth), "rule_of_thumb": _rule(f), "definition": f.definition,
             "notes": list(f.notes)} for f in result]


def fixity_summary(result: tuple, d: DisplayUnits) -> list[str]:
    """Summary lines of the depth of fixity, in display units."""
    out = ["Depth of fixity (equivalent fixed-base column with the same critical load)"]
    for f in result:
        lead = f"  {f.axis} axis: " if f.axis != "in-plane" else "  "
        out.append(f"{lead}ground line at {fmt(d.L(f.ground_line))} {d.length}, free length L_u "
                   f"{fmt(d.L(f.free_length))} {d.length}, embedded {fmt(d.L(f.embedded_length))} {d.length}")
        if f.depth is not None:
            out.append(f"    {f.head}: N_cr {fmt(d.F(f.critical_force))} {d.force}, L_e "
                       f"{fmt(d.L(f.equivalent_length))} {d.length}, depth of fixity d_f = L_e - L_u = "
                       f"{fmt(d.L(f.depth))} {d.length}")
        else:
            out.append("    depth of fixity not defined")
        if f.n_h is not None:
            n_h = f.n_h * d.length_si ** 3 / d.force_si
            cmp = "" if f.depth_in_T is None else f" (this analysis: d_f = {f.depth_in_T:.3g} T)"
            out.append(f"    rule of thumb (common practice): n_h {fmt(n_h)} {d.force}/{d.length}^3, "
                       f"T = (EI / n_h)^(1/5) = {fmt(d.L(f.T))} {d.length}, 1.8 T = {fmt(d.L(f.rule_depth))} "
                       f"{d.length}{cmp}")
        for note in f.notes:
            out.append(f"    note: {note}")
    out.append("  L_e = c sqrt(EI / N_cr): c = pi/2 free head, pi head fixed in rotation and free to sway, "
               "4.493 head held laterally, 2 pi held in both; ground line = top of the highest foundation")
    return out
