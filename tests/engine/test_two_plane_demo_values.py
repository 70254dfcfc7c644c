"""The invented two-plane demo's results pinned across speed work on the two-plane solve.

Not an outside reference: the values were recorded from commit 9bcb784 (before the issue-14 speed work of
2026-12-02 evening) on the project's machine, so that a change meant to save time and leave every result as it
was is caught if it moves a number. Compared to 1e-12 (the speed work's promise), so that another machine's
last bits do not fail the test.
"""

from __future__ import annotations

import dataclasses
from importlib import resources

import pytest

import engine

# force [N]: (utilisation, pair check, its x [m], max M plane 1 [N·m], max M plane 2, max w plane 1 [m],
# max w plane 2, alpha_cr, routes' utilisations (second-order, en-member, aisc), M_cr [N·m], cautions)
#: The cautions of both planes once the second order matters in both and the routes disagree.
_BEYOND = (
    "second-order-matters",
    "second-order-matters",
    "scope",
    "deflection-basis",
    "deflection-basis",
    "routes-disagree",
)
_RECORDED = {
    180e3: (
        0.47300051906639007,
        0.4453124267155348,
        1.9616470588235295,
        7709.278105942961,
        5916.1473030197785,
        0.003979322810794227,
        0.008201144184303046,
        4.018162113149636,
        (0.4453124267155348, 0.47300051906639007, 0.41941979964581494),
        72045.00441715657,
        ("second-order-matters", "scope", "deflection-basis", "deflection-basis"),
    ),
    300e3: (
        0.7887100106016065,
        0.7887100106016065,
        2.0258823529411765,
        10652.056538845129,
        11874.114555467233,
        0.005476855129483753,
        0.016482217936334077,
        2.4108972678897813,
        (0.7887100106016065, 0.7287590706030365, 0.6450807442053133),
        63081.391380307774,
        _BEYOND,
    ),
    450e3: (
        1.4976137414838195,
        1.4976137414838195,
        2.0635588235294122,
        14986.00972503405,
        26741.879971821436,
        0.007682243833408996,
        0.03706298286917959,
        1.6072648452598541,
        (1.4976137414838195, 1.0531411720764268, 0.9351044575170593),
        50474.31137284698,
        ("overstressed", *_BEYOND),
    ),
}


@pytest.mark.parametrize("force", sorted(_RECORDED))
def test_two_plane_demo_results_as_recorded(force):
    """The two-plane demo's utilisations, peaks, alpha_cr, routes, M_cr and cautions are the recorded ones."""
    text = resources.files("assets").joinpath("demo_two_planes.json").read_text(encoding="utf-8")
    case = dataclasses.replace(engine.Case.from_json(text), axial_force=force)
    result = engine.solve(case)
    second = result.second_plane
    util, check, check_x, m1, m2, w1, w2, alpha, routes, m_cr, cautions = _RECORDED[force]
    rel = 1e-12
    assert result.status == "stable"
    assert result.utilization == pytest.approx(util, rel=rel)
    assert result.check.utilization == pytest.approx(check, rel=rel)
    assert result.check.x == pytest.approx(check_x, rel=rel)
    assert result.governing.moment.value == pytest.approx(m1, rel=rel)
    assert second.governing.moment.value == pytest.approx(m2, rel=rel)
    assert result.governing.deflection.value == pytest.approx(w1, rel=rel)
    assert second.governing.deflection.value == pytest.approx(w2, rel=rel)
    assert result.alpha_cr == pytest.approx(alpha, rel=rel)
    assert [r.utilization for r in result.routes] == pytest.approx(list(routes), rel=rel)
    assert result.ltb.M_cr == pytest.approx(m_cr, rel=rel)
    assert tuple(c.code for c in result.cautions) == cautions
