"""Make ``assets/screenshot.png``: the member explorer on its start demo at 1280×720.

Run: ``python3 -m tests.benchmarks.screenshot [--out assets/screenshot.png]``

Serves the page with the real ``strutscope serve`` command on its start demo (the invented wind post with a
permanent and a wind load case, issue 17), waits for the governing combinations, picks "envelope" so the band
of every combination shows on the diagrams, and saves the viewport as PNG. It waits on visible text and data,
never on fixed sleeps.
"""

from __future__ import annotations

import argparse
import sys
import tempfile
from pathlib import Path

REPO_ROOT = Path(__file__).resolve().parents[2]
if str(REPO_ROOT) not in sys.path:
    sys.path.insert(0, str(REPO_ROOT))

from tests.browser.conftest import CHROMIUM, CHROMIUM_ARGS, VIEWPORT, Server  # noqa: E402


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument(
        "--out", default=str(REPO_ROOT / "assets" / "screenshot.png"), help="the PNG to write"
    )
    args = parser.parse_args(argv)
    from playwright.sync_api import expect, sync_playwright

    with tempfile.TemporaryDirectory() as folder:
        server = Server(cwd=folder)
        try:
            with sync_playwright() as playwright:
                browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
                page = browser.new_page(viewport=VIEWPORT)
                page.set_default_timeout(60_000)
                page.goto(server.url, wait_until="domcontentloaded")
                page.locator("table.ss-values").wait_for(state="visible")
                expect(page.locator(".ss-governing")).to_contain_text("strength and stability (headline)")
                page.get_by_label("Combination shown").select_option(label="envelope (every combination)")
                page.wait_for_function(
                    "() => { const m = Bokeh.documents[0].get_model_by_name('envelope_M');"
                    " return m && m.data.x.length > 0; }"
                )
                expect(page.locator(".ss-scale-mode")).to_contain_text("Envelope: the shaded band")
                # The capacity is solved apart (a worker process); the shot waits until the table shows it.
                capacity = page.locator("table.ss-values tr").filter(has_text="capacity N")
                expect(capacity).to_contain_text("kN")
                page.mouse.move(VIEWPORT["width"] - 5, VIEWPORT["height"] - 5)  # no hover readout in the shot
                page.screenshot(path=args.out)
                browser.close()
        finally:
            server.stop()
    print(f"wrote {args.out}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
