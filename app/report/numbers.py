"""The number formatters every output shares (command line, exports, batch, page).

Each takes a plain number (already in its display unit, or dimensionless) and returns text; ``None``, NaN and
the engine's infinite values at a critical load are written in words by :func:`app.units.format_number`.
"""

from __future__ import annotations

import math

from app.units import Units, format_number

__all__ = [
    "csv_number",
    "finite",
    "format_number",
    "percent",
    "position",
    "ratio",
    "scientific",
    "utilisation",
]

#: Significant figures of the numbers in a CSV export: far beyond what a drawing or a hand check needs, and
#: short enough to read in a spreadsheet (repr gave 17, with noise digits such as 6.000000000000001).
CSV_DIGITS = 6


def finite(value) -> bool:
    """True for a number that is neither None, NaN nor infinite."""
    return value is not None and math.isfinite(float(value))


def ratio(value, decimals: int = 3) -> str:
    """A dimensionless ratio (utilisation, amplification, α_cr) to `decimals` decimals, e.g. ``"0.423"``."""
    if not finite(value):
        return format_number(value)
    return f"{float(value):.{decimals}f}"


def utilisation(value) -> str:
    """A utilisation, with "(fails)" beside an unbounded one (above Pcr1, or a class 4 section)."""
    text = ratio(value)
    return f"{text} (fails)" if value is not None and math.isinf(float(value)) else text


def percent(value) -> str:
    """A relative difference (approximation - exact) / exact as a signed percentage, e.g. ``"+0.4%"``."""
    if not finite(value):
        return format_number(value)
    return f"{float(value):+.1%}"


def scientific(value) -> str:
    """A small residual in scientific notation, e.g. ``"-5.7e-17"``."""
    if not finite(value):
        return format_number(value)
    return f"{float(value):.1e}"


def position(U: Units, x) -> str:
    """A position along the member [m, SI] to three decimals of the length unit, e.g. ``"2.200 m"``."""
    if not finite(x):
        return format_number(x)
    return f"{float(x) * U.length.factor:.3f} {U.length.label}"


def csv_number(value) -> str:
    """A CSV cell: :data:`CSV_DIGITS` significant figures, ``inf``/``-inf``/``nan`` as Python writes them.

    >>> csv_number(6.000000000000001), csv_number(-0.0123456789), csv_number(float("inf")), csv_number(0.0)
    ('6', '-0.0123457', 'inf', '0')
    """
    value = float(value)
    if not math.isfinite(value):
        return repr(value)
    text = f"{value:.{CSV_DIGITS}g}"
    return "0" if text in ("0", "-0") else text
