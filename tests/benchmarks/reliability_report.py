"""Reliability report: concurrent sessions under load, and the server's memory over many sessions.

Run from the repository root:
``python3 -m tests.benchmarks.reliability_report [--sessions 20] [--steps 50] [--churn 200]``.
It starts the real ``strutscope serve`` (with STRUTSCOPE_DEBUG_SESSIONS set, so the server logs how many
pages are still alive), drives Debian's Chromium through Playwright and prints:

- load: SESSIONS browser contexts, each with its own span, stepping the axial force STEPS times together;
  every step is checked against ``engine.solve`` for that session's inputs, and the step latency (key press
  to new plot data, in the browser's own clock) is reported as median and p95;
- memory: CHURN sessions opened and closed, the server's resident memory (VmRSS) after the first 20 and after
  all of them, and the number of pages still alive once the server has dropped the closed sessions.
"""

from __future__ import annotations

import argparse
import os
import re
import statistics
import tempfile
import time

from tests.browser.conftest import CHROMIUM, CHROMIUM_ARGS, TIMEOUT_MS, VIEWPORT, Server, open_page
from tests.reliability.test_load import close_sessions, open_sessions, step_all

_ALIVE = re.compile(r"strutscope-debug: session (opened|closed); pages alive (\d+)")


def rss_mb(pid: int) -> float:
    """Resident memory of process `pid` [MB], from /proc/<pid>/status."""
    with open(f"/proc/{pid}/status", encoding="ascii") as status:
        for line in status:
            if line.startswith("VmRSS:"):
                return int(line.split()[1]) / 1024
    raise RuntimeError("no VmRSS line")


def debug_counts(server: Server) -> tuple[int, int, int | None]:
    """(sessions opened, sessions closed, pages alive at the last log line) from the server's log."""
    opened = closed = 0
    alive = None
    for line in list(server.output):
        match = _ALIVE.search(line)
        if match:
            opened += match.group(1) == "opened"
            closed += match.group(1) == "closed"
            alive = int(match.group(2))
    return opened, closed, alive


def percentile(values: list[float], share: float) -> float:
    """The `share` quantile of `values` (nearest rank)."""
    ordered = sorted(values)
    return ordered[min(len(ordered) - 1, max(0, round(share * len(ordered)) - 1))]


def open_and_close(browser, url: str, count: int) -> None:
    """Open `count` sessions (each its own browser context, drawn), then close them all."""
    contexts = []
    for _ in range(count):
        context = browser.new_context(viewport=VIEWPORT)
        context.set_default_timeout(TIMEOUT_MS)
        contexts.append(context)
        open_page(context, url)
    for context in contexts:
        context.close()


def churn(browser, url: str, total: int, batch: int, server: Server) -> dict:
    """Open and close `total` sessions, `batch` at a time; RSS after the first 20 and after all."""
    figures = {}
    done = 0
    while done < total:
        step = min(batch, total - done)
        open_and_close(browser, url, step)
        done += step
        if done == 20:
            figures["rss_after_20"] = rss_mb(server.process.pid)
    figures["rss_after_all"] = rss_mb(server.process.pid)
    return figures


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sessions", type=int, default=20)
    parser.add_argument("--steps", type=int, default=50)
    parser.add_argument("--churn", type=int, default=200)
    args = parser.parse_args()
    from playwright.sync_api import sync_playwright

    os.environ["STRUTSCOPE_DEBUG_SESSIONS"] = "1"
    with tempfile.TemporaryDirectory() as where, sync_playwright() as playwright:
        server = Server(cwd=where)
        browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
        try:
            rss_start = rss_mb(server.process.pid)
            sessions = open_sessions(browser, server.url, args.sessions)
            started = time.perf_counter()
            latencies = step_all(sessions, args.steps)
            elapsed = time.perf_counter() - started
            rss_loaded = rss_mb(server.process.pid)
            close_sessions(sessions)
            print(
                f"load: {args.sessions} concurrent sessions x {args.steps} steps of the axial force, "
                f"{len(latencies)} steps completed and checked against engine.solve (no cross-talk), "
                f"{elapsed:.1f} s"
            )
            median = statistics.median(latencies)
            print(
                f"  step latency (key press to new plot data): median {median:.0f} ms, "
                f"p95 {percentile(latencies, 0.95):.0f} ms, max {max(latencies):.0f} ms"
            )
            print(
                f"  server RSS: {rss_start:.0f} MB at start, {rss_loaded:.0f} MB with {args.sessions} "
                "sessions open"
            )
            figures = churn(browser, server.url, args.churn, 10, server)
            # Bokeh drops a closed session after its unused-session lifetime (about 15 s, checked every 17 s).
            deadline = time.monotonic() + 90
            while time.monotonic() < deadline:
                opened, closed, alive = debug_counts(server)
                if closed >= opened:
                    break
                time.sleep(1)  # polling the server's log, not waiting on the page
            opened, closed, alive = debug_counts(server)
            rss_final = rss_mb(server.process.pid)
            print(f"memory: {args.churn} sessions opened and closed, 10 at a time")
            print(
                f"  server RSS after the first 20: {figures['rss_after_20']:.0f} MB; after {args.churn}: "
                f"{figures['rss_after_all']:.0f} MB "
                f"({figures['rss_after_all'] - figures['rss_after_20']:+.0f} MB); "
                f"after the closed sessions were dropped: {rss_final:.0f} MB"
            )
            print(
                f"  sessions: {opened} opened, {closed} destroyed by the server; pages still alive after "
                f"gc: {alive}"
            )
        finally:
            browser.close()
            server.stop()


if __name__ == "__main__":
    main()
