"""The bare start page in the browser (issue 17): `strutscope serve` with no case opens the invented wind post
with a permanent (G) and a wind (W) load case, names the governing combinations and shows the values of the
closed-form check in tests/app/wind_post_reference.py (Timoshenko & Gere beam-column, EN 1990 factors; sources
named there). The tests of plain-case behaviour serve the plain demo explicitly (conftest `server`)."""

import re

import pytest
from playwright.sync_api import expect

from tests.app import wind_post_reference as ref
from tests.browser.conftest import Server
from tests.browser.test_page_in_browser import _uncovered, tab

pytestmark = pytest.mark.browser


@pytest.fixture(scope="module")
def server(tmp_path_factory):
    """The real `strutscope serve` with no case named: the start demo."""
    running = Server(cwd=tmp_path_factory.mktemp("serve_start"))
    yield running
    running.stop()


def test_the_server_says_it_opens_the_demo_with_load_cases(server):
    assert any("demo_wind_post_actions.json (invented demo)" in line for line in server.output), server.output


def test_the_start_page_names_the_governing_combinations_with_the_closed_form_values(app):
    """Strength and stability from U2 = 1.35 G + 1.5 W, deflection from S2 = G + W; N 294 kN; max|M| and the
    deflection check as the closed forms give them; the picker and the load cases G and W in view."""
    page = app.page
    block = page.locator(".ss-governing")
    expect(block).to_contain_text("strength and stability (headline)")
    headline = block.locator("tr").filter(has_text="strength and stability (headline)")
    expect(headline).to_contain_text("U2")
    deflection = block.locator("tr").filter(has_text="deflection (service)")
    service = ref.max_deflection(ref.combined(1.0, 1.0)) / (ref.L / 250)  # 0.130
    expect(deflection).to_contain_text(re.compile(rf"S2\s*{service:.3f}"))
    moment = ref.max_moment(ref.combined(1.35, 1.5)) / 1e3  # 22.89 kN·m
    expect(page.locator("table.ss-values")).to_contain_text(f"{moment:.2f} kN·m")
    assert _uncovered(page, headline)
    expect(page.get_by_label("Combination shown")).to_be_visible()
    expect(page.get_by_label("N [kN]", exact=True)).to_have_value("294")  # 1.35 x 240 − 1.5 x 20 kN
    tab(page, "Loads")
    names = page.locator(".ss-load-case input[placeholder='name']")
    expect(names.first).to_have_value("G")
    expect(names.nth(1)).to_have_value("W")
    assert app.errors == []
