"""The depth-of-fixity part of the report, read from the :class:`~fea.solve.fixity.Fixity` of each plane.

The values are those of the JSON ``"fixity"`` part (:mod:`fea.io.fixity_output`); each names its JSON path.
"""

from __future__ import annotations

from dataclasses import replace
from typing import TYPE_CHECKING

from ..io.fixity_output import RULE_SOURCE
from ..units import DisplayUnits
from .blocks import yes
from .buckling import plane_title
from .document import Heading, Note, Para, Q, T, Table, q, unit_label

if TYPE_CHECKING:
    from ..solve.fixity import Fixity

__all__ = ["fixity_blocks", "fixity_figures"]


def _rows(f: "Fixity", p: str, u: DisplayUnits) -> tuple:
    """(label, value, unit) rows; each label names its JSON key (some hold digits: ``1.8 T``)."""
    stiffness = f"{u.force}*{u.length}^2"
    head = T(f.head, f"json:{p}/head") if f.head else "not ideal"
    rows = [("ground_line_m", "Ground line (top of the highest foundation)", q(f.ground_line, "", u.length)),
            ("free_length_m", "Free length above the ground line, L_u", q(f.free_length, "", u.length)),
            ("embedded_length_m", "Embedded length", q(f.embedded_length, "", u.length)),
            ("head", "Head restraint", head),
            ("EI_Nm2", "Bending stiffness of the free length, EI", q(f.EI, "", stiffness)),
            ("critical_force_N", "Largest axial force in the free length at the critical state, N_cr",
             q(f.critical_force, "", u.force)),
            ("equivalent_length_m", "Equivalent fixed-base length, L_e", q(f.equivalent_length, "", u.length)),
            ("depth_of_fixity_m", "Depth of fixity, d_f = L_e \u2212 L_u", q(f.depth, "", u.length))]
    if f.n_h is not None:
        per_volume = f"{u.force}/{u.length}^3"
        rows += [("rule_of_thumb/n_h_N_per_m3", "Growth of the foundation modulus with depth, n_h",
                  q(f.n_h, "", per_volume)),
                 ("rule_of_thumb/T_m", "T = (EI / n_h)^(1/5)", q(f.T, "", u.length)),
                 ("rule_of_thumb/depth_m", "Rule of thumb (common practice): 1.8 T", q(f.rule_depth, "", u.length)),
                 ("rule_of_thumb/depth_of_fixity_in_T", "This analysis: d_f / T", q(f.depth_in_T, "", "", 3)),
                 ("rule_of_thumb/long_pile", "Long pile (embedded length of 4 T or more)",
                  yes(bool(f.long_pile), f"json:{p}/rule_of_thumb/long_pile"))]
    out = []
    for key, label, value in rows:
        if isinstance(value, Q):
            value = replace(value, src=f"json:{p}/{key}")
        unit = value.unit if isinstance(value, Q) else ""
        out.append(((T(label, f"key:{p}/{key}"),), (value,), (unit_label(unit),)))
    return tuple(out)


def fixity_blocks(result: tuple, u: DisplayUnits) -> list:
    """The depth-of-fixity part: the definition, then one table per plane with a foundation."""
    blocks: list = [Para(("The depth of fixity is read from the lowest elastic critical load: ",
                          T(result[0].definition, "json:fixity/0/definition"), "."))]
    for i, f in enumerate(result):
        p = f"fixity/{i}"
        if len(result) > 1 or f.axis != "in-plane":
            blocks.append(Heading(3, plane_title(f.axis)))
        blocks.append(Table((("Quantity",), ("Value",), ("Unit",)), _rows(f, p, u), numeric=(1,)))
        if f.n_h is not None:
            blocks.append(Para(("Rule of thumb: ", T(RULE_SOURCE, f"json:{p}/rule_of_thumb/source"), ".")))
        blocks += [Note((T(n, f"json:{p}/notes/{k}"),), "check") for k, n in enumerate(f.notes)]
    return blocks


def fixity_figures(result: tuple, u: DisplayUnits) -> list:
    """No figure of its own: the ground line is drawn on the column's sketch."""
    return []
