r"""The design wall thickness of an ERW hollow section on the ``aisc`` route (AISC 360-16 §B4.2, from memory).

AISC 360-16 §B4.2 takes the design wall thickness :math:`t` of an electric-resistance-welded HSS (ASTM A500)
as 0.93 times its nominal thickness, for every property the Specification's checks use (a submerged-arc-welded
HSS, or one to ASTM A1085, keeps the nominal value). strutscope knows an HSS is ERW by its material: a
material named "ASTM A500 …" with an RHS, SHS or CHS section. The route then takes the section rebuilt with
``t = 0.93·t`` (A_g, S, Z, the wall slenderness b/t or D/t), each plane's critical load scaled by
:math:`I_{des}/I_{nom}` (the analysis ran with the nominal stiffness) and its second-order moment
:math:`M_r` grown as a single mode grows with the lower stiffness,
:math:`M_r (1 - \alpha N/N_{cr})/(1 - \alpha N/N_{cr,des})` (α = 1.6 for ASD's moment at 1.6·N), unbounded
at or above :math:`N_{cr,des}/\alpha`.
"""

from __future__ import annotations

import dataclasses
import math

from engine.sections import section_from_spec

__all__ = ["ERW_FACTOR", "design_planes", "design_section", "is_erw"]

#: AISC 360-16 §B4.2: the design wall thickness of an ERW HSS is 0.93 × nominal (from memory).
ERW_FACTOR = 0.93


def is_erw(section, material) -> bool:
    """An ASTM A500 (electric-resistance-welded) hollow section."""
    return section.shape in ("rhs", "chs") and str(material.name).startswith("ASTM A500")


def design_section(section):
    """The section rebuilt with the design wall 0.93·t."""
    dims = section.dimensions
    keys = ("h", "b") if section.shape == "rhs" else ("D",)
    spec = {"shape": section.shape, "manufacture": section.manufacture, **{k: dims[k] for k in keys}}
    spec["t"] = ERW_FACTOR * dims["t"]
    return section_from_spec(spec, section.axis)


def _grown(M: float | None, N: float, N_cr: float, N_cr_des: float, alpha: float) -> float | None:
    if M is None or N <= 0.0 or math.isinf(N_cr):
        return M
    if alpha * N >= N_cr_des:
        return math.inf
    return M * (1.0 - alpha * N / N_cr) / (1.0 - alpha * N / N_cr_des)


def design_planes(y, z, N: float, asd_alpha: float, untilted_alpha: float | None = None) -> tuple:
    """The planes ``y``, ``z`` (:class:`engine.design.en_member.Plane`) with the design wall: their sections,
    critical loads, M_second and M_asd as the module says; M_untilted grown at ``untilted_alpha`` (its
    analysis's 1 or 1.6), or kept as it is (None: the direct analysis method's, whose c holds the wall)."""
    planes = []
    for p in (y, z):
        section = design_section(p.section)
        ratio = section.I / p.section.I
        N_cr = p.N_cr * ratio
        planes.append(
            dataclasses.replace(
                p,
                section=section,
                N_cr=N_cr,
                EI=p.EI * ratio,
                M_second=_grown(p.M_second, N, p.N_cr, N_cr, 1.0),
                M_asd=_grown(p.M_asd, N, p.N_cr, N_cr, asd_alpha),
                M_untilted=(
                    p.M_untilted
                    if untilted_alpha is None
                    else _grown(p.M_untilted, N, p.N_cr, N_cr, untilted_alpha)
                ),
            )
        )
    return tuple(planes)
