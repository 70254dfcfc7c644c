"""The aisc route's own second-order moments M_r [N·m], each a solve of the member without its bow.

AISC 360-16 (from memory) takes M_r from a second-order analysis of the member as built, not with the code
bow of EN 1993-1-1: :mod:`engine.analysis` passes these to :class:`engine.results.Amplification` and
:mod:`engine.member_routes` to the route.

- ``moment_out_of_plumb`` (:func:`plumb_moment`): a member with an end that can translate is tilted by
  §C2.2a's 1/500 the worse way (the notional load 0.002·P_r is that tilt's transverse force).
- ``moment_asd`` (:func:`asd_moment`): ASD's analysis at 1.6 × the loads (§C2.1), its forces divided by 1.6:
  the transverse loads enter linearly, so it is the member at 1.6·P with the loads as given.
- ``moment_direct`` (:func:`direct_moment`): the direct analysis method (§C2.3). Every stiffness is taken at
  c = 0.8·τ_b of its value (the member's EI, its end and intermediate springs, a foundation). Dividing the
  equilibrium equations by c shows that this member at P under loads q with a tilt φ has the moments of the
  nominal member at P/c under q with a tilt c·φ: one solve of the member as it is, at another force. ASD's
  analysis at 1.6 × the loads is then the nominal member at 1.6·P/c with a tilt c·φ/1.6.
- ``moment_untilted`` (:func:`untilted_moment`): ASD's or the direct analysis method's M_r without the tilt,
  for a one-plane case whose other plane sways (:func:`other_plane_sways`): the notional loads are applied
  independently in each of two orthogonal directions (Appendix 7 §7.2.2, §C2.2b, from memory), so the route
  also checks the in-plane M_r without its tilt beside the tilt about the other axis
  (:func:`engine.design.aisc_member.route`). The effective length method in LRFD needs no solve for it: its
  M_r without the tilt is the bow-free moment at P.
"""

from __future__ import annotations

import math

import numpy as np

from engine.design.aisc_member import ASD_ALPHA, direct_stiffness
from engine.out_of_plane import other_axis_sways
from engine.raw import raw as _raw
from engine.sway import AISC_OUT_OF_PLUMB, can_sway

__all__ = ["asd_moment", "direct_moment", "other_plane_sways", "plumb_moment", "untilted_moment"]


def _moment(raw) -> float:
    """max|M| [N·m] of a raw solution (+inf at a critical load)."""
    if raw[0] == "critical":
        return math.inf
    return float(np.max(np.abs(raw[2]["M"])))


def _free(prep, count, P) -> float:
    """max|M| of the member without its bow at ``P``."""
    return _moment(_raw(prep.variant("bow_free") if prep.has_bow else prep, count, P))


def plumb_moment(case, prep, count, P, alpha: float = 1.0) -> float | None:
    """max|M| [N·m] of the member without its bow, out of plumb by 1/(500·α) the worse way, at ``P``; None
    where no end translates, in tension or without a member. ``alpha``: ASD's 1.6 (``P`` already holds it):
    the notional load 0.002·α·Y_i of the analysis at α × the loads, divided by α as the transverse loads are,
    is an out-of-plumbness of 1/(500·α) at α·P (the direct analysis method passes α/c, see the module)."""
    if P <= 0.0 or prep.member is None or not can_sway(case):
        return None
    if P >= prep.buckling.critical_loads[0]:
        return math.inf
    phi = AISC_OUT_OF_PLUMB / alpha
    kinds = (f"plumb{phi:+.17g}", f"plumb{-phi:+.17g}")
    return max(_moment(_raw(prep.variant(kind), count, P)) for kind in kinds)


def asd_moment(case, prep, count, P) -> float | None:
    """max|M| [N·m] of the member without its bow at 1.6·P (:attr:`Amplification.moment_asd`), out of plumb
    where it can sway; None unless the aisc route is in ASD and the member is compressed."""
    if case.check.aisc_method != "ASD" or P <= 0.0 or prep.member is None:  # a route not counted is shown too
        return None
    if ASD_ALPHA * P >= prep.buckling.critical_loads[0]:
        return math.inf
    plumb = plumb_moment(case, prep, count, ASD_ALPHA * P, ASD_ALPHA)
    return plumb if plumb is not None else _free(prep, count, ASD_ALPHA * P)


def _direct_force(case, prep, P) -> tuple[float, float] | None:
    """(αP/c, α/c): the force at which the nominal member has the moments of the direct analysis method's
    reduced member at ``P`` (see the module), and the factor on its tilt; αP/c = +inf where c = 0 (τ_b = 0).
    None: not asked (``check.aisc_analysis``), no compression, or where the route does not apply."""
    member = prep.member
    if case.check.aisc_analysis != "direct" or P <= 0.0 or member is None:
        return None
    if member.section is None or member.material is None:
        return None
    method = case.check.aisc_method
    found = direct_stiffness(member.section, member.material, P, method)
    if found is None:
        return None
    c = found[2]
    alpha = ASD_ALPHA if method == "ASD" else 1.0
    return (alpha * P / c, alpha / c) if c > 0.0 else (math.inf, math.inf)


def direct_moment(case, prep, count, P) -> float | None:
    """M_r [N·m] of the direct analysis method at ``P`` for the route's method (LRFD or ASD), or None: not
    asked (``check.aisc_analysis``), no compression, or where the route does not apply; +inf where the
    reduced member has no equilibrium (αP ≥ c·N_cr, τ_b = 0 included)."""
    found = _direct_force(case, prep, P)
    if found is None:
        return None
    at, scale = found
    if at >= prep.buckling.critical_loads[0]:
        return math.inf
    plumb = plumb_moment(case, prep, count, at, scale)
    return plumb if plumb is not None else _free(prep, count, at)


def other_plane_sways(case, prep) -> bool:
    """Whether the other plane of a one-plane case sways for the aisc route's notional load
    (:func:`engine.out_of_plane.other_axis_sways`)."""
    if case.second_plane is not None or prep.member is None:
        return False
    return other_axis_sways(prep.out_of_plane(), case.length)


def untilted_moment(case, prep, count, P) -> float | None:
    """The aisc route's M_r [N·m] without the out-of-plumb tilt at its own analysis force, where that is not
    P (ASD: 1.6·P; the direct analysis method: αP/c) and M_r holds a tilt (an end can translate); +inf where
    that member has no equilibrium; None elsewhere."""
    if P <= 0.0 or prep.member is None or not can_sway(case):
        return None
    if case.check.aisc_analysis == "direct":
        found = _direct_force(case, prep, P)
        if found is None:
            return None
        at = found[0]
    elif case.check.aisc_method == "ASD":
        at = ASD_ALPHA * P
    else:
        return None
    if at >= prep.buckling.critical_loads[0]:
        return math.inf
    return _free(prep, count, at)
