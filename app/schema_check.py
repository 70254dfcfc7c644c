"""The ``check`` object of the case file's JSON Schema (:mod:`app.schema`): the member check's settings, the
routes and, since issue 15, ``check.ltb`` (lateral-torsional buckling). The names are written out here so the
schema reads on its own; tests/app/test_schema.py compares them with the engine's."""

from __future__ import annotations

from typing import Any

__all__ = ["CHECK_METHODS", "CHI_METHODS", "LATERAL_ENDS", "LOAD_POSITIONS", "WARPING_ENDS", "check_schema"]

CHECK_METHODS = ("elastic", "plastic")
LOAD_POSITIONS = ("destabilising", "shear-centre", "stabilising")
LATERAL_ENDS = ("supports", "fork", "fixed")
WARPING_ENDS = ("free", "fixed")
CHI_METHODS = ("general", "rolled")


def _pair(allowed: tuple[str, ...], what: str, default: str) -> dict[str, Any]:
    return {
        "type": "array",
        "items": {"enum": list(allowed)},
        "minItems": 2,
        "maxItems": 2,
        "description": f"{what} at [x = 0, x = L]: " + " or ".join(repr(a) for a in allowed) + f". Default "
        f"[{default!r}, {default!r}].",
    }


def ltb_schema(closed) -> dict[str, Any]:
    """``check.ltb``: where the loads act over the depth, the end conditions and the χ_LT clause."""
    return closed(
        {
            "load_position": {
                "enum": list(LOAD_POSITIONS),
                "description": "Where the transverse loads act: 'destabilising' (at the flange they come "
                "from, +h/2 from the shear centre; default, the conservative choice), 'shear-centre' or "
                "'stabilising' (the other flange, −h/2).",
            },
            "lateral_ends": _pair(
                LATERAL_ENDS,
                "Lateral condition ('supports': a fork where the end's support holds it across the plane of "
                "bending, free where it moves; 'fork': held, free to turn about the minor axis; 'fixed')",
                "supports",
            ),
            "warping_ends": _pair(WARPING_ENDS, "Warping condition", "free"),
            "chi_method": {
                "enum": list(CHI_METHODS),
                "description": "χ_LT by EN 1993-1-1 §6.3.2.2 ('general'; default) or §6.3.2.3 ('rolled': "
                "rolled or equivalent welded I sections).",
            },
            "restrained": {
                "type": "boolean",
                "description": "True: the compression flange is restrained along the member (by a slab or "
                "sheeting), so lateral-torsional buckling is prevented (χ_LT = 1). Default false.",
            },
        },
        description="Lateral-torsional buckling of the member about its major axis (EN 1993-1-1 §6.3.2). "
        "Default: destabilising loads, lateral ends by support, warping free, §6.3.2.2, not restrained.",
    )


def check_schema(closed, number) -> dict[str, Any]:
    """The ``check`` object; `closed` and `number` are :mod:`app.schema`'s builders."""
    return closed(
        {
            "method": {
                "enum": list(CHECK_METHODS),
                "description": "Cross-section resistance to N and M: 'elastic' (any section) or "
                "'plastic' (EN 1993-1-1 §6.2.9.1 for I/H and hollow sections). "
                "Default 'elastic'.",
            },
            "gamma_M0": number("Partial factor γ_M0 [-], 0.5 to 3; default 1.0", minimum=0.5, maximum=3),
            "gamma_M1": number("Partial factor γ_M1 [-], 0.5 to 3; default 1.0", minimum=0.5, maximum=3),
            "deflection_limit": number(
                "n of the deflection limit span/n [-], 1 to 10000; default 250", minimum=1, maximum=10000
            ),
            "routes": {
                "type": "array",
                "items": {"enum": ["second-order", "en-member", "aisc"]},
                "minItems": 1,
                "uniqueItems": True,
                "description": "The routes of the member check that set the headline utilisation (the "
                "largest of them): 'second-order' (exact analysis with the code's bow, then cross-sections), "
                "'en-member' (EN 1993-1-1 §6.3.3, eqs. (6.61)/(6.62)), 'aisc' (AISC 360-16 §E3 and §H1.1). "
                "Default ['second-order', 'en-member']; every route is shown.",
            },
            "annex": {
                "enum": ["B", "A"],
                "description": "Interaction factors of the 'en-member' route: 'B' (EN 1993-1-1 Annex B, "
                "method 2; default) or 'A' (Annex A, method 1).",
            },
            "aisc_method": {
                "enum": ["LRFD", "ASD"],
                "description": "The 'aisc' route's factors: 'LRFD' (resistance factors φ; default) or 'ASD' "
                "(safety factors Ω).",
            },
            "aisc_analysis": {
                "enum": ["effective-length", "direct"],
                "description": "The 'aisc' route's method of analysis: 'effective-length' (Appendix 7: the "
                "nominal stiffness, K from the exact critical load; default) or 'direct' (§C2.3: every "
                "stiffness at 0.8·τ_b, the notional load 0.002·P_r, L_c = L).",
            },
            "ltb": ltb_schema(closed),
        },
        description="How the member is checked (needs a section and a material to apply).",
    )
