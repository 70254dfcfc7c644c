r"""Cross-sections: exact area, second moment, elastic and plastic moduli and shear area of one member.

A section is a frozen, keyword-only value object holding the properties about **one** bending axis, the
axis the member bends about in the analysis. :func:`section_from_spec` builds it from what a case file holds
under ``"section"`` (SI metres), either a catalogue name or a shape with its dimensions::

    {"name": "HEB 200"}
    {"shape": "rolled_i", "h": 0.2, "b": 0.1, "tw": 0.0056, "tf": 0.0085, "r": 0.012}
    {"shape": "welded_i", "h": 0.6, "b": 0.25, "tw": 0.008, "tf": 0.015}
    {"shape": "rhs", "h": 0.15, "b": 0.1, "t": 0.0063, "manufacture": "hot-finished"}
    {"shape": "chs", "D": 0.1143, "t": 0.005}
    {"shape": "rectangle", "b": 0.045, "h": 0.195}
    {"shape": "round", "D": 0.03}
    {"shape": "custom", "A": 2.8e-3, "I": 1.9e-5, "W_el": 1.9e-4, "W_pl": 2.2e-4}

Every bad input is a :class:`engine.errors.CaseError` naming the field, the value received and what is
allowed, e.g. ``section.tf: 0.3 m must be less than h/2 = 0.1 m``.

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

Axes: ``"major"`` bends about the axis parallel to the flanges of an I/H section (y–y, depth h); ``"minor"``
about the axis along the web (z–z, depth b). For a rectangle or RHS, ``"major"`` bends in the plane of h,
whichever of h and b is larger, as the case file gives them.
"""

from __future__ import annotations

import difflib
import math
import numbers
import re
from collections.abc import Iterator, Mapping
from contextlib import contextmanager
from dataclasses import dataclass, field
from typing import Any

from engine.case import _is_bool, _quoted, _show  # one wording for every field message
from engine.errors import CaseError

__all__ = [
    "AXES",
    "MANUFACTURES",
    "SHAPES",
    "Section",
    "catalogue_names",
    "normalise_name",
    "section_from_spec",
]

#: The shapes a section may have.
SHAPES: tuple[str, ...] = ("rolled_i", "welded_i", "rhs", "chs", "rectangle", "round", "custom")
#: How a section may be made. It sets the buckling curve, not the properties (except an RHS's corners).
MANUFACTURES: tuple[str, ...] = ("rolled", "welded", "hot-finished", "cold-formed", "solid", "custom")
#: The bending axes a section may be used about.
AXES: tuple[str, ...] = ("major", "minor")

_HOLLOW_MANUFACTURES = ("hot-finished", "cold-formed")

# Dimensions above this are almost surely millimetres typed as metres; the message says so.
_MAX_DIMENSION = 10.0  # [m]
# Relative slack for the consistency checks of a section's properties (rounding in a file or a formula).
_RELATIVE_SLACK = 1e-9

# The keys of each shape's spec: (required, optional), in the order the messages list them.
_SPEC_KEYS: dict[str, tuple[tuple[str, ...], tuple[str, ...]]] = {
    "rolled_i": (("h", "b", "tw", "tf", "r"), ()),
    "welded_i": (("h", "b", "tw", "tf"), ("a",)),
    "rhs": (("h", "b", "t", "manufacture"), ()),
    "chs": (("D", "t"), ("manufacture",)),
    "rectangle": (("b", "h"), ()),
    "round": (("D",), ()),
    "custom": (
        ("A", "I", "W_el", "W_pl"),
        ("A_v", "t_max", "depth", "width", "doubly_symmetric", "open_section"),
    ),
}


# ----------------------------------------------------------------------------- helpers


def _g(value: float) -> str:
    """Format a limit for a message, six significant figures."""
    return f"{value:.6g}"


def _positive(path: str, value: Any, unit: str, maximum: float | None = None) -> float:
    """Check that ``value`` is a finite real number > 0 (and <= ``maximum``) and return it as a float."""
    allowed = f"it must be a finite number > 0 {unit}"
    if maximum is not None:
        allowed = f"it must be a finite number > 0 and <= {maximum:g} {unit}"
    if _is_bool(value):
        raise CaseError(f"{path}: {value!r} is a boolean, not a number; {allowed}")
    if not isinstance(value, numbers.Real):
        raise CaseError(f"{path}: {_show(value)} is not a number; {allowed}")
    try:
        number = float(value)
    except (OverflowError, ValueError):
        raise CaseError(f"{path}: {_show(value)} is too large for a float; {allowed}") from None
    if not math.isfinite(number):
        raise CaseError(f"{path}: {number!r} {unit} is not finite; {allowed}")
    if number <= 0.0:
        raise CaseError(f"{path}: {number!r} {unit} must be > 0")
    if maximum is not None and number > maximum:
        raise CaseError(
            f"{path}: {number!r} {unit} must be <= {maximum:g} {unit} "
            f"(dimensions are in metres: 200 mm is 0.2)"
        )
    return number


def _flag(path: str, value: Any) -> bool:
    if not _is_bool(value):
        raise CaseError(f"{path}: {_show(value)} is not allowed; it must be true or false")
    return bool(value)


def _choice(path: str, value: Any, choices: tuple[str, ...], what: str) -> str:
    if not isinstance(value, str) or value not in choices:
        raise CaseError(
            f"{path}: {_show(value)} is not {what}{_suggestion(value, choices)}; allowed: {_quoted(choices)}"
        )
    return value


def _suggestion(word: Any, choices: tuple[str, ...] | list[str], n: int = 1) -> str:
    """Return `` (did you mean 'x'?)`` for the nearest choices, or an empty string."""
    if not isinstance(word, str):
        return ""
    lowered = {choice.lower(): choice for choice in choices}
    matches = difflib.get_close_matches(word.lower(), list(lowered), n=n, cutoff=0.6)
    if not matches:
        return ""
    return f" (did you mean {' or '.join(repr(lowered[m]) for m in matches)}?)"


def _mm(value: float) -> str:
    """A length [m] in millimetres for a section's description."""
    return f"{value * 1000.0:.6g}"


@contextmanager
def _within(prefix: str) -> Iterator[None]:
    """Re-raise a CaseError from a section's own validation with the spec's path in front."""
    try:
        yield
    except CaseError as error:
        raise CaseError(f"{prefix}.{error}") from None


# ----------------------------------------------------------------------------- geometry


def _spandrel(r: float) -> tuple[float, float, float]:
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
class _AxisProperties:
    """Properties about one axis, before they become a :class:`Section`."""

    I: float  # [m⁴]
    W_el: float  # [m³]
    W_pl: float  # [m³]
    A_v: float  # [m²]
    depth: float  # [m]
    width: float  # [m]
    interaction_a: float | None


def _i_section(
    h: float, b: float, tw: float, tf: float, r: float, rolled: bool
) -> tuple[float, _AxisProperties, _AxisProperties]:
    """Area [m²] and major- and minor-axis properties of a doubly symmetric I/H section.

    Two flanges b × tf, a web tw × (h − 2tf) and four root-radius spandrels of radius r (r = 0 for a welded
    section, whose fillet welds are left out). Shear areas per EN 1993-1-1 §6.2.6(3) (from memory):
    (a) rolled, load parallel to the web, A − 2btf + (tw + 2r)tf but not less than η h_w tw;
    (d) welded, load parallel to the web, η h_w tw; (e) load parallel to the flanges, A − h_w tw (the clause
    names welded sections; it is used for rolled ones too, from memory). η = 1 here, which is conservative.
    """
    hw = h - 2.0 * tf
    fillet, offset, fillet_own = _spandrel(r)
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
    major = _AxisProperties(
        I=I_y, W_el=I_y / (h / 2.0), W_pl=2.0 * half_y, A_v=shear_y, depth=h, width=b, interaction_a=a
    )
    minor = _AxisProperties(
        I=I_z, W_el=I_z / (b / 2.0), W_pl=2.0 * half_z, A_v=shear_z, depth=b, width=h, interaction_a=a
    )
    return area, major, minor


def _rounded_rectangle(depth: float, width: float, radius: float) -> tuple[float, float, float]:
    """Area [m²], second moment [m⁴] and half-section first moment [m³] of a solid rounded rectangle.

    The rectangle depth × width less four corner spandrels of the given radius, about its centroidal axis
    parallel to ``width``.
    """
    corner, offset, corner_own = _spandrel(radius)
    arm = depth / 2.0 - offset
    area = depth * width - 4.0 * corner
    second_moment = width * depth**3 / 12.0 - 4.0 * (corner_own + corner * arm**2)
    half_moment = width * depth**2 / 8.0 - 2.0 * corner * arm
    return area, second_moment, half_moment


def _corner_radii(t: float, manufacture: str) -> tuple[float, float]:
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


def _rectangular_hollow(
    h: float, b: float, t: float, manufacture: str
) -> tuple[float, _AxisProperties, _AxisProperties]:
    """Area [m²] and major- and minor-axis properties of a rectangular hollow section.

    Outer rounded rectangle h × b (radius r_o) less the inner one (h − 2t) × (b − 2t) (radius r_i).
    Shear areas per EN 1993-1-1 §6.2.6(3)(f) (from memory): A h/(b + h) for load parallel to the depth,
    A b/(b + h) parallel to the width. Interaction per §6.2.9.1(5) (from memory): a_w = (A − 2bt)/A for the
    major axis, a_f = (A − 2ht)/A for the minor, each <= 0.5.
    """
    outer, inner = _corner_radii(t, manufacture)
    area_o, I_y_o, half_y_o = _rounded_rectangle(h, b, outer)
    area_i, I_y_i, half_y_i = _rounded_rectangle(h - 2.0 * t, b - 2.0 * t, inner)
    _, I_z_o, half_z_o = _rounded_rectangle(b, h, outer)
    _, I_z_i, half_z_i = _rounded_rectangle(b - 2.0 * t, h - 2.0 * t, inner)
    area = area_o - area_i
    I_y = I_y_o - I_y_i
    I_z = I_z_o - I_z_i
    major = _AxisProperties(
        I=I_y,
        W_el=I_y / (h / 2.0),
        W_pl=2.0 * (half_y_o - half_y_i),
        A_v=area * h / (b + h),
        depth=h,
        width=b,
        interaction_a=min((area - 2.0 * b * t) / area, 0.5),
    )
    minor = _AxisProperties(
        I=I_z,
        W_el=I_z / (b / 2.0),
        W_pl=2.0 * (half_z_o - half_z_i),
        A_v=area * b / (b + h),
        depth=b,
        width=h,
        interaction_a=min((area - 2.0 * h * t) / area, 0.5),
    )
    return area, major, minor


def _circular_hollow(D: float, t: float) -> tuple[float, _AxisProperties]:
    r"""Area [m²] and properties of a circular hollow section, the same about every axis.

    .. math::

        A = \frac{\pi}{4}(D^2 - d^2), \quad I = \frac{\pi}{64}(D^4 - d^4), \quad
        W_{pl} = \frac{D^3 - d^3}{6}, \quad d = D - 2t

    Shear area 2A/π, EN 1993-1-1 §6.2.6(3)(g) (from memory).
    """
    d = D - 2.0 * t
    area = math.pi / 4.0 * (D * D - d * d)
    I = math.pi / 64.0 * (D**4 - d**4)
    props = _AxisProperties(
        I=I,
        W_el=I / (D / 2.0),
        W_pl=(D**3 - d**3) / 6.0,
        A_v=2.0 * area / math.pi,
        depth=D,
        width=D,
        interaction_a=None,
    )
    return area, props


def _solid_rectangle(depth: float, width: float) -> _AxisProperties:
    """Properties of a solid rectangle bending in the plane of ``depth``.

    I = width·depth³/12, W_pl = width·depth²/4. Shear area 2A/3, from τ_max = 1.5 V/A of the parabolic shear
    stress (common practice, no source).
    """
    area = depth * width
    I = width * depth**3 / 12.0
    return _AxisProperties(
        I=I,
        W_el=I / (depth / 2.0),
        W_pl=width * depth**2 / 4.0,
        A_v=2.0 * area / 3.0,
        depth=depth,
        width=width,
        interaction_a=None,
    )


def _solid_round(D: float) -> tuple[float, _AxisProperties]:
    """Area [m²] and properties of a solid round bar.

    A = πD²/4, I = πD⁴/64, W_pl = D³/6. Shear area 3A/4, from τ_max = 4V/(3A) (common practice, no source).
    """
    area = math.pi * D * D / 4.0
    I = math.pi * D**4 / 64.0
    props = _AxisProperties(
        I=I, W_el=I / (D / 2.0), W_pl=D**3 / 6.0, A_v=0.75 * area, depth=D, width=D, interaction_a=None
    )
    return area, props


# ----------------------------------------------------------------------------- the section


@dataclass(frozen=True, kw_only=True)
class Section:
    r"""The properties of a member's cross-section about the axis it bends about.

    Build one with :func:`section_from_spec`. Change it with :func:`dataclasses.replace`, which validates the
    new section again (so changing ``I`` needs a matching ``i``).

    Parameters
    ----------
    name : str
        The catalogue name, e.g. ``"IPE 200"``, or a description in millimetres, e.g.
        ``"rolled I 200×100×5.6×8.5 r12"``.
    shape : str
        One of :data:`SHAPES`.
    manufacture : str
        One of :data:`MANUFACTURES`: how it is made, which sets its buckling curve.
    axis : str
        ``"major"`` or ``"minor"``: the axis that every property below is about.
    A : float
        Area [m²].
    I : float
        Second moment of area about the axis [m⁴].
    W_el : float
        Elastic section modulus about the axis, I over the distance to the extreme fibre [m³].
    W_pl : float
        Plastic section modulus about the axis [m³].
    i : float
        Radius of gyration, :math:`\sqrt{I/A}` [m].
    A_v : float
        Shear area for shear in the plane of bending [m²], EN 1993-1-1 §6.2.6(3) (from memory) for steel
        shapes, the parabolic shear stress for solids (common practice, no source).
    depth : float or None
        Extent perpendicular to the bending axis [m] (h for the major axis of an I); None when unknown
        (a custom section given without it).
    width : float or None
        The other extent [m]; None when unknown.
    t_max : float or None
        The thickness that sets the yield strength [m]: the thickest plate of an I/H (the flange of every
        rolled one), the wall of a hollow section, the smaller side of a solid rectangle, the diameter of a
        round bar; None when unknown.
    doubly_symmetric : bool
        Whether both axes are axes of symmetry.
    open_section : bool
        True for a thin-walled open section (I/H), for which lateral-torsional buckling matters in
        major-axis bending. A solid rectangle is not open in this sense, though a deep narrow one can still
        buckle laterally.
    h_over_b : float or None
        h/b of an I/H section (it picks the buckling curve, EN 1993-1-1 Table 6.2), else None.
    interaction_a : float or None
        EN 1993-1-1 §6.2.9.1(5) (from memory): a = (A − 2btf)/A <= 0.5 for I/H; for an RHS
        a_w = (A − 2bt)/A (major axis) or a_f = (A − 2ht)/A (minor axis), <= 0.5; None otherwise.
    dimensions : dict
        The dimensions used [m], keys as in the spec (an RHS adds its corner radii ``r_o`` and ``r_i``).
    source : str
        Where the dimensions and properties come from, with "from memory" where so.

    Raises
    ------
    CaseError
        For a value of the wrong type, a property that is not finite and positive, or properties that no
        section can have together: i ≠ √(I/A), W_pl < W_el, W_pl > A·i, A_v > A, or W_el > 2I/depth.
    """

    name: str
    shape: str
    manufacture: str
    axis: str
    A: float
    I: float
    W_el: float
    W_pl: float
    i: float
    A_v: float
    depth: float | None
    width: float | None
    t_max: float | None
    doubly_symmetric: bool
    open_section: bool
    h_over_b: float | None
    interaction_a: float | None
    dimensions: dict = field(hash=False)
    source: str

    def __post_init__(self) -> None:
        if not isinstance(self.name, str) or not self.name:
            raise CaseError(f"name: {_show(self.name)} is not allowed; it must be a non-empty string")
        if not isinstance(self.source, str):
            raise CaseError(f"source: {_show(self.source)} is not allowed; it must be a string")
        _choice("shape", self.shape, SHAPES, "a shape")
        _choice("manufacture", self.manufacture, MANUFACTURES, "a manufacture")
        _choice("axis", self.axis, AXES, "an axis")
        units = {"A": "m²", "I": "m⁴", "W_el": "m³", "W_pl": "m³", "i": "m", "A_v": "m²"}
        for name, unit in units.items():
            object.__setattr__(self, name, _positive(name, getattr(self, name), unit))
        for name in ("depth", "width", "t_max", "h_over_b"):
            value = getattr(self, name)
            if value is not None:
                unit = "" if name == "h_over_b" else "m"
                object.__setattr__(self, name, _positive(name, value, unit))
        if self.interaction_a is not None:
            a = self.interaction_a
            if _is_bool(a) or not isinstance(a, numbers.Real) or not 0.0 <= float(a) <= 0.5:
                raise CaseError(
                    f"interaction_a: {_show(a)} is not allowed; it must be a number from 0 to 0.5"
                )
            object.__setattr__(self, "interaction_a", float(a))
        _flag("doubly_symmetric", self.doubly_symmetric)
        _flag("open_section", self.open_section)
        if not isinstance(self.dimensions, Mapping):
            raise CaseError(f"dimensions: {_show(self.dimensions)} is not an object of lengths [m]")
        dimensions = {}
        for key, value in self.dimensions.items():
            dimensions[key] = _positive(f"dimensions.{key}", value, "m")
        object.__setattr__(self, "dimensions", dimensions)
        self._check_consistency()

    def _check_consistency(self) -> None:
        """Reject properties that no real section can have together (each bound holds for every shape)."""
        up, down = 1.0 + _RELATIVE_SLACK, 1.0 - _RELATIVE_SLACK
        gyration = math.sqrt(self.I / self.A)
        if not down * gyration <= self.i <= up * gyration:
            raise CaseError(f"i: {self.i!r} m must equal sqrt(I/A) = {_g(gyration)} m")
        if self.A_v > up * self.A:
            raise CaseError(f"A_v: {self.A_v!r} m² must be <= A = {_g(self.A)} m²")
        if self.W_pl < down * self.W_el:
            # Full plasticity carries at least the first-yield moment.
            raise CaseError(
                f"W_pl: {self.W_pl!r} m³ must be >= W_el = {_g(self.W_el)} m³ "
                f"(the plastic modulus is never less than the elastic one)"
            )
        if self.W_pl > up * self.A * self.i:
            # W_pl = min over the axis of the integral of |y| dA <= sqrt(A·I) by Cauchy–Schwarz.
            raise CaseError(
                f"W_pl: {self.W_pl!r} m³ must be <= A·i = sqrt(A·I) = {_g(self.A * self.i)} m³ "
                f"(no section has more; check the units)"
            )
        if self.depth is not None and self.W_el > up * 2.0 * self.I / self.depth:
            # One extreme fibre is at least depth/2 from the axis.
            bound = 2.0 * self.I / self.depth
            raise CaseError(f"W_el: {self.W_el!r} m³ must be <= 2I/depth = {_g(bound)} m³")

    def mass_per_metre(self, density: float) -> float:
        """Mass per unit length, A·ρ.

        Parameters
        ----------
        density : float
            Density of the material ρ [kg/m³], e.g. 7850 for steel (common practice, no source).

        Returns
        -------
        float
            Mass per metre of member [kg/m].

        Raises
        ------
        CaseError
            When the density is not a finite number > 0.

        Examples
        --------
        >>> round(section_from_spec({"name": "IPE 200"}).mass_per_metre(7850.0), 1)
        22.4
        """
        return self.A * _positive("density", density, "kg/m³")


# ----------------------------------------------------------------------------- catalogue

# Every catalogue value below is from memory unless a comment names references.md §5, whose catalogue
# values are themselves flagged [memory] there (each recomputed from its dimensions, [derived]). The
# properties of a catalogue section are computed exactly from its stored dimensions; the handbook A and I
# are kept only so that the tests can check each entry's dimensions against them.

# EN 10365 rolled I/H (from memory): (h, b, tw, tf, r) [mm], then handbook A [cm²], I_y [cm⁴], I_z [cm⁴]
# (from memory).
_ROLLED_I: dict[str, tuple[tuple[float, float, float, float, float], float, float, float]] = {
    "IPE 80": ((80, 46, 3.8, 5.2, 5), 7.64, 80.14, 8.49),
    "IPE 100": ((100, 55, 4.1, 5.7, 7), 10.32, 171.0, 15.92),
    "IPE 120": ((120, 64, 4.4, 6.3, 7), 13.21, 317.8, 27.67),
    "IPE 140": ((140, 73, 4.7, 6.9, 7), 16.43, 541.2, 44.92),
    "IPE 160": ((160, 82, 5.0, 7.4, 9), 20.09, 869.3, 68.31),
    "IPE 180": ((180, 91, 5.3, 8.0, 9), 23.95, 1317, 100.9),
    "IPE 200": ((200, 100, 5.6, 8.5, 12), 28.48, 1943, 142.4),  # references.md §5
    "IPE 220": ((220, 110, 5.9, 9.2, 12), 33.37, 2772, 204.9),
    "IPE 240": ((240, 120, 6.2, 9.8, 15), 39.12, 3892, 283.6),
    "IPE 270": ((270, 135, 6.6, 10.2, 15), 45.95, 5790, 419.9),
    "IPE 300": ((300, 150, 7.1, 10.7, 15), 53.81, 8356, 603.8),  # references.md §5
    "IPE 330": ((330, 160, 7.5, 11.5, 18), 62.61, 11770, 788.1),
    "IPE 360": ((360, 170, 8.0, 12.7, 18), 72.73, 16270, 1043),
    "IPE 400": ((400, 180, 8.6, 13.5, 21), 84.46, 23130, 1318),
    "IPE 450": ((450, 190, 9.4, 14.6, 21), 98.82, 33740, 1676),
    "IPE 500": ((500, 200, 10.2, 16.0, 21), 115.5, 48200, 2142),
    "IPE 550": ((550, 210, 11.1, 17.2, 24), 134.4, 67120, 2668),
    "IPE 600": ((600, 220, 12.0, 19.0, 24), 156.0, 92080, 3387),
    "HEA 100": ((96, 100, 5.0, 8.0, 12), 21.24, 349.2, 133.8),
    "HEA 120": ((114, 120, 5.0, 8.0, 12), 25.34, 606.2, 230.9),
    "HEA 140": ((133, 140, 5.5, 8.5, 12), 31.42, 1033, 389.3),
    "HEA 160": ((152, 160, 6.0, 9.0, 15), 38.77, 1673, 615.6),
    "HEA 180": ((171, 180, 6.0, 9.5, 15), 45.25, 2510, 924.6),
    "HEA 200": ((190, 200, 6.5, 10.0, 18), 53.83, 3692, 1336),  # references.md §5
    "HEA 220": ((210, 220, 7.0, 11.0, 18), 64.34, 5410, 1955),
    "HEA 240": ((230, 240, 7.5, 12.0, 21), 76.84, 7763, 2769),
    "HEA 260": ((250, 260, 7.5, 12.5, 24), 86.82, 10450, 3668),
    "HEA 280": ((270, 280, 8.0, 13.0, 24), 97.26, 13670, 4763),
    "HEA 300": ((290, 300, 8.5, 14.0, 27), 112.5, 18260, 6310),
    "HEA 320": ((310, 300, 9.0, 15.5, 27), 124.4, 22930, 6985),
    "HEA 340": ((330, 300, 9.5, 16.5, 27), 133.5, 27690, 7436),
    "HEA 360": ((350, 300, 10.0, 17.5, 27), 142.8, 33090, 7887),
    "HEA 400": ((390, 300, 11.0, 19.0, 27), 159.0, 45070, 8564),
    "HEA 450": ((440, 300, 11.5, 21.0, 27), 178.0, 63720, 9465),
    "HEA 500": ((490, 300, 12.0, 23.0, 27), 197.5, 86970, 10370),
    "HEA 550": ((540, 300, 12.5, 24.0, 27), 211.8, 111900, 10820),
    "HEA 600": ((590, 300, 13.0, 25.0, 27), 226.5, 141200, 11270),
    "HEB 100": ((100, 100, 6.0, 10.0, 12), 26.04, 449.5, 167.3),
    "HEB 120": ((120, 120, 6.5, 11.0, 12), 34.01, 864.4, 317.5),
    "HEB 140": ((140, 140, 7.0, 12.0, 12), 42.96, 1509, 549.7),
    "HEB 160": ((160, 160, 8.0, 13.0, 15), 54.25, 2492, 889.2),
    "HEB 180": ((180, 180, 8.5, 14.0, 15), 65.25, 3831, 1363),
    "HEB 200": ((200, 200, 9.0, 15.0, 18), 78.08, 5696, 2003),  # references.md §5
    "HEB 220": ((220, 220, 9.5, 16.0, 18), 91.04, 8091, 2843),
    "HEB 240": ((240, 240, 10.0, 17.0, 21), 106.0, 11260, 3923),
    "HEB 260": ((260, 260, 10.0, 17.5, 24), 118.4, 14920, 5135),
    "HEB 280": ((280, 280, 10.5, 18.0, 24), 131.4, 19270, 6595),
    "HEB 300": ((300, 300, 11.0, 19.0, 27), 149.1, 25170, 8563),
    "HEB 320": ((320, 300, 11.5, 20.5, 27), 161.3, 30820, 9239),
    "HEB 340": ((340, 300, 12.0, 21.5, 27), 170.9, 36660, 9690),
    "HEB 360": ((360, 300, 12.5, 22.5, 27), 180.6, 43190, 10140),
    "HEB 400": ((400, 300, 13.5, 24.0, 27), 197.8, 57680, 10820),
    "HEB 450": ((450, 300, 14.0, 26.0, 27), 218.0, 79890, 11720),
    "HEB 500": ((500, 300, 14.5, 28.0, 27), 238.6, 107200, 12620),
    "HEB 550": ((550, 300, 15.0, 29.0, 27), 254.1, 136700, 13080),
    "HEB 600": ((600, 300, 15.5, 30.0, 27), 270.0, 171000, 13530),
}

# EN 10210-2 hot-finished square and rectangular hollow sections: (h, b, t) [mm], then handbook A [cm²],
# I_y [cm⁴], I_z [cm⁴] (I_z None for a square one). Sizes from EN 10210-2, handbook values from memory, except
# SHS 100x100x5 from references.md §5.
_HOLLOW_RECTANGULAR: dict[str, tuple[tuple[float, float, float], float, float, float | None]] = {
    "SHS 100x100x5": ((100, 100, 5.0), 18.7, 279, None),  # references.md §5
    "SHS 100x100x8": ((100, 100, 8.0), 28.8, 400, None),
    "SHS 150x150x8": ((150, 150, 8.0), 44.8, 1491, None),
    "RHS 150x100x6.3": ((150, 100, 6.3), 29.7, 898, 474),
    "RHS 200x100x8": ((200, 100, 8.0), 44.8, 2234, 739),
    "RHS 300x200x10": ((300, 200, 10.0), 95.7, 11820, 6280),
}

# EN 10210-2 hot-finished circular hollow sections: (D, t) [mm], then handbook A [cm²], I [cm⁴]. Sizes from
# EN 10210-2, handbook values from memory, except CHS 114.3x5 from references.md §5.
_HOLLOW_CIRCULAR: dict[str, tuple[tuple[float, float], float, float]] = {
    "CHS 114.3x5": ((114.3, 5.0), 17.17, 256.9),  # references.md §5
    "CHS 139.7x6.3": ((139.7, 6.3), 26.4, 589),
    "CHS 168.3x8": ((168.3, 8.0), 40.3, 1297),
    "CHS 219.1x10": ((219.1, 10.0), 65.7, 3598),
    "CHS 273x10": ((273.0, 10.0), 82.6, 7154),
}

# Common sawn-timber sizes, (b, h) [mm], width × depth in the style of EN 336 (common practice, no source).
# A and I are exact by formula, so only the dimensions are stored.
_TIMBER: dict[str, tuple[float, float]] = {
    "TIMBER 45x95": (45, 95),
    "TIMBER 45x145": (45, 145),
    "TIMBER 45x195": (45, 195),
    "TIMBER 45x220": (45, 220),
    "TIMBER 63x175": (63, 175),
    "TIMBER 75x200": (75, 200),
    "TIMBER 90x270": (90, 270),
    "TIMBER 115x315": (115, 315),
}

_REFERENCES_S5 = ("IPE 200", "IPE 300", "HEB 200", "HEA 200", "SHS 100x100x5", "CHS 114.3x5")


def catalogue_names() -> tuple[str, ...]:
    """The names of every catalogue section, in their canonical spelling.

    Returns
    -------
    tuple of str
        E.g. ``"IPE 200"``, ``"HEB 200"``, ``"SHS 100x100x5"``, ``"CHS 114.3x5"``, ``"TIMBER 45x195"``.

    Examples
    --------
    >>> "HEB 200" in catalogue_names()
    True
    """
    return (*_ROLLED_I, *_HOLLOW_RECTANGULAR, *_HOLLOW_CIRCULAR, *_TIMBER)


# Patterns of a compacted name (re caches them on first use, so nothing is compiled at import).
_HE_LETTER_LAST = r"HE(\d+)([ABM])"
_FAMILY_SIZE = r"([A-Z]+)(\d+(?:\.\d+)?(?:X\d+(?:\.\d+)?)*)"


def normalise_name(name: str) -> str:
    """The canonical spelling of a section name, case- and space-insensitive.

    Upper case, no spaces inside the family or the size, one space between them, ``x`` between the sizes
    (``×`` is accepted) and each size without trailing zeros. ``"HE 200 B"`` is read as ``"HEB 200"``.
    A name of another form comes back upper-cased with its spaces collapsed. The name need not be in the
    catalogue.

    Parameters
    ----------
    name : str
        A section name, e.g. ``"heb200"``.

    Returns
    -------
    str
        The canonical name, e.g. ``"HEB 200"``.

    Raises
    ------
    TypeError
        When ``name`` is not a string.

    Examples
    --------
    >>> normalise_name("heb200"), normalise_name("HE 200 B"), normalise_name("shs 100 × 100 × 5.0")
    ('HEB 200', 'HEB 200', 'SHS 100x100x5')
    """
    if not isinstance(name, str):
        raise TypeError(f"a section name must be a string, not {type(name).__name__}")
    compact = re.sub(r"[\s\-_]+", "", name.upper().replace("×", "X"))
    letter_last = re.fullmatch(_HE_LETTER_LAST, compact)
    if letter_last:
        return f"HE{letter_last.group(2)} {letter_last.group(1)}"
    family_size = re.fullmatch(_FAMILY_SIZE, compact)
    if family_size:
        sizes = "x".join(f"{float(part):g}" for part in family_size.group(2).split("X"))
        return f"{family_size.group(1)} {sizes}"
    return " ".join(name.upper().split())


def _first_size(name: str) -> float:
    match = re.search(r"\d+(?:\.\d+)?", name)
    return float(match.group()) if match else math.inf


def _near_names(name: str, names: tuple[str, ...]) -> list[str]:
    """Up to three catalogue names close to ``name``: the most alike first, then the nearest in size."""
    turned = re.fullmatch(r"RHS ([\d.]+)x([\d.]+)x([\d.]+)", name)
    if turned and f"RHS {turned[2]}x{turned[1]}x{turned[3]}" in names:
        return [f"RHS {turned[2]}x{turned[1]}x{turned[3]}"]  # the same tube, named depth first
    size = _first_size(name)
    matcher = difflib.SequenceMatcher(b=name)
    scored = []
    for candidate in difflib.get_close_matches(name, names, n=10, cutoff=0.6):
        matcher.set_seq1(candidate)
        scored.append((-round(matcher.ratio(), 2), abs(_first_size(candidate) - size), candidate))
    return [candidate for *_, candidate in sorted(scored)[:3]]


def _from_catalogue(path: str, spec: Mapping, axis: str) -> Section:
    for key in spec:
        if key != "name":
            if key == "shape":
                raise CaseError(
                    f"{path}: give either 'name' (a catalogue section) or 'shape' with its "
                    f"dimensions, not both"
                )
            raise CaseError(
                f"{path}.{key}: unknown key{_suggestion(key, ('name',))}; a catalogue section "
                f"takes only 'name'"
            )
    name = spec["name"]
    if not isinstance(name, str):
        raise CaseError(
            f"{path}.name: {_show(name)} is not a section name; it must be a string such as 'HEB 200'"
        )
    canonical = normalise_name(name)
    names = catalogue_names()
    if canonical not in names:
        near = _near_names(canonical, names)
        hint = f" (did you mean {', '.join(repr(n) for n in near)}?)" if near else ""
        raise CaseError(
            f"{path}.name: {name!r} is not in the catalogue{hint}; it holds IPE 80 to 600, "
            f"HEA and HEB 100 to 600, some hot-finished SHS, RHS and CHS and sawn-timber sizes "
            f"(engine.sections.catalogue_names() lists them), or give 'shape' with dimensions"
        )
    checked = "; checked against references.md §5" if canonical in _REFERENCES_S5 else ""
    computed = "; properties computed exactly from the dimensions"
    if canonical in _ROLLED_I:
        h, b, tw, tf, r = (value / 1000.0 for value in _ROLLED_I[canonical][0])
        dims = {"h": h, "b": b, "tw": tw, "tf": tf, "r": r}
        source = f"dimensions EN 10365 (from memory){computed}, root radii included{checked}"
        return _build(path, "rolled_i", "rolled", dims, axis, canonical, source)
    if canonical in _HOLLOW_RECTANGULAR:
        h, b, t = (value / 1000.0 for value in _HOLLOW_RECTANGULAR[canonical][0])
        dims = {"h": h, "b": b, "t": t}
        source = (
            f"a size of the EN 10210-2 range (from memory), hot-finished, corner radii r_o = 1.5t, "
            f"r_i = t (references.md §5){computed}{checked}"
        )
        return _build(path, "rhs", "hot-finished", dims, axis, canonical, source)
    if canonical in _HOLLOW_CIRCULAR:
        D, t = (value / 1000.0 for value in _HOLLOW_CIRCULAR[canonical][0])
        source = f"a size of the EN 10210-2 range (from memory), hot-finished{computed}{checked}"
        return _build(path, "chs", "hot-finished", {"D": D, "t": t}, axis, canonical, source)
    b, h = (value / 1000.0 for value in _TIMBER[canonical])
    source = f"common sawn-timber size, width × depth (common practice, no source){computed}"
    return _build(path, "rectangle", "solid", {"b": b, "h": h}, axis, canonical, source)


# ----------------------------------------------------------------------------- specs


def _check_geometry(path: str, shape: str, dims: dict[str, float], manufacture: str) -> None:
    """Reject dimensions that make no section of this shape, naming the field at fault."""
    if shape in ("rolled_i", "welded_i"):
        h, b, tw, tf = dims["h"], dims["b"], dims["tw"], dims["tf"]
        if tf >= h / 2.0:
            raise CaseError(f"{path}.tf: {tf!r} m must be less than h/2 = {_g(h / 2.0)} m")
        if tw >= b:
            raise CaseError(f"{path}.tw: {tw!r} m must be less than b = {_g(b)} m")
        if shape == "rolled_i":
            r = dims["r"]
            between_flanges = (h - 2.0 * tf) / 2.0
            beside_web = (b - tw) / 2.0
            if r > between_flanges:
                raise CaseError(
                    f"{path}.r: {r!r} m is too large to fit between the flanges; "
                    f"it must be <= (h - 2tf)/2 = {_g(between_flanges)} m"
                )
            if r > beside_web:
                raise CaseError(
                    f"{path}.r: {r!r} m is too large to fit beside the web; "
                    f"it must be <= (b - tw)/2 = {_g(beside_web)} m"
                )
    elif shape == "rhs":
        h, b, t = dims["h"], dims["b"], dims["t"]
        smaller = min(h, b)
        if t >= smaller / 2.0:
            raise CaseError(f"{path}.t: {t!r} m must be less than min(h, b)/2 = {_g(smaller / 2.0)} m")
        outer, _ = _corner_radii(t, manufacture)
        if 2.0 * outer > smaller:
            raise CaseError(
                f"{path}.t: {t!r} m is too thick for a {manufacture} section of this size: "
                f"its outer corner radius {_g(outer)} m must be <= min(h, b)/2 = "
                f"{_g(smaller / 2.0)} m"
            )
    elif shape == "chs":
        D, t = dims["D"], dims["t"]
        if t >= D / 2.0:
            raise CaseError(
                f"{path}.t: {t!r} m must be less than D/2 = {_g(D / 2.0)} m (a solid bar is shape 'round')"
            )


def _build(
    path: str, shape: str, manufacture: str, dims: dict[str, float], axis: str, name: str, source: str
) -> Section:
    """Compute the properties of a checked parametric shape and make the section about ``axis``."""
    _check_geometry(path, shape, dims, manufacture)
    h_over_b = None
    open_section = False
    if shape in ("rolled_i", "welded_i"):
        rolled = shape == "rolled_i"
        r = dims["r"] if rolled else 0.0
        area, major, minor = _i_section(dims["h"], dims["b"], dims["tw"], dims["tf"], r, rolled)
        t_max = max(dims["tf"], dims["tw"])
        h_over_b = dims["h"] / dims["b"]
        open_section = True
    elif shape == "rhs":
        area, major, minor = _rectangular_hollow(dims["h"], dims["b"], dims["t"], manufacture)
        outer, inner = _corner_radii(dims["t"], manufacture)
        dims = {**dims, "r_o": outer, "r_i": inner}
        t_max = dims["t"]
    elif shape == "chs":
        area, major = _circular_hollow(dims["D"], dims["t"])
        minor = major
        t_max = dims["t"]
    elif shape == "rectangle":
        area = dims["b"] * dims["h"]
        major = _solid_rectangle(dims["h"], dims["b"])
        minor = _solid_rectangle(dims["b"], dims["h"])
        t_max = min(dims["b"], dims["h"])
    else:  # round
        area, major = _solid_round(dims["D"])
        minor = major
        t_max = dims["D"]
    props = major if axis == "major" else minor
    with _within(path):
        return Section(
            name=name,
            shape=shape,
            manufacture=manufacture,
            axis=axis,
            A=area,
            I=props.I,
            W_el=props.W_el,
            W_pl=props.W_pl,
            i=math.sqrt(props.I / area),
            A_v=props.A_v,
            depth=props.depth,
            width=props.width,
            t_max=t_max,
            doubly_symmetric=True,
            open_section=open_section,
            h_over_b=h_over_b,
            interaction_a=props.interaction_a,
            dimensions=dims,
            source=source,
        )


def _describe(shape: str, manufacture: str, dims: dict[str, float]) -> str:
    """A section's description in millimetres, e.g. ``rolled I 200×100×5.6×8.5 r12``."""
    if shape == "rolled_i":
        return (
            f"rolled I {_mm(dims['h'])}×{_mm(dims['b'])}×{_mm(dims['tw'])}×{_mm(dims['tf'])} "
            f"r{_mm(dims['r'])}"
        )
    if shape == "welded_i":
        return f"welded I {_mm(dims['h'])}×{_mm(dims['b'])}×{_mm(dims['tw'])}×{_mm(dims['tf'])}"
    if shape == "rhs":
        family = "SHS" if dims["h"] == dims["b"] else "RHS"
        return f"{family} {_mm(dims['h'])}×{_mm(dims['b'])}×{_mm(dims['t'])} {manufacture}"
    if shape == "chs":
        return f"CHS {_mm(dims['D'])}×{_mm(dims['t'])} {manufacture}"
    if shape == "rectangle":
        return f"rectangle {_mm(dims['b'])}×{_mm(dims['h'])}"
    return f"round {_mm(dims['D'])}"


def _custom(path: str, spec: Mapping, axis: str) -> Section:
    values = {
        key: _positive(f"{path}.{key}", spec[key], unit)
        for key, unit in (("A", "m²"), ("I", "m⁴"), ("W_el", "m³"), ("W_pl", "m³"))
    }
    A_v = _positive(f"{path}.A_v", spec["A_v"], "m²") if "A_v" in spec else values["A"]
    extents = {
        key: _positive(f"{path}.{key}", spec[key], "m", maximum=_MAX_DIMENSION)
        for key in ("depth", "width", "t_max")
        if key in spec
    }
    doubly_symmetric = _flag(f"{path}.doubly_symmetric", spec.get("doubly_symmetric", False))
    # Unknown means lateral-torsional buckling may matter: the cautious reading.
    open_section = _flag(f"{path}.open_section", spec.get("open_section", True))
    source = "properties given in the case, taken as about the chosen axis"
    with _within(path):
        return Section(
            name="custom",
            shape="custom",
            manufacture="custom",
            axis=axis,
            A=values["A"],
            I=values["I"],
            W_el=values["W_el"],
            W_pl=values["W_pl"],
            i=math.sqrt(values["I"] / values["A"]),
            A_v=A_v,
            depth=extents.get("depth"),
            width=extents.get("width"),
            t_max=extents.get("t_max"),
            doubly_symmetric=doubly_symmetric,
            open_section=open_section,
            h_over_b=None,
            interaction_a=None,
            dimensions=extents,
            source=source,
        )


def section_from_spec(spec: Mapping, axis: str = "major", path: str = "section") -> Section:
    """Build a section from what a case file holds under ``"section"`` (SI metres).

    Parameters
    ----------
    spec : mapping
        ``{"name": ...}`` for a catalogue section (case- and space-insensitive, see :func:`normalise_name`),
        or ``{"shape": ..., <dimensions>}``:

        - ``"rolled_i"``: h, b, tw, tf, r [m] (r the root radius);
        - ``"welded_i"``: h, b, tw, tf [m], and optionally ``a``, the fillet-weld throat [m], which is
          checked but not added to the properties;
        - ``"rhs"``: h, b, t [m] and ``manufacture``, ``"hot-finished"`` (EN 10210-2 corners) or
          ``"cold-formed"`` (EN 10219-2 corners); a square hollow section has h == b;
        - ``"chs"``: D, t [m], and optionally ``manufacture`` (default ``"cold-formed"``, the cautious
          choice for the buckling curve; it does not change the properties);
        - ``"rectangle"``: b (the width) and h (the depth in the major-axis plane) [m], a solid section;
        - ``"round"``: D [m], a solid bar;
        - ``"custom"``: A [m²], I [m⁴], W_el [m³], W_pl [m³], all about the chosen axis, and optionally
          A_v [m²] (default A), depth, width, t_max [m] (default unknown), doubly_symmetric (default false)
          and open_section (default true).
    axis : str
        ``"major"`` or ``"minor"``, the axis the member bends about.
    path : str
        The spec's path in the case, for error messages.

    Returns
    -------
    Section
        The properties about ``axis``.

    Raises
    ------
    CaseError
        For an unknown name (with near matches), an unknown or missing key, a value that is not a finite
        number > 0 (or a length above 10 m), or dimensions that make no section (tf >= h/2, tw >= b, root
        radii that do not fit, t >= D/2, ...), each naming its field.

    Examples
    --------
    >>> s = section_from_spec({"name": "ipe200"})
    >>> s.name, round(s.A * 1e4, 2), round(s.I * 1e8)
    ('IPE 200', 28.48, 1943)
    >>> round(section_from_spec({"name": "IPE 200"}, axis="minor").I * 1e8, 1)
    142.4
    >>> section_from_spec({"shape": "rolled_i", "h": 0.2, "b": 0.1, "tw": 0.0056, "tf": 0.3, "r": 0.012})
    Traceback (most recent call last):
    ...
    engine.errors.CaseError: section.tf: 0.3 m must be less than h/2 = 0.1 m
    """
    if not isinstance(axis, str) or axis not in AXES:
        raise CaseError(
            f"axis: {_show(axis)} is not an axis{_suggestion(axis, AXES)}; allowed: {_quoted(AXES)}"
        )
    if not isinstance(spec, Mapping):
        raise CaseError(
            f"{path}: {_show(spec)} is not an object; expected {{'name': ...}} or "
            f"{{'shape': ..., <dimensions>}}"
        )
    if "name" in spec:
        return _from_catalogue(path, spec, axis)
    if "shape" not in spec:
        raise CaseError(f"{path}: needs 'name' (a catalogue section) or 'shape' (one of {_quoted(SHAPES)})")
    shape = _choice(f"{path}.shape", spec["shape"], SHAPES, "a shape")
    required, optional = _SPEC_KEYS[shape]
    allowed = ("shape", *required, *optional)
    for key in spec:
        if key not in allowed:
            shown = key if isinstance(key, str) else _show(key)
            raise CaseError(
                f"{path}.{shown}: unknown key{_suggestion(key, allowed)}; shape {shape!r} takes "
                f"{_quoted(allowed)}"
            )
    for key in required:
        if key not in spec:
            raise CaseError(f"{path}.{key}: required key is missing for shape {shape!r}")
    if shape == "custom":
        return _custom(path, spec, axis)

    if shape == "rhs":
        manufacture = _choice(
            f"{path}.manufacture",
            spec["manufacture"],
            _HOLLOW_MANUFACTURES,
            "a manufacture for a hollow section",
        )
    elif shape == "chs":
        manufacture = _choice(
            f"{path}.manufacture",
            spec.get("manufacture", "cold-formed"),
            _HOLLOW_MANUFACTURES,
            "a manufacture for a hollow section",
        )
    else:
        manufacture = {"rolled_i": "rolled", "welded_i": "welded"}.get(shape, "solid")
    dims = {
        key: _positive(f"{path}.{key}", spec[key], "m", maximum=_MAX_DIMENSION)
        for key in required
        if key != "manufacture"
    }
    if "a" in spec:
        _positive(f"{path}.a", spec["a"], "m", maximum=_MAX_DIMENSION)
    source = "dimensions given in the case; properties computed exactly from them"
    if shape == "rolled_i":
        source += ", root radii included"
    elif shape == "rhs":
        source += (
            ", corner radii r_o = 1.5t, r_i = t per EN 10210-2 (references.md §5)"
            if manufacture == "hot-finished"
            else ", corner radii per EN 10219-2: r_o = 2t (t <= 6 mm), 2.5t (6 < t <= 10 mm), "
            "3t (t > 10 mm), r_i = r_o - t (from memory)"
        )
    elif shape == "welded_i":
        source += ", fillet welds left out"
    return _build(path, shape, manufacture, dims, axis, _describe(shape, manufacture, dims), source)
