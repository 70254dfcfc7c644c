"""The cautions of the member-check routes (issue 14), added to a result's cautions.

Structured like every caution (:class:`engine.cautions.Caution`): ``values`` carry the route, the note or
reason codes and the utilisations, for an app to word.
"""

from __future__ import annotations

import math

from engine.buckling_interaction import TERM as INTERACTION
from engine.cautions import Caution
from engine.member_routes import LTB_ELASTIC, headline
from engine.sway_buckling import SOURCE as SWAY_SOURCE
from engine.sway_buckling import TERM as SWAY

__all__ = ["ROUTES_DISAGREE", "with_route_cautions"]

_INTERACTION_SOURCE = (
    "EN 1993-1-1:2005 §6.3.3(4), eq. (6.62) (N with M_y about the buckling axis z–z; from memory)"
)

#: Routes whose utilisations differ by more than this fraction of the smaller one get an info caution: what
#: an engineer learns from (which assumptions make the difference). Common practice, no source.
ROUTES_DISAGREE = 0.2

_ROUTE_NOTES = {
    "chi-LT-1": "EN 1993-1-1:2005 §6.3.2 and §6.3.3 (χ_LT = 1: lateral-torsional buckling not checked; "
    "from memory)",
    "LTB-not-checked": "AISC 360-16 Chapter F (lateral-torsional buckling not checked; from memory)",
}


def with_route_cautions(cautions, routes, ltb_check=None) -> tuple:
    """The routes' notes, the routes not applied, the headline's fallback and a disagreement between routes.

    Returns ``cautions`` with them, most severe first. Where ``cautions`` already holds the
    ``lateral-torsional-buckling`` warning, the routes' ``chi-LT-1`` and ``LTB-not-checked`` notes join its
    values (``routes``) instead of repeating it. Where the member's lateral-torsional buckling check was made
    (``ltb_check``, an :class:`engine.design.ltb_member.LtbCheck` that applies) that warning is dropped: the
    check replaces it (and so does the case's statement ``check.ltb.restrained``, or a member without
    major-axis moment, reason ``no-major-moment``: nothing to buckle laterally); where it was not made, the
    warning stays with the check's reason code (``values["ltb_reason"]``: ``torsion-unknown``, ``free-end``,
    ...) and, for a custom section, the keys it lacks (``values["ltb_missing"]``).
    """
    given = list(cautions)
    # Nothing to check where the major-axis diagram has no moment (a strut): the warning goes too.
    if ltb_check is not None and (ltb_check.applies or ltb_check.reason in ("restrained", "no-major-moment")):
        given = [c for c in given if c.code != "lateral-torsional-buckling"]
    ltb = next((i for i, c in enumerate(given) if c.code == "lateral-torsional-buckling"), None)
    if ltb is not None and ltb_check is not None and ltb_check.reason:
        message = given[ltb].message
        second = next((r for r in routes if r.route == "second-order"), None)
        bound = None if second is None else (second.terms or {}).get(LTB_ELASTIC)
        if bound is not None:  # a material without the check: its M_cr still bounds (engine.member_routes)
            message += (
                " Its elastic critical moment bounds any code's resistance: M_y,II/M_cr = "
                f"{bound:.3f} counts in the utilisation as a bound, and the code's check is still to be made."
            )
        given[ltb] = Caution(
            level=given[ltb].level,
            code=given[ltb].code,
            message=message,
            source=given[ltb].source,
            values=dict(given[ltb].values, ltb_reason=ltb_check.reason)
            | ({"ltb_missing": list(ltb_check.missing)} if getattr(ltb_check, "missing", ()) else {}),
        )
    if ltb is not None:
        noted = [r.route for r in routes if r.utilization is not None and set(r.notes) & set(_ROUTE_NOTES)]
        if noted:
            given[ltb] = Caution(
                level=given[ltb].level,
                code=given[ltb].code,
                message=given[ltb].message,
                source=given[ltb].source,
                values=dict(given[ltb].values, routes=noted, chi_LT=1.0),
            )
    out = []
    for route in routes:
        if route.utilization is None:
            out.append(
                Caution(
                    level="warning" if route.enabled else "info",
                    code="route-not-applied",
                    message=f"The {route.route} route is not applied: {route.reason}.",
                    source=route.source,
                    values={"route": route.route, "reason": route.reason, "enabled": route.enabled},
                )
            )
            continue
        for note in route.notes:
            if note in _ROUTE_NOTES and ltb is None:
                out.append(
                    Caution(
                        level="info",
                        code=note,
                        message=f"{route.route} route: {note}.",
                        source=_ROUTE_NOTES[note],
                        values={"route": route.route, "enabled": route.enabled},
                    )
                )
    out.extend(_interaction_not_counted(routes))
    out.extend(_sway_counted(routes))
    out.extend(_cantilever_support(ltb_check))
    applied = [r for r in routes if r.enabled and r.utilization is not None]
    if routes and not applied:
        out.append(
            Caution(
                level="warning",
                code="headline-fallback",
                message="No enabled route applies to this member: the headline is the second-order check.",
                source="strutscope's routes (common practice, no source)",
                values={"routes": [r.route for r in routes if r.enabled]},
            )
        )
    out.extend(_member_fails(routes, given + out))
    finite = {
        r.route: r.utilization for r in routes if r.utilization is not None and 0 < r.utilization < math.inf
    }
    if len(finite) >= 2:
        low, high = min(finite.values()), max(finite.values())
        if high > low * (1.0 + ROUTES_DISAGREE):
            out.append(
                Caution(
                    level="info",
                    code="routes-disagree",
                    message=f"The routes' utilisations differ by {100.0 * (high / low - 1.0):.0f} %: "
                    f"{finite}.",
                    source="strutscope's routes (threshold common practice, no source)",
                    values={"utilizations": finite, "spread": high / low - 1.0, "limit": ROUTES_DISAGREE},
                )
            )
    order = {"danger": 0, "warning": 1, "info": 2}
    return tuple(sorted(given + out, key=lambda c: order[c.level]))


def _member_fails(routes, cautions) -> list:
    """A danger caution where the headline (the largest enabled route, :func:`headline`) is above 1 and no
    danger caution says so yet: an audit found a member failing eq. (6.62) at 1.014 with no caution at all
    (the ``overstressed`` caution speaks of the in-plane check only), so a calc sheet read as a pass
    everywhere but its routes."""
    value, code, fell_back = headline(routes)
    if fell_back or value is None or not value > 1.0 or any(c.level == "danger" for c in cautions):
        return []
    top = next(r for r in routes if r.route == code)
    shown = "unbounded" if math.isinf(value) else f"{value:.3f} > 1"
    return [
        Caution(
            level="danger",
            code="member-fails",
            message=(
                f"The member fails: utilisation {shown} by the {code} route ({top.governing}). It does not "
                "pass as analysed."
            ),
            source=top.source,
            values={"route": code, "utilization": value, "governing": top.governing},
        )
    ]


def _cantilever_support(ltb_check) -> list:
    """Warnings where the lateral-torsional buckling check took an end as free laterally because its support
    moves (``tip_moves``), or a cantilever's built-in support as held laterally, the case leaving a fork
    there (``root_assumed``; :mod:`engine.ltb_route`)."""
    if ltb_check is None:
        return []
    out = _held_assumed(ltb_check) + _supports_assumed(ltb_check)
    tip = 1 if ltb_check.lateral_ends[1] == "free" else 0
    where = ("x = 0", "x = L")[tip]
    if getattr(ltb_check, "tip_moves", False) and "free" in ltb_check.lateral_ends:
        out.append(
            Caution(
                level="warning",
                code="ltb-end-moves",
                message=(
                    f"Lateral-torsional buckling takes the end at {where} as free laterally and in twist (a "
                    "cantilever's tip): its support moves and the case does not hold it out of plane. Where "
                    "it is held (bracing, a roof plate), set its lateral end to fork, or give the "
                    "out-of-plane buckling length (L where both ends are held)."
                ),
                source="a decision of this project (an end whose support moves is not taken as held "
                "laterally unless the case says so)",
                values={"end": ("left", "right")[tip]},
            )
        )
    factor = getattr(ltb_check, "out_of_plane_cantilever", 0.0)
    if factor:
        beyond = factor > 2.0 * (1.0 + 1e-9)
        covers = (
            "which is held more than the member (longer than 2L out of plane): the check is a lower bound of "
            "its utilisation, not a check of it"
            if beyond
            else "which covers any length up to 2L and is conservative below it"
        )
        out.append(
            Caution(
                level="danger" if beyond else "warning",
                code="ltb-out-of-plane-length",
                message=(
                    f"The out-of-plane buckling length given is {factor:.3g} times the member's, so its ends "
                    "are not both held out of its plane: lateral-torsional buckling takes the member as a "
                    f"cantilever out of its plane, held at one end and free at the other (free at {where}, "
                    f"the worse), {covers}. Give the plane of minor-axis bending with its supports for the "
                    "member's own check."
                ),
                source="a decision of this project (EN 1993-1-1 §6.3.2.2; M_cr of the cantilever, Timoshenko "
                "& Gere (1961) ch. 6, from memory)",
                values={"factor": factor, "end": ("left", "right")[tip]},
            )
        )
    if getattr(ltb_check, "root_assumed", False):
        root = 1 - tip
        warping = ltb_check.warping_ends[root]
        out.append(
            Caution(
                level="warning",
                code="ltb-cantilever-support",
                message=(
                    "Lateral-torsional buckling is checked as a cantilever with its built-in support held "
                    "laterally as well (no lateral displacement or rotation about the minor axis there, "
                    f"twist held, warping {warping}): check.ltb.lateral_ends does not say fixed there, and "
                    "a fork would let it swing. Where the support does not hold it so (an overhang past a "
                    "support, a connection to a member that can twist), M_cr is lower and the check is not "
                    "covered."
                ),
                source="Timoshenko & Gere (1961) ch. 6, the built-in cantilever (from memory); a decision of "
                "this project",
                values={"support": ("left", "right")[root], "warping": warping},
            )
        )
    return out


def _held_assumed(ltb_check) -> list:
    """A warning where an end whose support moves in the plane analysed was taken as a fork by the
    lateral-torsional buckling check of a one-plane case (its other end not built in:
    :mod:`engine.ltb_route`)."""
    side = getattr(ltb_check, "held_assumed", "")
    if not side:
        return []
    where = {"left": "the end at x = 0", "right": "the end at x = L", "both": "both ends"}[side]
    return [
        Caution(
            level="warning",
            code="ltb-end-held-assumed",
            message=(
                f"Lateral-torsional buckling takes {where} as held laterally and against twist (a fork), "
                "though the support moves in the plane analysed (free, guided or a spring) and the case "
                "does not say how it is held out of that plane; without a built-in end, nothing else "
                "would hold the member laterally. Where that end is not held so, the check is "
                "not covered: give the plane of minor-axis bending (its supports then decide), or set the "
                "lateral end. An out-of-plane buckling length not above L states the ends held."
            ),
            source="a decision of this project (common practice, no source)",
            values={"end": side},
        )
    ]


def _supports_assumed(ltb_check) -> list:
    """A warning where the lateral-torsional buckling check of a one-plane overhang took its supports inside
    the member as forks (:mod:`engine.ltb_route`)."""
    xs = getattr(ltb_check, "supports_assumed", ())
    if not xs:
        return []
    where = ", ".join(f"{x:.3f}" for x in xs)
    return [
        Caution(
            level="warning",
            code="ltb-support-held-assumed",
            message=(
                f"Lateral-torsional buckling takes the support inside the member (x = {where} m) as held "
                "laterally and against twist (a fork), as it takes a supported end: with a free end and the "
                "other end not built in, nothing else would hold the member laterally. One plane does not "
                "say how the support holds the member out of its plane; where it does not hold it so, the "
                "check is not covered: give the plane of minor-axis bending with its restraints."
            ),
            source="a decision of this project (common practice, no source)",
            values={"x": list(xs)},
        )
    ]


def _interaction_not_counted(routes) -> list:
    """A one-plane case checked without the ``en-member`` route: its out-of-plane check is N alone.

    The second-order route of a one-plane case checks buckling about the other axis for the axial force
    alone (N/N_b,Rd, §6.3.1); the interaction of that buckling with the moment in the plane analysed is
    eq. (6.62) of the en-member route (and H1-1 of the aisc route). When neither is enabled, say so: a
    warning, or a danger when its eq. (6.62) exceeds 1 (the headline then misses a failing check).
    """
    second = next((r for r in routes if r.route == "second-order"), None)
    if second is not None and INTERACTION in second.terms:
        return [_counted_conservatively(second)]
    member = next((r for r in routes if r.route == "en-member"), None)
    if member is None or member.enabled or member.utilization is None:
        return []
    if any(r.enabled and r.utilization is not None and r.route == "aisc" for r in routes):
        return []  # H1-1 takes P_c about the weaker axis with the moment: the interaction counts
    facts = member.facts
    if not facts.get("N_Ed", 0.0) > 0.0:
        return []
    other = next((a for a in ("y", "z") if facts.get(f"N_cr_{a}_source") == "out-of-plane length"), None)
    analysed = "z" if other == "y" else "y"
    if other is None or not facts.get(f"M_{analysed}_Ed", 0.0) > 0.0:
        return _ltb_interaction_not_counted(member, second)
    eq = member.terms.get("eq-6.62" if other == "z" else "eq-6.61")
    if eq is None and math.isinf(member.utilization):  # at or above a critical load: no equation to give
        eq = member.utilization
    level = "danger" if eq is not None and eq > 1.0 else "warning"
    return [
        Caution(
            level=level,
            code="out-of-plane-interaction-not-counted",
            message=(
                "Out-of-plane buckling is checked for the axial force alone (N/N_b,Rd): its interaction with "
                "the moment in the plane analysed (EN 1993-1-1 eq. (6.62)) is in the en-member route, which "
                "does not count toward the headline"
                + (f"; that equation gives {eq:.3f} > 1." if level == "danger" else ".")
            ),
            source=_INTERACTION_SOURCE,
            values={"route": "en-member", "equation": "eq-6.62" if other == "z" else "eq-6.61", "value": eq},
        )
    ]


def _ltb_interaction_not_counted(member, second) -> list:
    """Lateral-torsional buckling (χ_LT < 1) checked for M_y alone by the second-order route, where the
    en-member route's eqs. (6.61)/(6.62), which add N (and M_z), do not count and would raise the headline:
    a warning, or a danger above 1."""
    if second is None or second.utilization is None or not member.facts.get("chi_LT", 1.0) < 1.0:
        return []
    found = [(member.terms[e], e) for e in ("eq-6.61", "eq-6.62") if e in member.terms]
    if not found:
        return []
    value, equation = max(found)
    if not value > second.utilization * (1.0 + 1e-9):
        return []
    level = "danger" if value > 1.0 else "warning"
    shown = "(6.61)" if equation == "eq-6.61" else "(6.62)"
    return [
        Caution(
            level=level,
            code="lateral-torsional-interaction-not-counted",
            message=(
                "Lateral-torsional buckling is checked for the major-axis moment alone (M_y,II/M_b,Rd): its "
                f"interaction with the axial force (EN 1993-1-1 eq. {shown}, {value:.3f}) is in the "
                f"en-member route, which does not count toward the headline ({second.utilization:.3f})."
            ),
            source=_INTERACTION_SOURCE,
            values={
                "route": "en-member",
                "equation": equation,
                "value": value,
                "headline": second.utilization,
            },
        )
    ]


_WHY = {
    "foundation": "a member on a foundation is not one of the diagrams of Annexes A and B, and the en-member "
    "route cannot be enabled on it",
    "stepped-section": "the en-member route takes one section along the member; each segment's section is "
    "taken in turn with the largest moment of the whole member",
    "en-member-not-enabled": "the en-member route, which counts them, is not enabled",
    "custom-section": "a custom section's class and buckling curves are not known: it is taken as class 3 "
    "(its elastic properties) with curve d about both axes and the largest factors of Annex B's Tables B.1 "
    "and B.2",
}

_READ = {
    "foundation": "with C_m = 1, the largest value of the Annex's tables,",
    "stepped-section": "with C_m read from the member's own diagram,",
    "en-member-not-enabled": "as the en-member route reads them,",
    "custom-section": "with C_m the larger of the member's own diagram and 1,",
}


#: What the sway caution adds where a spring or the ground holds the member (engine.sway_buckling).
_SUPPORT_FORCE = {
    "spring": " The force in the translational spring grows as 1/(1 − N/Pcr1) and is not checked: design "
    "the restraint for the reaction shown.",
    "foundation": " The ground's reaction grows as 1/(1 − N/Pcr1) and is not checked.",
}


def _sway_counted(routes) -> list:
    """The caution of the second-order route's in-plane buckling on a swaying first mode
    (:mod:`engine.sway_buckling`): info, or a warning where a spring or the ground holds the member (their
    force is not checked)."""
    second = next((r for r in routes if r.route == "second-order" and r.utilization is not None), None)
    if second is None or SWAY not in (second.terms or {}):
        return []
    facts, value = second.facts, second.terms[SWAY]
    support = facts.get("sway_support", "free")
    why = (
        "No equivalent-member route applies to a member stepped in section"
        if support == "stepped"
        else "A piece of the member may turn as a rigid body in its first mode (an end that moves, a hinge "
        "or a foundation), and such a mode carries little bending"
    )
    return [
        Caution(
            level="warning" if support in _SUPPORT_FORCE else "info",
            code="sway-buckling-counted",
            message=(
                f"{why}: the second-order route also counts in-plane flexural buckling on the first mode, "
                f"N/N_b,Rd = {value:.3f} with N_cr = Pcr1, λ̄ = {facts.get('sway_lambda', math.nan):.3f}, "
                f"χ = {facts.get('sway_chi', math.nan):.3f} (curve {facts.get('sway_curve', '?')})."
                + _SUPPORT_FORCE.get(support, "")
            ),
            source=SWAY_SOURCE,
            values={"route": "second-order", "value": value, "support": support},
        )
    ]


def _counted_conservatively(second) -> Caution:
    """The info caution of the second-order route's buckling interaction term
    (:mod:`engine.buckling_interaction`)."""
    facts = second.facts
    equation = facts.get("interaction_equation", "eq-6.62")
    value = facts.get("interaction_value", second.terms[INTERACTION])
    why = facts.get("interaction_reason", "")
    shown = "(6.62)" if equation == "eq-6.62" else "(6.61)"
    because = _WHY.get(why, "no equivalent-member route counts it")
    return Caution(
        level="info",
        code="buckling-interaction-counted",
        message=(
            "Member buckling with the moments (out of plane; in plane where the bow is below the code's; "
            "and lateral-torsional with the axial force) is "
            f"counted in the second-order route by EN 1993-1-1 eqs. (6.61)/(6.62) {_READ.get(why, '')} on "
            f"the member's own first-order moments: eq. {shown} governs with {value:.3f}. "
            + (
                f"It is counted here because {because}."
                if why == "en-member-not-enabled"
                else f"A conservative reading, because {because}."
            )
        ),
        source=_INTERACTION_SOURCE + "; Annex B Table B.3 and Annex A Table A.2 (from memory)",
        values={"route": "second-order", "equation": equation, "value": value, "reason": why},
    )
