r"""Torsion properties of a cross-section: the St Venant torsion constant I_t and the warping constant I_w.

The groundwork of the lateral-torsional buckling check: closed forms of the handbooks for every shape
:mod:`engine.sections` builds, each with its source beside it. Dimensions in m, I_t in m⁴, I_w in m⁶. Every
shape here is doubly symmetric, so its shear centre is its centroid.

===============  ==============================================================  ==========================
shape            I_t                                                             I_w
===============  ==============================================================  ==========================
rolled I/H       SCI P363 "Blue Book" formula with the root-fillet term            flanges only,
                 (El Darwish & Johnston), :func:`rolled_i_torsion`                 :func:`i_warping`
welded I         the same formula with r = 0 (fillet welds left out)               flanges only
RHS/SHS          EN 10210-2 / EN 10219-2 Annex B: t³h_m/3 + 2KA_m, mid-line         0 (closed section,
                 with the corner radius R_c = (r_o + r_i)/2                        neglected)
CHS              2I, exact                                                        0, exact
rectangle        Saint-Venant's series, exact                                     0 (solid, neglected)
round            πD⁴/32, exact                                                    0, exact
===============  ==============================================================  ==========================

Every neglected or approximated term errs on the safe side for lateral-torsional buckling, whose elastic
critical moment only rises with I_t and I_w, except where DEVELOPERS.md (decisions log, issue 15) gives the
measured difference against a finite-element computation (the rolled shapes' I_w and, by under 1 %, I_t).

A custom section's I_t and I_w are what the case gives (keys ``It`` and ``Iw``), or None when it gives none.
"""

from __future__ import annotations

import math
import numbers
from dataclasses import dataclass

from engine.errors import CaseError
from engine.section_properties import corner_radii
from engine.validate import show

__all__ = [
    "TorsionProperties",
    "circular_hollow_torsion",
    "i_warping",
    "rectangular_hollow_torsion",
    "rolled_i_torsion",
    "shape_torsion",
    "solid_rectangle_torsion",
    "solid_round_torsion",
    "torsion_properties",
]

#: ζ(5), Apéry's constant's neighbour (Abramowitz & Stegun, Table 23.3, from memory; checked with mpmath in
#: tests/engine/test_torsion.py). The odd terms sum to (1 − 2⁻⁵) ζ(5).
_ZETA_5 = 1.0369277551433699263

_ROLLED_I_SOURCE = (
    "I_t by the SCI P363 formula for rolled I/H sections, "
    "2/3 b tf³ + 1/3 (h - 2tf) tw³ + 2 α₁ D₁⁴ - 0.420 tf⁴ "
    "(root fillet term after El Darwish & Johnston 1965; from memory)"
)
_WARPING_SOURCE = (
    "I_w = tf b³ (h - tf)²/24, thin-walled theory, flanges only (Timoshenko & Gere; from memory)"
)
_SOURCES = {
    "rolled_i": f"{_ROLLED_I_SOURCE}; {_WARPING_SOURCE}",
    "welded_i": f"{_ROLLED_I_SOURCE} with r = 0, fillet welds left out; {_WARPING_SOURCE}",
    "rhs": (
        "I_t = t³ h_m/3 + 2 K A_m, K = 2 A_m t/h_m, on the mid-line with the corner radius "
        "R_c = (r_o + r_i)/2 "
        "(EN 10210-2 / EN 10219-2 Annex B; from memory); I_w = 0, the small warping of a closed section "
        "neglected (conservative)"
    ),
    "chs": "I_t = 2I = π(D⁴ - d⁴)/32 (exact, Saint-Venant); I_w = 0 (exact)",
    "rectangle": (
        "I_t by Saint-Venant's series (exact; Timoshenko & Goodier, Theory of Elasticity, from memory); "
        "I_w = 0, the small warping of a solid section neglected (conservative)"
    ),
    "round": "I_t = πD⁴/32 (exact, Saint-Venant); I_w = 0 (exact)",
}


@dataclass(frozen=True, kw_only=True)
class TorsionProperties:
    """The torsion properties of a cross-section.

    Parameters
    ----------
    I_t : float or None
        St Venant torsion constant [m⁴], > 0; None when unknown (a custom section given without ``It``).
    I_w : float or None
        Warping constant about the shear centre [m⁶], >= 0; None when unknown.
    shear_centre_at_centroid : bool or None
        Whether the shear centre is the centroid: True for every doubly symmetric section, None when unknown.
    source : str
        The formulas used and where they come from, "from memory" where so.

    Raises
    ------
    CaseError
        For an I_t that is not a finite number > 0, or an I_w that is not a finite number >= 0.
    """

    I_t: float | None
    I_w: float | None
    shear_centre_at_centroid: bool | None
    source: str

    def __post_init__(self) -> None:
        for name, unit, zero in (("I_t", "m⁴", False), ("I_w", "m⁶", True)):
            value = getattr(self, name)
            if value is None:
                continue
            bound = ">= 0" if zero else "> 0"
            ok = isinstance(value, numbers.Real) and not isinstance(value, bool) and math.isfinite(value)
            if not ok or value < 0.0 or (value == 0.0 and not zero):
                raise CaseError(
                    f"{name}: {show(value)} {unit} is not allowed; it must be a finite number {bound}"
                )
            object.__setattr__(self, name, float(value))
        if self.shear_centre_at_centroid not in (True, False, None):
            raise CaseError(
                f"shear_centre_at_centroid: {show(self.shear_centre_at_centroid)} is not allowed; "
                f"it must be true, false or null"
            )
        if not isinstance(self.source, str):
            raise CaseError(f"source: {show(self.source)} is not allowed; it must be a string")


# ----------------------------------------------------------------------------- formulas


def rolled_i_torsion(h: float, b: float, tw: float, tf: float, r: float) -> float:
    r"""St Venant torsion constant [m⁴] of a doubly symmetric I/H section with root fillets of radius r.

    The formula of SCI P363 (*Steel building design: design data*, notes on the tables; from memory), whose
    fillet term is El Darwish & Johnston's (1965, *Torsion of structural shapes*, J. Struct. Div. ASCE 91):

    .. math::

        I_t = \tfrac{2}{3} b t_f^3 + \tfrac{1}{3}(h - 2t_f) t_w^3 + 2\alpha_1 D_1^4 - 0.420\,t_f^4,

        \alpha_1 = -0.042 + 0.2204\frac{t_w}{t_f} + 0.1355\frac{r}{t_f} - 0.0865\frac{r t_w}{t_f^2}
        - 0.0725\frac{t_w^2}{t_f^2}, \qquad D_1 = \frac{(t_f + r)^2 + (r + t_w/4)\,t_w}{2r + t_f}.

    D₁ is the diameter of the largest circle inscribed at a web–flange junction, 0.420 t_f⁴ the four free
    flange tips (2 × 0.21 t_f⁴ per flange). With r = 0 (a welded I, its fillet welds left out) the junction
    term stays: it is what the junction adds to the rectangles. With tw > tf, outside the fit's range, the
    junction term is left out (the rectangles alone, less than the exact value). Measured against finite
    elements in tests/engine/test_torsion.py and DEVELOPERS.md (issue 15).

    >>> round(rolled_i_torsion(0.2, 0.2, 0.009, 0.015, 0.018) * 1e8, 1)  # HEB 200 [cm⁴]
    59.7
    """
    web = h - 2.0 * tf
    if tw > tf:  # outside the fit (every table has tw < tf): the junction term left out, which is safe
        return 2.0 / 3.0 * b * tf**3 + web * tw**3 / 3.0 - 0.420 * tf**4
    alpha = (
        -0.042
        + 0.2204 * tw / tf
        + 0.1355 * r / tf
        - 0.0865 * r * tw / (tf * tf)
        - 0.0725 * tw * tw / (tf * tf)
    )
    inscribed = ((tf + r) ** 2 + (r + 0.25 * tw) * tw) / (2.0 * r + tf)
    return 2.0 / 3.0 * b * tf**3 + web * tw**3 / 3.0 + 2.0 * alpha * inscribed**4 - 0.420 * tf**4


def i_warping(h: float, b: float, tf: float) -> float:
    r"""Warping constant [m⁶] of a doubly symmetric I/H section about its shear centre (the centroid).

    Thin-walled theory with the flanges only: :math:`I_w = I_f h_s^2/2 = t_f b^3 (h - t_f)^2/24`, I_f one
    flange's second moment about the web, h_s the distance between the flanges' mid-planes (Timoshenko &
    Gere, *Theory of Elastic Stability*, the I-beam's warping constant; from memory). It reproduces the EN
    catalogue values (HEB 200: 171.1·10³ cm⁶, from memory) and lies below I_z h_s²/4 with the whole section's
    I_z (the conservative of the two for lateral-torsional buckling).

    >>> round(i_warping(0.2, 0.2, 0.015) * 1e12 / 1e3, 1)  # HEB 200 [10³ cm⁶]
    171.1
    """
    return tf * b**3 * (h - tf) ** 2 / 24.0


def rectangular_hollow_torsion(h: float, b: float, t: float, manufacture: str) -> float:
    r"""St Venant torsion constant [m⁴] of a rectangular hollow section.

    EN 10210-2 and EN 10219-2, Annex B (from memory), on the wall's mid-line with the mean corner radius
    :math:`R_c = (r_o + r_i)/2` (the radii of :func:`engine.section_properties.corner_radii`):

    .. math::

        I_t = \frac{t^3 h_m}{3} + 2 K A_m, \quad K = \frac{2 A_m t}{h_m}, \quad
        h_m = 2[(b - t) + (h - t)] - 2R_c(4 - \pi), \quad A_m = (b - t)(h - t) - R_c^2(4 - \pi),

    Bredt's closed-cell term :math:`4A_m^2 t/h_m` plus the walls' own open-section term.
    """
    outer, inner = corner_radii(t, manufacture)
    mean = 0.5 * (outer + inner)
    perimeter = 2.0 * ((b - t) + (h - t)) - 2.0 * mean * (4.0 - math.pi)
    enclosed = (b - t) * (h - t) - mean * mean * (4.0 - math.pi)
    k = 2.0 * enclosed * t / perimeter
    return t**3 * perimeter / 3.0 + 2.0 * k * enclosed


def circular_hollow_torsion(D: float, t: float) -> float:
    r"""St Venant torsion constant [m⁴] of a circular hollow section, :math:`2I = \pi(D^4 - d^4)/32`.

    Exact for any wall (Saint-Venant's solution: a tube does not warp).
    """
    d = D - 2.0 * t
    return math.pi * (D**4 - d**4) / 32.0


def solid_rectangle_torsion(b: float, h: float) -> float:
    r"""St Venant torsion constant [m⁴] of a solid rectangle b × h, by Saint-Venant's series (exact).

    With a >= c the longer and shorter sides (Timoshenko & Goodier, *Theory of Elasticity*, torsion of a
    rectangular bar; from memory):

    .. math::

        I_t = \frac{a c^3}{3}\left[1 - \frac{192}{\pi^5}\frac{c}{a}
        \sum_{n = 1, 3, 5, \ldots} \frac{\tanh(n\pi a / 2c)}{n^5}\right].

    The sum is written as :math:`(1 - 2^{-5})\zeta(5) - \sum (1 - \tanh x_n)/n^5`, whose terms fall as
    :math:`e^{-n\pi}`: a handful reach double precision. A thin strip gives
    :math:`a c^3/3\,(1 - 0.6303\,c/a)`.

    >>> round(solid_rectangle_torsion(1.0, 1.0), 5)  # a square: 0.1406 a⁴
    0.14058
    """
    a, c = max(b, h), min(b, h)
    total = (1.0 - 2.0**-5) * _ZETA_5
    n = 1
    while True:
        x = n * math.pi * a / (2.0 * c)
        decay = math.exp(-2.0 * x)
        shortfall = 2.0 * decay / (1.0 + decay) / n**5  # (1 - tanh x)/n⁵
        total -= shortfall
        if shortfall < 1e-18:
            break
        n += 2
    return a * c**3 / 3.0 * (1.0 - 192.0 / math.pi**5 * (c / a) * total)


def solid_round_torsion(D: float) -> float:
    r"""St Venant torsion constant [m⁴] of a solid round bar, the polar moment :math:`\pi D^4/32` (exact)."""
    return math.pi * D**4 / 32.0


# ----------------------------------------------------------------------------- per shape


def shape_torsion(shape: str, manufacture: str, dims: dict[str, float]) -> TorsionProperties:
    """The torsion properties of a parametric shape of :mod:`engine.sections` from its checked dimensions.

    Parameters
    ----------
    shape : str
        ``"rolled_i"``, ``"welded_i"``, ``"rhs"``, ``"chs"``, ``"rectangle"`` or ``"round"``.
    manufacture : str
        How it is made (an RHS's corner radii depend on it).
    dims : dict
        The dimensions [m], keys as in the section spec.

    Returns
    -------
    TorsionProperties
        I_t [m⁴], I_w [m⁶], the shear centre at the centroid (every shape here is doubly symmetric), source.

    Raises
    ------
    ValueError
        For a shape without closed forms here (``"custom"``: see :func:`torsion_properties`).
    """
    if shape in ("rolled_i", "welded_i"):
        r = dims["r"] if shape == "rolled_i" else 0.0
        I_t = rolled_i_torsion(dims["h"], dims["b"], dims["tw"], dims["tf"], r)
        I_w = i_warping(dims["h"], dims["b"], dims["tf"])
    elif shape == "rhs":
        I_t, I_w = rectangular_hollow_torsion(dims["h"], dims["b"], dims["t"], manufacture), 0.0
    elif shape == "chs":
        I_t, I_w = circular_hollow_torsion(dims["D"], dims["t"]), 0.0
    elif shape == "rectangle":
        I_t, I_w = solid_rectangle_torsion(dims["b"], dims["h"]), 0.0
    elif shape == "round":
        I_t, I_w = solid_round_torsion(dims["D"]), 0.0
    else:
        raise ValueError(f"shape {shape!r} has no closed-form torsion properties")
    return TorsionProperties(I_t=I_t, I_w=I_w, shear_centre_at_centroid=True, source=_SOURCES[shape])


def torsion_properties(section) -> TorsionProperties:
    """The torsion properties of a :class:`engine.sections.Section`: I_t [m⁴], I_w [m⁶] and their source.

    A parametric or catalogue section's come from the closed forms (:func:`shape_torsion`); a custom
    section's are the ``It`` and ``Iw`` the case gives, None for a key left out.

    Examples
    --------
    >>> from engine.sections import section_from_spec
    >>> props = torsion_properties(section_from_spec({"name": "IPE 300"}))
    >>> round(props.I_t * 1e8, 1), round(props.I_w * 1e12 / 1e3, 1)  # [cm⁴], [10³ cm⁶]
    (19.9, 125.9)
    """
    return section.torsion
