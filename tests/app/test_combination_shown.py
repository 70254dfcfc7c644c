"""A combination other than the governing one chosen in "Combination shown" (the invented demo with load
cases: U1–U4 ultimate, S1–S2 service; U2 governs strength, S2 the deflection): every output words it one way.

- each route's value is the shown combination's own and is named with it; a larger one of another
  combination is named with that combination (never a number beside a combination it does not belong to);
- the deflection check is the governing service combination's (S2), named, whichever combination is shown;
- a service combination shows no strength headline and no bow warning (it is solved without a bow by design):
  strength is checked on the ultimate combinations, the governing one named with its value.

Every number compared is the engine's own (the page does no mechanics)."""

import io
import re

import pytest
from pypdf import PdfReader

from app import exports
from app.export_names import export_filename
from app.page.actions import demo_with_actions
from app.page.member import MemberPage
from app.report import format_summary, route_rows
from app.report.numbers import csv_number, utilisation
from app.state_actions import shown_combination, view_result
from app.units import units


@pytest.fixture(scope="module")
def page():
    made = MemberPage()
    made.model.load_mapping(demo_with_actions())
    assert made.model.errors == {}
    assert made.model.result.actions.headline == "U2"
    return made


def _choose(page, name):
    page.combination_bar.picker.value = name
    return view_result(page.model)


def _flat(text: str) -> str:
    return " ".join(re.sub(r"<[^>]+>", " ", text).replace("&#x27;", "'").split())


def _pdf(result) -> str:
    reader = PdfReader(io.BytesIO(exports.pdf_bytes(result, date="2026-12-02")))
    return _flat(" ".join(page.extract_text() or "" for page in reader.pages))


def _png(result) -> str:
    figure = exports.result_figure(result, date="2026-12-02")
    return _flat(" ".join(text.get_text() for text in figure.texts))


def _csv(result) -> dict:
    """The CSV's metadata rows, key → (value, note)."""
    import csv

    rows = {}
    for row in csv.reader(io.StringIO(exports.csv_text(result).lstrip("\ufeff"))):
        if row and row[0].startswith("# "):
            rows[row[0][2:]] = (row[1] if len(row) > 1 else "", row[2] if len(row) > 2 else "")
    return rows


def _own(result, route):
    return next(r.utilization for r in result.routes if r.route == route)


def test_the_routes_of_a_chosen_combination_are_its_own_and_named_with_it(page):
    """U4 chosen: each route row reads U4's own value "in U4" (not "in U2", the governing one), and the
    second-order route's larger value is named with U1, on the page, in the CSV and on the calc sheet; no
    route in the CSV reads larger than U4's headline without naming its combination."""
    shown = _choose(page, "U4")
    actions = page.model.result.actions
    u4 = actions.of("U4").result
    for row in route_rows(shown, units("si")):
        own = _own(u4, row["route"])
        assert row["value"] == own
        assert row["utilisation"].startswith(f"{utilisation(own)} in U4")
        assert f"{utilisation(own)} in U2" not in row["utilisation"]
    largest = actions.governing_for("route:second-order")
    assert largest.combination == "U1"
    second = f"{utilisation(_own(u4, 'second-order'))} in U4 by out-of-plane buckling; "
    second += f"{utilisation(largest.value)} in U1, the largest of the combinations"
    assert second in _flat(page.routes.block.object)
    assert second in _pdf(shown)
    assert "in U4 by EN 1993-1-1 equivalent member (Annex B)" in _pdf(shown)  # the headline, named
    rows = _csv(shown)
    headline = float(rows["utilisation [-]"][0])
    assert "of combination U4" in rows["utilisation [-]"][1]
    value, note = rows["route second order + cross-section [-]"]
    assert value == csv_number(_own(u4, "second-order")) and second in note
    for key, (value, note) in rows.items():
        if key.startswith("route ") and value:
            assert float(value) <= headline and "in U4" in note, (key, value, note)


def test_the_governing_combinations_routes_are_named_with_it(page):
    """The governing result (the page's default, the command line's summary): every route names U2."""
    result = page.model.result
    text = format_summary("invented", result.case, result)
    for route in result.routes:
        assert f"{utilisation(route.utilization)} in U2" in text
    assert "headline utilisation: 0.448 in U2 by EN 1993-1-1 equivalent member (Annex B)" in text


@pytest.mark.parametrize("name", ["U4", "U1", "S1"])
def test_the_deflection_check_is_the_governing_service_combinations_whatever_is_shown(page, name):
    """The caution, the PNG, the values table, the CSV, the calc sheet and the note all give S2's deflection
    check (0.130), named; never the shown combination's own deflection "on the loads as given"."""
    shown = _choose(page, name)
    actions = page.model.result.actions
    s2 = actions.of("S2").result.service
    assert actions.governing_for("deflection").combination == "S2"
    assert shown.service is page.model.result.service and shown.service.utilization == s2.utilization
    value = utilisation(s2.utilization)
    own = actions.of(name).result.service
    mine = utilisation(own.utilization)
    assert mine != value  # the shown combination's own deflection differs: it must not be shown as the check
    basis = [c for c in shown.cautions if c.code == "deflection-basis"]
    assert len(basis) == 1 and f"Deflection utilisation {value}" in basis[0].message
    assert "combination S2" in basis[0].message and "loads as given" not in basis[0].message
    figure = _png(shown)
    assert f"Deflection utilisation {value}" in figure and "combination S2" in figure
    assert f"Deflection utilisation {mine}" not in figure
    table = _flat(page.values.table.object)
    assert f"deflection (service) {value}" in table and "service combination S2, no bow" in table
    assert f"the deflection check is that of service combination S2 ({value})" in table
    cautions = _flat(page.cautions.list.object)
    assert f"Deflection utilisation {value}" in cautions and f"Deflection utilisation {mine}" not in cautions
    deflection, note = _csv(shown)["deflection utilisation [-]"]
    assert deflection == csv_number(s2.utilization)
    assert "service check of combination S2, the governing service combination" in note
    sheet = _pdf(shown)
    assert f"({value}); service combination S2, no bow" in sheet
    assert "; loads as given, no bow" not in sheet


def test_a_service_combination_shows_no_strength_headline_and_no_bow_warning(page):
    """S2 chosen: no utilisation of S2 (0.328 by eq. (6.62)) as a headline anywhere, no routes of S2, no
    warning that its bow of 0 mm is below the code value; every output says that strength is checked on the
    ultimate combinations and names U2 with its 0.448."""
    shown = _choose(page, "S2")
    actions = page.model.result.actions
    own = actions.of("S2").result
    assert any(c.code == "bow-below-code" for c in own.cautions)  # the engine's, for a member without a bow
    mine = utilisation(own.utilization)
    governing = f"combination U2 governs, utilisation {utilisation(actions.governing_for('strength').value)}"
    assert shown.utilization is None and shown.check is None and shown.routes == ()
    assert not any(c.code == "bow-below-code" for c in shown.cautions)
    for text in (
        _flat(page.values.table.object),
        _flat(page.routes.block.object),
        _pdf(shown),
        _png(shown),
        " ".join(f"{v} {n}" for v, n in _csv(shown).values()),
    ):
        assert "checked on the ultimate combinations" in text
        assert mine not in text and f"{own.utilization:.6g}"[:6] not in text
        assert "smaller than the code value" not in text
    for text in (_flat(page.values.table.object), _pdf(shown), _png(shown)):
        assert governing in text
    cautions = _flat(page.cautions.list.object)
    assert "smaller than the code value" not in cautions and "data-code='bow-below-code'" not in (
        page.cautions.list.object
    )
    assert "checked on the ultimate combinations" in _flat(page.ltb.readout.object)


def test_an_ultimate_combination_keeps_its_own_warnings_and_the_general_caution(page):
    """U4 chosen: the general caution is the one wording (never "load combinations are not checked"), and
    the member check's cautions are U4's own."""
    from app.report.scope import GENERAL_CAUTION

    shown = _choose(page, "U4")
    assert [c.code for c in shown.cautions].count("scope") == 1
    assert GENERAL_CAUTION in _flat(page.cautions.general.object).replace("&#x27;", "'")
    for text in (_pdf(shown), _png(shown), exports.csv_text(shown)):
        assert "combinations are not checked" not in " ".join(text.split())
    checked = next(c for c in shown.cautions if c.code == "out-of-plane-checked")
    assert checked.values["utilization"] == pytest.approx(_own(shown, "second-order"))


def test_the_exports_are_named_with_the_combination_shown(page):
    """The file names of U4's exports and of the governing U2's differ by the combination's name, and the
    envelope's the governing one's, which they hold (named "envelope" they held U2, found by a new user); a
    case without load cases gives no combination (its names are unchanged)."""
    names = {}
    for choice, expected in (("U4", "U4"), ("", "U2"), ("U2", "U2"), ("envelope", "U2")):
        shown = _choose(page, choice)
        assert shown_combination(page.model) == expected
        names[choice] = export_filename(shown.case.title, shown.case.axial_force, "pdf", "si", expected)
        assert f"_{expected}_N" in names[choice]
    assert names["U4"] != names[""] == names["U2"] == names["envelope"]
    _choose(page, "envelope")
    assert page.files.blocked.visible
    assert "the exports hold combination U2" in _flat(page.files.blocked.object)
    _choose(page, "")
    assert not page.files.blocked.visible
    plain = MemberPage()
    assert plain.model.result.actions is None and shown_combination(plain.model) == ""


def test_the_page_names_its_downloads_with_the_combination_shown(page):
    """The page's download names carry the combination shown (U4), as app.export_names words them."""
    shown = _choose(page, "U4")
    try:
        page.files.draw()
        expected = export_filename(shown.case.title, shown.case.axial_force, "pdf", "si", "U4")
        assert page.files.pdf_button.filename == expected
    finally:
        _choose(page, "")


def test_the_calc_sheet_gives_the_source_of_the_route_that_sets_the_utilisation(page):
    """The demo's headline is eq. (6.62) of the EN equivalent member: the source under it is that route's
    (§6.3.3, Annex B), not the second-order check's out-of-plane clauses (found by a new user)."""
    shown = _choose(page, "")
    text = _pdf(shown)
    after = text.split("Utilisation", 1)[1]
    source = after.split("source:", 1)[1][:160]
    assert "§6.3.3" in source and "Annex B" in source, source
