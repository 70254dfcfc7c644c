"""The ``strutscope`` console script.

Commands:

- ``strutscope solve CASE.json`` (or ``--demo``) reads a case file in schema 1, solves it with
  :func:`engine.solve` and prints a summary in the display units of ``--units`` (``si``: kN, m, mm, kN·m;
  ``us``: kip, ft, in, kip·ft), or with ``--json`` a machine-readable summary in SI (:func:`summary_data`).
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
import contextlib
import json
import os
import sys
import tempfile
import textwrap
from collections.abc import Sequence
from importlib import metadata, resources

from app.interrupt import clean_exit
from app.safe_text import terminal
from app.summary_json import SUMMARY_VERSION, summary_data

__all__ = ["CAUTION", "DEMO_CASE", "SUMMARY_VERSION", "format_summary", "main", "summary_data"]

#: The general caution for ``--help``, which must not import the engine: the one copy of
#: ``engine.cautions.GENERAL.message`` outside the engine (tests/app/test_general_caution.py keeps them
#: equal).
#: Every summary prints the engine's own (:func:`app.report.general_caution`).
CAUTION = (
    "Elastic analysis of one member in one plane. Not a full code check: lateral-torsional buckling, "
    "biaxial bending and the interaction of EN 1993-1-1 eqs. (6.61)/(6.62), class 4 sections, "
    "connections and load combinations are not checked. Check the results against your local codes "
    "and have them reviewed by a licensed engineer."
)

#: The invented demo case, package data of :mod:`assets`.
DEMO_CASE = "demo_wind_post.json"


DEFAULT_STATIONS = 401


def format_summary(source: str, case, result, units: str = "si", capacity=None) -> str:
    """The printed summary (:func:`app.report.format_summary`, imported when a case is solved)."""
    from app.report import format_summary as summary

    return summary(source, case, result, units=units, capacity=capacity)


class _InputError(Exception):
    """Input that cannot be read or is invalid; ``str()`` is what is printed after ``error: <source>:``."""

    def __init__(self, source: str, message: str) -> None:
        super().__init__(message)
        self.source = source


# --------------------------------------------------------------------------------------------------------
# Command line: shared pieces.


def _station_count(text: str) -> int:
    try:
        count = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a whole number") from None
    if count < 2:
        raise argparse.ArgumentTypeError(f"{count} must be at least 2 (the two ends)")
    return count


def _worker_count(text: str) -> int:
    try:
        count = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a whole number") from None
    if count < 1:
        raise argparse.ArgumentTypeError(f"{count} must be at least 1")
    return count


def _version() -> str:
    try:
        return metadata.version("strutscope")
    except metadata.PackageNotFoundError:
        return "unknown (not installed)"


def _epilog(*examples: str) -> str:
    lines = ["examples:", *(f"  {example}" for example in examples), ""]
    lines.extend(textwrap.wrap(CAUTION, width=100))
    return "\n".join(lines)


def _add_parser(commands, name: str, *, help: str, description: str, examples: Sequence[str]):
    # Raw formatting keeps the examples one to a line, so the description is wrapped here.
    return commands.add_parser(
        name,
        help=help,
        description=textwrap.fill(description, width=100),
        epilog=_epilog(*examples),
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )


def _add_units(parser, what: str) -> None:
    parser.add_argument(
        "--units",
        choices=("si", "us"),
        default="si",
        help=f"display units of {what}: si (kN, m, mm, kN·m; the default) or us (kip, ft, in, kip·ft)",
    )


def _add_signatures(parser) -> None:
    for option in ("--prepared-by", "--checked-by"):
        parser.add_argument(option, default="", metavar="NAME", help="name on the calc sheet (with --pdf)")


def _write_file(path: str, data: bytes) -> None:
    """Write `data` to `path` through a temporary file beside it, so that no half-written file is left."""
    directory = os.path.dirname(os.path.abspath(path))
    handle, temporary = tempfile.mkstemp(dir=directory, prefix=".", suffix=".part")
    try:
        with os.fdopen(handle, "wb") as stream:
            stream.write(data)
        os.chmod(temporary, 0o666 & ~_umask())
        os.replace(temporary, path)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(temporary)
        raise


def _umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def _error(text: str) -> None:
    """Print an error line on stderr, control characters from the input escaped (app.safe_text.terminal)."""
    print(terminal(text), file=sys.stderr)


def _print(text: str) -> bool:
    """Print `text` (control characters escaped); return False when the reader went away (``... | head``)."""
    try:
        print(terminal(text, keep_newlines=True))
        sys.stdout.flush()
    except BrokenPipeError:
        # As the Python docs advise, point stdout at devnull so that the flush at exit does not raise again.
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return False
    return True


def _beyond_critical(result) -> bool:
    """At or above the first critical load (no stable equilibrium): exit code 1 even without ``--strict``."""
    return result.status in ("unstable", "critical")


def _failing(result) -> bool:
    """A failed member check or a danger caution (what ``--strict`` turns into exit code 1)."""
    return (result.utilization is not None and result.utilization > 1.0) or any(
        caution.level == "danger" for caution in result.cautions
    )


# --------------------------------------------------------------------------------------------------------
# strutscope solve


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
    which.add_argument("--demo", action="store_true", help=f"solve the invented demo case ({DEMO_CASE})")
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


def _exports(args, result) -> None:
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
            data = exports.csv_text(result, units=args.units).encode("utf-8")
        elif kind == "png":
            data = exports.png_bytes(result, units=args.units)
        else:
            data = exports.pdf_bytes(
                result, units=args.units, prepared_by=args.prepared_by, checked_by=args.checked_by
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
            capacity = engine.capacity(case) if args.capacity else None
        except engine.CaseError as error:
            raise _InputError(source, str(error)) from None
        except MemoryError:
            raise _InputError(source, "not enough memory to solve this case") from None
        _exports(args, result)
    except _InputError as error:
        _error(f"error: {error.source}: {error}")
        return 2
    if args.json:
        text = json.dumps(
            summary_data(source, case, result, capacity), indent=2, ensure_ascii=False, allow_nan=False
        )
    else:
        text = format_summary(source, case, result, units=args.units, capacity=capacity)
    if not _print(text):
        return 1
    if _beyond_critical(result):
        return 1  # at or above the first critical load the member fails, --strict or not
    return 1 if args.strict and _failing(result) else 0


# --------------------------------------------------------------------------------------------------------
# strutscope batch


def _add_batch(commands) -> None:
    batch = _add_parser(
        commands,
        "batch",
        help="solve a table of members (CSV) into a table of results",
        description="Solve every member of a CSV table (one member per row; the columns are listed in the "
        "README and in assets/example_members.csv) and write DIR/results.csv, one row per member "
        "in the input order. A row that cannot be solved is reported there with its row number, "
        "column and message, and does not stop the run. Exit code 0 when every row was solved, "
        "1 when some rows were invalid or a member is at or above its first critical load (or, "
        "with --strict, a member fails its check), 2 when the "
        "table cannot be read.",
        examples=[
            "strutscope batch members.csv --out results",
            "strutscope batch members.csv --out results --pdf --prepared-by 'A. Engineer'",
            "strutscope batch members.csv --out results --workers 4 --units us",
        ],
    )
    batch.add_argument("table", metavar="MEMBERS.csv", help="the table of members")
    batch.add_argument(
        "--out", required=True, metavar="DIR", help="folder for results.csv (created if missing)"
    )
    batch.add_argument("--pdf", action="store_true", help="also write a calc sheet DIR/<id>.pdf per member")
    _add_signatures(batch)
    batch.add_argument(
        "--workers",
        type=_worker_count,
        default=None,
        metavar="N",
        help="processes to share the rows out to (default: every core); tables of up to 50 "
        "rows are solved in one process",
    )
    _add_units(batch, "results.csv and the calc sheets (the input columns keep their stated units)")
    batch.add_argument(
        "--stations",
        type=_station_count,
        default=DEFAULT_STATIONS,
        metavar="N",
        help=f"stations per member (default {DEFAULT_STATIONS})",
    )
    batch.add_argument(
        "--no-capacity",
        dest="capacity",
        action="store_false",
        help="skip the capacity search (faster; the capacity columns stay empty)",
    )
    batch.add_argument(
        "--no-progress",
        dest="progress",
        action="store_false",
        default=None,
        help="no progress bar (it shows only on a terminal and for long tables anyway)",
    )
    batch.add_argument(
        "--strict",
        action="store_true",
        help="exit with 1 when any member fails its check or a danger caution fires",
    )
    batch.set_defaults(handler=_batch)


@clean_exit("batch")
def _batch(args) -> int:
    from concurrent.futures.process import BrokenProcessPool

    from app.workers import one_thread_here

    one_thread_here()  # before numpy loads (the workers get one thread each anyway)
    from app import batch
    from app.outdir import FolderError

    try:
        summary = batch.run(
            args.table,
            args.out,
            units=args.units,
            pdf=args.pdf,
            workers=args.workers,
            stations=args.stations,
            capacity=args.capacity,
            progress=args.progress,
            prepared_by=args.prepared_by,
            checked_by=args.checked_by,
        )
    except batch.TableError as error:
        _error(f"error: {args.table}: {error}")
        return 2
    except FolderError as error:
        _error(f"error: {args.out}: {error}")
        return 2
    except OSError as error:
        _error(f"error: {args.out}: cannot write the results: {error.strerror or error}")
        return 2
    except BrokenProcessPool as error:
        _error(
            f"error: {args.table}: a worker process stopped ({error}); no results were written. "
            "Try --workers 1"
        )
        return 2
    except MemoryError:
        _error(f"error: {args.table}: not enough memory; no results were written. Try --workers 1")
        return 2
    failing = f", {summary.failing} failing their check or with a danger caution" if summary.failing else ""
    lines = [
        f"strutscope batch: {summary.members} member{'s' if summary.members != 1 else ''} from "
        f"{terminal(args.table)}: {summary.solved} solved, {summary.error_count} invalid{failing} "
        f"({summary.workers} process{'es' if summary.workers != 1 else ''})"
    ]
    for row, identifier, _column, message in summary.errors:
        lines.append(f"  row {row}{f' ({terminal(identifier)})' if identifier else ''}: {terminal(message)}")
    if summary.error_count > len(summary.errors):
        more = summary.error_count - len(summary.errors)
        lines.append(f"  ... and {more} more invalid row{'s' if more != 1 else ''} (see {summary.results})")
    lines.append(f"results: {summary.results}")
    if args.pdf:
        lines.append(
            f"calc sheets: {summary.pdfs} PDF file{'s' if summary.pdfs != 1 else ''} in {terminal(args.out)}"
        )
    if summary.stale:
        stale = len(summary.stale)
        lines.append(
            f"removed {stale} calc sheet{'s' if stale != 1 else ''} of the previous run that this "
            "run did not write"
        )
    lines.append(f"Caution: {CAUTION}")
    if not _print("\n".join(lines)):
        return 1
    if summary.error_count or summary.beyond_critical or (args.strict and summary.failing):
        return 1
    return 0


# --------------------------------------------------------------------------------------------------------
# strutscope schema


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
    argv = list(sys.argv[1:] if argv is None else argv)
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
