r"""The exact solution of a segment on an elastic (Winkler) foundation, in every regime of its roots.

On a foundation of modulus k [N/m²] the governing equation of a segment is

.. math::

    EI\,w'''' + P\,w'' + k\,w = q_0 + q_1\xi + P u + P\sum F\sin(\beta x + \psi),

whose characteristic roots :math:`r^2 = (-s \pm \sqrt{s^2 - 4\omega^2})/2` (:math:`s = P/EI`,
:math:`\omega^2 = k/EI`) are complex (:math:`|s| < 2\omega`), a double pair (:math:`s = \pm 2\omega`), two
imaginary pairs (compression beyond :math:`2\sqrt{kEI}`) or two real pairs (tension beyond it), and one pair
tends to zero as k → 0. Rather than a closed form per regime, with its switches and the cancellation beside
each transition, the segment's four fundamental solutions (value and first three derivatives 0 or 1 at the
segment's start) and the zero-initial-value particular solution are written as Taylor series in
:math:`t = \xi/h`, whose coefficients follow from the equation itself:

.. math::

    D_{m+4} = -s h^2 D_{m+2} - \omega^2 h^4 D_m + h^4 G_m / EI,

with :math:`D_m = h^m y^{(m)}(0)` and :math:`G_m = h^m g^{(m)}(0)` the load's derivatives. The series is
entire in s, k and the load, so every regime and every transition between them (and P → 0, k → 0) is one
formula, continuous and exact to rounding. It sums accurately while the reach
:math:`z = (\sqrt{|s|} + \sqrt{\omega} + \beta) h` is moderate: the terms then grow at most to about
:math:`e^z` before they fall, so at most log10(e^z) digits are lost (five at the limit 12). The model cuts
every foundation range into pieces of at most L/16 and :math:`(EI/k)^{1/4}`, which keeps z below the limit
for any axial force up to about 2000 Euler loads of the member (common practice for series bases, no
source); a force beyond is refused, naming it. The same basis gives the exact end stiffness of a foundation
segment for the critical loads (:mod:`engine.solver.restrained`).

Units: P [N], EI [N·m²], k [N/m²], lengths [m]; states (w [m], w' [-], M [N·m], T [N]).
"""

from __future__ import annotations

import math

import numpy as np

from engine.errors import CaseError

__all__ = ["MAX_REACH", "basis", "end_stiffness", "piece_length"]

#: The largest reach z = (√|s| + √ω + β) h of a series [-]: at most log10(e^12) ≈ 5 digits lost.
MAX_REACH = 12.0
_TOLERANCE = 1e-18


def piece_length(L: float, EI: float, k: float) -> float:
    """The longest piece of a foundation range [m]: L/16 and the foundation's length (EI/k)^(1/4)."""
    return min(L / 16.0, (EI / k) ** 0.25)


def _terms(z: float) -> int:
    """Terms for which the first one left out, z^N/N!, is below 1e-18 of the largest (about e^z)."""
    n, term, largest = 0, 1.0, 1.0
    while term > _TOLERANCE * largest or n < 8:
        n += 1
        term *= z / n
        largest = max(largest, term)
    return n + 4


def _coefficients(P, EI, k, h, xa, q0, q1, waves):
    """Taylor coefficients C_m = D_m/m! (shape (n, 5, N)) of the four fundamental solutions and the
    particular solution, in t = ξ/h, at points with segments of length h starting at xa."""
    s = P / EI
    a = s * h * h
    b = (k / EI) * h**4
    beta_h = max((abs(beta) for _, beta, _ in waves), default=0.0) * float(np.max(h))
    reach = float(np.max(np.sqrt(np.abs(a)) + b**0.25)) + beta_h
    if reach > MAX_REACH:
        worst = float(np.max(np.abs(P)))
        raise CaseError(
            f"axial_force: |{worst:g}| N is beyond what the foundation's segments are solved for (their "
            f"series reach {reach:.3g} exceeds {MAX_REACH:g}); the limit is about 2000 Euler loads of the "
            "member"
        )
    N = _terms(reach)
    n = np.broadcast(a, h).size
    a = np.broadcast_to(a, (n,))
    b = np.broadcast_to(b, (n,))
    D = np.zeros((n, 5, N + 4))
    for j in range(4):
        D[:, j, j] = 1.0
    # The load's derivatives G_m at the segment's start, in t-units (times h^m).
    G = np.zeros((n, N + 4))
    G[:, 0] = q0
    G[:, 1] = q1 * h
    for F, beta, psi in waves:
        theta = beta * xa + psi
        bh = beta * h
        for m in range(N + 4):
            G[:, m] += P * F * bh**m * np.sin(theta + m * math.pi / 2)
    scale = h**4 / EI
    for m in range(N):
        D[:, :, m + 4] = -a[:, None] * D[:, :, m + 2] - b[:, None] * D[:, :, m]
        D[:, 4, m + 4] += scale * G[:, m]
    inv_fact = np.array([1.0 / math.factorial(m) for m in range(N + 4)])
    return D * inv_fact


def _evaluate(C, t):
    """Y, Y', Y'', Y''' (t-derivatives) at t from the coefficients: four arrays (n, 5)."""
    n, _, M = C.shape
    powers = np.ones((n, M))
    if M > 1:
        powers[:, 1:] = t[:, None]
        np.cumprod(powers, axis=1, out=powers)
    out = []
    for d in range(4):
        m = np.arange(M - d)
        falling = np.ones(M - d)
        for i in range(d):
            falling = falling * (m + d - i)
        out.append(np.einsum("njm,nm->nj", C[:, :, d:] * falling, powers[:, : M - d]))
    return out


def basis(P, EI, k, h, xa, xi, q0, q1, waves, bow_slope):
    """The state rows (w, w', M, T) of the four fundamental solutions and of the particular solution.

    Parameters are per point (arrays, or scalars broadcast): P [N], EI [N·m²], k [N/m²], the segment's h and
    start xa [m], the distance ξ from it [m], the load q0 + q1 ξ [N/m, N/m²] (the bow's uniform part P·u
    included), the bow's sinusoids ``waves`` ((F, β, ψ), ...) and the bow's slope w0' at the points (T holds
    ``-P w0'`` for the particular solution, as in :mod:`engine.solver.model`).

    Returns
    -------
    B : ndarray (n, 4, 4)
        ``B[:, i, j]``: state quantity i of fundamental solution j.
    p : ndarray (n, 4)
        The particular solution's state.
    """
    xi = np.atleast_1d(np.asarray(xi, dtype=float))
    n = xi.size
    P, EI, k, h, xa, q0, q1 = (
        np.broadcast_to(np.asarray(v, dtype=float), (n,)) for v in (P, EI, k, h, xa, q0, q1)
    )
    C = _coefficients(P, EI, k, h, xa, q0, q1, waves)
    Y0, Y1, Y2, Y3 = _evaluate(C, xi / h)
    w, d1, d2, d3 = Y0, Y1 / h[:, None], Y2 / (h * h)[:, None], Y3 / (h**3)[:, None]
    M = -EI[:, None] * d2
    V = -EI[:, None] * d3
    T = V - P[:, None] * d1
    states = np.stack([w, d1, M, T], axis=1)  # (n, 4 quantities, 5 functions)
    p = states[:, :, 4].copy()
    p[:, 3] -= P * np.broadcast_to(bow_slope, (n,))
    return states[:, :, :4], p


def end_stiffness(P, EI, k, h):
    """The exact end stiffness of a foundation segment (no load): (n, 4, 4) for freedoms (w_a, θ_a, w_b, θ_b)
    and forces (-T_a, M_a, T_b, -M_b) [N/m, N, N, N·m], symmetric."""
    P = np.atleast_1d(np.asarray(P, dtype=float))
    n = P.size
    xi = np.concatenate([np.zeros(n), np.full(n, h)])
    B, _ = basis(np.concatenate([P, P]), EI, k, h, 0.0, xi, 0.0, 0.0, (), 0.0)
    s0, s1 = B[:n], B[n:]
    disp = np.stack([s0[:, 0], s0[:, 1], s1[:, 0], s1[:, 1]], axis=1)
    force = np.stack([-s0[:, 3], s0[:, 2], s1[:, 3], -s1[:, 2]], axis=1)
    K = np.swapaxes(np.linalg.solve(np.swapaxes(disp, 1, 2), np.swapaxes(force, 1, 2)), 1, 2)
    return 0.5 * (K + np.swapaxes(K, 1, 2))
