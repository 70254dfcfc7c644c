"""Beam-column amplification functions in arbitrary precision, for tests.

Source: Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed. (1961), ch. 1 (article numbers from memory);
the forms as written in tests/REFERENCES.md §1 ([derived] there). Simply supported span,
``u = kL/2``, ``k = √(|P|/EI)``.

The forms cancel catastrophically as u → 0 (η loses about 4·|log10 u| digits), so each function raises the
working precision by that much over the requested 30 significant digits; the result keeps 30 digits.
"""

from __future__ import annotations

import mpmath

__all__ = [
    "eta",
    "lam",
    "chi",
    "sec",
    "tan_ratio",
    "eta_t",
    "lam_t",
    "chi_t",
    "sech",
    "tanh_ratio",
    "u_of",
    "DIGITS",
]

#: Significant digits kept in every result.
DIGITS = 30


def _dps(u) -> int:
    u = mpmath.mpf(u)
    lost = int(max(0, -4 * mpmath.log10(u))) if u < 1 else 0
    return DIGITS + lost + 10


def u_of(P: float, EI: float, L: float) -> mpmath.mpf:
    """Return u = (L/2)√(|P|/EI) [-] from the exact binary values of the float inputs."""
    with mpmath.workdps(60):
        return +(mpmath.mpf(L) / 2 * mpmath.sqrt(abs(mpmath.mpf(P)) / mpmath.mpf(EI)))


def eta(u):
    """η(u) = 12(2 sec u − 2 − u²)/(5u⁴): mid-span deflection amplification, uniform load [-]."""
    with mpmath.workdps(_dps(u)):
        u = mpmath.mpf(u)
        return +(12 * (2 * mpmath.sec(u) - 2 - u**2) / (5 * u**4))


def lam(u):
    """λ(u) = 2(sec u − 1)/u²: moment amplification, uniform load; deflection, end moments [-]."""
    with mpmath.workdps(_dps(u)):
        u = mpmath.mpf(u)
        return +(2 * (mpmath.sec(u) - 1) / u**2)


def chi(u):
    """χ(u) = 3(tan u − u)/u³: mid-span deflection amplification, central point load [-]."""
    with mpmath.workdps(_dps(u)):
        u = mpmath.mpf(u)
        return +(3 * (mpmath.tan(u) - u) / u**3)


def sec(u):
    """sec u: moment amplification, equal end moments [-]."""
    with mpmath.workdps(_dps(u)):
        return +mpmath.sec(mpmath.mpf(u))


def tan_ratio(u):
    """tan u / u: moment amplification, central point load [-]."""
    with mpmath.workdps(_dps(u)):
        u = mpmath.mpf(u)
        return +(mpmath.tan(u) / u)


def eta_t(u):
    """η_t(u) = 12(2 sech u − 2 + u²)/(5u⁴): tension version of η [-]."""
    with mpmath.workdps(_dps(u)):
        u = mpmath.mpf(u)
        return +(12 * (2 * mpmath.sech(u) - 2 + u**2) / (5 * u**4))


def lam_t(u):
    """λ_t(u) = 2(1 − sech u)/u² [-]."""
    with mpmath.workdps(_dps(u)):
        u = mpmath.mpf(u)
        return +(2 * (1 - mpmath.sech(u)) / u**2)


def chi_t(u):
    """χ_t(u) = 3(u − tanh u)/u³ [-]."""
    with mpmath.workdps(_dps(u)):
        u = mpmath.mpf(u)
        return +(3 * (u - mpmath.tanh(u)) / u**3)


def sech(u):
    """sech u [-]."""
    with mpmath.workdps(_dps(u)):
        return +mpmath.sech(mpmath.mpf(u))


def tanh_ratio(u):
    """tanh u / u: tension version of tan u / u [-]."""
    with mpmath.workdps(_dps(u)):
        u = mpmath.mpf(u)
        return +(mpmath.tanh(u) / u)
