"""The caution of a member whose material has no code check here (timber, aluminium, a custom material).

The routes of EN 1993-1-1 and AISC 360-16 are for steel; for another material the engine reports the stress
over the unfactored strength and elastic bounds (N/N_cr, M/M_cr, which no code's resistance exceeds), so the
utilisation can be well below that material's code check (an independent check found an aluminium CHS at
0.93 where EN 1999-1-1's flexural buckling gives 1.13, and a glulam post at 0.52 against about 0.82 by
EN 1995-1-1). The batch marked such a value "not a code check" (``utilization_basis``); the page, the
printed summary and ``solve --json`` showed it as any other. A danger caution now says it wherever the result
is shown, and ``--strict`` fails on it.
"""

from __future__ import annotations

__all__ = [
    "HIGH_STRENGTH_WORDS",
    "custom_compression",
    "high_strength",
    "material_cautions",
    "not_a_code_check",
]

#: What a check of the material's code would add, and the code, by material kind.
_MISSING = {
    "aluminium": (
        "the flexural buckling reduction χ, γ_M1 and the softening of heat-affected zones",
        "EN 1999-1-1",
    ),
    "timber": (
        "k_c (buckling), k_crit, k_mod, γ_M, the size and service-class factors, and shear (f_v,k is not "
        "checked at all)",
        "EN 1995-1-1",
    ),
    "custom": (
        "that material's buckling reduction and partial factors, and its own shear strength (shear is "
        "checked as for steel, A_v·f_y/√3)",
        "the material's design code",
    ),
}


def not_a_code_check(material, has_check: bool) -> dict | None:
    """The fields of the caution ``not-a-code-check`` (:class:`engine.cautions.Caution`) for a member of
    timber, aluminium or a custom material with a strength check; None for steel or without a check."""
    kind = getattr(material, "kind", None)
    if not has_check or kind not in _MISSING:
        return None
    missing, code = _MISSING[kind]
    tension = ""
    if kind in ("timber", "custom") and getattr(material, "f_t", None) is None:
        tension = " No tension strength f_t is given: tension is checked against f_c."
    if kind == "timber" and getattr(material, "E_mean", None) is None:
        tension += (
            " No E_0,05 is given: the critical loads use the E given, and bound the code's resistance only "
            "if that is E_0,05."
        )
    return {
        "level": "danger",
        "code": "not-a-code-check",
        "message": (
            f"Not a code check for this material ({kind}): the utilisation is the stress over the unfactored "
            f"strength and elastic bounds (N/N_cr, M/M_cr), without {missing}. A utilisation below 1 is not "
            f"a pass: check the member to {code}.{tension}"
        ),
        "source": "strutscope's scope (common practice, no source)",
        "values": {"kind": kind},
    }


#: EN 1993-1-1 covers steels up to S460 (§1.1(2) and Table 3.1, from memory); EN 1993-1-12 extends its rules
#: to S700 with added requirements; above that no Eurocode for steel structures applies.
_EN_1993_1_1_TOP = 460e6
_EN_1993_1_12_TOP = 700e6


#: The words after "f_y = ... MPa" of the caution ``high-strength-steel``, by level (the app words the stress
#: in the display units: app.report.words).
HIGH_STRENGTH_WORDS = {
    "warning": "is above EN 1993-1-1's grades (up to S460): EN 1993-1-12 extends its rules to S700 with "
    "added requirements (ductility, elastic global analysis, some buckling curves) not checked here.",
    "danger": "is above every Eurocode steel (EN 1993-1-12 stops at S700): the checks here are EN 1993-1-1's "
    "and AISC 360-16's as written, not a code check for this steel.",
}


def high_strength(material, has_check: bool) -> dict | None:
    """The caution of a steel stronger than EN 1993-1-1's grades (``f_y`` above 460 MPa): a warning up to
    700 MPa (EN 1993-1-12's range), a danger above (no Eurocode); None otherwise. An audit found a custom
    steel of 1500 MPa checked as a plain code check without a word."""
    if not has_check or getattr(material, "kind", None) != "steel" or not material.fy > _EN_1993_1_1_TOP:
        return None
    level = "warning" if material.fy <= _EN_1993_1_12_TOP else "danger"
    return {
        "level": level,
        "code": "high-strength-steel",
        "message": f"f_y = {material.fy / 1e6:.0f} MPa {HIGH_STRENGTH_WORDS[level]}",
        "source": "EN 1993-1-1:2005 §1.1(2); EN 1993-1-12:2007 (from memory)",
        "values": {"fy": material.fy, "level": level},
    }


def _twist_unchecked(section, axis: str) -> dict | None:
    """The danger caution of a doubly symmetric open custom section in compression whose torsional buckling
    cannot be checked: no It or Iw, or bent about its minor axis (nothing bounds i0² then). An audit passed
    a cruciform at 0.577 where N/N_b,T,Rd is 1.657."""
    torsion = getattr(section, "torsion", None)
    known = torsion is not None and torsion.I_t is not None and torsion.I_w is not None
    if not section.open_section or (known and axis == "major"):
        return None
    return {
        "level": "danger",
        "code": "torsional-buckling-not-checked",
        "message": (
            "Torsional buckling of this open custom section in compression is not checked ("
            + (
                "it is bent about its minor axis: nothing is given about the other axis"
                if known
                else "give It and Iw"
            )
            + "); it can govern well below flexural buckling (a cruciform, say). A utilisation below 1 is "
            "not a pass: check it to EN 1993-1-1 §6.3.1.4 or AISC 360-16 §E4."
        ),
        "source": "EN 1993-1-1:2005 §6.3.1.4; AISC 360-16 §E4 (from memory)",
        "values": {},
    }


def custom_compression(section, material, has_check: bool, P: float, axis: str) -> dict | None:
    """The danger caution of a custom section in compression whose torsional buckling is not checked: not
    stated doubly symmetric (the default; an audit passed a single angle at 0.927 where flexural–torsional
    buckling gives about 1.15 by hand), or doubly symmetric without what the check needs
    (:func:`_twist_unchecked`); None otherwise."""
    if not has_check or not P > 0.0 or getattr(section, "shape", None) != "custom":
        return None
    if getattr(material, "kind", None) not in ("steel", "aluminium", "custom"):
        return None
    if section.doubly_symmetric:
        return _twist_unchecked(section, axis)
    return {
        "level": "danger",
        "code": "flexural-torsional-not-checked",
        "message": (
            "A custom section not stated doubly symmetric (doubly_symmetric: false, the default) is in "
            "compression: its torsional and flexural–torsional buckling (a shear centre away from the "
            "centroid: angles, channels, tees) is not checked, and can govern well below the flexural "
            "resistance. A utilisation below 1 is not a pass: check it to EN 1993-1-1 §6.3.1.4 or AISC "
            "360-16 §E4, or state doubly_symmetric: true (with It and Iw) for a doubly symmetric section."
        ),
        "source": "EN 1993-1-1:2005 §6.3.1.4; AISC 360-16 §E4 (from memory)",
        "values": {},
    }


def material_cautions(material, has_check: bool, section=None, P: float = 0.0, axis: str = "major") -> list:
    """Every caution of the material and of a custom section: :func:`not_a_code_check`,
    :func:`high_strength` and :func:`custom_compression` (their fields)."""
    found = (
        not_a_code_check(material, has_check),
        high_strength(material, has_check),
        custom_compression(section, material, has_check, P, axis),
    )
    return [c for c in found if c]
