r"""The global sway imperfection of a member with an end that can translate (free, guided or a spring).

EN 1993-1-1:2005 §5.3.2(3)a, eq. (5.5) (clause and equation numbers from memory):

.. math::

    \varphi = \varphi_0\,\alpha_h\,\alpha_m, \qquad \varphi_0 = 1/200, \qquad
    \alpha_h = 2/\sqrt{h},\ \tfrac{2}{3} \le \alpha_h \le 1.0, \qquad
    \alpha_m = \sqrt{0.5\,(1 + 1/m)},

with :math:`h` the height of the structure in metres and :math:`m` the number of columns in a row that carry a
vertical load of at least half the average per column. strutscope analyses one member, so :math:`h` is the
member's length and :math:`m = 1` unless the case gives ``columns`` (``imperfection.columns``). A case that
belongs to a taller structure or a wider row should give its own values (a bigger :math:`h` or :math:`m` only
lowers φ, so the defaults err on the safe side).

AISC 303-16 §7.13.1.1 (from memory) allows a column out of plumb by 1/500 of its height; the AISC preset uses
that as its sway.
"""

from __future__ import annotations

import math

from engine import codes

__all__ = ["AISC_OUT_OF_PLUMB", "can_sway", "sway_anchor", "sway_phi"]

#: AISC 303-16 §7.13.1.1 column out-of-plumbness 1/500 (from memory).
AISC_OUT_OF_PLUMB = 1.0 / 500.0
SOURCE_EN = "EN 1993-1-1:2005 §5.3.2(3)a, eq. (5.5) (from memory)"
SOURCE_AISC = "AISC 303-16 §7.13.1.1, out of plumb 1/500 (from memory)"


def sway_phi(height: float, columns: int = 1) -> tuple[float, float, float]:
    r"""φ (:func:`engine.codes.sway_imperfection`), α_h and α_m of EN 1993-1-1 eq. (5.5) for a structure of
    ``height`` [m] and ``columns`` m.

    >>> phi, a_h, a_m = sway_phi(4.0)
    >>> round(1 / phi, 6), a_h, a_m
    (200.0, 1.0, 1.0)
    >>> round(sway_phi(36.0)[1], 12)        # 2/sqrt(36) = 1/3, held at the lower limit 2/3
    0.666666666667
    """
    phi = codes.sway_imperfection(h=height, m=columns)
    alpha_h = min(1.0, max(2.0 / 3.0, 2.0 / math.sqrt(height)))
    alpha_m = math.sqrt(0.5 * (1.0 + 1.0 / columns))
    return phi, alpha_h, alpha_m


def can_sway(case) -> bool:
    """Whether one end of the member can translate: free, guided, or a translational spring."""
    return case.left.translation != "fixed" or case.right.translation != "fixed"


def sway_anchor(case) -> float:
    """Where the sway is zero [m]: the end held against translation (the left one when neither is held); the
    sway grows away from it, w0 += φ·|x - anchor|."""
    if case.left.translation == "fixed" or case.right.translation != "fixed":
        return 0.0
    return float(case.length)
