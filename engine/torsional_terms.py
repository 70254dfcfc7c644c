"""The member routes' torsional buckling term (EN 1993-1-1 §6.3.1.4, :mod:`engine.torsional_buckling`): the
member's own, and a member stepped in section's: N_cr,T of the stepped member itself (its torsion equation
solved by finite elements, :func:`stepped_critical_load`), each segment's resistance to it, the smallest
N_b,T,Rd kept. Independent checks found the term missing on a stepped member (7 % on the unsafe side), then
each segment's own whole-length N_cr,T above the stepped member's (a weak middle between stocky ends with a
larger i0²: 12.7 % above, the term 3 % low)."""

from __future__ import annotations

import dataclasses
import math
from types import SimpleNamespace

import numpy as np

from engine import torsional_buckling
from engine.ltb_route import lateral_sides
from engine.ltb_route import made as _made
from engine.ltb_route import major as _major
from engine.sections import section_from_spec

__all__ = ["custom_torsional", "member_torsional", "term", "weakest_segment"]


def _free_ends(result) -> tuple:
    """The ends that do not hold the twist (a free end, or one the LTB check leaves free laterally)."""
    case = result.case
    if _major(result) is not None:
        return lateral_sides(result, case.check.ltb)[0]
    ends = (("left", case.left), ("right", case.right))
    return tuple(side for side, end in ends if end.translation == "free" and end.rotation == "free")


def member_torsional(result, section_y, section_z, material):
    """The member's torsional buckling load and resistance with the section about its major (``section_y``)
    and minor axis, or None."""
    case = result.case
    found = torsional_buckling.critical_load(case, section_y, section_z, material, _free_ends(result))
    if found is None:
        return None
    return torsional_buckling.resistance(found, section_z, material, case.check.gamma_M1)


def custom_torsional(result):
    """The torsional buckling check of a custom steel section that states ``doubly_symmetric``,
    ``open_section``, ``It``, ``Iw`` and ``Iz`` (bent about its major axis): N_cr,T as for a catalogue
    section, χ_T by curve d on the gross area (as :mod:`engine.buckling_interaction` reads a custom section,
    its curves unknown); None otherwise. An audit found the term left out of every custom section: a custom
    IPE 300 passed at 0.691 where the catalogue one failed at 1.038 by it."""
    section, material, case = result.section, result.material, result.case
    if case.axis != "major":
        return None  # nothing is given about the major axis: no bound on i0² (a danger caution says so)
    # without Iz, Iz = I (Iz ≤ I): the largest i0², the lowest N_cr,T, a safe bound (an audit, stop 39)
    turned = SimpleNamespace(I=section.I if section.I_minor is None else section.I_minor)
    found = torsional_buckling.critical_load(case, section, turned, material, _free_ends(result))
    if found is None:
        return None
    return torsional_buckling.resistance(
        found, turned, material, case.check.gamma_M1, curve="d", area=section.A
    )


def _view(segment, axis: str):
    """A segment's section about ``axis`` (``"major"``, ``"minor"``)."""
    return section_from_spec(dict(segment.spec), axis)


def _element(h: float):
    """∫N'ᵀN' and ∫N''ᵀN'' of a Hermite cubic element of length h (DOFs φ, φ' at each end)."""
    first = np.array(
        [
            [36, 3 * h, -36, 3 * h],
            [3 * h, 4 * h * h, -3 * h, -h * h],
            [-36, -3 * h, 36, -3 * h],
            [3 * h, -h * h, -3 * h, 4 * h * h],
        ]
    ) / (30.0 * h)
    second = (
        np.array(
            [
                [12, 6 * h, -12, 6 * h],
                [6 * h, 4 * h * h, -6 * h, 2 * h * h],
                [-12, -6 * h, 12, -6 * h],
                [6 * h, 2 * h * h, -6 * h, 4 * h * h],
            ]
        )
        / h**3
    )
    return first, second


def stepped_critical_load(case, pieces, free_ends=()) -> float | None:
    """N_cr,T [N] of a member stepped in section: the smallest λ of (GI_t φ')' − (EI_w φ'')'' = λ(i0² φ')'
    over the whole member (Timoshenko & Gere 1961 ch. 5's equation with properties constant by piece, from
    memory), by Hermite cubic elements (12 per piece: the eigenvalue to about 1e-7). ``pieces``: (start,
    end, GI_t, EI_w, i0²) along the member. The twist is held where :mod:`engine.torsional_buckling` holds
    it (its held points), φ' = 0 at a member end whose warping is fixed; None where nothing holds the twist.
    """
    held = torsional_buckling.held_points(case, free_ends)
    if not held:
        return None
    edges = sorted({0.0, float(case.length), *held, *(p[0] for p in pieces), *(p[1] for p in pieces)})
    nodes = []
    for a, b in zip(edges[:-1], edges[1:], strict=False):
        if b - a > 1e-12 * case.length:
            nodes.extend(np.linspace(a, b, 13)[:-1])
    nodes = np.array([*nodes, float(case.length)])
    size = 2 * len(nodes)
    K, G = np.zeros((size, size)), np.zeros((size, size))
    for i in range(len(nodes) - 1):
        h, mid = nodes[i + 1] - nodes[i], 0.5 * (nodes[i] + nodes[i + 1])
        GI_t, EI_w, i0 = next((p[2], p[3], p[4]) for p in pieces if p[0] <= mid <= p[1])
        first, second = _element(h)
        at = slice(2 * i, 2 * i + 4)
        K[at, at] += GI_t * first + EI_w * second
        G[at, at] += i0 * first
    fixed = {2 * int(np.argmin(np.abs(nodes - x))) for x in held}
    warping = dict(zip((0, len(nodes) - 1), case.check.ltb.warping_ends, strict=True))
    fixed |= {2 * i + 1 for i, end in warping.items() if end == "fixed" and nodes[i] in held}
    keep = [d for d in range(size) if d not in fixed]
    K, G = K[np.ix_(keep, keep)], G[np.ix_(keep, keep)]
    inverse = np.linalg.inv(np.linalg.cholesky(K))
    mu = np.linalg.eigvalsh(inverse @ G @ inverse.T)
    return 1.0 / float(mu[-1]) if mu[-1] > 0.0 else math.inf


def weakest_segment(result, segments, cache):
    """The torsional buckling check of a member stepped in section: N_cr,T of the stepped member
    (:func:`stepped_critical_load`) with each segment's resistance to it, the smallest N_b,T,Rd kept (each
    segment's area, f_y and curve; the weakest governs); None where no segment's section applies."""
    found = []
    for segment in segments:
        # the minor view under member_routes' own key for it (the same section, made once)
        minor = _made(cache, ("routes-minor-section", segment.spec), lambda s=segment: _view(s, "minor"))
        major = _made(cache, ("routes-view", "major", segment.spec), lambda s=segment: _view(s, "major"))
        twist = member_torsional(result, major, minor, segment.material)
        if twist is not None:
            found.append((segment, minor, twist))
    if not found:
        return None
    if len(found) < len(segments):  # a piece without torsional buckling (a closed section): not counted
        return min((t for _, _, t in found), key=lambda t: t.N_b_Rd)
    pieces = [(s.start, s.end, t.GI_t, t.EI_w, t.i0_squared) for s, _, t in found]
    free = _free_ends(result)
    N_cr = stepped_critical_load(result.case, pieces, free)
    if N_cr is None:
        return None
    gamma = result.case.check.gamma_M1
    checked = [
        torsional_buckling.resistance(dataclasses.replace(t, N_cr=N_cr), z, s.material, gamma)
        for s, z, t in found
    ]
    return min(checked, key=lambda t: t.N_b_Rd)


def term(N: float, twist) -> tuple[str, float, dict]:
    """(the term's code, N/N_b,T,Rd, its facts) for :func:`engine.member_routes._with_term`."""
    value = N / twist.N_b_Rd if twist.N_b_Rd > 0.0 else math.inf
    facts = {"N_cr_T": twist.N_cr, "L_T": twist.length, "chi_T": twist.chi, "N_b_T_Rd": twist.N_b_Rd}
    return torsional_buckling.TERM, value, facts
