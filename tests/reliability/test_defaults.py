"""Safe defaults of the served page: who can reach it, what an upload may be, what the page touches on disk.

The defaults are those of issue 6 and the serving rules in DEVELOPERS.md ("Decisions log"): bind 127.0.0.1,
share only with an explicit ``--host`` and a warning, websocket origins limited to the served host and port,
uploads parsed in memory, at most 1 MB, JSON only, no code evaluated (common practice, no source).
"""

from __future__ import annotations

import asyncio
import json
import os
import pickle
import re
import sys
import urllib.request
from importlib import resources
from pathlib import Path

import panel as pn
import pytest

from app.page import UPLOAD_LIMIT, MemberPage
from tests.browser.conftest import Server

REPO = Path(__file__).resolve().parents[2]


# ------------------------------------------------------------------------------------------------ serving


def listening_addresses(port: int) -> set[str]:
    """The local addresses (hex, as /proc/net/tcp{,6} writes them) of sockets listening on `port`."""
    found = set()
    for table in ("/proc/net/tcp", "/proc/net/tcp6"):
        if not os.path.exists(table):
            continue
        with open(table, encoding="ascii") as rows:
            next(rows)
            for row in rows:
                fields = row.split()
                address, hex_port = fields[1].rsplit(":", 1)
                if fields[3] == "0A" and int(hex_port, 16) == port:  # 0A: TCP_LISTEN
                    found.add(address)
    return found


def port_of(url: str) -> int:
    """The port in a served URL."""
    return int(re.search(r":(\d+)/", url).group(1))


@pytest.fixture(scope="module")
def served(tmp_path_factory):
    """The real `strutscope serve` with its default address."""
    running = Server(cwd=tmp_path_factory.mktemp("defaults"))
    yield running
    running.stop()


@pytest.mark.browser
def test_the_server_listens_on_the_loopback_address_only(served):
    """With no --host the only listening socket is 127.0.0.1 (never 0.0.0.0 or ::), and no warning."""
    if not os.path.exists("/proc/net/tcp"):
        pytest.skip("needs Linux /proc/net/tcp")
    assert listening_addresses(port_of(served.url)) == {"0100007F"}  # 127.0.0.1, little-endian hex
    assert "warning" not in "".join(served.output)


def test_the_command_line_default_address_is_loopback():
    """`strutscope serve` without --host parses to 127.0.0.1."""
    import argparse

    from app.serve import add_arguments

    parser = argparse.ArgumentParser()
    add_arguments(parser)
    assert parser.parse_args([]).host == "127.0.0.1"
    assert parser.parse_args(["--host", "0.0.0.0"]).host == "0.0.0.0"


@pytest.mark.browser
def test_sharing_needs_host_and_prints_a_warning(tmp_path):
    """`--host 0.0.0.0` listens on every address and prints a warning that anyone reachable can use it."""
    running = Server("--host", "0.0.0.0", cwd=tmp_path)
    try:
        text = "".join(running.output)
        assert re.search(r"warning: serving on 0\.0\.0\.0.*no login", text)
        if os.path.exists("/proc/net/tcp"):
            assert "00000000" in listening_addresses(port_of(running.url))
    finally:
        running.stop()


def websocket_answer(url: str, origin: str) -> str:
    """Open the page's websocket with the `origin` header; 'open' when accepted, else the HTTP status."""
    from tornado.httpclient import HTTPClientError, HTTPRequest
    from tornado.websocket import websocket_connect

    page = urllib.request.urlopen(url, timeout=30).read().decode("utf-8")
    token = re.search(r'"token":"([^"]+)"', page).group(1)
    port = port_of(url)

    async def attempt() -> str:
        request = HTTPRequest(f"ws://127.0.0.1:{port}/ws", headers={"Origin": origin}, request_timeout=30)
        try:
            connection = await websocket_connect(request, subprotocols=["bokeh", token])
        except HTTPClientError as error:
            return str(error.code)
        message = await connection.read_message()
        connection.close()
        return "open" if message else "closed"

    return asyncio.run(attempt())


@pytest.mark.browser
def test_a_websocket_from_another_origin_is_refused(served):
    """The page's own origins (127.0.0.1, localhost on its port) connect; any other origin gets 403."""
    port = port_of(served.url)
    assert websocket_answer(served.url, f"http://127.0.0.1:{port}") == "open"
    assert websocket_answer(served.url, f"http://localhost:{port}") == "open"
    others = (f"http://attacker.invalid:{port}", f"http://127.0.0.1:{port + 1}")
    for origin in ("http://attacker.invalid", *others, "null"):
        assert websocket_answer(served.url, origin) == "403", origin


# ------------------------------------------------------------------------------------------------ uploads


@pytest.fixture
def page():
    """A page on the invented demo case, without a server."""
    yield MemberPage()
    pn.state.reset()


def upload(page, data: bytes, filename: str) -> str:
    """Deliver `data` to the page's upload widget as the browser would; return the message shown."""
    page.upload.value = None
    page.upload.filename = filename
    page.upload.value = data
    return page.upload_message.object


def demo_json() -> str:
    """The invented demo case file."""
    return resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8")


def invented_case(length: float) -> bytes:
    """The demo case on another span, as file bytes (invented)."""
    mapping = json.loads(demo_json())
    mapping["length"] = length
    return json.dumps(mapping).encode()


def test_an_upload_over_one_megabyte_is_refused_and_one_under_it_loads(page):
    """A valid case padded past 1 MB is refused with its size; the same case under the cap loads."""
    data = invented_case(5.0)
    big = data + b" " * (UPLOAD_LIMIT + 1 - len(data))
    assert UPLOAD_LIMIT <= 1_000_000
    message = upload(page, big, "big.json")
    assert "ss-error" in message and "at most 1 MB" in message
    assert page.model.length == 6.0
    message = upload(page, data + b" " * (UPLOAD_LIMIT - len(data)), "fits.json")
    assert "loaded fits.json" in message and page.model.length == 5.0


@pytest.mark.parametrize("name", ["case.txt", "case.py", "case.json.exe", "case"])
def test_an_upload_not_named_json_is_refused(page, name):
    """Only .json files are read: a valid case under another name is refused and the inputs stay."""
    message = upload(page, invented_case(5.0), name)
    assert "ss-error" in message and "not a .json case file" in message
    assert page.model.length == 6.0


class _Marker:
    """Unpickling this would create a file: the proof that an upload was evaluated."""

    def __init__(self, path: str) -> None:
        self.path = path

    def __reduce__(self):
        return (Path.touch, (Path(self.path),))


def test_an_upload_is_never_evaluated_as_code(page, tmp_path):
    """A pickle, a YAML tag and code in a title are data: refused or kept as text, and nothing runs."""
    marker = tmp_path / "evaluated"
    payloads = [
        pickle.dumps(_Marker(str(marker))),
        f"!!python/object/apply:pathlib.Path.touch [{str(marker)!r}]".encode(),
        f"__import__('pathlib').Path({str(marker)!r}).touch()".encode(),
    ]
    for data in payloads:
        message = upload(page, data, "case.json")
        assert "ss-error" in message and ("not valid JSON" in message or "cannot be decoded" in message)
    code = f"__import__('pathlib').Path({str(marker)!r}).touch()"
    mapping = json.loads(demo_json())
    mapping["title"] = code
    assert "loaded" in upload(page, json.dumps(mapping).encode(), "case.json")
    assert page.model.title == code and page.model.result.case.title == code
    assert not marker.exists()


# ------------------------------------------------------------------------------------------------ file system


_EVENTS: list[tuple] = []
_RECORDING = [False]
_WATCHED = (
    "open",
    "os.remove",
    "os.rename",
    "os.mkdir",
    "os.rmdir",
    "shutil.rmtree",
    "shutil.move",
    "os.truncate",
    "subprocess.Popen",
    "os.system",
    "os.exec",
    "os.posix_spawn",
    "socket.connect",
)


def _audit(event: str, args) -> None:
    if _RECORDING[0] and event in _WATCHED:
        _EVENTS.append((event, args))


sys.addaudithook(_audit)  # audit hooks cannot be removed; this one records only while _RECORDING is set


class recorded:
    """Record the file, process and network events (PEP 578 audit hooks) raised inside the block."""

    def __enter__(self):
        _EVENTS.clear()
        _RECORDING[0] = True
        return _EVENTS

    def __exit__(self, *exc):
        _RECORDING[0] = False


def _writes(events) -> list:
    out = []
    for event, args in events:
        if event != "open":
            out.append((event, args))
            continue
        path, mode, flags = args
        if (isinstance(mode, str) and any(c in mode for c in "wax+")) or (
            isinstance(flags, int) and flags & (os.O_WRONLY | os.O_RDWR | os.O_CREAT | os.O_TRUNC)
        ):
            out.append((event, args))
    return out


def _reads_outside_the_installation(events) -> list:
    allowed = tuple(
        str(Path(p).resolve())
        for p in {sys.prefix, sys.base_prefix, REPO / "engine", REPO / "app", REPO / "assets", *sys.path}
        if p
    )
    out = []
    for event, args in events:
        if event == "open" and isinstance(args[0], (str, bytes, os.PathLike)):
            path = os.fsdecode(args[0])
            if not str(Path(path).resolve()).startswith(allowed):
                out.append(path)
    return out


def test_an_upload_is_parsed_in_memory(page):
    """Loading an uploaded case opens no file at all: the bytes are parsed where they arrived."""
    upload(page, invented_case(4.5), "warm.json")  # the first load may import modules
    data = invented_case(5.0)
    with recorded() as events:
        message = upload(page, data, "case.json")
    assert "loaded" in message and page.model.length == 5.0
    assert [e for e in events if e[0] == "open"] == []


def test_using_the_page_writes_nothing_and_reads_only_the_installation(page):
    """Edits, loads, units, variants and downloads open no file for writing, run nothing, call nowhere."""
    for make in (
        page.files.png,
        page.files.csv,
        page.files.pdf,
        page.files.json,
    ):  # first exports may build font caches
        make()
    data = invented_case(5.0)
    with recorded() as events:
        page.length_input.value = 7.0
        page.model.axial_force = 200e3
        page.model.left_end = "fixed"
        page.model.add_load("point")
        page.model.units = "us"
        page.model.units = "si"
        page.keep_variant()
        upload(page, data, "case.json")
        page.model.length = -1.0  # refused by the engine, shown on the page
        exports = [
            make().getvalue() for make in (page.files.png, page.files.csv, page.files.pdf, page.files.json)
        ]
    assert all(len(data) > 100 for data in exports)  # the downloads were made, in memory
    assert _writes(events) == []
    assert _reads_outside_the_installation(events) == []
    assert "length" in page.model.errors and page.model.length == -1.0  # refused, and the input kept
