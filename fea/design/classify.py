"""Cross-section classification for the member checks with bending: EN 1993-1-1 Table 5.2, AISC 360 Table B4.1.

Pure kernel (SI floats, no I/O): a section shape of :mod:`fea.sections` and the yield strength in, the class of
every plate element and of the section out, each element with its width-to-thickness ratio, its limits and
the rule that gave them.  The member checks with bending take classes 1 to 3 (EN 1993-1-1) or compact sections
(AISC 360); a class 4 (slender) section is "not verified" (local buckling is not covered).

EN 1993-1-1:2005 Table 5.2 (from memory; ``epsilon = sqrt(235 MPa / fy)``)
---------------------------------------------------------------------------
* Internal parts (an I web, the walls of a rectangular hollow section):
  in compression throughout: ``c/t <= 33, 38, 42 epsilon`` for classes 1, 2, 3;
  in bending and compression (the web of a section bent about its major axis, with ``N_Ed``):
  classes 1 and 2 with the plastic stress block, ``alpha`` the compressed share of ``c``:
  ``alpha > 0.5``: ``396 epsilon / (13 alpha - 1)`` and ``456 epsilon / (13 alpha - 1)``;
  ``alpha <= 0.5``: ``36 epsilon / alpha`` and ``41.5 epsilon / alpha``;
  class 3 with the elastic stress ratio ``psi = sigma_2 / sigma_1`` at the ends of ``c``:
  ``psi > -1``: ``42 epsilon / (0.67 + 0.33 psi)``; ``psi <= -1``: ``62 epsilon (1 - psi) sqrt(-psi)``.
  For a doubly symmetric web the plastic neutral axis gives ``alpha = 0.5 (1 + N_Ed / (fy c t_w))``
  (``t_w`` the total web thickness: two walls of a hollow section), at most 1 (common practice).
* Outstand flanges (an I or channel flange), taken in uniform compression (conservative under minor-axis
  bending, whose stress gradient the table would reward): ``c/t <= 9, 10, 14 epsilon``.
* Circular hollow sections: ``d/t <= 50, 70, 90 epsilon^2``.
* Widths: rolled I and channel webs ``c = h - 2 t_f - 2 r``, I flanges ``c = (b - t_w - 2 r) / 2``, channel
  flanges ``c = b - t_w - r`` (a section without root radii, ``r = 0``, is taken as welded with the welds left
  out: conservative); rectangular hollow sections ``c = b - 3 t`` and ``h - 3 t`` (the table's note for
  rolled hollow sections).  Solid rectangles and rounds are class 1.

AISC 360-16 Table B4.1 (from memory; ``lambda`` the width-to-thickness ratio)
---------------------------------------------------------------------------
* B4.1b, flexure (compact limit ``lambda_p``, noncompact limit ``lambda_r``): I flanges ``b_f / (2 t_f)``:
  ``0.38``, ``1.0 sqrt(E/F_y)``; I webs ``h / t_w`` (``h = d - 2 t_f - 2 r``): ``3.76``, ``5.70 sqrt(E/F_y)``;
  rectangular HSS flanges ``b/t``: ``1.12``, ``1.40 sqrt(E/F_y)``, webs ``h/t``: ``2.42``, ``5.70 sqrt(E/F_y)``
  (``b = B - 3 t``, ``h = H - 3 t`` when the corner radius is not known); round HSS ``D/t``: ``0.07``,
  ``0.31 E/F_y``.
* B4.1a, compression (slender beyond ``lambda_r``): I flanges ``0.56 sqrt(E/F_y)``, I webs
  ``1.49 sqrt(E/F_y)``, rectangular HSS walls ``1.40 sqrt(E/F_y)``, round HSS ``0.11 E/F_y``.
* The design wall thickness of welded HSS (``0.93 t``, B4.2) is not applied: give the design thickness.

A section is "compact" when every element is compact in flexure and none is slender in compression; the
checks with bending of AISC 360 here cover compact sections only.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

from ..errors import ModelError

__all__ = ["ElementClass", "SectionClass", "en1993_class", "aisc360_class", "EN_REF", "AISC_REF", "CLASSIFIED"]

EN_REF = "EN 1993-1-1 Table 5.2"
AISC_REF = "AISC 360 Table B4.1"
#: Section kinds the classification knows (the others are "not classified").
CLASSIFIED = ("i_section", "channel", "rectangular_hollow", "circular_hollow", "rectangle", "round")
#: AISC 360 class words, mapped on EN's numbers for the member checks (compact ~ class 1-2).
AISC_WORDS = {1: "compact", 3: "noncompact", 4: "slender"}


@dataclass(frozen=True)
class ElementClass:
    """One plate element of a section.

    Attributes
    ----------
    element : which element ("web", "flange", "walls b", "wall", ...)
    stress : how it is stressed ("compression", "bending and compression", "flexure", ...)
    c, t : width and thickness [m] (``d`` and ``t`` for a round tube)
    ratio : ``c / t`` (``d / t``) [-]
    limits : the limits of classes 1, 2, 3 (EN) or lambda_p, lambda_r (AISC) [-]
    section_class : 1, 2, 3 or 4 (AISC: 1 compact, 3 noncompact, 4 slender)
    rule : the rule and its parameters in words
    """

    element: str
    stress: str
    c: float
    t: float
    ratio: float
    limits: tuple[float, ...]
    section_class: int
    rule: str


@dataclass(frozen=True)
class SectionClass:
    """The class of a section: the worst of its elements.

    Attributes
    ----------
    standard : "EN 1993-1-1" or "AISC 360"
    section_class : 1 to 4 (AISC: 1 compact, 3 noncompact, 4 slender)
    word : "class 2", "compact", ...
    elements : every element classified
    governing : the element that gives the class ("" for a solid section)
    epsilon : EN ``sqrt(235 MPa / fy)``; AISC ``sqrt(E / F_y)`` [-]
    source : the table (from memory)
    notes : assumptions in words
    """

    standard: str
    section_class: int
    word: str
    elements: tuple[ElementClass, ...]
    governing: str
    epsilon: float
    source: str
    notes: tuple[str, ...] = ()


def _dims(shape: Any) -> tuple[str, dict[str, float]]:
    kind = getattr(type(shape), "kind", "")
    names = ("b", "h", "tf", "tw", "r", "t", "d", "r_out")
    return kind, {n: float(getattr(shape, n)) for n in names if isinstance(getattr(shape, n, None), (int, float))}


def _en_class(ratio: float, limits: tuple[float, float, float]) -> int:
    return next((k + 1 for k, lim in enumerate(limits) if ratio <= lim), 4)


def _en_internal(name: str, c: float, t: float, eps: float, alpha: float | None, psi: float) -> ElementClass:
    """An internal part: in compression throughout (alpha None, psi = 1) or in bending and compression."""
    if alpha is None or alpha >= 1.0:
        limits = (33 * eps, 38 * eps, 42 * eps)
        stress, rule = "compression", "internal part in compression: 33, 38, 42 epsilon"
    else:
        if alpha > 0.5:
            l1, l2 = 396 * eps / (13 * alpha - 1), 456 * eps / (13 * alpha - 1)
            rule = f"alpha = {alpha:.3f} > 0.5: 396 epsilon / (13 alpha - 1), 456 epsilon / (13 alpha - 1)"
        else:
            l1, l2 = 36 * eps / alpha, 41.5 * eps / alpha
            rule = f"alpha = {alpha:.3f} <= 0.5: 36 epsilon / alpha, 41.5 epsilon / alpha"
        if psi > -1:
            l3 = 42 * eps / (0.67 + 0.33 * psi)
            rule += f"; psi = {psi:.3f} > -1: 42 epsilon / (0.67 + 0.33 psi)"
        else:
            l3 = 62 * eps * (1 - psi) * math.sqrt(-psi)
            rule += f"; psi = {psi:.3f} <= -1: 62 epsilon (1 - psi) sqrt(-psi)"
        limits = (l1, l2, max(l3, l2))
        stress = "bending and compression"
    ratio = c / t
    return ElementClass(name, stress, c, t, ratio, limits, _en_class(ratio, limits), rule)


def _en_outstand(name: str, c: float, t: float, eps: float) -> ElementClass:
    limits = (9 * eps, 10 * eps, 14 * eps)
    return ElementClass(name, "compression", c, t, c / t, limits, _en_class(c / t, limits),
                        "outstand flange in compression: 9, 10, 14 epsilon")


def en1993_class(shape: Any, fy: float, N_Ed: float = 0.0, M_y_Ed: float = 0.0, A: float | None = None,
                 I_y: float | None = None) -> SectionClass:
    """The class of ``shape`` by EN 1993-1-1 Table 5.2 (from memory; module notes).

    Parameters
    ----------
    shape : a section of :mod:`fea.sections` (its ``kind`` and dimensions) [m]
    fy : yield strength [Pa]
    N_Ed : design compression [N] (>= 0); with ``M_y_Ed`` it sets the web's stress distribution
    M_y_Ed : design moment about the major axis [N m] (>= 0); 0: the web is in compression throughout
    A, I_y : area [m^2] and major second moment [m^4] for the elastic stress ratio psi of the web (class 3
        limit); needed when ``M_y_Ed > 0``

    Returns
    -------
    SectionClass
    """
    if not (math.isfinite(fy) and fy > 0):
        raise ModelError("fy", f"{fy!r} Pa is not valid; expected a yield strength > 0")
    kind, d = _dims(shape)
    eps = math.sqrt(235e6 / fy)
    notes = [f"epsilon = sqrt(235 MPa / fy) = {eps:.4f}"]
    elements: list[ElementClass] = []
    if kind in ("rectangle", "round"):
        return SectionClass("EN 1993-1-1", 1, "class 1", (), "", eps, EN_REF, ("solid section: no local buckling",))
    bent = M_y_Ed > 0 and N_Ed >= 0

    def web(name: str, c: float, t_total: float, t: float) -> ElementClass:
        if not bent:
            return _en_internal(name, c, t, eps, None, 1.0)
        alpha = min(0.5 * (1.0 + N_Ed / (fy * c * t_total)), 1.0)
        if A is None or I_y is None:
            raise ModelError("I_y", "missing: the stress ratio of the web needs A and I_y")
        s_n, s_m = N_Ed / A, M_y_Ed * 0.5 * c / I_y
        psi = (s_n - s_m) / (s_n + s_m)
        return _en_internal(name, c, t, eps, alpha, psi)

    if kind in ("i_section", "channel"):
        b, h, tf, tw, r = d["b"], d["h"], d["tf"], d["tw"], d.get("r", 0.0)
        elements.append(web("web", h - 2 * tf - 2 * r, tw, tw))
        c_f = (b - tw - 2 * r) / 2 if kind == "i_section" else b - tw - r
        elements.append(_en_outstand("flange", c_f, tf, eps))
        if r == 0:
            notes.append("no root radius: widths taken without welds (conservative)")
        notes.append("flange outstands taken in uniform compression (conservative under minor-axis bending)")
    elif kind == "rectangular_hollow":
        b, h, t = d["b"], d["h"], d["t"]
        elements.append(_en_internal("walls b (flanges)", b - 3 * t, t, eps, None, 1.0))
        elements.append(web("walls h (webs)", h - 3 * t, 2 * t, t))
        notes.append("c = b - 3 t and h - 3 t (Table 5.2 note for rolled hollow sections)")
    elif kind == "circular_hollow":
        dd, t = d["d"], d["t"]
        limits = (50 * eps**2, 70 * eps**2, 90 * eps**2)
        elements.append(ElementClass("wall", "compression and bending", dd, t, dd / t, limits,
                                     _en_class(dd / t, limits), "tube: d/t <= 50, 70, 90 epsilon^2"))
    else:
        raise ModelError("section.shape", f"{kind or 'a section given by its properties'!r}: EN 1993-1-1 Table 5.2 "
                                          "is applied here to I sections, channels and hollow sections only")
    if bent:
        notes.append("web in bending and compression: alpha from the plastic stress block with N_Ed (classes 1, 2), "
                     "psi from the elastic stresses of N_Ed and M_y,Ed at the ends of c (class 3)")
    gov = max(elements, key=lambda e: (e.section_class, e.ratio / e.limits[min(e.section_class, 3) - 1]))
    cls = gov.section_class
    return SectionClass("EN 1993-1-1", cls, f"class {cls}", tuple(elements), gov.element, eps, EN_REF, tuple(notes))


def aisc360_class(shape: Any, Fy: float, E: float) -> SectionClass:
    """Compact, noncompact or slender by AISC 360-16 Table B4.1 (from memory; module notes): flexure (B4.1b) and
    compression (B4.1a, slender elements only).

    Returns
    -------
    SectionClass
        ``section_class`` 1 (compact), 3 (noncompact in flexure) or 4 (slender in flexure or compression).
    """
    if not (math.isfinite(Fy) and Fy > 0 and math.isfinite(E) and E > 0):
        raise ModelError("fy", f"{Fy!r} Pa, E = {E!r} Pa: expected positive values")
    kind, d = _dims(shape)
    root = math.sqrt(E / Fy)
    elements: list[ElementClass] = []
    notes: list[str] = []

    def element(name: str, c: float, t: float, lp: float, lr: float, lc: float, words: str) -> None:
        ratio = c / t
        cls = 1 if ratio <= lp else 3 if ratio <= lr else 4
        if ratio > lc:
            cls = 4
        elements.append(ElementClass(name, "flexure and compression", c, t, ratio, (lp, lr, lc), cls, words))

    if kind in ("rectangle", "round"):
        return SectionClass("AISC 360", 1, "compact", (), "", root, AISC_REF, ("solid section: no local buckling",))
    if kind in ("i_section", "channel"):
        b, h, tf, tw, r = d["b"], d["h"], d["tf"], d["tw"], d.get("r", 0.0)
        bf = b / 2 if kind == "i_section" else b
        element("flange", bf, tf, 0.38 * root, 1.0 * root, 0.56 * root,
                "flange: compact 0.38 sqrt(E/Fy), noncompact 1.0 sqrt(E/Fy); compression 0.56 sqrt(E/Fy)")
        element("web", h - 2 * tf - 2 * r, tw, 3.76 * root, 5.70 * root, 1.49 * root,
                "web: compact 3.76 sqrt(E/Fy), noncompact 5.70 sqrt(E/Fy); compression 1.49 sqrt(E/Fy)")
    elif kind == "rectangular_hollow":
        b, h, t = d["b"], d["h"], d["t"]
        element("walls b (flanges)", b - 3 * t, t, 1.12 * root, 1.40 * root, 1.40 * root,
                "HSS flange: compact 1.12 sqrt(E/Fy), noncompact 1.40 sqrt(E/Fy); compression 1.40 sqrt(E/Fy)")
        element("walls h (webs)", h - 3 * t, t, 2.42 * root, 5.70 * root, 1.40 * root,
                "HSS web: compact 2.42 sqrt(E/Fy), noncompact 5.70 sqrt(E/Fy); compression 1.40 sqrt(E/Fy)")
        notes.append("b = B - 3 t, h = H - 3 t (corner radius taken as unknown); the design wall thickness is the one "
                     "given")
    elif kind == "circular_hollow":
        dd, t = d["d"], d["t"]
        element("wall", dd, t, 0.07 * E / Fy, 0.31 * E / Fy, 0.11 * E / Fy,
                "round HSS: compact 0.07 E/Fy, noncompact 0.31 E/Fy; compression 0.11 E/Fy")
    else:
        raise ModelError("section.shape", f"{kind or 'a section given by its properties'!r}: AISC 360 Table B4.1 "
                                          "is applied here to I sections, channels and hollow sections only")
    gov = max(elements, key=lambda e: (e.section_class, e.ratio / e.limits[0]))
    cls = gov.section_class
    return SectionClass("AISC 360", cls, AISC_WORDS[cls], tuple(elements), gov.element, root, AISC_REF, tuple(notes))
