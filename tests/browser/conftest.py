"""Fixtures for the browser tests: the real `strutscope serve` in a subprocess, and Debian's Chromium.

One server per test module; one browser per module; a fresh browser context (its own session) per test.
Every wait is on visible text or data, never a fixed sleep; every Playwright call has a generous timeout.
"""

import json
import os
import queue
import re
import shutil
import signal
import subprocess
import sys
import threading
from pathlib import Path

import pytest

REPO_ROOT = Path(__file__).resolve().parents[2]
CHROMIUM = "/usr/bin/chromium"
CHROMIUM_ARGS = [
    "--no-sandbox",
    "--disable-gpu",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--no-first-run",
]
TIMEOUT_MS = 45_000  # a generous limit for any one wait on the page


def use_suite_timeout() -> None:
    """Make Playwright's `expect` wait up to :data:`TIMEOUT_MS` too (its own default is 5 s).

    Locator actions take the context's default timeout (set in the `context` fixture), but `expect` has a
    separate one: a busy machine made `expect` calls fail after 5 s while everything else waited 45 s.
    Applied at import, so every module that imports this one (the reliability tests do) gets it.
    """
    from playwright.sync_api import expect

    expect.set_options(timeout=TIMEOUT_MS)


use_suite_timeout()
VIEWPORT = {"width": 1280, "height": 720}
#: The plain invented demo (no load cases), which the page opened at start until issue 17's demo switch. The
#: tests of plain-case behaviour (the loads table, the slider's N, downloads, the link, the layout) serve it
#: explicitly; the bare start page (the demo with load cases) has its own tests in test_start_page_in_browser.
PLAIN_DEMO = REPO_ROOT / "assets" / "demo_wind_post.json"
_URL = re.compile(r"at (http://127\.0\.0\.1:\d+/)")


def serve_command() -> list[str]:
    """The real console command when installed, else the same entry point through the interpreter."""
    executable = shutil.which("strutscope")
    if executable is None:
        if os.environ.get("CI"):
            pytest.fail("the strutscope console script is not installed (CI installs the package)")
        return [sys.executable, "-m", "app.cli"]
    return [executable]


class Server:
    """A running `strutscope serve` subprocess and the URL it printed."""

    def __init__(self, *args: str, cwd, command: tuple[str, ...] = ("serve", "--no-browser", "--port", "0")):
        env = dict(os.environ, PYTHONIOENCODING="utf-8", PYTHONUNBUFFERED="1")
        # The checkout under test goes first on the path, whatever copy of the package is installed.
        env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPO_ROOT), env.get("PYTHONPATH")]))
        self.process = subprocess.Popen(
            [*serve_command(), *command, *args],
            cwd=cwd,
            env=env,
            stdout=subprocess.PIPE,
            stderr=subprocess.STDOUT,
            text=True,
            encoding="utf-8",
        )
        self.lines: queue.Queue = queue.Queue()
        self.output: list[str] = []
        threading.Thread(target=self._read, daemon=True).start()
        try:
            self.url = self.wait_for(_URL).group(1)
        except BaseException:  # pytest.fail included: never leave a server running
            self.stop()
            raise

    def _read(self) -> None:
        for line in self.process.stdout:
            self.output.append(line)
            self.lines.put(line)
        self.lines.put(None)

    def wait_for(self, pattern: re.Pattern, timeout: float = 60.0) -> re.Match:
        """Wait for a line of output matching `pattern`; fail with the output so far if none comes."""
        while True:
            try:
                line = self.lines.get(timeout=timeout)
            except queue.Empty:
                pytest.fail(
                    f"no line matching {pattern.pattern!r} within {timeout} s:\n{''.join(self.output)}"
                )
            if line is None:
                pytest.fail(f"the server exited ({self.process.poll()}):\n{''.join(self.output)}")
            match = pattern.search(line)
            if match:
                return match

    def stop(self) -> int:
        """Stop the server as Ctrl+C would and return its exit code."""
        if self.process.poll() is None:
            self.process.send_signal(signal.SIGINT)
            try:
                self.process.wait(timeout=30)
            except subprocess.TimeoutExpired:
                self.process.kill()
                self.process.wait(timeout=10)
        return self.process.returncode


def serving(tmp_path_factory, case: dict, name: str):
    """`strutscope serve CASE` on `case` (an invented case mapping) written to a new folder `name`; for a test
    module's own ``server`` fixture (``yield from serving(...)``), stopped after the module."""
    folder = tmp_path_factory.mktemp(name)
    path = folder / "case.json"
    path.write_text(json.dumps(case), encoding="utf-8")
    running = Server(str(path), cwd=folder)
    yield running
    running.stop()


@pytest.fixture(scope="module")
def server(tmp_path_factory):
    """The real `strutscope serve` on the plain demo case (:data:`PLAIN_DEMO`), one per test module."""
    running = Server(str(PLAIN_DEMO), cwd=tmp_path_factory.mktemp("serve"))
    yield running
    running.stop()


@pytest.fixture(scope="module")
def browser():
    """Debian's Chromium driven by Playwright (never a browser that Playwright downloads)."""
    if not os.path.exists(CHROMIUM):
        if os.environ.get("CI"):
            pytest.fail(f"{CHROMIUM} is missing: CI installs it with apt-get install -y chromium")
        pytest.skip(f"{CHROMIUM} is not installed")
    from playwright.sync_api import sync_playwright

    with sync_playwright() as playwright:
        chromium = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
        yield chromium
        chromium.close()


class Watched:
    """A page with its console errors and every request it made."""

    def __init__(self, page) -> None:
        self.page = page
        self.errors: list[str] = []
        self.requests: list[str] = []
        page.on("console", lambda message: message.type == "error" and self.errors.append(message.text))
        page.on("pageerror", lambda error: self.errors.append(str(error)))
        page.on("request", lambda request: self.requests.append(request.url))


@pytest.fixture
def context(browser):
    """A fresh browser context (its own cookies, so its own server session) at 1280×720."""
    ctx = browser.new_context(viewport=VIEWPORT, accept_downloads=True)
    ctx.set_default_timeout(TIMEOUT_MS)
    yield ctx
    ctx.close()


def open_page(context, url: str) -> Watched:
    """Open `url` in `context` and wait until the governing values are shown."""
    watched = Watched(context.new_page())
    watched.page.goto(url, wait_until="domcontentloaded")
    watched.page.locator("table.ss-values").wait_for(state="visible")
    return watched


@pytest.fixture
def app(context, server) -> Watched:
    """The page on the `server` fixture's case (the plain demo unless a module serves another), drawn."""
    return open_page(context, server.url)
