"""Intermediate restraints and steps in the stiffness: the case keys ``restraints`` and ``steps``.

A **restraint** acts at one point strictly inside the member, in one plane or both:

- ``translation``: ``"fixed"`` (w = 0 there), ``"free"`` or a spring k_t [N/m], whose force on the member is
  ``-k_t w``;
- ``rotation``: ``"fixed"`` (w' = 0 there), ``"free"`` or a spring k_r [N·m/rad], whose couple on the
  member is ``-k_r w'``;
- ``hinge``: true for an internal hinge (a moment release: M = 0 on both sides, the slope may jump); a hinge
  takes no rotation restraint (on which side would it act?);
- ``plane``: ``"first"``, ``"second"`` (a two-plane case only) or ``"both"`` (the default);
- ``twist``: ``"fixed"`` (the section held against twisting there, φ = 0), ``"free"`` (the default) or a
  torsional spring k_φ [N·m/rad]. It acts in no bending plane: only the lateral-torsional buckling check reads
  it (:mod:`engine.design.ltb_member`); a restraint with a twist alone is left out of the bending planes.

For lateral-torsional buckling, a restraint acting in the plane of minor-axis bending (a two-plane case's
plane about the minor axis) holds the shear centre laterally (translation: v = 0 or a spring; rotation: v' = 0
or a spring), see DEVELOPERS.md (decisions log, issue 15, restraints in M_cr).

A **step** changes the member from its ``x`` to the next step (or the end), in one of two forms:

- by stiffness, ``{"x": ..., "EI": ...}`` [m, N·m²]: in a one-plane case that gives its own EI and no section
  (there is no section to check);
- by section, ``{"x": ..., "section": ...}`` (the forms of the case's ``section``: a catalogue name, a
  parametric shape or a custom mapping): in a one-plane case with a section and a material and no EI of its
  own. That segment's EI is E·I of its section about the case's axis (times the stiffness factor), and the
  cross-section check along it uses its section (and the material's f_y for its thickness).

The case's own EI or section holds from x = 0 to the first step; all steps of a case take the same form.

Both are frozen value objects that validate themselves; :func:`restraints_from_data` and
:func:`steps_from_data` read the case file's lists, :func:`check_against` checks them against the member.
Errors name the path: ``restraints[1].x: 7.5 m lies outside the member (0 to 6 m, ends excluded)``.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any

import numpy as np

from engine.errors import CaseError
from engine.inputs import Spec, _restraint
from engine.limits import MAX_RESTRAINTS
from engine.sections import section_from_spec
from engine.validate import check_keys, choice, flag, real, set_field, show, within

__all__ = [
    "PLANES",
    "Foundation",
    "Restraint",
    "RestraintReaction",
    "Step",
    "check_against",
    "normalise",
    "read",
    "written",
    "by_section",
    "check_mechanism",
    "foundations_from_data",
    "for_plane",
    "restraints_from_data",
    "steps_from_data",
]

PLANES = ("first", "second", "both")
_RESTRAINT_KEYS = ("x", "translation", "rotation", "hinge", "plane", "twist")
_STEP_KEYS = ("x", "EI", "section")
_FOUNDATION_KEYS = ("start", "end", "k", "plane")
_MAX_FOUNDATION = 1e12  # [N/m²]: stiffer than any soil or bedding by orders of magnitude
_MAX_ITEMS = MAX_RESTRAINTS  # per list: far more than any member needs; keeps the global system small
_MIN_EI, _MAX_EI = 1e-3, 1e16  # [N·m²], the case's own bounds of EI


@dataclass(frozen=True, kw_only=True)
class Restraint:
    """A support, spring or hinge at one point inside the member (see the module docstring).

    >>> Restraint(x=3.0, translation="fixed")
    Restraint(x=3.0, translation='fixed', rotation='free', hinge=False, plane='both', twist='free')
    """

    x: float
    translation: str | float = "free"
    rotation: str | float = "free"
    hinge: bool = False
    plane: str = "both"
    twist: str | float = "free"

    def __post_init__(self) -> None:
        set_field(self, "x", real("x", self.x, "m"))
        set_field(self, "translation", _restraint("translation", self.translation, "k_t", "N/m"))
        set_field(self, "rotation", _restraint("rotation", self.rotation, "k_r", "N·m/rad"))
        set_field(self, "hinge", flag("hinge", self.hinge))
        set_field(self, "twist", _restraint("twist", self.twist, "k_φ", "N·m/rad"))
        choice("plane", self.plane, PLANES, "a plane")
        if self.hinge and self.rotation != "free":
            raise CaseError(
                f"rotation: {show(self.rotation)} is not allowed with a hinge; a hinge releases the moment, "
                "so its rotation must be 'free' (put a rotation restraint at another x)"
            )
        if not self.bends and self.twist in ("free", 0.0):
            raise CaseError(
                "translation: 'free' with rotation 'free', no hinge and twist 'free' restrains nothing; "
                "give a fixed or elastic translation, rotation or twist, or hinge: true"
            )

    @property
    def bends(self) -> bool:
        """Whether it acts in bending (a translation, rotation or hinge; not a twist alone)."""
        return self.hinge or self.translation != "free" or self.rotation != "free"

    @property
    def translation_stiffness(self) -> float | None:
        """k_t [N/m] of a spring, 0 when free, None when fixed."""
        return (
            None if self.translation == "fixed" else (0.0 if self.translation == "free" else self.translation)
        )

    @property
    def rotation_stiffness(self) -> float | None:
        """k_r [N·m/rad] of a spring, 0 when free, None when fixed."""
        return None if self.rotation == "fixed" else (0.0 if self.rotation == "free" else self.rotation)

    def describe(self, index: int) -> str:
        """The restraint as an error message names it: ``restraints[1] (x = 3 m, a hinge)``."""
        parts = []
        if self.translation != "free":
            parts.append(f"translation {self.translation!r}")
        if self.rotation != "free":
            parts.append(f"rotation {self.rotation!r}")
        if self.hinge:
            parts.append("a hinge")
        if self.twist != "free":
            parts.append(f"twist {self.twist!r}")
        return f"restraints[{index}] (x = {self.x:g} m, {', '.join(parts)})"

    def to_data(self) -> dict[str, Any]:
        """The case-file form; the defaults are left out."""
        data: dict[str, Any] = {"x": self.x}
        if self.translation != "free":
            data["translation"] = self.translation
        if self.rotation != "free":
            data["rotation"] = self.rotation
        if self.hinge:
            data["hinge"] = True
        if self.plane != "both":
            data["plane"] = self.plane
        if self.twist != "free":
            data["twist"] = self.twist
        return data


@dataclass(frozen=True, kw_only=True)
class RestraintReaction:
    """What one intermediate restraint exerts on the member: ``force`` [N] along +w and ``couple`` [N·m]
    (anticlockwise positive as drawn, the sign of a couple load C), at ``x`` [m]; ``index`` is its place in
    the plane's restraints."""

    index: int
    x: float
    force: float
    couple: float


@dataclass(frozen=True, kw_only=True)
class Step:
    """The member from ``x`` [m] to the next step or the end: its bending stiffness ``EI`` [N·m²], or its own
    ``section`` (a section specification, as the case's ``section`` key); exactly one of the two.

    >>> Step(x=2.0, EI=3.0e6)
    Step(x=2.0, EI=3000000.0, section=None)
    >>> Step(x=2.0, section={"name": "HEB 200"}).section["name"]
    'HEB 200'
    """

    x: float
    EI: float | None = None
    section: Any = None

    def __post_init__(self) -> None:
        set_field(self, "x", real("x", self.x, "m"))
        if (self.EI is None) == (self.section is None):
            raise CaseError(
                "EI: give exactly one of EI [N·m²] (a step in stiffness) or section (a step in section); "
                f"received EI {show(self.EI)} and section {show(self.section)}"
            )
        if self.EI is not None:
            set_field(self, "EI", real("EI", self.EI, "N·m²", minimum=_MIN_EI, maximum=_MAX_EI))
            return
        if not isinstance(self.section, Spec):
            set_field(self, "section", Spec(self.section, "section"))
        section_from_spec(dict(self.section), "major")  # the spec is checked here, naming section.<key>

    def to_data(self) -> dict[str, Any]:
        if self.section is not None:
            return {"x": self.x, "section": dict(self.section)}
        return {"x": self.x, "EI": self.EI}


@dataclass(frozen=True, kw_only=True)
class Foundation:
    """An elastic (Winkler) foundation of modulus ``k`` [N/m², force per length per deflection] from ``start``
    to ``end`` [m], in ``plane`` "first", "second" or "both" (default): it adds ``-k w`` to the load.

    >>> Foundation(start=0.0, end=6.0, k=2.0e6)
    Foundation(start=0.0, end=6.0, k=2000000.0, plane='both')
    """

    start: float
    end: float
    k: float
    plane: str = "both"

    def __post_init__(self) -> None:
        set_field(self, "start", real("start", self.start, "m"))
        set_field(self, "end", real("end", self.end, "m"))
        set_field(
            self, "k", real("k", self.k, "N/m²", minimum=0.0, minimum_exclusive=True, maximum=_MAX_FOUNDATION)
        )
        choice("plane", self.plane, PLANES, "a plane")
        if self.end <= self.start:
            raise CaseError(f"end: {self.end!r} m must be beyond start ({self.start!r} m)")

    def to_data(self) -> dict[str, Any]:
        data: dict[str, Any] = {"start": self.start, "end": self.end, "k": self.k}
        if self.plane != "both":
            data["plane"] = self.plane
        return data


def _items(path: str, raw: Any, keys: tuple[str, ...], make) -> tuple:
    if isinstance(raw, (str, bytes, Mapping)) or not isinstance(raw, (list, tuple)):
        raise CaseError(f"{path}: {show(raw)} is not a list; expected a list of objects with keys {keys}")
    if len(raw) > _MAX_ITEMS:
        raise CaseError(f"{path}: {len(raw)} items are too many; at most {_MAX_ITEMS} are allowed")
    out = []
    for index, item in enumerate(raw):
        where = f"{path}[{index}]"
        if isinstance(item, make):
            out.append(item)
            continue
        if not isinstance(item, Mapping):
            raise CaseError(f"{where}: {show(item)} is not an object; expected keys {keys}")
        required = {Restraint: ("x",), Step: ("x",), Foundation: ("start", "end", "k")}[make]
        check_keys(where, item, keys, required)
        with within(where):
            out.append(make(**item))
    return tuple(out)


def restraints_from_data(raw: Any) -> tuple[Restraint, ...]:
    """The case file's ``restraints`` list as :class:`Restraint` objects (paths ``restraints[i].key``)."""
    return _items("restraints", raw, _RESTRAINT_KEYS, Restraint)


def steps_from_data(raw: Any) -> tuple[Step, ...]:
    """The case file's ``steps`` list as :class:`Step` objects (paths ``steps[i].key``)."""
    return _items("steps", raw, _STEP_KEYS, Step)


def foundations_from_data(raw: Any) -> tuple[Foundation, ...]:
    """The case file's ``foundation`` list as :class:`Foundation` objects (paths ``foundation[i].key``)."""
    return _items("foundation", raw, _FOUNDATION_KEYS, Foundation)


def _inside(path: str, x: float, length: float) -> None:
    if not 0.0 < x < length:
        raise CaseError(
            f"{path}.x: {x!r} m lies outside the member's interior (0 to {length:g} m, ends excluded); "
            "restrain an end with supports"
        )


#: The least distance between two points where the member's stiffness chain is cut (the ends, restraints,
#: steps, the ends of a foundation range), as a fraction of L. A piece h long enters the critical-load count
#: with a stiffness of order EI/h³, so the count loses about (L/h)³ times the rounding: an independent audit
#: found two 1 N/m springs 10 µm apart on a 5 m member raising Pcr1 from 1661 kN to 3512 kN ("stable" above
#: the true critical load). Measured on a 5 m member: two soft springs 2e-4·L apart err by 3e-6, a short
#: stiffer piece by 5e-5 at 6e-5·L and 3.6e-3 at 2e-5·L; at 1e-3·L the error is below 1e-7 [derived].
MIN_APART = 1e-3


def _apart(case) -> None:
    """Refuse two cuts of the stiffness chain closer than :data:`MIN_APART`·L (not the same point)."""
    length = case.length
    tol = 1e-9 * length
    for plane in ("first", "second") if case.second_plane is not None else ("first",):
        cuts = [(0.0, "the left end"), (length, "the right end")]
        cuts += [
            (r.x, f"restraints[{i}]") for i, r in enumerate(case.restraints) if r.plane in (plane, "both")
        ]
        cuts += [(st.x, f"steps[{i}]") for i, st in enumerate(case.steps)]
        for i, f in enumerate(case.foundation):
            if f.plane in (plane, "both"):
                cuts += [(x, f"foundation[{i}]") for x in (f.start, f.end) if tol < x < length - tol]
        cuts.sort(key=lambda cut: cut[0])
        for (a, first), (b, second) in zip(cuts, cuts[1:], strict=False):
            # any gap below MIN_APART·L but zero: the solver keeps even a piece 1e-11 m long, which an
            # audit found to raise Pcr1 4.7 times; exactly MIN_APART·L apart is allowed
            if 0.0 < b - a < MIN_APART * length * (1 - 1e-9):
                later = second if second not in ("the left end", "the right end") else first
                where = b if later == second else a
                other, at = (first, a) if later == second else (second, b)
                raise CaseError(
                    f"{later}: at {where:.9g} m it is {abs(b - a):.3g} m from {other} at {at:.9g} m; points "
                    "where the member's stiffness changes (ends, restraints, steps, foundation ends) must be "
                    f"the same point or at least {MIN_APART:g}·L = {MIN_APART * length:g} m apart (closer, "
                    "the critical loads lose their precision); merge them or move them apart"
                )


def check_against(case) -> None:
    """Check ``case.restraints`` and ``case.steps`` against the member; raise :class:`CaseError` naming them.

    Positions strictly inside, one restraint per point and plane, steps at distinct points, a second-plane
    restraint only in a two-plane case, steps by EI only in a one-plane case with its own EI and no section.
    """
    length = case.length
    seen: dict = {}
    for index, r in enumerate(case.restraints):
        if not isinstance(r, Restraint):
            raise CaseError(f"restraints[{index}]: {show(r)} is not a Restraint")
        _inside(f"restraints[{index}]", r.x, length)
        if r.plane == "second" and case.second_plane is None:
            raise CaseError(
                f"restraints[{index}].plane: 'second' is not allowed in a one-plane case; allowed: 'first', "
                "'both' (or add second_plane)"
            )
        for plane in ("first", "second") if r.plane == "both" else (r.plane,):
            for other, x in seen.get(plane, ()):
                if abs(x - r.x) <= 1e-9 * length:
                    raise CaseError(
                        f"restraints[{index}].x: {r.x!r} m repeats restraints[{other}] in the {plane} plane; "
                        "give one restraint per point and plane (with both its translation and rotation)"
                    )
            seen.setdefault(plane, []).append((index, r.x))
    previous = None
    for index, s in enumerate(case.steps):
        if not isinstance(s, Step):
            raise CaseError(f"steps[{index}]: {show(s)} is not a Step")
        _inside(f"steps[{index}]", s.x, length)
        if previous is not None and s.x <= previous + 1e-9 * length:
            raise CaseError(
                f"steps[{index}].x: {s.x!r} m must lie beyond the step before it ({previous:g} m); "
                "list steps in increasing x"
            )
        previous = s.x
    if case.steps:
        _check_step_forms(case)
    ranges = []
    for index, f in enumerate(case.foundation):
        if not isinstance(f, Foundation):
            raise CaseError(f"foundation[{index}]: {show(f)} is not a Foundation")
        if f.start < -1e-9 * length or f.end > length * (1 + 1e-9):
            raise CaseError(
                f"foundation[{index}]: {f.start:g} to {f.end:g} m lies outside the member (0 to {length:g} m)"
            )
        if f.plane == "second" and case.second_plane is None:
            raise CaseError(
                f"foundation[{index}].plane: 'second' is not allowed in a one-plane case; allowed: 'first', "
                "'both' (or add second_plane)"
            )
        for plane in ("first", "second") if f.plane == "both" else (f.plane,):
            for other, a, b in ranges:
                if plane == other[1] and f.start < b - 1e-9 * length and a < f.end - 1e-9 * length:
                    raise CaseError(
                        f"foundation[{index}]: {f.start:g} to {f.end:g} m overlaps "
                        f"foundation[{other[0]}] in the {plane} plane; give one modulus per range"
                    )
            ranges.append(((index, plane), f.start, f.end))
    _apart(case)
    routes = tuple(getattr(case.check, "routes", ()))
    checked = case.section is not None and case.material is not None
    if case.foundation and checked and routes != ("second-order",):
        raise CaseError(
            f"check.routes: {list(routes)!r} is not available on a foundation: the equivalent-member "
            "routes read the moment diagram between braced points by the tables of EN 1993-1-1 Annex A/B "
            "and AISC 360, none of which covers a member bedded along its length; allowed here: "
            "['second-order'] (the cross-section check with the exact second-order forces and a bow in the "
            "shape of the first buckling mode)"
        )
    if case.steps and case.imperfection.preset == "en1993-eq-5.9":
        raise CaseError(
            "imperfection.preset: 'en1993-eq-5.9' is not available with steps: eq. (5.9)'s bow is scaled "
            "to the moment at the critical cross-section of a uniform member, and with steps in section "
            "that section is not known beforehand; use 'en1993-table-5.1' (the worst curve of the "
            "segments) or give the bow's shape and amplitude"
        )


def by_section(case) -> bool:
    """Whether the case's steps name their own sections (steps in section rather than in EI)."""
    return any(getattr(s, "section", None) is not None for s in getattr(case, "steps", ()))


def _check_step_forms(case) -> None:
    """Steps of one form, each in a case that supports it (see the module docstring)."""
    sectioned = [i for i, s in enumerate(case.steps) if s.section is not None]
    if sectioned and len(sectioned) != len(case.steps):
        first = next(i for i, s in enumerate(case.steps) if s.section is None)
        raise CaseError(
            f"steps[{first}].EI: a step by EI is not allowed beside steps by section "
            f"(steps[{sectioned[0]}]); give every step a section"
        )
    if sectioned:
        if case.section is None or case.material is None or case.EI is not None:
            raise CaseError(
                f"steps[{sectioned[0]}].section: a step by section needs a case with a section and a "
                "material and no EI of its own (the first segment's section is the case's)"
            )
        if case.second_plane is not None:
            raise CaseError(
                f"steps[{sectioned[0]}].section: steps are not allowed in a two-plane case (the N–M_y–M_z "
                "check of both planes reads one section); analyse each plane as a one-plane case"
            )
        return
    if case.EI is None or case.section is not None:
        raise CaseError(
            "steps[0].EI: a step by EI needs a case that gives its own EI and no section (the member check "
            "would use the one section along the whole member); with a section give each step its own "
            "section instead"
        )
    if case.second_plane is not None:
        raise CaseError(
            "steps: not allowed in a two-plane case (a step by EI gives the stiffness about one axis only)"
        )


def for_plane(restraints, plane: str) -> tuple[Restraint, ...]:
    """The restraints acting in ``plane`` ("first" or "second"), each marked ``plane="first"`` for the solver,
    which sees one plane at a time (a twist alone acts in no plane: left out)."""
    out = []
    for r in restraints:
        if r.plane in (plane, "both") and r.bends:
            out.append(r if r.plane == "first" else Restraint(**{**r.__dict__, "plane": "first"}))
    return tuple(out)


def _restrains(value) -> bool:
    return value == "fixed" or (not isinstance(value, str) and float(value) > 0.0)


def check_mechanism(case) -> None:
    """Raise :class:`CaseError` when the supports, restraints and foundation of the first plane leave a
    mechanism.

    At zero load a mechanism is a deflected shape without strain: w piecewise linear, continuous, with a kink
    only at hinges, and zero wherever translation is restrained (rigidly or by a spring k > 0), its slope zero
    wherever rotation is. With w = a + b x + Σ c_h (x − x_h)₊ over the hinges h, the member is stable exactly
    when these conditions leave a = b = c_h = 0 (a rank test; common practice, no source). The error names
    the hinges that move, or the rigid-body motion when none does.
    """
    L = float(case.length)
    own = for_plane(case.restraints, "first")
    hinges = [(i, r) for i, r in enumerate(case.restraints) if r.hinge and r.plane in ("first", "both")]
    xh = np.array([r.x for _, r in hinges]) / L

    def w_row(x):
        return np.concatenate([[1.0, x], np.maximum(x - xh, 0.0)])

    def slope_row(x):
        return np.concatenate([[0.0, 1.0], (x > xh).astype(float)])

    rows = []
    for end, x in ((case.left, 0.0), (case.right, 1.0)):
        if _restrains(end.translation):
            rows.append(w_row(x))
        if _restrains(end.rotation):
            rows.append(slope_row(x))
    for r in own:
        if _restrains(r.translation):
            rows.append(w_row(r.x / L))
        if _restrains(r.rotation):
            rows.append(slope_row(r.x / L))
    # A foundation holds w = 0 along its whole range: at both ends and at every hinge inside it.
    for f in foundations_for_plane(case.foundation, "first"):
        for x in (f.start, f.end, *(r.x for _, r in hinges if f.start < r.x < f.end)):
            rows.append(w_row(x / L))
    n = 2 + len(hinges)
    G = np.array(rows) if rows else np.zeros((1, n))
    _, sv, vt = np.linalg.svd(G, full_matrices=True)
    sv = np.concatenate([sv, np.zeros(n - sv.size)]) if sv.size < n else sv
    if sv[-1] > 1e-9 * max(sv[0], 1.0):
        return
    v = vt[-1]
    moving = [hinges[k] for k in range(len(hinges)) if abs(v[2 + k]) > 1e-6 * np.abs(v).max()]
    if moving:
        names = ", ".join(r.describe(i) for i, r in moving)
        raise CaseError(
            f"restraints: the hinge at {names} leaves a span free to move (a mechanism); restrain "
            "translation beside it, or remove the hinge"
        )
    raise CaseError(
        "restraints: the supports and restraints leave the member free to move as a rigid body (a "
        "mechanism); restrain translation at two points at least, or translation and rotation at one"
    )


def foundations_for_plane(foundation, plane: str) -> tuple[Foundation, ...]:
    """The foundation ranges acting in ``plane``, each marked ``plane="first"`` for the solver."""
    out = []
    for f in foundation:
        if f.plane in (plane, "both"):
            out.append(
                f if f.plane == "first" else Foundation(start=f.start, end=f.end, k=f.k, plane="first")
            )
    return tuple(out)


_READERS = {"restraints": restraints_from_data, "steps": steps_from_data, "foundation": foundations_from_data}


def read(mapping) -> dict:
    """The case file's ``restraints``, ``steps`` and ``foundation`` (those given) as the case's arguments."""
    return {key: reader(mapping[key]) for key, reader in _READERS.items() if key in mapping}


def written(case) -> dict:
    """The case-file form of the case's ``restraints``, ``steps`` and ``foundation`` (those not empty)."""
    return {key: [item.to_data() for item in getattr(case, key)] for key in _READERS if getattr(case, key)}


def normalise(case) -> None:
    """Store the three lists on the (frozen) case as tuples of their objects, and check them."""
    for key, reader in _READERS.items():
        set_field(case, key, reader(getattr(case, key)))
    check_against(case)
