"""Lateral-torsional buckling on the real served page (issue 15), at 1280×720.

What a person sees: the LTB figures (M_cr exact and tabulated, λ̄_LT, χ_LT, the utilisation) in the governing
values and in the LTB tab, each inside the window and not covered, with the engine's numbers in the page's
units; the buckled-shape view drawn with the lateral and the twist component of the first mode; and a link
with LTB settings that reopens the same settings and the same figures in a new browser.
"""

import json
import re
import urllib.parse
from importlib import resources

import pytest
from playwright.sync_api import expect

import engine
from app.report.ltb import ltb_words
from app.units import units
from tests.browser.conftest import TIMEOUT_MS, VIEWPORT, open_page
from tests.browser.test_meeting_room import inside_window
from tests.browser.test_page_in_browser import _uncovered, tab, value_cell

pytestmark = pytest.mark.browser

SHOWN = ("M_cr", "M_cr_tabulated", "lambda_LT", "chi_LT", "utilisation")


def demo_mapping() -> dict:
    return json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))


def link_to(server, mapping: dict) -> str:
    """The page's address opening `mapping` (the link format the page itself writes)."""
    return server.url + "?case=" + urllib.parse.quote(json.dumps(mapping, separators=(",", ":")))


def expected_words(mapping: dict):
    """The engine's check of `mapping`, worded as the page words it (SI)."""
    result = engine.solve(engine.Case.from_dict(mapping))
    assert result.ltb is not None and result.ltb.applies, "the demo member has an LTB check"
    return result.ltb, ltb_words(result, units("si"))


def readable(page, cell) -> bool:
    """Whether `cell`, scrolled to the middle of its box as a reader would, lies in the window uncovered.

    (A row half cut off at the edge of its scrolling box counts as in view for the browser's own "scroll if
    needed", which then does not scroll: a reader scrolls on.)"""
    cell.evaluate("(el) => el.scrollIntoView({block: 'center'})")
    return inside_window(cell) and _uncovered(page, cell)


# The box of the Bokeh figure that draws the source 'ltb_mode', found through Bokeh's views.
_PLOT_BOX = """() => {
    const found = [];
    const walk = (view) => {
        if (!view) return;
        if (view.model && view.model.type === 'Figure'
                && view.model.renderers.some((r) => r.data_source && r.data_source.name === 'ltb_mode')) {
            const r = view.el.getBoundingClientRect();
            found.push({x: r.left, y: r.top, width: r.width, height: r.height});
        }
        for (const child of (view.child_views ?? [])) walk(child);
    };
    for (const root of (Bokeh.index.roots ?? Object.values(Bokeh.index))) walk(root);
    return found.length === 1 ? found[0] : null;
}"""


def _mode_drawn(page) -> None:
    """Wait until the LTB tab's figure holds both components of the mode, each with a largest |value| of 1."""
    page.wait_for_function(
        """() => {
            const doc = Bokeh.documents[0];
            const s = doc && doc.get_model_by_name('ltb_mode');
            if (!s || s.data.x.length < 5) return false;
            const peak = (a) => Math.max(...Array.from(a, Math.abs));
            return Math.abs(peak(s.data.v) - 1) < 1e-9 && Math.abs(peak(s.data.phi) - 1) < 1e-9;
        }""",
        timeout=TIMEOUT_MS,
    )


def test_ltb_figures_are_readable_and_the_mode_is_drawn(app):
    """The figures in the values and in the LTB tab are the engine's, in the window and uncovered; the mode's
    two components are drawn on a canvas that fills its place."""
    page = app.page
    _, words = expected_words(demo_mapping())
    # Served, the capacity comes after the first result and redraws the values: read them once it is in.
    expect(value_cell(page, "capacity N")).to_contain_text("kN")
    values = page.locator("table.ss-values").first
    for key in SHOWN:
        cell = values.locator(f"tr[data-ltb='{key}'] td.v")
        expect(cell).to_have_text(words.text(key))
        assert readable(page, cell), key
    tab(page, "LTB")
    _mode_drawn(page)  # the tab's view is built and has drawn (the tab is built when first shown)
    block = page.locator("table.ss-ltb")
    expect(block).to_be_visible()
    for key in (*SHOWN, "difference", "M_b_Rd"):
        cell = block.locator(f"tr[data-ltb='{key}'] td.v")
        expect(cell).to_have_text(words.text(key))
        assert readable(page, cell), key
    expect(page.locator(".ss-ltb-settings")).to_contain_text("destabilising")
    # The buckled-shape view lies in the window under the figures, at its full size, without scrolling.
    page.locator("table.ss-ltb").evaluate("(el) => el.scrollIntoView({block: 'start'})")
    box = page.evaluate(_PLOT_BOX)
    assert box is not None and box["width"] > 300 and box["height"] > 200, box
    assert box["y"] >= 0 and box["y"] + box["height"] <= VIEWPORT["height"] + 0.5, box
    top = page.locator("table.ss-ltb").bounding_box()
    assert top["y"] + top["height"] <= box["y"] + 0.5, (top, box)  # the table does not run over the plot
    assert app.errors == []


def test_a_link_with_ltb_settings_reopens_them(browser, server):
    """LTB settings from a link show in the Check tab; a change made there travels in a copied link, which a
    new browser opens with the same settings and the engine's figures for them."""
    mapping = demo_mapping()
    mapping["check"] = dict(mapping.get("check") or {}, ltb={"lateral_ends": ["fixed", "fixed"]})
    first = browser.new_context(viewport=VIEWPORT)
    other = browser.new_context(viewport=VIEWPORT)
    try:
        for ctx in (first, other):
            ctx.set_default_timeout(TIMEOUT_MS)
        first.grant_permissions(["clipboard-read", "clipboard-write"], origin=server.url.rstrip("/"))
        page = open_page(first, link_to(server, mapping)).page
        tab(page, "Check")
        expect(page.get_by_label("lateral end, x = 0", exact=True)).to_have_value("fixed")
        expect(page.get_by_label("lateral end, x = L", exact=True)).to_have_value("fixed")
        page.get_by_label("LTB load position", exact=True).select_option(label="at the shear centre")
        page.get_by_label("warping end, x = L", exact=True).select_option(label="fixed")
        changed = json.loads(json.dumps(mapping))
        changed["check"]["ltb"] = {
            "load_position": "shear-centre",
            "lateral_ends": ["fixed", "fixed"],
            "warping_ends": ["free", "fixed"],
        }
        _, words = expected_words(changed)
        cell = page.locator("table.ss-values tr[data-ltb='M_cr'] td.v")
        expect(cell).to_have_text(words.text("M_cr"))
        page.get_by_role("button", name="Copy link").click()
        expect(page.get_by_role("button", name="Link copied")).to_be_visible()
        link = page.evaluate("() => navigator.clipboard.readText()")
        case = json.loads(urllib.parse.parse_qs(urllib.parse.urlparse(link).query)["case"][0])
        assert case["check"]["ltb"] == changed["check"]["ltb"]

        again = open_page(other, link).page
        expect(again.locator("table.ss-values tr[data-ltb='M_cr'] td.v")).to_have_text(words.text("M_cr"))
        expect(again.locator("table.ss-values tr[data-ltb='chi_LT'] td.v")).to_have_text(words.text("chi_LT"))
        tab(again, "Check")
        # Panel's Select sends its options' labels to the browser: the value shown is the label.
        expect(again.get_by_label("LTB load position", exact=True)).to_have_value("at the shear centre")
        expect(again.get_by_label("warping end, x = L", exact=True)).to_have_value("fixed")
        expect(again.get_by_label("warping end, x = 0", exact=True)).to_have_value("free")
        tab(again, "LTB")
        expect(again.locator(".ss-ltb-settings")).to_contain_text(re.compile("at the shear centre"))
        _mode_drawn(again)
    finally:
        first.close()
        other.close()


def test_a_sway_top_is_free_laterally_until_the_user_says_fork(browser, server):
    """A sway column (the demo with a fixed foot and a guided top; invented): the Check tab shows each
    lateral end "by support", the warning that the top is free laterally is readable, and the engine's M_cr
    of that cantilever is shown; choosing "fork" at x = L gives the engine's M_cr for the stated fork and
    the warning goes."""
    mapping = demo_mapping()
    mapping.update(supports={"left": "fixed", "right": "guided"}, axial_force=150e3)
    free, free_words = ltb_words_of(mapping)
    assert free.lateral_ends == ("fixed", "free")
    held = json.loads(json.dumps(mapping))
    held["check"] = dict(held.get("check") or {}, ltb={"lateral_ends": ["supports", "fork"]})
    fork, fork_words = ltb_words_of(held)
    assert fork.M_cr > free.M_cr and fork_words.text("M_cr") != free_words.text("M_cr")
    context = browser.new_context(viewport=VIEWPORT)
    try:
        context.set_default_timeout(TIMEOUT_MS)
        page = open_page(context, link_to(server, mapping)).page
        cell = page.locator("table.ss-values tr[data-ltb='M_cr'] td.v")
        expect(cell).to_have_text(free_words.text("M_cr"))
        warning = page.locator("li[data-code='ltb-end-moves']")
        expect(warning).to_contain_text("x = L as free laterally")
        assert _top_uncovered(warning)
        tab(page, "Check")
        for where in ("x = 0", "x = L"):
            expect(page.get_by_label(f"lateral end, {where}", exact=True)).to_have_value("by support")
        page.get_by_label("lateral end, x = L", exact=True).select_option(label="fork")
        expect(cell).to_have_text(fork_words.text("M_cr"))
        expect(page.locator("li[data-code='ltb-end-moves']")).to_have_count(0)
    finally:
        context.close()


def ltb_words_of(mapping: dict):
    """The engine's LTB check of `mapping` (made) and its words on the page (SI)."""
    result = engine.solve(engine.Case.from_dict(mapping))
    assert result.ltb is not None and result.ltb.applies
    return result.ltb, ltb_words(result, units("si"))


def _top_uncovered(locator) -> bool:
    """Whether the first line of `locator`, scrolled to the top of its box as a reader starts reading, lies in
    the window with nothing over it."""
    locator.evaluate("(el) => el.scrollIntoView({block: 'start', inline: 'nearest'})")
    return locator.evaluate(
        """(el) => { const r = el.getBoundingClientRect();
                     const root = el.getRootNode();
                     const hit = (root.elementFromPoint ? root : document).elementFromPoint(
                         r.left + r.width / 2, r.top + 8);
                     return r.top >= 0 && hit !== null && (el === hit || el.contains(hit)); }"""
    )
