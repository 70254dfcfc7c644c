"""Memory over many sessions, reduced for CI: sessions opened and closed are released by the server.

The full measurement (200 sessions, RSS after the first 20 and after all) is the reliability report,
``python3 -m tests.benchmarks.reliability_report``; this runs the same churn with fewer sessions in
``bash .ci/run``. The server logs its live pages (STRUTSCOPE_DEBUG_SESSIONS), the only way to see from
outside whether closed sessions' pages are released (no debug endpoint is served).
"""

from __future__ import annotations

import os
import time

import pytest

from tests.benchmarks.reliability_report import debug_counts, open_and_close, rss_mb
from tests.browser.conftest import Server

#: RSS growth allowed between the first 20 sessions and the end of the churn [MB] (project bound, no source).
RSS_BOUND_MB = 40.0


@pytest.fixture(scope="module")
def browser():
    """Debian's Chromium driven by Playwright (the browser tests' own fixture)."""
    from tests.browser import conftest

    yield from conftest.browser.__wrapped__()


@pytest.mark.slow
@pytest.mark.browser
def test_closed_sessions_are_released_and_memory_stays_bounded(browser, tmp_path, monkeypatch):
    total = int(os.environ.get("STRUTSCOPE_MEMORY_SESSIONS", "40"))
    monkeypatch.setenv("STRUTSCOPE_DEBUG_SESSIONS", "1")
    server = Server(cwd=tmp_path)
    try:
        # The first sessions fill the server's caches (imports, templates, the solver's tables): the bound is
        # on what comes after them, as in the report (first 20, then the rest).
        open_and_close(browser, server.url, 10)
        open_and_close(browser, server.url, 10)
        rss_first = rss_mb(server.process.pid)
        done = 20
        while done < total:
            step = min(10, total - done)
            open_and_close(browser, server.url, step)
            done += step
        # Bokeh drops a closed session after its unused-session lifetime (about 15 s, checked every 17 s).
        deadline = time.monotonic() + 120
        while time.monotonic() < deadline:
            opened, closed, alive = debug_counts(server)
            if opened >= total and closed >= opened:
                break
            time.sleep(1)  # polling the server's log
        opened, closed, alive = debug_counts(server)
        rss_last = rss_mb(server.process.pid)
        print(
            f"{opened} sessions opened, {closed} destroyed, pages alive {alive}; "
            f"RSS {rss_first:.0f} MB after 20, {rss_last:.0f} MB after {total}"
        )
        assert opened >= total
        assert closed == opened, "".join(server.output[-20:])
        assert alive is not None and alive <= 2, f"{alive} pages still alive after every session closed"
        assert rss_last <= rss_first + RSS_BOUND_MB, (rss_first, rss_last)
        assert server.process.poll() is None
    finally:
        server.stop()
