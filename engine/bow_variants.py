"""The variants of a member's bow that the analysis solves, and which is the worse.

A preset's direction left automatic is solved both ways; where a preset takes the first mode's shape (a
member with an end that can translate, restraints or a foundation), the same e0 as a half sine between the
ends with the sway is solved too (:attr:`engine.member.BowChoice.alternatives`): EN 1993-1-1 §5.3.2(3) reads
the local bow relative to the chord, and a first mode that is (nearly) a rigid tilt on a spring carries
(almost) no curvature. :func:`engine.analysis._solve_plane` keeps the worse (:func:`worst_of`).
"""

from __future__ import annotations

from engine.raw import raw as solve_raw
from engine.raw import reversed_raw

__all__ = ["ORDER", "choose", "keys", "said", "said_as", "variants", "worst_of"]


#: The variants' keys in the order they are solved and reported.
ORDER = (
    "forward",
    "reversed",
    "half_sine",
    "half_sine_reversed",
    "half_sine_opposed",
    "half_sine_opposed_reversed",
)


def _base(kind: str) -> str:
    """The variant a reversed one reverses (the kind itself for one that is not reversed)."""
    return "forward" if kind == "reversed" else kind.removesuffix("_reversed")


def keys(reverse: bool, shapes: int) -> tuple:
    """The variants besides the bow as given, in the order of :data:`ORDER`: ``shapes`` half sines (with the
    sway, and against it), and with ``reverse`` each one reversed too."""
    made = ("forward", "half_sine", "half_sine_opposed")[: 1 + shapes]
    return tuple(k for k in ORDER[1:] if _base(k) in made and (reverse or k == _base(k)))


def variants(prep, n, P, raw, free_raw, reverse: bool, shapes: int) -> dict:
    """The bow's variants solved, ``{key: (prepared member, raw solution)}`` in the order of :data:`ORDER`
    (those asked: ``shapes`` half sines, with the sway and against it). A reversed one comes by linearity
    where the bow-free solution is at hand: 2 × (bow-free) − (forward), no further solve."""
    found = {"forward": (prep, raw)}
    for kind in keys(reverse, shapes):  # a reversed one after the one it reverses
        other_prep = prep.variant(kind)
        if kind == _base(kind):
            found[kind] = (other_prep, solve_raw(other_prep, n, P))
            continue
        base_prep, base_raw = found[_base(kind)]
        other = None
        if free_raw is not None:
            other = reversed_raw(other_prep, n, P, base_raw, free_raw, (base_prep, prep.variant("bow_free")))
        if other is None:
            other = solve_raw(other_prep, n, P)
        found[kind] = (other_prep, other)
    return found


def worst_of(severity: dict, among: tuple) -> str:
    """The key of the worst variant ``among`` those given: the larger first value (the strength utilisation,
    or a deflection; within 1e-9 a tie), then the larger second (max|M|); the first on a full tie."""
    best = among[0]
    for key in among[1:]:
        a, b = severity[best], severity[key]
        sa, sb = (-1.0 if a[0] is None else a[0]), (-1.0 if b[0] is None else b[0])
        tol = 1e-9 * max(1.0, abs(sa))
        if sb > sa + tol or (abs(sb - sa) <= tol and b[1] > a[1] * (1.0 + 1e-9)):
            best = key
    return best


def said_as(bow, shapes: bool) -> str:
    """A variant's direction in words, and its shape where two shapes are solved."""
    if not shapes:
        return bow.direction
    if bow.shape != "sine":
        return f"{bow.direction}, first-mode shape"
    against = bow.amplitude * bow.sway < 0.0
    return f"{bow.direction}, half sine between the ends" + (", against the sway" if against else "")


def said(direction, strength, moment) -> str:
    """A variant's facts in words: its direction (and shape), strength utilisation and max|M|."""
    text = f"max|M| {moment * 1e-3:.4g} kN·m"
    if strength is None:
        return f"{direction}: {text}"
    return f"{direction}: strength utilisation {strength:.3f}, {text}"


def choose(found: dict, severity: dict, choice, shapes: int, pick, unkept, rank: str) -> tuple:
    """``(key kept, the words of the choice, facts of every variant, favourable)`` among the variants
    ``found`` (:func:`variants`), ranked by ``severity`` (:func:`worst_of`); see
    ``engine.analysis._solve_plane`` for ``pick``, ``unkept`` and ``rank``."""
    facts = tuple((said_as(found[key][0].member.bow, shapes), *severity[key]) for key in found)
    if rank == "deflection":
        key = worst_of(severity, tuple(found))
        kept_fact = facts[tuple(found).index(key)]
        rest = "; ".join(f"{f[0]}: max|w| {f[1] * 1e3:.4g} mm" for f in facts if f is not kept_fact)
        largest = f"max|w| {kept_fact[1] * 1e3:.4g} mm"
        text = f"{kept_fact[0]}: the largest deflection of those solved ({largest}; {rest})"
        favourable = False
    elif choice.automatic:
        worst = worst_of(severity, tuple(found))
        key = pick if pick is not None else worst
        kept_fact = facts[tuple(found).index(key)]
        rest = "; ".join(said(*f) for f in facts if f is not kept_fact)
        how = "the worse of the two directions solved"
        if shapes:
            how = "the worse of the directions and shapes solved"
        if key != worst:
            how = "the worse for the check of both planes together"
        text = f"{kept_fact[0]}: {how} ({said(*kept_fact)}; {rest})"
        favourable = False
        if unkept is not None:
            unkept.extend((k, *found[k]) for k in found if k != key)
    else:  # the direction the case fixes: the worse shape in it; favourable where the reversed one is worse
        same = tuple(k for k in found if not k.endswith("reversed"))
        key = pick if pick is not None else worst_of(severity, same)
        if unkept is not None:  # the other shapes in the fixed direction, for the two planes' pair
            unkept.extend((k, *found[k]) for k in same if k != key)
        favourable = worst_of(severity, tuple(found)) not in same
        kept_fact = facts[tuple(found).index(key)]
        text = f"{choice.direction}, as the case fixes it" + (f" ({said(*kept_fact)})" if shapes else "")
        if favourable:
            reversed_fact = facts[tuple(found).index(worst_of(severity, tuple(found)))]
            text += f" (the favourable way: reversed, {said(*reversed_fact)})"
    return key, text, facts, favourable
