"""The invented US demo case, assets/demo_us_column.json, through the ``strutscope`` console script."""

import io
import subprocess
import sys
from importlib import resources

import pypdf
import pytest

import engine
from app import exports
from app.report import format_summary
from tests.app.test_unit_systems import _offending


def test_us_demo_solves_on_the_command_line_in_us_units(tmp_path):
    """`strutscope solve demo_us_column.json --units us` exits 0 and prints the W10x49 in US units only."""
    case = tmp_path / "demo_us_column.json"
    case.write_text(
        resources.files("assets").joinpath("demo_us_column.json").read_text(encoding="utf-8"),
        encoding="utf-8",
    )
    done = subprocess.run(
        [sys.executable, "-m", "app.cli", "solve", str(case), "--units", "us"],
        capture_output=True,
        text=True,
        encoding="utf-8",
        cwd=tmp_path,
        check=False,
    )
    assert done.returncode == 0, done.stderr
    assert "W10x49" in done.stdout and "ASTM A992" in done.stdout
    assert "length:       14.000 ft" in done.stdout
    assert "N = 200.00 kip compression" in done.stdout
    assert _offending(done.stdout, "us") == []


@pytest.mark.parametrize("system", ["si", "us"])
def test_us_demo_calc_sheet_and_summary_speak_one_system(system):
    """The US demo's PDF calc sheet (which quotes the W shape's and A992's sources) and its summary hold no
    unit of the other system, in either system."""
    case = engine.Case.from_json(
        resources.files("assets").joinpath("demo_us_column.json").read_text(encoding="utf-8")
    )
    result = engine.solve(case)
    reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(result, units=system, date="2026-01-15")))
    sheet = "\n".join(page.extract_text() for page in reader.pages)
    assert "W10x49" in sheet
    assert _offending(sheet, system) == []
    assert _offending(format_summary("demo_us_column.json", case, result, units=system), system) == []
