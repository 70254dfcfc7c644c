"""Speed of a two-plane solve against the one-plane solve of the same case, as a slider drag sees them.

Run from the repository root with ``python3 -m tests.benchmarks.two_planes``. Not collected by pytest (no
``test_`` prefix); nothing runs at import time. The case is the invented demo ``assets/demo_two_planes.json``;
the one-plane case is the same file without its ``second_plane`` (and so with the out-of-plane check instead).

Each round solves both cases at the same axial force, stepping it like a slider (the prepared members are
warm: every force-independent part is cached per case), alternating which goes first; the figure is the
median over rounds of the ratio of the two block medians. Target (a project goal, not a source): ≤ 2×.
"""

from __future__ import annotations

import dataclasses
import statistics
import time
from importlib import resources

import numpy as np

import engine

ROUNDS, BLOCK = 15, 30


def _block(case, forces) -> float:
    """The median time [s] of one solve of ``case`` at each of ``forces``."""
    times = []
    for force in forces:
        trial = dataclasses.replace(case, axial_force=float(force))
        t0 = time.perf_counter()
        engine.solve(trial)
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def main() -> None:
    """Print the two-plane and one-plane solve times and their ratios."""
    text = resources.files("assets").joinpath("demo_two_planes.json").read_text(encoding="utf-8")
    two = engine.Case.from_json(text)
    one = dataclasses.replace(two, second_plane=None)
    alone = two.second_plane_case()  # the second plane as a one-plane case
    result = engine.solve(two)
    top = 0.9 * min(float(result.critical_loads[0]), float(result.second_plane.critical_loads[0]))
    forces = np.linspace(0.05 * top, top, BLOCK)
    cases = (one, alone, two)
    for case in cases:  # warm the caches: a drag solves the same case at many forces
        _block(case, forces)
    times: list[list[float]] = [[], [], []]
    ratios, overheads = [], []
    for k in range(ROUNDS):
        order = (0, 1, 2) if k % 2 else (2, 1, 0)
        block = [0.0, 0.0, 0.0]
        for i in order:
            block[i] = _block(cases[i], forces)
            times[i].append(block[i])
        ratios.append(block[2] / block[0])
        overheads.append(block[2] / (block[0] + block[1]))
    how = f"median of {ROUNDS} block medians of {BLOCK}"
    for name, values in zip(("one-plane solve", "second plane alone", "two-plane solve"), times, strict=True):
        print(f"{name}, {how}: {statistics.median(values) * 1e3:.3f} ms")
    print(
        f"ratio two-plane / one-plane, median of {ROUNDS} paired ratios: {statistics.median(ratios):.2f}x "
        f"(rounds {min(ratios):.2f}-{max(ratios):.2f}x; target <= 2x)"
    )
    print(
        f"ratio two-plane / (one-plane + second plane alone): {statistics.median(overheads):.2f}x "
        "(the cost of pairing the planes)"
    )


if __name__ == "__main__":
    main()
