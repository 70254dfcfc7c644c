"""The case file's JSON Schema (app.schema), checked with the general-purpose `jsonschema` package.

Reference: JSON Schema draft 2020-12 (json-schema.org, "JSON Schema Core" and "Validation", 2020-12), as the
`jsonschema` package implements it. The schema's rules come from the README's case file (schema 1); every
check below also asks the engine, so that the schema and the engine agree in both directions.
"""

import copy
import json
import re
from importlib import resources
from pathlib import Path

import jsonschema
import pytest
from hypothesis import HealthCheck, given, settings

import engine
from app.schema import SCHEMA_ID, case_schema, schema_text
from tests.app.test_cli import run_cli
from tests.strategies import cases, two_plane_cases

REPO_ROOT = Path(__file__).resolve().parents[2]


@pytest.fixture(scope="module")
def validator():
    """A draft 2020-12 validator of the case-file schema."""
    return jsonschema.Draft202012Validator(case_schema())


def demo_mapping():
    """The demo case file as JSON data."""
    return json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8"))


def readme_example():
    """The case-file example of the README ("Case file (JSON, schema 1)")."""
    text = (REPO_ROOT / "README.md").read_text(encoding="utf-8")
    block = re.search(r"\*\*Case file \(JSON, schema 1\)\.\*\*\s*```json\n(.*?)```", text, re.DOTALL)
    assert block is not None, "the README's case-file example was not found"
    return json.loads(block.group(1))


def engine_accepts(mapping) -> bool:
    """Whether the engine reads `mapping` as a case."""
    try:
        engine.Case.from_dict(mapping)
    except engine.CaseError:
        return False
    return True


def full_case():
    """A case using every top-level key and a preset bow (invented values)."""
    return {
        "schema": 1,
        "title": "Invented: every key",
        "length": 5.0,
        "EI": 5.0e6,
        "supports": {"left": {"translation": "fixed", "rotation": 2.0e6}, "right": "pinned"},
        "axial_force": 150e3,
        "loads": [
            {"type": "uniform", "q": 1.0e3, "start": 0.5, "end": 4.0},
            {"type": "linear", "q_start": 0.0, "q_end": 2.0e3},
            {"type": "point", "P": 3.0e3, "x": 2.0},
            {"type": "couple", "C": -1.0e3, "x": 5.0},
        ],
        "imperfection": {"preset": "span", "ratio": 300, "shape": "parabola", "direction": "negative"},
        "section": {"shape": "rhs", "h": 0.2, "b": 0.1, "t": 0.008, "manufacture": "cold-formed"},
        "axis": "minor",
        "material": {"E": 2.1e11, "fy": 3.55e8, "density": 7850, "name": "invented steel"},
        "stiffness_factor": 0.8,
        "check": {"method": "plastic", "gamma_M0": 1.05, "gamma_M1": 1.1, "deflection_limit": 300},
    }


def test_schema_is_a_valid_draft_2020_12_schema():
    """The schema itself passes the draft 2020-12 meta-schema and names its draft and identifier."""
    schema = case_schema()
    jsonschema.Draft202012Validator.check_schema(schema)
    assert schema["$schema"] == "https://json-schema.org/draft/2020-12/schema"
    assert schema["$id"] == SCHEMA_ID


def test_demo_case_and_readme_example_validate(validator):
    """The shipped demo case and the README's example both pass the schema (and the engine reads both)."""
    for mapping in (demo_mapping(), readme_example()):
        assert list(validator.iter_errors(mapping)) == []
        assert engine_accepts(mapping)


def test_case_using_every_key_validates_and_round_trips(validator):
    """A case with every key, and the engine's own to_dict() of it, both pass the schema."""
    mapping = full_case()
    assert engine_accepts(mapping)
    assert list(validator.iter_errors(mapping)) == []
    assert list(validator.iter_errors(engine.Case.from_dict(mapping).to_dict())) == []


@pytest.mark.parametrize(
    "section",
    [
        {"name": "IPE 300"},
        {"shape": "rolled_i", "h": 0.2, "b": 0.1, "tw": 0.0056, "tf": 0.0085, "r": 0.012},
        {"shape": "welded_i", "h": 0.4, "b": 0.2, "tw": 0.008, "tf": 0.012, "a": 0.004},
        {"shape": "chs", "D": 0.1143, "t": 0.005},
        {"shape": "rectangle", "b": 0.045, "h": 0.195},
        {"shape": "round", "D": 0.05},
        {"shape": "custom", "A": 3.0e-3, "I": 2.0e-5, "W_el": 2.0e-4, "W_pl": 2.3e-4, "A_v": 1.5e-3},
    ],
)
def test_every_section_form_validates(validator, section):
    """Each section form of the README passes the schema with a catalogued material, as in the engine."""
    mapping = {
        "length": 4.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "section": section,
        "material": {"name": "S355"},
    }
    assert engine_accepts(mapping)
    assert list(validator.iter_errors(mapping)) == []


def broken(change):
    """The valid `full_case` with `change` applied to a copy."""
    mapping = copy.deepcopy(full_case())
    change(mapping)
    return mapping


BROKEN = {
    "unknown top-level key": broken(lambda m: m.update(lenght=5.0)),
    "unknown load key": broken(lambda m: m["loads"][0].update(qq=1.0)),
    "unknown section key": broken(lambda m: m["section"].update(depth=0.2)),
    "length as text": broken(lambda m: m.update(length="5.0")),
    "negative length": broken(lambda m: m.update(length=-5.0)),
    "axial force as a boolean": broken(lambda m: m.update(axial_force=True)),
    "misspelt support": broken(lambda m: m["supports"].update(right="pined")),
    "negative spring": broken(lambda m: m["supports"]["left"].update(rotation=-1.0)),
    "missing supports": broken(lambda m: m.pop("supports")),
    "unknown load type": broken(lambda m: m["loads"][2].update(type="force")),
    "point load without x": broken(lambda m: m["loads"][2].pop("x")),
    "loads not a list": broken(lambda m: m.update(loads={"type": "uniform", "q": 1.0})),
    "preset with an amplitude": broken(lambda m: m["imperfection"].update(amplitude=0.01)),
    "span preset without ratio": broken(lambda m: m["imperfection"].pop("ratio")),
    "ratio without the span preset": broken(lambda m: m.update(imperfection={"shape": "sine", "ratio": 300})),
    "curve without a preset": broken(
        lambda m: m.update(imperfection={"shape": "sine", "amplitude": 0.01, "curve": "b"})
    ),
    "no stiffness at all": broken(lambda m: [m.pop(k) for k in ("EI", "section")]),
    "unknown check method": broken(lambda m: m["check"].update(method="ultimate")),
    "stiffness factor above 1": broken(lambda m: m.update(stiffness_factor=1.2)),
    "schema 2": broken(lambda m: m.update(schema=2)),
    "schema 1.5": broken(lambda m: m.update(schema=1.5)),
    "schema as text": broken(lambda m: m.update(schema="1")),
    "schema true": broken(lambda m: m.update(schema=True)),
    "title too long": broken(lambda m: m.update(title="x" * 201)),
    "title with an escape sequence": broken(lambda m: m.update(title="\x1b[31mred")),
    "title with a line break": broken(lambda m: m.update(title="one\ntwo")),
    "one load too many": broken(
        lambda m: m.update(loads=[{"type": "point", "P": 1.0, "x": 0.1 * (i + 1)} for i in range(51)])
    ),
}


def test_schema_one_point_zero_is_accepted_by_both(validator):
    """ "schema": 1.0 is the integer 1 for JSON Schema 2020-12 (zero fractional part) and the engine alike."""
    mapping = full_case() | {"schema": 1.0}
    assert case_schema()["properties"]["schema"] == {
        **case_schema()["properties"]["schema"],
        "const": 1,
        "type": "integer",
    }
    assert list(validator.iter_errors(mapping)) == []
    assert engine_accepts(mapping)


def test_schema_limits_are_the_engine_limits():
    """The schema's loads and title limits are engine.limits' (and the engine's title length)."""
    import app.schema as schema
    from engine import case, limits

    assert schema.MAX_LOADS == limits.MAX_LOADS
    assert schema.MAX_SEGMENTS == limits.MAX_SEGMENTS
    assert schema.MAX_TITLE == case._MAX_TITLE
    loads = case_schema()["properties"]["loads"]
    assert loads["maxItems"] == limits.MAX_LOADS
    assert f"at most {limits.MAX_LOADS}" in loads["description"]
    assert f"at most {limits.MAX_SEGMENTS} segments" in loads["description"]


@pytest.mark.parametrize("name", list(BROKEN))
def test_broken_case_is_rejected_by_schema_and_engine(validator, name):
    """Each broken case (unknown key, wrong type, range, combination) fails both the schema and the engine."""
    mapping = BROKEN[name]
    assert list(validator.iter_errors(mapping)) != [], name
    assert not engine_accepts(mapping), name


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(case=cases())
def test_schema_accepts_every_case_the_engine_accepts(validator, case):
    """Generated cases the engine reads pass the schema: it is never stricter than the engine."""
    mapping = engine.Case.from_dict(case).to_dict()
    assert list(validator.iter_errors(case)) == []
    assert list(validator.iter_errors(mapping)) == []


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(case=two_plane_cases())
def test_schema_accepts_every_two_plane_case_the_engine_accepts(validator, case):
    """Generated two-plane cases, and the invented two-plane demo, pass the schema; with out_of_plane too
    they are refused by both."""
    mapping = engine.Case.from_dict(case).to_dict()
    assert list(validator.iter_errors(case)) == []
    assert list(validator.iter_errors(mapping)) == []
    both = {**case, "out_of_plane": {"buckling_length": 2.0}}
    assert list(validator.iter_errors(both)) != []
    assert not engine_accepts(both)


def test_two_plane_demo_validates(validator):
    """The invented two-plane demo file passes the schema."""
    text = resources.files("assets").joinpath("demo_two_planes.json").read_text(encoding="utf-8")
    assert list(validator.iter_errors(json.loads(text))) == []


def test_schema_names_match_the_engine():
    """The schema's lists of names (supports, loads, bows, shapes, kinds, methods) are the engine's own."""
    import app.schema as schema
    from engine import case, checks, materials, sections

    assert schema.SUPPORT_NAMES == case.SUPPORT_NAMES
    assert schema.BOW_SHAPES == case.IMPERFECTION_SHAPES
    assert schema.BOW_PRESETS == case.IMPERFECTION_PRESETS
    assert schema.SECTION_SHAPES == sections.SHAPES
    assert schema.AXES == sections.AXES
    assert schema.MATERIAL_KINDS == materials.MATERIAL_KINDS
    assert schema.CHECK_METHODS == checks.METHODS
    assert set(schema.LOAD_TYPES) == {"uniform", "linear", "point", "couple"}
    described = case_schema()["$defs"]["section"]["oneOf"]
    assert [entry["properties"]["shape"]["const"] for entry in described[1:]] == list(sections.SHAPES)


def test_schema_command_prints_the_schema(tmp_path):
    """`strutscope schema` exits 0 and prints exactly the schema app.schema builds."""
    done = run_cli("schema", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    assert json.loads(done.stdout) == case_schema()
    assert json.loads(schema_text()) == case_schema()


def test_a_custom_section_with_its_torsion_keys_is_valid_against_the_schema():
    """The engine reads `It`, `Iw`, `doubly_symmetric` and `open_section` of a custom section
    (engine/custom_section.py): the published schema accepts such a case, and refuses a negative `It`."""
    case = {
        "schema": 1,
        "length": 4.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "section": {
            "shape": "custom",
            "A": 7.8e-3,
            "I": 5.7e-5,
            "W_el": 5.7e-4,
            "W_pl": 6.4e-4,
            "It": 5.9e-7,
            "Iw": 1.7e-7,
            "doubly_symmetric": True,
            "open_section": True,
        },
        "material": {"name": "S355"},
    }
    engine.Case.from_dict(case)  # the engine reads it
    jsonschema.validate(case, case_schema())
    case["section"]["It"] = -1.0
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate(case, case_schema())


def test_actions_demo_validates_and_names_match_the_engine(validator):
    """The invented demo with actions passes the schema, and the action names are the engine's own."""
    from app import schema_actions
    from engine import actions

    text = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text(encoding="utf-8")
    assert list(validator.iter_errors(json.loads(text))) == []
    assert schema_actions.ACTION_CATEGORIES == actions.KNOWN_CATEGORIES
    assert schema_actions.COMBINATION_RULES == actions.RULES
    assert schema_actions.SERVICE_KINDS == actions.SERVICE_KINDS
    assert schema_actions.ASCE_SYMBOLS == actions.ASCE_SYMBOLS
    assert schema_actions.MAX_ACTIONS == actions.MAX_ACTIONS
    broken = json.loads(text)
    broken["actions"][0]["colour"] = "red"
    assert list(validator.iter_errors(broken)) and not engine_accepts(broken)


def test_two_plane_actions_validate_and_match_the_engine(validator):
    """An action's second-plane loads (``actions[i].second_plane.loads``) pass the schema and the engine; an
    unknown key inside it fails both (invented case)."""
    from engine import actions
    from tests.support.action_cases import as_one_action, demo_data

    case = as_one_action(demo_data("demo_two_planes.json"), combinations=None)
    assert list(validator.iter_errors(case)) == [] and engine_accepts(case)
    schema_keys = case_schema()["properties"]["actions"]["items"]["properties"]
    assert tuple(schema_keys) == actions.ACTION_KEYS
    assert tuple(schema_keys["second_plane"]["properties"]) == actions.ACTION_PLANE_KEYS
    case["actions"][0]["second_plane"]["colour"] = "red"
    assert list(validator.iter_errors(case)) and not engine_accepts(case)
