"""The lateral-torsional buckling check (issue 15), worded in the display units for every output.

The engine hands the check over as ``result.ltb`` (an ``engine.design.ltb_member.LtbCheck``, or None when the
case has no member check): the exact elastic critical moment for the member's own moment diagram, the
tabulated one (the C1 formula for the nearest standard diagram), λ̄_LT, χ_LT, M_b,Rd and the utilisation, the
settings used (load position, lateral and warping ends), the first buckling mode (lateral v and twist φ) and,
with the AISC route, AISC 360-16 §F2 (§F11.2 for a solid rectangular bar). This module words it once, for
the page, the printed summary, the calc sheet, the CSV and the batch table; it does no mechanics.

:func:`ltb_words` gives everything as text in one :class:`LtbWords`; :func:`ltb_of` the engine's object (or
None, also for an engine without the field).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from app.report.numbers import finite, percent, ratio
from app.report.words import source_text
from app.units import Units
from app.units import units as _units

__all__ = [
    "DIAGRAMS",
    "END_LABELS",
    "LOAD_POSITION_LABELS",
    "REASONS",
    "LtbWords",
    "ltb_of",
    "ltb_words",
    "method_text",
    "reason_text",
    "settings_text",
]

#: Where the transverse loads act over the depth, in words (the case file's codes as keys).
LOAD_POSITION_LABELS = {
    "destabilising": "destabilising: at the flange or edge the loads come from (z_g = +h/2)",
    "shear-centre": "at the shear centre (z_g = 0)",
    "stabilising": "stabilising: at the other flange or edge (z_g = −h/2)",
}
#: The end conditions in words.
END_LABELS = {
    "fork": "fork (free about the minor axis)",
    "fixed": "fixed",
    "free": "free",
    "supports": "as its support",
}

#: Why the check could not be made (``LtbCheck.reason``), in words.
REASONS = {
    "torsion-unknown": "the section's torsion and warping constants (I_t, I_w) are not known",
    "minor-axis-unknown": "the section's second moment about its minor axis (I_z) is not known",
    "not-open-section": "not a doubly symmetric open I- or H-section",
    "no-major-moment": "no moment about the major axis",
    "minor-axis-only": "the member bends about its minor axis only",
    "closed-or-solid": "a closed or solid section",
    "free-end": "an end free laterally (a cantilever's tip, or an end the plane of minor-axis bending lets "
    "move) while the other end is neither built in nor stated laterally fixed (set the LTB lateral end "
    "there to fixed, or the free end's to fork where it is held; an overhang past a support needs the "
    "plane of minor-axis bending with a restraint that holds that support laterally)",
    "not-doubly-symmetric": "the section is not doubly symmetric",
    "depth-unknown": "the section's depth is not known, so the loads cannot be placed over it",
    "lateral-hinge": "a hinge in the plane of minor-axis bending (not modelled in the critical moment)",
    "restrained": "the compression flange is restrained along the member, as the case states: "
    "lateral-torsional buckling is prevented, χ_LT = 1 (EN 1993-1-1 §6.3.2.1(2))",
}

#: The standard moment diagrams of the tabulated C1, by the engine's code.
DIAGRAMS = {
    "uniform": "uniform moment",
    "linear": "linear moment (end moments)",
    "udl": "uniform load, simply supported",
    "point-mid": "point load at mid-span",
    "point": "point load at mid-span",
}

#: EN 1993-1-1 methods for χ_LT, by clause.
_METHODS = {
    "6.3.2.2": "EN 1993-1-1 §6.3.2.2 (general case, eq. (6.56), Tables 6.3 and 6.4)",
    "6.3.2.3": "EN 1993-1-1 §6.3.2.3 (rolled or equivalent welded sections, eqs. (6.57) and (6.58), "
    "Tables 6.3 and 6.5)",
}

_ZONES = {
    "plastic": "plastic, L_b ≤ L_p (F2-1)",
    "inelastic": "inelastic, L_p < L_b ≤ L_r (F2-2)",
    "elastic": "elastic, L_b > L_r (F2-3)",
    "exact-cap": "the member's exact elastic M_cr at this segment's peak, below F2's value for it",
}

#: AISC 360-16 §F11 for a rectangular bar: the zones by L_b·d/t²; the engine's L_p and L_r are the L_b at
#: the two limits.
_ZONES_F11 = {
    "plastic": "yielding, L_b·d/t² ≤ 0.08E/F_y (F11-1)",
    "inelastic": "inelastic, 0.08E/F_y < L_b·d/t² ≤ 1.9E/F_y (F11-2)",
    "elastic": "elastic, L_b·d/t² > 1.9E/F_y (F11-3, F11-4)",
    "exact-cap": "the exact elastic M_cr, which is below F11-2/F11-4's value for this stocky bar",
}
_LIMITS_F11 = (("L_p", "L_b at 0.08E/F_y"), ("L_r", "L_b at 1.9E/F_y"))
_CLAUSES = {
    "F2": ("§F2", "§F2 (doubly symmetric compact I-shapes)"),
    "F11": ("§F11.2", "§F11.2 (rectangular bars bent about their major axis)"),
}


@dataclass(frozen=True)
class LtbWords:
    """The lateral-torsional buckling check as text in one unit system.

    Attributes
    ----------
    applies : bool
        False when the check could not be made (``reason`` says why; the engine's caution stays).
    reason : str
        Why not, in words ("" when it applies).
    settings : str
        Load position and end conditions used.
    rows : list of (key, label, value, note)
        The figures, in order: M_Ed, M_cr exact, M_cr tabulated, difference, λ̄_LT, χ_LT, M_b,Rd, utilisation
        (and M_n of AISC 360-16 §F2 for an I section, §F11.2 for a rectangular bar); keys are the engine's
        field names (``"aisc"`` for the last); ``note`` is "" or a few words for beside the value
        (:meth:`line` joins them).
    method : str
        How χ_LT and M_cr were found, with the clauses.
    sources : tuple of str
        The engine's sources, without strutscope's reliability flags.
    utilisation : float or None
        M_Ed / M_b,Rd (None when the check does not apply).
    caution : bool
        True when the engine's lateral-torsional buckling caution is among the result's cautions (it stays
        where the check could not be made; not where the case states the flange restrained).
    headline : str
        One line: ``"LTB 0.412 (χ_LT 0.803, M_cr 521.3 kN·m)"`` or ``"LTB not checked: <reason>"``.
    """

    applies: bool
    reason: str
    settings: str
    rows: list = field(default_factory=list)
    method: str = ""
    sources: tuple = ()
    utilisation: float | None = None
    headline: str = ""
    caution: bool = False

    def text(self, key: str) -> str:
        """The value of row `key` ("" when absent)."""
        return next((value for k, _, value, _ in self.rows if k == key), "")

    def lines(self) -> list[tuple[str, str, str]]:
        """(key, label, value with its note in parentheses) of every row, for one-line outputs."""
        return [(key, label, f"{value} ({note})" if note else value) for key, label, value, note in self.rows]

    @property
    def fails(self) -> bool:
        """True when the utilisation is above 1 (or unbounded)."""
        return self.utilisation is not None and not float(self.utilisation) <= 1.0


def ltb_of(result):
    """``result.ltb`` (None when the case has no member check, or the engine gives no such field)."""
    return getattr(result, "ltb", None)


def reason_text(code: str | None) -> str:
    """Why the check could not be made, in words; an unknown code with its hyphens as spaces."""
    if not code:
        return ""
    if code.startswith("material-"):  # the exact M_cr is still found: M_II/M_cr counts as a bound
        return (
            f"a {code.removeprefix('material-')} member: the check is for steel; its elastic critical moment "
            "bounds any code's resistance, and M_y,II/M_cr counts in the utilisation as a bound"
        )
    return REASONS.get(code, code.replace("-", " "))


def _pair_text(pair) -> str:
    left, right = (tuple(pair) + ("?", "?"))[:2]
    if left == right:
        return f"{END_LABELS.get(left, left)} at both ends"
    return f"{END_LABELS.get(left, left)} at x = 0, {END_LABELS.get(right, right)} at x = L"


def settings_text(ltb, U: Units | None = None) -> str:
    """The settings used: ``"loads destabilising: ...; lateral: fork (...) at both ends; warping: ..."``, and
    the restraints inside the member (``"; held inside: x = 3 m (lateral, twist)"``) when there are any."""
    position = getattr(ltb, "load_position", "destabilising")
    text = (
        f"loads {LOAD_POSITION_LABELS.get(position, position)}; lateral: {_pair_text(ltb.lateral_ends)}; "
        f"warping: {_pair_text(ltb.warping_ends)}"
    )
    held = getattr(ltb, "restraints", ()) or ()
    if held:
        U = U or _units("si")
        text += "; held inside (at the shear centre): " + ", ".join(_held_point(r, U) for r in held)
    return text


def _held_point(restraint, U: Units) -> str:
    """One intermediate restraint of the LTB problem: ``"x = 3 m (lateral, twist)"``."""
    parts = []
    for key, word, kind in (
        ("lateral", "lateral", "translational_spring"),
        ("lateral_rotation", "lateral rotation", "rotational_spring"),
        ("twist", "twist", "rotational_spring"),
    ):
        value = restraint.get(key, "free")
        if value == "fixed":
            parts.append(word)
        elif value != "free":
            parts.append(f"{word} spring {U.show(kind, value)}")
    return f"x = {U.show('length', restraint['x'])} ({', '.join(parts)})"


def _segment_text(ltb, U: Units) -> str:
    """The governing segment between brace points, or "" for a member without them."""
    segment = getattr(ltb, "segment", ()) or ()
    if not segment:
        return ""
    a, b = segment
    return f"segment x = {U.show('length', a)} to {U.show('length', b)} between brace points governs"


def method_text(ltb) -> str:
    """χ_LT's clause, the curve and f, then how the two critical moments were found."""
    clause = _METHODS.get(ltb.method, f"EN 1993-1-1 §{ltb.method}")
    f = "" if ltb.method != "6.3.2.3" else f", f = {ratio(ltb.f)}"
    return (
        f"χ_LT by {clause}, buckling curve {ltb.curve}{f}; M_cr exact: the elastic critical moment of this "
        "member's own moment diagram, load height and end conditions (Vlasov's equations, finite elements); "
        "M_cr tabulated: the three-factor formula with C1 and C2 of the nearest standard diagram, without "
        "the axial force"
    )


def _moment(U: Units, value) -> str:
    if value is not None and math.isinf(float(value)):
        return "∞ (no lateral-torsional buckling)"
    return U.show("moment", value)


def _held_text(ltb, U: Units) -> str:
    """The note beside the exact M_cr: the member's own diagram, and the compression held in it."""
    held = getattr(ltb, "N_Ed", 0.0) or 0.0
    at_zero = getattr(ltb, "M_cr_0", None)
    if float(ltb.M_cr) == 0.0 and held > 0.0:
        return (
            f"N_Ed = {U.show('force', held)} is at or above the member's lateral or torsional critical load: "
            f"no lateral stiffness is left ({_moment(U, at_zero)} at N = 0)"
        )
    if held > 0.0 and finite(at_zero):
        return f"with N_Ed = {U.show('force', held)} held; {_moment(U, at_zero)} at N = 0"
    return "this member's own diagram"


def _difference_note(ltb) -> str:
    """Beside the difference: which way it errs (the tabulated value above the exact one is unsafe)."""
    if finite(ltb.difference) and float(ltb.difference) > 0.0005:
        return "tabulated above exact: unsafe side (the exact one is used)"
    return "of the exact M_cr"


def _diagram_text(ltb) -> str:
    if ltb.diagram in ("none", "", None):
        return "none of the standard diagrams fits: uniform moment's"
    name = DIAGRAMS.get(ltb.diagram, str(ltb.diagram).replace("-", " "))
    deviation = float(ltb.diagram_deviation)
    if finite(deviation) and deviation > 0:
        return f"{name}, the real diagram {deviation:.0%} away"
    return name


def _utilisation_text(value) -> str:
    if value is None:
        return "n/a"
    if not finite(value):
        return f"{ratio(value)} (fails)"
    return f"{ratio(value)} > 1, fails" if float(value) > 1.0 else ratio(value)


def _aisc_note(ltb, U: Units) -> str:
    """Beside M_n of AISC 360-16 §F2 (§F11.2): its zone, L_p and L_r (the L_b at §F11's limits) and C_b."""
    aisc = ltb.aisc
    bar = getattr(aisc, "clause", "F2") == "F11"
    parts = [(_ZONES_F11 if bar else _ZONES).get(aisc.zone, aisc.zone)]
    if getattr(ltb, "segment", ()):
        parts.append(f"L_b = {U.show('length', aisc.L_b)} (the governing unbraced segment)")
    for key, name in _LIMITS_F11 if bar else (("L_p", "L_p"), ("L_r", "L_r")):
        value = getattr(aisc, key, None)
        if value is not None:
            parts.append(f"{name} = {U.show('length', value)}")
    c_b = getattr(aisc, "C_b", None)
    by_formula = getattr(ltb, "C_b_F1_1", None)
    if c_b is not None and finite(by_formula) and abs(float(by_formula) - float(c_b)) > 5e-4:
        parts.append(f"C_b = {ratio(c_b)} (eq. (F1-1): {ratio(by_formula)}, capped by the exact M_cr)")
    elif c_b is not None:
        parts.append(f"C_b = {ratio(c_b)} (eq. (F1-1))")
    return ", ".join(parts)


def ltb_words(result, U: Units) -> LtbWords | None:
    """The check of `result` in the units `U`, or None when the case has no member check (no ``ltb``)."""
    ltb = ltb_of(result)
    if ltb is None:
        return None
    settings = settings_text(ltb, U)
    sources = tuple(source_text(s, U) for s in (getattr(ltb, "sources", ()) or ()))
    caution = any(c.code == "lateral-torsional-buckling" for c in getattr(result, "cautions", ()) or ())
    if not ltb.applies:
        reason = reason_text(ltb.reason)
        missing = tuple(getattr(ltb, "missing", ()) or ())
        if missing:  # doubly_symmetric is "missing" when it is false, given or not
            named = [m if not m.endswith("doubly_symmetric") else f"{m}: true" for m in missing]
            reason += f" (needs: {', '.join(named)})"
        rows = []
        if str(ltb.reason).startswith("material-") and finite(ltb.M_cr):
            rows = [
                ("M_Ed", "M_Ed", U.show("moment", ltb.M_Ed), "largest major-axis moment"),
                ("M_cr", "M_cr exact", _moment(U, ltb.M_cr), _held_text(ltb, U)),
            ]
        return LtbWords(
            applies=False,
            reason=reason,
            settings=settings,
            rows=rows,
            sources=sources,
            headline=f"LTB not checked: {reason}",
            caution=caution,
        )
    rows = [
        ("M_Ed", "M_Ed", U.show("moment", ltb.M_Ed), "largest major-axis moment"),
        ("M_cr", "M_cr exact", _moment(U, ltb.M_cr), _held_text(ltb, U)),
        (
            "M_cr_tabulated",
            "M_cr tabulated",
            _moment(U, ltb.M_cr_tabulated),
            ", ".join(
                part
                for part in (f"C1 = {ratio(ltb.C1)}, {_diagram_text(ltb)}", _segment_text(ltb, U))
                if part
            ),
        ),
        ("difference", "tabulated − exact", percent(ltb.difference), _difference_note(ltb)),
        ("lambda_LT", "λ̄_LT", ratio(ltb.lambda_LT), ""),
        ("chi_LT", "χ_LT", ratio(ltb.chi_LT), f"curve {ltb.curve}, §{ltb.method}"),
        ("M_b_Rd", "M_b,Rd", U.show("moment", ltb.M_b_Rd), ""),
        ("utilisation", "M_Ed / M_b,Rd", _utilisation_text(ltb.utilisation), "LTB utilisation"),
    ]
    method = method_text(ltb)
    aisc = getattr(ltb, "aisc", None)
    if aisc is not None:
        short, long = _CLAUSES.get(getattr(aisc, "clause", "F2"), _CLAUSES["F2"])
        rows.append(("aisc", f"M_n, AISC 360-16 {short}", U.show("moment", aisc.M_n), _aisc_note(ltb, U)))
        method += f"; AISC 360-16 {long} with C_b by eq. (F1-1)"
    return LtbWords(
        applies=True,
        reason="",
        settings=settings,
        rows=rows,
        method=method,
        sources=sources,
        utilisation=float(ltb.utilisation),
        caution=caution,
        headline=f"LTB {_utilisation_text(ltb.utilisation)} (χ_LT {ratio(ltb.chi_LT)}, "
        f"M_cr {_moment(U, ltb.M_cr)})",
    )
