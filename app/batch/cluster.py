"""The batch on an existing Dask cluster: ``strutscope batch TABLE --executor dask://HOST:PORT``.

An optional extra (``pip install "strutscope[cluster]"``, which brings ``dask[distributed]``); the default
stays the local process pool of :mod:`app.batch.solving`. The rows go in chunks of :data:`CHUNK_ROWS` through
the cluster's ``Client``, with a bounded window of chunks in flight (per-task overhead is milliseconds,
so a chunk is many rows), and come back in the input order: the caller writes them to the same temporary
results file, renamed only when complete.

A worker that dies loses no row: the scheduler sends the tasks it held to another worker (Dask's own
rescheduling), and when a chunk has used up the scheduler's allowed failures it is sent again from here, up
to :data:`RESUBMITS` times. Either way the run reports it (``BatchSummary.retried``).

Before anything is sent, every worker's strutscope must be the client's: the same version and the same code
(a digest of the installed ``engine`` and ``app`` sources). A worker on other code would solve with other
numbers; the run is refused with a message naming the worker and both versions.
"""

from __future__ import annotations

import collections
import hashlib
import importlib.metadata
from collections.abc import Iterator
from pathlib import Path

__all__ = ["CHUNK_ROWS", "RESUBMITS", "ExecutorError", "code_version", "dask_address", "solved_on_dask"]

#: Rows per task: a task costs the scheduler milliseconds, a thousand rows seconds.
CHUNK_ROWS = 1000
#: Times a chunk is sent again after the scheduler gave up on it (``KilledWorker``).
RESUBMITS = 2
#: Seconds to wait for the scheduler to answer at the start.
CONNECT_TIMEOUT = 30

_PREFIX = "dask://"


class ExecutorError(Exception):
    """The executor cannot be used: a wrong address, dask missing, no workers, or a version skew."""


def dask_address(executor: str) -> str | None:
    """The scheduler's ``tcp://HOST:PORT`` for ``dask://HOST:PORT``, None for ``local``; else an error."""
    if executor == "local":
        return None
    if executor.startswith(_PREFIX):
        rest = executor[len(_PREFIX) :]
        host, _, port = rest.rpartition(":")
        if host and port.isdigit() and 0 < int(port) < 65536 and "/" not in rest:
            return f"tcp://{rest}"
    raise ExecutorError(
        f"{executor!r} is not an executor; allowed: 'local', or dask://HOST:PORT with the address of a "
        "running Dask scheduler (for example dask://10.0.0.5:8786)"
    )


_VERSION: str | None = None


def code_version() -> str:
    """The version and a digest of its ``engine`` and ``app`` sources (``0.1.0+code.1a2b3c4d5e6f``)."""
    global _VERSION
    if _VERSION is None:
        try:
            version = importlib.metadata.version("strutscope")
        except importlib.metadata.PackageNotFoundError:
            version = "unknown"
        digest = hashlib.sha256()
        root = Path(__file__).resolve().parents[2]
        for package in ("engine", "app"):
            for path in sorted((root / package).rglob("*.py")):
                digest.update(path.relative_to(root).as_posix().encode())
                digest.update(path.read_bytes())
        _VERSION = f"{version}+code.{digest.hexdigest()[:12]}"
    return _VERSION


def worker_version() -> str:
    """What a worker reports (run there by ``Client.run``)."""
    return code_version()


def client_version() -> str:
    """What this side compares the workers with."""
    return code_version()


def _connect(address: str):
    try:
        from distributed import Client
    except ImportError:
        raise ExecutorError(
            "the Dask executor needs dask.distributed, which is not installed; "
            "install it with: pip install 'strutscope[cluster]'"
        ) from None
    try:
        return Client(address, timeout=CONNECT_TIMEOUT, set_as_default=False)
    except (OSError, TimeoutError) as error:
        raise ExecutorError(f"no Dask scheduler answered at {address} ({error})") from None


def _check_versions(client) -> int:
    """Refuse workers on other code; return the number of workers."""
    ours = client_version()
    try:
        theirs = client.run(worker_version)
    except Exception as error:  # noqa: BLE001 -- e.g. a worker without strutscope cannot load the check
        raise ExecutorError(
            f"the workers could not report their strutscope version ({type(error).__name__}: {error}); "
            "install the same strutscope on the client and every worker"
        ) from None
    if not theirs:
        raise ExecutorError(f"the Dask scheduler at {client.scheduler.address} has no workers")
    other = {worker: version for worker, version in theirs.items() if version != ours}
    if other:
        worker, version = sorted(other.items())[0]
        raise ExecutorError(
            f"version skew: worker {worker} runs strutscope {version}, this client {ours} "
            f"({len(other)} of {len(theirs)} workers differ); install the same strutscope on the client "
            "and every worker, then restart the workers"
        )
    return len(theirs)


def _suspicious(dask_scheduler, keys) -> dict:
    """On the scheduler: how often each task's worker died while it ran there."""
    found = {}
    for key in keys:
        state = dask_scheduler.tasks.get(key)
        found[key] = 0 if state is None else int(getattr(state, "suspicious", 0))
    return found


def solved_on_dask(
    address: str, chunks: Iterator[list], solve_chunk, options, retried: list, window: int | None = None
) -> Iterator[list]:
    """Yield each chunk's results in the input order, solved on the cluster at `address`.

    `retried` receives a line for each chunk that was solved again because a worker was lost.
    """
    client = _connect(address)
    try:
        workers = _check_versions(client)
        window = window or 2 * workers + 2
        pending: collections.deque = collections.deque()

        def submit(chunk):
            # Client.submit rather than the concurrent.futures wrapper of Client.get_executor(): the task's
            # key is needed to ask the scheduler whether a worker died under it.
            return client.submit(solve_chunk, chunk, options, pure=False)

        def send(chunk):
            return [chunk, submit(chunk), 0]

        def rows(chunk) -> str:
            return f"rows {chunk[0][0]}–{chunk[-1][0]}" if chunk else "an empty chunk"

        def settle(item) -> list:
            chunk, future, resent = item
            while True:
                try:
                    results = future.result()
                    break
                except Exception as error:  # noqa: BLE001 -- the scheduler gave up on the chunk
                    if type(error).__name__ != "KilledWorker" or resent >= RESUBMITS:
                        raise ExecutorError(
                            f"{rows(chunk)} could not be solved on the cluster "
                            f"({type(error).__name__}: {error})"
                        ) from None
                    resent += 1
                    retried.append(
                        f"{rows(chunk)}: the workers running them were lost; sent again ({resent})"
                    )
                    future = submit(chunk)
            lost = client.run_on_scheduler(_suspicious, keys=[future.key]).get(future.key, 0)
            if lost:
                retried.append(
                    f"{rows(chunk)}: a worker was lost while solving them; the scheduler solved them again "
                    f"({lost} time{'s' if lost != 1 else ''})"
                )
            future.release()
            return results

        try:
            for chunk in chunks:
                pending.append(send(chunk))
                if len(pending) >= window:
                    yield settle(pending.popleft())
            while pending:
                yield settle(pending.popleft())
        finally:
            for _, future, _ in pending:
                future.cancel()
    finally:
        client.close()
