"""The ``strutscope`` console script.

``strutscope solve CASE.json`` (or ``strutscope solve --demo``) reads a case file in schema 1, solves it with
:func:`engine.solve` and prints a summary in engineering units (kN, m, mm, kN·m). Exit codes: 0 when the case
was solved (whatever its status: stable, unstable or critical), 2 when the case is invalid
(:class:`engine.CaseError`), the file cannot be read, or the command line is wrong, and 1 when the output pipe
was closed early.

This module does no mechanics: every figure it prints comes from the engine's result. The engine is imported
only when a case is solved, so ``strutscope --help`` works on its own and nothing happens at import time.
"""

from __future__ import annotations

import argparse
import json
import math
import os
import sys
from collections.abc import Sequence
from importlib import metadata, resources

__all__ = ["CAUTION", "DEMO_CASE", "format_summary", "main"]

#: Printed with every summary, whatever the result.
CAUTION = (
    "Elastic analysis of one member only. Not a full code check: lateral-torsional buckling, local buckling, "
    "connections and load combinations are not checked. Check against your local codes and have a licensed "
    "engineer review."
)

#: The invented demo case, package data of :mod:`assets`.
DEMO_CASE = "demo_wind_post.json"

DEFAULT_STATIONS = 401

_SUPPORT_PARTS = {"translation": ("kN/m", 1e-3), "rotation": ("kN·m/rad", 1e-3)}


class _InputError(Exception):
    """A case that cannot be read or is invalid; ``str()`` is the message printed after ``error: <file>:``."""

    def __init__(self, source: str, message: str) -> None:
        super().__init__(message)
        self.source = source


# --------------------------------------------------------------------------------------------------------
# Number formatting: engineering units, None and non-finite values shown in words.


def _number(value: float | None, significant: int = 4, max_decimals: int | None = None) -> str:
    """Format a number to about `significant` figures, fixed-point where that stays readable.

    With `max_decimals`, fixed-point output stops at that many decimals, so round-off noise such as a
    moment of 1e-16 kN·m at a pinned end prints as 0.
    """
    if value is None:
        return "n/a"
    value = float(value)
    if math.isnan(value):
        return "n/a"
    if math.isinf(value):
        return "unbounded" if value > 0 else "unbounded (negative)"
    if value == 0.0:
        return "0"
    magnitude = math.floor(math.log10(abs(value)))
    if max_decimals is not None and magnitude < -max_decimals:
        magnitude = -max_decimals
    if -3 <= magnitude < 7:
        decimals = max(significant - 1 - magnitude, 0)
        if max_decimals is not None:
            decimals = min(decimals, max_decimals)
        text = f"{value:.{decimals}f}"
        # A value that rounds to zero would print as "-0.000" or "0.000".
        return "0" if float(text) == 0.0 else text
    return f"{value:.{significant - 1}e}"


def _quantity(value: float | None, scale: float, unit: str, significant: int = 4) -> str:
    """Format `value` (SI) times `scale` with its engineering `unit`; no unit after n/a or unbounded.

    Engineering units print to at most three decimals (1 N, 1 N·m, 1 µm), the resolution a summary needs.
    """
    if value is None or not math.isfinite(float(value)):
        return _number(value)
    return f"{_number(float(value) * scale, significant, max_decimals=3)} {unit}"


def _kN(force: float | None, significant: int = 4) -> str:
    return _quantity(force, 1e-3, "kN", significant)


def _kNm(moment: float | None) -> str:
    return _quantity(moment, 1e-3, "kN·m")


def _mm(length: float | None) -> str:
    return _quantity(length, 1e3, "mm")


def _m(length: float | None) -> str:
    if length is None or not math.isfinite(float(length)):
        return _number(length)
    return f"{float(length):.3f} m"


def _ratio(value: float | None) -> str:
    if value is None or not math.isfinite(float(value)):
        return _number(value)
    return f"{float(value):.3f}"


def _relative_error(error: float | None) -> str:
    # The engine gives an approximation's error as a fraction of the exact value, (approx - exact) / exact.
    if error is None or not math.isfinite(float(error)):
        return _number(error)
    return f"{float(error):+.1%}"


# --------------------------------------------------------------------------------------------------------
# Describing the case.


def _support(end) -> str:
    if end.name is not None:
        return end.name
    parts = []
    for part, (unit, scale) in _SUPPORT_PARTS.items():
        value = getattr(end, part)
        if isinstance(value, str):
            parts.append(f"{part} {value}")
        else:
            parts.append(f"{part} spring {_quantity(value, scale, unit)}")
    return ", ".join(parts)


def _load(load, length: float) -> str:
    kind = getattr(load, "type", type(load).__name__)
    if kind == "uniform":
        a, b = load.span(length)
        return f"uniform q = {_quantity(load.q, 1e-3, 'kN/m')} from x = {_m(a)} to {_m(b)}"
    if kind == "linear":
        a, b = load.span(length)
        return (
            f"linear q = {_quantity(load.q_start, 1e-3, 'kN/m')} to {_quantity(load.q_end, 1e-3, 'kN/m')}"
            f" from x = {_m(a)} to {_m(b)}"
        )
    if kind == "point":
        return f"point P = {_kN(load.P)} at x = {_m(load.x)}"
    if kind == "couple":
        return f"couple C = {_kNm(load.C)} at x = {_m(load.x)}"
    return repr(load)


def _axial(force: float) -> str:
    if force > 0:
        return f"{_kN(force)} (compression)"
    if force < 0:
        return f"{_kN(-force)} (tension)"
    return "none"


def _imperfection(imperfection, length: float) -> str:
    if imperfection.shape == "none" or imperfection.amplitude == 0:
        return "none"
    # L/|a| is how bows are specified in practice (EN 1993-1-1 table 5.1 gives e0/L as 1/300 and so on).
    return (
        f"{imperfection.shape}, amplitude {_mm(imperfection.amplitude)}"
        f" (L/{length / abs(imperfection.amplitude):.0f})"
    )


# --------------------------------------------------------------------------------------------------------
# The summary.


def _peak(peak, to_text) -> str:
    """The signed value at the largest magnitude, and where it is (nowhere in particular when unbounded)."""
    if not math.isfinite(float(peak.value)):
        return to_text(peak.value)
    return f"{to_text(peak.value)} at x = {_m(peak.x)}"


def format_summary(source: str, case, result) -> str:
    """Return the printed summary of `result`, the engine's solution of `case` read from `source`.

    Parameters
    ----------
    source : str
        What the case was read from, shown on the first line.
    case : engine.Case
        The case as read.
    result : engine result
        What ``engine.solve(case)`` returned.

    Returns
    -------
    str
        Lines of text in engineering units, ending with the caution.
    """
    lines: list[str] = []
    add = lines.append
    add("strutscope: exact second-order analysis of one member")
    add(f"  case:         {source}")
    add(f"  title:        {case.title or '(untitled)'}")
    add(f"  length:       {_m(case.length)}")
    if result.section is not None:
        add(f"  section:      {result.section.name}, {case.axis} axis (A = {result.section.A * 1e4:.2f} cm², "
            f"I = {result.section.I * 1e8:.0f} cm⁴)")
    if result.material is not None:
        add(f"  material:     {result.material.name} (E = {result.material.E * 1e-6:.0f} MPa, "
            f"fy = {result.material.fy * 1e-6:.0f} MPa)")
    add(f"  EI:           {_quantity(result.EI, 1e-3, 'kN·m²')}")
    add(f"  supports:     left {_support(case.left)}; right {_support(case.right)}")
    add(f"  axial force:  {_axial(result.axial_force)}")
    if case.loads:
        add("  loads:")
        lines.extend(f"    {_load(load, case.length)}" for load in case.loads)
    else:
        add("  loads:        none")
    if result.bow is not None:
        add(f"  initial bow:  {result.bow.label}" + (" (against the loads)" if result.bow.opposes_load else ""))
    else:
        add(f"  initial bow:  {_imperfection(case.imperfection, case.length)}")

    add("")
    add("Elastic critical loads")
    for n, load in enumerate(result.critical_loads[:3], start=1):
        add(f"  Pcr{n} = {_kN(load, significant=5)}")
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
        ("largest |w|", "deflection", _mm),
        ("largest |w + w0|", "total_offset", _mm),
        ("largest |M|", "moment", _kNm),
        ("largest |V|", "shear", _kN),
    ]
    for label, field, to_text in rows:
        second_text = _peak(getattr(result.governing, field), to_text)
        first_text = "n/a" if first is None else _peak(getattr(first.governing, field), to_text)
        add(f"  {label:<22}{second_text:<30}{first_text}")

    reactions = result.reactions
    add("")
    add("Reactions (end values of T and M, support side; T(0) - T(L) = total transverse load)")
    add(f"  left end:   T = {_kN(reactions.left_T)}, M = {_kNm(reactions.left_M)}")
    add(f"  right end:  T = {_kN(reactions.right_T)}, M = {_kNm(reactions.right_M)}")

    amplification = result.amplification
    add("")
    add("Amplification (second order / first order)")
    add(f"  moment, exact:      {_ratio(amplification.moment)}")
    add(f"  deflection, exact:  {_ratio(amplification.deflection)}")
    for approximation in amplification.approximations:
        add(
            f"  {approximation.name + ':':<19} {_ratio(approximation.value)}"
            f"  (error {_relative_error(approximation.error)} against exact; {approximation.source})"
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
        add(f"Member check ({check.settings.method}, gamma_M0 = {check.settings.gamma_M0:g}), second-order forces")
        add(f"  utilisation:  {_ratio(check.utilization)} ({check.kind} at x = {_m(check.x)}; {check.source})")
        add(f"  strength:     {_ratio(check.strength_utilization)} ({check.strength_kind})")
        add(f"  deflection:   {_mm(check.max_deflection)} against span/{check.settings.deflection_limit:g} = "
            f"{_mm(check.deflection_allowed)} ({_ratio(check.deflection_utilization)})")
    elif result.utilization is not None:
        add("")
        add(f"Member check: utilisation {_ratio(result.utilization)}")

    add("")
    add("Cautions")
    for caution in result.cautions:
        if caution.code == "scope":
            continue  # printed last, always
        add(f"  [{caution.level}] {caution.message} ({caution.source})")
    add("")
    add(f"Caution: {CAUTION}")
    return "\n".join(lines)


def _scientific(value: float | None) -> str:
    if value is None or not math.isfinite(float(value)):
        return _number(value)
    return f"{float(value):.1e}"


# --------------------------------------------------------------------------------------------------------
# Command line.


def _station_count(text: str) -> int:
    try:
        count = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a whole number") from None
    if count < 2:
        raise argparse.ArgumentTypeError(f"{count} must be at least 2 (the two ends)")
    return count


def _version() -> str:
    try:
        return metadata.version("strutscope")
    except metadata.PackageNotFoundError:
        return "unknown (not installed)"


def _build_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="strutscope",
        description=(
            "Exact second-order analysis of one member under axial force and bending: deflection, moment and "
            "shear amplification under compression, and the elastic critical loads."
        ),
        epilog=CAUTION,
    )
    parser.add_argument("--version", action="version", version=f"strutscope {_version()}")
    commands = parser.add_subparsers(dest="command", metavar="COMMAND")
    solve = commands.add_parser(
        "solve",
        help="solve a case file and print a summary",
        description="Solve a case file (JSON, schema 1; SI units) and print a summary in kN, m, mm and kN·m.",
        epilog=CAUTION,
    )
    which = solve.add_mutually_exclusive_group(required=True)
    which.add_argument("case", nargs="?", metavar="CASE.json", help="the case file to solve")
    which.add_argument("--demo", action="store_true", help=f"solve the invented demo case ({DEMO_CASE})")
    solve.add_argument(
        "--stations",
        type=_station_count,
        default=DEFAULT_STATIONS,
        metavar="N",
        help=f"number of stations along the member (default {DEFAULT_STATIONS}); "
        "the engine adds the load points and the peaks",
    )
    return parser


def _read_case(args):
    """Return ``(source, case)`` for the parsed `args`; raise _InputError when it cannot be had."""
    import engine

    if args.demo:
        source = f"{DEMO_CASE} (invented demo)"
        text = resources.files("assets").joinpath(DEMO_CASE).read_text(encoding="utf-8")
    else:
        source = args.case
        try:
            with open(args.case, encoding="utf-8") as file:
                text = file.read()
        except OSError as error:
            raise _InputError(source, f"cannot read the file: {error.strerror or error}") from None
        except UnicodeDecodeError as error:
            raise _InputError(source, f"cannot read the file: not UTF-8 text ({error.reason})") from None
    try:
        return source, engine.Case.from_json(text)
    except engine.CaseError as error:
        raise _InputError(source, str(error)) from None
    except json.JSONDecodeError as error:
        raise _InputError(source, f"not valid JSON: {error}") from None


def _solve(args) -> int:
    import engine

    try:
        source, case = _read_case(args)
        try:
            result = engine.solve(case, stations=args.stations)
        except engine.CaseError as error:
            raise _InputError(source, str(error)) from None
    except _InputError as error:
        print(f"error: {error.source}: {error}", file=sys.stderr)
        return 2
    try:
        print(format_summary(source, case, result))
        sys.stdout.flush()
    except BrokenPipeError:
        # The reader went away (`strutscope solve ... | head`): say nothing more. As the Python docs advise,
        # point stdout at devnull so that the flush at exit does not raise again.
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return 1
    return 0


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
        0 when the case was solved, 2 for an invalid or unreadable case or a wrong command line.
    """
    _allow_any_text(sys.stdout)
    _allow_any_text(sys.stderr)
    parser = _build_parser()
    try:
        args = parser.parse_args(argv)
    except SystemExit as stop:  # argparse exits for --help, --version and usage errors
        return stop.code if isinstance(stop.code, int) else (0 if stop.code is None else 2)
    if args.command is None:
        # The page, shown by a bare `strutscope`, comes with a later release.
        parser.print_help()
        return 2
    if args.command == "solve":
        return _solve(args)
    return 2  # unreachable: argparse rejects unknown commands


if __name__ == "__main__":
    raise SystemExit(main())
