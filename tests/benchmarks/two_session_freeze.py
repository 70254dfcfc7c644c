"""One heavy case must not freeze another session: slider-step latency of session A, idle and while B loads.

Run: ``python3 -m tests.benchmarks.two_session_freeze [--loads 50] [--steps 30] [--seconds 25]``

Session A (a Chromium page on the invented demo case) steps its axial-force slider with the keyboard; each
step is timed in the page from the slider's change to the new plot data (as ``page_latency`` does). First
``--steps`` steps with nothing else going on (idle), then the same while session B uploads a case with
``--loads`` point loads (invented; default the case limit of 50; 300 took 110 s to show before issue 11 and
froze every other session meanwhile) and a plain HTTP GET opens the same case as a ``?case=`` link, for
``--seconds``. The script
prints both medians, the 95th percentiles, the largest step, the ratio of the medians (target ≤ 2), how long
the ``?case=`` GET took, and what session B showed at the end (its result, or the budget's message).

This is a measurement, not a test: it prints the figures and asserts nothing.
"""

from __future__ import annotations

import argparse
import json
import statistics
import sys
import tempfile
import threading
import time
import urllib.parse
import urllib.request
from importlib import resources
from pathlib import Path

REPO_ROOT = Path(__file__).resolve().parents[2]
if str(REPO_ROOT) not in sys.path:
    sys.path.insert(0, str(REPO_ROOT))

from tests.benchmarks.page_latency import _PROBE, summary  # noqa: E402
from tests.browser.conftest import CHROMIUM, CHROMIUM_ARGS, PLAIN_DEMO, VIEWPORT, Server  # noqa: E402

_WAIT_MS = 120_000


def heavy_case(loads: int) -> dict:
    """The invented demo case with `loads` point loads spread along the member (invented)."""
    mapping = json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))
    mapping["title"] = f"Invented heavy case, {loads} point loads"
    length = mapping["length"]
    mapping["loads"] = [
        {"type": "point", "P": 1.0e3 + i, "x": length * (i + 0.5) / loads} for i in range(loads)
    ]
    return mapping


def open_observer(browser, url: str):
    """Session A: the page open, the probe installed, the slider handle focused."""
    context = browser.new_context(viewport=VIEWPORT)
    page = context.new_page()
    page.set_default_timeout(_WAIT_MS)
    page.goto(url, wait_until="domcontentloaded")
    page.locator("table.ss-values").wait_for(state="visible")
    page.evaluate(_PROBE, "stations")
    page.locator(".noUi-handle").first.focus()
    return context, page


def step(page, key: str) -> None:
    """One keyboard step, waiting until its plot data arrive."""
    count = page.evaluate("window.__probe.count")
    page.keyboard.press(key)
    page.wait_for_function(f"window.__probe.count > {count}", timeout=_WAIT_MS)


def steps(page, count: int, start_key: str = "ArrowRight") -> list[float]:
    """Latencies [ms] of `count` steps, alternating direction so the force stays in range."""
    before = len(page.evaluate("window.__probe.latencies"))
    for i in range(count):
        step(page, start_key if (i // 10) % 2 == 0 else "ArrowLeft")
    return page.evaluate("window.__probe.latencies")[before:]


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--loads", type=int, default=50, help="point loads of the heavy case (default 50)")
    parser.add_argument("--steps", type=int, default=30, help="idle steps of session A (default 30)")
    parser.add_argument("--seconds", type=float, default=25.0, help="steps while B loads (default 25 s)")
    parser.add_argument("--json", metavar="PATH", help="also write the figures as JSON")
    parser.add_argument("--log", action="store_true", help="print the server's log at the end")
    args = parser.parse_args(argv)

    from playwright.sync_api import sync_playwright

    mapping = heavy_case(args.loads)
    with tempfile.TemporaryDirectory() as folder:
        path = Path(folder) / "heavy.json"
        path.write_text(json.dumps(mapping), encoding="utf-8")
        server = Server(str(PLAIN_DEMO), cwd=folder)  # the plain demo: figures comparable with before
        get_seconds: list[float] = []
        try:
            with sync_playwright() as playwright:
                browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
                observer_context, observer = open_observer(browser, server.url)
                steps(observer, 5)  # warm-up
                idle = steps(observer, args.steps)

                heavy_context = browser.new_context(viewport=VIEWPORT)
                heavy = heavy_context.new_page()
                heavy.set_default_timeout(_WAIT_MS)
                heavy.goto(server.url, wait_until="domcontentloaded")
                heavy.locator("table.ss-values").wait_for(state="visible")

                link = server.url + "?" + urllib.parse.urlencode({"case": json.dumps(mapping)})

                def fetch() -> None:
                    start = time.perf_counter()
                    with urllib.request.urlopen(link, timeout=600) as response:
                        response.read()
                    get_seconds.append(time.perf_counter() - start)

                getter = threading.Thread(target=fetch, daemon=True)
                heavy.locator("input[type=file]").set_input_files(path)
                getter.start()
                loaded: list[float] = []
                end = time.monotonic() + args.seconds
                while time.monotonic() < end:
                    loaded += steps(observer, 2)
                    if args.log:
                        print(f"{time.monotonic() - end + args.seconds:6.1f} s: {loaded[-2:]}", flush=True)
                getter.join(timeout=600)
                shown = heavy.locator(".ss-values, .ss-error").first.inner_text(timeout=_WAIT_MS)
                chart_note = heavy.locator(".ss-error").all_inner_texts()
                heavy_context.close()
                observer_context.close()
                browser.close()
        finally:
            server.stop()
            if args.log:
                print("".join(server.output))
    figures = {"idle": summary(idle), "loading": summary(loaded)}
    figures["idle"]["max_ms"] = max(idle)
    figures["loading"]["max_ms"] = max(loaded)
    figures["ratio_median"] = figures["loading"]["median_ms"] / figures["idle"]["median_ms"]
    figures["ratio_p95"] = figures["loading"]["p95_ms"] / figures["idle"]["p95_ms"]
    figures["case_link_get_s"] = get_seconds[0] if get_seconds else None
    figures["loads"] = args.loads
    print(f"session A's slider step to new plot data, while session B loads {args.loads} point loads:")
    for name in ("idle", "loading"):
        f = figures[name]
        print(
            f"  {name:<8} median {f['median_ms']:7.1f} ms   p95 {f['p95_ms']:7.1f} ms   "
            f"max {f['max_ms']:7.1f} ms   ({f['n']} steps)"
        )
    print(
        f"  ratio    median {figures['ratio_median']:7.2f}      p95 {figures['ratio_p95']:7.2f}"
        "      (target <= 2)"
    )
    got = figures["case_link_get_s"]
    print(f"GET of the ?case= link with the same case: {got:.2f} s" if got is not None else "GET unfinished")
    print(
        "session B shows:",
        " | ".join(text.strip().replace("\n", " ")[:160] for text in chart_note)
        or shown.strip().replace("\n", " ")[:160],
    )
    print(f"means: idle steps {statistics.mean(idle):.1f} ms; while loading {statistics.mean(loaded):.1f} ms")
    if args.json:
        Path(args.json).write_text(json.dumps(figures, indent=2) + "\n", encoding="utf-8")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
