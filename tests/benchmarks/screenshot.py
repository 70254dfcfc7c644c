"""Make ``assets/screenshot.png``: the member explorer on the invented demo case at 1280×720.

Run: ``python3 -m tests.benchmarks.screenshot [--out assets/screenshot.png]``

Serves the page with the real ``strutscope serve`` command, keeps the demo case as a variant, raises the
axial force to 1500 kN (about 0.46·Pcr1) so the variant's muted curves show the amplification, and saves the
viewport as PNG. It waits on visible text, never on fixed sleeps.
"""

from __future__ import annotations

import argparse
import re
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
                page.get_by_role("button", name=re.compile("^Keep as variant")).click()
                expect(page.get_by_role("button", name="Keep as variant (1/4)")).to_be_visible()
                field = page.get_by_label("N [kN]", exact=True)
                field.fill("1500")
                field.press("Enter")
                expect(page.locator(".ss-readout b").first).to_have_text(re.compile(r"^1500(\.0+)? kN$"))
                expect(page.locator(".ss-key")).to_contain_text("A: N 350.0 kN")
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
