"""The wording of load cases and combinations (a case with ``actions``): the actions, each combination, the
governing combination of each check and route, the superposition comparison. One wording for the command
line, the exports and the batch."""

from __future__ import annotations

import math

from app.report import words as w
from app.report.numbers import utilisation
from app.report.route_names import governing_text, plane_axes, plane_name, route_name

__all__ = [
    "CHECK_NAMES",
    "RULE_NAMES",
    "action_rows",
    "check_name",
    "combination_lines",
    "combination_rows",
    "deflection_basis",
    "deflection_words",
    "expression",
    "governing_rows",
    "headline_note",
    "metadata_rows",
    "not_governing_title",
    "rule_text",
    "second_plane_service",
    "service_strength",
    "shown_line",
    "shown_name",
    "shown_of",
    "strength_words",
    "utilisation_line",
    "utilisation_note",
    "worst_deflection",
]

#: The rules' names, with their sources' flags.
RULE_NAMES = {
    "en1990-6.10": "EN 1990 eq. (6.10), Table A1.2(B) (factors from memory)",
    "en1990-6.10ab": "EN 1990 eqs. (6.10a)/(6.10b), Table A1.2(B) (factors from memory)",
    "asce7-2.3": "ASCE 7-16 §2.3.1 LRFD, service by §2.4.1 (factors from memory)",
    "table": "the user's table of factors",
}
#: The checks of ``ActionsResult.governing``, by the engine's code (routes: ``route:<route>``).
CHECK_NAMES = {
    "strength": "strength and stability (headline)",
    "in-plane": "in-plane cross-section",
    "out-of-plane": "out-of-plane buckling",
    "shear": "shear",
    "moment": "largest |M|",
    "deflection": "deflection (service)",
}
_EQUATIONS = {
    "6.10": "EN 1990 (6.10)",
    "6.10a": "EN 1990 (6.10a)",
    "6.10b": "EN 1990 (6.10b)",
    "6.14b": "EN 1990 (6.14b) characteristic",
    "6.15b": "EN 1990 (6.15b) frequent",
    "6.16b": "EN 1990 (6.16b) quasi-permanent",
    "table": "user's table",
}


def rule_text(settings) -> str:
    """The rule in words, with the service combinations asked for (EN 1990 rules)."""
    text = RULE_NAMES[settings.rule]
    if settings.rule.startswith("en1990") and settings.service:
        text += f"; service: {', '.join(settings.service)}"
    if settings.table and settings.rule != "table":
        text += f"; and {len(settings.table)} rows of the user's own"
    return text


def equation_text(combination) -> str:
    """Where a combination comes from, e.g. ``"EN 1990 (6.10)"`` or ``"ASCE 7 2.3.1-4"``."""
    if combination.equation in _EQUATIONS:
        return _EQUATIONS[combination.equation]
    return f"ASCE 7 {combination.equation}"


def expression(combination, names) -> str:
    """The combination as factors times actions, e.g. ``"1.35 G + 1.5 W"``."""
    terms = combination.terms(names)
    if not terms:
        return "(nothing)"
    parts = []
    for factor, name in terms:
        value = f"{abs(factor):g} {name}"
        if not parts:
            parts.append(value if factor > 0 else f"-{value}")
        else:
            parts.append(f"{'-' if factor < 0 else '+'} {value}")
    return " ".join(parts)


def check_name(code: str, result=None) -> str:
    """A governing check's name (a route by its own name)."""
    if code.startswith("route:"):
        return route_name(code.split(":", 1)[1], result) if result is not None else code.split(":", 1)[1]
    return CHECK_NAMES.get(code, code)


def _value(row, U) -> str:
    if row.unit == "N·m":
        return U.show("moment", row.value)
    if row.unit == "m":
        return U.show("deflection", row.value)
    return utilisation(row.value)


def action_rows(actions_result, U) -> list:
    """``(name, category, axial force, loads)`` of each action, worded."""
    case = actions_result.case
    rows = []
    for action in case.actions:
        loads = "; ".join(w.load_text(load, case.length, U) for load in action.loads) or "no transverse load"
        if action.second_loads:
            second = "; ".join(w.load_text(load, case.length, U) for load in action.second_loads)
            loads += f"; second plane: {second}"
        rows.append((action.name, action.category, f"N = {w.axial_text(action.axial_force, U)}", loads))
    return rows


def combination_rows(actions_result, U) -> list:
    """One dict per combination: name, state, source, expression, N, and its utilisation or deflection."""
    rows = []
    for item in actions_result.combinations:
        c, r = item.combination, item.result
        if c.state == "ultimate":
            value = "n/a" if r.utilization is None else utilisation(r.utilization)
            measure = f"utilisation {value}" if r.utilization is not None else ""
            measure += f"{', ' if measure else ''}max|M| {w.peak_text(r.governing.moment, 'moment', U)}"
        elif r.service is not None:
            measure = f"deflection {w.service_text(r.service, U)}"
        else:
            measure = f"max|w| {w.peak_text(r.governing.deflection, 'deflection', U)}"
        rows.append(
            {
                "name": c.name,
                "state": c.state,
                "source": equation_text(c),
                "expression": expression(c, actions_result.names),
                "axial": w.axial_text(item.case.axial_force, U),
                "measure": measure,
                "bow": _bow_text(item),
            }
        )
    return rows


def _bow_text(item) -> str:
    planes = [
        name for name, flag in (("", item.bow_reversed), ("second plane ", item.second_bow_reversed)) if flag
    ]
    return " and ".join(f"{name}bow reversed" for name in planes) + (" (the worse way)" if planes else "")


def governing_rows(actions_result, result=None, U=None) -> list:
    """``(check in words, combination name, value in words)`` for each check and route."""
    return [
        (
            check_name(row.check, result) + (" (second plane)" if row.plane == 2 else ""),
            row.combination,
            _value(row, U),
        )
        for row in actions_result.governing
    ]


def headline_note(actions_result) -> str:
    """What the headline values are: the governing combination's; the deflection the service ones'."""
    deflection = actions_result.governing_for("deflection")
    text = f"The values above are those of combination {actions_result.headline} (the largest strength and "
    text += "stability utilisation of the ultimate combinations)"
    if deflection is not None:
        text += f"; the deflection check is that of service combination {deflection.combination}"
    return text + "."


def shown_name(actions_result, result) -> str:
    """The name of the combination whose values ``result`` holds (the headline's unless another was
    chosen on the page; see :func:`app.state_actions.view_result`)."""
    headline = actions_result.headline or ""
    if result is None:
        return headline
    named = [item.name for item in actions_result.combinations if item.result.case == result.case]
    return headline if headline in named or not named else named[0]


def shown_of(result) -> str:
    """The name of the combination `result` holds (:func:`shown_name`); '' for a case without load cases."""
    actions = getattr(result, "actions", None)
    return "" if actions is None else shown_name(actions, result)


def shown_line(result) -> tuple[str, bool]:
    """The exports' line on the combination a result holds, and whether it is not the governing one
    (("", False) for a case without load cases)."""
    actions_result = getattr(result, "actions", None)
    if actions_result is None:
        return "", False
    shown = shown_name(actions_result, result)
    note = not_governing_note(actions_result, shown)
    if note:
        return note, True
    text = f"Combination {shown}, the governing one: {headline_note(actions_result)}" if shown else ""
    return text, False


def not_governing_note(actions_result, shown: str) -> str:
    """Said wherever a combination other than the governing one is shown or exported; '' for the
    governing one. A service combination's says that strength is checked on the ultimate combinations (it
    has no member check shown and no bow, by design: :func:`app.state_actions.view_result`)."""
    headline = actions_result.headline
    if not _other_than_headline(actions_result, shown):
        return ""
    deflection = deflection_words(actions_result)
    deflection = f"the deflection check is that of {deflection}" if deflection else "no deflection check"
    if _state_of(actions_result, shown) == "service":
        return (
            f"Combination {shown} is shown: a service combination, solved without the bow by design; "
            f"{deflection}. Strength and stability are checked on the ultimate combinations: "
            f"{strength_words(actions_result)}; the design is that of combination {headline}, the capacity "
            "the lowest of the ultimate combinations."
        )
    return (
        f"Combination {shown} is shown: it is not the governing combination. The headline utilisation and "
        f"the design are those of combination {headline}, the capacity the lowest of the ultimate "
        f"combinations; {deflection}."
    )


def not_governing_title(result) -> str:
    """The page's one-line title over :func:`shown_line`'s note where the combination shown is not the
    governing one (the note itself opens under it); '' otherwise."""
    actions_result = getattr(result, "actions", None)
    if actions_result is None:
        return ""
    shown = shown_name(actions_result, result)
    if not _other_than_headline(actions_result, shown):
        return ""
    kind = "Service combination" if _state_of(actions_result, shown) == "service" else "Combination"
    return f"{kind} {shown} shown; {actions_result.headline} governs"


def _other_than_headline(actions_result, shown: str) -> bool:
    """Whether ``shown`` names a combination other than the governing one."""
    headline = actions_result.headline
    return bool(shown) and headline is not None and shown != headline


def _state_of(actions_result, name: str) -> str:
    return next((c.combination.state for c in actions_result.combinations if c.name == name), "")


def strength_words(actions_result) -> str:
    """The governing ultimate combination and its strength utilisation, e.g. ``"combination U2 governs,
    utilisation 0.448 by EN 1993-1-1 equivalent member (Annex B), eq. (6.62)"``."""
    row = actions_result.governing_for("strength")
    if row is None:
        return "none is given"
    head = next((c.result for c in actions_result.combinations if c.name == row.combination), None)
    routes = [r for r in getattr(head, "routes", ()) or () if r.enabled and r.utilization is not None]
    top = max(routes, key=lambda r: float(r.utilization)) if routes else None
    text = f"combination {row.combination} governs, utilisation {utilisation(row.value)}"
    if top is not None and float(top.utilization) == float(row.value):
        term = governing_text(top.governing)
        text += f" by {route_name(top, head)}" + (f", {term}" if term else "")
    return text


def deflection_words(actions_result, plane: int = 1) -> str:
    """The deflection check's combination and value, e.g. ``"service combination S2 (0.130)"``; '' when
    the service combinations give no deflection check."""
    row = actions_result.governing_for("deflection", plane)
    if row is None or row.unit != "":
        return ""
    return f"service combination {row.combination} ({utilisation(row.value)})"


def deflection_basis(result, long: bool = False, plane: int = 1) -> str:
    """What the deflection check of `result` is of: the loads as given, or with load cases the governing
    service combination, by name, whichever combination is shown (``long``: the engine's basis after it).
    ``plane=2``: the second plane's check."""
    actions = getattr(result, "actions", None)
    row = None if actions is None else actions.governing_for("deflection", plane)
    of = result if plane == 1 else getattr(result, "second_plane", None)
    basis = getattr(getattr(of, "service", None), "basis", "")
    if row is None or row.unit != "":
        return f"service check: {basis}" if long else "loads as given, no bow"
    if long:
        return f"service check of combination {row.combination}, the governing service combination: {basis}"
    return f"service combination {row.combination}, no bow"


def second_plane_service(result) -> tuple:
    """(label, service check, basis) of the second plane's deflection check, or None (one plane, or no
    check): every output states it beside the first plane's (an audit found 1.204 in a caution only)."""
    second = getattr(result, "second_plane", None)
    service = getattr(second, "service", None)
    if service is None:
        return None
    label = f"second plane, {plane_name(plane_axes(result)[1])}"
    return label, service, deflection_basis(result, plane=2)


def worst_deflection(result) -> float | None:
    """The larger deflection utilisation of both planes (the first plane's alone in a one-plane case)."""
    first = getattr(result, "service", None)
    second = second_plane_service(result)
    values = ([] if first is None else [first.utilization]) + (
        [] if second is None else [second[1].utilization]
    )
    return max(values) if values else None


def utilisation_note(result) -> str:
    """The note of the strength utilisation of `result`: whose it is with load cases."""
    shown = shown_of(result)
    of = f" of combination {shown}" if shown else ""
    return f"strength and stability{of}; the deflection check is apart"


def utilisation_line(result, U) -> str:
    """The headline utilisation in one line, e.g. ``"Utilisation: 0.448 (...)"``, with load cases of the
    combination shown (``"Utilisation of combination U4: ..."``), a service combination's where strength is
    checked; '' without a check."""
    strength = service_strength(result)
    if strength:
        return f"Strength and stability are {strength}."
    text = w.utilisation_text(result, U)
    if not text:
        return ""
    shown = shown_of(result)
    return f"Utilisation{f' of combination {shown}' if shown else ''}: {text}"


def service_strength(result, brief: bool = False) -> str:
    """A service combination shown (no member check, :func:`app.state_actions.view_result`): where strength
    is checked, e.g. ``"checked on the ultimate combinations, not on a service one: combination U2 governs,
    utilisation 0.448 by ..."`` (``brief``: before the colon);
    '' for any other result."""
    actions = getattr(result, "actions", None)
    if actions is None or result.check is not None or actions.headline is None:
        return ""
    if _state_of(actions, shown_name(actions, result)) != "service":
        return ""
    where = "checked on the ultimate combinations, not on a service one"
    return where if brief else f"{where}: {strength_words(actions)}"


def superposition_error(comparison) -> str:
    """The error of the summed load cases in words, one wording for the page, the summary and the exports:
    e.g. ``"8.1 % below the exact value (the unsafe side)"``; ``"∞ (a critical load)"``."""
    error = comparison.error  # (exact − sum) / exact of max|M|: positive where the sum falls short
    if not math.isfinite(error):
        return "∞ (a critical load)"
    if abs(error) < 5e-4:
        return "0.0 % (the sum equals the exact value)"
    if error > 0:
        return f"{100 * error:.1f} % below the exact value (the unsafe side)"
    return f"{-100 * error:.1f} % above the exact value"


def superposition_lines(comparison, U) -> list:
    """The superposition comparison of one combination in words."""
    parts = " + ".join(
        f"{factor:g} {name} at N = {w.axial_text(axial, U)}" for name, factor, axial in comparison.parts
    )
    return [
        f"Superposition shown wrong (combination {comparison.combination}, without the bow): adding the load "
        "cases solved one by one, each at its own axial force, is not the combined result",
        f"  exact, solved together:    max|M| = {U.show('moment', comparison.moment_peak_exact)}",
        f"  sum of the parts ({parts}): max|M| = {U.show('moment', comparison.moment_peak_superposed)}",
        f"  error of the sum:          {superposition_error(comparison)} (small near N = 0, large near Pcr1)",
    ]


def combination_lines(actions_result, result, U, comparison=None) -> list:
    """The printed block of a case with actions: actions, combinations, governing combination per check."""
    lines = ["", "Load cases (actions)"]
    for name, category, axial, loads in action_rows(actions_result, U):
        lines.append(f"  {name:<8}{category:<14}{axial}; {loads}")
    lines += ["", f"Combinations: {rule_text(actions_result.case.combinations)}"]
    for row in combination_rows(actions_result, U):
        bow = f"; {row['bow']}" if row["bow"] else ""
        lines.append(
            f"  {row['name']:<6}{row['state']:<10}{row['source']:<34}{row['expression']:<23} "
            f"N = {row['axial']}; {row['measure']}{bow}"
        )
    lines += ["", "Governing combination per check"]
    for check, name, value in governing_rows(actions_result, result, U):
        lines.append(f"  {check + ':':<44}{name} ({value})")
    lines += ["", headline_note(actions_result)]
    if comparison is not None:
        lines += [""] + superposition_lines(comparison, U)
    return lines


def metadata_rows(actions_result, result, U) -> list:
    """The exports' rows of a case with actions: ``(key, value, note)`` for the combination shown, each
    combination and the governing combination of each check (the CSV's metadata, the calc sheet's items)."""
    shown = shown_name(actions_result, result)
    note = not_governing_note(actions_result, shown) or headline_note(actions_result)
    rows = [
        ("combination shown", shown, note),
        ("combination rule", rule_text(actions_result.case.combinations), ""),
    ]
    for name, category, axial, loads in action_rows(actions_result, U):
        rows.append((f"action {name}", f"{category}; {axial}", loads))
    for row in combination_rows(actions_result, U):
        note = "; ".join(
            part for part in (row["state"], row["source"], f"N = {row['axial']}", row["bow"]) if part
        )
        rows.append((f"combination {row['name']}", row["expression"], f"{note}; {row['measure']}"))
    for check, name, value in governing_rows(actions_result, result, U):
        rows.append((f"governing: {check}", name, value))
    return rows
