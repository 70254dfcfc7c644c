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

__all__ = ["not_a_code_check"]

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
