"""Solving the members table: the rows in chunks, in one process or several, into the results file."""

from __future__ import annotations

import collections
import contextlib
import math
import os
import shutil
import sys
import tempfile
from collections.abc import Callable, Iterable, Iterator
from dataclasses import dataclass

from app import outdir
from app.batch.cluster import CHUNK_ROWS, ExecutorError, dask_address, solved_on_dask
from app.batch.columns import (
    _RESULT_LAYOUT,
    PARALLEL_MIN_ROWS,
    RESULTS_FILE,
    ROUTE_COLUMNS,
    BatchSummary,
    RowError,
    TableError,
    _file_mode,
    result_columns,
)
from app.batch.enveloped import spread
from app.batch.headline import basis_cell, governing_cell
from app.batch.rows import _count_rows, _engine_error, _records, member_case
from app.batch.summary import count_danger, count_solved, finish
from app.report.combinations import worst_deflection
from app.safe_text import csv_writer
from app.workers import worker_pool

# --------------------------------------------------------------------------------------------------------
# Solving rows (in this process or in a worker).


@dataclass(frozen=True, kw_only=True)
class _Options:
    units: str
    stations: int
    capacity: bool
    pdf_dir: str | None
    prepared_by: str = ""
    checked_by: str = ""


def _cell(value: float | None, factor: float = 1.0) -> str:
    """A number for the results table: full precision (round-trips), 'inf' when unbounded, '' for none."""
    if value is None:
        return ""
    value = float(value)
    if math.isnan(value):
        return ""
    if math.isinf(value):
        return "inf" if value > 0 else "-inf"
    return repr(value * factor)


def _write_atomically(path: str, data: bytes) -> None:
    directory = os.path.dirname(path) or "."
    handle, temporary = tempfile.mkstemp(dir=directory, prefix=outdir.TEMPORARY_PREFIX, suffix=".part")
    try:
        with os.fdopen(handle, "wb") as stream:
            stream.write(data)
        os.chmod(temporary, _file_mode())
        os.replace(temporary, path)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(temporary)
        raise


def _solved_record(row: int, identifier: str, case, options: _Options) -> tuple[list[str], bool, bool]:
    """Solve one case: return (results-table cells, failing, pdf written); failing is "" (it passes),
    "check" (a utilisation above 1) or the code of the danger caution it fails by."""
    import engine
    from app.report import status_message
    from app.units import units

    shown = units(options.units)
    result = engine.solve(case, stations=options.stations)
    force, per_moment, length = shown.force.factor, shown.moment.factor, shown.length.factor
    small = shown.small_length.factor
    governing = result.governing
    check = result.check
    capacity_force = capacity_check = capacity_combination = None
    if options.capacity and case.section is not None and case.material is not None:
        found = engine.capacity_of(result)  # with load cases, the lowest of the ultimate combinations
        capacity_force, capacity_check, capacity_combination = (
            found.axial_force,
            found.check,
            found.combination,
        )
    over = spread(result)  # with load cases, each value column's largest over the ultimate combinations
    moment, shear, deflection = (
        (governing.moment.value, governing.moment.x),
        (governing.shear.value, governing.shear.x),
        (governing.deflection.value, governing.deflection.x),
    )
    out_of_plane = None if check is None or check.out_of_plane is None else check.out_of_plane.utilization
    if over is not None:
        moment, shear, deflection = over.moment[:2], over.shear[:2], over.deflection[:2]
        out_of_plane = None if over.out_of_plane is None else over.out_of_plane[0]
    # "" passes; "check": the utilisation is above 1; else the first danger caution's code (it fails by it).
    danger = next((caution.code for caution in result.cautions if caution.level == "danger"), "")
    failing = "check" if result.utilization is not None and result.utilization > 1.0 else danger
    record = [
        identifier,
        str(row),
        "ok",
        "",
        status_message(result, shown),
        result.status,
        _cell(result.critical_loads[0], force),
        _cell(result.alpha_cr if over is None or over.alpha_cr is None else over.alpha_cr[0]),
        _cell(moment[0], per_moment),
        _cell(moment[1], length),
        _cell(shear[0], force),
        _cell(shear[1], length),
        _cell(deflection[0], small),
        _cell(deflection[1], length),
        _cell(result.amplification.moment),
        _cell(result.utilization),
        basis_cell(result),
        _cell(worst_deflection(result)),  # the larger of both planes
        governing_cell(result),
        "" if out_of_plane is None else _cell(out_of_plane),
        "" if check is None or check.section_class is None else str(check.section_class.klass),
        _cell(capacity_force, force),
        capacity_check or "",
        ";".join(caution.code for caution in result.cautions),
        *_route_cells(result, over),
        *_second_plane_cells(result, force, per_moment, small, over),
        *_combination_cells(result),
        *_ltb_cells(result, per_moment, None if over is None or over.ltb is None else over.ltb[0]),
        *_inner_cells(result, shown),
        "" if capacity_combination is None else capacity_combination,
        "" if over is None else over.sources(),
    ]
    wrote = False
    if options.pdf_dir is not None:
        from app.exports import pdf_bytes

        _write_atomically(
            os.path.join(options.pdf_dir, f"{identifier}.pdf"),
            pdf_bytes(
                result, units=options.units, prepared_by=options.prepared_by, checked_by=options.checked_by
            ),
        )
        wrote = True
    return record, failing, wrote


def _route_cells(result, over=None) -> list[str]:
    """The headline route's code, then each route's utilisation and governing term code ("" when absent);
    with load cases (``over``) each route's largest over the ultimate combinations."""
    from app.report.routes import headline_route

    found = {
        route.route: (route.utilization, route.governing) for route in getattr(result, "routes", ()) or ()
    }
    if over is not None:
        found = {code: value[:2] for code, value in over.routes.items()}
    head = headline_route(result)
    cells = ["" if head is None else head.route]
    for code in ROUTE_COLUMNS:
        route = found.get(code)
        cells += ["", ""] if route is None or route[0] is None else [_cell(route[0]), route[1] or ""]
    return cells


def _second_plane_cells(result, force: float, moment: float, small: float, over=None) -> list[str]:
    """The second plane's Pcr1 and largest |M|, |V| and |w| in the display units, "" for one plane; with
    load cases (``over``) the largest over the ultimate combinations."""
    second = getattr(result, "second_plane", None)
    if second is None:
        return ["", "", "", ""]
    governing = second.governing
    values = (governing.moment.value, governing.shear.value, governing.deflection.value)
    if over is not None and over.second_moment is not None:
        values = (over.second_moment[0], over.second_shear[0], over.second_deflection[0])
    return [
        _cell(second.critical_loads[0], force),
        _cell(abs(values[0]), moment),
        _cell(abs(values[1]), force),
        _cell(abs(values[2]), small),
    ]


def _combination_cells(result) -> list[str]:
    """The rule and the combinations giving the headline and the deflection check ("" without actions)."""
    actions = getattr(result, "actions", None)
    if actions is None:
        return ["", "", ""]
    deflection = actions.governing_for("deflection")
    return [
        actions.case.combinations.rule,
        actions.headline or "",
        "" if deflection is None else deflection.combination,
    ]


def _ltb_cells(result, moment: float, ltb=None) -> list[str]:
    """Lateral-torsional buckling (``ltb``, else the result's): "checked" or "not checked: <reason>",
    M_cr exact and tabulated in the display units, λ̄_LT, χ_LT and the utilisation; all "" without a member
    check."""
    ltb = getattr(result, "ltb", None) if ltb is None else ltb
    if ltb is None:
        return [""] * 6
    if not ltb.applies:
        return [f"not checked: {ltb.reason}"] + [""] * 5
    return [
        "checked",
        _cell(ltb.M_cr, moment),
        _cell(ltb.M_cr_tabulated, moment),
        _cell(ltb.lambda_LT),
        _cell(ltb.chi_LT),
        _cell(ltb.utilisation),
    ]


def _inner_cells(result, shown) -> list[str]:
    """The restraints' reactions inside the member (app.report.restraints.inner_reactions): the largest
    force (up as drawn) and its x, then every restraint's ``x:F=..,C=..``; all "" without restraints."""
    from app.report.restraints import inner_reactions, inner_reactions_cell

    found = inner_reactions(result)
    if not found:
        return ["", "", ""]
    top = max(found, key=lambda r: abs(r.force))  # the first of equal ones
    return [
        _cell(top.force, shown.force.factor),
        _cell(top.x, shown.length.factor),
        inner_reactions_cell(found, shown, _cell),
    ]


def _error_record(row: int, identifier: str, column: str, message: str) -> list[str]:
    width = len(_RESULT_LAYOUT)
    return [identifier, str(row), "error", column, message] + [""] * (width - 5)


def _solve_chunk(chunk: list[tuple[int, object]], options: _Options) -> list[tuple[list[str], bool, bool]]:
    """Solve a chunk of rows; each item is ``(row, cells)`` or ``(row, RowError)`` found while reading."""
    import engine

    out = []
    for row, cells in chunk:
        identifier = cells.identifier if isinstance(cells, RowError) else (cells.get("id") or "").strip()
        try:
            if isinstance(cells, RowError):
                raise cells
            case = member_case(cells)
            try:
                out.append(_solved_record(row, identifier, case, options))
            except engine.CaseError as error:
                raise _engine_error(error, cells, []) from None
        except RowError as error:
            out.append((_error_record(row, identifier, error.column, str(error)), False, False))
        except Exception as error:  # noqa: BLE001 -- one member's failure must not stop the table
            message = (
                f"unexpected error while solving this member ({type(error).__name__}: {error}); "
                "please report it with the row"
            )
            out.append((_error_record(row, identifier, "", message), False, False))
    return out


# --------------------------------------------------------------------------------------------------------
# The run.


def default_workers() -> int:
    """The number of CPU cores this process may use."""
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except AttributeError:  # not on Linux
        return max(1, os.cpu_count() or 1)


def _chunks(items: Iterable, size: int) -> Iterator[list]:
    chunk = []
    for item in items:
        chunk.append(item)
        if len(chunk) == size:
            yield chunk
            chunk = []
    if chunk:
        yield chunk


#: Ids kept in memory before the rest go to a temporary database on disk (about 150 bytes each in a dict, so
#: 1.5 MB at most; a lookup on disk costs microseconds beside a member's milliseconds).
ID_MEMORY_ROWS = 10_000


class _SeenIds:
    """The ids used so far and their rows: a dict for the first :data:`ID_MEMORY_ROWS`, then a temporary
    SQLite database on disk (deleted when closed), so that a table of millions of rows keeps memory flat."""

    def __init__(self, memory_rows: int = ID_MEMORY_ROWS) -> None:
        self._memory: dict[str, int] = {}
        self._limit = memory_rows
        self._disk = None

    def first_row(self, identifier: str) -> int | None:
        row = self._memory.get(identifier)
        if row is None and self._disk is not None:
            found = self._disk.execute("SELECT row FROM ids WHERE id = ?", (identifier,)).fetchone()
            row = None if found is None else found[0]
        return row

    def add(self, identifier: str, row: int) -> None:
        if len(self._memory) < self._limit:
            self._memory[identifier] = row
            return
        if self._disk is None:
            import sqlite3

            self._disk = sqlite3.connect("")  # "": a private temporary database on disk
            self._disk.execute("PRAGMA journal_mode = OFF")
            self._disk.execute("PRAGMA synchronous = OFF")
            self._disk.execute("CREATE TABLE ids (id TEXT PRIMARY KEY, row INTEGER) WITHOUT ROWID")
        self._disk.execute("INSERT INTO ids VALUES (?, ?)", (identifier, row))

    def close(self) -> None:
        if self._disk is not None:
            self._disk.close()
            self._disk = None


def _checked_ids(records: Iterable[tuple[int, object]], memory_rows: int = ID_MEMORY_ROWS):
    """Turn the second and later uses of an id into row errors (ids name the calc sheets)."""
    seen = _SeenIds(memory_rows)  # the only thing kept for the whole table, bounded in memory
    try:
        for row, cells in records:
            if isinstance(cells, dict):
                identifier = cells.get("id", "")
                first = seen.first_row(identifier) if identifier else None
                if first is not None:
                    yield (
                        row,
                        RowError(
                            "id",
                            f"id: {identifier!r} is already used on row {first}; "
                            f"ids must be unique (they name the calc sheets)",
                            identifier,
                        ),
                    )
                    continue
                if identifier:
                    seen.add(identifier, row)
            yield row, cells
    finally:
        seen.close()


def _solved_in_order(chunks: Iterator[list], options: _Options, workers: int) -> Iterator[list]:
    """Yield each chunk's results in the input order, keeping a bounded window of chunks in flight."""
    if workers <= 1:
        for chunk in chunks:
            yield _solve_chunk(chunk, options)
        return
    window = 3 * workers
    with worker_pool(workers, options.pdf_dir is not None) as pool:
        pending: collections.deque = collections.deque()
        try:
            for chunk in chunks:
                pending.append(pool.submit(_solve_chunk, chunk, options))
                if len(pending) >= window:
                    yield pending.popleft().result()
            while pending:
                yield pending.popleft().result()
        finally:
            for future in pending:
                future.cancel()


def run(
    table: str,
    out_dir: str,
    *,
    units: str = "si",
    pdf: bool = False,
    workers: int | None = None,
    stations: int = 401,
    capacity: bool = True,
    progress: bool | None = None,
    prepared_by: str = "",
    checked_by: str = "",
    error_limit: int = 20,
    on_progress: Callable[[int], None] | None = None,
    executor: str = "local",
    chunk_rows: int | None = None,
) -> BatchSummary:
    """Solve every member of a table and write ``out_dir/results.csv`` (and the calc sheets).

    Parameters
    ----------
    table : str
        Path of the members table (CSV, the columns of :data:`COLUMNS`).
    out_dir : str
        Folder for the results; created when missing.
    units : str
        ``"si"`` or ``"us"``: the units of the results table and the calc sheets. The input columns are always
        in the units their names state.
    pdf : bool
        Write a calc sheet ``out_dir/<id>.pdf`` for every solved member.
    workers : int, optional
        Processes to use; all cores when None. Tables of up to :data:`PARALLEL_MIN_ROWS` rows are solved in
        this process.
    stations : int
        Stations per member (the governing values are exact peaks whatever the number).
    capacity : bool
        Find each member's axial capacity (:func:`engine.capacity`) when it has a section and a material.
    progress : bool, optional
        Show a progress bar on stderr; by default when stderr is a terminal and the table is long.
    prepared_by, checked_by : str
        Names on the calc sheets.
    error_limit : int
        How many row errors the summary lists (all are in the results table).
    on_progress : callable, optional
        Called with the number of rows just written (for tests and other front ends).
    executor : str
        ``"local"`` (this machine's processes, `workers` of them) or ``"dask://HOST:PORT"``: the Dask cluster
        whose scheduler is there (:mod:`app.batch.cluster`; `workers` is then the cluster's).
    chunk_rows : int, optional
        Rows per task on a Dask cluster (:data:`app.batch.cluster.CHUNK_ROWS` by default).

    Returns
    -------
    BatchSummary

    Raises
    ------
    TableError
        When the table cannot be read or its header is wrong; nothing is written then.
    ExecutorError
        When the executor is not one, cannot be reached, or its workers run other code; nothing is written.
    OSError
        When the output folder cannot be written.
    """
    from app.units import UNIT_SYSTEMS

    if units not in UNIT_SYSTEMS:
        raise ValueError(f"units: {units!r} is not a units system; allowed: {', '.join(UNIT_SYSTEMS)}")
    address = dask_address(executor)
    if address is not None and pdf:
        raise ExecutorError(
            "--pdf writes the calc sheets where the members are solved, which on a Dask cluster is not this "
            "machine; run the calc sheets locally (without --executor)"
        )
    total = _count_rows(table)  # also checks the header before anything is written
    if os.path.exists(out_dir) and not os.path.isdir(out_dir):
        raise TableError(f"--out: {out_dir!r} exists and is not a folder")
    outdir.check_not_input(table, out_dir, RESULTS_FILE)
    os.makedirs(out_dir, exist_ok=True)
    with outdir.locked(out_dir):
        try:
            return _run_locked(
                table,
                out_dir,
                total,
                units=units,
                pdf=pdf,
                workers=workers,
                stations=stations,
                capacity=capacity,
                progress=progress,
                prepared_by=prepared_by,
                checked_by=checked_by,
                error_limit=error_limit,
                on_progress=on_progress,
                address=address,
                chunk_rows=chunk_rows,
            )
        except BaseException:
            outdir.remove_temporaries(out_dir)  # what stopped workers may have left
            raise


def _run_locked(
    table: str,
    out_dir: str,
    total: int,
    *,
    units,
    pdf,
    workers,
    stations,
    capacity,
    progress,
    prepared_by,
    checked_by,
    error_limit,
    on_progress,
    address=None,
    chunk_rows=None,
) -> BatchSummary:
    """:func:`run` once the folder is locked."""
    manifest = outdir.Manifest(out_dir)
    workers = default_workers() if workers is None else max(1, int(workers))
    used = workers if workers > 1 and total > PARALLEL_MIN_ROWS else 1
    # Chunks of a few dozen rows keep the cost of passing work between processes small beside the solves,
    # while leaving enough chunks to keep every worker busy to the end.
    size = max(1, min(64, total // (used * 8))) if used > 1 else 16
    options = _Options(
        units=units,
        stations=stations,
        capacity=capacity,
        # the calc sheets are written into a staging folder and moved beside results.csv only when it is
        # replaced: an interrupted run leaves no sheet of its own beside the previous run's table (an audit
        # found M00–M15 of the new run beside results.csv and M16–M19 of the old one)
        pdf_dir=outdir.staging(out_dir) if pdf else None,
        prepared_by=prepared_by,
        checked_by=checked_by,
    )
    target = os.path.join(out_dir, RESULTS_FILE)
    summary = BatchSummary(results=target, workers=used)
    if address is not None:
        size, summary.executor, summary.workers = chunk_rows or CHUNK_ROWS, f"Dask cluster at {address}", 0
    highest: list = []  # a heap of the highest utilisations that are code checks (app.batch.summary)
    not_checked: list = []  # and one of those that are not (elastic bounds)

    bar = None
    if progress is None:
        progress = total >= 20 and sys.stderr.isatty()
    if progress:
        try:
            from tqdm import tqdm
        except ImportError:  # the bar is a convenience: run without it
            tqdm = None
        if tqdm is not None:
            bar = tqdm(total=total, unit="member", file=sys.stderr, dynamic_ncols=True, leave=False)

    handle, temporary = tempfile.mkstemp(
        dir=out_dir, prefix=f"{outdir.TEMPORARY_PREFIX}results-", suffix=".csv.part"
    )
    try:
        with os.fdopen(handle, "w", encoding="utf-8", newline="") as stream:
            writer = csv_writer(stream)  # every cell neutralised against formulas (app.safe_text)
            writer.writerow(result_columns(units))
            chunks = _chunks(_checked_ids(_records(table)), size)
            solved = (
                _solved_in_order(chunks, options, used)
                if address is None
                else solved_on_dask(address, chunks, _solve_chunk, options, summary.retried)
            )
            for results in solved:
                for record, failing, wrote in results:
                    writer.writerow(record)
                    summary.members += 1
                    if record[2] == "ok":
                        summary.solved += 1
                        summary.failing += bool(failing)
                        if failing and failing != "check":
                            count_danger(summary, record, failing)
                        summary.beyond_critical += record[5] in ("unstable", "critical")
                        count_solved(summary, record, highest, not_checked)
                        summary.pdfs += wrote
                        if wrote:
                            manifest.add(f"{record[0]}.pdf")
                    else:
                        summary.error_count += 1
                        if len(summary.errors) < error_limit:
                            summary.errors.append((int(record[1]), record[0], record[3], record[4]))
                if bar is not None:
                    bar.update(len(results))
                if on_progress is not None:
                    on_progress(len(results))
            stream.flush()
            os.fsync(stream.fileno())
        os.chmod(temporary, _file_mode())
        os.replace(temporary, target)
        if options.pdf_dir is not None:
            outdir.publish(options.pdf_dir, out_dir)
        summary.stale = manifest.complete()
        finish(summary, highest, not_checked)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(temporary)
        if options.pdf_dir is not None:  # this run's sheets never join the previous run's table
            shutil.rmtree(options.pdf_dir, ignore_errors=True)
        raise
    finally:
        if bar is not None:
            bar.close()
    return summary
