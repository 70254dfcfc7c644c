"""The single-force fast paths of ``engine.solve`` give what the general evaluation gives.

For one axial force ``engine.solve`` evaluates the stations from a table of polynomials in -P/EI
(``engine.solver.table.StationTable``) and finds the interior peaks by the Taylor series of the solution about
the stations (``engine.solver.series.refine_by_series``). Both are rearrangements of the exact solution, so
the check here is against the
engine's own general path, which the outside references check (solve_bvp in ``test_against_bvp.py``, mpmath
and Timoshenko & Gere in ``test_closed_forms.py``; both run through these fast paths too):

- the states at every station of a result, evaluated again by the general basis functions at the same
  positions, agree to 1e-12 of each field's largest value;
- every interior peak is a zero of its target: at the peak of M, V = 0, and so on (the definition of a peak
  in conventions.md, "stations rule"), to 1e-9 of the target's scale;
- the derivative recursion equals the derivatives of w from the governing equation differentiated term by
  term (common practice, no source: it is the equation itself).
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import engine
from engine import prepared, solver
from engine.solver import series
from tests import strategies as cs

_FIELDS = (
    ("deflection", "w"),
    ("rotation", "rotation"),
    ("moment", "M"),
    ("shear", "V"),
    ("transverse_force", "T"),
    ("initial_bow", "w0"),
)


def _case(left, right, shape, fraction, **extra):
    data = {
        "schema": 1,
        "length": 5.0,
        "EI": 2.0e6,
        "supports": {"left": left, "right": right},
        "loads": [
            {"type": "uniform", "q": 1.0e3},
            {"type": "point", "P": 3.0e3, "x": 1.7},
            {"type": "couple", "C": 2.0e3, "x": 3.1},
            {"type": "linear", "q_start": 500.0, "q_end": -800.0, "start": 0.5, "end": 4.0},
        ],
        "imperfection": {"shape": shape, "amplitude": 0.01 if shape != "none" else 0.0},
    }
    data.update(extra)
    pcr1 = engine.critical_loads(engine.Case.from_dict(data), 1).critical_loads[0]
    data["axial_force"] = fraction * float(pcr1)
    return engine.Case.from_dict(data)


def _exact_states(case, result):
    """The states at result.x by the general basis functions (no table, no series)."""
    model = prepared.prepare(case).model
    x = np.asarray(result.x)
    seg = model.segment_of(x)
    # A node listed twice is the end of the left segment first, then the start of the right one.
    first_of_pair = np.zeros(x.size, dtype=bool)
    first_of_pair[:-1] = x[:-1] == x[1:]
    seg = np.where(first_of_pair, np.maximum(seg - 1, 0), seg)
    xi = x - model.xa[seg]
    batch = solver.Batch(model, [case.axial_force])
    return batch.states(0, solver.Points(model, seg, xi)), model


SUPPORTS = [
    ("pinned", "pinned"),
    ("fixed", "free"),
    ("fixed", "guided"),
    ("fixed", "pinned"),
    ("fixed", "fixed"),
    ({"translation": 5.0e6, "rotation": 2.0e6}, {"translation": 8.0e6, "rotation": 5.0e5}),
]


@pytest.mark.parametrize("left, right", SUPPORTS)
@pytest.mark.parametrize("shape", ["none", "sine", "parabola", "sway", "mode"])
@pytest.mark.parametrize("fraction", [0.0, 0.4, -2.0, 1.7])
def test_solve_equals_the_general_evaluation_at_every_station(left, right, shape, fraction):
    case = _case(left, right, shape, fraction)
    result = engine.solve(case)
    exact, _ = _exact_states(case, result)
    for name, key in _FIELDS:
        got, want = np.asarray(getattr(result, name)), exact[key]
        scale = max(float(np.abs(want).max()), 1e-300)
        assert np.abs(got - want).max() <= 1e-12 * scale, (name, float(np.abs(got - want).max() / scale))


@pytest.mark.parametrize("left, right", SUPPORTS)
@pytest.mark.parametrize("fraction", [0.0, 0.6, -1.5])
def test_interior_peaks_are_zeros_of_their_targets(left, right, fraction):
    """A governing |M| or |w| is at an end, at a node (a load's kink) or where V or w' is zero."""
    case = _case(left, right, "sine", fraction)
    result = engine.solve(case)
    exact, model = _exact_states(case, result)
    x = np.asarray(result.x)
    for name, target in (("moment", exact["V"]), ("deflection", exact["rotation"])):
        peak = getattr(result.governing, name)
        i = int(np.flatnonzero(x == peak.x)[0])
        at_node = np.min(np.abs(model.nodes - peak.x)) <= 1e-12 * case.length
        assert at_node or abs(target[i]) <= 1e-9 * float(np.abs(target).max()), (name, peak.x)


def test_the_fast_paths_are_the_ones_used_on_the_benchmark_like_case(monkeypatch):
    """Guard against a silent fallback: the table and the series both apply to an ordinary spring case."""
    case = _case(*SUPPORTS[-1], "sine", 0.5)
    engine.clear_caches()
    calls = []
    original = series.refine_by_series

    def spy(batch, pts, st_, fid, k, *rest):
        fast = original(batch, pts, st_, fid, k, *rest)
        calls.append((batch.table_rows is not None, fast is not None and fast[2].size == k.size))
        return fast

    monkeypatch.setattr(series, "refine_by_series", spy)
    engine.solve(case)
    # Every refinement (the first order's, then the solve's) took the series; the solve's batch used the
    # table.
    assert calls and all(fast for _, fast in calls) and calls[-1][0], calls


def test_strong_tension_falls_back_and_still_matches():
    """u = sqrt(|P|/EI) L = 2000: beyond the series' reach; the general path gives the states."""
    data = {
        "schema": 1,
        "length": 4.0,
        "EI": 1.0e6,
        "supports": {"left": "fixed", "right": "fixed"},
        "loads": [{"type": "uniform", "q": 1.0e3}],
        "axial_force": -((2000.0 / 4.0) ** 2) * 1.0e6,
    }
    case = engine.Case.from_dict(data)
    result = engine.solve(case)
    exact, _ = _exact_states(case, result)
    scale = float(np.abs(exact["M"]).max())
    assert np.abs(np.asarray(result.moment) - exact["M"]).max() <= 1e-10 * scale
    assert np.isfinite(np.asarray(result.moment)).all()


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(s=st.one_of(st.just(0.0), st.floats(-50.0, 50.0)), beta=st.floats(0.0, 3.0), data=st.data())
def test_derivative_recursion_matches_the_equation_differentiated(s, beta, data):
    """w^(m+4) = -s w^(m+2) + g^(m), g = Q0 + Q1 x + s (F sin θ) (common practice, no source)."""

    class _Bow:
        terms = ((1.0, beta, 0.3),) if beta > 0 else ()

    class _Model:
        bow = _Bow()

    tables = series.SeriesTables(_Model())
    v = np.array(data.draw(st.lists(st.floats(-10.0, 10.0), min_size=8, max_size=8)))
    R = tables.recursion(s)
    D = series.SERIES_DERIVATIVES
    d = np.zeros(D)
    d[:4] = v[:4]
    for m in range(D - 4):
        g = (v[4] if m == 0 else 0.0) + (v[5] if m == 1 else 0.0)
        phase = [(v[6], v[7]), (v[7], -v[6]), (-v[6], -v[7]), (-v[7], v[6])][m % 4]
        g += s * beta**m * (phase[0] if beta > 0 else (v[6] if m == 0 else 0.0))
        d[m + 4] = -s * d[m + 2] + g
    got = R @ v
    scale = np.maximum(np.abs(d[4:]), 1.0) * max(1.0, abs(s)) ** (np.arange(D - 4) / 2 + 1)
    assert np.all(np.abs(got - d[4:]) <= 1e-12 * scale)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(data=st.data())
def test_random_cases_match_the_general_evaluation(data):
    """Hypothesis cases (springs, partial and linear loads, couples, every bow), tension to 0.95 Pcr1."""
    mapping = data.draw(cs.cases())
    case0 = engine.Case.from_dict(mapping)
    pcr1 = float(engine.critical_loads(case0, 1).critical_loads[0])
    fraction = data.draw(cs.axial_fractions(-5.0, 0.95))
    case = engine.Case.from_dict(cs.with_axial_force(mapping, fraction * pcr1))
    result = engine.solve(case)
    exact, model = _exact_states(case, result)
    # A field can be zero up to rounding (T under couples alone): judge it against the loads' own scale too.
    L, EI = model.L, model.EI
    force = model.load_scale + model.couple_scale / L
    moment = force * L
    floor = {
        "w": moment * L * L / EI,
        "rotation": moment * L / EI,
        "M": moment,
        "V": force,
        "T": force,
        "w0": abs(case.imperfection.amplitude),
    }
    for name, key in _FIELDS:
        got, want = np.asarray(getattr(result, name)), exact[key]
        scale = max(float(np.abs(want).max()), floor[key], 1e-300)
        assert np.abs(got - want).max() <= 1e-11 * scale, name


@pytest.mark.parametrize("left, right", SUPPORTS)
@pytest.mark.parametrize("shape", ["none", "sine", "parabola", "mode"])
def test_station_table_targets_equal_the_general_targets(left, right, shape):
    """The targets and their slopes at the stations (bracketing the peaks), by the table and in general."""
    case = _case(left, right, shape, 0.45)
    prep = prepared.prepare(case)
    seg, xi, shown, pts = prep.stations(401, 0.0)
    fast = solver.Batch(prep.model, [case.axial_force], at=pts)
    assert fast.table_rows is not None
    f1, df1 = fast.targets(fast.states(0, pts), pts)
    general = solver.Batch(prep.model, [case.axial_force])
    plain = solver.Points(prep.model, seg, xi)
    f2, df2 = general.targets(general.states(0, plain), plain)
    for a, b in ((f1, f2), (df1, df2)):
        scale = np.maximum(np.abs(b).max(axis=1, keepdims=True), 1e-300)
        assert np.all(np.abs(a - b) <= 1e-12 * scale)


def test_the_fast_paths_keep_their_state_in_declared_attributes():
    """Solving adds no attribute to the model or the stations: every cache is declared when they are built."""
    case = _case(*SUPPORTS[-1], "sine", 0.5)
    engine.clear_caches()
    prep = prepared.prepare(case)
    pts = prep.stations(401, 0.0)[3]
    before = (set(vars(prep.model)), set(vars(pts)))
    engine.solve(case)
    assert (set(vars(prep.model)), set(vars(pts))) == before
    assert pts.station_table is not None and prep.model.series_tables is not None  # both paths were taken
    batch = solver.Batch(prep.model, [case.axial_force], at=pts)
    state = batch.states(0, pts)
    assert isinstance(state, solver.State) and state.rows is not None and state.columns is not None
    fields = np.stack([state.w, state.rotation, state.M, state.T, state.V, state.w0])
    assert np.array_equal(state.stacked(), fields)
