"""Ctrl-C (SIGINT) and SIGTERM end `strutscope batch` and `strutscope solve` cleanly (issue 11).

Each test runs the real command line in its own session (so that its worker processes can be found by their
session id in /proc, and SIGINT can go to the whole process group as a terminal sends it), waits until the
command has installed its handlers (the SIGTERM bit of SigCgt in /proc/PID/status, proc(5)), sends the
signal and checks: exit code 128 + the signal number (130, 143: the shell's convention, common practice, no
source), no traceback, no `.part` file, and no process of the session left. Members are invented.
"""

from __future__ import annotations

import csv
import os
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from tests.app.test_cli import REPO_ROOT, write_case

pytestmark = pytest.mark.skipif(not Path("/proc/self/stat").exists(), reason="needs Linux /proc")


def session_processes(session: int) -> list[int]:
    """The ids of live (non-zombie) processes whose session id is `session` (proc(5): stat fields 3, 6)."""
    found = []
    for entry in os.listdir("/proc"):
        if not entry.isdigit():
            continue
        try:
            stat = Path(f"/proc/{entry}/stat").read_text()
        except OSError:
            continue
        fields = stat[stat.rindex(")") + 2 :].split()
        if fields[0] != "Z" and int(fields[3]) == session:
            found.append(int(entry))
    return found


def catches_sigterm(pid: int) -> bool:
    """Whether process `pid` has a handler for SIGTERM installed (bit 15 of SigCgt)."""
    try:
        for line in Path(f"/proc/{pid}/status").read_text().splitlines():
            if line.startswith("SigCgt:"):
                return bool(int(line.split()[1], 16) >> (signal.SIGTERM - 1) & 1)
    except OSError:
        pass
    return False


def start(args, cwd) -> subprocess.Popen:
    """Start the command line in a new session, as `strutscope ARGS` from `cwd`."""
    env = dict(os.environ, PYTHONIOENCODING="utf-8")
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPO_ROOT), env.get("PYTHONPATH")]))
    return subprocess.Popen(
        [sys.executable, "-m", "app.cli", *args],
        cwd=cwd,
        env=env,
        stdout=subprocess.PIPE,
        stderr=subprocess.PIPE,
        text=True,
        encoding="utf-8",
        start_new_session=True,
    )


def wait_for(condition, timeout=90.0) -> None:
    """Poll `condition` until it holds (fails the test after `timeout` s)."""
    deadline = time.monotonic() + timeout
    while not condition():
        assert time.monotonic() < deadline, "timed out waiting"
        time.sleep(0.05)


def interrupt(process: subprocess.Popen, signum: int) -> tuple[int, str, str]:
    """Send `signum` (SIGINT to the whole group, as a terminal does); return (code, stdout, stderr)."""
    if signum == signal.SIGINT:
        os.killpg(process.pid, signum)
    else:
        os.kill(process.pid, signum)
    try:
        out, err = process.communicate(timeout=60)
    except subprocess.TimeoutExpired:
        os.killpg(process.pid, signal.SIGKILL)
        raise
    return process.returncode, out, err


def members_table(path: Path, rows: int) -> Path:
    """A table of `rows` invented members with a section and material (so each gets a calc sheet)."""
    with open(path, "w", encoding="utf-8", newline="") as stream:
        writer = csv.writer(stream)
        writer.writerow(
            ["id", "length_m", "left", "right", "section", "material", "axial_kN", "udl_kN_per_m"]
        )
        for i in range(rows):
            writer.writerow([f"M{i}", 6.0, "pinned", "pinned", "HEB 200", "S355", 300, 2.5])
    return path


def sheet_written(out) -> bool:
    """A calc sheet is written: into the run's staging folder (app.outdir.staging), or beside results."""
    staging = out / ".strutscope-sheets"
    return any(
        folder.is_dir() and any(name.endswith(".pdf") for name in os.listdir(folder))
        for folder in (out, staging)
    )


def assert_clean(process, code, err, expected, folder) -> None:
    """Exit code, one message and no traceback, no .part file nor staged sheets in `folder`, no process of
    the session."""
    assert code == expected, err
    assert "Traceback" not in err and "KeyboardInterrupt" not in err, err
    assert "stopped by" in err
    assert [name for name in os.listdir(folder) if name.endswith(".part")] == []
    assert not (folder / ".strutscope-sheets").exists()  # an interrupted run's sheets never stay
    deadline = time.monotonic() + 10  # the fork server notices its parent's end within moments
    while session_processes(process.pid) and time.monotonic() < deadline:
        time.sleep(0.1)
    assert session_processes(process.pid) == [], "processes of the run outlived it"


@pytest.mark.parametrize(
    ("signum", "expected"), [(signal.SIGTERM, 143), (signal.SIGINT, 130)], ids=["SIGTERM", "SIGINT"]
)
def test_batch_with_workers_ends_cleanly_on_a_signal(tmp_path, signum, expected):
    """A batch shared over two workers, stopped mid-run: 143/130, no traceback, no .part, no worker left."""
    table = members_table(tmp_path / "members.csv", 400)
    out = tmp_path / "out"
    out.mkdir()
    (out / "results.csv").write_text("previous results\n", encoding="utf-8")
    process = start(["batch", str(table), "--out", str(out), "--pdf", "--workers", "2"], tmp_path)
    wait_for(lambda: sheet_written(out))  # workers busy with sheets
    assert len(session_processes(process.pid)) >= 3  # the command, the fork server and its workers
    code, _, err = interrupt(process, signum)
    assert_clean(process, code, err, expected, out)
    assert (out / "results.csv").read_text(encoding="utf-8") == "previous results\n"


@pytest.mark.parametrize(
    ("signum", "expected"), [(signal.SIGTERM, 143), (signal.SIGINT, 130)], ids=["SIGTERM", "SIGINT"]
)
def test_batch_in_one_process_ends_cleanly_on_a_signal(tmp_path, signum, expected):
    """A short batch solved in one process, stopped mid-run: 143/130, no traceback, no .part file."""
    table = members_table(tmp_path / "members.csv", 40)
    out = tmp_path / "out"
    process = start(["batch", str(table), "--out", str(out), "--pdf"], tmp_path)
    wait_for(lambda: sheet_written(out))
    code, _, err = interrupt(process, signum)
    assert_clean(process, code, err, expected, out)
    assert not (out / "results.csv").exists()


@pytest.mark.parametrize(
    ("signum", "expected"), [(signal.SIGTERM, 143), (signal.SIGINT, 130)], ids=["SIGTERM", "SIGINT"]
)
def test_solve_ends_cleanly_on_a_signal(tmp_path, signum, expected):
    """`solve` with a calc sheet, stopped while it works: 143/130, no traceback, no .part, no sheet."""
    case = write_case(tmp_path / "case.json")
    process = start(["solve", str(case), "--pdf", "sheet.pdf", "--png", "figure.png", "--capacity"], tmp_path)
    wait_for(lambda: catches_sigterm(process.pid))  # the command is running (its handlers are in place)
    code, _, err = interrupt(process, signum)
    if code == 0:
        pytest.skip("the solve finished before the signal arrived")
    assert_clean(process, code, err, expected, tmp_path)
    assert not (tmp_path / "sheet.pdf").exists()


def test_signals_stay_ignored_once_a_command_is_stopped():
    """After the first signal the command is ending: SIGINT and SIGTERM stay ignored, so a second Ctrl-C
    after the message cannot end it by SIGINT with a traceback instead of 130 (CI saw exit -2 once, after the
    clean message). A command that ends without a signal puts the handlers back. In this process (the main
    thread), with the handlers restored afterwards."""
    from app.interrupt import EXIT_SIGINT, clean_exit

    before = {number: signal.getsignal(number) for number in (signal.SIGINT, signal.SIGTERM)}
    try:

        @clean_exit("test")
        def stopped() -> int:
            os.kill(os.getpid(), signal.SIGINT)
            time.sleep(5)  # the handler raises KeyboardInterrupt before this ends
            return 0

        @clean_exit("test")
        def finished() -> int:
            return 0

        assert finished() == 0
        assert {n: signal.getsignal(n) for n in before} == before
        assert stopped() == EXIT_SIGINT
        assert signal.getsignal(signal.SIGINT) is signal.SIG_IGN
        assert signal.getsignal(signal.SIGTERM) is signal.SIG_IGN
    finally:
        for number, handler in before.items():
            signal.signal(number, handler)


PROGRAM = """
import os, signal, sys
from app.interrupt import clean_exit, end_process

@clean_exit("test")
def command() -> int:
    # Ctrl-C lands while Python runs code given as text, as when the standard dataclasses module builds a
    # class's methods during an import: CPython marks the interruption as unhandled although it is caught
    exec("os.kill(os.getpid(), signal.SIGINT)\\nfor _ in range(10**7): pass")
    return 0

raise SystemExit(end_process(command()))
"""


def test_end_process_ends_a_stopped_program_with_130(tmp_path):
    """A program stopped by Ctrl-C inside code run from text (exec of a string) ends with 130 and the one
    message. Without `end_process`, `python -m app.cli solve ...` stopped while it imports was killed by
    SIGINT at exit (-2) after the clean message in about 6 runs in 20: CPython's "unhandled
    KeyboardInterrupt" flag, set by an exec of a string however the exception is then caught (CPython 3.11
    Python/pythonrun.c, run_eval_code_obj), is read when a module run by -m ends (Modules/main.c,
    Py_RunMain). Resetting that flag by hand removed the failures too, which confirmed the cause; the real
    command's test above (`test_solve_ends_cleanly_on_a_signal[SIGINT]`) is the one that showed it."""
    script = tmp_path / "program.py"
    script.write_text(PROGRAM, encoding="utf-8")
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPO_ROOT), env.get("PYTHONPATH")]))
    done = subprocess.run([sys.executable, str(script)], env=env, capture_output=True, text=True, timeout=60)
    assert done.returncode == 130, done.stderr
    assert done.stderr.count("stopped by Ctrl-C (SIGINT)") == 1, done.stderr
    assert "Traceback" not in done.stderr
