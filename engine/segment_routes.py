r"""The ``en-member`` route of a member with intermediate restraints: one equivalent member per segment
between points of restraint (issue 16).

EN 1993-1-1:2005 Annex B, Table B.3 (its heading, from memory): :math:`C_{my}` is read from the moment diagram
:math:`M_y` between the points braced in the z direction (against deflection in the plane of :math:`M_y`),
:math:`C_{mz}` from :math:`M_z` between the points braced in y; Annex A's Table A.2 is applied the same way.
So each plane is cut at its restraints with a **fixed** translation (a rigid brace); an elastic brace (a
spring) is not a braced point in the code's sense: the diagram runs through it (its reaction shapes the
diagram) and the exact critical load counts its stiffness. Both planes' cuts together give the member's
pieces; each piece is checked with eqs. (6.61)/(6.62) and the cross-section checks, using

- the exact critical load of each plane (:math:`N_{cr}` of the first mode, springs and restraints counted),
  so the buckling length of every segment is :math:`L_{cr} = \pi\sqrt{EI/N_{cr}}` and :math:`\chi` the
  member's (the first mode's N_cr is the lowest, so a short segment never gets a shorter buckling length
  than the mode gives it: on the safe side);
- for each plane the first-order diagram of the braced segment that holds the piece: :math:`M_{Ed}` its
  largest |M|, :math:`C_m` its Table B.3 (or A.2) factor, the sway note's 0.9 where one of its ends is a
  member end free to translate;
- the member's lateral-torsional buckling check as it is (:mod:`engine.member_routes`), with :math:`C_{mLT}`
  of Table B.2 read from :math:`M_y` between the points braced laterally (the LTB check's brace segments, the
  whole member without braces), not from the piece's span between in-plane braces.

The piece with the largest utilisation governs; its x range is in the facts (``segment_start``,
``segment_end``; ``L_segment`` its length) and every piece's ``[start, end, utilisation]`` in
``segments``. Pure functions of the solved planes; numpy only.
"""

from __future__ import annotations

import dataclasses
from types import SimpleNamespace

import numpy as np

from engine.design import en_member
from engine.design.diagram import annex_b_factor, describe
from engine.restraints import for_plane

__all__ = ["braced_points", "route"]

_TOL = 1e-9


def braced_points(case) -> tuple:
    """The x [m] of the restraints of ``case``'s own (first) plane with a fixed translation, in order."""
    return tuple(sorted(float(r.x) for r in for_plane(case.restraints, "first") if r.translation == "fixed"))


def _piece_loads(loads, a: float, b: float) -> list:
    """The loads on [a, b] in the piece's own coordinate, as :func:`engine.design.diagram.describe` reads
    them (a load that covers only part of the piece is read as ``mixed``)."""
    tol = _TOL * max(1.0, b - a)
    out = []
    for load in loads:
        if load.type in ("point", "couple"):
            if a - tol <= load.x <= b + tol:
                out.append(dataclasses.replace(load, x=min(max(load.x - a, 0.0), b - a)))
            continue
        start = 0.0 if load.start is None else load.start
        end = np.inf if load.end is None else load.end
        if end <= a + tol or start >= b - tol:
            continue
        whole = start <= a + tol and end >= b - tol
        if load.type == "uniform":
            out.append(
                SimpleNamespace(
                    type="uniform", q=load.q, start=None if whole else max(start - a, tol), end=None
                )
            )
        else:  # a linear load is never uniform over the piece: the "mixed" row
            out.append(SimpleNamespace(type="linear", q_start=load.q_start, q_end=load.q_end))
    return out


def _segment_diagram(res, case, a: float, b: float):
    """The first-order diagram of the plane ``res`` between a and b (exact: every node is a station)."""
    first = res.first_order
    x = np.asarray(first.x)
    tol = _TOL * float(case.length)
    on = (x >= a - tol) & (x <= b + tol)
    sway = (a <= tol and case.left.translation != "fixed") or (
        b >= case.length - tol and case.right.translation != "fixed"
    )
    return describe(
        x=x[on] - a,
        moment=np.asarray(first.moment)[on],
        deflection=np.asarray(first.deflection)[on],
        shear=np.asarray(first.shear)[on],
        loads=_piece_loads(case.loads, a, b),
        length=b - a,
        sway=sway,
    )


def _containing(cuts: tuple, length: float, x: float) -> tuple:
    ends = (0.0, *cuts, length)
    k = int(np.searchsorted(np.asarray(ends), x)) - 1
    k = min(max(k, 0), len(ends) - 2)
    return ends[k], ends[k + 1]


def _lateral_diagram(found, cuts: tuple, lateral_cuts: tuple, ltb, length: float, mid: float, cache):
    """The M_y diagram whose Table B.3 factor is C_mLT for the piece at ``mid``, where it is not the piece's
    own span between in-plane braces (None then). Table B.3 reads C_mLT between the points braced laterally
    ("points braced in direction y-y", from memory): the spans between the second plane's braced points
    (``lateral_cuts``: lateral translation held, twist free or not). The LTB check's brace segments (lateral
    translation and twist held) are read too, and the larger factor is kept: the two readings differ where a
    restraint holds the member laterally but not against twist (an independent check found C_mLT 0.4 over the
    whole member against 0.6 over each half, eq. (6.62) 3 % low), and the larger C_mLT gives the larger
    k_zy. An in-plane support alone does not hold the member laterally, so its C_my is not C_mLT (an
    independent check found C_mLT 0.55 of a half span taken for a member free laterally over 8 m: eq. (6.62)
    8.8 % low)."""
    if found is None or ltb is None or not getattr(ltb, "applies", False):
        return None
    spans = tuple(ltb.segments) or ((0.0, length),)
    braced = next(((a, b) for a, b in spans if a - _TOL <= mid <= b + _TOL), (0.0, length))
    held = _containing(lateral_cuts, length, mid)
    own = _containing(cuts, length, mid)
    diagrams = {
        span: cache(("routes-segment-diagram", "y", span), lambda span=span: _segment_diagram(*found, *span))
        for span in dict.fromkeys((braced, held))
    }
    span = max(diagrams, key=lambda s: annex_b_factor(diagrams[s]))
    return None if span == own else diagrams[span]


def route(*, y, z, plane_results, cache, key=None, **common):
    """The ``en-member`` route of a member with braced points: every piece between the braced points of both
    planes checked as an equivalent member (see the module); ``plane_results`` maps an axis (``"y"``,
    ``"z"``) to its solved plane ``(result, case)`` or None (a plane without loads: no cuts, its diagram as
    given). ``common``: the other arguments of :func:`engine.design.en_member.route`. Returns the governing
    piece's RouteCheck, or None when no plane has a braced point (the member is one equivalent member);
    ``key`` (a function of a piece's RouteCheck) picks the piece instead of its utilisation."""
    planes = {"y": y, "z": z}
    cuts = {axis: (braced_points(found[1]) if found else ()) for axis, found in plane_results.items()}
    if not any(cuts.values()):
        return None
    length = next(found[1].length for found in plane_results.values() if found)
    edges = sorted({0.0, length, *cuts["y"], *cuts["z"]})
    pieces = []
    for a, b in zip(edges[:-1], edges[1:], strict=False):
        mid = 0.5 * (a + b)
        sides = {}
        for axis, plane in planes.items():
            found = plane_results[axis]
            if found is None:
                sides[axis], span = plane, (0.0, length)
                continue
            span = _containing(cuts[axis], length, mid)
            diagram = cache(
                ("routes-segment-diagram", axis, span),
                lambda found=found, span=span: _segment_diagram(*found, *span),
            )
            sides[axis] = dataclasses.replace(plane, diagram=diagram)
        ltb = common.get("ltb")
        lateral = _lateral_diagram(plane_results["y"], cuts["y"], cuts["z"], ltb, length, mid, cache)
        found = en_member.route(y=sides["y"], z=sides["z"], lateral_diagram=lateral, **common)
        if found.utilization is None:
            return found  # not applied: a property of the section, the same for every piece
        pieces.append((a, b, found))
    pick = (lambda p: p[2].utilization) if key is None else (lambda p: key(p[2]))
    a, b, best = max(pieces, key=pick)
    facts = dict(
        best.facts,
        segment_start=a,
        segment_end=b,
        L_segment=b - a,
        segments=[[pa, pb, p.utilization] for pa, pb, p in pieces],
    )
    return dataclasses.replace(best, facts=facts)
