r"""The beam-column functions: entire series in the axial-force parameter and their closed forms.

For a member with axial force :math:`P` (compression positive) and stiffness :math:`EI` write
:math:`s = P/EI` [1/m²]. The homogeneous equation :math:`w'''' + s\,w'' = 0` has the solutions
:math:`1, \xi, \varphi_2(\xi; s), \varphi_3(\xi; s)`, where

.. math::

    \varphi_n(\xi; s) = \sum_{j \ge 0} \frac{(-s)^j\,\xi^{n+2j}}{(n+2j)!},
    \qquad \varphi_n' = \varphi_{n-1}\ (n \ge 1), \qquad \varphi_0' = -s\,\varphi_1,
    \qquad \varphi_{n+2} = \frac{\xi^n/n! - \varphi_n}{s}.

So :math:`\varphi_0 = \cos k\xi`, :math:`\varphi_1 = \sin k\xi / k`, :math:`\varphi_2 = (1-\cos k\xi)/k^2`,
:math:`\varphi_3 = (\xi - \sin k\xi/k)/k^2` in compression (:math:`k^2 = s`), the hyperbolic forms in tension,
and the polynomials :math:`\xi^n/n!` at :math:`s = 0`. Being entire in :math:`s`, they pass through zero axial
force without a switch of formula. These are the functions of the transfer-matrix method for beam-columns
(Pestel & Leckie, *Matrix Methods in Elastomechanics*, 1963, ch. 6) written in series form, which removes the
cancellation of the closed forms as :math:`k\xi \to 0` (the trap noted for Timoshenko & Gere's :math:`\eta,
\lambda, \chi` functions).

The series is evaluated only where :math:`|s|\xi^2 \le 4`; beyond that the solver uses the closed
trigonometric or decaying-exponential forms (see :mod:`engine.solver.model`).

Units: s [1/m²], ξ [m], :math:`\varphi_n` [m^n] (φ₀ is dimensionless, φ₁ a length, φ₂ an area, ...). The
identities above follow from the series term by term; ``tests/engine/test_functions.py`` checks the series
against the closed forms and against mpmath.
"""

from __future__ import annotations

import math

import numpy as np

__all__ = ["SERIES_LIMIT", "SERIES_TERMS", "phi_series", "phi_closed", "phi", "xi_powers"]

#: The series is used where |s| ξ² is at most this value [-] (|k ξ| <= 2).
SERIES_LIMIT = 4.0

# At most 13 terms: the truncation error is below 4**13 / 30! ~ 3e-25 relative for |s xi^2| <= 4.
_TERMS = SERIES_TERMS = 13
_COEF45 = np.array(
    [[1.0 / math.factorial(4 + 2 * j), 1.0 / math.factorial(5 + 2 * j)] for j in range(_TERMS)]
)


def _terms_for(zmax: float) -> int:
    """The number of series terms for which the first neglected one is below 1e-19 of the leading one."""
    term = 1.0
    for j in range(1, _TERMS):
        term *= zmax / ((2 * j + 3) * (2 * j + 4))
        if term < 1e-19:
            return j + 1
    return _TERMS


def xi_powers(xi) -> np.ndarray:
    """ξ^(2j), j = 0 … terms − 1, at each point: shape (n, terms). Cached by callers that reuse points."""
    xi = np.atleast_1d(np.asarray(xi, dtype=float)).ravel()
    powers = np.empty((xi.size, _TERMS))
    powers[:, 0] = 1.0
    powers[:, 1:] = (xi * xi)[:, None]
    np.cumprod(powers, axis=1, out=powers)
    return powers


_J = np.arange(_TERMS, dtype=float)


def phi_series(s, xi, powers=None, xi2_max=None):
    r"""The functions :math:`\varphi_0 \ldots \varphi_5` by their series, for :math:`|s|\xi^2 \le 4`.

    Parameters
    ----------
    s : float or ndarray
        Axial-force parameter :math:`P/EI` [1/m²], compression positive.
    xi : float or ndarray
        Distance from the start of the segment [m]; broadcast against ``s``.
    powers : ndarray, optional
        :func:`xi_powers` of ``xi``, for a scalar ``s``: the series is then one matrix product.
    xi2_max : float, optional
        An upper bound of ξ² over the points, with ``powers``; it sets the number of terms.

    Returns
    -------
    tuple of ndarray
        :math:`(\varphi_0, \varphi_1, \varphi_2, \varphi_3, \varphi_4, \varphi_5)` [m^n].

    Examples
    --------
    >>> import numpy as np
    >>> p = phi_series(0.0, 2.0)
    >>> [round(float(v), 12) for v in p]
    [1.0, 2.0, 2.0, 1.333333333333, 0.666666666667, 0.266666666667]
    >>> k = 0.7
    >>> bool(np.isclose(phi_series(k * k, 1.3)[0], np.cos(k * 1.3), rtol=1e-15, atol=0))
    True
    """
    if powers is not None and xi2_max is not None and np.ndim(s) == 0:
        # One axial force at known points: the number of terms from the bound, and one matrix product.
        s = float(s)
        xi = np.asarray(xi, dtype=float)
        xi2 = powers[:, 1]
        n = _terms_for(abs(s) * xi2_max)
        sums = powers[:, :n] @ (_COEF45[:n] * np.power(-s, _J[:n])[:, None])
        x4 = powers[:, 2]
        p4 = x4 * sums[:, 0]
        p5 = x4 * xi * sums[:, 1]
        p3 = xi2 * xi / 6.0 - s * p5
        p2 = 0.5 * xi2 - s * p4
        p1 = xi - s * p3
        p0 = 1.0 - s * p2
        return p0, p1, p2, p3, p4, p5
    s = np.asarray(s, dtype=float)
    xi = np.asarray(xi, dtype=float)
    xi2 = xi * xi
    z = -s * xi2
    zflat = np.atleast_1d(z).ravel()
    n = _terms_for(float(np.abs(zflat).max(initial=0.0)))
    if powers is not None and s.ndim == 0:
        sums = powers[:, :n] @ (_COEF45[:n] * np.power(-float(s), _J[:n])[:, None])
    elif zflat.size <= 2000:
        # Few points: the powers of z by one running product, then both series by one matrix product.
        powers = np.empty((zflat.size, n))
        powers[:, 0] = 1.0
        powers[:, 1:] = zflat[:, None]
        np.cumprod(powers, axis=1, out=powers)
        sums = powers @ _COEF45[:n]
    else:  # many points (a sweep): Horner's rule, which allocates less
        zz = zflat[:, None]
        sums = np.broadcast_to(_COEF45[n - 1], (zflat.size, 2))
        for c in _COEF45[n - 2 :: -1]:
            sums = sums * zz + c
    x4 = xi2 * xi2
    p4 = x4 * sums[:, 0].reshape(np.shape(z))
    p5 = x4 * xi * sums[:, 1].reshape(np.shape(z))
    p3 = xi2 * xi / 6.0 - s * p5
    p2 = 0.5 * xi2 - s * p4
    p1 = xi - s * p3
    p0 = 1.0 - s * p2
    return p0, p1, p2, p3, p4, p5


def phi_closed(s, xi):
    r"""The functions :math:`\varphi_0 \ldots \varphi_3` in closed form, for :math:`|s|\xi^2 > 4`.

    Trigonometric in compression, hyperbolic in tension. They overflow in strong tension
    (:math:`\sqrt{-s}\,\xi > 700`), which is why the solver itself uses decaying exponentials there.

    Parameters
    ----------
    s : ndarray
        Axial-force parameter [1/m²], nonzero.
    xi : ndarray
        Distance [m].

    Returns
    -------
    tuple of ndarray
        :math:`(\varphi_0, \varphi_1, \varphi_2, \varphi_3)` [-, m, m², m³]: :math:`\cos k\xi`,
        :math:`\sin k\xi/k`, :math:`(1 - \cos k\xi)/k^2`, :math:`(\xi - \sin k\xi/k)/k^2` with
        :math:`k^2 = s` in compression, cosh and sinh in tension.
    """
    s, xi = np.broadcast_arrays(np.asarray(s, dtype=float), np.asarray(xi, dtype=float))
    k = np.sqrt(np.abs(s))
    kx = k * xi
    with np.errstate(over="ignore", invalid="ignore"):
        p0 = np.where(s > 0, np.cos(kx), np.cosh(kx))
        p1 = np.where(s > 0, np.sin(kx), np.sinh(kx)) / k
    p2 = (1.0 - p0) / s
    p3 = (xi - p1) / s
    return p0, p1, p2, p3


def phi(s, xi):
    r"""The functions :math:`\varphi_0 \ldots \varphi_3`, by series or closed form, whichever is accurate.

    Parameters
    ----------
    s : float or ndarray
        Axial-force parameter [1/m²].
    xi : float or ndarray
        Distance [m].

    Returns
    -------
    tuple of ndarray
        :math:`(\varphi_0, \varphi_1, \varphi_2, \varphi_3)` [-, m, m², m³].

    Examples
    --------
    >>> import numpy as np
    >>> p2 = phi(np.array([1e-12, 9.0]), 1.0)[2]
    >>> bool(np.allclose(p2, [0.5 - 1e-12 / 24, (1 - np.cos(3.0)) / 9.0], rtol=1e-14, atol=0))
    True
    """
    s, xi = np.broadcast_arrays(np.asarray(s, dtype=float), np.asarray(xi, dtype=float))
    small = np.abs(s) * xi * xi <= SERIES_LIMIT
    series = phi_series(np.where(small, s, 0.0), np.where(small, xi, 0.0))[:4]
    safe_s = np.where(small, 1.0, s)
    closed = phi_closed(safe_s, np.where(small, 0.0, xi))
    return tuple(np.where(small, a, b) for a, b in zip(series, closed, strict=True))
