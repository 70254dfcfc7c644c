"""The page's start demo (issue 17): the invented wind post with a permanent (G) and a wind (W) load case,
its ultimate and service combinations made by EN 1990; the headline's strength comes from the ultimate
combinations, its deflection from the service ones, and the page names the governing combination.

The numbers are checked against closed forms computed without the engine (tests/app/wind_post_reference.py,
sources named there), not re-recorded from a run.
"""

import re

import panel as pn
import pytest

from app.serve import make_page
from tests.app import wind_post_reference as ref


@pytest.fixture(autouse=True)
def clean_panel_state():
    yield
    pn.state.reset()


@pytest.fixture(scope="module")
def start():
    """The page the server builds for a bare `strutscope` (no case named)."""
    page = make_page()
    yield page
    pn.state.reset()


def _text(html: str) -> str:
    return re.sub(r"\s+", " ", re.sub(r"<[^>]+>", " ", html)).strip()


def test_the_start_page_opens_the_invented_demo_with_a_permanent_and_a_wind_case(start):
    state = start.model
    assert state.title.startswith("Invented example") and "invented building" in state.title
    assert [(action["name"], action["category"]) for action in state.actions] == [
        ("G", "permanent"),
        ("W", "wind"),
    ]
    assert state.combination_rule == "en1990-6.10"
    names = [(item.combination.name, item.combination.state) for item in state.result.actions.combinations]
    # EN 1990 eq. (6.10): G at 1.35 and 1.0, W absent or at 1.5 (four); eq. (6.14b): G, G + W (two)
    assert names == [(f"U{i}", "ultimate") for i in range(1, 5)] + [("S1", "service"), ("S2", "service")]
    assert start.combination_bar.panel.visible and start.combination_bar.picker.options
    assert start.governing.panel.visible


def test_the_page_names_the_governing_combinations(start):
    """The strength headline from ultimate U2 = 1.35 G + 1.5 W, the deflection from service S2 = G + W."""
    shown = _text(start.governing.pane.object)
    assert "strength and stability (headline) U2" in shown
    assert "deflection (service) S2" in shown
    governing = {row.check: row for row in start.model.result.actions.governing}
    assert governing["strength"].combination == "U2" and governing["strength"].state == "ultimate"
    assert governing["deflection"].combination == "S2" and governing["deflection"].state == "service"
    # every strength and stability row comes from an ultimate combination
    assert {row.state for row in governing.values() if row.check != "deflection"} == {"ultimate"}


def test_the_headline_n_and_moment_match_the_closed_form(start):
    """U2's axial force is 1.35 × 240 kN − 1.5 × 20 kN = 294 kN; its max|M| with the L/250 bow laid the worse
    way matches the exact beam-column moment (Timoshenko & Gere) within 0.1 %."""
    result = start.model.result
    u2 = ref.combined(1.35, 1.5)
    assert start.model.axial_force == pytest.approx(294e3, rel=1e-12)
    assert result.axial_force == pytest.approx(u2["N"], rel=1e-12)
    assert result.critical_loads[0] == pytest.approx(ref.euler_load(), rel=2e-3)  # 3279 kN (I_y from tables)
    expected = ref.max_moment(u2)
    assert result.governing.moment.magnitude == pytest.approx(expected, rel=1e-3)
    assert f"largest |M| U2 {expected / 1e3:.2f} kN·m" in _text(start.governing.pane.object)


def test_the_headline_deflection_is_the_service_combination_s2(start):
    """w_max of S2 (N 220 kN, q 1.7 kN/m, 1.5 kN at 2.2 m, no bow) over L/250 = 24 mm: 3.118 mm, 0.130; the
    ultimate combination's own deflection (with the bow, at 1.5 W) would read far more."""
    result = start.model.result
    expected = ref.max_deflection(ref.combined(1.0, 1.0))
    assert expected == pytest.approx(3.118e-3, rel=1e-3)  # worked out once, as a plausibility check
    assert result.service.utilization == pytest.approx(expected / (ref.L / 250), rel=1e-3)
    own = next(item for item in result.actions.combinations if item.combination.name == "U2").result.service
    assert own.utilization > 1.3 * result.service.utilization  # the check could fail: U2's own is larger
    assert f"deflection (service) S2 {expected / (ref.L / 250):.3f}" in _text(start.governing.pane.object)
    values = _text(start.values.table.object)  # the values panel shows the same headline deflection
    assert f"deflection (service) {expected / (ref.L / 250):.3f} {expected * 1e3:.3f} mm" in values


def test_each_route_shows_its_largest_value_over_the_ultimate_combinations(start):
    """The routes shown are the headline combination's (U2); the second-order route is loaded more by U1
    (out-of-plane buckling under 1.35 G alone). Each route's value is the shown combination's own, named
    with it, and where another ultimate combination loads it more the words name that one and its value,
    the largest of the combinations, each solved as its own case here ([derived]: an envelope is the largest
    of its members): never a number beside a combination it does not belong to."""
    import engine
    from app.report.numbers import utilisation
    from app.report.routes import route_rows
    from app.units import units

    result = start.model.result
    actions = result.actions
    largest = {}
    for item in actions.combinations:
        if item.combination.state != "ultimate":
            continue
        alone = engine.solve(item.case)
        for route in alone.routes:
            if route.utilization is not None:
                best = largest.get(route.route, (-1.0, ""))
                largest[route.route] = max(best, (float(route.utilization), item.name))
    rows = route_rows(result, units("si"))
    assert rows
    moved = 0
    for row in rows:
        value, name = largest[row["route"]]
        own = next(r.utilization for r in result.routes if r.route == row["route"])
        assert row["value"] == own  # the shown combination's own value
        assert row["utilisation"].startswith(f"{utilisation(own)} in {actions.headline}")
        if name != actions.headline:
            moved += 1
            assert f"; {utilisation(value)} in {name}, the largest of the combinations" in row["utilisation"]
            # The shown combination's governing term goes with its own value, before the larger one (read
            # after it, it would seem the larger one's), and no view adds it again after the words.
            shown = f"in {actions.headline} by {row['governing']}; "
            assert row["term_in_words"] and shown in row["utilisation"]
    assert moved >= 1  # the demo has one: the second-order route in U1
