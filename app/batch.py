"""``strutscope batch``: solve a table of members, one per row, into one table of results.

The input is a CSV file (comma-separated, UTF-8, a header row first) with the columns of :data:`COLUMNS`,
in the units their names state. Each row becomes an :class:`engine.Case`, is solved by :func:`engine.solve`
and, when it has a section and a material, sized by :func:`engine.capacity`. The output is
``DIR/results.csv`` with the columns of :func:`result_columns`, one row per member in the input order, and
with ``--pdf`` a calc sheet ``DIR/<id>.pdf`` per solved member.

A row that cannot be solved does not stop the run: it is reported in the results with its row number (the
line of the input file, the header being line 1), the column at fault and a message naming the value and
what is allowed. Only a table that cannot be read at all (no such file, unknown or missing columns) stops
the run, with :class:`TableError`.

The rows are read, solved and written as a stream, so memory stays flat however long the table is. With
more than :data:`PARALLEL_MIN_ROWS` rows and more than one worker, chunks of rows go to a
:class:`concurrent.futures.ProcessPoolExecutor`; a bounded window of chunks is in flight at any time and
results are written in the input order. The results file is written to a temporary file in ``DIR`` and
renamed over ``results.csv`` only when complete, so it is never left half-written.

This module does no mechanics: every number in the results comes from the engine. It converts units only.
"""

from __future__ import annotations

import collections
import contextlib
import csv
import difflib
import math
import os
import re
import sys
import tempfile
from collections.abc import Callable, Iterable, Iterator, Mapping
from dataclasses import dataclass, field

from app import outdir
from app.safe_text import csv_writer
from app.workers import worker_pool

__all__ = [
    "COLUMNS",
    "Column",
    "PARALLEL_MIN_ROWS",
    "RESULTS_FILE",
    "BatchSummary",
    "RowError",
    "TableError",
    "member_case",
    "result_columns",
    "run",
]

#: The results table written into the output folder.
RESULTS_FILE = "results.csv"

#: Tables with more rows than this are shared out across processes when more than one worker is allowed;
#: below it, starting the processes costs more than it saves.
PARALLEL_MIN_ROWS = 50

# Unit factors of the input columns, SI engineering units to SI base units (the columns' names state them).
_KILO = 1e3  # kN -> N, kN/m -> N/m, kN·m² -> N·m²
_MILLI = 1e-3  # mm -> m

_ID_PATTERN = re.compile(r"[A-Za-z0-9][A-Za-z0-9._-]{0,63}")
_NUMBER = r"[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?"
_POINT_LOAD = re.compile(rf"\s*({_NUMBER})\s*@\s*({_NUMBER})\s*")
_SPAN_BOW = re.compile(r"\s*L\s*/\s*(" + _NUMBER + r")\s*", re.IGNORECASE)
_MM_BOW = re.compile(rf"\s*({_NUMBER})\s*mm\s*", re.IGNORECASE)
_PRESET_BOWS = ("en1993-table-5.1", "en1993-eq-5.9", "aisc-l/1000")


def _file_mode() -> int:
    # Temporary files are created readable by the owner only; the finished files get the usual permissions.
    mask = os.umask(0)
    os.umask(mask)
    return 0o666 & ~mask


@dataclass(frozen=True, kw_only=True)
class Column:
    """One column of the members table.

    Attributes
    ----------
    name : str
        The header, as written in the table (matched ignoring case and surrounding spaces).
    required : bool
        Whether the header must be present (its cells must then be filled in too).
    description : str
        What goes in a cell, with its unit and default.
    """

    name: str
    required: bool
    description: str


#: The columns of the members table, in the order the README lists them.
COLUMNS: tuple[Column, ...] = (
    Column(
        name="id",
        required=True,
        description="The member's identifier: letters, digits, '.', '_' and '-', up to 64 characters, "
        "unique in the table (it names the calc sheet <id>.pdf).",
    ),
    Column(name="length_m", required=True, description="Length L [m], 0.001 to 1000."),
    Column(
        name="left",
        required=True,
        description="Support at x = 0 (the bottom of a vertical member): pinned, fixed, free or guided.",
    ),
    Column(name="right", required=True, description="Support at x = L: pinned, fixed, free or guided."),
    Column(
        name="section",
        required=False,
        description="A catalogue section such as 'HEB 200', 'IPE 300', 'SHS 100x100x5' or 'TIMBER 45x195' "
        "(case- and space-insensitive). Empty: give EI_kNm2.",
    ),
    Column(
        name="material",
        required=False,
        description="A catalogued material: S235, S275, S355, S460, ASTM A992, ASTM A36, C24, GL24h or "
        "EN AW-6082 T6. Empty: give EI_kNm2 (no member check).",
    ),
    Column(
        name="EI_kNm2",
        required=False,
        description="Bending stiffness EI [kN·m²], > 0; overrides the section and material when given.",
    ),
    Column(name="axis", required=False, description="Axis of bending: major or minor. Empty: major."),
    Column(
        name="axial_kN",
        required=False,
        description="Axial force P [kN], compression positive, tension negative. Empty: 0.",
    ),
    Column(
        name="udl_kN_per_m",
        required=False,
        description="Uniform transverse load q over the whole length [kN/m]. Empty: none.",
    ),
    Column(
        name="point_loads",
        required=False,
        description="Transverse point loads as force@position in kN@m, separated by ';': "
        "'7@2.0;3.5@4'. Empty: none.",
    ),
    Column(
        name="bow",
        required=False,
        description="Initial bow: none; a code preset en1993-table-5.1, en1993-eq-5.9 or aisc-l/1000, the "
        "EN 1993-1-1 ones optionally with a buckling curve after a colon (en1993-table-5.1:c; "
        "otherwise the curve follows from the section and material); L/n such as L/300; or an "
        "amplitude such as 12mm (a half sine wave). Empty: none.",
    ),
    Column(
        name="check_method", required=False, description="Member check: elastic or plastic. Empty: elastic."
    ),
    Column(
        name="deflection_limit", required=False, description="n of the deflection limit span/n. Empty: 250."
    ),
    Column(
        name="Lcr_out_m",
        required=False,
        description="Out-of-plane buckling length L_cr [m] (flexural buckling about the other axis, EN "
        "1993-1-1 §6.3.1). Empty: the member length.",
    ),
    Column(
        name="out_of_plane",
        required=False,
        description="restrained when out-of-plane buckling is prevented (no check about the other axis). "
        "Empty: checked.",
    ),
    Column(name="comment", required=False, description="Free text, not read (it goes into the case title)."),
)

_BY_KEY = {column.name.lower(): column for column in COLUMNS}
_REQUIRED = tuple(column.name for column in COLUMNS if column.required)

# The results table's columns; the unit-bearing ones get their unit suffix from the units system.
_RESULT_LAYOUT: tuple[tuple[str, str | None], ...] = (
    ("id", None),
    ("row", None),
    ("status", None),
    ("field", None),
    ("message", None),
    ("stability", None),
    ("Pcr1", "force"),
    ("alpha_cr", None),
    ("M_max", "moment"),
    ("x_M", "length"),
    ("V_max", "force"),
    ("x_V", "length"),
    ("w_max", "small_length"),
    ("x_w", "length"),
    ("amplification_moment", None),
    ("utilization", None),
    ("deflection_utilization", None),
    ("governing_check", None),
    ("out_of_plane_utilization", None),
    ("section_class", None),
    ("capacity", "force"),
    ("capacity_check", None),
    ("cautions", None),
)
_SUFFIXES = {
    "si": {"force": "kN", "moment": "kNm", "length": "m", "small_length": "mm"},
    "us": {"force": "kip", "moment": "kip_ft", "length": "ft", "small_length": "in"},
}


def result_columns(units: str = "si") -> tuple[str, ...]:
    """Return the header of the results table for a units system.

    Parameters
    ----------
    units : str
        ``"si"`` (kN, kN·m, m, mm) or ``"us"`` (kip, kip·ft, ft, in).

    Returns
    -------
    tuple of str
        ``id, row, status, field, message, stability, Pcr1_kN, alpha_cr, M_max_kNm, x_M_m, V_max_kN, x_V_m,
        w_max_mm, x_w_m, amplification_moment, utilization, deflection_utilization, governing_check,
        out_of_plane_utilization, section_class, capacity_kN, capacity_check, cautions`` in SI.
        ``utilization``
        is strength and stability; ``deflection_utilization`` the separate service check (loads as given, no
        bow).
    """
    suffixes = _SUFFIXES[units]
    return tuple(name if kind is None else f"{name}_{suffixes[kind]}" for name, kind in _RESULT_LAYOUT)


class TableError(Exception):
    """The members table cannot be used at all (unreadable, or unknown or missing columns)."""


class RowError(Exception):
    """One row cannot be solved.

    Parameters
    ----------
    column : str
        The column at fault ("" when it is the row as a whole).
    message : str
        What is wrong, naming the value received and what is allowed.
    """

    def __init__(self, column: str, message: str, identifier: str = "") -> None:
        super().__init__(message)
        self.column = column
        self.identifier = identifier

    def __reduce__(self):
        # Rows found bad while reading travel to the worker processes; keep every field through pickling.
        return type(self), (self.column, str(self), self.identifier)


@dataclass(kw_only=True)
class BatchSummary:
    """What a batch run did.

    Attributes
    ----------
    results : str
        Path of the results table written.
    members : int
        Rows read (blank rows are skipped and not counted).
    solved : int
        Rows solved (status ``ok``).
    errors : list of tuple
        ``(row, id, column, message)`` of the first rows with status ``error`` (at most
        ``error_limit``); ``error_count`` has them all.
    error_count : int
    failing : int
        Solved members with a utilisation above 1 or a danger caution.
    beyond_critical : int
        Solved members at or above their first critical load (``stability`` unstable or critical, utilisation
        inf): the command line exits with 1 for them even without ``--strict``.
    workers : int
        Processes used (1: solved in this process).
    pdfs : int
        Calc sheets written.
    stale : list of str
        Calc sheets of the previous run into the folder that this run did not write, removed.
    """

    results: str
    members: int = 0
    solved: int = 0
    errors: list = field(default_factory=list)
    error_count: int = 0
    failing: int = 0
    beyond_critical: int = 0
    workers: int = 1
    pdfs: int = 0
    stale: list = field(default_factory=list)


# --------------------------------------------------------------------------------------------------------
# Reading the table.


def _open_table(path: str):
    try:
        return open(path, encoding="utf-8-sig", newline="")  # -sig: spreadsheets often write a BOM
    except OSError as error:
        raise TableError(f"cannot read the file: {error.strerror or error}") from None


def _header(reader) -> list[str]:
    """Read and check the header row; return the canonical column name of each position."""
    try:
        cells = next(reader)
    except StopIteration:
        raise TableError(
            f"the file is empty; the first row must name the columns, e.g. {','.join(_REQUIRED)}"
        ) from None
    names: list[str] = []
    for position, cell in enumerate(cells, start=1):
        key = cell.strip().lower()
        if key == "" and all(not c.strip() for c in cells[position - 1 :]):
            break  # trailing empty header cells, as spreadsheets write them
        column = _BY_KEY.get(key)
        if column is None:
            hint = ""
            if ";" in cell or "\t" in cell:
                hint = (
                    " (the columns seem to be separated by ';' or tabs; strutscope reads comma-separated "
                    "values: export as CSV with commas)"
                )
            else:
                near = difflib.get_close_matches(key, list(_BY_KEY), n=1, cutoff=0.6)
                if near:
                    hint = f" (did you mean {_BY_KEY[near[0]].name!r}?)"
            raise TableError(
                f"column {position}: unknown column {cell.strip()!r}{hint}; allowed columns: "
                f"{', '.join(c.name for c in COLUMNS)}"
            )
        if column.name in names:
            raise TableError(f"column {position}: {column.name!r} is given twice")
        names.append(column.name)
    missing = [name for name in _REQUIRED if name not in names]
    if missing:
        raise TableError(
            f"required column{'s' if len(missing) > 1 else ''} missing: {', '.join(missing)} "
            f"(the header row names the columns)"
        )
    return names


def _records(path: str) -> Iterator[tuple[int, dict[str, str] | RowError]]:
    """Yield ``(row, cells)`` for every non-blank row, or ``(row, RowError)`` for a row of the wrong width."""
    with _open_table(path) as stream:
        # strict: a quote left open or a stray quote is an error naming the line, never rows run together.
        reader = csv.reader(stream, strict=True)
        start = 1  # the line the next row starts on
        try:
            names = _header(reader)
            start = reader.line_num + 1
            for cells in reader:
                row, start = start, reader.line_num + 1
                if not any(cell.strip() for cell in cells):
                    continue
                broken = [
                    name
                    for name, cell in zip(names, cells, strict=False)
                    if name != "comment" and ("\n" in cell or "\r" in cell)
                ]
                if broken:  # a quote closed lines later: the rows between ran into one cell
                    padded = cells + [""] * len(names)
                    identifier = "" if "id" in broken else padded[names.index("id")].strip()
                    yield (
                        row,
                        RowError(
                            broken[0],
                            f"{broken[0]}: the cell runs over lines {row} to "
                            f'{reader.line_num}: a quote (") in it is probably not '
                            "closed",
                            identifier,
                        ),
                    )
                    continue
                extra = [cell for cell in cells[len(names) :] if cell.strip()]
                if extra:
                    identifier = cells[names.index("id")].strip()
                    yield (
                        row,
                        RowError(
                            "",
                            f"the row has {len(names) + len(extra)} or more filled cells but "
                            f"the header names {len(names)} columns",
                            identifier,
                        ),
                    )
                    continue
                padded = cells + [""] * (len(names) - len(cells))  # spreadsheets drop empty trailing cells
                yield row, {name: padded[i].strip() for i, name in enumerate(names)}
        except csv.Error as error:
            if "unexpected end of data" in str(error):
                raise TableError(
                    f"line {start}: a quoted cell that starts on this line is never closed (a "
                    f'quote " is missing); the table is not read, so that no rows are lost'
                ) from None
            raise TableError(
                f'line {start}: not readable as CSV ({error}); check the quotes (") on this line'
            ) from None
        except UnicodeDecodeError as error:
            raise TableError(f"not UTF-8 text ({error.reason}); save the table as CSV UTF-8") from None


def _count_rows(path: str) -> int:
    """The number of rows :func:`_records` will yield (a first pass; the rows are not kept)."""
    return sum(1 for _ in _records(path))


# --------------------------------------------------------------------------------------------------------
# One row -> one case.


def _number(column: str, text: str, unit: str, example: str) -> float:
    try:
        value = float(text)
    except ValueError:
        hint = " (use a decimal point, not a comma)" if re.fullmatch(r"[-+]?\d+,\d+", text) else ""
        raise RowError(
            column, f"{column}: {text!r} is not a number{hint}; give {unit}, e.g. {example}"
        ) from None
    if not math.isfinite(value):
        raise RowError(column, f"{column}: {text!r} is not a finite number; give {unit}, e.g. {example}")
    return value


def _point_loads(text: str) -> list[tuple[float, float]]:
    from engine.limits import MAX_LOADS

    parts = [part for part in text.split(";") if part.strip()]
    if len(parts) > MAX_LOADS:  # refused before any is read, as the engine refuses a case file's loads
        raise RowError(
            "point_loads",
            f"point_loads: {len(parts)} point loads given; a member may have at most {MAX_LOADS} loads",
        )
    loads = []
    for part in parts:
        if not part.strip():
            continue
        match = _POINT_LOAD.fullmatch(part)
        if match is None:
            raise RowError(
                "point_loads",
                f"point_loads: {part.strip()!r} is not a point load; write each as "
                f"force_kN@position_m, separated by ';', e.g. '7@2.0;3.5@4'",
            )
        loads.append((float(match.group(1)), float(match.group(2))))
    return loads


def _plain(text: str) -> str:
    """A comment as one line of printable text for the title (a spreadsheet cell may hold line breaks)."""
    return " ".join("".join(char if char.isprintable() else " " for char in text).split())


def _bow(text: str) -> dict:
    key = text.strip().lower()
    if key in ("", "none"):
        return {"shape": "none", "amplitude": 0.0}
    if key in _PRESET_BOWS:
        return {"preset": key}
    preset, _, curve = key.partition(":")
    if preset in _PRESET_BOWS[:2] and curve.strip():
        # The EN 1993-1-1 presets take the buckling curve after a colon: en1993-table-5.1:c.
        return {"preset": preset, "curve": curve.strip()}
    match = _SPAN_BOW.fullmatch(text)
    if match is not None:
        return {"preset": "span", "ratio": float(match.group(1))}
    match = _MM_BOW.fullmatch(text)
    if match is not None:
        return {"shape": "sine", "amplitude": float(match.group(1)) * _MILLI}
    raise RowError(
        "bow",
        f"bow: {text!r} is not a bow; allowed: none, {', '.join(_PRESET_BOWS)} (the "
        f"EN 1993-1-1 ones with a buckling curve after a colon if wanted, e.g. "
        f"en1993-table-5.1:c), L/n such as L/300, or an amplitude in mm such as 12mm",
    )


def _column_of(path: str, row: Mapping[str, str], load_columns: list[str]) -> str:
    """The table column behind an engine field path such as ``loads[1].x`` or ``supports.left``."""
    head = re.split(r"[.\[]", path, maxsplit=1)[0]
    if head == "loads":
        match = re.match(r"loads\[(\d+)\]", path)
        if match and int(match.group(1)) < len(load_columns):
            return load_columns[int(match.group(1))]
        return "point_loads"
    if head == "supports":
        if path.startswith("supports.left"):
            return "left"
        if path.startswith("supports.right"):
            return "right"
        return "left/right"
    if head == "EI":
        if row.get("EI_kNm2"):
            return "EI_kNm2"
        return "section" if not row.get("section") else "material"
    if head == "out_of_plane":
        return "out_of_plane" if "restrained" in path else "Lcr_out_m"
    if head == "check":
        return "deflection_limit" if "deflection_limit" in path else "check_method"
    return {
        "length": "length_m",
        "axial_force": "axial_kN",
        "imperfection": "bow",
        "section": "section",
        "material": "material",
        "axis": "axis",
        "case": "id",
    }.get(head, head)


def _engine_error(error: Exception, row: Mapping[str, str], load_columns: list[str]) -> RowError:
    message = str(error)
    path = message.split(":", 1)[0].strip()
    column = _column_of(path, row, load_columns)
    cell = row.get(column)
    # The engine's message names its own field and the value in SI; the cell shows what the table said.
    return RowError(column, f"{column} = {cell!r}: {message}" if cell else message)


def member_case(row: Mapping[str, str]):
    """Build the engine case of one row of the members table.

    Parameters
    ----------
    row : mapping of str to str
        Cells by column name (:data:`COLUMNS`); absent columns and empty cells take their defaults.

    Returns
    -------
    engine.Case
        In SI units (m, N, N/m, N·m²).

    Raises
    ------
    RowError
        Naming the column, the value received and what is allowed; the engine's own message
        (:class:`engine.CaseError`) follows the column's name and cell.
    """
    import engine

    def cell(name: str) -> str:
        return (row.get(name) or "").strip()

    for name in _REQUIRED:
        if not cell(name):
            raise RowError(name, f"{name}: the cell is empty; {_BY_KEY[name.lower()].description}")
    identifier = cell("id")
    if not _ID_PATTERN.fullmatch(identifier):
        raise RowError(
            "id",
            f"id: {identifier!r} may hold only letters, digits, '.', '_' and '-' (up to "
            f"64 characters, starting with a letter or digit): it names the calc sheet "
            f"<id>.pdf",
        )
    data: dict = {
        "schema": 1,
        "title": f"{identifier}: {_plain(cell('comment'))}"[:200] if _plain(cell("comment")) else identifier,
        "length": _number("length_m", cell("length_m"), "metres", "6.0"),
        "supports": {"left": cell("left").lower(), "right": cell("right").lower()},
    }
    load_columns: list[str] = []
    loads: list[dict] = []
    if cell("udl_kN_per_m"):
        q = _number("udl_kN_per_m", cell("udl_kN_per_m"), "kN/m", "2.5")
        if q != 0.0:
            loads.append({"type": "uniform", "q": q * _KILO})
            load_columns.append("udl_kN_per_m")
    for force, x in _point_loads(cell("point_loads")):
        loads.append({"type": "point", "P": force * _KILO, "x": x})
        load_columns.append("point_loads")
    data["loads"] = loads
    if cell("axial_kN"):
        axial = _number("axial_kN", cell("axial_kN"), "kN (compression positive)", "350")
        data["axial_force"] = axial * _KILO
    if cell("EI_kNm2"):
        data["EI"] = _number("EI_kNm2", cell("EI_kNm2"), "kN·m²", "4200") * _KILO
    if cell("section"):
        data["section"] = {"name": cell("section")}
    if cell("material"):
        data["material"] = {"name": cell("material")}
    if cell("axis"):
        data["axis"] = cell("axis").lower()
    data["imperfection"] = _bow(cell("bow"))
    check: dict = {}
    if cell("check_method"):
        check["method"] = cell("check_method").lower()
    if cell("deflection_limit"):
        check["deflection_limit"] = _number(
            "deflection_limit", cell("deflection_limit"), "the n of span/n", "250"
        )
    if check:
        data["check"] = check
    state = cell("out_of_plane").lower()
    if state not in ("", "restrained", "checked"):
        raise RowError(
            "out_of_plane",
            f"out_of_plane: {cell('out_of_plane')!r} is not allowed; allowed: "
            "'restrained', 'checked' or empty (checked)",
        )
    if state == "restrained":
        data["out_of_plane"] = {"restrained": True}
    if cell("Lcr_out_m"):
        length = _number("Lcr_out_m", cell("Lcr_out_m"), "metres", "3.0")
        data["out_of_plane"] = {**data.get("out_of_plane", {}), "buckling_length": length}
    try:
        return engine.Case.from_dict(data)
    except engine.CaseError as error:
        raise _engine_error(error, row, load_columns) from None


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
    """Solve one case: return (results-table cells, failing, pdf written)."""
    import engine
    from app.units import units

    shown = units(options.units)
    result = engine.solve(case, stations=options.stations)
    force, moment, length = shown.force.factor, shown.moment.factor, shown.length.factor
    small = shown.small_length.factor
    governing = result.governing
    check = result.check
    capacity_force = capacity_check = None
    if options.capacity and case.section is not None and case.material is not None:
        found = engine.capacity(case)
        capacity_force, capacity_check = found.axial_force, found.check
    failing = (result.utilization is not None and result.utilization > 1.0) or any(
        caution.level == "danger" for caution in result.cautions
    )
    record = [
        identifier,
        str(row),
        "ok",
        "",
        result.message,
        result.status,
        _cell(result.critical_loads[0], force),
        _cell(result.alpha_cr),
        _cell(governing.moment.value, moment),
        _cell(governing.moment.x, length),
        _cell(governing.shear.value, force),
        _cell(governing.shear.x, length),
        _cell(governing.deflection.value, small),
        _cell(governing.deflection.x, length),
        _cell(result.amplification.moment),
        _cell(result.utilization),
        _cell(None if result.service is None else result.service.utilization),
        "" if check is None else check.kind,
        "" if check is None or check.out_of_plane is None else _cell(check.out_of_plane.utilization),
        "" if check is None or check.section_class is None else str(check.section_class.klass),
        _cell(capacity_force, force),
        capacity_check or "",
        ";".join(caution.code for caution in result.cautions),
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


def _checked_ids(records: Iterable[tuple[int, object]]) -> Iterator[tuple[int, object]]:
    """Turn the second and later uses of an id into row errors (ids name the calc sheets)."""
    seen: dict[str, int] = {}  # a few dozen bytes per row: the only thing kept for the whole table
    for row, cells in records:
        if isinstance(cells, dict):
            identifier = cells.get("id", "")
            if identifier and identifier in seen:
                yield (
                    row,
                    RowError(
                        "id",
                        f"id: {identifier!r} is already used on row {seen[identifier]}; "
                        f"ids must be unique (they name the calc sheets)",
                        identifier,
                    ),
                )
                continue
            if identifier:
                seen[identifier] = row
        yield row, cells


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

    Returns
    -------
    BatchSummary

    Raises
    ------
    TableError
        When the table cannot be read or its header is wrong; nothing is written then.
    OSError
        When the output folder cannot be written.
    """
    from app.units import UNIT_SYSTEMS

    if units not in UNIT_SYSTEMS:
        raise ValueError(f"units: {units!r} is not a units system; allowed: {', '.join(UNIT_SYSTEMS)}")
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
        pdf_dir=os.path.abspath(out_dir) if pdf else None,
        prepared_by=prepared_by,
        checked_by=checked_by,
    )
    target = os.path.join(out_dir, RESULTS_FILE)
    summary = BatchSummary(results=target, workers=used)

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
            for results in _solved_in_order(chunks, options, used):
                for record, failing, wrote in results:
                    writer.writerow(record)
                    summary.members += 1
                    if record[2] == "ok":
                        summary.solved += 1
                        summary.failing += failing
                        summary.beyond_critical += record[5] in ("unstable", "critical")
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
        summary.stale = manifest.complete()
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(temporary)
        raise
    finally:
        if bar is not None:
            bar.close()
    return summary
