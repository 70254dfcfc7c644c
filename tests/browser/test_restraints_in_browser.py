"""Restraints inside the member on the served page (engine issue 16), driven as an engineer would: open the
editor, add a brace at mid-span, read its reaction in the governing values, see the shear jump drawn at the
brace, type a position off the member and read the message, and reopen the copied link.

Invented case: a 6 m beam, pinned at both ends, under a uniform load q = 2.5 kN/m, no axial force and no bow.
With a brace at mid-span it is two equal spans l = 3 m, whose middle support takes 1.25 q l = 9.375 kN (the
continuous-beam table of a structural engineering handbook, two equal spans under a uniform load; from
memory).
"""

import json
import re
import urllib.parse

import pytest
from playwright.sync_api import expect

from tests.browser.conftest import TIMEOUT_MS, VIEWPORT, open_page, serving
from tests.browser.test_page_in_browser import _uncovered, set_number, value_cell

pytestmark = pytest.mark.browser

Q, SPAN = 2.5, 3.0  # [kN/m], [m]: each of the two spans once braced
CASE = {
    "schema": 1,
    "title": "Invented two-span beam",
    "length": 2 * SPAN,
    "EI": 4.2e6,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 0.0,
    "loads": [{"type": "uniform", "q": Q * 1e3}],
    "imperfection": {"shape": "none", "amplitude": 0.0},
}
BRACE = "restraint at x = 3.000 m"


@pytest.fixture(scope="module")
def server(tmp_path_factory):
    """`strutscope serve CASE` on the invented beam."""
    yield from serving(tmp_path_factory, CASE, "serve_restraints")


def _shear_at(page, x: float) -> list:
    """The second-order shear [kN] the diagrams draw at the stations at `x` [m] (both sides of a jump)."""
    return page.evaluate(
        """(x) => { const s = Bokeh.documents[0].get_model_by_name('stations');
                    const out = [];
                    s.data.x.forEach((xi, i) => { if (Math.abs(xi - x) < 1e-9) out.push(s.data.V2[i]); });
                    return out; }""",
        x,
    )


def test_a_brace_shows_its_handbook_reaction_and_the_link_keeps_it(app, browser, server):
    page = app.page
    opener = page.get_by_role("button", name=re.compile("^. Restraints, steps, foundation"))
    expect(opener).to_be_visible()
    assert page.locator(".ss-inside").count() == 0  # not built before it is opened (start-up, issue 10)
    opener.click()
    page.get_by_role("button", name="+ Restraint").click()
    cell = value_cell(page, BRACE)
    expect(cell).to_have_text(re.compile(r"^9\.375 kN up$"))  # 1.25 q l, handbook two-span table
    assert _uncovered(page, cell)
    box = cell.bounding_box()
    assert box["x"] + box["width"] <= VIEWPORT["width"] + 0.5
    expect(opener).to_have_text(re.compile(r"\(1 restraint\)"))
    # the shear jumps by the reaction at the brace: the diagrams hold both sides of x = 3 m
    left, right = _shear_at(page, SPAN)
    assert right - left == pytest.approx(1.25 * Q * SPAN, rel=1e-6)

    # the copied link (the page's address) holds the brace, and reopens it with its reaction
    page.wait_for_url(re.compile(r"restraints"))
    query = urllib.parse.parse_qs(urllib.parse.urlparse(page.url).query)
    assert json.loads(query["case"][0])["restraints"] == [{"x": SPAN, "translation": "fixed"}]
    other_context = browser.new_context(viewport=VIEWPORT)
    try:
        other_context.set_default_timeout(TIMEOUT_MS)
        other = open_page(other_context, page.url).page
        expect(value_cell(other, BRACE)).to_have_text(re.compile(r"^9\.375 kN up$"))
        expect(
            other.get_by_role("button", name=re.compile(r"Restraints, steps, foundation \(1 restraint\)"))
        ).to_be_visible()
    finally:
        other_context.close()


def test_a_brace_off_the_member_is_named_and_the_last_result_kept(app):
    page = app.page
    page.get_by_role("button", name=re.compile("^. Restraints, steps, foundation")).click()
    page.get_by_role("button", name="+ Restraint").click()
    expect(value_cell(page, BRACE)).to_have_text(re.compile(r"^9\.375 kN up$"))
    set_number(page, "at x [m]", 9)
    message = page.locator(".ss-inside .ss-error")
    expect(message).to_have_text(re.compile(r"^Restraint 1, at x: 9(\.0)? m lies outside .*0 to 6 m"))
    assert _uncovered(page, message)
    expect(page.locator(".ss-stale-banner")).to_be_visible()
    expect(value_cell(page, BRACE)).to_have_text(re.compile(r"^9\.375 kN up$"))  # the last good result
    expect(page.get_by_label("at x [m]", exact=True)).to_have_value("9")  # the input is kept as typed
