"""The out-of-plane check of a section class 4 in uniform compression is worded with A_eff, in SI and US
units, because its N_b,Rd is χ·A_eff·f_y/γ_M1 (EN 1993-1-1 §6.3.1.1 with A_eff of EN 1993-1-5 §4.4, from
memory; the number itself is checked in tests/engine/test_web_classification.py). Invented member."""

from __future__ import annotations

import engine
from app.report.words import out_of_plane_text
from app.units import units
from tests.engine.test_web_classification import _beam_column


def test_out_of_plane_words_name_the_effective_area():
    """IPE 300 S355 (class 4 in uniform compression): "N_b,Rd = χ·A_eff·f_y/γ_M1"; HEB 200: "χ·A·f_y"."""
    case = _beam_column(100e3, length=4.0, out_of_plane={"buckling_length": 4.0})
    out = engine.solve(case).check.out_of_plane
    assert out.effective
    for system in ("si", "us"):
        assert "N_b,Rd = χ·A_eff·f_y/γ_M1 = " in out_of_plane_text(out, units(system))
    stocky = engine.solve(
        _beam_column(100e3, section={"name": "HEB 200"}, out_of_plane={"buckling_length": 4.0})
    )
    assert not stocky.check.out_of_plane.effective
    assert "N_b,Rd = χ·A·f_y/γ_M1 = " in out_of_plane_text(stocky.check.out_of_plane, units("si"))
