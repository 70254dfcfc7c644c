r"""The code rules the member check uses, as pure functions of plain numbers and names.

Sources, each with how sure the project is of it ("[text]": seen in a published text; "from memory": recalled,
to be checked against a copy of the standard; "[derived]": re-derived from the governing equation):

- EN 1993-1-1:2005 Table 6.1, imperfection factors :math:`\alpha` [text]; eq. (6.49), the reduction factor
  :math:`\chi` [text]; Table 6.2, the choice of buckling curve (cells from memory).
- EN 1993-1-1:2005 Table 5.1, the design initial bow :math:`e_0/L` [text: Simões da Silva et al., *Design of
  Steel Structures*, ECCS 2010, table 2.20]; §5.3.2(3), the sway imperfection (from memory); §5.3.2(11),
  eq. (5.9), the amplitude of a first-mode imperfection (from memory).
- EN 1993-1-1:2005 §6.2.8, the shear reduction of the yield strength, and §6.2.9.1, the plastic bending
  resistance reduced by axial force (equation numbers from memory).
- AISC 303-16 §7.13.1.1, member out-of-straightness L/1000 and column out-of-plumb L/500 [text].

Sections are described by a shape name (:data:`SHAPES`); this module takes plain numbers and strings and knows
nothing of section tables.
"""

from __future__ import annotations

import math
import numbers
from types import MappingProxyType
from typing import Any

import numpy as np

from engine.errors import CaseError
from engine.validate import choice as _choice
from engine.validate import positive as _positive
from engine.validate import quoted as _quoted
from engine.validate import real as _finite
from engine.validate import show as _show

__all__ = [
    "AISC_OUT_OF_PLUMB",
    "AISC_OUT_OF_STRAIGHTNESS",
    "ALPHA_CR_LIMITS",
    "ALPHA_CR_SOURCE",
    "AXES",
    "BUCKLING_CURVES",
    "IMPERFECTION_FACTORS",
    "MANUFACTURES",
    "SHAPES",
    "alpha_cr_limit",
    "bow_ratio",
    "buckling_curve",
    "eq_5_9_amplitude",
    "plastic_interaction",
    "reduction_factor",
    "shear_reduction",
    "slenderness",
    "sway_imperfection",
]

#: Imperfection factor :math:`\alpha` of each buckling curve: EN 1993-1-1:2005 Table 6.1 [text].
IMPERFECTION_FACTORS = MappingProxyType({"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76})

#: The buckling curves, from the least to the most imperfect.
BUCKLING_CURVES: tuple[str, ...] = tuple(IMPERFECTION_FACTORS)

#: Member out-of-straightness tolerance L/1000: AISC 303-16 §7.13.1.1 [text].
AISC_OUT_OF_STRAIGHTNESS = 1000

#: Column out-of-plumb tolerance L/500: AISC 303-16 §7.13.1.1 [text].
AISC_OUT_OF_PLUMB = 500

#: Section shapes: rolled and welded doubly symmetric I or H sections, rectangular and circular hollow
#: sections, solid rectangles and rounds, and anything else (``custom``).
SHAPES: tuple[str, ...] = ("rolled_i", "welded_i", "rhs", "chs", "rectangle", "round", "custom")

#: How a section was made. Hollow sections must say ``hot_finished`` (EN 10210) or ``cold_formed`` (EN 10219);
#: ``""`` means not stated. Hyphens are read as underscores, so ``"hot-finished"`` is ``"hot_finished"``.
MANUFACTURES: tuple[str, ...] = ("rolled", "welded", "hot_finished", "cold_formed", "solid", "custom", "")

#: Bending axes: ``y`` (or ``major``) the major y–y axis, ``z`` (or ``minor``) the minor z–z axis of
#: EN 1993-1-1.
AXES: tuple[str, ...] = ("y", "z", "major", "minor")
_AXIS = {"y": "y", "z": "z", "major": "y", "minor": "z"}

#: α_cr = F_cr/F_Ed below which second-order effects must be taken into account, by the type of GLOBAL
#: analysis: EN 1993-1-1:2005 §5.2.1(3), eq. (5.1) (from memory). The limit 15 is for a plastic global
#: analysis, not for a plastic cross-section check after an elastic analysis (strutscope's analysis is
#: always elastic).
ALPHA_CR_LIMITS = MappingProxyType({"elastic": 10.0, "plastic": 15.0})
ALPHA_CR_SOURCE = "EN 1993-1-1:2005 §5.2.1(3), eq. (5.1) (clause from memory)"


def alpha_cr_limit(global_analysis: str = "elastic") -> float:
    """The α_cr limit of EN 1993-1-1 §5.2.1(3): 10 for an elastic, 15 for a plastic global analysis.

    Examples
    --------
    >>> alpha_cr_limit(), alpha_cr_limit("plastic")
    (10.0, 15.0)
    """
    _choice("global_analysis", global_analysis, tuple(ALPHA_CR_LIMITS))
    return ALPHA_CR_LIMITS[global_analysis]


# Table 5.1, e0/L = 1/ratio [text: ECCS 2010 table 2.20, reproducing EN 1993-1-1:2005 Table 5.1].
_BOW_RATIOS = {
    "elastic": {"a0": 350, "a": 300, "b": 250, "c": 200, "d": 150},
    "plastic": {"a0": 300, "a": 250, "b": 200, "c": 150, "d": 100},
}
_ANALYSES = tuple(_BOW_RATIOS)

# Manufactures each shape accepts; a rolled I called "welded" is a contradiction, not a choice.
_SHAPE_MANUFACTURES = {
    "rolled_i": ("rolled", "custom", ""),
    "welded_i": ("welded", "custom", ""),
    "rhs": ("hot_finished", "cold_formed"),
    "chs": ("hot_finished", "cold_formed"),
    "rectangle": MANUFACTURES,
    "round": MANUFACTURES,
    "custom": MANUFACTURES,
}

# Rounding in h/b or a thickness (0.24 m / 0.2 m, or 0.04 m read as 40.000000000000004 mm) does not move a
# section across a limit of Table 6.2; limits are "<=" on the thinner side as the table writes them.
_RELATIVE_TOLERANCE = 1e-9

_TABLE_6_2 = "EN 1993-1-1:2005 Table 6.2 (cells from memory)"


# ----------------------------------------------------------------------------- buckling curves


def buckling_curve(
    *, shape: str, manufacture: str, axis: str, h_over_b: float | None, t_max: float | None, grade: str | None
) -> tuple[str, str]:
    r"""The flexural buckling curve of a section, EN 1993-1-1:2005 Table 6.2.

    =====================================================  ============  ============
    section (cells from memory)                            S235 to S420  S460
                                                           y–y / z–z     y–y / z–z
    =====================================================  ============  ============
    rolled I, h/b > 1.2, :math:`t_f \le 40` mm             a / b         a0 / a0
    rolled I, h/b > 1.2, :math:`40 < t_f \le 100` mm       b / c         a / a
    rolled I, h/b :math:`\le` 1.2, :math:`t_f \le 100` mm  b / c         a / a
    rolled I, h/b :math:`\le` 1.2, :math:`t_f > 100` mm    d / d         c / c
    welded I, :math:`t_f \le 40` mm                        b / c         b / c
    welded I, :math:`t_f > 40` mm                          c / d         c / d
    hollow section, hot finished                           a             a0
    hollow section, cold formed                            c             c
    solid section                                          c             c
    =====================================================  ============  ============

    A rolled I with h/b > 1.2 and :math:`t_f > 100` mm is not in the table; it takes curve d, the curve of the
    thickest rolled sections (an assumption, common practice, no source). A ``custom`` section takes curve c
    (an assumption).

    Parameters
    ----------
    shape : str
        One of :data:`SHAPES`.
    manufacture : str
        One of :data:`MANUFACTURES`; ``hot_finished`` or ``cold_formed`` for ``rhs`` and ``chs``; ``rolled``,
        ``custom`` or ``""`` for ``rolled_i``; ``welded``, ``custom`` or ``""`` for ``welded_i``.
    axis : str
        ``"y"`` or ``"major"``; ``"z"`` or ``"minor"``.
    h_over_b : float or None
        Depth over flange width [-]; needed for ``rolled_i`` only.
    t_max : float or None
        Flange thickness :math:`t_f` of an I section [m] (the thickest plate is a safe stand-in: a thicker
        plate never gives a better curve); needed for ``rolled_i`` and ``welded_i`` only. Other shapes ignore
        it, but a number given must be > 0.
    grade : str or None
        Steel grade, e.g. ``"S460"``. Only the S460 grades have their own column; None or any other grade
        takes the S235 to S420 column.

    Returns
    -------
    curve : str
        ``"a0"``, ``"a"``, ``"b"``, ``"c"`` or ``"d"``.
    reason : str
        The row of the table that gave it, with its source.

    Raises
    ------
    CaseError
        For an unknown shape, manufacture or axis, a manufacture that contradicts the shape, a missing
        ``h_over_b`` or ``t_max`` for an I section, or a number that is not finite and > 0.

    Examples
    --------
    >>> buckling_curve(shape="rolled_i", manufacture="rolled", axis="y", h_over_b=2.0, t_max=0.0107,
    ...                grade="S355")[0]
    'a'
    """
    _choice("shape", shape, SHAPES)
    given_manufacture = manufacture
    if isinstance(manufacture, str):
        manufacture = manufacture.replace("-", "_")
    _choice("manufacture", manufacture, MANUFACTURES, shown=given_manufacture)
    _choice("axis", axis, AXES)
    axis = _AXIS[axis]
    allowed = _SHAPE_MANUFACTURES[shape]
    if manufacture not in allowed:
        raise CaseError(
            f"manufacture: {given_manufacture!r} does not fit shape {shape!r}; allowed: {_quoted(allowed)}"
        )
    if t_max is None:
        if shape in ("rolled_i", "welded_i"):
            raise CaseError(
                f"t_max: required for shape {shape!r} (the flange thickness); it must be a "
                f"finite number > 0 m"
            )
    else:
        t_max = _positive("t_max", t_max, "m")
    if grade is not None and not isinstance(grade, str):
        raise CaseError(f"grade: {_show(grade)} must be a string such as 'S355', or None")
    s460 = grade is not None and grade.replace(" ", "").upper().startswith("S460")
    column = "S460" if s460 else "S235 to S420"
    pick = 1 if s460 else 0
    on_axis = f"buckling about {axis}–{axis}"
    t_mm = t_max * 1000.0 if t_max is not None else math.nan

    if shape == "custom":
        return "c", "custom section: curve c assumed"
    if shape == "rolled_i":
        if h_over_b is None:
            raise CaseError("h_over_b: required for shape 'rolled_i'; it must be a finite number > 0")
        h_over_b = _positive("h_over_b", h_over_b, "")
        if h_over_b > 1.2 * (1 + _RELATIVE_TOLERANCE):
            if _at_most(t_mm, 40.0):
                curves, row = (("a", "b"), ("a0", "a0")), "t_f <= 40 mm"
            elif _at_most(t_mm, 100.0):
                curves, row = (("b", "c"), ("a", "a")), "40 < t_f <= 100 mm"
            else:
                return "d", (
                    f"rolled I section, h/b = {h_over_b:.3g} > 1.2 with t_f = {t_mm:g} mm > 100 mm "
                    f"is not in {_TABLE_6_2}: curve d assumed, as for the thickest rolled "
                    f"sections (common practice, no source)"
                )
            shape_text = f"rolled I section, h/b = {h_over_b:.3g} > 1.2, {row} (t_f = {t_mm:g} mm)"
        else:
            if _at_most(t_mm, 100.0):
                curves, row = (("b", "c"), ("a", "a")), "t_f <= 100 mm"
            else:
                curves, row = (("d", "d"), ("c", "c")), "t_f > 100 mm"
            shape_text = f"rolled I section, h/b = {h_over_b:.3g} <= 1.2, {row} (t_f = {t_mm:g} mm)"
        curve = curves[pick][("y", "z").index(axis)]
    elif shape == "welded_i":
        if _at_most(t_mm, 40.0):
            curves, row = ("b", "c"), "t_f <= 40 mm"
        else:
            curves, row = ("c", "d"), "t_f > 40 mm"
        curve = curves[("y", "z").index(axis)]
        shape_text = f"welded I section, {row} (t_f = {t_mm:g} mm)"
    elif shape in ("rhs", "chs"):
        if manufacture == "hot_finished":
            curve = "a0" if s460 else "a"
        else:
            curve = "c"
        shape_text = (
            f"{'rectangular' if shape == 'rhs' else 'circular'} hollow section, "
            f"{manufacture.replace('_', ' ')}"
        )
    else:  # rectangle, round
        curve = "c"
        shape_text = f"solid {'rectangular' if shape == 'rectangle' else 'round'} section"
    return curve, f"{_TABLE_6_2}: {shape_text}, {column}, {on_axis}: curve {curve}"


def bow_ratio(curve: str, analysis: str) -> int:
    r"""The ratio :math:`L/e_0` of the design initial bow, EN 1993-1-1:2005 Table 5.1.

    .. math:: \frac{e_0}{L} = \frac{1}{\text{ratio}}

    ======== ==== ==== ==== ==== ====
    curve    a0   a    b    c    d
    elastic  350  300  250  200  150
    plastic  300  250  200  150  100
    ======== ==== ==== ==== ==== ====

    Source: Table 5.1 as reproduced in Simões da Silva et al., *Design of Steel Structures*, ECCS 2010,
    table 2.20 [text].

    Parameters
    ----------
    curve : str
        Buckling curve, ``"a0"`` to ``"d"``.
    analysis : str
        ``"elastic"`` or ``"plastic"`` cross-section resistance.

    Returns
    -------
    int
        The ratio [-]; the bow amplitude is :math:`e_0 = L/\text{ratio}` [m].

    Examples
    --------
    >>> bow_ratio("b", "elastic")
    250
    """
    _choice("curve", curve, BUCKLING_CURVES)
    _choice("analysis", analysis, _ANALYSES)
    return _BOW_RATIOS[analysis][curve]


# ----------------------------------------------------------------------------- flexural buckling


def slenderness(A: float, fy: float, N_cr: float) -> float:
    r"""Non-dimensional slenderness, EN 1993-1-1:2005 §6.3.1.2.

    .. math:: \bar\lambda = \sqrt{\frac{A f_y}{N_{cr}}}

    Parameters
    ----------
    A : float
        Cross-section area [m²] (the effective area for a class 4 section).
    fy : float
        Yield strength [Pa].
    N_cr : float
        Elastic critical force for the buckling mode [N]; ``inf`` gives 0.

    Returns
    -------
    float
        :math:`\bar\lambda` [-].

    Examples
    --------
    >>> slenderness(1e-2, 3.55e8, 3.55e6)
    1.0
    """
    A = _positive("A", A, "m²")
    fy = _positive("fy", fy, "Pa")
    N_cr = _positive("N_cr", N_cr, "N", allow_infinite=True)
    return math.sqrt(A * fy / N_cr)


def reduction_factor(lambda_bar: float, curve: str) -> float:
    r"""Flexural buckling reduction factor :math:`\chi`, EN 1993-1-1:2005 §6.3.1.2, eq. (6.49).

    .. math::

        \chi = \frac{1}{\Phi + \sqrt{\Phi^2 - \bar\lambda^2}} \le 1, \qquad
        \Phi = 0.5\left[1 + \alpha(\bar\lambda - 0.2) + \bar\lambda^2\right]

    with :math:`\alpha` of Table 6.1 (:data:`IMPERFECTION_FACTORS`). For :math:`\bar\lambda \le 0.2` the
    formula reaches 1 or more, so :math:`\chi = 1`; §6.3.1.2(4) then lets buckling effects be ignored
    altogether.

    Parameters
    ----------
    lambda_bar : float
        Non-dimensional slenderness :math:`\bar\lambda` [-], >= 0.
    curve : str
        Buckling curve, ``"a0"`` to ``"d"``.

    Returns
    -------
    float
        :math:`\chi` [-], in (0, 1].

    Examples
    --------
    >>> round(reduction_factor(1.0, "b"), 4)
    0.597
    """
    _choice("curve", curve, BUCKLING_CURVES)
    lam = _positive("lambda_bar", lambda_bar, "", allow_zero=True)
    alpha = IMPERFECTION_FACTORS[curve]
    phi = 0.5 * (1.0 + alpha * (lam - 0.2) + lam * lam)
    # Φ − λ̄ = 0.5[(1 − λ̄)² + α(λ̄ − 0.2)] > 0 for every λ̄ >= 0 and every α of Table 6.1, so the root is real,
    # and Φ + √(…) adds two positive numbers: the form has no cancellation.
    return min(1.0, 1.0 / (phi + math.sqrt(phi * phi - lam * lam)))


def eq_5_9_amplitude(
    *, curve: str, lambda_bar: float, M_Rk: float, N_Rk: float, gamma_M1: float = 1.0
) -> float:
    r"""Amplitude :math:`e_0` of an imperfection in the shape of the first buckling mode,
    EN 1993-1-1:2005 §5.3.2(11), eq. (5.9) (from memory).

    .. math::

        e_0 = \alpha(\bar\lambda - 0.2)\,\frac{M_{Rk}}{N_{Rk}}\,
              \frac{1 - \chi\bar\lambda^2/\gamma_{M1}}{1 - \chi\bar\lambda^2}
              \quad\text{for } \bar\lambda > 0.2, \qquad e_0 = 0 \text{ otherwise}

    With it, the elastic second-order check of the cross-section,
    :math:`N/N_{Rk} + N e_0/[(1 - N/N_{cr}) M_{Rk}] = 1`, is met exactly at :math:`N = \chi N_{Rk}` when
    :math:`\gamma_{M1} = 1` (the Ayrton–Perry identity, [derived]).

    Parameters
    ----------
    curve : str
        Buckling curve, ``"a0"`` to ``"d"``.
    lambda_bar : float
        Non-dimensional slenderness [-], >= 0.
    M_Rk : float
        Characteristic moment resistance of the critical cross-section [N·m] (elastic or plastic, as the
        check that follows).
    N_Rk : float
        Characteristic axial resistance [N].
    gamma_M1 : float
        Partial factor for member instability [-], >= 1.

    Returns
    -------
    float
        :math:`e_0` [m].

    Examples
    --------
    >>> round(eq_5_9_amplitude(curve="b", lambda_bar=1.0, M_Rk=5e4, N_Rk=1e6), 6)
    0.0136
    """
    _choice("curve", curve, BUCKLING_CURVES)
    lam = _positive("lambda_bar", lambda_bar, "", allow_zero=True)
    M_Rk = _positive("M_Rk", M_Rk, "N·m")
    N_Rk = _positive("N_Rk", N_Rk, "N")
    gamma_M1 = _positive("gamma_M1", gamma_M1, "")
    if gamma_M1 < 1.0:
        raise CaseError(f"gamma_M1: {gamma_M1!r} must be >= 1 (a partial factor)")
    if lam <= 0.2:
        return 0.0
    chi = reduction_factor(lam, curve)
    used = chi * lam * lam  # < 1 for every λ̄ > 0.2 (it equals Φ − √(Φ² − λ̄²))
    return IMPERFECTION_FACTORS[curve] * (lam - 0.2) * M_Rk / N_Rk * (1.0 - used / gamma_M1) / (1.0 - used)


def sway_imperfection(*, h: float, m: int = 1) -> float:
    r"""Global initial sway imperfection :math:`\phi`, EN 1993-1-1:2005 §5.3.2(3) (from memory).

    .. math::

        \phi = \phi_0\,\alpha_h\,\alpha_m, \quad \phi_0 = \frac{1}{200}, \quad
        \alpha_h = \frac{2}{\sqrt{h}},\ \frac{2}{3} \le \alpha_h \le 1, \quad
        \alpha_m = \sqrt{0.5\left(1 + \frac{1}{m}\right)}

    Parameters
    ----------
    h : float
        Height of the structure [m] (the formula takes h in metres).
    m : int
        Number of columns in a row that carry a vertical load of at least half the mean column load [-], >= 1.

    Returns
    -------
    float
        :math:`\phi` [rad].

    Examples
    --------
    >>> sway_imperfection(h=4.0)
    0.005
    """
    h = _positive("h", h, "m")
    if isinstance(m, bool) or not isinstance(m, numbers.Integral) or m < 1:
        raise CaseError(f"m: {_show(m)} must be a whole number >= 1 (columns in the row)")
    alpha_h = min(1.0, max(2.0 / 3.0, 2.0 / math.sqrt(h)))
    alpha_m = math.sqrt(0.5 * (1.0 + 1.0 / int(m)))
    return alpha_h * alpha_m / 200.0


# ----------------------------------------------------------------------------- cross-section resistance


def plastic_interaction(*, shape: str, axis: str, n, a: float | None = None):
    r"""Plastic moment resistance reduced by axial force :math:`M_{N,Rd}/M_{pl,Rd}`, EN 1993-1-1 §6.2.9.1.

    With :math:`n = N_{Ed}/N_{pl,Rd}` (tension and compression alike, by the symmetry of the section) and the
    web or flange share :math:`a`, capped at 0.5 as the clause says:

    - solid rectangle, eq. (6.32): :math:`1 - n^2` (exact, [derived]);
    - doubly symmetric I or H (``rolled_i``, ``welded_i``), :math:`a = (A - 2 b t_f)/A`:
      major axis, eq. (6.36): :math:`(1 - n)/(1 - 0.5a) \le 1`; minor axis, eqs. (6.37)–(6.38): 1 for
      :math:`n \le a`, else :math:`1 - [(n - a)/(1 - a)]^2`;
    - RHS, eqs. (6.39)–(6.40): :math:`(1 - n)/(1 - 0.5a) \le 1`, with :math:`a = a_w = (A - 2bt)/A` about
      y–y and :math:`a = a_f = (A - 2ht)/A` about z–z;
    - CHS: :math:`1 - n^{1.7}` (from memory; the clause that gives it is not confirmed), but never above
      :math:`\cos(\pi n/2)`, the exact interaction of a thin tube and the lowest of any tube (a plastic
      integration of the annulus; above :math:`n \approx 0.69` the power law exceeds the exact value of a
      thin tube by up to about 5 %: a decision of the project, DEVELOPERS.md decisions log, stop 34);
    - ``round`` and ``custom``: :math:`1 - n`, the straight line between pure bending and pure axial force.
      It is safe for any section because the plastic interaction of a cross-section is convex [derived];
      EN 1993-1-1 gives no rule for them.

    Equation numbers are from memory. ``a`` is needed by the I and RHS rules only.

    Parameters
    ----------
    shape : str
        One of :data:`SHAPES`.
    axis : str
        ``"y"`` or ``"major"``; ``"z"`` or ``"minor"``.
    n : float or array_like
        :math:`N_{Ed}/N_{pl,Rd}` [-]; its sign is ignored.
    a : float or None
        :math:`a`, :math:`a_w` or :math:`a_f` [-], >= 0 and < 1; required for ``rolled_i``, ``welded_i`` and
        ``rhs``, ignored otherwise.

    Returns
    -------
    float or numpy.ndarray
        :math:`M_{N,Rd}/M_{pl,Rd}` [-], in [0, 1]; 0 when :math:`|n| \ge 1`. An array when ``n`` is one.

    Examples
    --------
    >>> plastic_interaction(shape="rolled_i", axis="y", n=0.5, a=0.4)
    0.625
    """
    _choice("shape", shape, SHAPES)
    _choice("axis", axis, AXES)
    axis = _AXIS[axis]
    values, scalar = _finite_values("n", n)
    n = np.minimum(np.abs(values), 1.0)  # from |n| = 1 on, every rule below gives 0
    if shape in ("rolled_i", "welded_i", "rhs"):
        if a is None:
            raise CaseError(f"a: required for shape {shape!r}; it must be a number >= 0 and < 1")
        a = _finite("a", a)
        if not 0.0 <= a < 1.0:
            raise CaseError(
                f"a: {a!r} must be >= 0 and < 1 (the share of the area outside the flanges or webs)"
            )
        a = min(a, 0.5)
    if shape == "rectangle":
        result = 1.0 - n * n
    elif shape in ("rolled_i", "welded_i") and axis == "z":
        result = np.where(n <= a, 1.0, 1.0 - ((n - a) / (1.0 - a)) ** 2)
    elif shape in ("rolled_i", "welded_i", "rhs"):
        result = np.minimum(1.0, (1.0 - n) / (1.0 - 0.5 * a))
    elif shape == "chs":  # never above the thin tube's exact cos(πn/2), the lowest of any tube (a decision)
        result = np.minimum(1.0 - n**1.7, np.cos(0.5 * math.pi * n))
    else:  # round, custom
        result = 1.0 - n
    return float(result) if scalar else result


def shear_reduction(V_Ed, V_pl_Rd: float):
    r"""Reduction :math:`\rho` of the yield strength for shear, EN 1993-1-1:2005 §6.2.8(3).

    .. math::

        \rho = 0 \quad\text{for } |V_{Ed}| \le 0.5 V_{pl,Rd}, \qquad
        \rho = \left(\frac{2 |V_{Ed}|}{V_{pl,Rd}} - 1\right)^2 \quad\text{otherwise}

    The reduced yield strength :math:`(1 - \rho) f_y` then applies to the shear area. For
    :math:`|V_{Ed}| \ge V_{pl,Rd}` the section fails in shear (a separate check); :math:`\rho` is held at 1
    there so that no strength becomes negative.

    Parameters
    ----------
    V_Ed : float or array_like
        Design shear force [N]; its sign is ignored.
    V_pl_Rd : float
        Design plastic shear resistance [N], > 0.

    Returns
    -------
    float or numpy.ndarray
        :math:`\rho` [-], in [0, 1]. An array when ``V_Ed`` is one.

    Examples
    --------
    >>> shear_reduction(75e3, 100e3)
    0.25
    """
    values, scalar = _finite_values("V_Ed", V_Ed, "N")
    V_pl_Rd = _positive("V_pl_Rd", V_pl_Rd, "N")
    ratio = np.minimum(np.abs(values) / V_pl_Rd, 1.0)
    rho = np.where(ratio <= 0.5, 0.0, (2.0 * ratio - 1.0) ** 2)
    return float(rho) if scalar else rho


# ----------------------------------------------------------------------------- helpers


def _at_most(value: float, limit: float) -> bool:
    return value <= limit * (1 + _RELATIVE_TOLERANCE)


def _finite_values(path: str, value: Any, unit: str = "") -> tuple[np.ndarray, bool]:
    """``value`` as a float array of finite numbers, and whether it was a scalar; else a CaseError."""
    if isinstance(value, (numbers.Real, bool)):
        return np.asarray(_finite(path, value), dtype=float), True
    array = None if isinstance(value, (str, bytes)) else np.asarray(value)
    if array is None or array.dtype.kind not in "iuf":
        raise CaseError(f"{path}: {_show(value)} is not a number or an array of numbers")
    array = array.astype(float)
    if not np.all(np.isfinite(array)):
        bad = float(array[~np.isfinite(array)].ravel()[0])
        unit_text = f" {unit}" if unit else ""
        raise CaseError(f"{path}: {bad!r}{unit_text} is not finite; every value must be a finite number")
    return array, array.ndim == 0
