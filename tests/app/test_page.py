"""The page without a browser: widgets drive the state, and results reach the sources and panes."""

import io
import json
import math
import re
from importlib import resources

import numpy as np
import panel as pn
import param
import pytest

import engine
from app.page import MAX_VARIANTS, UPLOAD_LIMIT, MemberPage
from app.state import MemberState

FOOT = 0.3048  # m, exact by definition (NIST SP 811 (2008) Appendix B, from memory)
KIP = 4448.2216152605  # N, 1000 lbf, exact by definition (same source)


@pytest.fixture(autouse=True)
def clean_panel_state():
    """Reset Panel's global state after every test, so no document or cache leaks between tests."""
    yield
    pn.state.reset()


@pytest.fixture
def page():
    """A page on the invented demo case."""
    return MemberPage()


def demo_case():
    """The invented demo case shipped in assets/."""
    return engine.Case.from_json(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))


def visible_errors(page):
    """The text of every error pane that is shown."""
    return [*page.errors.shown(), *page.inputs.loads.errors.shown()]


def test_sources_hold_the_engine_result_in_display_units(page):
    """The stations source is the engine's solution of the demo case, in m, mm, kN·m and kN."""
    result = engine.solve(demo_case(), stations=page.model.stations)
    data = page.stations.data
    np.testing.assert_allclose(data["x"], result.x, rtol=0, atol=0)
    np.testing.assert_allclose(data["M2"], result.moment * 1e-3, rtol=1e-12)
    np.testing.assert_allclose(data["M1"], result.first_order.moment * 1e-3, rtol=1e-12, atol=1e-15)
    np.testing.assert_allclose(data["w2"], result.total_offset * 1e3, rtol=1e-12)
    np.testing.assert_allclose(data["V2"], result.shear * 1e-3, rtol=1e-12)
    peak = page.diagrams.peaks["M"].data
    assert peak["y"] == [pytest.approx(result.governing.moment.value * 1e-3, rel=1e-12)]
    assert (
        peak["text"][0]
        == f"{result.governing.moment.value * 1e-3:.2f} kN·m at {result.governing.moment.x:.3f} m"
    )


def test_slider_is_scaled_to_the_critical_load(page):
    """The slider runs from tension of Pcr1 to 1.25·Pcr1, nine times finer near Pcr1 than a linear track."""
    pcr1 = page.model.result.critical_loads[0]
    force = page.force
    assert force.force_at(0.0) == pytest.approx(-pcr1) and force.force_at(1.0) == pytest.approx(1.25 * pcr1)
    assert force.force_at(force.slider.value) == pytest.approx(350e3)
    step = force.slider.step
    near = force.force_at(force.position_of(pcr1) + step) - pcr1
    linear = 2.25 * pcr1 * step  # the same step on a linear track from -Pcr1 to 1.25·Pcr1
    assert 0 < near <= linear / 9


def test_dragging_the_slider_updates_the_sources_live(page):
    """Each slider value re-solves at once: the peak moment grows with compression towards Pcr1."""
    link = page.model.link
    pcr1 = page.model.result.critical_loads[0]
    peaks = []
    for value in (350.0, 1000.0, 2000.0, 3000.0):
        page.force.slide_to(value * 1e3)
        assert page.model.axial_force == pytest.approx(value * 1e3, abs=pcr1 / 400)  # a slider step
        peaks.append(np.nanmax(np.abs(page.stations.data["M2"])))
        expected = engine.solve(page.model.result.case).governing.moment.magnitude * 1e-3
        assert peaks[-1] == pytest.approx(expected, rel=1e-9)
    assert peaks == sorted(peaks) and peaks[-1] > 5 * peaks[0]
    assert page.model.link == link  # the URL changes only when the slider is released
    with param.edit_constant(page.force_slider):
        page.force_slider.value_throttled = page.force_slider.value  # what the browser sends on release
    assert json.loads(page.model.link)["axial_force"] == pytest.approx(page.model.axial_force)


def test_number_entry_sets_the_force_exactly_and_settles(page):
    """Typing N sets the exact force, moves the slider and settles the link."""
    page.force_input.value = 1234.5
    assert page.model.axial_force == pytest.approx(1234.5e3, rel=1e-15)
    assert page.force.force_at(page.force_slider.value) == pytest.approx(1234.5e3)
    assert json.loads(page.model.link)["axial_force"] == pytest.approx(1234.5e3)
    assert "1234.5 kN" in page.force.readout.object or "1235 kN" in page.force.readout.object


def test_readout_shows_ratio_and_alpha(page):
    """Beside the slider: N, N/Pcr1 and α_cr = Pcr1/N from the engine (EN 1993-1-1 §5.2.1, from memory)."""
    result = page.model.result
    assert f"<b>{result.axial_force / result.critical_loads[0]:.3f}</b>" in page.force.readout.object
    assert f"<b>{result.alpha_cr:.3f}</b>" in page.force.readout.object


def test_bad_input_shows_the_engine_message_and_keeps_the_plots(page):
    """A negative span shows the engine's message next to the span input; the curves stay as they were."""
    before = dict(page.stations.data)
    page.length_input.value = -1.0
    errors = visible_errors(page)
    assert any("Span L: -1.0 m must be &gt;= 0.001 and &lt;= 1000 m" in text for text in errors)
    assert page.stale.visible
    np.testing.assert_array_equal(page.stations.data["M2"], before["M2"])
    page.length_input.value = 6.0
    assert not page.stale.visible and visible_errors(page) == []


def test_load_row_edits_reach_the_case_and_errors_show_on_the_row(page):
    """Editing a load row changes the case; a position beyond the member shows on that row only."""
    row = page.inputs.loads.rows[1]
    inputs = {key: field.widget for key, field in row.fields.items()}
    inputs["P"].value = 10.0  # kN
    assert pytest.approx(10e3) == page.model.result.case.loads[1].P
    inputs["x"].value = 7.5
    assert page.model.error_for("loads[1]").startswith("loads[1].x: 7.5 m")
    assert row.error.visible and "Load 2, position: 7.5 m" in row.error.object
    assert not page.inputs.loads.rows[0].error.visible


def test_adding_a_point_load_rebuilds_the_rows_and_changes_the_curves(page):
    """The add button appends a row of the chosen type and the moment diagram changes."""
    before = np.nanmax(np.abs(page.stations.data["M2"]))
    page.inputs.loads.add_type.value = "point"
    page.inputs.loads.add_button.clicks += 1
    assert len(page.model.loads) == 3 and len(page.inputs.loads.rows) == 3
    assert page.inputs.loads.rows[2].type == "point"
    assert np.nanmax(np.abs(page.stations.data["M2"])) > before
    page.inputs.loads.rows[2].remove_button.clicks += 1
    assert len(page.inputs.loads.rows) == 2


def test_supports_and_springs_show_their_inputs(page):
    """An elastic end shows its restraint choices; a spring shows its stiffness input."""
    left = page.inputs.ends["left"]
    assert not left["springs"].visible
    left["form"].value = "elastic"
    assert left["springs"].visible
    left["rotation"].value = "spring"
    assert left["k_r"].visible and not left["k_t"].visible
    left["k_r"].value = 500.0  # kN·m/rad
    assert page.model.result.case.left == engine.EndSupport(translation="fixed", rotation=500e3)


def test_units_switch_converts_every_shown_value(page):
    """US units show ft, in, kip and kip·ft (1 ft = 0.3048 m, 1 kip = 4448.22 N); the state stays SI."""
    si = dict(page.stations.data)
    page.units_switch.value = "us"
    assert page.model.units == "us"
    data = page.stations.data
    np.testing.assert_allclose(data["x"], si["x"] / FOOT, rtol=1e-12)
    np.testing.assert_allclose(data["M2"], si["M2"] * 1e3 / (KIP * FOOT), rtol=1e-12)
    assert page.length_input.value == 19.685  # 6 m in ft, shown to six significant figures
    assert page.length_input.label == "Span L [ft]"
    assert "kip" in page.values.table.object and "kN" not in page.values.table.object
    page.length_input.value = 20.0
    assert page.model.length == pytest.approx(20.0 * FOOT)
    assert page.diagrams.fig_V.xaxis.axis_label == "x [ft]"


def test_transverse_force_toggle_shows_T(page):
    """The toggle adds the transverse force T beside the shear V."""
    assert not page.diagrams.renderers["V"]["extra"].visible
    page.diagrams.transverse_toggle.value = True
    assert page.diagrams.renderers["V"]["extra"].visible
    np.testing.assert_allclose(
        page.stations.data["T2"], page.model.result.transverse_force * 1e-3, rtol=1e-12
    )


def test_variants_are_kept_overlaid_and_compared(page):
    """Up to four variants are kept, overlaid on the diagrams and listed in the comparison table."""
    for value in (500.0, 1000.0, 1500.0, 2000.0, 2500.0):
        page.force.slide_to(value * 1e3)
        page.keep_variant()
    assert len(page.variants.kept) == MAX_VARIANTS
    kept = [v["result"].axial_force for v in page.variants.kept]
    assert kept == pytest.approx([1.0e6, 1.5e6, 2.0e6, 2.5e6], abs=10e3)  # within a slider step
    assert len(page.diagrams.renderers["M"]["variants"]) == MAX_VARIANTS
    assert all(r.visible for r in page.diagrams.renderers["M"]["variants"])
    np.testing.assert_allclose(
        page.diagrams.variant_sources[0].data["M"], page.variants.kept[0]["result"].moment * 1e-3
    )
    assert page.variants.table.object.count("<th>") == 1 + 1 + MAX_VARIANTS
    page.variants.clear()
    assert not any(r.visible for r in page.diagrams.renderers["M"]["variants"])


def test_cautions_are_listed_by_severity_with_the_general_one_pinned(page):
    """The general caution is always shown; beyond Pcr1 the engine's instability caution leads the list."""
    assert "data-code='scope'" in page.cautions.general.object
    assert "licensed engineer" in page.cautions.general.object
    page.force_slider.value = page.force_slider.end
    assert page.model.result.status == "unstable"
    text = page.cautions.list.object
    # It leads the list (the LTB warning, which used to follow it, goes once the member's LTB check is made).
    first = re.search(r"<li class='(\w+)' data-code='([^']+)'", text)
    assert first.groups() == ("danger", "beyond-critical-load")
    assert "data-code='scope'" in page.cautions.general.object


def test_critical_load_is_drawn_as_unbounded_not_broken(page):
    """At N = Pcr1 the engine's +inf values become gaps in the plots and 'unbounded' in the table."""
    page.force_input.value = page.model.result.critical_loads[0] * 1e-3
    assert page.model.result.status == "critical"
    assert np.all(np.isnan(page.stations.data["M2"]))
    assert "unbounded" in page.values.table.object
    assert page.diagrams.peaks["M"].data["x"] == []


def test_amplification_chart_and_modes(page):
    """The chart's curves come from engine.sweep; the marker sits at N/Pcr1; the modes carry their Pcr."""
    result = page.model.result
    pcr = result.critical_loads
    n = np.asarray(page.amplification.sweep_source.data["n"])
    assert n[0] == pytest.approx(-2.0) and n[-1] > pcr[2] / pcr[0]
    assert page.amplification.current.data["n"] == [pytest.approx(350e3 / pcr[0])]
    assert page.amplification.current.data["moment"] == [pytest.approx(result.amplification.moment)]
    assert list(page.amplification.critical_source.data["n"]) == pytest.approx(list(pcr[:3] / pcr[0]))
    assert page.modes.mode_items[0].label.value == f"mode 1: Pcr1 = {pcr[0] * 1e-3:.0f} kN"
    assert max(page.modes.source.data["m1"]) == pytest.approx(1.0, abs=1e-3)


def test_sketch_draws_every_load(page):
    """The sketch has one arrow per point load and a row of arrows for the line load, at their positions."""
    xs = page.diagrams.sketch.arrows.data["x0"]
    assert 2.2 in xs  # the point load at 2.2 m
    assert min(xs) == 0.0 and max(xs) == 6.0  # the uniform load spans the member
    assert page.diagrams.sketch.axial_text.data["text"] == ["N = 350.00 kN\ncompression"]


def test_downloads_are_real_files(page):
    """Each download callback gives a file: PNG and PDF signatures, CSV with units, the case JSON."""
    png = page.files.png().getvalue()
    assert png[:8] == b"\x89PNG\r\n\x1a\n"
    assert page.files.pdf().getvalue()[:5] == b"%PDF-"
    csv = page.files.csv().getvalue()
    assert "x [m]" in csv and "M [kN·m]" in csv
    case = engine.Case.from_json(page.files.json().getvalue())
    assert case == demo_case()
    assert page.files.png_button.filename.startswith("strutscope-invented-example")


def upload(page, data: bytes, filename: str):
    """Deliver `data` to the page's upload widget as the browser would."""
    page.upload.filename = filename
    page.upload.value = data


def test_upload_restores_the_whole_page(page):
    """An uploaded case replaces every input in one update and the widgets show it."""
    case = engine.Case.from_dict(
        {
            "title": "Invented upload",
            "length": 4.0,
            "EI": 2.0e6,
            "axial_force": 100e3,
            "supports": {"left": "fixed", "right": "pinned"},
            "loads": [{"type": "couple", "C": 2e3, "x": 0.0}],
            "imperfection": {"shape": "sine", "amplitude": 0.004},
        }
    )
    upload(page, case.to_json().encode(), "invented.json")
    assert page.model.to_case() == case
    assert page.length_input.value == 4.0 and page.title_input.value == "Invented upload"
    assert page.inputs.ends["left"]["form"].value == "fixed"
    assert len(page.inputs.loads.rows) == 1 and page.inputs.loads.rows[0].type == "couple"
    assert "loaded invented.json" in page.upload_message.object


@pytest.mark.parametrize(
    ("data", "filename", "message"),
    [
        (
            b'{"length": 6.0, "supports": {"left": "pinned", "right": "pinned"}, "EI": 1e6,'
            b' "loads": [{"type": "point", "P": 1.0, "x": 7.5}]}',
            "bad.json",
            "loads[0].x: 7.5 m lies outside",
        ),
        (b"not json", "broken.json", "not valid JSON"),
        (b"{}", "case.txt", "is not a .json case file"),
        (b" " * (UPLOAD_LIMIT + 1), "big.json", "at most 1 MB"),
    ],
)
def test_bad_upload_is_refused_next_to_the_widget(page, data, filename, message):
    """A bad upload shows why beside the upload widget and changes nothing."""
    before = page.model.to_case()
    upload(page, data, filename)
    assert message in page.upload_message.object
    assert page.model.to_case() == before


def test_every_session_has_its_own_state():
    """Two pages built by the server's page function share nothing."""
    from app.serve import make_page

    first, second = make_page(), make_page()
    first.force.slide_to(2000e3)
    assert first.model.axial_force > 1900e3  # the slider's λ scales every load case of the first page only
    # the start demo's governing combination U2 = 1.35 G + 1.5 W: 1.35 x 240 kN - 1.5 x 20 kN = 294 kN
    # (EN 1990 Table A1.2(B), recommended factors, from memory)
    assert second.model.axial_force == pytest.approx(294e3, rel=1e-12)
    assert second.model.actions[0]["axial_force"] == 240e3
    assert first.model is not second.model and first.stations is not second.stations


def test_server_side_step_is_cheap_enough_to_drag():
    """A slider step solves and updates in place: the same source objects, new data (speed: the benchmark)."""
    state = MemberState()
    page = MemberPage(state)
    source, figure = page.stations, page.diagrams.fig_M
    page.force.slide_to(900e3)
    assert page.stations is source and page.diagrams.fig_M is figure
    assert not math.isclose(np.nanmax(page.stations.data["M2"]), 27.17, rel_tol=1e-3)


def test_page_stylesheet_sets_the_page_colours():
    """The document-level stylesheet carries the page's own colours and body font."""
    from app.page import page_stylesheet

    assert "--ss-ink" in page_stylesheet()


def test_upload_json_with_io():
    """The download of the case as JSON reads back into the engine (round trip through the page)."""
    page = MemberPage()
    text = page.files.json().getvalue()
    second = MemberPage()
    upload(second, text.encode(), "again.json")
    assert second.model.to_case() == page.model.result.case
    assert isinstance(page.files.csv(), io.StringIO)


def test_hidden_tabs_are_built_when_first_shown(page):
    """The amplification and modes tabs hold nothing until shown; shown, they hold their chart."""
    tabs = page.centre_tabs
    assert len(tabs[1].objects) == 0 and len(tabs[2].objects) == 0
    tabs.active = 1
    assert len(tabs[1].objects) == 1 and len(tabs[2].objects) == 0
    assert len(page.amplification.sweep_source.data["n"]) > 100


def test_amplification_chart_shows_the_useful_range_with_its_legend_outside(page):
    """The chart opens on N/Pcr1 from −1 to 1.5 (the useful range), its legend below the plot."""
    figure = page.amplification.figure
    assert figure.x_range.start == pytest.approx(-1.05) and figure.x_range.end == pytest.approx(1.5)
    assert any(type(item).__name__ == "Legend" for item in figure.below)
    assert not any(type(item).__name__ == "Legend" for item in figure.center)
    n = page.amplification.critical_source.data["n"]
    assert n[0] == pytest.approx(1.0)  # Pcr1's label sits left of its line, inside the range shown


def test_routes_chart_keeps_its_legend_below_the_plot(page):
    """The routes chart's legend lies below the plot: inside it, it covered the N marker at small forces."""
    figure = page.routes_chart.figure
    assert any(item is page.routes_chart.legend for item in figure.below)
    assert not any(type(item).__name__ == "Legend" for item in figure.center)


def test_near_the_critical_load_the_badge_warns_and_the_engine_cautions(page):
    """From N/Pcr1 = 0.9 the readout's badge reads "near Pcr1" and the engine adds a danger caution."""
    pcr1 = page.model.result.critical_loads[0]
    page.force_input.value = 0.89 * pcr1 * 1e-3
    assert "near Pcr1" not in page.force.readout.object
    assert "near-critical-load" not in page.cautions.list.object
    page.force_input.value = 0.9 * pcr1 * 1e-3
    assert "near Pcr1" in page.force.readout.object
    assert "data-code='near-critical-load'" in page.cautions.list.object
    # 1/(1 - 0.9) = 10 (Timoshenko & Gere (1961) ch. 1, the amplification factor)
    assert "about 10 times the first-order ones" in page.cautions.list.object


def test_messages_use_the_page_names_of_the_fields(page):
    """An engine message on loads[1].x reads "Load 2, position" beside the row and in the banner."""
    page.length_input.value = 2.0  # the point load at 2.2 m is now beyond the member
    assert any("Load 2, position: 2.2 m" in text for text in visible_errors(page))
    assert "Load 2, position" in page.stale.object and "loads[1]" not in page.stale.object
    assert all(button.disabled for button in page.files.buttons)
    assert "Load 2, position" in page.files.blocked.object and page.files.blocked.visible
    page.length_input.value = 6.0
    assert not any(button.disabled for button in page.files.buttons)


def test_variant_names_say_what_differs_and_can_be_edited(page):
    """The first variant is named by N; the next by what differs (here the section); a name can be changed."""
    page.keep_variant()
    page.model.section_name = "HEB 240"
    page.keep_variant()
    names = [v["name"] for v in page.variants.kept]
    assert names == ["A: N 350.0 kN", "B: HEB 240"]
    page.variants.names[1].value = "B: heavier post"
    assert page.variants.kept[1]["name"] == "B: heavier post"
    assert "heavier post" in page.diagrams.key.object and "heavier post" in page.variants.table.object


def test_a_member_that_fails_its_check_is_flagged_beside_the_stable_badge(page):
    """At 350 kN the demo passes its check (utilisation 0.42) and shows no flag; at 1000 kN (below N_cr,z =
    1153 kN) it is in equilibrium ("stable") but fails out of plane (1.2): "fails check" beside the badge."""
    assert page.model.result.check.utilization < 1
    assert "fails check" not in page.force.readout.object
    page.force_input.value = 1000.0
    result = page.model.result
    assert result.status == "stable" and result.check.utilization > 1
    assert "ss-stable" in page.force.readout.object
    assert "fails check" in page.force.readout.object


def test_the_flag_reads_the_headline_not_the_member_check_alone(page):
    """At 800 kN the demo's member check passes (out-of-plane buckling 0.966) but the headline fails: eq.
    (6.62) of the en-member route, above 1. The flag said nothing there before (it read the member check)."""
    page.force_input.value = 800.0
    result = page.model.result
    assert result.status == "stable" and result.check.utilization < 1 < result.utilization
    assert "fails check" in page.force.readout.object
    page.force_input.value = 600.0
    assert page.model.result.utilization < 1
    assert "fails check" not in page.force.readout.object


def test_past_the_other_axis_buckling_load_the_badge_does_not_read_stable(page):
    """The demo HEB 200 buckles about its minor axis at N_cr,z = π²EI_z/L² = 1153 kN (Euler; the engine's
    out-of-plane check): above it the badge names that buckling in the danger style, below it stays stable."""
    n_cr = page.model.result.check.out_of_plane.N_cr
    assert n_cr == pytest.approx(
        math.pi**2 * 210e9 * 20.03e-6 / 6.0**2, rel=1e-3
    )  # I_z of HEB 200 (from memory)
    page.force_input.value = 0.99 * n_cr * 1e-3
    assert ">stable<" in page.force.readout.object
    page.force_input.value = 1.01 * n_cr * 1e-3
    assert "buckles about the other axis" in page.force.readout.object
    assert "ss-unstable" in page.force.readout.object and ">stable<" not in page.force.readout.object


def test_readout_of_two_planes_takes_the_lower_plane():
    """A two-plane case (the invented demo: Pcr1 1966 kN about the major axis, 723 kN about the minor): the
    readout's N/Pcr1 is that of the lower plane, so that it is 1/α_cr beside it, and the slider's fine zone
    sits below that plane's critical load."""
    text = resources.files("assets").joinpath("demo_two_planes.json").read_text(encoding="utf-8")
    state = MemberState()
    state.load_mapping(json.loads(text))
    page = MemberPage(state)
    result = state.result
    lower = min(float(result.critical_loads[0]), float(result.second_plane.critical_loads[0]))
    readout = page.force.readout.object
    assert f"<b>{result.axial_force / lower:.3f}</b>" in readout
    assert f"<b>{result.alpha_cr:.3f}</b>" in readout
    assert result.axial_force / lower == pytest.approx(1.0 / result.alpha_cr, rel=1e-12)
    assert page.force.pcr1 == pytest.approx(lower, rel=1e-12)


def test_the_cautions_heading_counts_every_item_listed_in_the_plural(page):
    """The heading's counts are those of the items listed (the general note included), "notes" past one."""
    cautions = page.cautions
    listed = re.findall(r"<li class='(\w+)'", cautions.list.object + cautions.general.object)
    heading = re.sub(r"<[^>]+>", "", cautions.heading.object)
    for level, word in (("danger", "danger"), ("warning", "warning"), ("info", "note")):
        n = listed.count(level)
        if n:
            assert f"{n} {word}{'' if n == 1 else 's'}" in heading, (heading, listed)
    assert listed.count("info") >= 2 and "notes" in heading
