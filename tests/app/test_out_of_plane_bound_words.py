"""The bound N/N_cr about the other axis as a user sees it: summary, JSON, page values table, units.

Where the code's out-of-plane check is not made (a timber member here) the member check counts N/N_cr as a
bound (tests/engine/test_out_of_plane_bound.py has the engine's side and its references). Here: the
machine-readable verdict fails beyond N_cr, the page's values table names the bound, and the US-unit
output quotes no SI unit (the warning's message quoted N_cr in kN and L_cr in m inside its reason, so US
output mixed the two). The member is invented.
"""

from __future__ import annotations

import re

import engine
from app.page.words import values_table
from app.report.summary import format_summary
from app.report.words import caution_text
from app.summary_json import summary_data
from app.units import units
from tests.engine.test_out_of_plane_bound import stud as timber_stud


def stud(force: float) -> engine.Case:
    """The invented timber stud of the engine's tests (45 × 195 mm C24, 3 m, pinned) at ``force``."""
    return timber_stud(axial_force=force)


def test_the_json_verdict_fails_beyond_the_euler_load_about_the_other_axis():
    """20 kN > N_cr,z = 12.02 kN (E_0,05): `fails` true and the bound in `check.out_of_plane` (it said
    false)."""
    case = stud(20e3)
    data = summary_data("stud.json", case, engine.solve(case))
    # Beyond N_cr,z no lateral stiffness is left either: the LTB bound M/M_cr is unbounded (JSON null).
    assert data["fails"] is True and data["utilization"] is None
    out = data["check"]["out_of_plane"]
    assert out["checked"] is False
    assert abs(out["elastic_utilization"] - 20e3 / 12016.5518) < 1e-6
    assert data["check"]["strength_kind"] == "out-of-plane elastic buckling"
    assert data["check"]["utilization"] == out["elastic_utilization"]


def test_the_values_table_names_the_bound():
    """The page's values table: a row "N/N_cr out of plane" with its value and "a bound", red above 1."""
    case = stud(10e3)
    html = values_table(engine.solve(case), None, "", units("si"))
    text = re.sub(r"\s+", " ", re.sub("<[^>]+>", " ", html))
    assert "N/N cr out of plane 0.832 minor, a bound: code check not made" in text


def test_us_output_quotes_no_si_unit():
    """The summary and the warning in US units: kip and ft, never kN or m, for the bound's N_cr and L_cr."""
    case = stud(10e3)
    result = engine.solve(case)
    warning = next(c for c in result.cautions if c.code == "out-of-plane-not-checked")
    words = caution_text(warning, units("us"))
    assert "N_cr = 2.701 kip (L_cr = 9.843 ft)" in words and "N/N_cr = 0.832" in words
    assert " kN" not in words and " m)" not in words
    summary = format_summary("stud.json", case, result, units="us")
    lines = [line for line in summary.splitlines() if "out of plane" in line or "Out-of-plane" in line]
    assert lines
    for line in lines:
        assert not re.search(r"\d kN\b|\d m\b|\d MPa\b", line), line


def test_a_two_plane_alpha_cr_is_named_with_the_plane_it_belongs_to():
    """The PNG and the calc sheet printed "Pcr1 = 75.405 kip, α_cr = 1.051" for the two-plane stud: Pcr1 the
    first plane's, α_cr the member's (the minor axis plane's, 12.02 kN / 11.4 kN with E_0,05). Each is now
    named."""
    from app.report.routes import pcr1_planes_text
    from app.report.words import alpha_text, load_ratio_text

    case = timber_stud(
        axial_force=11.4e3, second_plane={"supports": {"left": "pinned", "right": "pinned"}, "loads": []}
    )
    result = engine.solve(case)
    assert alpha_text(result) == "1.054 (bending about the minor axis (z–z))"
    assert load_ratio_text(result) == "N/Pcr1 = 0.949 (bending about the minor axis (z–z))"
    assert pcr1_planes_text(result, units("si")) == (
        "225.64 kN (major axis (y–y)), 12.017 kN (minor axis (z–z))"
    )
    one = engine.solve(timber_stud(axial_force=10e3))
    assert alpha_text(one) == "22.564" and "bending" not in load_ratio_text(one)
