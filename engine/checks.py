r"""The cross-section check along the member with the second-order forces (EN 1993-1-1 §5.2.2(7)a route).

With the code's equivalent bow in an elastic second-order analysis, EN 1993-1-1:2005 §5.2.2(7)a asks only for
cross-section checks along the member (clause from memory; the route is described in Simões da Silva et al.,
*Design of Steel Structures*, ECCS 2010). At every station this module computes:

- **elastic** (any section): :math:`|N|/(A f_c) + |M|/(W_{el} f_y) \le 1/\gamma_{M0}`, the linear form of the
  elastic criterion of EN 1993-1-1 §6.2.1(7), eq. (6.2) (clause from memory). For steel :math:`f_c = f_y`, so
  it is :math:`\sigma = N/A + M/W_{el}` against :math:`f_y/\gamma_{M0}`; where the shear exceeds half the
  plastic shear resistance, :math:`M/W_{el}` is taken against :math:`(1-\rho)f_y` (§6.2.8(3), from memory, on
  the whole section as for the plastic check below: on the safe side);
- **plastic** N–M interaction for doubly symmetric I/H and hollow sections, EN 1993-1-1 §6.2.9.1 (from
  memory),
  and :math:`M_{N} = M_{pl}(1 - n^2)` for a solid rectangle [derived]; where the shear exceeds half the
  plastic
  shear resistance, the plastic moment is reduced by :math:`(1-\rho)` over the whole section (§6.2.8, applied
  conservatively to the whole section rather than the shear area);
- **shear**: :math:`|V| / (A_v f_y/(\sqrt{3}\gamma_{M0}))`, EN 1993-1-1 §6.2.6 eq. (6.18) (from memory);
- **deflection**: :math:`\max|w| / (L/n)`, the limit span/n of the check settings (span/250 by default, common
  practice, no source; national annexes rule). A serviceability check: the caller passes the deflection of the
  loads as given without the bow (:class:`engine.results.ServiceCheck`), and it never enters the governing
  utilisation.

The governing utilisation is the largest of the strength checks, which also set the capacity.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from engine.classification import compression_area, elastic_modulus, eq_5_9_modulus
from engine.codes import plastic_interaction, shear_reduction
from engine.design.ltb import LtbSettings
from engine.design.routes import ROUTES
from engine.errors import CaseError
from engine.out_of_plane import ELASTIC_KIND, ELASTIC_SOURCE, KIND
from engine.shear_area import axial_ratio, shear_area_kept
from engine.shear_buckling import shear_resistance

__all__ = [
    "ANNEXES",
    "AISC_ANALYSES",
    "AISC_METHODS",
    "CheckSettings",
    "DEFAULT_ROUTES",
    "EQ_5_9_KIND",
    "IN_PLANE_ELASTIC_KIND",
    "IN_PLANE_ELASTIC_SOURCE",
    "MemberCheck",
    "check_member",
    "METHODS",
]

#: The member check's kind where N/Pcr1 of a plane analysed without a bow governs (a bound, see check_member).
IN_PLANE_ELASTIC_KIND = "in-plane elastic buckling"
IN_PLANE_ELASTIC_SOURCE = (
    "Euler: the exact first critical load Pcr1 of the plane; a code's buckling resistance does not exceed "
    "it, so N/Pcr1 is a bound of the code's utilisation where no bow makes the analysis see buckling, and "
    "for a material other than steel, whose code's buckling check is not made here (common practice, no "
    "source)"
)

#: The kind of the linear member check of the eq. (5.9) route.
EQ_5_9_KIND = "linear N–M, eq. (5.9) route"

METHODS = ("elastic", "plastic")
#: The interaction factors of EN 1993-1-1 §6.3.3: Annex B (method 2) or Annex A (method 1).
ANNEXES = ("B", "A")
#: AISC 360-16 design methods: resistance factors φ (LRFD) or safety factors Ω (ASD).
AISC_METHODS = ("LRFD", "ASD")
#: How the aisc route's M_r and P_c are found: AISC 360-16 Appendix 7's effective length method (the nominal
#: stiffness, K from the exact critical load) or Chapter C's direct analysis method (§C2.3's reduced
#: stiffness 0.8·τ_b, §C3's L_c = L unless the exact critical load is higher).
AISC_ANALYSES = ("effective-length", "direct")
#: The routes enabled by default (the headline is the larger of them; AISC is shown for comparison).
DEFAULT_ROUTES = ("second-order", "en-member")
_PLASTIC_SHAPES = ("rolled_i", "welded_i", "rhs", "chs", "rectangle")

_SOURCES = {
    "elastic": "EN 1993-1-1:2005 §6.2.1(7), eq. (6.2), linear form, and §6.2.8 (clauses from memory)",
    "plastic": "EN 1993-1-1:2005 §6.2.9.1 and §6.2.8 (clause numbers from memory)",
    "shear": "EN 1993-1-1:2005 §6.2.6, eq. (6.18) (from memory)",
    "eq-5.9": (
        "EN 1993-1-1:2005 §5.3.2(11), eqs. (5.9)–(5.10), with N/(N_Rk/γ_M1) + M/(M_Rk/γ_M1) <= 1 "
        "(from memory)"
    ),
    "deflection": "span/n deflection limit: national annexes; span/250 common practice, no source",
}


#: Why a check above the first critical load is +inf.
BEYOND_CRITICAL_SOURCE = (
    "Euler; Timoshenko & Gere (1961) ch. 2: no stable equilibrium above the first critical load"
)


@dataclass(frozen=True, kw_only=True)
class CheckSettings:
    """How the member is checked.

    Attributes
    ----------
    method : str
        ``"elastic"`` or ``"plastic"`` (cross-section resistance to N and M).
    gamma_M0, gamma_M1 : float
        Partial factors [-], 1.0 by default (EN 1993-1-1 recommends 1.0; national annexes may differ).
    deflection_limit : float
        n of the limit span/n [-], 250 by default.
    routes : tuple of str
        The routes of the member check that count toward the headline utilisation
        (:data:`engine.design.routes.ROUTES`), in that order; a list is accepted. Default
        ``("second-order", "en-member")``. Every route is computed; the others are shown for comparison.
    annex : str
        ``"B"`` (default: EN 1993-1-1 Annex B, method 2) or ``"A"`` (Annex A, method 1): the interaction
        factors of the ``en-member`` route.
    aisc_method : str
        ``"LRFD"`` (default, resistance factors φ) or ``"ASD"`` (safety factors Ω) for the ``aisc`` route.
    aisc_analysis : str
        ``"effective-length"`` (default) or ``"direct"``: the ``aisc`` route's method of analysis
        (:data:`AISC_ANALYSES`).
    ltb : LtbSettings
        The lateral-torsional buckling check's restraints and load position (case key ``check.ltb``, a
        mapping accepted; :class:`engine.design.ltb.LtbSettings`).
    """

    method: str = "elastic"
    gamma_M0: float = 1.0
    gamma_M1: float = 1.0
    deflection_limit: float = 250.0
    routes: tuple = DEFAULT_ROUTES
    annex: str = "B"
    aisc_method: str = "LRFD"
    aisc_analysis: str = "effective-length"
    ltb: LtbSettings = LtbSettings()

    def __post_init__(self) -> None:
        self._check_routes()
        object.__setattr__(self, "ltb", LtbSettings.from_data(self.ltb))
        for name, allowed in (
            ("annex", ANNEXES),
            ("aisc_method", AISC_METHODS),
            ("aisc_analysis", AISC_ANALYSES),
        ):
            value = getattr(self, name)
            if not isinstance(value, str) or value not in allowed:
                raise CaseError(
                    f"check.{name}: {value!r} is not allowed; allowed: " + ", ".join(repr(a) for a in allowed)
                )
        if self.method not in METHODS:
            raise CaseError(
                f"check.method: {self.method!r} is not a check method; allowed: 'elastic', 'plastic'"
            )
        for name, low, high in (
            ("gamma_M0", 0.5, 3.0),
            ("gamma_M1", 0.5, 3.0),
            ("deflection_limit", 1.0, 10000.0),
        ):
            value = getattr(self, name)
            if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
                raise CaseError(f"check.{name}: {value!r} must be a finite number from {low:g} to {high:g}")
            if not low <= value <= high:
                raise CaseError(f"check.{name}: {value!r} must be from {low:g} to {high:g}")
            object.__setattr__(self, name, float(value))

    def _check_routes(self) -> None:
        """``routes``: a non-empty list of known routes without repeats, kept in the order of ROUTES."""
        given = self.routes
        allowed = ", ".join(repr(r) for r in ROUTES)
        if isinstance(given, (str, bytes)) or not isinstance(given, (list, tuple)):
            raise CaseError(f"check.routes: {given!r} must be a list of routes; allowed: {allowed}")
        if not given:
            raise CaseError(f"check.routes: [] must name at least one route; allowed: {allowed}")
        for item in given:
            if not isinstance(item, str) or item not in ROUTES:
                raise CaseError(f"check.routes: {item!r} is not a route; allowed: {allowed}")
        if len(set(given)) != len(given):
            raise CaseError(f"check.routes: {list(given)!r} names a route twice; allowed: {allowed}")
        object.__setattr__(self, "routes", tuple(r for r in ROUTES if r in given))

    def to_dict(self) -> dict:
        """The case-file form (the route keys only where they differ from the defaults, so that a schema-1
        file written before them reads back the same)."""
        data = {
            "method": self.method,
            "gamma_M0": self.gamma_M0,
            "gamma_M1": self.gamma_M1,
            "deflection_limit": self.deflection_limit,
        }
        if self.routes != DEFAULT_ROUTES:
            data["routes"] = list(self.routes)
        if self.annex != "B":
            data["annex"] = self.annex
        if self.aisc_method != "LRFD":
            data["aisc_method"] = self.aisc_method
        if self.aisc_analysis != "effective-length":
            data["aisc_analysis"] = self.aisc_analysis
        if self.ltb != LtbSettings():
            data["ltb"] = self.ltb.to_dict()
        return data


@dataclass(frozen=True, kw_only=True, eq=False)
class MemberCheck:
    """The member check at every station, and what governs.

    Attributes
    ----------
    settings : CheckSettings
    utilization : float
        The governing strength utilisation [-] (the deflection check is a separate service check).
    kind : str
        Which check governs: ``"elastic stress"``, ``"plastic N–M"`` or ``"shear"``.
    x : float
        Where it governs [m].
    source : str
        The governing check's clause.
    strength_utilization : float
        The governing utilisation of the strength checks alone (what the capacity finder drives to 1) [-].
    strength_kind : str
    stations : ndarray
        The governing strength utilisation at each station of the result [-].
    axial_bending, shear : ndarray
        The N–M (elastic or plastic) and the shear utilisation at each station [-].
    deflection_utilization : float
        max|w| / (L/n) [-].
    max_deflection, deflection_allowed : float
        [m].
    resistances : dict
        N_Rd [N], M_Rd [N·m] (elastic or plastic), V_Rd [N] (None where not checked). The two-plane check
        (:mod:`engine.biaxial`) adds M_Rd_y and M_Rd_z [N·m] (about the major and the minor axis) and V_Rd_z
        and V_Rd_y [N] (the shear of the major-axis and of the minor-axis plane); M_Rd and V_Rd are then the
        first plane's.
    notes : tuple of str
        What was not checked, or checked another way than asked.
    section_class : SectionClass or None
        EN 1993-1-1 Table 5.2 class (:mod:`engine.classification`), None where not classified.
    out_of_plane : OutOfPlane or None
        Flexural buckling about the other axis (EN 1993-1-1 §6.3.1): N/N_b,Rd in ``utilization``, or why it
        was not checked; it is part of ``strength_utilization`` (kind ``"out-of-plane buckling"``). Where it
        was not checked but N_cr about that axis is known, N/N_cr is (kind ``"out-of-plane elastic
        buckling"``, a bound: :mod:`engine.out_of_plane`).
    in_plane_utilization : float
        The in-plane strength utilisation alone (cross-section checks along the member) [-].
    in_plane_kind : str
    in_plane_source : str
        The source of the in-plane checks, which ``notes`` are about ("" where the check does not say; then
        ``source``).
    at : ndarray or None
        Where ``stations``, ``axial_bending`` and ``shear`` are [m] when that is not the result's ``x``: the
        two-plane check (:mod:`engine.biaxial`) runs on the stations of both planes merged; None otherwise.
    valid : bool
        False when the result cannot stand: a class 4 section in compression (its gross-section resistance
        does not apply) or an axial force above the first critical load; the utilisation is then +inf.
    """

    settings: CheckSettings
    utilization: float
    kind: str
    x: float
    source: str
    strength_utilization: float
    strength_kind: str
    stations: np.ndarray
    axial_bending: np.ndarray
    shear: np.ndarray
    deflection_utilization: float
    max_deflection: float
    deflection_allowed: float
    resistances: dict = field(default_factory=dict)
    notes: tuple = ()
    section_class: object = None
    valid: bool = True
    out_of_plane: object = None
    in_plane_utilization: float | None = None
    in_plane_kind: str = ""
    in_plane_source: str = ""
    at: np.ndarray | None = None


def method_used(asked: str, shape: str, material, section_class, plastic_shapes=_PLASTIC_SHAPES):
    """The check method actually used, and why it differs from the one asked for (a list of notes).

    The plastic check needs a shape it has rules for (``plastic_shapes``), a material other than timber, and a
    section of class 1 or 2; otherwise the elastic check is used and a note says why.
    """
    notes = []
    method = asked
    if method == "plastic" and (shape not in plastic_shapes or material.kind == "timber"):
        notes.append(
            f"The plastic check does not apply to a {shape} section of {material.kind}; "
            "the elastic check is used instead."
        )
        method = "elastic"
    klass = section_class.klass if section_class is not None else None
    if method == "plastic" and klass is not None and klass >= 3:
        notes.append(
            f"The section is {section_class.describe()}: the plastic check needs class 1 or 2, "
            "so the elastic check is used instead."
        )
        method = "elastic"
    return method, notes


def check_member(
    *,
    x,
    axial_force,
    moment,
    shear,
    deflection,
    length,
    section,
    material,
    axis,
    settings: CheckSettings,
    route: str | None = None,
    section_class=None,
    beyond_critical: bool = False,
    out_of_plane=None,
    in_plane_bound: float | None = None,
) -> MemberCheck:
    """Check the cross-section at every station with the second-order forces.

    Parameters
    ----------
    x : ndarray
        Stations [m].
    axial_force : float
        N [N], compression positive (the check uses |N|).
    moment, shear : ndarray
        M [N·m] and V [N] at the stations.
    deflection : ndarray
        w [m] for the deflection check: the caller's service deflection (any length; its largest |w| counts).
    length : float
        L [m], for the deflection limit.
    section : Section
    material : Material
    axis : str
    settings : CheckSettings
    route : str or None
        ``"eq-5.9"`` when the bow is the eq. (5.9) preset: the linear member check with γ_M1 is added.
    section_class : SectionClass or None
        The section's class (:func:`engine.classification.classify`), None when not classified.
    beyond_critical : bool
        The axial force is above the first critical load: the check fails (utilisation +inf).
    out_of_plane : OutOfPlane or None
        The out-of-plane flexural buckling check at this axial force (:mod:`engine.out_of_plane`); its
        N/N_b,Rd joins the strength utilisation.
    in_plane_bound : float or None
        N/Pcr1 of the plane analysed when it has no bow (:data:`IN_PLANE_ELASTIC_KIND`): without a bow the
        stresses do not see buckling until N reaches Pcr1, and no code's buckling resistance exceeds the
        elastic critical load, so it counts as a bound. None otherwise.

    Returns
    -------
    MemberCheck
    """
    g0 = settings.gamma_M0
    N = abs(float(axial_force))
    M = np.abs(np.asarray(moment, dtype=float))
    V = np.abs(np.asarray(shear, dtype=float))
    fy, fc = material.fy, material.axial_strength(axial_force)  # f_t in tension where known (timber)
    steel_like = material.kind in ("steel", "aluminium", "custom")
    method, notes = method_used(settings.method, section.shape, material, section_class)
    klass = section_class.klass if section_class is not None else None
    # V_pl,Rd, or the smaller V_b,Rd of a web slender in shear (EN 1993-1-5 §5, engine.shear_buckling)
    V_Rd = shear_resistance(section, material, axis, g0, settings.gamma_M1) if steel_like else None
    with np.errstate(divide="ignore", invalid="ignore"):
        area = compression_area(section, section_class, float(axial_force))  # A_eff: class 4 in compression
        # §6.2.8: beyond half of V_pl,Rd the shear takes (1 − ρ) of f_y from the moment resistance, in the
        # elastic check as in the plastic one (applied to the whole section: on the safe side)
        rho = shear_reduction(V, V_Rd) if V_Rd is not None else np.zeros_like(V)
        # §6.2.10(3): the axial resistance too, with (1 − ρ)f_y in the shear area A_v
        kept = shear_area_kept(area, ((rho, section.A_v),))
        if method == "elastic":
            N_Rd = area * fc / g0
            M_Rd = elastic_modulus(section, section_class) * fy / g0  # W_eff of a class 4 section
            n = axial_ratio(N, kept * fc / g0)
            ab = n + np.where(M > 0, M / (M_Rd * (1.0 - rho)), 0.0)  # ρ = 1: no moment resistance
            kind_ab = "elastic stress"
        else:
            fa = min(fy, fc)  # the plastic axial resistance: f_y, or a material's lower f_c or f_t
            N_Rd = area * fa / g0
            M_Rd = section.W_pl * fy / g0
            n = axial_ratio(N, kept * fa / g0)
            if section.shape == "rectangle":
                reduced = np.maximum(0.0, 1.0 - n * n)
            else:
                reduced = plastic_interaction(
                    shape=section.shape, axis=axis, n=np.minimum(n, 1.0), a=section.interaction_a
                )
            capacity = M_Rd * reduced * (1.0 - rho)
            ab = np.where(M > 0, np.maximum(n, M / capacity), n)
            ab = np.where(np.isnan(ab), np.inf, ab)
            kind_ab = "plastic N–M"
        sh = V / V_Rd if V_Rd is not None else np.zeros_like(V)
        linear = None
        if route == "eq-5.9" and float(axial_force) > 0:  # a stability check: compression only
            linear = _eq_5_9_linear(N, M, section, material, settings, area)
            ab_section = ab
            ab = np.maximum(ab, linear)
    if linear is not None:
        notes.append(_eq_5_9_note(settings.method, method, settings.gamma_M1))
    if V_Rd is None:
        notes.append("Shear is not checked for timber (no shear strength is given for it).")
    strength = np.maximum(ab, sh)
    i = int(np.argmax(strength))
    s_kind = kind_ab if ab[i] >= sh[i] else "shear"
    if linear is not None and s_kind != "shear" and linear[i] >= ab_section[i]:
        s_kind = EQ_5_9_KIND
    s_value = float(strength[i])
    w_abs = np.abs(np.asarray(deflection, dtype=float))
    j = int(np.argmax(w_abs))
    allowed = length / settings.deflection_limit
    d_util = float(w_abs[j] / allowed)
    # Serviceability stays out of the headline: the governing utilisation is strength and stability.
    kind, value, where = s_kind, s_value, float(x[i])
    source = _SOURCES["shear"] if s_kind == "shear" else _SOURCES[method]
    if s_kind == EQ_5_9_KIND:
        source = _SOURCES["eq-5.9"]
    in_plane_value, in_plane_kind, in_plane_source = s_value, s_kind, source
    u_out = None if out_of_plane is None else out_of_plane.utilization
    bound = None if out_of_plane is None else out_of_plane.elastic_bound
    if u_out is not None and u_out > s_value:
        # The member check about the other axis governs (x: mid-length, a member-level check).
        s_value, s_kind = u_out, KIND
        kind, value, where, source = KIND, s_value, 0.5 * length, out_of_plane.source
    elif bound is not None and bound > s_value:
        # No code check about the other axis here, but its elastic critical load bounds any code's resistance.
        s_value, s_kind = bound, ELASTIC_KIND
        kind, value, where, source = ELASTIC_KIND, s_value, 0.5 * length, ELASTIC_SOURCE
    if in_plane_bound is not None and in_plane_bound > s_value:
        s_value, s_kind = in_plane_bound, IN_PLANE_ELASTIC_KIND
        kind, value, where, source = IN_PLANE_ELASTIC_KIND, s_value, 0.5 * length, IN_PLANE_ELASTIC_SOURCE
    valid = True
    # Class 4 under the forces present (compression, or bending: a web or flange that buckles locally in
    # its compressed part): the gross-section resistance is not valid. The danger caution says why.
    # A class 4 section whose effective properties are known is checked by eq. (6.44) with A_eff and W_eff:
    # the elastic check above (SectionClass.effective).
    effective = section_class is not None and section_class.effective
    if klass == 4 and not effective and (N > 0 or float(M.max(initial=0.0)) > 0.0):
        kind = s_kind = "class 4 section"
        value = s_value = math.inf
        source = section_class.source
        valid = False
    if beyond_critical:
        kind = s_kind = "elastic buckling"
        value = s_value = math.inf
        source = BEYOND_CRITICAL_SOURCE
        valid = False
    return MemberCheck(
        settings=settings,
        utilization=value,
        kind=kind,
        x=where,
        source=source,
        strength_utilization=s_value,
        strength_kind=s_kind,
        stations=strength,
        axial_bending=ab,
        shear=sh,
        deflection_utilization=d_util,
        max_deflection=float(w_abs[j]),
        deflection_allowed=allowed,
        resistances={"N_Rd": N_Rd, "M_Rd": M_Rd, "V_Rd": V_Rd},
        notes=tuple(notes),
        section_class=section_class,
        valid=valid,
        out_of_plane=out_of_plane,
        in_plane_utilization=in_plane_value,
        in_plane_kind=in_plane_kind,
        in_plane_source=in_plane_source,
    )


def _eq_5_9_linear(N, M, section, material, settings, area):
    """N/(N_Rk/γ_M1) + M/(M_Rk/γ_M1) at every station, with the M_Rk of eq. (5.10) and N_Rk = area·f_y (A_eff
    for a section class 4 in uniform compression, as the bow of eq. (5.9) took it) [-]."""
    g1 = settings.gamma_M1
    W = eq_5_9_modulus(section, material, settings.method)
    return N * g1 / (area * material.fy) + M * g1 / (W * material.fy)


def _eq_5_9_note(asked: str, used: str, g1: float) -> str:
    if asked == "plastic" and used == "plastic":
        extra = (
            "The plastic §6.2.9 interaction is not used for this member check: eq. (5.10)'s e0 is "
            "derived for the linear interaction (with M_Rk = W_pl f_y), which reproduces χ·N_Rk/γ_M1 "
            "exactly, whereas the plastic interaction would overshoot it; the plastic check is kept for "
            "the cross-section with γ_M0."
        )
    else:
        extra = "The cross-section check with γ_M0 is made as well."
    return (
        "Eq. (5.9) route: the member is checked with the linear interaction "
        f"N/(N_Rk/γ_M1) + M/(M_Rk/γ_M1) <= 1 (γ_M1 = {g1:g}), which reaches 1 at "
        "N_b,Rd = χ·A·f_y/γ_M1 for the bow alone. " + extra
    )
