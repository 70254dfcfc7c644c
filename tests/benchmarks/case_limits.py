"""What the largest allowed case costs, beside the invented demo case (engine.limits; issue 11).

    python3 -m tests.benchmarks.case_limits

Times, per case, the first solve (critical loads, model and first order included, caches cleared), a
repeated solve, `engine.capacity` and the page's amplification sweep (the about 340 forces of its chart),
each the median of a few rounds in alternation with the demo, and prints them with the ratio to the demo.
The cases: the invented demo, MAX_LOADS point loads, and partial uniform loads cutting the member into
MAX_SEGMENTS segments, all on a pin-ended HEB 200 in S355 (invented). For the record, issue 11 measured
14 s for 1 000 point loads before the limits. Run it as the command line runs (one thread of linear
algebra: OPENBLAS_NUM_THREADS=1) or as it is to see what threads cost on a shared machine.
"""

from __future__ import annotations

import statistics
import time
from importlib import resources

import engine
from engine import limits

ROUNDS = 5


def _cases() -> dict[str, engine.Case]:
    demo = engine.Case.from_json(resources.files("assets").joinpath("demo_wind_post.json").read_bytes())
    base = {
        "schema": 1,
        "length": 6.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 350e3,
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
    }
    count = limits.MAX_LOADS
    points = [{"type": "point", "P": 1e3, "x": 6.0 * (i + 1) / (count + 1)} for i in range(count)]
    partial_count = (limits.MAX_SEGMENTS - 1) // 2
    partial = [
        {"type": "uniform", "q": 1e2, "start": 0.05 + 0.05 * i, "end": 3.0 + 0.05 * i}
        for i in range(partial_count)
    ]
    return {
        "demo (invented)": demo,
        f"{count} point loads": engine.Case.from_dict(base | {"title": "invented", "loads": points}),
        f"{partial_count} partial loads ({2 * partial_count + 1} segments)": engine.Case.from_dict(
            base | {"title": "invented", "loads": partial}
        ),
    }


def _time(function) -> float:
    start = time.perf_counter()
    function()
    return time.perf_counter() - start


def main() -> None:
    from app.state import chart_forces

    cases = _cases()
    figures: dict[str, dict[str, list[float]]] = {name: {} for name in cases}
    for _ in range(ROUNDS):
        for name, case in cases.items():
            engine.clear_caches()
            first = _time(lambda case=case: engine.solve(case))
            again = _time(lambda case=case: engine.solve(case))
            capacity = _time(lambda case=case: engine.capacity(case))
            pcr = engine.solve(case).critical_loads
            sweep = _time(lambda case=case, pcr=pcr: engine.sweep(case, chart_forces(pcr)))
            for key, value in (
                ("first solve", first),
                ("solve", again),
                ("capacity", capacity),
                ("sweep", sweep),
            ):
                figures[name].setdefault(key, []).append(value)
    demo = next(iter(figures.values()))
    print(f"median of {ROUNDS} rounds, seconds (ratio to the demo)")
    for name, values in figures.items():
        parts = []
        for key, times in values.items():
            median = statistics.median(times)
            ratio = median / statistics.median(demo[key])
            parts.append(f"{key} {median:.3f} ({ratio:.0f}x)")
        print(f"{name}: " + ", ".join(parts))


if __name__ == "__main__":
    main()
