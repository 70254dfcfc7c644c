"""The member routes' torsional buckling term (EN 1993-1-1 §6.3.1.4, :mod:`engine.torsional_buckling`): the
member's own, and a member stepped in section's (each segment's section along the whole member, the smallest
N_b,T,Rd kept: the weakest segment governs, as for lateral-torsional buckling; an independent check found the
term missing on a stepped member, 7 % on the unsafe side)."""

from __future__ import annotations

import math

from engine import torsional_buckling
from engine.ltb_route import lateral_sides
from engine.ltb_route import made as _made
from engine.ltb_route import major as _major
from engine.sections import section_from_spec

__all__ = ["member_torsional", "term", "weakest_segment"]


def member_torsional(result, section_y, section_z, material):
    """The member's torsional buckling load and resistance with the section about its major (``section_y``)
    and minor axis, or None."""
    case = result.case
    if _major(result) is not None:
        free = lateral_sides(result, case.check.ltb)[0]
    else:
        ends = (("left", case.left), ("right", case.right))
        free = tuple(side for side, end in ends if end.translation == "free" and end.rotation == "free")
    found = torsional_buckling.critical_load(case, section_y, section_z, material, free)
    if found is None:
        return None
    return torsional_buckling.resistance(found, section_z, material, case.check.gamma_M1)


def _view(segment, axis: str):
    """A segment's section about ``axis`` (``"major"``, ``"minor"``)."""
    return section_from_spec(dict(segment.spec), axis)


def weakest_segment(result, segments, cache):
    """The smallest N_b,T,Rd over the segments of a member stepped in section, or None where none applies."""
    found = []
    for segment in segments:
        views = [
            _made(cache, ("routes-view", axis, segment.spec), lambda a=axis, s=segment: _view(s, a))
            for axis in ("major", "minor")
        ]
        twist = member_torsional(result, *views, segment.material)
        if twist is not None:
            found.append(twist)
    return min(found, key=lambda t: t.N_b_Rd) if found else None


def term(N: float, twist) -> tuple[str, float, dict]:
    """(the term's code, N/N_b,T,Rd, its facts) for :func:`engine.member_routes._with_term`."""
    value = N / twist.N_b_Rd if twist.N_b_Rd > 0.0 else math.inf
    facts = {"N_cr_T": twist.N_cr, "L_T": twist.length, "chi_T": twist.chi, "N_b_T_Rd": twist.N_b_Rd}
    return torsional_buckling.TERM, value, facts
