"""The repository stands on its own: no file names a folder or a file outside it (issue 10).

A reader who clones the project has only the repository. Found 2026-12-03: DEVELOPERS.md and five source and
test files named a contract file of a working folder outside the repository; the conventions, the case-file
contract and the reference values live in DEVELOPERS.md, README.md and tests/REFERENCES.md instead.
"""

from __future__ import annotations

import re
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
_SKIP_DIRS = {
    ".git",
    "__pycache__",
    ".venv",
    "venv",
    "node_modules",
    ".ruff_cache",
    ".pytest_cache",
    ".hypothesis",
}
_TEXT = {
    ".py",
    ".md",
    ".toml",
    ".json",
    ".txt",
    ".cfg",
    ".csv",
    ".yml",
    ".yaml",
    ".sh",
    ".html",
    ".js",
    ".css",
    "",
}
# A path that leaves the checkout, or a named file that only a working folder beside it held. The forms are
# put together from their words, so that this file names no such path itself and is scanned like any other.
_UP, _SHARED, _DESIGN, _WORK, _CONTRACT = "..", "shared", "design", "work", "CONTRACT"
_FORMS = (
    f"{_UP}/{_SHARED}",
    f"/{_WORK}/",
    f"{_SHARED} {_DESIGN} folder",
    f"{_DESIGN}/conventions.md",
    f"{_DESIGN}/references.md",
)
_OUTSIDE = re.compile(
    "|".join(re.escape(form) for form in _FORMS)
    + rf"|(?<![\w.]){re.escape(f'{_UP}/{_DESIGN}/')}|[A-Z_]+_{_CONTRACT}\.md"
)


def _files():
    for path in ROOT.rglob("*"):
        if any(part in _SKIP_DIRS or part.endswith(".egg-info") for part in path.relative_to(ROOT).parts):
            continue
        if path.is_file() and path.suffix in _TEXT:
            yield path


def test_no_file_points_outside_the_repository():
    found = []
    for path in _files():
        try:
            text = path.read_text(encoding="utf-8")
        except UnicodeDecodeError:
            continue
        for number, line in enumerate(text.splitlines(), start=1):
            if _OUTSIDE.search(line):
                found.append(f"{path.relative_to(ROOT)}:{number}: {line.strip()[:100]}")
    assert found == [], "\n".join(found)


def test_the_pattern_finds_what_it_looks_for():
    """The check can fail: each form it forbids is found (invented lines)."""
    for line in (
        f"see {_UP}/{_SHARED}/{_DESIGN}/notes.md",
        f"interface in `/{_WORK}/wt/LTB_{_CONTRACT}.md`",
        f"in the project's {_SHARED} {_DESIGN} folder",
        f"(LTB_{_CONTRACT}.md)",
    ):
        assert _OUTSIDE.search(line), line
    assert not _OUTSIDE.search("see tests/REFERENCES.md and DEVELOPERS.md")
