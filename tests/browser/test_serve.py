"""`strutscope serve`: the real console command serves a case, refuses a bad one and stops on Ctrl+C."""

import json
import re
import subprocess
import urllib.request

import pytest

import app.cli
import app.serve
from tests.browser.conftest import REPO_ROOT, Server, serve_command


def test_serve_prints_its_url_serves_the_page_and_stops_cleanly(tmp_path):
    """The command prints the URL, answers on it with the page, and exits with 0 on Ctrl+C."""
    case = tmp_path / "invented.json"
    case.write_text(
        json.dumps(
            {
                "length": 3.0,
                "EI": 1.0e6,
                "supports": {"left": "pinned", "right": "pinned"},
                "title": "Invented served case",
            }
        ),
        encoding="utf-8",
    )
    server = Server(str(case), cwd=tmp_path)
    assert str(case) in "".join(server.output)
    with urllib.request.urlopen(server.url, timeout=60) as response:
        assert response.status == 200
        page = response.read().decode("utf-8")
    assert "strutscope" in page
    assert re.search(r"https?://(?!127\.0\.0\.1|localhost)", page.split("<body")[0]) is None  # no CDN links
    assert server.stop() == 0
    assert "strutscope: stopped" in "".join(server.output)
    assert "Traceback" not in "".join(server.output)


def test_serve_refuses_an_invalid_case_with_the_engines_message(tmp_path):
    """A case with a load beyond the member exits with 2 and the engine's message, no traceback."""
    case = tmp_path / "bad.json"
    case.write_text(
        json.dumps(
            {
                "length": 3.0,
                "EI": 1.0e6,
                "supports": {"left": "pinned", "right": "pinned"},
                "loads": [{"type": "point", "P": 1.0, "x": 4.0}],
            }
        ),
        encoding="utf-8",
    )
    done = subprocess.run(
        [*serve_command(), "serve", str(case), "--no-browser", "--port", "0"],
        cwd=tmp_path,
        capture_output=True,
        text=True,
        timeout=120,
        env={
            "PYTHONPATH": str(REPO_ROOT),
            "PATH": "/usr/bin:/bin:/usr/local/bin",
            "PYTHONIOENCODING": "utf-8",
        },
    )
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {case}: loads[0].x: 4.0 m lies outside the member")
    assert "Traceback" not in done.stderr


def test_serving_beyond_this_computer_prints_a_warning(tmp_path):
    """--host with an address other than loopback prints a warning before serving."""
    server = Server("--host", "0.0.0.0", cwd=tmp_path)
    try:
        assert any(line.startswith("warning: serving on 0.0.0.0") for line in server.output)
    finally:
        assert server.stop() == 0


def test_bare_command_serves_the_demo(monkeypatch):
    """A bare `strutscope` runs `serve` with its defaults: the demo case, 127.0.0.1, a browser."""
    calls = []
    monkeypatch.setattr(app.serve, "serve", lambda *args, **kwargs: calls.append((args, kwargs)) or 0)
    assert app.cli.main([]) == 0
    assert calls == [((None,), {"port": app.serve.DEFAULT_PORT, "open_browser": True, "host": "127.0.0.1"})]


@pytest.mark.parametrize("port", ["-1", "70000", "eighty"])
def test_bad_port_is_a_usage_error(port, capsys):
    """A port outside 0–65535 or not a number is refused by the command line with exit code 2."""
    assert app.cli.main(["serve", "--port", port]) == 2
    assert "--port" in capsys.readouterr().err
