"""Load: several browser sessions against one real server, each on its own case, stepping the axial force.

Each session's plotted stations must equal ``engine.solve`` of that session's own inputs after every step (no
cross-talk between sessions), and every step must complete (issue 6, "Load"). CI runs 5 sessions × 10 steps
(``STRUTSCOPE_LOAD_SESSIONS`` and ``STRUTSCOPE_LOAD_STEPS`` change that); the reliability report runs 20 × 50
and prints the step latencies. Speed is never asserted here.
"""

from __future__ import annotations

import dataclasses
import json
import os
import time
from importlib import resources

import numpy as np
import pytest

import engine
from tests.browser.conftest import PLAIN_DEMO, TIMEOUT_MS, VIEWPORT, Server, open_page

# Installed once per page: stamps the time of every key press and of every new stations data set.
_PROBE = """() => {
    const doc = Bokeh.documents[0];
    const source = doc.get_model_by_name('stations');
    window.ssProbe = {pressed: 0, drawn: 0, count: 0};
    document.addEventListener('keydown', () => { window.ssProbe.pressed = performance.now(); }, true);
    source.connect(source.properties.data.change, () => {
        window.ssProbe.drawn = performance.now();
        window.ssProbe.count += 1;
    });
}"""

_STATE = """() => {
    const source = Bokeh.documents[0].get_model_by_name('stations');
    return {x: Array.from(source.data.x), M2: Array.from(source.data.M2), force: source.tags[0],
            count: window.ssProbe.count, latency: window.ssProbe.drawn - window.ssProbe.pressed};
}"""


def demo_mapping() -> dict:
    """The invented demo case the server opens, as a mapping."""
    return json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))


def span_of(index: int) -> float:
    """Session `index`'s own span [m] (invented): 4.0, 4.25, 4.5, …"""
    return 4.0 + 0.25 * index


@dataclasses.dataclass
class Session:
    """One browser context on the server with its own span."""

    context: object
    page: object
    case: engine.Case
    count: int = 0


def open_sessions(browser, url: str, count: int) -> list[Session]:
    """Open `count` contexts, set each one's span and wait until each shows its own solution."""
    sessions = []
    base = demo_mapping()
    for index in range(count):
        context = browser.new_context(viewport=VIEWPORT)
        context.set_default_timeout(TIMEOUT_MS)
        page = open_page(context, url).page
        page.evaluate(_PROBE)
        field = page.get_by_label("Span L [m]", exact=True)
        field.fill(str(span_of(index)))
        field.press("Enter")
        sessions.append(Session(context, page, engine.Case.from_dict({**base, "length": span_of(index)})))
    for session in sessions:
        session.page.wait_for_function(
            "L => Math.max(...Bokeh.documents[0].get_model_by_name('stations').data.x) === L",
            arg=session.case.length,
        )
        session.count = session.page.evaluate("() => window.ssProbe.count")
        session.page.locator(".noUi-handle").first.focus()
    return sessions


def check_shown(session: Session, stations: int = 401) -> float:
    """Check the plotted stations against engine.solve of this session's inputs; return the latency."""
    shown = session.page.evaluate(_STATE)
    expected = engine.solve(dataclasses.replace(session.case, axial_force=shown["force"]), stations=stations)
    np.testing.assert_allclose(shown["x"], expected.x, rtol=1e-12, atol=1e-12)
    np.testing.assert_allclose(shown["M2"], expected.moment * 1e-3, rtol=1e-9, atol=1e-9)
    return shown["latency"]


def step_all(sessions: list[Session], steps: int) -> list[float]:
    """Press ArrowRight in every session at once, `steps` times; check each step; return latencies [ms]."""
    latencies = []
    for _ in range(steps):
        for session in sessions:
            # Press on the handle itself (it takes the focus first): a late first result rescales the slider,
            # and a re-rendered handle loses the keyboard focus it was given when the sessions were opened.
            session.page.locator(".noUi-handle").first.press("ArrowRight")
        for session in sessions:
            session.count += 1
            session.page.wait_for_function("n => window.ssProbe.count >= n", arg=session.count)
            latencies.append(check_shown(session))
    return latencies


def close_sessions(sessions: list[Session]) -> None:
    """Close every context (and so its server session)."""
    for session in sessions:
        session.context.close()


@pytest.fixture(scope="module")
def browser():
    """Debian's Chromium driven by Playwright (the browser tests' own fixture)."""
    from tests.browser import conftest

    yield from conftest.browser.__wrapped__()


@pytest.mark.slow
@pytest.mark.browser
def test_concurrent_sessions_each_see_their_own_case_at_every_step(browser, tmp_path):
    """N sessions on one server, each its own span, stepping N together: every step shows its own solution."""
    count = int(os.environ.get("STRUTSCOPE_LOAD_SESSIONS", "5"))
    steps = int(os.environ.get("STRUTSCOPE_LOAD_STEPS", "10"))
    server = Server(str(PLAIN_DEMO), cwd=tmp_path)  # each session checked against the plain demo's case
    sessions = []
    try:
        sessions = open_sessions(browser, server.url, count)
        started = time.perf_counter()
        latencies = step_all(sessions, steps)
        assert len(latencies) == count * steps  # every step of every session completed and was checked
        start = demo_mapping()["axial_force"]
        assert all(s.page.evaluate(_STATE)["force"] > start for s in sessions)  # every one stepped N up
        assert server.process.poll() is None, "".join(server.output)
        print(f"{count} sessions x {steps} steps in {time.perf_counter() - started:.1f} s")
    finally:
        close_sessions(sessions)
        server.stop()
