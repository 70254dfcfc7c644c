"""Load cases and combinations on the served page (issue 17), driven as an engineer would: the load-case
table, the governing combination, the envelope band, the slider's mode sentence and a copied link that reopens
the same load cases. The page serves the invented demo with a permanent and a wind load case."""

import json
import re
import urllib.parse
from importlib import resources

import pytest
from playwright.sync_api import expect

from tests.browser.conftest import TIMEOUT_MS, VIEWPORT, Server, open_page
from tests.browser.test_page_in_browser import _uncovered, tab

pytestmark = pytest.mark.browser

DEMO = resources.files("assets").joinpath("demo_wind_post_actions.json")


@pytest.fixture(scope="module")
def server(tmp_path_factory):
    """`strutscope serve CASE` on the demo with load cases."""
    folder = tmp_path_factory.mktemp("serve_actions")
    path = folder / "case.json"
    path.write_text(DEMO.read_text("utf-8"), encoding="utf-8")
    running = Server(str(path), cwd=folder)
    yield running
    running.stop()


def _inside(box) -> bool:
    return (
        box is not None
        and box["x"] >= 0
        and box["y"] >= 0
        and box["x"] + box["width"] <= VIEWPORT["width"] + 0.5
        and box["y"] + box["height"] <= VIEWPORT["height"] + 0.5
    )


def _governing():
    """The engine's governing ultimate combination of the demo and its axial force [N] (what the page shows;
    U2 = 1.35 G + 1.5 W since lateral-torsional buckling is checked, EN 1990 Table A1.2(B), from memory)."""
    import engine

    result = engine.solve(engine.Case.from_dict(json.loads(DEMO.read_text("utf-8"))))
    return result.actions.headline, result.axial_force


GOVERNING, GOVERNING_N = _governing()


def _names(page) -> list:
    inputs = page.locator(".ss-load-case input[placeholder='name']")
    return [inputs.nth(i).input_value() for i in range(inputs.count())]


def test_load_cases_and_the_governing_combination_are_shown_and_not_covered(app):
    """The load-case table (G and W), the governing combination per check and the picker lie in view."""
    page = app.page
    governing = page.locator(".ss-governing td").filter(has_text=re.compile(f"^{GOVERNING}$")).first
    expect(governing).to_be_visible()
    expect(page.locator(".ss-governing")).to_contain_text("strength and stability (headline)")
    assert _uncovered(page, governing)
    assert _inside(governing.bounding_box())
    picker = page.get_by_label("Combination shown")
    expect(picker).to_be_visible()
    assert _inside(picker.bounding_box())
    expect(page.locator(".ss-scale-mode")).to_contain_text(
        f"The slider sets N of combination {GOVERNING} by one factor λ = 1 on every load case's axial "
        "force alone"
    )
    tab(page, "Loads")
    first = page.locator(".ss-load-case input[placeholder='name']").first
    expect(first).to_have_value("G")
    assert _names(page) == ["G", "W"]
    assert _uncovered(page, first)
    assert _inside(first.bounding_box())
    assert app.errors == []


def test_picking_envelope_draws_a_band(app):
    """'envelope' fills the band of M with the envelope of the ultimate combinations (max above min)."""
    page = app.page
    page.get_by_label("Combination shown").select_option(label="envelope (every combination)")
    page.wait_for_function(
        "() => { const m = Bokeh.documents[0].get_model_by_name('envelope_M');"
        " return m && m.data.x.length > 0; }",
        timeout=TIMEOUT_MS,
    )
    band = page.evaluate("""() => {
        const s = Bokeh.documents[0].get_model_by_name('envelope_M');
        return {lo: Array.from(s.data.lo), hi: Array.from(s.data.hi)};
    }""")
    widths = [hi - lo for lo, hi in zip(band["lo"], band["hi"], strict=True)]
    assert min(widths) >= 0
    assert max(widths) > 1.0  # kN·m: the wind case's moment spreads the combinations apart
    expect(page.locator(".ss-scale-mode")).to_contain_text("Envelope: the shaded band")
    page.get_by_label("Combination shown").select_option(label=f"governing ({GOVERNING})")
    page.wait_for_function(
        "() => Bokeh.documents[0].get_model_by_name('envelope_M').data.x.length === 0", timeout=TIMEOUT_MS
    )


def test_the_mode_switch_says_what_the_slider_scales(app):
    """The switch to the whole combination changes the sentence under the picker."""
    page = app.page
    page.get_by_role("button", name="whole combination (λ)").click()
    expect(page.locator(".ss-scale-mode")).to_contain_text(
        f"sets N of combination {GOVERNING} by one load factor λ = 1 on every load case's loads and "
        "axial force"
    )


def test_a_copied_link_reopens_the_same_load_cases(browser, server, app):
    """A changed load case reaches the copied link (the Copy link button) and the address bar; the copied link
    opened in a fresh browser shows the same load cases and the same governing combination."""
    page = app.page
    page.context.grant_permissions(["clipboard-read", "clipboard-write"], origin=server.url.rstrip("/"))
    tab(page, "Loads")
    name = page.locator(".ss-load-case input[placeholder='name']").nth(1)
    name.fill("W1")
    name.press("Enter")
    page.wait_for_url(re.compile(r"W1"))
    page.get_by_role("button", name="Copy link").click()
    expect(page.get_by_role("button", name="Link copied")).to_be_visible()
    link = page.evaluate("() => navigator.clipboard.readText()")
    case = json.loads(urllib.parse.parse_qs(urllib.parse.urlparse(link).query)["case"][0])
    assert [action["name"] for action in case["actions"]] == ["G", "W1"]
    assert case["combinations"]["rule"] == "en1990-6.10"
    other = browser.new_context(viewport=VIEWPORT)
    try:
        other.set_default_timeout(TIMEOUT_MS)
        again = open_page(other, link).page
        tab(again, "Loads")
        expect(again.locator(".ss-load-case input[placeholder='name']").nth(1)).to_have_value("W1")
        assert _names(again) == ["G", "W1"]
        expect(again.locator(".ss-governing")).to_contain_text(GOVERNING)
        expect(again.locator(".ss-governing")).to_contain_text("S2")
    finally:
        other.close()


def test_an_uploaded_case_with_load_cases_replaces_them(app, tmp_path):
    """An uploaded file with load cases is read (it was refused before issue 17's page part)."""
    page = app.page
    data = json.loads(DEMO.read_text("utf-8"))
    data["actions"][1]["name"] = "Wup"
    path = tmp_path / "invented-actions.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    page.locator("input[type=file]").set_input_files(path)
    expect(page.get_by_text("loaded invented-actions.json")).to_be_visible()
    tab(page, "Loads")
    expect(page.locator(".ss-load-case input[placeholder='name']").nth(1)).to_have_value("Wup")
    assert _names(page) == ["G", "Wup"]


def test_a_load_outside_the_member_is_named_and_the_last_result_kept(app):
    """A load case's load beyond the span: the message names the load case, the load, the value and the range;
    the plots keep the last good result."""
    page = app.page
    tab(page, "Loads")
    field = page.locator(".ss-load-case").first.get_by_label("at x [m]")
    before = page.evaluate("() => Array.from(Bokeh.documents[0].get_model_by_name('stations').data.M2)")
    field.fill("7.5")
    field.press("Enter")
    message = "Load case 1, load 1, position: 7.5 m lies outside the member (0 to 6 m)"
    expect(page.get_by_text(message).first).to_be_visible()
    expect(page.get_by_text("Input not accepted")).to_be_visible()
    after = page.evaluate("() => Array.from(Bokeh.documents[0].get_model_by_name('stations').data.M2)")
    assert after == before
    assert app.errors == []


def test_typing_n_scales_the_shown_combination(app):
    """N typed with load cases is the shown combination's N: the readout shows it, the link's actions follow
    (mode 'its N only': every load case's axial force times N/N_before)."""
    page = app.page
    entry = page.get_by_label("N [kN]", exact=True)
    expect(entry).to_have_value(f"{GOVERNING_N / 1e3:g}")  # U2 = 1.35 x 240 kN − 1.5 x 20 kN = 294 kN
    entry.fill(f"{1.5 * GOVERNING_N / 1e3:g}")
    entry.press("Enter")
    expect(page.locator(".ss-readout")).to_contain_text(f"{1.5 * GOVERNING_N / 1e3:.2f} kN")
    page.wait_for_url(re.compile(r"360000"))  # G: 240 kN x 1.5 = 360 kN
    query = urllib.parse.parse_qs(urllib.parse.urlparse(page.url).query)
    case = json.loads(query["case"][0])
    assert case["actions"][0]["axial_force"] == pytest.approx(360e3)
    assert case["actions"][1]["axial_force"] == pytest.approx(-30e3)
    assert case["actions"][1]["loads"] == json.loads(DEMO.read_text("utf-8"))["actions"][1]["loads"]


def _label(name: str) -> str:
    """The picker's label of combination `name` (the page's own wording, app.page.actions)."""
    import engine
    from app.page.actions import choice_options

    result = engine.solve(engine.Case.from_dict(json.loads(DEMO.read_text("utf-8"))))
    return next(label for label, value in choice_options(result).items() if value == name)


def test_a_combination_picked_is_said_not_to_govern_and_reopens_from_a_copied_link(browser, server, app):
    """Picking U1 (U2 governs): the right column says, in view and uncovered, that U1 is shown and does not
    govern; the address and the copied link carry it, and the link opened afresh shows U1 again."""
    page = app.page
    page.context.grant_permissions(["clipboard-read", "clipboard-write"], origin=server.url.rstrip("/"))
    label = _label("U1")
    page.get_by_label("Combination shown").select_option(label=label)
    note = page.locator(".ss-other-combination")
    title = note.locator("summary")
    expect(title).to_have_text(f"Combination U1 shown; {GOVERNING} governs")
    expect(title).to_be_visible()
    assert _uncovered(page, title)
    # One line: the governing values stay in view below it at 1280×720; the whole note opens on a click.
    assert title.bounding_box()["height"] < 40
    box = page.locator(".ss-values-box").first.bounding_box()
    headline = page.locator(".ss-values-box td").filter(has_text="headline").first
    cell = headline.bounding_box()
    assert box["y"] <= cell["y"] and cell["y"] + cell["height"] <= box["y"] + box["height"]  # in view
    title.click()
    whole = note.locator(".ss-note")
    expect(whole).to_contain_text("Combination U1 is shown: it is not the governing combination")
    expect(whole).to_contain_text(f"those of combination {GOVERNING}")
    expect(whole).to_be_visible()
    page.wait_for_url(re.compile(r"shown=U1"))
    page.get_by_role("button", name="Copy link").click()
    expect(page.get_by_role("button", name="Link copied")).to_be_visible()
    link = page.evaluate("() => navigator.clipboard.readText()")
    assert urllib.parse.parse_qs(urllib.parse.urlparse(link).query)["shown"] == ["U1"]
    other = browser.new_context(viewport=VIEWPORT)
    try:
        other.set_default_timeout(TIMEOUT_MS)
        again = open_page(other, link).page
        expect(again.locator(".ss-other-combination")).to_contain_text("Combination U1 is shown")
        expect(again.get_by_label("Combination shown")).to_have_value(re.compile(".+"))
        shown = again.get_by_label("Combination shown").evaluate("s => s.options[s.selectedIndex].text")
        assert shown == label
    finally:
        other.close()
    page.get_by_label("Combination shown").select_option(label=f"governing ({GOVERNING})")
    expect(page.locator(".ss-other-combination")).to_have_count(0)


def test_a_service_combination_picked_shows_where_strength_is_checked_and_no_bow_warning(app):
    """Picking S2 (a service combination, solved without the bow by design): the right column says, in view
    and uncovered, that strength is checked on the ultimate combinations and names the governing one; no
    caution says that the bow of 0 mm is below the code value; the general caution says how load cases are
    combined (not that combinations are not checked)."""
    page = app.page
    page.get_by_label("Combination shown").select_option(label=_label("S2"))
    note = page.locator(".ss-other-combination")
    title = note.locator("summary")
    expect(title).to_have_text(f"Service combination S2 shown; {GOVERNING} governs")
    expect(title).to_be_visible()
    assert _uncovered(page, title)
    title.click()
    whole = note.locator(".ss-note")
    expect(whole).to_contain_text("Combination S2 is shown: a service combination")
    expect(whole).to_contain_text(f"combination {GOVERNING} governs, utilisation")
    expect(whole).to_be_visible()
    expect(page.locator("li[data-code='deflection-basis']")).to_contain_text("combination S2")
    expect(page.locator("li[data-code='bow-below-code']")).to_have_count(0)
    general = page.locator("li[data-code='scope']")
    expect(general).to_contain_text("Load cases are combined by EN 1990")
    expect(general).not_to_contain_text("combinations are not checked")
    page.get_by_label("Combination shown").select_option(label=f"governing ({GOVERNING})")
    expect(page.locator(".ss-other-combination")).to_have_count(0)
