"""Display units for the page and the command line; the engine itself stays in SI.

A :class:`Units` holds one :class:`Unit` per kind of quantity. Each unit converts an SI value into the value
shown by multiplying it by its ``factor``:

.. math::

    v_\\text{shown} = f \\, v_\\text{SI}

The US customary factors follow from the exact definitions 1 in = 0.0254 m, 1 ft = 0.3048 m and
1 lbf = 4.4482216152605 N (NIST SP 811 (2008) Appendix B, from memory), with 1 kip = 1000 lbf.

>>> units("si").show("moment", 27170.0)
'27.17 kN·m'
>>> units("us").show("small_length", 0.0254)
'1.000 in'
"""

from __future__ import annotations

import math
from dataclasses import dataclass, fields

__all__ = ["UNIT_SYSTEMS", "KINDS", "Unit", "Units", "format_number", "units"]

#: The units systems :func:`units` knows: SI (kN, m, mm) and US customary (kip, ft, in).
UNIT_SYSTEMS = ("si", "us")

# Exact by definition (NIST SP 811 (2008) Appendix B, from memory).
_INCH = 0.0254  # [m]
_FOOT = 12 * _INCH  # [m] = 0.3048 m
_KIP = 1000 * 4.4482216152605  # [N]

# Round-off in engineering units: a summary shows at most this many decimals, so a moment of 1e-16 kN·m at a
# pinned end shows as 0 (the command line does the same).
_MAX_DECIMALS = 3


@dataclass(frozen=True, kw_only=True)
class Unit:
    """One display unit.

    Attributes
    ----------
    label : str
        What is printed after the number, e.g. ``"kN·m"``.
    factor : float
        Shown value per SI value [label per SI unit]: 1e-3 for kN from N.
    """

    label: str
    factor: float

    def from_si(self, value_si):
        """Return `value_si` (SI; a float or a numpy array) in this unit."""
        return value_si * self.factor

    def to_si(self, value):
        """Return `value` (in this unit; a float or a numpy array) in SI."""
        return value / self.factor


@dataclass(frozen=True, kw_only=True)
class Units:
    """The display units of one system, one :class:`Unit` per kind of quantity.

    Attributes
    ----------
    system : str
        ``"si"`` or ``"us"``.
    force : Unit
        kN | kip.
    length : Unit
        m | ft (positions along the member, its length).
    small_length : Unit
        mm | in (deflections, bows, section dimensions).
    moment : Unit
        kN·m | kip·ft.
    line_load : Unit
        kN/m | kip/ft.
    stress : Unit
        MPa | ksi (moduli and strengths).
    stiffness : Unit
        kN·m² | kip·ft² (bending stiffness EI).
    area : Unit
        cm² | in².
    second_moment : Unit
        cm⁴ | in⁴.
    warping : Unit
        cm⁶ | in⁶ (the warping constant I_w).
    rotation : Unit
        mrad in both systems.
    translational_spring : Unit
        kN/m | kip/in (support springs k_t).
    rotational_spring : Unit
        kN·m/rad | kip·ft/rad (support springs k_r).
    foundation_modulus : Unit
        kN/m² | kip/in² (an elastic foundation's modulus k: force per length of member per deflection; the
        same unit on the page, in the sketch, the words, the CSV, the calc sheet and the batch column).
    """

    system: str
    force: Unit
    length: Unit
    small_length: Unit
    moment: Unit
    line_load: Unit
    stress: Unit
    stiffness: Unit
    area: Unit
    second_moment: Unit
    warping: Unit
    rotation: Unit
    translational_spring: Unit
    rotational_spring: Unit
    foundation_modulus: Unit

    def unit(self, kind: str) -> Unit:
        """Return the :class:`Unit` of `kind` (one of :data:`KINDS`); ValueError naming ``kind`` otherwise."""
        if kind not in KINDS:
            allowed = ", ".join(map(repr, KINDS))
            raise ValueError(f"kind: {kind!r} is not a kind of quantity; allowed: {allowed}")
        return getattr(self, kind)

    def label(self, kind: str) -> str:
        """Return the unit label of `kind`, e.g. ``"kN·m"``."""
        return self.unit(kind).label

    def convert(self, kind: str, value_si):
        """Return `value_si` (SI; a float or a numpy array) in the display unit of `kind`."""
        return self.unit(kind).from_si(value_si)

    def show(self, kind: str, value_si: float | None, digits: int = 4) -> str:
        """Return `value_si` [SI] as text in the display unit of `kind`, e.g. ``"27.17 kN·m"``.

        Parameters
        ----------
        kind : str
            One of :data:`KINDS`.
        value_si : float or None
            The value in SI units.
        digits : int
            Significant figures, 4 by default; at most three decimals are shown.

        Returns
        -------
        str
            The number and the unit; ``"unbounded"`` for +inf (the engine's value at a critical load),
            ``"unbounded (negative)"`` for -inf and ``"n/a"`` for None or NaN, each without a unit.
        """
        unit = self.unit(kind)
        if value_si is None or not math.isfinite(float(value_si)):
            return format_number(value_si)
        return f"{format_number(float(value_si) * unit.factor, digits)} {unit.label}"


#: The kinds of quantity a :class:`Units` converts (its fields after ``system``).
KINDS = tuple(f.name for f in fields(Units) if f.name != "system")


def format_number(value: float | None, digits: int = 4, max_decimals: int = _MAX_DECIMALS) -> str:
    """Return `value` to about `digits` significant figures, fixed-point where that stays readable.

    Parameters
    ----------
    value : float or None
        The number (already in its display unit).
    digits : int
        Significant figures.
    max_decimals : int
        Fixed-point output stops at this many decimals, so round-off noise shows as ``0``.

    Returns
    -------
    str
        ``"unbounded"`` for +inf, ``"unbounded (negative)"`` for -inf, ``"n/a"`` for None or NaN.

    Examples
    --------
    >>> format_number(3279.412), format_number(3279.412, 5), format_number(1.2e-16), format_number(4.2e9)
    ('3279', '3279.4', '0', '4.200e+09')
    """
    if value is None:
        return "n/a"
    value = float(value)
    if math.isnan(value):
        return "n/a"
    if math.isinf(value):
        return "unbounded" if value > 0 else "unbounded (negative)"
    if value == 0.0:
        return "0"
    magnitude = max(math.floor(math.log10(abs(value))), -max_decimals)
    if magnitude < 7:
        decimals = min(max(digits - 1 - magnitude, 0), max_decimals)
        text = f"{value:.{decimals}f}"
        # A value that rounds to zero would print as "-0.000" or "0.000".
        return "0" if float(text) == 0.0 else text
    return f"{value:.{digits - 1}e}"


def _system(system: str, **units: tuple[str, float]) -> Units:
    return Units(
        system=system, **{kind: Unit(label=label, factor=factor) for kind, (label, factor) in units.items()}
    )


def units(system: str = "si") -> Units:
    """Return the display units of `system`.

    Parameters
    ----------
    system : str
        ``"si"`` (kN, m, mm, kN·m, MPa) or ``"us"`` (kip, ft, in, kip·ft, ksi). A :class:`Units` is
        returned as it is.

    Returns
    -------
    Units

    Raises
    ------
    ValueError
        Naming ``units`` when `system` is anything else.
    """
    if isinstance(system, Units):
        return system
    if system == "si":
        return _system(
            "si",
            force=("kN", 1e-3),
            length=("m", 1.0),
            small_length=("mm", 1e3),
            moment=("kN·m", 1e-3),
            line_load=("kN/m", 1e-3),
            stress=("MPa", 1e-6),
            stiffness=("kN·m²", 1e-3),
            area=("cm²", 1e4),
            second_moment=("cm⁴", 1e8),
            warping=("cm⁶", 1e12),
            rotation=("mrad", 1e3),
            translational_spring=("kN/m", 1e-3),
            rotational_spring=("kN·m/rad", 1e-3),
            foundation_modulus=("kN/m²", 1e-3),
        )
    if system == "us":
        return _system(
            "us",
            force=("kip", 1 / _KIP),
            length=("ft", 1 / _FOOT),
            small_length=("in", 1 / _INCH),
            moment=("kip·ft", 1 / (_KIP * _FOOT)),
            line_load=("kip/ft", _FOOT / _KIP),
            stress=("ksi", _INCH**2 / _KIP),
            stiffness=("kip·ft²", 1 / (_KIP * _FOOT**2)),
            area=("in²", 1 / _INCH**2),
            second_moment=("in⁴", 1 / _INCH**4),
            warping=("in⁶", 1 / _INCH**6),
            rotation=("mrad", 1e3),
            translational_spring=("kip/in", _INCH / _KIP),
            rotational_spring=("kip·ft/rad", 1 / (_KIP * _FOOT)),
            foundation_modulus=("kip/in²", _INCH**2 / _KIP),
        )
    allowed = ", ".join(map(repr, UNIT_SYSTEMS))
    raise ValueError(f"units: {system!r} is not a units system; allowed: {allowed}")
