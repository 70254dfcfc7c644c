"""Which host names and origins the server answers (issue 11: DNS rebinding).

A page on another site can point its own host name at 127.0.0.1 ("DNS rebinding") and then read and drive
the local server as if it were that site. The browser sends that site's name in the ``Host`` header (and in
``Origin`` on the websocket), so the server answers only the names it serves:

- 127.0.0.1, localhost and [::1] on the served port, always;
- the address given with ``--host``, unless it is every address (0.0.0.0 or ::);
- each ``--allow-origin`` (``http://name:port``, ``name:port`` or ``name``, which takes the served port): the
  names by which other computers reach a shared server.

Every other ``Host`` gets 403 on every path, the websocket included, before any page is built, and the
websocket's origin allowlist is the same list (never a wildcard). One short line is logged per refusal,
without the name received.
"""

from __future__ import annotations

import ipaddress
import logging
import urllib.parse

__all__ = ["LOOPBACK_NAMES", "allowed_hosts", "host_allowed", "install", "origin_entry"]

_log = logging.getLogger(__name__)

#: Names of this computer that the server always answers.
LOOPBACK_NAMES = ("127.0.0.1", "localhost", "[::1]")
_EVERY_ADDRESS = ("0.0.0.0", "::", "")


def _bracketed(host: str) -> str:
    """An IPv6 address in the bracketed form a Host header uses; any other name as it is, lower case."""
    host = host.strip().lower()
    try:
        if ipaddress.ip_address(host.strip("[]")).version == 6:
            return f"[{host.strip('[]')}]"
    except ValueError:
        pass
    return host


def origin_entry(text: str, port: int | None = None) -> str:
    """``name:port`` from ``http://name:port``, ``name:port`` or ``name`` (`port` when none is given).

    Raises ValueError with a message naming the value when it is not a host name with an optional port.
    """
    raw = text.strip()
    parsed = urllib.parse.urlsplit(raw if "//" in raw else f"http://{raw}")
    try:
        name, given = parsed.hostname, parsed.port
    except ValueError:
        name, given = None, None
    if not name or parsed.path not in ("", "/") or parsed.query or parsed.username or "*" in raw:
        raise ValueError(
            f"{text!r} is not an origin: give http://NAME:PORT, NAME:PORT or NAME (no wildcard, no path)"
        )
    if given is None:
        given = port if port is not None else (443 if parsed.scheme == "https" else 80)
    return f"{_bracketed(name)}:{given}"


def allowed_hosts(host: str, port: int, extra=()) -> tuple[str, ...]:
    """The ``name:port`` entries served: loopback names, `host` (unless every address) and `extra`."""
    names = [f"{name}:{port}" for name in LOOPBACK_NAMES]
    if host.strip() not in _EVERY_ADDRESS and _bracketed(host) not in LOOPBACK_NAMES:
        names.append(f"{_bracketed(host)}:{port}")
    for entry in extra:
        entry = origin_entry(entry, port)
        if entry not in names:
            names.append(entry)
    return tuple(names)


def host_allowed(header: str | None, allowed) -> bool:
    """Whether a ``Host`` header names an `allowed` ``name:port`` entry (port 80 may be left out)."""
    if not header:
        return False
    try:
        entry = origin_entry(header, 80)
    except ValueError:
        return False
    return entry in allowed


def install(server, allowed) -> None:
    """Refuse, with 403, every request to `server` (a Bokeh/Panel server) whose Host is not `allowed`."""
    from tornado.web import RequestHandler

    class RefuseHost(RequestHandler):
        def prepare(self) -> None:
            self.set_status(403)
            self.set_header("Content-Type", "text/plain; charset=utf-8")
            self.finish("strutscope answers only the host names it serves (see README, Reliability).\n")

    application = server._tornado
    find_handler = application.find_handler
    allowed = frozenset(allowed)

    def guarded(request, **kwargs):
        if host_allowed(request.headers.get("Host"), allowed):
            return find_handler(request, **kwargs)
        _log.warning("strutscope: refused a request for a host name this server does not serve")
        return application.get_handler_delegate(request, RefuseHost)

    application.find_handler = guarded
