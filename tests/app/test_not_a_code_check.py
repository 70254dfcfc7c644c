"""A member of timber, aluminium or a custom material: its utilisation is not a code check, and every output
says so (a danger caution, ``utilization_basis`` in ``solve --json``, ``--strict`` failing).

An independent audit (stop 35) found an aluminium CHS 114.3×5 (EN AW-6082 T6, 1 m pinned, 400 kN) at 0.932,
printed as any other utilisation, where EN 1999-1-1 §6.3.1's flexural buckling (class A, α = 0.20, λ̄0 = 0.10,
γ_M1 = 1.10; from memory) gives about 1.13. The members are invented.
"""

from __future__ import annotations

import json

import pytest

import engine
from app.summary_json import summary_data
from tests.app.test_cli import run_cli


def _case(material: dict, section: dict, N: float = 400e3) -> dict:
    return {
        "schema": 1,
        "length": 1.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": N,
        "loads": [],
        "section": section,
        "material": material,
    }


ALUMINIUM = _case({"name": "EN AW-6082 T6"}, {"name": "CHS 114.3x5"})
TIMBER = _case({"name": "GL24h"}, {"shape": "rectangle", "b": 0.115, "h": 0.315}, N=450e3)
STEEL = _case({"name": "S355"}, {"name": "CHS 114.3x5"})


@pytest.mark.parametrize("data", [ALUMINIUM, TIMBER], ids=["aluminium", "timber"])
def test_a_danger_caution_and_the_basis_say_it_is_not_a_code_check(data):
    case = engine.Case.from_dict(data)
    result = engine.solve(case)
    assert result.utilization < 1.0  # it would read as a pass
    (caution,) = [c for c in result.cautions if c.code == "not-a-code-check"]
    assert caution.level == "danger"
    assert "A utilisation below 1 is not a pass" in caution.message
    kind = result.material.kind
    expected = f"elastic bound only, not a code check ({kind})"
    assert summary_data("test", case, result)["utilization_basis"] == expected


def test_a_steel_member_is_a_code_check():
    case = engine.Case.from_dict(STEEL)
    result = engine.solve(case)
    assert "not-a-code-check" not in [c.code for c in result.cautions]
    assert summary_data("test", case, result)["utilization_basis"] == "code check"


def test_strict_fails_an_aluminium_member_below_1(tmp_path):
    """`solve --strict` exits 1 (a danger caution), though the utilisation is below 1; steel passes."""
    path = tmp_path / "alu.json"
    path.write_text(json.dumps(ALUMINIUM), encoding="utf-8")
    done = run_cli("solve", str(path), "--strict", "--json", cwd=tmp_path)
    assert done.returncode == 1, done.stderr
    assert json.loads(done.stdout)["utilization_basis"].startswith("elastic bound only")
    path.write_text(json.dumps(STEEL | {"axial_force": 100e3}), encoding="utf-8")
    assert run_cli("solve", str(path), "--strict", cwd=tmp_path).returncode == 0
