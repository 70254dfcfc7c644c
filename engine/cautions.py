"""Cautions: where this elastic, single-member analysis stops, as structured objects.

Each caution has a level (``info``, ``warning`` or ``danger``), a short identifier of strutscope's own, a
message in words and the source of the rule it applies. The general caution is always first.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from engine.codes import ALPHA_CR_SOURCE
from engine.deep_sections import deep_hollow, deep_solid, stronger_axis_named_minor
from engine.material_cautions import material_cautions
from engine.shear_buckling import web_shear_caution

__all__ = [
    "Caution",
    "GENERAL",
    "LEVELS",
    "NEAR_CRITICAL_RATIO",
    "PLANE_CODES",
    "assess",
    "merge_plane_cautions",
]

LEVELS = ("info", "warning", "danger")


@dataclass(frozen=True, kw_only=True)
class Caution:
    """One caution.

    Attributes
    ----------
    level : str
        ``"info"``, ``"warning"`` or ``"danger"``.
    code : str
        strutscope's own short identifier, stable between versions (for filters and tests).
    message : str
        What holds and what to do about it, with the numbers.
    source : str
        The rule's source, "from memory" where the clause number is recalled.
    values : dict
        The facts the message quotes, in SI (m, N, N·m, or a plain number or word): what an application needs
        to word the caution in its own units (``app/report`` does). ``message`` is the engine's wording in SI.
    """

    level: str
    code: str
    message: str
    source: str
    values: dict = field(default_factory=dict, compare=False, hash=False)


GENERAL = Caution(
    level="info",
    code="scope",
    message=(
        "Elastic analysis of one member in one or two uncoupled planes. Not a full code check: "
        "torsion, non-symmetric sections, patch loading of a slender web and connections are not checked; "
        "lateral-torsional buckling and class 4 sections are checked unless a caution says otherwise. The "
        "loads are taken as "
        "given (load "
        "cases, where given, are combined by the rule the case names; the factors are the engineer's). Check "
        "the results against your local codes and have them reviewed by a licensed engineer."
    ),
    source="strutscope's scope (common practice, no source)",
)

_UNCLASSIFIED = Caution(
    level="warning",
    code="section-class",
    message=(
        "Section class and local buckling are not checked for this section and material: its plates are "
        "assumed able to reach the stresses used (class 1 or 2 for the plastic check, class 3 for the "
        "elastic one)."
    ),
    source="EN 1993-1-1:2005 §5.5 and Table 5.2; AISC 360-16 Table B4.1",
)


#: N/Pcr1 from which a stable result is marked as near the critical load (a danger caution, and a warning
#: badge on the page). At 0.9 the moments are amplified about 10 times, and a 10 % error in EI or in the
#: critical load (a cracked or yielding part, a support softer than assumed) reaches instability: the result
#: no longer deserves trust without a check of those inputs. Common practice, no source.
NEAR_CRITICAL_RATIO = 0.9


def _web_shear_cautions(pairs, axis, check, gamma_M1) -> list:
    """A web slender in shear (EN 1993-1-5 §5): its V_b,Rd is checked (:mod:`engine.shear_buckling`); the
    first of the (section, material) ``pairs`` (a stepped member's segments) that has one."""
    found = (web_shear_caution(s, m, axis, check.shear, gamma_M1) for s, m in pairs) if check else ()
    first = next((f for f in found if f is not None), None)
    return [] if first is None else [Caution(**first)]


def _class_cautions(check) -> list:
    """The section class of EN 1993-1-1 Table 5.2: a warning when not classified, a danger for class 4."""
    found = None if check is None else check.section_class
    if found is None:
        return [_UNCLASSIFIED]
    if found.effective:
        area = "" if found.A_eff is None else "the effective area of EN 1993-1-5 §4.4 for the axial force, "
        bent = found.bending_class is not None and found.bending_class <= 3
        modulus = "W_eff = W_el (class 1 to 3 in bending alone)" if bent else "W_eff (EN 1993-1-5 §4.3)"
        message = (
            f"The section is {found.describe()}. It is checked with effective properties: {area}{modulus} "
            "for bending, EN 1993-1-1 eq. (6.44) with e_N = 0 (doubly symmetric), and the equivalent member "
            "by its class 3 rules, lateral-torsional buckling with W_eff too. Local buckling of the "
            "effective section under the combined stresses (EN 1993-1-5 §4.6) is not checked."
        )
        source = "EN 1993-1-1:2005 §6.2.9.3 eq. (6.44), EN 1993-1-5:2006 §4.3–4.4 (clauses from memory)"
        values = {"A_eff": found.A_eff, "A": found.area, "W_eff": found.W_eff}
        return [
            Caution(
                level="warning",
                code="section-class-4-effective",
                message=message,
                source=source,
                values=values,
            )
        ]
    if found.klass == 4:
        return [
            Caution(
                level="danger",
                code="section-class-4",
                message=(
                    f"The section is {found.describe()}: local buckling governs, and the "
                    "gross-section result is not valid (the utilisation is shown as unbounded). "
                    "Effective properties (EN 1993-1-5) are not computed: choose a stockier "
                    "section or check it by other means."
                ),
                source=found.source,
            )
        ]
    if found.A_eff is not None:
        return [
            Caution(
                level="info",
                code="section-effective-area",
                message=(
                    f"The section is {found.describe()}. Its resistance to the axial force, in the "
                    "cross-section and in the buckling checks, uses the effective area of EN 1993-1-5 §4.4 "
                    "for uniform compression; its bending resistance uses the class in bending and "
                    "compression (α from N)."
                ),
                source="EN 1993-1-1:2005 §6.2.2.5 and EN 1993-1-5:2006 §4.4 (clauses from memory)",
                values={"A_eff": found.A_eff, "A": found.area},
            )
        ]
    # Classes 1 to 3 are reported with the member check (check.section_class); class 3 with the plastic method
    # adds the check's own note that the elastic check was used.
    return []


def _out_of_plane_cautions(found, P: float) -> list:
    """Flexural buckling about the other axis (EN 1993-1-1 §6.3.1): a danger above 1, a note when not made
    (and a danger when, not made, N exceeds the elastic critical load about that axis)."""
    if found is None:
        return []
    if not found.checked:
        restrained = found.reason.startswith("restrained")
        message = f"Out-of-plane flexural buckling ({found.axis} axis): {found.reason}."
        values = {}
        if found.N_cr is not None:  # the elastic bound counts in the member check (engine.out_of_plane)
            message += (
                f" Its elastic critical load, N_cr = {found.N_cr * 1e-3:.6g} kN (L_cr = "
                f"{found.buckling_length:.3f} m), bounds any code's resistance: N/N_cr = "
                f"{(found.elastic_utilization or 0.0):.3f} counts in the utilisation as a bound, and the "
                "code's check is still to be made."
            )
            values = {**found.facts(), "reason": found.reason}
        out = [
            Caution(
                level="info" if restrained else "warning",
                code="out-of-plane-not-checked",
                message=message,
                source=found.source,
                values=values,
            )
        ]
        if found.N_cr is not None and P > found.N_cr:
            out.append(
                Caution(
                    level="danger",
                    code="out-of-plane-buckling",
                    message=(
                        f"N = {P * 1e-3:.6g} kN exceeds the elastic critical load about the {found.axis} "
                        f"axis, N_cr = {found.N_cr * 1e-3:.6g} kN (L_cr = {found.buckling_length:.3f} m): "
                        "the member buckles out of the plane analysed. Brace it or choose a larger section."
                    ),
                    source="Euler; Timoshenko & Gere (1961) ch. 2",
                    values=found.facts(),
                )
            )
        return out
    extra = []
    if found.note:
        extra.append(
            Caution(level="warning", code="out-of-plane-length", message=found.note, source=found.source)
        )
    if found.utilization <= 1.0:
        return extra + [
            Caution(
                level="info",
                code="out-of-plane-checked",
                message=(
                    f"Out-of-plane flexural buckling ({found.axis} axis) checked: "
                    f"N/N_b,Rd = {found.utilization:.3f} <= 1."
                ),
                source="EN 1993-1-1:2005 §6.3.1 (from memory)",
                values=found.facts(),
            )
        ]
    if found.utilization > 1.0:
        force = found.utilization * found.N_b_Rd
        beyond = (
            f" N = {force * 1e-3:.6g} kN exceeds even the elastic critical load about that axis."
            if found.N_cr is not None and force > found.N_cr
            else ""
        )
        return extra + [
            Caution(
                level="danger",
                code="out-of-plane-buckling",
                message=(
                    f"N/N_b,Rd = {found.utilization:.3f} > 1: the member buckles out of the "
                    f"plane analysed, {found.describe()}.{beyond} Brace it (a shorter out-of-plane "
                    "buckling length) or choose a larger section."
                ),
                source=found.source,
                values=found.facts(),
            )
        ]
    return extra  # pragma: no cover - a NaN utilisation


#: Cautions about one plane's own analysis: a two-plane case keeps the second plane's even when the first
#: plane has one with the same words.
PLANE_CODES = (
    "at-critical-load",
    "beyond-critical-load",
    "near-critical-load",
    "second-order-matters",
    "slender",
    "lateral-torsional-buckling",
    "deflection",
    "deflection-basis",
    "bow-below-code",
    "no-bow",
    "bow-opposes-load",
    "bow-shape",
)


def merge_plane_cautions(first, second, axis: str) -> tuple:
    """The cautions of a two-plane case: the first plane's, then the second plane's that are about that
    plane (:data:`PLANE_CODES`) or not already there, most severe first.

    The second plane's get ``values["plane"] = 2`` and ``values["axis"]`` (the axis it bends about, for the
    app to word) and their message opens with the plane. Its general caution and its own strength check's
    ``overstressed`` (the first plane's list has the two-plane check's) are left out.
    """
    seen = {(c.code, c.message) for c in first}
    out = list(first)
    for caution in second:
        if caution.code in ("scope", "overstressed"):
            continue
        if caution.code not in PLANE_CODES and (caution.code, caution.message) in seen:
            continue
        out.append(
            Caution(
                level=caution.level,
                code=caution.code,
                message=f"Second plane (bending about the {axis} axis): {caution.message}",
                source=caution.source,
                values={**caution.values, "plane": 2, "axis": axis},
            )
        )
    order = {"danger": 0, "warning": 1, "info": 2}
    return tuple(sorted(out, key=lambda c: order[c.level]))


_CRACKING = ("concrete", "masonry", "brick", "block", "stone", "glass")


def assess(
    *,
    P,
    pcr1,
    alpha_cr_limit,
    status,
    slenderness,
    section,
    material,
    axis,
    check,
    bow,
    service=None,
    gamma_M1: float = 1.0,
    segments: tuple = (),
) -> list:
    """The cautions for one solved case, most severe first; the general caution is always there.

    Parameters
    ----------
    P : float
        Axial force [N], compression positive.
    pcr1 : float
        First critical load [N].
    alpha_cr_limit : float
        :func:`engine.codes.alpha_cr_limit`: 10 for the elastic global analysis strutscope makes (15 would be
        for a plastic global analysis, EN 1993-1-1 §5.2.1(3), whatever the cross-section check).
    status : str
        The result's status.
    slenderness : float or None
        K·L/i [-], None without a section.
    section, material : Section or None, Material or None
    axis : str
        ``"major"`` or ``"minor"``.
    check : MemberCheck or None
        The member check, when a section and material are given.
    bow : dict
        ``amplitude`` [m] used, ``code_amplitude`` [m] or None, ``opposes_load`` (bool: the bow used is the
        favourable way, which the solve found by reversing it), ``shape``, ``notes``.
    service : ServiceCheck or None
        The deflection check (loads as given, no bow).
    gamma_M1 : float
        γ_M1 of the check (the shear buckling resistance of a slender web, :mod:`engine.shear_buckling`).
    segments : tuple
        (section, material) of each segment of a member stepped in section (its webs are each looked at).
    """
    out = [GENERAL]
    alpha_cr = pcr1 / P if P > 0 else float("inf")
    if status == "critical":
        out.append(
            Caution(
                level="danger",
                code="at-critical-load",
                message="The axial force equals an elastic critical load: no equilibrium exists.",
                source="Euler; Timoshenko & Gere (1961) ch. 2",
            )
        )
    elif status == "unstable":
        out.append(
            Caution(
                level="danger",
                code="beyond-critical-load",
                message=(
                    f"The axial force is {P / pcr1:.3g} times the first critical load: the member "
                    "buckles before it carries it. The curves shown are the unstable linear "
                    "solution."
                ),
                source="Euler; Timoshenko & Gere (1961) ch. 2",
            )
        )
    elif P > 0 and P / pcr1 >= NEAR_CRITICAL_RATIO:
        out.append(
            Caution(
                level="danger",
                code="near-critical-load",
                message=(
                    f"The axial force is {P / pcr1:.3g} times the first critical load: the moments are "
                    f"about {1.0 / (1.0 - P / pcr1):.3g} times the first-order ones, and an error of "
                    f"{100.0 * (1.0 - P / pcr1):.3g} % in the stiffness EI or in the critical load makes "
                    "the member buckle. Check EI, the supports and the effective length before using "
                    "these results."
                ),
                source="Timoshenko & Gere (1961) ch. 1 (amplification 1/(1 − N/Pcr1)); threshold "
                "common practice, no source",
            )
        )
    if status == "stable" and P > 0 and alpha_cr < alpha_cr_limit:
        out.append(
            Caution(
                level="warning",
                code="second-order-matters",
                message=(
                    f"α_cr = Pcr1/N = {alpha_cr:.3g} < {alpha_cr_limit:g} (the limit "
                    "for an elastic global analysis): second-order effects must be taken "
                    "into account (this analysis includes them)."
                ),
                source=ALPHA_CR_SOURCE,
                values={"alpha_cr": alpha_cr, "limit": alpha_cr_limit},
            )
        )
    if P < 0:
        out.append(
            Caution(
                level="info",
                code="tension",
                message=(
                    "The member is in tension: it does not buckle in flexure, and the axial force "
                    "reduces the bending moments (lateral-torsional buckling still applies)."
                ),
                source="Timoshenko & Gere (1961) ch. 1 (tension beam-columns)",
            )
        )
    if slenderness is not None:
        limit = 200.0 if P >= 0 else 300.0
        if slenderness > limit:
            kind = "compression" if P >= 0 else "tension"
            out.append(
                Caution(
                    level="warning",
                    code="slender",
                    message=(
                        f"Slenderness K·L/i = {slenderness:.0f} exceeds the {limit:.0f} recommended "
                        f"for members in {kind}."
                    ),
                    source="AISC 360-16 §E2 and §D1 user notes (recommendations; from memory)",
                )
            )
    if section is not None:
        # A solid rectangle deeper than wide buckles laterally too; the member check replaces this warning
        # wherever it makes the lateral-torsional buckling check (steel).
        if (section.open_section or deep_solid(section) or deep_hollow(section)) and axis == "major":
            what, part = ("an open section", "flange")
            if deep_solid(section):
                what, part = ("a solid section deeper than wide", "edge")
            elif deep_hollow(section):
                what, part = ("a rectangular hollow section deeper than wide", "flange")
            out.append(
                Caution(
                    level="warning",
                    code="lateral-torsional-buckling",
                    message=(
                        f"Major-axis bending of {what}: lateral-torsional buckling is not checked. Check it, "
                        f"or make sure the compression {part} is restrained."
                    ),
                    source="EN 1993-1-1:2005 §6.3.2; AISC 360-16 Chapter F; EN 1995-1-1 §6.3.3",
                )
            )
        found = stronger_axis_named_minor(section, axis)  # the LTB check would miss it: a danger caution
        out.extend([] if found is None else [Caution(**found)])
        out.extend(_class_cautions(check))
        pairs = segments or ((section, material),)
        out.extend(_web_shear_cautions(pairs, axis, check, gamma_M1))
    out.extend(Caution(**c) for c in material_cautions(material, check is not None, section, P, axis))
    if material is not None:
        name = (material.name or "").lower()
        if material.kind == "custom" and any(word in name for word in _CRACKING):
            out.append(
                Caution(
                    level="danger",
                    code="cracking-material",
                    message=(
                        f"'{material.name}' cracks or crushes: this linear elastic analysis does not "
                        "apply to concrete, masonry or other cracking materials."
                    ),
                    source="common practice, no source",
                )
            )
        elif material.kind == "custom":
            out.append(
                Caution(
                    level="info",
                    code="custom-material",
                    message=(
                        "A custom material is taken as linear elastic up to its given strength. "
                        "Concrete, masonry and other cracking materials are out of scope."
                    ),
                    source="common practice, no source",
                )
            )
        if material.kind == "timber":
            out.append(
                Caution(
                    level="warning",
                    code="timber-factors",
                    message=(
                        "Timber strengths are characteristic values: k_mod, γ_M, size and "
                        "service-class factors are not applied unless you set γ_M0 to include them."
                    ),
                    source="EN 1995-1-1 §2.4 and §3.2 (from memory)",
                )
            )
    if check is not None:
        if check.in_plane_utilization > 1.0 and check.valid:
            out.append(
                Caution(
                    level="danger",
                    code="overstressed",
                    message=(
                        f"Strength utilisation {check.in_plane_utilization:.3f} > 1 "
                        f"({check.in_plane_kind}): the member does not work as analysed."
                    ),
                    # check.source is the governing check's, which may be the out-of-plane one
                    source=check.source
                    if check.kind == check.in_plane_kind
                    else "EN 1993-1-1:2005 §6.2 (clause numbers from memory)",
                )
            )
        out.extend(_service_cautions(service))
        if P > 0:
            out.extend(_out_of_plane_cautions(check.out_of_plane, P))
        for note in check.notes:
            source = check.in_plane_source or check.source  # the notes are about the in-plane checks
            out.append(Caution(level="info", code="check-note", message=note, source=source))
    else:  # a member given by EI alone: its deflection check all the same
        out.extend(_service_cautions(service))
    if (
        P > 0
        and bow.get("code_amplitude") is not None
        and abs(bow["amplitude"]) < bow["code_amplitude"] * (1 - 1e-9)
    ):
        out.append(
            Caution(
                level="warning",
                code="bow-below-code",
                message=(
                    f"The initial bow {abs(bow['amplitude']) * 1e3:.2f} mm is smaller than the code "
                    f"value {bow['code_amplitude'] * 1e3:.2f} mm ({bow['code_label']})."
                ),
                source=bow["code_source"],
                values={
                    "amplitude": abs(bow["amplitude"]),
                    "code_amplitude": bow["code_amplitude"],
                    "code_label": bow["code_label"],
                },
            )
        )
    elif P > 0 and bow.get("code_amplitude") is None and bow["amplitude"] == 0.0:
        out.append(
            Caution(
                level="warning",
                code="no-bow",
                message=(
                    "No initial bow in a compressed member: codes require an equivalent "
                    "imperfection (EN 1993-1-1 Table 5.1, or AISC L/1000). Without one the analysis does "
                    "not see buckling until Pcr1: N/Pcr1 counts in the utilisation as a bound, which is "
                    "not the code's buckling check."
                ),
                source="EN 1993-1-1:2005 §5.3.2; AISC 303-16 §7.13.1.1",
            )
        )
    if P != 0 and bow.get("opposes_load"):
        out.append(
            Caution(
                level="warning",
                code="bow-opposes-load",
                message=(
                    "The initial bow points the favourable way at this axial force: "
                    "reversed, it gives a larger utilisation or moment. Codes take the "
                    "imperfection in the unfavourable direction: set the direction to "
                    "automatic ('load'), which solves both and keeps the worse."
                ),
                source="EN 1993-1-1:2005 §5.3.2(1) (from memory)",
            )
        )
    for note in bow.get("notes", ()):
        out.append(
            Caution(
                level="info",
                code="bow-shape",
                message=note,
                source="EN 1993-1-1:2005 §5.3.2(11) (from memory)",
            )
        )
    order = {"danger": 0, "warning": 1, "info": 2}
    return sorted(out, key=lambda c: order[c.level])  # stable: the general caution leads the infos


def _service_cautions(service) -> list:
    """The deflection check's cautions: over the limit (warning), and what it is a check of (info)."""
    out: list = []
    if service is None:
        return out
    if service.utilization > 1.0:
        out.append(
            Caution(
                level="warning",
                code="deflection",
                message=(
                    f"Deflection {abs(service.deflection) * 1e3:.1f} mm exceeds the "
                    f"limit span/{service.limit:g} = {service.allowed * 1e3:.1f} mm "
                    "(service check on the loads as given, without the bow)."
                ),
                source=service.source,
                values={
                    "deflection": abs(service.deflection),
                    "limit": service.limit,
                    "allowed": service.allowed,
                },
            )
        )
    out.append(
        Caution(
            level="info",
            code="deflection-basis",
            message=(
                f"Deflection utilisation {service.utilization:.3f}: a service check "
                "apart from the strength one, on the loads as given and without the "
                "bow. Enter service loads for it."
            ),
            source="EN 1990 §3.4 and §6.5 serviceability (from memory)",
        )
    )
    return out
