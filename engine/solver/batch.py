"""The global system of one member for many axial forces at once, and the state it gives at any points.

:class:`Batch` assembles the end conditions and the continuity and jump conditions at every cut into one
equilibrated linear system per axial force and solves them together (the field-matrix method, see
:mod:`engine.solver.model`). :meth:`Batch.states` returns a :class:`State` at any points, from whichever
evaluation applies: the stations' polynomial table (:mod:`engine.solver.table`) for one force at the stations
it was built with, the basis columns already evaluated there for the assembly, or the basis functions.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from engine.solver.model import Model, Points
from engine.solver.table import TARGET_ROWS, TARGET_SLOPE_ROWS, StationTable, station_table

__all__ = ["Batch", "State", "STATE_FIELDS"]

#: The fields of a state, in the order of :meth:`State.stacked`.
STATE_FIELDS = ("w", "rotation", "M", "T", "V", "w0")


@dataclass(slots=True, eq=False)
class State:
    """The solution at some points: w [m], rotation, M [N·m], T and V [N], the bow w0 and its derivatives.

    ``rows`` holds the fields as one array when the evaluation produced them so (the station table's eleven
    rows, or the Taylor series' six); :meth:`stacked` then costs nothing. ``columns`` are the station table's
    columns at the same points, which the series refinement reuses. ``P`` is the axial force [N], one for all
    points or one per point. Fields may be read by name, ``state["M"]``, as well as ``state.M``.
    """

    w: np.ndarray
    rotation: np.ndarray
    M: np.ndarray
    T: np.ndarray
    V: np.ndarray
    w0: np.ndarray
    w0_1: np.ndarray | None = None
    w0_2: np.ndarray | None = None
    w0_3: np.ndarray | None = None
    P: float | np.ndarray | None = None
    rows: np.ndarray | None = None
    columns: np.ndarray | None = None

    def __getitem__(self, name: str) -> np.ndarray:
        return getattr(self, name)

    def stacked(self) -> np.ndarray:
        """w, rotation, M, T, V and w0 as the rows of one array, shape (6, n)."""
        if self.rows is not None:
            return self.rows[:6]
        return np.stack([getattr(self, name) for name in STATE_FIELDS])


@dataclass(slots=True, eq=False)
class _TableRows:
    """The station table and its columns at the stations one single-force batch was assembled with."""

    points: Points
    table: StationTable
    columns: tuple


@dataclass(slots=True, eq=False)
class _ReusedColumns:
    """The basis columns at the stations, evaluated once for the assembly and kept for the states there."""

    points: Points
    columns: tuple
    particular: list


@dataclass(slots=True, eq=False)
class _Targets:
    """The targets and slopes that :meth:`Batch.states` computed with the state from the table."""

    state: State
    values: np.ndarray
    slopes: np.ndarray


class Batch:
    """The solution of one model for many axial forces at once.

    Parameters
    ----------
    model : Model
    axial_forces : array_like
        Axial forces [N], compression positive.
    """

    def __init__(self, model: Model, axial_forces, at: Points | None = None):
        self.model = model
        P = np.atleast_1d(np.asarray(axial_forces, dtype=float))
        self.P = P
        nP, nseg = P.size, model.nseg
        m = 4 * nseg
        ends = model.end_points
        #: the single-force fast path, when the stations ``at`` were given: their table, or their columns
        self.table_rows: _TableRows | None = None
        self.reused: _ReusedColumns | None = None
        self._targets: _Targets | None = None
        rows = None
        if nP == 1 and at is not None and at.ends is not None and not model.special:
            rows = station_table(model, at).evaluate(float(P[0]))
        if rows is not None:
            # The rows at the segment ends and the stations' columns, from the stations' table.
            B, p, columns = rows
            self.table_rows = _TableRows(at, at.station_table, columns)
        elif nP == 1 and at is not None and at.ends is not None:
            # One evaluation serves both the assembly (at the segment ends) and the stations themselves.
            cols, part = model.columns(P[0], at)
            self.reused = _ReusedColumns(at, cols, part)
            B, p = model.basis(P[0], at, (cols, part), index=at.ends)
        elif nP == 1:
            B, p = model.basis(P[0], ends)
        else:
            tiled = Points(model, np.tile(ends.seg, nP), np.tile(ends.xi, nP))
            B, p = model.basis(np.repeat(P, ends.size), tiled)
        if nP == 1:
            self._solve_one(B.reshape(nseg, 2, 4, 4), p.reshape(nseg, 2, 4))
            return
        B = B.reshape(nP, nseg, 2, 4, 4)
        p = p.reshape(nP, nseg, 2, 4)
        A = np.zeros((nP, m, m))
        rhs = np.zeros((nP, m))
        rl, rr = model.rows_left, model.rows_right
        jumps = model.jumps
        A[:, 0:2, 0:4] = rl @ B[:, 0, 0]
        rhs[:, 0:2] = (jumps[0][None, :] - p[:, 0, 0]) @ rl.T
        if nseg > 1:
            # Every interface block at once: [-B(end of j) | B(start of j+1)] in rows 2 + 4j.
            rows, cols_ = model.interface_index
            if model.general_nodes:  # intermediate restraints: E_L state(x-) + E_R state(x+) = r
                EL, ER = model.node_left[None], model.node_right[None]
                A[:, rows, cols_] = np.concatenate([EL @ B[:, :-1, 1], ER @ B[:, 1:, 0]], axis=3)
                rhs[:, 2 : m - 2] = (
                    model.node_rhs[None]
                    - np.einsum("nij,pnj->pni", model.node_left, p[:, :-1, 1])
                    - np.einsum("nij,pnj->pni", model.node_right, p[:, 1:, 0])
                ).reshape(nP, -1)
            else:
                A[:, rows, cols_] = np.concatenate([-B[:, :-1, 1], B[:, 1:, 0]], axis=3)
                rhs[:, 2 : m - 2] = (jumps[None, 1:nseg] - p[:, 1:, 0] + p[:, :-1, 1]).reshape(nP, -1)
        A[:, m - 2 : m, m - 4 : m] = rr @ B[:, nseg - 1, 1]
        rhs[:, m - 2 : m] = -(p[:, nseg - 1, 1] + jumps[nseg][None, :]) @ rr.T
        # Equilibrate rows, then columns, so that stiff springs and strong tension keep the pivots honest.
        row = np.abs(A).max(axis=2, keepdims=True)
        row[row == 0] = 1.0
        A /= row
        rhs /= row[:, :, 0]
        col = np.abs(A).max(axis=1, keepdims=True)
        col[col == 0] = 1.0
        A /= col
        self.singular = np.zeros(nP, dtype=bool)
        try:
            y = np.linalg.solve(A, rhs[:, :, None])[:, :, 0]
        except np.linalg.LinAlgError:
            y = np.zeros((nP, m))
            for i in range(nP):
                try:
                    y[i] = np.linalg.solve(A[i], rhs[i])
                except np.linalg.LinAlgError:
                    self.singular[i] = True
        y = y / col[:, 0, :]
        self.singular |= ~np.isfinite(y).all(axis=1)
        y[self.singular] = 0.0
        self.coefficients = y.reshape(nP, nseg, 4)

    @classmethod
    def combined(cls, model: Model, parts) -> Batch | None:
        """The batch of ``model`` whose solution is the sum of ``weight × batch`` over ``parts``.

        At given axial forces the problem is linear in the loads and the bow: the global matrix depends on
        neither, so models that differ only in those have solutions that add. ``model`` must be the one whose
        loads and bow are that sum (the caller's duty: the reversed bow is 2 × (bow-free) − (forward)). Its
        states are evaluated from the basis functions (no station table). None where a part is singular or the
        parts do not share the axial forces and segments.
        """
        first = parts[0][1]
        if any(
            b is None
            or b.singular.any()
            or not np.array_equal(b.P, first.P)
            or b.coefficients.shape[1] != model.nseg
            for _, b in parts
        ):
            return None
        self = cls.__new__(cls)
        self.model = model
        self.P = first.P
        self.table_rows = None
        self.reused = None
        self._targets = None
        self.singular = np.zeros(first.P.size, dtype=bool)
        self.coefficients = sum(weight * b.coefficients for weight, b in parts)
        return self

    def _solve_one(self, B, p):
        """The assembly and solve of :meth:`__init__` for one axial force, in two dimensions (fewer steps)."""
        model = self.model
        nseg = B.shape[0]
        m = 4 * nseg
        A = np.zeros((m, m))
        rhs = np.empty(m)
        rl, rr, jumps = model.rows_left, model.rows_right, model.jumps
        A[0:2, 0:4] = rl @ B[0, 0]
        rhs[0:2] = rl @ (jumps[0] - p[0, 0])
        if nseg > 1:
            rows, cols_ = model.interface_index
            if model.general_nodes:
                EL, ER = model.node_left, model.node_right
                A[rows, cols_] = np.concatenate([EL @ B[:-1, 1], ER @ B[1:, 0]], axis=2)
                rhs[2 : m - 2] = (
                    model.node_rhs
                    - np.einsum("nij,nj->ni", EL, p[:-1, 1])
                    - np.einsum("nij,nj->ni", ER, p[1:, 0])
                ).ravel()
            else:
                A[rows, cols_] = np.concatenate([-B[:-1, 1], B[1:, 0]], axis=2)
                rhs[2 : m - 2] = (jumps[1:nseg] - p[1:, 0] + p[:-1, 1]).ravel()
        A[m - 2 : m, m - 4 : m] = rr @ B[nseg - 1, 1]
        rhs[m - 2 : m] = -(rr @ (p[nseg - 1, 1] + jumps[nseg]))
        # Equilibrate rows, then columns, as for many forces.
        row = np.abs(A).max(axis=1)
        row[row == 0] = 1.0
        A /= row[:, None]
        rhs /= row
        col = np.abs(A).max(axis=0)
        col[col == 0] = 1.0
        A /= col
        self.singular = np.zeros(1, dtype=bool)
        try:
            y = np.linalg.solve(A, rhs) / col
        except np.linalg.LinAlgError:
            y = np.zeros(m)
            self.singular[0] = True
        if not np.isfinite(y).all():
            self.singular[0] = True
            y = np.zeros(m)
        self.coefficients = y.reshape(1, nseg, 4)

    def states(self, iP, pts) -> State:
        """The state at points: w, rotation, M, T, V and the bow derivatives w0..w0'''.

        Parameters
        ----------
        iP : int or ndarray of int
            Index into the axial forces of the batch: one for all points, or one per point.
        pts : Points
        """
        model = self.model
        P = self.P[iP]
        fast = self.table_rows
        if fast is not None and fast.points is pts and np.ndim(iP) == 0:
            out = fast.table.state(float(P), self.coefficients[iP], fast.columns)
            w0, d1, d2, d3 = pts.bow
            st = State(
                w=out[0],
                rotation=out[1],
                M=out[2],
                T=out[3],
                V=out[4],
                w0=w0,
                w0_1=d1,
                w0_2=d2,
                w0_3=d3,
                P=P,
                rows=out,
                columns=fast.columns[0],
            )
            self._targets = _Targets(st, out[TARGET_ROWS], out[TARGET_SLOPE_ROWS])
            return st
        if model.has_foundation:  # the state rows of the basis (the foundation's rows replace the bare ones)
            reused = self.reused is not None and self.reused.points is pts
            B, p = model.basis(P, pts, (self.reused.columns, self.reused.particular) if reused else None)
            c = self.coefficients[iP][pts.seg] if np.ndim(iP) == 0 else self.coefficients[iP, pts.seg]
            y = np.einsum("nij,nj->in", B, c) + p.T
            w0, d1, d2, d3 = pts.bow
            return State(
                w=y[0],
                rotation=y[1],
                M=y[2],
                T=y[3],
                V=y[3] + P * (y[1] + d1),
                w0=w0,
                w0_1=d1,
                w0_2=d2,
                w0_3=d3,
                P=P,
            )
        if self.reused is not None and self.reused.points is pts:
            cols, (pw, pt, pm, pT) = self.reused.columns, self.reused.particular
        else:
            cols, (pw, pt, pm, pT) = model.columns(P, pts)
        w3, t3, m3, w4, t4, m4, T4 = cols
        c = self.coefficients[iP][pts.seg] if np.ndim(iP) == 0 else self.coefficients[iP, pts.seg]
        c0, c1, c2, c3 = c[:, 0], c[:, 1], c[:, 2], c[:, 3]
        rot = c1 + c2 * t3 + c3 * t4 + pt
        T = c3 * T4 - P * c1 + pT
        w0, d1, d2, d3 = pts.bow
        return State(
            w=c0 + c1 * pts.xi + c2 * w3 + c3 * w4 + pw,
            rotation=rot,
            M=c2 * m3 + c3 * m4 + pm,
            T=T,
            V=T + P * (rot + d1),
            w0=w0,
            w0_1=d1,
            w0_2=d2,
            w0_3=d3,
            P=P,
        )

    def targets(self, states, pts):
        """Values and slopes of the four functions whose interior zeros are peaks.

        Returns arrays shaped (4, n): the rotation (peak of w), the total slope (peak of w + w0),
        V (peak of M) and dV/dx (peak of V).
        """
        if self._targets is not None and self._targets.state is states:
            return self._targets.values, self._targets.slopes
        EI = pts.EI
        P = states.P
        curv = -states.M / EI
        # On a foundation its reaction -k w adds to the load: dV/dx and d²V/dx² gain k w and k w'.
        dV = -pts.q + P * (states.w0_2 + curv) + pts.k * states.w
        f = np.stack([states.rotation, states.rotation + states.w0_1, states.V, dV])
        ddV = -pts.q1 + P * (states.w0_3 - states.V / EI) + pts.k * states.rotation
        df = np.stack([curv, curv + states.w0_2, dV, ddV])
        return f, df
