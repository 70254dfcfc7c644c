"""engine.sweep: the governing values for many axial forces, against one solve each."""

import numpy as np
import pytest

import engine

CASE = {
    "schema": 1,
    "title": "Invented check: propped strut with springs",
    "length": 5.0,
    "EI": 3.0e6,
    "supports": {"left": {"translation": "fixed", "rotation": 4.0e6}, "right": "pinned"},
    "loads": [
        {"type": "uniform", "q": 2e3},
        {"type": "point", "P": 5e3, "x": 1.5},
        {"type": "linear", "q_start": 0.0, "q_end": 3e3, "start": 2.0, "end": 5.0},
    ],
    "imperfection": {"shape": "mode", "amplitude": 0.01},
}


def test_sweep_matches_single_solves():
    """Each axial force of a sweep from strong tension to past the third critical load gives the governing
    |w|, |w + w0|, |M| and |V| of engine.solve at that force, to 1e-9."""
    case = engine.Case.from_dict(CASE)
    pcr = engine.critical_loads(case).critical_loads
    forces = np.linspace(-3 * pcr[0], 1.2 * pcr[2], 37)
    s = engine.sweep(case, forces)
    for i, P in enumerate(forces):
        r = engine.solve(engine.Case.from_dict(dict(CASE, axial_force=float(P))))
        assert s.stable[i] == r.stable
        for name in ("deflection", "total_offset", "moment", "shear"):
            assert getattr(s, f"peak_{name}")[i] == pytest.approx(
                getattr(r.governing, name).magnitude, rel=1e-9
            )


def test_sweep_marks_critical_loads_and_keeps_order():
    """A force exactly at a critical load is flagged critical with +inf values; order follows the input."""
    case = engine.Case.from_dict(CASE)
    pcr = engine.critical_loads(case).critical_loads
    forces = np.array([0.5 * pcr[0], pcr[1], -pcr[0], pcr[0]])
    s = engine.sweep(case, forces)
    assert list(s.critical) == [False, True, False, True]
    assert np.isinf(s.peak_moment[[1, 3]]).all() and np.isfinite(s.peak_moment[[0, 2]]).all()
    assert list(s.stable) == [True, False, True, False]
    np.testing.assert_array_equal(s.axial_force, forces)


def test_sweep_amplification_is_relative_to_first_order():
    """moment_amplification_first_order is peak |M| / first-order peak |M|; moment_amplification (reference
    M_I + N·w0) agrees with engine.solve's to 1e-12."""
    case = engine.Case.from_dict(CASE)
    s = engine.sweep(case, [0.0, 1e5, -2e5])
    assert s.moment_amplification_first_order[0] == pytest.approx(1.0, rel=1e-14)
    assert s.moment_amplification[0] == pytest.approx(1.0, rel=1e-14)
    ratio = s.peak_moment[1] / s.first_order.moment.value
    assert ratio == pytest.approx(s.moment_amplification_first_order[1], rel=1e-14)
    for i, P in ((1, 1e5), (2, -2e5)):
        r = engine.solve(engine.Case.from_dict(dict(CASE, axial_force=P)))
        assert s.moment_amplification[i] == pytest.approx(r.amplification.moment, rel=1e-12)


def test_sweep_rejects_non_finite_forces():
    """NaN or inf axial forces raise CaseError naming axial_forces."""
    with pytest.raises(engine.CaseError, match="axial_forces"):
        engine.sweep(engine.Case.from_dict(CASE), [1.0, float("nan")])


def test_sweep_gives_the_simple_amplification_beside_the_exact():
    """simple_amplification: 1/(1 − P/Pcr1) below Pcr1, NaN from Pcr1 on (Timoshenko & Gere 1961 ch. 1)."""
    case = engine.Case.from_dict(CASE)
    pcr1 = engine.critical_loads(case).critical_loads[0]
    forces = np.array([-pcr1, 0.0, 0.5 * pcr1, pcr1, 1.5 * pcr1])
    s = engine.sweep(case, forces)
    np.testing.assert_allclose(s.simple_amplification[:3], 1.0 / (1.0 - forces[:3] / pcr1), rtol=1e-14)
    assert np.isnan(s.simple_amplification[3:]).all()
