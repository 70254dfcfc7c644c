"""The case: one member, its supports, axial force, transverse loads and initial bow.

A case is a frozen, keyword-only value object. Every class validates itself on
construction, so a case built in Python is checked exactly like one read from a file,
and every problem is a :class:`engine.errors.CaseError` whose message names the field
path, the value received and what is allowed, for example
``loads[2].x: 7.5 m lies outside the member (0 to 6 m)``.

Case files are JSON, schema 1, as set out in the project's conventions (SI units:
m, N, N·m, N/m, N·m/rad). :meth:`Case.from_dict` and :meth:`Case.to_dict` convert
between a case and the file's mapping, and ``Case.from_dict(c.to_dict()) == c``.

Change a case with :func:`dataclasses.replace`, which validates the new case again.
"""

from __future__ import annotations

import dataclasses
import difflib
import json
import math
import numbers
import os
from collections.abc import Iterator, Mapping
from contextlib import contextmanager, suppress
from dataclasses import dataclass, field
from typing import Any, ClassVar

from engine import limits
from engine.errors import CaseError

__all__ = [
    "CoupleLoad",
    "Case",
    "EndSupport",
    "IMPERFECTION_PRESETS",
    "IMPERFECTION_SHAPES",
    "Imperfection",
    "LinearLoad",
    "Load",
    "PointLoad",
    "SCHEMA_VERSION",
    "SUPPORT_NAMES",
    "Spec",
    "UniformLoad",
    "load_case",
    "save_case",
]

#: The case-file schema version this module reads and writes.
SCHEMA_VERSION = 1

#: Named end supports as (translation, rotation) restraints.
_NAMED_SUPPORTS: dict[str, tuple[str, str]] = {
    "pinned": ("fixed", "free"),
    "fixed": ("fixed", "fixed"),
    "free": ("free", "free"),
    "guided": ("free", "fixed"),
}

#: The support names a case file may use for an end.
SUPPORT_NAMES: tuple[str, ...] = tuple(_NAMED_SUPPORTS)

#: The initial-bow shapes a case may use.
IMPERFECTION_SHAPES: tuple[str, ...] = ("none", "sine", "parabola", "sway", "mode")

#: The code presets for the bow amplitude (engine.member explains each).
IMPERFECTION_PRESETS: tuple[str, ...] = ("en1993-table-5.1", "en1993-eq-5.9", "aisc-l/1000", "span")
_CURVES = ("auto", "a0", "a", "b", "c", "d")
_ANALYSES = ("elastic", "plastic")
_DIRECTIONS = ("load", "positive", "negative")
_AXES = ("major", "minor")

_RESTRAINTS = ("fixed", "free")

# Bounds that keep every input inside what the solver handles in double precision.
_MAX_LENGTH = 1000.0  # [m]
# [m]: shorter than any member; fuzzing found L = 1e-200, whose L² underflows to zero in the critical loads.
_MIN_LENGTH = 1e-3
_MAX_EI = 1e16  # [N·m²]
# [N·m²]: below any structural member (a 1 mm steel wire has about 1e-2); smaller values only reach
# the limits of double precision (found by fuzzing: EI = 1e-308 overflowed the spring scaling).
_MIN_EI = 1e-3
_MAX_AXIAL_FORCE = 1e12  # [N]
_MAX_FORCE = 1e12  # [N/m] for line loads, [N] for point loads
_MAX_COUPLE = 1e13  # [N·m]
_MAX_SPRING = 1e18  # [N/m] or [N·m/rad]
_MAX_TITLE = 200  # characters
# Positions within this fraction of the length outside the member are read as the end
# itself, so rounding in a file (6.000000000001 on a 6 m member) is not an error.
_POSITION_TOLERANCE = 1e-9

_REPR_LIMIT = 60


# ----------------------------------------------------------------------------- helpers


def _show(value: Any) -> str:
    """Return a short repr of a received value for an error message."""
    if isinstance(value, numbers.Integral) and not _is_bool(value):
        text = repr(int(value))
    elif isinstance(value, numbers.Real) and not _is_bool(value):
        try:
            text = repr(float(value))
        except (OverflowError, ValueError):
            text = repr(value)
    else:
        text = repr(value)
    if len(text) > _REPR_LIMIT:
        text = text[: _REPR_LIMIT - 3] + "..."
    return text


def _is_bool(value: Any) -> bool:
    # numpy.bool_ is not a subclass of bool, so match it by name too.
    return isinstance(value, bool) or type(value).__name__ in ("bool_", "bool")


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


def _real(
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
    """
    requirement = _requirement(unit, minimum, minimum_exclusive, maximum, magnitude)
    if requirement:
        allowed = f"it must be a finite number {requirement}"
    else:
        allowed = f"it must be a finite number [{unit}]" if unit else "it must be a finite number"
    if _is_bool(value):
        raise CaseError(f"{path}: {value!r} is a boolean, not a number; {allowed}")
    if not isinstance(value, numbers.Real):
        raise CaseError(f"{path}: {_show(value)} is not a number; {allowed}")
    try:
        number = float(value)
    except (OverflowError, ValueError):
        raise CaseError(f"{path}: {_show(value)} is too large for a float; {allowed}") from None
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


def _optional_position(path: str, value: Any) -> float | None:
    """Check an optional start/end position [m]; the member's length is checked by the case."""
    if value is None:
        return None
    return _real(path, value, "m")


def _suggestion(word: Any, choices: tuple[str, ...] | list[str]) -> str:
    """Return `` (did you mean 'x'?)`` for the nearest choice, or an empty string."""
    if not isinstance(word, str):
        return ""
    lowered = {choice.lower(): choice for choice in choices}
    matches = difflib.get_close_matches(word.lower(), list(lowered), n=1, cutoff=0.6)
    return f" (did you mean {lowered[matches[0]]!r}?)" if matches else ""


def _quoted(choices: tuple[str, ...] | list[str]) -> str:
    return ", ".join(repr(choice) for choice in choices)


def _set(instance: Any, name: str, value: Any) -> None:
    """Store a normalised value on a frozen dataclass during ``__post_init__``."""
    object.__setattr__(instance, name, value)


@contextmanager
def _within(prefix: str) -> Iterator[None]:
    """Re-raise a CaseError from a nested object with the path prefix of that object."""
    try:
        yield
    except CaseError as error:
        raise CaseError(f"{prefix}.{error}") from None


def _check_keys(
    path: str, mapping: Mapping, allowed: tuple[str, ...], required: tuple[str, ...] = ()
) -> None:
    """Reject unknown keys (with a near-match suggestion) and name a missing required key."""
    for key in mapping:
        if key not in allowed:
            raise CaseError(
                f"{path}: unknown key {_show(key)}{_suggestion(key, allowed)}; "
                f"allowed keys: {_quoted(allowed)}"
            )
    for key in required:
        if key not in mapping:
            raise CaseError(f"{_join(path, key)}: required key is missing")


def _join(path: str, key: str) -> str:
    return key if path == "case" else f"{path}.{key}"


def _expect_mapping(path: str, value: Any, what: str) -> Mapping:
    if not isinstance(value, Mapping):
        raise CaseError(f"{path}: {_show(value)} is not an object; expected {what}")
    return value


# ----------------------------------------------------------------------------- nested specs


class Spec(Mapping):
    """An immutable, hashable copy of a case-file object (a section or material specification).

    Parameters
    ----------
    mapping : Mapping
        Keys are strings; values are numbers, strings or booleans.
    path : str
        Field path for error messages.
    """

    __slots__ = ("_items",)

    def __init__(self, mapping: Mapping, path: str = "spec") -> None:
        if not isinstance(mapping, Mapping):
            raise CaseError(f"{path}: {_show(mapping)} is not an object")
        items = []
        for key, value in mapping.items():
            if not isinstance(key, str):
                raise CaseError(f"{path}: key {_show(key)} is not text")
            if _is_bool(value):
                items.append((key, bool(value)))  # a flag, e.g. a custom section's open_section
                continue
            if not isinstance(value, (str, numbers.Real)):
                raise CaseError(f"{path}.{key}: {_show(value)} must be a number, a name or true/false")
            if isinstance(value, str):
                limits.check_text(f"{path}.{key}", value)
            items.append((key, value if isinstance(value, str) else float(value)))
        object.__setattr__(self, "_items", tuple(sorted(items)))

    def __setattr__(self, name, value):  # frozen
        raise AttributeError("Spec is immutable")

    def __getitem__(self, key):
        for k, v in self._items:
            if k == key:
                return v
        raise KeyError(key)

    def __iter__(self):
        return (k for k, _ in self._items)

    def __len__(self) -> int:
        return len(self._items)

    def __hash__(self) -> int:
        return hash(self._items)

    def __eq__(self, other) -> bool:
        if isinstance(other, Spec):
            return self._items == other._items
        return isinstance(other, Mapping) and dict(self._items) == dict(other)

    def __repr__(self) -> str:
        return f"Spec({dict(self._items)!r})"


# ----------------------------------------------------------------------------- supports


def _restraint(path: str, value: Any, spring: str, unit: str) -> str | float:
    """Check one restraint of an end: ``"fixed"``, ``"free"`` or a spring stiffness."""
    allowed = f"it must be 'fixed', 'free' or a spring stiffness {spring} >= 0 and <= {_MAX_SPRING:g} {unit}"
    if isinstance(value, str):
        if value not in _RESTRAINTS:
            raise CaseError(
                f"{path}: {_show(value)} is not a restraint{_suggestion(value, _RESTRAINTS)}; {allowed}"
            )
        return value
    if _is_bool(value) or not isinstance(value, numbers.Real):
        raise CaseError(f"{path}: {_show(value)} is not allowed; {allowed}")
    return _real(path, value, unit, minimum=0.0, maximum=_MAX_SPRING)


@dataclass(frozen=True, kw_only=True)
class EndSupport:
    """The restraint of one end of the member against translation and rotation.

    Parameters
    ----------
    translation : str or float
        ``"fixed"`` (w = 0), ``"free"`` (T = 0) or an elastic spring stiffness
        k_t [N/m], 0 to 1e18. The spring condition is T(0) = k_t w(0) at the left end
        and T(L) = -k_t w(L) at the right end.
    rotation : str or float
        ``"fixed"`` (w' = 0), ``"free"`` (M = 0) or an elastic spring stiffness
        k_r [N·m/rad], 0 to 1e18. The spring condition is M(0) = -k_r w'(0) at the left
        end and M(L) = k_r w'(L) at the right end.

    Raises
    ------
    CaseError
        When a restraint is not ``"fixed"``, ``"free"`` or a finite number in range.

    Examples
    --------
    >>> EndSupport.named("pinned")
    EndSupport(translation='fixed', rotation='free')
    >>> EndSupport(translation=2.0e6, rotation="free").name is None
    True
    """

    translation: str | float
    rotation: str | float

    def __post_init__(self) -> None:
        _set(self, "translation", _restraint("translation", self.translation, "k_t", "N/m"))
        _set(self, "rotation", _restraint("rotation", self.rotation, "k_r", "N·m/rad"))

    @classmethod
    def named(cls, name: str) -> EndSupport:
        """Return a named support.

        Parameters
        ----------
        name : str
            ``"pinned"`` (w = 0, M = 0), ``"fixed"`` (w = 0, w' = 0),
            ``"free"`` (M = 0, T = 0) or ``"guided"`` (w' = 0, T = 0).

        Returns
        -------
        EndSupport
            The support with the restraints of that name.

        Raises
        ------
        CaseError
            For any other name.
        """
        return _named_support("name", name)

    @property
    def name(self) -> str | None:
        """The support's name when both restraints match a named support, else None."""
        for name, restraints in _NAMED_SUPPORTS.items():
            if (self.translation, self.rotation) == restraints:
                return name
        return None

    def to_data(self) -> str | dict[str, str | float]:
        """Return the case-file form: the name when it has one, else an object.

        Returns
        -------
        str or dict
            ``"pinned"``, ``"fixed"``, ``"free"``, ``"guided"`` or
            ``{"translation": ..., "rotation": ...}``.
        """
        name = self.name
        if name is not None:
            return name
        return {"translation": self.translation, "rotation": self.rotation}

    @classmethod
    def from_data(cls, data: Any) -> EndSupport:
        """Read the case-file form of an end (a name or an object).

        Parameters
        ----------
        data : str or Mapping
            A support name or ``{"translation": ..., "rotation": ...}``.

        Returns
        -------
        EndSupport

        Raises
        ------
        CaseError
            With a path relative to the end (``translation: ...``); the case adds
            ``supports.left.`` or ``supports.right.``.
        """
        return _support_from_data("", data)


def _named_support(path: str, name: Any) -> EndSupport:
    allowed = f"allowed: {_quoted(SUPPORT_NAMES)}"
    if not isinstance(name, str) or name not in _NAMED_SUPPORTS:
        raise CaseError(
            f"{path}: {_show(name)} is not a support name{_suggestion(name, SUPPORT_NAMES)}; {allowed}"
        )
    translation, rotation = _NAMED_SUPPORTS[name]
    return EndSupport(translation=translation, rotation=rotation)


def _support_from_data(path: str, data: Any) -> EndSupport:
    """Read one end; ``path`` is e.g. ``"supports.left"`` (empty for a standalone end)."""
    label = path or "support"
    if isinstance(data, str):
        return _named_support(label, data)
    if not isinstance(data, Mapping):
        raise CaseError(
            f"{label}: {_show(data)} is not allowed; it must be a support name "
            f"({_quoted(SUPPORT_NAMES)}) or an object "
            '{"translation": "fixed" | "free" | k_t, "rotation": "fixed" | "free" | k_r}'
        )
    keys = ("translation", "rotation")
    _check_keys(label, data, keys, required=keys)
    if not path:
        return EndSupport(translation=data["translation"], rotation=data["rotation"])
    with _within(path):
        return EndSupport(translation=data["translation"], rotation=data["rotation"])


# ----------------------------------------------------------------------------- loads


def _check_span(start: float | None, end: float | None) -> None:
    if start is not None and end is not None and not start < end:
        raise CaseError(f"start: {start!r} m must be less than end ({end!r} m)")


class _DistributedLoad:
    """Shared behaviour of loads spread over a length of the member."""

    start: float | None
    end: float | None

    def span(self, length: float) -> tuple[float, float]:
        """Return the loaded stretch with the defaults resolved.

        Parameters
        ----------
        length : float
            Length of the member [m].

        Returns
        -------
        tuple of float
            (a, b) [m]: ``start`` or 0 and ``end`` or ``length``.
        """
        a = 0.0 if self.start is None else self.start
        b = length if self.end is None else self.end
        return a, b


@dataclass(frozen=True, kw_only=True)
class UniformLoad(_DistributedLoad):
    """A uniform transverse line load.

    Parameters
    ----------
    q : float
        Intensity [N/m], positive in the direction of positive w, |q| <= 1e12.
    start, end : float or None
        Loaded stretch [m] from the left end; None means the member's end
        (0 and L). The case checks 0 <= start < end <= L.
    """

    type: ClassVar[str] = "uniform"

    q: float
    start: float | None = None
    end: float | None = None

    def __post_init__(self) -> None:
        _set(self, "q", _real("q", self.q, "N/m", magnitude=_MAX_FORCE))
        _set(self, "start", _optional_position("start", self.start))
        _set(self, "end", _optional_position("end", self.end))
        _check_span(self.start, self.end)


@dataclass(frozen=True, kw_only=True)
class LinearLoad(_DistributedLoad):
    """A transverse line load varying linearly from ``q_start`` at ``start`` to ``q_end`` at ``end``.

    Parameters
    ----------
    q_start, q_end : float
        Intensities [N/m] at the start and the end of the loaded stretch, |q| <= 1e12.
    start, end : float or None
        Loaded stretch [m] from the left end; None means the member's end
        (0 and L). The case checks 0 <= start < end <= L.
    """

    type: ClassVar[str] = "linear"

    q_start: float
    q_end: float
    start: float | None = None
    end: float | None = None

    def __post_init__(self) -> None:
        _set(self, "q_start", _real("q_start", self.q_start, "N/m", magnitude=_MAX_FORCE))
        _set(self, "q_end", _real("q_end", self.q_end, "N/m", magnitude=_MAX_FORCE))
        _set(self, "start", _optional_position("start", self.start))
        _set(self, "end", _optional_position("end", self.end))
        _check_span(self.start, self.end)


@dataclass(frozen=True, kw_only=True)
class PointLoad:
    """A concentrated transverse force.

    Parameters
    ----------
    P : float
        Force [N], positive in the direction of positive w, |P| <= 1e12.
        (Not the axial force, which is ``Case.axial_force``.)
    x : float
        Position [m] from the left end; the case checks 0 <= x <= L.
    """

    type: ClassVar[str] = "point"

    P: float
    x: float

    def __post_init__(self) -> None:
        _set(self, "P", _real("P", self.P, "N", magnitude=_MAX_FORCE))
        _set(self, "x", _real("x", self.x, "m"))


@dataclass(frozen=True, kw_only=True)
class CoupleLoad:
    """A concentrated couple, making the moment jump by ``M(x+) - M(x-) = C``.

    Parameters
    ----------
    C : float
        Couple [N·m], |C| <= 1e13. Equal end moments M0 in single curvature are
        C = +M0 at x = 0 and C = -M0 at x = L.
    x : float
        Position [m] from the left end; the case checks 0 <= x <= L.
    """

    type: ClassVar[str] = "couple"

    C: float
    x: float

    def __post_init__(self) -> None:
        _set(self, "C", _real("C", self.C, "N·m", magnitude=_MAX_COUPLE))
        _set(self, "x", _real("x", self.x, "m"))


#: Any load object a case may hold.
Load = UniformLoad | LinearLoad | PointLoad | CoupleLoad

_LOAD_CLASSES: dict[str, type] = {cls.type: cls for cls in (UniformLoad, LinearLoad, PointLoad, CoupleLoad)}
_LOAD_TYPES: tuple[str, ...] = tuple(_LOAD_CLASSES)


def _load_to_data(load: Load) -> dict[str, Any]:
    data: dict[str, Any] = {"type": load.type}
    for item in dataclasses.fields(load):
        value = getattr(load, item.name)
        if item.name in ("start", "end") and value is None:
            continue
        data[item.name] = value
    return data


def _load_from_data(path: str, data: Any) -> Load:
    """Read one load object of a case file; ``path`` is e.g. ``"loads[2]"``."""
    data = _expect_mapping(path, data, 'a load object such as {"type": "uniform", "q": 1000.0}')
    if "type" not in data:
        raise CaseError(f"{path}.type: required key is missing; allowed types: {_quoted(_LOAD_TYPES)}")
    kind = data["type"]
    if not isinstance(kind, str) or kind not in _LOAD_CLASSES:
        raise CaseError(
            f"{path}.type: {_show(kind)} is not a load type{_suggestion(kind, _LOAD_TYPES)}; "
            f"allowed: {_quoted(_LOAD_TYPES)}"
        )
    cls = _LOAD_CLASSES[kind]
    names = tuple(item.name for item in dataclasses.fields(cls))
    required = tuple(item.name for item in dataclasses.fields(cls) if item.default is dataclasses.MISSING)
    _check_keys(path, data, ("type", *names), required)
    with _within(path):
        return cls(**{name: data[name] for name in names if name in data})


# ----------------------------------------------------------------------------- imperfection


@dataclass(frozen=True, kw_only=True)
class Imperfection:
    """The initial bow w0(x), a stress-free initial shape measured like w.

    Parameters
    ----------
    shape : str
        ``"none"``; ``"sine"``, w0 = a sin(pi x / L); ``"parabola"``,
        w0 = 4 a x (L - x) / L²; ``"sway"``, w0 = a x / L; or ``"mode"``, the first
        elastic buckling mode of the supports scaled so its largest value is +a.
    amplitude : float
        a [m], the largest |w0|; may be negative. The case checks
        |a| <= L / 10. With shape ``"none"`` it is kept as given and ignored.
    preset : str or None
        A code value for the amplitude instead: ``"en1993-table-5.1"``, ``"en1993-eq-5.9"``,
        ``"aisc-l/1000"`` or ``"span"`` (see :mod:`engine.member`). ``shape`` then defaults to
        ``"sine"`` (``"mode"`` for eq. 5.9), and ``amplitude`` must be left at 0.
    curve : str
        Buckling curve for the EN 1993-1-1 presets: ``"auto"`` (from EN 1993-1-1 Table 6.2) or
        ``"a0"``, ``"a"``, ``"b"``, ``"c"``, ``"d"``.
    analysis : str
        Table 5.1 column: ``"elastic"`` or ``"plastic"``.
    ratio : float or None
        n of L/n for preset ``"span"``.
    direction : str
        For presets: ``"load"`` (automatic: both directions are solved and the unfavourable one is used),
        ``"positive"`` or ``"negative"``.
    columns : int
        m of EN 1993-1-1 eq. (5.5), for the sway a preset adds on a member with an end that can translate
        (:mod:`engine.sway`): 1 to 1000, default 1. Only with a preset.
    """

    shape: str = "none"
    amplitude: float = 0.0
    preset: str | None = None
    curve: str = "auto"
    analysis: str = "elastic"
    ratio: float | None = None
    direction: str = "load"
    columns: int = 1

    def __post_init__(self) -> None:
        if not isinstance(self.shape, str) or self.shape not in IMPERFECTION_SHAPES:
            raise CaseError(
                f"shape: {_show(self.shape)} is not a bow shape"
                f"{_suggestion(self.shape, IMPERFECTION_SHAPES)}; "
                f"allowed: {_quoted(IMPERFECTION_SHAPES)}"
            )
        _set(self, "amplitude", _real("amplitude", self.amplitude, "m"))
        for name, allowed in (("curve", _CURVES), ("analysis", _ANALYSES), ("direction", _DIRECTIONS)):
            value = getattr(self, name)
            if not isinstance(value, str) or value not in allowed:
                raise CaseError(
                    f"{name}: {_show(value)} is not allowed{_suggestion(value, allowed)}; "
                    f"allowed: {_quoted(allowed)}"
                )
        if self.preset is not None:
            if not isinstance(self.preset, str) or self.preset not in IMPERFECTION_PRESETS:
                raise CaseError(
                    f"preset: {_show(self.preset)} is not a bow preset"
                    f"{_suggestion(self.preset, IMPERFECTION_PRESETS)}; "
                    f"allowed: {_quoted(IMPERFECTION_PRESETS)}"
                )
            if self.amplitude != 0.0:
                raise CaseError(
                    f"amplitude: {self.amplitude!r} m cannot be given with preset "
                    f"{self.preset!r}, which sets the amplitude; give one or the other"
                )
            if self.preset == "en1993-eq-5.9" and self.shape not in ("none", "mode"):
                raise CaseError(
                    f"shape: {self.shape!r} does not go with preset 'en1993-eq-5.9', whose bow "
                    "has the shape of the first buckling mode; use 'mode' or leave it out"
                )
            if self.shape in ("sway",) and self.preset != "span":
                raise CaseError(
                    f"shape: 'sway' does not go with preset {self.preset!r}, a member bow; "
                    "use 'sine', 'parabola' or 'mode'"
                )
        if self.preset == "span":
            if self.ratio is None:
                raise CaseError("ratio: required with preset 'span' (the n of L/n)")
            _set(self, "ratio", _real("ratio", self.ratio, "", minimum=10.0, maximum=100000.0))
        elif self.ratio is not None:
            raise CaseError(f"ratio: {_show(self.ratio)} only goes with preset 'span'")
        if (
            isinstance(self.columns, bool)
            or not isinstance(self.columns, (int, float))
            or not math.isfinite(self.columns)
            or self.columns != int(self.columns)
            or not 1 <= self.columns <= 1000
        ):
            raise CaseError(
                f"columns: {_show(self.columns)} must be a whole number of columns from 1 "
                "to 1000 (m of EN 1993-1-1 eq. (5.5))"
            )
        _set(self, "columns", int(self.columns))
        if self.preset is None:
            for name, default in (
                ("curve", "auto"),
                ("analysis", "elastic"),
                ("direction", "load"),
                ("columns", 1),
            ):
                if getattr(self, name) != default:
                    raise CaseError(
                        f"{name}: {getattr(self, name)!r} only goes with a preset; "
                        f"allowed presets: {_quoted(IMPERFECTION_PRESETS)}"
                    )

    def to_data(self) -> dict[str, Any]:
        """The case-file form: shape and amplitude, and the preset's keys when there is one."""
        data: dict[str, Any] = {"shape": self.shape, "amplitude": self.amplitude}
        if self.preset is not None:
            data.update(
                preset=self.preset, curve=self.curve, analysis=self.analysis, direction=self.direction
            )
            if self.ratio is not None:
                data["ratio"] = self.ratio
            if self.columns != 1:
                data["columns"] = self.columns
        return data


# ----------------------------------------------------------------------------- case

_CASE_KEYS = (
    "schema",
    "title",
    "length",
    "EI",
    "supports",
    "axial_force",
    "loads",
    "imperfection",
    "section",
    "axis",
    "material",
    "stiffness_factor",
    "check",
    "out_of_plane",
)
_CASE_REQUIRED = ("length", "supports")
_IMPERFECTION_KEYS = ("shape", "amplitude", "preset", "curve", "analysis", "ratio", "direction", "columns")
_CHECK_KEYS = ("method", "gamma_M0", "gamma_M1", "deflection_limit")


def _schema_version(value: Any) -> int:
    """The schema version as the integer 1; 1.0 is the same JSON number (JSON Schema counts it an integer)."""
    if not _is_bool(value) and isinstance(value, numbers.Real) and value == SCHEMA_VERSION:
        return SCHEMA_VERSION
    raise CaseError(
        f"schema: {_show(value)} is not a known case-file schema version; "
        f"this version of strutscope reads schema {SCHEMA_VERSION} (the integer 1)"
    )


def _snap_position(path: str, value: float, length: float) -> float:
    """Check 0 <= value <= length (with a small tolerance) and return it snapped onto the member."""
    tolerance = _POSITION_TOLERANCE * length
    if not -tolerance <= value <= length + tolerance:
        raise CaseError(f"{path}: {value!r} m lies outside the member (0 to {length:g} m)")
    return min(max(value, 0.0), length)


def _placed_load(index: int, load: Any, length: float) -> Load:
    """Check a load against the member's length and return it with positions snapped."""
    path = f"loads[{index}]"
    if not isinstance(load, (UniformLoad, LinearLoad, PointLoad, CoupleLoad)):
        raise CaseError(
            f"{path}: {_show(load)} is not a load; expected UniformLoad, LinearLoad, PointLoad or CoupleLoad"
        )
    if isinstance(load, (PointLoad, CoupleLoad)):
        x = _snap_position(f"{path}.x", load.x, length)
        return load if x == load.x else dataclasses.replace(load, x=x)
    changes = {}
    for name in ("start", "end"):
        value = getattr(load, name)
        if value is not None:
            snapped = _snap_position(f"{path}.{name}", value, length)
            if snapped != value:
                changes[name] = snapped
    if changes:
        load = dataclasses.replace(load, **changes)
    a, b = load.span(length)
    if not a < b:
        if load.start is not None and load.end is None:
            raise CaseError(
                f"{path}.start: {a!r} m must be less than the end of the load ({b:g} m, the member's length)"
            )
        raise CaseError(f"{path}.end: {b!r} m must be greater than the start ({a!r} m)")
    return load


@dataclass(frozen=True, kw_only=True)
class Case:
    """One member under axial force and transverse load: the input of an analysis.

    Parameters
    ----------
    length : float
        L [m], 0.001 <= L <= 1000.
    EI : float or None
        Bending stiffness [N·m²], 1e-3 <= EI <= 1e16. It may be left out when ``section`` and
        ``material`` give it (E·I); when given it overrides them.
    left, right : EndSupport
        The supports at x = 0 and x = L.
    axial_force : float
        P [N], compression positive, |P| <= 1e12; constant along the member and
        keeping its direction as the member deflects.
    loads : tuple of load objects
        :class:`UniformLoad`, :class:`LinearLoad`, :class:`PointLoad` and
        :class:`CoupleLoad` objects; a list is accepted and stored as a tuple.
        Positions must lie on the member; a position within 1e-9 L outside it is
        moved onto the end.
    imperfection : Imperfection
        The initial bow; its |amplitude| must not exceed L / 10.
    title : str
        Free text of at most 200 characters.
    schema : int
        Case-file schema version; only 1 is known.
    section : Spec or mapping, optional
        ``{"name": "HEB 200"}`` or a parametric shape (:func:`engine.sections.section_from_spec`).
    axis : str
        ``"major"`` or ``"minor"``: the axis the member bends about.
    material : Spec or mapping, optional
        ``{"name": "S355"}`` or ``{"E": ..., "fy": ...}`` (:func:`engine.materials.material_from_spec`).
    stiffness_factor : float
        Multiplies EI for the analysis only (0 < factor <= 1), e.g. 0.8·τ_b (AISC 360-16 direct analysis).
    check : CheckSettings or mapping, optional
        The member check's method, γ factors and deflection limit (:class:`engine.checks.CheckSettings`).
    out_of_plane : OutOfPlaneSettings or mapping, optional
        ``{"buckling_length": L_cr}`` or ``{"restrained": true}`` for flexural buckling about the other axis
        (:mod:`engine.out_of_plane`); default: the member length, not restrained.

    Raises
    ------
    CaseError
        Naming the field path, the value received and what is allowed. A support set
        that leaves the member a mechanism is also a CaseError (checked by
        ``engine.supports.check_stable``).

    Examples
    --------
    >>> case = Case.from_dict({
    ...     "length": 6.0, "EI": 4.2e6, "supports": {"left": "pinned", "right": "pinned"},
    ...     "axial_force": 350e3, "loads": [{"type": "point", "P": 7.0e3, "x": 2.0}],
    ... })
    >>> case.loads
    (PointLoad(P=7000.0, x=2.0),)
    >>> Case.from_dict(case.to_dict()) == case
    True
    """

    length: float
    left: EndSupport
    right: EndSupport
    EI: float | None = None
    axial_force: float = 0.0
    loads: tuple = ()
    imperfection: Imperfection = field(default_factory=Imperfection)
    title: str = ""
    schema: int = SCHEMA_VERSION
    section: Spec | None = None
    axis: str = "major"
    material: Spec | None = None
    stiffness_factor: float = 1.0
    check: Any = None
    out_of_plane: Any = None

    def __post_init__(self) -> None:
        _set(self, "schema", _schema_version(self.schema))
        if not isinstance(self.title, str):
            raise CaseError(
                f"title: {_show(self.title)} is not text; it must be a string of at most "
                f"{_MAX_TITLE} characters"
            )
        if len(self.title) > _MAX_TITLE:
            raise CaseError(
                f"title: text of {len(self.title)} characters is too long; at most "
                f"{_MAX_TITLE} characters are allowed"
            )
        limits.check_text("title", self.title)
        length = _real("length", self.length, "m", minimum=_MIN_LENGTH, maximum=_MAX_LENGTH)
        _set(self, "length", length)
        if self.EI is not None:
            _set(self, "EI", _real("EI", self.EI, "N·m²", minimum=_MIN_EI, maximum=_MAX_EI))
        self._check_member()
        _set(self, "axial_force", _real("axial_force", self.axial_force, "N", magnitude=_MAX_AXIAL_FORCE))
        for end in ("left", "right"):
            if not isinstance(getattr(self, end), EndSupport):
                raise CaseError(
                    f"{end}: {_show(getattr(self, end))} is not an EndSupport; build one with "
                    f"EndSupport.named(...) or EndSupport(translation=..., rotation=...)"
                )
        if not isinstance(self.loads, (tuple, list)):
            raise CaseError(f"loads: {_show(self.loads)} is not a tuple or list of load objects")
        limits.check_load_count(len(self.loads))
        _set(self, "loads", tuple(_placed_load(index, load, length) for index, load in enumerate(self.loads)))
        limits.check_work(length, self.loads)
        if not isinstance(self.imperfection, Imperfection):
            raise CaseError(f"imperfection: {_show(self.imperfection)} is not an Imperfection")
        if abs(self.imperfection.amplitude) > length / 10:
            raise CaseError(
                f"imperfection.amplitude: {self.imperfection.amplitude!r} m is too large; "
                f"|amplitude| must be <= length/10 = {length / 10:g} m"
            )
        # Imported here, not at the top, so that engine.supports may import from this
        # module without an import cycle.
        from engine.supports import check_stable

        check_stable(self)

    def _check_member(self) -> None:
        """Validate the section, material, axis, stiffness factor and check settings."""
        from engine.checks import CheckSettings

        if not isinstance(self.axis, str) or self.axis not in _AXES:
            raise CaseError(
                f"axis: {_show(self.axis)} is not an axis{_suggestion(self.axis, _AXES)}; "
                f"allowed: {_quoted(_AXES)}"
            )
        _set(
            self,
            "stiffness_factor",
            _real(
                "stiffness_factor",
                self.stiffness_factor,
                "",
                minimum=0.0,
                minimum_exclusive=True,
                maximum=1.0,
            ),
        )
        if self.check is None:
            _set(self, "check", CheckSettings())
        elif isinstance(self.check, Mapping):
            _check_keys("check", self.check, _CHECK_KEYS)
            _set(self, "check", CheckSettings(**self.check))
        elif not isinstance(self.check, CheckSettings):
            raise CaseError(
                f"check: {_show(self.check)} is not check settings; expected an object with keys "
                f"{_quoted(_CHECK_KEYS)}"
            )
        if self.out_of_plane is not None:
            from engine.out_of_plane import OutOfPlaneSettings

            settings = OutOfPlaneSettings.from_data(self.out_of_plane)
            _set(self, "out_of_plane", None if settings == OutOfPlaneSettings() else settings)
        section = None
        if self.section is not None:
            from engine.sections import section_from_spec

            if not isinstance(self.section, Spec):
                _set(self, "section", Spec(self.section, "section"))
            section = section_from_spec(dict(self.section), self.axis)
        if self.material is not None:
            from engine.materials import material_from_spec

            if not isinstance(self.material, Spec):
                _set(self, "material", Spec(self.material, "material"))
            material_from_spec(dict(self.material), section.t_max if section is not None else None)
        if self.EI is None and (self.section is None or self.material is None):
            missing = [name for name in ("section", "material") if getattr(self, name) is None]
            raise CaseError(
                f"EI: required key is missing (or give both section and material; "
                f"{' and '.join(missing)} missing)"
            )

    # ------------------------------------------------------------------ case files

    @classmethod
    def from_dict(cls, mapping: Mapping[str, Any]) -> Case:
        """Build a case from the mapping of a case file (schema 1).

        Parameters
        ----------
        mapping : Mapping
            Keys ``schema`` (optional, 1), ``title`` (optional), ``length`` [m],
            ``EI`` [N·m²], ``supports`` {``left``, ``right``}, ``axial_force`` [N]
            (optional, 0), ``loads`` (optional list) and ``imperfection``
            {``shape``, ``amplitude`` [m]} (optional). Integers are accepted for numbers.

        Returns
        -------
        Case
            The validated case. The mapping is not modified.

        Raises
        ------
        CaseError
            Naming the field path (``loads[2].x``, ``supports.left.translation``,
            ``imperfection.shape``), the value received and what is allowed; unknown
            keys are named with the nearest known key.
        """
        mapping = _expect_mapping("case", mapping, f"a case object with keys {_quoted(_CASE_KEYS)}")
        # The schema comes first: another version may have other keys.
        schema = _schema_version(mapping.get("schema", SCHEMA_VERSION))
        _check_keys("case", mapping, _CASE_KEYS, _CASE_REQUIRED)

        supports = _expect_mapping("supports", mapping["supports"], '{"left": ..., "right": ...}')
        _check_keys("supports", supports, ("left", "right"), ("left", "right"))
        left = _support_from_data("supports.left", supports["left"])
        right = _support_from_data("supports.right", supports["right"])

        raw_loads = mapping.get("loads", [])
        if isinstance(raw_loads, (str, bytes)) or not isinstance(raw_loads, (list, tuple)):
            raise CaseError(f"loads: {_show(raw_loads)} is not a list of load objects")
        limits.check_load_count(len(raw_loads))  # before any load is built
        loads = tuple(_load_from_data(f"loads[{index}]", data) for index, data in enumerate(raw_loads))

        raw_bow = _expect_mapping(
            "imperfection", mapping.get("imperfection", {}), '{"shape": ..., "amplitude": ...}'
        )
        _check_keys("imperfection", raw_bow, _IMPERFECTION_KEYS)
        with _within("imperfection"):
            imperfection = Imperfection(**raw_bow)

        arguments = {
            name: mapping[name]
            for name in ("title", "length", "EI", "axial_force", "axis", "stiffness_factor")
            if name in mapping
        }
        for name in ("section", "material", "check", "out_of_plane"):
            if name in mapping:
                arguments[name] = _expect_mapping(name, mapping[name], "an object")
        return cls(schema=schema, left=left, right=right, loads=loads, imperfection=imperfection, **arguments)

    def to_dict(self) -> dict[str, Any]:
        """Return the case-file mapping (schema 1), ready for :func:`json.dumps`.

        Returns
        -------
        dict
            Every key of schema 1. A support is written as its name when it has one,
            and a load's ``start`` and ``end`` are left out when they are None.
            ``Case.from_dict(case.to_dict()) == case``.
        """
        data: dict[str, Any] = {
            "schema": self.schema,
            "title": self.title,
            "length": self.length,
        }
        if self.EI is not None:
            data["EI"] = self.EI
        data.update(
            {
                "supports": {"left": self.left.to_data(), "right": self.right.to_data()},
                "axial_force": self.axial_force,
                "loads": [_load_to_data(load) for load in self.loads],
                "imperfection": self.imperfection.to_data(),
            }
        )
        if self.section is not None:
            data["section"] = dict(self.section)
            data["axis"] = self.axis
        elif self.axis != "major":
            data["axis"] = self.axis
        if self.material is not None:
            data["material"] = dict(self.material)
        if self.stiffness_factor != 1.0:
            data["stiffness_factor"] = self.stiffness_factor
        from engine.checks import CheckSettings

        if self.check != CheckSettings():
            data["check"] = self.check.to_dict()
        if self.out_of_plane is not None:
            data["out_of_plane"] = self.out_of_plane.to_dict()
        return data

    @classmethod
    def from_json(cls, text: str | bytes) -> Case:
        """Build a case from the JSON text of a case file.

        Parameters
        ----------
        text : str or bytes
            JSON text (UTF-8 when bytes), at most ``engine.limits.MAX_CASE_BYTES``.

        Returns
        -------
        Case

        Raises
        ------
        CaseError
            For text that is not JSON (with line and column), a repeated key, text
            beyond the limits of :mod:`engine.limits` (size, nesting, digits), bytes
            that are not UTF-8, a lone surrogate anywhere, or any problem
            :meth:`from_dict` finds. Never another exception: the case is refused whole.
        """
        mapping = limits.parse_json(text, object_pairs_hook=_unique_keys)
        return cls.from_dict(mapping)

    def to_json(self, indent: int | None = 2) -> str:
        """Return the JSON text of the case file.

        Parameters
        ----------
        indent : int or None
            Indentation of the JSON text; None for a single line.

        Returns
        -------
        str
            JSON text; non-ASCII characters in the title are kept as they are.
        """
        return json.dumps(self.to_dict(), indent=indent, ensure_ascii=False, allow_nan=False)


def _unique_keys(pairs: list[tuple[str, Any]]) -> dict[str, Any]:
    """Build a JSON object, refusing a key given twice (JSON would keep the last silently)."""
    mapping: dict[str, Any] = {}
    for key, value in pairs:
        if key in mapping:
            raise CaseError(f"case: key {key!r} is given twice in one JSON object")
        mapping[key] = value
    return mapping


def load_case(path: str | os.PathLike) -> Case:
    """Read a case file.

    Parameters
    ----------
    path : str or path-like
        A UTF-8 JSON case file.

    Returns
    -------
    Case

    Raises
    ------
    CaseError
        For a file that is not a valid case.
    OSError
        When the file cannot be read.
    """
    with open(path, "rb") as stream:
        # One byte more than the limit is enough to refuse a larger file without reading it all.
        return Case.from_json(stream.read(limits.MAX_CASE_BYTES + 1))


def save_case(case: Case, path: str | os.PathLike) -> None:
    """Write a case file (UTF-8 JSON, two-space indent, final newline).

    Parameters
    ----------
    case : Case
        The case to write.
    path : str or path-like
        Destination; an existing file is replaced atomically: the text goes to a temporary file in the same
        folder, which then replaces the destination, so a reader never sees a half-written file.

    Raises
    ------
    OSError
        When the file cannot be written.
    """
    import tempfile

    data = (case.to_json(indent=2) + "\n").encode("utf-8")
    folder = os.path.dirname(os.path.abspath(os.fspath(path)))
    handle, temporary = tempfile.mkstemp(dir=folder, prefix=".", suffix=".json.part")
    try:
        with os.fdopen(handle, "wb") as stream:
            stream.write(data)
            stream.flush()
            os.fsync(stream.fileno())
        mask = os.umask(0)
        os.umask(mask)
        os.chmod(temporary, 0o666 & ~mask)
        os.replace(temporary, path)
    except BaseException:
        with suppress(OSError):
            os.unlink(temporary)
        raise
