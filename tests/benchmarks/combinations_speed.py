"""Speed of a case with 12 load combinations (solved and enveloped) against one plain solve.

Run from the repository root with ``python3 -m tests.benchmarks.combinations_speed``. Not collected by pytest;
nothing runs at import time. The case is the invented demo ``assets/demo_wind_post_actions.json`` with a third
action (an imposed load, category B) and the quasi-permanent service combinations: EN 1990 eq. (6.10) gives 10
ultimate combinations (G at 1.35 and 1.00; Q and W absent, alone, or each leading) and (6.16b) 2 service ones
(W's ψ2 = 0 makes the other two the same), 12 in all. The plain case is the plain demo
``assets/demo_wind_post.json`` (one solve, the same member and bow).

Warm: both cases solved again as the page does on each step (every force-independent part cached); the two
are timed in alternating blocks and the figure is the median over rounds of the ratio of the block medians.
Cold: the first solve after ``engine.clear_caches()`` (critical loads, models, combinations built). Target
(the issue's): 12 combinations solved and enveloped in ≤ 15 ms.

Run as the page and the command line run: one thread of linear algebra (``app.workers.one_thread_here``,
before numpy loads; a value in the environment is kept, so ``OPENBLAS_NUM_THREADS=2`` measures threads).
"""

from __future__ import annotations

import json
import os
import statistics
import time
from importlib import resources

from app.workers import one_thread_here

one_thread_here()  # before numpy loads: as `strutscope serve`, `solve` and `batch` run
import engine  # noqa: E402

ROUNDS, BLOCK = 15, 10
PAIRS = 150


def _text(name: str) -> str:
    return resources.files("assets").joinpath(name).read_text(encoding="utf-8")


def twelve() -> engine.Case:
    """The demo with actions plus an imposed action and quasi-permanent service combinations (invented)."""
    data = json.loads(_text("demo_wind_post_actions.json"))
    data["actions"].append(
        {
            "name": "Q",
            "category": "imposed-B",
            "axial_force": 80e3,
            "loads": [{"type": "point", "P": 1e3, "x": 4.0}],
        }
    )
    data["combinations"] = {"rule": "en1990-6.10", "service": ["quasi-permanent"]}
    return engine.Case.from_dict(data)


def _block(case) -> float:
    times = []
    for _ in range(BLOCK):
        t0 = time.perf_counter()
        engine.solve(case)
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def main() -> None:
    """Print the warm and cold times of the 12-combination case and of one plain solve, and their ratios."""
    combined, plain = twelve(), engine.Case.from_json(_text("demo_wind_post.json"))
    result = engine.solve(combined)
    count = len(result.actions.combinations)
    states = [c.combination.state for c in result.actions.combinations]
    print(f"combinations: {count} ({states.count('ultimate')} ultimate, {states.count('service')} service)")
    print(f"OPENBLAS_NUM_THREADS={os.environ.get('OPENBLAS_NUM_THREADS')}, load average {os.getloadavg()}")
    cold_combined, cold_plain = [], []
    for _ in range(5):
        engine.clear_caches()
        t0 = time.perf_counter()
        engine.solve(combined)
        cold_combined.append(time.perf_counter() - t0)
        engine.clear_caches()
        t0 = time.perf_counter()
        engine.solve(plain)
        cold_plain.append(time.perf_counter() - t0)
    engine.solve(combined), engine.solve(plain)
    times = {"combined": [], "plain": []}
    ratios = []
    for k in range(ROUNDS):
        order = ("combined", "plain") if k % 2 else ("plain", "combined")
        block = {}
        for name in order:
            block[name] = _block(combined if name == "combined" else plain)
            times[name].append(block[name])
        ratios.append(block["combined"] / block["plain"])
    ms = 1e3
    print(f"warm, median of {ROUNDS} block medians of {BLOCK}:")
    print(
        f"  12 combinations solved and enveloped: {statistics.median(times['combined']) * ms:.2f} ms "
        f"(best block {min(times['combined']) * ms:.2f} ms; target <= 15 ms)"
    )
    print(
        f"  one plain solve:                      {statistics.median(times['plain']) * ms:.2f} ms "
        f"(best block {min(times['plain']) * ms:.2f} ms)"
    )
    print(f"  ratio, median of paired block ratios: {statistics.median(ratios):.2f}x")
    single = {"combined": [], "plain": []}
    for k in range(PAIRS):  # single solves in alternation: less exposed to the load drifting between blocks
        for name in ("combined", "plain") if k % 2 else ("plain", "combined"):
            t0 = time.perf_counter()
            engine.solve(combined if name == "combined" else plain)
            single[name].append(time.perf_counter() - t0)
    paired = [a / b for a, b in zip(single["combined"], single["plain"], strict=True)]
    print(f"warm, {PAIRS} single solves in alternation:")
    print(
        f"  12 combinations: median {statistics.median(single['combined']) * ms:.2f} ms, "
        f"fastest {min(single['combined']) * ms:.2f} ms; one plain solve: median "
        f"{statistics.median(single['plain']) * ms:.2f} ms, fastest {min(single['plain']) * ms:.2f} ms"
    )
    print(
        f"  ratio: median of paired ratios {statistics.median(paired):.2f}x, of the fastest "
        f"{min(single['combined']) / min(single['plain']):.2f}x (per combination "
        f"{statistics.median(paired) / count:.2f}x)"
    )
    print("cold (after engine.clear_caches()), median of 5:")
    print(
        f"  12 combinations: {statistics.median(cold_combined) * ms:.1f} ms; "
        f"one plain solve: {statistics.median(cold_plain) * ms:.1f} ms"
    )


if __name__ == "__main__":
    main()
