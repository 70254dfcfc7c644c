"""Latency of the member explorer's axial-force slider, against a minimal Panel page measured the same way.

Run: ``python3 -m tests.benchmarks.page_latency [--steps 40] [--rounds 2]``

In the browser (Debian's Chromium through Playwright), each keyboard step of the slider is stamped with
``performance.now()`` when the slider's value changes in the page, and again when the new plot data arrive
(a listener on the data source's ``data`` property). The difference is the step-to-data latency: the round
trip to the server, the solve and the update, and the message back. The same is measured on a minimal Panel
page (one slider, one line of 401 points), served in the same run, which is the framework's own floor;
rounds alternate between the two pages. The first steps of every round are warm-up and left out.

Server side, the script also times one slider step in process (the solve plus every source and pane update,
with the page attached to a Bokeh document so the changes are recorded as they would be for a session).

This is a measurement, not a test: it prints the figures and asserts nothing.
"""

from __future__ import annotations

import argparse
import json
import statistics
import sys
import time
from pathlib import Path

REPO_ROOT = Path(__file__).resolve().parents[2]
if str(REPO_ROOT) not in sys.path:
    sys.path.insert(0, str(REPO_ROOT))

from tests.browser.conftest import CHROMIUM, CHROMIUM_ARGS, PLAIN_DEMO, VIEWPORT, Server  # noqa: E402

_WARM_UP = 3

_PROBE = """(sourceName) => {
    const doc = Bokeh.documents[0];
    const models = [...doc._all_models.values()];
    const source = doc.get_model_by_name(sourceName);
    const slider = models.find((m) => m.type.endsWith('Slider'));
    window.__probe = {count: 0, t0: null, latencies: []};
    slider.connect(slider.properties.value.change, () => { window.__probe.t0 = performance.now(); });
    source.connect(source.properties.data.change, () => {
        const p = window.__probe;
        if (p.t0 !== null) { p.latencies.push(performance.now() - p.t0); p.t0 = null; }
        p.count += 1;
    });
}"""


def minimal_page():
    """One slider and one line: the smallest page that does what a slider step on strutscope does."""
    import numpy as np
    import panel as pn
    from bokeh.models import ColumnDataSource
    from bokeh.plotting import figure

    x = np.linspace(0.0, 1.0, 401)
    source = ColumnDataSource(data={"x": x, "y": np.zeros_like(x)}, name="line")
    fig = figure(height=300, sizing_mode="stretch_width")
    fig.line("x", "y", source=source)
    slider = pn.widgets.FloatSlider(
        label="value", start=-3300.0, end=4100.0, step=10.0, value=350.0, sizing_mode="stretch_width"
    )

    def moved(event):
        source.data = {"x": x, "y": np.sin(x * event.new / 1000.0)}

    slider.param.watch(moved, "value")
    return pn.Column(slider, pn.pane.Bokeh(fig, sizing_mode="stretch_width"), sizing_mode="stretch_width")


def measure(browser, url: str, source_name: str, steps: int) -> list[float]:
    """Latencies [ms] of `steps` keyboard steps of the first slider on the page at `url`."""
    context = browser.new_context(viewport=VIEWPORT)
    page = context.new_page()
    page.set_default_timeout(60_000)
    page.goto(url, wait_until="domcontentloaded")
    page.locator(".noUi-handle").first.wait_for(state="visible")
    page.wait_for_function(
        f"() => window.Bokeh && Bokeh.documents.length && "
        f"Bokeh.documents[0].get_model_by_name('{source_name}') !== null"
    )
    page.evaluate(_PROBE, source_name)
    page.locator(".noUi-handle").first.focus()
    for _ in range(steps):
        count = page.evaluate("window.__probe.count")
        page.keyboard.press("ArrowRight")
        page.wait_for_function(f"window.__probe.count > {count}")
    latencies = page.evaluate("window.__probe.latencies")
    context.close()
    return latencies[_WARM_UP:]


def server_side(steps: int) -> list[float]:
    """Times [ms] of one slider step in process: solve plus every update, the page in a Bokeh document."""
    from bokeh.document import Document
    from panel.io.state import set_curdoc

    from app.page import MemberPage

    page = MemberPage()
    doc = Document()
    page.__panel__().get_root(doc)
    pcr1 = page.model.result.critical_loads[0] * 1e-3
    values = [350.0 + i * (0.9 * pcr1 - 350.0) / steps for i in range(steps)]
    times = []
    with set_curdoc(doc):
        for value in values:
            start = time.perf_counter()
            page.force.slide_to(value * 1e3)
            times.append((time.perf_counter() - start) * 1e3)
    return times[_WARM_UP:]


def summary(values: list[float]) -> dict:
    """Median and 95th percentile [ms]."""
    ordered = sorted(values)
    p95 = ordered[min(len(ordered) - 1, int(round(0.95 * (len(ordered) - 1))))]
    return {"n": len(values), "median_ms": statistics.median(values), "p95_ms": p95}


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--steps", type=int, default=40, help="slider steps per round (default 40)")
    parser.add_argument("--rounds", type=int, default=2, help="rounds per page, alternating (default 2)")
    parser.add_argument("--json", metavar="PATH", help="also write the figures as JSON")
    args = parser.parse_args(argv)

    import tempfile

    import panel as pn
    from playwright.sync_api import sync_playwright

    from app.serve import _free_port

    port = _free_port("127.0.0.1")
    minimal = pn.serve(
        minimal_page,
        port=port,
        address="127.0.0.1",
        show=False,
        threaded=True,
        websocket_origin=[f"127.0.0.1:{port}"],
        verbose=False,
    )
    with tempfile.TemporaryDirectory() as folder:
        page_server = Server(str(PLAIN_DEMO), cwd=folder)  # the plain demo: figures comparable with before
        try:
            deadline = time.time() + 60
            while time.time() < deadline:  # the threaded minimal server binds asynchronously
                try:
                    import urllib.request

                    urllib.request.urlopen(f"http://127.0.0.1:{port}/", timeout=5).close()
                    break
                except OSError:
                    time.sleep(0.2)
            results = {"strutscope": [], "minimal": []}
            with sync_playwright() as playwright:
                browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
                for _ in range(args.rounds):
                    results["minimal"] += measure(browser, f"http://127.0.0.1:{port}/", "line", args.steps)
                    results["strutscope"] += measure(browser, page_server.url, "stations", args.steps)
                browser.close()
        finally:
            page_server.stop()
            minimal.stop()
    figures = {name: summary(values) for name, values in results.items()}
    figures["server_step"] = summary(server_side(200))
    page, floor = figures["strutscope"], figures["minimal"]
    figures["ratio_median"] = page["median_ms"] / floor["median_ms"]
    figures["ratio_p95"] = page["p95_ms"] / floor["p95_ms"]
    print("slider step to new plot data, in the browser (Chromium, localhost):")
    for name in ("strutscope", "minimal"):
        f = figures[name]
        print(f"  {name:<11} median {f['median_ms']:7.1f} ms   p95 {f['p95_ms']:7.1f} ms   ({f['n']} steps)")
    print(
        f"  ratio       median {figures['ratio_median']:7.2f}      p95 {figures['ratio_p95']:7.2f}"
        "      (target <= 1.5)"
    )
    f = figures["server_step"]
    print(
        f"server side, one step (solve + update): median {f['median_ms']:.2f} ms, p95 {f['p95_ms']:.2f} ms "
        "(target <= 15 ms)"
    )
    if args.json:
        Path(args.json).write_text(json.dumps(figures, indent=2) + "\n", encoding="utf-8")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
