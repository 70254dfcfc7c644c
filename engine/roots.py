"""Bracketed root finding: Brent's method in plain Python, the same steps as scipy's ``brentq``.

The engine needs one root finder, for the critical loads and the capacity. ``scipy.optimize`` took about
0.5 s to import (it brings linear programming, the FFT and the special functions with it), and the served
page asked for it while building its first page, a third of the start-up (issue 10). This module follows
R. P. Brent, *Algorithms for Minimization without Derivatives* (Prentice-Hall, 1973), ch. 4 ("zero"), in the
form of scipy's ``scipy/optimize/Zeros/brentq.c`` (BSD licence): the same interpolation, extrapolation and
bisection tests in the same order, so the roots equal scipy's bit for bit
(``tests/engine/test_roots.py`` compares them with :func:`scipy.optimize.brentq`, the reference).
"""

from __future__ import annotations

import math

__all__ = ["brentq"]

#: scipy's default tolerances: xtol and the smallest rtol it accepts (4·eps).
_XTOL = 2e-12
_RTOL = 4 * 2.220446049250313e-16


def brentq(f, a: float, b: float, xtol: float = _XTOL, rtol: float = _RTOL, maxiter: int = 100) -> float:
    """A root of `f` in [a, b], where f(a) and f(b) differ in sign, to within ``xtol + rtol·|x|``.

    Raises
    ------
    ValueError
        When f(a) and f(b) have the same sign, or a tolerance is out of range.
    RuntimeError
        When ``maxiter`` steps do not converge.
    """
    if not xtol > 0:
        raise ValueError(f"xtol too small ({xtol!r} <= 0)")
    if rtol < _RTOL:
        raise ValueError(f"rtol too small ({rtol!r} < {_RTOL!r})")
    xpre, xcur = float(a), float(b)
    fpre, fcur = float(f(xpre)), float(f(xcur))
    if fpre == 0.0:
        return xpre
    if fcur == 0.0:
        return xcur
    if math.copysign(1.0, fpre) == math.copysign(1.0, fcur):
        raise ValueError("f(a) and f(b) must have different signs")
    xblk = fblk = spre = scur = 0.0
    for _ in range(maxiter):
        if fpre != 0.0 and fcur != 0.0 and math.copysign(1.0, fpre) != math.copysign(1.0, fcur):
            xblk, fblk = xpre, fpre
            spre = scur = xcur - xpre
        if abs(fblk) < abs(fcur):
            xpre, xcur, xblk = xcur, xblk, xcur
            fpre, fcur, fblk = fcur, fblk, fcur
        delta = (xtol + rtol * abs(xcur)) / 2
        sbis = (xblk - xcur) / 2
        if fcur == 0.0 or abs(sbis) < delta:
            return xcur
        if abs(spre) > delta and abs(fcur) < abs(fpre):
            try:
                if xpre == xblk:  # interpolate (secant)
                    stry = -fcur * (xcur - xpre) / (fcur - fpre)
                else:  # extrapolate (inverse quadratic)
                    dpre = (fpre - fcur) / (xpre - xcur)
                    dblk = (fblk - fcur) / (xblk - xcur)
                    stry = -fcur * (fblk * dblk - fpre * dpre) / (dblk * dpre * (fblk - fpre))
            except ZeroDivisionError:
                # In C a zero divisor gives an infinite or NaN step, which fails the test below: bisect.
                stry = math.inf
            if 2 * abs(stry) < min(abs(spre), 3 * abs(sbis) - delta):  # a good short step
                spre, scur = scur, stry
            else:  # bisect
                spre = scur = sbis
        else:  # bisect
            spre = scur = sbis
        xpre, fpre = xcur, fcur
        if abs(scur) > delta:
            xcur += scur
        else:
            xcur += delta if sbis > 0 else -delta
        fcur = float(f(xcur))
    raise RuntimeError(f"Brent's method did not converge in {maxiter} steps")
