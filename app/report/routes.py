"""The routes of the member check and the second bending plane, worded in the display units.

The engine hands each route's verdict over as an :class:`engine.design.routes.RouteCheck` (a route code, a
utilisation, the code of the governing term, the terms, the facts in SI, a reason, note codes and a source)
and a two-plane case's second plane as a full :class:`engine.Result`. This module words them, for every output
(the page, the printed summary, the calc sheet, the batch), in one unit system.

Route names: ``"second order + cross-section"``, ``"EN 1993-1-1 equivalent member (Annex B)"`` (or Annex
A), ``"AISC 360-16 (LRFD)"`` (or ASD). The *headline* is the worst route the case enables (``check.routes``);
the others are shown "for comparison".
"""

from __future__ import annotations

import math

from app.report.combinations import shown_of
from app.report.numbers import finite, ratio
from app.report.route_names import (  # noqa: F401 (the planes' names are used from here too)
    NOTES,
    REASONS,
    TERMS,
    governing_text,
    other_axis,
    plane_axes,
    plane_name,
    route_name,
    route_setting,
)
from app.report.route_notes import setting_notes
from app.report.words import governing_rows, peak_text, quoted_text
from app.units import Units

__all__ = [
    "FACTS",
    "NOTES",
    "TERMS",
    "fact_text",
    "facts_text",
    "governing_text",
    "headline_route",
    "headline_exceeds_routes",
    "headline_text",
    "note_text",
    "other_axis",
    "reason_text",
    "plane_axes",
    "plane_name",
    "route_name",
    "pcr1_planes_text",
    "route_rows",
    "route_setting",
    "second_plane_rows",
]

#: The facts shown, in this order: key → (symbol, kind of quantity or "" for a ratio).
FACTS = {
    "L_cr_y": ("L_cr,y", "length"),
    "L_cr_z": ("L_cr,z", "length"),
    "N_cr_y": ("N_cr,y", "force"),
    "N_cr_z": ("N_cr,z", "force"),
    "lambda_bar_y": ("λ̄_y", ""),
    "lambda_bar_z": ("λ̄_z", ""),
    "lambda_y": ("λ̄_y", ""),
    "lambda_z": ("λ̄_z", ""),
    "chi_y": ("χ_y", ""),
    "chi_z": ("χ_z", ""),
    "chi_LT": ("χ_LT", ""),
    "lambda_LT": ("λ̄_LT", ""),
    "M_cr": ("M_cr", "moment"),
    "M_b_Rd": ("M_b,Rd", "moment"),
    "M_y_II": ("M_y,II", "moment"),
    "C_b": ("C_b", ""),
    "C_b_F1_1": ("C_b by eq. (F1-1)", ""),
    "M_n_F2": ("M_n by §F2", "moment"),
    "M_n_F11": ("M_n by §F11.2", "moment"),
    "Lbd_t2": ("L_b·d/t²", ""),
    "Lbd_t2_p": ("0.08E/F_y", ""),
    "Lbd_t2_r": ("1.9E/F_y", ""),
    "k_yy": ("k_yy", ""),
    "k_yz": ("k_yz", ""),
    "k_zy": ("k_zy", ""),
    "k_zz": ("k_zz", ""),
    "k_zy_cm1": ("k_zy (C_m = 1)", ""),
    "k_yz_cm1": ("k_yz (C_m = 1)", ""),
    "k_yy_cm1": ("k_yy (C_m = 1)", ""),
    "k_zz_cm1": ("k_zz (C_m = 1)", ""),
    "C_my": ("C_my", ""),
    "C_mz": ("C_mz", ""),
    "C_mLT": ("C_mLT", ""),
    "rho_shear": ("ρ (shear, §6.2.8)", ""),
    "drift_ratio": ("Δ2/Δ1 ≈ 1/(1 − αN/N_cr)", ""),
    "tau_b": ("τ_b (§C2.3)", ""),
    "P_ns": ("P_ns", "force"),
    "t_nominal": ("t, nominal", "small_length"),
    "t_design": ("t, design (0.93 t, §B4.2)", "small_length"),
    "N_Rk": ("N_Rk", "force"),
    "M_y_Rk": ("M_y,Rk", "moment"),
    "M_z_Rk": ("M_z,Rk", "moment"),
    "N_Ed": ("N_Ed", "force"),
    "M_y_Ed": ("M_y,Ed", "moment"),
    "M_z_Ed": ("M_z,Ed", "moment"),
    "KL_r": ("KL/r", ""),
    "F_e": ("F_e", "stress"),
    "F_cr": ("F_cr", "stress"),
    "F_e_y": ("F_e,y", "stress"),
    "F_e_z": ("F_e,z", "stress"),
    "F_cr_y": ("F_cr,y", "stress"),
    "F_cr_z": ("F_cr,z", "stress"),
    "F_e_T": ("F_e,T (§E4)", "stress"),
    "F_cr_T": ("F_cr,T (§E4)", "stress"),
    "N_cr_T": ("N_cr,T", "force"),
    "sway_N_cr": ("N_cr of the swaying first mode (Pcr1)", "force"),
    "sway_lambda": ("λ̄ (sway)", ""),
    "sway_chi": ("χ (sway)", ""),
    "sway_N_b_Rd": ("N_b,Rd (sway)", "force"),
    "L_T": ("L_T", "length"),
    "chi_T": ("χ_T", ""),
    "N_b_T_Rd": ("N_b,T,Rd", "force"),
    "F_y": ("F_y", "stress"),
    "P_n": ("P_n", "force"),
    "phi_c": ("φ_c", ""),
    "Omega_c": ("Ω_c", ""),
    "phi_b": ("φ_b", ""),
    "Omega_b": ("Ω_b", ""),
    "P_c": ("P_c", "force"),
    "P_r": ("P_r", "force"),
    "phi_t": ("φ_t", ""),
    "M_n_y": ("M_n,y", "moment"),
    "M_n_z": ("M_n,z", "moment"),
    "M_c_y": ("M_c,y", "moment"),
    "M_c_z": ("M_c,z", "moment"),
    "M_r_y": ("M_r,y", "moment"),
    "M_r_z": ("M_r,z", "moment"),
    "M_r_y_notional": ("M_r,y of the notional load about y", "moment"),
    "M_r_z_notional": ("M_r,z of the notional load about z", "moment"),
    "V_r_y": ("V_r,y", "force"),
    "V_n_y": ("V_n,y", "force"),
    "V_c_y": ("V_c,y", "force"),
    "phi_v_y": ("φ_v,y", ""),
    "Omega_v_y": ("Ω_v,y", ""),
    "V_r_z": ("V_r,z", "force"),
    "V_n_z": ("V_n,z", "force"),
    "V_c_z": ("V_c,z", "force"),
    "phi_v_z": ("φ_v,z", ""),
    "Omega_v_z": ("Ω_v,z", ""),
}

# A fact the table above does not know is shown when its key says its kind (N_, P_ forces; M_ moments;
# L_ lengths; F_, f_ stresses; the dimensionless symbols); any other is left to the JSON summary, so that no
# number is ever shown without its unit.
_PREFIX_KINDS = (
    ("N_", "force"),
    ("P_", "force"),
    ("M_", "moment"),
    ("L_", "length"),
    ("F_", "stress"),
    ("f_", "stress"),
    ("chi", ""),
    ("k_", ""),
    ("C_m", ""),
    ("lambda", ""),
    ("phi", ""),
    ("Omega", ""),
    ("alpha", ""),
)


#: Slenderness-like ratios (tens to thousands), shown to one decimal.
_ONE_DECIMAL = ("KL_r", "Lbd_t2", "Lbd_t2_p", "Lbd_t2_r")


def _kind_of(key: str) -> str | None:
    if key in FACTS:
        return FACTS[key][1]
    for prefix, kind in _PREFIX_KINDS:
        if key.startswith(prefix):
            return kind
    return None


def _symbol_of(key: str) -> str:
    if key in FACTS:
        return FACTS[key][0]
    return key


def fact_text(key: str, value, U: Units) -> str | None:
    """One fact, e.g. ``"χ_z = 0.422"`` or ``"F_cr = 215.3 MPa"``; None for a fact of unknown kind."""
    kind = _kind_of(key)
    if kind is None or isinstance(value, bool) or not isinstance(value, (int, float)):
        return None
    if kind == "":
        shown = ratio(value, 1 if key in _ONE_DECIMAL else 3)
    else:
        shown = U.show(kind, float(value))
    return f"{_symbol_of(key)} = {shown}"


#: The facts of a member divided by restraints into segments (engine.segment_routes), worded together.
_SEGMENT_FACTS = ("segment_start", "segment_end", "L_segment", "segments")


def segment_text(facts: dict, U: Units) -> str | None:
    """Which segment between braced points governs an equivalent-member route, e.g. ``"governing segment
    x = 0 to 3.00 m (1 of 2)"``; None for a route of the whole member."""
    if "segment_start" not in facts or "segment_end" not in facts:
        return None
    a, b = float(facts["segment_start"]), float(facts["segment_end"])
    text = f"governing segment x = {U.show('length', a)} to {U.show('length', b)}"
    pieces = facts.get("segments") or ()
    for number, piece in enumerate(pieces, start=1):
        if (float(piece[0]), float(piece[1])) == (a, b):  # the same numbers: the engine copied them
            return f"{text} ({number} of {len(pieces)})"
    return text


def facts_text(facts: dict, U: Units) -> str:
    """The facts of a route that have a known kind, in the order of :data:`FACTS`, then the others; the
    governing segment first when the route checked the member segment by segment."""
    keys = [k for k in FACTS if k in facts] + sorted(k for k in facts if k not in FACTS)
    parts = [segment_text(facts, U)]
    parts += [fact_text(key, facts[key], U) for key in keys if key not in _SEGMENT_FACTS]
    return ", ".join(part for part in parts if part)


def reason_text(code: str, U: Units | None = None) -> str:
    """Why a route was not applied, in words (``material-timber``: "not a steel member (timber)")."""
    if not code:
        return ""
    if code.startswith("material-"):
        return f"not a steel member ({code.removeprefix('material-')}): the route is for steel"
    words = REASONS.get(code, code.replace("-", " "))
    return words if U is None else quoted_text(words, U)


def note_text(code: str, U: Units | None = None) -> tuple[str, str]:
    """(level, words) of a route's note code; an unknown code is an info with its code as the words."""
    level, words = NOTES.get(code, ("info", code.replace("-", " ")))
    return level, words if U is None else quoted_text(words, U)


def _utilisation_of(route) -> float:
    value = route.utilization
    if value is None:
        return -math.inf
    value = float(value)
    return math.inf if math.isnan(value) else value


def headline_route(result):
    """The enabled route with the largest utilisation (+inf counts as largest), or None."""
    enabled = [r for r in getattr(result, "routes", ()) or () if r.enabled and r.utilization is not None]
    if not enabled:
        return None
    return max(enabled, key=_utilisation_of)


def _utilisation_words(value) -> str:
    if value is None:
        return "not applied"
    text = ratio(value)
    if not finite(value) or float(value) > 1.0:
        return f"{text} (fails)" if not finite(value) else f"{text} > 1, fails"
    return text


def headline_exceeds_routes(result) -> bool:
    """True when the result's own utilisation is above every enabled route's (the routes then under-report).

    The engine's headline is the worst enabled route, so the two agree; should they not, the page, the
    summary and the sheet show the larger, the result's, and say so: a shown utilisation never errs low.
    """
    route = headline_route(result)
    own = getattr(result, "utilization", None)
    if route is None or own is None:
        return False
    return _utilisation_of(route) < float(own) * (1.0 - 1e-9) - 1e-12


def headline_text(result) -> str:
    """The headline: the worst enabled route by name, e.g. ``"0.874 by AISC 360-16 (LRFD), H1-1a"``; with
    load cases the combination it is of, e.g. ``"0.341 in U4 by ..."``."""
    route = headline_route(result)
    if route is None:
        return ""
    shown = shown_of(result)
    where = f" in {shown}" if shown else ""
    if headline_exceeds_routes(result):
        check = getattr(result, "check", None)
        kind = f" ({check.kind})" if check is not None else ""
        words = _utilisation_words(result.utilization)
        return f"{words}{where} by the member check{kind}, above every route that counts"
    term = governing_text(route.governing)
    text = f"{_utilisation_words(route.utilization)}{where} by {route_name(route, result)}"
    return text + (f", {term}" if term else "")


def _largest_of_combinations(result, route, shown: str) -> tuple[float, str] | None:
    """(utilisation, combination) when an ultimate combination other than the shown one gives this route a
    larger utilisation (the engine's ``route:<code>`` governing row), else None: it is named beside the shown
    combination's own value, never put in its place."""
    actions = getattr(result, "actions", None)
    if actions is None:
        return None
    row = actions.governing_for(f"route:{route.route}")
    if row is None or row.combination == shown:
        return None
    value = float(row.value)
    if not (math.isnan(value) or value > _utilisation_of(route)):
        return None
    return value, row.combination


def route_rows(result, U: Units) -> list[dict]:
    """Each route of `result` as words: name, status, utilisation, governing term, facts, notes, source.

    Every row is a dict with ``route`` (the code), ``name``, ``enabled`` (bool), ``status`` (``"headline"``,
    ``"counts"`` or ``"for comparison"``), ``utilisation`` (text), ``value`` (the number or None),
    ``danger`` (bool: above 1 here or in another combination), ``combination`` (the shown one's name, ''
    without load cases), ``governing``, ``term_in_words`` (bool),
    ``facts``, ``reason``, ``notes`` (tuple of (level, words), one per engine note code, in their order),
    ``setting_notes`` (tuple of (level, words): how a setting of the case reaches the route, worded by
    :mod:`app.report.route_notes` from the settings and the route's facts; shown with ``notes``) and
    ``source``.

    With load cases the rule is one for every output: each value is the shown combination's own and is
    named with it (``"0.254 in U4"``); a route that another ultimate combination loads more names that one
    after it (``"; 0.391 in U1, the largest of the combinations"``), the shown combination's governing term
    beside its own value (``term_in_words`` True: a view then does not add ``governing`` after the words,
    where it would read as the larger one's). ``value`` is always the shown combination's own.
    """
    head = None if headline_exceeds_routes(result) else headline_route(result)
    shown = shown_of(result)
    rows = []
    for route in getattr(result, "routes", ()) or ():
        if route is head:
            status = "headline"
        elif route.enabled:
            status = "counts"
        else:
            status = "for comparison"
        words, value = _utilisation_words(route.utilization), route.utilization
        danger = value is not None and not float(value) <= 1.0
        governing = governing_text(route.governing)
        term_in_words = False
        if shown and value is not None:
            words = f"{words} in {shown}"
        largest = _largest_of_combinations(result, route, shown)
        if largest is not None:  # another combination loads this route more: named after the own value
            words += f" by {governing}" if governing else ""
            words += f"; {_utilisation_words(largest[0])} in {largest[1]}, the largest of the combinations"
            term_in_words = True
            danger = danger or not largest[0] <= 1.0
        rows.append(
            {
                "route": route.route,
                "name": route_name(route, result),
                "enabled": bool(route.enabled),
                "status": status,
                "utilisation": words,
                "value": value,
                "danger": danger,
                "combination": shown,
                "governing": governing,
                "term_in_words": term_in_words,
                "facts": facts_text(route.facts or {}, U),
                "reason": reason_text(route.reason or "", U),
                "notes": tuple(note_text(code, U) for code in route.notes or ()),
                "setting_notes": tuple(
                    (level, quoted_text(words, U)) for level, words in setting_notes(result, route)
                ),
                "source": route.source or "",
            }
        )
    return rows


def pcr1_planes_text(result, U: Units) -> str:
    """Pcr1 in the display units; in a two-plane case each plane's with its axis (α_cr beside it is the lower
    plane's, :func:`app.report.words.alpha_text`)."""
    first = U.show("force", float(result.critical_loads[0]), 5)
    second = getattr(result, "second_plane", None)
    if second is None:
        return first
    own, other = plane_axes(result)
    other_pcr1 = U.show("force", float(second.critical_loads[0]), 5)
    return f"{first} ({plane_name(own)}), {other_pcr1} ({plane_name(other)})"


def second_plane_rows(result, U: Units) -> list[tuple[str, str]]:
    """(label, text) of the second plane's first critical load and governing values; [] for one plane."""
    second = getattr(result, "second_plane", None)
    if second is None:
        return []
    rows = [("Pcr1", U.show("force", float(second.critical_loads[0]), 5))]
    for label, name, kind in governing_rows(second):
        rows.append((label, peak_text(getattr(second.governing, name), kind, U)))
    return rows
