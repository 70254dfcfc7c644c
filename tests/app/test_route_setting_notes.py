"""The note that the equivalent-member route takes the resistance of the section class whatever the
cross-section check setting (app.report.route_notes), in every output that shows the routes.

EN 1993-1-1:2005 §6.3.3 takes N_Rk and M_Rk of eqs. (6.61)/(6.62) by the section class, Table 6.7: W_pl for
class 1 and 2, W_el for class 3 (from memory). The demo is the invented HEB 200 in S355 with the elastic
cross-section check (assets/demo_wind_post.json), class 1 by the engine's own classification.
"""

import dataclasses
import html
import io
import json
import re
from importlib import resources

import pypdf
import pytest

import engine
from app import exports
from app.report import format_summary, route_rows
from app.units import units

_SAID = "takes the resistance of the section class"


def _mapping(**check) -> dict:
    mapping = json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))
    mapping["check"] = {**mapping["check"], **check}
    return mapping


@pytest.fixture(scope="module")
def elastic():
    """The plain demo, solved with its elastic cross-section check."""
    result = engine.solve(engine.Case.from_dict(_mapping()))
    assert result.case.check.method == "elastic"
    return result


def _row(result, route, system="si"):
    return next(row for row in route_rows(result, units(system)) if row["route"] == route)


def _en_member(result):
    return next(route for route in result.routes if route.route == "en-member")


def test_the_elastic_setting_on_a_class_1_section_gets_the_note_on_the_en_member_route_only(elastic):
    """Elastic check, class 1: the en-member row says it takes the class's plastic resistance and that the
    setting is the second-order route's; the other routes' rows and the engine's note codes say nothing."""
    assert _en_member(elastic).facts["section_class"] == 1
    ((level, words),) = _row(elastic, "en-member")["setting_notes"]
    assert level == "info" and _SAID in words
    assert "class 1: plastic" in words and "M_Rk = W_pl·f_y" in words
    assert "the elastic setting applies to the second-order route's cross-section check" in words
    assert _row(elastic, "second-order")["setting_notes"] == () == _row(elastic, "aisc")["setting_notes"]
    # the engine's own notes are worded one per code, in their order, as before
    assert len(_row(elastic, "en-member")["notes"]) == len(_en_member(elastic).notes)


def test_no_note_with_the_plastic_setting_a_class_3_section_or_a_route_not_applied(elastic):
    """The plastic setting, a class 3 section (elastic resistance: the setting and the route agree) and a
    route with no utilisation give no such note."""
    plastic = engine.solve(engine.Case.from_dict(_mapping(method="plastic")))
    assert plastic.case.check.method == "plastic" and _row(plastic, "en-member")["setting_notes"] == ()
    route = _en_member(elastic)
    for changed in (
        dataclasses.replace(route, facts={**route.facts, "section_class": 3}),
        dataclasses.replace(route, utilization=None, facts={}),
    ):
        routes = tuple(changed if r is route else r for r in elastic.routes)
        assert _row(dataclasses.replace(elastic, routes=routes), "en-member")["setting_notes"] == ()


def test_the_summary_csv_and_calc_sheet_carry_the_note(elastic):
    """The printed summary, the CSV's route row and the calc sheet's route block carry the note, in SI and
    US units alike."""
    summary = format_summary("demo", elastic.case, elastic)
    block = summary[summary.index("EN 1993-1-1 equivalent member") :]
    assert _SAID in block[: block.index("AISC 360-16")]
    for system in ("si", "us"):
        csv = exports.csv_text(elastic, units=system)
        line = next(line for line in csv.splitlines() if line.startswith("# route EN 1993-1-1 equivalent"))
        assert _SAID in line and "[info]" in line
        reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(elastic, units=system, date="2026-12-04")))
        text = " ".join(" ".join(page.extract_text() for page in reader.pages).split())
        assert f"[info] the equivalent-member route {_SAID}" in text


def test_the_page_lists_the_note_with_the_route_notes():
    """The page's cautions list the note, named by its route, as app.report words it."""
    from app.page import MemberPage

    page = MemberPage()
    page.model.load_mapping(_mapping())
    assert page.model.result.case.check.method == "elastic"
    text = html.unescape(re.sub(r"<[^>]+>", " ", str(page.cautions.list.object)))
    assert f"EN 1993-1-1 equivalent member (Annex B): the equivalent-member route {_SAID}" in text
