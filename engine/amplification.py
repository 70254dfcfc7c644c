r"""Practitioners' approximations of the moment amplification, set beside the exact value.

With :math:`\alpha = P/P_{cr,1}`, :math:`P_{cr,1}` the member's exact first elastic critical load:

- :math:`1/(1-\alpha)`: the classical amplification of a sinusoidal first-order shape
  (Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed. 1961, ch. 1, article number from memory);
- :math:`(1+\psi\alpha)/(1-\alpha)`: the moment-gradient form with :math:`\psi` from AISC 360-16 Commentary
  Table C-A-8.1 (after Iwankiw, AISC Engineering Journal 1984; the matching of support cases to
  :math:`\psi` is
  from memory), given only where the case is one of the table's;
- :math:`B_1 = C_m/(1-\alpha) \ge 1`: AISC 360-16 Appendix 8, §8.2.1 (equation numbers from memory), with
  :math:`C_m = 0.6 - 0.4 M_1/M_2` when only end moments act, :math:`1 + \psi\alpha` where the table fits,
  and conservatively 1.0 otherwise; :math:`\alpha_{LRFD} = 1`, and :math:`P_{e1}` taken as the exact
  critical load
  (the Appendix allows an analysis to justify it). Only for members braced at both ends.

The first two are compared with the exact amplification over the reference :math:`M_I + N w_0`
(:mod:`engine.reference`); B1 with the exact amplification of the member without its bow, since AISC keeps the
out-of-straightness inside :math:`P_c` (from memory).
"""

from __future__ import annotations

import numpy as np

from engine.results import Approximation

__all__ = ["SIMPLE", "approximations", "braced", "psi_for"]

#: The name of the textbook amplification 1/(1 − N/Pcr1) among the approximations (N the axial force).
SIMPLE = "1/(1 − N/Pcr1)"

_SOURCE_SIMPLE = (
    "Timoshenko & Gere (1961) ch. 1, sinusoidal amplification 1/(1 − N/Pcr) (article from memory)"
)
_SOURCE_PSI = "AISC 360-16 Commentary Table C-A-8.1, ψ after Iwankiw (1984) (case matching from memory)"
_SOURCE_B1 = (
    "AISC 360-16 Appendix 8 §8.2.1, B1 = Cm/(1 − N/Pe1) ≥ 1, Pe1 = exact Pcr1 (eq. numbers from memory)"
)

# (left, right) named supports -> (psi for a full uniform load, psi for a central point load)
_PSI = {
    ("pinned", "pinned"): (0.0, -0.2),
    ("fixed", "pinned"): (-0.4, -0.3),
    ("pinned", "fixed"): (-0.4, -0.3),
    ("fixed", "fixed"): (-0.4, -0.2),
}


def braced(case) -> bool:
    """Both ends held against translation (B1 is for such members)."""
    return case.left.translation == "fixed" and case.right.translation == "fixed"


def psi_for(case) -> float | None:
    """The tabulated ψ when the case is one of AISC Commentary Table C-A-8.1's, else None.

    The table's cases are one full-length uniform load, or one point load at mid-span, on pinned–pinned,
    fixed–pinned or fixed–fixed supports.
    """
    pair = (case.left.name, case.right.name)
    if pair not in _PSI or len(case.loads) != 1:
        return None
    load = case.loads[0]
    L = case.length
    if load.type == "uniform" and load.span(L) == (0.0, L):
        return _PSI[pair][0]
    if load.type == "point" and abs(load.x - 0.5 * L) <= 1e-9 * L:
        return _PSI[pair][1]
    return None


def _end_moment_cm(case, end_moments) -> float | None:
    """C_m = 0.6 - 0.4 M1/M2 when the only loads are couples at the ends, else None."""
    if not case.loads or any(ld.type != "couple" for ld in case.loads):
        return None
    L = case.length
    if any(0.0 < ld.x < L for ld in case.loads):
        return None
    ma, mb = end_moments
    big, small = (ma, mb) if abs(ma) >= abs(mb) else (mb, ma)
    if big == 0.0:
        return None
    # AISC's M1/M2 is positive in reverse curvature, where our end moments have opposite signs.
    return 0.6 + 0.4 * (small / big)


def approximations(case, axial_force, pcr1, exact, end_moments, bow_free=None) -> tuple:
    """The approximations that apply to ``case`` at ``axial_force``, each with its error against ``exact``.

    Parameters
    ----------
    case : Case
    axial_force : float
        [N], compression positive.
    pcr1 : float
        First critical load [N].
    exact : float or None
        Exact moment amplification against the reference M_I + N·w0 [-] (1/(1 - α) and the ψ form are
        compared with it).
    bow_free : float or None
        Exact moment amplification of the member without its bow [-]: AISC B1 is compared with it, since
        AISC keeps the out-of-straightness inside P_c (AISC 360-16 Appendix 8 / Chapter E, from memory).
    end_moments : tuple of float
        First-order member-end moments M(0) and M(L) [N·m], for the C_m of end moments.

    Returns
    -------
    tuple of Approximation
        Empty at or beyond the first critical load, where none of them means anything.
    """
    P = float(axial_force)
    if P >= pcr1 or not np.isfinite(pcr1):
        return ()
    alpha = P / pcr1

    def item(name, value, source, against=exact, key="moment"):
        err = None if against is None or against == 0 else float((value - against) / against)
        return Approximation(name=name, value=float(value), source=source, error=err, compared_with=key)

    out = [item(SIMPLE, 1.0 / (1.0 - alpha), _SOURCE_SIMPLE)]
    if P <= 0:
        return tuple(out)
    psi = psi_for(case)
    if psi is not None:
        out.append(
            item(f"(1 + ψ N/Pcr1)/(1 − N/Pcr1), ψ = {psi:g}", (1 + psi * alpha) / (1 - alpha), _SOURCE_PSI)
        )
    if braced(case):
        cm = _end_moment_cm(case, end_moments)
        if cm is None:
            cm = 1.0 + psi * alpha if psi is not None else 1.0
        out.append(
            item(
                f"AISC B1, Cm = {cm:.3f}",
                max(cm / (1.0 - alpha), 1.0),
                _SOURCE_B1,
                bow_free,
                "moment_bow_free",
            )
        )
    return tuple(out)
