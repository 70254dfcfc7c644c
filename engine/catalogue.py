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
    "INCH",
    "REFERENCES_S5",
    "ROLLED_I",
    "TIMBER",
    "W_SHAPES",
    "catalogue_names",
    "near_names",
    "normalise_name",
    "rolled_i_dimensions",
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

# US wide-flange (W) shapes, AISC Steel Construction Manual (15th ed.) Table 1-1, all from memory:
# (d, b_f, t_w, t_f, k_des) [in], then handbook A [in²], I_x [in⁴], Z_x [in³], S_x [in³], I_y [in⁴],
# Z_y [in³], S_y [in³]. The root radius is r = k_des − t_f. The Manual prints d and b_f to three figures, so
# the properties computed from them differ from its own (from the unrounded sizes) by up to about 1 %.
# W10x68 and W14x68 are left out: recalled as they are, their dimensions miss the handbook I_y (W10x68) and
# Z_x (W14x68) by more than 1 %.
W_SHAPES: dict[
    str, tuple[tuple[float, float, float, float, float], float, float, float, float, float, float, float]
] = {
    "W6x15": ((5.99, 5.99, 0.230, 0.260, 0.510), 4.43, 29.1, 10.8, 9.72, 9.32, 4.75, 3.11),
    "W6x20": ((6.20, 6.02, 0.260, 0.365, 0.615), 5.87, 41.4, 14.9, 13.4, 13.3, 6.72, 4.41),
    "W6x25": ((6.38, 6.08, 0.320, 0.455, 0.705), 7.34, 53.4, 18.9, 16.7, 17.1, 8.56, 5.61),
    "W8x18": ((8.14, 5.25, 0.230, 0.330, 0.630), 5.26, 61.9, 17.0, 15.2, 7.97, 4.66, 3.04),
    "W8x24": ((7.93, 6.50, 0.245, 0.400, 0.794), 7.08, 82.7, 23.1, 20.9, 18.3, 8.57, 5.63),
    "W8x31": ((8.00, 8.00, 0.285, 0.435, 0.829), 9.13, 110, 30.4, 27.5, 37.1, 14.1, 9.27),
    "W8x40": ((8.25, 8.07, 0.360, 0.560, 0.954), 11.7, 146, 39.8, 35.5, 49.1, 18.5, 12.2),
    "W8x48": ((8.50, 8.11, 0.400, 0.685, 1.08), 14.1, 184, 49.0, 43.2, 60.9, 22.9, 15.0),
    "W8x67": ((9.00, 8.28, 0.570, 0.935, 1.33), 19.7, 272, 70.1, 60.4, 88.6, 32.7, 21.4),
    "W10x26": ((10.3, 5.77, 0.260, 0.440, 0.740), 7.61, 144, 31.3, 27.9, 14.1, 7.50, 4.89),
    "W10x33": ((9.73, 7.96, 0.290, 0.435, 0.935), 9.71, 171, 38.8, 35.0, 36.6, 14.0, 9.20),
    "W10x39": ((9.92, 7.99, 0.315, 0.530, 1.03), 11.5, 209, 46.8, 42.1, 45.0, 17.2, 11.3),
    "W10x45": ((10.1, 8.02, 0.350, 0.620, 1.12), 13.3, 248, 54.9, 49.1, 53.4, 20.3, 13.3),
    "W10x49": ((9.98, 10.0, 0.340, 0.560, 1.06), 14.4, 272, 60.4, 54.6, 93.4, 28.3, 18.7),
    "W10x60": ((10.2, 10.1, 0.420, 0.680, 1.18), 17.7, 341, 74.6, 66.7, 116, 35.0, 23.0),
    "W12x26": ((12.2, 6.49, 0.230, 0.380, 0.680), 7.65, 204, 37.2, 33.4, 17.3, 8.17, 5.34),
    "W12x35": ((12.5, 6.56, 0.300, 0.520, 0.820), 10.3, 285, 51.2, 45.6, 24.5, 11.5, 7.47),
    "W12x50": ((12.2, 8.08, 0.370, 0.640, 1.14), 14.6, 391, 71.9, 64.2, 56.3, 21.3, 13.9),
    "W12x53": ((12.1, 10.0, 0.345, 0.575, 1.18), 15.6, 425, 77.9, 70.6, 95.8, 29.1, 19.2),
    "W12x65": ((12.1, 12.0, 0.390, 0.605, 1.20), 19.1, 533, 96.8, 87.9, 174, 44.1, 29.1),
    "W12x79": ((12.4, 12.1, 0.470, 0.735, 1.33), 23.2, 662, 119, 107, 216, 54.3, 35.8),
    "W14x22": ((13.7, 5.00, 0.230, 0.335, 0.735), 6.49, 199, 33.2, 29.0, 7.00, 4.39, 2.80),
    "W14x26": ((13.9, 5.03, 0.255, 0.420, 0.820), 7.69, 245, 40.2, 35.3, 8.91, 5.54, 3.55),
    "W14x30": ((13.8, 6.73, 0.270, 0.385, 0.785), 8.85, 291, 47.3, 42.0, 19.6, 8.99, 5.82),
    "W14x48": ((13.8, 8.03, 0.340, 0.595, 1.19), 14.1, 484, 78.4, 70.2, 51.4, 19.6, 12.8),
    "W14x61": ((13.9, 10.0, 0.375, 0.645, 1.24), 17.9, 640, 102, 92.1, 107, 32.8, 21.5),
    "W14x82": ((14.3, 10.1, 0.510, 0.855, 1.45), 24.0, 881, 139, 123, 148, 44.8, 29.3),
    "W14x90": ((14.0, 14.5, 0.440, 0.710, 1.31), 26.5, 999, 157, 143, 362, 75.6, 49.9),
    "W14x120": ((14.5, 14.7, 0.590, 0.940, 1.54), 35.3, 1380, 212, 190, 495, 102, 67.5),
    "W14x132": ((14.7, 14.7, 0.645, 1.03, 1.63), 38.8, 1530, 234, 209, 548, 113, 74.5),
    "W16x26": ((15.7, 5.50, 0.250, 0.345, 0.747), 7.68, 301, 44.2, 38.4, 9.59, 5.48, 3.49),
    "W16x31": ((15.9, 5.53, 0.275, 0.440, 0.842), 9.13, 375, 54.0, 47.2, 12.4, 7.03, 4.49),
    "W18x35": ((17.7, 6.00, 0.300, 0.425, 0.827), 10.3, 510, 66.5, 57.6, 15.3, 8.06, 5.12),
    "W18x50": ((18.0, 7.50, 0.355, 0.570, 0.972), 14.7, 800, 101, 88.9, 40.1, 16.6, 10.7),
    "W21x44": ((20.7, 6.50, 0.350, 0.450, 0.950), 13.0, 843, 95.4, 81.6, 20.7, 10.2, 6.37),
    "W24x55": ((23.6, 7.01, 0.395, 0.505, 1.01), 16.2, 1350, 134, 114, 29.1, 13.3, 8.30),
    "W24x68": ((23.7, 8.97, 0.415, 0.585, 1.09), 20.1, 1830, 177, 154, 70.4, 24.5, 15.7),
}

#: One inch [m], exact by definition (the international inch of 1959).
INCH = 0.0254

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
        E.g. ``"IPE 200"``, ``"HEB 200"``, ``"W10x49"``, ``"SHS 100x100x5"``, ``"CHS 114.3x5"``,
        ``"TIMBER 45x195"``.

    Examples
    --------
    >>> "HEB 200" in catalogue_names()
    True
    """
    return (*ROLLED_I, *W_SHAPES, *HOLLOW_RECTANGULAR, *HOLLOW_CIRCULAR, *TIMBER)


def rolled_i_dimensions(name: str) -> tuple[dict[str, float], str]:
    """The dimensions [m] of a catalogue rolled I/H section, and the standard they come from.

    Parameters
    ----------
    name : str
        A canonical name of :data:`ROLLED_I` or :data:`W_SHAPES`.

    Returns
    -------
    dims : dict
        ``h``, ``b``, ``tw``, ``tf`` and the root radius ``r`` [m]; a W shape's d, b_f, t_w, t_f converted
        exactly from inches (1 in = 0.0254 m), its r = k_des − t_f.
    standard : str
        E.g. ``"EN 10365"``.

    Raises
    ------
    KeyError
        When ``name`` is not a rolled I/H of the catalogue.

    Examples
    --------
    >>> dims, _ = rolled_i_dimensions("W8x31")
    >>> round(dims["h"], 6), round(dims["r"] * 1000.0, 4)
    (0.2032, 10.0076)
    """
    if name in ROLLED_I:
        h, b, tw, tf, r = (value / 1000.0 for value in ROLLED_I[name][0])
        return {"h": h, "b": b, "tw": tw, "tf": tf, "r": r}, "EN 10365"
    d, b_f, t_w, t_f, k_des = W_SHAPES[name][0]
    dims = {"h": d * INCH, "b": b_f * INCH, "tw": t_w * INCH, "tf": t_f * INCH, "r": (k_des - t_f) * INCH}
    return dims, "AISC Steel Construction Manual (15th ed.) Table 1-1 in inches, r = k_des − t_f"


# Patterns of a compacted name (re caches them on first use, so nothing is compiled at import).
_HE_LETTER_LAST = r"HE(\d+)([ABM])"
_US_W = r"W(\d+)X(\d+(?:\.\d+)?)"
_FAMILY_SIZE = r"([A-Z]+)(\d+(?:\.\d+)?(?:X\d+(?:\.\d+)?)*)"


def normalise_name(name: str) -> str:
    """The canonical spelling of a section name, case- and space-insensitive.

    Upper case, no spaces inside the family or the size, one space between them, ``x`` between the sizes
    (``×`` is accepted) and each size without trailing zeros. ``"HE 200 B"`` is read as ``"HEB 200"``. A US
    W shape is written as AISC writes it, without the space: ``"w 8 x 31"`` is ``"W8x31"``.
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
    >>> normalise_name("W 8 X 31"), normalise_name("w8×31")
    ('W8x31', 'W8x31')
    """
    if not isinstance(name, str):
        raise TypeError(f"a section name must be a string, not {type(name).__name__}")
    compact = re.sub(r"[\s\-_]+", "", name.upper().replace("×", "X"))
    letter_last = re.fullmatch(_HE_LETTER_LAST, compact)
    if letter_last:
        return f"HE{letter_last.group(2)} {letter_last.group(1)}"
    us_w = re.fullmatch(_US_W, compact)
    if us_w:
        return f"W{int(us_w.group(1))}x{float(us_w.group(2)):g}"
    family_size = re.fullmatch(_FAMILY_SIZE, compact)
    if family_size:
        sizes = "x".join(f"{float(part):g}" for part in family_size.group(2).split("X"))
        return f"{family_size.group(1)} {sizes}"
    return " ".join(name.upper().split())


_US_W_NAME = r"W(\d+)x(\d+(?:\.\d+)?)"  # a canonical W shape name


def _w_sizes(name: str) -> tuple[float, float]:
    """The nominal depth [in] and weight [lb/ft] in a canonical W shape name."""
    match = re.fullmatch(_US_W_NAME, name)
    return float(match[1]), float(match[2])


def _first_size(name: str) -> float:
    match = re.search(r"\d+(?:\.\d+)?", name)
    return float(match.group()) if match else math.inf


def near_names(name: str, names: tuple[str, ...]) -> list[str]:
    """Up to three catalogue names close to ``name``: the most alike first, then the nearest in size.

    A W shape's are the W shapes of the nearest nominal depth, then of the nearest weight.

    Examples
    --------
    >>> near_names("W14x68", catalogue_names())
    ['W14x61', 'W14x82', 'W14x48']
    """
    turned = re.fullmatch(r"RHS ([\d.]+)x([\d.]+)x([\d.]+)", name)
    if turned and f"RHS {turned[2]}x{turned[1]}x{turned[3]}" in names:
        return [f"RHS {turned[2]}x{turned[1]}x{turned[3]}"]  # the same tube, named depth first
    if re.fullmatch(_US_W_NAME, name):
        depth, weight = _w_sizes(name)
        shapes = [candidate for candidate in names if re.fullmatch(_US_W_NAME, candidate)]

        def distance(candidate: str) -> tuple[float, float]:
            other_depth, other_weight = _w_sizes(candidate)
            return abs(other_depth - depth), abs(other_weight - weight)

        return sorted(shapes, key=distance)[:3]
    size = _first_size(name)
    matcher = difflib.SequenceMatcher(b=name)
    scored = []
    for candidate in difflib.get_close_matches(name, names, n=10, cutoff=0.6):
        matcher.set_seq1(candidate)
        scored.append((-round(matcher.ratio(), 2), abs(_first_size(candidate) - size), candidate))
    return [candidate for *_, candidate in sorted(scored)[:3]]
