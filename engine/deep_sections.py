"""Sections that buckle laterally although they are not open I/H sections: a solid rectangle or an RHS
bent about its stronger axis (the lateral-torsional buckling check and its caution read them)."""

from __future__ import annotations

__all__ = ["deep_hollow", "deep_solid", "stronger_axis_named_minor"]


def deep_hollow(section) -> bool:
    """An RHS deeper in the plane of bending than across it: not spared lateral-torsional buckling
    (EN 1993-1-1 §6.3.2.1(2) spares square and circular hollow sections; from memory)."""
    d, b = section.depth, section.width
    return section.shape == "rhs" and d is not None and b is not None and d > b * (1.0 + 1e-9)


def deep_solid(section) -> bool:
    """A solid rectangle deeper in the plane of bending than across it (a flat bar, a timber joist bent about
    its stronger axis): it buckles laterally like a deep beam (Timoshenko & Gere 1961 §6.2); a square, or one
    bent about its weaker axis, does not."""
    depth, width = section.depth, section.width
    return section.shape == "rectangle" and depth is not None and width is not None and depth > width


def stronger_axis_named_minor(section, axis: str) -> dict | None:
    """The fields of the danger caution ``stronger-axis-named-minor`` (:class:`engine.cautions.Caution`) where
    the plane analysed bends a rectangle or RHS about its stronger axis under the name "minor" (b > h): the
    lateral-torsional buckling check runs for the plane called major only, so it would be missed (a
    self-audit: an RHS given as 100×300 read 0.635 where given upright it reads 0.827). None otherwise."""
    if axis != "minor" or not (deep_solid(section) or deep_hollow(section)):
        return None
    return {
        "level": "danger",
        "code": "stronger-axis-named-minor",
        "message": (
            "The plane analysed bends the section about its stronger axis (b > h) although the case calls it "
            "minor: lateral-torsional buckling is not checked for it. Give the section with h ≥ b bent about "
            "'major' to have it checked."
        ),
        "source": "EN 1993-1-1:2005 §6.3.2.1 (from memory); a decision of this project",
    }
