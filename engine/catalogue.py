"""The section catalogue: names and stored dimensions of rolled I/H, hollow and sawn-timber sections.

Data only, with the name lookup: :func:`catalogue_names`, :func:`normalise_name` (the canonical spelling of a
name) and :func:`near_names` (suggestions for a name not found). :mod:`engine.sections` computes every
catalogue section's properties exactly from these dimensions (:mod:`engine.section_properties`).
"""

from __future__ import annotations

import difflib
import math
import re

__all__ = [
    "HOLLOW_CIRCULAR",
    "HOLLOW_RECTANGULAR",
    "REFERENCES_S5",
    "ROLLED_I",
    "TIMBER",
    "catalogue_names",
    "near_names",
    "normalise_name",
]


# Every catalogue value below is from memory unless a comment names references.md §5, whose catalogue
# values are themselves flagged [memory] there (each recomputed from its dimensions, [derived]). The
# properties of a catalogue section are computed exactly from its stored dimensions; the handbook A and I
# are kept only so that the tests can check each entry's dimensions against them.

# EN 10365 rolled I/H (from memory): (h, b, tw, tf, r) [mm], then handbook A [cm²], I_y [cm⁴], I_z [cm⁴]
# (from memory).
ROLLED_I: dict[str, tuple[tuple[float, float, float, float, float], float, float, float]] = {
    "IPE 80": ((80, 46, 3.8, 5.2, 5), 7.64, 80.14, 8.49),
    "IPE 100": ((100, 55, 4.1, 5.7, 7), 10.32, 171.0, 15.92),
    "IPE 120": ((120, 64, 4.4, 6.3, 7), 13.21, 317.8, 27.67),
    "IPE 140": ((140, 73, 4.7, 6.9, 7), 16.43, 541.2, 44.92),
    "IPE 160": ((160, 82, 5.0, 7.4, 9), 20.09, 869.3, 68.31),
    "IPE 180": ((180, 91, 5.3, 8.0, 9), 23.95, 1317, 100.9),
    "IPE 200": ((200, 100, 5.6, 8.5, 12), 28.48, 1943, 142.4),  # references.md §5
    "IPE 220": ((220, 110, 5.9, 9.2, 12), 33.37, 2772, 204.9),
    "IPE 240": ((240, 120, 6.2, 9.8, 15), 39.12, 3892, 283.6),
    "IPE 270": ((270, 135, 6.6, 10.2, 15), 45.95, 5790, 419.9),
    "IPE 300": ((300, 150, 7.1, 10.7, 15), 53.81, 8356, 603.8),  # references.md §5
    "IPE 330": ((330, 160, 7.5, 11.5, 18), 62.61, 11770, 788.1),
    "IPE 360": ((360, 170, 8.0, 12.7, 18), 72.73, 16270, 1043),
    "IPE 400": ((400, 180, 8.6, 13.5, 21), 84.46, 23130, 1318),
    "IPE 450": ((450, 190, 9.4, 14.6, 21), 98.82, 33740, 1676),
    "IPE 500": ((500, 200, 10.2, 16.0, 21), 115.5, 48200, 2142),
    "IPE 550": ((550, 210, 11.1, 17.2, 24), 134.4, 67120, 2668),
    "IPE 600": ((600, 220, 12.0, 19.0, 24), 156.0, 92080, 3387),
    "HEA 100": ((96, 100, 5.0, 8.0, 12), 21.24, 349.2, 133.8),
    "HEA 120": ((114, 120, 5.0, 8.0, 12), 25.34, 606.2, 230.9),
    "HEA 140": ((133, 140, 5.5, 8.5, 12), 31.42, 1033, 389.3),
    "HEA 160": ((152, 160, 6.0, 9.0, 15), 38.77, 1673, 615.6),
    "HEA 180": ((171, 180, 6.0, 9.5, 15), 45.25, 2510, 924.6),
    "HEA 200": ((190, 200, 6.5, 10.0, 18), 53.83, 3692, 1336),  # references.md §5
    "HEA 220": ((210, 220, 7.0, 11.0, 18), 64.34, 5410, 1955),
    "HEA 240": ((230, 240, 7.5, 12.0, 21), 76.84, 7763, 2769),
    "HEA 260": ((250, 260, 7.5, 12.5, 24), 86.82, 10450, 3668),
    "HEA 280": ((270, 280, 8.0, 13.0, 24), 97.26, 13670, 4763),
    "HEA 300": ((290, 300, 8.5, 14.0, 27), 112.5, 18260, 6310),
    "HEA 320": ((310, 300, 9.0, 15.5, 27), 124.4, 22930, 6985),
    "HEA 340": ((330, 300, 9.5, 16.5, 27), 133.5, 27690, 7436),
    "HEA 360": ((350, 300, 10.0, 17.5, 27), 142.8, 33090, 7887),
    "HEA 400": ((390, 300, 11.0, 19.0, 27), 159.0, 45070, 8564),
    "HEA 450": ((440, 300, 11.5, 21.0, 27), 178.0, 63720, 9465),
    "HEA 500": ((490, 300, 12.0, 23.0, 27), 197.5, 86970, 10370),
    "HEA 550": ((540, 300, 12.5, 24.0, 27), 211.8, 111900, 10820),
    "HEA 600": ((590, 300, 13.0, 25.0, 27), 226.5, 141200, 11270),
    "HEB 100": ((100, 100, 6.0, 10.0, 12), 26.04, 449.5, 167.3),
    "HEB 120": ((120, 120, 6.5, 11.0, 12), 34.01, 864.4, 317.5),
    "HEB 140": ((140, 140, 7.0, 12.0, 12), 42.96, 1509, 549.7),
    "HEB 160": ((160, 160, 8.0, 13.0, 15), 54.25, 2492, 889.2),
    "HEB 180": ((180, 180, 8.5, 14.0, 15), 65.25, 3831, 1363),
    "HEB 200": ((200, 200, 9.0, 15.0, 18), 78.08, 5696, 2003),  # references.md §5
    "HEB 220": ((220, 220, 9.5, 16.0, 18), 91.04, 8091, 2843),
    "HEB 240": ((240, 240, 10.0, 17.0, 21), 106.0, 11260, 3923),
    "HEB 260": ((260, 260, 10.0, 17.5, 24), 118.4, 14920, 5135),
    "HEB 280": ((280, 280, 10.5, 18.0, 24), 131.4, 19270, 6595),
    "HEB 300": ((300, 300, 11.0, 19.0, 27), 149.1, 25170, 8563),
    "HEB 320": ((320, 300, 11.5, 20.5, 27), 161.3, 30820, 9239),
    "HEB 340": ((340, 300, 12.0, 21.5, 27), 170.9, 36660, 9690),
    "HEB 360": ((360, 300, 12.5, 22.5, 27), 180.6, 43190, 10140),
    "HEB 400": ((400, 300, 13.5, 24.0, 27), 197.8, 57680, 10820),
    "HEB 450": ((450, 300, 14.0, 26.0, 27), 218.0, 79890, 11720),
    "HEB 500": ((500, 300, 14.5, 28.0, 27), 238.6, 107200, 12620),
    "HEB 550": ((550, 300, 15.0, 29.0, 27), 254.1, 136700, 13080),
    "HEB 600": ((600, 300, 15.5, 30.0, 27), 270.0, 171000, 13530),
}

# EN 10210-2 hot-finished square and rectangular hollow sections: (h, b, t) [mm], then handbook A [cm²],
# I_y [cm⁴], I_z [cm⁴] (I_z None for a square one). Sizes from EN 10210-2, handbook values from memory, except
# SHS 100x100x5 from references.md §5.
HOLLOW_RECTANGULAR: dict[str, tuple[tuple[float, float, float], float, float, float | None]] = {
    "SHS 100x100x5": ((100, 100, 5.0), 18.7, 279, None),  # references.md §5
    "SHS 100x100x8": ((100, 100, 8.0), 28.8, 400, None),
    "SHS 150x150x8": ((150, 150, 8.0), 44.8, 1491, None),
    "RHS 150x100x6.3": ((150, 100, 6.3), 29.7, 898, 474),
    "RHS 200x100x8": ((200, 100, 8.0), 44.8, 2234, 739),
    "RHS 300x200x10": ((300, 200, 10.0), 95.7, 11820, 6280),
}

# EN 10210-2 hot-finished circular hollow sections: (D, t) [mm], then handbook A [cm²], I [cm⁴]. Sizes from
# EN 10210-2, handbook values from memory, except CHS 114.3x5 from references.md §5.
HOLLOW_CIRCULAR: dict[str, tuple[tuple[float, float], float, float]] = {
    "CHS 114.3x5": ((114.3, 5.0), 17.17, 256.9),  # references.md §5
    "CHS 139.7x6.3": ((139.7, 6.3), 26.4, 589),
    "CHS 168.3x8": ((168.3, 8.0), 40.3, 1297),
    "CHS 219.1x10": ((219.1, 10.0), 65.7, 3598),
    "CHS 273x10": ((273.0, 10.0), 82.6, 7154),
}

# Common sawn-timber sizes, (b, h) [mm], width × depth in the style of EN 336 (common practice, no source).
# A and I are exact by formula, so only the dimensions are stored.
TIMBER: dict[str, tuple[float, float]] = {
    "TIMBER 45x95": (45, 95),
    "TIMBER 45x145": (45, 145),
    "TIMBER 45x195": (45, 195),
    "TIMBER 45x220": (45, 220),
    "TIMBER 63x175": (63, 175),
    "TIMBER 75x200": (75, 200),
    "TIMBER 90x270": (90, 270),
    "TIMBER 115x315": (115, 315),
}

REFERENCES_S5 = ("IPE 200", "IPE 300", "HEB 200", "HEA 200", "SHS 100x100x5", "CHS 114.3x5")


def catalogue_names() -> tuple[str, ...]:
    """The names of every catalogue section, in their canonical spelling.

    Returns
    -------
    tuple of str
        E.g. ``"IPE 200"``, ``"HEB 200"``, ``"SHS 100x100x5"``, ``"CHS 114.3x5"``, ``"TIMBER 45x195"``.

    Examples
    --------
    >>> "HEB 200" in catalogue_names()
    True
    """
    return (*ROLLED_I, *HOLLOW_RECTANGULAR, *HOLLOW_CIRCULAR, *TIMBER)


# Patterns of a compacted name (re caches them on first use, so nothing is compiled at import).
_HE_LETTER_LAST = r"HE(\d+)([ABM])"
_FAMILY_SIZE = r"([A-Z]+)(\d+(?:\.\d+)?(?:X\d+(?:\.\d+)?)*)"


def normalise_name(name: str) -> str:
    """The canonical spelling of a section name, case- and space-insensitive.

    Upper case, no spaces inside the family or the size, one space between them, ``x`` between the sizes
    (``×`` is accepted) and each size without trailing zeros. ``"HE 200 B"`` is read as ``"HEB 200"``.
    A name of another form comes back upper-cased with its spaces collapsed. The name need not be in the
    catalogue.

    Parameters
    ----------
    name : str
        A section name, e.g. ``"heb200"``.

    Returns
    -------
    str
        The canonical name, e.g. ``"HEB 200"``.

    Raises
    ------
    TypeError
        When ``name`` is not a string.

    Examples
    --------
    >>> normalise_name("heb200"), normalise_name("HE 200 B"), normalise_name("shs 100 × 100 × 5.0")
    ('HEB 200', 'HEB 200', 'SHS 100x100x5')
    """
    if not isinstance(name, str):
        raise TypeError(f"a section name must be a string, not {type(name).__name__}")
    compact = re.sub(r"[\s\-_]+", "", name.upper().replace("×", "X"))
    letter_last = re.fullmatch(_HE_LETTER_LAST, compact)
    if letter_last:
        return f"HE{letter_last.group(2)} {letter_last.group(1)}"
    family_size = re.fullmatch(_FAMILY_SIZE, compact)
    if family_size:
        sizes = "x".join(f"{float(part):g}" for part in family_size.group(2).split("X"))
        return f"{family_size.group(1)} {sizes}"
    return " ".join(name.upper().split())


def _first_size(name: str) -> float:
    match = re.search(r"\d+(?:\.\d+)?", name)
    return float(match.group()) if match else math.inf


def near_names(name: str, names: tuple[str, ...]) -> list[str]:
    """Up to three catalogue names close to ``name``: the most alike first, then the nearest in size."""
    turned = re.fullmatch(r"RHS ([\d.]+)x([\d.]+)x([\d.]+)", name)
    if turned and f"RHS {turned[2]}x{turned[1]}x{turned[3]}" in names:
        return [f"RHS {turned[2]}x{turned[1]}x{turned[3]}"]  # the same tube, named depth first
    size = _first_size(name)
    matcher = difflib.SequenceMatcher(b=name)
    scored = []
    for candidate in difflib.get_close_matches(name, names, n=10, cutoff=0.6):
        matcher.set_seq1(candidate)
        scored.append((-round(matcher.ratio(), 2), abs(_first_size(candidate) - size), candidate))
    return [candidate for *_, candidate in sorted(scored)[:3]]
