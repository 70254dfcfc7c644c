"""Limits on one case and hostile case files (engine.limits, through engine.Case and engine.load_case).

Issue 11 found that a case of 1 000 point loads took 14 s to solve, that deeply nested JSON raised
RecursionError, a number of 5 000 digits ValueError, and that a lone surrogate in the title crashed every
export. Each is now a CaseError naming the field or the place, and the case is refused whole.
The limits are this project's own choice (common practice, no source): far above what one member needs.
"""

from __future__ import annotations

import dataclasses
import json
import os

import pytest

import engine
from engine import limits
from engine.case import Case, EndSupport, PointLoad, UniformLoad
from engine.case_files import load_case, save_case
from engine.errors import CaseError


def base() -> dict:
    """A plain pinned–pinned case file (invented)."""
    return {
        "schema": 1,
        "title": "Invented",
        "length": 6.0,
        "EI": 4.2e6,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 350e3,
    }


def refused(text) -> str:
    """The CaseError message for case-file text (fails when anything else happens)."""
    with pytest.raises(CaseError) as caught:
        Case.from_json(text)
    return str(caught.value)


def point_loads(count: int) -> list[dict]:
    """`count` point loads spread over a 6 m member."""
    return [{"type": "point", "P": 1e3, "x": 6.0 * (i + 1) / (count + 1)} for i in range(count)]


def test_the_largest_number_of_loads_is_accepted():
    """A case with exactly MAX_LOADS point loads is read and solved."""
    mapping = base() | {"loads": point_loads(limits.MAX_LOADS)}
    case = Case.from_dict(mapping)
    assert len(case.loads) == limits.MAX_LOADS
    assert engine.solve(case).status == "stable"


def test_one_load_too_many_is_refused_naming_the_limit_and_the_count():
    """MAX_LOADS + 1 loads are refused with a message naming the limit and the count received."""
    mapping = base() | {"loads": point_loads(limits.MAX_LOADS + 1)}
    with pytest.raises(CaseError) as caught:
        Case.from_dict(mapping)
    message = str(caught.value)
    assert message.startswith("loads: ")
    assert f"{limits.MAX_LOADS + 1} loads" in message and f"at most {limits.MAX_LOADS}" in message


def test_a_thousand_loads_are_refused_before_any_is_built(monkeypatch):
    """24 000 loads (what a 1 MB upload holds) are refused on their count alone, quickly."""
    built = []
    monkeypatch.setattr(engine.case, "load_from_data", lambda path, data: built.append(path))
    with pytest.raises(CaseError, match="24000 loads given"):
        Case.from_dict(base() | {"loads": point_loads(24_000)})
    assert built == []


def test_too_many_segments_are_refused():
    """Partial loads whose ends cut the member into more than MAX_SEGMENTS segments are refused."""
    count = limits.MAX_SEGMENTS // 2 + 1 - 1  # each load has two interior ends, all distinct
    loads = [
        {"type": "uniform", "q": 1e3, "start": 0.05 + 0.01 * i, "end": 3.0 + 0.01 * i} for i in range(count)
    ]
    assert Case.from_dict(base() | {"loads": loads[:-1]})  # 2·(count − 1) + 1 segments: allowed
    with pytest.raises(CaseError) as caught:
        Case.from_dict(base() | {"loads": loads})
    assert str(caught.value) == (
        f"loads: the loads cut the member into {2 * count + 1} segments; a case may "
        f"have at most {limits.MAX_SEGMENTS} (every point load, couple and end of "
        "a partial load is a cut)"
    )


def test_segment_count_agrees_with_the_solver():
    """engine.limits counts the segments exactly as engine.solver.model cuts the member."""
    from engine.imperfections import bow_for
    from engine.solver.model import Model

    case = Case.from_dict(
        base()
        | {
            "loads": [
                {"type": "point", "P": 1e3, "x": 2.0},
                {"type": "point", "P": 1e3, "x": 2.0},
                {"type": "uniform", "q": 1e3, "start": 1.0, "end": 2.0},
                {"type": "couple", "C": 1e3, "x": 6.0},
                {"type": "linear", "q_start": 0.0, "q_end": 1e3},
            ]
        }
    )
    model = Model(case, bow_for(case))
    assert limits.segment_count(case.length, case.loads) == model.nseg == 3


def test_python_built_cases_are_bounded_too():
    """A case built in Python (as the page builds it) meets the same limits."""
    loads = [PointLoad(P=1.0, x=0.1 * (i + 1)) for i in range(limits.MAX_LOADS + 1)]
    with pytest.raises(CaseError, match=rf"^loads: {limits.MAX_LOADS + 1} loads given"):
        Case(
            length=6.0, EI=1e6, left=EndSupport.named("pinned"), right=EndSupport.named("pinned"), loads=loads
        )
    case = Case(length=6.0, EI=1e6, left=EndSupport.named("pinned"), right=EndSupport.named("pinned"))
    with pytest.raises(CaseError, match="^loads: "):
        dataclasses.replace(
            case,
            loads=[
                UniformLoad(q=1.0, start=0.01 * i + 0.01, end=5.0 - 0.01 * i)
                for i in range(limits.MAX_SEGMENTS // 2)
            ],
        )


def test_deeply_nested_json_is_a_message_not_a_recursion_error():
    """100 000 nested arrays are refused naming the nesting limit and the place (was RecursionError)."""
    message = refused("[" * 100_000 + "]" * 100_000)
    assert message == (
        f"case: the JSON nests objects and arrays more than {limits.MAX_JSON_DEPTH} levels "
        "deep (at line 1 column 21); a case file needs 4"
    )
    nested = '{"length": 6, "section": ' + '{"a": ' * 5_000 + "1" + "}" * 5_000 + "}"
    assert "nests objects and arrays more than" in refused(nested)


@pytest.mark.parametrize(
    "text",
    [
        '"\\' * 400_000,
        '["' + "\\\\" * 400_000 + '"]',
        '"' * 900_000,
        "[]" * 450_000,
        '{"title": "' + "x" * 900_000,
    ],
)
def test_pathological_text_near_the_size_limit_is_a_message(text):
    """Runs of quotes and backslashes near 1 MB are scanned in linear time and refused with a message."""
    assert refused(text).startswith("case: ")


def test_nesting_inside_strings_does_not_count():
    """Brackets inside strings (a title of '[[[[') are text, not nesting."""
    case = Case.from_json(json.dumps(base() | {"title": "[" * 150 + '\\"{'}))
    assert case.title.startswith("[[[")


def test_a_number_of_thousands_of_digits_is_a_message():
    """An integer of 5 000 digits is refused naming the digit limit (was ValueError from int conversion)."""
    message = refused('{"length": ' + "7" * 5_000 + "}")
    assert message == (
        f"case: a number of 5000 digits is too long; numbers in a case file have at most "
        f"{limits.MAX_NUMBER_DIGITS} digits"
    )
    assert refused('{"length": -' + "7" * 5_000 + "}").startswith("case: a number of 5000 digits")


def test_a_huge_exponent_is_refused_naming_the_field():
    """1e400 reads as infinity and is refused naming the field, like any value out of range."""
    assert refused(json.dumps(base()).replace('"length": 6.0', '"length": 1e400')).startswith("length: ")


def test_a_file_above_the_size_limit_is_refused_unread(tmp_path):
    """A case file above MAX_CASE_BYTES is refused, and load_case reads no more than the limit."""
    path = tmp_path / "big.json"
    path.write_bytes(b" " * (limits.MAX_CASE_BYTES + 10) + json.dumps(base()).encode())
    with pytest.raises(CaseError, match=f"at most {limits.MAX_CASE_BYTES} bytes"):
        load_case(path)


def test_memory_error_while_parsing_is_a_message(monkeypatch):
    """A MemoryError while the JSON is read becomes a CaseError, never a traceback."""

    def exhausted(*args, **kwargs):
        raise MemoryError

    monkeypatch.setattr(limits.json, "loads", exhausted)
    assert refused(json.dumps(base())) == "case: not enough memory to read the case file"


@pytest.mark.parametrize("where", ["title", "section", "key", "material"])
def test_a_lone_surrogate_anywhere_is_refused_naming_the_field(where):
    """ "\\ud800" in the title, a name or a key is refused with the field named (it crashed every export)."""
    mapping = base()
    if where == "title":
        text = json.dumps(mapping | {"title": "Post \ud800 A"})
        expected = (
            "title: contains a character that is not valid text (U+D800, a lone surrogate) at position 6"
        )
    elif where == "section":
        text = json.dumps(mapping | {"section": {"name": "HEB \udfff"}})
        expected = "section.name: contains a character that is not valid text (U+DFFF"
    elif where == "material":
        text = json.dumps(mapping | {"material": {"E": 2.1e11, "fy": 3.55e8, "name": "\ud800"}})
        expected = "material.name: contains a character that is not valid text (U+D800"
    else:
        text = json.dumps(mapping | {"\ud83d": 1})
        expected = "case: a key contains a character that is not valid text (U+D83D"
    assert refused(text).startswith(expected)  # escaped in the JSON text
    raw = json.dumps(json.loads(text), ensure_ascii=False).encode("utf-8", "surrogatepass")
    assert refused(raw).startswith("case: the bytes cannot be decoded as UTF-8")  # raw: not UTF-8 at all


def test_a_surrogate_title_built_in_python_is_refused():
    """The page builds cases in Python: a lone surrogate in the title is refused there too."""
    case = Case(length=6.0, EI=1e6, left=EndSupport.named("pinned"), right=EndSupport.named("pinned"))
    with pytest.raises(CaseError, match=r"^title: contains a character that is not valid text \(U\+D800"):
        dataclasses.replace(case, title="\ud800")


@pytest.mark.parametrize("title", ["\x1b[2J\x1b[31mfake", "line\nbreak", "tab\there", "bell\x07", "c1\x9b"])
def test_control_characters_in_the_title_are_refused(title):
    """Escape sequences, line breaks, tabs and C1 controls in the title are refused naming the title."""
    with pytest.raises(CaseError, match=r"^title: contains a control character \(U\+00"):
        Case.from_dict(base() | {"title": title})


@pytest.mark.parametrize("title", ["façade post — level 2", "柱 A-1", "post 🏗", "=SUM(1)", "x" * 200])
def test_foreign_and_long_titles_are_valid_text(title):
    """Accents, CJK, emoji, formula-like text and 200 characters are valid titles."""
    assert Case.from_dict(base() | {"title": title}).title == title


@pytest.mark.parametrize("data", [b"\xff\xfe\x00", b'{"title": "\xc3"}', b'{"title": "\xed\xa0\x80"}'])
def test_invalid_utf8_is_a_message_with_the_byte(data):
    """Bytes that are not UTF-8 (a stray byte, a cut sequence, an encoded surrogate) name the byte."""
    message = refused(data)
    assert message.startswith(("case: the bytes cannot be decoded as UTF-8 text (", "case: not valid"))


def test_not_text_at_all_is_a_message():
    """An object that is not text (a number, None) is a CaseError, not a TypeError."""
    assert refused(12).startswith("case: ")
    assert refused(None).startswith("case: ")


def test_a_refused_file_leaves_nothing_half_applied(tmp_path):
    """Case values are immutable: a refused file changes nothing, and the previous case stays as it was."""
    previous = Case.from_dict(base())
    before = previous.to_dict()
    refused(json.dumps(base() | {"title": "\ud800", "length": 9.0}))
    assert previous.to_dict() == before


def test_save_case_writes_atomically(tmp_path, monkeypatch):
    """save_case writes a temporary file beside the target and renames it; a failure keeps the old file."""
    path = tmp_path / "post.json"
    save_case(Case.from_dict(base()), path)
    original = path.read_bytes()
    replaced = []
    real_replace = os.replace

    def spy(source, target):
        replaced.append((os.path.dirname(source), os.fspath(target)))
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "replace", spy)
    with pytest.raises(OSError):
        save_case(Case.from_dict(base() | {"title": "New"}), path)
    assert replaced == [(str(tmp_path), str(path))]
    assert path.read_bytes() == original
    assert sorted(p.name for p in tmp_path.iterdir()) == ["post.json"]  # no temporary file left
    monkeypatch.setattr(os, "replace", real_replace)
    save_case(Case.from_dict(base() | {"title": "New"}), path)
    assert load_case(path).title == "New"


@pytest.mark.parametrize("key", ["restraints", "steps", "foundation"])
def test_each_list_along_the_member_takes_at_most_max_restraints_items(key):
    """restraints, steps and foundation: MAX_RESTRAINTS + 1 items are refused naming the list, the count and
    the limit (engine.limits holds the value the README's limits table states)."""
    item = {
        "restraints": {"x": 3.0, "translation": "fixed"},
        "steps": {"x": 3.0, "EI": 4.0e6},
        "foundation": {"start": 0.0, "end": 6.0, "k": 1e5},
    }[key]
    message = refused(json.dumps(base() | {key: [item] * (limits.MAX_RESTRAINTS + 1)}))
    assert message == (
        f"{key}: {limits.MAX_RESTRAINTS + 1} items are too many; at most {limits.MAX_RESTRAINTS} are allowed"
    )


def test_the_limits_table_names_every_limit_the_engine_enforces():
    """Load cases and combinations are bounded by the values engine.limits publishes."""
    from engine import actions, combinations

    assert actions.MAX_ACTIONS == limits.MAX_ACTIONS == limits.LIMITS["actions"][0] == 12
    assert combinations.MAX_COMBINATIONS == limits.MAX_COMBINATIONS == limits.LIMITS["combinations"][0] == 256
    assert limits.LIMITS["restraints"][0] == limits.MAX_RESTRAINTS == 50
    too_many = [{"name": f"A{i}", "category": "permanent", "axial_force": 1e3} for i in range(13)]
    message = refused(json.dumps(base() | {"axial_force": 0.0, "actions": too_many}))
    assert message == f"actions: 13 actions given; 1 to {limits.MAX_ACTIONS} are allowed"
