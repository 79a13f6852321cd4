"""Cross-section shapes and their properties.

Three layers: :mod:`~fea.sections.geometry` (exact outlines of lines and arcs,
boundary integration), :mod:`~fea.sections.base` (the abstract shape and the
records it computes: :class:`SectionProperties`, :class:`FibreSet`) and
:mod:`~fea.sections.shapes` (the concrete shapes and :data:`SHAPES`).

Every shape is a frozen, validated dataclass built from dimensions in metres.
Its outline is an exact boundary made of straight edges and circular arcs
(fillets, corner radii and circles are *not* discretised).  All area integrals
are boundary integrals (Green's theorem)::

    integral over region of f(v) dA = closed integral of u f(v) dv

evaluated edge by edge with 16-point Gauss-Legendre quadrature.  Along a
straight edge the integrand is a polynomial and the rule is exact; arcs are cut
into pieces of at most 90 degrees, on which the trigonometric integrand is
integrated to round-off.  Wherever the integrand has a kink (a plastic neutral
axis, the edge of a fibre strip) the edge is first cut at the kink, so the
quadrature stays exact.

Coordinate system
-----------------
* ``y`` horizontal (to the right), ``z`` vertical (upward); the origin is the
  lower-left corner of the shape's bounding box.
* ``I_yy = integral (z - z_c)^2 dA`` is the second moment about the horizontal
  centroidal axis (the ``y`` axis), ``I_zz = integral (y - y_c)^2 dA`` about
  the vertical one, ``I_yz = integral (y - y_c)(z - z_c) dA`` the product.
  For an I section standing upright, ``y-y`` is the major axis, as in
  EN 1993-1-1.
* The principal angle ``theta`` [rad] is measured counter-clockwise from the
  ``+y`` axis to the *major* principal axis, ``-pi/2 < theta <= pi/2``.  The
  major axis has direction ``e1 = (cos theta, sin theta)``, the minor axis
  ``e2 = (-sin theta, cos theta)``.  Principal coordinates of a point are
  ``p = (r - r_c).e1`` and ``q = (r - r_c).e2``; bending about the major axis
  strains fibres in proportion to ``q``, bending about the minor axis in
  proportion to ``p``.  When ``I_yy == I_zz`` and ``I_yz == 0`` (square, round)
  every axis is principal and ``theta = 0``.
"""


from .base import Axis, FibreSet, SectionProperties, Shape
from .shapes import (
    SHAPES,
    Angle,
    Channel,
    CircularHollow,
    Cruciform,
    FlangedShape,
    ISection,
    Rectangle,
    RectangularHollow,
    Round,
    Tee,
)
from .thinwall import OpenProfile, OpenProfileResult, TorsionConstants

__all__ = [
    "SectionProperties",
    "FibreSet",
    "Shape",
    "FlangedShape",
    "Axis",
    "Rectangle",
    "Round",
    "RectangularHollow",
    "CircularHollow",
    "ISection",
    "Channel",
    "Angle",
    "Tee",
    "Cruciform",
    "TorsionConstants",
    "OpenProfile",
    "OpenProfileResult",
    "SHAPES",
]
