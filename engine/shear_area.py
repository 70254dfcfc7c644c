r"""The axial resistance left where the shear takes part of the yield strength, EN 1993-1-1:2005 §6.2.10(3).

Past half of V_pl,Rd, §6.2.8(3) reduces the yield strength to :math:`(1 - \rho) f_y` in the shear area, and
§6.2.10(3) (from memory) uses it for the resistance to N as well as to M: the checks of :mod:`engine.checks`,
:mod:`engine.biaxial` and the en-member route's cross-section term take
:math:`N / ((A - \sum \rho A_v) f_y)` (:func:`shear_area_kept`, :func:`axial_ratio`).
"""

from __future__ import annotations

import math

import numpy as np

__all__ = ["axial_ratio", "shear_area_kept"]


def shear_area_kept(area: float, reductions) -> np.ndarray:
    r"""The area [m²] that resists the axial force where the shear takes part of the yield strength,
    EN 1993-1-1:2005 §6.2.10(3) (from memory): :math:`(1 - \rho) f_y` in each shear area :math:`A_v`, so
    :math:`A - \sum \rho A_v` (never below 0) at every station.

    ``reductions``: pairs (ρ at the stations, A_v of that shear) of :func:`engine.codes.shear_reduction`.

    >>> round(float(shear_area_kept(1.0e-2, ((np.array(0.25), 4.0e-3),))), 12)
    0.009
    """
    kept = float(area)
    for rho, A_v in reductions:
        kept = kept - np.asarray(rho, dtype=float) * float(A_v)
    return np.maximum(kept, 0.0)


def axial_ratio(N: float, N_Rd):
    """N/N_Rd at every station (|N| [N] against the resistance [N] there); +inf where no resistance is left
    under a force, 0 without one."""
    N_Rd = np.asarray(N_Rd, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(N_Rd > 0.0, abs(N) / np.where(N_Rd > 0.0, N_Rd, 1.0), math.inf if N else 0.0)
