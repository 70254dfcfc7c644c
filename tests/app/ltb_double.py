"""A test double of the engine's ``LtbCheck`` (engine.design.ltb_member), for the wording tests before
the engine's lateral-torsional buckling check is merged. Its numbers are invented (they check the wording and
the unit conversions only, never mechanics); no product code uses it."""

from __future__ import annotations

from dataclasses import dataclass, field


@dataclass(frozen=True)
class AiscDouble:
    M_n: float = 180.0e3
    M_p: float = 230.0e3
    L_p: float = 2.0
    L_r: float = 7.5
    F_cr: float = 300.0e6
    zone: str = "inelastic"
    C_b: float = 1.136


@dataclass(frozen=True)
class LtbDouble:
    applies: bool = True
    reason: str | None = None
    M_Ed: float = 60.0e3
    M_cr: float = 400.0e3
    M_cr_tabulated: float = 392.0e3
    C1: float = 1.127
    diagram: str = "udl"
    diagram_deviation: float = 0.0
    difference: float = -0.02
    lambda_LT: float = 0.75
    chi_LT: float = 0.80
    curve: str = "b"
    method: str = "6.3.2.3"
    f: float = 0.94
    M_b_Rd: float = 150.0e3
    utilisation: float = 0.40
    load_position: str = "destabilising"
    lateral_ends: tuple = ("fork", "fork")
    warping_ends: tuple = ("free", "free")
    mode_x: tuple = (0.0, 1.5, 3.0, 4.5, 6.0)
    mode_v: tuple = (0.0, 0.7, 1.0, 0.7, 0.0)
    mode_phi: tuple = (0.0, -0.7, -1.0, -0.7, 0.0)
    aisc: AiscDouble | None = None
    sources: tuple = field(default=("EN 1993-1-1:2005 §6.3.2.3 (from memory)",))


def with_ltb(result, ltb):
    """`result` (a real engine result) carrying `ltb` as its ``ltb`` field."""
    object.__setattr__(result, "ltb", ltb)
    return result
