"""Speed of engine.solve and engine.sweep, and their agreement with the solve_bvp reference.

Run from the repository root with ``python3 -m tests.benchmarks.engine_speed``. Not collected by pytest
(no ``test_`` prefix); nothing runs at import time. The case is invented.

Targets (project goals, not sources): solve ≤ 1 ms and ≥ 200× faster than solve_bvp, agreement ≤ 1e-8,
sweep of 200 axial forces ≤ 20 ms.
"""

from __future__ import annotations

import statistics
import time

import numpy as np

import engine
from tests.support.bvp_reference import reference_solution

CASE = {
    "schema": 1,
    "title": "Invented benchmark: spring-supported strut, four loads",
    "length": 6.0,
    "EI": 4.2e6,
    "supports": {
        "left": {"translation": 5.0e6, "rotation": 2.0e6},
        "right": {"translation": 8.0e6, "rotation": 5.0e5},
    },
    "axial_force": 0.0,  # set to half the first critical load below
    "loads": [
        {"type": "uniform", "q": 2.5e3},
        {"type": "linear", "q_start": 0.0, "q_end": 4.0e3, "start": 1.0, "end": 4.5},
        {"type": "point", "P": 7.0e3, "x": 2.0},
        {"type": "couple", "C": -6.0e3, "x": 4.2},
    ],
    "imperfection": {"shape": "sine", "amplitude": 0.01},
}


#: Rounds of the alternating timing, and engine solves per round.
ROUNDS, BLOCK = 15, 40


def _median_time(fn, runs: int, warmup: int = 3) -> float:
    for _ in range(warmup):
        fn()
    times = []
    for _ in range(runs):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def main() -> None:
    """Time the engine and the reference on one case and print the figures beside their targets."""
    data = dict(CASE)
    pcr = np.asarray(engine.critical_loads(engine.Case.from_dict(data), count=5).critical_loads)
    data["axial_force"] = 0.5 * float(pcr[0])
    case = engine.Case.from_dict(data)

    # Engine and reference are timed in alternation, a block of engine solves beside each reference solve, so
    # that a change in the machine's speed during the run (a shared machine drifts by tens of per cent)
    # acts on
    # both: the ratio is the median of the paired ratios.
    engine_times, reference_times = [], []

    def solve():
        return engine.solve(case, stations=401)

    _median_time(solve, runs=20, warmup=20)
    result = engine.solve(case, stations=401)
    x = np.asarray(result.x)
    reference_solution(data, x)
    for _ in range(ROUNDS):
        engine_times.append(_median_time(solve, runs=BLOCK, warmup=2))
        reference_times.append(_median_time(lambda: reference_solution(data, x), runs=1, warmup=0))
    t_solve = statistics.median(engine_times)
    t_ref = statistics.median(reference_times)
    paired = sorted(r / e for r, e in zip(reference_times, engine_times, strict=True))
    ref = reference_solution(data, x)
    dis_w = np.max(np.abs(np.asarray(result.deflection) - ref["w"])) / np.max(np.abs(ref["w"]))
    dis_m = np.max(np.abs(np.asarray(result.moment) - ref["M"])) / np.max(np.abs(ref["M"]))

    forces = np.linspace(-3.0 * pcr[0], 1.2 * pcr[2], 200)
    t_sweep = _median_time(lambda: engine.sweep(case, forces), runs=30, warmup=3)

    print(
        "strutscope engine benchmark (invented case: springs both ends,"
        " uniform + partial linear + point + couple)"
    )
    print(
        f"  P = 0.5 Pcr1 = {data['axial_force']:.6g} N; Pcr1..3 = {pcr[0]:.6g}, {pcr[1]:.6g}, {pcr[2]:.6g} N"
    )
    print(
        f"  engine.solve(stations=401), median of {ROUNDS} medians of {BLOCK}: {t_solve * 1e3:9.4f} ms"
        "   (target <= 1 ms)"
    )
    print(f"  solve_bvp reference, median of {ROUNDS}            : {t_ref * 1e3:9.2f} ms")
    print(
        f"  speed ratio reference / engine, median of {ROUNDS} paired: {statistics.median(paired):6.0f} x"
        f"    (target >= 200 x; paired range {paired[0]:.0f}-{paired[-1]:.0f} x)"
    )
    print(f"  max rel. disagreement at {x.size} stations  w : {dis_w:9.2e}      (target <= 1e-8)")
    print(f"                                            M : {dis_m:9.2e}      (target <= 1e-8)")
    print(f"  engine.sweep(200 forces), median of 30      : {t_sweep * 1e3:9.3f} ms   (target <= 20 ms)")

    # Issue 16: three intermediate restraints (a brace, a spring, a hinge beside a brace) and one step in EI.
    restrained = dict(data)
    restrained["restraints"] = [
        {"x": 1.5, "translation": "fixed"},
        {"x": 3.0, "translation": 2.0e6, "rotation": 1.0e6},
        {"x": 4.5, "translation": "fixed", "hinge": True},
    ]
    restrained["steps"] = [{"x": 2.5, "EI": 2.1e6}]
    restrained["axial_force"] = 0.0
    pcr_r = engine.critical_loads(engine.Case.from_dict(restrained), 1).critical_loads[0]
    restrained["axial_force"] = 0.5 * float(pcr_r)
    restrained_case = engine.Case.from_dict(restrained)
    t_restrained = _median_time(lambda: engine.solve(restrained_case, stations=401), runs=200, warmup=20)
    print(
        f"  3 intermediate restraints and one step, engine.solve at 0.5 Pcr1, median of 200: "
        f"{t_restrained * 1e3:.4f} ms (target <= 1 ms; {t_restrained / t_solve:.2f} x the plain case)"
    )

    if hasattr(engine, "clear_caches"):
        other = dict(data)
        other["supports"] = {"left": {"translation": 3.3e6, "rotation": 1.1e6}, "right": "pinned"}
        other_case = engine.Case.from_dict(other)

        def first_solve():
            engine.clear_caches()
            engine.solve(other_case, stations=401)

        t_cold = _median_time(first_solve, runs=20, warmup=1)
        print(f"  first solve of a new support set (caches cleared), median of 20: {t_cold * 1e3:.3f} ms")
    else:
        print("  engine has no clear_caches(): uncached first solve not measured")


if __name__ == "__main__":
    main()
