r"""The ``aisc`` route's shear: AISC 360-16 Chapter G (from memory, to be checked against a copy of the
Specification), members without transverse stiffeners in the span.

- I-shapes, shear parallel to the web (major-axis bending), §G2.1: :math:`V_n = 0.6F_yA_wC_{v1}`,
  :math:`A_w = d\,t_w`, h the clear distance between the flanges less the root fillets,
  :math:`d - 2(t_f + r)` (:math:`d - 2k_{des}` of a W shape; a welded I has none). A rolled I with
  :math:`h/t_w \le 2.24\sqrt{E/F_y}`: :math:`C_{v1} = 1`, :math:`\phi_v = 1.00`
  (:math:`\Omega_v = 1.50`) (G2.1(a)); otherwise :math:`\phi_v = 0.90`
  (:math:`\Omega_v = 1.67`), :math:`k_v = 5.34` and :math:`C_{v1} = 1` up to
  :math:`h/t_w = 1.10\sqrt{k_vE/F_y}`, beyond :math:`1.10\sqrt{k_vE/F_y}/(h/t_w)` (G2-3, G2-4).
- I-shapes, shear parallel to the flanges (minor-axis bending), §G6: :math:`V_n = 0.6F_yb_ft_fC_{v2}` for
  each of the two flanges, :math:`C_{v2}` of §G2.2 with :math:`h/t_w \to b_f/(2t_f)` and :math:`k_v = 1.2`.
- Rectangular HSS, §G4: :math:`V_n = 0.6F_yA_wC_{v2}`, :math:`A_w = 2ht`, h = the side parallel to the
  shear less 2t and the two inside corner radii (3t where they are not known), :math:`k_v = 5`.
- Round HSS, §G5: :math:`V_n = F_{cr}A_g/2`, :math:`F_{cr}` the larger of
  :math:`1.60E/(\sqrt{L_v/D}(D/t)^{5/4})` and :math:`0.78E/(D/t)^{3/2}`, at most :math:`0.6F_y`, with
  :math:`L_v` taken as the member's length (the longest it can be: the smaller :math:`F_{cr}`).
- :math:`C_{v2}` (§G2.2): 1 up to :math:`1.10\sqrt{k_vE/F_y}`, then :math:`1.10\sqrt{k_vE/F_y}/(h/t)` up to
  :math:`1.37\sqrt{k_vE/F_y}`, beyond :math:`1.51k_vE/((h/t)^2F_y)` (G2-9 to G2-11).
- Sections other than these (solid bars): not checked (note ``aisc-shear-not-checked``).

The required shear :math:`V_r` is the plane's largest first-order shear grown by the plane's second-order
amplification of the moment, :math:`\max(1, M_r/M_{1,max})` (a decision of this project: the route's
:math:`M_r` holds the second-order effects, its first-order diagram does not).
"""

from __future__ import annotations

import math

__all__ = ["shear_check"]

_PHI = {("LRFD", True): 1.00, ("ASD", True): 1.50, ("LRFD", False): 0.90, ("ASD", False): 1.67}


def _cv2(ratio: float, k_v: float, E: float, Fy: float) -> float:
    """C_v2 of AISC 360-16 §G2.2 (eqs. (G2-9)–(G2-11), from memory) at h/t = ``ratio``."""
    root = math.sqrt(k_v * E / Fy)
    if ratio <= 1.10 * root:
        return 1.0
    if ratio <= 1.37 * root:
        return 1.10 * root / ratio
    return 1.51 * k_v * E / (ratio**2 * Fy)


def nominal(section, axis: str, E: float, Fy: float, length: float) -> tuple[float, bool, str] | None:
    """(V_n [N], whether φ_v = 1.00 applies (§G2.1(a)), the clause) of the shear parallel to ``axis``'s
    bending plane (``"y"``: major-axis bending), or None where the route does not check it."""
    dims, shape = section.dimensions or {}, section.shape
    if shape in ("rolled_i", "welded_i"):
        d, b, tw, tf = dims["h"], dims["b"], dims["tw"], dims["tf"]
        if axis == "z":  # §G6: the two flanges
            return 2 * 0.6 * Fy * b * tf * _cv2(b / (2 * tf), 1.2, E, Fy), False, "G6"
        ratio = (d - 2 * (tf + dims.get("r", 0.0))) / tw  # h = d − 2k: the fillets left out
        if shape == "rolled_i" and ratio <= 2.24 * math.sqrt(E / Fy):
            return 0.6 * Fy * d * tw, True, "G2.1(a)"
        root = math.sqrt(5.34 * E / Fy)
        cv1 = 1.0 if ratio <= 1.10 * root else 1.10 * root / ratio
        return 0.6 * Fy * d * tw * cv1, False, "G2.1(b)"
    if shape == "rhs":
        side = dims["h"] if axis == "y" else dims["b"]
        t = dims["t"]
        h = side - 2.0 * t - 2.0 * dims["r_i"] if "r_i" in dims else side - 3.0 * t
        return 0.6 * Fy * 2 * h * t * _cv2(h / t, 5.0, E, Fy), False, "G4"
    if shape == "chs":
        D, t = dims["D"], dims["t"]
        F_cr = max(1.60 * E / (math.sqrt(length / D) * (D / t) ** 1.25), 0.78 * E / (D / t) ** 1.5)
        return min(F_cr, 0.6 * Fy) * section.A / 2, False, "G5"
    return None


def shear_check(
    planes, M_r: dict, E: float, Fy: float, method: str, length: float
) -> tuple[float, dict] | None:
    """(the largest V_r/V_c of the planes, facts) or None where the section's shear is not checked here.
    ``planes``: the route's (y, z) planes (their first-order diagrams); ``M_r``: the route's required
    moments by axis."""
    facts, worst = {}, 0.0
    for p in planes:
        found = nominal(p.section, p.axis, E, Fy, length)
        if found is None:
            return None
        V_n, rolled_web, clause = found
        first = p.diagram.M_max
        grow = max(1.0, M_r[p.axis] / first) if first > 0.0 and math.isfinite(M_r[p.axis]) else 1.0
        V_r = p.diagram.V_max * grow
        factor = _PHI[method, rolled_web]
        V_c = factor * V_n if method == "LRFD" else V_n / factor
        ratio = V_r / V_c if V_c > 0.0 else math.inf
        facts.update({f"V_n_{p.axis}": V_n, f"V_c_{p.axis}": V_c, f"V_r_{p.axis}": V_r})
        facts[f"shear_clause_{p.axis}"] = clause
        facts[f"{'phi' if method == 'LRFD' else 'Omega'}_v_{p.axis}"] = factor
        worst = max(worst, ratio)
    return worst, facts
