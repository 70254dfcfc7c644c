"""The routes of the member check, side by side: what each found, in numbers.

A *route* is one published way of checking the member:

- ``"second-order"``: the exact second-order analysis with the code's initial bow, then the cross-section at
  every station (EN 1993-1-1:2005 §5.2.2(7)a), and, for a one-plane case, flexural buckling about the other
  axis (§6.3.1);
- ``"en-member"``: the equivalent-member check of EN 1993-1-1:2005 §6.3.1 and §6.3.3, eqs. (6.61)/(6.62),
  with the interaction factors of Annex B (method 2) or Annex A (method 1);
- ``"aisc"``: AISC 360-16 Chapter E (§E3) and Chapter H (§H1.1, eqs. H1-1a/b), with φ (LRFD) or Ω (ASD).

The headline utilisation of a result is the largest utilisation of the routes the case enables
(``check.routes``); the others are computed for comparison.
"""

from __future__ import annotations

from dataclasses import dataclass, field

__all__ = ["ROUTES", "RouteCheck"]

#: Every route, in the order they are shown.
ROUTES: tuple[str, ...] = ("second-order", "en-member", "aisc")


@dataclass(frozen=True, kw_only=True)
class RouteCheck:
    """One route's verdict.

    Attributes
    ----------
    route : str
        One of :data:`ROUTES`.
    enabled : bool
        True when the route counts toward the headline utilisation (the case's ``check.routes``).
    utilization : float or None
        The route's governing utilisation [-]; None when the route cannot be applied (``reason`` says why);
        +inf at or above a critical load.
    governing : str
        The code of the governing term, e.g. ``"cross-section"``, ``"out-of-plane"``, ``"eq-6.61"``,
        ``"eq-6.62"``, ``"H1-1a"``, ``"H1-1b"``; "" when not applied.
    terms : dict
        Every term's utilisation [-], keyed as ``governing`` is.
    facts : dict
        The numbers behind it, SI and dimensionless, keyed by the trade's symbols written in ASCII
        (``"chi_y"``, ``"chi_z"``, ``"N_cr_y"``, ``"L_cr_z"``, ``"k_yy"``, ``"C_my"``, ``"phi_c"``,
        ``"F_cr"``, ...).
    reason : str
        Why the route was not applied, else "".
    notes : tuple of str
        Codes of what the route assumed (for example ``"chi-LT-1"``: lateral-torsional buckling not
        checked, χ_LT = 1), for the app to word as cautions.
    source : str
        The clauses the route follows.
    """

    route: str
    enabled: bool
    utilization: float | None
    governing: str = ""
    terms: dict = field(default_factory=dict)
    facts: dict = field(default_factory=dict)
    reason: str = ""
    notes: tuple = ()
    source: str = ""
