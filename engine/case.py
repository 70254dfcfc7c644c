"""The case: one member, its supports, axial force, transverse loads and initial bow.

A case is a frozen, keyword-only value object. Every class validates itself on
construction, so a case built in Python is checked exactly like one read from a file,
and every problem is a :class:`engine.errors.CaseError` whose message names the field
path, the value received and what is allowed, for example
``loads[2].x: 7.5 m lies outside the member (0 to 6 m)``.

Case files are JSON, schema 1, as set out in the project's conventions (SI units:
m, N, N·m, N/m, N·m/rad). :meth:`Case.from_dict` and :meth:`Case.to_dict` convert
between a case and the file's mapping, and ``Case.from_dict(c.to_dict()) == c``.

The optional key ``second_plane`` (:mod:`engine.plane`) adds bending about the other axis: its own supports,
loads, bow and (with the case's EI) stiffness; errors name its paths, e.g. ``second_plane.loads[1].x``.
:meth:`Case.second_plane_case` is that plane as a one-plane case. A file without it is a one-plane case.

Change a case with :func:`dataclasses.replace`, which validates the new case again.
"""

from __future__ import annotations

import json
import numbers
from collections.abc import Mapping
from dataclasses import dataclass, field
from typing import Any

from engine import limits
from engine import restraints as inner
from engine.actions import case_actions
from engine.checks import CheckSettings
from engine.errors import CaseError
from engine.inputs import (
    IMPERFECTION_PRESETS,
    IMPERFECTION_SHAPES,
    SUPPORT_NAMES,
    EndSupport,
    Imperfection,
    Spec,
    support_from_data,
)
from engine.loads import (
    CoupleLoad,
    LinearLoad,
    Load,
    PointLoad,
    UniformLoad,
    load_from_data,
    load_to_data,
    placed_load,
)
from engine.materials import material_from_spec
from engine.out_of_plane import OutOfPlaneSettings
from engine.plane import SecondPlane, as_second_plane, second_plane_of
from engine.sections import AXES, section_from_spec
from engine.solver import supports
from engine.validate import (
    check_keys,
    choice,
    expect_mapping,
    is_bool,
    quoted,
    real,
    set_field,
    show,
    within,
)

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
    "SecondPlane",
    "Spec",
    "UniformLoad",
]

#: The case-file schema version this module reads and writes.
SCHEMA_VERSION = 1


# Bounds that keep every input inside what the solver handles in double precision.
_MAX_LENGTH = 1000.0  # [m]
# [m]: shorter than any member; fuzzing found L = 1e-200, whose L² underflows to zero in the critical loads.
_MIN_LENGTH = 1e-3
_MAX_EI = 1e16  # [N·m²]
# [N·m²]: below any structural member (a 1 mm steel wire has about 1e-2); smaller values only reach
# the limits of double precision (found by fuzzing: EI = 1e-308 overflowed the spring scaling).
_MIN_EI = 1e-3
_MAX_AXIAL_FORCE = 1e12  # [N]
_MAX_TITLE = 200  # characters


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
    "second_plane",
    "actions",
    "combinations",
    "restraints",
    "steps",
    "foundation",
)
_CASE_REQUIRED = ("length", "supports")
_IMPERFECTION_KEYS = ("shape", "amplitude", "preset", "curve", "analysis", "ratio", "direction", "columns")
_CHECK_KEYS = (
    "method",
    "gamma_M0",
    "gamma_M1",
    "deflection_limit",
    "routes",
    "annex",
    "aisc_method",
    "aisc_analysis",
    "ltb",
)


def _schema_version(value: Any) -> int:
    """The schema version as the integer 1; 1.0 is the same JSON number (JSON Schema counts it an integer)."""
    if not is_bool(value) and isinstance(value, numbers.Real) and value == SCHEMA_VERSION:
        return SCHEMA_VERSION
    raise CaseError(
        f"schema: {show(value)} is not a known case-file schema version; "
        f"this version of strutscope reads schema {SCHEMA_VERSION} (the integer 1)"
    )


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
        (:mod:`engine.out_of_plane`); default: the member length (twice it where an end sways), not
        restrained. Not with ``second_plane``.
    second_plane : SecondPlane or mapping, optional
        Bending about the other axis as well (:mod:`engine.plane`): its ``supports`` (required), ``loads``,
        ``imperfection`` (default: the EN 1993-1-1 Table 5.1 bow with a steel section, else none) and ``EI``
        (given exactly when the case gives its own EI). The first plane bends about ``axis``, the second
        about the other one; :meth:`second_plane_case` is the second plane as a case of its own.
    restraints : tuple of Restraint
        Supports, springs and hinges inside the member, per plane (:mod:`engine.restraints`).
    steps : tuple of Step
        Changes of EI along the member (:mod:`engine.restraints`).
    foundation : tuple of Foundation
        Elastic (Winkler) foundation ranges, per plane (:mod:`engine.restraints`).

    Raises
    ------
    CaseError
        Naming the field path, the value received and what is allowed. A support set
        that leaves the member a mechanism is also a CaseError (checked by
        ``engine.solver.supports.check_stable``).

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
    second_plane: Any = None
    actions: Any = None
    combinations: Any = None
    restraints: tuple = ()
    steps: tuple = ()
    foundation: tuple = ()

    def __post_init__(self) -> None:
        set_field(self, "schema", _schema_version(self.schema))
        if not isinstance(self.title, str):
            raise CaseError(
                f"title: {show(self.title)} is not text; it must be a string of at most "
                f"{_MAX_TITLE} characters"
            )
        if len(self.title) > _MAX_TITLE:
            raise CaseError(
                f"title: text of {len(self.title)} characters is too long; at most "
                f"{_MAX_TITLE} characters are allowed"
            )
        limits.check_text("title", self.title)
        length = real("length", self.length, "m", minimum=_MIN_LENGTH, maximum=_MAX_LENGTH)
        set_field(self, "length", length)
        if self.EI is not None:
            set_field(self, "EI", real("EI", self.EI, "N·m²", minimum=_MIN_EI, maximum=_MAX_EI))
        self._check_member()
        set_field(self, "axial_force", real("axial_force", self.axial_force, "N", magnitude=_MAX_AXIAL_FORCE))
        for end in ("left", "right"):
            if not isinstance(getattr(self, end), EndSupport):
                raise CaseError(
                    f"{end}: {show(getattr(self, end))} is not an EndSupport; build one with "
                    f"EndSupport.named(...) or EndSupport(translation=..., rotation=...)"
                )
        if not isinstance(self.loads, (tuple, list)):
            raise CaseError(f"loads: {show(self.loads)} is not a tuple or list of load objects")
        limits.check_load_count(len(self.loads))
        set_field(
            self, "loads", tuple(placed_load(index, load, length) for index, load in enumerate(self.loads))
        )
        limits.check_work(length, self.loads)
        if not isinstance(self.imperfection, Imperfection):
            raise CaseError(f"imperfection: {show(self.imperfection)} is not an Imperfection")
        if abs(self.imperfection.amplitude) > length / 10:
            raise CaseError(
                f"imperfection.amplitude: {self.imperfection.amplitude!r} m is too large; "
                f"|amplitude| must be <= length/10 = {length / 10:g} m"
            )
        # Intermediate restraints, steps and foundation (engine.restraints), then the mechanism check.
        inner.normalise(self)
        if self.restraints or self.foundation:
            inner.check_mechanism(self)
        else:
            supports.check_stable(self)
        if self.second_plane is not None:
            self._check_second_plane()
        if self.actions is not None or self.combinations is not None:
            self._check_actions()

    def _check_actions(self) -> None:
        """Validate ``actions`` and ``combinations`` (:mod:`engine.actions`); the loads then live in them."""
        actions, settings = case_actions(self)
        set_field(self, "actions", actions)
        set_field(self, "combinations", settings)

    def _check_second_plane(self) -> None:
        """Validate ``second_plane`` against the member and keep the second plane's case (at zero force)."""
        plane, derived = second_plane_of(self)
        set_field(self, "second_plane", plane)
        # Not a field: equality and hashing see second_plane, of which this is a function.
        object.__setattr__(self, "_second_case", derived)

    def second_plane_case(self) -> Case | None:
        """The second plane as a one-plane case at this case's axial force (None without ``second_plane``).

        It bends about the other axis, with the second plane's supports, loads, bow and EI, and the case's
        length, section, material, stiffness factor and check settings.
        """
        derived = self.__dict__.get("_second_case")
        if derived is None or self.axial_force == 0.0:
            return derived
        twin = object.__new__(Case)
        twin.__dict__.update(derived.__dict__)
        twin.__dict__["axial_force"] = self.axial_force
        return twin

    def _check_member(self) -> None:
        """Validate the section, material, axis, stiffness factor and check settings."""
        choice("axis", self.axis, AXES, "an axis")
        set_field(
            self,
            "stiffness_factor",
            real(
                "stiffness_factor",
                self.stiffness_factor,
                "",
                minimum=0.0,
                minimum_exclusive=True,
                maximum=1.0,
            ),
        )
        if self.check is None:
            set_field(self, "check", CheckSettings())
        elif isinstance(self.check, Mapping):
            check_keys("check", self.check, _CHECK_KEYS)
            set_field(self, "check", CheckSettings(**self.check))
        elif not isinstance(self.check, CheckSettings):
            raise CaseError(
                f"check: {show(self.check)} is not check settings; expected an object with keys "
                f"{quoted(_CHECK_KEYS)}"
            )
        if self.out_of_plane is not None:
            settings = OutOfPlaneSettings.from_data(self.out_of_plane)
            set_field(self, "out_of_plane", None if settings == OutOfPlaneSettings() else settings)
        section = None
        if self.section is not None:
            if not isinstance(self.section, Spec):
                set_field(self, "section", Spec(self.section, "section"))
            section = section_from_spec(dict(self.section), self.axis)
        if self.material is not None:
            if not isinstance(self.material, Spec):
                set_field(self, "material", Spec(self.material, "material"))
            material_from_spec(dict(self.material), section.t_max if section is not None else None)
        if self.EI is None and (self.section is None or self.material is None):
            missing = [name for name in ("section", "material") if getattr(self, name) is None]
            raise CaseError(
                f"EI: required key is missing (or give both section and material; "
                f"{' and '.join(missing)} missing)"
            )

    def without_axial_force(self) -> Case:
        """This case at zero axial force: the key of every cache of what does not depend on the force.

        The critical loads, the model, the stations and the first-order solution are the same for every
        axial force, so :mod:`engine.prepared` keys them on this (and a caller that caches per case should
        too). Nothing is validated again: a valid case stays valid with no axial force.

        >>> case = Case(length=2.0, EI=1.0, left=EndSupport.named("pinned"), right=EndSupport.named("pinned"),
        ...             axial_force=3.0)
        >>> twin = case.without_axial_force()
        >>> twin.axial_force, twin == Case(length=2.0, EI=1.0, left=case.left, right=case.right)
        (0.0, True)
        """
        if self.axial_force == 0.0:
            return self
        twin = object.__new__(Case)
        twin.__dict__.update(self.__dict__)
        twin.__dict__["axial_force"] = 0.0
        return twin

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
        mapping = expect_mapping("case", mapping, f"a case object with keys {quoted(_CASE_KEYS)}")
        # The schema comes first: another version may have other keys.
        schema = _schema_version(mapping.get("schema", SCHEMA_VERSION))
        check_keys("case", mapping, _CASE_KEYS, _CASE_REQUIRED)

        supports = expect_mapping("supports", mapping["supports"], '{"left": ..., "right": ...}')
        check_keys("supports", supports, ("left", "right"), ("left", "right"))
        left = support_from_data("supports.left", supports["left"])
        right = support_from_data("supports.right", supports["right"])

        raw_loads = mapping.get("loads", [])
        if isinstance(raw_loads, (str, bytes)) or not isinstance(raw_loads, (list, tuple)):
            raise CaseError(f"loads: {show(raw_loads)} is not a list of load objects")
        limits.check_load_count(len(raw_loads))  # before any load is built
        loads = tuple(load_from_data(f"loads[{index}]", data) for index, data in enumerate(raw_loads))

        raw_bow = expect_mapping(
            "imperfection", mapping.get("imperfection", {}), '{"shape": ..., "amplitude": ...}'
        )
        check_keys("imperfection", raw_bow, _IMPERFECTION_KEYS)
        with within("imperfection"):
            imperfection = Imperfection(**raw_bow)

        arguments = {
            name: mapping[name]
            for name in ("title", "length", "EI", "axial_force", "axis", "stiffness_factor")
            if name in mapping
        }
        for name in ("section", "material", "check", "out_of_plane"):
            if name in mapping:
                arguments[name] = expect_mapping(name, mapping[name], "an object")
        if "second_plane" in mapping:
            arguments["second_plane"] = as_second_plane(mapping["second_plane"])
        for name in ("actions", "combinations"):
            if name in mapping:
                arguments[name] = mapping[name]
        arguments.update(inner.read(mapping))
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
                "loads": [load_to_data(load) for load in self.loads],
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
        if self.check != CheckSettings():
            data["check"] = self.check.to_dict()
        if self.out_of_plane is not None:
            data["out_of_plane"] = self.out_of_plane.to_dict()
        if self.second_plane is not None:
            data["second_plane"] = self.second_plane.to_data()
        if self.actions is not None:
            data["actions"] = [action.to_data() for action in self.actions]
            data["combinations"] = self.combinations.to_data()
        data.update(inner.written(self))
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
