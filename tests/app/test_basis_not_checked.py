"""`utilization_basis` says "not a code check" where a danger caution says the steel is not covered here.

An audit (stop 39) found `"code check"` beside the danger caution `high-strength-steel` ("not a code check
for this steel") for f_y = 800 MPa. EN 1993-1-12 stops at S700 (from memory)."""

from __future__ import annotations

import engine
from app.batch.headline import basis_cell
from tests.engine.test_custom_section_torsion import _case, _custom_ipe
from tests.engine.test_high_strength_steel import _case as _steel


def test_basis_of_a_steel_above_700_mpa():
    assert basis_cell(engine.solve(_steel(800e6))) == "not a code check (high-strength-steel)"
    assert basis_cell(engine.solve(_steel(355e6))) == "code check"


def test_basis_of_a_custom_section_not_stated_doubly_symmetric_in_compression():
    r = engine.solve(_case(_custom_ipe(doubly_symmetric=False), 300e3))
    assert basis_cell(r) == "not a code check (flexural-torsional-not-checked)"
