"""Checking input values: the one home of the helpers every input module uses to refuse a bad value.

Every refusal is a :class:`engine.errors.CaseError` whose message starts with the field path, shows the value
received (shortened to 60 characters) and says what is allowed, e.g.
``loads[0].x: -1.0 m must be >= 0 m`` or ``shape: 'rhss' is not allowed (did you mean 'rhs'?); allowed: ...``.
The case (:mod:`engine.case`, :mod:`engine.loads`, :mod:`engine.inputs`), the sections, the materials and the
code formulas (:mod:`engine.codes`) all word their messages through these functions, so a message reads the
same wherever the value was typed.

This module is the bottom layer of the engine: it imports nothing of the engine but :mod:`engine.errors`.
"""

from __future__ import annotations

import difflib
import math
import numbers
from collections.abc import Iterator, Mapping
from contextlib import contextmanager
from typing import Any

from engine.errors import CaseError

__all__ = [
    "check_keys",
    "choice",
    "dimension",
    "expect_mapping",
    "flag",
    "is_bool",
    "join",
    "positive",
    "quoted",
    "real",
    "set_field",
    "show",
    "suggestion",
    "within",
]

_REPR_LIMIT = 60


def is_bool(value: Any) -> bool:
    """Whether ``value`` is a boolean, Python's or numpy's (``numpy.bool_`` is no subclass of bool)."""
    return isinstance(value, bool) or type(value).__name__ in ("bool_", "bool")


def show(value: Any) -> str:
    """A short repr of a received value for an error message (numbers as Python numbers, 60 characters)."""
    if isinstance(value, numbers.Integral) and not is_bool(value):
        text = repr(int(value))
    elif isinstance(value, numbers.Real) and not is_bool(value):
        try:
            text = repr(float(value))
        except (OverflowError, ValueError):
            text = repr(value)
    else:
        text = repr(value)
    if len(text) > _REPR_LIMIT:
        text = text[: _REPR_LIMIT - 3] + "..."
    return text


def quoted(choices: tuple[str, ...] | list[str]) -> str:
    """The allowed words, quoted and separated by commas."""
    return ", ".join(repr(choice) for choice in choices)


def suggestion(word: Any, choices: tuple[str, ...] | list[str], n: int = 1) -> str:
    """`` (did you mean 'x'?)`` for the nearest of ``choices`` (up to ``n`` of them), or an empty string."""
    if not isinstance(word, str):
        return ""
    lowered = {choice.lower(): choice for choice in choices if choice}
    matches = difflib.get_close_matches(word.lower(), list(lowered), n=n, cutoff=0.6)
    if not matches:
        return ""
    return f" (did you mean {' or '.join(repr(lowered[match]) for match in matches)}?)"


def _requirement(
    unit: str, minimum: float | None, minimum_exclusive: bool, maximum: float | None, magnitude: float | None
) -> str:
    """Describe a range in words, e.g. ``> 0 and <= 1000 m``; empty when unbounded."""
    suffix = f" {unit}" if unit else ""
    if magnitude is not None:
        return f"between -{magnitude:g} and {magnitude:g}{suffix}"
    parts = []
    if minimum is not None:
        parts.append(f"{'>' if minimum_exclusive else '>='} {minimum:g}")
    if maximum is not None:
        parts.append(f"<= {maximum:g}")
    return " and ".join(parts) + suffix if parts else ""


def real(
    path: str,
    value: Any,
    unit: str = "",
    *,
    minimum: float | None = None,
    minimum_exclusive: bool = False,
    maximum: float | None = None,
    magnitude: float | None = None,
) -> float:
    """Check that ``value`` is a finite real number in range and return it as a float.

    Parameters
    ----------
    path : str
        Field path used in the error message, e.g. ``"loads[0].q"``.
    value : object
        The value received.
    unit : str
        Unit shown in the message, e.g. ``"m"``.
    minimum, maximum : float or None
        Bounds, inclusive unless ``minimum_exclusive``.
    magnitude : float or None
        Largest allowed absolute value.

    Returns
    -------
    float
        The value as a Python float.

    Raises
    ------
    CaseError
        For a bool, a non-number, NaN, infinity or a value out of range.

    Examples
    --------
    >>> real("length", 6, "m", minimum=0.001, maximum=1000.0)
    6.0
    >>> real("length", -1.0, "m", minimum=0.001)
    Traceback (most recent call last):
    ...
    engine.errors.CaseError: length: -1.0 m must be >= 0.001 m
    """
    requirement = _requirement(unit, minimum, minimum_exclusive, maximum, magnitude)
    if requirement:
        allowed = f"it must be a finite number {requirement}"
    else:
        allowed = f"it must be a finite number [{unit}]" if unit else "it must be a finite number"
    if is_bool(value):
        raise CaseError(f"{path}: {value!r} is a boolean, not a number; {allowed}")
    if not isinstance(value, numbers.Real):
        raise CaseError(f"{path}: {show(value)} is not a number; {allowed}")
    try:
        number = float(value)
    except (OverflowError, ValueError):
        raise CaseError(f"{path}: {show(value)} is too large for a float; {allowed}") from None
    suffix = f" {unit}" if unit else ""
    if not math.isfinite(number):
        raise CaseError(f"{path}: {number!r}{suffix} is not finite; {allowed}")
    in_range = True
    if magnitude is not None and abs(number) > magnitude:
        in_range = False
    if minimum is not None and (number <= minimum if minimum_exclusive else number < minimum):
        in_range = False
    if maximum is not None and number > maximum:
        in_range = False
    if not in_range:
        raise CaseError(f"{path}: {number!r}{suffix} must be {requirement}")
    return number


def positive(
    path: str, value: Any, unit: str = "", *, allow_zero: bool = False, allow_infinite: bool = False
) -> float:
    """A number > 0 (>= 0 with ``allow_zero``; finite unless ``allow_infinite``) as a float, else a CaseError.

    >>> positive("material.fy", 355e6, "Pa")
    355000000.0
    >>> positive("material.fy", -1.0, "Pa")
    Traceback (most recent call last):
    ...
    engine.errors.CaseError: material.fy: -1.0 Pa must be finite and > 0
    """
    requirement = f"{'>=' if allow_zero else '>'} 0"
    unit_text = f" {unit}" if unit else ""
    finite = "" if allow_infinite else "finite "
    if isinstance(value, bool) or not isinstance(value, numbers.Real):
        raise CaseError(
            f"{path}: {show(value)} is not a number; it must be a {finite}number {requirement}{unit_text}"
        )
    number = float(value)
    bad = (
        math.isnan(number)
        or (math.isinf(number) and not allow_infinite)
        or number < 0
        or (number == 0 and not allow_zero)
    )
    if bad:
        finite_and = "" if allow_infinite else "finite and "
        raise CaseError(f"{path}: {number!r}{unit_text} must be {finite_and}{requirement}")
    return number


def dimension(path: str, value: Any, unit: str, maximum: float | None = None) -> float:
    """A finite number > 0 (and <= ``maximum``, with a hint that dimensions are in metres) as a float."""
    number = real(path, value, unit, minimum=0.0, minimum_exclusive=True)
    if maximum is not None and number > maximum:
        raise CaseError(
            f"{path}: {number!r} {unit} must be <= {maximum:g} {unit} "
            "(dimensions are in metres: 200 mm is 0.2)"
        )
    return number


def flag(path: str, value: Any) -> bool:
    """``value`` as a bool when it is one (Python's or numpy's), else a CaseError."""
    if not is_bool(value):
        raise CaseError(f"{path}: {show(value)} is not allowed; it must be true or false")
    return bool(value)


def choice(
    path: str, value: Any, choices: tuple[str, ...], what: str = "allowed", *, shown: Any = None
) -> str:
    """``value`` when it is one of ``choices``, else a CaseError; ``shown`` is the value as the user gave."""
    if not isinstance(value, str) or value not in choices:
        shown = value if shown is None else shown
        raise CaseError(
            f"{path}: {show(shown)} is not {what}{suggestion(value, choices)}; allowed: {quoted(choices)}"
        )
    return value


def set_field(instance: Any, name: str, value: Any) -> None:
    """Store a normalised value on a frozen dataclass during ``__post_init__``."""
    object.__setattr__(instance, name, value)


@contextmanager
def within(prefix: str) -> Iterator[None]:
    """Re-raise a CaseError from a nested object with the path prefix of that object."""
    try:
        yield
    except CaseError as error:
        raise CaseError(f"{prefix}.{error}") from None


def join(path: str, key: str) -> str:
    """The path of ``key`` inside ``path`` (the case's own keys have no prefix)."""
    return key if path == "case" else f"{path}.{key}"


def check_keys(path: str, mapping: Mapping, allowed: tuple[str, ...], required: tuple[str, ...] = ()) -> None:
    """Reject unknown keys (with a near-match suggestion) and name a missing required key."""
    for key in mapping:
        if key not in allowed:
            raise CaseError(
                f"{path}: unknown key {show(key)}{suggestion(key, allowed)}; allowed keys: {quoted(allowed)}"
            )
    for key in required:
        if key not in mapping:
            raise CaseError(f"{join(path, key)}: required key is missing")


def expect_mapping(path: str, value: Any, what: str) -> Mapping:
    """``value`` when it is a mapping, else a CaseError saying what was expected."""
    if not isinstance(value, Mapping):
        raise CaseError(f"{path}: {show(value)} is not an object; expected {what}")
    return value
