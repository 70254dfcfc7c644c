"""The reversed bow's solution formed by linearity (engine.raw.reversed_raw) against a direct solve of it."""

import dataclasses
from pathlib import Path

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

import engine
from engine.prepared import prepare
from engine.raw import raw, reversed_raw
from engine.solver.model import Points
from tests.strategies import loads, named_supports

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo_two_planes.json"
FIELDS = ("w", "rotation", "M", "T", "V")
#: The fields judged together: T and V against the larger of both (T is zero by statics in some cases).
GROUPS = {"w": ("w",), "rotation": ("rotation",), "M": ("M",), "T": ("T", "V"), "V": ("T", "V")}


def _scale(states, name):
    """The largest |value| of ``name``'s group over ``states`` (what rounding is measured against)."""
    return max(max(float(np.abs(s[f]).max(initial=0.0)) for f in GROUPS[name]) for s in states) or 1e-300


def _case(supports, case_loads, shape, direction, fraction, generated=True):
    """The demo (invented) with other supports, loads and bow, at ``fraction`` of its first critical load."""
    base = engine.Case.from_json(DEMO.read_text(encoding="utf-8"))
    data = base.to_dict()
    data.pop("second_plane")
    data["supports"] = {"left": supports[0], "right": supports[1]}
    data["loads"] = case_loads
    data["imperfection"] = dict(data["imperfection"], shape=shape, direction=direction)
    case = engine.Case.from_dict(data)
    pcr = np.asarray(engine.critical_loads(case).critical_loads)
    away = bool(np.all(np.abs(fraction * pcr[0] / pcr - 1.0) > 1e-6))  # not at a critical load
    if generated:
        assume(away)
    assert away
    return dataclasses.replace(case, axial_force=float(fraction * pcr[0]))


def _direction(case, direction):
    return dataclasses.replace(case, imperfection=dataclasses.replace(case.imperfection, direction=direction))


def _both(case, n=401):
    """(combined, direct) raw solutions of the reversed bow of ``case`` at its axial force."""
    P = float(case.axial_force)
    prep = prepare(case)
    free_prep, rev_prep = prep.variant("bow_free"), prep.variant("reversed")
    forward, free = raw(prep, n, P), raw(free_prep, n, P)
    combined = reversed_raw(rev_prep, n, P, forward, free, (prep, free_prep))
    return combined, raw(rev_prep, n, P), rev_prep


@settings(max_examples=25, deadline=None)
@given(
    supports=named_supports(),
    case_loads=loads(4.2, max_size=3, scale=2e3),
    shape=st.sampled_from(["sine", "parabola", "mode"]),
    direction=st.sampled_from(["load", "positive", "negative"]),
    fraction=st.one_of(
        st.floats(-5.0, 0.95, allow_subnormal=False), st.floats(1.05, 2.5, allow_subnormal=False)
    ),
)
def test_reversed_bow_by_linearity_equals_its_direct_solve(supports, case_loads, shape, direction, fraction):
    """w, rotation, M, T and V of the reversed bow as 2 × (bow-free) − (forward) equal a direct solve of the
    reversed bow to 1e-11 of each field's largest value (the combination carries the rounding of two solves,
    one doubled, and the direct solve its own: 2.1e-11 of T's largest value was seen with couples beside a
    guided end), at the stations and at the peaks, which fall at the same points (linearity of the
    second-order problem at a given N: Timoshenko & Gere (1961) ch. 1, the
    governing equation EI w'''' + N w'' = q + N w0'' is linear in q and w0)."""
    case = _case(supports, case_loads, shape, direction, fraction)
    combined, direct, _ = _both(case)
    assume(direct[0] != "critical")
    assert combined is not None
    assert combined[0] == direct[0]
    for name in FIELDS:
        a, b = combined[7][name], direct[7][name]  # the base stations
        assert np.abs(a - b).max() <= 1e-11 * _scale((direct[7],), name), name
    # The largest values (the peaks found between stations on each solution) agree too.
    for name in FIELDS:
        a, b = combined[2][name], direct[2][name]
        assert abs(np.abs(a).max() - np.abs(b).max()) <= 1e-11 * _scale((direct[2],), name), name


@settings(max_examples=15, deadline=None)
@given(
    supports=named_supports(),
    case_loads=loads(4.2, max_size=3, scale=2e3),
    fraction=st.floats(-3.0, 0.95, allow_subnormal=False),  # a subnormal force loses its relative precision
)
def test_combined_peaks_are_exact_points_of_the_combination(supports, case_loads, fraction):
    """The values listed for the combined solution, peaks included, are the combined solution evaluated there
    from the basis functions (not the series about the stations), to 1e-12 of each field's largest value; and
    M's largest value is a true extremum: V, its slope, is zero there or it sits at a node or an end."""
    case = _case(supports, case_loads, "sine", "load", fraction)
    combined, _, rev_prep = _both(case)
    assert combined is not None
    _, _, values, x, seg, xi, batch, *_ = combined
    exact = batch.states(0, Points(rev_prep.model, seg, xi))
    for name in FIELDS:
        assert np.abs(values[name] - exact[name]).max() <= 1e-12 * _scale((exact,), name), name
    i = int(np.argmax(np.abs(values["M"])))
    at_node = np.min(np.abs(rev_prep.model.nodes - x[i])) <= 1e-9 * rev_prep.model.L
    assert at_node or abs(values["V"][i]) <= 1e-9 * max(float(np.abs(values["V"]).max()), 1e-300)


def test_solve_uses_the_combination_and_keeps_the_reversed_results():
    """On the demo (invented), a fixed direction's solve reports the reversed direction's strength utilisation
    and max|M| (formed by linearity) as the solve that fixes that direction gets them directly, to 1e-12."""
    case = dataclasses.replace(engine.Case.from_json(DEMO.read_text(encoding="utf-8")), second_plane=None)
    r = engine.solve(_direction(case, "positive"))
    other = engine.solve(_direction(case, "negative"))
    (d_pos, u_pos, m_pos), (d_neg, u_neg, m_neg) = r.bow.directions
    (o_neg, ou_neg, om_neg), (o_pos, ou_pos, om_pos) = other.bow.directions  # its own direction first
    assert (d_pos, d_neg) == (o_pos, o_neg)
    assert u_neg == pytest.approx(ou_neg, rel=1e-12) and m_neg == pytest.approx(om_neg, rel=1e-12)
    assert u_pos == pytest.approx(ou_pos, rel=1e-12) and m_pos == pytest.approx(om_pos, rel=1e-12)
    assert m_neg == pytest.approx(other.governing.moment.magnitude, rel=1e-12)
    assert u_pos != pytest.approx(u_neg, rel=1e-3)  # the two directions differ here


def test_combination_with_a_sway():
    """A fixed–free member (the demo, invented) with the Table 5.1 preset gets a first-mode bow and the eq.
    (5.5) sway (EN 1993-1-1, from memory); the combination reverses both, as a direct solve does, to 1e-12."""
    case = _case(("fixed", "free"), [{"type": "point", "P": 2.0e3, "x": 4.2}], "sine", "load", 0.5, False)
    assert prepare(case).member.bow.sway != 0.0
    combined, direct, _ = _both(case)
    assert combined is not None
    for name in FIELDS:
        assert np.abs(combined[7][name] - direct[7][name]).max() <= 1e-12 * _scale((direct[7],), name), name
        assert np.abs(combined[2][name] - direct[2][name]).max() <= 1e-12 * _scale((direct[2],), name), name
