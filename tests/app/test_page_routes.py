"""The page's routes and second plane (issue 14): the routes block, the planes line, the plane switch of the
diagrams, the second plane's values and inputs, the route settings, the routes-against-N figure, the link.

Routes are built by hand where the engine gives none (invented numbers, tests/app/test_routes_report.py);
the second plane is the engine's own.
"""

import dataclasses
import html
import json
import re

import numpy as np
import panel as pn
import param
import pytest

from app.page import MemberPage
from app.state import MemberState, values_from_mapping
from tests.app.test_routes_report import ROUTES
from tests.app.test_unit_systems import FORBIDDEN


@pytest.fixture(autouse=True)
def clean_panel_state():
    """Each test starts with Panel's global state as new."""
    yield
    pn.state.clear_caches()


def _with_routes(state):
    """Put hand-made routes into the state's result (of the kind the engine gives)."""
    with param.edit_constant(state):
        state.result = dataclasses.replace(state.result, routes=ROUTES)


def _text(pane) -> str:
    return html.unescape(re.sub(r"<[^>]+>", " ", str(pane.object)))


def test_second_plane_inputs_make_the_case_and_leave_out_of_plane_out():
    """Ticking the second plane writes second_plane and no out_of_plane; the engine solves it."""
    state = MemberState()
    state.param.update(out_of_plane="restrained", plane2=True, plane2_left="fixed")
    mapping = state.case_mapping()
    assert mapping["second_plane"] == {
        "supports": {"left": "fixed", "right": "pinned"},
        "loads": [{"type": "uniform", "q": 1.0e3}],
    }
    assert "out_of_plane" not in mapping
    assert state.errors == {}
    assert state.result.second_plane is not None
    assert state.result.second_plane.case.left.name == "fixed"


def test_second_plane_loads_are_edited_like_the_first_planes():
    """The second plane's loads list takes add, set and remove as the first plane's does, and only its own."""
    state = MemberState()
    state.plane2 = True
    state.add_load("point", field="plane2_loads")
    state.set_load(1, field="plane2_loads", P=2.0e3, x=1.5)
    assert state.plane2_loads[1] == {"type": "point", "P": 2.0e3, "x": 1.5}
    state.remove_load(0, field="plane2_loads")
    assert state.plane2_loads == [{"type": "point", "P": 2.0e3, "x": 1.5}]
    assert len(state.loads) == 2  # the demo's own loads untouched
    (load,) = state.result.second_plane.case.loads
    assert (load.P, load.x) == (2.0e3, 1.5)


def test_route_settings_and_second_plane_go_through_the_link():
    """The link carries the second plane and non-default route settings; reading it restores them."""
    state = MemberState()
    state.param.update(plane2=True, plane2_right="guided", routes=["second-order", "aisc"], annex="A")
    mapping = json.loads(state.link_now())
    assert mapping["second_plane"]["supports"]["right"] == "guided"
    assert mapping["check"]["routes"] == ["second-order", "aisc"] and mapping["check"]["annex"] == "A"
    values = values_from_mapping(mapping)
    assert values["plane2"] is True and values["plane2_right"] == "guided"
    assert values["routes"] == ["second-order", "aisc"] and values["annex"] == "A"
    assert values["aisc_method"] == "LRFD"
    plain = values_from_mapping(MemberState().case_mapping())
    assert plain["plane2"] is False and plain["routes"] == ["second-order", "en-member"]
    assert "routes" not in MemberState().case_mapping()["check"]  # defaults are not written


def test_routes_block_marks_the_headline_and_comparison():
    """The block lists every route with its utilisation and term, the headline starred, the others marked."""
    page = MemberPage()
    _with_routes(page.model)
    text = _text(page.routes.block)
    assert "Routes — headline 0.903" in text
    assert "second order + cross-section 0.812 cross-section counts" in " ".join(text.split())
    assert "EN 1993-1-1 equivalent member (Annex B) 0.903 eq. (6.62) ★ headline" in " ".join(text.split())
    assert "AISC 360-16 (LRFD) 0.951 H1-1a comparison" in " ".join(text.split())
    notes = _text(page.cautions.list)
    # The demo member's LTB check is made (issue 15): the engine drops its LTB warning, and the routes' notes
    # that χ_LT = 1 was taken or LTB not checked are not listed either (the engine's caution says so where the
    # check cannot be made).
    assert "lateral-torsional buckling is not checked" not in notes
    assert notes.count("χ_LT = 1 taken") == 0


def test_planes_line_says_the_out_of_plane_choice():
    """One plane names its out-of-plane choice (checked with L_cr, or prevented); two planes say so."""
    page = MemberPage()
    assert "Out of plane (minor axis (z–z)): flexural buckling checked, L_cr = 6.000 m" in _text(
        page.routes.block
    )
    page.model.out_of_plane = "restrained"
    assert "buckling prevented (restrained" in _text(page.routes.block)
    page.model.plane2 = True
    assert "Both planes analysed: major axis (y–y) and minor axis (z–z)" in _text(page.routes.block)


def test_plane_switch_draws_the_second_planes_diagrams_and_values():
    """With a second plane the switch appears; choosing it plots the second plane's M and hides the sketch."""
    page = MemberPage()
    diagrams = page.diagrams
    assert not diagrams.plane_switch.visible
    page.model.plane2 = True
    assert diagrams.plane_switch.visible
    second = page.model.result.second_plane
    diagrams.plane_switch.value = "second"
    m2 = np.asarray(diagrams.stations.data["M2"])
    assert np.max(np.abs(m2)) == pytest.approx(abs(second.governing.moment.value) / 1e3, rel=1e-9)
    assert not diagrams.panes[0].visible
    assert "second plane, minor axis (z–z)" in _text(diagrams.key)
    assert "Second plane · minor axis (z–z)" in _text(page.values.table)
    page.model.plane2 = False
    assert diagrams.plane == "own" and not diagrams.plane_switch.visible
    assert diagrams.panes[0].visible


def test_loads_tab_edits_the_second_plane():
    """The Loads tab's plane switch shows the second plane's supports and loads, bound to the state."""
    page = MemberPage()
    planes = page.inputs.planes
    planes.plane_switch.value = "second"
    planes.enable.value = True
    assert page.model.plane2
    planes.ends["left"].value = "fixed"
    assert page.model.plane2_left == "fixed"
    rows = planes.second_loads.rows
    rows[0].fields["q"].widget.value = 3.0  # kN/m
    assert page.model.plane2_loads[0]["q"] == pytest.approx(3.0e3)
    assert page.inputs.out_of_plane_select.disabled


def test_route_settings_widgets_follow_the_state():
    """The Check tab's route boxes, Annex and method write the state, and show a loaded case's settings."""
    page = MemberPage()
    settings = page.inputs.route_settings
    settings.routes.value = ["aisc"]
    assert page.model.routes == ["aisc"]
    settings.method.value = "ASD"
    assert page.model.aisc_method == "ASD"
    settings.analysis.value = "direct"
    assert page.model.aisc_analysis == "direct"
    route = next(r for r in page.model.result.routes if r.route == "aisc")
    assert "aisc-direct-analysis" in route.notes
    page.model.load_mapping(MemberState().case_mapping())
    assert settings.routes.value == ["second-order", "en-member"] and settings.method.value == "LRFD"
    assert settings.analysis.value == "effective-length"


def test_routes_chart_sweeps_once_and_marks_the_force():
    """The routes figure is computed when first shown, from N = 0 to 0.95 of the lowest critical load, and its
    marker follows N without a new sweep."""
    page = MemberPage()
    state = page.model
    assert state.route_sweep is None  # not computed before the tab is shown
    chart = page.routes_chart
    sweep = state.route_sweep
    forces = np.asarray(sweep["forces"])
    out = state.result.check.out_of_plane
    assert forces[0] == 0 and forces[-1] == pytest.approx(
        0.95 * min(out.N_cr, state.result.critical_loads[0])
    )
    headline = np.asarray(chart.sources["headline"].data["u"])
    assert headline.size == 25 and np.all(np.diff(headline) > 0)  # more compression, more utilisation
    state.axial_force = 500e3
    assert chart.marker.location == pytest.approx(500.0)
    assert state.route_sweep is sweep  # a step of N does not sweep again
    state.length = 5.0
    assert state.route_sweep is not sweep


@pytest.mark.parametrize("system", ["si", "us"])
def test_routes_block_speaks_one_system(system):
    """The routes block and the second plane's values hold no unit of the other system."""
    state = MemberState(units=system)
    state.plane2 = True
    page = MemberPage(state)
    _with_routes(state)
    text = _text(page.routes.block) + _text(page.values.table) + _text(page.cautions.list)
    assert not [text[max(0, m.start() - 40) : m.end() + 5] for m in FORBIDDEN[system].finditer(text)]


def test_saved_case_carries_the_second_plane_and_route_settings():
    """The page's saved case JSON holds second_plane and the route settings, and reopens them."""
    from app.export_names import case_json

    state = MemberState()
    state.param.update(
        plane2=True,
        plane2_left="fixed",
        routes=["second-order", "aisc"],
        aisc_method="ASD",
        aisc_analysis="direct",
    )
    saved = json.loads(case_json(state.result.case))
    assert saved["second_plane"]["supports"]["left"] == "fixed"
    assert saved["check"]["routes"] == ["second-order", "aisc"] and saved["check"]["aisc_method"] == "ASD"
    assert saved["check"]["aisc_analysis"] == "direct"
    again = MemberState()
    again.load_mapping(saved)
    assert (again.plane2, again.plane2_left, again.routes, again.aisc_method, again.aisc_analysis) == (
        True,
        "fixed",
        ["second-order", "aisc"],
        "ASD",
        "direct",
    )
    assert again.errors == {}
