"""The co-rotational fibre path of an imperfect column (one bending plane).

:func:`nonlinear_path` turns a :class:`~fea.model.Column` of one bending plane,
its :class:`~fea.model.imperfection.Imperfection`, lateral actions and per-segment
sections into the planar model of :mod:`fea.solve.corotational` and traces its
equilibrium path with :func:`fea.solve.pathfollow.trace_path`:

* nodes at the heights of the mesh of :func:`fea.solve.second_order.discretise`
  (every station, lateral action and measured offset is a node), placed at
  ``(w0(x), x)`` so the bow is built into the geometry (straight elements
  between nodes);
* rigid restraints fix ``u_x`` (lateral) or ``theta``; the base is held
  vertically (the model carries all axial load down to the base); finite
  springs, Winkler foundations (consistent matrices) and permanent leaning loads
  (``-P/h``) form ``K_spring``; variable leaning loads form
  ``K_spring_lambda``; the leaning loads also push on the bow, ``(P/h) w0``;
* axial loads act downwards (the kernel is tension positive; here compression is
  positive): variable ones in ``F_ref``, permanent ones in ``F_const``;
  distributed axial loads are lumped half to each element end; lateral loads
  use the consistent Hermite load vectors; applied moments (eccentricities
  ``P e``) act on ``theta = -dw/dx``;
* fibres: a section fibre at ``+y`` (towards ``+w``) sits at ``-y`` in the
  kernel's local axis; residual stress ``sigma_r = -ratio fy`` (tension positive
  there).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ..elements import foundation_stiffness
from ..errors import ModelError
from ..model import Column
from ..model.imperfection import DEFAULT_ELEMENTS, Imperfection, LateralActions, SegmentSection
from ..util.numbers import readonly
from .bowed_mesh import Discrete, discretise, segment_of_elements
from .fibre import make_elastic_section, make_fibre_section
from .pathfollow import PathResult, trace_path

__all__ = ["NonlinearPath", "nonlinear_path", "MIN_ELEMENTS"]

#: Smallest number of elements of the nonlinear model.
MIN_ELEMENTS = DEFAULT_ELEMENTS


@dataclass(frozen=True)
class NonlinearPath:
    """Geometrically and materially nonlinear path of one bending plane (SI).

    Attributes
    ----------
    load_factors : (n_pts,) load factor of every converged point [-]
    heights : (n_nodes,) node heights [m]
    bow : (n_nodes,) initial bow at the nodes [m]
    deflection : (n_pts, n_nodes) total lateral position w0 + u [m]
    rotation : (n_pts, n_nodes) node rotation from the initial geometry, positive
        when the axis turns towards +w going up [rad]
    control_height : height of the node whose deflection is the path's abscissa [m]
        (largest total deflection at the limit point or the last point)
    control_deflection : (n_pts,) total lateral deflection there [m]
    ip_heights : (n_el, n_ip) heights of the integration points [m]
    axial_force : (n_pts, n_el, n_ip) axial compression [N]
    bending_moment : (n_pts, n_el, n_ip) bending moment, Timoshenko sign
        (``EI (w - w0)'' = -M``) [N m]
    yield_fraction : (n_pts, n_el) share of the section yielding (mean over the
        integration points) [-]
    yield_extent : (n_pts, 2) lowest and highest element mid-height with yielding
        fibres [m], NaN while elastic
    limit_load_factor : peak load factor (ultimate load), None when no peak was
        passed [-]
    limit_accuracy : relative gap between the refined peak and the highest
        converged point [-]
    limit_index : index of the highest converged point
    first_yield_load_factor : load factor at which a fibre first yields (step-
        interpolated), None when nothing yielded [-]
    first_yield_bracket : load factors at the ends of that step
    first_yield_height : height of the first-yielding fibre [m]
    first_yield_offset : its distance from the bending axis, positive towards +w [m]
    status, message, success : how the trace ended (see :class:`~fea.solve.pathfollow.PathResult`)
    n_elements, n_fibres, n_steps, n_iter, n_bisections : sizes and work counters
    max_residual : largest achieved relative residual over the stored points
    tolerance : the residual and displacement tolerance used
    """

    load_factors: np.ndarray
    heights: np.ndarray
    bow: np.ndarray
    deflection: np.ndarray
    rotation: np.ndarray
    control_height: float
    control_deflection: np.ndarray
    ip_heights: np.ndarray
    axial_force: np.ndarray
    bending_moment: np.ndarray
    yield_fraction: np.ndarray
    yield_extent: np.ndarray
    limit_load_factor: float | None
    limit_accuracy: float | None
    limit_index: int | None
    first_yield_load_factor: float | None
    first_yield_bracket: tuple[float, float] | None
    first_yield_height: float | None
    first_yield_offset: float | None
    status: str
    message: str
    success: bool
    n_elements: int
    n_fibres: int
    n_steps: int
    n_iter: int
    n_bisections: int
    max_residual: float
    tolerance: float


def _fibre_model(column: Column, sections, seg_of_el: np.ndarray, n_el: int):
    """Per-element FibreSection (padded to a common fibre count)."""
    n_max = max(s.fibre_y.size for s in sections)
    Y = np.zeros((n_el, n_max))
    Ar = np.zeros((n_el, n_max))
    SR = np.zeros((n_el, n_max))
    E = np.empty(n_el)
    fy = np.empty(n_el)
    Et = np.empty(n_el)
    for i, (seg, s) in enumerate(zip(column.segments, sections)):
        m = seg_of_el == i
        if not np.any(m):
            continue
        k = s.fibre_y.size
        y = -np.asarray(s.fibre_y, dtype=float)  # kernel local axis points to -w
        a = np.asarray(s.fibre_area, dtype=float)
        pad = n_max - k
        Y[m] = np.r_[y, np.zeros(pad)]
        # padding fibres on the axis with a negligible area (the kernel needs one fibre count)
        Ar[m] = np.r_[a, np.full(pad, 1e-12 * a.sum())]
        sr = np.zeros(k) if s.residual is None else -np.asarray(s.residual, dtype=float) * s.fy
        SR[m] = np.r_[sr, np.zeros(pad)]
        E[m] = seg.E
        fy[m] = s.fy
        Et[m] = s.hardening * seg.E
    return make_fibre_section(Y, Ar, E, fy, n_el, E_t=Et, sigma_r=SR)


def _check_sections(column: Column, sections, need_fibres: bool) -> tuple[SegmentSection, ...]:
    if sections is None:
        raise ModelError("sections", "the nonlinear analysis needs each segment's section (area, and fibres with fy "
                                     "for yielding)")
    sections = tuple(sections)
    if len(sections) != len(column.segments) or not all(isinstance(s, SegmentSection) for s in sections):
        raise ModelError("sections", f"expected one SegmentSection per segment ({len(column.segments)}), got "
                                     f"{len(sections)}")
    fib = [s.has_fibres for s in sections]
    if any(fib) and not all(fib):
        i = fib.index(False)
        raise ModelError(f"segment[{i + 1}].section", "has no fibres while other segments do; give every segment "
                                                      "a section by its dimensions (or none, for an elastic run)")
    if all(fib):
        for i, s in enumerate(sections):
            if s.fy is None:
                raise ModelError(f"segment[{i + 1}].fy", "missing: the nonlinear fibre analysis needs the yield "
                                                         "strength fy (in [material] or the segment)")
            if column.segments[i].tapered:
                raise ModelError(f"segment[{i + 1}]", "is tapered: the fibre analysis uses one section per segment "
                                                      "and cannot follow a taper; use analysis = 'second-order'")
    elif need_fibres:
        raise ModelError("sections", "no fibres given: a yield analysis needs the sections by their dimensions")
    return sections


def nonlinear_path(column: Column, imperfection: Imperfection | None, sections, actions: LateralActions | None = None,
                   *, min_elements: int = MIN_ELEMENTS, n_ip: int = 3, method: str = "arc-length",
                   initial_step: float = 0.05, max_step: float | None = None, max_steps: int = 200,
                   tolerance: float = 1e-8, limit_tol: float = 1e-4, drop_fraction: float | None = 0.8,
                   lambda_max: float | None = None, deflection_limit: float | None = None,
                   rotation_limit: float | None = None) -> NonlinearPath:
    """Trace the co-rotational (fibre) path of one plane of ``column``.

    Parameters
    ----------
    column : the column of this plane
    imperfection : initial bow (None: straight; then a lateral action is needed)
    sections : one :class:`~fea.model.imperfection.SegmentSection` per segment; all
        with fibres and fy (elastic-plastic) or none with fibres (elastic, EA =
        E A and EI of the column)
    actions : lateral loads and applied moments
    min_elements : smallest number of elements (the mesh of nested levels with
        at least this many is used)
    n_ip : Gauss points per element (2 or 3)
    method : "arc-length", "load" or "displacement" (control of the lateral
        displacement of the control node)
    initial_step, max_step, max_steps, limit_tol, drop_fraction, lambda_max :
        path-following options of :func:`~fea.solve.pathfollow.trace_path`
    tolerance : relative residual and displacement tolerance [-]
    deflection_limit : stop once the lateral displacement at the largest bow
        reaches this [m] (default: a fifth of the height)
    rotation_limit : stop once the base rotation reaches this [rad] (optional)

    Returns
    -------
    NonlinearPath

    Raises
    ------
    ModelError
        A straight column without lateral action (no limit point can be found
        past the bifurcation), missing sections or fy, tapered fibre segments, a
        mechanism.
    """
    actions = actions or LateralActions()
    sections = _check_sections(column, sections, need_fibres=False)
    if (imperfection is None or imperfection.is_zero) and actions.empty:
        raise ModelError("imperfection", "the column is perfectly straight and carries no lateral load or "
                                         "eccentricity: the nonlinear path only reaches the bifurcation at the "
                                         "critical load and cannot pass it without an imperfection; give a bow "
                                         "such as 'L/1000'")
    d = _mesh(column, imperfection, actions, min_elements)
    mesh = d.mesh
    sec, n_fib = _section_model(column, sections, mesh)
    fixed, Ks, Ksl = _springs(mesh)
    F_ref, F_const = _loads(d)
    disp_limit, control_dof = _path_control(column, d, fixed, method, deflection_limit, rotation_limit)
    x = mesh.x
    xy0 = np.c_[d.w0n, x]
    conn = np.c_[np.arange(mesh.n_el), np.arange(1, mesh.n_el + 1)]
    r: PathResult = trace_path(xy0, conn, sec, F_ref, fixed=sorted(set(fixed)), F_const=F_const, K_spring=Ks,
                               K_spring_lambda=Ksl if np.any(Ksl) else None, method=method, control_dof=control_dof,
                               n_ip=n_ip, initial_step=initial_step, max_step=max_step, max_steps=max_steps,
                               tol_residual=tolerance, tol_displacement=tolerance, lambda_max=lambda_max,
                               displacement_limit=disp_limit, drop_fraction=drop_fraction, limit_tol=limit_tol)
    message = path_message(r, x, disp_limit, max_steps=max_steps, drop_fraction=drop_fraction)
    return _package(r, mesh, d.w0n, sec, n_fib, tolerance, message)


def _mesh(column: Column, imperfection, actions: LateralActions, min_elements: int) -> Discrete:
    """The nested mesh of :func:`discretise` with at least ``min_elements`` elements (level 8 at most)."""
    level = 0
    while True:
        d = discretise(column, imperfection, actions, level)
        if d.mesh.n_el >= min_elements or level >= 8:
            return d
        level += 1


def _section_model(column: Column, sections, mesh):
    """The kernel's per-element section (fibres, or elastic EA and EI) and the number of fibres."""
    n_el = mesh.n_el
    seg_of_el = segment_of_elements(column, mesh.x)
    if sections[0].has_fibres:
        return _fibre_model(column, sections, seg_of_el, n_el), max(s.fibre_y.size for s in sections)
    EA = np.array([column.segments[s].E * sections[s].A for s in seg_of_el])
    return make_elastic_section(EA, mesh.EI.mean(axis=1), n_el), 0


def _springs(mesh):
    """Rigidly fixed DOFs, the constant spring stiffness and the one scaled by the load factor."""
    n_nodes, n_el = mesh.n_nodes, mesh.n_el
    n_dof = 3 * n_nodes
    # (w, psi) dofs of element e -> kernel dofs (u_x, theta) with theta = -psi
    kdofs = np.stack([3 * np.arange(n_el), 3 * np.arange(n_el) + 2, 3 * np.arange(1, n_el + 1),
                      3 * np.arange(1, n_el + 1) + 2], axis=1)
    sgn = np.array([1.0, -1.0, 1.0, -1.0])
    fixed = [1]
    Ks = np.zeros((n_dof, n_dof))
    for i in range(n_nodes):
        for k_val, dof in ((mesh.k_lat[i], 3 * i), (mesh.k_rot[i], 3 * i + 2)):
            if math.isinf(k_val):
                fixed.append(dof)
            elif k_val > 0:
                Ks[dof, dof] += k_val
    if np.any(mesh.k_found):
        kf = foundation_stiffness(mesh.L, mesh.k_found, mesh.phi) * sgn[None, :, None] * sgn[None, None, :]
        rows = np.repeat(kdofs, 4, axis=1).ravel()
        cols = np.tile(kdofs, (1, 4)).ravel()
        np.add.at(Ks, (rows, cols), kf.reshape(n_el, 16).ravel())
    lat = 3 * np.arange(n_nodes)
    Ks[lat, lat] -= mesh.lean_perm
    Ksl = np.zeros((n_dof, n_dof))
    Ksl[lat, lat] -= mesh.lean_var
    return fixed, Ks, Ksl


def _loads(d: Discrete) -> tuple[np.ndarray, np.ndarray]:
    """The reference load scaled by the load factor and the constant (permanent) load, kernel DOFs."""
    mesh = d.mesh
    x = mesh.x
    mid = 0.5 * (x[:-1] + x[1:])
    n_dof = 3 * mesh.n_nodes
    lat = 3 * np.arange(mesh.n_nodes)
    F_ref = np.zeros(n_dof)
    F_const = np.zeros(n_dof)
    for p in d.column.point_loads:
        node = int(np.argmin(np.abs(x - p.at)))
        (F_const if p.permanent else F_ref)[3 * node + 1] -= p.P
    for q in d.column.distributed_loads:
        sel = (mid > q.bottom) & (mid < q.top)
        tgt = F_const if q.permanent else F_ref
        np.add.at(tgt, 3 * np.flatnonzero(sel) + 1, -0.5 * q.q * mesh.L[sel])
        np.add.at(tgt, 3 * (np.flatnonzero(sel) + 1) + 1, -0.5 * q.q * mesh.L[sel])
    # lateral actions: (w, psi) load vectors mapped to (u_x, theta)
    for f_full, tgt in ((d.f1_lat, F_ref), (d.f0_lat, F_const)):
        tgt[lat] += f_full[0::2]
        tgt[lat + 2] -= f_full[1::2]
    F_ref[lat] += mesh.lean_var * d.w0n
    F_const[lat] += mesh.lean_perm * d.w0n
    return F_ref, F_const


def _path_control(column: Column, d: Discrete, fixed: list[int], method: str, deflection_limit, rotation_limit):
    """The displacement stopping rule and the controlled DOF, at the node of the largest bow.

    For a straight column the middle node is controlled.
    """
    ctrl_node = int(np.argmax(np.abs(d.w0n))) if np.any(d.w0n) else None
    if deflection_limit is None:
        deflection_limit = 0.2 * column.height
    disp_limit = None
    if rotation_limit is not None:
        disp_limit = (2, float(rotation_limit))
    elif ctrl_node is not None and 3 * ctrl_node not in fixed:
        disp_limit = (3 * ctrl_node, float(deflection_limit))
    control_dof = None
    if method == "displacement":
        control_dof = 3 * (ctrl_node if ctrl_node is not None else d.mesh.n_nodes // 2)
    return disp_limit, control_dof


def path_message(r: PathResult, heights: np.ndarray, disp_limit, *, max_steps: int,
                 drop_fraction: float | None) -> str:
    """How the trace ended, in engineering words (the path kernel's own message names its settings).

    Parameters
    ----------
    r : the kernel's result
    heights : (n_nodes,) node heights [m]
    disp_limit : (kernel DOF, value) of the displacement stopping rule, or None
    max_steps, drop_fraction : the stopping rules given to the kernel
    """
    lam = r.load_factors
    last = float(lam[-1]) if lam.size else 0.0
    where = ""
    if disp_limit is not None:
        dof, value = disp_limit
        where = (f"the base rotation reached the stopping limit of {value:.4g} rad" if dof % 3 == 2 else
                 f"the lateral deflection {heights[dof // 3]:.4g} m up reached the stopping limit of {value:.4g} m")
    words = {
        "drop_after_peak": (f"past the ultimate load the load fell to {drop_fraction:g} of its peak, as far as the "
                            "path is followed"
                            if drop_fraction is not None else "past the ultimate load the load fell"),
        "displacement_limit": where or "the deflection reached its stopping limit",
        "lambda_max": f"the load factor reached the largest value asked for ({last:.6g})",
        "max_steps": f"the largest number of steps ({max_steps}, [imperfection] steps) was used",
        "step_failed": (f"no equilibrium was found beyond load factor {last:.6g}, even with the step halved many "
                        "times; the path stops there"),
        "load_control_limit": (f"load control stopped at load factor {last:.6g}: the peak lies just above and load "
                               "control cannot pass it (use method = 'arc-length'); no ultimate load is reported"),
        "bifurcation": ("the column lost stability while the load still rose (a bifurcation, at load factor about "
                        f"{r.bifurcation_load_factor:.6g}): no peak was found; give a bow"
                        if r.bifurcation_load_factor is not None else
                        "the column lost stability while the load still rose (a bifurcation): no peak was found; "
                        "give a bow"),
        "constant_load_failed": "the permanent loads alone could not be carried (they exceed the column's strength "
                                "or a critical load)",
    }
    text = words.get(r.status, r.message)
    if r.status in ("max_steps", "lambda_max", "displacement_limit") and r.limit_load_factor is None:
        text += "; no peak was passed, so no ultimate load is reported"
    elif r.limit_load_factor is not None and r.limit_accuracy is not None and not math.isfinite(r.limit_accuracy):
        text += "; the peak could not be refined: the ultimate load is the highest point reached"
    return text


def _package(r: PathResult, mesh, w0n, sec, n_fib: int, tol: float, message: str | None = None) -> NonlinearPath:
    x = mesh.x
    defl = r.displacements[:, 0::3] + w0n[None, :]
    k = r.limit_index if r.limit_index is not None else len(r.load_factors) - 1
    ctrl = int(np.argmax(np.abs(defl[k])))
    ip_h = x[:-1, None] + mesh.L[:, None] * np.asarray(r.ip_positions)[None, :]
    mid = 0.5 * (x[:-1] + x[1:])
    yf = np.asarray(r.yield_fraction)
    ext = np.full((yf.shape[0], 2), np.nan)
    any_y = yf > 0
    for i in range(yf.shape[0]):
        if np.any(any_y[i]):
            ext[i] = mid[any_y[i]].min(), mid[any_y[i]].max()
    fy_h = fy_off = None
    if r.first_yield_location is not None:
        e, ip, f = r.first_yield_location
        fy_h = float(ip_h[e, ip])
        fy_off = float(-sec.y[e, f]) if hasattr(sec, "y") else None
    return NonlinearPath(
        load_factors=readonly(r.load_factors), heights=readonly(x), bow=readonly(w0n), deflection=readonly(defl),
        rotation=readonly(-np.asarray(r.displacements)[:, 2::3]),
        control_height=float(x[ctrl]), control_deflection=readonly(defl[:, ctrl]), ip_heights=readonly(ip_h),
        axial_force=readonly(-np.asarray(r.axial_force)), bending_moment=readonly(r.bending_moment),
        yield_fraction=readonly(yf), yield_extent=readonly(ext), limit_load_factor=r.limit_load_factor,
        limit_accuracy=r.limit_accuracy, limit_index=r.limit_index,
        first_yield_load_factor=r.first_yield_load_factor, first_yield_bracket=r.first_yield_bracket,
        first_yield_height=fy_h, first_yield_offset=fy_off, status=r.status,
        message=r.message if message is None else message,
        success=bool(r.success), n_elements=int(mesh.n_el), n_fibres=int(n_fib), n_steps=r.n_steps,
        n_iter=r.n_iter, n_bisections=r.n_bisections, max_residual=r.max_residual, tolerance=float(tol))


