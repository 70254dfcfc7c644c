"""The routes against the axial force: each route's utilisation from N = 0 to near the first critical load.

The page's "Routes" figure shows how far apart the routes of the member check are, over the whole range of
axial force rather than at the one N on screen. Every value comes from the engine: `engine.sweeps.route_sweep`
solves the case at :data:`SWEEP_POINTS` axial forces and keeps each route's utilisation. It does not
depend on the axial force on screen, so :class:`RouteSweepOutputs` computes it once per case without its axial
force (``Case.without_axial_force()``), and only once the figure has been asked for (the tab shown): a drag of
the slider never reruns it. Served, it runs in the chart's worker process under the chart's budget.
"""

from __future__ import annotations

import logging
from functools import partial

import numpy as np
import param

__all__ = ["SWEEP_POINTS", "RouteSweepOutputs", "route_sweep", "route_sweep_forces", "route_sweep_job"]

_log = logging.getLogger(__name__)

#: Axial forces of the sweep: enough for a smooth curve of a utilisation (which is smooth in N below Pcr1).
SWEEP_POINTS = 25


def route_sweep_forces(result, points: int = SWEEP_POINTS) -> np.ndarray:
    """Axial forces [N] of the sweep: :func:`engine.sweeps.route_sweep_forces`."""
    from engine.sweeps import route_sweep_forces as forces_of

    return forces_of(result, points)


def route_sweep(case, forces) -> dict:
    """:func:`engine.sweeps.route_sweep` of `case` at `forces` [N], with ``note`` ("" or why nothing could be
    computed)."""
    from engine.sweeps import route_sweep as sweep_of

    sweep = sweep_of(case, forces)
    note = "" if np.isfinite(sweep["headline"]).any() else "no member check: give a section and a material"
    return {**sweep, "note": note}


def route_sweep_job(case_text: str, forces) -> dict:
    """:func:`route_sweep` of a case given as JSON text (picklable in and out): the worker's job."""
    import engine

    return route_sweep(engine.Case.from_json(case_text), forces)


class RouteSweepOutputs(param.Parameterized):
    """The route sweep as an output of the page's state, computed when wanted and once per case."""

    route_sweep = param.Parameter(
        default=None, constant=True, doc="route_sweep of the case (dict), or None until computed."
    )
    route_note = param.String(
        default="", constant=True, doc="Why the routes figure is not shown (yet), when it is not."
    )

    _route_wanted = False
    _route_key = None

    def want_route_sweep(self) -> None:
        """Compute the sweep for the current case (and again whenever the case without N changes)."""
        self._route_wanted = True
        if self.result is not None:
            self._routes_follow(self.result.case, self.result)

    def _routes_follow(self, case, result) -> None:
        """After a solve: start the sweep if it is wanted and the case (without N) is new."""
        if not self._route_wanted:
            return
        key = case.without_axial_force()
        if key == self._route_key:
            return
        self._route_key = key
        forces = route_sweep_forces(result)
        if self.runner is None:
            self._route_swept(key, _sweep_outputs(case, forces))
            return
        with param.edit_constant(self):
            self.param.update(route_sweep=None, route_note="computing the routes …")
        self.runner.routes(partial(_route_job, self, case, key, forces))

    def _route_swept(self, key, outputs: dict) -> None:
        if key != self._route_key:
            return  # the case has changed since
        with param.edit_constant(self):
            self.param.update(**outputs)


def _failed(error: BaseException) -> dict:
    _log.error("strutscope: the route sweep failed (%s)", type(error).__name__)
    return {"route_sweep": None, "route_note": f"the routes could not be computed ({type(error).__name__})"}


def _sweep_outputs(case, forces) -> dict:
    try:
        sweep = route_sweep(case, forces)
    except Exception as error:  # noqa: BLE001 - the figure is secondary
        _log.error("strutscope: the route sweep failed (%s)", type(error).__name__)
        return {
            "route_sweep": None,
            "route_note": f"the routes could not be computed ({type(error).__name__})",
        }
    return {"route_sweep": sweep, "route_note": sweep["note"]}


def _route_job(state, case, key, forces):
    """Off the event loop: the sweep in the chart's worker process, under the chart's budget."""
    from app import work

    try:
        sweep = work.run_in_worker("chart", route_sweep_job, (case.to_json(), forces), work.CHART_BUDGET)
        outputs = {"route_sweep": sweep, "route_note": sweep["note"]}
    except work.BudgetExceeded:
        note = f"the routes take longer than the server's budget of {work.CHART_BUDGET:g} s"
        outputs = {"route_sweep": None, "route_note": note}
    except Exception as error:  # noqa: BLE001 - the figure is secondary
        _log.error("strutscope: the route sweep failed (%s)", type(error).__name__)
        outputs = {
            "route_sweep": None,
            "route_note": f"the routes could not be computed ({type(error).__name__})",
        }
    return partial(state._route_swept, key, outputs)
