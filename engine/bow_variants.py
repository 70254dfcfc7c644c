"""The variants of a member's bow that the analysis solves, and which is the worse.

A preset's direction left automatic is solved both ways; where a preset takes the first mode's shape (a
member with an end that can translate, restraints or a foundation), the same e0 as a half sine between the
ends with the sway is solved too (:attr:`engine.member.BowChoice.alternative`): EN 1993-1-1 §5.3.2(3) reads
the local bow relative to the chord, and a first mode that is (nearly) a rigid tilt on a spring carries
(almost) no curvature. :func:`engine.analysis._solve_plane` keeps the worse (:func:`worst_of`).
"""

from __future__ import annotations

from engine.raw import raw as solve_raw
from engine.raw import reversed_raw

__all__ = ["said", "said_as", "variants", "worst_of"]


def variants(prep, n, P, raw, free_raw, reverse: bool, shapes: bool) -> dict:
    """The bow's variants solved, ``{key: (prepared member, raw solution)}`` in the order forward,
    reversed, half_sine, half_sine_reversed (those asked). A reversed one comes by linearity where the
    bow-free solution is at hand: 2 × (bow-free) − (forward), no further solve."""
    found = {"forward": (prep, raw)}
    pairs = [("forward", "reversed")] if reverse else []
    if shapes:
        half = prep.variant("half_sine")
        found["half_sine"] = (half, solve_raw(half, n, P))
        if reverse:
            pairs.append(("half_sine", "half_sine_reversed"))
    for base, kind in pairs:
        base_prep, base_raw = found[base]
        other_prep = prep.variant(kind)
        other = None
        if free_raw is not None:
            other = reversed_raw(other_prep, n, P, base_raw, free_raw, (base_prep, prep.variant("bow_free")))
        if other is None:
            other = solve_raw(other_prep, n, P)
        found[kind] = (other_prep, other)
    order = ("forward", "reversed", "half_sine", "half_sine_reversed")
    return {key: found[key] for key in order if key in found}


def worst_of(severity: dict, keys: tuple) -> str:
    """The key of the worst variant among ``keys``: the larger strength utilisation (within 1e-9 a tie), then
    the larger max|M|; the first on a full tie."""
    best = keys[0]
    for key in keys[1:]:
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
    return f"{bow.direction}, {'half sine between the ends' if bow.shape == 'sine' else 'first-mode shape'}"


def said(direction, strength, moment) -> str:
    """A variant's facts in words: its direction (and shape), strength utilisation and max|M|."""
    text = f"max|M| {moment * 1e-3:.4g} kN·m"
    if strength is None:
        return f"{direction}: {text}"
    return f"{direction}: strength utilisation {strength:.3f}, {text}"
