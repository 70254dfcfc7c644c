"""The second bending plane of a case: the case file's optional ``second_plane`` key.

A case bends about its ``axis`` (major by default): that is the first plane. ``second_plane`` adds bending
about the other axis, with its own supports, transverse loads and initial bow; the length, section,
material, axial force, stiffness factor and check settings are the case's::

    "second_plane": {
        "supports": {"left": "pinned", "right": "pinned"},
        "loads": [{"type": "point", "P": 1.5e3, "x": 3.0}],
        "imperfection": {"preset": "en1993-table-5.1"},
        "EI": 1.2e6
    }

- ``supports`` (required): the same forms as the case's ``supports``, for translation and rotation in the
  second plane.
- ``loads`` (optional, default none): the same load forms as the case's ``loads``; w and the loads of the
  second plane are positive the same way as each other.
- ``imperfection`` (optional): the same forms as the case's. Left out, the second plane takes the code's bow
  (EN 1993-1-1 Table 5.1, ``en1993-table-5.1`` with the curve about the other axis, the column of the check
  method, the direction automatic) when the case has a section and a steel material, and no bow otherwise
  (with the ``no-bow`` caution in compression).
- ``EI`` [N·m²]: given exactly when the case's own ``EI`` is given (the bending stiffness about the other
  axis, overriding E·I of a section as the case's does); left out when the case takes EI from its section and
  material.

A two-plane case may not give ``out_of_plane`` (the second plane's supports and bow make that check), nor a
``custom`` section (its properties are about one axis only). The planes are uncoupled: strutscope's sections
are doubly symmetric, and for those linear second-order theory gives two independent beam-columns (torsion,
warping and flexural–torsional buckling are not analysed). This module only reads and writes the key; the
case (:class:`engine.case.Case`) validates it against the member and builds the second plane's case.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any

from engine import limits
from engine.errors import CaseError
from engine.inputs import EndSupport, Imperfection, support_from_data
from engine.loads import load_from_data, load_to_data
from engine.materials import material_from_spec
from engine.restraints import for_plane, foundations_for_plane
from engine.sections import section_from_spec
from engine.validate import check_keys, expect_mapping, show, within

__all__ = ["SECOND_PLANE_KEYS", "SecondPlane", "as_second_plane", "default_bow", "second_plane_of"]

#: The keys of ``second_plane``.
SECOND_PLANE_KEYS = ("supports", "loads", "imperfection", "EI")
_IMPERFECTION_KEYS = ("shape", "amplitude", "preset", "curve", "analysis", "ratio", "direction", "columns")


@dataclass(frozen=True, kw_only=True)
class SecondPlane:
    """Bending about the other axis: supports, loads, bow and (with the case's EI) the stiffness.

    Attributes
    ----------
    left, right : EndSupport
        The supports of the second plane at x = 0 and x = L.
    loads : tuple of load objects
        The second plane's transverse loads (positions checked against the member by the case).
    imperfection : Imperfection or None
        The second plane's bow; None: the default (the code's bow with a steel section, else none).
    EI : float or None
        Bending stiffness about the other axis [N·m²]; given exactly when the case gives its own EI.
    """

    left: EndSupport
    right: EndSupport
    loads: tuple = ()
    imperfection: Imperfection | None = None
    EI: float | None = None

    def __post_init__(self) -> None:
        for end in ("left", "right"):
            if not isinstance(getattr(self, end), EndSupport):
                raise CaseError(
                    f"second_plane.supports.{end}: {show(getattr(self, end))} is not an EndSupport; build "
                    "one with EndSupport.named(...) or EndSupport(translation=..., rotation=...)"
                )
        if not isinstance(self.loads, (tuple, list)):
            raise CaseError(f"second_plane.loads: {show(self.loads)} is not a tuple or list of load objects")
        object.__setattr__(self, "loads", tuple(self.loads))
        if self.imperfection is not None and not isinstance(self.imperfection, Imperfection):
            raise CaseError(f"second_plane.imperfection: {show(self.imperfection)} is not an Imperfection")

    @classmethod
    def from_data(cls, data: Any) -> SecondPlane:
        """Read the case file's ``second_plane`` mapping, naming every field by its path."""
        if isinstance(data, SecondPlane):
            return data
        data = expect_mapping(
            "second_plane", data, '{"supports": {"left": ..., "right": ...}, "loads": [...], ...}'
        )
        check_keys("second_plane", data, SECOND_PLANE_KEYS, ("supports",))
        supports = expect_mapping("second_plane.supports", data["supports"], '{"left": ..., "right": ...}')
        check_keys("second_plane.supports", supports, ("left", "right"), ("left", "right"))
        left = support_from_data("second_plane.supports.left", supports["left"])
        right = support_from_data("second_plane.supports.right", supports["right"])
        raw_loads = data.get("loads", [])
        if isinstance(raw_loads, (str, bytes)) or not isinstance(raw_loads, (list, tuple)):
            raise CaseError(f"second_plane.loads: {show(raw_loads)} is not a list of load objects")
        limits.check_load_count(len(raw_loads))
        loads = tuple(
            load_from_data(f"second_plane.loads[{index}]", item) for index, item in enumerate(raw_loads)
        )
        imperfection = None
        if "imperfection" in data:
            raw_bow = expect_mapping(
                "second_plane.imperfection", data["imperfection"], '{"shape": ..., "amplitude": ...}'
            )
            check_keys("second_plane.imperfection", raw_bow, _IMPERFECTION_KEYS)
            with within("second_plane.imperfection"):
                imperfection = Imperfection(**raw_bow)
        return cls(left=left, right=right, loads=loads, imperfection=imperfection, EI=data.get("EI"))

    def to_data(self) -> dict[str, Any]:
        """The case-file form (``imperfection`` and ``EI`` only when given)."""
        data: dict[str, Any] = {
            "supports": {"left": self.left.to_data(), "right": self.right.to_data()},
            "loads": [load_to_data(load) for load in self.loads],
        }
        if self.imperfection is not None:
            data["imperfection"] = self.imperfection.to_data()
        if self.EI is not None:
            data["EI"] = self.EI
        return data


def as_second_plane(value: Any) -> SecondPlane:
    """``value`` as a :class:`SecondPlane` (a mapping is read as the case file's key)."""
    if isinstance(value, SecondPlane):
        return value
    if isinstance(value, Mapping):
        return SecondPlane.from_data(value)
    raise CaseError(
        f"second_plane: {show(value)} is not an object; expected "
        '{"supports": {"left": ..., "right": ...}, "loads": [...], "imperfection": {...}, "EI": ...}'
    )


def default_bow(case) -> Imperfection:
    """The second plane's bow when the case leaves it out: EN 1993-1-1 Table 5.1 with steel, else none.

    The Table 5.1 preset with the curve ``auto`` (EN 1993-1-1 Table 6.2 about the other axis), the column of
    the case's check method and the direction automatic (both solved, the worse kept). Both planes carry
    their bows at the same time: the conservative reading (DEVELOPERS.md).
    """
    if case.section is None or case.material is None:
        return Imperfection()
    section = section_from_spec(dict(case.section), case.axis)
    if material_from_spec(dict(case.material), section.t_max).kind != "steel":
        return Imperfection()
    return Imperfection(shape="sine", preset="en1993-table-5.1", analysis=case.check.method)


def second_plane_of(case):
    """``case.second_plane`` validated against the member, and the second plane's case at zero force.

    Returns ``(plane, derived)``: the :class:`SecondPlane` with its load positions snapped as the case snaps
    its own, and a case of ``type(case)`` bending about the other axis. Every error names its path
    (``second_plane.loads[1].x: ...``).
    """
    plane = as_second_plane(case.second_plane)
    if case.out_of_plane is not None:
        raise CaseError(
            f"out_of_plane: {show(case.out_of_plane.to_dict())} is not allowed with second_plane: the "
            "second plane's supports and bow make the check of buckling about the other axis; leave "
            "out_of_plane out"
        )
    if case.EI is not None and plane.EI is None:
        raise CaseError(
            "second_plane.EI: required key is missing: the case gives its own EI, so the second plane "
            "needs the bending stiffness about the other axis [N·m²], 1e-3 to 1e16"
        )
    if case.EI is None and plane.EI is not None:
        raise CaseError(
            f"second_plane.EI: {show(plane.EI)} N·m² is not allowed here: the case takes EI from its "
            "section and material, which give it about the other axis too; leave it out, or give "
            "the case's EI as well"
        )
    if case.section is not None and dict(case.section).get("shape") == "custom":
        raise CaseError(
            "second_plane: not allowed with a custom section, whose properties are about one axis "
            "only; give a catalogue section or a parametric shape, or leave out section and "
            "material and give EI for both planes"
        )
    imperfection = plane.imperfection if plane.imperfection is not None else default_bow(case)
    with within("second_plane"):
        derived = type(case)(
            length=case.length,
            left=plane.left,
            right=plane.right,
            EI=plane.EI,
            loads=plane.loads,
            imperfection=imperfection,
            title=case.title,
            section=case.section,
            axis="minor" if case.axis == "major" else "major",
            material=case.material,
            stiffness_factor=case.stiffness_factor,
            check=case.check,
            restraints=for_plane(case.restraints, "second"),
            foundation=foundations_for_plane(case.foundation, "second"),
        )
    plane = SecondPlane(
        left=plane.left,
        right=plane.right,
        loads=derived.loads,
        imperfection=plane.imperfection,
        EI=derived.EI,
    )
    return plane, derived
