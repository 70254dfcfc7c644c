"""The wording of load cases and combinations (a case with ``actions``): the actions, each combination, the
governing combination of each check and route, the superposition comparison. One wording for the command
line, the exports and the batch."""

from __future__ import annotations

from app.report import words as w
from app.report.numbers import percent, utilisation
from app.report.route_names import route_name

__all__ = [
    "CHECK_NAMES",
    "RULE_NAMES",
    "action_rows",
    "check_name",
    "combination_lines",
    "combination_rows",
    "expression",
    "governing_rows",
    "headline_note",
    "metadata_rows",
    "rule_text",
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
    governing one."""
    headline = actions_result.headline
    if not shown or headline is None or shown == headline:
        return ""
    return (
        f"Combination {shown} is shown: it is not the governing combination. The headline utilisation, the "
        f"capacity and the design are those of combination {headline}; the deflection check is that of the "
        "service combinations."
    )


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
        f"  error of the sum:          {percent(-comparison.error)} of the exact value "
        "(small near N = 0, large near Pcr1)",
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
            f"  {row['name']:<6}{row['state']:<10}{row['source']:<34}{row['expression']:<24}"
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
