"""Speed of the exports of one solved case: the PNG figure, the PDF calc sheet, the CSV and the summary.

Run from the repository root with ``python3 -m tests.benchmarks.export_speed``. Not collected by pytest (no
``test_`` prefix); nothing runs at import time. The case is the invented demo (assets/demo_wind_post.json).

Each export is made ``--repeat`` times after one warm-up, in SI and US units alternately, and the median
time of each is printed in milliseconds. To compare two versions, run this script in each (set PYTHONPATH to
each checkout in turn) on an idle machine, alternating, and compare the medians: the machine's speed drifts
by tens of per cent within minutes.
"""

from __future__ import annotations

import argparse
import statistics
import time


def _timed(function, repeat: int) -> float:
    function("si")  # warm-up: fonts, caches
    times = []
    for i in range(repeat):
        start = time.perf_counter()
        function("us" if i % 2 else "si")
        times.append(time.perf_counter() - start)
    return statistics.median(times) * 1e3


def main() -> None:
    """Print the median time of each export in milliseconds."""
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=9, help="exports of each kind (default 9)")
    args = parser.parse_args()

    from importlib import resources

    import engine
    from app import exports
    from app.cli import format_summary

    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    case = engine.Case.from_json(text)
    result = engine.solve(case)
    jobs = {
        "png (150 dpi)": lambda units: exports.png_bytes(result, units=units, date="2026-01-15"),
        "pdf": lambda units: exports.pdf_bytes(result, units=units, date="2026-01-15"),
        "csv": lambda units: exports.csv_text(result, units=units),
        "summary": lambda units: format_summary("demo.json", case, result, units=units),
    }
    for name, job in jobs.items():
        print(f"{name:<14} {_timed(job, args.repeat):8.1f} ms (median of {args.repeat})")


if __name__ == "__main__":
    main()
