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
import math
import os
import sys
import tempfile
import textwrap
from collections.abc import Sequence
from importlib import metadata, resources

from app.interrupt import clean_exit
from app.safe_text import terminal

__all__ = ["CAUTION", "DEMO_CASE", "SUMMARY_VERSION", "format_summary", "main", "summary_data"]

#: Printed with every summary, whatever the result.
CAUTION = (
    "Elastic analysis of one member in one plane. Not a full code check: lateral-torsional buckling, "
    "biaxial bending and the interaction of EN 1993-1-1 eqs. (6.61)/(6.62), class 4 sections, "
    "connections and load combinations are not checked. Check the results against your local codes "
    "and have them reviewed by a licensed engineer."
)

#: The invented demo case, package data of :mod:`assets`.
DEMO_CASE = "demo_wind_post.json"

#: Version of the layout of ``solve --json``; it grows when keys are added and changes if one changes meaning.
SUMMARY_VERSION = 1

DEFAULT_STATIONS = 401


class _InputError(Exception):
    """Input that cannot be read or is invalid; ``str()`` is what is printed after ``error: <source>:``."""

    def __init__(self, source: str, message: str) -> None:
        super().__init__(message)
        self.source = source


# --------------------------------------------------------------------------------------------------------
# Number formatting: display units, None and non-finite values shown in words.


def _ratio(value: float | None) -> str:
    from app.units import format_number

    if value is None or not math.isfinite(float(value)):
        return format_number(value)
    return f"{float(value):.3f}"


def _position(shown, x: float | None) -> str:
    """A position along the member, to three decimals of the length unit."""
    from app.units import format_number

    if x is None or not math.isfinite(float(x)):
        return format_number(x)
    return f"{float(x) * shown.length.factor:.3f} {shown.length.label}"


def _relative_error(error: float | None) -> str:
    from app.units import format_number

    # The engine gives an approximation's error as a fraction of the exact value, (approx - exact) / exact.
    if error is None or not math.isfinite(float(error)):
        return format_number(error)
    return f"{float(error):+.1%}"


def _scientific(value: float | None) -> str:
    from app.units import format_number

    if value is None or not math.isfinite(float(value)):
        return format_number(value)
    return f"{float(value):.1e}"


# --------------------------------------------------------------------------------------------------------
# Describing the case.


def _support(shown, end) -> str:
    if end.name is not None:
        return end.name
    parts = []
    for part, kind in (("translation", "translational_spring"), ("rotation", "rotational_spring")):
        value = getattr(end, part)
        if isinstance(value, str):
            parts.append(f"{part} {value}")
        else:
            parts.append(f"{part} spring {shown.show(kind, value)}")
    return ", ".join(parts)


def _load(shown, load, length: float) -> str:
    kind = getattr(load, "type", type(load).__name__)
    if kind == "uniform":
        a, b = load.span(length)
        return (
            f"uniform q = {shown.show('line_load', load.q)} from x = {_position(shown, a)} "
            f"to {_position(shown, b)}"
        )
    if kind == "linear":
        a, b = load.span(length)
        return (
            f"linear q = {shown.show('line_load', load.q_start)} to {shown.show('line_load', load.q_end)}"
            f" from x = {_position(shown, a)} to {_position(shown, b)}"
        )
    if kind == "point":
        return f"point P = {shown.show('force', load.P)} at x = {_position(shown, load.x)}"
    if kind == "couple":
        return f"couple C = {shown.show('moment', load.C)} at x = {_position(shown, load.x)}"
    return repr(load)


def _axial(shown, force: float) -> str:
    if force > 0:
        return f"{shown.show('force', force)} (compression)"
    if force < 0:
        return f"{shown.show('force', -force)} (tension)"
    return "none"


def _imperfection(shown, imperfection, length: float) -> str:
    if imperfection.shape == "none" or imperfection.amplitude == 0:
        return "none"
    # L/|a| is how bows are specified in practice (EN 1993-1-1 table 5.1 gives e0/L as 1/300 and so on).
    return (
        f"{imperfection.shape}, amplitude {shown.show('small_length', imperfection.amplitude)}"
        f" (L/{length / abs(imperfection.amplitude):.0f})"
    )


# --------------------------------------------------------------------------------------------------------
# The printed summary.


def _peak(shown, peak, kind: str) -> str:
    """The signed value at the largest magnitude, and where it is (nowhere in particular when unbounded)."""
    if not math.isfinite(float(peak.value)):
        return shown.show(kind, peak.value)
    return f"{shown.show(kind, peak.value)} at x = {_position(shown, peak.x)}"


def format_summary(source: str, case, result, units: str = "si", capacity=None) -> str:
    """Return the printed summary of `result`, the engine's solution of `case` read from `source`.

    Parameters
    ----------
    source : str
        What the case was read from, shown on the first line.
    case : engine.Case
        The case as read.
    result : engine.Result
        What ``engine.solve(case)`` returned.
    units : str
        ``"si"`` (kN, m, mm, kN·m) or ``"us"`` (kip, ft, in, kip·ft).
    capacity : engine.Capacity, optional
        What ``engine.capacity(case)`` returned, shown when given.

    Returns
    -------
    str
        Lines of text in the display units, ending with the caution.
    """
    from app.units import units as display_units

    shown = display_units(units)
    lines: list[str] = []
    add = lines.append
    add("strutscope: exact second-order analysis of one member")
    add(f"  case:         {terminal(source)}")
    add(f"  title:        {terminal(case.title) or '(untitled)'}")
    add(f"  length:       {_position(shown, case.length)}")
    if result.section is not None:
        section = result.section
        add(
            f"  section:      {section.name}, {case.axis} axis (A = {shown.show('area', section.A)}, "
            f"I = {shown.show('second_moment', section.I)})"
        )
    if result.material is not None:
        add(
            f"  material:     {result.material.name} (E = {shown.show('stress', result.material.E, 5)}, "
            f"fy = {shown.show('stress', result.material.fy, 3)})"
        )
    add(f"  EI:           {shown.show('stiffness', result.EI)}")
    add(f"  supports:     left {_support(shown, case.left)}; right {_support(shown, case.right)}")
    add(f"  axial force:  {_axial(shown, result.axial_force)}")
    if case.loads:
        add("  loads:")
        lines.extend(f"    {_load(shown, load, case.length)}" for load in case.loads)
    else:
        add("  loads:        none")
    if result.bow is not None:
        against = " (against the loads)" if result.bow.opposes_load else ""
        add(f"  initial bow:  {result.bow.label}{against}")
        if result.bow.direction_governing:
            add(f"  bow direction: {_bow_direction(shown, result.bow)}")
    else:
        add(f"  initial bow:  {_imperfection(shown, case.imperfection, case.length)}")

    add("")
    add("Elastic critical loads")
    for n, load in enumerate(result.critical_loads[:3], start=1):
        add(f"  Pcr{n} = {shown.show('force', load, 5)}")
    add(f"  effective length factor K = {_ratio(result.buckling.effective_length_factor)}")
    if result.axial_force > 0:
        add(f"  α_cr = Pcr1 / P = {_ratio(result.alpha_cr)}")
    else:
        add(f"  α_cr = {_ratio(result.alpha_cr)} (no compression)")

    add("")
    add(f"Status: {result.status}")
    if result.message:
        add(f"  {result.message}")

    first = result.first_order
    add("")
    add(f"{'Governing values':<24}{'second order':<30}first order (P = 0)")
    rows = [
        ("largest |w|", "deflection", "small_length"),
        ("largest |w + w0|", "total_offset", "small_length"),
        ("largest |M|", "moment", "moment"),
        ("largest |V|", "shear", "force"),
    ]
    for label, name, kind in rows:
        second_text = _peak(shown, getattr(result.governing, name), kind)
        first_text = "n/a" if first is None else _peak(shown, getattr(first.governing, name), kind)
        add(f"  {label:<22}{second_text:<30}{first_text}")

    reactions = result.reactions
    add("")
    add("Reactions (end values of T and M, support side; T(0) - T(L) = total transverse load)")
    add(
        f"  left end:   T = {shown.show('force', reactions.left_T)}, "
        f"M = {shown.show('moment', reactions.left_M)}"
    )
    add(
        f"  right end:  T = {shown.show('force', reactions.right_T)}, "
        f"M = {shown.show('moment', reactions.right_M)}"
    )

    amplification = result.amplification
    add("")
    add("Amplification (second order / first order)")
    from engine.results import AMPLIFICATION_DEFINITIONS as definitions

    add(f"  moment, exact:      {_ratio(amplification.moment)}  ({definitions['moment']})")
    add(
        f"  moment over M_I:    {_ratio(amplification.moment_first_order)}  "
        f"({definitions['moment_first_order']})"
    )
    if amplification.moment_bow_free is not None:
        add(
            f"  moment, no bow:     {_ratio(amplification.moment_bow_free)}  "
            f"({definitions['moment_bow_free']})"
        )
    add(f"  deflection, exact:  {_ratio(amplification.deflection)}  ({definitions['deflection']})")
    for approximation in amplification.approximations:
        against = "exact, no bow" if approximation.compared_with == "moment_bow_free" else "exact"
        add(
            f"  {approximation.name + ':':<19} {_ratio(approximation.value)}"
            f"  (error {_relative_error(approximation.error)} against {against}; {approximation.source})"
        )

    equilibrium = result.equilibrium
    add("")
    if equilibrium is None:
        # The engine gives none at a critical load, where no equilibrium exists.
        add("Equilibrium residuals (relative): n/a (no equilibrium state)")
    else:
        add(
            "Equilibrium residuals (relative): "
            f"transverse {_scientific(equilibrium.transverse)}, moment {_scientific(equilibrium.moment)}"
        )

    check = result.check
    if check is not None:
        add("")
        add(
            f"Member check ({check.settings.method}, gamma_M0 = {check.settings.gamma_M0:g}), "
            "second-order forces"
        )
        add(
            f"  utilisation:  {_utilisation(check.utilization)} ({check.kind} at "
            f"x = {_position(shown, check.x)}; {check.source})"
        )
        add(f"  strength:     {_utilisation(check.strength_utilization)} ({check.strength_kind})")
        out = check.out_of_plane
        if out is not None and out.checked:
            add(
                f"  out of plane: {_ratio(out.utilization)} (N/N_b,Rd about the {out.axis} axis; L_cr = "
                f"{shown.show('length', out.buckling_length)}, lambda_bar = {out.lambda_bar:.3f}, curve "
                f"{out.curve}, chi = {out.chi:.3f}, N_b,Rd = {shown.show('force', out.N_b_Rd, 5)})"
            )
        elif out is not None:
            add(f"  out of plane: not checked ({out.reason})")
        if check.section_class is not None:
            add(f"  section:      {check.section_class.describe()}")
    service = result.service
    if service is not None:
        add("")
        add("Service check (deflection; apart from the strength utilisation)")
        allowed = shown.show("small_length", service.allowed)
        add(
            f"  deflection:   {shown.show('small_length', abs(service.deflection))} at x = "
            f"{_position(shown, service.x)} against span/{service.limit:g} = {allowed} "
            f"({_ratio(service.utilization)})"
        )
        add(f"  basis:        {service.basis}")
    elif result.utilization is not None:
        add("")
        add(f"Member check: utilisation {_utilisation(result.utilization)}")

    if capacity is not None:
        add("")
        add(f"Capacity ({capacity.mode}: the largest axial compression at strength utilisation 1)")
        where = "" if capacity.x is None else f" at x = {_position(shown, capacity.x)}"
        add(f"  axial force:  {shown.show('force', capacity.axial_force, 5)} ({capacity.check}{where})")
        add(
            f"  load factor:  {_ratio(capacity.load_factor)} on the given axial force; "
            f"Pcr1 = {shown.show('force', capacity.critical_load, 5)}"
        )
        add(f"  {capacity.message}")

    add("")
    add("Cautions")
    for caution in result.cautions:
        if caution.code == "scope":
            continue  # printed last, always
        add(f"  [{caution.level}] {caution.message} ({caution.source})")
    add("")
    add(f"Caution: {CAUTION}")
    return "\n".join(lines)


# --------------------------------------------------------------------------------------------------------
# The machine-readable summary.


def _finite(value) -> float | None:
    """A JSON number, or None (JSON null) for no value and for the engine's non-finite values."""
    if value is None:
        return None
    value = float(value)
    return value if math.isfinite(value) else None


def _peak_data(peak) -> dict:
    return {"value": _finite(peak.value), "x": _finite(peak.x)}


def _governing_data(governing) -> dict:
    return {
        name: _peak_data(getattr(governing, name))
        for name in ("deflection", "total_offset", "moment", "shear")
    }


def _bow_direction(shown, bow) -> str:
    """Which direction of the bow governed, with both directions' values in the display units."""
    if not bow.automatic:
        return bow.direction_governing

    def said(direction, strength, moment):
        util = "" if strength is None else f"strength utilisation {_ratio(strength)}, "
        return f"{direction}: {util}max|M| {shown.show('moment', moment)}"

    both = "; ".join(said(*d) for d in bow.directions)
    return f"{bow.direction}, the worse of both directions solved ({both})"


def _definitions() -> dict:
    """What each amplification ratio divides by what (the engine's words)."""
    from engine.results import AMPLIFICATION_DEFINITIONS

    return dict(AMPLIFICATION_DEFINITIONS)


def summary_data(source: str, case, result, capacity=None) -> dict:
    """Return the machine-readable summary of a solved case (what ``solve --json`` prints).

    Every value is in SI units (m, N, N·m, Pa) and is what the engine's result holds; the keys are listed in
    the README ("Command line"). JSON has no infinity: every non-finite value (the engine's +inf at a critical
    load, ``alpha_cr`` without compression) is written null, and ``status`` says which case it is
    (``"critical"``, or ``axial_force`` <= 0 for ``alpha_cr``).

    Parameters
    ----------
    source : str
        What the case was read from.
    case : engine.Case
    result : engine.Result
        What ``engine.solve(case)`` returned.
    capacity : engine.Capacity, optional
        What ``engine.capacity(case)`` returned; ``capacity`` is null without it.

    Returns
    -------
    dict
        Ready for :func:`json.dumps` with ``allow_nan=False``.
    """
    first = result.first_order
    amplification = result.amplification
    check = result.check
    return {
        "summary_version": SUMMARY_VERSION,
        "source": source,
        "title": case.title,
        "units": "SI: m, N, N·m, Pa",
        "status": result.status,
        "stable": bool(result.stable),
        "message": result.message,
        "length": _finite(case.length),
        "EI": _finite(result.EI),
        "axial_force": _finite(result.axial_force),
        "critical_loads": [_finite(load) for load in result.critical_loads],
        "alpha_cr": _finite(result.alpha_cr),
        "effective_length_factor": _finite(result.buckling.effective_length_factor),
        "governing": _governing_data(result.governing),
        "first_order": None if first is None else _governing_data(first.governing),
        "reactions": {
            name: _finite(getattr(result.reactions, name))
            for name in ("left_T", "left_M", "right_T", "right_M")
        },
        "amplification": {
            "moment": _finite(amplification.moment),
            "deflection": _finite(amplification.deflection),
            "moment_first_order": _finite(amplification.moment_first_order),
            "moment_bow_free": _finite(amplification.moment_bow_free),
            "reference_moment": _finite(amplification.reference_moment),
            "definitions": _definitions(),
            "approximations": [
                {
                    "name": a.name,
                    "value": _finite(a.value),
                    "source": a.source,
                    "error": _finite(a.error),
                    "compared_with": a.compared_with,
                }
                for a in amplification.approximations
            ],
        },
        "equilibrium": None
        if result.equilibrium is None
        else {
            "transverse": _finite(result.equilibrium.transverse),
            "moment": _finite(result.equilibrium.moment),
        },
        "section": None if result.section is None else result.section.name,
        "material": None if result.material is None else result.material.name,
        "bow": None if result.bow is None else result.bow.label,
        "bow_direction": None
        if result.bow is None
        else {
            "used": result.bow.direction,
            "governing": result.bow.direction_governing,
            "favourable": bool(result.bow.favourable),
            "sway": _finite(result.bow.sway),
            "compared": [
                {"direction": d, "strength_utilization": _finite(u), "max_moment": _finite(m)}
                for d, u, m in result.bow.directions
            ],
        },
        "utilization": _finite(result.utilization),
        "check": None
        if check is None
        else {
            "method": check.settings.method,
            "kind": check.kind,
            "x": _finite(check.x),
            "utilization": _finite(check.utilization),
            "strength_utilization": _finite(check.strength_utilization),
            "strength_kind": check.strength_kind,
            "valid": check.valid,
            "fails": bool(check.utilization > 1.0),
            "section_class": None if check.section_class is None else check.section_class.klass,
            "out_of_plane": _out_of_plane_data(check.out_of_plane),
            "deflection_utilization": _finite(check.deflection_utilization),
            "max_deflection": _finite(check.max_deflection),
            "deflection_allowed": _finite(check.deflection_allowed),
            "source": check.source,
        },
        "service": None
        if result.service is None
        else {
            "deflection_utilization": _finite(result.service.utilization),
            "deflection": _finite(result.service.deflection),
            "x": _finite(result.service.x),
            "allowed": _finite(result.service.allowed),
            "basis": result.service.basis,
            "source": result.service.source,
        },
        "capacity": None
        if capacity is None
        else {
            "mode": capacity.mode,
            "axial_force": _finite(capacity.axial_force),
            "load_factor": _finite(capacity.load_factor),
            "check": capacity.check,
            "x": _finite(capacity.x),
            "critical_load": _finite(capacity.critical_load),
            "message": capacity.message,
        },
        "cautions": [
            {"level": c.level, "code": c.code, "message": c.message, "source": c.source}
            for c in result.cautions
        ],
    }


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


def _out_of_plane_data(out) -> dict | None:
    """The out-of-plane buckling check for the JSON summary (SI)."""
    if out is None:
        return None
    return {
        "checked": out.checked,
        "axis": out.axis,
        "reason": out.reason,
        "buckling_length": _finite(out.buckling_length),
        "N_cr": _finite(out.N_cr),
        "lambda_bar": _finite(out.lambda_bar),
        "chi": _finite(out.chi),
        "curve": out.curve,
        "N_b_Rd": _finite(out.N_b_Rd),
        "utilization": _finite(out.utilization),
    }


def _beyond_critical(result) -> bool:
    """At or above the first critical load (no stable equilibrium): exit code 1 even without ``--strict``."""
    return result.status in ("unstable", "critical")


def _utilisation(value: float | None) -> str:
    """A utilisation, with "fails" beside an infinite one (above Pcr1, or a class 4 section)."""
    text = _ratio(value)
    return f"{text} (fails)" if value is not None and math.isinf(float(value)) else text


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
