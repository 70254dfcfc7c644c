"""Solving a case with named load cases: each combination exactly, the envelope, the governing combination.

References: the engine's own plain solve (a combination must equal a direct solve of its summed loads, and a
one-action case under a factor of 1 must be today's case exactly); EN 1990 eq. (6.10) and Table A1.2(B)
for the factors (from memory, as tests/engine/test_combinations.py). Cases invented.
"""

import json
import math
from importlib import resources

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import engine
from engine import analysis
from engine.envelope import combination_case
from tests.support.action_cases import as_one_action


def demo_data(name="demo_wind_post_actions.json"):
    """An invented demo case file as JSON data."""
    return json.loads(resources.files("assets").joinpath(name).read_text(encoding="utf-8"))


FIELDS = ("x", "deflection", "rotation", "moment", "shear", "transverse_force", "initial_bow")


@pytest.mark.parametrize("demo", ["demo_wind_post.json", "demo_two_planes.json"])
def test_one_action_under_factor_one_is_todays_case_exactly(demo):
    """The plain demo as one action with a table row of factor 1 gives today's result bit for bit; its service
    row gives today's deflection check (solved without the bow, to rounding). The two-plane demo's action
    carries both planes' loads (``second_plane.loads``) and gives both planes bit for bit."""
    plain = demo_data(demo)
    data = as_one_action(plain)
    today = engine.solve(engine.Case.from_dict(plain))
    combined = engine.solve(engine.Case.from_dict(data))
    assert combined.actions.headline == "Ult"
    planes = [(today, combined, 1)]
    if today.second_plane is not None:
        planes.append((today.second_plane, combined.second_plane, 2))
    for before, after, plane in planes:
        for name in FIELDS:
            assert np.array_equal(getattr(before, name), getattr(after, name)), (plane, name)
        assert after.service.utilization == pytest.approx(before.service.utilization, rel=1e-12)
        assert after.service.deflection == pytest.approx(before.service.deflection, rel=1e-12)
        assert combined.actions.governing_for("deflection", plane).combination == "Srv"
        assert combined.actions.governing_for("moment", plane).combination == "Ult"
    assert combined.utilization == today.utilization
    assert combined.check.kind == today.check.kind
    assert combined.axial_force == today.axial_force
    assert [r.utilization for r in combined.routes] == [r.utilization for r in today.routes]


def test_a_combination_equals_a_direct_solve_of_its_summed_loads():
    """Combination 1.0 G + 1.5 W of the demo equals the plain case with those loads and N written out."""
    case = engine.Case.from_dict(demo_data())
    result = engine.solve(case)
    item = next(c for c in result.actions.combinations if c.combination.factors == (1.0, 1.5))
    direct = demo_data()
    del direct["actions"], direct["combinations"]
    direct["axial_force"] = 1.0 * 240e3 + 1.5 * -20e3
    direct["loads"] = [{"type": "point", "P": 1.5e3, "x": 2.2}, {"type": "uniform", "q": 1.5 * 1.7e3}]
    expected = analysis.solve(engine.Case.from_dict(direct))
    assert item.case.axial_force == 210e3
    for name in FIELDS:
        np.testing.assert_allclose(getattr(item.result, name), getattr(expected, name), rtol=0, atol=1e-9)
    assert item.result.utilization == pytest.approx(expected.utilization, rel=1e-12)


def test_uplift_with_the_least_permanent_factor_gives_tension():
    """Wind uplift (tension) times 1.5 against permanent compression times 1.0: the member is in tension."""
    data = demo_data()
    data["actions"][0]["axial_force"] = 20e3
    data["actions"][1]["axial_force"] = -40e3
    result = engine.solve(engine.Case.from_dict(data))
    forces = {c.combination.factors: c.case.axial_force for c in result.actions.combinations}
    assert forces[(1.0, 1.5)] == pytest.approx(20e3 - 60e3)
    assert forces[(1.35, 1.5)] == pytest.approx(27e3 - 60e3)
    assert forces[(1.35, 0.0)] == pytest.approx(27e3)


def envelope_holds(env, item, attribute):
    """Each station value of one combination lies within the envelope at that x."""
    values = getattr(item.result, attribute)
    for x, value in zip(item.result.x, values, strict=True):
        at = np.flatnonzero(env.x == x)
        assert at.size, x
        low = getattr(env, f"{attribute}_min")[at].min()
        high = getattr(env, f"{attribute}_max")[at].max()
        tol = 1e-12 * max(1.0, np.abs(values).max())
        assert low - tol <= value <= high + tol, (item.name, attribute, x)


@pytest.mark.parametrize("point", [False, True])
def test_the_envelope_contains_every_combination(point):
    """Every combination's M, V and w at its own stations lie inside the envelope of its limit state, and the
    envelope's extremes are the combinations' own (with a point load: jumps in V)."""
    data = demo_data()
    if point:
        data["actions"][1]["loads"].append({"type": "point", "P": -3e3, "x": 4.0})
    result = engine.solve(engine.Case.from_dict(data))
    actions = result.actions
    for item in actions.combinations:
        env = actions.ultimate if item.combination.state == "ultimate" else actions.service
        for attribute in ("moment", "shear", "deflection"):
            envelope_holds(env, item, attribute)
    for env in (actions.ultimate, actions.service):
        items = [c for c in actions.combinations if c.name in env.names]
        for attribute in ("moment", "shear", "deflection"):
            top = max(getattr(c.result, attribute).max() for c in items)
            assert env.peaks[f"{attribute}_max"][0] == top
            assert getattr(env, f"{attribute}_max").max() == top


def test_headline_strength_from_ultimate_and_deflection_from_service():
    """The headline's strength comes from the ultimate combinations, its deflection from the service ones."""
    result = engine.solve(engine.Case.from_dict(demo_data()))
    items = result.actions.combinations
    ultimate = [c for c in items if c.combination.state == "ultimate"]
    service = [c for c in items if c.combination.state == "service"]
    assert result.utilization == max(c.result.utilization for c in ultimate)
    assert result.service.utilization == max(c.result.service.utilization for c in service)
    # In this demo the ultimate loads deflect more than the service ones: the split matters.
    assert max(c.result.service.utilization for c in ultimate) > result.service.utilization
    governing = {row.check: row for row in result.actions.governing}
    assert governing["strength"].combination == result.actions.headline
    assert governing["strength"].state == "ultimate" and governing["deflection"].state == "service"
    assert {row.check for row in result.actions.governing} >= {"strength", "deflection", "moment", "shear"}
    for route in result.routes:
        row = governing[f"route:{route.route}"]
        assert row.value == max(
            next(r.utilization for r in c.result.routes if r.route == route.route) for c in ultimate
        )


def test_a_fixed_preset_direction_is_tried_both_ways_in_combinations():
    """A preset bow fixed 'positive' (with the wind load) under uplift tension straightens; in the
    combinations both directions are tried, so the moment is never below that of no bow at all."""
    data = demo_data()
    data["imperfection"]["direction"] = "positive"
    data["actions"][0]["axial_force"] = 10e3
    data["actions"][1]["axial_force"] = -60e3
    case = engine.Case.from_dict(data)
    result = engine.solve(case)
    item = next(c for c in result.actions.combinations if c.combination.factors == (1.0, 1.5))
    assert item.case.axial_force < 0
    no_bow = dict(data, imperfection={"shape": "none"})
    bare = engine.solve(engine.Case.from_dict(no_bow))
    bare_item = next(c for c in bare.actions.combinations if c.combination.factors == (1.0, 1.5))
    assert item.result.governing.moment.magnitude >= bare_item.result.governing.moment.magnitude
    fixed = analysis.solve(
        combination_case(case, item.combination).__class__.from_dict(
            {
                **item.case.to_dict(),
                "imperfection": {**item.case.to_dict()["imperfection"], "direction": "positive"},
            }
        )
    )
    # Today's fixed direction gives less moment than no bow at all: the defect the combinations avoid.
    assert fixed.governing.moment.magnitude < bare_item.result.governing.moment.magnitude


def test_a_shaped_bow_is_reversed_where_that_is_worse():
    """A sine bow given with the loads, under tension, is solved reversed as well and the worse kept."""
    data = {
        "length": 5.0,
        "EI": 4e6,
        "supports": {"left": "pinned", "right": "pinned"},
        "imperfection": {"shape": "sine", "amplitude": 0.01},
        "actions": [
            {"name": "G", "category": "permanent", "axial_force": 5e3},
            {
                "name": "W",
                "category": "wind",
                "axial_force": -200e3,
                "loads": [{"type": "uniform", "q": 2e3}],
            },
        ],
    }
    result = engine.solve(engine.Case.from_dict(data))
    item = next(c for c in result.actions.combinations if c.combination.factors == (1.0, 1.5))
    assert item.bow_reversed and item.case.imperfection.amplitude == -0.01
    kept = analysis.solve(combination_case(engine.Case.from_dict(data), item.combination))
    assert item.result.governing.moment.magnitude > kept.governing.moment.magnitude
    assert result.actions.governing_for("moment").unit == "N·m"


def test_a_case_with_actions_is_refused_by_the_plain_paths():
    """The sweep and the plain analysis refuse a case with actions instead of solving it unloaded."""
    case = engine.Case.from_dict(demo_data())
    with pytest.raises(engine.CaseError, match="solved per combination"):
        engine.sweep(case, [0.0, 1e5])
    with pytest.raises(engine.CaseError, match="solved per combination"):
        analysis.solve(case)


@settings(max_examples=20, deadline=None)
@given(
    g=st.floats(-2e5, 6e5),
    w=st.floats(-2e5, 2e5),
    q=st.floats(-5e3, 5e3),
    p=st.floats(-5e3, 5e3),
    x=st.floats(0.0, 5.0),
    fg=st.sampled_from([1.35, 1.0, 0.9]),
    fw=st.sampled_from([1.5, 0.9, 0.0, -1.0]),
)
def test_any_table_combination_equals_the_direct_solve(g, w, q, p, x, fg, fw):
    """For invented actions and factors, a table combination equals the plain case with the loads and N summed
    (a property; the stations are the same, so the values agree to rounding)."""
    data = {
        "length": 5.0,
        "EI": 6e6,
        "supports": {"left": "fixed", "right": "pinned"},
        "imperfection": {"shape": "sine", "amplitude": 0.005},
        "actions": [
            {
                "name": "G",
                "category": "permanent",
                "axial_force": g,
                "loads": [{"type": "point", "P": p, "x": x}],
            },
            {"name": "W", "category": "wind", "axial_force": w, "loads": [{"type": "uniform", "q": q}]},
        ],
        "combinations": {
            "rule": "table",
            "table": [{"name": "C", "state": "ultimate", "factors": {"G": fg, "W": fw}}],
        },
    }
    result = engine.solve(engine.Case.from_dict(data))
    item = result.actions.combinations[0]
    loads = [{"type": "point", "P": fg * p, "x": x}] + ([{"type": "uniform", "q": fw * q}] if fw else [])
    bow = {"shape": "sine", "amplitude": -0.005 if item.bow_reversed else 0.005}
    direct = {key: data[key] for key in ("length", "EI", "supports")}
    direct.update(axial_force=fg * g + fw * w, loads=loads, imperfection=bow)
    expected = analysis.solve(engine.Case.from_dict(direct))
    assert item.result.status == expected.status
    if expected.status == "critical":
        return
    for name in ("moment", "deflection", "shear"):
        got, want = getattr(item.result, name), getattr(expected, name)
        scale = max(1.0, float(np.abs(want).max()))
        np.testing.assert_allclose(got, want, rtol=0, atol=1e-9 * scale)


def test_a_combination_above_the_critical_load_governs_without_a_section():
    """Without a section the headline is ranked by |M|; a combination above Pcr1 (unstable, its moment finite)
    still governs, so the headline never reads stable while a combination buckles."""
    pcr = math.pi**2 * 4e6 / 5.0**2  # Euler, pinned-pinned (tests/REFERENCES.md §2)
    data = {
        "length": 5.0,
        "EI": 4e6,
        "supports": {"left": "pinned", "right": "pinned"},
        "imperfection": {"shape": "sine", "amplitude": 0.005},
        "actions": [
            {"name": "G", "category": "permanent", "axial_force": 0.8 * pcr},
            {
                "name": "W",
                "category": "wind",
                "axial_force": -0.7 * pcr,
                "loads": [{"type": "uniform", "q": 2e4}],
            },
        ],
    }
    result = engine.solve(engine.Case.from_dict(data))
    statuses = {
        c.name: c.result.status for c in result.actions.combinations if c.combination.state == "ultimate"
    }
    assert statuses["U1"] == "unstable" and statuses["U2"] == "stable"
    assert result.actions.headline == "U1" and result.status == "unstable"
    assert result.actions.governing_for("moment").value == math.inf


def test_shared_work_leaves_every_combination_as_its_own_fresh_solve():
    """The 12 combinations of the speed benchmark's case (what they share kept: critical loads, models, the
    M_cr meshes) give, bit for bit, what each combination's plain case gives solved alone from empty
    caches: the diagrams, the utilisation, every route and the LTB check's M_cr."""
    from tests.benchmarks.combinations_speed import twelve

    engine.clear_caches()
    result = engine.solve(twelve())
    engine.solve(twelve())  # warm: everything kept is used
    again = engine.solve(twelve())
    assert len(again.actions.combinations) == 12
    for item in again.actions.combinations:
        engine.clear_caches()
        alone = analysis.solve(item.case)
        for name in FIELDS:
            assert np.array_equal(getattr(item.result, name), getattr(alone, name)), (item.name, name)
        assert item.result.utilization == alone.utilization, item.name
        assert [(r.route, r.utilization) for r in item.result.routes] == [
            (r.route, r.utilization) for r in alone.routes
        ], item.name
        if alone.ltb is not None:
            assert item.result.ltb.M_cr == alone.ltb.M_cr, item.name
    assert result.actions.governing == again.actions.governing
