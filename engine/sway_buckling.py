r"""In-plane flexural buckling on a first mode that may turn as a rigid body, in the second-order route.

The second-order route checks the cross-section on the exact second-order forces with the code's bow. Where
an end of the member can translate in the plane analysed (free, guided or on a translational spring) its
first mode may be (nearly) a rigid tilt on the support: the bow then carries almost no curvature, the moment
stays small up to the critical load, and the cross-section check never reaches 1 while the displacement and
the support's force grow without bound. A hinge inside the member does the same (its pieces turn about it;
held by a spring or a foundation, the first mode kinks there without curvature), and so may a foundation. An
independent audit found a pinned HEB 200 on a 200 kN/m spring (minor axis, 3 m) passing at 0.97·Pcr1 with
utilisation 0.35, and its capacity read as Pcr1 = 600 kN, where the code's member check with the same N_cr
gives χ·A·f_y = 480 kN (25 % lower); a foundation, a member stepped in section (where only this route
applies), a hinge on a spring and a custom section read the same way.

EN 1993-1-1 §5.2.2(8) (from memory) allows the stability of a member to be checked as an equivalent member
with the buckling length of the global buckling mode. So where a piece may turn (:func:`may_tilt`), the
route counts

.. math::

    \frac{N_{Ed}}{N_{b,Rd}}, \qquad N_{b,Rd} = \frac{\chi A f_y}{\gamma_{M1}}, \qquad
    \bar\lambda = \sqrt{\frac{A f_y}{P_{cr,1}}}

(eqs. (6.46)–(6.49), from memory; :math:`A_{eff}` for a section that is class 4 in uniform compression), with
:math:`P_{cr,1}` the exact first critical load of that plane (springs, restraints, steps and the foundation
included) and χ for the section's curve about the plane's axis (Table 6.2; curve d, the lowest, for a
custom section). A member stepped in section takes each segment's section with the member's
:math:`P_{cr,1}` and keeps the largest (common practice, no source). Steel only; another material keeps
the elastic bound N/Pcr1 of the check. The force in a spring or the ground is not checked: the cautions say
so.
"""

from __future__ import annotations

import math

from engine import codes
from engine.classification import area_in_compression
from engine.design.en_member import curve_of
from engine.member import segments_of
from engine.out_of_plane import sways

__all__ = ["SOURCE", "TERM", "may_tilt", "term"]

#: The second-order route's term code.
TERM = "sway-buckling"

SOURCE = (
    "EN 1993-1-1:2005 §5.2.2(8) and §6.3.1.1–6.3.1.2, eqs. (6.46)–(6.49), N_cr the exact first critical "
    "load of the plane analysed; curve by Table 6.2 (all from memory)"
)


def _planes(result) -> list:
    """``(case of the plane, its result)`` of each plane analysed."""
    second = getattr(result, "second_plane", None)
    return [(result.case, result)] + ([] if second is None else [(second.case, second)])


def may_tilt(case) -> bool:
    """Whether a piece of the member may turn as a rigid body in its first mode: an end free to translate
    (free, guided or a translational spring), a hinge inside (its pieces turn about it; held by a spring, the
    first mode kinks there without curvature), or a foundation."""
    hinged = any(getattr(r, "hinge", False) for r in getattr(case, "restraints", ()) or ())
    return sways(case) or hinged or bool(case.foundation)


def _support(case) -> str:
    """Why the term is counted: ``"spring"`` (a translational spring at an end or inside), ``"foundation"``,
    ``"free"`` (an end free or guided, or a hinge inside), or ``"stepped"`` (a member stepped in section that
    nothing lets turn: no equivalent-member route applies to it)."""
    if not may_tilt(case):
        return "stepped"  # counted because no equivalent-member route applies to a stepped member
    springs = [end.translation for end in (case.left, case.right)]
    springs += [r.translation for r in getattr(case, "restraints", ()) or ()]
    if any(isinstance(t, (int, float)) and not isinstance(t, bool) for t in springs):
        return "spring"
    return "foundation" if case.foundation else "free"


def term(result) -> tuple | None:
    """``(TERM, N/N_b,Rd, facts)`` of the plane analysed whose first mode can sway and gives the largest
    value; None where no plane can sway, the member is not in compression, or nothing has a curve (another
    material, a custom section)."""
    N = float(result.axial_force)
    material = result.material
    if not N > 0.0 or material is None or material.kind != "steel":
        return None
    found = None
    for case, plane in _planes(result):
        # a member stepped in section too: no equivalent-member route is applied to it (the bow's plastic
        # check alone overshot χ·A·f_y by up to 2.5 %, an independent audit)
        if not (may_tilt(case) or segments_of(case)) or plane.section is None:
            continue
        pcr = float(plane.critical_loads[0])
        if not (math.isfinite(pcr) and pcr > 0.0):
            continue
        segments = segments_of(case)
        pieces = [(s.section, s.material) for s in segments] or [(plane.section, material)]
        for section, steel in pieces:
            # a custom section: curve d, the lowest (as engine.buckling_interaction reads it)
            curve = "d" if section.shape == "custom" else curve_of(section, steel)[0]
            if curve is None:  # pragma: no cover - every steel shape but custom has a curve
                continue
            area = area_in_compression(section, steel)
            lam = codes.slenderness(area, steel.fy, pcr)
            chi = codes.reduction_factor(lam, curve)
            resistance = chi * area * steel.fy / case.check.gamma_M1
            value = N / resistance if resistance > 0.0 else math.inf
            if found is None or value > found[1]:
                facts = {
                    "sway_axis": section.axis,
                    "sway_N_cr": pcr,
                    "sway_lambda": lam,
                    "sway_chi": chi,
                    "sway_curve": curve,
                    "sway_N_b_Rd": resistance,
                    "sway_effective": area < section.A,
                    "sway_support": _support(case),
                }
                found = (TERM, value, facts)
    return found
