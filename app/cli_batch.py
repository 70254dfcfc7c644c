"""``strutscope batch``: its options and its handler (:mod:`app.batch` does the work)."""

from __future__ import annotations

from app.cli_common import (
    CAUTION,
    DEFAULT_STATIONS,
    _add_parser,
    _add_signatures,
    _add_units,
    _error,
    _print,
    _station_count,
    _worker_count,
)
from app.interrupt import clean_exit
from app.safe_text import terminal


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
        "--executor",
        default="local",
        metavar="WHERE",
        help="where the rows are solved: 'local' (default: a pool of processes on this machine) or "
        "dask://HOST:PORT (an existing Dask cluster's scheduler; needs pip install 'strutscope[cluster]')",
    )
    batch.add_argument(
        "--summary-json",
        default=None,
        metavar="FILE",
        help="also write the run's summary as JSON to FILE ('-': to standard output, and the "
        "printed summary goes to standard error)",
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
            executor=args.executor,
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
    except batch.ExecutorError as error:
        _error(f"error: --executor {terminal(args.executor)}: {error}; no results were written")
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
        + (
            f"({summary.workers} process{'es' if summary.workers != 1 else ''})"
            if summary.executor == "local"
            else f"(on the {summary.executor})"
        )
    ]
    if summary.by_stability:
        counts = ", ".join(
            f"{count} {name or 'no stability'}" for name, count in summary.by_stability.items()
        )
        lines.append(f"solved members by stability: {counts}")
    if summary.highest:
        lines.append(f"highest utilisations by a code check ({len(summary.highest)}):")
        for value, row, identifier in summary.highest:
            lines.append(f"  row {row}{f' ({terminal(identifier)})' if identifier else ''}: {value:.4g}")
    if summary.not_code_checks:
        # Never ranked with the code checks: an elastic bound that a code's check of the material can exceed.
        count = summary.not_code_check_count
        shown = len(summary.not_code_checks)
        lines.append(
            f"NOT code checks, not ranked above ({count} member{'s' if count != 1 else ''}"
            f"{f', the {shown} highest' if shown < count else ''}): the utilisation is an elastic bound only "
            "(no code check of the material is made; a code's check can give more):"
        )
        for value, row, identifier, basis in summary.not_code_checks:
            lines.append(
                f"  row {row}{f' ({terminal(identifier)})' if identifier else ''}: {value:.4g} "
                f"[{terminal(basis)}]"
            )
    if summary.danger:
        count, listed = summary.danger_count, len(summary.danger)
        lines.append(
            f"failing by a danger caution with a utilisation of at most 1 ({count} member"
            f"{'s' if count != 1 else ''}{f', the first {listed}' if listed < count else ''}"
            "; its cautions cell lists it):"
        )
        for row, identifier, code in summary.danger:
            lines.append(f"  row {row}{f' ({terminal(identifier)})' if identifier else ''}: {terminal(code)}")
    for line in summary.retried:
        lines.append(f"retried: {terminal(line)}")
    if summary.errors:
        lines.append(f"invalid rows ({summary.error_count}), by line of {terminal(args.table)}:")
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
    lines += _cautions(summary)
    if args.summary_json is not None:
        from app.batch.summary import summary_json

        document = summary_json(summary, args.table)
        if args.summary_json == "-":
            if not _print(document.rstrip("\n")):
                return 1
            _error("\n".join(lines))
            lines = []
        else:
            try:
                _write_text_atomically(args.summary_json, document)
            except OSError as error:
                _error(
                    f"error: --summary-json {args.summary_json}: cannot write it: {error.strerror or error}"
                )
                return 2
    if lines and not _print("\n".join(lines)):
        return 1
    if summary.error_count or summary.beyond_critical or (args.strict and summary.failing):
        return 1
    return 0


def _write_text_atomically(path: str, text: str) -> None:
    """Write `text` to `path` through a temporary file in the same folder, renamed when complete."""
    import os
    import tempfile

    from app.batch.columns import _file_mode

    folder = os.path.dirname(os.path.abspath(path))
    handle, temporary = tempfile.mkstemp(dir=folder, prefix=".strutscope-", suffix=".json.part")
    try:
        with os.fdopen(handle, "w", encoding="utf-8") as stream:
            stream.write(text)
        os.chmod(temporary, _file_mode())
        os.replace(temporary, path)
    except BaseException:
        if os.path.exists(temporary):
            os.unlink(temporary)
        raise


# --------------------------------------------------------------------------------------------------------
# strutscope schema


def _cautions(summary) -> list[str]:
    """The scope caution of the rows solved: a plain member's, and a member's with load cases (whose
    combination factors are recalled values) where the table had any."""
    if not summary.with_combinations:
        return [f"Caution: {CAUTION}"]
    from engine.envelope import SCOPE

    lines = []
    if summary.with_combinations < summary.solved:
        lines.append(f"Caution (rows without load cases): {CAUTION}")
    lines.append(f"Caution (rows with load cases): {SCOPE.message}")
    return lines
