"""What the batch's headline ``utilization`` is: what produces it (``governing_check``) and whether it is a
code check (``utilization_basis``).

The headline is the worst enabled route of the member check (:func:`app.report.routes.headline_route`), so its
cell is named by that route and the route's governing term, never by one route's check alone. It is a code
check only for a steel member whose counted routes are code checks: for timber, aluminium or a custom material
the engine makes no check of that material's code (no buckling curves, no k_mod or γ_M: the routes for steel
are not applied, reason ``material-<kind>``), and what it reports is the larger of elastic bounds (N/N_cr,
M/M_cr, which no code's resistance exceeds, so a code's utilisation is at least that) and the stress over the
unfactored strength. Such a utilisation is marked and kept out of the ranking of code checks
(:mod:`app.batch.summary`).
"""

from __future__ import annotations

__all__ = ["BOUND_TERMS", "CODE_CHECK", "NOT_CODE_CHECK", "basis_cell", "governing_cell", "is_code_check"]

#: ``utilization_basis`` of a utilisation that is a code check.
CODE_CHECK = "code check"

#: The start of ``utilization_basis`` of one that is not (the material's kind follows in brackets).
NOT_CODE_CHECK = "elastic bound only, not a code check"

#: The routes' terms that are elastic bounds standing in for a check the engine does not make
#: (engine.member_routes: N/N_cr about the other axis, N/Pcr1 without a bow, M_y,II/M_cr).
BOUND_TERMS = frozenset({"out-of-plane-elastic", "in-plane-elastic", "lateral-torsional-elastic"})

#: The member check's kinds that are such bounds (engine.out_of_plane.ELASTIC_KIND, engine.checks
#: IN_PLANE_ELASTIC_KIND), for a result without routes.
_BOUND_KINDS = frozenset({"out-of-plane elastic buckling", "in-plane elastic buckling"})


#: Danger cautions of a steel member that the code check here does not cover (engine.material_cautions): the
#: basis says so (an audit found "code check" beside "not a code check for this steel").
_NOT_CHECKED_STEEL = frozenset(
    {"high-strength-steel", "flexural-torsional-not-checked", "torsional-buckling-not-checked"}
)


def governing_cell(result) -> str:
    """``governing_check``: the route giving the headline and its governing term, e.g. ``"en-member: eq.
    (6.62)"``; ``"member check: <kind>"`` where the member check's own value is above every route (or there
    are no routes); "" without a member check."""
    from app.report.route_names import governing_text
    from app.report.routes import headline_exceeds_routes, headline_route

    check = getattr(result, "check", None)
    if check is None or getattr(result, "utilization", None) is None:
        return ""
    route = headline_route(result)
    if route is None or headline_exceeds_routes(result):
        return f"member check: {check.kind}"
    term = governing_text(route.governing)
    return f"{route.route}: {term}" if term else route.route


def is_code_check(result) -> bool:
    """True when the headline utilisation is a code check: a steel member with at least one counted route free
    of elastic bounds (the headline, the worst counted route, is then at least that route's code check)."""
    material = getattr(result, "material", None)
    if getattr(material, "kind", None) != "steel":
        return False
    counted = [
        route
        for route in getattr(result, "routes", ()) or ()
        if route.enabled and route.utilization is not None
    ]
    if not counted:
        check = getattr(result, "check", None)
        return check is not None and check.kind not in _BOUND_KINDS
    return any(
        route.governing not in BOUND_TERMS and not BOUND_TERMS.intersection(route.terms or {})
        for route in counted
    )


def basis_cell(result) -> str:
    """``utilization_basis``: ``"code check"``, ``"elastic bound only, not a code check (<material kind>)"``,
    ``"not a code check (<danger caution>)"`` (a steel above 700 MPa, a custom section not stated doubly
    symmetric in compression), or "" without a utilisation."""
    if getattr(result, "utilization", None) is None:
        return ""
    for caution in getattr(result, "cautions", ()) or ():  # a steel its own caution says is not checked here
        if caution.level == "danger" and caution.code in _NOT_CHECKED_STEEL:
            return f"not a code check ({caution.code})"
    if is_code_check(result):
        return CODE_CHECK
    kind = getattr(getattr(result, "material", None), "kind", None) or "no material"
    return f"{NOT_CODE_CHECK} ({kind})"
