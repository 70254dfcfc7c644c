r"""The ``aisc`` route: AISC 360-16 §E3 (flexural buckling), §F2/F6/F7/F8/F11 (yielding), §F2.2/§F11.2
(lateral-torsional buckling), §H1.1/§H1.2.

Sources: ANSI/AISC 360-16, *Specification for Structural Steel Buildings*: Table B4.1a (width-to-thickness
ratios, members in axial compression), Table B4.1b (members in flexure), eqs. (E3-1)–(E3-4), §F1 eq. (F1-1),
§F2, §F6.1, §F7.1, §F8.1, §F11.1, §F11.2 eqs. (F11-2)–(F11-4), §D2(a), eqs. (H1-1a)/(H1-1b). Every limit and
factor from memory, to be checked against a copy of the Specification.

- :math:`F_e = N_{cr}/A_g` from the exact critical load of each plane (springs and restraints count); the
  smaller :math:`P_n = F_{cr}A_g` governs (:func:`engine.design.aisc360.critical_stress`).
- Compression elements (Table B4.1a): I flanges :math:`b/t = b_f/(2t_f) \le 0.56\sqrt{E/F_y}` (rolled;
  built-up: :math:`0.64\sqrt{k_cE/F_y}`, :math:`k_c = 4/\sqrt{h/t_w}` within 0.35–0.76), I webs
  :math:`h/t_w \le 1.49\sqrt{E/F_y}`, rectangular HSS walls :math:`b/t \le 1.40\sqrt{E/F_y}` (b = side − 3t),
  round HSS :math:`D/t \le 0.11E/F_y`. With a slender element :math:`P_n = F_{cr}A_e` (§E7, from memory:
  :func:`effective_area`, the effective widths of eq. (E7-3) under each axis's :math:`F_{cr}`, note
  ``aisc-slender-e7``; a round HSS by eq. (E7-7), beyond :math:`D/t = 0.45E/F_y` not applied).
- Flexure (Table B4.1b): compact when every element is within :math:`\lambda_p` (I flanges
  :math:`0.38\sqrt{E/F_y}`, I webs :math:`3.76\sqrt{E/F_y}`, HSS flanges :math:`1.12\sqrt{E/F_y}`, HSS webs
  :math:`2.42\sqrt{E/F_y}`, round HSS :math:`0.07E/F_y`); then :math:`M_n = M_p = F_yZ \le 1.6F_yS`. A
  non-compact element (within :math:`\lambda_r`: I flanges :math:`1.0\sqrt{E/F_y}` (built-up, major axis:
  :math:`0.95\sqrt{k_cE/F_L}`, :math:`F_L = 0.7F_y`), I webs
  :math:`5.70\sqrt{E/F_y}`, HSS flanges :math:`1.40\sqrt{E/F_y}`, HSS webs :math:`5.70\sqrt{E/F_y}`, round
  HSS :math:`0.31E/F_y`): :math:`M_n` by the local-buckling limit of §F3.2, §F6.2, §F7 or §F8.2
  (:func:`noncompact_moment`; a noncompact I web 0.7F_yS, §F4 not made; note ``aisc-noncompact``). A
  slender element in flexure: the route is not applied.
- Lateral-torsional buckling (issue 15): where the member's check applies to an I section, the major-axis
  :math:`M_n` is the smaller of the yielding value above and §F2's (:func:`engine.design.ltb.aisc_f2`:
  :math:`L_b` the length between brace points, the member's length without any; :math:`C_b` of eq. (F1-1)
  from the first-order diagram, capped by the exact elastic ratio :math:`M_{cr,0}/M_{cr,uniform}` so that a
  load on the top flange counts); a non-compact flange takes §F3.1, which is §F2.2 again. The exact
  :math:`M_{cr}` is in the facts beside it. A solid rectangle deeper than wide
  (:func:`engine.sections.deep_solid`) bent about its major axis takes §F11.2 the same way, with the same
  :math:`L_b` and :math:`C_b`
  (:func:`engine.design.ltb.aisc_f11`, d the depth, t the width): :math:`M_n = M_p` up to
  :math:`L_bd/t^2 = 0.08E/F_y` (F11-1), :math:`C_b[1.52 - 0.274(L_bd/t^2)F_y/E]F_yS \le M_p` up to
  :math:`1.9E/F_y` (F11-2), beyond :math:`F_{cr}S \le M_p`, :math:`F_{cr} = 1.9EC_b/(L_bd/t^2)` (F11-3,
  F11-4); facts ``M_n_F11``, ``zone_F11``, ``Lbd_t2`` and its limits ``Lbd_t2_p``, ``Lbd_t2_r``. Minor-axis
  bending of a rectangle, and a square bar, stay with §F11.1 (no LTB, no note). Elsewhere (an open section
  or a deep rectangle whose check could not be made, e.g. a free end) note ``LTB-not-checked``. Shear by
  Chapter G (§G2.1, §G4, §G5, §G6: :mod:`engine.design.aisc_shear`), the term ``shear``; solid bars not
  (note ``aisc-shear-not-checked``).
- :math:`P_r = N`; :math:`M_r` the largest second-order moment of each plane WITHOUT the bow (the
  Specification's strength :math:`P_n` already holds the member's out-of-straightness). ASD analyses at 1.6 ×
  its loads (§C2.1, from memory): :math:`M_r` grows as :func:`_asd_moment` says.
- :math:`P_c = \phi_cP_n` or :math:`P_n/\Omega_c`, :math:`M_c = \phi_bM_n` or :math:`M_n/\Omega_b`
  (``check.aisc_method``); these replace :math:`\gamma_{M0}, \gamma_{M1}` on this route. In tension,
  :math:`P_c = \phi_tF_yA_g` (§D2(a), yielding; rupture of a net section is not checked) in eq. (H1-1) as
  §H1.2 allows (note ``aisc-tension-yielding``, only where N < 0).
"""

from __future__ import annotations

import math

from engine.design import aisc360
from engine.design.aisc_hss import ERW_FACTOR, design_planes, design_section, is_erw
from engine.design.aisc_shear import shear_check
from engine.design.en_member import Plane, not_applied
from engine.design.routes import RouteCheck
from engine.sections import deep_solid
from engine.sway import AISC_OUT_OF_PLUMB

__all__ = [
    "SOURCE",
    "compression_elements",
    "direct_stiffness",
    "effective_area",
    "flexure_class",
    "route",
]

SOURCE = (
    "AISC 360-16 Tables B4.1a/b, §E3 eqs. (E3-1)–(E3-4), §E7, §F2.1/F6.1/F7.1/F8.1/F11.1, §F1 eq. (F1-1), "
    "§F2.2, §F11.2 eqs. (F11-2)–(F11-4), §D2(a), §H1.1 eqs. (H1-1a)/(H1-1b) and §H1.2, §G2.1, §G4–§G6 "
    "(from memory)"
)

_SHAPES = ("rolled_i", "welded_i", "rhs", "chs", "rectangle", "round")


def _i_parts(dims: dict, shape: str) -> tuple[float, float, float]:
    """Flange b/t, web h/t_w and k_c of an I section."""
    h, b, tw, tf = dims["h"], dims["b"], dims["tw"], dims["tf"]
    r = dims.get("r", 0.0) if shape == "rolled_i" else 0.0
    web = (h - 2.0 * tf - 2.0 * r) / tw
    k_c = min(0.76, max(0.35, 4.0 / math.sqrt(web)))
    return b / (2.0 * tf), web, k_c


def compression_elements(section, E: float, Fy: float) -> list:
    """Table B4.1a: (element, ratio, limit λ_r) of every element of the section."""
    root = math.sqrt(E / Fy)
    dims, shape = section.dimensions, section.shape
    if shape in ("rolled_i", "welded_i"):
        flange, web, k_c = _i_parts(dims, shape)
        limit = 0.56 * root if shape == "rolled_i" else 0.64 * math.sqrt(k_c * E / Fy)
        return [("flange", flange, limit), ("web", web, 1.49 * root)]
    if shape == "rhs":
        t = dims["t"]
        return [(f"wall {side}", (dims[side] - 3 * t) / t, 1.40 * root) for side in ("h", "b")]
    if shape == "chs":
        return [("tube", dims["D"] / dims["t"], 0.11 * E / Fy)]
    return []


def effective_area(section, E: float, Fy: float, Fcr: float) -> float | None:
    """The effective area A_e [m²] of AISC 360-16 §E7 under the critical stress ``Fcr`` [Pa] (from memory):
    the gross area less (b − b_e)t of every slender element (:func:`engine.design.aisc360.effective_width`:
    I flanges as unstiffened halves b_f/2, I webs h and RHS walls b = side − 3t as stiffened), or eq. (E7-7)
    for a round HSS; None beyond the Specification's range (a round HSS with D/t >= 0.45E/F_y)."""
    dims, shape, area = section.dimensions, section.shape, section.A
    if shape == "chs":
        found = aisc360.round_hss_area(area, dims["D"] / dims["t"], E, Fy)
        return None if math.isnan(found) else found
    for name, ratio, limit in compression_elements(section, E, Fy):
        if shape in ("rolled_i", "welded_i"):
            if name == "flange":
                t, count, kind = dims["tf"], 4, "unstiffened"
            else:
                t, count, kind = dims["tw"], 1, "stiffened"
        else:
            t, count, kind = dims["t"], 2, "hss wall"
        width = ratio * t
        area -= count * (width - aisc360.effective_width(width, ratio, limit, kind, Fy, Fcr)) * t
    return area


def flexure_class(section, E: float, Fy: float) -> tuple[str, list]:
    """Table B4.1b about the section's axis: ``"compact"``, ``"noncompact"`` or ``"slender"`` and the
    elements as (element, ratio, λ_p, λ_r)."""
    root = math.sqrt(E / Fy)
    dims, shape = section.dimensions, section.shape
    parts: list = []
    if shape in ("rolled_i", "welded_i"):
        flange, web, k_c = _i_parts(dims, shape)
        # Table B4.1b: a built-up flange in major-axis bending has λ_r = 0.95√(k_c·E/F_L), F_L = 0.7F_y
        # (doubly symmetric); rolled flanges and any flange in minor-axis bending 1.0√(E/F_y).
        built_up = shape == "welded_i" and section.axis == "major"
        limit = 0.95 * math.sqrt(k_c * E / (0.7 * Fy)) if built_up else 1.0 * root
        parts.append(("flange", flange, 0.38 * root, limit))
        if section.axis == "major":
            parts.append(("web", web, 3.76 * root, 5.70 * root))
    elif shape == "rhs":
        t = dims["t"]
        web_side, flange_side = (dims["h"], dims["b"]) if section.axis == "major" else (dims["b"], dims["h"])
        parts.append(("flange", (flange_side - 3 * t) / t, 1.12 * root, 1.40 * root))
        parts.append(("web", (web_side - 3 * t) / t, 2.42 * root, 5.70 * root))
    elif shape == "chs":
        parts.append(("tube", dims["D"] / dims["t"], 0.07 * E / Fy, 0.31 * E / Fy))
    worst = "compact"
    for _, ratio, lp, lr in parts:
        if ratio > lr * (1 + 1e-12):
            return "slender", parts
        if ratio > lp * (1 + 1e-12):
            worst = "noncompact"
    return worst, parts


#: AISC 360-16 §C2.1(4) and Appendix 8 eq. (A-8-3): ASD's second-order analysis at 1.6 × the ASD loads, its
#: forces then divided by 1.6 (from memory).
ASD_ALPHA = 1.6


def noncompact_moment(section, parts, E: float, Fy: float) -> float:
    """M_n [N·m] of a section with a noncompact element (none slender), by the local-buckling limit of its
    chapter F clause (from memory): the smallest over its noncompact elements of

    - I flange, major axis (§F3.2, eq. F3-1) or minor axis (§F6.2, eq. F6-2):
      M_p − (M_p − 0.7F_yS)(λ − λ_p)/(λ_r − λ_p);
    - rectangular HSS flange (§F7.2, eq. F7-2): M_p − (M_p − F_yS)(3.57(b/t)√(F_y/E) − 4.0) ≤ M_p;
    - rectangular HSS web (§F7.3, eq. F7-6): M_p − (M_p − F_yS)(0.305(h/t)√(F_y/E) − 0.738) ≤ M_p;
    - round HSS (§F8.2, eq. F8-2): (0.021E/(D/t) + F_y)S;
    - an I web (§F4, its R_pc and its own lateral-torsional buckling, not made here): 0.7F_yS, the lowest
      value those reach (on the safe side).
    """
    S = section.W_el
    M_p = min(Fy * section.W_pl, 1.6 * Fy * S)
    root = math.sqrt(Fy / E)
    found = M_p
    for name, ratio, lp, lr in parts:
        if ratio <= lp * (1 + 1e-12):
            continue
        if section.shape in ("rolled_i", "welded_i"):
            value = 0.7 * Fy * S if name == "web" else M_p - (M_p - 0.7 * Fy * S) * (ratio - lp) / (lr - lp)
        elif name == "flange":
            value = M_p - (M_p - Fy * S) * (3.57 * ratio * root - 4.0)
        elif name == "web":
            value = M_p - (M_p - Fy * S) * (0.305 * ratio * root - 0.738)
        else:  # a round HSS
            value = (0.021 * E / ratio + Fy) * S
        found = min(found, value)
    return min(found, M_p)


def direct_stiffness(section, material, N: float, method: str) -> tuple[float, float, float] | None:
    """The direct analysis method (§C2.3, from memory) for a plane whose section is ``section``: (τ_b, P_ns,
    the factor on the plane's nominal EI); P_ns = F_y·A_g, or F_y·A_e(F_y) with a slender element (§C2.3(b));
    an ERW HSS takes its design wall, the factor then also holding I_des/I_nom. None where the route does not
    apply (not steel, a custom section)."""
    if material.kind != "steel" or section.shape not in _SHAPES:
        return None
    built = design_section(section) if is_erw(section, material) else section
    E, Fy = material.E, material.fy
    area = built.A
    if any(ratio > limit for _, ratio, limit in compression_elements(built, E, Fy)):
        found = effective_area(built, E, Fy, Fy)
        area = area if found is None else found
    P_ns = Fy * area
    tau = aisc360.tau_b((ASD_ALPHA if method == "ASD" else 1.0) * N / P_ns)
    return tau, P_ns, aisc360.DIRECT_STIFFNESS * tau * built.I / section.I


def _asd_moment(p, N: float, M_second: float) -> float:
    """A bound on ASD's M_r [N·m] (α = 1.6) where the plane has no exact solve at 1.6·N (``Plane.M_asd``):
    the largest of the exact moment at 1.0·N (``M_second``), its second-order part grown as a single mode
    grows, M_I + (M_II − M_I)·α(1 − a)/(1 − αa), and Appendix 8's amplification with C_m = 1, M_I/(1 − αa);
    a = N/N_cr of the plane, M_I the first-order moment; unbounded at αN ≥ N_cr."""
    M_I = p.diagram.M_max
    if M_I == 0.0 and M_second == 0.0:
        return 0.0
    a = N / p.N_cr
    if ASD_ALPHA * a >= 1.0:
        return math.inf
    grown = M_I + (M_second - M_I) * ASD_ALPHA * (1.0 - a) / (1.0 - ASD_ALPHA * a)
    return max(M_second, grown, M_I / (1.0 - ASD_ALPHA * a))


def _buckling_load(p, direct: bool) -> float:
    """The plane's load for §E3's F_e: its exact critical load; by the direct analysis method (§C3, from
    memory: L_c = L unless a rational analysis gives less) never below π²EI/L² with L the member's length,
    where the exact load is the plane's own, or where the unloaded plane of a one-plane case sways and so
    carries the notional load (:func:`_notional_moment`); another out-of-plane buckling length the case
    gives is kept."""
    if not direct or math.isinf(p.N_cr):
        return p.N_cr
    if p.sway_length is not None:
        return max(p.N_cr, math.pi**2 * p.EI / p.sway_length**2)
    if p.N_cr_source != "exact" or p.length is None:
        return p.N_cr
    return max(p.N_cr, math.pi**2 * p.EI / p.length**2)


def _notional_moment(N: float, p: Plane, alpha: float, c: float) -> float:
    """M_r [N·m] about the unloaded, swaying plane ``p`` of a one-plane case from the notional load alone:
    the tilt 1/500 over ``p.sway_length`` with App. 8's B2 = 1/(1 − αN/(c·N_cr)) (from memory; ``alpha``
    ASD's 1.6, ``c`` the direct analysis method's 0.8·τ_b or 1). N·φ·L bounds the end moment of any member
    whose ends translate by φ·L relative to each other, and B2 bounds the cantilever's exact tan(kL)/(kL)
    (every term of its partial fractions is at most the first one's), so this is never below the exact
    second-order moment of a cantilever (tests/engine/test_aisc_notional_other_axis.py)."""
    load = alpha * N / c
    if load >= p.N_cr:
        return math.inf
    return AISC_OUT_OF_PLUMB * N * p.sway_length / (1.0 - load / p.N_cr)


def _ltb_facts(ltb, section) -> dict:
    """The facts of the lateral-torsional buckling limit: §F2's (an I section) or §F11.2's (a solid
    rectangular bar: its L_b·d/t² and the limits 0.08E/F_y and 1.9E/F_y, as L_p·d/t² and L_r·d/t²)."""
    found = ltb.aisc
    facts = {"L_b": found.L_b, "C_b": found.C_b, "C_b_F1_1": ltb.C_b_F1_1, "M_cr": ltb.M_cr_0}
    if found.clause == "F11":
        scale = section.depth / section.width**2  # d/t²
        return facts | {
            "M_n_F11": found.M_n,
            "zone_F11": found.zone,
            "Lbd_t2": found.L_b * scale,
            "Lbd_t2_p": found.L_p * scale,
            "Lbd_t2_r": found.L_r * scale,
        }
    return facts | {"M_n_F2": found.M_n, "L_p": found.L_p, "L_r": found.L_r, "zone_F2": found.zone}


def route(
    *, y: Plane, z: Plane, N: float, material, settings, enabled: bool, beyond: bool, ltb=None, N_cr_T=None
) -> RouteCheck:
    """The ``aisc`` route at axial force ``N`` (compression positive) [N]; ``beyond``: N is at or above the
    first critical load of the plane analysed (no stable equilibrium); ``ltb``: the member's
    lateral-torsional buckling check (its ``aisc`` part is used where it applies); ``N_cr_T``: the torsional
    buckling load [N] (§E4 with F_e = N_cr,T/A_g, :mod:`engine.torsional_buckling`), or None."""
    if y.section.shape not in _SHAPES:
        return not_applied("aisc", enabled, "custom-section", SOURCE)
    erw = is_erw(y.section, material)
    direct = settings.aisc_analysis == "direct"
    reduced = direct_stiffness(y.section, material, N, settings.aisc_method) if direct and N > 0.0 else None
    if erw:  # §B4.2: an ERW HSS's design wall is 0.93·t (engine.design.aisc_hss)
        t_nominal = y.section.dimensions["t"]
        untilted_alpha = None if direct else (ASD_ALPHA if settings.aisc_method == "ASD" else 1.0)
        y, z = design_planes(y, z, N, ASD_ALPHA, untilted_alpha)
    sy = y.section
    E, Fy = material.E, material.fy
    method = settings.aisc_method
    phi = {name: aisc360.RESISTANCE[name, method] for name in ("compression", "flexure")}
    tension_factor = 0.90 if method == "LRFD" else 1.67  # §D2(a), from memory
    available = (lambda n, f: f * n) if method == "LRFD" else (lambda n, f: n / f)
    facts: dict = {"method": method, "F_y": Fy, "E": E, "A_g": sy.A}
    if erw:
        facts.update(t_nominal=t_nominal, t_design=ERW_FACTOR * t_nominal)
    if method == "LRFD":
        facts.update(phi_c=phi["compression"], phi_b=phi["flexure"], phi_t=tension_factor)
    else:
        facts.update(Omega_c=phi["compression"], Omega_b=phi["flexure"], Omega_t=tension_factor)
    facts["factors"] = "phi/Omega of AISC 360-16 in place of gamma_M0/gamma_M1"
    slender = []
    if N > 0.0:
        slender = [item for item in compression_elements(sy, E, Fy) if item[1] > item[2]]
        if slender:
            name, ratio, limit = slender[0]
            facts.update(element=name, ratio=ratio, limit=limit)
            if effective_area(sy, E, Fy, Fy) is None:  # beyond §E7's range (a round HSS past 0.45E/F_y)
                return RouteCheck(
                    route="aisc",
                    enabled=enabled,
                    utilization=None,
                    facts=facts,
                    reason="slender-element-compression",
                    source=SOURCE,
                )
    notes = ["aisc-shear-not-checked"] + (["aisc-erw-design-wall"] if erw else [])
    swaying = [p for p in (y, z) if p.diagram.sway or p.sway_length is not None]
    if direct:  # Chapter C: no drift limit; the reduced stiffness and the notional load are in M_r
        notes.insert(0, "aisc-direct-analysis")
        facts["analysis"] = "direct"
        if reduced is not None:
            facts.update(tau_b=reduced[0], P_ns=reduced[1])
    elif N > 0.0 and swaying:
        notes.insert(0, "aisc-out-of-plumb-in-Mr")  # §C2.2a's notional load is in M_r (Plane.M_second)
        # Appendix 7 §7.2.1 (from memory): the effective length method only while the second-order drift is
        # at most 1.5 × the first-order drift; a single mode's 1/(1 − αN/N_cr) estimates that ratio
        alpha = ASD_ALPHA if method == "ASD" else 1.0
        drift = max(1.0 / (1.0 - alpha * N / p.N_cr) if alpha * N < p.N_cr else math.inf for p in swaying)
        facts["drift_ratio"] = drift
        if drift > 1.5:
            notes.insert(0, "aisc-elm-drift-limit")
    torsional = ltb is not None and ltb.applies and ltb.aisc is not None and y.diagram.M_max > 0.0
    M_c = {}
    for p in (y, z):
        kind, parts = flexure_class(p.section, E, Fy)
        facts[f"flexure_{p.axis}"] = kind
        if kind == "slender":
            if p.diagram.M_max == 0.0 and (p.sway_length is None or N <= 0.0):
                continue  # no moment about this axis: its flexural strength does not enter
            return RouteCheck(
                route="aisc",
                enabled=enabled,
                utilization=None,
                facts=facts,
                reason="slender-element-flexure",
                source=SOURCE,
            )
        S, Z = p.section.W_el, p.section.W_pl
        M_n = min(Fy * Z, 1.6 * Fy * S) if kind == "compact" else noncompact_moment(p.section, parts, E, Fy)
        if p.axis == "y" and torsional:
            facts.update(_ltb_facts(ltb, sy))
            M_n = min(M_n, ltb.aisc.M_n)
        if kind == "noncompact" and "aisc-noncompact" not in notes:
            notes.append("aisc-noncompact")
        facts[f"M_n_{p.axis}"] = M_n
        M_c[p.axis] = available(M_n, phi["flexure"])
        facts[f"M_c_{p.axis}"] = M_c[p.axis]
    no_ltb = sy.shape in ("chs", "round") or (sy.shape == "rectangle" and not deep_solid(sy))  # §F8, §F11.1
    if y.diagram.M_max > 0.0 and not no_ltb and not torsional:
        restrained = ltb is not None and ltb.reason == "restrained"
        notes.insert(0, "LTB-restrained" if restrained else "LTB-not-checked")
    M_r = {}
    for p in (y, z):
        if p.M_second is None:
            M_r[p.axis] = p.diagram.M_max
        else:
            M_r[p.axis] = p.M_second
        if direct and N > 0.0 and p.M_direct is not None:  # §C2.3: at the route's method (ASD included)
            M_r[p.axis] = p.M_direct
        elif method == "ASD" and N > 0.0:  # the exact solve at 1.6·N, else a bound on it (see _asd_moment)
            M_r[p.axis] = p.M_asd if p.M_asd is not None else _asd_moment(p, N, M_r[p.axis])
        facts[f"M_r_{p.axis}"] = M_r[p.axis]
    if N > 0.0:
        P_n = math.inf
        modes = [(p.axis, _buckling_load(p, direct)) for p in (y, z)]  # §E3
        modes += [] if N_cr_T is None else [("T", N_cr_T)]  # §E4
        for axis, N_cr in modes:
            F_e = N_cr / sy.A
            F_cr = aisc360.critical_stress(Fy, F_e)
            facts[f"F_e_{axis}"], facts[f"F_cr_{axis}"] = F_e, F_cr
            A_e = effective_area(sy, E, Fy, F_cr) if slender else sy.A  # §E7: slender elements
            if F_cr * A_e < P_n:
                P_n, facts["P_n_axis"] = F_cr * A_e, axis
                if slender:
                    facts["A_e"] = A_e
        if slender:
            notes.append("aisc-slender-e7")
        P_c = available(P_n, phi["compression"])
    else:
        P_n = Fy * sy.A
        P_c = available(P_n, tension_factor)
        if N < 0.0:  # no axial force (N = 0): P_c does not enter, no note
            notes.append("aisc-tension-yielding")
    facts.update(P_r=N, P_n=P_n, P_c=P_c)
    alpha = ASD_ALPHA if method == "ASD" else 1.0  # §C2.1 / App. 8: ASD's analysis at 1.6 × its loads
    unbounded = any(math.isinf(value) for value in M_r.values())  # the reduced member has no equilibrium
    if beyond or unbounded or any(alpha * N >= p.N_cr and p.diagram.M_max > 0.0 for p in (y, z)):
        return RouteCheck(
            route="aisc",
            enabled=enabled,
            utilization=math.inf,
            governing="elastic-buckling",
            terms={"elastic-buckling": math.inf},
            facts=facts,
            notes=tuple(notes),
            source=SOURCE,
        )
    found = aisc360.interaction(N, P_c, M_r["y"], M_c.get("y", math.inf), M_r["z"], M_c.get("z", math.inf))
    other = next((p for p in (y, z) if p.sway_length is not None), None) if N > 0.0 else None
    if other is not None:  # the notional load about the other axis instead (App. 7 §7.2.2, §C2.2b)
        c = reduced[2] if direct and reduced is not None else 1.0
        M_tilt = _notional_moment(N, other, alpha, c)
        M_b = {p.axis: p.M_untilted if p.M_untilted is not None else M_r[p.axis] for p in (y, z)}
        M_b[other.axis] = M_tilt
        facts[f"M_r_{other.axis}_notional"] = M_tilt
        M_c_y, M_c_z = M_c.get("y", math.inf), M_c.get("z", math.inf)
        beside = aisc360.interaction(N, P_c, M_b["y"], M_c_y, M_b["z"], M_c_z)
        analysed = z if other is y else y  # the plane analysed, tilted in the first check
        facts["tilt_axis"] = analysed.axis if found.utilization >= beside.utilization else other.axis
        if beside.utilization > found.utilization:
            found = beside
            facts.update({f"M_r_{axis}": value for axis, value in M_b.items()})
        notes.append("aisc-notional-other-axis")
    facts.update(axial=found.axial, bending=found.bending)
    terms = {found.equation: found.utilization}
    length = next((p.length for p in (y, z) if p.length), math.inf)
    sheared = shear_check((y, z), M_r, E, Fy, method, length)  # Chapter G (engine.design.aisc_shear)
    if sheared is not None:
        terms["shear"] = sheared[0]
        facts.update(sheared[1])
        notes.remove("aisc-shear-not-checked")
    governing = max(terms, key=lambda k: terms[k])
    return RouteCheck(
        route="aisc",
        enabled=enabled,
        utilization=terms[governing],
        governing=governing,
        terms=terms,
        facts=facts,
        notes=tuple(notes),
        source=SOURCE,
    )
