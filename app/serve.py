"""Serving the member explorer: ``strutscope serve [CASE] [--port N] [--no-browser] [--host H]``.

Each browser session gets its own :class:`app.state.MemberState` and :class:`app.page.MemberPage`, built by
a function that Panel calls per session (a served object would share its state between tabs). The page is
served on 127.0.0.1 by default; another address is an explicit choice, with a printed warning. Every
resource (Bokeh's and Panel's scripts and styles) comes from the server's own ``/static``: the page needs no
internet connection. Ctrl+C (or SIGTERM) stops the server cleanly.
"""

from __future__ import annotations

import gc
import ipaddress
import os
import signal
import socket
import sys
import weakref
from importlib import resources

from app.cli_common import DEMO_CASE

__all__ = ["DEFAULT_PORT", "DISCONNECTED", "add_arguments", "make_page", "run", "serve"]

#: The port used when none is given: our own (S-T-R-U on a phone keypad), not Panel's 5006; when it is taken,
#: the next free port above it is used and the line printed at start-up says so.
DEFAULT_PORT = 7878
#: Seconds after start-up before the worker processes are warmed (see :func:`serve`).
_WARM_DELAY_S = 8.0
_PORT_TRIES = 20  # how many ports above the default are tried when it is taken
_LOOPBACK = ("127.0.0.1", "localhost", "::1")
#: Shown on the page when the connection to the server is lost.
DISCONNECTED = (
    "strutscope lost its connection to the server. Start strutscope again and reload this page: "
    "its address keeps the case."
)


def _demo_case():
    """The page's start case, the one ``solve --demo`` solves (app.cli_common.DEMO_CASE): the invented wind
    post with a permanent (G) and a wind (W) load case; ``strutscope serve assets/demo_wind_post.json`` opens
    the plain demo."""
    import engine

    return engine.Case.from_json(resources.files("assets").joinpath(DEMO_CASE).read_text(encoding="utf-8"))


#: Set (to anything) in a test or the reliability report to have the server log its live pages per session.
DEBUG_SESSIONS_ENV = "STRUTSCOPE_DEBUG_SESSIONS"
_PAGES: weakref.WeakSet = weakref.WeakSet()


def _log_sessions(page) -> None:
    """With STRUTSCOPE_DEBUG_SESSIONS set, print how many pages are still alive at each open and close.

    Added for issue 6 (memory over many sessions): whether closed sessions' pages are released can only be
    seen from inside the server, and the issue forbids a debug endpoint; the count goes to the server's log.
    """
    import panel as pn

    _PAGES.add(page)
    gc.collect()
    print(f"strutscope-debug: session opened; pages alive {len(_PAGES)}", flush=True)

    def closed(session_context) -> None:
        gc.collect()
        print(f"strutscope-debug: session closed; pages alive {len(_PAGES)}", flush=True)

    pn.state.on_session_destroyed(closed)


def _release_memory(session_context) -> None:
    """After a session is destroyed: collect its cycles and hand freed heap back to the system.

    Issue 6 measured the server's resident memory over many sessions: without this it kept the high-water
    mark of the sessions seen so far (freed memory stays in the C allocator's arenas). ``malloc_trim`` is
    glibc's; elsewhere only the collection runs.
    """
    gc.collect()
    trim = _malloc_trim()
    if trim is not None:
        trim(0)


def _malloc_trim():
    global _TRIM
    if _TRIM is False:
        try:
            import ctypes
            import ctypes.util

            libc = ctypes.CDLL(ctypes.util.find_library("c") or "libc.so.6")
            _TRIM = libc.malloc_trim
        except (OSError, AttributeError):
            _TRIM = None
    return _TRIM


_TRIM = False


#: Milliseconds between answering a served page's request and building its page (see :func:`make_page`).
BUILD_DELAY_MS = 120


def make_page(case=None):
    """Build one session's page on `case` (an :class:`engine.Case`; None: the invented demo with load cases).

    The settled inputs and the units are mirrored into the URL, so a copied link reopens the same case.

    Served, the request is answered with an empty frame at once and the page is built into it
    :data:`BUILD_DELAY_MS` later, before the browser asks for the page's content: the browser loads and
    compiles Bokeh's and Panel's scripts (about 0.4 s) while the server builds the page (about 0.6 s),
    where it used to wait for the build before it could start (start-up, issue 10). Outside a server (tests,
    scripts) the page is built and returned at once.
    """
    import panel as pn

    document = pn.state.curdoc
    if document is None or document.session_context is None:
        return _build_page(case, None)
    from app.work import Runner

    # Nothing is solved while the request is answered (a GET does bounded work); the runner starts once the
    # page is live in the browser and solves off the event loop (issue 11).
    runner = Runner(document)
    pn.state.onload(runner.start)
    pn.state.on_session_destroyed(lambda session_context: runner.close())
    _guard_upload_size(document)
    pn.state.on_session_destroyed(_release_memory)
    frame = pn.Column(sizing_mode="stretch_both", margin=0, min_height=660)

    def build() -> None:
        from panel.io.state import set_curdoc

        if runner.closed or frame.objects:
            return
        with set_curdoc(document):
            try:
                frame.objects = [_build_page(case, runner)]
            except Exception as error:  # noqa: BLE001 - never a blank page: say what failed, in one line
                _log_failure(error)
                frame.objects = [pn.pane.HTML(_BUILD_FAILED, sizing_mode="stretch_width")]

    document.add_timeout_callback(build, BUILD_DELAY_MS)
    return frame


def _local_styles_only() -> None:
    """Never let Panel point a stylesheet at its CDN (the page needs no internet connection).

    Panel 1.9 rewrites a component's stylesheet links to the document's ``dist_url`` when it updates the
    component, and falls back to its CDN where the component's model has no document at that moment (a new
    user saw an error message's pane, updated while its model was detached, fetch ``loading.css`` from the
    CDN). The fallback is the module constant ``panel.reactive.CDN_DIST``; served, it is set to the local
    path the server already serves (``static/extensions/panel/``), so such a link stays on this server."""
    import panel.reactive
    from panel.io.resources import LOCAL_DIST

    if hasattr(panel.reactive, "CDN_DIST"):
        panel.reactive.CDN_DIST = LOCAL_DIST


_BUILD_FAILED = (
    "<div style='padding:16px'><b>strutscope could not build this page.</b> Reload the page; if it fails "
    "again, start strutscope again. The server's window names the error.</div>"
)


def _log_failure(error: Exception) -> None:
    print(f"strutscope: building a page failed ({type(error).__name__}: {error})", file=sys.stderr)


#: BokehJS bundles the page never uses: WebGL drawing (no figure asks for it). Not served, so the browser
#: neither fetches nor compiles them (about 0.2 MB of script; start-up, issue 10).
UNUSED_BUNDLES = ("bokeh-gl",)


def _without_webgl(server) -> None:
    """Serve pages without :data:`UNUSED_BUNDLES` (`server`: a Bokeh/Panel server, not yet started)."""
    application = server._tornado
    resources = application.resources

    def lean(absolute_url=None):
        found = resources(absolute_url)
        return found.clone(components=[c for c in found.components if c not in UNUSED_BUNDLES])

    application.resources = lean


def _build_page(case, runner):
    """The page on `case` for the current document (served with `runner`, or solved at once without)."""
    import panel as pn

    from app.page import MemberPage
    from app.state import MemberState

    # The start case (the demo, or the file named on the command line) is trusted and bounded: it is solved
    # while the page is built, so the first page the browser draws already holds its values (start-up, issue
    # 10; it saved a round trip and a second layout). A case from the address is solved off the loop.
    from_link = bool(_link_text(pn.state.session_args, "case")) if pn.state.location is not None else False
    state = MemberState.from_case(
        case if case is not None else _demo_case(), runner=runner, solve_first=not from_link
    )
    if pn.state.location is not None:
        # The link is the settled case (never the axial force while it is dragged); see MemberState.link.
        # Read before the page is built, so that the page opens on the link's case; a bad value is named in
        # the page's notice (issue 11: it silently opened the demo case).
        _open_link(state, pn.state.session_args)
        _mirror_link(state, pn.state.location)
    page = MemberPage(state)
    if os.environ.get(DEBUG_SESSIONS_ENV):
        _log_sessions(page)
    return page


_UNITS = ("si", "us")

# In the browser, before anything is sent: a file over the upload cap is refused next to the upload control.
# Bokeh's file input sends a whole file in one websocket message, and a message over the server's limit
# closes the connection (issue 11: over about 20 MB the session died). The listener sits on the control's
# shadow root in the capture phase, so it runs before the control reads the file.
_UPLOAD_GUARD_JS = """
const LIMIT = %(limit)d;
function attach() {
  for (const view of Bokeh.index.query((v) => v.model != null && v.model.type === "FileInput")) {
    const root = view.shadow_el;
    if (root == null || root.__ssSizeGuard) { continue; }
    root.__ssSizeGuard = true;
    root.addEventListener("change", (event) => {
      const input = event.target;
      const files = input != null ? input.files : null;
      let note = root.querySelector(".ss-upload-refused");
      if (files != null && files.length > 0 && files[0].size > LIMIT) {
        event.stopImmediatePropagation();
        const size = (files[0].size / 1e6).toFixed(1);
        const name = files[0].name;
        input.value = "";
        if (note == null) {
          note = document.createElement("div");
          note.className = "ss-upload-refused";
          note.style.cssText = "color:#a3261b;font-size:12px;margin:2px 0 0 2px";
          root.appendChild(note);
        }
        note.textContent = "upload: " + name + " is " + size +
          " MB; a case file may be at most 1 MB (not sent)";
      } else if (note != null) {
        note.textContent = "";
      }
    }, true);
  }
}
attach();
document.addEventListener("pointerdown", attach, true);
document.addEventListener("dragenter", attach, true);
setInterval(attach, 2000);
"""


def _guard_upload_size(document) -> None:
    from bokeh.models import CustomJS

    from app.page import UPLOAD_LIMIT

    document.js_on_event("document_ready", CustomJS(code=_UPLOAD_GUARD_JS % {"limit": UPLOAD_LIMIT}))


def _link_text(args, key: str) -> str:
    """The value of `key` in the page's address, as text ('' when none)."""
    values = (args or {}).get(key) or []
    if not values:
        return ""
    value = values[-1]
    return value.decode("utf-8", "replace") if isinstance(value, bytes) else str(value)


def _open_link(state, args) -> None:
    """Put the address's units and case into `state` (the case is read, or refused with a message)."""
    units = _link_units(args)
    if units in _UNITS:
        state.units = units
    elif units:
        _link_refused(state, units, {})
    case = _link_text(args, "case")
    if case:
        state.link = case
    shown = _link_text(args, "shown")  # the combination shown (a name the case does not make: the governing)
    if shown and getattr(state.result, "actions", None) is not None:
        state.show_combination(shown)
    elif shown:  # the result is still being solved: it follows the choice when it arrives
        state.combination_choice = shown


def _mirror_link(state, location) -> None:
    """Keep the page's address equal to the settled case and the units: always JSON text, never late.

    The address is written here, whole, on every change of either (Panel's own URL sync decoded the case's
    JSON into a mapping and, on a units switch, wrote that mapping back as Python text).
    """
    import urllib.parse

    from app.state_actions import link_choice

    def write(*events) -> None:
        link = state.link if isinstance(state.link, str) else ""
        query = {"case": link, "units": state.units} if link else {"units": state.units}
        choice = link_choice(state)
        if link and choice:  # the combination shown reopens with the link
            query["shown"] = choice
        search = "?" + urllib.parse.urlencode(query)
        if location.search != search:
            location.search = search

    state.param.watch(write, ["link", "units", "combination_choice"])
    write()


def _link_units(args) -> str:
    """The ``units`` of the page's address, as text ('' when none)."""
    values = (args or {}).get("units") or []
    if not values:
        return ""
    value = values[-1]
    text = value.decode("utf-8", "replace") if isinstance(value, bytes) else str(value)
    return text.strip('"')


def _link_refused(state, units: str, mapped: dict) -> None:
    """Panel could not apply the link's values together: apply the case alone and name what was wrong."""
    from app.intake import clean_text

    if "link" in mapped:
        state.link = mapped["link"]  # the case on its own (its own problems are named by the state)
    if units and units not in _UNITS:
        shown = clean_text(units)[:40]
        message = f"units: {shown!r} in the link is not si or us; the page shows {state.units.upper()} units"
        if message not in state.notice:
            state._notify(f"{state.notice}; {message}" if state.notice else message)


def _free_port(host: str) -> int:
    family = socket.AF_INET6 if ":" in host else socket.AF_INET
    with socket.socket(family, socket.SOCK_STREAM) as probe:
        probe.bind((host, 0))
        return probe.getsockname()[1]


def _port_is_free(host: str, port: int) -> bool:
    """Whether a listening socket could bind `host`:`port` now (with SO_REUSEADDR, as the server binds)."""
    family = socket.AF_INET6 if ":" in host else socket.AF_INET
    with socket.socket(family, socket.SOCK_STREAM) as probe:
        probe.setsockopt(socket.SOL_SOCKET, socket.SO_REUSEADDR, 1)
        try:
            probe.bind((host, port))
        except OSError:
            return False
    return True


def _next_free_port(host: str, port: int) -> int | None:
    """The first free port above `port` (within a few tries), or None."""
    for candidate in range(port + 1, min(port + 1 + _PORT_TRIES, 65536)):
        if _port_is_free(host, candidate):
            return candidate
    return None


def choose_port(host: str, port: int | None) -> tuple[int | None, str | None]:
    """The port to serve on, and a one-line note (or an error when the port was asked for and is taken).

    Parameters
    ----------
    host : str
    port : int or None
        The port the user asked for; None for the default. 0 picks any free port.

    Returns
    -------
    port : int or None
        None when the asked-for port is taken (the note is then the error message).
    note : str or None
    """
    if port == 0:
        return _free_port(host), None
    wanted = DEFAULT_PORT if port is None else port
    if _port_is_free(host, wanted):
        return wanted, None
    spare = _next_free_port(host, wanted)
    if port is None and spare is not None:
        return spare, f"port {wanted} is in use (another program is serving there); using port {spare}"
    offer = f"; port {spare} is free: strutscope --port {spare}" if spare is not None else ""
    return None, f"port {wanted} on {host} is in use by another program{offer}"


def _is_loopback(host: str) -> bool:
    if host in _LOOPBACK:
        return True
    try:
        return ipaddress.ip_address(host).is_loopback
    except ValueError:
        return False


def serve(
    case_path=None,
    port: int | None = None,
    open_browser: bool = True,
    host: str = "127.0.0.1",
    allow_origin=(),
) -> int:
    """Serve the page until Ctrl+C; return the exit code (0 when stopped, 2 for a case or port problem).

    Parameters
    ----------
    case_path : str or path-like, optional
        A case file (JSON, schema 1) to open; the invented demo with load cases when None.
    port : int, optional
        The port; 0 picks a free one; None is :data:`DEFAULT_PORT`, or the next free port above it when it is
        taken. A port asked for that is taken is an error that names the next free one. The URL is printed
        either way.
    open_browser : bool
        Open the page in the default browser once the server listens.
    host : str
        The address to listen on: 127.0.0.1 by default. Any other address shares the page (and the
        machine's CPU) with the network it is on, with no login: a warning is printed.
    allow_origin : sequence of str
        Further addresses (``http://name:port``, ``name:port`` or ``name``) by which other computers open
        the page; only these, the loopback names and `host` are answered (see :mod:`app.guard`).
    """
    import engine

    case = None
    if case_path is not None:
        from app.intake import IntakeError, check_case

        try:
            case = engine.load_case(case_path)
            check_case(case)  # a lone surrogate in the title failed every session (issue 11)
        except (engine.CaseError, IntakeError) as error:
            print(f"error: {case_path}: {error}", file=sys.stderr)
            return 2
        except OSError as error:
            print(f"error: {case_path}: cannot read the file: {error.strerror or error}", file=sys.stderr)
            return 2
    port, note = choose_port(host, port)
    if port is None:
        print(f"error: {note}", file=sys.stderr)
        return 2
    if note is not None:
        print(f"strutscope: {note}", flush=True)
    try:
        import panel as pn

        from app.page import UPLOAD_LIMIT, page_stylesheet

        pn.config.raw_css = [*pn.config.raw_css, page_stylesheet()]
        # Bokeh checks every new document's models for layout mistakes (0.1–0.2 s per page, start-up, issue
        # 10); a test runs the same check on a built page instead (tests/app/test_page_document.py).
        from bokeh.settings import settings as bokeh_settings

        bokeh_settings.perform_document_validation.set_value(False)
        _local_styles_only()
        # Issue 6 found that a stopped server went unreported: the page stayed as it was and ignored input.
        # Panel shows this message (in its notification area) when the websocket is lost.
        pn.config.disconnect_notification = DISCONNECTED
        from app import guard, work

        # Only the names served, for plain requests and the websocket alike; never a wildcard (issue 11).
        hosts = guard.allowed_hosts(host, port, allow_origin)
        origins = [entry for entry in hosts if not entry.startswith("[")]  # Bokeh cannot match IPv6 origins
        server = pn.serve(
            lambda: make_page(case),
            port=port,
            address=host,
            websocket_origin=origins,
            show=open_browser,
            start=False,
            title="strutscope · member explorer",
            verbose=False,
            # Just above what a page needs (an upload of at most 1 MB is 1.4 MB of base64 in one message);
            # the browser refuses larger files before sending them.
            websocket_max_message_size=4 * UPLOAD_LIMIT,
        )
        guard.install(server, hosts)
        _without_webgl(server)
        server.start()
        # Warm the worker processes once the first page has had the machine to itself (their imports compete
        # with it for the CPU: start-up, issue 10); a job before then starts its worker itself.
        server.io_loop.call_later(_WARM_DELAY_S, work.start_workers)
    except OSError as error:
        print(f"error: cannot listen on {host}:{port}: {error.strerror or error}", file=sys.stderr)
        return 2
    shown_host = f"[{host}]" if ":" in host else host
    if not _is_loopback(host):
        print(
            f"warning: serving on {host}, not only this computer: anyone who can reach this address can open "
            "the page and run analyses on this machine; there is no login.",
            file=sys.stderr,
        )
    source = case_path if case_path is not None else f"{DEMO_CASE} (invented demo)"
    print(f"strutscope: serving the member explorer on {source} at http://{shown_host}:{port}/", flush=True)
    if host in ("0.0.0.0", "::"):
        print(f"strutscope: on this computer, open it at http://127.0.0.1:{port}/", flush=True)
    others = hosts[len(guard.LOOPBACK_NAMES) :]
    if not _is_loopback(host):
        print(
            "strutscope: other computers can open it at "
            + (", ".join(f"http://{entry}/" for entry in others) if others else "no address yet")
            + " (name each address they use with --allow-origin)",
            flush=True,
        )
    print("strutscope: press Ctrl+C to stop", flush=True)

    def stop(signum, frame):
        raise KeyboardInterrupt

    previous = signal.signal(signal.SIGTERM, stop)
    try:
        server.io_loop.start()
    except KeyboardInterrupt:
        pass
    finally:
        signal.signal(signal.SIGTERM, previous)
        server.stop()
        work.shutdown()
        print("strutscope: stopped", flush=True)
    return 0


def add_arguments(parser) -> None:
    """Add the ``serve`` options to `parser` (an argparse parser for the subcommand)."""
    parser.add_argument(
        "case",
        nargs="?",
        metavar="CASE.json",
        help="a case file to open (default: the invented demo with load cases G and W)",
    )
    parser.add_argument(
        "--port",
        type=_port,
        default=None,
        metavar="N",
        help=f"port to serve on (default {DEFAULT_PORT}, else the next free one above it; 0: any free one)",
    )
    parser.add_argument("--no-browser", action="store_true", help="do not open a browser")
    parser.add_argument(
        "--host",
        default="127.0.0.1",
        metavar="H",
        help="address to listen on (default 127.0.0.1, this computer only; another address "
        "shares the page with the network, with a warning)",
    )
    parser.add_argument(
        "--allow-origin",
        action="append",
        type=_origin,
        metavar="URL",
        help="an address other computers use to open the page, e.g. http://workstation.local:8080 (repeat "
        "for more); with --host, only these, the --host address and this computer's own names are answered",
    )


def _origin(text: str) -> str:
    import argparse

    from app.guard import origin_entry

    try:
        origin_entry(text, 0)
    except ValueError as error:
        raise argparse.ArgumentTypeError(str(error)) from None
    return text


def _port(text: str) -> int:
    import argparse

    try:
        port = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a whole number") from None
    if not 0 <= port <= 65535:
        raise argparse.ArgumentTypeError(f"{port} must be from 0 to 65535")
    return port


def run(args) -> int:
    """Run ``strutscope serve`` with parsed `args` (``case``, ``port``, ``no_browser``, ``host``)."""
    extra = {"allow_origin": args.allow_origin} if getattr(args, "allow_origin", None) else {}
    return serve(
        getattr(args, "case", None),
        port=getattr(args, "port", None),
        open_browser=not getattr(args, "no_browser", False),
        host=getattr(args, "host", "127.0.0.1"),
        **extra,
    )


if __name__ == "__main__":  # not an entry point (it printed nothing): say which one is
    sys.exit("the page is served by `strutscope serve` or `python -m app.cli serve`; add --help for options")
