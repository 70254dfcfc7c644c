"""The member sketch in a real browser: drawn from app.sketch's shapes at the size the browser reports."""

import time

import pytest
from playwright.sync_api import expect

from app.page.sketch_view import SKETCH_INCH
from tests.browser.conftest import TIMEOUT_MS

pytestmark = pytest.mark.browser


def _sketch(page) -> dict:
    """The sketch figure's reported frame, the shared x range, and the sketch's axial arrows and texts."""
    return page.evaluate("""() => {
        const doc = Bokeh.documents[0];
        const fig = doc.get_model_by_name('sketch');
        const arrows = doc.get_model_by_name('sketch_axial_arrows').data;
        const text = doc.get_model_by_name('sketch_text').data;
        return {width: fig.inner_width, start: fig.x_range.start, end: fig.x_range.end,
                x0: Array.from(arrows.x0), x1: Array.from(arrows.x1), text: Array.from(text.text)};
    }""")


def _wait_for_scaled_arrows(page, width_not: float | None = None) -> dict:
    """Poll until the axial arrows span 0.42 sketch inches of the reported frame (of a new width if given)."""
    deadline = time.monotonic() + TIMEOUT_MS / 1000
    while True:
        s = _sketch(page)
        if s["width"] and s["x0"] and s["width"] != width_not:
            px = abs(s["x1"][0] - s["x0"][0]) / (s["end"] - s["start"]) * s["width"]
            if px == pytest.approx(0.42 * SKETCH_INCH, abs=0.3):
                return s
        if time.monotonic() > deadline:
            pytest.fail(f"the axial arrow never spanned 0.42 sketch inches of the reported frame: {s}")
        page.wait_for_timeout(100)  # a poll of the drawn data, not a fixed wait for it


def test_sketch_scales_its_offsets_with_the_reported_frame(app):
    """The axial arrows span 0.42 sketch inches of the frame the browser reports, also after a resize."""
    page = app.page
    expect(page.locator(".bk-Figure canvas").first).to_be_visible()
    s = _wait_for_scaled_arrows(page)
    assert s["text"].count("pinned") == 2  # the demo's two support labels, as in the PNG
    assert any(text.startswith("F = 4.000 kN") for text in s["text"])
    page.set_viewport_size({"width": 1600, "height": 720})  # a wider frame: the sketch must be redrawn
    wider = _wait_for_scaled_arrows(page, width_not=s["width"])
    assert wider["width"] > s["width"]
    assert not app.errors
