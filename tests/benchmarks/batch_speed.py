"""Speed and memory of ``strutscope batch`` on a large generated table of members.

Run from the repository root with ``python3 -m tests.benchmarks.batch_speed`` (``--members N`` to change the
table's size, ``--no-capacity`` to leave out the capacity search). Not collected by pytest (no ``test_``
prefix); nothing runs at import time. Every member is invented, drawn from a seeded random generator.

It writes N members to a temporary CSV file and runs the batch on it, each run in a fresh interpreter so
that every run starts cold and its peak memory is its own:

1. with one worker (the rows solved in the run's own process) on N members;
2. with every core on the same N members, in the same session, so the two speeds are comparable;
3. with one worker on N/5 members, to compare the peak resident memory with run 1.

It prints members per second for 1 and 2 and their ratio, and the peak resident set size
(``resource.getrusage(RUSAGE_SELF).ru_maxrss``) of runs 3 and 1. With one worker everything happens in the
measured process, so its peak is the whole run's; with processes only the parent's part is measured.

Targets (project goals, not sources): a ratio of at least 1.7 on two cores, and a peak memory that does not
grow with the number of members (the rows and results are streamed, not held).
"""

from __future__ import annotations

import argparse
import csv
import json
import os
import random
import resource
import subprocess
import sys
import tempfile
import time

# Invented members: catalogue sections and materials, supports that carry load, bows of every form.
_SECTIONS = (
    "HEB 200",
    "HEB 300",
    "HEA 200",
    "HEA 300",
    "IPE 200",
    "IPE 300",
    "IPE 400",
    "SHS 100x100x5",
    "CHS 114.3x5",
    "TIMBER 45x195",
)
_SUPPORTS = (
    ("pinned", "pinned"),
    ("pinned", "pinned"),
    ("fixed", "pinned"),
    ("fixed", "fixed"),
    ("fixed", "free"),
    ("pinned", "fixed"),
)
_BOWS = ("en1993-table-5.1", "en1993-table-5.1", "L/300", "aisc-l/1000", "en1993-eq-5.9", "12mm", "none")
_HEADER = (
    "id",
    "length_m",
    "left",
    "right",
    "section",
    "material",
    "axis",
    "axial_kN",
    "udl_kN_per_m",
    "point_loads",
    "bow",
    "comment",
)

TARGET_RATIO = 1.7


def write_members(path: str, count: int, seed: int = 20240601) -> None:
    """Write `count` invented members to the CSV file `path` (about 1 % of them deliberately invalid)."""
    rng = random.Random(seed)
    with open(path, "w", encoding="utf-8", newline="") as stream:
        writer = csv.writer(stream)
        writer.writerow(_HEADER)
        for n in range(count):
            section = rng.choice(_SECTIONS)
            timber = section.startswith("TIMBER")
            length = round(rng.uniform(2.5, 9.0), 2)
            left, right = rng.choice(_SUPPORTS)
            loads = ";".join(
                f"{rng.uniform(0.5, 10):.1f}@{rng.uniform(0.0, length):.2f}" for _ in range(rng.randint(0, 2))
            )
            # Timber has no buckling curve of EN 1993-1-1 Table 6.2: give it one, or a bow of another form.
            bow = rng.choice(("en1993-table-5.1:c", "L/300", "aisc-l/1000", "12mm") if timber else _BOWS)
            comment = "invented benchmark member"
            if rng.random() < 0.01:
                length, comment = -length, "deliberately bad row: negative length"
            writer.writerow(
                (
                    f"M{n:06d}",
                    length,
                    left,
                    right,
                    section,
                    "C24" if timber else "S355",
                    rng.choice(("major", "major", "minor")),
                    round(rng.uniform(1, 30) if timber else rng.uniform(10, 400), 1),
                    round(rng.uniform(0, 5), 2),
                    loads,
                    bow,
                    comment,
                )
            )


def _run_child(table: str, out: str, workers: int, capacity: bool) -> dict:
    """Run one batch in a fresh interpreter; return its members, seconds and peak memory."""
    command = [sys.executable, "-m", "tests.benchmarks.batch_speed", "--child", table, out, str(workers)]
    if not capacity:
        command.append("--no-capacity")
    done = subprocess.run(command, capture_output=True, text=True, check=True)
    return json.loads(done.stdout.strip().splitlines()[-1])


def _child(table: str, out: str, workers: int, capacity: bool) -> None:
    from app import batch

    start = time.perf_counter()
    summary = batch.run(table, out, workers=workers, capacity=capacity, progress=False)
    seconds = time.perf_counter() - start
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    # ru_maxrss is in kibibytes on Linux and in bytes on macOS.
    peak_mib = peak / (1024 * 1024) if sys.platform == "darwin" else peak / 1024
    print(
        json.dumps(
            {
                "members": summary.members,
                "solved": summary.solved,
                "errors": summary.error_count,
                "workers": summary.workers,
                "seconds": seconds,
                "peak_mib": peak_mib,
            }
        )
    )


def main(argv: list[str] | None = None) -> None:
    """Generate the table, run the three batches and print the figures beside their targets."""
    parser = argparse.ArgumentParser(
        prog="python3 -m tests.benchmarks.batch_speed",
        description=__doc__,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("--members", type=int, default=10_000, help="members in the large table (10 000)")
    parser.add_argument(
        "--no-capacity",
        dest="capacity",
        action="store_false",
        help="leave out the capacity search (the batch's --no-capacity)",
    )
    parser.add_argument("--child", nargs=3, metavar=("TABLE", "OUT", "WORKERS"), help=argparse.SUPPRESS)
    args = parser.parse_args(argv)
    if args.child:
        table, out, workers = args.child
        _child(table, out, int(workers), args.capacity)
        return

    from app.batch import default_workers

    cores = default_workers()
    small = max(1, args.members // 5)
    with tempfile.TemporaryDirectory(prefix="strutscope-batch-speed-") as folder:
        large_table = os.path.join(folder, "members_large.csv")
        small_table = os.path.join(folder, "members_small.csv")
        write_members(large_table, args.members)
        write_members(small_table, small)
        print(
            f"strutscope batch benchmark: {args.members} invented members"
            f"{'' if args.capacity else ', no capacity search'}; {cores} core{'s' if cores != 1 else ''}"
        )
        one = _run_child(large_table, os.path.join(folder, "one"), 1, args.capacity)
        print(
            f"  1 worker:    {one['members'] / one['seconds']:8.1f} members/s  ({one['seconds']:.1f} s; "
            f"{one['solved']} solved, {one['errors']} invalid rows)"
        )
        every = _run_child(large_table, os.path.join(folder, "every"), cores, args.capacity)
        print(
            f"  {cores} workers:   {every['members'] / every['seconds']:8.1f} members/s  "
            f"({every['seconds']:.1f} s; {every['workers']} processes)"
        )
        with (
            open(os.path.join(folder, "one", "results.csv"), "rb") as a,
            open(os.path.join(folder, "every", "results.csv"), "rb") as b,
        ):
            same = a.read() == b.read()
        ratio = one["seconds"] / every["seconds"]
        verdict = "meets" if ratio >= TARGET_RATIO or cores < 2 else "misses"
        print(
            f"  speed-up:    {ratio:.2f}x on {cores} cores (target >= {TARGET_RATIO} on two cores: "
            f"{verdict}); results identical: {'yes' if same else 'NO'}"
        )
        little = _run_child(small_table, os.path.join(folder, "small"), 1, args.capacity)
        growth = one["peak_mib"] / little["peak_mib"]
        print(
            f"  peak memory, 1 worker: {little['peak_mib']:.1f} MiB for {little['members']} members, "
            f"{one['peak_mib']:.1f} MiB for {one['members']} members ({growth:.2f}x for "
            f"{one['members'] / little['members']:.0f}x the members); "
            f"parent process with {cores} workers: {every['peak_mib']:.1f} MiB"
        )


if __name__ == "__main__":
    main()
