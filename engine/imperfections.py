r"""Initial bow shapes :math:`w_0(x)` and the load they put on the member under axial force.

The bow enters the governing equation as :math:`-P w_0''`. Every shape here has a curvature that is a
constant plus at most one sinusoid, :math:`-w_0'' = u + F\sin(\beta x + \psi)`, which the solver integrates
exactly. ``amplitude`` is always the largest :math:`|w_0|` over the member (conventions.md).

- ``sine``: :math:`a \sin(\pi x / L)`;
- ``parabola``: :math:`4 a x (L - x)/L^2`;
- ``sway``: :math:`a x / L`, an initial inclination;
- ``mode``: the first elastic buckling mode of the actual supports, scaled so its largest value is :math:`a`.

Any of these may carry a global sway on top, :math:`w_0 \mathrel{+}= \varphi\,(x - x_a)` (``slope`` φ and
``anchor`` :math:`x_a`, the end that cannot translate), for a member with a free or guided end
(EN 1993-1-1 §5.3.2(3)a, eq. (5.5), from memory). A sway is straight, :math:`w_0'' = 0`: it puts no load along
the member and acts only through :math:`-P w_0'` in the transverse force T, so the solution stays exact.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

import numpy as np

__all__ = ["Bow", "bow_for"]


@dataclass(frozen=True, kw_only=True)
class Bow:
    """A bow shape ready for the solver.

    Attributes
    ----------
    shape : str
        ``none``, ``sine``, ``parabola``, ``sway`` or ``mode``.
    amplitude : float
        Largest :math:`|w_0|` [m], signed.
    length : float
        Member length [m].
    uniform : float
        The constant part :math:`u` of :math:`-w_0''` [1/m].
    terms : tuple
        ``(F, beta, psi)`` of the sinusoidal part of :math:`-w_0''`: F [1/m], beta [1/m], psi [rad].
    """

    shape: str
    amplitude: float
    length: float
    uniform: float = 0.0
    terms: tuple = ()
    _mode: object = None  # (Buckling, scale) for the mode shape
    #: (buckling, a) when the bow is the first mode of a member with restraints, steps or a foundation: no
    #: sinusoid terms; the solver adds its response a·N/(N_cr − N)·φ exactly (engine.solver.model)
    modal: object = None
    slope: float = 0.0  # a sway φ [rad] on top of the shape: w0 += slope (x - anchor)
    anchor: float = 0.0  # [m], where the sway part is zero

    def derivatives(self, x, left=None):
        """w0, w0', w0'', w0''' at ``x`` [m] ([m], [-], [1/m], [1/m²]), the sway included.

        ``left`` marks points that take the value just left of a node (a modal bow's slope jumps at a hinge,
        its curvature at a step).
        """
        if self.modal is not None:
            buckling, scale = self.modal
            w0, d1, d2, d3 = (scale * d for d in buckling.mode_derivatives(0, x, left))
        else:
            w0, d1, d2, d3 = self._shape_derivatives(x)

        if self.slope != 0.0:
            x = np.asarray(x, dtype=float)
            w0, d1 = w0 + self.slope * (x - self.anchor), d1 + self.slope
        return w0, d1, d2, d3

    def _shape_derivatives(self, x):
        """:math:`w_0, w_0', w_0'', w_0'''` at ``x`` [m]: [m], [-], [1/m], [1/m²]."""
        x = np.asarray(x, dtype=float)
        a, L = self.amplitude, self.length
        zero = np.zeros_like(x)
        if self.shape == "sine" and a != 0.0:
            b = math.pi / L
            sn, cs = np.sin(b * x), np.cos(b * x)
            return a * sn, a * b * cs, -a * b * b * sn, -a * b**3 * cs
        if self.shape == "parabola" and a != 0.0:
            return 4 * a * x * (L - x) / L**2, 4 * a * (L - 2 * x) / L**2, zero - 8 * a / L**2, zero
        if self.shape == "sway" and a != 0.0:
            return a * x / L, zero + a / L, zero, zero
        if self.shape == "mode" and a != 0.0:
            buckling, scale = self._mode
            return tuple(scale * d for d in buckling.mode_derivatives(0, x))
        return zero, zero, zero, zero


def bow_for(case, buckling=None, slope: float = 0.0, anchor: float = 0.0) -> Bow:
    """The bow of ``case`` (its ``imperfection``), with the first mode from ``buckling`` for shape ``mode``.

    Parameters
    ----------
    case : Case
        The member.
    buckling : Buckling, optional
        Needed for the ``mode`` shape.
    slope, anchor : float
        A global sway φ [rad] added on top, zero at ``anchor`` [m] (0: none).

    Returns
    -------
    Bow
    """
    bow = _shape_bow(case, buckling)
    if slope == 0.0:
        return bow
    if bow.shape == "none":  # a sway alone: shape "sway" with no a·x/L part of its own
        bow = Bow(shape="sway", amplitude=0.0, length=bow.length)
    return dataclasses.replace(bow, slope=float(slope), anchor=float(anchor))


def _shape_bow(case, buckling) -> Bow:
    imp = case.imperfection
    a, L = float(imp.amplitude), float(case.length)
    shape = imp.shape
    if shape == "none" or a == 0.0:
        return Bow(shape="none", amplitude=0.0, length=L)
    if shape == "sine":
        b = math.pi / L
        return Bow(shape=shape, amplitude=a, length=L, terms=((a * b * b, b, 0.0),))
    if shape == "parabola":
        return Bow(shape=shape, amplitude=a, length=L, uniform=8 * a / L**2)
    if shape == "sway":
        return Bow(shape=shape, amplitude=a, length=L)
    if shape == "mode" and hasattr(buckling, "segment_EI"):  # a restrained, stepped or founded member
        return Bow(shape=shape, amplitude=a, length=L, _mode=(buckling, a), modal=(buckling, a))
    if shape == "mode":
        lam = float(buckling.wavenumbers[0])
        c = buckling._coefficients[0]
        # -w0'' = -(a / L^2) (c2 cos βx + (c3/λ) sin βx), β = λ/L; written as F sin(βx + ψ).
        g_cos, g_sin = -a * c[2] / L**2, -a * c[3] / (lam * L**2)
        F = math.hypot(g_cos, g_sin)
        psi = math.atan2(g_cos, g_sin)
        return Bow(shape=shape, amplitude=a, length=L, terms=((F, lam / L, psi),), _mode=(buckling, a))
    raise ValueError(
        f"imperfection.shape: unknown shape {shape!r}"
    )  # pragma: no cover - the case validates it
