"""The routes of the member check and the second plane, worded by app.report (issue 14).

The routes here are RouteCheck objects built by hand (invented numbers) on a real solved demo, so that the
wording is checked whatever the engine computes; the engine's own numbers are checked in tests/engine.
"""

import dataclasses
import json
import math
from importlib import resources

import pytest

import engine
from app.report import format_summary, headline_route, headline_text, route_rows, second_plane_rows
from app.report.routes import fact_text, governing_text, plane_name, route_name
from app.summary_json import summary_data
from app.units import units
from engine.design.routes import RouteCheck
from tests.app.test_unit_systems import FORBIDDEN

# Invented facts in SI; each kind of quantity appears once at least.
ROUTES = (
    RouteCheck(
        route="second-order",
        enabled=True,
        utilization=0.812,
        governing="cross-section",
        terms={"cross-section": 0.812, "shear": 0.05},
        facts={"chi_z": 0.412, "L_cr_z": 6.0, "N_cr_z": 1.2e6},
        source="EN 1993-1-1:2005 §5.2.2(7)a, §6.2.9",
    ),
    RouteCheck(
        route="en-member",
        enabled=True,
        utilization=0.903,
        governing="eq-6.62",
        terms={"eq-6.61": 0.71, "eq-6.62": 0.903},
        facts={"chi_y": 0.912, "chi_z": 0.412, "k_yy": 1.05, "k_zy": 0.63, "C_my": 0.95, "M_y_Rk": 2.1e5},
        notes=("chi-LT-1",),
        source="EN 1993-1-1:2005 §6.3.3, Annex B",
    ),
    RouteCheck(
        route="aisc",
        enabled=False,
        utilization=0.951,
        governing="H1-1a",
        terms={"H1-1a": 0.951},
        facts={"phi_c": 0.9, "F_cr": 215e6, "P_n": 1.4e6, "KL_r": 98.0},
        source="AISC 360-16 §E3, §H1.1",
    ),
)


@pytest.fixture(scope="module")
def demo():
    """The invented demo case, solved, with hand-made routes and a second plane (the minor axis)."""
    mapping = json.loads(
        resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    )
    result = engine.solve(engine.Case.from_dict(mapping))
    other = dict(mapping, axis="minor", loads=[{"type": "uniform", "q": 1.0e3}])
    second = engine.solve(engine.Case.from_dict(other))
    return dataclasses.replace(result, routes=ROUTES, second_plane=second)


def test_route_names_follow_the_settings():
    """Each route has its name; annex and AISC method come from the settings (B, LRFD by default)."""
    assert route_name("second-order") == "second order + cross-section"
    assert route_name("en-member") == "EN 1993-1-1 equivalent member"  # no settings given: no Annex named
    assert route_name("aisc") == "AISC 360-16"

    class Settings:
        annex = "A"
        aisc_method = "ASD"

    class Case:
        check = Settings()

    class Result:
        case = Case()

    assert route_name("en-member", Result()) == "EN 1993-1-1 equivalent member (Annex A)"
    assert route_name("aisc", Result()) == "AISC 360-16 (ASD)"


def test_governing_terms_are_named():
    """The engine's term codes become the code's equation names."""
    assert governing_text("eq-6.61") == "eq. (6.61)"
    assert governing_text("eq-6.62") == "eq. (6.62)"
    assert governing_text("H1-1b") == "H1-1b"
    assert governing_text("out-of-plane") == "out-of-plane buckling"
    assert governing_text("") == ""


def test_headline_is_the_worst_enabled_route(demo):
    """The headline is the enabled route with the largest utilisation; one for comparison never is."""
    route = headline_route(demo)
    assert route.route == "en-member"  # 0.903, while the AISC route (0.951) is only for comparison
    assert headline_text(demo) == "0.903 by EN 1993-1-1 equivalent member (Annex B), eq. (6.62)"
    statuses = [row["status"] for row in route_rows(demo, units("si"))]
    assert statuses == ["counts", "headline", "for comparison"]


def test_an_unbounded_route_is_the_headline(demo):
    """+inf (at a critical load) beats every finite utilisation and is worded as failing; None never heads."""
    routes = (
        dataclasses.replace(ROUTES[0], utilization=math.inf),
        dataclasses.replace(ROUTES[1], utilization=None, reason="no section class for this shape"),
        ROUTES[2],
    )
    result = dataclasses.replace(demo, routes=routes)
    assert headline_route(result).route == "second-order"
    rows = route_rows(result, units("si"))
    assert rows[0]["utilisation"] == "unbounded (fails)"
    assert rows[1]["utilisation"] == "not applied"
    assert rows[1]["reason"] == "no section class for this shape"


def test_facts_in_si_and_us():
    """Facts are shown in the display units: F_cr 215 MPa = 31.18 ksi, P_n 1400 kN = 314.7 kip."""
    # 1 ksi = 6.894757 MPa, 1 kip = 4.448222 kN (NIST SP 811 (2008) Appendix B; from memory).
    assert fact_text("F_cr", 215e6, units("si")) == "F_cr = 215.0 MPa"
    assert fact_text("F_cr", 215e6, units("us")) == "F_cr = 31.18 ksi"
    assert fact_text("P_n", 1.4e6, units("us")) == "P_n = 314.7 kip"
    assert fact_text("chi_z", 0.4123, units("us")) == "χ_z = 0.412"
    assert fact_text("mystery", 3.0, units("si")) is None  # no unit known: never shown bare


def test_plane_names():
    """The planes are named by the axis they bend about."""
    assert plane_name("major") == "major axis (y–y)"
    assert plane_name("minor") == "minor axis (z–z)"


@pytest.mark.parametrize("system", ["si", "us"])
def test_route_and_plane_words_speak_one_system(demo, system):
    """No route row, second-plane row or summary line shows the other system's units."""
    U = units(system)
    text = json.dumps(route_rows(demo, U), ensure_ascii=False) + json.dumps(second_plane_rows(demo, U))
    text += format_summary("demo", demo.case, demo, system)
    found = [text[max(0, m.start() - 40) : m.end() + 5] for m in FORBIDDEN[system].finditer(text)]
    assert not found


def test_summary_has_routes_and_second_plane(demo):
    """The printed summary lists every route, the headline and the second plane's critical load."""
    text = format_summary("demo", demo.case, demo, "si")
    assert "Routes (" in text
    for name in (
        "second order + cross-section",
        "EN 1993-1-1 equivalent member (Annex B)",
        "AISC 360-16 (LRFD)",
    ):
        assert name in text
    assert "[for comparison]" in text and "[headline]" in text
    assert "headline utilisation: 0.903 by EN 1993-1-1 equivalent member (Annex B), eq. (6.62)" in text
    assert "Second plane: bending about the minor axis (z–z)" in text
    assert f"Pcr1{'':<18}{units('si').show('force', demo.second_plane.critical_loads[0], 5)}" in text
    assert "χ_LT = 1 taken" in text


def test_json_carries_routes_and_second_plane(demo):
    """solve --json's data hold each route with SI facts, the headline route and the second plane."""
    data = json.loads(json.dumps(summary_data("demo", demo.case, demo), allow_nan=False))
    assert [r["route"] for r in data["routes"]] == ["second-order", "en-member", "aisc"]
    assert data["routes"][2]["facts"]["F_cr"] == 215e6
    assert data["routes"][1]["notes"] == ["chi-LT-1"]
    assert data["headline_route"] == "en-member"
    plane = data["second_plane"]
    assert plane["axis"] == "minor"
    assert plane["critical_loads"][0] == pytest.approx(float(demo.second_plane.critical_loads[0]))
    assert plane["governing"]["moment"]["value"] == pytest.approx(
        float(demo.second_plane.governing.moment.value)
    )


def test_one_plane_json_has_no_second_plane(demo):
    """A one-plane case writes second_plane null and no routes when the engine gives none."""
    plain = dataclasses.replace(demo, routes=(), second_plane=None)
    data = summary_data("demo", plain.case, plain)
    assert data["second_plane"] is None and data["routes"] == [] and data["headline_route"] is None
    assert "Routes (" not in format_summary("demo", plain.case, plain, "si")


def test_headline_never_below_the_results_utilisation(demo):
    """If every route that counts gives less than the result's utilisation, the headline is the result's."""
    low = dataclasses.replace(demo, utilization=0.95)  # above every enabled route (0.812, 0.903)
    assert headline_text(low).startswith("0.950 by the member check (")
    assert [row["status"] for row in route_rows(low, units("si"))] == ["counts", "counts", "for comparison"]
    agree = dataclasses.replace(demo, utilization=0.903)
    assert headline_text(agree) == "0.903 by EN 1993-1-1 equivalent member (Annex B), eq. (6.62)"


def test_command_line_json_carries_the_engines_routes_and_second_plane(tmp_path):
    """`solve --json` on the two-plane demo holds each route the engine gives (SI facts), the headline route
    and the second plane's critical loads and peaks, equal to the engine's."""
    from tests.app.test_cli import run_cli

    source = resources.files("assets").joinpath("demo_two_planes.json")
    path = tmp_path / "two.json"
    path.write_text(source.read_text(encoding="utf-8"), encoding="utf-8")
    done = run_cli("solve", str(path), "--json", cwd=tmp_path)
    assert done.returncode in (0, 1), done.stderr
    data = json.loads(done.stdout)
    result = engine.solve(engine.Case.from_json(path.read_text(encoding="utf-8")))
    assert [r["route"] for r in data["routes"]] == [r.route for r in result.routes]
    for shown, route in zip(data["routes"], result.routes, strict=True):
        expected = (
            route.utilization if route.utilization is not None and math.isfinite(route.utilization) else None
        )
        assert shown["utilization"] == expected and shown["governing"] == route.governing
        assert shown["enabled"] == route.enabled
    assert data["headline_route"] == headline_route(result).route
    plane = data["second_plane"]
    assert plane["axis"] == "minor"
    assert plane["critical_loads"][0] == pytest.approx(
        float(result.second_plane.critical_loads[0]), rel=1e-12
    )
    moment = result.second_plane.governing.moment
    assert plane["governing"]["moment"]["value"] == pytest.approx(float(moment.value), rel=1e-12)
    text = run_cli("solve", str(path), "--units", "us", cwd=tmp_path).stdout
    assert "Routes (" in text and "Second plane: bending about the minor axis (z–z)" in text
    assert not [m.group(0) for m in FORBIDDEN["us"].finditer(text)]


def _demo_two_planes_at(axial_force):
    """The invented two-plane demo at `axial_force` [N] (Pcr1 1965.7 kN major axis, 723.27 kN minor)."""
    import json
    from importlib import resources

    import engine

    text = resources.files("assets").joinpath("demo_two_planes.json").read_text(encoding="utf-8")
    mapping = json.loads(text)
    return engine.solve(engine.Case.from_dict(dict(mapping, axial_force=axial_force)))


def test_status_of_two_planes_is_worded_with_the_lower_planes_critical_load():
    """Between the two planes' first critical loads the member is unstable by its minor axis: the status must
    give that plane's Pcr1 and ratio (it gave the major axis's, 'exceeds 1965.7 kN' at N = 1000 kN)."""
    from app.report import status_text
    from app.units import units

    result = _demo_two_planes_at(1.0e6)
    pcr = result.second_plane.critical_loads[0]
    assert pcr < 1.0e6 < result.critical_loads[0]
    text = status_text(result, units("si"))
    assert text.startswith("unstable: the axial force 1000.0 kN exceeds the first critical load 723.27 kN, ")
    assert "minor axis (z–z)" in text and f"N/Pcr1 = {1.0e6 / pcr:.4g}" in text
    assert "between critical loads 1 and 2" in text
    stable = status_text(_demo_two_planes_at(180e3), units("si"))
    assert f"α_cr = {pcr / 180e3:.4g}, bending about the minor axis (z–z)" in stable


def test_summary_gives_the_planes_and_the_members_alpha_cr():
    from app.report.summary import format_summary

    result = _demo_two_planes_at(180e3)
    text = format_summary("demo", result.case, result)
    own = result.critical_loads[0] / 180e3
    assert f"α_cr = Pcr1 / N = {own:.3f} (this plane)" in text
    assert "α_cr of the member = 4.018 (the smaller of both planes" in text


def test_member_check_block_opens_with_the_headline(demo):
    """The printed member check states the headline (the worst enabled route) before the second-order check's
    own utilisation line, so the first utilisation a reader meets is the one that decides: here eq. (6.62)
    at 0.903 against the cross-section check's lower value (an audit found a failing member whose first
    printed utilisation was its passing second-order check)."""
    text = format_summary("demo", demo.case, demo, "si")
    block = text[text.index("Member check (") :]
    headline = block.index("  headline:     0.903 by EN 1993-1-1 equivalent member (Annex B), eq. (6.62)")
    own = block.index("  utilisation:  ")
    assert headline < own
    assert demo.check.utilization < 0.903
