"""The ``strutscope`` console script.

Commands:

- ``strutscope solve CASE.json`` (or ``--demo``, the demo case the page opens) reads a case file in schema 1,
  solves it with :func:`engine.solve` and prints a summary in the display units of ``--units`` (``si``: kN,
  m, mm, kN·m; ``us``: kip, ft, in, kip·ft), or with ``--json`` a machine-readable summary in SI
  (:func:`summary_data`).
  ``--csv``, ``--png`` and ``--pdf`` write the exports of :mod:`app.exports`, and ``--capacity`` adds
  :func:`engine.capacity`.
- ``strutscope batch MEMBERS.csv --out DIR`` solves a table of members (:mod:`app.batch`).
- ``strutscope schema`` prints the case file's JSON Schema (:mod:`app.schema`).

Exit codes: 0 when done; 1 when a member's axial force is at or above its first critical load (with or without
``--strict``), 1 with ``--strict`` when a member fails its check (utilisation above 1) or a danger
caution fires, for ``batch`` also when a row of the table is invalid, and when the output pipe was closed
early; 2 when the input is invalid (:class:`engine.CaseError`, named with the file), a file cannot be read or
written, the batch's ``--out`` folder is in use or would overwrite the input, or the command line is wrong;
130 and 143 when ``solve`` or ``batch`` is stopped by Ctrl-C (SIGINT) or SIGTERM (:mod:`app.interrupt`).
Text from the input is printed with its control characters escaped (:func:`app.safe_text.terminal`).

This module does no mechanics: every figure it prints comes from the engine's result. The engine, the units
and the exports are imported only when needed, so ``strutscope --help`` works on its own and nothing happens
at import time. Each command is one ``_add_<command>`` function that registers its subparser and handler, so
a command can be added without touching the others.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
import textwrap
from collections.abc import Sequence
from importlib import resources

from app.cli_batch import _add_batch
from app.cli_common import (
    CAUTION,
    DEFAULT_STATIONS,
    DEMO_CASE,
    PLAIN_DEMO_CASE,
    _add_parser,
    _add_signatures,
    _add_units,
    _beyond_critical,
    _epilog,
    _error,
    _failing,
    _InputError,
    _print,
    _station_count,
    _version,
    _write_file,
)
from app.interrupt import clean_exit, end_process
from app.summary_json import SUMMARY_VERSION, summary_data

__all__ = ["CAUTION", "DEMO_CASE", "SUMMARY_VERSION", "format_summary", "main", "summary_data"]


def format_summary(source: str, case, result, units: str = "si", capacity=None, comparison=None) -> str:
    """The printed summary (:func:`app.report.format_summary`, imported when a case is solved)."""
    from app.report import format_summary as summary

    return summary(source, case, result, units=units, capacity=capacity, comparison=comparison)


def _add_solve(commands) -> None:
    solve = _add_parser(
        commands,
        "solve",
        help="solve a case file and print a summary",
        description="Solve a case file (JSON, schema 1; SI units) and print a summary of the critical "
        "loads, the governing values with their positions, the reactions, the amplification "
        "factors, the member check and the cautions. Exit code 0 when solved, 2 for an invalid "
        "case or a file that cannot be read or written, 1 when the axial force is at or above "
        "the first critical load, and 1 with --strict when the member fails its check.",
        examples=[
            "strutscope solve --demo",
            "strutscope solve post.json --units us",
            "strutscope solve post.json --json > post-summary.json",
            "strutscope solve post.json --pdf post.pdf --prepared-by 'A. Engineer' --strict",
        ],
    )
    which = solve.add_mutually_exclusive_group(required=True)
    which.add_argument("case", nargs="?", metavar="CASE.json", help="the case file to solve")
    which.add_argument(
        "--demo",
        action="store_true",
        help=f"solve the invented demo case the page opens ({DEMO_CASE}): a façade wind post with a "
        "permanent (G) and a wind (W) load case, combined by EN 1990; the same post without load cases is "
        f"assets/{PLAIN_DEMO_CASE}, solved by its path from a checkout",
    )
    solve.add_argument(
        "--stations",
        type=_station_count,
        default=DEFAULT_STATIONS,
        metavar="N",
        help=f"number of stations along the member (default {DEFAULT_STATIONS}); the engine "
        "adds the load points and the exact peaks",
    )
    _add_units(solve, "the summary and the exports")
    solve.add_argument(
        "--json",
        action="store_true",
        help="print a machine-readable summary (JSON, SI units) instead of the text",
    )
    solve.add_argument(
        "--capacity",
        action="store_true",
        help="also find the largest axial compression at strength utilisation 1 "
        "(needs a section and a material)",
    )
    solve.add_argument("--csv", metavar="FILE", help="write the results along the member as CSV")
    solve.add_argument("--png", metavar="FILE", help="write the diagrams as a PNG image")
    solve.add_argument("--pdf", metavar="FILE", help="write a calc sheet as PDF")
    _add_signatures(solve)
    solve.add_argument(
        "--strict",
        action="store_true",
        help="exit with 1 when the utilisation exceeds 1 or a danger caution fires",
    )
    solve.set_defaults(handler=_solve)


def _read_case(args):
    """Return ``(source, case)`` for the parsed `args`; raise _InputError when it cannot be had."""
    import engine
    from engine.limits import MAX_CASE_BYTES

    if args.demo:
        source = f"{DEMO_CASE} (invented demo)"
        text = resources.files("assets").joinpath(DEMO_CASE).read_text(encoding="utf-8")
    else:
        source = args.case
        try:
            with open(args.case, "rb") as file:
                # One byte past the limit is enough for the engine to refuse a larger file.
                text = file.read(MAX_CASE_BYTES + 1)
        except OSError as error:
            raise _InputError(source, f"cannot read the file: {error.strerror or error}") from None
    try:
        return source, engine.Case.from_json(text)  # every problem is a CaseError (engine.limits)
    except engine.CaseError as error:
        raise _InputError(source, str(error)) from None


def _exports(args, result, capacity=None) -> None:
    """Write the files asked for; raise _InputError naming the file when one cannot be written."""
    asked = ((args.csv, "csv"), (args.png, "png"), (args.pdf, "pdf"))
    wanted = [(path, kind) for path, kind in asked if path]
    if not wanted:
        return
    for path, _ in wanted:  # before the exports are drawn, which takes a while
        folder = os.path.dirname(os.path.abspath(path))
        if not os.path.isdir(folder):
            raise _InputError(path, f"cannot write the file: the folder {folder} does not exist")
    from app import exports

    for path, kind in wanted:
        if kind == "csv":
            data = exports.csv_text(result, units=args.units, capacity=capacity).encode("utf-8")
        elif kind == "png":
            data = exports.png_bytes(result, units=args.units)
        else:
            data = exports.pdf_bytes(
                result,
                units=args.units,
                prepared_by=args.prepared_by,
                checked_by=args.checked_by,
                capacity=capacity,
            )
        try:
            _write_file(path, data)
        except OSError as error:
            raise _InputError(path, f"cannot write the file: {error.strerror or error}") from None


@clean_exit("solve")
def _solve(args) -> int:
    from app.workers import one_thread_here

    one_thread_here()  # before numpy loads
    import engine

    try:
        source, case = _read_case(args)
        try:
            result = engine.solve(case, stations=args.stations)
            # A case with actions: the capacity and the superposition of the governing combination.
            capacity = engine.capacity_of(result) if args.capacity else None
            comparison = None
            if result.actions is not None and result.actions.headline is not None:
                from engine.superposition import compare

                moment = result.actions.governing_for("moment")
                comparison = compare(case, result.actions.of(moment.combination).combination, args.stations)
        except engine.CaseError as error:
            raise _InputError(source, str(error)) from None
        except MemoryError:
            raise _InputError(source, "not enough memory to solve this case") from None
        _exports(args, result, capacity)
    except _InputError as error:
        _error(f"error: {error.source}: {error}")
        return 2
    if args.json:
        text = json.dumps(
            summary_data(source, case, result, capacity), indent=2, ensure_ascii=False, allow_nan=False
        )
    else:
        text = format_summary(
            source, case, result, units=args.units, capacity=capacity, comparison=comparison
        )
    if not _print(text):
        return 1
    if _beyond_critical(result):
        return 1  # at or above the first critical load the member fails, --strict or not
    return 1 if args.strict and _failing(result) else 0


# --------------------------------------------------------------------------------------------------------
# strutscope batch


def _add_schema(commands) -> None:
    schema = _add_parser(
        commands,
        "schema",
        help="print the case file's JSON Schema",
        description="Print the JSON Schema (draft 2020-12) of the case file, schema 1, so that other tools "
        "can check case files. strutscope itself checks more than a schema can (positions "
        "against the length, supports that make a mechanism, a section's plates against its "
        "depth).",
        examples=["strutscope schema > strutscope-case.schema.json"],
    )
    schema.set_defaults(handler=_schema)


def _schema(args) -> int:
    from app.schema import schema_text

    return 0 if _print(schema_text()) else 1


# --------------------------------------------------------------------------------------------------------
# The program.


def _build_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="strutscope",
        description=textwrap.fill(
            "Exact second-order analysis of one member under axial force and bending: "
            "deflection, moment and shear amplification under compression, and the "
            "elastic critical loads.",
            width=100,
        ),
        epilog=_epilog(
            "strutscope solve --demo",
            "strutscope solve post.json --json",
            "strutscope batch members.csv --out results --pdf",
            "strutscope schema",
            "strutscope COMMAND --help",
        ),
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("--version", action="version", version=f"strutscope {_version()}")
    commands = parser.add_subparsers(dest="command", metavar="COMMAND")
    _add_solve(commands)
    _add_batch(commands)
    _add_schema(commands)
    _add_serve(commands)
    return parser


# --- the page: `strutscope serve` (app/serve.py holds its options and the server) ---------------------------


def _add_serve(commands) -> None:
    from app import serve

    page = _add_parser(
        commands,
        "serve",
        help="serve the member explorer page (what a bare `strutscope` does)",
        description="Serve the interactive member explorer on this computer and open it in the browser: "
        "set up the member, drag the axial force towards the critical load and watch the "
        "second-order deflection, moment and shear; export a figure, the stations, a calc sheet "
        "and the case. Opens the invented demo case unless a case file is given.",
        examples=["strutscope serve", "strutscope serve post.json --port 8080 --no-browser"],
    )
    serve.add_arguments(page)
    page.set_defaults(handler=_serve)


def _serve(args) -> int:
    from app.workers import one_thread_here

    one_thread_here()  # before numpy loads: the page's solves are small (a case's combinations: 2.2x faster)
    from app import serve

    return serve.run(args)


def _allow_any_text(stream) -> None:
    # Titles, units and the α in α_cr are not ASCII: on a console that cannot show them, substitute rather
    # than fail after the case was solved.
    reconfigure = getattr(stream, "reconfigure", None)
    if reconfigure is not None:
        reconfigure(errors="backslashreplace")


def main(argv: Sequence[str] | None = None) -> int:
    """Run the ``strutscope`` command line and return its exit code.

    Parameters
    ----------
    argv : sequence of str, optional
        The arguments after the program name; ``sys.argv[1:]`` when None.

    Returns
    -------
    int
        0 when done; 1 for a --strict failure, invalid rows of a batch or a closed output pipe; 2 for invalid
        or unreadable input, a file that cannot be written or a wrong command line.
    """
    _allow_any_text(sys.stdout)
    _allow_any_text(sys.stderr)
    parser = _build_parser()
    if argv is None:  # the program itself (its entry point or ``python -m app.cli``), not a test's call
        return end_process(_run(parser, list(sys.argv[1:])))
    return _run(parser, list(argv))


def _run(parser: argparse.ArgumentParser, argv: list[str]) -> int:
    if _means_serve(argv):
        # A bare `strutscope`, `strutscope --port 8123 --no-browser` or `strutscope post.json` serve the page.
        argv = ["serve", *argv]
    try:
        args = parser.parse_args(argv)
    except SystemExit as stop:  # argparse exits for --help, --version and usage errors
        return stop.code if isinstance(stop.code, int) else (0 if stop.code is None else 2)
    return args.handler(args)


_COMMANDS = ("solve", "batch", "schema", "serve")


def _means_serve(argv: list[str]) -> bool:
    """Whether the arguments are the `serve` command's without its name.

    Nothing, a serve option (``--port``, ``--no-browser``, ``--host``) or a case file first mean `serve`;
    ``--help`` and ``--version`` stay the program's own, and an unknown word that is not a file is left to
    argparse, which names the commands.
    """
    if not argv:
        return True
    first = argv[0]
    if first in _COMMANDS or first in ("-h", "--help", "--version"):
        return False
    if first.startswith("-"):
        return True
    return first.lower().endswith(".json") or os.path.exists(first)


if __name__ == "__main__":
    raise SystemExit(main())
