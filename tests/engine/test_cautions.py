"""Each caution fires exactly when its condition holds (and the general one always)."""

import math

import engine

PINNED = {"left": "pinned", "right": "pinned"}


def _codes(mapping):
    r = engine.solve(engine.Case.from_dict(dict({"schema": 1, "length": 4.0, "supports": PINNED}, **mapping)))
    return [c.code for c in r.cautions], r


def _steel(**extra):
    base = {
        "section": {"name": "IPE 200"},
        "material": {"name": "S355"},
        "axial_force": 1.0e5,
        "loads": [{"type": "uniform", "q": 2.0e3}],
        "imperfection": {"preset": "en1993-table-5.1"},
    }
    base.update(extra)
    return base


def test_general_caution_is_always_there():
    """The scope caution (elastic, single member, not a code check, licensed review) is on every result."""
    for mapping in ({"EI": 1e6}, {"EI": 1e6, "axial_force": -1e3}, _steel()):
        codes, r = _codes(mapping)
        assert "scope" in codes
        general = next(c for c in r.cautions if c.code == "scope")
        assert "licensed engineer" in general.message and "lateral-torsional" in general.message


def test_alpha_cr_below_ten_fires_only_below_ten():
    """EN 1993-1-1 §5.2.1(3) (from memory): the caution fires for α_cr = 9.9 and not for 10.1."""
    pcr = math.pi**2 * 1e6 / 16.0
    assert "second-order-matters" in _codes({"EI": 1e6, "axial_force": pcr / 9.9})[0]
    assert "second-order-matters" not in _codes({"EI": 1e6, "axial_force": pcr / 10.1})[0]


def test_plastic_check_uses_fifteen():
    """With the plastic check the α_cr limit is 15 (EN 1993-1-1 §5.2.1(3), from memory)."""
    codes, r = _codes(_steel(check={"method": "plastic"}))
    alpha = r.alpha_cr
    assert ("second-order-matters" in codes) == (alpha < 15)


def test_at_and_beyond_the_critical_load_are_danger():
    """At Pcr1 the 'at-critical-load' danger fires; between Pcr1 and Pcr2 'beyond-critical-load'."""
    pcr = math.pi**2 * 1e6 / 16.0
    codes, r = _codes({"EI": 1e6, "axial_force": pcr})
    assert "at-critical-load" in codes and r.cautions[0].level == "danger"
    assert "beyond-critical-load" in _codes({"EI": 1e6, "axial_force": 2 * pcr})[0]
    assert not {"at-critical-load", "beyond-critical-load"} & set(
        _codes({"EI": 1e6, "axial_force": 0.5 * pcr})[0]
    )


def test_tension_caution():
    """A tension member gets the 'tension' info and no compression cautions."""
    codes, _ = _codes({"EI": 1e6, "axial_force": -5e4})
    assert "tension" in codes and "no-bow" not in codes


def test_slenderness_limits():
    """K·L/i > 200 in compression and > 300 in tension warn (AISC 360-16 user notes, from memory)."""
    # IPE 200 minor axis: i_z = 22.4 mm (references §5), so L = 5 m pinned gives 223 > 200.
    codes, r = _codes(_steel(length=5.0, axis="minor", axial_force=1e3, loads=[]))
    assert "slender" in codes
    codes, _ = _codes(_steel(length=4.0, axis="minor", axial_force=1e3, loads=[]))  # 179
    assert "slender" not in codes
    codes, _ = _codes(_steel(length=6.5, axis="minor", axial_force=-1e3, loads=[]))  # 290 in tension
    assert "slender" not in codes
    codes, _ = _codes(_steel(length=7.0, axis="minor", axial_force=-1e3, loads=[]))  # 312 in tension
    assert "slender" in codes


def test_lateral_torsional_buckling_for_major_axis_open_sections_only():
    """Major-axis bending of an open section whose check cannot be made (a custom section without It/Iw)
    warns of LTB; an I, whose torsion constants are known, is checked instead (issue 15); minor-axis bending
    or a hollow section does not warn."""
    codes, r = _codes(_steel(axis="major"))
    assert "lateral-torsional-buckling" not in codes and r.ltb.applies
    custom = {"shape": "custom", "A": 2.85e-3, "I": 1.943e-5, "W_el": 1.94e-4, "W_pl": 2.2e-4}
    codes, r = _codes(_steel(axis="major", section=custom))
    assert "lateral-torsional-buckling" in codes and not r.ltb.applies
    warning = next(c for c in r.cautions if c.code == "lateral-torsional-buckling")
    assert warning.values["ltb_reason"] == "torsion-unknown"
    assert "lateral-torsional-buckling" not in _codes(_steel(axis="minor"))[0]
    assert "lateral-torsional-buckling" not in _codes(_steel(section={"name": "SHS 100x100x5"}))[0]


def test_section_class_caution_where_it_matters():
    """The class (EN 1993-1-1 Table 5.2) is computed for steel I/H and hollow sections: class 1–2 need no
    caution, an unclassified section (custom) keeps the warning, and EI alone has none (issue 12)."""
    codes, r = _codes(_steel())
    assert "section-class" not in codes and r.check.section_class.klass <= 2
    custom = {"shape": "custom", "A": 5e-3, "I": 2e-5, "W_el": 2e-4, "W_pl": 2.3e-4}
    assert "section-class" in _codes(_steel(section=custom))[0]
    assert "section-class" not in _codes({"EI": 1e6})[0]


def test_overstress_and_deflection_fire_with_their_checks():
    """Utilisation > 1 is danger 'overstressed'; deflection over span/n warns; neither below the limit."""
    codes, r = _codes(_steel(loads=[{"type": "uniform", "q": 4.0e4}]))
    assert r.utilization > 1 and "overstressed" in codes
    codes, r = _codes(_steel(loads=[{"type": "uniform", "q": 1.0e3}], axial_force=1e3))
    assert r.check.strength_utilization < 1 and "overstressed" not in codes
    assert ("deflection" in codes) == (r.check.deflection_utilization > 1)
    codes, r = _codes(
        _steel(loads=[{"type": "uniform", "q": 1.0e3}], axial_force=1e3, check={"deflection_limit": 5000})
    )
    assert r.check.deflection_utilization > 1 and "deflection" in codes


def test_bow_below_code_and_no_bow():
    """A given bow smaller than EN 1993-1-1 Table 5.1's warns; no bow at all in compression warns too."""
    small = _steel(imperfection={"shape": "sine", "amplitude": 0.001})
    assert "bow-below-code" in _codes(small)[0]
    big = _steel(imperfection={"shape": "sine", "amplitude": 0.03})
    assert "bow-below-code" not in _codes(big)[0]
    assert "no-bow" in _codes({"EI": 1e6, "axial_force": 1e3})[0]
    assert (
        "no-bow"
        not in _codes({"EI": 1e6, "axial_force": 1e3, "imperfection": {"shape": "sine", "amplitude": 0.004}})[
            0
        ]
    )


def test_bow_opposing_the_load():
    """A user's bow against the loads' deflection warns; the same bow with the load warns not."""
    against = _steel(imperfection={"shape": "sine", "amplitude": -0.02})
    assert "bow-opposes-load" in _codes(against)[0]
    along = _steel(imperfection={"shape": "sine", "amplitude": 0.02})
    assert "bow-opposes-load" not in _codes(along)[0]


def test_cracking_and_custom_materials():
    """A custom material named concrete is danger 'cracking-material'; another custom one an info."""
    bow = {"shape": "sine", "amplitude": 0.01}  # a code curve needs steel, so give the bow
    concrete = _steel(material={"name": "concrete C30", "E": 3.3e10, "fy": 3.0e7}, imperfection=bow)
    assert "cracking-material" in _codes(concrete)[0]
    custom = _steel(material={"name": "my alloy", "E": 2.0e11, "fy": 3.0e8}, imperfection=bow)
    codes = _codes(custom)[0]
    assert "custom-material" in codes and "cracking-material" not in codes


def test_timber_factors_caution():
    """Timber gets the k_mod / γ_M caution."""
    timber = {"section": {"name": "TIMBER 45x195"}, "material": {"name": "C24"}, "axial_force": 1e3}
    assert "timber-factors" in _codes(timber)[0]


def test_cautions_are_ordered_by_severity():
    """Danger first, then warnings, then infos."""
    _, r = _codes(_steel(loads=[{"type": "uniform", "q": 4.0e4}]))
    levels = [c.level for c in r.cautions]
    rank = {"danger": 0, "warning": 1, "info": 2}
    assert levels == sorted(levels, key=rank.get)


def test_the_in_plane_overstress_cites_the_cross_section_clause_when_out_of_plane_governs():
    """Demo (invented) at 1500 kN fails in plane (1.014) and out of plane (1.81): the in-plane caution cites
    EN 1993-1-1 §6.2 (cross-section), not the out-of-plane member check's §6.3.1 that governs the headline."""
    import dataclasses
    from importlib import resources

    demo = engine.Case.from_json(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))
    result = engine.solve(dataclasses.replace(demo, axial_force=1500e3))
    assert result.check.kind == "out-of-plane buckling"
    overstressed = [c for c in result.cautions if c.code == "overstressed"]
    assert len(overstressed) == 1
    assert "§6.2" in overstressed[0].source and "6.3.1" not in overstressed[0].source


def test_slenderness_caution_counts_the_other_axis_of_a_one_plane_case():
    """A one-plane HEB 200 strut, 12 m, pinned, free to buckle about its minor axis (the out-of-plane check's
    L_cr = L): K·L/i_y = 12/0.0854 = 141 is below AISC 360-16 §E2's user-note 200 (from memory), but
    L/i_z = 12/0.0507 = 237 is above it; the caution gives the larger (π√(EA/N_cr,z) = L_cr/i_z), and none
    where the other axis is held."""
    import math as _math

    data = {
        "schema": 1,
        "length": 12.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 20e3,
        "loads": [],
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
    }
    result = engine.solve(engine.Case.from_dict(data))
    slender = [c for c in result.cautions if c.code == "slender"]
    section = engine.Case.from_dict(dict(data, axis="minor"))
    i_z = _math.sqrt(engine.solve(section).section.I / result.section.A)
    assert len(slender) == 1 and f"= {12.0 / i_z:.0f} " in slender[0].message
    held = engine.solve(engine.Case.from_dict(dict(data, out_of_plane={"restrained": True})))
    assert not [c for c in held.cautions if c.code == "slender"]
