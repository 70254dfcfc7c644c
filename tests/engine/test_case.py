"""Tests of engine.case: the case data model, its validation and JSON case files.

The expected file layout, key names, support names and defaults come from the project's
contract, DEVELOPERS.md, "Conventions", "Case file (JSON, schema 1)"; the ranges come from
the engine API spec. The end conditions of the named supports are common practice, no source.
Support stability is engine.solver.supports' business and is only checked here for being called.
"""

from __future__ import annotations

import copy
import dataclasses
import json
import math

import numpy as np
import pytest

import engine.solver.supports
from engine.case import (
    Case,
    CoupleLoad,
    EndSupport,
    Imperfection,
    LinearLoad,
    PointLoad,
    UniformLoad,
)
from engine.case_files import load_case, save_case
from engine.errors import CaseError

# The example case file of conventions.md, copied verbatim (its title says it is invented).
CONVENTIONS_EXAMPLE = """\
{
  "schema": 1,
  "title": "Invented example: façade wind post, level 2",
  "length": 6.0,
  "EI": 4.2e6,
  "supports": {"left": "pinned", "right": "pinned"},
  "axial_force": 350e3,
  "loads": [
    {"type": "uniform", "q": 2.5e3},
    {"type": "uniform", "q": 1.0e3, "start": 1.0, "end": 3.5},
    {"type": "linear", "q_start": 0.0, "q_end": 4.0e3, "start": 0.0, "end": 6.0},
    {"type": "point", "P": 7.0e3, "x": 2.0},
    {"type": "couple", "C": -6.0e3, "x": 6.0}
  ],
  "imperfection": {"shape": "sine", "amplitude": 0.02}
}
"""

PINNED = EndSupport(translation="fixed", rotation="free")
FIXED = EndSupport(translation="fixed", rotation="fixed")


def example() -> dict:
    """Return a fresh copy of the conventions example as a mapping."""
    return json.loads(CONVENTIONS_EXAMPLE)


def simple_case(**changes) -> Case:
    """Return a pinned-pinned 6 m case (invented values) with the given fields replaced."""
    fields = {"length": 6.0, "EI": 4.2e6, "left": PINNED, "right": PINNED}
    fields.update(changes)
    return Case(**fields)


def error_of(mapping) -> str:
    """Return the message of the CaseError that Case.from_dict raises for ``mapping``."""
    with pytest.raises(CaseError) as caught:
        Case.from_dict(mapping)
    return str(caught.value)


# ----------------------------------------------------------------------------- the example


def test_conventions_example_parses():
    """The example file of conventions.md gives the supports, loads and bow it spells out."""
    case = Case.from_json(CONVENTIONS_EXAMPLE)
    assert case.title == "Invented example: façade wind post, level 2"
    assert (case.length, case.EI, case.axial_force) == (6.0, 4.2e6, 350e3)
    assert case.left == case.right == EndSupport.named("pinned")
    assert case.loads == (
        UniformLoad(q=2.5e3),
        UniformLoad(q=1.0e3, start=1.0, end=3.5),
        LinearLoad(q_start=0.0, q_end=4.0e3, start=0.0, end=6.0),
        PointLoad(P=7.0e3, x=2.0),
        CoupleLoad(C=-6.0e3, x=6.0),
    )
    assert case.imperfection == Imperfection(shape="sine", amplitude=0.02)
    assert case.schema == 1


def test_conventions_example_writes_back_unchanged():
    """to_dict of the conventions example gives back exactly the mapping that was read."""
    assert Case.from_json(CONVENTIONS_EXAMPLE).to_dict() == example()


def test_from_dict_leaves_the_mapping_alone():
    """from_dict does not modify the mapping it reads."""
    mapping = example()
    untouched = copy.deepcopy(mapping)
    Case.from_dict(mapping)
    assert mapping == untouched


def test_optional_keys_take_their_defaults():
    """A file with only length, EI and supports gets schema 1, no title, P = 0, no loads, no bow."""
    case = Case.from_dict({"length": 3, "EI": 1e6, "supports": {"left": "fixed", "right": "free"}})
    assert case == Case(length=3.0, EI=1e6, left=FIXED, right=EndSupport(translation="free", rotation="free"))
    assert (case.schema, case.title, case.axial_force, case.loads) == (1, "", 0.0, ())
    assert case.imperfection == Imperfection(shape="none", amplitude=0.0)


# ----------------------------------------------------------------------------- supports

# End conditions of the named supports: common practice, no source (as listed in conventions.md).
NAMED = {
    "pinned": ("fixed", "free"),
    "fixed": ("fixed", "fixed"),
    "free": ("free", "free"),
    "guided": ("free", "fixed"),
}


@pytest.mark.parametrize("name", sorted(NAMED))
def test_named_supports_have_their_restraints(name):
    """EndSupport.named gives the translation and rotation restraints of each named support."""
    support = EndSupport.named(name)
    assert (support.translation, support.rotation) == NAMED[name]
    assert support.name == name


def test_unnamed_support_has_no_name():
    """A support with a spring has name None."""
    assert EndSupport(translation=1.0e6, rotation="free").name is None


def test_unknown_support_name_is_refused():
    """EndSupport.named refuses an unknown name and suggests the nearest one."""
    with pytest.raises(CaseError, match=r"name: 'pined' is not a support name \(did you mean 'pinned'\?\)"):
        EndSupport.named("pined")


# Every support form on the right end; the left end is fixed so that every set is stable.
SUPPORT_FORMS = [
    ("pinned", "pinned"),
    ("fixed", "fixed"),
    ("free", "free"),
    ("guided", "guided"),
    ({"translation": 2.0e6, "rotation": "free"}, {"translation": 2.0e6, "rotation": "free"}),
    ({"translation": "fixed", "rotation": 5.0e4}, {"translation": "fixed", "rotation": 5.0e4}),
    ({"translation": 1.0e5, "rotation": 3.0e3}, {"translation": 1.0e5, "rotation": 3.0e3}),
    ({"translation": "free", "rotation": 0}, {"translation": "free", "rotation": 0.0}),
    ({"translation": 0.0, "rotation": "fixed"}, {"translation": 0.0, "rotation": "fixed"}),
    # The object form of a named support is written back as the name.
    ({"translation": "fixed", "rotation": "free"}, "pinned"),
    ({"translation": "free", "rotation": "fixed"}, "guided"),
    ({"translation": "fixed", "rotation": "fixed"}, "fixed"),
    ({"translation": "free", "rotation": "free"}, "free"),
]


@pytest.mark.parametrize(("given", "written"), SUPPORT_FORMS, ids=[repr(g) for g, _ in SUPPORT_FORMS])
def test_support_forms_round_trip(given, written):
    """Every support form reads, writes in its canonical form and reads back to an equal case."""
    mapping = {"length": 4.0, "EI": 2.0e6, "supports": {"left": "fixed", "right": given}}
    case = Case.from_dict(mapping)
    data = case.to_dict()
    assert data["supports"] == {"left": "fixed", "right": written}
    assert Case.from_dict(data) == case
    assert Case.from_json(case.to_json()) == case


def test_support_springs_are_stored_as_float():
    """Integer spring stiffnesses are stored as floats."""
    support = EndSupport(translation=1000, rotation=0)
    assert (support.translation, support.rotation) == (1000.0, 0.0)
    assert type(support.translation) is float and type(support.rotation) is float


# ----------------------------------------------------------------------------- loads

LOAD_FORMS = [
    UniformLoad(q=2.5e3),
    UniformLoad(q=-1.0e3, start=1.0),
    UniformLoad(q=1.0e3, end=3.5),
    UniformLoad(q=1.0e3, start=1.0, end=3.5),
    LinearLoad(q_start=0.0, q_end=4.0e3),
    LinearLoad(q_start=4.0e3, q_end=-1.0e3, start=0.5, end=6.0),
    PointLoad(P=7.0e3, x=2.0),
    PointLoad(P=-1.0, x=0.0),
    CoupleLoad(C=-6.0e3, x=6.0),
    CoupleLoad(C=2.0e3, x=0.0),
]


@pytest.mark.parametrize("load", LOAD_FORMS, ids=repr)
def test_load_forms_round_trip(load):
    """Every load type, with and without start/end, reads back equal from to_dict and to_json."""
    case = simple_case(loads=(load,))
    assert Case.from_dict(case.to_dict()) == case
    assert Case.from_json(case.to_json()) == case


def test_load_to_dict_leaves_out_unset_span():
    """to_dict writes the type first and leaves out start and end when they are None."""
    case = simple_case(loads=(UniformLoad(q=1.0), LinearLoad(q_start=1.0, q_end=2.0, end=3.0)))
    first, second = case.to_dict()["loads"]
    assert list(first) == ["type", "q"]
    assert list(second) == ["type", "q_start", "q_end", "end"]


def test_null_start_and_end_mean_the_member_ends():
    """A JSON null for start or end is read as None, the end of the member."""
    mapping = example()
    mapping["loads"] = [{"type": "uniform", "q": 1.0, "start": None, "end": None}]
    assert Case.from_dict(mapping).loads == (UniformLoad(q=1.0),)


def test_load_types_are_class_attributes():
    """Each load class names its type, and the type is not a dataclass field."""
    assert [cls.type for cls in (UniformLoad, LinearLoad, PointLoad, CoupleLoad)] == [
        "uniform",
        "linear",
        "point",
        "couple",
    ]
    assert "type" not in {f.name for f in dataclasses.fields(UniformLoad)}


def test_span_resolves_the_defaults():
    """span(length) resolves start None to 0 and end None to the length."""
    assert UniformLoad(q=1.0).span(6.0) == (0.0, 6.0)
    assert LinearLoad(q_start=1.0, q_end=0.0, start=1.5).span(6.0) == (1.5, 6.0)
    assert UniformLoad(q=1.0, end=2.0).span(6.0) == (0.0, 2.0)


def test_loads_are_stored_as_a_tuple_of_floats():
    """A list of loads is stored as a tuple, and integer inputs are stored as floats."""
    case = simple_case(length=6, EI=4200000, axial_force=1000, loads=[PointLoad(P=7000, x=2)])
    assert case.loads == (PointLoad(P=7000.0, x=2.0),)
    assert type(case.loads) is tuple
    values = (case.length, case.EI, case.axial_force, case.loads[0].P, case.loads[0].x)
    assert all(type(value) is float for value in values)


def test_numpy_numbers_are_stored_as_python_floats():
    """numpy scalars are accepted and stored as Python floats."""
    case = simple_case(length=np.float64(6.0), EI=np.int64(4200000))
    assert type(case.length) is float and type(case.EI) is float
    assert case == simple_case()


# ----------------------------------------------------------------------------- bow


@pytest.mark.parametrize("shape", ["none", "sine", "parabola", "sway", "mode"])
@pytest.mark.parametrize("amplitude", [0.012, -0.012])
def test_bow_shapes_round_trip(shape, amplitude):
    """Every bow shape, with either sign of amplitude, reads back equal."""
    case = simple_case(imperfection=Imperfection(shape=shape, amplitude=amplitude))
    assert case.to_dict()["imperfection"] == {"shape": shape, "amplitude": amplitude}
    assert Case.from_dict(case.to_dict()) == case


def test_no_bow_keeps_its_amplitude():
    """Shape 'none' with a nonzero amplitude is allowed and keeps the amplitude as given."""
    mapping = example()
    mapping["imperfection"] = {"shape": "none", "amplitude": 0.03}
    assert Case.from_dict(mapping).imperfection == Imperfection(shape="none", amplitude=0.03)


def test_bow_amplitude_is_limited_even_without_a_bow():
    """The amplitude limit |a| <= L/10 applies whatever the shape."""
    with pytest.raises(CaseError, match=r"imperfection\.amplitude: 0\.7 m"):
        simple_case(imperfection=Imperfection(shape="none", amplitude=0.7))


def test_bow_amplitude_limit_is_inclusive():
    """An amplitude of exactly L/10 is accepted."""
    assert simple_case(imperfection=Imperfection(shape="sine", amplitude=-0.6)).imperfection.amplitude == -0.6


# ----------------------------------------------------------------------------- bad input


def set_path(mapping, path, value):
    """Set the value at a dotted path such as ``loads.2.x`` (list indices as numbers)."""
    *parents, last = path.split(".")
    target = mapping
    for key in parents:
        target = target[int(key)] if isinstance(target, list) else target[key]
    target[int(last) if isinstance(target, list) else last] = value


def delete_path(mapping, path):
    """Delete the key at a dotted path."""
    *parents, last = path.split(".")
    target = mapping
    for key in parents:
        target = target[int(key)] if isinstance(target, list) else target[key]
    del target[last]


# (mutation of the conventions example, text the CaseError message must contain).
# Loads of the example: 0 uniform, 1 uniform 1.0-3.5, 2 linear 0-6, 3 point at 2, 4 couple at 6.
BAD_INPUT = [
    (("set", "length", -1.0), "length: -1.0 m must be >= 0.001 and <= 1000 m"),
    (("set", "length", 0), "length: 0.0 m must be >= 0.001 and <= 1000 m"),
    (("set", "length", 1000.5), "length: 1000.5 m must be >= 0.001 and <= 1000 m"),
    (("set", "EI", 0.0), "EI: 0.0 N·m² must be >= 0.001 and <= 1e+16 N·m²"),
    (("set", "EI", 2e16), "EI: 2e+16 N·m² must be >= 0.001 and <= 1e+16"),
    (("set", "EI", 1e-4), "EI: 0.0001 N·m² must be >= 0.001"),
    (("set", "axial_force", -2e12), "axial_force: -2000000000000.0 N must be between -1e+12 and 1e+12 N"),
    (("set", "title", 5), "title: 5 is not text"),
    (("set", "title", "x" * 201), "title: text of 201 characters is too long; at most 200"),
    (("delete", "length"), "length: required key is missing"),
    (("delete", "EI"), "EI: required key is missing"),
    (("delete", "supports"), "supports: required key is missing"),
    (("set", "supports", "pinned"), "supports: 'pinned' is not an object"),
    (("delete", "supports.right"), "supports.right: required key is missing"),
    (("set", "supports.rigth", "pinned"), "supports: unknown key 'rigth' (did you mean 'right'?)"),
    (
        ("set", "supports.left", "pined"),
        "supports.left: 'pined' is not a support name (did you mean 'pinned'?)",
    ),
    (("set", "supports.left", 3), "supports.left: 3 is not allowed; it must be a support name"),
    (
        ("set", "supports.left", {"translation": "fix", "rotation": "free"}),
        "supports.left.translation: 'fix' is not a restraint (did you mean 'fixed'?)",
    ),
    (
        ("set", "supports.left", {"translation": -1, "rotation": "free"}),
        "supports.left.translation: -1.0 N/m must be >= 0 and <= 1e+18 N/m",
    ),
    (
        ("set", "supports.right", {"translation": "fixed", "rotation": 1e19}),
        "supports.right.rotation: 1e+19 N·m/rad must be >= 0 and <= 1e+18 N·m/rad",
    ),
    (
        ("set", "supports.right", {"translation": "fixed", "rotation": None}),
        "supports.right.rotation: None is not allowed; it must be 'fixed', 'free' or a spring",
    ),
    (("set", "supports.right", {"translation": "fixed"}), "supports.right.rotation: required key is missing"),
    (
        ("set", "supports.right", {"translation": "fixed", "rotaton": "free"}),
        "supports.right: unknown key 'rotaton' (did you mean 'rotation'?)",
    ),
    (("set", "loads", {"type": "uniform", "q": 1.0}), "loads: {'type': 'uniform', 'q': 1.0} is not a list"),
    (("set", "loads.1", 5), "loads[1]: 5 is not an object"),
    (("delete", "loads.0.type"), "loads[0].type: required key is missing"),
    (
        ("set", "loads.0.type", "unifrom"),
        "loads[0].type: 'unifrom' is not a load type (did you mean 'uniform'?)",
    ),
    (
        ("set", "loads.0.type", "distributed"),
        "loads[0].type: 'distributed' is not a load type; allowed: 'uniform'",
    ),
    (("delete", "loads.0.q"), "loads[0].q: required key is missing"),
    (("delete", "loads.2.q_end"), "loads[2].q_end: required key is missing"),
    (("delete", "loads.3.x"), "loads[3].x: required key is missing"),
    (("set", "loads.0.qq", 1.0), "loads[0]: unknown key 'qq' (did you mean 'q'?)"),
    (("set", "loads.2.qend", 1.0), "loads[2]: unknown key 'qend' (did you mean 'q_end'?)"),
    (("set", "loads.3.F", 1.0), "loads[3]: unknown key 'F'; allowed keys: 'type', 'P', 'x'"),
    (("set", "loads.0.q", 2e12), "loads[0].q: 2000000000000.0 N/m must be between -1e+12 and 1e+12 N/m"),
    (("set", "loads.2.q_start", -3e12), "loads[2].q_start: -3000000000000.0 N/m must be between"),
    (("set", "loads.3.P", "7 kN"), "loads[3].P: '7 kN' is not a number"),
    (("set", "loads.3.P", 1.5e12), "loads[3].P: 1500000000000.0 N must be between -1e+12 and 1e+12 N"),
    (("set", "loads.4.C", -2e13), "loads[4].C: -20000000000000.0 N·m must be between -1e+13 and 1e+13 N·m"),
    (("set", "loads.3.x", 7.5), "loads[3].x: 7.5 m lies outside the member (0 to 6 m)"),
    (("set", "loads.4.x", -0.5), "loads[4].x: -0.5 m lies outside the member (0 to 6 m)"),
    (("set", "loads.1.start", -1.0), "loads[1].start: -1.0 m lies outside the member (0 to 6 m)"),
    (("set", "loads.1.end", 6.5), "loads[1].end: 6.5 m lies outside the member (0 to 6 m)"),
    (("set", "loads.1.start", 3.5), "loads[1].start: 3.5 m must be less than end (3.5 m)"),
    (("set", "loads.2.start", 6.0), "loads[2].start: 6.0 m must be less than end (6.0 m)"),
    (("set", "loads.1.end", 0.5), "loads[1].start: 1.0 m must be less than end (0.5 m)"),
    (("set", "imperfection", "sine"), "imperfection: 'sine' is not an object"),
    (
        ("set", "imperfection.shape", "sin"),
        "imperfection.shape: 'sin' is not a bow shape (did you mean 'sine'?)",
    ),
    (("set", "imperfection.shape", 1), "imperfection.shape: 1 is not a bow shape"),
    (
        ("set", "imperfection.amplitude", 0.7),
        "imperfection.amplitude: 0.7 m is too large; |amplitude| must be <= length/10 = 0.6 m",
    ),
    (("set", "imperfection.amplitude", "0.02"), "imperfection.amplitude: '0.02' is not a number"),
    (
        ("set", "imperfection.amplitud", 0.01),
        "imperfection: unknown key 'amplitud' (did you mean 'amplitude'?)",
    ),
]


def mutated(mutation) -> dict:
    """Return the conventions example with one mutation ("set" or "delete" at a dotted path) applied."""
    mapping = example()
    kind, path, *value = mutation
    if kind == "set":
        set_path(mapping, path, *value)
    else:
        delete_path(mapping, path)
    return mapping


@pytest.mark.parametrize(("mutation", "expected"), BAD_INPUT, ids=[m[1] + ":" + m[0] for m, _ in BAD_INPUT])
def test_bad_input_names_the_field(mutation, expected):
    """Each kind of bad input gives a CaseError naming the field path, the value and what is allowed."""
    assert expected in error_of(mutated(mutation))


def test_error_message_of_the_spec_example():
    """A point load beyond the end reads exactly like the example message of the spec."""
    mapping = example()
    mapping["loads"] = [
        {"type": "uniform", "q": 1.0},
        {"type": "uniform", "q": 2.0},
        {"type": "point", "P": 1.0, "x": 7.5},
    ]
    assert error_of(mapping) == "loads[2].x: 7.5 m lies outside the member (0 to 6 m)"


def test_open_start_beyond_the_member_end_is_refused():
    """A load with a start at the member's end and no end covers nothing and is refused."""
    mapping = example()
    mapping["loads"] = [{"type": "uniform", "q": 1.0, "start": 6.0}]
    assert error_of(mapping).startswith("loads[0].start: 6.0 m must be less than the end of the load")


def test_open_end_at_the_member_start_is_refused():
    """A load with an end at x = 0 and no start covers nothing and is refused."""
    mapping = example()
    mapping["loads"] = [{"type": "linear", "q_start": 1.0, "q_end": 2.0, "end": 0.0}]
    assert error_of(mapping).startswith("loads[0].end: 0.0 m must be greater than the start (0.0 m)")


def test_case_error_is_a_value_error():
    """CaseError can be caught as a ValueError."""
    with pytest.raises(ValueError):
        Case.from_dict(mutated(("set", "length", -1.0)))


# Number fields of the example, by file path and by the path the message must start with.
NUMBER_FIELDS = [
    ("length", "length"),
    ("EI", "EI"),
    ("axial_force", "axial_force"),
    ("loads.0.q", "loads[0].q"),
    ("loads.1.start", "loads[1].start"),
    ("loads.1.end", "loads[1].end"),
    ("loads.2.q_start", "loads[2].q_start"),
    ("loads.2.q_end", "loads[2].q_end"),
    ("loads.3.P", "loads[3].P"),
    ("loads.3.x", "loads[3].x"),
    ("loads.4.C", "loads[4].C"),
    ("loads.4.x", "loads[4].x"),
    ("imperfection.amplitude", "imperfection.amplitude"),
]
NOT_NUMBERS = [
    (math.nan, "nan"),
    (math.inf, "inf"),
    (-math.inf, "-inf"),
    (True, "True"),
    (False, "False"),
    ("6.0", "'6.0'"),
    ([1.0], "[1.0]"),
    (10**400, "too large"),
    (np.bool_(True), "True"),
]


@pytest.mark.parametrize(("file_path", "message_path"), NUMBER_FIELDS)
@pytest.mark.parametrize(("value", "shown"), NOT_NUMBERS, ids=repr)
def test_numbers_must_be_finite_reals(file_path, message_path, value, shown):
    """NaN, infinity, booleans, strings, lists and out-of-float integers are refused for every number."""
    message = error_of(mutated(("set", file_path, value)))
    assert message.startswith(message_path + ": ")
    assert shown in message


def test_none_is_refused_where_a_number_is_required():
    """None is refused for a required number (it only means 'the member end' for start and end)."""
    assert error_of(mutated(("set", "loads.3.x", None))).startswith("loads[3].x: None is not a number")


@pytest.mark.parametrize("value", [math.nan, math.inf, True, "1e5"], ids=repr)
def test_spring_must_be_a_finite_real(value):
    """A spring stiffness that is NaN, infinite, boolean or a string is refused with its path."""
    mapping = mutated(("set", "supports.right", {"translation": value, "rotation": "free"}))
    assert error_of(mapping).startswith("supports.right.translation: ")


def test_json_nan_literal_is_refused():
    """A NaN literal in the JSON text is refused as a non-finite number, naming the field."""
    text = CONVENTIONS_EXAMPLE.replace('"length": 6.0', '"length": NaN')
    with pytest.raises(CaseError, match=r"^length: nan m is not finite"):
        Case.from_json(text)


def test_unknown_top_level_key_suggests_the_near_match():
    """A misspelt top-level key is refused and the message suggests the right key."""
    mapping = example()
    mapping["lenght"] = mapping.pop("length")
    message = error_of(mapping)
    assert message.startswith("case: unknown key 'lenght' (did you mean 'length'?)")


def test_key_suggestion_ignores_case():
    """A key differing only in letter case is suggested (ei -> EI)."""
    mapping = example()
    mapping["ei"] = mapping.pop("EI")
    assert "unknown key 'ei' (did you mean 'EI'?)" in error_of(mapping)


@pytest.mark.parametrize("schema", [2, 0, "1", 1.5, 1.0000001, True, None, float("nan")], ids=repr)
def test_unknown_schema_is_refused(schema):
    """Any schema other than the integer 1 is refused before the other keys are looked at."""
    mapping = example()
    mapping["schema"] = schema
    mapping["future_key"] = 1
    assert error_of(mapping).startswith("schema: ")
    assert "not a known case-file schema version" in error_of(mapping)


def test_schema_one_point_zero_is_the_integer_one():
    """ "schema": 1.0 is read as 1, as JSON Schema draft 2020-12 counts it (the published schema agrees)."""
    mapping = example()
    mapping["schema"] = 1.0
    case = Case.from_dict(mapping)
    assert case.schema == 1 and type(case.schema) is int
    assert Case.from_json(json.dumps(mapping)).to_dict()["schema"] == 1


@pytest.mark.parametrize("mapping", [[], "case", None, 6.0], ids=repr)
def test_case_must_be_an_object(mapping):
    """A case that is not a mapping is refused."""
    assert error_of(mapping).startswith("case: ")


# ----------------------------------------------------------------------------- positions

# Tolerance of positions: 1e-9 of the length, from the engine API spec.


def test_position_just_beyond_an_end_is_snapped_onto_it():
    """A position within 1e-9 L outside the member is moved onto the end."""
    loads = (PointLoad(P=1.0, x=6.0 + 1e-12), UniformLoad(q=1.0, start=-1e-12, end=6.0 + 2e-9))
    case = simple_case(loads=loads)
    assert case.loads == (PointLoad(P=1.0, x=6.0), UniformLoad(q=1.0, start=0.0, end=6.0))


def test_position_beyond_the_tolerance_is_refused():
    """A position 1e-6 L beyond the end is outside the member."""
    with pytest.raises(CaseError, match=r"^loads\[0\]\.x: .* lies outside the member \(0 to 6 m\)"):
        simple_case(loads=(CoupleLoad(C=1.0, x=6.0 + 6e-6),))


def test_positions_at_the_ends_are_accepted():
    """Loads exactly at x = 0 and x = L are on the member."""
    loads = (
        PointLoad(P=1.0, x=0.0),
        CoupleLoad(C=1.0, x=6.0),
        LinearLoad(q_start=0.0, q_end=1.0, start=0.0, end=6.0),
    )
    assert simple_case(loads=loads).loads == loads


# ----------------------------------------------------------------------------- direct construction


@pytest.mark.parametrize(
    ("build", "expected"),
    [
        (lambda: UniformLoad(q=math.nan), "q: nan N/m is not finite"),
        (lambda: UniformLoad(q=1.0, start=2.0, end=1.0), "start: 2.0 m must be less than end (1.0 m)"),
        (lambda: LinearLoad(q_start="1", q_end=2.0), "q_start: '1' is not a number"),
        (lambda: PointLoad(P=1.0, x=True), "x: True is a boolean, not a number"),
        (lambda: CoupleLoad(C=math.inf, x=1.0), "C: inf N·m is not finite"),
        (
            lambda: EndSupport(translation="pinned", rotation="free"),
            "translation: 'pinned' is not a restraint",
        ),
        (lambda: EndSupport(translation="fixed", rotation=-5.0), "rotation: -5.0 N·m/rad must be >= 0"),
        (lambda: Imperfection(shape="bow"), "shape: 'bow' is not a bow shape"),
        (lambda: Imperfection(shape="sine", amplitude=math.nan), "amplitude: nan m is not finite"),
        (lambda: simple_case(left="pinned"), "left: 'pinned' is not an EndSupport"),
        (
            lambda: simple_case(loads=PointLoad(P=1.0, x=1.0)),
            "loads: PointLoad(P=1.0, x=1.0) is not a tuple or list",
        ),
        (
            lambda: simple_case(loads=(PointLoad(P=1.0, x=1.0), {"type": "point"})),
            "loads[1]: {'type': 'point'} is not a load",
        ),
        (
            lambda: simple_case(loads=(PointLoad(P=1.0, x=9.0),)),
            "loads[0].x: 9.0 m lies outside the member (0 to 6 m)",
        ),
        (lambda: simple_case(imperfection="sine"), "imperfection: 'sine' is not an Imperfection"),
        (lambda: simple_case(schema=2), "schema: 2 is not a known case-file schema version"),
        (lambda: simple_case(title=None), "title: None is not text"),
        (lambda: simple_case(length=-1.0), "length: -1.0 m must be >= 0.001 and <= 1000 m"),
    ],
    ids=lambda item: item if isinstance(item, str) else None,
)
def test_direct_construction_is_validated(build, expected):
    """Building the objects in Python validates them like a case file, naming the field."""
    with pytest.raises(CaseError) as caught:
        build()
    assert str(caught.value).startswith(expected)


def test_replace_validates_again():
    """dataclasses.replace checks the new case, here a point load left beyond a shortened member."""
    case = simple_case(loads=(UniformLoad(q=1.0), PointLoad(P=1.0, x=2.0)))
    assert dataclasses.replace(case, length=2.0).length == 2.0
    with pytest.raises(CaseError, match=r"^loads\[1\]\.x: 2\.0 m lies outside the member \(0 to 1\.5 m\)"):
        dataclasses.replace(case, length=1.5)


def test_objects_are_frozen_and_keyword_only():
    """Case objects cannot be changed in place and refuse positional arguments."""
    case = simple_case()
    with pytest.raises(dataclasses.FrozenInstanceError):
        case.length = 5.0  # type: ignore[misc]
    with pytest.raises(TypeError):
        EndSupport("fixed", "free")  # type: ignore[misc]


def test_equal_cases_hash_equal():
    """Equal cases are equal and hash alike, so a case can key a cache."""
    first, second = Case.from_json(CONVENTIONS_EXAMPLE), Case.from_dict(example())
    assert first == second and hash(first) == hash(second)
    assert first != dataclasses.replace(first, axial_force=0.0)


# ----------------------------------------------------------------------------- stability hook


def test_check_stable_is_called(monkeypatch):
    """Case construction hands the finished case to engine.solver.supports.check_stable."""
    seen = []
    monkeypatch.setattr(engine.solver.supports, "check_stable", seen.append)
    case = Case.from_dict(example())
    assert seen == [case]
    assert seen[0].loads == case.loads


def test_check_stable_error_passes_through(monkeypatch):
    """A CaseError raised by check_stable reaches the caller of from_dict unchanged."""

    def refuse(case):
        raise CaseError("supports: refused by the test")

    monkeypatch.setattr(engine.solver.supports, "check_stable", refuse)
    assert error_of(example()) == "supports: refused by the test"


# ----------------------------------------------------------------------------- JSON and files


def test_json_round_trip():
    """to_json and from_json give back an equal case, keeping non-ASCII text as it is."""
    case = Case.from_json(CONVENTIONS_EXAMPLE)
    text = case.to_json()
    assert "façade" in text
    assert Case.from_json(text) == case
    assert Case.from_json(case.to_json(indent=None)) == case
    assert "\n" not in case.to_json(indent=None)


def test_from_json_accepts_utf8_bytes():
    """from_json reads UTF-8 bytes as well as text."""
    assert Case.from_json(CONVENTIONS_EXAMPLE.encode("utf-8")) == Case.from_json(CONVENTIONS_EXAMPLE)


def test_file_round_trip(tmp_path):
    """save_case writes a UTF-8 file ending in a newline that load_case reads back equal."""
    case = Case.from_json(CONVENTIONS_EXAMPLE)
    path = tmp_path / "post.json"
    save_case(case, path)
    raw = path.read_bytes()
    assert raw.endswith(b"}\n")
    assert "façade".encode() in raw
    assert load_case(path) == case
    assert load_case(str(path)) == case


@pytest.mark.parametrize(
    "text",
    ['{"length": 6.0,', "", "not json", '{"length": 6.0} trailing', b"\xff\xfe\x00"],
    ids=repr,
)
def test_invalid_json_is_a_case_error(text):
    """Text that is not JSON gives a CaseError, not a json.JSONDecodeError."""
    with pytest.raises(CaseError) as caught:
        Case.from_json(text)
    assert not isinstance(caught.value, json.JSONDecodeError)
    assert str(caught.value).startswith("case: ")


def test_invalid_json_names_line_and_column():
    """The JSON syntax error message gives the line and column."""
    with pytest.raises(CaseError, match=r"^case: not valid JSON: .* at line 3 column"):
        Case.from_json('{\n  "length": 6.0,\n  "EI" 4.2e6\n}')


def test_repeated_key_is_refused():
    """A key given twice in one JSON object is refused instead of silently keeping the last."""
    text = CONVENTIONS_EXAMPLE.replace('"length": 6.0,', '"length": 6.0,\n  "length": 5.0,')
    with pytest.raises(CaseError, match=r"key 'length' is given twice"):
        Case.from_json(text)


def test_load_case_of_a_bad_file_is_a_case_error(tmp_path):
    """load_case of a file that is not valid JSON gives a CaseError."""
    path = tmp_path / "broken.json"
    path.write_text('{"schema": 1,', encoding="utf-8")
    with pytest.raises(CaseError, match=r"^case: not valid JSON"):
        load_case(path)


def test_load_case_of_a_missing_file_is_an_os_error(tmp_path):
    """load_case of a missing file raises the OSError of the file system, not a CaseError."""
    with pytest.raises(FileNotFoundError):
        load_case(tmp_path / "absent.json")


# ----------------------------------------------------------------------------- cache key


def test_without_axial_force_is_the_case_at_zero_force_and_the_cache_key():
    """The case without its axial force equals the case rebuilt at N = 0; solves at any N share one entry."""
    from engine import prepared

    case = Case.from_dict(example())
    assert case.axial_force != 0.0
    twin = case.without_axial_force()
    rebuilt = dataclasses.replace(case, axial_force=0.0)
    assert twin == rebuilt and hash(twin) == hash(rebuilt) and twin.axial_force == 0.0
    assert case.axial_force == Case.from_dict(example()).axial_force  # the original is untouched
    assert rebuilt.without_axial_force() is rebuilt
    assert prepared.prepare(case) is prepared.prepare(dataclasses.replace(case, axial_force=-1.0e3))
    assert prepared.prepare(case) is not prepared.prepare(dataclasses.replace(case, length=case.length + 1.0))
