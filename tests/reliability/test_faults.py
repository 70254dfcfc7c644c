"""Faults: the engine failing mid-session, broken uploads, and a server stopped and started again.

Rule 6 of the project (bad input keeps the last good result, a session never crashes, no input is lost) and
issue 6 ("Faults") are the requirements checked here.
"""

from __future__ import annotations

import json
import re
import urllib.parse
from importlib import resources

import numpy as np
import panel as pn
import pytest

import engine
from app.page import MemberPage


@pytest.fixture
def page():
    """A page on the invented demo case, without a server."""
    yield MemberPage()
    pn.state.reset()


def demo_bytes() -> bytes:
    """The invented demo case file."""
    return resources.files("assets").joinpath("demo_wind_post.json").read_bytes()


class Injected(RuntimeError):
    """The fault put into the engine by these tests."""


def test_an_engine_exception_during_an_update_keeps_the_session_and_the_last_result(page, monkeypatch):
    """engine.solve raising mid-session: the page says so, keeps the result and the input, then recovers."""
    good = page.model.result
    shown = {key: np.array(values) for key, values in page.stations.data.items()}

    def broken(*args, **kwargs):
        raise Injected("injected fault")

    monkeypatch.setattr(engine, "solve", broken)
    page.length_input.value = 7.0  # a full update
    assert page.model.result is good
    assert page.model.length == 7.0  # the input is kept as typed
    assert page.stale.visible and "injected fault" in page.stale.object
    assert "last good result" in page.stale.object
    for key, values in page.stations.data.items():
        np.testing.assert_array_equal(np.array(values), shown[key])
    page.model.axial_force = 400e3  # a slider step (the axial-force-only path)
    assert page.model.result is good and page.stale.visible
    monkeypatch.undo()
    page.length_input.value = 7.5
    assert not page.stale.visible and not page.model.errors
    expected = engine.solve(page.model.to_case(), stations=page.model.stations)
    assert page.model.result.case.length == 7.5
    np.testing.assert_allclose(page.stations.data["M2"], expected.moment * 1e-3, rtol=1e-12)


def test_an_engine_exception_in_the_chart_sweep_keeps_the_result(page, monkeypatch):
    """engine.sweep raising: the amplification chart is dropped, the solve and its values still show."""

    def broken(*args, **kwargs):
        raise Injected("injected sweep fault")

    monkeypatch.setattr(engine, "sweep", broken)
    page.length_input.value = 6.5
    assert page.model.result.case.length == 6.5 and not page.model.errors
    assert page.model.sweep is None


def upload(page, data: bytes, filename: str = "case.json") -> str:
    """Deliver `data` to the page's upload widget as the browser would; return the message shown."""
    page.upload.value = None
    page.upload.filename = filename
    page.upload.value = data
    return page.upload_message.object


@pytest.mark.parametrize("cut", [0, 1, 0.25, 0.5, 0.9, -2, -1])  # bytes kept: count, fraction or all but
def test_a_half_uploaded_case_file_is_refused_with_a_message(page, cut):
    """The demo case cut short anywhere is refused with the JSON error and the inputs stay as they were."""
    data = demo_bytes().rstrip()  # so that every cut below removes part of the JSON itself
    end = int(cut * len(data)) if isinstance(cut, float) else cut % len(data) if cut else 0
    before = page.model.case_mapping()
    message = upload(page, data[:end])
    assert "ss-error" in message and "upload: case.json" in message
    assert page.model.case_mapping() == before


@pytest.mark.parametrize(
    "data, words",
    [
        (b"\xff\xfe\x00garbage", "case"),
        (b"\xc3\x28\xa0\xa1{}", "cannot be decoded"),
        (b"[1, 2, 3]", "case"),
        (demo_bytes().replace(b"6.0", b"NaN", 1), "length"),
        (b'{"schema": 1, "length": 6, "length": 7}', "length"),
        (b'{"schema": 99}', "schema"),
        (b"\x00" * 512, "case"),
    ],
)
def test_a_corrupt_case_file_is_refused_with_a_message_naming_the_problem(page, data, words):
    """Bytes that are not a schema-1 case are refused with a message naming what is wrong; nothing changes."""
    good = page.model.result
    message = upload(page, data)
    assert "ss-error" in message and words in message
    assert page.model.result is good and not page.model.errors


# ------------------------------------------------------------------------------------------------ restart


@pytest.mark.browser
def test_a_restarted_server_reopens_the_case_from_the_url(browser, tmp_path):
    """A stopped server is reported on the page, and its URL reopens the same case on a restarted server."""
    from playwright.sync_api import expect

    from tests.browser.conftest import TIMEOUT_MS, VIEWPORT, Server, open_page

    first = Server(cwd=tmp_path)
    context = browser.new_context(viewport=VIEWPORT)
    context.set_default_timeout(TIMEOUT_MS)
    try:
        page = open_page(context, first.url).page
        field = page.get_by_label("Span L [m]", exact=True)
        field.fill("8.5")
        field.press("Enter")
        page.wait_for_url(re.compile(r"[?&]case=.*8\.5"))
        query = urllib.parse.urlparse(page.url).query
        assert json.loads(urllib.parse.parse_qs(query)["case"][0])["length"] == 8.5
        notice = page.locator(".notyf__message", has_text="lost its connection to the server")
        expect(notice).to_have_count(0)
        first.stop()
        # the page says that the server is gone (Panel's notification when the websocket closes)
        expect(page.locator(".notyf__message", has_text="lost its connection to the server")).to_be_visible()
        second = Server(cwd=tmp_path)
        try:
            again = open_page(context, f"{second.url}?{query}").page
            expect(again.get_by_label("Span L [m]", exact=True)).to_have_value(re.compile(r"^8\.50*$"))
            right_end = again.evaluate(
                "() => Math.max(...Bokeh.documents[0].get_model_by_name('stations').data.x)"
            )
            assert right_end == pytest.approx(8.5, rel=1e-12)
        finally:
            second.stop()
    finally:
        context.close()
        first.stop()


@pytest.fixture(scope="module")
def browser():
    """Debian's Chromium driven by Playwright (the browser tests' own fixture)."""
    from tests.browser import conftest

    yield from conftest.browser.__wrapped__()
