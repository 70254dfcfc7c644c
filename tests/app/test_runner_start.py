"""The served page's runner (app.work.Runner): solves start when the page goes live, the chart and route-sweep
jobs (which start a worker process) a moment later, so that the worker's imports do not compete with the
browser drawing the first page (start-up, issue 10)."""

import threading

from app import work


class _Document:
    """The calls a Bokeh document receives from the runner, recorded; callbacks run when asked."""

    def __init__(self):
        self.timeouts = []
        self.ticks = []

    def add_timeout_callback(self, callback, milliseconds):
        self.timeouts.append((callback, milliseconds))

    def add_next_tick_callback(self, callback):
        self.ticks.append(callback)


def _job(done, name):
    def job():
        done[name].set()

    return job


def test_charts_and_route_sweeps_wait_for_the_delay_and_solves_do_not():
    document = _Document()
    runner = work.Runner(document)
    done = {name: threading.Event() for name in ("solve", "chart", "routes")}
    runner.solve(lambda full: _job(done, "solve")() or None, full=True)
    runner.chart(lambda: _job(done, "chart")() or None)
    runner.routes(lambda: _job(done, "routes")() or None)
    runner.start()
    assert done["solve"].wait(10)
    ((callback, delay),) = document.timeouts
    assert delay == work.BACKGROUND_DELAY_MS > 0
    assert not done["chart"].wait(0.3) and not done["routes"].is_set()  # held until the timeout fires
    callback()
    assert done["chart"].wait(10) and done["routes"].wait(10)


def test_a_closed_session_starts_no_background_job():
    document = _Document()
    runner = work.Runner(document)
    started = threading.Event()
    runner.chart(lambda: started.set())
    runner.start()
    runner.close()
    ((callback, _),) = document.timeouts
    callback()
    assert not started.wait(0.3)
