"""The page's wording of a result: the governing-values table, the variants' table and the facts in use.

These functions turn an :class:`engine.Result` into the page's HTML text in a unit system; they do no
mechanics. They are the one place the page words the governing values (the seam where a shared wording of
results, for the command line and the exports too, plugs in).
"""

from __future__ import annotations

import math
import re

from app.page.style import esc
from app.report import (
    SYMBOLS,
    bow_direction_text,
    bow_text,
    lower_plane,
    percent,
    quoted_text,
    ratio,
    reaction_rows,
)
from app.report.capacity_words import fails_below_capacity
from app.report.combinations import deflection_basis, second_plane_service, service_strength
from app.report.ltb import ltb_words
from app.report.routes import governing_text, headline_route, plane_axes, plane_name, route_name
from app.report.section_names import section_name
from app.report.words import modulus_text
from engine.codes import alpha_cr_limit

__all__ = [
    "bow_facts",
    "check_facts",
    "empty_field_text",
    "plain",
    "ratio_text",
    "section_facts",
    "symbols",
    "unread_field_text",
    "values_table",
]


def plain(value) -> float:
    return math.nan if value is None or not math.isfinite(float(value)) else float(value)


def ratio_text(value) -> str:
    """A ratio as app.report writes it; an infinite one (α_cr without compression) in words."""
    if value is not None and math.isinf(float(value)):
        return "∞ (no compression)" if float(value) > 0 else "n/a"
    return ratio(value)


# Short forms of long check kinds, so that the values column does not wrap.
_SHORT_KINDS = {
    "out-of-plane buckling": "out of plane",
    "out-of-plane elastic buckling": "N/N_cr out of plane",
    "in-plane elastic buckling": "N/Pcr1 (a bound)",
    "linear N–M, eq. (5.9) route": "eq. (5.9) N–M",
    "buckling with the moments, eq. (6.61)/(6.62)": "eq. (6.61)/(6.62)",
    "lateral-torsional buckling": "LTB",
}


def kind_text(kind: str) -> str:
    return _SHORT_KINDS.get(kind, kind)


def utilisation_text(value) -> str:
    """A utilisation; an unbounded one (above Pcr1, a class 4 section) reads "∞ fails"."""
    if value is not None and math.isinf(float(value)):
        return "∞ fails"
    return ratio_text(value)


def _service_row(row, result, U) -> None:
    """The deflection check's rows (with load cases the governing service combination's, named), the second
    plane's beside the first's."""
    rows = (
        [] if result.service is None else [("deflection (service)", result.service, deflection_basis(result))]
    )
    second = second_plane_service(result)
    if second is not None:
        label, service, basis = second
        rows.append((f"deflection (service), {label}", service, basis))
    for label, service, basis in rows:
        row(
            label,
            f"{ratio_text(service.utilization)} {U.show('small_length', abs(service.deflection))}",
            basis,
            False,
            service.utilization > 1,
        )


def values_table(result, capacity, capacity_note: str, U) -> str:
    """The compact governing-values table (HTML) of `result` in units `U`."""
    rows: list[str] = []

    def head(text):
        rows.append(f"<tr><th colspan='3'>{esc(text)}</th></tr>")

    def row(quantity, value, note="", danger=False, warn=False, key=""):
        css = " class='danger'" if danger else " class='warn'" if warn else ""
        data = f" data-ltb='{esc(key)}'" if key else ""
        rows.append(
            f"<tr{css}{data}><td class='q'>{quantity}</td><td class='v'>{symbols(value)}</td>"
            f"<td class='f'>{symbols(note)}</td></tr>"
        )

    check = result.check
    head("Member check (second-order forces)")
    route = headline_route(result) if result.utilization is not None else None
    if check is not None and route is not None:
        # The headline first: the worst route that counts, which may exceed the member check below it (eq.
        # (6.62) of the en-member route, a term of the second-order route beyond its member check).
        term = governing_text(route.governing)
        row(
            "headline",
            f"{utilisation_text(result.utilization)} {kind_text(term)}".strip(),
            route_name(route).replace("second order + cross-section", "second order"),
            result.utilization > 1,
        )
    if check is not None:
        # A member's buckling check (about the other axis, or elastic buckling) has no location: an "@ x"
        # beside it read as a section's (found by a new user).
        whole = check.kind.startswith("out-of-plane") or "buckling" in check.kind
        row(
            "utilisation",
            f"{utilisation_text(check.utilization)} {kind_text(check.kind)}",
            "the whole member" if whole else f"@ {U.show('length', check.x)}",
            check.utilization > 1,
        )
        row(
            "strength and stability",
            f"{utilisation_text(check.strength_utilization)} {kind_text(check.strength_kind)}",
            "" if check.section_class is None else f"class {check.section_class.klass}",
            check.strength_utilization > 1,
        )
        out = check.out_of_plane
        if out is not None and out.checked:
            row(
                "N/N<sub>b,Rd</sub> out of plane",
                ratio_text(out.utilization),
                f"{out.axis}, χ {out.chi:.3f}",
                out.utilization > 1,
            )
        elif out is not None and out.elastic_bound is not None:  # no code check: N/N_cr counts as a bound
            row(
                "N/N<sub>cr</sub> out of plane",
                ratio_text(out.elastic_bound),
                f"{out.axis}, a bound: code check not made",
                out.elastic_bound > 1,
            )
        elif out is not None:
            row(
                "out of plane",
                "not checked",
                "restrained" if out.reason.startswith("restrained") else "see cautions",
            )
        _service_row(row, result, U)
        if capacity is not None:
            which = governing_text(capacity.check)
            if getattr(capacity, "combination", None):
                which = f"{which}; {capacity.combination}, the lowest of the ultimate combinations"
            note = fails_below_capacity(capacity, result)
            row(
                "capacity N",
                U.show("force", capacity.axial_force),
                f"{which}. {note}" if note else which,
                bool(note),
                result.axial_force > capacity.axial_force,
            )
        elif capacity_note:
            row("capacity N", "n/a", capacity_note)
    elif service_strength(result):  # a service combination shown: strength is the ultimate combinations'
        row("strength", "see note", service_strength(result))
        _service_row(row, result, U)
    else:
        row("utilisation", "n/a", "needs a section and material")
        _service_row(row, result, U)  # the deflection check needs neither
    _ltb_rows(head, row, result, U)
    first = result.first_order
    unstable = result.status != "stable"
    head("Second order · at x · first order")
    for label, field, kind in (
        ("max |w|", "deflection", "small_length"),
        ("max |w + w0|", "total_offset", "small_length"),
        ("max |M|", "moment", "moment"),
        ("max |V|", "shear", "force"),
    ):
        peak = getattr(result.governing, field)
        fpeak = getattr(first.governing, field)
        where = f" @ {U.show('length', peak.x)}" if math.isfinite(peak.value) else ""
        row(label, f"{U.show(kind, peak.magnitude)}{where}", U.show(kind, fpeak.magnitude), unstable)
    head("Reactions (what each support exerts)")
    for end, force, couple in reaction_rows(result, U):
        row(end, force, couple)
    second = getattr(result, "second_plane", None)
    if second is not None:
        own, other = plane_axes(result)
        head(f"Second plane · {plane_name(other)}")
        row("Pcr1, this plane", U.show("force", second.critical_loads[0]), plane_name(other))
        for label, field, kind in (
            ("max |w + w0|", "total_offset", "small_length"),
            ("max |M|", "moment", "moment"),
            ("max |V|", "shear", "force"),
        ):
            peak = getattr(second.governing, field)
            where = f" @ {U.show('length', peak.x)}" if math.isfinite(peak.value) else ""
            row(label, f"{U.show(kind, peak.magnitude)}{where}", "", second.status != "stable")
        if getattr(second.reactions, "intermediate", ()):  # its restraints: every support's reaction
            for where, force, couple in reaction_rows(second, U):
                row(f"{where}, 2nd plane", force, couple)
    head("Buckling")
    pcr = result.critical_loads
    two = getattr(result, "second_plane", None) is not None  # then the lower plane's Pcr1, named
    # Two planes: each plane's own Pcr1 is named with its plane, and α_cr is the lower plane's (one "Pcr1"
    # for two different loads side by side was found confusing by a new user).
    own_axis = plane_axes(result)[0]
    row(
        "Pcr1, first plane" if two else "Pcr1",
        U.show("force", pcr[0]),
        f"K = {result.buckling.effective_length_factor:.3f}" + (f"; {plane_name(own_axis)}" if two else ""),
    )
    row(
        "α<sub>cr</sub> = Pcr,lower/N" if two else "α<sub>cr</sub> = Pcr1/N",
        ratio_text(result.alpha_cr),
        ("" if not two else lower_plane(result)[1] if result.axial_force > 0 else "no compression"),
        result.alpha_cr <= 1,
        result.axial_force > 0 and result.alpha_cr < alpha_cr_limit(),
    )
    head("Amplification · error of approximation")
    amplification = result.amplification
    row(
        "M ÷ (M<sub>I</sub> + N·w0)",
        ratio_text(amplification.moment),
        f"w: {ratio_text(amplification.deflection)}",
    )
    row("M ÷ M<sub>I</sub>", ratio_text(amplification.moment_first_order), "bow not in M_I")
    if amplification.moment_bow_free is not None:
        row("M ÷ M<sub>I</sub>, no bow", ratio_text(amplification.moment_bow_free), "for B1")
    for approximation in amplification.approximations:
        against = " (no bow)" if approximation.compared_with == "moment_bow_free" else ""
        error = percent(approximation.error) + against
        row(symbols(approximation.name), ratio_text(approximation.value), error)
    if not amplification.approximations:
        row("approximations", "none at or beyond Pcr1")
    columns = "<colgroup><col class='q'><col class='v'><col class='f'></colgroup>"
    return "<table class='ss-values'>" + columns + "".join(rows) + "</table>"


#: The LTB figures the table shows in short (the LTB tab shows them all).
_LTB_SHORT = ("M_cr", "M_cr_tabulated", "lambda_LT", "chi_LT", "utilisation")


def _ltb_rows(head, row, result, U) -> None:
    """The lateral-torsional buckling figures in short, or why the check was not made (app.report.ltb)."""
    words = ltb_words(result, U)
    if words is None:
        return
    head("Lateral-torsional buckling")
    if not words.applies:
        row("LTB", "not checked", "see cautions" if words.caution else "", warn=words.caution, key="reason")
        row("why", words.reason, key="why")
        return
    shown = {key: (label, value, note) for key, label, value, note in words.rows}
    notes = {"M_cr_tabulated": shown["difference"][1], "chi_LT": shown["chi_LT"][2].split(",")[0]}
    for key in _LTB_SHORT:
        label, value, _ = shown[key]
        danger = key == "utilisation" and words.fails
        row(_html_label(label), value, notes.get(key, ""), danger, key=key)


def _html_label(label: str) -> str:
    """A label with its symbols' indices as subscripts: ``M_cr exact`` → M<sub>cr</sub> exact."""
    return re.sub(r"_([A-Za-z0-9]+(?:,[A-Za-z0-9]+)?)", r"<sub>\1</sub>", esc(label))


def _html_symbol(symbol: str) -> str:
    base, _, index = symbol.partition("_")
    return f"{base}<sub>{index}</sub>" if index else base


# The report's symbols (α_cr, ψ, λ̄, χ, γ_M0, γ_M1), with their indices as HTML subscripts.
_SYMBOLS = tuple((word, _html_symbol(symbol)) for word, symbol in SYMBOLS.items())


def symbols(text) -> str:
    """`text` escaped for HTML, with the engine's spelt-out symbols written as symbols (α_cr, λ̄, ψ, χ)."""
    out = esc(text)
    for word, symbol in _SYMBOLS:
        out = re.sub(rf"(?<![A-Za-z]){word}(?![A-Za-z])", symbol, out)
    return out


def section_facts(result, U) -> str:
    """The section, material and EI in use (HTML)."""
    lines = [f"EI used = <b>{esc(U.show('stiffness', result.EI))}</b>"]
    section = result.section
    if section is not None:
        lines.append(
            f"{esc(section_name(section, U))}, {result.case.axis} axis: "
            f"A = {esc(U.show('area', section.A))}, "
            f"I = {esc(U.show('second_moment', section.I))}, "
            f"i = {esc(U.show('small_length', section.i))}"
        )
    if result.material is not None:
        lines.append(
            f"{esc(result.material.name)}: {esc(modulus_text(result.material, U, 3))}, "
            f"f_y = {esc(U.show('stress', result.material.fy))}"
        )
    return "<div class='ss-note'>" + "<br>".join(lines) + "</div>"


def bow_facts(result, U) -> str:
    """The initial bow in use, its curve and its direction (HTML), in the page's units (app.report)."""
    text = f"In use: {symbols(bow_text(result, U))}"
    bow = result.bow
    if bow is not None:
        if bow.curve_reason:
            text += f"<br>Curve: {symbols(quoted_text(bow.curve_reason, U))}"
        direction = bow_direction_text(bow, U)
        if direction:
            text += f"<br>Direction: {symbols(direction)}"
        if bow.favourable:
            text += "<br><b>The bow points the favourable way: reversed, it gives more.</b>"
    return f"<div class='ss-note'>{text}</div>"


def check_facts(result, U) -> str:
    """The resistances and the deflection allowed of the member check, or why there is none (HTML)."""
    check = result.check
    if check is not None:
        resist = check.resistances
        parts = [
            f"{esc(name)} = {esc(U.show(kind, resist.get(name)))}"
            for name, kind in (("N_Rd", "force"), ("M_Rd", "moment"), ("V_Rd", "force"))
            if resist.get(name) is not None
        ]
        return (
            f"<div class='ss-note'>Resistances: {', '.join(parts)}<br>"
            f"Deflection allowed: {esc(U.show('small_length', check.deflection_allowed))}"
            f"<br>{esc(check.source)}</div>"
        )
    else:
        return "<div class='ss-note'>No member check: give a section and a material (Section tab).</div>"


# ------------------------------------------------------------------ a number field the page cannot read


def empty_field_text(field: str, allowed: str) -> str:
    """An emptied number field: "Span L is empty; enter a number >= 0.001 and <= 1000 m"."""
    return f"{field} is empty; {allowed}"


def unread_field_text(field: str, text: str | None, allowed: str) -> str:
    """A number field holding text that is not a number, quoted as typed, with what to type instead.

    >>> unread_field_text("Span L", "6,5", "enter a number >= 0.001 and <= 1000 m")
    "Span L: '6,5' is not a number; use a point for decimals (6.5); enter a number >= 0.001 and <= 1000 m"
    """
    if text is None:
        return f"{field}: the text typed is not a number; {allowed}"
    return f"{field}: {text!r} is not a number{_comma_hint(text)}; {allowed}"


def _comma_hint(text: str) -> str:
    """What to type for a number written with a comma; "1,000" could be either, so both are offered."""
    if "," not in text:
        return ""
    head, _, tail = text.partition(",")
    if re.fullmatch(r"[+-]?\d*,\d+", text) and len(tail) != 3:
        return f"; use a point for decimals ({head or '0'}.{tail})"
    if re.fullmatch(r"[+-]?\d+,\d{3}", text):
        return f"; use a point for decimals and no thousands separator ({head}.{tail} or {head}{tail})"
    return "; use a point for decimals and no thousands separators"
