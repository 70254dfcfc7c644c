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
from tests.browser.test_page_in_browser import _uncovered, tab

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
    values = page.locator("table.ss-values").first
    for key in SHOWN:
        cell = values.locator(f"tr[data-ltb='{key}'] td.v")
        expect(cell).to_have_text(words.text(key))
        assert inside_window(cell) and _uncovered(page, cell), key
    tab(page, "LTB")
    block = page.locator("table.ss-ltb")
    expect(block).to_be_visible()
    for key in (*SHOWN, "difference", "M_b_Rd"):
        cell = block.locator(f"tr[data-ltb='{key}'] td.v")
        expect(cell).to_have_text(words.text(key))
        assert inside_window(cell) and _uncovered(page, cell), key
    expect(page.locator(".ss-ltb-settings")).to_contain_text("destabilising")
    _mode_drawn(page)
    canvas = page.locator(".bk-Figure canvas").last
    expect(canvas).to_be_visible()
    box = canvas.bounding_box()
    assert box["width"] > 300 and box["height"] > 150, box
    assert box["y"] + 40 <= VIEWPORT["height"], box  # at least its top lies in the window
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
