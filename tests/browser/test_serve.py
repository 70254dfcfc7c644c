"""`strutscope serve`: the real console command serves a case, refuses a bad one and stops on Ctrl+C."""

import json
import re
import subprocess
import urllib.request

import pytest

import app.cli
import app.serve
from tests.browser.conftest import REPO_ROOT, Server, serve_command


def run_serve(args: list[str], cwd) -> subprocess.CompletedProcess:
    """Run the real command with `args` until it exits (a refusal), with a plain environment."""
    return subprocess.run(
        [*serve_command(), *args],
        cwd=cwd,
        capture_output=True,
        text=True,
        timeout=120,
        env={
            "PYTHONPATH": str(REPO_ROOT),
            "PATH": "/usr/bin:/bin:/usr/local/bin",
            "PYTHONIOENCODING": "utf-8",
        },
    )


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
    done = run_serve(["serve", str(case), "--no-browser", "--port", "0"], tmp_path)
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
    """A bare `strutscope` runs `serve` with its defaults: the demo, default port, 127.0.0.1, a browser."""
    calls = []
    monkeypatch.setattr(app.serve, "serve", lambda *args, **kwargs: calls.append((args, kwargs)) or 0)
    assert app.cli.main([]) == 0
    assert calls == [_served()]


def _served(case=None, port=None, open_browser=True):
    """The call `strutscope serve` makes with these options (and the defaults of the others)."""
    return ((case,), {"port": port, "open_browser": open_browser, "host": "127.0.0.1"})


@pytest.mark.parametrize(
    ("argv", "expected"),
    [
        (["--no-browser"], _served(open_browser=False)),
        (["--port", "8123"], _served(port=8123)),
        (["--no-browser", "--port", "8123"], _served(port=8123, open_browser=False)),
        (["post.json", "--port", "0"], _served("post.json", port=0)),
    ],
)
def test_bare_command_takes_the_serve_options(monkeypatch, argv, expected):
    """`strutscope --no-browser`, `--port N` and `strutscope CASE.json` act as `strutscope serve ...` does."""
    calls = []
    monkeypatch.setattr(app.serve, "serve", lambda *args, **kwargs: calls.append((args, kwargs)) or 0)
    assert app.cli.main(argv) == 0
    assert calls == [expected]
    calls.clear()
    assert app.cli.main(["serve", *argv]) == 0
    assert calls == [expected]


def test_an_unknown_command_word_is_still_a_usage_error(capsys):
    """A misspelt command that is no file is refused by argparse, naming the commands, not taken as a case."""
    assert app.cli.main(["sovle", "--demo"]) == 2
    assert "invalid choice" in capsys.readouterr().err


def test_the_default_port_is_not_panels(monkeypatch):
    """The default port is strutscope's own, not Panel's 5006, so as not to collide with another Panel app."""
    assert app.serve.DEFAULT_PORT != 5006
    monkeypatch.setattr(app.serve, "_port_is_free", lambda host, port: True)
    assert app.serve.choose_port("127.0.0.1", None) == (app.serve.DEFAULT_PORT, None)


def test_a_taken_default_port_moves_to_the_next_free_one_and_says_so(monkeypatch):
    """When the default port is in use the next free one is taken, with a one-line note naming both."""
    taken = {app.serve.DEFAULT_PORT, app.serve.DEFAULT_PORT + 1}
    monkeypatch.setattr(app.serve, "_port_is_free", lambda host, port: port not in taken)
    port, note = app.serve.choose_port("127.0.0.1", None)
    assert port == app.serve.DEFAULT_PORT + 2
    assert (
        note
        == f"port {app.serve.DEFAULT_PORT} is in use (another program is serving there); using port {port}"
    )


def test_a_taken_port_asked_for_is_an_error_that_offers_the_next_free_one(monkeypatch):
    """A port given with --port that is in use is refused in one line that offers the next free port."""
    monkeypatch.setattr(app.serve, "_port_is_free", lambda host, port: port != 8123)
    assert app.serve.choose_port("127.0.0.1", 8123) == (
        None,
        "port 8123 on 127.0.0.1 is in use by another program; port 8124 is free: strutscope --port 8124",
    )


def test_serving_on_a_port_that_is_really_taken_exits_with_one_line(tmp_path):
    """The real command, asked for a port another socket holds, exits 2 with one line and no traceback."""
    import socket

    with socket.socket() as other:
        other.bind(("127.0.0.1", 0))
        other.listen()
        port = other.getsockname()[1]
        done = run_serve(["--no-browser", "--port", str(port)], tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: port {port} on 127.0.0.1 is in use by another program")
    assert len(done.stderr.strip().splitlines()) == 1
    assert "Traceback" not in done.stderr


def test_the_bare_command_with_serve_options_serves_the_page(tmp_path):
    """The real `strutscope --no-browser --port 0` (no `serve`) answers with the page and stops on Ctrl+C."""
    server = Server(cwd=tmp_path, command=("--no-browser", "--port", "0"))
    try:
        with urllib.request.urlopen(server.url, timeout=60) as response:
            assert response.status == 200
            assert "strutscope" in response.read().decode("utf-8")
    finally:
        assert server.stop() == 0


@pytest.mark.parametrize("port", ["-1", "70000", "eighty"])
def test_bad_port_is_a_usage_error(port, capsys):
    """A port outside 0–65535 or not a number is refused by the command line with exit code 2."""
    assert app.cli.main(["serve", "--port", port]) == 2
    assert "--port" in capsys.readouterr().err
