"""Tests of engine.codes: the EN 1993-1-1 and AISC rules the member check uses.

Reference values come from tests/REFERENCES.md §3 and §4 with its flags ("[text]" seen in a published
text, "from memory" recalled, "[derived]" re-derived from the governing equation). Closed forms are also
checked against an independent solve in arbitrary precision (mpmath) and against their limiting cases.
"""

from __future__ import annotations

import math

import mpmath
import numpy as np
import pytest

from engine import codes
from engine.codes import (
    AISC_OUT_OF_PLUMB,
    AISC_OUT_OF_STRAIGHTNESS,
    BUCKLING_CURVES,
    IMPERFECTION_FACTORS,
    bow_ratio,
    buckling_curve,
    eq_5_9_amplitude,
    plastic_interaction,
    reduction_factor,
    shear_reduction,
    slenderness,
    sway_imperfection,
)
from engine.errors import CaseError

# EN 1993-1-1 Table 6.1 (references.md §3, [text]).
ALPHA = {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}
# χ at λ̄ = 1.0 from eq. (6.49) (references.md §3, [derived]); given to 4 figures, so tolerance 5e-5.
CHI_AT_ONE = {"a0": 0.7253, "a": 0.6656, "b": 0.5970, "c": 0.5399, "d": 0.4671}
# Table 5.1 e0/L = 1/ratio (references.md §3, [text: ECCS 2010 table 2.20]).
BOW_ELASTIC = {"a0": 350, "a": 300, "b": 250, "c": 200, "d": 150}
BOW_PLASTIC = {"a0": 300, "a": 250, "b": 200, "c": 150, "d": 100}

SLENDERNESSES = (0.21, 0.3, 0.5, 0.8, 1.0, 1.2, 1.7, 2.5, 4.0)


def _ayrton_perry_chi(lam: float, alpha: float) -> float:
    """The smaller root of χ²λ̄² − χ(1 + α(λ̄ − 0.2) + λ̄²) + 1 = 0, solved by mpmath at 40 digits [derived]."""
    with mpmath.workdps(40):
        lam_m, alpha_m = mpmath.mpf(lam), mpmath.mpf(alpha)
        a, b = lam_m**2, -(1 + alpha_m * (lam_m - mpmath.mpf("0.2")) + lam_m**2)
        # Both roots by the quadratic formula at 40 digits (no cancellation matters there). Not polyroots:
        # mpmath 1.4 deprecates its coefficient order, and the test must not depend on the version.
        discriminant = mpmath.sqrt(b**2 - 4 * a)
        roots = ((-b - discriminant) / (2 * a), (-b + discriminant) / (2 * a))
        return float(min(roots))


# ----------------------------------------------------------------------------- Table 6.1 and eq. (6.49)


def test_imperfection_factors_table_6_1():
    """α = 0.13, 0.21, 0.34, 0.49, 0.76 for a0 to d (EN 1993-1-1 Table 6.1 [text]; exact)."""
    assert dict(IMPERFECTION_FACTORS) == ALPHA
    assert BUCKLING_CURVES == ("a0", "a", "b", "c", "d")


def test_imperfection_factors_cannot_be_changed():
    """The table is read-only, so no caller can alter α for everyone else."""
    with pytest.raises(TypeError):
        IMPERFECTION_FACTORS["b"] = 0.5  # type: ignore[index]


@pytest.mark.parametrize("curve", list(CHI_AT_ONE))
def test_reduction_factor_at_unit_slenderness(curve):
    """χ(λ̄ = 1) of eq. (6.49) for every curve (references.md §3 [derived]; abs tol 5e-5, 4 figures given)."""
    assert reduction_factor(1.0, curve) == pytest.approx(CHI_AT_ONE[curve], abs=5e-5)


@pytest.mark.parametrize("curve", BUCKLING_CURVES)
@pytest.mark.parametrize("lam", SLENDERNESSES)
def test_reduction_factor_is_the_smaller_ayrton_perry_root(curve, lam):
    """χ of eq. (6.49) equals the smaller root of the Ayrton–Perry quadratic (mpmath [derived]; rel 1e-13)."""
    assert reduction_factor(lam, curve) == pytest.approx(_ayrton_perry_chi(lam, ALPHA[curve]), rel=1e-13)


@pytest.mark.parametrize("curve", BUCKLING_CURVES)
def test_reduction_factor_plateau(curve):
    """χ = 1 for λ̄ <= 0.2, where the formula reaches 1 or more (EN 1993-1-1 §6.3.1.2; exact)."""
    for lam in (0.0, 0.1, 0.2):
        assert reduction_factor(lam, curve) == 1.0
    assert reduction_factor(0.2 + 1e-6, curve) < 1.0


@pytest.mark.parametrize("curve", BUCKLING_CURVES)
def test_reduction_factor_limits(curve):
    """χ falls with λ̄, stays below the Euler bound 1/λ̄², and tends to it as λ̄ grows [derived]."""
    chis = [reduction_factor(lam, curve) for lam in SLENDERNESSES]
    assert all(b < a for a, b in zip(chis, chis[1:], strict=False))
    for lam, chi in zip(SLENDERNESSES, chis, strict=True):
        assert chi < 1.0 / lam**2
    lam = 1e3
    assert reduction_factor(lam, curve) * lam**2 == pytest.approx(1.0, abs=2 * ALPHA[curve] / lam)


def test_curves_are_ordered():
    """A more imperfect curve gives a smaller χ at every slenderness above 0.2 [derived]."""
    for lam in SLENDERNESSES:
        chis = [reduction_factor(lam, curve) for curve in BUCKLING_CURVES]
        assert all(b < a for a, b in zip(chis, chis[1:], strict=False))


@pytest.mark.parametrize(
    ("lam", "curve", "field"),
    [(-0.1, "b", "lambda_bar"), (math.nan, "b", "lambda_bar"), (1.0, "e", "curve"), (1.0, "B", "curve")],
)
def test_reduction_factor_rejects_bad_input(lam, curve, field):
    """A negative or NaN slenderness or an unknown curve is a CaseError naming the argument."""
    with pytest.raises(CaseError, match=rf"^{field}: "):
        reduction_factor(lam, curve)


def test_unknown_curve_suggests_the_nearest():
    """A curve written in capitals is refused with the lower-case name suggested."""
    pattern = r"^curve: 'A0' is not allowed \(did you mean 'a0'\?\); allowed: 'a0'"
    with pytest.raises(CaseError, match=pattern):
        reduction_factor(1.0, "A0")


# ----------------------------------------------------------------------------- slenderness


def test_slenderness_worked_number():
    """A = 53.81 cm², f_y = 235 MPa, N_cr = 1000 kN give λ̄ = √1.264535 (§6.3.1.2 [derived]; rel 1e-14)."""
    assert slenderness(53.81e-4, 235e6, 1000e3) == pytest.approx(math.sqrt(1.264535), rel=1e-14)


def test_slenderness_of_an_unbuckling_member_is_zero():
    """An infinite critical force gives λ̄ = 0 (limiting case of §6.3.1.2)."""
    assert slenderness(1e-3, 3.55e8, math.inf) == 0.0


@pytest.mark.parametrize(
    ("args", "field"),
    [
        ((0.0, 3.55e8, 1e6), "A"),
        ((1e-3, -3.55e8, 1e6), "fy"),
        ((1e-3, 3.55e8, 0.0), "N_cr"),
        ((1e-3, "355", 1e6), "fy"),
    ],
)
def test_slenderness_rejects_bad_input(args, field):
    """Area, yield strength and critical force must be > 0; the message names the argument."""
    with pytest.raises(CaseError, match=rf"^{field}: "):
        slenderness(*args)


# ----------------------------------------------------------------------------- Table 5.1


@pytest.mark.parametrize("curve", BUCKLING_CURVES)
def test_bow_ratios_table_5_1(curve):
    """e0/L = 1/ratio: elastic 350..150, plastic 300..100 (EN 1993-1-1 Table 5.1; ECCS 2010 t.2.20 [text])."""
    assert bow_ratio(curve, "elastic") == BOW_ELASTIC[curve]
    assert bow_ratio(curve, "plastic") == BOW_PLASTIC[curve]


def test_bow_ratio_rejects_unknown_analysis():
    """The analysis must be 'elastic' or 'plastic'; a near miss is suggested."""
    with pytest.raises(CaseError, match=r"^analysis: 'elastc' is not allowed \(did you mean 'elastic'\?\)"):
        bow_ratio("b", "elastc")


# ----------------------------------------------------------------------------- Table 6.2


def _curve(**kwargs):
    arguments = {
        "shape": "rolled_i",
        "manufacture": "rolled",
        "axis": "y",
        "h_over_b": 2.0,
        "t_max": 0.0107,
        "grade": "S355",
    }
    arguments.update(kwargs)
    return buckling_curve(**arguments)


@pytest.mark.parametrize(
    ("kwargs", "expected"),
    [
        # IPE 300: h/b = 300/150 = 2.0, t_f = 10.7 mm (references.md §5).
        ({"h_over_b": 2.0, "t_max": 0.0107}, ("a", "b")),
        ({"h_over_b": 2.0, "t_max": 0.0107, "grade": "S460"}, ("a0", "a0")),
        # Rolled h/b > 1.2, 40 < t_f <= 100 mm.
        ({"h_over_b": 1.5, "t_max": 0.050}, ("b", "c")),
        ({"h_over_b": 1.5, "t_max": 0.050, "grade": "S460"}, ("a", "a")),
        # HEB 200: h/b = 200/200 = 1.0, t_f = 15 mm (references.md §5).
        ({"h_over_b": 1.0, "t_max": 0.015}, ("b", "c")),
        ({"h_over_b": 1.0, "t_max": 0.015, "grade": "S460"}, ("a", "a")),
        # Rolled h/b <= 1.2, t_f > 100 mm.
        ({"h_over_b": 1.1, "t_max": 0.110}, ("d", "d")),
        ({"h_over_b": 1.1, "t_max": 0.110, "grade": "S460"}, ("c", "c")),
        # Welded I.
        ({"shape": "welded_i", "manufacture": "welded", "t_max": 0.020, "h_over_b": None}, ("b", "c")),
        ({"shape": "welded_i", "manufacture": "welded", "t_max": 0.060, "h_over_b": None}, ("c", "d")),
        ({"shape": "welded_i", "manufacture": "", "t_max": 0.060, "grade": "S460"}, ("c", "d")),
        # Hollow sections.
        ({"shape": "rhs", "manufacture": "hot_finished", "t_max": 0.005}, ("a", "a")),
        ({"shape": "chs", "manufacture": "hot_finished", "t_max": 0.005, "grade": "S460"}, ("a0", "a0")),
        ({"shape": "rhs", "manufacture": "cold_formed", "t_max": 0.005}, ("c", "c")),
        ({"shape": "chs", "manufacture": "cold_formed", "t_max": 0.005, "grade": "S460"}, ("c", "c")),
        # Solid sections.
        ({"shape": "rectangle", "manufacture": "", "t_max": 0.040, "grade": "S460"}, ("c", "c")),
        ({"shape": "round", "manufacture": "rolled", "t_max": 0.040}, ("c", "c")),
    ],
)
def test_buckling_curve_table_6_2(kwargs, expected):
    """Curves about y–y and z–z for representative sections (EN 1993-1-1 Table 6.2, cells from memory)."""
    got = tuple(_curve(axis=axis, **kwargs)[0] for axis in ("y", "z"))
    assert got == expected
    reason = _curve(axis="z", **kwargs)[1]
    assert "Table 6.2" in reason and "from memory" in reason
    assert reason.endswith(f"buckling about z–z: curve {expected[1]}")


@pytest.mark.parametrize(
    ("t_max", "expected"), [(0.040, ("a", "b")), (0.0401, ("b", "c")), (0.100, ("b", "c"))]
)
def test_buckling_curve_flange_thickness_edges(t_max, expected):
    """t_f = 40 mm is in the 't_f <= 40 mm' row and 100 mm in the '<= 100 mm' row (Table 6.2, from memory)."""
    assert tuple(_curve(h_over_b=2.0, t_max=t_max, axis=axis)[0] for axis in ("y", "z")) == expected


def test_buckling_curve_depth_ratio_edge():
    """h/b = 1.2 exactly (even as 0.24/0.2) belongs to the 'h/b <= 1.2' row (Table 6.2, from memory)."""
    assert _curve(h_over_b=1.2, t_max=0.010, axis="y")[0] == "b"
    assert _curve(h_over_b=0.24 / 0.2, t_max=0.010, axis="z")[0] == "c"
    assert _curve(h_over_b=1.2001, t_max=0.010, axis="y")[0] == "a"


def test_buckling_curve_outside_the_table_takes_curve_d():
    """A rolled I with h/b > 1.2 and t_f > 100 mm is not tabulated: curve d, marked as assumed."""
    for grade in ("S355", "S460"):
        curve, reason = _curve(h_over_b=1.3, t_max=0.125, grade=grade)
        assert curve == "d"
        assert "not in" in reason and "assumed" in reason


def test_buckling_curve_custom_section():
    """A custom section takes curve c with the reason 'custom section: curve c assumed'."""
    assert _curve(shape="custom", manufacture="", h_over_b=None) == ("c", "custom section: curve c assumed")


@pytest.mark.parametrize("grade", [None, "S235", "S420", "ASTM A992"])
def test_buckling_curve_other_grades_take_the_ordinary_column(grade):
    """Only S460 has its own column; other grades and None take the S235–S420 one (Table 6.2, from memory)."""
    curve, reason = _curve(grade=grade)
    assert curve == "a"
    assert "S235 to S420" in reason


@pytest.mark.parametrize(
    ("kwargs", "expected"),
    [
        ({"axis": "major"}, "a"),
        ({"axis": "minor"}, "b"),
        ({"shape": "rhs", "manufacture": "hot-finished", "t_max": None}, "a"),
        ({"shape": "chs", "manufacture": "cold-formed", "t_max": None}, "c"),
        ({"shape": "rectangle", "manufacture": "solid", "t_max": None}, "c"),
        ({"shape": "round", "manufacture": "solid", "t_max": 0.03}, "c"),
        ({"shape": "custom", "manufacture": "custom", "t_max": None, "h_over_b": None}, "c"),
        ({"shape": "rolled_i", "manufacture": "custom"}, "a"),
    ],
)
def test_buckling_curve_reads_the_section_vocabulary(kwargs, expected):
    """'major'/'minor', hyphenated manufactures, 'solid' and 'custom' are read; t_max may be None off I."""
    assert _curve(**kwargs)[0] == expected


def test_buckling_curve_reason_keeps_the_given_spelling_in_errors():
    """A hyphenated manufacture that does not fit is quoted as given."""
    with pytest.raises(CaseError, match=r"^manufacture: 'hot-finished' does not fit shape 'rolled_i'"):
        _curve(manufacture="hot-finished")


def test_buckling_curve_reads_s460_subgrades():
    """'S460NL' and 's460 m' take the S460 column."""
    assert _curve(grade="S460NL")[0] == "a0"
    assert _curve(grade="s460 m", axis="z")[0] == "a0"


@pytest.mark.parametrize(
    ("kwargs", "pattern"),
    [
        ({"shape": "rolled_I"}, r"^shape: 'rolled_I' is not allowed \(did you mean 'rolled_i'\?\)"),
        ({"axis": "x"}, r"^axis: 'x' is not allowed; allowed: 'y', 'z', 'major', 'minor'"),
        (
            {"shape": "welded_i", "manufacture": "welded", "t_max": None},
            r"^t_max: required for shape 'welded_i'",
        ),
        ({"manufacture": "hot-rolled"}, r"^manufacture: 'hot-rolled' is not allowed"),
        ({"manufacture": "welded"}, r"^manufacture: 'welded' does not fit shape 'rolled_i'"),
        (
            {"shape": "rhs", "manufacture": ""},
            r"^manufacture: '' does not fit shape 'rhs'; "
            r"allowed: 'hot_finished', 'cold_formed'",
        ),
        ({"h_over_b": None}, r"^h_over_b: required for shape 'rolled_i'"),
        ({"h_over_b": -2.0}, r"^h_over_b: -2\.0 must be finite and > 0"),
        ({"t_max": 0.0}, r"^t_max: 0\.0 m must be finite and > 0"),
        ({"grade": 355}, r"^grade: 355 must be a string"),
    ],
)
def test_buckling_curve_rejects_bad_input(kwargs, pattern):
    """Unknown names (with suggestions), contradictions and bad numbers are CaseErrors naming the argument."""
    with pytest.raises(CaseError, match=pattern):
        _curve(**kwargs)


# ----------------------------------------------------------------------------- eq. (5.9)


def test_eq_5_9_worked_number():
    """Curve b, λ̄ = 1, M_Rk/N_Rk = 0.05 m: e0 = 0.34·0.8·0.05 = 0.0136 m (eq. 5.9 [derived]; rel 1e-12)."""
    W, A, fy = 5e-4, 1e-2, 3.55e8
    e0 = eq_5_9_amplitude(curve="b", lambda_bar=1.0, M_Rk=W * fy, N_Rk=A * fy)
    assert e0 == pytest.approx(0.34 * 0.8 * 0.05, rel=1e-12)


def test_eq_5_9_partial_factor_term():
    """With γ_M1 = 1.1 the factor (1 − χλ̄²/γ)/(1 − χλ̄²) multiplies the γ = 1 value (eq. 5.9 [derived])."""
    chi = reduction_factor(1.0, "b")
    factor = (1 - chi / 1.1) / (1 - chi)
    e0 = eq_5_9_amplitude(curve="b", lambda_bar=1.0, M_Rk=5e4, N_Rk=1e6, gamma_M1=1.1)
    assert e0 == pytest.approx(0.0136 * factor, rel=1e-12)
    assert factor > 1.0


@pytest.mark.parametrize("lam", [0.0, 0.1, 0.2])
def test_eq_5_9_is_zero_without_buckling(lam):
    """e0 = 0 for λ̄ <= 0.2, where χ = 1 (§5.3.2(11), from memory; exact)."""
    assert eq_5_9_amplitude(curve="d", lambda_bar=lam, M_Rk=1e5, N_Rk=1e6) == 0.0


@pytest.mark.parametrize("gamma", [1.0, 1.1, 1.25])
@pytest.mark.parametrize("curve", BUCKLING_CURVES)
@pytest.mark.parametrize("lam", [0.3, 0.7, 1.0, 1.6, 3.0])
def test_eq_5_9_reproduces_the_buckling_resistance(curve, lam, gamma):
    """With e0 of eq. (5.9) the second-order section check is 1 at N = χN_Rk/γ_M1 ([derived]; rel 1e-12)."""
    # The check is N/N_Rd + N e0/((1 − N/N_cr) M_Rd) with N_Rd = N_Rk/γ_M1 and M_Rd = M_Rk/γ_M1: the
    # Ayrton–Perry identity behind eq. (6.49).
    N_Rk, M_Rk = 2.0e6, 1.5e5
    N_cr = N_Rk / lam**2
    e0 = eq_5_9_amplitude(curve=curve, lambda_bar=lam, M_Rk=M_Rk, N_Rk=N_Rk, gamma_M1=gamma)
    N = reduction_factor(lam, curve) * N_Rk / gamma
    utilisation = N / (N_Rk / gamma) + N * e0 / ((1 - N / N_cr) * M_Rk / gamma)
    assert utilisation == pytest.approx(1.0, rel=1e-12)


@pytest.mark.parametrize(
    ("kwargs", "field"),
    [
        ({"gamma_M1": 0.9}, "gamma_M1"),
        ({"M_Rk": 0.0}, "M_Rk"),
        ({"N_Rk": -1.0}, "N_Rk"),
        ({"lambda_bar": -1.0}, "lambda_bar"),
        ({"curve": "f"}, "curve"),
    ],
)
def test_eq_5_9_rejects_bad_input(kwargs, field):
    """A partial factor below 1, a resistance <= 0, a negative slenderness or an unknown curve is refused."""
    arguments = {"curve": "b", "lambda_bar": 1.0, "M_Rk": 5e4, "N_Rk": 1e6} | kwargs
    with pytest.raises(CaseError, match=rf"^{field}: "):
        eq_5_9_amplitude(**arguments)


# ----------------------------------------------------------------------------- sway and AISC


@pytest.mark.parametrize(
    ("h", "m", "expected"),
    [
        (4.0, 1, 1 / 200),  # α_h = 2/√4 = 1
        (1.0, 1, 1 / 200),  # α_h = 2, capped at 1
        (6.25, 1, 0.8 / 200),  # α_h = 2/2.5 = 0.8
        (9.0, 1, (2 / 3) / 200),  # α_h = 2/3, the lower bound
        (25.0, 1, (2 / 3) / 200),  # α_h = 0.4, raised to 2/3
        (4.0, 2, math.sqrt(0.75) / 200),  # α_m = √(0.5·1.5)
        (4.0, 10**9, math.sqrt(0.5) / 200),  # α_m → √0.5 for many columns
    ],
)
def test_sway_imperfection(h, m, expected):
    """φ = φ0 α_h α_m with φ0 = 1/200 and the bounds on α_h (EN 1993-1-1 §5.3.2(3), from memory; rel 1e-9)."""
    assert sway_imperfection(h=h, m=m) == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize(
    ("kwargs", "field"),
    [({"h": 0.0}, "h"), ({"h": 4.0, "m": 0}, "m"), ({"h": 4.0, "m": 2.5}, "m"), ({"h": 4.0, "m": True}, "m")],
)
def test_sway_imperfection_rejects_bad_input(kwargs, field):
    """The height must be > 0 and the number of columns a whole number >= 1."""
    with pytest.raises(CaseError, match=rf"^{field}: "):
        sway_imperfection(**kwargs)


def test_aisc_tolerances():
    """Out-of-straightness L/1000 and out-of-plumb L/500 (AISC 303-16 §7.13.1.1, references.md §4 [text])."""
    assert AISC_OUT_OF_STRAIGHTNESS == 1000
    assert AISC_OUT_OF_PLUMB == 500


# ----------------------------------------------------------------------------- §6.2.9.1


@pytest.mark.parametrize(
    ("shape", "axis", "n", "a", "expected"),
    [
        # Doubly symmetric I, major axis, eq. (6.36) (from memory): (1 − n)/(1 − 0.5a) <= 1.
        ("rolled_i", "y", 0.0, 0.4, 1.0),
        ("rolled_i", "y", 0.2, 0.4, 1.0),  # 0.8/0.8 = 1: no reduction up to n = 0.5a
        ("rolled_i", "y", 0.5, 0.4, 0.625),  # 0.5/0.8
        ("welded_i", "y", 0.5, 0.4, 0.625),
        ("rolled_i", "y", 1.0, 0.4, 0.0),
        # Minor axis, eqs. (6.37)–(6.38) (from memory).
        ("rolled_i", "z", 0.0, 0.4, 1.0),
        ("rolled_i", "z", 0.4, 0.4, 1.0),
        ("rolled_i", "z", 0.5, 0.4, 1 - (0.1 / 0.6) ** 2),
        ("rolled_i", "z", 1.0, 0.4, 0.0),
        # RHS, eqs. (6.39)–(6.40) (from memory), a = a_w or a_f.
        ("rhs", "y", 0.0, 0.3, 1.0),
        ("rhs", "y", 0.5, 0.3, 0.5 / 0.85),
        ("rhs", "z", 0.5, 0.2, 0.5 / 0.9),
        ("rhs", "z", 1.0, 0.2, 0.0),
        # CHS (from memory): 1 − n^1.7.
        ("chs", "y", 0.0, 0.0, 1.0),
        ("chs", "z", 0.5, 0.0, 1 - 0.5**1.7),
        ("chs", "y", 1.0, 0.0, 0.0),
        # Solid rectangle, eq. (6.32): 1 − n², the exact plastic interaction [derived].
        ("rectangle", "y", 0.5, 0.0, 0.75),
        # No rule: the straight line [derived].
        ("custom", "y", 0.5, 0.0, 0.5),
        ("round", "z", 0.25, 0.0, 0.75),
    ],
)
def test_plastic_interaction_values(shape, axis, n, a, expected):
    """M_N,Rd/M_pl,Rd at n = 0, 0.5 and 1 for each rule of EN 1993-1-1 §6.2.9.1 (rel 1e-12)."""
    value = plastic_interaction(shape=shape, axis=axis, n=n, a=a)
    assert value == pytest.approx(expected, rel=1e-12, abs=1e-15)


@pytest.mark.parametrize("a", [0.0, 0.15, 0.3, 0.5])
def test_minor_axis_interaction_is_continuous_at_n_equal_a(a):
    """About z–z the two branches of eqs. (6.37)–(6.38) meet at n = a with value 1 and no kink [derived]."""
    eps = 1e-7
    below = plastic_interaction(shape="rolled_i", axis="z", n=a - eps if a > 0 else 0.0, a=a)
    at = plastic_interaction(shape="rolled_i", axis="z", n=a, a=a)
    above = plastic_interaction(shape="rolled_i", axis="z", n=a + eps, a=a)
    assert below == at == 1.0
    assert above == pytest.approx(1.0, abs=1e-12)  # the drop is quadratic: ((ε/(1 − a))² < 1e-13
    assert above < 1.0


@pytest.mark.parametrize(
    ("shape", "expected"), [("chs", 1 - 0.4**1.7), ("rectangle", 1 - 0.16), ("round", 0.6), ("custom", 0.6)]
)
def test_plastic_interaction_needs_no_a_where_the_rule_has_none(shape, expected):
    """CHS, solid and custom rules take a = None (their formulas have no a; values as above, rel 1e-12)."""
    assert plastic_interaction(shape=shape, axis="major", n=0.4) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("shape", ["rolled_i", "welded_i", "rhs"])
def test_plastic_interaction_needs_a_for_i_and_rhs(shape):
    """The I and RHS rules cannot run without a, and say so naming 'a'."""
    with pytest.raises(CaseError, match=rf"^a: required for shape {shape!r}"):
        plastic_interaction(shape=shape, axis="y", n=0.4, a=None)


def test_plastic_interaction_takes_arrays():
    """An array of n gives the array of the scalar values, element by element (exact)."""
    n = np.array([0.0, 0.3, 0.45, 0.6, 1.0, 1.4, -0.6])
    for shape, axis, a in (("rolled_i", "minor", 0.45), ("rolled_i", "major", 0.4), ("chs", "y", None)):
        got = plastic_interaction(shape=shape, axis=axis, n=n, a=a)
        assert isinstance(got, np.ndarray) and got.shape == n.shape
        assert got.tolist() == [plastic_interaction(shape=shape, axis=axis, n=float(v), a=a) for v in n]
    assert isinstance(plastic_interaction(shape="chs", axis="y", n=np.float64(0.3)), float)


def test_web_share_is_capped_at_one_half():
    """a is taken as at most 0.5 (EN 1993-1-1 §6.2.9.1, 'a <= 0.5', from memory)."""
    for shape, axis in (("rolled_i", "y"), ("rolled_i", "z"), ("rhs", "y")):
        capped = plastic_interaction(shape=shape, axis=axis, n=0.6, a=0.5)
        assert plastic_interaction(shape=shape, axis=axis, n=0.6, a=0.8) == capped


@pytest.mark.parametrize("shape", ["rolled_i", "welded_i", "rhs", "chs", "rectangle", "round", "custom"])
@pytest.mark.parametrize("axis", ["y", "z"])
def test_plastic_interaction_is_within_the_safe_bounds(shape, axis):
    """Each rule lies between 1 − n and 1 (convexity [derived]), is 1 at n = 0, 0 from n = 1 and even in n."""
    for a in (0.0, 0.2, 0.45):
        assert plastic_interaction(shape=shape, axis=axis, n=0.0, a=a) == 1.0
        for n in (0.05, 0.25, 0.5, 0.75, 0.95):
            value = plastic_interaction(shape=shape, axis=axis, n=n, a=a)
            assert 1.0 - n - 1e-15 <= value <= 1.0
            assert plastic_interaction(shape=shape, axis=axis, n=-n, a=a) == value
        for n in (1.0, 1.5, -2.0):
            assert plastic_interaction(shape=shape, axis=axis, n=n, a=a) == 0.0


@pytest.mark.parametrize(
    ("kwargs", "field"),
    [
        ({"a": -0.1}, "a"),
        ({"a": 1.0}, "a"),
        ({"n": math.nan}, "n"),
        ({"shape": "I"}, "shape"),
        ({"axis": "x"}, "axis"),
    ],
)
def test_plastic_interaction_rejects_bad_input(kwargs, field):
    """a must lie in [0, 1), n must be finite and shape and axis must be known."""
    arguments = {"shape": "rolled_i", "axis": "y", "n": 0.3, "a": 0.4} | kwargs
    with pytest.raises(CaseError, match=rf"^{field}: "):
        plastic_interaction(**arguments)


# ----------------------------------------------------------------------------- §6.2.8


@pytest.mark.parametrize(
    ("V", "expected"),
    [
        (0.0, 0.0),
        (0.3e5, 0.0),
        (0.5e5, 0.0),  # no reduction up to half the plastic shear resistance
        (0.75e5, 0.25),  # (2·0.75 − 1)² = 0.25
        (0.9e5, 0.64),  # (2·0.9 − 1)² = 0.64
        (1.0e5, 1.0),
        (1.3e5, 1.0),  # held at 1 beyond the shear resistance
        (-0.75e5, 0.25),  # the sign of V does not matter
    ],
)
def test_shear_reduction(V, expected):
    """ρ = 0 for V <= 0.5 V_pl, else (2V/V_pl − 1)² (EN 1993-1-1 §6.2.8(3), from memory; rel 1e-12)."""
    assert shear_reduction(V, 1.0e5) == pytest.approx(expected, rel=1e-12, abs=1e-15)


def test_shear_reduction_takes_arrays():
    """An array of V gives the array of the scalar values, element by element (exact)."""
    V = np.array([[0.0, 4e4, 5e4], [6e4, -9e4, 1.2e5]])
    got = shear_reduction(V, 1e5)
    assert isinstance(got, np.ndarray) and got.shape == V.shape
    assert got.ravel().tolist() == [shear_reduction(float(v), 1e5) for v in V.ravel()]


@pytest.mark.parametrize("V", [[1e4, math.nan], np.array([1e4, math.inf]), ["1e4"], {"V": 1.0}])
def test_shear_reduction_rejects_bad_arrays(V):
    """An array with a value that is not a finite number is refused, naming V_Ed."""
    with pytest.raises(CaseError, match=r"^V_Ed: "):
        shear_reduction(V, 1e5)


def test_shear_reduction_is_continuous_at_half():
    """ρ rises from 0 without a jump just above V = 0.5 V_pl [derived]."""
    assert 0.0 < shear_reduction(0.5e5 * (1 + 1e-6), 1e5) < 1e-11


@pytest.mark.parametrize(
    ("args", "field"),
    [((1e4, 0.0), "V_pl_Rd"), ((1e4, -1e5), "V_pl_Rd"), ((math.inf, 1e5), "V_Ed"), (("10 kN", 1e5), "V_Ed")],
)
def test_shear_reduction_rejects_bad_input(args, field):
    """V_pl,Rd must be > 0 and V_Ed finite; the message names the argument."""
    with pytest.raises(CaseError, match=rf"^{field}: "):
        shear_reduction(*args)


def test_public_names():
    """The module exports exactly its documented names."""
    assert set(codes.__all__) == {
        "AISC_OUT_OF_PLUMB",
        "AISC_OUT_OF_STRAIGHTNESS",
        "ALPHA_CR_LIMITS",
        "ALPHA_CR_SOURCE",
        "alpha_cr_limit",
        "AXES",
        "BUCKLING_CURVES",
        "IMPERFECTION_FACTORS",
        "MANUFACTURES",
        "SHAPES",
        "bow_ratio",
        "buckling_curve",
        "eq_5_9_amplitude",
        "plastic_interaction",
        "reduction_factor",
        "shear_reduction",
        "slenderness",
        "sway_imperfection",
    }
    assert all(hasattr(codes, name) for name in codes.__all__)
