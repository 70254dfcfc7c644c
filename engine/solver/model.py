r"""The member model of the solver: segments, loads and the exact basis of each segment (no axial force kept).

The member is cut at every load position and load boundary into segments. In each segment the load is a
polynomial of degree one and the bow curvature a constant plus one sinusoid, so

.. math::

    EI\,w'''' + P\,w'' = q_0 + q_1\xi - P\,w_0''(x)

has the exact solution :math:`w = c_0 + c_1\xi + c_2 B_2(\xi) + c_3 B_3(\xi) + w_p(\xi)`. The pair
:math:`B_2, B_3` is chosen per segment so that it is accurate and cannot overflow:

- :math:`|P| h^2/EI \le 4`: the series functions :math:`\varphi_2, \varphi_3`
  (:mod:`engine.solver.functions`), with the particular solution :math:`(q_0\varphi_4 + q_1\varphi_5)/EI`,
  entire in :math:`P` and so continuous through :math:`P = 0`;
- compression beyond that: :math:`\cos k\xi, \sin k\xi`, with :math:`w_p = q_0\xi^2/2P + q_1\xi^3/6P`;
- tension beyond that: the decaying exponentials :math:`e^{-\kappa\xi}, e^{-\kappa(h-\xi)}`, bounded for any
  tension (no cosh overflow), with the same polynomial :math:`w_p`.

The bow's sinusoid :math:`F\sin(\beta x + \psi)` has the particular solution
:math:`sF\sin(\beta x+\psi)/(\beta^2(\beta^2 - s))`, :math:`s = P/EI`; within 2 % of resonance
(:math:`s \approx \beta^2`, which is not a critical load unless the supports make it one) the
zero-initial-value particular solution is used instead, by its Taylor series, which passes smoothly through
resonance.

The coefficients of all segments follow from one linear system: the end conditions
(:mod:`engine.solver.supports`) and, at every cut, continuity of :math:`w, w'` and the jumps
:math:`M^+ - M^- = C`, :math:`T^+ - T^- = -F`.
This is the field-matrix method (Pestel & Leckie, *Matrix Methods in Elastomechanics*, 1963) solved as one
global system rather than by chained products, which keeps strong tension well conditioned. The system is
equilibrated and solved for many axial forces at once, so a sweep costs about as much as one solve.

The assembly and solve are in :mod:`engine.solver.batch`, the stations' polynomial table in
:mod:`engine.solver.table`, the peaks in :mod:`engine.solver.peaks` and :mod:`engine.solver.series`.
"""

from __future__ import annotations

import math

import numpy as np

from engine.solver import foundation as foundation_basis
from engine.solver.functions import SERIES_LIMIT, phi_series, xi_powers
from engine.solver.supports import boundary_rows

__all__ = ["Model", "Points", "RESONANCE_BAND"]

# |s/β² - 1| below which the resonance-safe particular solution is used. Outside it the plain form loses at
# most log10(1/band) digits to the cancellation with the homogeneous part: 1.7 digits at 0.02.
RESONANCE_BAND = 0.02
_RESONANCE_TERMS = 46  # (1.12 · 2π)^46 / 46! < 1e-17: enough for any first-mode wavenumber


class Points:
    """Where the solution is evaluated, with everything there that does not depend on the axial force.

    Parameters
    ----------
    model : Model
    seg : ndarray of int
        Segment of each point.
    xi : ndarray
        Distance of each point from its segment's start [m].
    """

    def __init__(self, model, seg, xi, ends=None):
        #: indices of the start and end of every segment, in the order the assembly needs (or None)
        self.ends = ends
        self.seg = np.asarray(seg, dtype=int)
        self.xi = np.asarray(xi, dtype=float)
        self.size = self.xi.size
        self.h = model.h[self.seg]
        #: EI at each point [N·m²]: the member's one value, or per point where it has steps
        self.EI = model.EI if not model.stepped else model.EI_seg[self.seg]
        #: the foundation modulus at each point [N/m²] (0.0 without a foundation)
        self.k = model.k_seg[self.seg] if model.has_foundation else 0.0
        self.xa = model.xa[self.seg]
        self.q0 = model.q0[self.seg]
        self.q1 = model.q1[self.seg]
        self.q = self.q0 + self.q1 * self.xi
        self.x = self.xa + self.xi
        self.h2 = self.h * self.h
        self.h2_range = (float(self.h2.min()), float(self.h2.max())) if self.size else (0.0, 0.0)
        if (
            getattr(model.bow, "modal", None) is not None
        ):  # a modal bow: just left of a node at a segment's end
            self.bow = model.bow.derivatives(self.x, left=self.xi == self.h)
        else:
            self.bow = model.bow.derivatives(self.x)
        self.waves = tuple(
            (F, beta, psi, np.sin(beta * self.x + psi), np.cos(beta * self.x + psi))
            for F, beta, psi in model.bow.terms
        )
        self._powers = None
        self._same = None
        #: the stations' polynomial table (engine.solver.table.station_table builds it when first needed)
        self.station_table = None
        #: (seg, xi, index, offset) of the last nearest-station query (engine.solver.series)
        self.nearest = None
        #: the modal bow's shape and derivatives at the points (Model._modal_part), when first needed
        self.modal_phi = None
        #: for base stations (engine.prepared): the listed stations' indices and sort keys, their exact x, and
        #: those keys with sentinels at both ends (engine.analysis merges the peaks into the stations
        #: with them)
        self.order_key = None
        self.x_exact = None
        self.padded_key = None

    @property
    def same_segment(self) -> np.ndarray:
        """Whether each pair of consecutive points lies in one segment (for bracketing), kept."""
        if self._same is None:
            self._same = self.seg[1:] == self.seg[:-1]
        return self._same

    @property
    def powers(self) -> np.ndarray:
        """ξ^(2j) for the series, computed on first use and kept (the points do not move)."""
        if self._powers is None:
            self._powers = xi_powers(self.xi)
        return self._powers


class Model:
    """Everything about a case that does not depend on the axial force.

    Parameters
    ----------
    case : Case
        The member.
    bow : Bow
        Its initial bow, from :func:`engine.imperfections.bow_for`.
    """

    def __init__(self, case, bow):
        L = float(case.length)
        self.L, self.EI, self.bow = L, float(case.EI), bow
        #: what the series refinement needs that does not depend on P (engine.solver.series builds it)
        self.series_tables = None
        tol = 1e-12 * L
        cuts = [0.0, L]
        # Intermediate restraints of this plane and steps in EI (engine.restraints) are nodes as well.
        restraints = [r for r in getattr(case, "restraints", ()) if r.plane != "second"]
        steps = tuple(getattr(case, "steps", ()))
        cuts.extend(float(r.x) for r in restraints)
        cuts.extend(float(st.x) for st in steps)
        foundation = [f for f in getattr(case, "foundation", ()) if f.plane != "second"]
        for f in foundation:
            cuts.extend((float(f.start), float(f.end)))
        for load in case.loads:
            if load.type in ("point", "couple"):
                cuts.append(float(load.x))
            else:
                cuts.extend(load.span(L))
        cuts = np.sort(np.array(cuts))
        nodes = [cuts[0]]
        for c in cuts[1:]:
            if c - nodes[-1] > tol:
                nodes.append(float(c))
        nodes[-1] = L
        if (
            foundation
        ):  # each foundation range in pieces short enough for its series (engine.solver.foundation)
            nodes = _foundation_pieces(np.array(nodes), foundation, self.EI, steps, L)
        self.nodes = np.array(nodes)
        self.xa = self.nodes[:-1]
        self.h = np.diff(self.nodes)
        nseg = self.h.size
        self.nseg = nseg
        self.q0 = np.zeros(nseg)
        self.q1 = np.zeros(nseg)
        self.force = np.zeros(self.nodes.size)  # point loads at the nodes [N]
        self.couple = np.zeros(self.nodes.size)  # couples at the nodes [N·m]
        self.total_load = 0.0  # Σ F + ∫ q [N]
        self.total_moment = 0.0  # Σ F (L - x) + ∫ q (L - x) dx [N·m]
        self.total_couple = 0.0
        self.load_scale = 0.0
        for load in case.loads:
            if load.type in ("point", "couple"):
                i = int(np.argmin(np.abs(self.nodes - load.x)))
                if load.type == "point":
                    self.force[i] += load.P
                    self.total_load += load.P
                    self.total_moment += load.P * (L - self.nodes[i])
                    self.load_scale += abs(load.P)
                else:
                    self.couple[i] += load.C
                    self.total_couple += load.C
                continue
            a, b = load.span(L)
            qa, qb = (load.q, load.q) if load.type == "uniform" else (load.q_start, load.q_end)
            slope = (qb - qa) / (b - a)
            inside = (self.xa >= a - tol) & (self.xa + self.h <= b + tol)
            self.q0[inside] += qa + slope * (self.xa[inside] - a)
            self.q1[inside] += slope
            span = b - a
            self.total_load += 0.5 * (qa + qb) * span
            # ∫ q (L - x) dx over [a, b] for linear q, exactly.
            dq = qb - qa
            self.total_moment += span * (qa * (L - a) - qa * span / 2 + dq * (L - a) / 2 - dq * span / 3)
            self.load_scale += 0.5 * (abs(qa) + abs(qb)) * span
        self.couple_scale = float(np.abs(self.couple).sum())  # Σ |C| [N·m]
        # EI per segment: the case's EI up to the first step, then each step's from its x on.
        self.EI_seg = np.full(nseg, self.EI)
        for st in steps:
            self.EI_seg[self.xa >= float(st.x) - tol] = float(st.EI)
        #: whether EI changes along the member
        self.stepped = bool(steps) and bool(np.any(self.EI_seg != self.EI))
        #: the foundation modulus of every segment [N/m²] (zero off the foundation)
        self.k_seg = np.zeros(nseg)
        mid = self.xa + 0.5 * self.h
        for f in foundation:
            self.k_seg[(mid > f.start) & (mid < f.end)] += float(f.k)
        self.has_foundation = bool(np.any(self.k_seg > 0))
        #: a bow in the shape of the first mode of a restrained member: (buckling, amplitude), or None
        self.modal = getattr(bow, "modal", None)
        #: EI changes, a foundation or a modal bow: the fast paths (one EI, sinusoid bows) step aside
        self.special = self.stepped or self.has_foundation or self.modal is not None
        self.restraints = tuple(restraints)
        #: node index of each restraint, in the order of self.restraints
        self.restraint_nodes = np.array(
            [int(np.argmin(np.abs(self.nodes - r.x))) for r in restraints], dtype=int
        )
        self.rows_left = boundary_rows(case.left, "left")
        self.rows_right = boundary_rows(case.right, "right")
        self.jumps = np.stack([self.jump(i) for i in range(self.nodes.size)])
        self.node_left, self.node_right, self.node_rhs = node_conditions(self)
        #: whether some interior node has other conditions than continuity with the load's jumps
        self.general_nodes = bool(restraints)
        j = np.arange(nseg - 1)[:, None, None]
        self.interface_index = (2 + 4 * j + np.arange(4)[None, :, None], 4 * j + np.arange(8)[None, None, :])
        # Both ends of every segment, for the continuity and end conditions.
        self.end_points = Points(
            self,
            np.repeat(np.arange(nseg), 2),
            np.stack([np.zeros(nseg), self.h], 1).ravel(),
            ends=np.arange(2 * nseg),
        )

    def position(self, seg: np.ndarray, xi: np.ndarray) -> np.ndarray:
        """x = start of the segment + ξ, exactly the node where ξ is the segment's length [m]."""
        x = self.xa[seg] + xi
        at_end = xi == self.h[seg]
        x[at_end] = self.nodes[seg[at_end] + 1]
        return x

    def segment_of(self, x: np.ndarray) -> np.ndarray:
        """The segment holding each x (a node belongs to the segment on its right, L to the last)."""
        return np.minimum(np.maximum(np.searchsorted(self.nodes, x, side="right") - 1, 0), self.nseg - 1)

    # ----------------------------------------------------------------------------------------------
    def columns(self, P, pts):
        """The states (w, w', M, T) of basis functions 3 and 4 and of the particular solution at points.

        Basis functions 1 and 2 are 1 and ξ everywhere, with states (1, 0, 0, 0) and (ξ, 1, 0, -P).

        Parameters
        ----------
        P : float or ndarray
            Axial force [N], one for all points or one per point.
        pts : Points

        Returns
        -------
        cols : tuple of 7 arrays
            w, w', M of function 3; w, w', M, T of function 4 (T of function 3 is zero in every form).
        part : list of 4 arrays
            w, w', M, T of the particular solution, including the bow's term ``-P w0'`` in T.
        """
        EI = pts.EI
        s = P / EI
        xi, h = pts.xi, pts.h
        q0 = pts.q0 + P * self.bow.uniform if self.bow.uniform else pts.q0
        q1 = pts.q1
        if np.ndim(s) == 0:
            z = None
            zlo, zhi = sorted((s * pts.h2_range[0], s * pts.h2_range[1]))
        else:
            z = s * pts.h2
            zlo, zhi = (float(z.min()), float(z.max())) if z.size else (0.0, 0.0)
        if -SERIES_LIMIT <= zlo and zhi <= SERIES_LIMIT:
            out = (
                _series_columns(EI, P, s, xi, h, q0, q1, pts.powers, pts.h2_range[1])
                if z is None
                else _series_columns(EI, P, s, xi, h, q0, q1)
            )
        elif zlo > SERIES_LIMIT:
            out = _trig_columns(EI, P, s, xi, h, q0, q1)
        elif zhi < -SERIES_LIMIT:
            out = _exp_columns(EI, P, s, xi, h, q0, q1)
        else:  # segments of different regimes
            n = pts.size
            P, s = np.broadcast_to(P, (n,)), np.broadcast_to(s, (n,))
            q0 = np.broadcast_to(q0, (n,))
            z = s * pts.h2 if z is None else z
            out = [np.zeros(n) for _ in range(11)]
            for mask, fn in (
                (np.abs(z) <= SERIES_LIMIT, _series_columns),
                (z > SERIES_LIMIT, _trig_columns),
                (z < -SERIES_LIMIT, _exp_columns),
            ):
                if mask.any():
                    EIm = EI if np.ndim(EI) == 0 else EI[mask]
                    values = fn(EIm, P[mask], s[mask], xi[mask], h[mask], q0[mask], q1[mask])
                    for target, v in zip(out, values, strict=True):
                        target[mask] = v
        cols, part = tuple(out[:7]), list(out[7:])
        for F, beta, psi, sn, cs in pts.waves:
            pw, p1, p2, p3 = _bow_particular(s, F, beta, psi, pts, sn, cs)
            part[0] = part[0] + pw
            part[1] = part[1] + p1
            part[2] = part[2] - EI * p2
            part[3] = part[3] - (EI * p3 + P * p1)
        if self.bow.shape != "none":
            part[3] = part[3] - P * pts.bow[1]
        if self.modal is not None:
            for i, extra in enumerate(self._modal_part(P, pts)):
                part[i] = part[i] + extra
        return cols, part

    def _modal_part(self, P, pts, at=None):
        r"""The response to a bow :math:`w_0 = a\varphi` in the shape of the first mode φ (at :math:`N_{cr}`).

        :math:`w_p = c\varphi` with :math:`c = aP/(N_{cr} - P)` solves each segment's equation (from
        :math:`EI\varphi^{(4)} + N_{cr}\varphi'' (+ k\varphi) = 0`, :math:`EI w_p^{(4)} + P w_p'' (+ k w_p) =
        -P w_0''`) and, φ meeting every end, node and restraint condition at N_cr, adds nothing to them
        (derived). Returns w, w', M and T (without the bow's own -P w0', added with the other bows') at the
        points, or at ``at`` among them.
        """
        buckling, a = self.modal
        phi = pts.modal_phi
        if phi is None:  # M and V of the mode rather than its curvatures: continuous at a step in EI
            phi = pts.modal_phi = buckling.mode_state(0, pts.x, left=pts.xi == pts.h)
        w, d1, M, V = phi
        if at is not None:
            w, d1, M, V = w[at], d1[at], M[at], V[at]
        with np.errstate(divide="ignore", invalid="ignore"):
            c = a * P / (float(buckling.critical_loads[0]) - P)
        return c * w, c * d1, c * M, c * V - P * c * d1

    def basis(self, P, pts, columns=None, index=None):
        """The state rows (w, w', M, T) of the four basis functions and of the particular solution.

        ``columns`` may pass in what :meth:`columns` already returned for these points, and ``index``
        pick some
        of them.

        Returns
        -------
        B : ndarray, shape (n, 4, 4)
            ``B[:, i, j]`` is state quantity i of basis function j.
        p : ndarray, shape (n, 4)
            The particular solution's state.
        """
        cols, part = self.columns(P, pts) if columns is None else columns
        xi = pts.xi
        if index is not None:
            cols = tuple(c[index] for c in cols)
            part = [np.broadcast_to(p, xi.shape)[index] for p in part]
            xi = xi[index]
        w3, t3, m3, w4, t4, m4, T4 = cols
        B = np.zeros((xi.size, 4, 4))
        B[:, 0, 0] = 1.0
        B[:, 0, 1] = xi
        B[:, 1, 1] = 1.0
        B[:, 3, 1] = -P if np.ndim(P) == 0 or index is None else np.asarray(P)[index]
        B[:, 0, 2], B[:, 1, 2], B[:, 2, 2] = w3, t3, m3
        B[:, 0, 3], B[:, 1, 3], B[:, 2, 3], B[:, 3, 3] = w4, t4, m4, T4
        p = np.stack(np.broadcast_arrays(*part), axis=1)
        if self.has_foundation:
            on = np.nonzero((pts.k if index is None else pts.k[index]) > 0)[0]
            if on.size:
                at = on if index is None else np.asarray(index)[on]
                Pf = P if np.ndim(P) == 0 else np.asarray(P)[at]
                EIf = pts.EI if np.ndim(pts.EI) == 0 else pts.EI[at]
                q0f = pts.q0[at] + Pf * self.bow.uniform
                terms = tuple((F, beta, psi) for F, beta, psi, _, _ in pts.waves)
                B[on], p[on] = foundation_basis.basis(
                    Pf,
                    EIf,
                    pts.k[at],
                    pts.h[at],
                    pts.xa[at],
                    pts.xi[at],
                    q0f,
                    pts.q1[at],
                    terms,
                    pts.bow[1][at],
                )
                if self.modal is not None:
                    p[on] += np.stack(self._modal_part(Pf, pts, at), axis=1)
        return B, p

    def jump(self, node: int) -> np.ndarray:
        """state(x+) - state(x-) at a node: (0, 0, C, -F)."""
        return np.array([0.0, 0.0, self.couple[node], -self.force[node]])


def _foundation_pieces(nodes, foundation, EI, steps, L):
    """The nodes with every interval on a foundation cut into equal pieces no longer than
    :func:`engine.solver.foundation.piece_length` (EI of the interval, its steps considered)."""
    out = [nodes[0]]
    for a, b in zip(nodes[:-1], nodes[1:], strict=True):
        mid = 0.5 * (a + b)
        k = sum(float(f.k) for f in foundation if f.start < mid < f.end)
        if k > 0:
            EI_here = EI
            for st in steps:
                if st.x <= mid:
                    EI_here = float(st.EI)
            count = int(math.ceil((b - a) / foundation_basis.piece_length(L, EI_here, k) - 1e-9))
            out.extend(a + (b - a) * np.arange(1, count) / count)
        out.append(b)
    return out


def node_conditions(model):
    r"""The conditions at every interior node as ``E_L @ state(x-) + E_R @ state(x+) = r``, four rows each.

    A plain node is continuity of w and w' with the load's jumps :math:`M^+ - M^- = C`,
    :math:`T^+ - T^- = -F` (``E_L = -I``, ``E_R = I``). An intermediate restraint changes rows
    (conventions: its force on the member is :math:`-k_t w`, its couple :math:`-k_r w'`):

    - translation fixed: the T row becomes :math:`w^- = 0` (the reaction is free);
      spring: :math:`T^+ - T^- - k_t w^- = -F`;
    - rotation fixed: the M row becomes :math:`w'^- = 0`; spring: :math:`M^+ - M^- + k_r w'^- = C`;
    - hinge: the w' row becomes :math:`M^- = 0` (the slope may jump; the M row keeps :math:`M^+ = M^- + C`).

    Returns arrays of shapes (nseg - 1, 4, 4), (nseg - 1, 4, 4) and (nseg - 1, 4).
    """
    n = model.nseg - 1
    EL = np.tile(-np.eye(4), (n, 1, 1))
    ER = np.tile(np.eye(4), (n, 1, 1))
    r = model.jumps[1 : n + 1].copy() if n > 0 else np.zeros((0, 4))
    for restraint, node in zip(model.restraints, model.restraint_nodes, strict=True):
        j = node - 1  # the interface between segments node - 1 and node
        if restraint.hinge:
            EL[j, 1], ER[j, 1], r[j, 1] = (0.0, 0.0, 1.0, 0.0), 0.0, 0.0
        t, rot = restraint.translation, restraint.rotation
        if t == "fixed":
            EL[j, 3], ER[j, 3], r[j, 3] = (1.0, 0.0, 0.0, 0.0), 0.0, 0.0
        elif t != "free":
            EL[j, 3, 0] = -float(t)
        if rot == "fixed":
            EL[j, 2], ER[j, 2], r[j, 2] = (0.0, 1.0, 0.0, 0.0), 0.0, 0.0
        elif rot != "free":
            EL[j, 2, 1] = float(rot)
    return EL, ER, r


def _series_columns(EI, P, s, xi, h, q0, q1, powers=None, xi2_max=None):
    r"""The columns of :meth:`Model.columns` where :math:`|s|\xi^2 \le 4`, from the series φ₀…φ₅.

    Basis 3 is :math:`\varphi_2` (w [m²], w' [m], M = -EI φ₀ [N·m]), basis 4 is :math:`\varphi_3`
    (w [m³], w' [m²], M [N·m²], T = -EI [N·m²]); the particular solution of :math:`q_0 + q_1\xi` [N/m, N/m²]
    is :math:`w_p = (q_0\varphi_4 + q_1\varphi_5)/EI` [m], entire in P. Derived from the governing equation
    (DEVELOPERS.md, conventions) with :mod:`engine.solver.functions`; EI [N·m²], P [N], s = P/EI [1/m²],
    ξ and h [m].
    """
    f0, f1, f2, f3, f4, f5 = phi_series(s, xi, powers, xi2_max)
    return (
        f2,
        f1,
        -EI * f0,
        f3,
        f2,
        -EI * f1,
        np.broadcast_to(-EI, xi.shape) + 0.0 * xi,
        (q0 * f4 + q1 * f5) / EI,
        (q0 * f3 + q1 * f4) / EI,
        -(q0 * f2 + q1 * f3),
        -q0 * xi - 0.5 * q1 * xi * xi,
    )


def _polynomial_particular(EI, P, xi, q0, q1):
    r"""w, w', M, T of :math:`w_p = (q_0\xi^2/2 + q_1\xi^3/6)/P`, which solves :math:`EI w'''' + P w'' = q_0 +
    q_1\xi` for P ≠ 0 (substitution; common practice, no source). Units: [m], [-], [N·m], [N]."""
    return (
        (q0 * xi * xi / 2 + q1 * xi**3 / 6) / P,
        (q0 * xi + q1 * xi * xi / 2) / P,
        -EI * (q0 + q1 * xi) / P,
        -EI * q1 / P - q0 * xi - 0.5 * q1 * xi * xi,
    )


def _trig_columns(EI, P, s, xi, h, q0, q1):
    r"""The columns in compression beyond the series, :math:`s\xi^2 > 4`: basis :math:`\cos k\xi, \sin k\xi`,
    :math:`k = \sqrt{P/EI}` [1/m] (Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed., ch. 1, the
    homogeneous solution of the beam-column; from memory), with :func:`_polynomial_particular`."""
    k = np.sqrt(s)
    c, sn = np.cos(k * xi), np.sin(k * xi)
    ek2 = EI * k * k
    return (c, -k * sn, ek2 * c, sn, k * c, ek2 * sn, np.zeros(xi.size)) + _polynomial_particular(
        EI, P, xi, q0, q1
    )


def _exp_columns(EI, P, s, xi, h, q0, q1):
    r"""The columns in tension beyond the series, :math:`-s\xi^2 > 4`: basis :math:`e^{-\kappa\xi}` and
    :math:`e^{-\kappa(h - \xi)}`, :math:`\kappa = \sqrt{-P/EI}` [1/m], the same span as cosh and sinh but
    bounded by 1 on the segment, so that no tension overflows (common practice, no source); with
    :func:`_polynomial_particular`."""
    kap = np.sqrt(-s)
    e1, e2 = np.exp(-kap * xi), np.exp(-kap * (h - xi))
    ek2 = -EI * kap * kap
    return (e1, -kap * e1, ek2 * e1, e2, kap * e2, ek2 * e2, np.zeros(xi.size)) + _polynomial_particular(
        EI, P, xi, q0, q1
    )


def _bow_particular(s, F, beta, psi, pts, sn, cs):
    """A particular solution of w'''' + s w'' = s F sin(β x + ψ) and its first three derivatives in ξ.

    ``sn`` and ``cs`` are sin(βx + ψ) and cos(βx + ψ) at the points; s [1/m²], F [1/m] (the bow's curvature
    amplitude, -w0'' = F sin(βx + ψ)), β [1/m], ψ [rad]. Away from resonance it is A sin(βx + ψ) with
    A = sF/(β²(β² - s)) [m], by substitution (common practice, no source); within the band it is the
    zero-initial-value solution by its Taylor series (:func:`_resonant_series`). Returns w [m], w' [-],
    w'' [1/m] and w''' [1/m²] at the points.
    """
    b2 = beta * beta
    near = (s > 0) & (np.abs(s - b2) <= RESONANCE_BAND * b2)
    if np.ndim(near) == 0:
        if not near:
            A = s * F / (b2 * (b2 - s))
            return A * sn, (A * beta) * cs, (-A * b2) * sn, (-A * b2 * beta) * cs
        near = np.ones(pts.size, dtype=bool)
        s = np.full(pts.size, s)
    out = [np.zeros(pts.size) for _ in range(4)]
    far = ~near
    if far.any():
        sf = s[far]
        A = sf * F / (b2 * (b2 - sf))
        out[0][far] = A * sn[far]
        out[1][far] = A * beta * cs[far]
        out[2][far] = -A * b2 * sn[far]
        out[3][far] = -A * b2 * beta * cs[far]
    if near.any():
        sn_ = s[near]
        r = _resonant_series(sn_ / b2, beta * pts.xa[near] + psi, beta * pts.xi[near])
        scale = sn_ * F / b2**2
        for d in range(4):
            out[d][near] = scale * r[d] * beta**d
    return out


def _resonant_series(sigma, theta, t):
    r"""Zero-initial-value solution R(t) of R'''' + σ R'' = sin(θ + t), and R', R'', R''', by Taylor series.

    Used only for t <= 2π·1.2 or so and σ near 1, where the series converges fast and loses no more than two
    digits to alternating terms.
    """
    N = _RESONANCE_TERMS
    n = t.size
    g = np.empty((n, N))
    phase = np.stack([np.sin(theta), np.cos(theta), -np.sin(theta), -np.cos(theta)], axis=1)
    fact = 1.0
    for j in range(N):
        if j:
            fact /= j
        g[:, j] = phase[:, j % 4] * fact
    r = np.zeros((n, N + 4))
    for j in range(N):
        prev = r[:, j + 2] if j + 2 < N + 4 else 0.0
        r[:, j + 4] = (g[:, j] - sigma * (j + 2) * (j + 1) * prev) / ((j + 1) * (j + 2) * (j + 3) * (j + 4))
    # Horner for the value and the first three derivatives.
    out = []
    coef = r
    for _ in range(4):
        acc = np.zeros(n)
        for j in range(coef.shape[1] - 1, -1, -1):
            acc = acc * t + coef[:, j]
        out.append(acc)
        m = coef.shape[1]
        coef = coef[:, 1:] * np.arange(1, m)[None, :]
    return out
