r"""Section property formulas: exact area, second moments and plastic moduli of the parametric shapes.

The properties are exact for the shape, root radii and corner radii included (derived here; common practice,
no source). A root fillet or the material cut off a rounded corner is a *spandrel*: an r × r square less a
quarter disc of radius r. With its two straight edges on the coordinate axes,

.. math::

    A_s = r^2\left(1 - \frac{\pi}{4}\right), \qquad
    c_s = r\,\frac{10 - 3\pi}{12 - 3\pi}, \qquad
    I_{s,\text{edge}} = r^4\left(1 - \frac{5\pi}{16}\right),

where :math:`c_s` is the distance of its centroid from either straight edge and :math:`I_{s,\text{edge}}`
its second moment about either edge. An I/H section is two flanges, a web and four spandrels added in the
corners; a rectangular hollow section is an outer rounded rectangle less an inner one, each a full rectangle
less four corner spandrels. Every shape here is doubly symmetric, so the plastic modulus is twice the first
moment of the half on one side of the axis, :math:`W_{pl} = 2 S_{1/2}`, and :math:`W_{el} = I / (d/2)` with
d the depth (the extent perpendicular to the bending axis).

Dimensions in m, areas in m², second moments in m⁴, moduli in m³. :mod:`engine.sections` builds a
:class:`engine.sections.Section` from these; the catalogue's dimensions are in :mod:`engine.catalogue`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

__all__ = [
    "AxisProperties",
    "circular_hollow",
    "corner_radii",
    "i_section",
    "rectangular_hollow",
    "rounded_rectangle",
    "solid_rectangle",
    "solid_round",
    "spandrel",
]


def spandrel(r: float) -> tuple[float, float, float]:
    r"""Area, centroid offset and own second moment of one spandrel of radius ``r``.

    A spandrel is an r × r square less the quarter disc of radius r centred on its far corner: a root fillet,
    or what a rounded corner cuts off a rectangle (derived, common practice, no source).

    .. math::

        A_s = r^2 (1 - \pi/4), \quad c_s = r\,\frac{10 - 3\pi}{12 - 3\pi}, \quad
        I_{s,0} = r^4 (1 - 5\pi/16) - A_s c_s^2

    Parameters
    ----------
    r : float
        Radius [m], >= 0.

    Returns
    -------
    area : float
        :math:`A_s` [m²].
    offset : float
        :math:`c_s`, the distance of the centroid from either straight edge [m].
    own_second_moment : float
        :math:`I_{s,0}`, the second moment about the centroidal axis parallel to an edge [m⁴].
    """
    area = r * r * (1.0 - math.pi / 4.0)
    offset = r * (10.0 - 3.0 * math.pi) / (12.0 - 3.0 * math.pi)
    about_edge = r**4 * (1.0 - 5.0 * math.pi / 16.0)
    return area, offset, about_edge - area * offset * offset


@dataclass(frozen=True, kw_only=True)
class AxisProperties:
    """Properties about one axis, before they become a :class:`Section`."""

    I: float  # [m⁴]
    W_el: float  # [m³]
    W_pl: float  # [m³]
    A_v: float  # [m²]
    depth: float  # [m]
    width: float  # [m]
    interaction_a: float | None


def i_section(
    h: float, b: float, tw: float, tf: float, r: float, rolled: bool
) -> tuple[float, AxisProperties, AxisProperties]:
    """Area [m²] and major- and minor-axis properties of a doubly symmetric I/H section.

    Two flanges b × tf, a web tw × (h − 2tf) and four root-radius spandrels of radius r (r = 0 for a welded
    section, whose fillet welds are left out). Shear areas per EN 1993-1-1 §6.2.6(3) (from memory):
    (a) rolled, load parallel to the web, A − 2btf + (tw + 2r)tf but not less than η h_w tw;
    (d) welded, load parallel to the web, η h_w tw; (e) load parallel to the flanges, A − h_w tw (the clause
    names welded sections; it is used for rolled ones too, from memory). η = 1 here, which is conservative.
    """
    hw = h - 2.0 * tf
    fillet, offset, fillet_own = spandrel(r)
    area = 2.0 * b * tf + hw * tw + 4.0 * fillet

    flange_arm = h / 2.0 - tf / 2.0
    fillet_arm_y = h / 2.0 - tf - offset  # fillets hang below the inner face of each flange
    I_y = (
        2.0 * (b * tf**3 / 12.0 + b * tf * flange_arm**2)
        + tw * hw**3 / 12.0
        + 4.0 * (fillet_own + fillet * fillet_arm_y**2)
    )
    half_y = b * tf * flange_arm + tw * (hw / 2.0) ** 2 / 2.0 + 2.0 * fillet * fillet_arm_y

    fillet_arm_z = tw / 2.0 + offset  # fillets stand beside each face of the web
    I_z = 2.0 * tf * b**3 / 12.0 + hw * tw**3 / 12.0 + 4.0 * (fillet_own + fillet * fillet_arm_z**2)
    half_z = 2.0 * tf * (b / 2.0) * (b / 4.0) + hw * (tw / 2.0) * (tw / 4.0) + 2.0 * fillet * fillet_arm_z

    if rolled:
        # The clause's floor η h_w tw never governs with η = 1: this exceeds h_w tw by tw tf + 2r tf + 4A_s.
        shear_y = area - 2.0 * b * tf + (tw + 2.0 * r) * tf
    else:
        shear_y = hw * tw
    shear_z = area - hw * tw
    # EN 1993-1-1 §6.2.9.1(5): a = (A − 2btf)/A <= 0.5 (from memory).
    a = min((area - 2.0 * b * tf) / area, 0.5)
    major = AxisProperties(
        I=I_y, W_el=I_y / (h / 2.0), W_pl=2.0 * half_y, A_v=shear_y, depth=h, width=b, interaction_a=a
    )
    minor = AxisProperties(
        I=I_z, W_el=I_z / (b / 2.0), W_pl=2.0 * half_z, A_v=shear_z, depth=b, width=h, interaction_a=a
    )
    return area, major, minor


def rounded_rectangle(depth: float, width: float, radius: float) -> tuple[float, float, float]:
    """Area [m²], second moment [m⁴] and half-section first moment [m³] of a solid rounded rectangle.

    The rectangle depth × width less four corner spandrels of the given radius, about its centroidal axis
    parallel to ``width``.
    """
    corner, offset, corner_own = spandrel(radius)
    arm = depth / 2.0 - offset
    area = depth * width - 4.0 * corner
    second_moment = width * depth**3 / 12.0 - 4.0 * (corner_own + corner * arm**2)
    half_moment = width * depth**2 / 8.0 - 2.0 * corner * arm
    return area, second_moment, half_moment


def corner_radii(t: float, manufacture: str) -> tuple[float, float]:
    """Outer and inner corner radii [m] of a rectangular hollow section of wall ``t`` [m].

    Hot-finished, EN 10210-2: r_o = 1.5t, r_i = 1.0t (references.md §5, text).
    Cold-formed, EN 10219-2: r_o = 2t for t <= 6 mm, 2.5t for 6 < t <= 10 mm, 3t above; r_i = r_o − t
    (from memory; the t <= 6 mm rule is in references.md §5).
    """
    if manufacture == "hot-finished":
        return 1.5 * t, 1.0 * t
    slack = 1e-9  # [m] so that 0.006 read from a file counts as 6 mm
    if t <= 0.006 + slack:
        outer = 2.0 * t
    elif t <= 0.010 + slack:
        outer = 2.5 * t
    else:
        outer = 3.0 * t
    return outer, outer - t


def rectangular_hollow(
    h: float, b: float, t: float, manufacture: str
) -> tuple[float, AxisProperties, AxisProperties]:
    """Area [m²] and major- and minor-axis properties of a rectangular hollow section.

    Outer rounded rectangle h × b (radius r_o) less the inner one (h − 2t) × (b − 2t) (radius r_i).
    Shear areas per EN 1993-1-1 §6.2.6(3)(f) (from memory): A h/(b + h) for load parallel to the depth,
    A b/(b + h) parallel to the width. Interaction per §6.2.9.1(5) (from memory): a_w = (A − 2bt)/A for the
    major axis, a_f = (A − 2ht)/A for the minor, each <= 0.5.
    """
    outer, inner = corner_radii(t, manufacture)
    area_o, I_y_o, half_y_o = rounded_rectangle(h, b, outer)
    area_i, I_y_i, half_y_i = rounded_rectangle(h - 2.0 * t, b - 2.0 * t, inner)
    _, I_z_o, half_z_o = rounded_rectangle(b, h, outer)
    _, I_z_i, half_z_i = rounded_rectangle(b - 2.0 * t, h - 2.0 * t, inner)
    area = area_o - area_i
    I_y = I_y_o - I_y_i
    I_z = I_z_o - I_z_i
    major = AxisProperties(
        I=I_y,
        W_el=I_y / (h / 2.0),
        W_pl=2.0 * (half_y_o - half_y_i),
        A_v=area * h / (b + h),
        depth=h,
        width=b,
        interaction_a=min((area - 2.0 * b * t) / area, 0.5),
    )
    minor = AxisProperties(
        I=I_z,
        W_el=I_z / (b / 2.0),
        W_pl=2.0 * (half_z_o - half_z_i),
        A_v=area * b / (b + h),
        depth=b,
        width=h,
        interaction_a=min((area - 2.0 * h * t) / area, 0.5),
    )
    return area, major, minor


def circular_hollow(D: float, t: float) -> tuple[float, AxisProperties]:
    r"""Area [m²] and properties of a circular hollow section, the same about every axis.

    .. math::

        A = \frac{\pi}{4}(D^2 - d^2), \quad I = \frac{\pi}{64}(D^4 - d^4), \quad
        W_{pl} = \frac{D^3 - d^3}{6}, \quad d = D - 2t

    Shear area 2A/π, EN 1993-1-1 §6.2.6(3)(g) (from memory).
    """
    d = D - 2.0 * t
    area = math.pi / 4.0 * (D * D - d * d)
    I = math.pi / 64.0 * (D**4 - d**4)
    props = AxisProperties(
        I=I,
        W_el=I / (D / 2.0),
        W_pl=(D**3 - d**3) / 6.0,
        A_v=2.0 * area / math.pi,
        depth=D,
        width=D,
        interaction_a=None,
    )
    return area, props


def solid_rectangle(depth: float, width: float) -> AxisProperties:
    """Properties of a solid rectangle bending in the plane of ``depth``.

    I = width·depth³/12, W_pl = width·depth²/4. Shear area 2A/3, from τ_max = 1.5 V/A of the parabolic shear
    stress (common practice, no source).
    """
    area = depth * width
    I = width * depth**3 / 12.0
    return AxisProperties(
        I=I,
        W_el=I / (depth / 2.0),
        W_pl=width * depth**2 / 4.0,
        A_v=2.0 * area / 3.0,
        depth=depth,
        width=width,
        interaction_a=None,
    )


def solid_round(D: float) -> tuple[float, AxisProperties]:
    """Area [m²] and properties of a solid round bar.

    A = πD²/4, I = πD⁴/64, W_pl = D³/6. Shear area 3A/4, from τ_max = 4V/(3A) (common practice, no source).
    """
    area = math.pi * D * D / 4.0
    I = math.pi * D**4 / 64.0
    props = AxisProperties(
        I=I, W_el=I / (D / 2.0), W_pl=D**3 / 6.0, A_v=0.75 * area, depth=D, width=D, interaction_a=None
    )
    return area, props
