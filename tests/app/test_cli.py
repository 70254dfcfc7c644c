"""The ``strutscope`` console script, run for real in a subprocess."""

import json
import math
import os
import re
import shutil
import subprocess
import sys
from importlib import resources
from pathlib import Path

import pytest

import engine
from app.cli import main

REPO_ROOT = Path(__file__).resolve().parents[2]

# The exact wording every summary must carry (project rule for the command line).
CAUTION = (
    "Elastic analysis of one member only. Not a full code check: lateral-torsional buckling, local buckling, "
    "connections and load combinations are not checked. Check against your local codes and have a licensed "
    "engineer review."
)

PCR1_LINE = re.compile(r"^\s*Pcr1 = ([0-9.eE+-]+) kN$", re.MULTILINE)


def run_cli(*args, cwd, command=None):
    """Run the command line in a fresh interpreter from `cwd` and return the finished process."""
    env = dict(os.environ, PYTHONIOENCODING="utf-8")
    # The repository root goes on the path so that this works with or without an install; the working
    # directory is elsewhere, so that nothing may be found relative to it.
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(REPO_ROOT), env.get("PYTHONPATH")]))
    command = command or [sys.executable, "-m", "app.cli"]
    return subprocess.run(
        [*command, *args], cwd=cwd, env=env, capture_output=True, text=True, encoding="utf-8", timeout=120
    )


def demo_case():
    """The demo case as the engine reads it."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    return engine.Case.from_json(text)


def write_case(path, **changes):
    """Write a small valid pinned–pinned case with `changes` applied and return its path."""
    mapping = {
        "schema": 1,
        "title": "Invented test case",
        "length": 4.0,
        "EI": 2.0e6,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 100e3,
        "loads": [{"type": "uniform", "q": 1.0e3}],
        "imperfection": {"shape": "none", "amplitude": 0.0},
    }
    mapping.update(changes)
    path.write_text(json.dumps(mapping), encoding="utf-8")
    return path


def test_solve_demo_exits_zero_and_prints_critical_load_and_caution(tmp_path):
    """`solve --demo` succeeds from an unrelated directory and prints Pcr1, the status and the caution."""
    done = run_cli("solve", "--demo", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    assert PCR1_LINE.search(done.stdout), done.stdout
    assert "Status: stable" in done.stdout
    assert CAUTION in done.stdout
    assert done.stderr == ""


def test_printed_first_critical_load_matches_engine_and_euler(tmp_path):
    """The Pcr1 printed in kN equals engine.solve's first critical load for the demo case, and π²EI/L²."""
    done = run_cli("solve", "--demo", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    printed_kN = float(PCR1_LINE.search(done.stdout).group(1))

    case = demo_case()
    expected_kN = engine.solve(case, stations=401).critical_loads[0] / 1e3
    # Printed to 5 significant figures, so within half a unit in the fifth figure.
    assert printed_kN == pytest.approx(expected_kN, rel=1e-4)
    # The demo is pinned–pinned, so Pcr1 is the Euler load π²EI/L² (Timoshenko & Gere, Theory of Elastic
    # Stability, 2nd ed., 1961, ch. 2; chapter number from memory; design/references.md §2). Same tolerance.
    EI = engine.solve(case).EI  # E·I of the demo's section and material
    assert printed_kN == pytest.approx(math.pi**2 * EI / case.length**2 / 1e3, rel=1e-4)


def test_solve_case_file_and_stations_option(tmp_path):
    """A valid case file given by path, with --stations, is solved and summarised with exit code 0."""
    path = write_case(tmp_path / "post.json")
    done = run_cli("solve", str(path), "--stations", "51", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    assert "Invented test case" in done.stdout
    assert CAUTION in done.stdout


def test_case_at_critical_load_prints_unbounded_values(tmp_path):
    """At P = Pcr1 the summary shows "critical" and "unbounded" (no NaN), with exit code 0 and the caution."""
    length, EI = 6.0, 4.2e6
    # Euler load of a pinned–pinned member, π²EI/L² (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed.,
    # 1961, ch. 2; chapter number from memory; design/references.md §2).
    euler = math.pi**2 * EI / length**2
    path = write_case(tmp_path / "critical.json", length=length, EI=EI, axial_force=euler)
    done = run_cli("solve", str(path), cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    assert "Status: critical" in done.stdout
    assert re.search(r"^\s*largest \|M\|\s+unbounded", done.stdout, re.MULTILINE), done.stdout
    assert not re.search(r"\bnan\b", done.stdout, re.IGNORECASE), done.stdout
    assert CAUTION in done.stdout


def test_invalid_case_exits_two_and_names_the_field(tmp_path):
    """A case with a negative length exits with 2 and prints `error: <file>: ...` naming `length`."""
    path = write_case(tmp_path / "negative.json", length=-1.0, loads=[])
    done = run_cli("solve", str(path), cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {path}: ")
    assert "length" in done.stderr
    assert done.stdout == ""


def test_missing_file_exits_two(tmp_path):
    """A case file that does not exist exits with 2 and names the file on stderr."""
    path = tmp_path / "no_such_case.json"
    done = run_cli("solve", str(path), cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {path}: ")
    assert done.stdout == ""


def test_file_that_is_not_json_exits_two(tmp_path):
    """A case file that is not JSON exits with 2 and an error line, not a traceback."""
    path = tmp_path / "garbage.json"
    path.write_text("this is not json", encoding="utf-8")
    done = run_cli("solve", str(path), cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {path}: ")
    assert "Traceback" not in done.stderr


def test_bare_command_prints_help_and_exits_two(tmp_path):
    """`strutscope` with no command prints the usage and exits with 2 (the page comes later)."""
    done = run_cli(cwd=tmp_path)
    assert done.returncode == 2
    assert "usage: strutscope" in done.stdout
    assert "solve" in done.stdout


def test_main_returns_exit_codes_in_process(capsys):
    """main() returns its exit code instead of raising: 0 for --help and for solve --demo."""
    assert main(["--help"]) == 0
    assert main(["solve", "--demo"]) == 0
    assert CAUTION in capsys.readouterr().out


def test_installed_entry_point_runs_demo(tmp_path):
    """The installed `strutscope` console script exists and solves the demo."""
    executable = shutil.which("strutscope")
    if executable is None:
        if os.environ.get("CI"):  # CI installs the package, so there the script must exist
            pytest.fail("strutscope is not on PATH after the CI install")
        pytest.skip("strutscope is not installed (pip install -e '.[test]')")
    done = run_cli("solve", "--demo", cwd=tmp_path, command=[executable])
    assert done.returncode == 0, done.stderr
    assert CAUTION in done.stdout
