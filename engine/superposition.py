"""Superposition shown wrong: the sum of separately amplified load cases against the exact combined result.

Second-order analysis is not linear in the loads: the amplification of every load depends on the whole
axial force. Adding the actions' results, each solved alone at its own factored axial force, leaves out the
amplification each action's loads get from the other actions' axial force. :func:`compare` shows by how much,
for one combination: both sides are solved without the bow (the bow belongs to no one action). At N = 0
every part is first order and the sum is exact; towards the critical load the sum falls ever further short
(it is on the unsafe side when the axial forces add up).
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

import numpy as np

from engine import analysis
from engine.actions import scaled
from engine.envelope import combination_case, read_at
from engine.inputs import Imperfection
from engine.prepared import prepare
from engine.raw import raw
from engine.solver.model import Points

__all__ = ["Superposition", "compare"]


@dataclass(frozen=True, kw_only=True, eq=False)
class Superposition:
    """The exact combined moment and deflection against the sum of the separately solved actions.

    Attributes
    ----------
    combination : str
    x : ndarray
        The stations of the exact solution [m].
    moment_exact, moment_superposed : ndarray
        M [N·m] of the combination solved whole, and the sum of each action solved alone (its factored loads
        at its own factored axial force), both without the bow.
    deflection_exact, deflection_superposed : ndarray
        w [m], the same way.
    moment_peak_exact, moment_peak_superposed : float
        max|M| of each [N·m].
    error : float
        (max|M| exact − max|M| superposed) / max|M| exact [-]: positive where the sum falls short (the unsafe
        side); 0 without any moment; inf at a critical load.
    parts : tuple
        ``(action name, factor, axial force [N])`` of each action solved alone.
    """

    combination: str
    x: np.ndarray
    moment_exact: np.ndarray
    moment_superposed: np.ndarray
    deflection_exact: np.ndarray
    deflection_superposed: np.ndarray
    moment_peak_exact: float
    moment_peak_superposed: float
    error: float
    parts: tuple


def _part_at(part, n, x):
    """M and w of a plain case at the points ``x``, exactly: its own stations' values where ``x`` holds them
    (a doubled point: left value, then right), its basis functions elsewhere. None at a critical load."""
    prep = prepare(part)
    solved = raw(prep, n, float(part.axial_force))
    status, values, xs, batch = solved[0], solved[2], solved[3], solved[6]
    if status == "critical":
        return None
    right = np.zeros(x.size, dtype=bool)
    right[1:] = x[1:] == x[:-1]
    own = np.isin(x, xs)
    out = []
    for key in ("M", "w"):
        column = np.empty(x.size)
        for side in (False, True):
            pick = own & (right == side)
            column[pick] = read_at(xs, values[key], x[pick], side)
        out.append(column)
    inside = ~own
    if inside.any():
        model = prep.model
        seg = model.segment_of(x[inside])
        st = batch.states(0, Points(model, seg, x[inside] - model.xa[seg]))
        out[0][inside], out[1][inside] = st["M"], st["w"]
    return out


def compare(case, combination, stations: int = 401) -> Superposition:
    """Solve ``combination`` of ``case`` (a case with actions) whole and action by action, without the bow."""
    whole = dataclasses.replace(combination_case(case, combination), imperfection=Imperfection())
    n = analysis.check_stations(stations)
    exact = analysis.solve(whole, n)
    x = exact.x
    moment = np.zeros(x.size)
    deflection = np.zeros(x.size)
    parts = []
    for action, factor in zip(case.actions, combination.factors, strict=True):
        if factor == 0.0:
            continue
        part = dataclasses.replace(
            whole,
            loads=tuple(scaled(load, factor) for load in action.loads),
            axial_force=factor * action.axial_force,
        )
        solved = _part_at(part, n, x)
        if solved is None:
            moment += np.inf
            deflection += np.inf
        else:
            moment += solved[0]
            deflection += solved[1]
        parts.append((action.name, factor, part.axial_force))
    peak_exact = float(np.max(np.abs(exact.moment)))
    peak_sum = float(np.max(np.abs(moment)))
    if exact.status == "critical" or not (math.isfinite(peak_exact) and math.isfinite(peak_sum)):
        error = math.inf
    else:
        error = 0.0 if peak_exact == 0.0 else (peak_exact - peak_sum) / peak_exact
    return Superposition(
        combination=combination.name,
        x=x,
        moment_exact=exact.moment,
        moment_superposed=moment,
        deflection_exact=exact.deflection,
        deflection_superposed=deflection,
        moment_peak_exact=peak_exact,
        moment_peak_superposed=peak_sum,
        error=error,
        parts=tuple(parts),
    )
