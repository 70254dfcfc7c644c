"""M_cr where a load or a restraint lies a hair away from a node of its mesh (engine.design.mcr._nodes).

A break point (a point load, a restraint, the end of a partial load) more than 1e-9·L from a node of the
uniform mesh used to become a node of its own, so a load some micrometres from a node made an element about
1e-7 of the others: the eigenproblem was refused (M_cr = 0, the utilisation +inf) or the twist locked there
(M_cr 3.8 times too high, the member passing at 0.49 where it fails at 1.02). An independent audit found it
with its own finite elements; a US user's six-figure values (19.685 ft with the load at 9.84252 ft) reach it.

The reference: M_cr is continuous in the load's position and the span (the elastic critical moment of a
member depends continuously on its data, common practice, no source), so a shift of a few micrometres may
change M_cr by a few parts in a million at most; the unshifted members are checked against closed forms and
finite elements elsewhere (tests/engine/test_ltb_*). The members are invented.
"""

from __future__ import annotations

import pytest

import engine


def _beam(length: float, loads: list, restraints: list | None = None) -> dict:
    data = {
        "schema": 1,
        "length": length,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 0.0,
        "loads": loads,
        "imperfection": {"shape": "none", "amplitude": 0.0},
        "section": {"name": "IPE 300"},
        "material": {"name": "S235"},
        "check": {"method": "plastic", "ltb": {"load_position": "destabilising"}},
    }
    if restraints:
        data["restraints"] = restraints
    return data


def _ltb(data):
    return engine.solve(engine.Case.from_dict(data)).ltb


@pytest.mark.parametrize(
    ("length", "x", "shifted_length", "shifted_x"),
    [
        (6.0, 3.0, 6.0, 3.0000002),
        (6.0, 3.0, 6.0, 3.00001),
        (6.0, 3.0, 6.0, 3.00002),
        (6.0, 3.0, 5.999988, 3.0),  # 19.685 ft, the load at the 6 m member's midspan
        (8.0, 2.0, 8.0, 2.0000004),
        (6.0, 1.5, 6.0, 1.5000003),
    ],
)
def test_a_point_load_a_hair_from_a_node_keeps_m_cr(length, x, shifted_length, shifted_x):
    exact = _ltb(_beam(length, [{"type": "point", "P": 40e3, "x": x}]))
    shifted = _ltb(_beam(shifted_length, [{"type": "point", "P": 40e3, "x": shifted_x}]))
    assert exact.applies and shifted.applies
    assert shifted.M_cr == pytest.approx(exact.M_cr, rel=2e-5)
    assert shifted.utilisation == pytest.approx(exact.utilisation, rel=2e-5)


def test_a_restraint_a_hair_from_a_node_keeps_m_cr():
    uniform = [{"type": "uniform", "q": 10e3}]
    exact = _ltb(_beam(6.0, uniform, [{"x": 1.5, "twist": "fixed"}]))
    shifted = _ltb(_beam(6.0, uniform, [{"x": 1.5000001, "twist": "fixed"}]))
    assert exact.applies and shifted.applies
    assert shifted.M_cr == pytest.approx(exact.M_cr, rel=2e-5)


def test_two_loads_a_hair_apart_share_a_node():
    """Two point loads 0.4 µm apart: the same M_cr as one load of their sum, to a few parts in a million."""
    one = _ltb(_beam(8.0, [{"type": "point", "P": 40e3, "x": 2.7}]))
    two = _ltb(
        _beam(8.0, [{"type": "point", "P": 20e3, "x": 2.7}, {"type": "point", "P": 20e3, "x": 2.7000004}])
    )
    assert two.M_cr == pytest.approx(one.M_cr, rel=2e-5)


def test_two_breaks_straddling_the_limit_of_a_node_share_it():
    """A load 2 mm short of the 8-element mesh's node at 4 m (just outside the limit, its own node) and a
    twist restraint 0.01 mm from the load (just inside it, moving the node): the first version made an
    element of about 1e-9 of the others there and M_cr was 0 (a self-audit of this stop); the same as both
    at 3.998 m."""

    def beam(at_load, at_restraint):
        data = _beam(
            8.0, [{"type": "point", "P": 40e3, "x": at_load}], [{"x": at_restraint, "twist": "fixed"}]
        )
        return _ltb(data)

    together = beam(3.998, 3.998)
    straddling = beam(3.997995, 3.998005)
    assert straddling.applies and straddling.M_cr > 0.0
    assert straddling.M_cr == pytest.approx(together.M_cr, rel=2e-5)
