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

The properties are exact for the shape, root and corner radii included (the formulas: :mod:`engine.
section_properties`; the catalogue: :mod:`engine.catalogue`, its sections built once each and shared).

Axes: ``"major"`` bends about the axis parallel to the flanges of an I/H section (y–y, depth h); ``"minor"``
about the axis along the web (z–z, depth b). For a rectangle or RHS, ``"major"`` bends in the plane of h,
whichever of h and b is larger, as the case file gives them.
"""

from __future__ import annotations

import functools
import math
import numbers
from collections.abc import Mapping
from dataclasses import dataclass, field

from engine.catalogue import (
    HOLLOW_CIRCULAR,
    HOLLOW_RECTANGULAR,
    REFERENCES_S5,
    ROLLED_I,
    TIMBER,
    W_SHAPES,
    catalogue_names,
    near_names,
    normalise_name,
    rolled_i_dimensions,
)
from engine.custom_section import custom_fields
from engine.deep_sections import deep_hollow, deep_solid
from engine.errors import CaseError
from engine.section_properties import (
    circular_hollow,
    corner_radii,
    i_section,
    rectangular_hollow,
    solid_rectangle,
    solid_round,
)
from engine.torsion import TorsionProperties, shape_torsion
from engine.validate import choice, dimension, flag, is_bool, quoted, show, suggestion, within

__all__ = [
    "AXES",
    "MANUFACTURES",
    "SHAPES",
    "Section",
    "catalogue_names",
    "deep_hollow",
    "deep_solid",
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
        ("A_v", "t_max", "depth", "width", "doubly_symmetric", "open_section", "It", "Iw", "Iz", "ltb_curve"),
    ),
}


# ----------------------------------------------------------------------------- helpers


def _g(value: float) -> str:
    """Format a limit for a message, six significant figures."""
    return f"{value:.6g}"


def _mm(value: float) -> str:
    """A length [m] in millimetres for a section's description."""
    return f"{value * 1000.0:.6g}"


# ----------------------------------------------------------------------------- the section


@dataclass(frozen=True, kw_only=True)
class Section:
    r"""The properties of a member's cross-section about the axis it bends about.

    Build one with :func:`section_from_spec`. Change it with :func:`dataclasses.replace`, which validates the
    new section again (so changing ``I`` needs a matching ``i``).

    Parameters
    ----------
    name : str
        The catalogue name, e.g. ``"IPE 200"`` or ``"W10x49"``, or a description in millimetres, e.g.
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
    torsion : TorsionProperties
        I_t [m⁴] and I_w [m⁶] (:mod:`engine.torsion`; a custom section's as given, None when not given).
    I_minor : float or None
        A custom section's second moment about its minor axis [m⁴] (key ``Iz``), for the lateral-torsional
        buckling check; None when not given, and for every other shape (whose minor-axis properties are
        ``section_from_spec(spec, "minor")``'s).
    ltb_curve : str or None
        A custom section's lateral-torsional buckling curve of EN 1993-1-1 Table 6.4 (key ``ltb_curve``,
        ``"a"`` to ``"d"``); None: the table's own row (a custom section: "other cross-sections", d).

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
    torsion: TorsionProperties
    I_minor: float | None = None
    ltb_curve: str | None = None

    def __post_init__(self) -> None:
        if not isinstance(self.name, str) or not self.name:
            raise CaseError(f"name: {show(self.name)} is not allowed; it must be a non-empty string")
        if not isinstance(self.source, str):
            raise CaseError(f"source: {show(self.source)} is not allowed; it must be a string")
        choice("shape", self.shape, SHAPES, "a shape")
        choice("manufacture", self.manufacture, MANUFACTURES, "a manufacture")
        choice("axis", self.axis, AXES, "an axis")
        units = {"A": "m²", "I": "m⁴", "W_el": "m³", "W_pl": "m³", "i": "m", "A_v": "m²"}
        for name, unit in units.items():
            object.__setattr__(self, name, dimension(name, getattr(self, name), unit))
        for name in ("depth", "width", "t_max", "h_over_b"):
            value = getattr(self, name)
            if value is not None:
                unit = "" if name == "h_over_b" else "m"
                object.__setattr__(self, name, dimension(name, value, unit))
        if self.interaction_a is not None:
            a = self.interaction_a
            if is_bool(a) or not isinstance(a, numbers.Real) or not 0.0 <= float(a) <= 0.5:
                raise CaseError(f"interaction_a: {show(a)} is not allowed; it must be a number from 0 to 0.5")
            object.__setattr__(self, "interaction_a", float(a))
        flag("doubly_symmetric", self.doubly_symmetric)
        flag("open_section", self.open_section)
        if not isinstance(self.dimensions, Mapping):
            raise CaseError(f"dimensions: {show(self.dimensions)} is not an object of lengths [m]")
        dimensions = {}
        for key, value in self.dimensions.items():
            dimensions[key] = dimension(f"dimensions.{key}", value, "m")
        object.__setattr__(self, "dimensions", dimensions)
        if self.I_minor is not None:
            object.__setattr__(self, "I_minor", dimension("I_minor", self.I_minor, "m⁴"))
        if self.ltb_curve is not None:
            choice("ltb_curve", self.ltb_curve, ("a", "b", "c", "d"), "a buckling curve")
        if not isinstance(self.torsion, TorsionProperties):
            raise CaseError(f"torsion: {show(self.torsion)} is not allowed; it must be a TorsionProperties")
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
        return self.A * dimension("density", density, "kg/m³")


def _from_catalogue(path: str, spec: Mapping, axis: str) -> Section:
    for key in spec:
        if key != "name":
            if key == "shape":
                raise CaseError(
                    f"{path}: give either 'name' (a catalogue section) or 'shape' with its "
                    f"dimensions, not both"
                )
            raise CaseError(
                f"{path}.{key}: unknown key{suggestion(key, ('name',))}; a catalogue section "
                f"takes only 'name'"
            )
    name = spec["name"]
    if not isinstance(name, str):
        raise CaseError(
            f"{path}.name: {show(name)} is not a section name; it must be a string such as 'HEB 200'"
        )
    canonical = normalise_name(name)
    names = catalogue_names()
    if canonical not in names:
        near = near_names(canonical, names)
        hint = f" (did you mean {', '.join(repr(n) for n in near)}?)" if near else ""
        raise CaseError(
            f"{path}.name: {name!r} is not in the catalogue{hint}; it holds IPE 80 to 600, HEA and HEB "
            f"100 to 600, US W shapes W6 to W24, some hot-finished SHS, RHS and CHS, sawn-timber sizes "
            f"(engine.sections.catalogue_names() lists them), or give 'shape' with dimensions"
        )
    return _catalogued(canonical, axis)


@functools.cache
def _catalogued(canonical: str, axis: str, path: str = "section") -> Section:
    """A catalogue section about ``axis``, built once (a Section is frozen and the catalogue fixed)."""
    checked = "; checked against references.md §5" if canonical in REFERENCES_S5 else ""
    computed = "; properties computed exactly from the dimensions"
    if canonical in ROLLED_I or canonical in W_SHAPES:
        dims, standard = rolled_i_dimensions(canonical)
        source = f"dimensions {standard} (from memory){computed}, root radii included{checked}"
        return _build(path, "rolled_i", "rolled", dims, axis, canonical, source)
    if canonical in HOLLOW_RECTANGULAR:
        h, b, t = (value / 1000.0 for value in HOLLOW_RECTANGULAR[canonical][0])
        dims = {"h": h, "b": b, "t": t}
        source = (
            f"a size of the EN 10210-2 range (from memory), hot-finished, corner radii r_o = 1.5t, "
            f"r_i = t (references.md §5){computed}{checked}"
        )
        return _build(path, "rhs", "hot-finished", dims, axis, canonical, source)
    if canonical in HOLLOW_CIRCULAR:
        D, t = (value / 1000.0 for value in HOLLOW_CIRCULAR[canonical][0])
        source = f"a size of the EN 10210-2 range (from memory), hot-finished{computed}{checked}"
        return _build(path, "chs", "hot-finished", {"D": D, "t": t}, axis, canonical, source)
    b, h = (value / 1000.0 for value in TIMBER[canonical])
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
        outer, _ = corner_radii(t, manufacture)
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
    torsion = shape_torsion(shape, manufacture, dims)
    h_over_b = None
    open_section = False
    if shape in ("rolled_i", "welded_i"):
        rolled = shape == "rolled_i"
        r = dims["r"] if rolled else 0.0
        area, major, minor = i_section(dims["h"], dims["b"], dims["tw"], dims["tf"], r, rolled)
        t_max = max(dims["tf"], dims["tw"])
        h_over_b = dims["h"] / dims["b"]
        open_section = True
    elif shape == "rhs":
        area, major, minor = rectangular_hollow(dims["h"], dims["b"], dims["t"], manufacture)
        outer, inner = corner_radii(dims["t"], manufacture)
        dims = {**dims, "r_o": outer, "r_i": inner}
        t_max = dims["t"]
    elif shape == "chs":
        area, major = circular_hollow(dims["D"], dims["t"])
        minor = major
        t_max = dims["t"]
    elif shape == "rectangle":
        area = dims["b"] * dims["h"]
        major = solid_rectangle(dims["h"], dims["b"])
        minor = solid_rectangle(dims["b"], dims["h"])
        t_max = min(dims["b"], dims["h"])
    else:  # round
        area, major = solid_round(dims["D"])
        minor = major
        t_max = dims["D"]
    props = major if axis == "major" else minor
    with within(path):
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
            torsion=torsion,
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
          A_v [m²] (default A), depth, width, t_max [m] (default unknown), doubly_symmetric (default false),
          open_section (default true), It [m⁴] and Iw [m⁶] (the torsion constants, default unknown), Iz
          [m⁴] (the minor axis's second moment, 0 < Iz <= I) and ltb_curve (``"a"`` to ``"d"``, default
          ``"d"``) for the lateral-torsional buckling check.
    axis : str
        ``"major"`` or ``"minor"``, the axis the member bends about.
    path : str
        The spec's path in the case, for error messages.

    Returns the :class:`Section` about ``axis``.

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
    choice("axis", axis, AXES, "an axis")
    if not isinstance(spec, Mapping):
        raise CaseError(
            f"{path}: {show(spec)} is not an object; expected {{'name': ...}} or "
            f"{{'shape': ..., <dimensions>}}"
        )
    if "name" in spec:
        return _from_catalogue(path, spec, axis)
    if "shape" not in spec:
        raise CaseError(f"{path}: needs 'name' (a catalogue section) or 'shape' (one of {quoted(SHAPES)})")
    shape = choice(f"{path}.shape", spec["shape"], SHAPES, "a shape")
    required, optional = _SPEC_KEYS[shape]
    allowed = ("shape", *required, *optional)
    for key in spec:
        if key not in allowed:
            shown = key if isinstance(key, str) else show(key)
            raise CaseError(
                f"{path}.{shown}: unknown key{suggestion(key, allowed)}; shape {shape!r} takes "
                f"{quoted(allowed)}"
            )
    for key in required:
        if key not in spec:
            raise CaseError(f"{path}.{key}: required key is missing for shape {shape!r}")
    if shape == "custom":
        fields = custom_fields(path, spec)
        with within(path):
            return Section(axis=axis, **fields)

    if shape == "rhs":
        manufacture = choice(
            f"{path}.manufacture",
            spec["manufacture"],
            _HOLLOW_MANUFACTURES,
            "a manufacture for a hollow section",
        )
    elif shape == "chs":
        manufacture = choice(
            f"{path}.manufacture",
            spec.get("manufacture", "cold-formed"),
            _HOLLOW_MANUFACTURES,
            "a manufacture for a hollow section",
        )
    else:
        manufacture = {"rolled_i": "rolled", "welded_i": "welded"}.get(shape, "solid")
    dims = {
        key: dimension(f"{path}.{key}", spec[key], "m", maximum=_MAX_DIMENSION)
        for key in required
        if key != "manufacture"
    }
    if "a" in spec:
        dimension(f"{path}.a", spec["a"], "m", maximum=_MAX_DIMENSION)
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
