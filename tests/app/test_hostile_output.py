"""Hostile text in, harmless files and printouts out: formula injection, control characters, malformed CSV,
shared `--out` folders (issue 11).

Formula injection: a cell a spreadsheet opens that starts with '=', '+', '-', '@', a tab or a carriage return
is run as a formula; the usual defence is a leading apostrophe (OWASP, "CSV Injection", from memory). Every
CSV strutscope writes is read back here with Python's csv module, as a spreadsheet splits it, and no cell may
start a formula unless it is a number. Members and titles are invented.
"""

from __future__ import annotations

import csv
import io
import json
import os
import re

import pytest

import engine
from app import exports
from app.outdir import LOCK_FILE, locked
from app.safe_text import FORMULA_PREFIXES, csv_cell, csv_comment, terminal
from engine import limits
from tests.app.test_batch import HEADER, read_results, row, write_table
from tests.app.test_cli import run_cli

NUMBER = re.compile(r"[-+]?(?:(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?|inf|nan)", re.IGNORECASE)

HOSTILE = [
    '=HYPERLINK("http://example.invalid","click")',
    "+cmd|' /C calc'!A0",
    "@SUM(1+1)",
    "-2+3+cmd|x",
    "\t=1+1",
    "\r=1+1",
]


def formula_cells(text: str) -> list[str]:
    """Every cell of CSV `text` (comment lines included) that a spreadsheet would run as a formula."""
    return [
        cell
        for cells in csv.reader(io.StringIO(text, newline=""))
        for cell in cells
        if cell.startswith(FORMULA_PREFIXES) and not NUMBER.fullmatch(cell)
    ]


# ---------------------------------------------------------------------------------------------- helpers


@pytest.mark.parametrize("text", HOSTILE + ["=", "-", "+", "@"])
def test_formula_cells_get_an_apostrophe(text):
    """A cell starting with = + - @ tab or CR that is not a number is prefixed with an apostrophe."""
    assert csv_cell(text) == "'" + text


@pytest.mark.parametrize("text", ["-1.5", "+3", "-1e-5", "-inf", "inf", "0.25", "", "HEB 200", "'=x", "a=b"])
def test_numbers_and_plain_text_are_kept(text):
    """Signed numbers (and -inf), plain text and text already starting with an apostrophe stay as they are."""
    assert csv_cell(text) == text


@pytest.mark.parametrize("title", ["a,=1+1", 'a, b,"@x",+y', 'a,"=1"', "façade post, level 2"])
def test_comment_lines_never_split_into_a_formula(title):
    """A '# title: ...' line split at its commas by a spreadsheet gives no formula cell, and stays '# '."""
    line = csv_comment(f"title: {title}")
    assert line.startswith("# title: ")
    assert formula_cells(line) == []


@pytest.mark.parametrize(
    ("text", "shown"),
    [
        ("Post A\x1b[2J", "Post A\\u001b[2J"),
        ("ok\rfake: 0 invalid", "ok\\rfake: 0 invalid"),
        ("two\nlines", "two\\nlines"),
        ("bidi\u202eevil", "bidi\\u202eevil"),
        ("bell\x07", "bell\\u0007"),
        ("c1\x9b31m", "c1\\u009b31m"),
        ("del\x7f", "del\\u007f"),
        ("lone \ud800", "lone \\ud800"),
        ("façade 柱 🏗", "façade 柱 🏗"),
    ],
)
def test_terminal_escapes_control_characters(text, shown):
    """Escape sequences, CR, LF, bidi controls, bells, C1 controls and lone surrogates print as escapes."""
    assert terminal(text) == shown


# ---------------------------------------------------------------------------------------------- exports


def test_station_csv_neutralises_a_formula_title():
    """The station CSV (solve --csv and the page) has no formula cell, whatever the title says."""
    base = json.loads(
        json.dumps(
            {
                "length": 4.0,
                "EI": 2e6,
                "supports": {"left": "pinned", "right": "pinned"},
                "loads": [{"type": "uniform", "q": -1e3}],
                "axial_force": -1e5,
            }
        )
    )
    for title in HOSTILE[:4] + ['x,=1+1,"@SUM(1)"', "+1,-2"]:
        if any(char in title for char in "\t\r"):
            continue  # not valid titles (control characters are refused by the engine)
        result = engine.solve(engine.Case.from_dict(base | {"title": title}))
        text = exports.csv_text(result)
        assert formula_cells(text) == [], title
        assert any(line.startswith("# title,") for line in text.splitlines())


# ---------------------------------------------------------------------------------------------- batch


def hostile_rows():
    """Rows whose ids (and a wrong-width row, a duplicate) carry formulas; one good row."""
    rows = [row("G1", EI="4200", axial="100")]
    rows += [row(text, EI="4200") for text in HOSTILE]
    rows.append(row("=DUP", EI="4200"))
    rows.append(row("=DUP", EI="4200"))  # a duplicate id
    rows.append(row("@WIDE", EI="4200") + ["=EXTRA()"])  # a row wider than the header
    rows.append(row("G2", EI="-4200", comment="=1+1"))  # an invalid value
    return rows


def test_batch_results_have_no_formula_cells(tmp_path):
    """Invalid ids, duplicates and wrong-width rows reach results.csv neutralised; the run reports them."""
    table = write_table(tmp_path / "members.csv", hostile_rows())
    done = run_cli("batch", str(table), "--out", "out", cwd=tmp_path)
    assert done.returncode == 1, done.stderr
    text = (tmp_path / "out" / "results.csv").read_text(encoding="utf-8")
    assert formula_cells(text) == []
    ids = [cells[0] for cells in csv.reader(io.StringIO(text, newline=""))][1:]
    assert ids[0] == "G1" and ids[1] == "'" + HOSTILE[0] and "'=DUP" in ids and "'@WIDE" in ids
    assert "\x1b" not in done.stdout and "\r" not in done.stdout


def test_batch_printout_escapes_control_characters(tmp_path):
    """An id with an escape sequence or a carriage return prints escaped: it cannot fake a summary line."""
    table = write_table(
        tmp_path / "members.csv",
        [row("A\x1b[2J\x1b[1;1H", EI="4200"), row("B\rstrutscope batch: 0 invalid", EI="4200")],
    )
    done = run_cli("batch", str(table), "--out", "out", cwd=tmp_path)
    assert done.returncode == 1
    assert "\x1b" not in done.stdout + done.stderr and "\r" not in done.stdout + done.stderr
    assert "(A\\u001b[2J\\u001b[1;1H)" in done.stdout


def test_batch_point_loads_are_bounded(tmp_path):
    """More point loads in a row than a case may have are refused naming point_loads and the limit."""
    many = ";".join(f"1@{0.01 * (i + 1):.2f}" for i in range(limits.MAX_LOADS + 1))
    table = write_table(tmp_path / "members.csv", [row("P1", EI="4200", points=many)])
    done = run_cli("batch", str(table), "--out", "out", cwd=tmp_path)
    assert done.returncode == 1
    result = read_results(tmp_path / "out")[0]
    assert result["field"] == "point_loads"
    assert f"{limits.MAX_LOADS + 1} point loads given" in result["message"]
    assert f"at most {limits.MAX_LOADS}" in result["message"]


# ---------------------------------------------------------------------------------------------- malformed CSV


def test_an_unterminated_quote_is_an_error_naming_its_line(tmp_path):
    """A quote never closed (rows C2 to C6 would vanish into one cell) exits 2 naming its line; no output."""
    lines = [",".join(HEADER)] + [",".join(row(f"C{i}", EI="4200")) for i in range(1, 7)]
    lines[2] = lines[2].replace("C2", '"C2', 1)
    (tmp_path / "members.csv").write_text("\n".join(lines) + "\n", encoding="utf-8")
    done = run_cli("batch", "members.csv", "--out", "out", cwd=tmp_path)
    assert done.returncode == 2, done.stdout
    assert done.stderr.startswith(
        "error: members.csv: line 3: a quoted cell that starts on this line is never closed"
    )
    assert not (tmp_path / "out").exists()


def test_a_quote_closed_lines_later_is_a_row_error_naming_the_lines(tmp_path):
    """A quote closed on a later line swallows rows into one cell: that row is an error naming the lines."""
    lines = [",".join(HEADER)] + [",".join(row(f"C{i}", EI="4200")) for i in range(1, 5)]
    lines[2] = lines[2].replace(",6.0,", ',"6.0,', 1)
    lines[3] = lines[3].replace(",6.0,", ',6.0",', 1)
    (tmp_path / "members.csv").write_text("\n".join(lines) + "\n", encoding="utf-8")
    done = run_cli("batch", "members.csv", "--out", "out", cwd=tmp_path)
    assert done.returncode == 1
    results = read_results(tmp_path / "out")
    assert [r["id"] for r in results] == ["C1", "C2", "C4"]
    assert results[1]["field"] == "length_m"
    assert "runs over lines 3 to 4" in results[1]["message"]


def test_a_stray_quote_inside_a_cell_is_an_error_naming_its_line(tmp_path):
    """A quote followed by more text in the same cell (a"b"c) is malformed CSV: exit 2 naming the line."""
    lines = [",".join(HEADER), ",".join(row("C1", EI="4200")), ",".join(row("C2", EI="4200", comment='"a"b'))]
    (tmp_path / "members.csv").write_text("\n".join(lines) + "\n", encoding="utf-8")
    done = run_cli("batch", "members.csv", "--out", "out", cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith("error: members.csv: line 3: not readable as CSV")


# ---------------------------------------------------------------------------------------------- --out folders


def test_a_second_run_into_a_locked_folder_is_refused(tmp_path):
    """While one run holds the --out folder, another run into it exits 2 with a clear message."""
    table = write_table(tmp_path / "members.csv", [row("G1", EI="4200")])
    out = tmp_path / "out"
    out.mkdir()
    with locked(str(out)):
        done = run_cli("batch", str(table), "--out", str(out), cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {out}: another strutscope batch is writing into this folder")
    assert not (out / "results.csv").exists()
    assert run_cli("batch", str(table), "--out", str(out), cwd=tmp_path).returncode == 0  # free again
    assert (out / LOCK_FILE).exists()


def sheets(folder) -> list[str]:
    """The PDF files in `folder`."""
    return sorted(name for name in os.listdir(folder) if name.endswith(".pdf"))


def test_stale_calc_sheets_of_the_previous_run_are_removed(tmp_path):
    """A rerun removes the calc sheets it did not write itself; files the tool did not write stay."""
    out = tmp_path / "out"
    first = write_table(tmp_path / "first.csv", [row("G1", EI="4200"), row("G3", EI="4200")])
    assert run_cli("batch", str(first), "--out", str(out), "--pdf", cwd=tmp_path).returncode == 0
    (out / "notes.pdf").write_bytes(b"%PDF- the user's own file")
    second = write_table(tmp_path / "second.csv", [row("G3", EI="4200"), row("G4", EI="4200")])
    done = run_cli("batch", str(second), "--out", str(out), "--pdf", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    assert sheets(out) == ["G3.pdf", "G4.pdf", "notes.pdf"]
    assert "removed 1 calc sheet of the previous run" in done.stdout
    third = run_cli("batch", str(second), "--out", str(out), cwd=tmp_path)  # no --pdf: none is current
    assert third.returncode == 0
    assert sheets(out) == ["notes.pdf"]


def test_results_over_the_input_table_are_refused(tmp_path):
    """`batch d/results.csv --out d` would overwrite its own input: exit 2, the table untouched."""
    folder = tmp_path / "d"
    folder.mkdir()
    table = write_table(folder / "results.csv", [row("G1", EI="4200")])
    before = table.read_bytes()
    for out in ("d", str(folder), "./d/"):
        done = run_cli("batch", "d/results.csv", "--out", out, cwd=tmp_path)
        assert done.returncode == 2
        assert "would write results.csv over the input table" in done.stderr
    assert table.read_bytes() == before
