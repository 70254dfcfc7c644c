r"""Cross-section classification of steel I/H and hollow sections, EN 1993-1-1:2005 §5.5 and Table 5.2.

The limits of Table 5.2 (all from memory; check them against a copy before quoting them), with
:math:`\varepsilon = \sqrt{235/f_y}` (:math:`f_y` in N/mm²):

============================================  =================  =================  =================
part                                          class 1            class 2            class 3
============================================  =================  =================  =================
internal part in compression, c/t             33 ε               38 ε               42 ε
internal part in bending, c/t                 72 ε               83 ε               124 ε
outstand flange in compression, c/t           9 ε                10 ε               14 ε
circular hollow section, d/t                  50 ε²              70 ε²              90 ε²
============================================  =================  =================  =================

A part beyond its class 3 limit is class 4; the section takes the class of its worst part.

How the stresses are taken (strutscope's choice, conservative; written down in DEVELOPERS.md):

- the web of an I/H (and the walls of a hollow section that lie in the plane of bending) under **any
  compression** is classified with the pure-compression limits, not the α/ψ forms of Table 5.2 for combined
  N + M: the bending moment varies along the member and is small near a pinned end, where the web is nearly in
  uniform compression, and the pure-compression limits are the strictest of the α/ψ family. Without
  compression these parts are classified in pure bending (the 72ε/83ε/124ε limits), which is conservative
  under tension;
- the flanges (the outstands of an I/H, the walls of a hollow section perpendicular to the plane of bending)
  are always classified in uniform compression: one of them is compressed by the bending;
- the web of an I/H bent about its minor axis lies on the neutral axis: it is classified in compression when
  there is an axial compression, and left out otherwise;
- the flat width is c = h − 2t_f − 2r (web) and (b − t_w − 2r)/2 (outstand) for rolled I/H, c = h − 2t_f and
  (b − t_w)/2 for welded ones (the welds left out, conservative), and c = side − 3t for every hollow section
  (common practice for the flat of hot-finished corners, conservative for cold-formed ones; from memory);
- solid rectangles and rounds do not buckle locally (class 1, common practice, no source); custom sections and
  materials other than steel are not classified.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

__all__ = [
    "LIMITS",
    "WEB_SHEAR_LIMIT",
    "Part",
    "SectionClass",
    "classify",
    "epsilon",
    "eq_5_9_modulus",
    "web_shear_slenderness",
]

#: Table 5.2 limits for classes 1, 2, 3 (from memory): c/t in units of ε, or d/t in units of ε² for a CHS.
LIMITS = {
    "internal compression": (33.0, 38.0, 42.0),
    "internal bending": (72.0, 83.0, 124.0),
    "outstand compression": (9.0, 10.0, 14.0),
    "chs": (50.0, 70.0, 90.0),
}

SOURCE = "EN 1993-1-1:2005 §5.5.2 and Table 5.2 (limits from memory)"


@dataclass(frozen=True, kw_only=True)
class Part:
    """One plate (or the whole tube) of the section, classified.

    Attributes
    ----------
    name : str
        e.g. ``"web"``, ``"flange outstand"``, ``"wall"``.
    stress : str
        The row of Table 5.2 used (a key of :data:`LIMITS`).
    ratio : float
        c/t (d/t for a CHS) [-].
    limits : tuple of float
        The class 1, 2 and 3 limits of the ratio [-] (ε or ε² applied).
    klass : int
        1 to 4.
    """

    name: str
    stress: str
    ratio: float
    limits: tuple
    klass: int


@dataclass(frozen=True, kw_only=True)
class SectionClass:
    """The section's class and how it was found.

    Attributes
    ----------
    klass : int
        1 to 4, the worst part's class.
    parts : tuple of Part
    epsilon : float
        :math:`\\sqrt{235/f_y}` [-].
    basis : str
        The stress distribution assumed, in words.
    source : str
    """

    klass: int
    parts: tuple
    epsilon: float
    basis: str
    source: str = SOURCE

    @property
    def governing(self) -> Part | None:
        """The part with the worst class (the first such one), or None for a solid section."""
        return max(self.parts, key=lambda p: p.klass) if self.parts else None

    def describe(self) -> str:
        """One line, e.g. ``class 1 (web c/t = 14.9 <= 26.8)``."""
        part = self.governing
        if part is None:
            return f"class {self.klass} ({self.basis})"
        bound = part.limits[min(part.klass, 3) - 1]
        sign = "<=" if part.klass < 4 else ">"
        what = "d/t" if part.stress == "chs" else "c/t"
        return f"class {self.klass} ({part.name} {what} = {part.ratio:.1f} {sign} {bound:.1f})"


def epsilon(fy: float) -> float:
    r""":math:`\varepsilon = \sqrt{235/f_y}` with :math:`f_y` in Pa, EN 1993-1-1:2005 Table 5.2 (from memory).

    Examples
    --------
    >>> round(epsilon(355e6), 4)
    0.8136
    """
    return math.sqrt(235e6 / fy)


def _part(name: str, stress: str, ratio: float, eps: float) -> Part:
    factor = eps * eps if stress == "chs" else eps
    limits = tuple(value * factor for value in LIMITS[stress])
    klass = next((k + 1 for k, limit in enumerate(limits) if ratio <= limit * (1 + 1e-12)), 4)
    return Part(name=name, stress=stress, ratio=ratio, limits=limits, klass=klass)


def classify(section, material, *, compression: bool) -> SectionClass | None:
    """The class of ``section`` of ``material`` by EN 1993-1-1 Table 5.2, or None where it does not apply.

    Parameters
    ----------
    section : Section
        About the axis of bending (``section.axis``).
    material : Material
        Only steel is classified.
    compression : bool
        Whether the member carries an axial compression (see the module's notes on the stresses assumed).

    Returns
    -------
    SectionClass or None
        None for a custom section, a section without its dimensions, or a material other than steel.
    """
    if material is None or section is None or material.kind != "steel":
        return None
    eps = epsilon(material.fy)
    shape, dims = section.shape, dict(section.dimensions or {})
    web_stress = "internal compression" if compression else "internal bending"
    basis = (
        "webs taken in pure compression under axial compression (conservative)"
        if compression
        else "webs taken in pure bending without axial compression"
    )
    parts = []
    try:
        if shape in ("rolled_i", "welded_i"):
            h, b, tw, tf = dims["h"], dims["b"], dims["tw"], dims["tf"]
            r = dims.get("r", 0.0) if shape == "rolled_i" else 0.0
            web = (h - 2 * tf - 2 * r) / tw
            if section.axis == "major":
                parts.append(_part("web", web_stress, web, eps))
            elif compression:
                parts.append(_part("web", "internal compression", web, eps))
            parts.append(_part("flange outstand", "outstand compression", (b - tw - 2 * r) / 2 / tf, eps))
        elif shape == "rhs":
            h, b, t = dims["h"], dims["b"], dims["t"]
            in_plane, across = (h, b) if section.axis == "major" else (b, h)
            parts.append(_part("side wall (web)", web_stress, (in_plane - 3 * t) / t, eps))
            flange = (across - 3 * t) / t
            parts.append(_part("compression wall (flange)", "internal compression", flange, eps))
        elif shape == "chs":
            parts.append(_part("tube", "chs", dims["D"] / dims["t"], eps))
            basis = "d/t limit, the same for compression and bending"
        elif shape in ("rectangle", "round"):
            return SectionClass(
                klass=1,
                parts=(),
                epsilon=eps,
                basis="solid section: no local buckling (common practice, no source)",
            )
        else:
            return None
    except KeyError:
        return None
    return SectionClass(klass=max(p.klass for p in parts), parts=tuple(parts), epsilon=eps, basis=basis)


def eq_5_9_modulus(section, material, method: str) -> float:
    """The section modulus of M_Rk in eq. (5.10) and in the linear check of the eq. (5.9) route.

    W_el for the elastic check; for the plastic check W_pl of a class 1 or 2 section and W_el of any other
    (class 3 or 4, unclassified, or a shape the plastic check does not cover), EN 1993-1-1 §6.2.9 (from
    memory). The class is the one under axial compression.
    """
    if method != "plastic" or section.shape not in ("rolled_i", "welded_i", "rhs", "chs", "rectangle"):
        return section.W_el
    found = classify(section, material, compression=True)
    return section.W_pl if found is not None and found.klass <= 2 else section.W_el


#: h_w/t_w above which a web without intermediate stiffeners must be checked for shear buckling, in units of
#: ε/η: EN 1993-1-1:2005 §6.2.6(6) and EN 1993-1-5 §5.1(2) (from memory), with η = 1 (the value some national
#: annexes set; 1.2 is recommended up to S460): the lower limit, so that no slender web goes unwarned.
WEB_SHEAR_LIMIT = 72.0


def web_shear_slenderness(section, material, axis: str) -> tuple[float, float] | None:
    """(h_w/t_w, the limit 72ε/η with η = 1) of the web that carries the shear of bending about ``axis``:
    an I/H's web (h_w = h − 2t_f) or an RHS's two side walls (h_w = h − 2t) in major-axis bending, the RHS's
    other walls in minor-axis bending. None for other shapes, minor-axis bending of an I/H (its flanges carry
    the shear) or a material other than steel.

    >>> from engine.materials import material_from_spec
    >>> from engine.sections import section_from_spec
    >>> plates = {"shape": "welded_i", "h": 1.0, "b": 0.3, "tw": 0.008, "tf": 0.02}
    >>> welded = section_from_spec(plates, "major")
    >>> ratio, limit = web_shear_slenderness(welded, material_from_spec({"name": "S355"}, 0.02), "major")
    >>> round(ratio, 1), round(limit, 1)
    (120.0, 59.4)
    """
    if section is None or material is None or material.kind != "steel":
        return None
    dims = section.dimensions
    if section.shape in ("rolled_i", "welded_i") and axis == "major":
        web, thickness = dims["h"] - 2.0 * dims["tf"], dims["tw"]
    elif section.shape == "rhs":
        side = dims["h"] if axis == "major" else dims["b"]
        web, thickness = side - 2.0 * dims["t"], dims["t"]
    else:
        return None
    return web / thickness, WEB_SHEAR_LIMIT * epsilon(material.fy)
