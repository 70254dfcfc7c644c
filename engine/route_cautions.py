"""The cautions of the member-check routes (issue 14), added to a result's cautions.

Structured like every caution (:class:`engine.cautions.Caution`): ``values`` carry the route, the note or
reason codes and the utilisations, for an app to word.
"""

from __future__ import annotations

import math

from engine.cautions import Caution

__all__ = ["ROUTES_DISAGREE", "with_route_cautions"]

#: Routes whose utilisations differ by more than this fraction of the smaller one get an info caution: what
#: an engineer learns from (which assumptions make the difference). Common practice, no source.
ROUTES_DISAGREE = 0.2

_ROUTE_NOTES = {
    "chi-LT-1": "EN 1993-1-1:2005 §6.3.2 and §6.3.3 (χ_LT = 1: lateral-torsional buckling not checked; "
    "from memory)",
    "LTB-not-checked": "AISC 360-16 Chapter F (lateral-torsional buckling not checked; from memory)",
}


def with_route_cautions(cautions, routes) -> tuple:
    """The routes' notes, the routes not applied, the headline's fallback and a disagreement between routes.

    Returns ``cautions`` with them, most severe first. Where ``cautions`` already holds the
    ``lateral-torsional-buckling`` warning, the routes' ``chi-LT-1`` and ``LTB-not-checked`` notes join its
    values (``routes``) instead of repeating it.
    """
    given = list(cautions)
    ltb = next((i for i, c in enumerate(given) if c.code == "lateral-torsional-buckling"), None)
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
