"""Transverse loads on the member: uniform, linear, point and couple loads, and their case-file form.

Each load is a frozen, keyword-only value object that validates itself; a position is checked against the
member's length by :func:`placed_load` when the case is built (a position within 1e-9 L outside the member is
moved onto the end). Units: N/m, N, N·m, m.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from typing import Any, ClassVar

from engine.errors import CaseError
from engine.validate import check_keys, choice, expect_mapping, quoted, real, set_field, show, within

__all__ = [
    "CoupleLoad",
    "LOAD_TYPES",
    "LinearLoad",
    "Load",
    "PointLoad",
    "UniformLoad",
    "load_from_data",
    "load_to_data",
    "placed_load",
]

_MAX_FORCE = 1e12  # [N/m] for line loads, [N] for point loads
_MAX_COUPLE = 1e13  # [N·m]
# Positions within this fraction of the length outside the member are read as the end
# itself, so rounding in a file (6.000000000001 on a 6 m member) is not an error.
_POSITION_TOLERANCE = 1e-9


def _optional_position(path: str, value: Any) -> float | None:
    """Check an optional start/end position [m]; the member's length is checked by the case."""
    if value is None:
        return None
    return real(path, value, "m")


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
        set_field(self, "q", real("q", self.q, "N/m", magnitude=_MAX_FORCE))
        set_field(self, "start", _optional_position("start", self.start))
        set_field(self, "end", _optional_position("end", self.end))
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
        set_field(self, "q_start", real("q_start", self.q_start, "N/m", magnitude=_MAX_FORCE))
        set_field(self, "q_end", real("q_end", self.q_end, "N/m", magnitude=_MAX_FORCE))
        set_field(self, "start", _optional_position("start", self.start))
        set_field(self, "end", _optional_position("end", self.end))
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
        set_field(self, "P", real("P", self.P, "N", magnitude=_MAX_FORCE))
        set_field(self, "x", real("x", self.x, "m"))


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
        set_field(self, "C", real("C", self.C, "N·m", magnitude=_MAX_COUPLE))
        set_field(self, "x", real("x", self.x, "m"))


#: Any load object a case may hold.
Load = UniformLoad | LinearLoad | PointLoad | CoupleLoad

_LOAD_CLASSES: dict[str, type] = {cls.type: cls for cls in (UniformLoad, LinearLoad, PointLoad, CoupleLoad)}
LOAD_TYPES: tuple[str, ...] = tuple(_LOAD_CLASSES)


def load_to_data(load: Load) -> dict[str, Any]:
    data: dict[str, Any] = {"type": load.type}
    for item in dataclasses.fields(load):
        value = getattr(load, item.name)
        if item.name in ("start", "end") and value is None:
            continue
        data[item.name] = value
    return data


def load_from_data(path: str, data: Any) -> Load:
    """Read one load object of a case file; ``path`` is e.g. ``"loads[2]"``."""
    data = expect_mapping(path, data, 'a load object such as {"type": "uniform", "q": 1000.0}')
    if "type" not in data:
        raise CaseError(f"{path}.type: required key is missing; allowed types: {quoted(LOAD_TYPES)}")
    kind = data["type"]
    choice(f"{path}.type", kind, LOAD_TYPES, "a load type")
    cls = _LOAD_CLASSES[kind]
    names = tuple(item.name for item in dataclasses.fields(cls))
    required = tuple(item.name for item in dataclasses.fields(cls) if item.default is dataclasses.MISSING)
    check_keys(path, data, ("type", *names), required)
    with within(path):
        return cls(**{name: data[name] for name in names if name in data})


def _snap_position(path: str, value: float, length: float) -> float:
    """Check 0 <= value <= length (with a small tolerance) and return it snapped onto the member."""
    tolerance = _POSITION_TOLERANCE * length
    if not -tolerance <= value <= length + tolerance:
        raise CaseError(f"{path}: {value!r} m lies outside the member (0 to {length:g} m)")
    return min(max(value, 0.0), length)


def placed_load(index: int, load: Any, length: float) -> Load:
    """Check a load against the member's length and return it with positions snapped."""
    path = f"loads[{index}]"
    if not isinstance(load, (UniformLoad, LinearLoad, PointLoad, CoupleLoad)):
        raise CaseError(
            f"{path}: {show(load)} is not a load; expected UniformLoad, LinearLoad, PointLoad or CoupleLoad"
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
