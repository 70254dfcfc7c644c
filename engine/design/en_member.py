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
the class the worse of the section's classes about both axes (:mod:`engine.classification`); class 4 and
unclassified sections, custom sections and materials other than steel: the route is not applied.

Beside eqs. (6.61)/(6.62) the route makes the cross-section checks that an equivalent-member check always
goes with (EN 1993-1-1 §6.2, from memory): the linear interaction of §6.2.1(7), eq. (6.2),
:math:`|N|/N_{Rd} + M_{y,Ed}/M_{y,Rd} + M_{z,Ed}/M_{z,Rd}` with :math:`\gamma_{M0}` (conservative: the largest
moments wherever they are), and the shear :math:`V_{Ed}/V_{pl,Rd}` of eq. (6.18) in each plane. Without them
a small axial force and :math:`C_m < 1` would pass a member whose end section is overstressed.

Lateral-torsional buckling is not checked yet: :math:`\chi_{LT} = 1` (note ``chi-LT-1``). In tension or with
no axial force (:math:`N \le 0`) eqs. (6.61)/(6.62) do not apply (they are stability checks of a compressed
member) and the route is the cross-section checks alone, with the first-order moments (tension reduces them,
so this is on the safe side).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from engine import codes
from engine.design import annex_a, annex_b
from engine.design.diagram import Diagram, annex_a_factor, annex_b_factor
from engine.design.routes import RouteCheck

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
    """

    axis: str
    section: object
    N_cr: float
    EI: float
    diagram: Diagram
    M_second: float | None
    N_cr_source: str = "exact"
    curve: str | None = None

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


def not_applied(route: str, enabled: bool, reason: str, source: str = "") -> RouteCheck:
    """A route that cannot be applied to this member: utilisation None and why."""
    return RouteCheck(route=route, enabled=enabled, utilization=None, reason=reason, source=source)


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
    *, y: Plane, z: Plane, N: float, material, section_class, settings, enabled: bool, beyond: bool = False
) -> RouteCheck:
    """The ``en-member`` route for a member with planes ``y`` and ``z`` at axial force ``N`` (compression
    positive) [N]. ``section_class`` is the worse class about both axes (a SectionClass or None); ``beyond``:
    N is at or above the first critical load of the plane analysed."""
    source = SOURCE.format(annex=settings.annex)
    if section_class is None:
        return not_applied("en-member", enabled, "section-not-classified", source)
    klass = section_class.klass
    if klass == 4:
        return not_applied("en-member", enabled, "section-class-4", source)
    g0, g1, fy = settings.gamma_M0, settings.gamma_M1, material.fy
    sy, sz = y.section, z.section
    plastic = klass <= 2
    N_Rk = sy.A * fy
    My_Rk = (sy.W_pl if plastic else sy.W_el) * fy
    Mz_Rk = (sz.W_pl if plastic else sz.W_el) * fy
    My, Mz = y.diagram.M_max, z.diagram.M_max
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
        "chi_LT": 1.0,
        "form_y": y.diagram.form,
        "form_z": z.diagram.form,
    }
    terms = {
        "cross-section": abs(N) * g0 / N_Rk + My * g0 / My_Rk + Mz * g0 / Mz_Rk,
        "shear": max(
            p.diagram.V_max * g0 * math.sqrt(3.0) / (p.section.A_v * fy) for p in (y, z) if p.section.A_v > 0
        ),
    }
    notes = ["chi-LT-1"] if My > 0.0 and sy.shape not in ("chs", "round") else []
    for p in (y, z):
        curve = p.curve if p.curve is not None else curve_of(p.section, material)[0]
        lam = 0.0 if math.isinf(p.N_cr) else codes.slenderness(p.section.A, fy, p.N_cr)
        facts[f"curve_{p.axis}"] = curve
        facts[f"N_cr_{p.axis}"] = p.N_cr
        facts[f"N_cr_{p.axis}_source"] = p.N_cr_source
        facts[f"L_cr_{p.axis}"] = p.L_cr
        facts[f"lambda_{p.axis}"] = lam
        facts[f"chi_{p.axis}"] = codes.reduction_factor(lam, curve)
    if N <= 0.0:
        notes.append("en-member-cross-section-only")
        return _verdict(enabled, terms, facts, notes, source)
    # At or above a critical load of a plane whose solution the route reads (the plane analysed, or a plane
    # with moments), the moments have no stable equilibrium: unbounded, as the second-order route says. Annex
    # A's μ and 1/(1 - N/N_cr) turn negative above any critical load. Above the critical load of a plane
    # without moments, Annex B's equations hold and exceed 1 by themselves (N > N_cr >= χ N_Rk).
    if beyond or any(N >= p.N_cr and (p.diagram.M_max > 0.0 or settings.annex == "A") for p in (y, z)):
        terms["elastic-buckling"] = math.inf
        return _verdict(enabled, terms, facts, notes, source)
    chi_y, chi_z = facts["chi_y"], facts["chi_z"]
    lam_y, lam_z = facts["lambda_y"], facts["lambda_z"]
    if settings.annex == "B":
        C_my, C_mz = annex_b_factor(y.diagram), annex_b_factor(z.diagram)
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
        if sy.shape in ("rhs", "chs"):
            k = annex_b.interaction_factors(hollow=True, **common)
        elif sy.shape in ("rolled_i", "welded_i"):
            k = annex_b.interaction_factors(hollow=False, **common)
        else:  # solid sections are in neither row of Table B.1: the larger k_zz of the two rows
            k = max(
                annex_b.interaction_factors(hollow=True, **common),
                annex_b.interaction_factors(hollow=False, **common),
                key=lambda f: f.k_zz,
            )
    else:
        C_my = annex_a_factor(y.diagram, N, y.N_cr)
        C_mz = annex_a_factor(z.diagram, N, z.N_cr)
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
        )
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
        gamma_M1=g1,
    )
    terms["eq-6.61"], terms["eq-6.62"] = found.eq_6_61, found.eq_6_62
    facts.update(C_my=C_my, C_mz=C_mz, k_yy=k.k_yy, k_yz=k.k_yz, k_zy=k.k_zy, k_zz=k.k_zz)
    return _verdict(enabled, terms, facts, notes, source)
