"""What the member's lateral-torsional buckling check reads from the case: its ends, restraints and planes.

:func:`lateral_torsional` makes the check of :mod:`engine.design.ltb_member` for a solved result (the routes
of :mod:`engine.member_routes` call it). The case says how each end is held laterally in one of three ways
(``check.ltb.lateral_ends``): ``fork`` or ``fixed`` as stated, or ``supports`` (the default), which reads the
end's support across the plane of major-axis bending (:func:`lateral_sides`):

- a two-plane case states it: the support of the plane of minor-axis bending. Where its translation is
  fixed the end is a fork; where it is free, guided or a spring the end is free laterally, and the other end
  holds the member where that plane builds it in;
- a one-plane case says little about the other plane. An end held against translation in the plane
  analysed is a fork (the usual support of a beam or a braced column), and so is every end where the case
  states the member held out of its plane (``out_of_plane.restrained``, or an out-of-plane buckling length
  not above L). Otherwise an end that moves in the plane analysed (guided, a translational spring) is free
  laterally where the other end is built in (a sway column: the out-of-plane buckling length of
  :mod:`engine.out_of_plane` is 2L for the same reason); else it stays a fork, since nothing else would hold
  the member, and a warning says it is assumed.

An end free in the plane analysed (translation and rotation: a cantilever's tip) is free laterally whatever
the setting says, as before the setting existed (an explicit ``fork`` in a file written then stays what it
meant). The member is then checked as a cantilever from its other end, held there laterally where it is
stated ``fixed`` or built in (:func:`built_in_root`), or as an overhang where a restraint inside holds it
laterally (a two-plane restraint; in one plane the supports inside the member are taken as forks, as the
supported ends are: :func:`_supports_as_forks`); else the check is not made (``free-end``). A decision of
the project (DEVELOPERS.md decisions log, stop 30): a fork at an end whose support moves is an assumption on
the unsafe side unless the case states it, and a check not made leaves the headline without it.
"""

from __future__ import annotations

import dataclasses
import math
from types import SimpleNamespace

from engine.classification import elastic_modulus
from engine.design import ltb_member
from engine.design.ltb import LATERAL_FROM_SUPPORTS
from engine.inputs import EndSupport
from engine.sections import section_from_spec

__all__ = ["built_in_root", "lateral_sides", "lateral_torsional", "ltb_restraints", "made", "major"]

_SIDES = ("left", "right")
FIXED, FREE = "fixed", "free"


def made(cache, key, make):
    """``make()``, through ``cache(key, make)`` when there is a cache."""
    return make() if cache is None else cache(key, make)


def major(result):
    """The result of the major-axis plane (the result itself, its second plane, or None)."""
    if result.case.axis == "major":
        return result
    second = result.second_plane
    return second if second is not None and second.case.axis == "major" else None


def _lateral_plane(result):
    """The case of the plane of minor-axis bending where the result has it (a two-plane case), else None."""
    for plane in (result, result.second_plane):
        if plane is not None and plane.case.axis == "minor":
            return plane.case
    return None


def lateral_sides(result, settings, stated=None) -> tuple[tuple, tuple, tuple]:
    """The ends free laterally (``"left"``/``"right"``, in order), those of them free because their support
    moves and the setting is ``supports`` (the others are free in the plane analysed), and the ends whose
    support moves but which are taken as forks (a one-plane case whose other end is not built in).
    ``stated``: the plane of minor-axis bending to read (default: the result's own, a two-plane case's)."""
    plane = major(result).case
    stated = stated if stated is not None else _lateral_plane(result)
    free, moving, held = [], [], []
    for i, side in enumerate(_SIDES):
        end = getattr(plane, side)
        if end.translation == FREE and end.rotation == FREE:
            free.append(side)
        elif settings.lateral_ends[i] == LATERAL_FROM_SUPPORTS:
            if getattr(stated or plane, side).translation == FIXED:
                continue
            if stated is None and _held_out_of_plane(plane):
                continue  # the case states the member held out of its plane at its ends
            if stated is None and not built_in_root(result, side):
                held.append(side)
                continue
            free.append(side)
            moving.append(side)
    return tuple(free), tuple(moving), tuple(held)


def _held_out_of_plane(case) -> bool:
    """Whether a one-plane case states the member held out of its plane at both ends: out-of-plane buckling
    prevented, or an out-of-plane buckling length not above the member's (an end that moved out of plane
    would make it longer)."""
    settings = case.out_of_plane
    if settings is None:
        return False
    if settings.restrained:
        return True
    given = settings.buckling_length
    return given is not None and given <= case.length * (1.0 + 1e-9)


def _built_in(case, side: str) -> bool:
    """Whether the end opposite ``side`` is built in (translation and rotation fixed) in ``case``'s plane."""
    root = getattr(case, _other(side))
    return root.translation == FIXED and root.rotation == FIXED


def built_in_root(result, side: str) -> bool:
    """Whether the end opposite ``side`` is built in (translation and rotation fixed) in every plane of
    ``result``."""
    planes = [result.case] + ([result.second_plane.case] if result.second_plane is not None else [])
    return all(_built_in(p, side) for p in planes)


def _root_holds(result, side: str, moving: bool, stated=None) -> bool:
    """Whether the end opposite the free ``side`` holds the member laterally (v = v' = 0): built in within
    every plane (:func:`built_in_root`), or, where ``side`` is free because the plane of minor-axis bending
    lets it move, built in within that plane (the major plane's rotation there does not turn it laterally)."""
    stated = (stated if stated is not None else _lateral_plane(result)) if moving else None
    return built_in_root(result, side) if stated is None else _built_in(stated, side)


def ltb_restraints(case) -> tuple[tuple, bool]:
    """The case's intermediate restraints as the lateral-torsional buckling problem sees them, and whether a
    hinge acts in the plane of minor-axis bending.

    A restraint acting in that plane (a two-plane case's plane about the minor axis) holds the shear centre
    laterally: its translation is ``lateral`` (v), its rotation ``lateral_rotation`` (v'); its ``twist``
    holds φ in any case. A one-plane case's restraints act in its one plane only, so only their twist enters.
    """
    minor = None
    if case.second_plane is not None:
        minor = "second" if case.axis == "major" else "first"
    out, hinge = [], False
    for r in case.restraints:
        item = {"x": r.x}
        if minor is not None and r.plane in (minor, "both") and r.bends:
            hinge = hinge or r.hinge
            item.update(lateral=r.translation, lateral_rotation=r.rotation)
        if r.twist != "free":
            item["twist"] = r.twist
        if any(value != "free" for key, value in item.items() if key != "x"):
            out.append(item)
    return tuple(out), hinge


def _out_of_plane_factor(result) -> float | None:
    """L_cr/L of a one-plane case whose stated out-of-plane buckling length exceeds L (the member is then not
    held out of its plane at both ends); None otherwise."""
    case = result.case
    settings = case.out_of_plane
    if result.second_plane is not None or settings is None or settings.restrained:
        return None
    given = settings.buckling_length
    if given is None or given <= case.length * (1.0 + 1e-9):
        return None
    return float(given) / float(case.length)


def lateral_torsional(result, y, klass, cache=None, segment=None):
    """The member's lateral-torsional buckling check (:mod:`engine.design.ltb_member`), or None without a
    steel material (the routes are then not applied either); ``segment``: with that segment's section and
    material along the whole member (:func:`engine.member_routes` splits a stepped member).

    A one-plane case whose stated out-of-plane buckling length exceeds L says that the member is not held out
    of its plane at both ends, so its ends are not both forks (where they would be taken so): up to 2L the
    member is checked as a cantilever out of its plane from either end (the plane of minor-axis bending
    read as built in at one end and free at the other), the worse kept, which covers any length up to 2L
    and is conservative below it; beyond 2L the member is held less than a cantilever, so that check is a
    lower bound of the utilisation (M_cr only falls as a restraint is taken away), kept and marked by a
    danger caution rather than dropped (dropping it read 0.49 where 2L reads 1.80). Found by an independent
    audit: an IPE 300 over 6 m with L_cr = 12 m out of plane passed at 0.822 on forks where the same member
    given in two planes fails at 1.796."""
    factor = _out_of_plane_factor(result)
    if factor is None or major(result) is None or lateral_sides(result, result.case.check.ltb)[0]:
        # an end already free laterally (a cantilever's tip, a moving end over a built-in root): its reading
        return _lateral_torsional(result, y, klass, cache, segment)
    found = []
    for root in _SIDES:
        ends = {
            root: EndSupport(translation=FIXED, rotation=FIXED),
            _other(root): EndSupport(translation=FREE, rotation=FREE),
        }
        # Only its two ends are read (lateral_sides, _root_holds): not a case, so that nothing is validated
        # again (the case's hinges would make a mechanism of a cantilever).
        stated = SimpleNamespace(axis="minor", **ends)
        one = _lateral_torsional(result, y, klass, cache, segment, stated=stated)
        if one is not None and one.applies:
            one = dataclasses.replace(
                one, root_assumed=False, tip_moves=False, out_of_plane_cantilever=factor
            )
        found.append(one)
    applied = [one for one in found if one is not None and one.applies]
    if not applied:
        return found[0]
    # the larger utilisation; a material without the check has none (NaN): the lower M_cr
    return max(applied, key=lambda one: -one.M_cr if math.isnan(one.utilisation) else one.utilisation)


def _other(side: str) -> str:
    return "right" if side == "left" else "left"


def _lateral_torsional(result, y, klass, cache=None, segment=None, stated=None):
    """:func:`lateral_torsional` with the plane of minor-axis bending ``stated`` (default: the result's)."""
    case, material = result.case, result.material
    spec, y_section = case.section, (y.section if y is not None else None)
    if segment is not None:
        spec, y_section, material = segment.spec, segment.section, segment.material
    settings = case.check.ltb
    plane = major(result)
    if plane is None:
        return ltb_member.not_applied("minor-axis-only", settings)
    first = plane.first_order
    z_section = made(cache, ("ltb-minor-section", spec), lambda: section_from_spec(dict(spec), "minor"))
    restraints, hinge = ltb_restraints(case)
    section_y = y_section if y_section is not None else plane.section
    free, moving, held = lateral_sides(result, settings, stated)
    free_end = free[0] if len(free) == 1 else bool(free)
    root_holds = isinstance(free_end, str) and _root_holds(result, free_end, bool(moving), stated)
    inner = ()
    root_stated = isinstance(free_end, str) and settings.lateral_ends[1 - _SIDES.index(free_end)] == FIXED
    lateral_plane = stated if stated is not None else _lateral_plane(result)
    if isinstance(free_end, str) and not (root_holds or root_stated) and lateral_plane is None:
        restraints, inner = _supports_as_forks(case, restraints)
    found = ltb_member.check(
        x=first.x,
        M=first.moment,
        V=first.shear,
        loads=plane.case.loads,
        length=plane.case.length,
        section_y=section_y,
        section_z=z_section,
        material=material,
        N=float(result.axial_force),
        settings=settings,
        section_class=None if klass is None else klass.klass,
        free_end=free_end,
        built_in_root=root_holds,
        gamma_M1=case.check.gamma_M1,
        cache=cache,
        restraints=restraints,
        lateral_hinge=hinge,
        resistance=material.kind == "steel",  # another material: M_cr alone, its bound (_with_ltb_term)
        modulus=None if klass is None else elastic_modulus(section_y, klass, 0),  # W_eff,y of class 4
    )
    if not (moving or held or inner):
        return found
    held_assumed = "both" if len(held) == 2 else (held[0] if held else "")
    return dataclasses.replace(
        found, tip_moves=bool(moving), held_assumed=held_assumed, supports_assumed=inner
    )


def _supports_as_forks(case, restraints) -> tuple[tuple, tuple]:
    """A one-plane member with a free end whose other end does not hold it laterally: its supports inside
    the member (translation fixed in the plane analysed) taken as forks, held laterally and against twist
    (a twist the case gives is kept), as its ends are (:func:`lateral_sides`); with none, nothing changes
    (the check is then not made). Returns the restraints and the x of the supports so taken."""
    by_x = {item["x"]: dict(item) for item in restraints}
    taken = []
    for r in case.restraints:
        if r.translation != FIXED or not r.bends:
            continue
        item = by_x.setdefault(r.x, {"x": r.x})
        item["lateral"] = FIXED
        item.setdefault("twist", FIXED)
        taken.append(float(r.x))
    if not taken:
        return restraints, ()
    return tuple(sorted(by_x.values(), key=lambda item: item["x"])), tuple(sorted(taken))
