"""Bracketed root finding: scipy's Brent method, imported when first needed.

``scipy.optimize`` takes about 0.4 s to import (it brings linear programming, the FFT and the special
functions with it), a third of the served page's start-up (issue 10). The engine needs one function from it,
so the import waits for the first root; the server warms it in the background once it listens
(:func:`warm`). The numbers are scipy's own, unchanged.
"""

from __future__ import annotations

__all__ = ["brentq", "warm"]


def brentq(f, a: float, b: float, **options) -> float:
    """A root of `f` in [a, b], where f(a) and f(b) differ in sign: :func:`scipy.optimize.brentq`."""
    from scipy.optimize import brentq as scipy_brentq  # deferred for start-up, see the module's docstring

    return scipy_brentq(f, a, b, **options)


def warm() -> None:
    """Import scipy's root finder now (a server calls this once it listens, off the event loop)."""
    import scipy.optimize  # noqa: F401  (the import is the point)
