"""Solving off the server's event loop, with time budgets (issue 11: one case must never freeze the server).

The served page solves nothing on the event loop, which every session shares:

- :class:`Runner` is one session's queue of work. A solve runs in a thread of a shared pool; only the newest
  request waits (a slider dragged faster than it solves skips the steps in between), and the result is handed
  back to the session's document with ``add_next_tick_callback`` (the one thread-safe way into a Bokeh
  document), where the page draws it.
- The amplification chart's sweep and the capacity (200 solves of the case, the unbounded part: 112 s for
  300 point loads before issue 11) run in a separate worker process with a deadline (:data:`CHART_BUDGET`),
  so that they hold neither the event loop nor the server's GIL, and are killed when they take too long.
- The first solve of a case with many loads is tried in a worker process first, under :data:`SOLVE_BUDGET`:
  a case that takes longer is refused with a message and the previous case is kept (a thread cannot be
  stopped; a process can).

Without a runner (:class:`app.state.MemberState` used directly, in tests and scripts) everything is solved at
once, as before.
"""

from __future__ import annotations

import contextlib
import logging
import multiprocessing
import signal
import threading
import time
from concurrent.futures import ThreadPoolExecutor

__all__ = [
    "CHART_BUDGET",
    "PROBE_LOADS",
    "SOLVE_BUDGET",
    "BudgetExceeded",
    "Runner",
    "run_in_worker",
    "shutdown",
    "start_workers",
]

_log = logging.getLogger(__name__)

#: Seconds the amplification sweep and the capacity of one case may take on the server.
CHART_BUDGET = 20.0
#: Seconds the first solve of a case may take on the server (checked in a worker for cases with many loads).
SOLVE_BUDGET = 10.0
#: Cases with more loads than this have their first solve tried in a worker process under SOLVE_BUDGET.
PROBE_LOADS = 16

# Seconds a new worker process may take to start and import the engine (a busy machine: several seconds).
_START_TIMEOUT = 60.0
_SOLVES = ThreadPoolExecutor(max_workers=4, thread_name_prefix="strutscope-solve")
_WAITS = ThreadPoolExecutor(max_workers=8, thread_name_prefix="strutscope-chart")


class BudgetExceeded(Exception):
    """A job in a worker process ran past its deadline and the process was stopped."""


# ---------------------------------------------------------------------------------------- worker processes


def _child(connection) -> None:
    """The worker process: run each (function, arguments) received and send back (ok, value)."""
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # Ctrl+C goes to the server, which stops this process
    while True:
        try:
            function, args = connection.recv()
        except (EOFError, OSError):  # the server has gone
            return
        try:
            reply = (True, function(*args))
        except BaseException as error:  # noqa: BLE001 - reported to the server by its type only
            reply = (False, f"{type(error).__name__}")
        try:
            connection.send(reply)
        except (OSError, ValueError):
            return


class _Worker:
    """One worker process, started on first use, used by one job at a time, killed at a deadline."""

    def __init__(self, name: str) -> None:
        self.name = name
        self._lock = threading.Lock()
        self._process = None
        self._connection = None

    def _ensure(self) -> None:
        """Start the process when it is not running, and wait for its imports (not part of any budget)."""
        if self._process is not None and self._process.is_alive():
            return
        context = multiprocessing.get_context("spawn")  # never fork a threaded server
        parent, child = context.Pipe()
        process = context.Process(target=_child, args=(child,), name=f"strutscope-{self.name}", daemon=True)
        process.start()
        child.close()
        self._process, self._connection = process, parent
        parent.send((_import_engine, ()))
        if not parent.poll(_START_TIMEOUT):
            self._stop()
            raise RuntimeError("the worker process did not start")
        parent.recv()

    def _stop(self) -> None:
        process, connection = self._process, self._connection
        self._process = self._connection = None
        if connection is not None:
            connection.close()
        if process is not None and process.is_alive():
            process.kill()
            process.join(5)

    def run(self, function, args: tuple, deadline: float):
        """``function(*args)`` in the worker; BudgetExceeded past `deadline` s of work (or of queueing)."""
        if not self._lock.acquire(timeout=deadline):  # another session's job ran its whole budget
            raise BudgetExceeded
        try:
            self._ensure()
            self._connection.send((function, args))
            if not self._connection.poll(deadline):
                self._stop()
                raise BudgetExceeded
            ok, value = self._connection.recv()
        except (EOFError, OSError, BrokenPipeError):
            self._stop()
            raise RuntimeError("the worker process stopped") from None
        finally:
            self._lock.release()
        if not ok:
            raise RuntimeError(f"the worker failed ({value})")
        return value

    def stop(self) -> None:
        with self._lock:
            self._stop()


_WORKERS = {"chart": _Worker("chart"), "probe": _Worker("probe")}


def run_in_worker(kind: str, function, args: tuple, deadline: float):
    """Run a picklable top-level `function` in the `kind` worker process ('chart' or 'probe')."""
    return _WORKERS[kind].run(function, args, deadline)


def start_workers() -> None:
    """Start the worker processes ahead of the first session (their imports take a second or more)."""
    for kind in _WORKERS:
        _WAITS.submit(_warm, kind)


def _warm(kind: str) -> None:
    with contextlib.suppress(Exception):  # started again on first use
        run_in_worker(kind, _import_engine, (), CHART_BUDGET)


def _import_engine() -> bool:
    import engine  # noqa: F401

    return True


def shutdown() -> None:
    """Stop the worker processes (when the server stops)."""
    for worker in _WORKERS.values():
        worker.stop()


# ---------------------------------------------------------------------------------------- jobs in a worker


def probe_solve(case_text: str, stations: int) -> float:
    """Solve the case (JSON text) once; return the seconds it took. Runs in the probe worker."""
    import engine

    start = time.perf_counter()
    engine.solve(engine.Case.from_json(case_text), stations=stations)
    return time.perf_counter() - start


def chart_key(case, result):
    """What the chart and the capacity depend on: the case without its axial force, and with load cases
    every ultimate combination's too (the capacity is the lowest of them: an edit of another load case
    left the old capacity on screen, 29 % high, found by an independent audit)."""
    import engine

    actions = getattr(result, "actions", None)
    if actions is None:
        return case.without_axial_force()
    return (case.without_axial_force(), *(c.without_axial_force() for _, c in engine.ultimate_cases(actions)))


def ultimate_texts(result) -> tuple:
    """(name, JSON text) of every ultimate combination's plain case of a result with load cases, else ()."""
    import engine

    actions = getattr(result, "actions", None)
    return () if actions is None else tuple((n, c.to_json()) for n, c in engine.ultimate_cases(actions))


def chart_job(case_text: str, forces, ultimate: tuple = ()) -> dict:
    """The sweep over `forces` and the capacity of a case (JSON text), as picklable outputs. ``ultimate``:
    with load cases, (name, JSON text) of every ultimate combination's plain case, whose lowest capacity is
    given (:func:`engine.lowest_capacity`). In the worker."""
    import engine

    case = engine.Case.from_json(case_text)
    outputs: dict = {"chart_note": ""}
    try:
        sweep = engine.sweep(case, forces)
        outputs.update(sweep=sweep, approximation=(sweep.axial_force, sweep.simple_amplification))
    except Exception as error:  # noqa: BLE001 - the chart is secondary
        outputs.update(
            sweep=None,
            approximation=None,
            chart_note=f"the amplification chart could not be computed ({type(error).__name__})",
        )
    if case.section is not None and case.material is not None:
        try:
            if ultimate:
                named = tuple((name, engine.Case.from_json(text)) for name, text in ultimate)
                found = engine.lowest_capacity(named)
            else:
                found = engine.capacity(case)
            outputs.update(capacity=found, capacity_note="")
        except Exception as error:  # noqa: BLE001 - shown as the capacity's note
            outputs.update(capacity=None, capacity_note=str(error))
    else:
        outputs.update(capacity=None, capacity_note="needs a section and a material")
    return outputs


# ---------------------------------------------------------------------------------------- one session


class _Lane:
    """Latest-wins work for one session: at most one job runs, only the newest one waits."""

    def __init__(self, pool: ThreadPoolExecutor, deliver) -> None:
        self._pool = pool
        self._deliver = deliver
        self._lock = threading.Lock()
        self._pending = None
        self._busy = False
        self.paused = True

    def submit(self, job, merge=None) -> None:
        with self._lock:
            if merge is not None and self._pending is not None:
                job = merge(self._pending, job)
            self._pending = job
            if self._busy or self.paused:
                return
            self._busy = True
        self._pool.submit(self._drain)

    def resume(self) -> None:
        with self._lock:
            self.paused = False
            if self._busy or self._pending is None:
                return
            self._busy = True
        self._pool.submit(self._drain)

    def _drain(self) -> None:
        while True:
            with self._lock:
                job, self._pending = self._pending, None
                if job is None:
                    self._busy = False
                    return
            try:
                done = job()
            except Exception:  # noqa: BLE001 - a job reports its own failures; this is a last resort
                _log.error("strutscope: a background job failed")
                continue
            if done is not None:
                self._deliver(done)


#: Milliseconds after a page goes live before its chart and route-sweep jobs start (see :meth:`Runner.start`).
BACKGROUND_DELAY_MS = 1500


class Runner:
    """One session's off-loop solving; results come back as callbacks on the session's document."""

    def __init__(self, document) -> None:
        self.document = document
        self.closed = False
        self.started = False
        self._waiting: list = []
        self._solves = _Lane(_SOLVES, self._deliver)
        self._charts = _Lane(_WAITS, self._deliver)
        self._routes = _Lane(_WAITS, self._deliver)

    def start(self) -> None:
        """Begin working (the page calls this once it is live in the browser).

        Solves start at once; the chart and route-sweep lanes :data:`BACKGROUND_DELAY_MS` later: their first
        job starts a worker process, whose imports would otherwise compete for the CPU with the browser while
        it draws the first page (start-up, issue 10). Neither feeds the governing values.
        """
        self.started = True
        waiting, self._waiting = self._waiting, []
        for callback in waiting:
            self._deliver(callback)
        self._solves.resume()
        try:
            self.document.add_timeout_callback(self._resume_background, BACKGROUND_DELAY_MS)
        except Exception:  # noqa: BLE001 - no event loop (a script, a test): at once
            self._resume_background()

    def _resume_background(self) -> None:
        if self.closed:
            return
        self._charts.resume()
        self._routes.resume()

    def later(self, callback) -> None:
        """Run `callback` on the event loop on a later tick, once the page is live (never for a bare GET)."""
        if self.started:
            self._deliver(callback)
        else:
            self._waiting.append(callback)

    def close(self) -> None:
        self.closed = True

    def _deliver(self, callback) -> None:
        if self.closed:
            return
        document = self.document

        def run() -> None:
            from panel.io.state import set_curdoc

            with set_curdoc(document):
                callback()

        try:
            document.add_next_tick_callback(run)
        except Exception:  # noqa: BLE001 - the session has gone
            self.closed = True

    def solve(self, job, full: bool) -> None:
        """Queue `job` (a function returning the callback that applies its outcome); `full` requests merge."""
        self._solves.submit(_Job(job, full), merge=_Job.merge)

    def chart(self, job) -> None:
        """Queue a chart job (a function returning the callback that applies its outputs)."""
        self._charts.submit(job)

    def routes(self, job) -> None:
        """Queue a route-sweep job (its own lane, so that it never replaces a waiting chart job)."""
        self._routes.submit(job)


class _Job:
    """A solve request; when a newer one replaces it, a full refresh stays full."""

    def __init__(self, work, full: bool) -> None:
        self.work = work
        self.full = full

    def __call__(self):
        return self.work(self.full)

    @staticmethod
    def merge(old: _Job, new: _Job) -> _Job:
        return _Job(new.work, old.full or new.full)


# ------------------------------------------------------------------------------- the chart's forces

# The amplification chart runs from this much tension (in units of Pcr1) to past the third critical load.
_CHART_TENSION = 2.0
_CHART_BEYOND_THIRD = 1.12


def chart_forces(critical_loads):
    """The amplification chart's axial forces [N]: from tension of 2·Pcr1 to past Pcr3, dense near each Pcr.

    The critical loads themselves are left out: the curves run off the chart on both sides of each.
    """
    import numpy as np

    pcr = np.asarray(critical_loads, dtype=float)
    top = _CHART_BEYOND_THIRD * pcr[2]
    parts = [np.linspace(-_CHART_TENSION * pcr[0], top, 260)]
    offsets = np.geomspace(2e-4, 0.06, 14)
    for load in pcr[:3]:
        parts += [load * (1.0 - offsets), load * (1.0 + offsets)]
    forces = np.unique(np.concatenate(parts))
    return forces[(forces >= -_CHART_TENSION * pcr[0]) & (forces <= top)]
