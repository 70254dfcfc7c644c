"""Reading the members table: its header, its rows, and each row as an :class:`engine.Case`."""

from __future__ import annotations

import csv
import difflib
import math
import re
from collections.abc import Iterator, Mapping

from app.batch.actions import action_column, column_of_path, row_actions
from app.batch.columns import (
    _BY_KEY,
    _ID_PATTERN,
    _KILO,
    _MILLI,
    _MM_BOW,
    _POINT_LOAD,
    _PRESET_BOWS,
    _REQUIRED,
    _SPAN_BOW,
    COLUMNS,
    SECOND_PLANE_COLUMNS,
    RowError,
    TableError,
)
from app.batch.inner import inner_data

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
    per_action_seen: dict = {}  # (kind, NAME) -> header; NAME -> name: column names ignore case
    for position, cell in enumerate(cells, start=1):
        key = cell.strip().lower()
        if key == "" and all(not c.strip() for c in cells[position - 1 :]):
            break  # trailing empty header cells, as spreadsheets write them
        column = _BY_KEY.get(key)
        try:
            per_action = column is None and action_column(cell) is not None
        except ValueError as error:
            raise TableError(f"column {position}: {error}") from None
        if per_action:
            _per_action_once(per_action_seen, position, cell.strip())
            names.append(cell.strip())
            continue
        if column is None:
            hint = ""
            if ";" in cell or "\t" in cell:
                hint = (
                    " (the columns seem to be separated by ';' or tabs; strutscope reads comma-separated "
                    "values: export as CSV with commas)"
                )
            elif re.search(r"_(kips?|ft|in|ksi|psi|lbs?|kip_ft|kip_per_ft|klf|plf|k_ft)$", key):
                # A user told "did you mean 'axial_kN'?" renames the header and keeps the kip values (an
                # independent audit): the values must be converted, not the header renamed.
                hint = (
                    " (the table reads SI columns only: kN, m, mm, kN/m; convert the values to SI, do not "
                    "just rename the header; --units us changes the results, not the input)"
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


def _per_action_once(seen: dict, position: int, header: str) -> None:
    """Refuse a per-action column given twice, in any case (``axial_G_kN`` and ``AXIAL_G_kN``: one would be
    lost or both added), and two actions whose names differ only in case (``G`` and ``g``)."""
    kind, name = action_column(header)
    key = (kind, name.upper())
    if key in seen:
        raise TableError(
            f"column {position}: {header!r} is given twice (as {seen[key]!r}; column names ignore case)"
        )
    seen[key] = header
    other = seen.setdefault(name.upper(), name)
    if other != name:
        raise TableError(
            f"column {position}: {header!r} names the action {name!r}, and another column names {other!r}: "
            "action names that differ only in case are ambiguous; write the name the same way in each column"
        )


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
                if len(cells) < len(names):
                    # A row cut short (a line broken off, a hand edit) would be solved with its last
                    # cells empty: an independent audit saw N = 0 solved as "ok" (0.047 for 0.785).
                    missing = names[len(cells) :]
                    identifier = cells[names.index("id")].strip() if names.index("id") < len(cells) else ""
                    shown = ", ".join(missing[:6]) + (", ..." if len(missing) > 6 else "")
                    yield (
                        row,
                        RowError(
                            missing[0],
                            f"the row has {len(cells)} cells but the header names {len(names)} columns: "
                            f"{shown} {'has' if len(missing) == 1 else 'have'} no cell (a line cut off?); "
                            "write an empty cell as nothing between two commas",
                            identifier,
                        ),
                    )
                    continue
                yield row, {name: cells[i].strip() for i, name in enumerate(names)}
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


def _point_loads(text: str, column: str = "point_loads") -> list[tuple[float, float]]:
    from engine.limits import MAX_LOADS

    parts = [part for part in text.split(";") if part.strip()]
    if len(parts) > MAX_LOADS:  # refused before any is read, as the engine refuses a case file's loads
        raise RowError(
            column,
            f"{column}: {len(parts)} point loads given; a member may have at most {MAX_LOADS} loads",
        )
    loads = []
    for part in parts:
        if not part.strip():
            continue
        match = _POINT_LOAD.fullmatch(part)
        if match is None:
            raise RowError(
                column,
                f"{column}: {part.strip()!r} is not a point load; write each as "
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


def _column_of(path: str, row: Mapping[str, str], load_columns: list[str], second_columns=()) -> str:
    """The table column behind an engine field path such as ``loads[1].x`` or ``supports.left``."""
    if path.startswith("second_plane"):
        rest = path[len("second_plane") :].lstrip(".")
        if rest.startswith("supports"):
            return "second_right" if rest.startswith("supports.right") else "second_left"
        if rest.startswith("loads"):
            match = re.match(r"loads\[(\d+)\]", rest)
            if match and int(match.group(1)) < len(second_columns):
                return second_columns[int(match.group(1))]
            return "second_point_loads"
        if rest.startswith("imperfection"):
            return "second_bow"
        if rest.startswith("EI"):
            return "second_EI_kNm2"
        return "second_left"
    head = re.split(r"[.\[]", path, maxsplit=1)[0]
    if head == "actions":
        return column_of_path(path, row)
    if head == "combinations":
        return "combination_rule"
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


def _engine_error(
    error: Exception, row: Mapping[str, str], load_columns: list[str], second_columns=()
) -> RowError:
    message = str(error)
    path = message.split(":", 1)[0].strip()
    column = _column_of(path, row, load_columns, second_columns)
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
    data["loads"], load_columns = _plane_loads(cell, "")
    combined = row_actions(row, _number, lambda column, text: _point_loads(text, column), _KILO)
    if combined is not None:
        data["actions"], data["combinations"] = combined
        filled = [name for name in SECOND_PLANE_COLUMNS if cell(name)]
        if filled:
            raise RowError(
                filled[0],
                f"{filled[0]}: a second plane and load cases (per-action columns) in one row are not solved "
                "yet; give the row one bending plane, or the second plane without load cases",
            )
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
    second_columns: list[str] = []
    if any(cell(name) for name in SECOND_PLANE_COLUMNS):
        data["second_plane"], second_columns = _second_plane(cell)
    inner = inner_data(cell)
    if inner:
        data.update(inner)
        if "foundation" in inner and "section" in data and "material" in data:
            # On a foundation the engine offers the member check by the second-order route alone (no table
            # of the equivalent-member routes covers a member bedded along its length); the table has no
            # routes column, so such a row is checked by that route. Restraints and steps keep the default
            # routes: the engine checks each segment between braced points as an equivalent member.
            data["check"] = {**data.get("check", {}), "routes": ["second-order"]}
    try:
        return engine.Case.from_dict(data)
    except engine.CaseError as error:
        raise _engine_error(error, row, load_columns, second_columns) from None


def _plane_loads(cell, prefix: str) -> tuple[list[dict], list[str]]:
    """One plane's loads from its ``<prefix>udl_kN_per_m`` and ``<prefix>point_loads`` cells (SI), and the
    column of each load (for naming the column behind an engine error)."""
    udl, points = f"{prefix}udl_kN_per_m", f"{prefix}point_loads"
    loads: list[dict] = []
    columns: list[str] = []
    if cell(udl):
        q = _number(udl, cell(udl), "kN/m", "2.5")
        if q != 0.0:
            loads.append({"type": "uniform", "q": q * _KILO})
            columns.append(udl)
    for force, x in _point_loads(cell(points), points):
        loads.append({"type": "point", "P": force * _KILO, "x": x})
        columns.append(points)
    return loads, columns


def _second_plane(cell) -> tuple[dict, list[str]]:
    """The case file's ``second_plane`` from the second_ columns, and the column of each of its loads."""
    for name in ("second_left", "second_right"):
        if not cell(name):
            raise RowError(
                name,
                f"{name}: the cell is empty; a member bent in a second plane needs both its supports in that "
                "plane (second_left and second_right: pinned, fixed, free or guided)",
            )
    plane: dict = {"supports": {"left": cell("second_left").lower(), "right": cell("second_right").lower()}}
    plane["loads"], columns = _plane_loads(cell, "second_")
    if cell("second_bow"):
        try:
            plane["imperfection"] = _bow(cell("second_bow"))
        except RowError as error:
            raise RowError("second_bow", "second_" + str(error)) from None
    if cell("second_EI_kNm2"):
        plane["EI"] = _number("second_EI_kNm2", cell("second_EI_kNm2"), "kN·m²", "1500") * _KILO
    return plane, columns
