"""Result objects: the solution at stations, governing values, reactions, amplification and equilibrium.

All values are SI: m, rad, N, N·m. Arrays are numpy float arrays at the stations ``x``.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass, field

import numpy as np

__all__ = [
    "Peak",
    "Governing",
    "Reactions",
    "Approximation",
    "Amplification",
    "AMPLIFICATION_DEFINITIONS",
    "Equilibrium",
    "Result",
    "ServiceCheck",
    "SweepResult",
]

#: What each amplification ratio divides by what, in words (shown beside every value).
AMPLIFICATION_DEFINITIONS = {
    "moment": "max|M_II| / max|M_I + N·w0| (the first-order moment plus the bow's moment N·w0)",
    "moment_first_order": "max|M_II| / max|M_I| (the first-order moment alone; the bow's moment counts as "
    "amplification)",
    "moment_bow_free": "max|M_II| / max|M_I| of the member without its bow (the basis of AISC B1, whose P_c "
    "holds the out-of-straightness)",
    "deflection": "max|w + w0| / max|w_I + w0|",
}


@dataclass(frozen=True, kw_only=True)
class Peak:
    """A governing value: the signed value where |value| is largest, and where.

    Attributes
    ----------
    value : float
        Signed value at the peak of its magnitude [its unit].
    x : float
        Position [m].
    """

    value: float
    x: float

    @property
    def magnitude(self) -> float:
        """``abs(value)``."""
        return abs(self.value)


@dataclass(frozen=True, kw_only=True)
class Governing:
    """The governing values of one solution.

    Attributes
    ----------
    deflection : Peak
        Largest |w|, the deflection caused by loading [m].
    total_offset : Peak
        Largest |w + w0|, the offset from the straight line [m].
    moment : Peak
        Largest |M| [N·m].
    shear : Peak
        Largest |V|, normal to the deformed axis [N].
    transverse_force : Peak
        Largest |T|, perpendicular to the undeformed axis [N].
    """

    deflection: Peak
    total_offset: Peak
    moment: Peak
    shear: Peak
    transverse_force: Peak


@dataclass(frozen=True, kw_only=True)
class Reactions:
    """Support-side end values of T [N] and M [N·m] (conventions.md signs).

    The force the left support exerts on the member in the +w direction is ``-left_T``; at the right end it is
    ``+right_T``. Where no load or couple acts exactly at an end these equal the end values of the arrays.
    """

    left_T: float
    left_M: float
    right_T: float
    right_M: float
    #: the intermediate restraints' reactions (engine.restraints.RestraintReaction), in the case's order
    intermediate: tuple = ()


@dataclass(frozen=True, kw_only=True)
class Approximation:
    """One practitioner's approximation of the moment amplification.

    Attributes
    ----------
    name : str
        Short formula name.
    value : float
        The approximate amplification [-].
    source : str
        Where the formula is published.
    error : float or None
        ``(value - exact) / exact`` against the exact amplification named by ``compared_with`` [-].
    compared_with : str
        The key in :data:`AMPLIFICATION_DEFINITIONS` of the exact value it is compared with: ``"moment"``
        (reference M_I + N·w0), or ``"moment_bow_free"`` for AISC B1.
    """

    name: str
    value: float
    source: str
    error: float | None
    compared_with: str = "moment"


@dataclass(frozen=True, kw_only=True)
class Amplification:
    """Exact second-order / first-order ratios and the approximations beside them.

    Each ratio's definition is in :data:`AMPLIFICATION_DEFINITIONS`.

    Attributes
    ----------
    moment : float or None
        max|M_II| / max|M_I + N·w0| [-]: the reference includes the bow's moment N·w0 (the same footing as the
        deflection's); None when the reference is zero.
    deflection : float or None
        max|w + w0| / max|w_I + w0| [-]; None when the first-order offset is zero.
    approximations : tuple of Approximation
    moment_first_order : float or None
        max|M_II| / max|M_I| [-], the first-order moment alone as the reference.
    moment_bow_free : float or None
        max|M_II| / max|M_I| of the member without its bow [-] (AISC B1 is compared with it); equal to
        ``moment_first_order`` without a bow, None where it was not computed (a bow, and neither a member
        check nor B1).
    reference_moment : float or None
        max|M_I + N·w0| [N·m].
    reference_moment_x : float or None
        Where [m] (None when it is the first-order peak, without a bow).
    moment_asd : float or None
        max|M| [N·m] of the member without its bow solved at 1.6·N (AISC 360-16 §C2.1: ASD's analysis at 1.6
        × its loads, the forces divided by 1.6; the transverse loads enter linearly): the aisc route's M_r
        with ``check.aisc_method`` ASD; +inf at or above the first critical load; None otherwise. A member
        with an end that can translate is solved out of plumb as ``moment_out_of_plumb`` is.
    moment_out_of_plumb : float or None
        max|M| [N·m] of the member without its bow, out of plumb by 1/500 (AISC 360-16 §C2.2a's notional load
        0.002·Y_i, from memory) whichever way is worse: the aisc route's M_r of a member in compression with
        an end that can translate; +inf at or above the first critical load; None otherwise.
    moment_direct : float or None
        The aisc route's M_r [N·m] by the direct analysis method (``check.aisc_analysis`` ``"direct"``, AISC
        360-16 §C2.3, from memory): the member without its bow with every stiffness at 0.8·τ_b, out of plumb
        by 1/500 where it can sway, at the route's method (ASD at 1.6 × its loads, divided by 1.6); +inf where
        that member has no equilibrium; None otherwise (:mod:`engine.aisc_moments`).
    moment_untilted : float or None
        The aisc route's M_r [N·m] at its own analysis (ASD at 1.6·N, the direct analysis method at αN/c)
        without the out-of-plumb tilt, for the check with the notional load about the other axis of a
        one-plane case that sways about it (AISC 360-16 Appendix 7 §7.2.2 and §C2.2b: notional loads
        applied independently in each of two orthogonal directions, from memory); None where not needed.
    """

    moment: float | None
    deflection: float | None
    approximations: tuple = ()
    moment_first_order: float | None = None
    moment_bow_free: float | None = None
    reference_moment: float | None = None
    reference_moment_x: float | None = None
    moment_asd: float | None = None
    moment_out_of_plumb: float | None = None
    moment_direct: float | None = None
    moment_untilted: float | None = None


@dataclass(frozen=True, kw_only=True)
class ServiceCheck:
    """The deflection check, a serviceability check kept apart from the strength utilisation.

    Made on the loads as given (strutscope has no load combinations yet), in second order at the case's axial
    force, without the code's equivalent bow (an ultimate-state device). Give service loads for it.

    Attributes
    ----------
    utilization : float
        max|w| / (L/n) [-].
    deflection : float
        Signed w where |w| is largest [m].
    x : float
        Where [m].
    allowed : float
        L/n [m].
    limit : float
        n [-].
    basis : str
    source : str
    """

    utilization: float
    deflection: float
    x: float
    allowed: float
    limit: float
    basis: str = (
        "second order at the axial force given, on the loads as given (no load combinations), "
        "without the initial bow; use service loads"
    )
    source: str = "span/n deflection limit: national annexes; span/250 common practice, no source"


@dataclass(frozen=True, kw_only=True)
class Equilibrium:
    """Relative residuals of whole-member equilibrium, recomputed from the end values and the loads.

    Attributes
    ----------
    transverse : float
        ``(T(0) - T(L) - total load) / scale`` [-].
    moment : float
        Moment about the right end, including the axial force times the end offset difference, over its
        scale [-].
    """

    transverse: float
    moment: float


@dataclass(frozen=True, kw_only=True, eq=False)
class Result:
    """The solution of one case.

    Attributes
    ----------
    case : Case
    axial_force : float
        [N], compression positive.
    x : ndarray
        Stations [m]: both ends, every node (twice where a point load or couple acts), the uniform grid
        and the
        interior peaks of w, w + w0, M and V.
    deflection, rotation : ndarray
        w [m] and w' [rad] of the deflection caused by loading.
    initial_bow, total_offset : ndarray
        w0 and w + w0 [m].
    moment, shear, transverse_force : ndarray
        M [N·m], V [N] and T [N].
    status : str
        ``"stable"``, ``"unstable"`` (above the first critical load) or ``"critical"`` (at a critical load:
        no equilibrium exists and every response value is +inf).
    stable : bool
    message : str
    critical_loads : ndarray
        The first five elastic critical loads [N].
    buckling : Buckling
    alpha_cr : float
        ``Pcr1 / P`` for compression, inf otherwise [-].
    governing : Governing
    reactions : Reactions
    amplification : Amplification
    equilibrium : Equilibrium or None
        None at a critical load.
    first_order : Result or None
        The same case with P = 0, at the same stations (None for the first-order result itself); built on
        first access.
    EI : float
        The bending stiffness the analysis used [N·m²] (stiffness factor applied).
    section : Section or None
        The section's properties about the chosen axis, when the case gives a section.
    material : Material or None
    bow : BowChoice or None
        The initial bow used and why (code preset, curve), when the case gives a section, material or preset.
    check : MemberCheck or None
        The member check along the member with these second-order forces (section and material needed).
    utilization : float or None
        The governing strength and stability utilisation of ``check`` [-] (the deflection check is apart, in
        ``service``); +inf at a critical load; None without a section.
    service : ServiceCheck or None
        The deflection check on the loads as given without the bow (section and material needed).
    cautions : tuple of Caution
        Most severe first; the general caution is always there (not on ``first_order``).
    second_plane : Result or None
        The solution of the second bending plane (bending about the other axis, same axial force) when the
        case has a ``second_plane``; None for a one-plane case.
    routes : tuple of RouteCheck
        Each route of the member check (:mod:`engine.design.routes`), in the order of ``ROUTES``; empty
        without a section and material.
    actions : ActionsResult or None
        A case with load cases (:mod:`engine.envelope`): every combination solved, the envelopes and the
        governing combination of each check; this result is then the governing ultimate combination's, with
        ``service`` from the governing service combination. None for a case without actions.
    ltb : LtbCheck or None
        The member's lateral-torsional buckling check (:class:`engine.design.ltb_member.LtbCheck`; major
        axis, for the member in a two-plane case); None without a section and material.
    """

    case: object
    axial_force: float
    x: np.ndarray
    deflection: np.ndarray
    rotation: np.ndarray
    moment: np.ndarray
    shear: np.ndarray
    transverse_force: np.ndarray
    initial_bow: np.ndarray
    total_offset: np.ndarray
    status: str
    stable: bool
    message: str
    critical_loads: np.ndarray
    buckling: object = field(repr=False)
    alpha_cr: float
    governing: Governing
    reactions: Reactions
    amplification: Amplification
    equilibrium: Equilibrium | None
    _first_order_source: object = field(repr=False, default=None)
    EI: float = 0.0
    section: object = None
    material: object = None
    bow: object = None
    check: object = None
    utilization: float | None = None
    service: ServiceCheck | None = None
    cautions: tuple = ()
    second_plane: Result | None = None
    routes: tuple = ()
    actions: object = None
    ltb: object = None

    @functools.cached_property
    def first_order(self) -> Result | None:
        """The same case with P = 0, at the same stations (None for the first-order result itself)."""
        return None if self._first_order_source is None else self._first_order_source(self)

    @functools.cached_property
    def modes(self) -> np.ndarray:
        """The first five buckling mode shapes at ``x``, shape (5, len(x)), each with largest value +1 [-]."""
        return self.buckling.mode_shapes(self.x)


@dataclass(frozen=True, kw_only=True, eq=False)
class SweepResult:
    """Governing values for many axial forces (exact peaks, as in :class:`Result`).

    Attributes
    ----------
    axial_force : ndarray
        [N].
    peak_deflection, peak_deflection_x : ndarray
        max |w| [m] and where [m].
    peak_total_offset, peak_total_offset_x : ndarray
        max |w + w0| [m] and where.
    peak_moment, peak_moment_x : ndarray
        max |M| [N·m] and where.
    peak_shear, peak_shear_x : ndarray
        max |V| [N] and where.
    moment_amplification, deflection_amplification : ndarray
        Exact ratios [-]: max|M_II| / max|M_I + N·w0| and max|w + w0| / max|w_I + w0| (NaN only where the
        reference is zero); the moment reference's peak comes from a quadratic model about the best station.
    moment_amplification_first_order : ndarray
        max|M_II| / max|M_I| [-].
    simple_amplification : ndarray
        The approximation 1/(1 − P/Pcr1) beside them [-]; NaN at and above Pcr1, where it means nothing.
    stable : ndarray of bool
        Below the first critical load.
    critical : ndarray of bool
        At a critical load: the values there are +inf.
    critical_loads : ndarray
        [N].
    first_order : Governing
        Of the P = 0 solution.
    """

    axial_force: np.ndarray
    peak_deflection: np.ndarray
    peak_deflection_x: np.ndarray
    peak_total_offset: np.ndarray
    peak_total_offset_x: np.ndarray
    peak_moment: np.ndarray
    peak_moment_x: np.ndarray
    peak_shear: np.ndarray
    peak_shear_x: np.ndarray
    moment_amplification: np.ndarray
    deflection_amplification: np.ndarray
    moment_amplification_first_order: np.ndarray
    simple_amplification: np.ndarray
    stable: np.ndarray
    critical: np.ndarray
    critical_loads: np.ndarray
    first_order: Governing
