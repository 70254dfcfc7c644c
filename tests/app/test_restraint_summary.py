"""The printed and JSON summaries of a case with an intermediate restraint (engine issue 16): the restraint's
reaction is worded beside the ends'. Invented case: two equal spans under a uniform load, whose middle
reaction is 1.25 q l (a handbook value of continuous beams, from memory)."""

import engine
from app.report import reaction_rows
from app.summary_json import summary_data
from app.units import units

CASE = {
    "length": 6.0,
    "EI": 4.2e6,
    "supports": {"left": "pinned", "right": "pinned"},
    "loads": [{"type": "uniform", "q": 2500.0}],
    "restraints": [{"x": 3.0, "translation": "fixed"}],
}


def test_reaction_rows_name_the_restraint():
    result = engine.solve(engine.Case.from_dict(CASE))
    rows = reaction_rows(result, units("si"))
    assert len(rows) == 3
    where, force, couple = rows[2]
    assert where == "restraint at x = 3.000 m"
    assert force == "9.375 kN up"  # 1.25 q l = 1.25 · 2.5 kN/m · 3 m, against the load (drawn downward)
    assert couple == "0 kN·m"


def test_json_summary_lists_the_restraint_reaction():
    case = engine.Case.from_dict(CASE)
    data = summary_data("invented", case, engine.solve(case))
    (inner,) = data["reactions"]["intermediate"]
    assert inner["x"] == 3.0
    assert abs(inner["force"] + 9375.0) < 1e-9
