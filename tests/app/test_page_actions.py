"""The page's views of load cases (issue 17), without a browser: the picker's options, the governing
combination per check, the envelope band, the superposition tab, the saved case and bad input named.

Every number compared is the engine's own (the page does no mechanics)."""

import json

import numpy as np
import pytest

from app.page.actions import choice_options, demo_with_actions
from app.page.combination_views import superposition_of
from app.page.member import MemberPage


@pytest.fixture
def page():
    made = MemberPage()
    made.model.load_mapping(demo_with_actions())
    assert made.model.errors == {}
    return made


def test_the_picker_offers_governing_envelope_and_every_combination(page):
    result = page.model.result
    options = choice_options(result)
    values = list(options.values())
    assert values[:2] == ["", "envelope"]
    assert values[2:] == [item.name for item in result.actions.combinations]
    assert f"governing ({result.actions.headline})" in options
    assert page.combination_bar.panel.visible
    assert choice_options(MemberPage().model.result) == {}  # a plain case: no picker


def test_the_right_column_names_the_governing_combination_of_each_check(page):
    text = page.governing.pane.object
    actions = page.model.result.actions
    assert "strength and stability (headline)" in text
    assert f"<b>{actions.governing_for('strength').combination}</b>" in text
    assert f"<b>{actions.governing_for('deflection').combination}</b>" in text
    assert "deflection (service)" in text


def test_envelope_fills_the_band_with_the_engines_envelope(page):
    page.model.show_combination("envelope")
    band = page.band.sources["M"].data
    envelope = page.model.result.actions.ultimate
    assert np.allclose(band["hi"], envelope.moment_max / 1e3)  # kN·m on an SI page
    assert np.allclose(band["lo"], envelope.moment_min / 1e3)
    page.model.show_combination("")
    assert len(page.band.sources["M"].data["x"]) == 0


def test_choosing_a_combination_draws_it_and_moves_the_slider(page):
    page.combination_bar.picker.value = "S1"
    item = page.model.result.actions.of("S1")
    assert page.stations.tags == [float(item.result.axial_force)]
    assert page.model.axial_force == float(item.result.axial_force)
    assert "combination S1" in page.combination_bar.sentence.object


def test_superposition_of_the_largest_moment_combination(page):
    """With 'governing' chosen the comparison is the combination of largest |M| (as the command line)."""
    comparison = superposition_of(page.model)
    assert comparison.combination == page.model.result.actions.governing_for("moment").combination
    view = page._view(6)
    assert f"{100 * comparison.error:.1f} %" in view.text.object
    assert len(view.source.data["x"]) == len(comparison.x)


def test_the_saved_case_keeps_the_load_cases(page):
    saved = json.loads(page.files.json().getvalue())
    assert [action["name"] for action in saved["actions"]] == ["G", "W"]
    assert saved["combinations"]["rule"] == "en1990-6.10"


def test_a_bad_load_case_value_is_named_beside_it_and_the_result_kept(page):
    before = page.model.result
    block = page.load_cases.blocks[1]
    block.fields[0].widget.value = None  # q of W emptied
    assert page.model.result is before
    shown = page.load_cases.block_errors.shown()
    assert shown and "Load case 2, load 1" in shown[0]
    assert "actions[1].loads[0].q" in page.model.errors
    assert page.stale.visible
    # Every figure of the last valid case is dimmed, the governing combinations and the N readout too.
    assert page.governing.pane.object.startswith("<div class='ss-stale-values'>")
    assert page.force.readout.object.startswith("<div class='ss-stale-values'>")
    block.fields[0].widget.value = 1.0
    assert not page.model.errors and not page.stale.visible
    assert "ss-stale-values" not in page.governing.pane.object
    assert "ss-stale-values" not in page.force.readout.object


def test_load_cases_from_the_own_loads_and_back(page):
    """+ Add load case on a plain case turns its loads and N into load case G; removing it restores them."""
    plain = MemberPage()
    state = plain.model
    own_loads, own_force = list(state.loads), state.axial_force
    plain.load_cases.add.clicks += 1
    assert state.actions[0]["loads"] == own_loads and state.actions[0]["axial_force"] == own_force
    assert state.errors == {} and state.result.actions is not None
    assert all(not other.visible for other in plain.load_cases.others)
    plain.load_cases.blocks[0].remove.clicks += 1
    assert state.actions == [] and state.result.actions is None
    assert all(other.visible for other in plain.load_cases.others)


def test_load_case_paths_are_worded_on_the_page():
    from app.page.fields import field_words, page_message

    assert field_words("actions[1].loads[0].x") == "Load case 2, load 1, position"
    assert field_words("actions[0].axial_force") == "Load case 1, axial force"
    assert page_message("actions[0].loads[0].x: 7.5 m lies outside the member (0 to 6 m)") == (
        "Load case 1, load 1, position: 7.5 m lies outside the member (0 to 6 m)"
    )


def test_the_pages_exports_name_the_governing_combination(page):
    """The CSV and the calc sheet from the page carry the combination shown and the governing rows, as the
    command line's (the one wording: app.report.combinations)."""
    text = page.files.csv().getvalue()
    actions = page.model.result.actions
    assert "combination shown" in text and actions.headline in text
    assert (
        f"governing: deflection (service),{actions.governing_for('deflection').combination}"
        in text.replace('"', "")
    )


def test_the_pages_exports_state_the_capacity_shown(page):
    """The page's CSV and calc sheet state the capacity the page shows (the lowest of the ultimate
    combinations), in the page's units. Reference: engine.capacity_of of the page's result."""
    import pypdf

    expected = page.model.capacity
    assert expected is not None
    assert expected.axial_force == engine_capacity(page.model.result).axial_force
    text = page.files.csv().getvalue()
    assert f"# axial capacity [kN],{expected.axial_force / 1e3:.6g}" in text.replace('"', "")
    pdf = " ".join(p.extract_text() for p in pypdf.PdfReader(page.files.pdf()).pages)
    assert "Axial capacity N = " in " ".join(pdf.split())


def engine_capacity(result):
    import engine

    return engine.capacity_of(result)


def test_us_units_show_load_cases_in_kip(page):
    page.model.units = "us"
    block = page.load_cases.blocks[0]
    assert block.axial.widget.label == "N [kip]"
    # 1 kip = 4448.2216152605 N (1 lbf = 4.4482216152605 N exactly, NIST SP 811 Appendix B)
    assert block.axial.widget.value == pytest.approx(240e3 / 4448.2216152605, rel=1e-5)
    assert "kN" not in page.governing.pane.object


def test_a_combination_chosen_is_shown_and_exported_whole(page):
    """Choosing U1 (not the governing U2): the values, the cautions, the sketch and every export hold U1's
    result, each saying that U2 governs; the files never hold a combination other than the one on screen."""
    from app.exports.table import csv_text
    from app.sketch import Text, sketch
    from app.state_actions import view_result
    from app.units import units

    state = page.model
    actions = state.result.actions
    assert actions.headline == "U2"
    governing_csv = page.files.csv().getvalue()
    governing_sketch = list(page.diagrams.sketch.text.data["text"])
    page.combination_bar.picker.value = "U1"
    item = actions.of("U1")
    shown = view_result(state)
    assert float(shown.utilization) == float(item.result.utilization)
    assert shown.actions is actions
    # the right column: U1's values under a note that U2 governs
    table = page.values.table.object
    assert "Combination U1 is shown: it is not the governing combination" in table
    assert "combination U2" in table
    # the routes beside the values are U1's
    from app.page.routes import routes_html

    assert page.routes.block.object == routes_html(shown, units("si"))
    assert page.routes.block.object != routes_html(state.result, units("si"))
    # the sketch draws U1's loads (one load case fewer than U2's two)
    expected = {s.text for s in sketch(shown, units("si")).shapes if isinstance(s, Text)}
    drawn = list(page.diagrams.sketch.text.data["text"])
    assert drawn != governing_sketch
    assert drawn and set(drawn) <= expected
    # the CSV: U1's stations and the note; the same text as exporting U1's result directly
    text = page.files.csv().getvalue()
    assert text != governing_csv
    assert text == csv_text(shown, units="si", capacity=state.capacity)  # the case's capacity, as shown
    assert "combination shown,U1," in text.replace('"', "")
    assert "not the governing combination" in text
    assert page.files.csv_button.filename != "" and "294" not in page.files.csv_button.filename
    # back to the governing one: the state's own result, no note
    page.combination_bar.picker.value = ""
    assert view_result(state) is state.result
    assert "not the governing combination" not in page.values.table.object
    assert page.files.csv().getvalue() == governing_csv


def test_choosing_the_governing_combination_by_name_is_the_headline(page):
    from app.state_actions import view_result

    page.combination_bar.picker.value = "U2"
    assert view_result(page.model) is page.model.result
    assert "not the governing combination" not in page.values.table.object


def test_the_calc_sheet_of_a_chosen_combination_says_it_does_not_govern(page):
    import io

    from pypdf import PdfReader

    page.combination_bar.picker.value = "U3"
    pdf = page.files.pdf().getvalue()
    text = " ".join((p.extract_text() or "") for p in PdfReader(io.BytesIO(pdf)).pages)
    flat = " ".join(text.split())
    assert "Combination U3 is shown: it is not the governing combination" in flat
    assert "those of combination U2" in flat


def test_keep_as_variant_keeps_the_combination_on_screen(page):
    """With U3 shown (not the governing U2), "Keep as variant" keeps U3's result and the comparison table's
    current column is U3's (an audit found U2 kept: 294 kN, 0.448, while U3's 240 kN, 0.302 was on screen).
    Reference: the engine's own U3 result (app.state_actions.view_result)."""
    from app.page.variants import VariantsView
    from app.state_actions import view_result

    state = page.model
    view = VariantsView(state)
    state.show_combination("U3")
    shown = view_result(state)
    assert shown is not state.result and shown.axial_force != state.result.axial_force
    view.keep()
    kept = view.kept[0]["result"]
    assert kept.axial_force == shown.axial_force
    assert kept.utilization == shown.utilization
    assert kept.governing.moment.magnitude == shown.governing.moment.magnitude


def test_picking_a_combination_after_a_refused_force_clears_the_refusal(page):
    """A refused axial force (tension on the compression combinations) then another combination picked: the
    force box holds that combination's force of the result on screen, so the refusal goes and the exports
    come back (an audit found "not accepted" kept and the exports disabled)."""
    state = page.model
    state.axial_force = -50e3
    assert "axial_force" in state.errors and page.files.buttons[0].disabled
    state.show_combination("U3")
    assert state.errors == {}
    assert not page.files.buttons[0].disabled
    assert (
        state.axial_force
        == next(c for c in state.result.actions.combinations if c.name == "U3").result.axial_force
    )
