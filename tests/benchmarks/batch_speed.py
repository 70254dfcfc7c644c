"""Speed and memory of ``strutscope batch`` on a large generated table of members.

Run from the repository root with ``python3 -m tests.benchmarks.batch_speed`` (``--members N`` to change the
table's size, ``--no-capacity`` to leave out the capacity search). Not collected by pytest (no ``test_``
prefix); nothing runs at import time. Every member is invented, drawn from a seeded random generator.

It writes N members to a temporary CSV file and runs the batch on it, each run in a fresh interpreter so
that every run starts cold and its peak memory is its own:

1. with one worker (the rows solved in the run's own process, one thread of linear algebra as the console
   script sets) on N members, by today's code and by the code before the last round of issue 18's speed work
   (:data:`BEFORE`, unpacked with ``git archive`` into a temporary folder), one after the other in the same
   session: members per second of each, their ratio, and whether the two
   results files agree to 1e-9 relative (``tests/app/test_batch_exact.py``'s comparison);
2. with every core on the same N members, so the two speeds are comparable;
3. the streaming check: one worker, no capacity search, on a table of ``--stream-rows`` rows (100 000 by
   default) and on one a tenth as long; each cycles through 20 drawn members with distinct ids (members that
   differ in their names only share one prepared member, so the long table takes minutes, not hours), and
   the peak resident set size (``resource.getrusage(RUSAGE_SELF).ru_maxrss``) of the two must be about the
   same. ``--stream-rows 1000000`` is the measurement recorded in DEVELOPERS.md.

Targets (issue 18, project goals, not sources): at least 500 members per second on one core, a ratio of at
least 1.7 on two cores, and a peak memory that does not grow with the number of rows.
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
TARGET_PER_CORE = 500.0
#: The code before the last round of issue 18's speed work (the LTB check, load combinations and the new
#: columns included, so that both write the same results): today's batch is compared with it in the same
#: session. The first round was measured against 7e4e463 (DEVELOPERS.md, Benchmarks).
BEFORE = "9bcb784b24f82692bd1ac222738d8beab60a43b5"
_ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))


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


def write_repeated(path: str, count: int, kinds: int = 20, seed: int = 20240601) -> None:
    """Write `count` rows cycling through `kinds` drawn members, each row with its own id."""
    with tempfile.TemporaryDirectory() as folder:
        drawn = os.path.join(folder, "kinds.csv")
        write_members(drawn, kinds * 3, seed)
        with open(drawn, encoding="utf-8", newline="") as stream:
            rows = [row for row in list(csv.reader(stream))[1:] if not row[1].startswith("-")][:kinds]
    with open(path, "w", encoding="utf-8", newline="") as stream:
        writer = csv.writer(stream)
        writer.writerow(_HEADER)
        for n in range(count):
            row = list(rows[n % len(rows)])
            row[0] = f"R{n:07d}"
            writer.writerow(row)


def _run_child(table: str, out: str, workers: int, capacity: bool, root: str = _ROOT) -> dict:
    """Run one batch in a fresh interpreter on the code in `root`; return its members, seconds and peak
    memory."""
    here = os.path.abspath(__file__)
    command = [sys.executable, here, "--child", table, out, str(workers)]
    if not capacity:
        command.append("--no-capacity")
    env = dict(os.environ, PYTHONPATH=root)
    done = subprocess.run(command, capture_output=True, text=True, check=True, env=env, cwd=root)
    return json.loads(done.stdout.strip().splitlines()[-1])


def _before(folder: str) -> str | None:
    """The code before issue 18's speed work, unpacked into `folder`; None without git or that commit."""
    target = os.path.join(folder, "before")
    os.makedirs(target)
    try:
        archive = subprocess.run(
            ["git", "-C", _ROOT, "archive", BEFORE, "engine", "app", "assets"],
            capture_output=True,
            check=True,
        )
        subprocess.run(["tar", "-x", "-C", target], input=archive.stdout, check=True)
    except (OSError, subprocess.CalledProcessError):
        return None
    return target


def _agree(path_a: str, path_b: str) -> bool:
    from tests.app.test_batch_exact import assert_same_results

    try:
        assert_same_results(path_a, path_b)
    except AssertionError:
        return False
    return True


def _child(table: str, out: str, workers: int, capacity: bool) -> None:
    # One thread of linear algebra, as `strutscope batch` sets before numpy loads (app.cli_batch): with
    # OpenBLAS's threads the process's CPU time counts their spinning too (measured: about 1.8x the CPU time).
    for name in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
        os.environ.setdefault(name, "1")
    from app import batch

    start, cpu = time.perf_counter(), time.process_time()
    summary = batch.run(table, out, workers=workers, capacity=capacity, progress=False)
    seconds, cpu = time.perf_counter() - start, time.process_time() - cpu
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
                "cpu_seconds": cpu,
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
    parser.add_argument(
        "--stream-rows", type=int, default=100_000, help="rows of the streaming check (100 000; 0: skip it)"
    )
    parser.add_argument("--no-before", action="store_true", help="skip the run of the code before issue 18")
    parser.add_argument(
        "--rounds", type=int, default=5, help="slices of the table, each run by both codes in turn (5)"
    )
    parser.add_argument("--child", nargs=3, metavar=("TABLE", "OUT", "WORKERS"), help=argparse.SUPPRESS)
    args = parser.parse_args(argv)
    if args.child:
        table, out, workers = args.child
        _child(table, out, int(workers), args.capacity)
        return

    from app.batch import default_workers

    cores = default_workers()
    with tempfile.TemporaryDirectory(prefix="strutscope-batch-speed-") as folder:
        large_table = os.path.join(folder, "members_large.csv")
        write_members(large_table, args.members)
        print(
            f"strutscope batch benchmark: {args.members} invented members"
            f"{'' if args.capacity else ', no capacity search'}; {cores} core{'s' if cores != 1 else ''}"
        )
        before_root = None if args.no_before else _before(folder)
        if before_root is None and not args.no_before:
            print(f"  (the code before, commit {BEFORE[:7]}, is not in this checkout's history: no ratio)")
        one = _paired(folder, large_table, args, before_root)
        every = _run_child(large_table, os.path.join(folder, "every"), cores, args.capacity)
        print(
            f"  {cores} workers:   {every['members'] / every['seconds']:8.1f} members/s  "
            f"({every['seconds']:.1f} s; {every['workers']} processes)"
        )
        same = _by_id(one["slices"]) == _by_id([os.path.join(folder, "every", "results.csv")])
        ratio = one["seconds"] / every["seconds"]
        verdict = "meets" if ratio >= TARGET_RATIO or cores < 2 else "misses"
        print(
            f"  speed-up:    {ratio:.2f}x on {cores} cores (target >= {TARGET_RATIO} on two cores: "
            f"{verdict}); results identical: {'yes' if same else 'NO'}"
        )
        if args.stream_rows > 0:
            _stream_check(folder, args.stream_rows)


def _paired(folder: str, table: str, args, before_root: str | None) -> dict:
    """Today's code on the table in `args.rounds` slices, each run beside the code before (alternating which
    goes first), since a shared machine's speed drifts within minutes; print both speeds and their ratio."""
    with open(table, encoding="utf-8", newline="") as stream:
        rows = list(csv.reader(stream))
    header, body = rows[0], rows[1:]
    rounds = max(1, min(args.rounds, len(body)))
    now = {"members": 0, "solved": 0, "errors": 0, "seconds": 0.0, "cpu_seconds": 0.0}
    was_seconds, was_cpu, ratios, equal = 0.0, 0.0, [], True
    for r in range(rounds):
        part = os.path.join(folder, f"slice_{r}.csv")
        with open(part, "w", encoding="utf-8", newline="") as stream:
            writer = csv.writer(stream)
            writer.writerow(header)
            writer.writerows(body[r * len(body) // rounds : (r + 1) * len(body) // rounds])
        order = ("now", "before") if r % 2 == 0 else ("before", "now")
        runs = {}
        for which in order:
            if which == "before" and before_root is None:
                continue
            root = _ROOT if which == "now" else before_root
            runs[which] = _run_child(part, os.path.join(folder, f"{which}_{r}"), 1, args.capacity, root)
        for key in ("members", "solved", "errors", "seconds", "cpu_seconds"):
            now[key] += runs["now"][key]
        if "before" in runs:
            was_seconds += runs["before"]["seconds"]
            was_cpu += runs["before"]["cpu_seconds"]
            ratios.append(runs["before"]["cpu_seconds"] / runs["now"]["cpu_seconds"])
            equal &= _agree(
                os.path.join(folder, f"now_{r}", "results.csv"),
                os.path.join(folder, f"before_{r}", "results.csv"),
            )
    # Per core: members per second of the process's CPU time (the machine is shared: its wall-clock speed
    # drifts with the other work, the CPU time much less); the wall-clock figure beside it.
    speed = now["members"] / now["cpu_seconds"]
    verdict = "meets" if speed >= TARGET_PER_CORE else "misses"
    print(
        f"  1 worker, today's code:  {speed:8.1f} members per CPU second ({now['cpu_seconds']:.1f} s; "
        f"wall clock {now['members'] / now['seconds']:.1f} members/s; {now['solved']} solved, "
        f"{now['errors']} invalid rows; target >= {TARGET_PER_CORE:.0f} per core: {verdict})"
    )
    if ratios:
        was = now["members"] / was_cpu
        ratios.sort()
        print(
            f"  1 worker, before ({BEFORE[:7]}): {was:8.1f} members per CPU second ({was_cpu:.1f} s; wall "
            f"clock {now['members'] / was_seconds:.1f} members/s); ratio {was_cpu / now['cpu_seconds']:.2f}x "
            f"(paired slices {ratios[0]:.2f}-{ratios[-1]:.2f}x, median {ratios[len(ratios) // 2]:.2f}x; "
            f"wall clock {was_seconds / now['seconds']:.2f}x); "
            f"results equal to 1e-9: {'yes' if equal else 'NO'}"
        )
    now["slices"] = [os.path.join(folder, f"now_{r}", "results.csv") for r in range(rounds)]
    return now


def _by_id(paths: list[str]) -> dict:
    """The results rows of `paths` keyed by id, without the row number (it counts lines of each file)."""
    found = {}
    for path in paths:
        with open(path, encoding="utf-8", newline="") as stream:
            reader = csv.reader(stream)
            header = next(reader)
            at = header.index("row")
            for row in reader:
                found[row[0]] = row[:at] + row[at + 1 :]
    return found


def _stream_check(folder: str, rows: int) -> None:
    """Peak memory of one process streaming `rows` rows, against a tenth as many."""
    peaks = []
    for count in (max(1, rows // 10), rows):
        table = os.path.join(folder, f"stream_{count}.csv")
        write_repeated(table, count)
        run = _run_child(table, os.path.join(folder, f"stream_{count}"), 1, False)
        os.unlink(table)
        peaks.append(run)
        print(
            f"  streaming, 1 worker, no capacity: {run['members']} rows in {run['seconds']:.0f} s "
            f"({run['members'] / run['seconds']:.0f} rows/s), peak RSS {run['peak_mib']:.1f} MiB"
        )
    growth = peaks[1]["peak_mib"] / peaks[0]["peak_mib"]
    verdict = "flat" if growth < 1.1 else "GROWS"
    print(f"  peak RSS {growth:.3f}x for 10x the rows: {verdict} (target: flat, < 1.1x)")


if __name__ == "__main__":
    main()
