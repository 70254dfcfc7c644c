"""Load cases in a two-plane case: each action's second-plane loads, each combination solved in both planes
exactly, the envelope of each plane, the governing combination per plane.

References: the engine's own plain two-plane solve (a combination must equal a direct solve of its summed
loads in both planes; the one-action case under a factor of 1 is in tests/engine/test_envelope.py); EN 1990
eq. (6.10) and Table A1.2(B) for the factors (from memory, as tests/engine/test_combinations.py). Cases
invented.
"""

import numpy as np
import pytest

import engine
from engine import analysis
from engine.envelope import combination_case
from tests.support.action_cases import demo_data

FIELDS = ("x", "deflection", "rotation", "moment", "shear", "transverse_force", "initial_bow")


def plain_two_planes():
    """The invented two-plane demo as JSON data."""
    return demo_data("demo_two_planes.json")


def two_plane_actions():
    """An invented two-plane column: a permanent case in both planes, a wind case with uplift in both."""
    data = plain_two_planes()
    del data["axial_force"], data["loads"]
    data["second_plane"]["loads"] = []
    data["actions"] = [
        {
            "name": "G",
            "category": "permanent",
            "axial_force": 150e3,
            "loads": [{"type": "uniform", "q": 0.8e3}],
            "second_plane": {"loads": [{"type": "point", "P": 1.2e3, "x": 1.5}]},
        },
        {
            "name": "W",
            "category": "wind",
            "axial_force": -10e3,
            "loads": [{"type": "uniform", "q": 1.2e3}],
            "second_plane": {
                "loads": [{"type": "uniform", "q": 0.9e3}, {"type": "couple", "C": 0.4e3, "x": 3.0}]
            },
        },
    ]
    data["combinations"] = {"rule": "en1990-6.10", "service": ["characteristic"]}
    return data


def test_a_combination_equals_a_direct_solve_of_its_summed_loads_in_both_planes():
    """Combination 1.35 G + 1.5 W equals the plain two-plane case with both planes' loads and N written
    out."""
    result = engine.solve(engine.Case.from_dict(two_plane_actions()))
    item = next(c for c in result.actions.combinations if c.combination.factors == (1.35, 1.5))
    direct = two_plane_actions()
    del direct["actions"], direct["combinations"]
    direct["axial_force"] = 1.35 * 150e3 + 1.5 * -10e3
    direct["loads"] = [{"type": "uniform", "q": 1.35 * 0.8e3}, {"type": "uniform", "q": 1.5 * 1.2e3}]
    direct["second_plane"]["loads"] = [
        {"type": "point", "P": 1.35 * 1.2e3, "x": 1.5},
        {"type": "uniform", "q": 1.5 * 0.9e3},
        {"type": "couple", "C": 1.5 * 0.4e3, "x": 3.0},
    ]
    expected = analysis.solve(engine.Case.from_dict(direct))
    assert item.case.axial_force == pytest.approx(187.5e3, rel=1e-15)
    for name in FIELDS:
        np.testing.assert_allclose(getattr(item.result, name), getattr(expected, name), rtol=0, atol=1e-9)
        np.testing.assert_allclose(
            getattr(item.result.second_plane, name), getattr(expected.second_plane, name), rtol=0, atol=1e-9
        )
    assert item.result.utilization == pytest.approx(expected.utilization, rel=1e-12)


def test_each_plane_enveloped_and_its_governing_combination_named():
    """The second plane's envelope holds every combination's second-plane diagrams; its governing moment and
    deflection rows name the combination with the largest value in that plane."""
    actions = engine.solve(engine.Case.from_dict(two_plane_actions())).actions
    ultimate = [c for c in actions.combinations if c.combination.state == "ultimate"]
    service = [c for c in actions.combinations if c.combination.state == "service"]
    for items, env in ((ultimate, actions.second_ultimate), (service, actions.second_service)):
        assert env.plane == 2
        for item in items:
            r = item.result.second_plane
            at = np.interp(r.x, env.x, env.moment_max)
            assert np.all(r.moment <= at + 1e-9 * np.max(np.abs(env.moment_max)))
    largest = max(ultimate, key=lambda c: np.max(np.abs(c.result.second_plane.moment)))
    row = actions.governing_for("moment", 2)
    assert row.combination == largest.name
    assert row.value == pytest.approx(np.max(np.abs(largest.result.second_plane.moment)), rel=1e-12)
    worst = max(service, key=lambda c: c.result.second_plane.service.utilization)
    assert actions.governing_for("deflection", 2).combination == worst.name
    assert actions.governing_for("moment", 1).value == pytest.approx(
        max(np.max(np.abs(c.result.moment)) for c in ultimate), rel=1e-12
    )


def test_the_headline_carries_each_planes_own_governing_deflection_check():
    result = engine.solve(engine.Case.from_dict(two_plane_actions()))
    actions = result.actions
    first, second = actions.governing_for("deflection", 1), actions.governing_for("deflection", 2)
    assert result.service.utilization == actions.of(first.combination).result.service.utilization
    assert result.second_plane.service.utilization == second.value


def test_a_shaped_second_plane_bow_is_tried_both_ways_and_the_worse_kept():
    """A second-plane bow given by shape and amplitude: each ultimate combination is the direct solve with
    the worse of the two directions (larger utilisation, then larger max|M| of each plane)."""
    data = two_plane_actions()
    data["second_plane"]["imperfection"] = {"shape": "sine", "amplitude": -0.008}
    case = engine.Case.from_dict(data)
    result = engine.solve(case)
    reversed_any = False
    for item in result.actions.combinations:
        if item.combination.state != "ultimate":
            assert item.case.second_plane.imperfection.shape == "none"  # service: without the bow
            continue
        ways = [
            analysis.solve(combination_case(case, item.combination, second_bow_sign=s)) for s in (1.0, -1.0)
        ]
        ranks = [
            (r.utilization, r.governing.moment.magnitude, r.second_plane.governing.moment.magnitude)
            for r in ways
        ]
        worse = int(ranks[1] > ranks[0])
        assert item.second_bow_reversed == bool(worse)
        assert item.case.second_plane.imperfection.amplitude == (0.008 if worse else -0.008)
        assert item.result.utilization == ways[worse].utilization
        np.testing.assert_array_equal(item.result.second_plane.moment, ways[worse].second_plane.moment)
        reversed_any |= bool(worse)
    assert reversed_any  # the case is made so that the direction matters


@pytest.mark.parametrize(
    ("change", "message"),
    [
        (
            lambda d: d["actions"][1]["second_plane"]["loads"].append({"type": "point", "P": 1.0, "x": 7.5}),
            "actions[1].second_plane.loads[2].x",
        ),
        (
            lambda d: d["second_plane"].__setitem__("loads", [{"type": "uniform", "q": 1.0}]),
            "second_plane.loads",
        ),
        (lambda d: d["actions"][0]["second_plane"].__setitem__("colour", 1), "actions[0].second_plane"),
        (lambda d: d["actions"][0].__setitem__("second_plane", []), "actions[0].second_plane"),
        (lambda d: d.pop("second_plane"), "actions[0].second_plane"),
    ],
)
def test_validation_names_the_path(change, message):
    data = two_plane_actions()
    change(data)
    with pytest.raises(engine.CaseError) as error:
        engine.Case.from_dict(data)
    assert str(error.value).startswith(message), str(error.value)


def test_a_two_plane_case_with_actions_round_trips():
    case = engine.Case.from_dict(two_plane_actions())
    again = engine.Case.from_dict(case.to_dict())
    assert again == case
    assert again.actions[1].second_loads == case.actions[1].second_loads
