"""The CSV export: one row per station, units in the header."""

from __future__ import annotations

import io

import numpy as np

from app.exports.style import _title, _units
from app.report import bow_direction_text, general_caution, status_text, system_name
from app.safe_text import csv_comment, csv_writer
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
        columns += [
            ("utilisation [-]", check.stations, None),
            ("utilisation axial+bending [-]", check.axial_bending, None),
            ("utilisation shear [-]", check.shear, None),
        ]
    elif result.utilization is not None:
        # At a critical load the engine gives no check along the member, only the governing utilisation
        # (+inf), which then holds at every station.
        columns.append(("utilisation [-]", np.full(len(result.x), float(result.utilization)), None))
    return columns


def _number_text(value: float) -> str:
    # repr is the shortest text that reads back as the same float: full precision, no noise digits.
    return repr(float(value))


def _amplification_comments(result) -> list:
    """The CSV's comment lines for the exact amplifications, each with its definition."""
    from engine.results import AMPLIFICATION_DEFINITIONS as words

    amp = result.amplification
    lines = []
    for key in ("moment", "moment_first_order", "moment_bow_free", "deflection"):
        value = getattr(amp, key)
        if value is not None:
            lines.append(f"amplification {key} [-]: {_number_text(value)} ({words[key]})")
    return lines


def csv_text(result, *, units="si") -> str:
    """Return the stations of `result` as CSV text, one row per station, with units in the header.

    Leading comment lines (starting with ``"# "``) give the title, the units, the axial force, Pcr1, the
    status and the general caution. Columns: ``x``, ``w``, ``w1`` (the subscript 1 marks first order, N = 0),
    ``w0``, ``w+w0``, ``w1+w0``, ``rotation``, ``rotation1``, ``M``, ``M1``, ``V``, ``V1``, ``T``, ``T1``, and
    the utilisations when the result has a member check. Where a point load or couple acts, its station
    appears twice (the values either side). Unbounded values (at a critical load) are written ``inf``.

    Parameters
    ----------
    result : engine.Result
    units : str or Units

    Returns
    -------
    str
        CSV text with ``\\n`` line ends, numbers at full precision (Python ``repr``).
    """
    U = _units(units)
    columns = _csv_columns(result, U)
    out = io.StringIO()
    pcr1 = float(result.critical_loads[0])
    comments = [
        "strutscope: exact second-order analysis of one member",
        f"title: {_title(result)}",
        f"units: {system_name(U)}",
        f"axial force [{U.label('force')}]: {_number_text(U.convert('force', result.axial_force))} "
        "(compression positive)",
        f"Pcr1 [{U.label('force')}]: {_number_text(U.convert('force', pcr1))}",
        f"status: {status_text(result, U)}",
        *(
            [
                f"utilisation [-]: {_number_text(result.utilization)} (strength and stability; "
                "the deflection check is apart)"
            ]
            if result.utilization is not None
            else []
        ),
        *(
            [
                f"deflection utilisation [-]: {_number_text(result.service.utilization)} (service check: "
                f"{result.service.basis})"
            ]
            if result.service is not None
            else []
        ),
        *_amplification_comments(result),
        *(
            [f"bow direction: {bow_direction_text(result.bow, U)}"]
            if result.bow is not None and result.bow.direction_governing
            else []
        ),
        "columns ending in 1 are first order (N = 0) at the same stations; a station at a point load or "
        "couple appears twice; inf marks a value that is unbounded at a critical load",
        f"caution: {general_caution(result)}",
    ]
    for line in comments:
        out.write(csv_comment(line) + "\n")
    writer = csv_writer(out, lineterminator="\n")
    writer.writerow([header for header, _, _ in columns])
    data = []
    for _, values, kind in columns:
        values = np.asarray(values, dtype=float)
        data.append(values if kind is None else U.convert(kind, values))
    for row in zip(*data, strict=True):
        writer.writerow([_number_text(v) for v in row])
    return out.getvalue()
