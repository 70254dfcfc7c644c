"""The CSV export: one row per station, units in the header."""

from __future__ import annotations

import csv
import io

import numpy as np

from app.exports.style import _title, _units
from app.report import bow_direction_text, caution_text, csv_number, general_caution, status_text, system_name
from app.report.capacity_words import capacity_line
from app.report.combinations import (
    deflection_basis,
    metadata_rows,
    second_plane_service,
    service_strength,
    utilisation_note,
)
from app.report.numbers import CSV_DIGITS
from app.report.restraints import metadata_rows as restraint_rows
from app.safe_text import csv_writer
from app.units import Units

# --------------------------------------------------------------------------------------------------------
# CSV.


def _csv_columns(result, U: Units):
    """(header, SI array, unit kind or None) for every CSV column."""
    first = result.first_order
    sl, rot, mom, frc = (U.label(k) for k in ("small_length", "rotation", "moment", "force"))
    columns = [
        (f"x [{U.label('length')}]", result.x, "length"),
        (f"w [{sl}]", result.deflection, "small_length"),
    ]
    if first is not None:
        columns.append((f"w1 [{sl}]", first.deflection, "small_length"))
    columns += [
        (f"w0 [{sl}]", result.initial_bow, "small_length"),
        (f"w+w0 [{sl}]", result.total_offset, "small_length"),
    ]
    if first is not None:
        columns.append((f"w1+w0 [{sl}]", first.total_offset, "small_length"))
    for name, field, kind, unit in (
        ("rotation", "rotation", "rotation", rot),
        ("M", "moment", "moment", mom),
        ("V", "shear", "force", frc),
        ("T", "transverse_force", "force", frc),
    ):
        columns.append((f"{name} [{unit}]", getattr(result, field), kind))
        if first is not None:
            columns.append((f"{name}1 [{unit}]", getattr(first, field), kind))
    check = result.check
    if check is not None:
        at = getattr(check, "at", None)
        same = at is None
        for header, values in (
            ("utilisation [-]", check.stations),
            ("utilisation axial+bending [-]", check.axial_bending),
            ("utilisation shear [-]", check.shear),
        ):
            # A two-plane check runs on both planes' stations merged: at the rows' stations, the larger side.
            columns.append((header, values if same else _at_rows(result.x, at, values, larger=True), None))
    elif result.utilization is not None:
        # At a critical load the engine gives no check along the member, only the governing utilisation
        # (+inf), which then holds at every station.
        columns.append(("utilisation [-]", np.full(len(result.x), float(result.utilization)), None))
    return columns + _second_plane_columns(result, U)


def _second_plane_columns(result, U: Units):
    """The second bending plane's columns at the same stations, named by the axis they bend about (_z about
    the minor axis, _y about the major), or none for a one-plane case.

    The second plane is solved at its own stations (its loads sit elsewhere); its values are given at the
    first plane's x by linear interpolation between its stations, which hold its exact peaks, and a station
    of a jump in the first plane takes the second plane's value there.
    """
    second = getattr(result, "second_plane", None)
    if second is None:
        return []
    suffix = "y" if getattr(result.case, "axis", "major") == "minor" else "z"
    x = np.asarray(result.x, dtype=float)
    sx = np.asarray(second.x, dtype=float)
    sl, rot, mom, frc = (U.label(k) for k in ("small_length", "rotation", "moment", "force"))
    columns = []
    for name, field, kind, unit in (
        ("w", "deflection", "small_length", sl),
        ("w0", "initial_bow", "small_length", sl),
        ("rotation", "rotation", "rotation", rot),
        ("M", "moment", "moment", mom),
        ("V", "shear", "force", frc),
    ):
        values = np.asarray(getattr(second, field), dtype=float)
        same = sx.shape == x.shape and np.array_equal(sx, x)
        columns.append((f"{name}_{suffix} [{unit}]", values if same else _at_rows(x, sx, values), kind))
    return columns


def _at_rows(x, xp, fp, *, larger: bool = False) -> np.ndarray:
    """Values `fp` at stations `xp` (a node with a jump listed twice, left side first), at the rows' `x`.

    Linear between stations. At a position listed twice in `x` the first row takes the left side and the
    second the right; at a position listed once in `x` but twice in `xp` (the other plane's node) the side of
    the larger magnitude (or, with `larger`, the larger value), so that no peak is lost on the safe side.
    """
    x, xp, fp = (np.asarray(a, dtype=float) for a in (x, xp, fp))
    right = np.interp(x, xp, fp)
    left = np.interp(-x, -xp[::-1], fp[::-1])
    first_of_pair = np.zeros(x.size, dtype=bool)
    second_of_pair = np.zeros(x.size, dtype=bool)
    twin = np.nonzero(np.diff(x) == 0)[0]
    first_of_pair[twin], second_of_pair[twin + 1] = True, True
    if larger:
        either = np.maximum(left, right)
    else:
        either = np.where(np.abs(left) >= np.abs(right), left, right)
    return np.where(first_of_pair, left, np.where(second_of_pair, right, either))


#: The byte order mark that starts the CSV: spreadsheets read the file as UTF-8 with it (and as a legacy
#: code page without it, which garbles kN·m and accented titles).
BOM = "\ufeff"


def _amplification_rows(result) -> list:
    """The CSV's metadata rows for the exact amplifications, each with its definition."""
    from engine.results import AMPLIFICATION_DEFINITIONS as words

    amp = result.amplification
    rows = []
    for key in ("moment", "moment_first_order", "moment_bow_free", "deflection"):
        value = getattr(amp, key)
        if value is not None:
            rows.append((f"amplification {key} [-]", csv_number(value), words[key]))
    return rows


def _metadata(result, U: Units, capacity=None) -> list:
    """The metadata rows: a key (starting "# "), a value and perhaps a note, each one cell."""
    force = U.label("force")
    rows = [
        ("strutscope", "exact second-order analysis of one member"),
        ("title", _title(result)),
        ("units", system_name(U)),
        (
            f"axial force N [{force}]",
            csv_number(U.convert("force", result.axial_force)),
            "compression positive",
        ),
        (f"Pcr1 [{force}]", csv_number(U.convert("force", float(result.critical_loads[0])))),
        ("status", status_text(result, U)),
    ]
    if result.utilization is not None:
        fails = "fails (> 1); " if result.utilization > 1.0 else ""
        rows.append(("utilisation [-]", csv_number(result.utilization), fails + utilisation_note(result)))
    elif service_strength(result):  # a service combination shown: strength is the ultimate combinations'
        rows.append(("utilisation [-]", "", f"strength and stability {service_strength(result)}"))
    if capacity is not None:  # the same case's (`--capacity`, or the page's)
        force = U.convert("force", capacity.axial_force)
        note = capacity_line(capacity, U, result)
        rows.append((f"axial capacity [{U.label('force')}]", csv_number(force), note))
    if result.service is not None:
        note = deflection_basis(result, long=True)
        rows.append(("deflection utilisation [-]", csv_number(result.service.utilization), note))
    second = second_plane_service(result)
    if second is not None:
        label, service, basis = second  # no comma in a key: a line that starts with "# " is a comment
        rows.append(
            ("deflection utilisation second plane [-]", csv_number(service.utilization), f"{label}; {basis}")
        )
    rows += _amplification_rows(result)
    rows += _plane_and_route_rows(result, U)
    actions = getattr(result, "actions", None)
    if actions is not None:
        rows += metadata_rows(actions, result, U)
    rows += _ltb_rows(result, U)
    rows += restraint_rows(result, U)
    if result.bow is not None and result.bow.direction_governing:
        rows.append(("bow direction", bow_direction_text(result.bow, U)))
    rows.append(
        (
            "columns",
            "columns ending in 1 are first order (N = 0) at the same stations; a station at a point load or "
            "couple appears twice; inf marks a value that is unbounded at a critical load",
        )
    )
    # Every caution, most severe first, as the page and the calc sheet list them (the CSV held the general
    # one only: an audit found a timber member's "not a code check" danger left out of it).
    for caution in result.cautions:
        if caution.code != "scope":
            rows.append((f"caution ({caution.level})", caution_text(caution, U), caution.source))
    rows.append(("caution", general_caution(result)))
    return rows


def _plane_and_route_rows(result, U: Units) -> list:
    """The metadata rows of the second plane (Pcr1, peaks) and of each route (utilisation, governing term)."""
    from app.report import routes

    rows = []
    second = getattr(result, "second_plane", None)
    if second is not None:
        own, other = routes.plane_axes(result)
        suffix = "y" if other == "major" else "z"
        force, moment = U.label("force"), U.label("moment")
        rows.append(("second plane", routes.plane_name(other), f"columns ending in _{suffix}"))
        rows.append(
            (f"Pcr1_{suffix} [{force}]", csv_number(U.convert("force", float(second.critical_loads[0]))))
        )
        peak = second.governing.moment
        rows.append((f"max|M_{suffix}| [{moment}]", csv_number(U.convert("moment", abs(peak.value)))))
    for row in routes.route_rows(result, U):
        value = "" if row["value"] is None else csv_number(row["value"])
        governing = "" if row["term_in_words"] else row["governing"]
        # With load cases the value is the shown combination's own: the words name it (and any larger one).
        words = row["utilisation"] if row["combination"] and row["value"] is not None else ""
        # How a setting of the case reaches the route (app.report.route_notes), after its status.
        said = tuple(f"[{level}] {text}" for level, text in row["setting_notes"])
        note = "; ".join(part for part in (words, governing, row["status"], row["reason"], *said) if part)
        rows.append((f"route {row['name']} [-]", value, note))
    return rows


def _ltb_rows(result, U: Units) -> list:
    """The metadata rows of the lateral-torsional buckling check (major axis), or none without a check."""
    from app.report.ltb import ltb_of, ltb_words
    from app.report.numbers import ratio

    words = ltb_words(result, U)
    if words is None:
        return []
    if not words.applies:
        return [("LTB", "not checked", words.reason)]
    ltb = ltb_of(result)
    moment = U.label("moment")
    rows = [("LTB", "checked", words.settings)]
    for key, value, kind, note in (
        ("M_cr exact", ltb.M_cr, "moment", "exact, for this moment diagram; inf: no lateral buckling"),
        ("M_cr tabulated", ltb.M_cr_tabulated, "moment", f"C1 = {ratio(ltb.C1)}, diagram {ltb.diagram}"),
        ("M_cr difference", ltb.difference, None, "tabulated / exact - 1"),
        ("lambda_LT", ltb.lambda_LT, None, ""),
        ("chi_LT", ltb.chi_LT, None, f"curve {ltb.curve}, EN 1993-1-1 §{ltb.method}"),
        ("M_b_Rd", ltb.M_b_Rd, "moment", "M_b,Rd"),
        ("LTB utilisation", ltb.utilisation, None, "M_Ed / M_b,Rd"),
    ):
        unit = "-" if kind is None else moment
        number = csv_number(value if kind is None else U.convert(kind, float(value)))
        rows.append((f"{key} [{unit}]", number, note) if note else (f"{key} [{unit}]", number))
    return rows


def csv_text(result, *, units="si", capacity=None) -> str:
    """Return the stations of `result` as CSV text, one row per station, with units in the header.

    The text starts with a byte order mark (U+FEFF), so that a spreadsheet reads it as UTF-8 (kN·m, ç). The
    metadata lines come first, each starting with ``#`` (readers told to skip comments skip them): the key in
    the first cell, the value in the second, a note in the third, each value one cell however many commas it
    holds. They give the title, the units, the axial force, Pcr1, the status, the utilisations, the
    amplifications and the general caution. Columns: ``x``, ``w``, ``w1`` (the subscript 1 marks first
    order, N = 0), ``w0``, ``w+w0``, ``w1+w0``, ``rotation``, ``rotation1``, ``M``, ``M1``, ``V``, ``V1``,
    ``T``, ``T1``, and the utilisations when the result has a member check. Where a point load or couple
    acts, its station appears twice (the values either side). Unbounded values (at a critical load) are
    written ``inf``.

    Parameters
    ----------
    result : engine.Result
    units : str or Units
    capacity : engine.Capacity or None
        The axial capacity of the same case, as a metadata row.

    Returns
    -------
    str
        CSV text with ``\\n`` line ends, numbers to :data:`app.report.numbers.CSV_DIGITS` significant figures.
    """
    U = _units(units)
    columns = _csv_columns(result, U)
    out = io.StringIO()
    out.write(BOM)
    writer = csv_writer(out, lineterminator="\n")
    for key, *values in _metadata(result, U, capacity):
        writer.writerow([f"# {key}", *(" ".join(str(v).split()) for v in values)])
    writer.writerow([header for header, _, _ in columns])
    data = []
    for _, values, kind in columns:
        values = np.asarray(values, dtype=float)
        data.append(_column_cells(values if kind is None else U.convert(kind, values)))
    # Every cell below is a number written by csv_number, which no spreadsheet takes for a formula: the plain
    # writer is enough (and several times faster than checking each cell).
    csv.writer(out, lineterminator="\n").writerows(zip(*data, strict=True))
    return out.getvalue()


def _column_cells(values: np.ndarray) -> list[str]:
    """:func:`app.report.csv_number` of every value of one column, formatted in one pass."""
    digits = f".{CSV_DIGITS}g"
    finite_values = values[np.isfinite(values)]
    if finite_values.size:  # rounding of a zero (M at a pin: 4.6e-15 kN·m) written 0, as the page shows it
        tiny = 1e-12 * float(np.abs(finite_values).max())
        values = np.where(np.abs(values) <= tiny, 0.0, values)
    cells = [format(v, digits) for v in values.tolist()]
    return ["0" if cell == "-0" else cell for cell in cells]
