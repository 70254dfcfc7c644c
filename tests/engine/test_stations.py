"""The stations rule of the contract: ends, loads, doubled jump points and exact interior peaks."""

import numpy as np
import pytest

import engine

L = 6.0
CASE = {
    "schema": 1,
    "length": L,
    "EI": 4e6,
    "supports": {"left": "pinned", "right": "fixed"},
    "axial_force": 8e5,
    "loads": [
        {"type": "point", "P": 5e3, "x": 1.3},
        {"type": "couple", "C": 2e3, "x": 4.1},
        {"type": "uniform", "q": 1e3, "start": 2.0, "end": 3.5},
    ],
}


def test_stations_hold_ends_loads_and_boundaries():
    """x starts at 0, ends at L, is sorted, and holds every load position and load boundary."""
    r = engine.solve(engine.Case.from_dict(CASE), stations=51)
    assert r.x[0] == 0.0 and r.x[-1] == L and np.all(np.diff(r.x) >= 0)
    for pos in (1.3, 4.1, 2.0, 3.5):
        assert np.any(r.x == pos)


def test_jumps_are_given_twice_left_then_right():
    """At the point load V and T drop by F; at the couple M rises by C; both stations appear twice."""
    r = engine.solve(engine.Case.from_dict(CASE), stations=51)
    i = np.nonzero(r.x == 1.3)[0]
    assert i.size == 2 and i[1] == i[0] + 1
    assert r.shear[i[1]] - r.shear[i[0]] == pytest.approx(-5e3, rel=1e-12)
    assert r.transverse_force[i[1]] - r.transverse_force[i[0]] == pytest.approx(-5e3, rel=1e-12)
    j = np.nonzero(r.x == 4.1)[0]
    assert j.size == 2 and r.moment[j[1]] - r.moment[j[0]] == pytest.approx(2e3, rel=1e-10)
    assert np.sum(r.x == 2.0) == 1  # a load boundary has no jump, so it is listed once


def test_interior_peaks_are_stations_where_shear_and_slope_vanish():
    """Wherever V or w' changes sign between stations of one segment there is a station with V or w' = 0."""
    r = engine.solve(engine.Case.from_dict(CASE), stations=11)
    for values in (r.shear, r.rotation):
        small = np.abs(values) <= 1e-9 * np.abs(values).max()  # a station at the zero itself
        for a in range(r.x.size - 1):
            if values[a] * values[a + 1] < 0 and r.x[a] != r.x[a + 1] and not (small[a] or small[a + 1]):
                pytest.fail(f"sign change between x = {r.x[a]} and {r.x[a + 1]} with no zero station")
    assert np.any(np.abs(r.rotation) <= 1e-9 * np.abs(r.rotation).max())


def test_governing_moment_is_exact_even_on_a_coarse_grid():
    """With 3 or 401 stations the governing moment is the same to 1e-12 (the peak is found, not sampled)."""
    coarse = engine.solve(engine.Case.from_dict(CASE), stations=3)
    fine = engine.solve(engine.Case.from_dict(CASE), stations=401)
    assert coarse.governing.moment.value == pytest.approx(fine.governing.moment.value, rel=1e-12)
    assert coarse.governing.deflection.value == pytest.approx(fine.governing.deflection.value, rel=1e-12)


def test_first_order_shares_the_stations():
    """result.first_order is the P = 0 solution at the same x."""
    r = engine.solve(engine.Case.from_dict(CASE), stations=51)
    f = r.first_order
    np.testing.assert_array_equal(f.x, r.x)
    assert f.axial_force == 0.0 and f.first_order is None


def test_stations_argument_is_checked():
    """stations must be a whole number from 2 to 100 000; anything else is a CaseError naming it."""
    case = engine.Case.from_dict(CASE)
    for bad in (1, 0, 1.5, True, "401", 10**6):
        with pytest.raises(engine.CaseError, match="stations"):
            engine.solve(case, stations=bad)
