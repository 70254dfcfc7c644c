"""End conditions: the boundary rows of the solution and the check that a support set can carry load.

Every end condition is one linear equation in the end state ``(w, w', M, T)`` (conventions.md):

- translation fixed: ``w = 0``; free: ``T = 0``; spring ``k_t``: ``T(0) = k_t w(0)`` and ``T(L) = -k_t w(L)``;
- rotation fixed: ``w' = 0``; free: ``M = 0``; spring ``k_r``: ``M(0) = -k_r w'(0)`` and ``M(L) = k_r w'(L)``.

A uniform Euler–Bernoulli member has two rigid-body motions, a sideways translation and a rotation, so a
support set is stable exactly when something restrains translation and, unless both ends do, something also
restrains rotation (common practice, no source). A spring of stiffness zero restrains nothing.
"""

from __future__ import annotations

import numpy as np

from engine.errors import CaseError

__all__ = ["boundary_rows", "restrains", "check_stable"]


def restrains(value) -> bool:
    """Whether one end condition (``"fixed"``, ``"free"`` or a spring stiffness) restrains its motion."""
    if value == "fixed":
        return True
    if value == "free":
        return False
    return float(value) > 0.0


def boundary_rows(support, side: str) -> np.ndarray:
    """The two boundary rows of one end, as coefficients of the end state ``(w, w', M, T)``.

    Parameters
    ----------
    support : EndSupport
        The end's translation and rotation conditions.
    side : {"left", "right"}
        Which end. The spring conditions change sign between the ends.

    Returns
    -------
    ndarray, shape (2, 4)
        Rows ``r`` with ``r @ (w, w', M, T) = 0`` at that end.
    """
    sign = -1.0 if side == "left" else 1.0
    rows = np.zeros((2, 4))
    t = support.translation
    if t == "fixed":
        rows[0, 0] = 1.0
    elif t == "free":
        rows[0, 3] = 1.0
    else:  # T(0) - k w(0) = 0 at the left end, T(L) + k w(L) = 0 at the right end
        rows[0, 0] = sign * float(t)
        rows[0, 3] = 1.0
    r = support.rotation
    if r == "fixed":
        rows[1, 1] = 1.0
    elif r == "free":
        rows[1, 2] = 1.0
    else:  # M(0) + k w'(0) = 0 at the left end, M(L) - k w'(L) = 0 at the right end
        rows[1, 1] = -sign * float(r)
        rows[1, 2] = 1.0
    return rows


def _describe(support) -> str:
    name = support.name
    if name is not None:
        return f"'{name}'"
    return f"translation {support.translation!r}, rotation {support.rotation!r}"


def check_stable(case) -> None:
    """Raise :class:`CaseError` when the supports leave the member a mechanism.

    Parameters
    ----------
    case : Case
        Only ``case.left`` and ``case.right`` are read.

    Raises
    ------
    CaseError
        Naming ``supports`` and the rigid-body motion that nothing restrains. A mechanism is refused even when
        tension would steady it (a hanging pendulum), because the first-order comparison must exist.
    """
    left, right = case.left, case.right
    translations = restrains(left.translation) + restrains(right.translation)
    rotations = restrains(left.rotation) + restrains(right.rotation)
    ends = f"left {_describe(left)}, right {_describe(right)}"
    if translations == 0:
        raise CaseError(
            f"supports: {ends} leave the member free to move sideways (a mechanism); "
            "restrain translation at one end at least (pinned, fixed or a translation spring)"
        )
    if translations == 1 and rotations == 0:
        end = "left" if restrains(left.translation) else "right"
        raise CaseError(
            f"supports: {ends} let the member swing about its {end} end (a mechanism); "
            "restrain translation at the other end as well, or restrain rotation at either end"
        )
