"""Load-case inputs that used to lose a check without a word (an independent audit).

- a table of factors with service rows only: no strength check was made and none was said; it is refused;
- a table row whose factors are all 0: a combination without any load; refused;
- no service combination (``service: []``, or a table without service rows): the deflection is not checked,
  and a warning now says so (EN 1990 §6.5, from memory: deflections are checked on service combinations).
Invented member.
"""

from __future__ import annotations

import pytest

import engine

_BASE = {
    "title": "Invented wind post",
    "length": 6.0,
    "supports": {"left": "pinned", "right": "pinned"},
    "section": {"name": "HEB 200"},
    "material": {"name": "S355"},
    "actions": [
        {"name": "G", "category": "permanent", "axial_force": 240e3},
        {"name": "W", "category": "wind", "axial_force": -20e3, "loads": [{"type": "uniform", "q": 2e3}]},
    ],
}


def _case(combinations):
    return engine.Case.from_dict(dict(_BASE, combinations=combinations))


def test_a_table_of_service_rows_only_is_refused():
    table = [{"name": "SLS", "state": "service", "factors": {"G": 1.0, "W": 1.0}}]
    with pytest.raises(engine.CaseError, match=r"combinations\.table: every row is a service combination"):
        _case({"rule": "table", "table": table})


def test_a_table_row_of_zero_factors_is_refused():
    table = [{"name": "Z", "state": "ultimate", "factors": {"G": 0.0, "W": 0}}]
    with pytest.raises(engine.CaseError, match=r"combinations\.table\[0\]\.factors: every factor is 0"):
        _case({"rule": "table", "table": table})


@pytest.mark.parametrize(
    "combinations",
    [
        {"rule": "en1990-6.10", "service": []},
        {"rule": "table", "table": [{"name": "ULS", "state": "ultimate", "factors": {"G": 1.35, "W": 1.5}}]},
    ],
    ids=["service-empty", "table-ultimate-only"],
)
def test_no_service_combination_says_the_deflection_is_not_checked(combinations):
    result = engine.solve(_case(combinations))
    assert result.service is None
    codes = {c.code: c for c in result.cautions}
    assert codes["deflection-not-checked"].level == "warning"


def test_with_a_service_combination_the_warning_is_absent():
    result = engine.solve(_case({"rule": "en1990-6.10"}))
    assert result.service is not None
    assert "deflection-not-checked" not in {c.code for c in result.cautions}
