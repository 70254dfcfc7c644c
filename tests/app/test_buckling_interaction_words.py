"""The second-order route's out-of-plane interaction term, as the printed summary and the cautions word it.

The member is the invented demo wind post on an invented foundation (200 kN/m² over its length) at 350 kN; the
number itself is checked by hand in ``tests/engine/test_buckling_interaction.py``.
"""

from __future__ import annotations

import pathlib

import pytest

import engine
from app.report.summary import format_summary
from app.report.words import caution_text

REPO = pathlib.Path(__file__).resolve().parents[2]


def _bedded() -> tuple:
    data = engine.load_case(REPO / "assets" / "demo_wind_post.json").to_dict()
    data["foundation"] = [{"start": 0.0, "end": 6.0, "k": 2e5}]
    data["check"] = dict(data.get("check") or {}, routes=["second-order"])
    case = engine.Case.from_dict(data)
    return case, engine.solve(case)


@pytest.mark.parametrize("system", ["si", "us"])
def test_summary_names_the_interaction_as_the_headline(system):
    """The summary's routes block names the term and its C_m, the headline is its value, and the caution
    says how it was counted; the old warning that it was not counted is gone."""
    case, result = _bedded()
    text = format_summary("bedded.json", case, result, units=system)
    value = f"{result.utilization:.3f}"
    assert (
        f"headline utilisation: {value} by second order + cross-section, buckling with the "
        "moments, eq. (6.61)/(6.62)" in text
    )
    assert "k_zy (C_m = 1)" in text
    words = [caution_text(c, system) for c in result.cautions]
    assert any("eqs. (6.61)/(6.62) with C_m = 1" in w and value in w for w in words)
    assert not any("does not count toward the headline" in w for w in words)


def test_capacity_names_the_route_term_that_governs():
    """A capacity governed by a term of the second-order route (here the out-of-plane interaction) is worded
    with the term's name and the force, not the engine's code."""
    from app.report.capacity_words import capacity_text
    from app.units import units
    from engine.capacity import capacity

    case, result = _bedded()
    found = capacity(case)
    text = capacity_text(found, units("si"), result)
    assert text.startswith("The second-order route governs: utilisation 1 by buckling with the moments")
    assert f"{found.axial_force * 1e-3:.2f} kN" in text


def _ltb_heavy():
    data = engine.load_case(REPO / "assets" / "demo_wind_post.json").to_dict()
    data["loads"] = [{"type": "uniform", "q": 15e3}]
    data["axial_force"] = 800e3
    data["check"] = dict(data.get("check") or {}, routes=["second-order"])
    case = engine.Case.from_dict(data)
    return case, engine.solve(case)


@pytest.mark.parametrize("make", [_bedded, _ltb_heavy], ids=["foundation", "ltb-term"])
def test_exports_show_the_headline_when_a_route_term_sets_it(make):
    """The calc sheet's and the PNG's "Utilisation" line (utilisation_text) gives the headline when a term of
    the second-order route beyond its member check sets it (the buckling interaction; lateral-torsional
    buckling under 15 kN/m at 800 kN, 1.100 where the member check gives 0.966). Before, it gave the member
    check's value: a failing member read as passing on the sheet."""
    from app.report.words import utilisation_text

    _, result = make()
    assert result.utilization > result.check.utilization
    text = utilisation_text(result, "si")
    assert text.startswith(f"{result.utilization:.3f}")
    second = next(r for r in result.routes if r.route == "second-order")
    assert second.governing in ("buckling-interaction", "lateral-torsional")


def test_json_fails_reads_the_headline():
    """`solve --json`'s top-level `fails` is the headline's (1.100 by the LTB term), while `check.fails` is
    the member check's alone (0.966): a machine reading the first sees the failing member."""
    from app.summary_json import summary_data

    case, result = _ltb_heavy()
    data = summary_data("ltb.json", case, result)
    assert data["fails"] is True and data["check"]["fails"] is False
    assert data["utilization"] == result.utilization


def test_values_table_opens_with_the_headline():
    """The page's governing-values table opens its member-check block with the headline (the worst route that
    counts), marked as failing when above 1, before the member check's own utilisation: at 800 kN the demo's
    member check passes (0.966) while eq. (6.62) fails; on a foundation the buckling interaction (0.514)
    stands above the member check (0.423)."""
    import re

    from app.page.words import values_table
    from app.units import units

    data = engine.load_case(REPO / "assets" / "demo_wind_post.json").to_dict()
    data["axial_force"] = 800e3
    demo = engine.solve(engine.Case.from_dict(data))
    html = values_table(demo, None, "", units("si"))
    row = re.search(r"<tr( class='(\w+)')?><td class='q'>headline</td><td class='v'>([^<]*)</td>", html)
    assert row is not None and row.group(2) == "danger"
    assert row.group(3).startswith(f"{demo.utilization:.3f}") and "eq. (6.62)" in row.group(3)
    assert demo.check.utilization < 1 < demo.utilization
    assert html.index(">headline<") < html.index(">utilisation<")
    _, bedded = _bedded()
    html = values_table(bedded, None, "", units("si"))
    row = re.search(r"<tr( class='(\w+)')?><td class='q'>headline</td><td class='v'>([^<]*)</td>", html)
    assert row.group(2) is None and row.group(3) == f"{bedded.utilization:.3f} eq. (6.61)/(6.62)"
