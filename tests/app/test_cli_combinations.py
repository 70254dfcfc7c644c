"""`strutscope solve` on a case with load cases: the governing combination of each check is named.

Reference: the engine's own ActionsResult for the same file (the command line only reports it). The demo's
values are invented.
"""

import json
from importlib import resources

import engine
from tests.app.test_cli import run_cli, strict_json

DEMO = resources.files("assets").joinpath("demo_wind_post_actions.json")


def engine_result():
    """The engine's result for the invented demo with actions."""
    return engine.solve(engine.Case.from_json(DEMO.read_text(encoding="utf-8")))


def test_solve_prints_the_governing_combination_per_check(tmp_path):
    """The summary lists the combinations and names the governing one of each check, as the engine says."""
    path = tmp_path / "actions.json"
    path.write_text(DEMO.read_text(encoding="utf-8"), encoding="utf-8")
    done = run_cli("solve", str(path), cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    out = done.stdout
    actions = engine_result().actions
    assert "Governing combination per check" in out
    for row in actions.governing:
        assert f" {row.combination} (" in out
    strength = actions.governing_for("strength")
    deflection = actions.governing_for("deflection")
    assert "strength and stability (headline):" in out
    line = next(line for line in out.splitlines() if "strength and stability (headline):" in line)
    assert f"{strength.combination} ({strength.value:.3f})" in line
    line = next(line for line in out.splitlines() if "deflection (service):" in line)
    assert f"{deflection.combination} ({deflection.value:.3f})" in line
    assert f"those of combination {actions.headline}" in out
    assert "1.35 G + 1.5 W" in out and "Superposition shown wrong" in out
    assert "load combinations are not checked" not in out


def test_solve_json_holds_the_combinations(tmp_path):
    """`solve --json` holds every combination and the governing one of each check, equal to the engine's."""
    path = tmp_path / "actions.json"
    path.write_text(DEMO.read_text(encoding="utf-8"), encoding="utf-8")
    done = run_cli("solve", str(path), "--json", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    data = strict_json(done.stdout)["combinations"]
    actions = engine_result().actions
    assert data["headline"] == actions.headline and data["rule"] == "en1990-6.10"
    assert [c["name"] for c in data["combinations"]] == [c.name for c in actions.combinations]
    assert data["combinations"][1]["factors"] == {"G": 1.35, "W": 1.5}
    assert {g["check"]: g["combination"] for g in data["governing"]} == {
        g.check: g.combination for g in actions.governing
    }
    assert json.loads(done.stdout)["utilization"] == actions.governing_for("strength").value
