"""The machine-readable summary of one solved case (``strutscope solve --json``), in SI.

Every value is what the engine's result holds; non-finite values are written null (JSON has no infinity).
"""

from __future__ import annotations

import math

from app.batch.headline import basis_cell
from app.report.scope import GENERAL_CAUTION

__all__ = ["SUMMARY_VERSION", "summary_data"]

#: Version of the layout of ``solve --json``; it grows when keys are added and changes if one changes meaning.
SUMMARY_VERSION = 9


def _finite(value) -> float | None:
    """A JSON number, or None (JSON null) for no value and for the engine's non-finite values."""
    if value is None:
        return None
    value = float(value)
    return value if math.isfinite(value) else None


def _message(caution) -> str:
    """A caution's message as the engine gives it; the general caution in app.report's one wording."""
    return GENERAL_CAUTION if caution.code == "scope" else caution.message


def _peak_data(peak) -> dict:
    return {"value": _finite(peak.value), "x": _finite(peak.x)}


def _governing_data(governing) -> dict:
    return {
        name: _peak_data(getattr(governing, name))
        for name in ("deflection", "total_offset", "moment", "shear")
    }


def _definitions() -> dict:
    """What each amplification ratio divides by what (the engine's words)."""
    from engine.results import AMPLIFICATION_DEFINITIONS

    return dict(AMPLIFICATION_DEFINITIONS)


def summary_data(source: str, case, result, capacity=None) -> dict:
    """Return the machine-readable summary of a solved case (what ``solve --json`` prints).

    Every value is in SI units (m, N, N·m, Pa) and is what the engine's result holds; the keys are listed in
    the README ("Command line"). JSON has no infinity: every non-finite value (the engine's +inf at a critical
    load, ``alpha_cr`` without compression) is written null, and ``status`` says which case it is
    (``"critical"``, or ``axial_force`` <= 0 for ``alpha_cr``).

    Parameters
    ----------
    source : str
        What the case was read from.
    case : engine.Case
    result : engine.Result
        What ``engine.solve(case)`` returned.
    capacity : engine.Capacity, optional
        What ``engine.capacity(case)`` returned; ``capacity`` is null without it.

    Returns
    -------
    dict
        Ready for :func:`json.dumps` with ``allow_nan=False``.
    """
    first = result.first_order
    amplification = result.amplification
    check = result.check
    return {
        "summary_version": SUMMARY_VERSION,
        "source": source,
        "title": case.title,
        "units": "SI: m, N, N·m, Pa",
        "status": result.status,
        "stable": bool(result.stable),
        "message": result.message,
        "length": _finite(case.length),
        "EI": _finite(result.EI),
        "axial_force": _finite(result.axial_force),
        "critical_loads": [_finite(load) for load in result.critical_loads],
        "alpha_cr": _finite(result.alpha_cr),
        "effective_length_factor": _finite(result.buckling.effective_length_factor),
        "governing": _governing_data(result.governing),
        "first_order": None if first is None else _governing_data(first.governing),
        "reactions": _reactions(result.reactions),
        # Issue 16: the case's restraints, steps and foundation in the case file's form (SI); [] when none.
        **{
            key: [item.to_data() for item in getattr(case, key, ())]
            for key in ("restraints", "steps", "foundation")
        },
        "amplification": {
            "moment": _finite(amplification.moment),
            "deflection": _finite(amplification.deflection),
            "moment_first_order": _finite(amplification.moment_first_order),
            "moment_bow_free": _finite(amplification.moment_bow_free),
            "reference_moment": _finite(amplification.reference_moment),
            "definitions": _definitions(),
            "approximations": [
                {
                    "name": a.name,
                    "value": _finite(a.value),
                    "source": a.source,
                    "error": _finite(a.error),
                    "compared_with": a.compared_with,
                }
                for a in amplification.approximations
            ],
        },
        "equilibrium": None
        if result.equilibrium is None
        else {
            "transverse": _finite(result.equilibrium.transverse),
            "moment": _finite(result.equilibrium.moment),
        },
        "section": None if result.section is None else result.section.name,
        "material": None if result.material is None else result.material.name,
        "bow": None if result.bow is None else result.bow.label,
        "bow_direction": None
        if result.bow is None
        else {
            "used": result.bow.direction,
            "governing": result.bow.direction_governing,
            "favourable": bool(result.bow.favourable),
            "sway": _finite(result.bow.sway),
            "compared": [
                {"direction": d, "strength_utilization": _finite(u), "max_moment": _finite(m)}
                for d, u, m in result.bow.directions
            ],
        },
        "utilization": _finite(result.utilization),
        # "code check", or "elastic bound only, not a code check (<material kind>)" (app.batch.headline)
        "utilization_basis": basis_cell(result) or None,
        # The headline fails (every enabled route and term counted); check.fails is the member check's alone.
        "fails": None if result.utilization is None else bool(result.utilization > 1.0),
        "check": None
        if check is None
        else {
            "method": check.settings.method,
            "kind": check.kind,
            "x": _finite(check.x),
            "utilization": _finite(check.utilization),
            "strength_utilization": _finite(check.strength_utilization),
            "strength_kind": check.strength_kind,
            "valid": check.valid,
            "fails": bool(check.utilization > 1.0),
            "section_class": None if check.section_class is None else check.section_class.klass,
            "out_of_plane": _out_of_plane_data(check.out_of_plane),
            # no deflection check without a service state (beyond the first critical load)
            "deflection_utilization": None
            if result.service is None
            else _finite(check.deflection_utilization),
            "max_deflection": None if result.service is None else _finite(check.max_deflection),
            "deflection_allowed": _finite(check.deflection_allowed),
            "source": check.source,
        },
        "service": None
        if result.service is None
        else {
            "deflection_utilization": _finite(result.service.utilization),
            "deflection": _finite(result.service.deflection),
            "x": _finite(result.service.x),
            "allowed": _finite(result.service.allowed),
            "basis": result.service.basis,
            "source": result.service.source,
        },
        "second_plane_service": _second_service(result),
        "capacity": None
        if capacity is None
        else {
            "mode": capacity.mode,
            "axial_force": _finite(capacity.axial_force),
            "load_factor": _finite(capacity.load_factor),
            "check": capacity.check,
            "x": _finite(capacity.x),
            "critical_load": _finite(capacity.critical_load),
            "message": capacity.message,
            "combination": getattr(capacity, "combination", None),
        },
        "second_plane": _second_plane_data(result),
        "routes": [_route_data(route) for route in getattr(result, "routes", ()) or ()],
        "headline_route": _headline_route(result),
        "combinations": _combinations_data(getattr(result, "actions", None)),
        "ltb": _ltb_data(result),
        "cautions": [
            {"level": c.level, "code": c.code, "message": _message(c), "source": c.source}
            for c in result.cautions
        ],
    }


def _combinations_data(actions) -> dict | None:
    """A case with load cases: each combination's factors, axial force and verdict, and what governs."""
    if actions is None:
        return None
    rows = []
    for item in actions.combinations:
        c, r = item.combination, item.result
        rows.append(
            {
                "name": c.name,
                "state": c.state,
                "rule": c.rule,
                "equation": c.equation,
                "factors": dict(zip(actions.names, c.factors, strict=True)),
                "axial_force": _finite(item.case.axial_force),
                "utilization": _finite(r.utilization),
                "max_moment": _finite(r.governing.moment.magnitude),
                # the deflection check is made at the service combinations only (an ultimate one's is none)
                "deflection_utilization": None
                if r.service is None or c.state != "service"
                else _finite(r.service.utilization),
                "bow_reversed": item.bow_reversed,
                "second_bow_reversed": item.second_bow_reversed,
            }
        )
    return {
        "rule": actions.case.combinations.rule,
        "headline": actions.headline,
        "combinations": rows,
        "governing": [
            {
                "check": g.check,
                "combination": g.combination,
                "state": g.state,
                "value": _finite(g.value),
                "plane": g.plane,
            }
            for g in actions.governing
        ],
    }


def _out_of_plane_data(out) -> dict | None:
    """The out-of-plane buckling check for the JSON summary (SI)."""
    if out is None:
        return None
    return {
        "checked": out.checked,
        "axis": out.axis,
        "reason": out.reason,
        "buckling_length": _finite(out.buckling_length),
        "N_cr": _finite(out.N_cr),
        "lambda_bar": _finite(out.lambda_bar),
        "chi": _finite(out.chi),
        "curve": out.curve,
        "N_b_Rd": _finite(out.N_b_Rd),
        "utilization": _finite(out.utilization),
        "elastic_utilization": _finite(out.elastic_utilization),
    }


def _second_plane_data(result) -> dict | None:
    """The second bending plane (SI): its axis, critical loads and governing values; None for one plane."""
    second = getattr(result, "second_plane", None)
    if second is None:
        return None
    axis = getattr(result.case, "axis", None) or "major"
    return {
        "axis": "major" if axis == "minor" else "minor",
        "critical_loads": [_finite(load) for load in second.critical_loads],
        "alpha_cr": _finite(second.alpha_cr),
        "status": second.status,
        "governing": _governing_data(second.governing),
        "reactions": _reactions(second.reactions),
    }


def _reactions(reactions) -> dict:
    """The end reactions, and each intermediate restraint's force and couple on the member (SI) when any."""
    out = {name: _finite(getattr(reactions, name)) for name in ("left_T", "left_M", "right_T", "right_M")}
    inner = getattr(reactions, "intermediate", ())
    if inner:
        out["intermediate"] = [
            {"index": r.index, "x": r.x, "force": _finite(r.force), "couple": _finite(r.couple)}
            for r in inner
        ]
    return out


def _fact(value):
    """A fact as JSON: numbers (non-finite null), text, booleans, and lists and mappings of them."""
    if isinstance(value, (bool, str, type(None))):
        return value
    if isinstance(value, (int, float)):
        return _finite(value)
    if isinstance(value, dict):
        return {str(key): _fact(item) for key, item in value.items()}
    if isinstance(value, (list, tuple)):
        return [_fact(item) for item in value]
    return str(value)


def _route_data(route) -> dict:
    """One route of the member check (SI facts), as the engine gives it; non-finite numbers null."""
    return {
        "route": route.route,
        "enabled": bool(route.enabled),
        "utilization": _finite(route.utilization),
        "fails": route.utilization is not None and float(route.utilization) > 1.0,
        "governing": route.governing,
        "terms": {key: _finite(value) for key, value in (route.terms or {}).items()},
        "facts": {key: _fact(value) for key, value in (route.facts or {}).items()},
        "reason": route.reason,
        "notes": list(route.notes or ()),
        "source": route.source,
    }


def _headline_route(result) -> str | None:
    """The code of the enabled route that gives the headline utilisation, or None."""
    from app.report.routes import headline_route

    route = headline_route(result)
    return None if route is None else route.route


_LTB_NUMBERS = (
    "M_Ed",
    "M_cr",
    "M_cr_tabulated",
    "C1",
    "diagram_deviation",
    "difference",
    "lambda_LT",
    "chi_LT",
    "f",
    "M_b_Rd",
    "utilisation",
)
_AISC_LTB = ("M_n", "M_p", "L_p", "L_r", "F_cr", "C_b")


def _ltb_data(result) -> dict | None:
    """The lateral-torsional buckling check (SI; the mode shape left out), or None without a member check.

    An infinite M_cr (no lateral-torsional buckling under this diagram) is null, as every non-finite number.
    """
    ltb = getattr(result, "ltb", None)
    if ltb is None:
        return None
    data: dict = {"applies": bool(ltb.applies), "reason": ltb.reason}
    if getattr(ltb, "missing", ()):
        data["missing"] = list(ltb.missing)
    if getattr(ltb, "restraints", ()):
        data["restraints"] = [dict(r) for r in ltb.restraints]
    if getattr(ltb, "segment", ()):
        data["segment"] = list(ltb.segment)
    if ltb.applies:
        data.update({key: _finite(getattr(ltb, key)) for key in _LTB_NUMBERS})
        data.update(diagram=ltb.diagram, curve=ltb.curve, method=ltb.method)
        data["fails"] = not float(ltb.utilisation) <= 1.0
    data.update(
        load_position=ltb.load_position,
        lateral_ends=list(ltb.lateral_ends),
        warping_ends=list(ltb.warping_ends),
        sources=list(ltb.sources or ()),
    )
    aisc = getattr(ltb, "aisc", None) if ltb.applies else None
    if aisc is not None:
        data["aisc"] = {key: _finite(getattr(aisc, key)) for key in _AISC_LTB if hasattr(aisc, key)}
        data["aisc"]["zone"] = aisc.zone
        if getattr(aisc, "clause", "F2") != "F2":  # §F11.2, a rectangular bar (L_p, L_r: L_b at its limits)
            data["aisc"]["clause"] = aisc.clause
    return data


def _second_service(result) -> dict | None:
    """The second plane's deflection check (None for one plane), as ``service`` gives the first plane's."""
    second = getattr(getattr(result, "second_plane", None), "service", None)
    if second is None:
        return None
    return {
        "deflection_utilization": _finite(second.utilization),
        "deflection": _finite(second.deflection),
        "x": _finite(second.x),
        "allowed": _finite(second.allowed),
        "basis": second.basis,
        "source": second.source,
    }
