"""The member's inside editor fits the inputs column on a catalogue section (what a person sees).

On a case with a catalogue section the steps' button reads "+ Step in section", and the three add buttons
were wider together (about 328 px) than the inputs column (318 px): the column scrolled sideways when
"+ Foundation" was pressed and cut the left edge of every label ("ase title", "pan L"; found 2026-12-03 in US
units). The buttons now wrap. A foundation's modulus is typed in one unit (kN/m², as the exports and the
batch).

Invented case: a 6 m post of HEB 200, S355, pinned at both ends, N = 300 kN, q = 2 kN/m.
"""

import pytest
from playwright.sync_api import expect

from tests.browser.conftest import serving
from tests.browser.test_page_in_browser import _uncovered

pytestmark = pytest.mark.browser

CASE = {
    "schema": 1,
    "title": "Invented post on a catalogue section",
    "length": 6.0,
    "supports": {"left": "pinned", "right": "pinned"},
    "section": {"name": "HEB 200"},
    "material": {"name": "S355"},
    "axis": "major",
    "axial_force": 300e3,
    "loads": [{"type": "uniform", "q": 2e3}],
    "imperfection": {"shape": "none", "amplitude": 0.0},
}


@pytest.fixture(scope="module")
def server(tmp_path_factory):
    """`strutscope serve CASE` on the invented post."""
    yield from serving(tmp_path_factory, CASE, "serve_inside_fits")


def _scrolled_sideways(page) -> list:
    """Every element of the page (through Bokeh's shadow roots) that is scrolled sideways."""
    return page.evaluate(
        """() => { const found = [];
                   const walk = (root) => { for (const el of root.querySelectorAll('*')) {
                       if (el.scrollLeft > 0) found.push(el.className || el.tagName);
                       if (el.shadowRoot) walk(el.shadowRoot); } };
                   walk(document); return found; }"""
    )


def test_the_add_buttons_fit_and_nothing_scrolls_sideways(app):
    page = app.page
    page.get_by_role("button", name="Restraints, steps, foundation").click()
    buttons = [
        page.get_by_role("button", name=name, exact=True) for name in ("+ Restraint", "+ Step in section")
    ]
    buttons.append(page.get_by_role("button", name="+ Foundation", exact=True))
    title = page.get_by_label("Case title")
    expect(title).to_be_visible()
    column = title.bounding_box()
    for button in buttons:
        expect(button).to_be_visible()
        assert _uncovered(page, button)
        box = button.bounding_box()
        assert box["x"] >= column["x"] - 8 and box["x"] + box["width"] <= column["x"] + 300, box
    buttons[2].click()
    field = page.get_by_label("modulus k [kN/m²]", exact=True)
    expect(field).to_be_visible()
    assert _scrolled_sideways(page) == []
    label = page.get_by_text("Case title", exact=True)
    assert label.bounding_box()["x"] >= column["x"] - 1  # the label's first letter is not cut
    assert _uncovered(page, label)
