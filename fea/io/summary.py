"""Results -> the readable terminal summary, in the case's display units."""

from __future__ import annotations

import math
from typing import Any, Callable, Mapping

from ..cautions import CAUTION
from ..model.ideal_supports import ideal_case
from ..results import CaseResults
from ..units import DisplayUnits
from ..util.checks import one_line
from .run_warnings import run_notices

__all__ = ["summary_lines", "fmt"]


def fmt(x: float, sig: int = 4) -> str:
    """A number with ``sig`` significant figures, without exponent for everyday magnitudes."""
    if x == 0:
        return "0"
    a = abs(x)
    if 1e-3 <= a < 1e7:
        digits = max(0, sig - 1 - int(math.floor(math.log10(a))))
        return f"{x:.{digits}f}"
    return f"{x:.{sig - 1}e}"


def summary_lines(res: CaseResults, display: DisplayUnits | None = None,
                  parts: Mapping[str, Callable[[Any, DisplayUnits], list[str]]] | None = None) -> list[str]:
    """The terminal summary; ``parts`` gives the lines of each optional analysis's result."""
    parts = parts or {}
    case = res.case
    d = display or case.display
    out = [f"{one_line(case.title) or '(untitled case)'}"]
    if case.source:
        out.append(f"case file {case.source}  (sha256 {case.sha256[:12]})")
    out.append(f"height {fmt(d.L(case.height))} {d.length}, {len(case.segments)} segment(s); "
               f"forces in {d.force}, lengths in {d.length}")
    for n in run_notices(res):
        out.append(f"{'WARNING' if n.level == 'warning' else 'CHECK'} ({n.key}): {n.text}")
    for r in res.buckling:
        out.append("")
        lf = ", ".join(fmt(v) for v in r.load_factors)
        out.append(f"Axis {r.axis}: load factors {lf}")
        flag = "" if r.converged else "  NOT CONVERGED"
        errs = ", ".join(f"{e:.1e}" for e in r.mode_errors) if len(r.mode_errors) > 1 else \
            f"{r.discretisation_error:.1e}"
        out.append(f"  mesh {r.n_elements} elements, estimated error of the load factor"
                   f"{'s' if len(r.mode_errors) > 1 else ''} {errs} (tolerance {r.tolerance:.0e}){flag}")
        out.append(f"  {'segment':<22} {'from-to [' + d.length + ']':>15} {'N [' + d.force + ']':>11} "
                   f"{'N_cr [' + d.force + ']':>12} {'K':>7} {'K L [' + d.length + ']':>10} {'energy':>7}")
        for s, info in zip(r.segments, case.segments):
            span = f"{fmt(d.L(s.bottom), 3)}-{fmt(d.L(s.top), 3)}"
            K = "-" if s.effective_length_factor is None else f"{s.effective_length_factor:.3f}"
            KL = "-" if s.effective_length is None else fmt(d.L(s.effective_length), 4)
            flag = "" if s.meaningful else f"   (not a design K: {s.note}; check against its own N_cr)" \
                if s.effective_length_factor else f"   ({s.note})"
            ideal = ideal_case(case.column(r.axis), s.index) if s.meaningful else None
            if ideal is not None:
                flag += f"   (ideal {ideal.name}: design K {ideal.recommended:.2f})"
            name = f"{s.index + 1} {info.name}"[:22]
            out.append(f"  {name:<22} {span:>15} {fmt(d.F(s.axial_force)):>11} "
                       f"{fmt(d.F(s.critical_axial_force)):>12} {K:>7} {KL:>10} {100 * s.energy_share:6.1f}%{flag}")
    if len(res.buckling) > 1:
        g = res.governing
        out.append("")
        out.append(f"Governing: {g.axis} axis, lowest load factor {fmt(g.load_factor)}")
    for name, value in res.extras.items():
        if name in parts:
            out.append("")
            out.extend(parts[name](value, d))
    out.append("")
    out.append(f"CAUTION: {CAUTION}")
    return out
