"""The thin-walled (spatial) buckling of a case -> its JSON part (SI) and its summary lines.

JSON ``"spatial"`` (SI; see ``cases/README.md``)::

    {"covered": true, "note": "",                      # covered false: note says why ("not covered: ...")
     "load_factors": [3.51, 3.98, ...], "kinds": ["torsional", "flexural (minor axis)", ...],
     "estimated_errors": [1e-9, ...], "converged": true, "message": "...",
     "segments": [{"name": "post", "N_cr_N": 1.47e6}, ...],   # axial force in each segment at the lowest mode
     "planar_load_factor": 3.98, "planar_axis": "minor", "governs": true,
     "critical_moment": {"load_factor": 20.1, "kind": "lateral-torsional", "senses": "as given", "chords": 16,
                         "converged": true, "message": "...",
                         "segments": [{"name": "post", "M_max_Nm": 1.1e4, "at_m": 3.6, "M_cr_Nm": 2.2e5}]}}

``critical_moment`` (only when the major-axis plane carries moments): the elastic critical moment of the member
under the case's first-order major-axis moment diagram alone; ``{"note": "not computed: ..."}`` when it failed.

``load_factors``, ``kinds``, ``estimated_errors`` and ``segments`` are empty, and ``converged`` null, when the
analysis did not run.
"""

from __future__ import annotations

from typing import Any

from ..solve.spatial_case import CaseCriticalMoment, SpatialCase
from ..units import DisplayUnits
from ..util.numbers import finite_or_none as _num

__all__ = ["spatial_json", "spatial_summary", "segment_N_cr", "critical_moment_json"]


def segment_N_cr(s: SpatialCase) -> list[float]:
    """The axial force in each segment at the lowest spatial load factor [N] (empty when not run)."""
    if not s.ran or s.result is None:
        return []
    return [float(x) for x in s.result.segment_N_cr[0]]


def critical_moment_json(m: CaseCriticalMoment | str) -> dict[str, Any]:
    """The ``"critical_moment"`` entry of the spatial part (SI)."""
    if isinstance(m, str):
        return {"note": m}
    return {"load_factor": _num(m.load_factor), "kind": m.kind, "senses": m.senses, "chords": m.chords,
            "converged": m.converged, "message": m.message,
            "segments": [{"name": g.name, "M_max_Nm": _num(g.M_max), "at_m": _num(g.at), "M_cr_Nm": _num(g.M_cr)}
                         for g in m.segments]}


def spatial_json(s: SpatialCase) -> dict[str, Any]:
    """The ``"spatial"`` part of the JSON result (SI)."""
    r = s.result if s.ran else None
    out = {"covered": r is not None, "note": s.note,
            "load_factors": [] if r is None else [float(x) for x in r.load_factors],
            "kinds": [] if r is None else list(r.kinds),
            "estimated_errors": [] if r is None else [_num(float(e)) for e in r.discretisation_errors],
            "converged": None if r is None else bool(r.converged),
            "message": "" if r is None else r.message,
            "segments": [{"name": n, "N_cr_N": _num(N)} for n, N in zip(s.segment_names, segment_N_cr(s))],
            "planar_load_factor": s.planar_load_factor, "planar_axis": s.planar_axis, "governs": s.governs}
    if s.critical_moment is not None:
        out["critical_moment"] = critical_moment_json(s.critical_moment)
    return out


def spatial_summary(s: SpatialCase, d: DisplayUnits) -> list[str]:
    """Summary lines of the spatial buckling: the lowest load factor, its kind, and whether it governs."""
    head = "Thin-walled buckling (flexural, torsional and flexural-torsional modes together)"
    if not s.ran:
        return [head, f"  {s.note}"]
    out = [head, f"  lowest load factor {s.load_factor:.4g}: {s.kind}"]
    if s.governs:
        out.append(f"  {s.kind} buckling governs: load factor {s.load_factor:.4g} against "
                   f"{s.planar_load_factor:.4g} in plane ({s.planar_axis} axis)")
    else:
        out.append(f"  not below the planar analysis ({s.planar_load_factor:.4g}, {s.planar_axis} axis)")
    if s.result is not None and not s.result.converged:
        out.append(f"  NOT CONVERGED: {s.result.message}")
    m = s.critical_moment
    if isinstance(m, str):
        out.append(f"  elastic critical moment M_cr {m}")
    elif m is not None:
        from .summary import fmt

        unit = d.moment
        out.append(f"  elastic critical moment under the case's major-axis moments alone ({m.kind}, {m.senses}): "
                   f"load factor {m.load_factor:.4g} on the moment diagram")
        for g in m.segments:
            if g.M_max > 0:
                out.append(f"    {g.name}: largest moment {fmt(d.F(d.L(g.M_max)))} {unit} at {fmt(d.L(g.at))} "
                           f"{d.length}, M_cr {fmt(d.F(d.L(g.M_cr)))} {unit}")
        if not m.converged:
            out.append(f"    NOT CONVERGED: {m.message}")
    return out
