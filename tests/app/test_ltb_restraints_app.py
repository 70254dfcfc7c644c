"""Intermediate restraints of the lateral-torsional buckling check in the words and the JSON summary (issue
15): the restraints read, the governing segment between brace points, AISC's L_b. Invented member."""

import engine
from app.report.ltb import ltb_words
from app.summary_json import summary_data
from app.units import units


def _result(restraints):
    return engine.solve(
        engine.Case.from_dict(
            {
                "schema": 1,
                "title": "Invented braced beam",
                "length": 6.0,
                "supports": {"left": "pinned", "right": "pinned"},
                "section": {"name": "IPE 300"},
                "material": {"name": "S355"},
                "imperfection": {"preset": "en1993-table-5.1"},
                "loads": [{"type": "uniform", "q": 10e3}],
                "check": {"routes": ["second-order"]},
                "restraints": restraints,
                "second_plane": {"supports": {"left": "pinned", "right": "pinned"}, "loads": []},
            }
        )
    )


def _plain():
    """A member with no section: no check, so no lateral-torsional buckling (invented)."""
    return engine.solve(
        engine.Case.from_dict(
            {
                "schema": 1,
                "length": 4.0,
                "EI": 4e6,
                "supports": {"left": "pinned", "right": "pinned"},
                "loads": [{"type": "uniform", "q": 1e3}],
            }
        )
    )


def test_words_name_the_restraints_and_the_governing_segment():
    result = _result([{"x": 2.0, "translation": "fixed", "plane": "second", "twist": "fixed"}])
    si, us = ltb_words(result, units("si")), ltb_words(result, units("us"))
    assert "held inside (at the shear centre): x = 2.000 m (lateral, twist)" in si.settings
    assert "x = 6.562 ft (lateral, twist)" in us.settings  # 2 m / 0.3048 m per ft (exact by definition)
    a, b = result.ltb.segment
    U = units("si")
    span = f"segment x = {U.show('length', a)} to {U.show('length', b)} between brace points governs"
    lines = {key: value for key, _, value in si.lines()}
    assert span in lines["M_cr_tabulated"]
    assert "(the governing unbraced segment)" in lines["aisc"]
    data = summary_data("x", result.case, result)["ltb"]
    assert data["restraints"] == [
        {"x": 2.0, "lateral": "fixed", "lateral_rotation": "free", "twist": "fixed"}
    ]
    assert data["segment"] == [a, b]


def test_a_spring_is_shown_in_the_display_unit():
    result = _result([{"x": 2.0, "translation": 5e5, "plane": "second"}])
    words = ltb_words(result, units("si"))
    assert "x = 2.000 m (lateral spring 500.0 kN/m)" in words.settings
    assert "segment" not in dict((k, v) for k, _, v in words.lines())["M_cr_tabulated"]


def test_calc_sheet_has_a_page_with_the_buckling_mode():
    """The page after the text draws ltb.mode_v and ltb.mode_phi along x in the display unit, the brace
    dotted; a case without the check has no such page."""
    import numpy as np

    from app import exports

    result = _result([{"x": 2.0, "translation": "fixed", "plane": "second", "twist": "fixed"}])
    for system, per_metre in (("si", 1.0), ("us", 1 / 0.3048)):
        pages = exports.calc_sheet_figures(result, units=system)
        mode = [p for p in pages if any("Lateral-torsional buckling mode" in t.get_text() for t in p.texts)]
        assert len(mode) == 1
        ax = mode[0].axes[0]
        v, phi = ax.get_lines()[:2]
        assert np.allclose(v.get_xdata(), np.asarray(result.ltb.mode_x) * per_metre)
        assert np.allclose(v.get_ydata(), result.ltb.mode_v) and np.allclose(
            phi.get_ydata(), result.ltb.mode_phi
        )
        assert any(np.allclose(line.get_xdata(), 2.0 * per_metre) for line in ax.get_lines()[2:])
        assert pages.index(mode[0]) == len(pages) - 3  # before the two planes' figure pages
    plain = _plain()
    pages = exports.calc_sheet_figures(plain)
    assert not any("Lateral-torsional buckling mode" in t.get_text() for p in pages for t in p.texts)


def test_png_has_a_panel_with_the_buckling_mode():
    """With the check made, the PNG's figure gains one axes below the diagrams drawing ltb.mode_v and
    ltb.mode_phi along x in the display unit, titled with M_cr and the brace dotted; a member whose check was
    not made (a cantilever, or no section) keeps the four axes of before. The PNG stays A4 landscape."""
    import io

    import numpy as np
    from PIL import Image

    from app import exports
    from app.exports.figure import MODE_TITLE

    result = _result([{"x": 2.0, "translation": "fixed", "plane": "second", "twist": "fixed"}])
    for system, per_metre in (("si", 1.0), ("us", 1 / 0.3048)):
        fig = exports.result_figure(result, units=system)
        assert len(fig.axes) == 9  # a sketch and three diagrams per plane, and the mode
        (ax,) = [a for a in fig.axes if a.get_title(loc="left").startswith(MODE_TITLE)]
        assert ltb_words(result, units(system)).text("M_cr") in ax.get_title(loc="left")
        v, phi = ax.get_lines()[:2]
        assert np.allclose(v.get_xdata(), np.asarray(result.ltb.mode_x) * per_metre)
        assert np.allclose(v.get_ydata(), result.ltb.mode_v)
        assert np.allclose(phi.get_ydata(), result.ltb.mode_phi)
        assert any(np.allclose(line.get_xdata(), 2.0 * per_metre) for line in ax.get_lines()[2:])
    # A4 landscape at 40 dpi: 297 × 210 mm (ISO 216, from memory)
    assert Image.open(io.BytesIO(exports.png_bytes(result, dpi=40))).size == (468, 331)
    spring = {"translation": "fixed", "rotation": 5e6}  # not built in: the fork there is not overridden
    cantilever = dict(_result([]).case.to_dict(), supports={"left": spring, "right": "free"})
    cantilever.pop("second_plane")
    refused = engine.solve(engine.Case.from_dict(cantilever))
    assert refused.ltb is not None and not refused.ltb.applies
    plain = _plain()
    for other in (refused, plain):
        fig = exports.result_figure(other)
        assert len(fig.axes) == 4
        assert not any(a.get_title(loc="left").startswith(MODE_TITLE) for a in fig.axes)
