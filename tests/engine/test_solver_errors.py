"""Unstable support sets are refused; cases at and beyond the critical loads are reported, not raised.

Sources: the named critical loads are Euler's, as listed in tests/REFERENCES.md §2
(pinned–pinned π²EI/L², fixed–guided π²EI/L²: Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed.
(1961), ch. 2, from memory). The near-critical bow amplification a/(1 − P/P_E) is references.md §1
(same book, ch. 1, from memory; exact for a sine bow on a pinned–pinned member). Which support sets form a
mechanism follows from the end conditions in conventions.md (common practice, no source).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import engine
from tests.strategies import UNSTABLE_NAMED_PAIRS, flexural_rigidities, lengths, supports

RESPONSE_FIELDS = ("deflection", "rotation", "moment", "shear", "transverse_force", "total_offset")
L, EI = 5.0, 3.0e6  # [m], [N·m²]; invented member for these checks
EULER = math.pi**2 * EI / L**2  # pinned–pinned critical load [N]

#: Named pairs with a mechanism: a rigid rotation about one pin, or a rigid translation.
MECHANISMS = (
    ("free", "free"),
    ("pinned", "free"),
    ("free", "pinned"),
    ("guided", "guided"),
    ("free", "guided"),
    ("guided", "free"),
)

#: Spring supports that still leave a mechanism (zero stiffness is a free end; one spring is not enough).
SPRING_MECHANISMS = (
    ({"translation": 0.0, "rotation": "free"}, "pinned"),
    ({"translation": "fixed", "rotation": 0.0}, "free"),
    ({"translation": 0.0, "rotation": "fixed"}, "guided"),
    ({"translation": 0.0, "rotation": 0.0}, {"translation": 0.0, "rotation": 0.0}),
    ("free", {"translation": 0.0, "rotation": 0.0}),
    ({"translation": 0.0, "rotation": 5.0e4}, {"translation": 0.0, "rotation": "fixed"}),
    ({"translation": 2.0e5, "rotation": "free"}, "free"),
)


def _mapping(left, right, *, axial_force=0.0, loads=None, imperfection=None):
    return {
        "schema": 1,
        "title": "Invented check case",
        "length": L,
        "EI": EI,
        "supports": {"left": left, "right": right},
        "axial_force": axial_force,
        "loads": [{"type": "uniform", "q": 2.0e3}] if loads is None else loads,
        "imperfection": imperfection or {"shape": "sine", "amplitude": L / 500},
    }


def _assert_no_nan(result):
    for name in RESPONSE_FIELDS + ("x",):
        values = np.asarray(getattr(result, name), dtype=float)
        assert not np.isnan(values).any(), f"{name} holds NaN"
    for name in ("deflection", "moment", "shear", "total_offset"):
        peak = getattr(result.governing, name)
        assert not math.isnan(peak.value) and not math.isnan(peak.x), f"governing.{name} is NaN"


def _assert_finite(result):
    for name in RESPONSE_FIELDS + ("x",):
        assert np.isfinite(np.asarray(getattr(result, name), dtype=float)).all(), f"{name} is not finite"


def test_the_named_mechanisms_are_exactly_the_unstable_named_pairs_of_the_strategies():
    """The strategies' stability rule refuses exactly the six named pairs that form a mechanism."""
    assert set(UNSTABLE_NAMED_PAIRS) == set(MECHANISMS)


@pytest.mark.parametrize(("left", "right"), MECHANISMS + SPRING_MECHANISMS)
def test_a_support_set_with_a_mechanism_is_a_case_error_naming_supports(left, right):
    """A support set that allows a rigid-body motion raises CaseError, and the message names `supports`."""
    with pytest.raises(engine.CaseError, match="supports"):
        engine.solve(engine.Case.from_dict(_mapping(left, right)))


@settings(max_examples=40, deadline=None, database=None)
@given(data=st.data())
def test_every_stable_support_set_of_the_strategies_is_accepted(data):
    """Every support pair the strategies call stable, springs included, builds a case with P_cr1 > 0."""
    length, rigidity = data.draw(lengths()), data.draw(flexural_rigidities())
    left, right = data.draw(supports(length, rigidity))
    case = engine.Case.from_dict(
        dict(
            _mapping(left, right),
            length=length,
            EI=rigidity,
            imperfection={"shape": "none", "amplitude": 0.0},
        )
    )
    first = float(engine.critical_loads(case).critical_loads[0])
    assert math.isfinite(first) and first > 0.0


@pytest.mark.parametrize(
    ("left", "right", "expected"),
    [
        # A rotational spring of zero stiffness is a free rotation: pinned–pinned, π²EI/L².
        ({"translation": "fixed", "rotation": 0.0}, "pinned", EULER),
        # A translational spring of zero stiffness is a free translation: guided–fixed, π²EI/L².
        ({"translation": 0.0, "rotation": "fixed"}, "fixed", EULER),
    ],
)
def test_a_zero_stiffness_spring_acts_as_the_free_end(left, right, expected):
    """A zero spring leaves a stable set stable, with the critical load of the free end (Euler, rel 1e-8)."""
    case = engine.Case.from_dict(_mapping(left, right))
    assert float(engine.critical_loads(case).critical_loads[0]) == pytest.approx(expected, rel=1e-8)


CRITICAL_SETS = [
    ("pinned", "pinned"),
    ("fixed", "free"),
    ("fixed", "pinned"),
    ("pinned", "guided"),
    ({"translation": 4.0e5, "rotation": "free"}, {"translation": "fixed", "rotation": 2.0e6}),
]


@pytest.mark.parametrize(("left", "right"), CRITICAL_SETS)
def test_a_case_at_the_first_critical_load_is_reported_critical_without_nan(left, right):
    """At exactly P_cr1 the solve returns status "critical", stable False, and no NaN anywhere."""
    base = engine.Case.from_dict(_mapping(left, right))
    first = float(engine.critical_loads(base).critical_loads[0])
    result = engine.solve(engine.Case.from_dict(_mapping(left, right, axial_force=first)))
    assert result.status == "critical"
    assert result.stable is False
    _assert_no_nan(result)


def test_the_euler_load_written_as_a_formula_is_recognised_as_critical():
    """P = π²EI/L² on a pinned–pinned member (Euler; references.md §2) is reported critical, without NaN."""
    result = engine.solve(engine.Case.from_dict(_mapping("pinned", "pinned", axial_force=EULER)))
    assert result.status == "critical"
    assert result.stable is False
    _assert_no_nan(result)


def test_a_case_at_the_second_critical_load_is_reported_critical_without_nan():
    """At exactly P_cr2 the solve returns status "critical", stable False, and no NaN anywhere."""
    base = engine.Case.from_dict(_mapping("fixed", "pinned"))
    second = float(engine.critical_loads(base).critical_loads[1])
    result = engine.solve(engine.Case.from_dict(_mapping("fixed", "pinned", axial_force=second)))
    assert result.status == "critical"
    assert result.stable is False
    _assert_no_nan(result)


@pytest.mark.parametrize(("left", "right"), CRITICAL_SETS)
def test_a_case_between_the_first_two_critical_loads_is_unstable_with_finite_arrays(left, right):
    """Half-way between P_cr1 and P_cr2 the solve returns stable False, "unstable" and finite arrays."""
    base = engine.Case.from_dict(_mapping(left, right))
    loads = engine.critical_loads(base).critical_loads
    P = 0.5 * float(loads[0] + loads[1])
    result = engine.solve(engine.Case.from_dict(_mapping(left, right, axial_force=P)))
    assert result.stable is False
    assert result.status == "unstable"
    assert result.alpha_cr == pytest.approx(float(loads[0]) / P, rel=1e-12)
    _assert_finite(result)


@pytest.mark.parametrize(("left", "right"), CRITICAL_SETS)
def test_a_case_just_below_the_first_critical_load_is_stable_and_finite(left, right):
    """At P/P_cr1 = 0.99999 the solve returns stable True, status "stable" and finite arrays."""
    base = engine.Case.from_dict(_mapping(left, right))
    P = 0.99999 * float(engine.critical_loads(base).critical_loads[0])
    result = engine.solve(engine.Case.from_dict(_mapping(left, right, axial_force=P)))
    assert result.stable is True
    assert result.status == "stable"
    _assert_finite(result)


def test_just_below_the_euler_load_a_sine_bow_grows_as_one_over_one_minus_alpha():
    """Pinned–pinned, sine bow a, P = 0.99999 P_E: peak offset a/(1 − α) and moment P a/(1 − α), rel 1e-6."""
    a = L / 500
    P = 0.99999 * EULER
    result = engine.solve(
        engine.Case.from_dict(
            _mapping(
                "pinned", "pinned", axial_force=P, loads=[], imperfection={"shape": "sine", "amplitude": a}
            )
        )
    )
    alpha = P / EULER
    # Timoshenko & Gere ch. 1 (from memory; references.md §1): total offset a/(1 − α), M = P a/(1 − α).
    assert result.governing.total_offset.value == pytest.approx(a / (1 - alpha), rel=1e-6)
    assert result.governing.moment.value == pytest.approx(P * a / (1 - alpha), rel=1e-6)
    assert result.governing.total_offset.x == pytest.approx(L / 2, abs=1e-9 * L)
