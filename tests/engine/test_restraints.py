"""Intermediate restraints, hinges and steps in EI (issue 16): the case keys, the exact solution with the
restraints' reactions, the critical loads by Wittrick–Williams and the refusal of mechanisms.

Every number below is checked against a source named beside it; lengths, stiffnesses and loads are invented.
"""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.optimize import brentq

import engine
from engine.restraints import Restraint, Step

L = 6.0  # [m], invented
EI = 4.2e6  # [N·m²], invented
q = 2.5e3  # [N/m], invented


def _case(restraints=(), steps=(), left="pinned", right="pinned", P=0.0, loads=None, **extra):
    data = {
        "length": L,
        "EI": EI,
        "supports": {"left": left, "right": right},
        "axial_force": P,
        "loads": [{"type": "uniform", "q": q}] if loads is None else loads,
        "restraints": list(restraints),
        "steps": list(steps),
    }
    data.update(extra)
    return engine.Case.from_dict(data)


# ------------------------------------------------------------------------------------------- case keys


def test_round_trip_and_defaults():
    case = _case(
        [
            {"x": 2.0, "translation": 5e6, "rotation": "fixed"},
            {"x": 4.0, "translation": "fixed", "hinge": True},
        ],
        [{"x": 3.0, "EI": 2e6}],
    )
    assert case.restraints[0] == Restraint(x=2.0, translation=5e6, rotation="fixed")
    assert case.steps == (Step(x=3.0, EI=2e6),)
    assert engine.Case.from_dict(case.to_dict()) == case
    assert "restraints" not in _case().to_dict()


@pytest.mark.parametrize(
    ("restraint", "message"),
    [
        ({"x": 7.0, "translation": "fixed"}, "restraints[0].x: 7.0 m lies outside"),
        ({"x": 0.0, "translation": "fixed"}, "restraints[0].x: 0.0 m lies outside"),
        ({"x": 3.0, "translation": "rigid"}, "restraints[0].translation: 'rigid' is not a restraint"),
        ({"x": 3.0, "translation": -1.0}, "restraints[0].translation: -1.0 N/m must be >= 0"),
        ({"x": 3.0}, "restrains nothing"),
        (
            {"x": 3.0, "hinge": True, "rotation": 1e5},
            "restraints[0].rotation: 100000.0 is not allowed with a hinge",
        ),
        ({"x": 3.0, "translation": "fixed", "plane": "third"}, "restraints[0].plane: 'third' is not a plane"),
        (
            {"x": 3.0, "translation": "fixed", "plane": "second"},
            "restraints[0].plane: 'second' is not allowed",
        ),
        ({"x": 3.0, "translation": "fixed", "spring": 1}, "restraints[0]: unknown key 'spring'"),
        ({"translation": "fixed"}, "restraints[0].x: required key is missing"),
    ],
)
def test_restraint_errors_name_field_value_and_range(restraint, message):
    with pytest.raises(
        engine.CaseError, match=message.replace("[", r"\[").replace("]", r"\]").replace("(", r"\(")
    ):
        _case([restraint])


def test_step_errors():
    with pytest.raises(engine.CaseError, match=r"steps\[0\].EI: 0.0 N·m² must be >= 0.001"):
        _case(steps=[{"x": 3.0, "EI": 0.0}])
    with pytest.raises(engine.CaseError, match=r"steps\[1\].x: 2.0 m must lie beyond"):
        _case(steps=[{"x": 3.0, "EI": 1e6}, {"x": 2.0, "EI": 1e6}])
    with pytest.raises(engine.CaseError, match=r"steps\[0\]\.EI: a step by EI needs a case that gives"):
        _case(steps=[{"x": 3.0, "EI": 1e6}], section={"name": "HEB 200"}, material={"name": "S355"})


def test_two_restraints_at_one_point_are_refused():
    with pytest.raises(engine.CaseError, match=r"restraints\[1\].x: 3.0 m repeats restraints\[0\]"):
        _case([{"x": 3.0, "translation": "fixed"}, {"x": 3.0, "rotation": "fixed"}])


@pytest.mark.parametrize(
    ("supports", "restraints", "names"),
    [
        # A hinge in a simply supported span: the two halves fold (common practice, no source).
        (("pinned", "pinned"), [{"x": 3.0, "hinge": True}], "restraints[0] (x = 3 m, a hinge)"),
        # A cantilever with a hinge and nothing beyond it.
        (("fixed", "free"), [{"x": 2.0, "hinge": True}], "restraints[0] (x = 2 m, a hinge)"),
        # Two hinges between two pins with one brace: the middle part swings.
        (
            ("pinned", "pinned"),
            [{"x": 2.0, "hinge": True}, {"x": 3.0, "translation": "fixed"}, {"x": 4.0, "hinge": True}],
            "hinge at restraints[0]",
        ),
    ],
)
def test_mechanisms_are_refused_naming_the_hinge(supports, restraints, names):
    with pytest.raises(engine.CaseError, match=re_escape(names)):
        _case(restraints, left=supports[0], right=supports[1])


def re_escape(text):
    import re

    return re.escape(text)


def test_restraints_make_a_stable_member_of_ends_that_cannot():
    # Free at both ends, held sideways at two inner points: stable (common practice, no source).
    case = _case(
        [{"x": 1.0, "translation": "fixed"}, {"x": 5.0, "translation": "fixed"}], left="free", right="free"
    )
    result = engine.solve(case)
    assert result.status == "stable"
    # Overhangs of 1 m on a 4 m span under q: reactions q·L/2 each by symmetry (statics).
    forces = [r.force for r in result.reactions.intermediate]
    assert forces == pytest.approx([-q * L / 2, -q * L / 2], rel=1e-12)


def test_presets_take_the_mode_shape_with_restraints():
    # A code bow between the ends does not fit a braced member: the preset's bow takes the first mode's shape
    # (EN 1993-1-1 §5.3.2(11), from memory), with the whole member's amplitude L/ratio (conservative).
    with pytest.raises(engine.CaseError, match="imperfection.preset: 'en1993-eq-5.9' is not available with"):
        _case(steps=[{"x": 3.0, "EI": 0.5 * EI}], imperfection={"preset": "en1993-eq-5.9", "curve": "b"})
    case = _case(
        [{"x": 2.0, "translation": "fixed"}], imperfection={"preset": "en1993-table-5.1", "curve": "b"}
    )
    result = engine.solve(case)
    assert result.bow.shape == "mode"
    assert abs(result.bow.amplitude) == pytest.approx(L / 250, rel=1e-12)  # Table 5.1, curve b, elastic
    # The mode is scaled at its refined extreme: no station exceeds the amplitude, the nearest one meets it.
    assert np.abs(result.initial_bow).max() == pytest.approx(L / 250, rel=1e-6)
    assert np.abs(result.initial_bow).max() <= L / 250 * (1 + 1e-12)
    shape = result.buckling.mode_shapes(result.x)[0]
    assert np.abs(result.initial_bow - result.bow.amplitude * shape).max() < 1e-12 * L


@pytest.mark.parametrize(
    "extra",
    [
        {"restraints": [{"x": 2.0, "translation": "fixed"}]},
        {"steps": [{"x": 4.0, "EI": 0.7 * EI}]},
        {"restraints": [{"x": 2.5, "translation": 2e6, "hinge": True}, {"x": 4.0, "rotation": 1e6}]},
        {
            "restraints": [{"x": 2.0, "translation": "fixed", "hinge": True}],
            "steps": [{"x": 3.0, "EI": 2 * EI}],
        },
        {"foundation": [{"start": 1.0, "end": 5.0, "k": 3e4}]},
    ],
)
def test_a_modal_bow_is_amplified_by_one_over_one_minus_n_over_ncr(extra):
    # A bow a·φ in the shape of the first mode, alone: w = a·N/(N_cr − N)·φ exactly (φ satisfies the equation
    # at N_cr and every condition; derived, and the classical amplification of a first-mode imperfection,
    # Timoshenko & Gere ch. 1, from memory).
    a, P = 0.02, 2e5
    case = _case(
        left="fixed", right="pinned", P=P, loads=[], imperfection={"shape": "mode", "amplitude": a}, **extra
    )
    result = engine.solve(case)
    pcr = result.critical_loads[0]
    expected = a * P / (pcr - P) * result.buckling.mode_shapes(result.x)[0]
    assert np.abs(result.deflection - expected).max() <= 1e-12 * np.abs(expected).max()


# ------------------------------------------------------------------------------------------- statics


def test_two_equal_spans_under_udl_middle_reaction():
    # Continuous beam of two equal spans l under q: middle reaction 1.25 q l, end reactions 0.375 q l, hogging
    # moment q l²/8 over the middle support (AISC Steel Construction Manual, 15th ed., Table 3-23, case 29;
    # from memory; the same in every handbook of continuous beams).
    result = engine.solve(_case([{"x": L / 2, "translation": "fixed"}]))
    span = L / 2
    (middle,) = result.reactions.intermediate
    assert middle.x == L / 2
    assert -middle.force == pytest.approx(1.25 * q * span, rel=1e-12)
    assert result.reactions.left_T == pytest.approx(0.375 * q * span, rel=1e-12)
    assert -result.reactions.right_T == pytest.approx(0.375 * q * span, rel=1e-12)
    assert result.governing.moment.value == pytest.approx(-q * span**2 / 8, rel=1e-12)
    assert abs(result.equilibrium.transverse) < 1e-13


def test_propped_cantilever_by_a_hinge():
    # A fixed end, a hinge at a, a pin at the far end: the part beyond the hinge is a simple beam of length
    # L - a carrying half its load onto the hinge; the cantilever part then has the fixed-end moment
    # q a²/2 + q (L - a)/2 · a (statics of a Gerber beam; common practice, no source).
    a = 2.0
    case = _case([{"x": a, "hinge": True}], left="fixed", right="pinned")
    result = engine.solve(case)
    fixed_end = q * a**2 / 2 + q * (L - a) / 2 * a
    assert result.reactions.left_M == pytest.approx(-fixed_end, rel=1e-12)
    i = int(np.argmin(np.abs(result.x - a)))
    assert abs(result.moment[i]) < 1e-9 * fixed_end
    assert result.reactions.intermediate[0].force == pytest.approx(0.0, abs=1e-9 * q * L)


def test_a_rigid_rotation_restraint_clamps():
    # A pinned–pinned beam with translation and rotation held at mid-span: each half is a propped cantilever
    # (fixed at the middle), whose fixed-end moment under q is q l²/8 (handbook, from memory).
    result = engine.solve(_case([{"x": L / 2, "translation": "fixed", "rotation": "fixed"}]))
    span = L / 2
    assert abs(result.reactions.intermediate[0].couple) < 1e-9 * q * span**2  # symmetric: no net couple
    assert result.governing.moment.magnitude == pytest.approx(q * span**2 / 8, rel=1e-12)


@settings(max_examples=15, deadline=None)
@given(x=st.floats(0.5, 5.5), P=st.floats(-2e6, 1.5e6))
def test_stiff_spring_approaches_rigid(x, P):
    # k → ∞ approaches the rigid restraint: the spring's error in w is R/k (common practice, no source).
    rigid = engine.solve(_case([{"x": x, "translation": "fixed"}], P=P))
    stiff = engine.solve(_case([{"x": x, "translation": 1e15}], P=P))
    scale = np.abs(rigid.moment).max()
    assert np.abs(stiff.moment - rigid.moment).max() <= 1e-6 * scale
    assert stiff.reactions.intermediate[0].force == pytest.approx(
        rigid.reactions.intermediate[0].force, rel=1e-6
    )


@settings(max_examples=15, deadline=None)
@given(x=st.floats(0.3, 5.7), P=st.floats(-2e6, 1.0e6))
def test_step_with_equal_EI_changes_nothing(x, P):
    plain = engine.solve(_case(P=P, loads=[{"type": "point", "P": 1e4, "x": 2.2}]), stations=101)
    stepped = engine.solve(
        _case(steps=[{"x": x, "EI": EI}], P=P, loads=[{"type": "point", "P": 1e4, "x": 2.2}]), stations=101
    )
    assert stepped.critical_loads == pytest.approx(plain.critical_loads, rel=1e-12)
    scale = np.abs(plain.moment).max()
    # The step's node adds a station; compare at the plain result's stations.
    idx = np.searchsorted(stepped.x, plain.x)
    idx = np.minimum(idx, stepped.x.size - 1)
    same = np.abs(stepped.x[idx] - plain.x) < 1e-12
    assert np.abs(stepped.moment[idx][same] - plain.moment[same]).max() <= 1e-9 * scale


# ------------------------------------------------------------------------------------------- buckling


def test_column_with_rigid_mid_height_brace():
    # A pinned–pinned column braced against sway at mid-height buckles in two half-waves: N_cr = 4π²EI/L²
    # (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., ch. 2, the bar on an intermediate support;
    # from memory).
    result = engine.solve(_case([{"x": L / 2, "translation": "fixed"}], loads=[]))
    assert result.critical_loads[0] == pytest.approx(4 * math.pi**2 * EI / L**2, rel=1e-12)
    # The mode is two half-waves: its value at the quarter points is ±1.
    shape = result.buckling.mode_shapes(np.array([L / 4, 3 * L / 4]))[0]
    assert shape == pytest.approx([1.0, -1.0], abs=1e-9)
    assert result.buckling.effective_lengths() == pytest.approx([L / 2, L / 2], rel=1e-12)


def test_stepped_cantilever_against_its_characteristic_equation():
    # A cantilever fixed at x = 0, free at x = L, the lower part (length l2) of EI2, the upper (l1) of EI1,
    # loaded at the top: tan(k1 l1) · tan(k2 l2) = k1/k2, k_i = √(P/EI_i) (Timoshenko & Gere, Theory of
    # Elastic Stability, 2nd ed., ch. 2, buckling of a bar with changes in cross section; from memory,
    # re-derived: y = δ(1 - cos k2 x) below the step, y = δ + B sin k1 (L - x) above, w and w' continuous
    # at the step).
    l2, EI2, EI1 = 2.5, EI, 0.3 * EI
    l1 = L - l2
    case = _case(steps=[{"x": l2, "EI": EI1}], left="fixed", right="free", loads=[])
    pcr = engine.critical_loads(case, 1).critical_loads[0]

    def characteristic(P):
        k1, k2 = math.sqrt(P / EI1), math.sqrt(P / EI2)
        return math.sin(k1 * l1) * math.sin(k2 * l2) * k2 - k1 * math.cos(k1 * l1) * math.cos(k2 * l2)

    # The first root lies between the cantilevers of the weaker and the stronger uniform bar.
    lo, hi = math.pi**2 * EI1 / (4 * L**2), math.pi**2 * EI2 / (4 * L**2)
    reference = brentq(characteristic, lo, hi, xtol=1e-14 * hi, rtol=1e-15)
    assert pcr == pytest.approx(reference, rel=1e-11)
    lengths = engine.critical_loads(case, 1).effective_lengths()
    assert lengths == pytest.approx(math.pi * np.sqrt(np.array([EI2, EI1]) / reference), rel=1e-11)


def test_critical_loads_count_every_root_of_a_braced_column():
    # Two equal pinned spans: the roots are the pinned span's (m π / l)² EI and the propped cantilever's
    # (4.4934 / l)² EI (Timoshenko & Gere ch. 2; from memory), interleaved, none missed.
    result = engine.critical_loads(_case([{"x": L / 2, "translation": "fixed"}], loads=[]), 5)
    span = L / 2
    mu = brentq(
        lambda t: math.sin(t) - t * math.cos(t), 4.0, 4.6, xtol=1e-15
    )  # tan μ = μ, propped cantilever
    mu2 = brentq(lambda t: math.sin(t) - t * math.cos(t), 7.6, 7.8, xtol=1e-15)
    expected = sorted(
        [(math.pi / span) ** 2 * EI, (2 * math.pi / span) ** 2 * EI, (3 * math.pi / span) ** 2 * EI]
        + [(mu / span) ** 2 * EI, (mu2 / span) ** 2 * EI]
    )
    assert result.critical_loads == pytest.approx(expected, rel=1e-11)


def test_an_elastic_brace_between_none_and_rigid():
    # A pinned column with a mid-height spring: N_cr rises with k up to the rigid brace's 4π²EI/L², which is
    # reached at k = 16π²EI/L³ (Timoshenko & Gere ch. 2, the bar on an elastic intermediate support; from
    # memory: the threshold stiffness of a mid-height brace).
    threshold = 16 * math.pi**2 * EI / L**3
    pcr = [
        engine.critical_loads(_case([{"x": L / 2, "translation": k}], loads=[]), 1).critical_loads[0]
        for k in (0.25 * threshold, 0.999 * threshold, 1.001 * threshold)
    ]
    euler = math.pi**2 * EI / L**2
    assert euler < pcr[0] < pcr[1] < 4 * euler
    assert pcr[2] == pytest.approx(4 * euler, rel=1e-12)


def test_solver_is_singular_at_its_critical_load():
    case = _case([{"x": 2.0, "translation": "fixed"}], steps=[{"x": 4.0, "EI": 2 * EI}])
    pcr = engine.critical_loads(case, 1).critical_loads[0]
    result = engine.solve(engine.Case.from_dict({**case.to_dict(), "axial_force": pcr}))
    assert result.status == "critical"
    near = engine.solve(engine.Case.from_dict({**case.to_dict(), "axial_force": 0.999 * pcr}))
    assert near.status == "stable"
    assert near.amplification.moment > 50


def test_second_plane_restraint_acts_in_that_plane_only():
    data = {
        "length": L,
        "EI": EI,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 1e5,
        "second_plane": {"supports": {"left": "pinned", "right": "pinned"}, "EI": 0.2 * EI},
        "restraints": [{"x": L / 2, "translation": "fixed", "plane": "second"}],
    }
    result = engine.solve(engine.Case.from_dict(data))
    assert result.critical_loads[0] == pytest.approx(math.pi**2 * EI / L**2, rel=1e-12)
    assert result.second_plane.critical_loads[0] == pytest.approx(4 * math.pi**2 * 0.2 * EI / L**2, rel=1e-12)
    assert result.reactions.intermediate == ()


def test_preset_with_steps_on_a_swaying_member_takes_the_mode():
    case = _case(
        steps=[{"x": 3.0, "EI": 2 * EI}],
        left="fixed",
        right="free",
        P=1e5,
        imperfection={"preset": "en1993-table-5.1", "curve": "b"},
    )
    result = engine.solve(case)
    assert result.bow.shape == "mode"
    assert result.status == "stable"


def test_sweep_agrees_with_solve():
    # The many-force assembly (engine.sweep) and the one-force assembly give the same solution.
    case = _case(
        [
            {"x": 1.5, "translation": "fixed"},
            {"x": 3.0, "translation": 2e6, "rotation": 1e6},
            {"x": 4.5, "hinge": True, "translation": "fixed"},
        ],
        steps=[{"x": 2.5, "EI": 0.5 * EI}],
        loads=[{"type": "uniform", "q": q}, {"type": "point", "P": 1e4, "x": 2.0}],
        imperfection={"shape": "sine", "amplitude": 0.01},
    )
    pcr = engine.critical_loads(case, 1).critical_loads[0]
    forces = np.array([-0.5 * pcr, 0.3 * pcr, 0.8 * pcr])
    swept = engine.sweep(case, forces)
    for i, P in enumerate(forces):
        one = engine.solve(engine.Case.from_dict({**case.to_dict(), "axial_force": float(P)}))
        assert abs(swept.peak_moment[i]) == pytest.approx(one.governing.moment.magnitude, rel=1e-9)


def test_member_check_with_a_brace_takes_the_second_order_route():
    data = {
        "length": L,
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 8e5,
        "loads": [{"type": "uniform", "q": q}],
        "imperfection": {"preset": "en1993-table-5.1"},
        "restraints": [{"x": L / 2, "translation": "fixed"}],
    }
    # The equivalent-member routes are read per segment between the braced points (test_segment_routes.py).
    routes = engine.solve(engine.Case.from_dict(data)).routes
    assert routes[0].facts.get("segment_start") is None
    assert routes[1].facts["segment_start"] in (0.0, L / 2)  # the two spans are alike
    result = engine.solve(engine.Case.from_dict({**data, "check": {"routes": ["second-order"]}}))
    assert result.bow.shape == "mode" and result.check is not None
    # The braced column's first mode is two half-waves (4π²EI/L²); the code bow follows it, and the second-
    # order moments exceed the braced span's first-order hogging moment q l²/8 (Table 3-23, from memory).
    assert result.critical_loads[0] == pytest.approx(4 * math.pi**2 * result.EI / L**2, rel=1e-12)
    assert result.governing.moment.magnitude > q * (L / 2) ** 2 / 8
    assert 0 < result.utilization < 1


def test_a_braced_hinge_decouples_the_spans_in_buckling():
    # Fixed at x = 0, a hinge held sideways at mid-length, pinned at x = L: the left span buckles as a
    # fixed–pinned strut (μ = 4.4934, tan μ = μ), the right as a pinned–pinned one (π), independently
    # (Timoshenko & Gere ch. 2, from memory); the first critical loads are the spans' own, interleaved.
    span = L / 2
    case = _case([{"x": span, "translation": "fixed", "hinge": True}], left="fixed", right="pinned", loads=[])
    pcr = engine.critical_loads(case, 3).critical_loads
    mu = brentq(lambda t: math.sin(t) - t * math.cos(t), 4.0, 4.6, xtol=1e-15)
    expected = sorted([(math.pi / span) ** 2 * EI, (mu / span) ** 2 * EI, (2 * math.pi / span) ** 2 * EI])
    assert pcr == pytest.approx(expected, rel=1e-11)
    # The first mode lives in the right span only.
    shape = engine.critical_loads(case, 1).mode_shapes(np.array([span / 2, span + span / 2]))[0]
    assert shape == pytest.approx([0.0, 1.0], abs=1e-9)


_SUPPORT = st.sampled_from(["pinned", "fixed", "free", "guided"])
_RESTRAINT = st.fixed_dictionaries(
    {
        "x": st.sampled_from([0.7, 1.6, 2.9, 3.7, 4.6, 5.3]),
        "translation": st.sampled_from(["fixed", "free", 3e5, 5e6]),
        "rotation": st.sampled_from(["free", "free", 2e5, "fixed"]),
        "hinge": st.booleans(),
    }
)


@settings(max_examples=25, deadline=None)
@given(
    left=_SUPPORT,
    right=_SUPPORT,
    restraints=st.lists(_RESTRAINT, max_size=3, unique_by=lambda r: r["x"]),
    step=st.sampled_from([None, 0.4, 2.5]),
    k=st.sampled_from([None, 2e4, 1e6]),
)
def test_no_critical_load_is_missed(left, right, restraints, step, k):
    # Against an independent finite-element model (tests/support/fe_buckling.py, Hermite cubic elements,
    # error O(h⁴)): the first three critical loads of random supports, restraints, hinges, a step and a
    # foundation agree, so Wittrick–Williams neither misses nor invents one.
    restraints = [dict(r, rotation="free") if r["hinge"] else r for r in restraints]
    data = {
        "length": L,
        "EI": EI,
        "supports": {"left": left, "right": right},
        "restraints": restraints,
        "steps": [] if step is None else [{"x": 3.3, "EI": step * EI}],
        "foundation": [] if k is None else [{"start": 1.1, "end": 4.9, "k": k}],
    }
    try:
        case = engine.Case.from_dict(data)
    except engine.CaseError:
        return  # a mechanism, or a restraint that restrains nothing
    from tests.support.fe_buckling import fe_critical_loads

    ours = engine.critical_loads(case, 3).critical_loads
    # The element model's rounding grows with its condition, as the fourth power of the element count (a
    # long free overhang: 2e-8 with 30 elements, 1.4e-5 with 240, converging to this engine's value on the
    # coarser meshes), so 80 elements; and a nearly free part (a soft foundation beside a hinge) has a
    # critical load of a few hundred N, known to about 1e-8 of EI/L² only. A missed or invented root would
    # differ by far more.
    assert ours == pytest.approx(fe_critical_loads(data, 3, elements=80), rel=1e-5, abs=1e-6 * EI / L**2)
