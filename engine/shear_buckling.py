r"""The design shear resistance, with the shear buckling of a slender web, EN 1993-1-5:2006 §5.2–§5.3.

:math:`V_{Rd} = \min(V_{pl,Rd}, V_{b,Rd})`, :math:`V_{pl,Rd} = A_v f_y/(\sqrt3\,\gamma_{M0})` (EN 1993-1-1
eq. (6.18)). Where the web that carries the shear (an I/H's web in major-axis bending, an RHS's two walls
parallel to the shear) has :math:`h_w/t_w > 72\varepsilon/\eta` (EN 1993-1-1 §6.2.6(6), EN 1993-1-5 §5.1(2);
η = 1.2, :data:`engine.classification.WEB_SHEAR_ETA`) it buckles in shear before it yields, and

- :math:`V_{b,Rd} = V_{bw,Rd} = \chi_w f_{yw} h_w t_w / (\sqrt3\,\gamma_{M1})` (eq. (5.2)), the web's
  contribution alone: the flanges' :math:`V_{bf,Rd}` (§5.4) is left out, on the safe side;
- :math:`\bar\lambda_w = h_w / (86.4\, t_w \varepsilon)` (eq. (5.5), transverse stiffeners at the supports
  only: a member here has none in its span);
- :math:`\chi_w` of Table 5.1 with a non-rigid end post (the lower column): η for
  :math:`\bar\lambda_w < 0.83/\eta`, else :math:`0.83/\bar\lambda_w`;
- η = 1.2 up to S460, 1.0 above (§5.1(2) note; all from memory).

Past half of :math:`V_{Rd}` the checks reduce the moment resistance of the whole section by
:math:`1 - \rho`, :math:`\rho = (2V_{Ed}/V_{Rd} - 1)^2` (EN 1993-1-1 §6.2.8), here with :math:`V_{b,Rd}`
where it governs. EN 1993-1-5 §7.1 takes the reduction on the web's share only,
:math:`\bar\eta_1 + (1 - M_{f,Rd}/M_{pl,Rd})(2\bar\eta_3 - 1)^2 \le 1`; the whole section's is never smaller
(:math:`M_{f,Rd} \ge 0`), so this reading is on the safe side [derived].
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from engine.classification import WEB_SHEAR_ETA, epsilon, shear_web, web_shear_slenderness

__all__ = ["SOURCE", "WebShear", "shear_resistance", "web_shear", "web_shear_caution"]

SOURCE = (
    "EN 1993-1-5:2006 §5.2 eq. (5.2), §5.3 eq. (5.5), Table 5.1 (non-rigid end post), web contribution only "
    "(clauses from memory)"
)

#: fy above which η = 1.0 (EN 1993-1-5 §5.1(2) note, from memory) [Pa]
_ETA_GRADE = 460e6


@dataclass(frozen=True)
class WebShear:
    """The shear buckling of a slender web: V_b,Rd [N], χ_w, λ̄_w, and h_w/t_w with its limit 72ε/η (SI)."""

    V_b_Rd: float
    chi_w: float
    lambda_w: float
    ratio: float
    limit: float


def web_shear(section, material, axis: str, gamma_M1: float) -> WebShear | None:
    """The shear buckling resistance of the web that carries the shear of bending about ``axis`` (see the
    module), or None where that web is not slender in shear (or the section or material has no such rule).

    >>> from engine.materials import material_from_spec
    >>> from engine.sections import section_from_spec
    >>> plates = {"shape": "welded_i", "h": 1.0, "b": 0.3, "tw": 0.008, "tf": 0.02}
    >>> girder = section_from_spec(plates, "major")
    >>> found = web_shear(girder, material_from_spec({"name": "S355"}, 0.02), "major", 1.0)
    >>> round(found.lambda_w, 3), round(found.chi_w, 3), round(found.V_b_Rd / 1e3, 1)
    (1.683, 0.493, 754.5)
    """
    found = web_shear_slenderness(section, material, axis)
    if found is None or not found[0] > found[1]:
        return None
    ratio, limit = found
    h_w, t_w, webs = shear_web(section, axis)
    eta = WEB_SHEAR_ETA if material.fy <= _ETA_GRADE else 1.0
    lam = h_w / (86.4 * t_w * epsilon(material.fy))
    chi = eta if lam < 0.83 / eta else 0.83 / lam
    V_b = webs * chi * material.fy * h_w * t_w / (math.sqrt(3.0) * gamma_M1)
    return WebShear(V_b, chi, lam, ratio, limit)


def shear_resistance(section, material, axis: str, gamma_M0: float, gamma_M1: float) -> float:
    """V_Rd [N] of the shear of bending about ``axis``: the smaller of V_pl,Rd and, for a web slender in
    shear, V_b,Rd (see the module)."""
    V_pl = section.A_v * material.fy / (math.sqrt(3.0) * gamma_M0)
    found = web_shear(section, material, axis, gamma_M1)
    return V_pl if found is None else min(V_pl, found.V_b_Rd)


def web_shear_caution(section, material, axis: str, shear, gamma_M1: float) -> dict | None:
    """The fields of the caution ``web-shear-buckling`` (:class:`engine.cautions.Caution`) of a web slender in
    shear, ``shear`` the check's V_Ed/V_Rd at the stations; None where the web is not slender in shear. A
    warning: V_b,Rd is checked, but neither stiffeners in the span, nor the flanges' share, nor patch loading
    (EN 1993-1-5 §6) are."""
    found = web_shear(section, material, axis, gamma_M1)
    if found is None:
        return None
    ratio = float(np.max(shear)) if np.size(shear) else 0.0
    return {
        "level": "warning",
        "code": "web-shear-buckling",
        "message": (
            f"The web's h_w/t_w = {found.ratio:.1f} exceeds 72ε/η = {found.limit:.1f} (η = 1.2): it buckles "
            "in shear before it yields. The shear check takes its shear buckling resistance V_b,Rd "
            f"(EN 1993-1-5 §5.2–5.3: λ̄_w = {found.lambda_w:.3f}, χ_w = {found.chi_w:.3f}, the web alone, no "
            "stiffeners in the span, a non-rigid end post), and past half of it reduces the moment "
            f"resistance of the whole section; V_Ed/V_Rd = {ratio:.3f}. Patch loading under point loads and "
            "at the supports (EN 1993-1-5 §6) is not checked."
        ),
        "source": "EN 1993-1-1:2005 §6.2.6(6); " + SOURCE,
        "values": {
            "h_w_over_t_w": found.ratio,
            "limit": found.limit,
            "shear_utilisation": ratio,
            "V_b_Rd": found.V_b_Rd,
            "lambda_w": found.lambda_w,
            "chi_w": found.chi_w,
        },
    }
