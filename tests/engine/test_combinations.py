"""Load combinations (engine.combinations) against the code tables (tests/REFERENCES.md §10).

Sources, each value recalled, not read from a copy (so all **from memory**): EN 1990:2002+A1:2005 Table A1.1
(ψ factors, buildings) and Table A1.2(B) (γ_G,sup 1.35, γ_G,inf 1.00, γ_Q 1.50, ξ 0.85), eqs. (6.10),
(6.10a), (6.10b), (6.14b), (6.15b), (6.16b); ASCE/SEI 7-16 §2.3.1 (LRFD) and §2.4.1 (ASD). Actions invented.
"""

import pytest

from engine.actions import Action, CombinationSettings, UserCombination
from engine.combinations import EN_GAMMA, EN_PSI, combine
from engine.errors import CaseError


def act(name, category, **extra):
    """An invented action without loads."""
    return Action(name=name, category=category, **extra)


G, Q, W, S = act("G", "permanent"), act("Q", "imposed-B"), act("W", "wind"), act("S", "snow-low")


def factor_sets(combos, state="ultimate", equation=None):
    """The factor vectors of the combinations of one state (and equation), rounded to 1e-12."""
    return {
        tuple(round(f, 12) for f in c.factors)
        for c in combos
        if c.state == state and (equation is None or c.equation == equation)
    }


def test_psi_and_gamma_are_the_tables():
    """ψ of EN 1990 Table A1.1 and γ of Table A1.2(B), recommended values (from memory)."""
    assert EN_GAMMA == {"G_sup": 1.35, "G_inf": 1.00, "Q": 1.50, "xi": 0.85}
    assert EN_PSI["imposed-A"] == EN_PSI["imposed-B"] == (0.7, 0.5, 0.3)
    assert EN_PSI["imposed-C"] == EN_PSI["imposed-D"] == EN_PSI["imposed-F"] == (0.7, 0.7, 0.6)
    assert EN_PSI["imposed-E"] == (1.0, 0.9, 0.8)
    assert EN_PSI["imposed-G"] == (0.7, 0.5, 0.3)
    assert EN_PSI["imposed-H"] == (0.0, 0.0, 0.0)
    assert EN_PSI["snow"] == (0.7, 0.5, 0.2) and EN_PSI["snow-low"] == (0.5, 0.2, 0.0)
    assert EN_PSI["wind"] == (0.6, 0.2, 0.0) and EN_PSI["temperature"] == (0.6, 0.5, 0.0)
    # The decision for an imposed action without a category: the largest of each column (the safe side).
    columns = [EN_PSI[f"imposed-{c}"] for c in "ABCDEFGH"]
    assert EN_PSI["imposed"] == tuple(max(col) for col in zip(*columns, strict=True))


def test_en_6_10_with_two_variable_actions():
    """Eq. (6.10): G at 1.35 and 1.00, each variable leading at 1.5, the other at 1.5 ψ0, or absent."""
    combos = combine((G, Q, W), CombinationSettings())
    expected = set()
    for g in (1.35, 1.0):
        expected |= {(g, 0, 0), (g, 1.5, 0), (g, 0, 1.5), (g, 1.5, 1.5 * 0.6), (g, 1.5 * 0.7, 1.5)}
    assert factor_sets(combos) == {tuple(round(f, 12) for f in e) for e in expected}
    assert all(c.equation == "6.10" for c in combos if c.state == "ultimate")
    lead = {c.factors: c.leading for c in combos if c.state == "ultimate"}
    assert lead[(1.35, 1.5, 0.9)] == "Q" and lead[(1.35, 1.05, 1.5)] == "W"


def test_en_6_10a_and_6_10b():
    """Eqs. (6.10a)/(6.10b): 1.35 G + 1.5 ψ0 Q_i, and ξ 1.35 G + 1.5 Q_1 + 1.5 ψ0 Q_i; G_inf = 1.0 in both."""
    combos = combine((G, Q, W), CombinationSettings(rule="en1990-6.10ab"))
    a = factor_sets(combos, equation="6.10a")
    b = factor_sets(combos, equation="6.10b")
    assert (1.35, 1.05, 0.9) in a and (1.0, 1.05, 0.9) in a
    assert (1.1475, 1.5, 0.9) in b and (1.1475, 1.05, 1.5) in b and (1.0, 1.5, 0.9) in b
    assert all(round(f[0], 12) in (1.35, 1.0) for f in a) and all(round(f[0], 12) in (1.1475, 1.0) for f in b)


def test_6_10_is_never_less_onerous_than_6_10a_or_6_10b():
    """The default (6.10) covers 6.10a/b: each of their vectors is matched or exceeded term by term by a 6.10
    vector with the same permanent level (the reason 6.10 is the default: DEVELOPERS.md)."""
    base = factor_sets(combine((G, Q, W, S), CombinationSettings()))
    other = factor_sets(combine((G, Q, W, S), CombinationSettings(rule="en1990-6.10ab")))
    for vector in other:
        level = 1.35 if vector[0] > 1.0 else 1.0
        assert any(
            v[0] == level and all(x >= y for x, y in zip(v[1:], vector[1:], strict=True)) for v in base
        )


def test_service_combinations():
    """Eqs. (6.14b) G + Q1 + ψ0 Qi, (6.15b) G + ψ1 Q1 + ψ2 Qi, (6.16b) G + ψ2 Qi, all G at 1.0."""
    settings = CombinationSettings(service=("characteristic", "frequent", "quasi-permanent"))
    combos = combine((G, Q, W), settings)
    assert {(1.0, 1.0, 0.6), (1.0, 0.7, 1.0), (1.0, 0, 0)} <= factor_sets(combos, "service", "6.14b")
    assert {(1.0, 0.5, 0.0), (1.0, 0.3, 0.2)} <= factor_sets(combos, "service", "6.15b")
    # G alone is made once, as the characteristic combination, the first that holds it.
    assert factor_sets(combos, "service", "6.16b") == {(1.0, 0.3, 0.0)}


def test_exclusive_actions_never_act_together():
    """Two wind directions with one exclusive name never share a combination; each still leads."""
    w1, w2 = act("W1", "wind", exclusive="wind"), act("W2", "wind", exclusive="wind")
    combos = combine((G, w1, w2), CombinationSettings())
    assert not any(c.factors[1] and c.factors[2] for c in combos)
    assert {(1.35, 1.5, 0), (1.35, 0, 1.5), (1.0, 1.5, 0), (1.0, 0, 1.5)} <= factor_sets(combos)


def test_asce_lrfd_and_service():
    """ASCE 7-16 §2.3.1 combinations 1–5 and §2.4.1 1–7 (from memory), L factor 1.0 in 3 and 4."""
    combos = combine((G, act("L", "imposed"), act("Sn", "snow"), W), CombinationSettings(rule="asce7-2.3"))
    lrfd = factor_sets(combos)
    for vector in [
        (1.4, 0, 0, 0),
        (1.2, 1.6, 0.5, 0),
        (1.2, 1.0, 1.6, 0),
        (1.2, 0, 1.6, 0.5),
        (1.2, 1.0, 0.5, 1.0),
        (0.9, 0, 0, 1.0),
    ]:
        assert vector in lrfd, vector
    assert max(v[0] for v in lrfd) == 1.4 and min(v[0] for v in lrfd) == 0.9
    service = factor_sets(combos, "service")
    for vector in [(1, 1, 0, 0), (1, 0, 1, 0), (1, 0.75, 0.75, 0), (1, 0, 0, 0.6), (1, 0.75, 0.75, 0.45)]:
        assert vector in service, vector
    assert (0.6, 0, 0, 0.6) in service


def test_asce_combinations_are_numbered_as_in_7_16():
    """ASCE 7-16 numbers 0.9D + 1.0W as §2.3.1 combination 5 and D + 0.75L + 0.75(0.6W) + 0.75(Lr or S or R)
    as §2.4.1 combination 6 (the seismic ones moved to §2.3.6 and §2.4.5; from memory); 7-10's 6 and 6a were
    shown before."""
    combos = combine((G, act("L", "imposed"), W), CombinationSettings(rule="asce7-2.3"))
    equations = {c.equation: c.factors for c in combos}
    assert (0.9, 0.0, 1.0) in {f for e, f in equations.items() if e == "2.3.1-5"}
    assert "2.3.1-6" not in equations and "2.4.1-6a" not in equations
    assert any(c.equation == "2.4.1-6" and c.factors == (1.0, 0.75, 0.45) for c in combos)


def test_asce_refuses_a_category_without_a_symbol():
    """Temperature has no symbol in ASCE 7 §2.3's basic combinations: refused, naming the action."""
    with pytest.raises(CaseError, match=r"actions\[1\]\.category: 'temperature' has no load symbol"):
        combine((G, act("T", "temperature")), CombinationSettings(rule="asce7-2.3"))


def test_user_table_and_user_psi():
    """The user's rows are added with their names; a user's ψ replaces the table's."""
    crane = act("C", "crane", psi=(0.8, 0.6, 0.3))
    rows = (UserCombination(name="Acc", state="ultimate", factors=(("G", 1.0), ("C", 1.0))),)
    combos = combine((G, crane), CombinationSettings(table=rows, service=("frequent",)))
    assert combos[-1].name == "Acc" and combos[-1].factors == (1.0, 1.0) and combos[-1].rule == "table"
    assert (1.0, 0.6) in factor_sets(combos, "service")
    only = combine((G, crane), CombinationSettings(rule="table", table=rows))
    assert [c.name for c in only] == ["Acc"]


def test_names_are_numbered_per_state_and_each_vector_once():
    """Ultimate combinations are U1, U2 ..., service S1 ...; no factor vector appears twice in one state."""
    combos = combine((G, Q, W, act("H", "imposed-H")), CombinationSettings())
    for state, letter in (("ultimate", "U"), ("service", "S")):
        names = [c.name for c in combos if c.state == state]
        assert names == [f"{letter}{i}" for i in range(1, len(names) + 1)]
        assert len(factor_sets(combos, state)) == len(names)


def test_too_many_permanent_actions_are_refused():
    """More than six permanent actions (2^n permanent levels) are refused with the count."""
    many = tuple(act(f"G{i}", "permanent") for i in range(7))
    with pytest.raises(CaseError, match="actions: 7 permanent actions; at most 6"):
        combine(many, CombinationSettings())
