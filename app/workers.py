"""The process pool of ``strutscope batch``: workers with the engine loaded, stopped at once when interrupted.

:func:`worker_pool` starts the workers from a fork server that has imported the engine (cheap starts, and no
fork of the parent with its threads), each with one thread of linear algebra. When the run is interrupted
(Ctrl-C, SIGTERM) or fails, the pool does not wait for the chunks in flight: :func:`stop_workers` sends each
worker SIGTERM (which :func:`app.interrupt.worker_start` turns into a clean exit that removes a temporary
file being written) and kills what is still alive after a grace period, so no worker outlives the run.
"""

from __future__ import annotations

import concurrent.futures
import contextlib
import multiprocessing
import os
from collections.abc import Iterator

from app.interrupt import worker_start

__all__ = ["one_thread_here", "stop_workers", "worker_pool"]

# Each worker is one process on one core: let its linear algebra use one thread, or two workers on two cores
# run four threads and the share-out gains little (measured: 1.05x instead of 1.75x on two cores). The
# variables are read when numpy loads, so they are set for the worker processes only, and a value the user
# set is kept.
_THREAD_VARIABLES = ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS")


def one_thread_here() -> None:
    """One thread of linear algebra for this process, unless the user chose otherwise (before numpy loads).

    The systems of one member are small (4 unknowns per segment): threads only contend. On the shared
    two-core machine a capacity search of 50 point loads took 4.7 s with OpenBLAS's threads and 0.03 s with
    one (tests/benchmarks/case_limits.py, 2026-12-02).
    """
    for name in _THREAD_VARIABLES:
        os.environ.setdefault(name, "1")


@contextlib.contextmanager
def _one_thread_each() -> Iterator[None]:
    saved = {name: os.environ.get(name) for name in _THREAD_VARIABLES}
    for name in _THREAD_VARIABLES:
        os.environ.setdefault(name, "1")
    try:
        yield
    finally:
        for name, value in saved.items():
            if value is None:
                os.environ.pop(name, None)
            else:
                os.environ[name] = value


@contextlib.contextmanager
def worker_pool(workers: int, pdf: bool) -> Iterator[concurrent.futures.ProcessPoolExecutor]:
    """A process pool whose workers have the engine loaded and one thread of linear algebra each."""
    if "forkserver" in multiprocessing.get_all_start_methods():
        from multiprocessing import forkserver  # POSIX only

        # A fork server imports the engine once and forks the workers from it: cheap starts, and no fork of
        # this process with its threads (the progress bar has one). It keeps the environment it started with.
        context = multiprocessing.get_context("forkserver")
        preload = ["engine", "app.batch", "app.units"] + (["app.exports"] if pdf else [])
        context.set_forkserver_preload(preload)
        with _one_thread_each():
            forkserver.ensure_running()
        pool = concurrent.futures.ProcessPoolExecutor(
            max_workers=workers, mp_context=context, initializer=worker_start
        )
    else:  # Windows: spawned workers copy the environment as each one starts
        with _one_thread_each():
            pool = concurrent.futures.ProcessPoolExecutor(
                max_workers=workers, mp_context=multiprocessing.get_context("spawn"), initializer=worker_start
            )
    try:
        yield pool
    except BaseException:
        stop_workers(pool)  # interrupted (Ctrl-C, SIGTERM) or failed: do not wait for the chunks in flight
        raise
    pool.shutdown(wait=True)


def stop_workers(pool: concurrent.futures.ProcessPoolExecutor, grace: float = 2.0) -> None:
    """End the pool's workers now: SIGTERM (each removes its temporary file), then SIGKILL after `grace`."""
    processes = list((getattr(pool, "_processes", None) or {}).values())
    manager = getattr(pool, "_executor_manager_thread", None)  # shutdown() forgets it
    pool.shutdown(wait=False, cancel_futures=True)
    # The first SIGTERM interrupts a worker's chunk (its temporary file is removed); a worker that then waits
    # for more work gets a second one, which ends it (app.interrupt.worker_start); SIGKILL is the last resort.
    for step, wait in (("terminate", 0.5), ("terminate", grace), ("kill", grace)):
        alive = [process for process in processes if process.is_alive()]
        for process in alive:
            with contextlib.suppress(Exception):
                getattr(process, step)()
        for process in alive:
            with contextlib.suppress(Exception):
                process.join(wait)
    # The pool's manager thread closes its wake-up pipe as it ends. Python's exit hook for process pools
    # (concurrent.futures.process._python_exit, CPython 3.11) writes to that pipe without the pool's lock: if
    # the thread closed it in between, the exit printed "OSError: [Errno 9] Bad file descriptor" with a
    # traceback after the clean message (seen once in CI). Once the thread has ended, the hook skips the pipe.
    if manager is not None:
        with contextlib.suppress(Exception):
            manager.join(grace)
