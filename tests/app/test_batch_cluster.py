"""``strutscope batch --executor dask://HOST:PORT`` on a ``dask.distributed.LocalCluster``.

The cluster's results file must be byte for byte the local run's (the same rows solved by the same code in
the same order); a worker killed mid-run loses no row and the run says so; a worker on other code is refused.
Small clusters (one in-process worker, or two single-threaded worker processes) and generous timeouts, so the
tests hold on a busy two-core machine; nothing is timed.
"""

from __future__ import annotations

import os
import signal
from pathlib import Path

import pytest

from app import batch
from app.batch import cluster

distributed = pytest.importorskip("distributed")

DATA = Path(__file__).parent / "data"
TABLE = str(DATA / "batch_generated_members.csv")  # 150 invented members, 4 of them invalid


def _address(local_cluster) -> str:
    return local_cluster.scheduler_address.replace("tcp://", "dask://")


@pytest.fixture(scope="module")
def in_process_cluster():
    with distributed.LocalCluster(
        n_workers=1, threads_per_worker=1, processes=False, protocol="tcp", dashboard_address=":0"
    ) as local:
        yield local


@pytest.fixture(scope="module")
def local_results(tmp_path_factory):
    out = tmp_path_factory.mktemp("local")
    batch.run(TABLE, str(out), workers=1, progress=False)
    return (out / "results.csv").read_bytes()


def test_cluster_results_are_the_local_results(tmp_path, in_process_cluster, local_results):
    summary = batch.run(
        TABLE, str(tmp_path), executor=_address(in_process_cluster), chunk_rows=16, progress=False
    )
    assert (tmp_path / "results.csv").read_bytes() == local_results
    assert (summary.members, summary.solved, summary.error_count) == (150, 146, 4)
    assert summary.executor.startswith("Dask cluster at tcp://") and summary.retried == []
    assert [name for name in os.listdir(tmp_path) if name.endswith(".part")] == []


def test_a_worker_on_other_code_is_refused(tmp_path, in_process_cluster, monkeypatch):
    monkeypatch.setattr(cluster, "client_version", lambda: "0.0.1+code.000000000000")
    with pytest.raises(
        batch.ExecutorError, match=r"version skew: worker tcp://\S+ runs strutscope \S+, this client "
    ):
        batch.run(TABLE, str(tmp_path / "out"), executor=_address(in_process_cluster), progress=False)
    assert not (tmp_path / "out" / "results.csv").exists()


@pytest.mark.parametrize(
    "executor", ["dask:/host:8786", "tcp://host:8786", "dask://host", "dask://host:99999", "threads"]
)
def test_an_executor_that_is_not_one_is_refused_with_the_allowed_forms(tmp_path, executor):
    with pytest.raises(
        batch.ExecutorError, match=r"is not an executor; allowed: 'local', or dask://HOST:PORT"
    ):
        batch.run(TABLE, str(tmp_path / "out"), executor=executor, progress=False)
    assert not (tmp_path / "out").exists()


def test_calc_sheets_are_refused_on_a_cluster(tmp_path, in_process_cluster):
    with pytest.raises(batch.ExecutorError, match="--pdf"):
        batch.run(TABLE, str(tmp_path), executor=_address(in_process_cluster), pdf=True, progress=False)


def test_a_worker_killed_mid_run_loses_no_row_and_is_reported(tmp_path, local_results):
    with (
        distributed.LocalCluster(
            n_workers=2, threads_per_worker=1, processes=True, dashboard_address=":0", death_timeout=60
        ) as local,
        distributed.Client(local, set_as_default=False, timeout=60) as watcher,
    ):
        killed = []

        def kill_a_busy_worker(_rows):
            if killed:
                return
            busy = [address for address, keys in watcher.processing().items() if keys]
            for nanny in local.workers.values():
                if nanny.worker_address in busy and nanny.process is not None:
                    os.kill(nanny.process.process.pid, signal.SIGKILL)
                    killed.append(nanny.worker_address)
                    return

        summary = batch.run(
            TABLE,
            str(tmp_path),
            executor=_address(local),
            chunk_rows=10,
            progress=False,
            on_progress=kill_a_busy_worker,
        )
    assert killed, "no worker was busy when the first chunk came back"
    assert (tmp_path / "results.csv").read_bytes() == local_results
    assert summary.members == 150
    assert summary.retried and all(
        "sent again" in line or "solved them again" in line for line in summary.retried
    )


def test_the_command_line_refuses_an_unknown_executor_with_exit_code_two(tmp_path):
    from tests.app.test_cli import run_cli

    done = run_cli("batch", TABLE, "--out", "out", "--executor", "dask://nowhere", cwd=tmp_path)
    assert done.returncode == 2
    assert "--executor dask://nowhere: 'dask://nowhere' is not an executor; allowed: 'local'" in done.stderr
    assert not (tmp_path / "out").exists()
