"""Hostile requests to the real server (issue 11): rebinding host names, wildcard origins, a heavy link.

DNS rebinding (common practice, no source: a foreign page points its own name at 127.0.0.1 and the browser
then sends that name as Host and Origin) is refused by Host, on plain requests and on the websocket. A
``?case=`` link with a heavy case is only validated before the page is sent, so another request is answered
meanwhile. Each check failed on the code before issue 11 (200 for a foreign Host, a wildcard origin with
``--host 0.0.0.0``, and a heavy link that held every other request for minutes).
"""

from __future__ import annotations

import http.client
import json
import re
import socket
import threading
import urllib.parse
from importlib import resources

import pytest

from engine.limits import MAX_LOADS
from tests.browser.conftest import TIMEOUT_MS, Server
from tests.reliability.test_defaults import port_of

_WAIT_S = TIMEOUT_MS / 1000  # the suite's limit for any one wait (a hang check, not a speed check)


@pytest.fixture(scope="module")
def served(tmp_path_factory):
    """The real `strutscope serve` with its default address."""
    running = Server(cwd=tmp_path_factory.mktemp("hostile"))
    yield running
    running.stop()


def get(port: int, host_header: str, path: str = "/") -> tuple[int, str]:
    """GET `path` from 127.0.0.1:`port` with the Host header `host_header`; (status, body)."""
    connection = http.client.HTTPConnection("127.0.0.1", port, timeout=_WAIT_S)
    try:
        connection.putrequest("GET", path, skip_host=True)
        connection.putheader("Host", host_header)
        connection.endheaders()
        response = connection.getresponse()
        return response.status, response.read().decode("utf-8", "replace")
    finally:
        connection.close()


def upgrade(port: int, host_header: str, origin: str, token: str) -> str:
    """A raw websocket upgrade of /ws; returns the status line of the answer."""
    request = (
        "GET /ws HTTP/1.1\r\n"
        f"Host: {host_header}\r\n"
        "Upgrade: websocket\r\nConnection: Upgrade\r\n"
        "Sec-WebSocket-Key: dGhlIHNhbXBsZSBub25jZQ==\r\nSec-WebSocket-Version: 13\r\n"
        f"Sec-WebSocket-Protocol: bokeh, {token}\r\n"
        f"Origin: {origin}\r\n\r\n"
    )
    with socket.create_connection(("127.0.0.1", port), timeout=_WAIT_S) as sock:
        sock.sendall(request.encode("ascii"))
        answer = b""
        while b"\r\n" not in answer:
            chunk = sock.recv(4096)
            if not chunk:
                break
            answer += chunk
    return answer.split(b"\r\n", 1)[0].decode("ascii", "replace")


def session_token(port: int) -> str:
    """The session token of a page fetched under the loopback name."""
    status, page = get(port, f"127.0.0.1:{port}")
    assert status == 200
    return re.search(r'"token":"([^"]+)"', page).group(1)


def test_a_request_for_another_host_name_is_refused(served):
    """GET / with Host: evil.example:PORT gets 403 without the page; the names served get the page."""
    port = port_of(served.url)
    status, body = get(port, f"evil.example:{port}")
    assert status == 403 and "Bokeh" not in body
    for name in ("127.0.0.1", "localhost"):
        status, body = get(port, f"{name}:{port}")
        assert status == 200 and "strutscope" in body
    assert get(port, f"evil.example:{port}", "/static/js/bokeh.min.js")[0] == 403  # every path
    assert "Traceback" not in "".join(served.output)


def test_a_websocket_upgrade_under_another_host_name_is_refused(served):
    """A websocket upgrade with Host and Origin both evil.example:PORT is refused; the page's own opens."""
    port = port_of(served.url)
    evil = f"evil.example:{port}"
    assert " 403 " in upgrade(port, evil, f"http://{evil}", session_token(port)) + " "
    answer = upgrade(port, f"127.0.0.1:{port}", f"http://127.0.0.1:{port}", session_token(port))
    assert " 101 " in answer + " "


def test_every_address_never_makes_a_wildcard_origin(tmp_path):
    """With --host 0.0.0.0 only the loopback names and each --allow-origin are answered, never any name."""
    running = Server("--host", "0.0.0.0", "--allow-origin", "workstation.example", cwd=tmp_path)
    try:
        port = port_of(running.url)
        # The addresses are printed after the URL: wait for that line rather than read what has come so far.
        line = running.wait_for(re.compile(r"other computers can open it at .*"))
        assert f"http://workstation.example:{port}/" in line.group(0)
        assert get(port, f"10.1.2.3:{port}")[0] == 403
        assert get(port, f"evil.example:{port}")[0] == 403
        assert get(port, f"workstation.example:{port}")[0] == 200
        token = session_token(port)
        refused = upgrade(port, f"127.0.0.1:{port}", f"http://anything.example:{port}", token)
        assert " 403 " in refused + " "
    finally:
        running.stop()


def test_a_wildcard_or_a_path_is_not_an_origin():
    """--allow-origin takes a name with an optional port, never a wildcard or a path (a usage error)."""
    import argparse

    from app.serve import add_arguments

    parser = argparse.ArgumentParser(exit_on_error=False)
    add_arguments(parser)
    assert parser.parse_args(["--allow-origin", "http://a.example:8080"]).allow_origin == [
        "http://a.example:8080"
    ]
    for bad in ("*", "*:5006", "http://a.example/path", "http://"):
        with pytest.raises((argparse.ArgumentError, SystemExit)):
            parser.parse_args(["--allow-origin", bad])


def heavy_link(loads: int) -> str:
    """The invented demo case with `loads` point loads, as a ``?case=`` query (invented)."""
    mapping = json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))
    mapping["loads"] = [{"type": "point", "P": 1e3 + i, "x": 6.0 * (i + 0.5) / loads} for i in range(loads)]
    return "/?" + urllib.parse.urlencode({"case": json.dumps(mapping)})


def test_a_heavy_case_link_is_answered_without_holding_up_another_request(served):
    """A ?case= link with the most loads allowed, then a plain GET /: both answered within the suite's wait.

    Before issue 11 the link's GET solved the case and its amplification sweep before answering (minutes
    on this machine), and every other request waited behind it.
    """
    port = port_of(served.url)
    answers: dict = {}

    def heavy() -> None:
        try:
            answers["heavy"] = get(port, f"127.0.0.1:{port}", heavy_link(MAX_LOADS))[0]
        except OSError as error:
            answers["heavy"] = error

    thread = threading.Thread(target=heavy, daemon=True)
    thread.start()
    try:
        status, body = get(port, f"127.0.0.1:{port}")
    except TimeoutError:
        pytest.fail(f"a plain GET / waited more than {_WAIT_S} s behind a heavy link")
    assert status == 200 and "strutscope" in body
    thread.join(_WAIT_S)
    assert answers.get("heavy") == 200, answers


def test_serving_a_case_with_a_lone_surrogate_in_its_title_is_refused(tmp_path):
    """`serve CASE` whose title holds "\\ud800" exits with 2 and names the title (it failed every session)."""
    import subprocess

    from tests.browser.conftest import REPO_ROOT, serve_command

    case = tmp_path / "surrogate.json"
    case.write_text(
        '{"schema": 1, "title": "Post \\ud800", "length": 6, "EI": 1e6, '
        '"supports": {"left": "pinned", "right": "pinned"}}',
        encoding="ascii",
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
    assert done.stderr.startswith(f"error: {case}: title: ") and "lone surrogate" in done.stderr
    assert "Traceback" not in done.stderr
