"""The printed summary of one solved case (``strutscope solve``), worded by :mod:`app.report`."""

from __future__ import annotations

import unicodedata

from app.report import combinations as combos
from app.report import routes as r
from app.report import words as w
from app.report.capacity_words import capacity_combination_text, capacity_text, fails_below_capacity
from app.report.ltb import ltb_words
from app.report.numbers import percent, position, ratio, scientific, utilisation
from app.report.restraints import grouped_inner_rows, has_inner, reactions_note
from app.report.route_names import governing_text
from app.report.section_names import section_name
from app.safe_text import terminal
from app.units import units as display_units

__all__ = ["format_summary"]


#: The printed summary's labels of the restraints, steps and foundation groups (app.report.restraints).
_INNER_LABELS = {
    "Restraints inside": "restraints:",
    "Steps in EI": "steps in EI:",
    "Elastic foundation": "foundation:",
    "": "",
}


def _case_lines(add, source, case, result, U) -> None:
    add("strutscope: exact second-order analysis of one member")
    add(f"  case:         {terminal(source)}")
    add(f"  title:        {terminal(case.title) or '(untitled)'}")
    add(f"  length:       {position(U, case.length)}")
    if result.section is not None:
        section = result.section
        add(
            f"  section:      {section_name(section, U)}, {case.axis} axis (A = {U.show('area', section.A)}, "
            f"I = {U.show('second_moment', section.I)})"
        )
    if result.material is not None:
        add(
            f"  material:     {result.material.name} ({w.modulus_text(result.material, U)}, "
            f"fy = {U.show('stress', result.material.fy, 3)})"
        )
    add(f"  EI:           {U.show('stiffness', result.EI)}")
    add(f"  supports:     left {w.support_text(case.left, U)}; right {w.support_text(case.right, U)}")
    add(f"  axial force:  N = {w.axial_text(result.axial_force, U)}")
    if case.loads:
        add("  loads:")
        for load in case.loads:
            add(f"    {w.load_text(load, case.length, U)}")
    else:
        add("  loads:        none")
    # Issue 16: restraints, steps in EI and foundation ranges inside the member, grouped.
    for group, text in grouped_inner_rows(case, U):
        label = _INNER_LABELS[group]
        add(f"  {label:<14}{text}")
    add(f"  initial bow:  {w.bow_text(result, U)}")
    direction = w.bow_direction_text(result.bow, U)
    if direction:
        add(f"  bow direction: {direction}")


def _results_lines(add, result, U) -> None:
    add("")
    add("Elastic critical loads")
    for n, load in enumerate(result.critical_loads[:3], start=1):
        add(f"  Pcr{n} = {U.show('force', load, 5)}")
    add(f"  effective length factor K = {ratio(result.buckling.effective_length_factor)}")
    second = getattr(result, "second_plane", None)
    if result.axial_force > 0 and second is not None:
        # result.alpha_cr is the member's, the smaller of the two planes'; Pcr1 above is this plane's
        own, other = r.plane_axes(result)
        add(f"  α_cr = Pcr1 / N = {ratio(result.critical_loads[0] / result.axial_force)} (this plane)")
        add(
            f"  α_cr of the member = {ratio(result.alpha_cr)} (the smaller of both planes; second plane, "
            f"{r.plane_name(other)}: Pcr1 = {U.show('force', second.critical_loads[0], 5)})"
        )
    elif result.axial_force > 0:
        add(f"  α_cr = Pcr1 / N = {ratio(result.alpha_cr)}")
    else:
        add(f"  α_cr = {ratio(result.alpha_cr)} (no compression)")
    add("")
    add(f"Status: {w.status_text(result, U)}")

    first = result.first_order
    add("")
    add(f"{'Governing values':<24}{'second order':<30}first order (N = 0)")
    for label, name, kind in w.governing_rows(result, always_offset=True):
        second_text = w.peak_text(getattr(result.governing, name), kind, U)
        first_text = "n/a" if first is None else w.peak_text(getattr(first.governing, name), kind, U)
        add(f"  {label:<22}{second_text:<30}{first_text}")

    add("")
    add(f"Reactions ({reactions_note(result.case)})")
    # With restraints, steps or a foundation: every support in x order, both planes (issue 16).
    rows = w.every_reaction_rows(result, U) if has_inner(result.case) else w.reaction_rows(result, U)
    width = max(19, *(len(end) + 2 for end, _, _ in rows))
    for end, force, couple in rows:
        add(f"  {end + ':':<{width}}force {force}, couple {couple}")

    amplification = result.amplification
    add("")
    add("Amplification (second order / first order)")
    from engine.results import AMPLIFICATION_DEFINITIONS as definitions

    add(f"  moment, exact:      {ratio(amplification.moment)}  ({definitions['moment']})")
    add(
        f"  moment over M_I:    {ratio(amplification.moment_first_order)}  "
        f"({definitions['moment_first_order']})"
    )
    if amplification.moment_bow_free is not None:
        free = ratio(amplification.moment_bow_free)
        add(f"  moment, no bow:     {free}  ({definitions['moment_bow_free']})")
    add(f"  deflection, exact:  {ratio(amplification.deflection)}  ({definitions['deflection']})")
    for approximation in amplification.approximations:
        against = "exact, no bow" if approximation.compared_with == "moment_bow_free" else "exact"
        add(
            f"  {approximation.name + ':':<19} {ratio(approximation.value)}"
            f"  (error {percent(approximation.error)} against {against}; {approximation.source})"
        )

    equilibrium = result.equilibrium
    add("")
    if equilibrium is None:
        # The engine gives none at a critical load, where no equilibrium exists.
        add("Equilibrium residuals (relative): n/a (no equilibrium state)")
    else:
        add(
            "Equilibrium residuals (relative): "
            f"transverse {scientific(equilibrium.transverse)}, moment {scientific(equilibrium.moment)}"
        )


def _check_lines(add, result, U) -> None:
    check = result.check
    if check is not None:
        add("")
        settings = check.settings
        add(f"Member check ({settings.method}, γ_M0 = {settings.gamma_M0:g}), second-order forces")
        headline = r.headline_text(result)
        if headline and result.routes:
            # the second-order line below is one route: the headline (worst enabled route) comes first
            add(f"  headline:     {headline} (the worst enabled route, listed under Routes)")
        add(
            f"  utilisation:  {utilisation(check.utilization)} ({check.kind} at "
            f"x = {position(U, check.x)}; {check.source})"
        )
        add(f"  strength:     {utilisation(check.strength_utilization)} ({check.strength_kind})")
        out = check.out_of_plane
        if out is not None and out.checked:
            add(f"  out of plane: {ratio(out.utilization)} (N/N_b,Rd {w.out_of_plane_text(out, U)})")
        elif out is not None:
            add(f"  out of plane: {w.out_of_plane_text(out, U)}")
        if check.section_class is not None:
            add(f"  section:      {check.section_class.describe()}")
    _routes_lines(add, result, U)
    _ltb_lines(add, result, U)
    service = result.service
    if service is not None:
        add("")
        add("Service check (deflection; apart from the strength utilisation)")
        add(f"  deflection:   {w.service_text(service, U)}")
        add(f"  basis:        {combos.deflection_basis(result, long=True).removeprefix('service check: ')}")
        second = combos.second_plane_service(result)
        if second is not None:
            add(f"  {second[0]}: {w.service_text(second[1], U)}; {second[2]}")
    elif result.utilization is not None:
        add("")
        add(f"Member check: utilisation {utilisation(result.utilization)}")


def _plane_lines(add, result, U) -> None:
    """The second bending plane, when the case has one: its critical load and governing values."""
    rows = r.second_plane_rows(result, U)
    if not rows:
        return
    own, other = r.plane_axes(result)
    add("")
    add(f"Second plane: bending about the {r.plane_name(other)} (the values above: {r.plane_name(own)})")
    second = result.second_plane.case
    add(f"  supports:     left {w.support_text(second.left, U)}; right {w.support_text(second.right, U)}")
    for i, load in enumerate(second.loads):
        add(f"  {'loads:' if i == 0 else '':<14}{w.load_text(load, second.length, U)}")
    add(f"  initial bow:  {w.bow_text(result.second_plane, U)}")
    for label, text in rows:
        add(f"  {label:<22}{text}")


def _routes_lines(add, result, U) -> None:
    """The routes of the member check side by side, the headline first in words."""
    rows = r.route_rows(result, U)
    if not rows:
        return
    add("")
    add("Routes (each a published way of checking the member; the headline is the worst enabled one)")
    for row in rows:
        term = f", {row['governing']}" if row["governing"] and not row["term_in_words"] else ""
        status = {"headline": "headline", "counts": "enabled", "for comparison": "for comparison"}[
            row["status"]
        ]
        add(f"  {row['name'] + ':':<44}{row['utilisation']}{term} [{status}]")
        if row["reason"]:
            add(f"      not applied: {row['reason']}")
        if row["facts"]:
            add(f"      {row['facts']}")
        for level, words in row["notes"] + row["setting_notes"]:
            add(f"      [{level}] {words}")
        if row["source"]:
            add(f"      source: {row['source']}")
    headline = r.headline_text(result)
    if headline:
        add(f"  headline utilisation: {headline}")


def _ltb_lines(add, result, U) -> None:
    """The lateral-torsional buckling check: both critical moments, λ̄_LT, χ_LT and the utilisation."""
    words = ltb_words(result, U)
    if words is None:
        return
    add("")
    add("Lateral-torsional buckling (major axis)")
    add(f"  settings:     {words.settings}")
    if not words.applies:
        add(f"  not checked:  {words.reason}" + (" (see the cautions)" if words.caution else ""))
    for _, label, text in words.lines():
        # λ̄ is two characters (λ and a combining macron) that print as one: pad by what is seen.
        seen = sum(1 for char in label if not unicodedata.combining(char))
        add(f"  {label + ':'}{' ' * max(1, 21 - seen)}{text}")
    if words.method:
        add(f"  method:       {words.method}")
    for source in words.sources:
        add(f"  source:       {source}")


def format_summary(source: str, case, result, units: str = "si", capacity=None, comparison=None) -> str:
    """Return the printed summary of `result`, the engine's solution of `case` read from `source`.

    Parameters
    ----------
    source : str
        What the case was read from, shown on the first line.
    case : engine.Case
        The case as read.
    result : engine.Result
        What ``engine.solve(case)`` returned.
    units : str
        ``"si"`` (kN, m, mm, kN·m) or ``"us"`` (kip, ft, in, kip·ft).
    capacity : engine.Capacity, optional
        What ``engine.capacity(case)`` returned, shown when given.
    comparison : engine.superposition.Superposition, optional
        A case with actions: the superposition comparison of one combination, shown when given.

    Returns
    -------
    str
        Lines of text in the display units, ending with the general caution.
    """
    U = display_units(units)
    lines: list[str] = []
    add = lines.append
    actions = getattr(result, "actions", None)
    _case_lines(add, source, case if actions is None else result.case, result, U)
    if actions is not None:
        lines.extend(combos.combination_lines(actions, result, U, comparison))
    _results_lines(add, result, U)
    _plane_lines(add, result, U)
    _check_lines(add, result, U)
    if capacity is not None:
        add("")
        add(f"Capacity ({capacity.mode}: the largest axial compression at strength utilisation 1)")
        where = "" if capacity.x is None else f" at x = {position(U, capacity.x)}"
        check = governing_text(capacity.check)
        add(f"  axial force:  N = {U.show('force', capacity.axial_force, 5)} ({check}{where})")
        given = "the given axial force"
        if capacity.combination:
            add(f"  combination:  {capacity_combination_text(capacity)}")
            given = f"the axial force of {capacity.combination}"
        add(
            f"  load factor:  {ratio(capacity.load_factor)} on {given}; "
            f"Pcr1 = {U.show('force', capacity.critical_load, 5)}"
        )
        add(f"  {capacity_text(capacity, U, result)}")
        note = fails_below_capacity(capacity, result)
        if note:
            add(f"  note: {note}")
    add("")
    add("Cautions")
    for caution in result.cautions:
        if caution.code == "scope":
            continue  # printed last, always
        add(f"  [{caution.level}] {w.caution_text(caution, U)} ({caution.source})")
    add("")
    add(f"Caution: {w.general_caution(result)}")
    return "\n".join(lines)
