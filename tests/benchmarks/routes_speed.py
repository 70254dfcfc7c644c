"""What the member-check routes (issue 14) cost a solve of the invented demo case.

Run from the repository root with ``python3 -m tests.benchmarks.routes_speed``. Not collected by pytest;
nothing runs at import time. The demo case is invented.

The same process times ``engine.solve`` on the demo with the routes and with the routes' step replaced by the
identity (what a solve cost before the routes), in alternating blocks, because the shared machine's speed
drifts by tens of per cent within minutes; it prints the median of the paired ratios. Each case is solved with
every route enabled (so that the AISC route's bow-free moment is in both) and with the default routes.
"""

from __future__ import annotations

import dataclasses
import importlib.resources
import math
import statistics
import time

import engine
from engine import analysis, member_routes
from engine.prepared import prepare

ROUNDS, BLOCK = 30, 20


def _block(case) -> float:
    t0 = time.perf_counter()
    for _ in range(BLOCK):
        engine.solve(case)
    return (time.perf_counter() - t0) / BLOCK


def _without_routes(result, **_):
    return result


def main() -> None:
    """Print the solve time with and without the routes, and the median paired ratio."""
    text = importlib.resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    demo = engine.Case.from_json(text)
    every = dataclasses.replace(
        demo, check=dataclasses.replace(demo.check, routes=("second-order", "en-member", "aisc"))
    )
    attach = member_routes.attach
    for name, case in (("default routes", demo), ("every route", every)):
        engine.solve(case)
        ratios, with_t, without_t = [], [], []
        for _ in range(ROUNDS):
            analysis.member_routes.attach = _without_routes
            before = _block(case)
            analysis.member_routes.attach = attach
            after = _block(case)
            ratios.append(after / before)
            with_t.append(after)
            without_t.append(before)
        print(
            f"{name}: solve {statistics.median(without_t) * 1e3:.3f} ms without the routes, "
            f"{statistics.median(with_t) * 1e3:.3f} ms with them (medians; best blocks "
            f"{min(without_t) * 1e3:.3f} and {min(with_t) * 1e3:.3f} ms, "
            f"ratio {min(with_t) / min(without_t):.3f}); "
            f"ratio (median of {ROUNDS} paired) {statistics.median(ratios):.3f} "
            f"(range {min(ratios):.3f}–{max(ratios):.3f})"
        )
        # The routes' step alone on a solved result (what the solve adds), best of the blocks.
        result = engine.solve(case)
        prep = prepare(case)
        out = prep.out_of_plane()
        best = math.inf
        for _ in range(ROUNDS):
            t0 = time.perf_counter()
            for _ in range(BLOCK):
                attach(result, bow_free=None, out_of_plane=out, cache=prep.design)
            best = min(best, (time.perf_counter() - t0) / BLOCK)
        print(f"{name}: the routes' step alone, best block {best * 1e6:.0f} µs per solve")


if __name__ == "__main__":
    main()
