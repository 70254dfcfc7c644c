"""Numbers typed into the served page as a new user types them (a new-user audit): a decimal comma, an emptied
field, and the last good axial force typed again after an absurd one.

Before the fix Chromium's number box dropped the comma as it was typed ("6,5" became a 65 m span, solved
without a word), an emptied span read "Span L: None is not a number …" and showed "NaN" once left, and with
load cases an axial force of 1e30 kN stayed refused (in N: "8.163265306122448e+32 N") after the last good
294 kN was typed again. Each message is checked as a person sees it: visible, and not covered.
"""

from __future__ import annotations

import dataclasses
import re

import pytest
from playwright.sync_api import expect

import engine
from tests.browser.conftest import Server, open_page
from tests.browser.test_page_in_browser import _uncovered, demo_case, value_cell, wait_for_number

pytestmark = pytest.mark.browser


def messages(page, words: str):
    """The shown messages holding `words`: the pane beside the field and the stale banner above the plots."""
    return page.locator(".ss-error").filter(has_text=words)


def expect_read(page, words: str) -> None:
    """Every message holding `words` is visible and not covered, beside its field and in the banner."""
    shown = messages(page, words)
    expect(shown.first).to_be_visible()
    expect(page.locator(".ss-stale-banner").filter(has_text=words)).to_be_visible()
    for i in range(shown.count()):
        assert _uncovered(page, shown.nth(i)), shown.nth(i).inner_text()


def test_a_decimal_comma_is_refused_in_words_and_never_read_as_65(app):
    """'6,5' typed key by key into the span: refused with the field, the text and a point asked for; the
    last good result (6 m) stays; '6.5' is then taken as 6.5 m."""
    page = app.page
    span = page.get_by_label("Span L [m]", exact=True)
    pcr1 = value_cell(page, "Pcr1")
    before = pcr1.inner_text()
    span.click()
    span.press("Control+a")
    span.press_sequentially("6,5")
    span.press("Enter")
    expect_read(
        page, "Span L: '6,5' is not a number; use a point for decimals (6.5); enter a number >= 0.001"
    )
    expect(span).to_have_value("6,5")  # the input is kept as typed
    expect(page.get_by_text("Exports are disabled until Span L is accepted")).to_be_visible()
    assert pcr1.inner_text() == before  # still the 6 m member, not a 65 m one
    span.fill("6.5")
    span.press("Enter")
    expect(messages(page, "'6,5'")).to_have_count(0)
    longer = dataclasses.replace(demo_case(), length=6.5)
    expected = engine.critical_loads(longer, count=1).critical_loads[0] * 1e-3
    wait_for_number(page, pcr1, expected, rel=5e-4)
    assert app.errors == []


def test_an_emptied_field_says_it_is_empty_and_keeps_the_last_result(app):
    """The span emptied: "Span L is empty; enter a number >= 0.001 and <= 1000 m", the field stays empty
    (never "NaN") once left, the last result stays marked stale; a number then clears it."""
    page = app.page
    span = page.get_by_label("Span L [m]", exact=True)
    pcr1 = value_cell(page, "Pcr1")
    before = pcr1.inner_text()
    span.fill("")
    span.press("Enter")
    expect_read(page, "Span L is empty; enter a number >= 0.001 and <= 1000 m")
    span.press("Tab")
    expect(span).to_have_value("")
    expect(page.locator(".ss-error").filter(has_text=re.compile(r"\bNone\b"))).to_have_count(0)
    assert pcr1.inner_text() == before
    span.fill("6")
    span.press("Enter")
    expect(messages(page, "Span L is empty")).to_have_count(0)
    expect(page.locator(".ss-stale-banner")).to_have_count(0)
    assert app.errors == []


@pytest.fixture(scope="module")
def start_server(tmp_path_factory):
    """The real `strutscope serve` with no case named: the start demo with load cases G and W."""
    running = Server(cwd=tmp_path_factory.mktemp("serve_start_typed"))
    yield running
    running.stop()


def test_the_last_good_force_typed_again_withdraws_a_refused_one(context, start_server):
    """With load cases, N = 1e30 kN is refused in kN (the field's unit, the engine's bounds); typing the last
    good 294 kN again takes the refusal away and the exports come back."""
    watched = open_page(context, start_server.url)
    page = watched.page
    entry = page.get_by_label("N [kN]", exact=True)
    expect(entry).to_have_value("294")
    entry.fill("1e30")
    entry.press("Enter")
    expect_read(page, "Axial force N: 1.000e+30 kN must be between -1.000e+09 kN and 1.000e+09 kN")
    newtons = page.locator(".ss-error").filter(has_text=re.compile(r"\d N (must|between)"))
    expect(newtons).to_have_count(0)  # never the engine's newtons
    entry.fill("294")
    entry.press("Enter")
    expect(messages(page, "1.000e+30 kN")).to_have_count(0)
    expect(page.locator(".ss-stale-banner")).to_have_count(0)
    expect(page.get_by_text("Exports are disabled")).to_have_count(0)
    assert watched.errors == []
