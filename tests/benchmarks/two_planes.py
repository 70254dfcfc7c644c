"""Speed of a two-plane solve against the one-plane solve, as a slider drag sees them.

Run from the repository root with ``python3 -m tests.benchmarks.two_planes``. Not collected by pytest (no
``test_`` prefix); nothing runs at import time. The case is the invented demo ``assets/demo_two_planes.json``;
the one-plane case is the same file without its ``second_plane`` (and so with the out-of-plane check instead).

Two readings of "the one-plane solve" are timed in the same run:

- **same code**: the one-plane case solved by the engine in this checkout;
- **pre-issue**: the same one-plane case solved by the engine as it was when issue 14 (both bending planes,
  the routes) was filed, commit :data:`PRE_ISSUE_COMMIT`, the last commit before the first issue-14 commit
  (``git log``: the next one, ``c12b95e``, adds the equivalent-member rules "groundwork for the two-plane
  member check"). Its ``engine/`` is exported with ``git archive`` into a temporary folder and run in a
  subprocess whose ``PYTHONPATH`` holds only that folder; the subprocess times its blocks when asked, so the
  two engines are timed in alternation and never at the same time. Skipped, with a note, where git or the
  commit is missing (``--no-pre-issue`` skips it too).

Each round solves every case at the same axial forces, stepping them like a slider (the prepared members are
warm: every force-independent part is cached per case), alternating the order; each figure is the median over
rounds of the ratio of the two block medians. Target (a project goal, not a source): ≤ 2×. Ratios only: no
timed asserts.

Every solve is timed twice: by the wall clock (what a user waits) and by the CPU time of the thread
(``time.thread_time``). On a shared machine the wall clock also counts the time the solve waits while other
processes run; a solve longer than the scheduler's slice (a few ms at a load average above the core count)
is interrupted more often than a short one, so under load the wall-clock ratio of the longer two-plane solve
grows (measured: 7× at a load average of 5 against 3× on a quieter machine). The CPU-time ratio does not
count that wait and is the one that compares across loads.
"""

from __future__ import annotations

import dataclasses
import json
import os
import statistics
import subprocess
import sys
import tempfile
import time
from importlib import resources
from pathlib import Path

import numpy as np

import engine

ROUNDS, BLOCK = 15, 30
#: The engine as it was when issue 14 was filed (the last commit before its first commit, c12b95e).
PRE_ISSUE_COMMIT = "dd8f287"


def _block(case, forces) -> tuple[float, float]:
    """The median wall-clock and thread CPU time [s] of one solve of ``case`` at each of ``forces``."""
    wall, cpu = [], []
    for force in forces:
        trial = dataclasses.replace(case, axial_force=float(force))
        c0, t0 = time.thread_time(), time.perf_counter()
        engine.solve(trial)
        t1, c1 = time.perf_counter(), time.thread_time()
        wall.append(t1 - t0)
        cpu.append(c1 - c0)
    return statistics.median(wall), statistics.median(cpu)


def _worker() -> None:
    """The subprocess side: read the case and the forces, then time one block per ``block`` line."""
    setup = json.loads(sys.stdin.readline())
    case = engine.Case.from_dict(setup["case"])
    forces = setup["forces"]
    print(json.dumps({"engine": str(Path(engine.__file__).parent)}), flush=True)
    for line in sys.stdin:
        if line.strip() != "block":
            break
        print(json.dumps(_block(case, forces)), flush=True)


class PreIssue:
    """The one-plane solve of the engine at :data:`PRE_ISSUE_COMMIT`, timed in a subprocess on request."""

    def __init__(self, folder: str, case: dict, forces) -> None:
        root = Path(__file__).resolve().parents[2]
        archive = subprocess.run(
            ["git", "-C", str(root), "archive", PRE_ISSUE_COMMIT, "engine"], capture_output=True, check=True
        )
        subprocess.run(["tar", "-x", "-C", folder], input=archive.stdout, check=True)
        env = dict(os.environ, PYTHONPATH=folder)
        self.process = subprocess.Popen(
            [sys.executable, str(Path(__file__).resolve()), "--worker"],
            stdin=subprocess.PIPE,
            stdout=subprocess.PIPE,
            text=True,
            cwd=folder,
            env=env,
        )
        try:
            self.process.stdin.write(json.dumps({"case": case, "forces": [float(f) for f in forces]}) + "\n")
            self.process.stdin.flush()
            where = json.loads(self.process.stdout.readline())["engine"]
        except (OSError, ValueError, KeyError):
            self.process.kill()
            self.process.wait(timeout=60)
            raise
        if Path(where).resolve() != (Path(folder) / "engine").resolve():
            self.close()
            raise RuntimeError(f"the subprocess imported the engine from {where}, not the exported commit")

    def block(self) -> tuple[float, float]:
        """One block's medians [s] of the pre-issue engine (the subprocess runs while this one waits)."""
        self.process.stdin.write("block\n")
        self.process.stdin.flush()
        wall, cpu = json.loads(self.process.stdout.readline())
        return float(wall), float(cpu)

    def close(self) -> None:
        self.process.stdin.write("quit\n")
        self.process.stdin.close()
        self.process.wait(timeout=60)


def main(pre_issue: bool = True) -> None:
    """Print the solve times and the ratios of the two-plane solve to each reading of the one-plane solve."""
    text = resources.files("assets").joinpath("demo_two_planes.json").read_text(encoding="utf-8")
    two = engine.Case.from_json(text)
    one = dataclasses.replace(two, second_plane=None)
    alone = two.second_plane_case()  # the second plane as a one-plane case
    result = engine.solve(two)
    top = 0.9 * min(float(result.critical_loads[0]), float(result.second_plane.critical_loads[0]))
    forces = np.linspace(0.05 * top, top, BLOCK)
    one_dict = json.loads(text)
    del one_dict["second_plane"]
    with tempfile.TemporaryDirectory(prefix="strutscope-pre-issue-") as folder:
        old = None
        if pre_issue:
            try:
                old = PreIssue(folder, one_dict, forces)
            except (OSError, subprocess.CalledProcessError, RuntimeError, ValueError, KeyError) as error:
                print(f"pre-issue engine ({PRE_ISSUE_COMMIT}) not timed: {error}")
        try:
            _rounds(one, alone, two, forces, old)
        finally:
            if old is not None:
                old.close()


def _rounds(one, alone, two, forces, old) -> None:
    cases = (one, alone, two)
    names = ["one-plane solve (same code)", "second plane alone", "two-plane solve"]
    timers = [lambda case=case: _block(case, forces) for case in cases]
    if old is not None:
        names.append(f"one-plane solve (pre-issue engine, {PRE_ISSUE_COMMIT})")
        timers.append(old.block)
    for timer in timers:  # warm the caches: a drag solves the same case at many forces
        timer()
    start = os.getloadavg()[0] if hasattr(os, "getloadavg") else float("nan")
    times: list[list[tuple[float, float]]] = [[] for _ in timers]
    for k in range(ROUNDS):
        order = list(range(len(timers)))
        if k % 2 == 0:
            order.reverse()
        for i in order:
            times[i].append(timers[i]())
    end = os.getloadavg()[0] if hasattr(os, "getloadavg") else float("nan")
    how = f"median of {ROUNDS} block medians of {BLOCK}"
    for name, values in zip(names, times, strict=True):
        wall = statistics.median(v[0] for v in values) * 1e3
        cpu = statistics.median(v[1] for v in values) * 1e3
        print(f"{name}, {how}: {wall:.3f} ms wall clock, {cpu:.3f} ms CPU")

    def said(kind: int, num: int, dens: tuple[int, ...]) -> str:
        paired = [t[num][kind] / sum(t[d][kind] for d in dens) for t in zip(*times, strict=True)]
        return f"{statistics.median(paired):.2f}x (rounds {min(paired):.2f}-{max(paired):.2f}x)"

    print(f"ratios, median of {ROUNDS} paired ratios (target <= 2x): wall clock | CPU time")
    print(f"  two-plane / one-plane of the same code: {said(0, 2, (0,))} | {said(1, 2, (0,))}")
    if old is not None:
        pre = f"  two-plane / one-plane of the pre-issue engine ({PRE_ISSUE_COMMIT}):"
        print(f"{pre} {said(0, 2, (3,))} | {said(1, 2, (3,))}")
    pairing = "  two-plane / (one-plane + second plane alone), the cost of pairing the planes:"
    print(f"{pairing} {said(0, 2, (0, 1))} | {said(1, 2, (0, 1))}")
    print(f"load average (1 min) at the start and the end: {start:.2f}, {end:.2f}")


if __name__ == "__main__":
    if "--worker" in sys.argv[1:]:
        _worker()
    else:
        main(pre_issue="--no-pre-issue" not in sys.argv[1:])
