r"""The ``en-member`` route: EN 1993-1-1:2005 §6.3.1 and §6.3.3, eqs. (6.61)/(6.62), Annex B or Annex A.

What it takes from the engine (everything else is closed form):

- the exact elastic critical load of each plane, :math:`N_{cr,y}` and :math:`N_{cr,z}` (springs and restraints
  count), so :math:`\bar\lambda_i = \sqrt{A f_y/N_{cr,i}}` and :math:`L_{cr,i} = \pi\sqrt{EI_i/N_{cr,i}}`
  (reported); :math:`\chi_i` by eq. (6.49) with the curve of Table 6.2 about each axis. A plane that is
  restrained (``out_of_plane.restrained``) has :math:`N_{cr} = \infty`, :math:`\chi = 1`;
- the first-order solution of each plane (the loads as given, no bow: the bow is inside χ):
  :math:`M_{y,Ed}, M_{z,Ed}` = max|M|, and the :math:`C_m` factors read from the diagram
  (:mod:`engine.design.diagram`).

Resistances: :math:`N_{Rk} = A f_y`, :math:`M_{Rk} = W_{pl} f_y` (class 1–2) or :math:`W_{el} f_y` (class 3),
the class the worse of the section's classes about both axes, the webs in bending and compression with α from
N (:mod:`engine.classification`); a section class 4 in uniform compression takes
:math:`N_{Rk} = A_{eff} f_y` and :math:`\bar\lambda = \sqrt{A_{eff} f_y/N_{cr}}` (EN 1993-1-5 §4.4;
conservative), and a class 4 section with its effective properties (``SectionClass.effective``) the class 3
rules with :math:`W_{eff}` in :math:`M_{Rk}`. Other class 4 sections, unclassified sections, custom sections
and materials other than steel: the route is not applied.

Beside eqs. (6.61)/(6.62) the route makes the cross-section checks that an equivalent-member check always
goes with (EN 1993-1-1 §6.2, from memory): the linear interaction of §6.2.1(7), eq. (6.2),
:math:`|N|/N_{Rd} + M_{y,Ed}/M_{y,Rd} + M_{z,Ed}/M_{z,Rd}` with :math:`\gamma_{M0}` (conservative: the largest
moments wherever they are), and the shear :math:`V_{Ed}/V_{pl,Rd}` of eq. (6.18) in each plane. Without them
a small axial force and :math:`C_m < 1` would pass a member whose end section is overstressed.

Lateral-torsional buckling (issue 15): where the member's check is made (``ltb``, an
:class:`engine.design.ltb_member.LtbCheck` that applies), its :math:`\chi_{LT}` enters eqs. (6.61)/(6.62),
the term ``lateral-torsional`` is :math:`M_{y,Ed}/M_{b,Rd}` (eq. (6.54)), Annex B takes :math:`k_{zy}` of
Table B.2 with :math:`C_{mLT}` = the Table B.3 factor of the major-axis diagram between the end restraints
(the same as :math:`C_{my}`, the sway note's 0.9 included: a larger :math:`C_{mLT}` gives a larger
:math:`k_{zy}`), and Annex A its :math:`a_{LT}, \bar\lambda_0, C_{mLT}` terms
(:class:`engine.design.annex_a.TorsionalTerms`). Elsewhere :math:`\chi_{LT} = 1` (note ``chi-LT-1``) for
an open or rectangular section bent about its major axis. In tension or with
no axial force (:math:`N \le 0`) eqs. (6.61)/(6.62) do not apply (they are stability checks of a compressed
member) and the route is the cross-section checks alone, with the first-order moments (tension reduces them,
so this is on the safe side).
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

from engine import codes
from engine.classification import compression_area, elastic_modulus
from engine.design import annex_a, annex_b, ltb
from engine.design.diagram import Diagram, annex_a_factor, annex_b_factor
from engine.design.routes import RouteCheck
from engine.shear_area import axial_ratio, shear_area_kept
from engine.shear_buckling import shear_resistance

__all__ = ["Plane", "SOURCE", "route"]

SOURCE = (
    "EN 1993-1-1:2005 §6.3.1 (eqs. 6.46–6.49, Table 6.2), §6.3.3 eqs. (6.61)/(6.62) with Annex {annex}, and "
    "the cross-section checks of §6.2.1(7) eq. (6.2) and §6.2.6 eq. (6.18) (clauses from memory)"
)


@dataclass(frozen=True)
class Plane:
    """One bending plane of the member, as the routes read it.

    Attributes
    ----------
    axis : str
        ``"y"`` (bending about the major axis) or ``"z"``.
    section : Section
        The section's properties about that axis.
    N_cr : float
        The exact elastic critical load of the plane [N]; +inf when buckling in it is prevented.
    EI : float
        The bending stiffness the analysis used [N·m²] (for L_cr).
    diagram : Diagram
        The first-order diagram of the loads as given.
    M_second : float or None
        max|M| of the second-order solution without bow at the axial force [N·m] (AISC's M_r); None when it
        was not computed.
    N_cr_source : str
        How N_cr was found: ``"exact"`` (the engine's critical load of the plane), ``"out-of-plane length"``
        (π²EI/L_cr² with the case's out-of-plane buckling length) or ``"restrained"``.
    bow_short : bool
        The analysed plane's initial bow is smaller than the code's (or there is none): the second-order
        analysis does not cover this plane's member buckling, whose equation the second-order route then
        counts (EN 1993-1-1 §5.2.2(7)b; :func:`engine.buckling_interaction.equations`).
    """

    axis: str
    section: object
    N_cr: float
    EI: float
    diagram: Diagram
    M_second: float | None
    N_cr_source: str = "exact"
    curve: str | None = None
    bow_short: bool = False
    M_asd: float | None = (
        None  # max|M| without bow at 1.6·N (ASD's analysis, AISC §C2.1) [N·m]; None: not made
    )
    M_direct: float | None = None  # the direct analysis method's M_r [N·m] (Amplification.moment_direct)
    length: float | None = None  # the member's length [m] (the direct analysis method's L_c = L)
    # the aisc route's M_r of this plane without its out-of-plumb tilt [N·m], where M_r holds one (the check
    # with the notional load about the other axis instead, aisc_member); None: M_r holds no tilt
    M_untilted: float | None = None
    # the unloaded plane of a one-plane case that sways (L_cr > L): the length [m] over which the aisc
    # route's notional tilt acts about this axis; None: no tilt about it (aisc_member)
    sway_length: float | None = None

    @property
    def L_cr(self) -> float | None:
        """π√(EI/N_cr) [m], None when restrained."""
        return None if math.isinf(self.N_cr) else math.pi * math.sqrt(self.EI / self.N_cr)


def _grade(material) -> str | None:
    return material.name if material.name.upper().startswith("S") else None


def curve_of(section, material) -> tuple[str, str]:
    """The buckling curve of Table 6.2 about the section's axis (engine.codes)."""
    return codes.buckling_curve(
        shape=section.shape,
        manufacture=section.manufacture,
        axis=section.axis,
        h_over_b=section.h_over_b,
        t_max=section.t_max,
        grade=_grade(material),
    )


#: The axis a plane bends about, by its name.
_AXES = {"y": "major", "z": "minor"}


def _largest_factors(rows):
    """Each of k_yy, k_yz, k_zy and k_zz the largest of ``rows`` (InteractionFactors at the same n_y, n_z)."""
    names = ("k_yy", "k_yz", "k_zy", "k_zz")
    return dataclasses.replace(rows[0], **{n: max(getattr(r, n) for r in rows) for n in names})


def _largest_of_tables(common: dict, C_mLT: float | None) -> tuple:
    """(factors, C_mLT): each of Annex B's factors the largest of Table B.1's two rows and, with ``C_mLT``
    (a member that can twist), Table B.2's with it; for a shape in neither table's rows."""
    rows = [annex_b.interaction_factors(hollow=hollow, **common) for hollow in (True, False)]
    if C_mLT is None:
        return _largest_factors(rows), None
    rows.append(annex_b.interaction_factors(hollow=False, C_mLT=C_mLT, **common))
    return dataclasses.replace(_largest_factors(rows), C_mLT=C_mLT), C_mLT


def not_applied(route: str, enabled: bool, reason: str, source: str = "") -> RouteCheck:
    """A route that cannot be applied to this member: utilisation None and why."""
    return RouteCheck(route=route, enabled=enabled, utilization=None, reason=reason, source=source)


def _reduced(bending: float, rho: float) -> float:
    """The bending terms with (1 − ρ)f_y (§6.2.8); unbounded at ρ = 1 (no moment resistance left)."""
    return bending / (1.0 - rho) if rho < 1.0 else math.inf


def _verdict(enabled: bool, terms: dict, facts: dict, notes: list, source: str) -> RouteCheck:
    """The route's result: its largest term governs (the first of equal ones)."""
    governing = max(terms, key=lambda k: terms[k])
    return RouteCheck(
        route="en-member",
        enabled=enabled,
        utilization=terms[governing],
        governing=governing,
        terms=terms,
        facts=facts,
        notes=tuple(notes),
        source=source,
    )


def route(
    *,
    y: Plane,
    z: Plane,
    N: float,
    material,
    section_class,
    settings,
    enabled: bool,
    beyond: bool = False,
    ltb=None,
    lateral_diagram=None,
) -> RouteCheck:
    """The ``en-member`` route for a member with planes ``y`` and ``z`` at axial force ``N`` (compression
    positive) [N]. ``section_class`` is the worse class about both axes (a SectionClass or None); ``beyond``:
    N is at or above the first critical load of the plane analysed; ``ltb``: the member's lateral-torsional
    buckling check (None or not applying: χ_LT = 1); ``lateral_diagram``: the M_y diagram between the points
    braced laterally that hold the member (Table B.3 reads C_mLT there), where it differs from ``y``'s."""
    source = SOURCE.format(annex=settings.annex)
    if section_class is None:
        return not_applied("en-member", enabled, "section-not-classified", source)
    klass = section_class.klass
    if klass == 4 and not section_class.effective:  # effective: the class 3 rules with A_eff and W_eff
        return not_applied("en-member", enabled, "section-class-4", source)
    g0, g1, fy = settings.gamma_M0, settings.gamma_M1, material.fy
    sy, sz = y.section, z.section
    plastic = klass <= 2
    area = compression_area(sy, section_class, N)  # A_eff where class 4 in uniform compression (conservative)
    N_Rk = area * fy
    My_Rk = (sy.W_pl if plastic else elastic_modulus(sy, section_class, 0)) * fy  # W_eff: class 4
    Mz_Rk = (sz.W_pl if plastic else elastic_modulus(sz, section_class, 1)) * fy
    My, Mz = y.diagram.M_max, z.diagram.M_max
    torsional = ltb is not None and ltb.applies and My > 0.0
    chi_LT = ltb.chi_LT if torsional else 1.0
    facts = {
        "annex": settings.annex,
        "section_class": klass,
        "N_Ed": N,
        "N_Rk": N_Rk,
        "M_y_Rk": My_Rk,
        "M_z_Rk": Mz_Rk,
        "M_y_Ed": My,
        "M_z_Ed": Mz,
        "gamma_M0": g0,
        "gamma_M1": g1,
        "chi_LT": chi_LT,
        "form_y": y.diagram.form,
        "form_z": z.diagram.form,
    }
    sheared = [  # V/V_Rd, V_b,Rd for a web slender in shear (EN 1993-1-5 §5, engine.shear_buckling)
        (p.diagram.V_max / shear_resistance(p.section, material, _AXES[p.axis], g0, g1), p.section.A_v)
        for p in (y, z)
    ]
    sheared = [item for item in sheared if item[1] > 0]
    shear = max(ratio for ratio, _ in sheared)
    # §6.2.8: past half of V_pl,Rd, (1 − ρ)f_y for the moments (the largest shear with the largest moments,
    # on the whole section: on the safe side), and in each shear area for N (§6.2.10(3))
    rho = float(codes.shear_reduction(shear, 1.0))
    kept = shear_area_kept(N_Rk / fy, [(codes.shear_reduction(r, 1.0), A_v) for r, A_v in sheared])
    bending = My * g0 / My_Rk + Mz * g0 / Mz_Rk
    axial = float(axial_ratio(N, float(kept) * fy / g0))
    terms = {
        "cross-section": axial + (0.0 if bending == 0.0 else _reduced(bending, rho)),
        "shear": shear,
    }
    if rho > 0.0:
        facts["rho_shear"] = rho
    notes = ["chi-LT-1"] if My > 0.0 and sy.shape not in ("chs", "round") and not torsional else []
    if notes and ltb is not None and ltb.reason == "restrained":
        notes = ["LTB-restrained"]  # the case states the compression flange is restrained
    if torsional:
        facts.update(lambda_LT=ltb.lambda_LT, M_cr=ltb.M_cr, curve_LT=ltb.curve, method_LT=ltb.method)
        M_b = chi_LT * My_Rk / g1
        facts["M_b_Rd"] = M_b
        terms["lateral-torsional"] = My / M_b if M_b > 0.0 else math.inf
    for p in (y, z):
        curve = p.curve if p.curve is not None else curve_of(p.section, material)[0]
        lam = 0.0 if math.isinf(p.N_cr) else codes.slenderness(area, fy, p.N_cr)
        facts[f"curve_{p.axis}"] = curve
        facts[f"N_cr_{p.axis}"] = p.N_cr
        facts[f"N_cr_{p.axis}_source"] = p.N_cr_source
        facts[f"L_cr_{p.axis}"] = p.L_cr
        facts[f"lambda_{p.axis}"] = lam
        facts[f"chi_{p.axis}"] = codes.reduction_factor(lam, curve)
    if N <= 0.0:
        if not (My > 0.0 and Mz > 0.0):  # one moment: at N_Ed = 0 the equations add nothing to the terms
            notes.append("en-member-cross-section-only")
            return _verdict(enabled, terms, facts, notes, source)
        # No compression but both moments: eqs. (6.61)/(6.62) at N_Ed = 0 (a tension is not counted as
        # relieving; the M_z term must not drop out of the lateral-torsional buckling check).
        notes.append("en-member-no-compression")
        N = 0.0
    # At or above a critical load of a plane whose solution the route reads (the plane analysed, or a plane
    # with moments), the moments have no stable equilibrium: unbounded, as the second-order route says. Annex
    # A's μ and 1/(1 - N/N_cr) turn negative above any critical load. Above the critical load of a plane
    # without moments, Annex B's equations hold and exceed 1 by themselves (N > N_cr >= χ N_Rk).
    if beyond or any(N >= p.N_cr and (p.diagram.M_max > 0.0 or settings.annex == "A") for p in (y, z)):
        terms["elastic-buckling"] = math.inf
        return _verdict(enabled, terms, facts, notes, source)
    chi_y, chi_z = facts["chi_y"], facts["chi_z"]
    lam_y, lam_z = facts["lambda_y"], facts["lambda_z"]
    if torsional and chi_LT <= 0.0:  # N held at or above N_cr,z or N_cr,T in M_cr: no bending resistance
        terms["eq-6.61"] = terms["eq-6.62"] = terms["elastic-buckling"] = math.inf
        return _verdict(enabled, terms, facts, notes, source)
    C_mLT = None
    if settings.annex == "B":
        C_my, C_mz = annex_b_factor(y.diagram, N, y.N_cr), annex_b_factor(z.diagram, N, z.N_cr)
        # Table B.2 for every I/H member that can twist out of plane, checked for LTB or not: χ_LT = 1
        # where the check could not be made does not make the member torsionally stiff (k_zy of Table B.1
        # would be smaller, on the unsafe side).
        held = ltb is not None and ltb.reason == "restrained"
        twisting = sy.shape in ("rolled_i", "welded_i") and My > 0.0 and not held
        lateral = C_my if lateral_diagram is None else annex_b_factor(lateral_diagram, N, y.N_cr)
        C_mLT = lateral if torsional or twisting else None
        common = dict(
            N_Ed=N,
            N_Rk=N_Rk,
            chi_y=chi_y,
            chi_z=chi_z,
            lambda_y=lam_y,
            lambda_z=lam_z,
            C_my=C_my,
            C_mz=C_mz,
            section_class=min(klass, 3),
            gamma_M1=g1,
        )
        if sy.shape in ("rolled_i", "welded_i"):
            common["C_mLT"] = C_mLT
        if torsional and sy.shape not in ("rolled_i", "welded_i", "custom"):
            # A deep RHS or a solid rectangle checked for lateral-torsional buckling (χ_LT < 1): Table B.1's
            # k_zy = 0.6 k_yy would treat it as torsionally stiff while eq. (6.62) counts its twist; each
            # factor the largest of Table B.1's rows and Table B.2 (an independent audit: a 40×250 mm
            # rectangle read 0.768 by eq. (6.62) with B.1 where B.2 gives 1.031, and Annex A 0.997).
            k, C_mLT = _largest_of_tables(common, lateral)
        elif sy.shape in ("rhs", "chs"):
            k = annex_b.interaction_factors(hollow=True, **common)
            C_mLT = None  # Table B.1 (hollow sections)
        elif sy.shape in ("rolled_i", "welded_i"):
            k = annex_b.interaction_factors(hollow=False, **common)
        elif sy.shape == "custom":  # any shape: each factor the largest of Table B.1's rows and Table B.2
            k, C_mLT = _largest_of_tables(common, lateral if My > 0.0 and not held else None)
        else:  # solid sections are in neither row of Table B.1: the larger k_zz of the two rows
            C_mLT = None
            k = max(
                annex_b.interaction_factors(hollow=True, **common),
                annex_b.interaction_factors(hollow=False, **common),
                key=lambda f: f.k_zz,
            )
    else:
        C_my = annex_a_factor(y.diagram, N, y.N_cr)
        C_mz = annex_a_factor(z.diagram, N, z.N_cr)
        terms_lt = _torsional_terms(ltb, y, z, N, My, Mz, material, settings) if torsional else None
        if terms_lt is not None and N >= terms_lt.N_cr_T:  # at or above torsional buckling (warping free)
            facts["N_cr_T"] = terms_lt.N_cr_T
            terms["elastic-buckling"] = math.inf
            return _verdict(enabled, terms, facts, notes, source)
        k = annex_a.interaction_factors(
            N_Ed=N,
            N_Rk=N_Rk,
            N_cr_y=y.N_cr,
            N_cr_z=z.N_cr,
            chi_y=chi_y,
            chi_z=chi_z,
            lambda_y=lam_y,
            lambda_z=lam_z,
            C_my=C_my,
            C_mz=C_mz,
            W_el_y=sy.W_el,
            W_pl_y=sy.W_pl,
            W_el_z=sz.W_el,
            W_pl_z=sz.W_pl,
            section_class=min(klass, 3),
            gamma_M1=g1,
            ltb=terms_lt,
        )
        if not torsional:
            notes.append("annex-A-lambda-0")
    found = annex_b.member_check(
        N_Ed=N,
        M_y_Ed=My,
        M_z_Ed=Mz,
        N_Rk=N_Rk,
        M_y_Rk=My_Rk,
        M_z_Rk=Mz_Rk,
        chi_y=chi_y,
        chi_z=chi_z,
        factors=k,
        chi_LT=chi_LT,
        gamma_M1=g1,
    )
    terms["eq-6.61"], terms["eq-6.62"] = found.eq_6_61, found.eq_6_62
    C_my = k.C_my if k.C_my is not None else C_my
    facts.update(C_my=C_my, C_mz=C_mz, k_yy=k.k_yy, k_yz=k.k_yz, k_zy=k.k_zy, k_zz=k.k_zz)
    if torsional or C_mLT is not None:
        facts["C_mLT"] = k.C_mLT
        facts["table_B"] = "B.2" if settings.annex == "B" and C_mLT is not None else None
    return _verdict(enabled, terms, facts, notes, source)


def _torsional_terms(check, y: Plane, z: Plane, N, My, Mz, material, settings) -> annex_a.TorsionalTerms:
    """Annex A's lateral-torsional terms for the member (see the module). λ̄_0 from the uniform-moment M_cr
    with fork supports and free warping (the smallest of the end conditions: the safe side), C1 the smaller
    of the table's and the exact ratio M_cr,0/M_cr,uniform, N_cr,T with the member length (warping free). A
    cantilever (a free end) takes twice its length in both (the built-in cantilever with warping free is the
    fork-ended span of 2L; no table C1)."""
    sy, sz = y.section, z.section
    E = material.E
    G = material.G if material.G is not None else E / 2.6
    L = check.length * (2.0 if "free" in tuple(check.lateral_ends) else 1.0)
    EI_z, GI_t, EI_w = E * sz.I, G * check.I_t, E * check.I_w
    uniform = ltb.mcr_c1(L, EI_z, GI_t, EI_w, 1.0)
    lambda_0 = math.sqrt(check.W_y * material.fy / uniform)
    C1 = check.C1 if math.isfinite(check.C1) else math.inf
    if math.isfinite(check.M_cr_0):
        C1 = min(C1, check.M_cr_0 / uniform)
    i0_sq = (sy.I + sz.I) / sy.A
    N_cr_T = (GI_t + math.pi**2 * EI_w / L**2) / i0_sq
    gamma = max(settings.gamma_M0, settings.gamma_M1)
    return annex_a.TorsionalTerms(
        a_LT=max(0.0, 1.0 - check.I_t / sy.I),
        lambda_0=lambda_0,
        C1=max(C1, 1e-6) if math.isfinite(C1) else 1.0,
        chi_LT=check.chi_LT,
        N_cr_T=N_cr_T,
        M_y_Ed=My,
        M_z_Ed=Mz,
        M_pl_y_Rd=sy.W_pl * material.fy / gamma,
        M_pl_z_Rd=sz.W_pl * material.fy / gamma,
        A=sy.A,
    )
