"""One wording of a result: sentences and table cells in the chosen display units.

Every output of strutscope (the command line, the PNG, the CSV, the PDF calc sheet, the batch and the page)
words the case and its result with these functions, so that they say the same thing in the same words and
never mix unit systems. The engine hands over numbers in SI and facts with their source (a caution's
``code`` and ``values``, a bow's ``label_template`` and ``label_values``); this module turns them into text.

Notation: N is the axial force (compression positive), F a point load, C a couple, q a distributed load,
Pcr1 the first elastic critical load, α_cr = Pcr1/N, ψ the end-moment ratio, λ̄ the relative slenderness.
"""

from __future__ import annotations

import math
import re

import numpy as np

from app.report import restraints as inner
from app.report.numbers import finite, format_number, position, ratio
from app.report.restraints import REACTIONS_NOTE, all_reactions, support_label, support_reactions
from app.report.route_names import NOTES, REASONS, governing_text, plane_axes, plane_name, route_name
from app.report.scope import GENERAL_CAUTION
from app.report.section_names import section_name
from app.units import Units, units

__all__ = [
    "REACTIONS_NOTE",
    "SYMBOLS",
    "alpha_text",
    "lower_plane",
    "axial_text",
    "bow_direction_text",
    "bow_text",
    "caution_text",
    "general_caution",
    "governing_rows",
    "has_bow",
    "load_ratio_text",
    "load_text",
    "material_text",
    "modulus_text",
    "out_of_plane_text",
    "peak_text",
    "reaction_rows",
    "every_reaction_rows",
    "section_text",
    "service_text",
    "quoted_text",
    "source_text",
    "stiffness_text",
    "status_message",
    "status_text",
    "support_text",
    "system_name",
    "utilisation_text",
]

#: The symbols written in every output (never their ASCII spellings).
SYMBOLS = {
    "alpha_cr": "α_cr",
    "psi": "ψ",
    "lambda_bar": "λ̄",
    "chi": "χ",
    "gamma_M0": "γ_M0",
    "gamma_M1": "γ_M1",
}


_SYSTEM_NAMES = {"si": "SI (kN, m, mm, kN·m)", "us": "US customary (kip, ft, in, kip·ft)"}


def system_name(U: Units) -> str:
    """The units system in words, e.g. ``"SI (kN, m, mm, kN·m)"``."""
    return _SYSTEM_NAMES.get(U.system, U.system)


def general_caution(result=None) -> str:
    """The general caution (the engine's ``scope`` caution in :mod:`app.report.scope`'s one wording), printed
    with every output whatever the result."""
    return GENERAL_CAUTION


# ----------------------------------------------------------------------------------------------------------
# The case.


def support_text(end, U: Units, sep: str = ", ") -> str:
    """A support by name (``pinned``) or by its two parts, springs with their stiffness."""
    if end.name is not None:
        return end.name
    parts = []
    for part, kind, symbol in (
        ("translation", "translational_spring", "k_t"),
        ("rotation", "rotational_spring", "k_r"),
    ):
        value = getattr(end, part)
        if isinstance(value, str):
            parts.append(f"{part} {value}")
        else:
            parts.append(f"{part} spring {symbol} = {U.show(kind, value)}")
    return sep.join(parts)


def load_text(load, length: float, U: Units) -> str:
    """One transverse load, e.g. ``"point load F = 4.000 kN at x = 2.200 m"``."""
    kind = getattr(load, "type", type(load).__name__)
    if kind == "uniform":
        a, b = load.span(length)
        return f"uniform q = {U.show('line_load', load.q)} from x = {position(U, a)} to {position(U, b)}"
    if kind == "linear":
        a, b = load.span(length)
        return (
            f"linear q = {U.show('line_load', load.q_start)} to {U.show('line_load', load.q_end)} "
            f"from x = {position(U, a)} to {position(U, b)}"
        )
    if kind == "point":
        # F, so that N stays the axial force (the case file keeps its key "P").
        return f"point load F = {U.show('force', load.P)} at x = {position(U, load.x)}"
    if kind == "couple":
        return f"couple C = {U.show('moment', load.C)} at x = {position(U, load.x)}"
    return repr(load)


def axial_text(force: float, U: Units) -> str:
    """The axial force N in words, five figures (as the critical loads), e.g. ``"350.00 kN compression"``."""
    if force > 0:
        return f"{U.show('force', force, 5)} compression"
    if force < 0:
        return f"{U.show('force', -force, 5)} tension"
    return "none"


def load_ratio_text(result) -> str:
    """N/Pcr1, the reciprocal of α_cr, or "" without an axial force (of the plane with the lower Pcr1, named
    in a two-plane case)."""
    pcr, plane = lower_plane(result)
    pcr1 = float(pcr[0])
    if result.axial_force == 0 or not finite(pcr1) or pcr1 <= 0:
        return ""
    return f"N/Pcr1 = {result.axial_force / pcr1:.3f}" + (f" ({plane})" if plane else "")


def alpha_text(result) -> str:
    """α_cr = Pcr1/N, or why there is none (the member's: in a two-plane case the lower plane's, named)."""
    if result.axial_force > 0:
        _, plane = lower_plane(result)
        return ratio(result.alpha_cr) + (f" ({plane})" if plane else "")
    return "∞ (no compression)"


def lower_plane(result) -> tuple:
    """(critical loads, "bending about the … axis") of the plane whose first critical load is the lower; the
    words are "" for a one-plane case."""
    pcr = np.asarray(result.critical_loads, dtype=float)
    second = getattr(result, "second_plane", None)
    if second is None:
        return pcr, ""
    own, other = plane_axes(result)
    lower = np.asarray(second.critical_loads, dtype=float)
    if lower[0] < pcr[0]:
        return lower, f"bending about the {plane_name(other)}"
    return pcr, f"bending about the {plane_name(own)}"


def _bow_quantity(U: Units, name: str, value: float) -> str:
    return U.show("length" if name == "h" else "small_length", value)


def bow_text(result, U: Units) -> str:
    """The initial bow used, e.g. ``"EN 1993-1-1 Table 5.1, curve b, ...: e0 = L/250 = 24.00 mm"``."""
    bow = result.bow
    if bow is not None:
        template = getattr(bow, "label_template", "") or bow.label
        values = getattr(bow, "label_values", {}) or {}
        label = template.format(**{name: _bow_quantity(U, name, v) for name, v in values.items()})
        return label + (" (against the loads)" if bow.opposes_load else "")
    imperfection = result.case.imperfection
    if imperfection.shape == "none" or imperfection.amplitude == 0:
        return "none"
    length = float(result.case.length)
    return (
        f"{imperfection.shape}, amplitude {U.show('small_length', imperfection.amplitude)} "
        f"(L/{length / abs(imperfection.amplitude):.0f})"
    )


def bow_direction_text(bow, U: Units) -> str:
    """Which direction of the bow governed, with both directions' values in the display units ("" if none)."""
    if bow is None or not bow.direction_governing:
        return ""
    if not bow.automatic or not bow.directions:
        return _bow_direction_fixed(bow, U)

    def said(direction, strength, moment):
        util = "" if strength is None else f"strength utilisation {ratio(strength)}, "
        return f"{direction}: {util}max|M| {U.show('moment', moment)}"

    both = "; ".join(said(*d) for d in bow.directions)
    return f"{bow.direction}, the worse of both directions solved ({both})"


def _bow_direction_fixed(bow, U: Units) -> str:
    if U.system == "si" or not bow.directions:
        return bow.direction_governing
    # The engine's words quote max|M| in kN·m: word them again from its numbers.
    used, *other = bow.directions
    text = f"{used[0]} as the case gives it"
    if other:
        strength, moment = other[0][1], other[0][2]
        util = "" if strength is None else f"strength utilisation {ratio(strength)}, "
        text += f"; reversed: {util}max|M| {U.show('moment', moment)}"
    return text


def stiffness_text(result, U: Units) -> str:
    """EI and the stiffness factor when one is applied."""
    text = f"EI = {U.show('stiffness', result.EI)}"
    factor = getattr(result.case, "stiffness_factor", 1.0)
    if factor != 1.0:
        text += f" (stiffness factor {factor:g} applied)"
    return text


def section_text(result, U: Units) -> str | None:
    """The section, its axis, area and second moment; None without a section."""
    section = result.section
    if section is None:
        return None
    return (
        f"{section_name(section, U)}, {section.axis} axis: A = {U.show('area', section.A)}, "
        f"I = {U.show('second_moment', section.I)}"
    )


def modulus_text(material, U: Units, digits: int = 5) -> str:
    """ "E = ..." of the analysis; for timber taken at E_0,05, which it is and the mean it replaced."""
    text = f"E = {U.show('stress', material.E, digits)}"
    mean = getattr(material, "E_mean", None)
    if mean is not None:
        text += f" (E_0,05; E_mean = {U.show('stress', mean, digits)})"
    return text


def material_text(result, U: Units) -> str | None:
    """The material, E and f_y; None without a material."""
    material = result.material
    if material is None:
        return None
    return f"{material.name}: {modulus_text(material, U)}, fy = {U.show('stress', material.fy)}"


# ----------------------------------------------------------------------------------------------------------
# The result.


def has_bow(result) -> bool:
    """True when the result has a non-zero initial bow."""
    return bool(np.any(np.asarray(result.initial_bow, dtype=float) != 0))


def peak_text(peak, kind: str, U: Units) -> str:
    """A governing value and where it is, e.g. ``"27.17 kN·m at x = 2.732 m"``; "unbounded" has no place."""
    if not finite(peak.value):
        return format_number(peak.value)
    return f"{U.show(kind, peak.value)} at x = {position(U, peak.x)}"


def governing_rows(result, *, always_offset: bool = False, transverse: bool = False):
    """(label, result field, unit kind) of the governing values, in the order every output shows them."""
    rows = [("largest |w|", "deflection", "small_length")]
    if always_offset or has_bow(result):
        rows.append(("largest |w + w0|", "total_offset", "small_length"))
    rows += [("largest |M|", "moment", "moment"), ("largest |V|", "shear", "force")]
    if transverse:
        rows.append(("largest |T|", "transverse_force", "force"))
    return rows


def status_text(result, U: Units) -> str:
    """The status and what it means in the display units, e.g. ``"stable: compression ..."``."""
    return f"{result.status}: {status_message(result, U)}"


def status_message(result, U: Units) -> str:
    """What the status means, with the numbers in the display units (no status word in front)."""
    status, P = result.status, float(result.axial_force)
    # The member's status is the worse plane's: worded with the critical loads of the plane whose first
    # critical load is the lower, that plane named.
    pcr, plane = lower_plane(result)
    plane = f", {plane}" if plane else ""

    def force(value):
        return U.show("force", value, 5)

    if status == "critical":
        n = int(np.argmin(np.abs(pcr - P))) + 1
        said = (
            f"the axial force {force(P)} equals critical load {n} ({force(pcr[n - 1])}{plane}): no "
            "equilibrium exists and the response is unbounded"
        )
    elif status == "unstable":
        between = int(np.searchsorted(pcr, P))
        said = (
            f"the axial force {force(P)} exceeds the first critical load {force(pcr[0])}{plane} (N/Pcr1 = "
            f"{P / pcr[0]:.4g}, between critical loads {between} and {between + 1}): this equilibrium is "
            "unstable; the member buckles before it is reached"
        )
    elif P > 0:
        alpha = float(pcr[0]) / float(P)  # plain floats: inf for a subnormal N, without numpy's warning
        said = (
            f"compression {force(P)}, N/Pcr1 = {P / pcr[0]:.4g} (α_cr = {alpha:.4g}{plane}); stable "
            "equilibrium"
        )
    elif P < 0:
        said = f"tension {force(-P)}; stable equilibrium, no flexural buckling"
    else:
        said = "no axial force: first-order solution"
    return said


def reaction_rows(result, U: Units):
    """(end, force text, couple text) of the support reactions: what each support exerts on the member.

    The engine's reactions are the end values of the transverse force T and moment M on the support side;
    the left support pushes the member by −T(0) along +w, the right one by +T(L) (DEVELOPERS.md,
    "Coordinates and signs"). Drawn with x to the right and +w downward, a force along −w points up; a
    couple −M(0) at the left end and +M(L) at the right one turns anticlockwise.
    """
    found = support_reactions(result.reactions, 0.0)
    # The ends first, then the intermediate restraints (engine issue 16) in x order.
    return [
        (support_label(r, U), _directed(U, "force", r.force, "up", "down"), _couple(U, r.couple))
        for r in [found[0], found[-1], *found[1:-1]]
    ]


def every_reaction_rows(result, U: Units):
    """(support, force text, couple text) at every support in x order, the ends and the restraints inside
    (engine issue 16), the first plane's then the second's (each then named by its plane)."""
    two = getattr(result, "second_plane", None) is not None
    return [
        (support_label(r, U, two), _directed(U, "force", r.force, "up", "down"), _couple(U, r.couple))
        for r in all_reactions(result)
    ]


def _directed(U: Units, kind: str, value: float, positive: str, negative: str) -> str:
    if not finite(value):
        return format_number(value)
    shown = U.show(kind, abs(value))
    if float(shown.split()[0]) == 0.0:
        return f"0 {U.label(kind)}"
    return f"{shown} {positive if value > 0 else negative}"


def _couple(U: Units, anticlockwise: float) -> str:
    return _directed(U, "moment", anticlockwise, "anticlockwise", "clockwise")


def utilisation_text(result, U: Units) -> str | None:
    """The governing (headline) utilisation, its check and where; None without a check. When a route other
    than the second-order check sets the headline (engine issue 14: the largest enabled route), it is named
    with its governing term, e.g. ``0.468 (EN 1993-1-1 equivalent member (Annex B), eq. (6.62))``."""
    check = result.check
    applied = [r for r in getattr(result, "routes", ()) if r.enabled and r.utilization is not None]
    top = max(applied, key=lambda r: r.utilization) if applied else None
    # A route other than the second-order check, or a term of the second-order route beyond its member check
    # (lateral-torsional buckling, the buckling interaction), sets the headline: named with its term.
    beyond = check is None or top is None or top.utilization != check.utilization
    if top is not None and top.utilization == result.utilization and (top.route != "second-order" or beyond):
        fails = _fails(top.utilization)
        return f"{ratio(top.utilization)}{fails} ({route_name(top, result)}, {governing_text(top.governing)})"
    if check is not None:
        where = f" at x = {position(U, check.x)}" if finite(check.x) else ""
        return f"{ratio(check.utilization)}{_fails(check.utilization)} ({check.kind}{where})"
    if result.utilization is not None:
        return f"{ratio(result.utilization)}{_fails(result.utilization)}"
    return None


def _fails(value: float) -> str:
    """ " fails" after an unbounded utilisation, " > 1, fails" after a finite one above 1 (an audit found a
    PNG and calc sheet showing 1.014 in plain ink, with no caution, where a route other than the second-order
    check failed), else ""."""
    if math.isinf(value):
        return " fails"
    return " > 1, fails" if value > 1.0 else ""


def out_of_plane_text(out, U: Units) -> str:
    """Flexural buckling about the other axis, from the engine's facts, e.g. for the member check."""
    if out is None:
        return ""
    if not out.checked:
        bound = _elastic_bound_words(out.facts(), U)
        return f"not checked: {out.reason}" + (f"; {bound}" if bound else "")
    return _out_of_plane_facts(out.facts(), U)


def _elastic_bound_words(f: dict, U: Units) -> str:
    """N/N_cr about the other axis where the code's check is not made but N_cr is known (it counts in the
    utilisation as a bound), else ""."""
    if f.get("N_cr") is None or f.get("elastic_utilization") is None:
        return ""
    return (
        f"elastic N_cr = {U.show('force', f['N_cr'])} (L_cr = {U.show('length', f['buckling_length'])}), "
        f"N/N_cr = {f['elastic_utilization']:.3f} counted as a bound (no code's resistance exceeds N_cr)"
    )


def _out_of_plane_facts(f: dict, U: Units) -> str:
    return (
        f"about the {f['axis']} axis: L_cr = {U.show('length', f['buckling_length'])}, "
        f"N_cr = {U.show('force', f['N_cr'])}, λ̄ = {f['lambda_bar']:.3f}, curve {f['curve']}, "
        f"χ = {f['chi']:.3f}, N_b,Rd = χ·{'A_eff' if f.get('effective') else 'A'}·f_y/γ_M1 = "
        f"{U.show('force', f['N_b_Rd'])}"
    )


def service_text(service, U: Units) -> str:
    """The deflection check: the largest |w| against the limit, with the utilisation."""
    allowed = U.show("small_length", service.allowed)
    return (
        f"max|w| = {U.show('small_length', abs(service.deflection))} at x = {position(U, service.x)} "
        f"against span/{service.limit:g} = {allowed} ({ratio(service.utilization)})"
    )


# ----------------------------------------------------------------------------------------------------------
# Cautions.


def _deflection(v: dict, U: Units) -> str:
    return (
        f"Deflection {U.show('small_length', v['deflection'])} exceeds the limit span/{v['limit']:g} = "
        f"{U.show('small_length', v['allowed'])} (a service check, without the bow)."
    )


def _high_strength(v: dict, U: Units) -> str:
    from engine.material_cautions import HIGH_STRENGTH_WORDS

    return f"f_y = {U.show('stress', v['fy'])} {HIGH_STRENGTH_WORDS[v['level']]}"


def _bow_below_code(v: dict, U: Units) -> str:
    return (
        f"The initial bow {U.show('small_length', v['amplitude'])} is smaller than the code value "
        f"{U.show('small_length', v['code_amplitude'])} ({v['code_label']})."
    )


def _out_of_plane_buckling(v: dict, U: Units) -> str:
    if v.get("utilization") is None:  # no check made (a material outside the out-of-plane check): N > N_cr
        return (
            f"The axial force exceeds the elastic critical load about the {v['axis']} axis, N_cr = "
            f"{U.show('force', v['N_cr'])} (L_cr = {U.show('length', v['buckling_length'])}): the member "
            "buckles out of the plane analysed. Brace it or choose a larger section."
        )
    return (
        f"N/N_b,Rd = {v['utilization']:.3f} > 1: the member buckles out of the plane analysed, "
        f"{_out_of_plane_facts(v, U)}. Brace it (a shorter out-of-plane buckling length) or choose a larger "
        "section."
    )


def _out_of_plane_not_checked(v: dict, U: Units) -> str:
    return (
        f"Out-of-plane flexural buckling ({v['axis']} axis): {v['reason']}. Its "
        f"{_elastic_bound_words(v, U)}; the code's check is still to be made."
    )


def _out_of_plane_checked(v: dict, U: Units) -> str:
    return (
        f"Out-of-plane flexural buckling checked: N/N_b,Rd = {v['utilization']:.3f} <= 1, "
        f"{_out_of_plane_facts(v, U)}."
    )


def _route_reason(code: str) -> str:
    if code.startswith("material-"):
        return f"not a steel member ({code.removeprefix('material-')}): the route is for steel"
    return REASONS.get(code, code.replace("-", " "))


def _route_not_applied(v: dict, U: Units) -> str:
    return f"The route {route_name(v.get('route', ''))} is not applied: {_route_reason(v.get('reason', ''))}."


def _route_note(code: str):
    def word(v: dict, U: Units) -> str:
        return f"{route_name(v.get('route', ''))}: {NOTES.get(code, ('', code))[1]}."

    return word


def _routes_disagree(v: dict, U: Units) -> str:
    found = v.get("utilizations") or {}
    listed = ", ".join(f"{route_name(code)} {ratio(value)}" for code, value in found.items())
    return (
        f"The routes' utilisations differ by {100.0 * float(v.get('spread', 0.0)):.0f} % ({listed}): "
        "their assumptions differ (bow and second-order analysis, or equivalent member factors)."
    )


# The cautions whose message quotes a quantity with a unit (or an engine code), worded here from the engine's
# values; every other caution's message holds neither and is shown as the engine words it.
_WORDED = {
    "route-not-applied": _route_not_applied,
    "chi-LT-1": _route_note("chi-LT-1"),
    "LTB-not-checked": _route_note("LTB-not-checked"),
    "routes-disagree": _routes_disagree,
    "deflection": _deflection,
    "bow-below-code": _bow_below_code,
    "high-strength-steel": _high_strength,
    "out-of-plane-buckling": _out_of_plane_buckling,
    "out-of-plane-checked": _out_of_plane_checked,
    "out-of-plane-not-checked": _out_of_plane_not_checked,
    "ltb-support-held-assumed": inner.support_held_words,
}


_FLAG = re.compile(r"\s*\((?:[^()]*?\b)?(?:from memory|common practice, no source)\)|;?\s*\bfrom memory\b")


# A quantity quoted from an SI source ("t <= 16 mm", "210 000 MPa"): digits with spaces between thousands.
_QUOTED = re.compile(
    r"(?<![\w.])(\d{1,3}(?:[ \u202f]\d{3})+|\d+(?:\.\d+)?)\s?(kg/m³|mm|MPa|kN·m|kN|m)(?![\w²³⁴·/])"
)
_QUOTED_KINDS = {"mm": ("small_length", 1e-3), "MPa": ("stress", 1e6), "kN·m": ("moment", 1e3)}
_QUOTED_KINDS.update({"kN": ("force", 1e3), "m": ("length", 1.0)})


def quoted_text(text: str, U: Units) -> str:
    """Text quoted from an SI source (a table row, a thickness range) with its quantities in `U`'s units.

    In SI the text is returned as it is; in US customary units each "16 mm" or "355 MPa" becomes the same
    quantity in the US unit, so that no US output shows an SI unit.

    >>> quoted_text("t <= 16 mm: 355 MPa; E = 210 000 MPa", units("us"))
    't <= 0.630 in: 51.49 ksi; E = 30458 ksi'
    """
    if U.system == "si" or not text:
        return text

    def convert(match):
        value = float(match.group(1).replace(" ", "").replace("\u202f", ""))
        if match.group(2) == "kg/m³":  # 1 lb/ft³ = 0.45359237 kg / 0.3048³ m³ (exact definitions)
            return f"{value * 0.3048**3 / 0.45359237:.4g} lb/ft³"
        kind, factor = _QUOTED_KINDS[match.group(2)]
        return U.show(kind, value * factor)

    return _QUOTED.sub(convert, text)


def source_text(source: str, U: Units | None = None) -> str:
    """A source as the calc sheet shows it: the reference itself, without strutscope's own reliability flags.

    The flags ("clause from memory", "common practice, no source") stay in the README and the source code;
    a sheet handed to a checker names the reference.

    >>> source_text("EN 1993-1-1:2005 §5.2.1(3), eq. (5.1) (clause from memory)")
    'EN 1993-1-1:2005 §5.2.1(3), eq. (5.1)'
    >>> source_text("common practice, no source")
    'common practice, no source'
    """
    text = _FLAG.sub("", source or "").strip(" ;,") or (source or "")
    return text if U is None else quoted_text(text, U)


def caution_text(caution, U: Units | str = "si") -> str:
    """A caution's message in the display units (the engine's own words where it quotes no unit)."""
    if caution.code == "scope":
        return GENERAL_CAUTION
    U = units(U)
    word = _WORDED.get(caution.code)
    values = getattr(caution, "values", None)
    if word is None or not values:
        return caution.message
    text = word(values, U)
    if values.get("plane") == 2:
        # A two-plane case's caution about its second plane: the engine's message opens with the plane.
        text = f"Second plane (bending about the {values.get('axis', 'other')} axis): {text}"
    if values.get("combination"):  # another combination's caution beside the one shown (engine.envelope)
        text = f"{text} (combination {values['combination']})"
    return text
