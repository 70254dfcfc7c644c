"""The ``strutscope`` console script, run for real in a subprocess."""

import csv
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

# The exact wording every summary must carry (project rule for the command line): the general caution, worded
# once in app.report.scope.
CAUTION = (
    "Elastic, one member. Not checked: torsion, non-symmetric sections, patch loading, connections; "
    "lateral-torsional buckling and class 4 as the cautions say. Load cases are combined by EN 1990 "
    "(6.10)/(6.10a,b) or ASCE 7 rules; the factors and the choice of actions are yours. Have them checked "
    "against your local codes by a licensed engineer."
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
    """The plain demo case (no load cases, 350 kN) as the engine reads it."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    return engine.Case.from_json(text)


def page_demo_case():
    """The demo case `solve --demo` solves (the one the page opens, with load cases G and W), as the engine
    reads it."""
    text = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text(encoding="utf-8")
    return engine.Case.from_json(text)


def write_case(path, **changes):
    """Write a small valid pinned–pinned case with `changes` (None drops a key) and return its path."""
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
    mapping = {key: value for key, value in mapping.items() if value is not None}  # None: leave the key out
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


def test_solve_demo_solves_the_case_the_page_opens(tmp_path):
    """`solve --demo` prints the numbers of the page's start case (with load cases: U2 governs, 0.448), and
    its --help names that case; the plain demo is solved by its path and prints its own figures."""
    from app.serve import _demo_case

    done = run_cli("solve", "--demo", "--json", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    data = strict_json(done.stdout)
    page = engine.solve(_demo_case(), stations=401)  # reference: the engine's result for the page's case
    assert page.actions is not None and data["combinations"] is not None
    assert data["title"] == page.case.title and data["utilization"] == page.utilization
    # The page names U2 = 1.35 G + 1.5 W with 0.448 (DEVELOPERS.md, "The start demo carries load cases").
    assert f"{data['utilization']:.3f}" == "0.448" and page.actions.headline == "U2"
    shown = run_cli("solve", "--help", cwd=tmp_path)
    assert "demo_wind_post_actions.json" in " ".join(shown.stdout.split())
    assert "with a permanent (G) and a wind (W) load case" in " ".join(shown.stdout.split())
    plain = run_cli("solve", str(REPO_ROOT / "assets" / "demo_wind_post.json"), "--json", cwd=tmp_path)
    assert plain.returncode == 0, plain.stderr
    plain_data = strict_json(plain.stdout)
    assert plain_data["combinations"] is None and plain_data["axial_force"] == 350e3  # the file's 350 kN
    assert plain_data["utilization"] != data["utilization"]


def test_printed_first_critical_load_matches_engine_and_euler(tmp_path):
    """The Pcr1 printed in kN equals engine.solve's first critical load for the demo case, and π²EI/L²."""
    done = run_cli("solve", "--demo", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    printed_kN = float(PCR1_LINE.search(done.stdout).group(1))

    case = page_demo_case()
    expected_kN = engine.solve(case, stations=401).critical_loads[0] / 1e3
    # Printed to 5 significant figures, so within half a unit in the fifth figure.
    assert printed_kN == pytest.approx(expected_kN, rel=1e-4)
    # The demo is pinned–pinned, so Pcr1 is the Euler load π²EI/L² (Timoshenko & Gere, Theory of Elastic
    # Stability, 2nd ed., 1961, ch. 2; chapter number from memory; tests/REFERENCES.md §2). Same tolerance.
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
    """At P = Pcr1 the summary shows "critical" and "unbounded" (no NaN), with the caution, and exits with 1
    without --strict (issue 12: at or above the first critical load the member fails)."""
    length, EI = 6.0, 4.2e6
    # Euler load of a pinned–pinned member, π²EI/L² (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed.,
    # 1961, ch. 2; chapter number from memory; tests/REFERENCES.md §2).
    euler = math.pi**2 * EI / length**2
    path = write_case(tmp_path / "critical.json", length=length, EI=EI, axial_force=euler)
    done = run_cli("solve", str(path), cwd=tmp_path)
    assert done.returncode == 1, done.stderr
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


def test_bare_command_runs_serve_on_the_demo(monkeypatch):
    """A bare `strutscope` runs the `serve` command with its defaults (the server itself is replaced here)."""
    import app.cli as cli

    calls = []
    monkeypatch.setattr(cli, "_serve", lambda args: calls.append(args) or 0)
    assert main([]) == 0
    assert len(calls) == 1
    assert calls[0].command == "serve" and calls[0].case is None  # no case file: the invented demo


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


# --------------------------------------------------------------------------------------------------------
# solve --json, --units, the exports, --capacity and --strict.

# The keys `solve --json` documents (README, "Command line").
SUMMARY_KEYS = {
    "summary_version",
    "second_plane_service",
    "fails",
    "source",
    "title",
    "units",
    "status",
    "stable",
    "message",
    "length",
    "EI",
    "axial_force",
    "critical_loads",
    "alpha_cr",
    "effective_length_factor",
    "governing",
    "first_order",
    "reactions",
    "restraints",
    "steps",
    "foundation",
    "amplification",
    "equilibrium",
    "section",
    "material",
    "bow",
    "utilization",
    "utilization_basis",
    "check",
    "capacity",
    "cautions",
    "bow_direction",
    "service",
    "second_plane",
    "routes",
    "headline_route",
    "combinations",
    "ltb",
}

# 1 kip = 1000 lbf = 4448.2216152605 N, exact by definition (NIST SP 811 (2008) Appendix B; from memory).
KIP = 4448.2216152605
FOOT = 0.3048  # [m], exact by definition (same source)


def strict_json(text):
    """Parse JSON, refusing the non-standard NaN and Infinity that Python's json module would accept."""

    def refuse(name):
        raise ValueError(f"non-standard JSON constant {name}")

    return json.loads(text, parse_constant=refuse)


def test_json_summary_matches_engine_solve(tmp_path):
    """`solve --demo --json` prints standard JSON with the documented keys, equal to engine.solve's values."""
    done = run_cli("solve", "--demo", "--json", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    data = strict_json(done.stdout)
    assert set(data) == SUMMARY_KEYS
    # Reference: the engine's own result for the same case (the command line only reports it).
    result = engine.solve(page_demo_case(), stations=401)
    assert data["status"] == result.status == "stable"
    assert data["stable"] is True
    assert data["utilization"] == result.utilization and data["fails"] is (result.utilization > 1.0)
    assert data["axial_force"] == result.axial_force
    assert data["critical_loads"] == [float(p) for p in result.critical_loads]
    assert data["alpha_cr"] == result.alpha_cr
    assert data["effective_length_factor"] == result.buckling.effective_length_factor
    for name in ("deflection", "total_offset", "moment", "shear"):
        peak = getattr(result.governing, name)
        assert data["governing"][name] == {"value": peak.value, "x": peak.x}
        first = getattr(result.first_order.governing, name)
        assert data["first_order"][name] == {"value": first.value, "x": first.x}
    assert data["reactions"] == {
        name: getattr(result.reactions, name) for name in ("left_T", "left_M", "right_T", "right_M")
    }
    assert data["amplification"]["moment"] == result.amplification.moment
    assert data["amplification"]["deflection"] == result.amplification.deflection
    assert [a["name"] for a in data["amplification"]["approximations"]] == [
        a.name for a in result.amplification.approximations
    ]
    assert [a["error"] for a in data["amplification"]["approximations"]] == [
        a.error for a in result.amplification.approximations
    ]
    assert data["equilibrium"] == {
        "transverse": result.equilibrium.transverse,
        "moment": result.equilibrium.moment,
    }
    assert data["utilization"] == result.utilization
    assert data["check"]["kind"] == result.check.kind
    assert data["check"]["x"] == result.check.x
    assert data["check"]["strength_utilization"] == result.check.strength_utilization
    assert data["check"]["deflection_utilization"] == result.check.deflection_utilization
    assert data["service"]["deflection_utilization"] == result.service.utilization
    assert data["amplification"]["moment_first_order"] == result.amplification.moment_first_order
    assert data["amplification"]["moment_bow_free"] == result.amplification.moment_bow_free
    assert set(data["amplification"]["definitions"]) == {
        "moment",
        "moment_first_order",
        "moment_bow_free",
        "deflection",
    }
    assert [a["compared_with"] for a in data["amplification"]["approximations"]] == [
        a.compared_with for a in result.amplification.approximations
    ]
    assert data["bow_direction"]["governing"] == result.bow.direction_governing
    assert data["capacity"] is None
    assert [(c["level"], c["code"]) for c in data["cautions"]] == [(c.level, c.code) for c in result.cautions]
    assert "scope" in [c["code"] for c in data["cautions"]]  # the general caution, always


def test_json_at_critical_load_writes_null_and_status_critical(tmp_path):
    """At P = Pcr1 the JSON is still standard: unbounded values are null and the status says "critical"."""
    length, EI = 6.0, 4.2e6
    # Euler load of a pinned–pinned member, π²EI/L² (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed.,
    # 1961, ch. 2; chapter number from memory).
    euler = math.pi**2 * EI / length**2
    path = write_case(tmp_path / "critical.json", length=length, EI=EI, axial_force=euler)
    done = run_cli("solve", str(path), "--json", cwd=tmp_path)
    assert done.returncode == 1, done.stderr  # at the critical load the member fails (issue 12)
    data = strict_json(done.stdout)
    assert data["status"] == "critical"
    assert data["stable"] is False
    assert data["governing"]["moment"]["value"] is None
    assert data["reactions"]["left_T"] is None
    assert data["equilibrium"] is None
    assert "at-critical-load" in [c["code"] for c in data["cautions"]]


def test_us_units_print_the_engine_values_in_kip(tmp_path):
    """`--units us` prints Pcr1 in kip and the length in ft, the engine's values converted (NIST SP 811)."""
    done = run_cli("solve", "--demo", "--units", "us", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    printed = float(re.search(r"^\s*Pcr1 = ([0-9.eE+-]+) kip$", done.stdout, re.MULTILINE).group(1))
    expected = engine.solve(page_demo_case()).critical_loads[0] / KIP
    assert printed == pytest.approx(expected, rel=1e-4)  # printed to 5 significant figures
    assert f"length:       {6.0 / FOOT:.3f} ft" in done.stdout
    assert CAUTION in done.stdout


def test_exports_are_written_and_parse(tmp_path):
    """--csv, --png and --pdf write files that parse as CSV and open as a PNG image and as a PDF."""
    from PIL import Image
    from pypdf import PdfReader

    done = run_cli(
        "solve",
        "--demo",
        "--csv",
        "out.csv",
        "--png",
        "out.png",
        "--pdf",
        "out.pdf",
        "--prepared-by",
        "Invented Engineer",
        cwd=tmp_path,
    )
    assert done.returncode == 0, done.stderr
    assert CAUTION in done.stdout
    lines = [
        line
        for line in (tmp_path / "out.csv").read_text(encoding="utf-8-sig").splitlines()
        if not line.startswith("#")
    ]
    rows = list(csv.reader(lines))
    assert rows[0][0].startswith("x [m]")
    body = [[float(cell) for cell in row] for row in rows[1:]]
    # The stations run from the left end to the right end of the 6 m member (the demo case file).
    assert body[0][0] == 0.0 and body[-1][0] == pytest.approx(6.0, abs=1e-12)
    with Image.open(tmp_path / "out.png") as image:
        image.verify()
        assert image.format == "PNG"
    reader = PdfReader(tmp_path / "out.pdf")
    assert len(reader.pages) >= 1
    text = "".join(page.extract_text() for page in reader.pages)
    assert "Invented Engineer" in text
    assert not list(tmp_path.glob(".*.part"))  # no temporary file left behind


def test_export_to_a_missing_folder_exits_two_naming_the_file(tmp_path):
    """An export path in a folder that does not exist exits with 2, naming the file, and prints no summary."""
    target = tmp_path / "no_such_folder" / "post.pdf"
    done = run_cli("solve", "--demo", "--pdf", str(target), cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {target}: cannot write the file")
    assert done.stdout == ""


def test_capacity_option_reports_engine_capacity(tmp_path):
    """`--capacity --json` reports engine.capacity's axial force and governing check for the demo case's
    governing combination."""
    done = run_cli("solve", "--demo", "--capacity", "--json", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    data = strict_json(done.stdout)
    # Reference: the engine's capacity finder, on the governing combination's case (the demo has load cases).
    expected = engine.capacity(engine.solve(page_demo_case()).case)
    assert data["capacity"]["axial_force"] == expected.axial_force
    assert data["capacity"]["check"] == expected.check
    assert data["capacity"]["critical_load"] == expected.critical_load


def test_capacity_option_reaches_the_calc_sheet_and_csv(tmp_path):
    """`--capacity` with `--pdf` and `--csv` states the same capacity in both files as in the JSON (an audit
    found it only in the printed summary and the JSON): the CSV's metadata row holds the force in kN, the
    calc sheet's member check the force and its combination. Reference: engine.capacity_of of the demo."""
    import pypdf

    done = run_cli(
        "solve", "--demo", "--capacity", "--json", "--pdf", "c.pdf", "--csv", "c.csv", cwd=tmp_path
    )
    assert done.returncode == 0, done.stderr
    expected = engine.capacity_of(engine.solve(page_demo_case()))
    assert strict_json(done.stdout)["capacity"]["axial_force"] == expected.axial_force
    row = next(
        line
        for line in (tmp_path / "c.csv").read_text(encoding="utf-8-sig").splitlines()
        if "capacity" in line
    )
    assert row.startswith("# axial capacity [kN],")
    assert float(row.split(",")[1]) == pytest.approx(expected.axial_force / 1e3, rel=1e-6)
    text = " ".join(p.extract_text() for p in pypdf.PdfReader(tmp_path / "c.pdf").pages)
    text = " ".join(text.split())
    shown = f"{expected.axial_force / 1e3:.2f} kN"
    assert f"Axial capacity N = {shown}" in text
    assert f"Combination: {expected.combination}, the lowest of the ultimate combinations" in text


def test_capacity_without_section_exits_two_naming_section(tmp_path):
    """`--capacity` on a case given by EI alone exits with 2 and names `section`, which the capacity needs."""
    path = write_case(tmp_path / "ei_only.json")
    done = run_cli("solve", str(path), "--capacity", cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {path}: section")


def test_strict_exit_codes(tmp_path):
    """--strict exits 0 for the demo (utilisation 0.448), 1 above utilisation 1 and 1 above Pcr1 (danger)."""
    assert run_cli("solve", "--demo", "--strict", cwd=tmp_path).returncode == 0
    # An invented HEB 200 in S355 under a wind load far beyond its strength: qL²/8 = 200·36/8 = 900 kN·m
    # against W_el·fy ≈ 570e-6 · 355e6 ≈ 202 kN·m (section values from memory), so utilisation > 1.
    overloaded = write_case(
        tmp_path / "overloaded.json",
        EI=None,
        section={"name": "HEB 200"},
        material={"name": "S355"},
        length=6.0,
        loads=[{"type": "uniform", "q": 200e3}],
    )
    assert engine.solve(engine.load_case(overloaded)).utilization > 1.0
    assert run_cli("solve", str(overloaded), cwd=tmp_path).returncode == 0
    assert run_cli("solve", str(overloaded), "--strict", cwd=tmp_path).returncode == 1
    # Twice the Euler load π²EI/L² of a pinned–pinned member (Timoshenko & Gere 1961, ch. 2; from memory):
    # unstable, which the engine flags with a danger caution.
    beyond = write_case(tmp_path / "beyond.json", axial_force=2 * math.pi**2 * 2.0e6 / 4.0**2)
    done = run_cli("solve", str(beyond), "--strict", cwd=tmp_path)
    assert done.returncode == 1
    assert "Status: unstable" in done.stdout


def test_field_error_names_field_and_file(tmp_path):
    """A point load beyond the member's end exits with 2: `error: <file>: loads[0].x: ...` on stderr."""
    path = write_case(tmp_path / "outside.json", loads=[{"type": "point", "P": 1.0e3, "x": 7.5}])
    done = run_cli("solve", str(path), "--json", cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {path}: loads[0].x: 7.5 m lies outside the member")
    assert done.stdout == ""


@pytest.mark.parametrize("command", ["solve", "batch", "schema"])
def test_every_command_has_help_with_an_example(tmp_path, command):
    """`strutscope <command> --help` exits 0 and shows an example of that command and the caution."""
    done = run_cli(command, "--help", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    assert "examples:" in done.stdout
    assert f"strutscope {command}" in done.stdout.split("examples:", 1)[1]
    assert "licensed" in done.stdout


def test_top_level_help_lists_every_command():
    """`strutscope --help` (in process) lists solve, batch and schema and returns 0."""
    import contextlib
    import io

    out = io.StringIO()
    with contextlib.redirect_stdout(out):
        assert main(["--help"]) == 0
    for command in ("solve", "batch", "schema"):
        assert command in out.getvalue()
