"""The names of the routes of the member check and of their governing terms (no other import: the words of
the capacity and the routes' own module both use them)."""

from __future__ import annotations

__all__ = ["NOTES", "REASONS", "ROUTE_TERMS", "TERMS", "governing_text", "route_name", "route_setting"]

#: The routes' names; the ``{annex}`` and ``{method}`` come from the case's check settings.
_NAMES = {
    "second-order": "second order + cross-section",
    "en-member": "EN 1993-1-1 equivalent member (Annex {annex})",
    "aisc": "AISC 360-16 ({method}{analysis})",
}

#: The second-order route's own terms beside its check along the member (a capacity can stop at one).
ROUTE_TERMS = (
    "lateral-torsional",
    "buckling-interaction",
    "lateral-torsional-elastic",
    "torsional-buckling",
    "sway-buckling",
)

#: The governing terms' names, by the engine's code.
TERMS = {
    "eq-6.61": "eq. (6.61)",
    "eq-6.62": "eq. (6.62)",
    "H1-1a": "H1-1a",
    "H1-1b": "H1-1b",
    "cross-section": "cross-section",
    "shear": "shear",
    "out-of-plane": "out-of-plane buckling",
    "out-of-plane-buckling": "out-of-plane buckling",
    "out-of-plane-elastic": "out-of-plane elastic buckling, N/N_cr (a bound)",
    "in-plane-elastic": "in-plane elastic buckling, N/Pcr1 (a bound)",
    "in-plane elastic buckling": "in-plane elastic buckling, N/Pcr1 (a bound)",
    "out-of-plane elastic buckling": "out-of-plane elastic buckling, N/N_cr (a bound)",
    "buckling-interaction": "buckling with the moments, eq. (6.61)/(6.62)",
    "lateral-torsional": "lateral-torsional buckling",
    "lateral-torsional-elastic": "lateral-torsional buckling, M/M_cr (a bound)",
    "torsional-buckling": "torsional buckling, N/N_b,T,Rd",
    "sway-buckling": "in-plane buckling on the swaying first mode, N/N_b,Rd with N_cr = Pcr1",
    "flexural-buckling-y": "flexural buckling, major axis",
    "flexural-buckling-z": "flexural buckling, minor axis",
    "flexural-buckling": "flexural buckling",
    "biaxial": "biaxial cross-section",
    "elastic-buckling": "elastic buckling",
    "class-4": "class 4 section",
    "compression": "compression alone",
    "E3": "§E3 compression",
}


def route_setting(result, name: str, default: str) -> str:
    """One of the case's check settings (``annex``, ``aisc_method``), or `default` when it has none."""
    settings = getattr(getattr(result, "case", None), "check", None)
    value = getattr(settings, name, None)
    return value if isinstance(value, str) and value else default


def route_name(route, result=None) -> str:
    """A route's name, e.g. ``"EN 1993-1-1 equivalent member (Annex B)"`` (`result` gives the Annex, the
    AISC method and its analysis; without it the name has none of them); `route` a code or a RouteCheck."""
    code = getattr(route, "route", route)
    template = _NAMES.get(code, code)
    if result is None:  # no settings to name the Annex or the method by: the route alone
        return template.split(" (")[0] if "{" in template else template
    direct = route_setting(result, "aisc_analysis", "effective-length") == "direct"
    return template.format(
        annex=route_setting(result, "annex", "B"),
        method=route_setting(result, "aisc_method", "LRFD"),
        analysis=", direct analysis" if direct else "",
    )


def governing_text(code: str) -> str:
    """A governing term's name, e.g. ``"eq. (6.62)"``; an unknown code with its hyphens as spaces."""
    if not code:
        return ""
    return TERMS.get(code, code.replace("-", " "))


#: The route notes: code → (level, words). Every note is a caution about what the route does not cover.
NOTES = {
    "chi-LT-1": (
        "warning",
        "χ_LT = 1 taken: lateral-torsional buckling is not checked; right only where it cannot occur (a "
        "closed section, minor-axis bending, a compression flange braced along its length)",
    ),
    "LTB-not-checked": (
        "warning",
        "lateral-torsional buckling (AISC 360-16 §F2.2 or §F11.2, unbraced length L_b) is not checked",
    ),
    "aisc-shear-not-checked": ("info", "shear (Chapter G) is not checked on this route"),
    "aisc-erw-design-wall": (
        "info",
        "an ERW hollow section (ASTM A500): the design wall is 0.93 × the nominal thickness (AISC 360-16 "
        "§B4.2, from memory) in A_g, S, Z, b/t and the buckling loads; M_r grows with the lower stiffness",
    ),
    "aisc-elm-drift-limit": (
        "warning",
        "the second-order drift exceeds 1.5 × the first-order drift (1/(1 − αN/N_cr) of a swaying plane): "
        "AISC 360-16 Appendix 7's effective length method is not valid beyond that limit (from memory); "
        "choose the direct analysis method for this route",
    ),
    "aisc-out-of-plumb-in-Mr": (
        "info",
        "an end can translate: M_r holds an out-of-plumbness of 1/500 the worse way (AISC 360-16 §C2.2a, "
        "notional load 0.002·P_r, from memory), solved with the nominal stiffness, the effective length "
        "method (K from the exact critical load)",
    ),
    "aisc-direct-analysis": (
        "info",
        "the direct analysis method (AISC 360-16 §C2.3, from memory): M_r from the member without its bow, "
        "every stiffness (EI, springs, a foundation) at 0.8·τ_b, out of plumb by 1/500 the worse way where "
        "an end can translate; P_n with L_c = L unless the exact critical load is higher (§C3)",
    ),
    "aisc-notional-other-axis": (
        "info",
        "the other axis sways too (its out-of-plane buckling length exceeds the member's): H1-1 is also "
        "checked with the notional load about that axis instead, 0.002·P_r·L × B2 = 1/(1 − αP_r/P_e) from "
        "its buckling load (Appendix 7 §7.2.2, §C2.2b, Appendix 8, from memory; the loads of this plane "
        "without its tilt); the worse of the two counts",
    ),
    "aisc-noncompact": (
        "info",
        "a noncompact element: M_n by its local buckling limit (§F3.2, §F6.2, §F7, §F8.2; a noncompact I web "
        "0.7·F_y·S, §F4 not made)",
    ),
    "aisc-slender-e7": ("info", "a slender element in compression: P_n = F_cr·A_e, effective widths of §E7"),
    "aisc-tension-yielding": ("info", "tension: P_c is tension yielding, §D2(a)"),
    "en-member-no-compression": (
        "info",
        "no compression: eqs. (6.61)/(6.62) taken at N_Ed = 0 (a tension not counted as relieving) for "
        "bending about both axes, beside the cross-section checks",
    ),
    "en-member-cross-section-only": (
        "info",
        "no compression: eqs. (6.61)/(6.62) do not apply, only the cross-section checks",
    ),
    "annex-A-lambda-0": ("info", "Annex A: λ̄_0 from the critical moment taken as for χ_LT = 1"),
    "one-plane": (
        "info",
        "one bending plane: the other axis carries no moment, only the axial force (flexural buckling)",
    ),
    "out-of-plane-restrained": (
        "info",
        "buckling about the other axis is taken as prevented (as the case says)",
    ),
    "no-torsion": ("info", "torsional and flexural-torsional buckling are not checked"),
    "class-4": ("danger", "class 4 section: the route does not apply"),
    "not-steel": ("info", "not a steel member: the route does not apply"),
    "custom-section": ("info", "a custom section: the route's buckling curve is not known"),
}


#: Why a route was not applied, by the engine's code.
REASONS = {
    "section-not-classified": "the section has no class (EN 1993-1-1 Table 5.2): the route needs one",
    "section-class-4": "a class 4 section: the route does not cover effective sections",
    "custom-section": "a custom section: its buckling curve and classes are not known",
    "stepped-section": (
        "a member stepped in section: the route's tables take one section along the member (the second-order "
        "route checks each segment with its own section)"
    ),
    "slender-element-compression": "a round HSS beyond D/t = 0.45E/F_y (AISC 360-16 §E7 does not cover it)",
    "slender-element-flexure": "a slender element in flexure (AISC 360-16 §F, not covered)",
}


def plane_name(axis: str) -> str:
    """The plane named by the axis it bends about: ``"major axis (y–y)"`` or ``"minor axis (z–z)"``."""
    return "minor axis (z–z)" if axis == "minor" else "major axis (y–y)"


def other_axis(axis: str) -> str:
    """The other axis: ``"minor"`` for ``"major"`` and back."""
    return "major" if axis == "minor" else "minor"


def plane_axes(result) -> tuple[str, str]:
    """(axis of the case's own plane, axis of the second plane), e.g. ``("major", "minor")``."""
    axis = getattr(getattr(result, "case", None), "axis", None) or "major"
    return axis, other_axis(axis)
