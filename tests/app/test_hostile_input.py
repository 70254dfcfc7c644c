"""`strutscope solve` on hostile case files: a message naming the file and the problem, never a traceback.

Issue 11 found RecursionError (deep nesting), ValueError (an integer of 5 000 digits), a crash on a lone
surrogate in the title, and 14 s of work for 1 000 point loads; each now exits with 2 and one line
(README, "Command line": exit code 2 for invalid input). The files are invented.
"""

from __future__ import annotations

import json

import pytest

import engine
from app import cli
from engine import limits
from tests.app.test_cli import run_cli


def case_text(**changes) -> str:
    """A small valid case file's JSON text with `changes` applied."""
    mapping = {
        "schema": 1,
        "title": "Invented",
        "length": 4.0,
        "EI": 2.0e6,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 1e5,
    }
    mapping.update(changes)
    return json.dumps(mapping)


HOSTILE = {
    "deep nesting": ("[" * 50_000 + "]" * 50_000).encode(),
    "5000 digits": case_text().replace('"length": 4.0', '"length": ' + "9" * 5_000).encode(),
    "lone surrogate in the title": case_text(title="post \ud800").encode(),
    "raw surrogate bytes": case_text()
    .replace("Invented", "post \\ud800")
    .encode()
    .replace(b"\\ud800", "\ud800".encode("utf-8", "surrogatepass")),
    "invalid UTF-8": case_text().encode().replace(b"Invented", b"Inv\xffented"),
    "1000 point loads": case_text(
        loads=[{"type": "point", "P": 1e3, "x": 4.0 * (i + 1) / 1001} for i in range(1000)]
    ).encode(),
    "2 MB of whitespace": b" " * 2_000_000 + case_text().encode(),
    "NaN": case_text().replace("100000.0", "NaN").encode(),
    "escape sequence in the title": case_text(title="\x1b[2J\x1b[31mfake").encode(),
}

EXPECTED = {
    "deep nesting": "the JSON nests objects and arrays more than",
    "5000 digits": "a number of 5000 digits is too long",
    "lone surrogate in the title": "title: contains a character that is not valid text (U+D800",
    "raw surrogate bytes": "the bytes cannot be decoded as UTF-8 text",
    "invalid UTF-8": "the bytes cannot be decoded as UTF-8 text (invalid start byte at byte",
    "1000 point loads": f"loads: 1000 loads given; a case may have at most {limits.MAX_LOADS}",
    "2 MB of whitespace": f"at most {limits.MAX_CASE_BYTES} bytes",
    "NaN": "axial_force: ",
    "escape sequence in the title": "title: contains a control character (U+001B)",
}


@pytest.mark.parametrize("name", list(HOSTILE))
def test_hostile_case_files_exit_two_with_one_message(tmp_path, name):
    """Each hostile file exits 2 with `error: <file>: <message>` on one line, no traceback, no export."""
    (tmp_path / "case.json").write_bytes(HOSTILE[name])
    done = run_cli("solve", "case.json", "--pdf", "sheet.pdf", cwd=tmp_path)
    assert done.returncode == 2, done.stderr
    assert done.stderr.startswith("error: case.json: "), done.stderr
    assert EXPECTED[name] in done.stderr
    assert "Traceback" not in done.stderr and done.stderr.count("\n") == 1
    assert "\x1b" not in done.stderr
    assert not (tmp_path / "sheet.pdf").exists()


def test_the_largest_allowed_case_solves_on_the_command_line(tmp_path):
    """A case with the most loads allowed is solved (exit 0) with its capacity."""
    loads = [
        {"type": "point", "P": 1e3, "x": 4.0 * (i + 1) / (limits.MAX_LOADS + 1)}
        for i in range(limits.MAX_LOADS)
    ]
    (tmp_path / "case.json").write_text(
        case_text(loads=loads, section={"name": "HEB 200"}, material={"name": "S355"}), encoding="utf-8"
    )
    done = run_cli("solve", "case.json", "--capacity", cwd=tmp_path)
    assert done.returncode == 0, done.stderr


def test_memory_error_while_solving_is_a_message(tmp_path, monkeypatch, capsys):
    """A MemoryError in the solve exits 2 with a message naming the file, not a traceback."""
    (tmp_path / "case.json").write_text(case_text(), encoding="utf-8")

    def exhausted(*args, **kwargs):
        raise MemoryError

    monkeypatch.setattr(engine, "solve", exhausted)
    assert cli.main(["solve", str(tmp_path / "case.json")]) == 2
    expected = f"error: {tmp_path / 'case.json'}: not enough memory to solve this case\n"
    assert capsys.readouterr().err == expected
