"""Stopping the batch's process pool leaves nothing for Python's exit to trip over.

`app.workers.stop_workers` ends the workers of an interrupted batch. Python's exit hook for process pools
(`concurrent.futures.process._python_exit`, CPython 3.11) then writes to the wake-up pipe of every pool's
manager thread, without the pool's lock; the thread closes that pipe as it ends, so a thread still ending at
exit made the hook fail with "OSError: [Errno 9] Bad file descriptor" and a traceback after the clean
message (seen once in CI, tests/app/test_interrupt.py). These tests check that the thread has ended and its
pipe is closed (the hook then skips it) when `stop_workers` returns.
"""

from __future__ import annotations

import concurrent.futures.process as process_pool
import time

from app.workers import stop_workers, worker_pool


def _nap(seconds: float) -> float:
    time.sleep(seconds)
    return seconds


def test_the_pool_manager_has_ended_and_its_wakeup_pipe_is_closed_when_stop_workers_returns():
    with worker_pool(2, pdf=False) as pool:
        futures = [pool.submit(_nap, 30.0) for _ in range(4)]  # workers busy, more work queued
        time.sleep(0.5)
        manager = pool._executor_manager_thread
        wakeup = pool._executor_manager_thread_wakeup
        assert manager is not None and manager.is_alive()
        workers = list(pool._processes.values())
        started = time.monotonic()
        stop_workers(pool)
        took = time.monotonic() - started
    assert not manager.is_alive()
    assert wakeup._closed  # what the exit hook reads before it writes
    assert all(not worker.is_alive() for worker in workers)
    assert all(future.done() for future in futures)
    assert took < 20.0  # the 30 s naps were cut short, not waited for
    # The exit hook's own loop over the pools runs without error now (what Python does at exit).
    for _, pipe in list(process_pool._threads_wakeups.items()):
        pipe.wakeup()
