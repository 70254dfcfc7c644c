"""The case's nested inputs: the end supports, the initial bow and the immutable section/material specs.

Each is a frozen, keyword-only value object that validates itself, so one built in Python is checked exactly
like one read from a case file. Units: N/m and N·m/rad for springs, m for the bow's amplitude.
"""

from __future__ import annotations

import math
import numbers
from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any

from engine import limits
from engine.errors import CaseError
from engine.validate import check_keys, choice, is_bool, quoted, real, set_field, show, suggestion, within

__all__ = [
    "EndSupport",
    "IMPERFECTION_PRESETS",
    "IMPERFECTION_SHAPES",
    "Imperfection",
    "SUPPORT_NAMES",
    "Spec",
    "support_from_data",
]

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
_RESTRAINTS = ("fixed", "free")
_MAX_SPRING = 1e18  # [N/m] or [N·m/rad]


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
            raise CaseError(f"{path}: {show(mapping)} is not an object")
        items = []
        for key, value in mapping.items():
            if not isinstance(key, str):
                raise CaseError(f"{path}: key {show(key)} is not text")
            if is_bool(value):
                items.append((key, bool(value)))  # a flag, e.g. a custom section's open_section
                continue
            if not isinstance(value, (str, numbers.Real)):
                raise CaseError(f"{path}.{key}: {show(value)} must be a number, a name or true/false")
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
                f"{path}: {show(value)} is not a restraint{suggestion(value, _RESTRAINTS)}; {allowed}"
            )
        return value
    if is_bool(value) or not isinstance(value, numbers.Real):
        raise CaseError(f"{path}: {show(value)} is not allowed; {allowed}")
    return real(path, value, unit, minimum=0.0, maximum=_MAX_SPRING)


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
        set_field(self, "translation", _restraint("translation", self.translation, "k_t", "N/m"))
        set_field(self, "rotation", _restraint("rotation", self.rotation, "k_r", "N·m/rad"))

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
        return support_from_data("", data)


def _named_support(path: str, name: Any) -> EndSupport:
    choice(path, name, SUPPORT_NAMES, "a support name")
    translation, rotation = _NAMED_SUPPORTS[name]
    return EndSupport(translation=translation, rotation=rotation)


def support_from_data(path: str, data: Any) -> EndSupport:
    """Read one end; ``path`` is e.g. ``"supports.left"`` (empty for a standalone end)."""
    label = path or "support"
    if isinstance(data, str):
        return _named_support(label, data)
    if not isinstance(data, Mapping):
        raise CaseError(
            f"{label}: {show(data)} is not allowed; it must be a support name "
            f"({quoted(SUPPORT_NAMES)}) or an object "
            '{"translation": "fixed" | "free" | k_t, "rotation": "fixed" | "free" | k_r}'
        )
    keys = ("translation", "rotation")
    check_keys(label, data, keys, required=keys)
    if not path:
        return EndSupport(translation=data["translation"], rotation=data["rotation"])
    with within(path):
        return EndSupport(translation=data["translation"], rotation=data["rotation"])


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
        choice("shape", self.shape, IMPERFECTION_SHAPES, "a bow shape")
        set_field(self, "amplitude", real("amplitude", self.amplitude, "m"))
        for name, allowed in (("curve", _CURVES), ("analysis", _ANALYSES), ("direction", _DIRECTIONS)):
            choice(name, getattr(self, name), allowed)
        if self.preset is not None:
            choice("preset", self.preset, IMPERFECTION_PRESETS, "a bow preset")
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
            set_field(self, "ratio", real("ratio", self.ratio, "", minimum=10.0, maximum=100000.0))
        elif self.ratio is not None:
            raise CaseError(f"ratio: {show(self.ratio)} only goes with preset 'span'")
        if (
            isinstance(self.columns, bool)
            or not isinstance(self.columns, (int, float))
            or not math.isfinite(self.columns)
            or self.columns != int(self.columns)
            or not 1 <= self.columns <= 1000
        ):
            raise CaseError(
                f"columns: {show(self.columns)} must be a whole number of columns from 1 "
                "to 1000 (m of EN 1993-1-1 eq. (5.5))"
            )
        set_field(self, "columns", int(self.columns))
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
                        f"allowed presets: {quoted(IMPERFECTION_PRESETS)}"
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
