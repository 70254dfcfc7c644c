"""Bad input, fuzzed: generated case mappings, batch rows and uploaded files either solve or are refused.

Every generated case either solves with finite results (a stable result holds no NaN and no infinity; at a
critical load +inf is allowed, NaN never) or is refused with ``engine.CaseError`` whose message starts with
the field path it is about. Nothing else escapes. The cases are invented; the contract is README "Case file"
and the decisions log in DEVELOPERS.md ("NaN never appears").
"""

from __future__ import annotations

import copy
import json
import math

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import engine
from engine import limits

TOP_KEYS = (
    "schema",
    "title",
    "length",
    "EI",
    "supports",
    "axial_force",
    "loads",
    "imperfection",
    "section",
    "axis",
    "material",
    "stiffness_factor",
    "check",
)
FUZZ_CASES = 10_000  # the issue asks for at least 10 000 per run
BATCH = 20  # cases drawn per hypothesis example, so the drawing costs less than the solving

# A few lengths, stiffnesses and supports, so that the engine's per-support cache is hit and 10 000 solves
# fit in a CI run; the loads, the force and the bow vary freely. All invented.
_LENGTHS = (0.8, 3.0, 6.0, 11.5, 24.0)
_EIS = (2.0e4, 4.2e6, 3.0e8)
_ENDS = (
    "pinned",
    "fixed",
    "guided",
    "free",
    {"translation": 1.0e6, "rotation": "free"},
    {"translation": "fixed", "rotation": 5.0e5},
)
_NASTY = (
    math.nan,
    math.inf,
    -math.inf,
    1e308,
    -1e308,
    1e-308,
    5e-324,
    -0.0,
    0.0,
    1e30,
    -1e30,
    1e-30,
    True,
    False,
    None,
    "",
    "6.0",
    "nan",
    [],
    {},
    [1.0],
    {"x": 1},
)


@st.composite
def valid_case(draw) -> dict:
    """A schema-1 case mapping with any supports (an unstable pair included), loads and bow; invented."""
    length = draw(st.sampled_from(_LENGTHS))
    EI = draw(st.sampled_from(_EIS))
    kinds = draw(st.lists(st.sampled_from(("uniform", "linear", "point", "couple")), max_size=3))
    loads = []
    for kind in kinds:
        magnitude = draw(st.floats(-5e4, 5e4, allow_nan=False))
        if kind == "uniform":
            loads.append({"type": "uniform", "q": magnitude})
        elif kind == "linear":
            a, b = sorted(draw(st.lists(st.floats(0.0, 1.0), min_size=2, max_size=2)))
            loads.append(
                {
                    "type": "linear",
                    "q_start": -magnitude / 3,
                    "q_end": magnitude,
                    "start": a * length,
                    "end": b * length,
                }
            )
        else:
            key = "P" if kind == "point" else "C"
            loads.append({"type": kind, key: magnitude, "x": draw(st.floats(0.0, 1.0)) * length})
    shape = draw(st.sampled_from(("none", "sine", "parabola", "sway", "mode")))
    pcr_euler = math.pi**2 * EI / length**2
    return {
        "schema": 1,
        "title": "Fuzzed case (invented)",
        "length": length,
        "EI": EI,
        "supports": {
            "left": copy.deepcopy(draw(st.sampled_from(_ENDS))),
            "right": copy.deepcopy(draw(st.sampled_from(_ENDS))),
        },
        "axial_force": draw(st.floats(-3.0, 4.5)) * pcr_euler,
        "loads": loads,
        "imperfection": {"shape": shape, "amplitude": draw(st.floats(-0.005, 0.005)) * length},
    }


def _paths(data, prefix=()):
    """Every path to a value inside nested dicts and lists."""
    yield prefix
    if isinstance(data, dict):
        for key, value in data.items():
            yield from _paths(value, (*prefix, key))
    elif isinstance(data, list):
        for index, value in enumerate(data):
            yield from _paths(value, (*prefix, index))


@st.composite
def fuzzed_case(draw) -> dict:
    """A valid case, or one with a value replaced, a key removed or added, or a load pushed off the member."""
    case = draw(valid_case())
    action = draw(st.sampled_from(("keep", "replace", "replace", "remove", "add", "outside", "scale")))
    paths = [p for p in _paths(case) if p]
    path = draw(st.sampled_from(paths))
    *parents, last = path
    holder = case
    for step in parents:
        holder = holder[step]
    if action == "replace":
        holder[last] = draw(
            st.one_of(
                st.sampled_from(_NASTY), st.floats(), st.text(max_size=5), st.integers(-(10**30), 10**30)
            )
        )
    elif action == "remove":
        del holder[last]
    elif action == "add":
        target = holder if isinstance(holder, dict) else case
        target[draw(st.sampled_from(("bogus", "Length", "q", "x", "__class__", "eval")))] = 1.0
    elif action == "outside" and case["loads"]:
        load = case["loads"][0]
        key = "x" if "x" in load else draw(st.sampled_from(("start", "end")))
        load[key] = draw(st.sampled_from((-1e-3, -case["length"], case["length"] * 1.0001, 1e6)))
    elif action == "scale" and isinstance(holder[last], float):
        holder[last] *= draw(st.sampled_from((1e-200, 1e-12, 1e12, 1e200)))
    return case


def check_outcome(mapping) -> str:
    """Solve `mapping`; return 'solved' or 'refused', failing the test on any other outcome."""
    try:
        result = engine.solve(engine.Case.from_dict(mapping), stations=11)
    except engine.CaseError as error:
        message = str(error)
        field = message.split(":", 1)[0].strip()
        root = field.split(".")[0].split("[")[0]
        assert root in (*TOP_KEYS, "case"), f"message names no field: {message!r} for {mapping!r}"
        assert " " not in field and len(message) > len(field) + 5, message
        return "refused"
    arrays = [
        result.x,
        result.deflection,
        result.moment,
        result.shear,
        result.rotation,
        result.total_offset,
        result.transverse_force,
    ]
    for values in arrays:
        values = np.asarray(values, dtype=float)
        assert not np.isnan(values).any(), f"NaN in a result of {mapping!r}"
        if result.status != "critical":
            assert np.isfinite(values).all(), f"a non-finite value in a {result.status} result of {mapping!r}"
    assert np.isfinite(result.x).all()
    assert not np.isnan(np.asarray(result.critical_loads, dtype=float)).any()
    return "solved"


@pytest.mark.slow
def test_ten_thousand_fuzzed_cases_solve_or_are_refused_naming_a_field():
    """10 000 generated cases: each solves with finite values (no NaN) or raises CaseError naming a field."""
    outcomes = {"solved": 0, "refused": 0}

    @settings(
        max_examples=FUZZ_CASES // BATCH,
        deadline=None,
        database=None,
        derandomize=False,
        suppress_health_check=list(HealthCheck),
    )
    @given(st.lists(fuzzed_case(), min_size=BATCH, max_size=BATCH))
    def run(batch):
        for mapping in batch:
            outcomes[check_outcome(mapping)] += 1

    run()
    assert sum(outcomes.values()) >= FUZZ_CASES
    # both kinds were met, so the generator is not stuck on one side
    assert outcomes["solved"] > FUZZ_CASES // 10 and outcomes["refused"] > FUZZ_CASES // 10, outcomes


def test_a_tiny_EI_is_refused_naming_EI():
    """EI = 3e-192 N·m², below any structural member, is refused with a CaseError naming EI and its range
    (found by fuzzing: it used to reach the spring scaling and be reported under the wrong name)."""
    mapping = {
        "schema": 1,
        "length": 11.5,
        "EI": 3e-192,
        "axial_force": 0.0,
        "loads": [],
        "supports": {"left": {"translation": 1.0e6, "rotation": "free"}, "right": "pinned"},
    }
    with pytest.raises(engine.CaseError) as refused:
        engine.solve(engine.Case.from_dict(mapping), stations=11)
    assert str(refused.value).startswith("EI: 3e-192")


def test_a_tiny_EI_never_raises_an_index_error():
    """EI = 1e-308 N·m² is refused with a CaseError naming EI, never an IndexError (found by fuzzing)."""
    mapping = {
        "schema": 1,
        "length": 11.5,
        "EI": 1e-308,
        "axial_force": 235.76,
        "loads": [],
        "supports": {"left": "fixed", "right": "free"},
        "imperfection": {"shape": "parabola", "amplitude": -0.0123},
    }
    with pytest.raises(engine.CaseError, match="^EI: "):
        engine.solve(engine.Case.from_dict(mapping), stations=11)


# ------------------------------------------------------------------------------------------------ batch rows

_CELLS = {
    "id": st.sampled_from(("M1", "col-2", "", " ", "a b", "../x", "x" * 70, "é")),
    "length_m": st.sampled_from(("6", "0", "-1", "nan", "inf", "1e400", "6.0m", "", "2,5", "0x10", "1e-300")),
    "left": st.sampled_from(("pinned", "fixed", "free", "guided", "FIXED", "", "hinge", "1e6")),
    "right": st.sampled_from(("pinned", "fixed", "free", "guided", "", "roller")),
    "EI_kNm2": st.sampled_from(("4200", "", "-5", "nan", "inf", "1e30", "abc")),
    "axial_kN": st.sampled_from(("350", "", "-1e9", "nan", "-inf", "1e13", "1e3")),
    "udl_kN_per_m": st.sampled_from(("2.5", "", "nan", "0", "-1e308", "x")),
    "point_loads": st.sampled_from(("", "7@2.0", "7@2.0;3.5@4", "7@99", "@", "7@", "nan@1", "1@nan", ";;")),
    "bow": st.sampled_from(("", "none", "L/300", "12mm", "L/0", "-3mm", "en1993-table-5.1:b", "wobbly")),
    "section": st.sampled_from(("", "HEB 200", "NOPE 1")),
    "material": st.sampled_from(("", "S355", "unobtainium")),
    "deflection_limit": st.sampled_from(("", "250", "0", "nan")),
}


@settings(max_examples=1500, deadline=None, database=None, suppress_health_check=list(HealthCheck))
@given(
    st.fixed_dictionaries({}, optional=_CELLS),
    st.dictionaries(st.sampled_from(tuple(_CELLS)), st.text(max_size=8), max_size=2),
)
def test_batch_rows_solve_or_are_refused_naming_a_column(row, junk):
    """A fuzzed members-table row gives a case that solves finitely, or a RowError naming its column."""
    from app.batch import COLUMNS, RowError, member_case

    row = {**row, **junk}
    try:
        case = member_case(row)
    except RowError as error:
        known = {column.name.lower() for column in COLUMNS}
        assert error.column == "" or error.column.lower() in known, (error.column, row)
        assert str(error).strip(), row
        return
    check_outcome(case.to_dict())


# ------------------------------------------------------------------------------------------------ uploads


@pytest.fixture(scope="module")
def upload_page():
    """One page on the invented demo case, reused for every fuzzed upload."""
    import panel as pn

    from app.page import MemberPage

    yield MemberPage()
    pn.state.reset()


_DEMO = None


def _demo_json() -> str:
    global _DEMO
    if _DEMO is None:
        from importlib import resources

        _DEMO = resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8")
    return _DEMO


# Hostile strings (issue 11): lone surrogates, control characters and escape sequences, spreadsheet formula
# prefixes, long and foreign text. Hostile structure: deep nesting, huge numbers, many loads, big files.
_HOSTILE_TEXT = (
    "\ud800",
    "\udfff x",
    "a\ud83d",
    "\x1b[2J\x1b[31mFAKE",
    "line\rsummary: ok\n",
    "\x00\x07\x08",
    '=HYPERLINK("http://x.invalid")',
    "+cmd|' /C calc'!A0",
    "@SUM(1+1)",
    "-2+3",
    "\tTAB",
    "\rCR",
    "x" * 5000,
    "梁の座屈 🏗️",
    "\u202eRTL",
)


@st.composite
def hostile_bytes(draw) -> bytes:
    """A case file made hostile: strings in its title or ids, deep nesting, huge numbers or sheer size."""
    mapping = json.loads(_demo_json())
    kind = draw(st.sampled_from(("text", "nesting", "digits", "loads", "pad")))
    if kind == "text":
        text = draw(st.sampled_from(_HOSTILE_TEXT)) + draw(st.text(max_size=5))
        where = draw(st.sampled_from(("title", "key", "load type", "support")))
        if where == "title":
            mapping["title"] = text
        elif where == "key":
            mapping[text] = 1
        elif where == "load type":
            mapping["loads"][0]["type"] = text
        else:
            mapping["supports"]["left"] = text
        return json.dumps(mapping, ensure_ascii=draw(st.booleans())).encode("utf-8", "surrogatepass")
    if kind == "nesting":
        depth = draw(st.sampled_from((40, 1000, 100_000)))
        mapping["title"] = "@@"
        return json.dumps(mapping).replace('"@@"', "[" * depth + "]" * depth).encode()
    if kind == "digits":
        digits = draw(st.sampled_from((4299, 4301, 20_000)))
        return json.dumps(mapping).replace("6.0", "1" + "0" * digits, 1).encode()
    if kind == "loads":
        count = draw(st.sampled_from((13, 30)))  # more rows than the page lists; the solve stays short
        mapping["loads"] = [{"type": "point", "P": 1.0, "x": 6.0 * i / count} for i in range(count)]
        return json.dumps(mapping).encode()
    return json.dumps(mapping).encode() + b" " * draw(st.sampled_from((10, 999_000, 1_000_001)))


@st.composite
def uploaded_bytes(draw) -> bytes:
    """File contents: a fuzzed case as JSON, the demo case cut short, arbitrary bytes, or a hostile file."""
    kind = draw(st.sampled_from(("case", "case", "cut", "bytes", "text", "hostile", "hostile")))
    if kind == "hostile":
        return draw(hostile_bytes())
    if kind == "case":
        return json.dumps(draw(fuzzed_case()), allow_nan=True).encode()
    if kind == "cut":
        text = _demo_json().encode()
        return text[: draw(st.integers(0, len(text) - 1))]
    if kind == "bytes":
        return draw(st.binary(max_size=200))
    return draw(st.text(max_size=50)).encode("utf-8", "surrogatepass")


@settings(max_examples=600, deadline=None, database=None, suppress_health_check=list(HealthCheck))
@given(data=uploaded_bytes(), name=st.sampled_from(("case.json", "CASE.JSON", "case.txt", "case.json.py")))
def test_uploaded_files_load_or_are_refused_with_a_message(upload_page, data, name):
    """A fuzzed upload either loads (the page shows the engine's case) or is refused with a message."""
    page = upload_page
    before = page.model.result
    page.upload.filename = name
    page.upload.value = None  # so that the same bytes twice still reach the watcher
    page.upload.value = data
    message = page.upload_message.object
    if "ss-error" in message:
        assert "upload:" in message
        assert page.model.result is before  # the last good result is kept
    else:
        assert "loaded" in message
        assert name.lower().endswith(".json")
        assert page.model.result is not None
        case = engine.Case.from_json(page.upload.value)
        if not page.model.errors:
            assert page.model.result.case == case
    # whatever came in, everything the page sends on is text (a lone surrogate would fail every message)
    page.model.link.encode("utf-8")
    message.encode("utf-8")


# ----------------------------------------------------------------------------------------------- hostile text
# Issue 11: lone surrogates, control characters (escape sequences, CR, LF), bidirectional controls and formula
# prefixes in any text a case or a table holds; nesting, size and thousands of digits in the file's structure.

_HOSTILE_PIECES = (
    "\ud800",
    "\udfff",
    "\ud83d",
    "\x00",
    "\x1b[2J",
    "\x1b]0;pwned\x07",
    "\r",
    "\n",
    "\t",
    "\x7f",
    "\x9b",
    "\u202e",
    "\u2066",
    '=HYPERLINK("x")',
    "+cmd|' /C calc'!A0",
    "@SUM(1+1)",
    "-2+3",
    "=",
    "柱",
    "🏗",
    "é",
    "'",
    '"',
    ",",
    ";",
)
_hostile_text = st.one_of(
    st.lists(st.sampled_from(_HOSTILE_PIECES), min_size=1, max_size=6).map("".join),
    # Any code point, surrogates included (written without `characters(exclude_categories=...)`, which the
    # oldest hypothesis this project allows does not know).
    st.lists(st.integers(0, 0x10FFFF).map(chr), max_size=12).map("".join),
)


def _formula_cells(text: str) -> list[str]:
    """Cells of CSV `text` that a spreadsheet would run as formulas (see tests/app/test_hostile_output.py)."""
    import csv
    import io
    import re

    number = re.compile(r"[-+]?(?:(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?|inf|nan)", re.IGNORECASE)
    return [
        cell
        for cells in csv.reader(io.StringIO(text, newline=""))
        for cell in cells
        if cell[:1] in ("=", "+", "-", "@", "\t", "\r") and not number.fullmatch(cell)
    ]


def _shows_no_controls(text: str) -> bool:
    """Whether `text` holds no control, surrogate or bidirectional-control character (terminals run them)."""
    import unicodedata

    return not any(
        unicodedata.category(char) in ("Cc", "Cs")
        or char in "\u202a\u202b\u202c\u202d\u202e\u2066\u2067\u2068\u2069\u200e\u200f\u061c"
        for char in text
    )


def _read_json(text) -> str:
    """Read case-file JSON; return 'read' or 'refused', failing on anything but a CaseError naming a field."""
    try:
        engine.Case.from_json(text)
    except engine.CaseError as error:
        field = str(error).split(":", 1)[0].strip()
        root = field.split(".")[0].split("[")[0]
        assert root in (*TOP_KEYS, "case"), f"message names no field: {error}"
        return "refused"
    return "read"


@settings(max_examples=400, deadline=None, database=None, suppress_health_check=list(HealthCheck))
@given(
    case=valid_case(),
    text=_hostile_text,
    where=st.sampled_from(("title", "section", "material", "key", "support", "load type")),
)
def test_hostile_text_is_refused_naming_its_field_or_exports_safely(case, text, where):
    """Hostile text anywhere in a case file is refused naming the field, or the case exports a safe CSV."""
    from app.exports import csv_text
    from app.safe_text import terminal

    case["supports"] = {"left": "pinned", "right": "pinned"}  # stable, so the export can be checked
    if where == "title":
        case["title"] = text
    elif where == "section":
        case["section"] = {"name": text}
        case["material"] = {"name": "S355"}
    elif where == "material":
        case["material"] = {"E": 2.1e11, "fy": 3.55e8, "name": text}
        case["section"] = {"name": "HEB 200"}
    elif where == "key":
        case[text] = 1.0
    elif where == "support":
        case["supports"]["left"] = text
    else:
        case["loads"] = [{"type": text, "q": 1.0}]
    for encoded in (json.dumps(case), json.dumps(case, ensure_ascii=False).encode("utf-8", "surrogatepass")):
        if _read_json(encoded) == "read":
            read = engine.Case.from_json(encoded)
            assert _shows_no_controls(read.title) and _shows_no_controls(terminal(read.title))
            assert _formula_cells(csv_text(engine.solve(read, stations=11))) == []


@st.composite
def hostile_structure(draw) -> str:
    """Case-file text with deep nesting, long arrays, long strings or numbers of thousands of digits."""
    case = draw(valid_case())
    kind = draw(st.sampled_from(("nesting", "loads", "string", "digits", "exponent", "size")))
    text = json.dumps(case)
    if kind == "nesting":
        depth = draw(st.integers(1, 3000))
        return text.replace('"title"', '"x": ' + "[" * depth + "]" * depth + ', "title"', 1)
    if kind == "loads":
        count = draw(st.integers(0, 400))
        case["loads"] = [
            {"type": "point", "P": 1.0, "x": case["length"] * (i + 1) / (count + 1)} for i in range(count)
        ]
        return json.dumps(case)
    if kind == "string":
        case["title"] = "x" * draw(st.integers(150, 200_000))
        return json.dumps(case)
    if kind == "digits":
        digits = "7" * draw(st.integers(1, 6000))
        return text.replace(f'"length": {case["length"]!r}', f'"length": {digits}', 1)
    if kind == "exponent":
        return text.replace(f'"length": {case["length"]!r}', f'"length": 1e{draw(st.integers(-400, 400))}', 1)
    return text + " " * draw(st.integers(0, 1_200_000))


@settings(max_examples=200, deadline=None, database=None, suppress_health_check=list(HealthCheck))
@given(text=hostile_structure())
def test_hostile_structure_is_read_or_refused_with_a_message(text):
    """Nesting, long arrays and strings, huge numbers and sizes: a case, or a CaseError naming a field."""
    outcome = _read_json(text)
    if outcome == "read":
        case = engine.Case.from_json(text)
        assert len(case.loads) <= limits.MAX_LOADS and len(text) <= limits.MAX_CASE_BYTES


@settings(max_examples=150, deadline=None, database=None, suppress_health_check=list(HealthCheck))
@given(identifier=_hostile_text, comment=_hostile_text, extra=st.booleans())
def test_hostile_batch_ids_and_comments_reach_results_neutralised(identifier, comment, extra):
    """A row with a hostile id or comment (or one cell too many) gives a results.csv with no formula cell."""
    import csv
    import os
    import tempfile

    from app import batch
    from app.safe_text import terminal

    identifier, comment = (text.encode("utf-8", "replace").decode("utf-8") for text in (identifier, comment))
    with tempfile.TemporaryDirectory() as folder:
        table = os.path.join(folder, "members.csv")
        with open(table, "w", encoding="utf-8", newline="") as stream:
            writer = csv.writer(stream)  # a table as any other program writes it
            writer.writerow(["id", "length_m", "left", "right", "EI_kNm2", "comment"])
            writer.writerow(
                [identifier, "6", "pinned", "pinned", "4200", comment] + (["=X()"] if extra else [])
            )
        try:
            summary = batch.run(table, os.path.join(folder, "out"), workers=1, capacity=False)
        except batch.TableError as error:  # a lone CR in a cell can make the table unreadable as CSV
            assert str(error).startswith("line "), error
            return
        with open(summary.results, encoding="utf-8", newline="") as stream:
            text = stream.read()
    assert _formula_cells(text) == []
    for _, identifier_, _, message in summary.errors:
        assert _shows_no_controls(terminal(identifier_)) and _shows_no_controls(terminal(message))
