"""The routes and the second plane on the real served page (issue 14), at 1280×720.

The routes block must be visible, not covered and show each route's utilisation as the engine computes it;
the plane switch must draw the second plane's own diagrams for the invented two-plane demo
(``assets/demo_two_planes.json``); a copied link must reopen the same second-plane loads and route settings.
"""

import json
import re
import urllib.parse
from importlib import resources

import pytest
from playwright.sync_api import expect

import engine
from app.report.numbers import ratio
from tests.browser.conftest import TIMEOUT_MS, VIEWPORT, open_page
from tests.browser.test_meeting_room import inside_window
from tests.browser.test_page_in_browser import _uncovered, demo_case, set_number, tab

pytestmark = pytest.mark.browser


def two_planes_mapping() -> dict:
    """The invented two-plane demo case (package data)."""
    return json.loads(resources.files("assets").joinpath("demo_two_planes.json").read_text("utf-8"))


def link_to(server, mapping: dict) -> str:
    """The page's address opening `mapping` (the link format the page itself writes)."""
    return server.url + "?case=" + urllib.parse.quote(json.dumps(mapping, separators=(",", ":")))


def test_routes_block_is_readable_and_shows_each_route(app):
    """Each route's row lies in the window, uncovered, with the engine's utilisation; the headline marked."""
    page = app.page
    result = engine.solve(demo_case())
    block = page.locator("table.ss-routes")
    expect(block).to_be_visible()
    assert result.routes, "the engine gives the routes"
    for route in result.routes:
        row = page.locator(f"tr[data-route='{route.route}']")
        expect(row.locator("td.v")).to_contain_text(ratio(route.utilization))
        assert inside_window(row) and _uncovered(page, row.locator("td.v")), route.route
    head = max((r for r in result.routes if r.enabled), key=lambda r: r.utilization)
    expect(page.locator(f"tr[data-route='{head.route}'] td.f")).to_have_text("★ headline")
    expect(page.locator(".ss-planes")).to_contain_text("Out of plane (minor axis (z–z)): flexural buckling")


def test_plane_switch_draws_the_minor_axis_diagrams(context, server):
    """For the two-plane demo the switch shows the second plane's M (the engine's, in kN·m) and its values."""
    mapping = two_planes_mapping()
    page = open_page(context, link_to(server, mapping)).page
    second = engine.solve(engine.Case.from_dict(mapping)).second_plane
    switch = page.get_by_role("button", name="minor axis (z–z)", exact=True)
    expect(switch).to_be_visible()
    switch.click()
    expect(page.locator(".ss-key")).to_contain_text("second plane, minor axis (z–z)")
    expected = abs(second.governing.moment.value) / 1e3
    page.wait_for_function(
        """(expected) => {
            const s = Bokeh.documents[0].get_model_by_name('stations');
            const m = Math.max(...Array.from(s.data.M2, Math.abs));
            return Math.abs(m - expected) <= 1e-6 * expected;
        }""",
        arg=expected,
        timeout=TIMEOUT_MS,
    )
    expect(page.locator("table.ss-values th", has_text="Second plane · minor axis (z–z)")).to_have_count(1)
    expect(page.locator(".ss-planes")).to_contain_text("Both planes analysed")


def test_a_copied_link_reopens_second_plane_loads_and_route_settings(browser, server):
    """Edits of the second plane's load and of the route settings travel in a copied link to a new browser."""
    first = browser.new_context(viewport=VIEWPORT)
    other = browser.new_context(viewport=VIEWPORT)
    try:
        for ctx in (first, other):
            ctx.set_default_timeout(TIMEOUT_MS)
        first.grant_permissions(["clipboard-read", "clipboard-write"], origin=server.url.rstrip("/"))
        page = open_page(first, link_to(server, two_planes_mapping())).page
        tab(page, "Loads")
        page.get_by_role("button", name="2nd plane: minor axis (z–z)").click()
        set_number(page, "F [kN]", 2.5)  # the second plane's point load, 1.2 kN in the demo
        tab(page, "Check")
        page.get_by_label("AISC 360-16 (H1.1)").check()
        page.get_by_label("AISC 360-16", exact=True).select_option(label="ASD (Ω)")
        page.get_by_label("AISC analysis", exact=True).select_option(label="direct analysis (§C2.3)")
        expect(page.locator("tr[data-route='aisc'] td.q")).to_contain_text(
            "AISC 360-16 (ASD, direct analysis)"
        )
        page.get_by_role("button", name="Copy link").click()
        expect(page.get_by_role("button", name="Link copied")).to_be_visible()
        link = page.evaluate("() => navigator.clipboard.readText()")
        case = json.loads(urllib.parse.parse_qs(urllib.parse.urlparse(link).query)["case"][0])
        assert case["second_plane"]["loads"][0]["P"] == pytest.approx(2500.0)
        assert case["check"]["routes"] == ["second-order", "en-member", "aisc"]
        assert case["check"]["aisc_method"] == "ASD" and case["check"]["aisc_analysis"] == "direct"

        again = open_page(other, link).page
        expect(again.locator("tr[data-route='aisc'] td.f")).not_to_have_text("comparison")
        expect(again.locator("tr[data-route='aisc'] td.q")).to_contain_text(
            "AISC 360-16 (ASD, direct analysis)"
        )
        tab(again, "Loads")
        again.get_by_role("button", name="2nd plane: minor axis (z–z)").click()
        expect(again.get_by_label("F [kN]", exact=True)).to_have_value(re.compile(r"^2\.5"))
        tab(again, "Check")
        expect(again.get_by_label("AISC 360-16 (H1.1)")).to_be_checked()
        expect(again.get_by_label("AISC analysis", exact=True)).to_have_value("direct analysis (§C2.3)")
        expect(again.get_by_label("AISC analysis", exact=True)).to_be_visible()
    finally:
        first.close()
        other.close()
