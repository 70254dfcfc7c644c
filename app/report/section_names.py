"""A section's name in the page's units: a parametric section's dimensions in mm (SI) or in (US), a catalogue
section's own name (``HEB 200``, ``W10x49``, ``SHS 100x100x5``) as the catalogue writes it.

The engine names a parametric section by its dimensions in millimetres without a unit (``RHS 200×100×8
cold-formed``); a US page would then mix millimetres with inches. The name is rebuilt here from the section's
dimensions (SI, metres) in the page's small-length unit, with the unit written once at the end.
"""

from __future__ import annotations

from app.units import Units

__all__ = ["section_name"]

#: The words the engine's parametric names start with, by shape (engine.sections._describe).
_PARAMETRIC = ("rolled_i", "welded_i", "rhs", "chs", "rectangle", "round")


def section_name(section, U: Units) -> str:
    """``section``'s name in units ``U``; a catalogue or custom section's own name."""
    dims = getattr(section, "dimensions", None) or {}
    name = str(section.name)
    named_by_size = "×" in name or name.startswith("round ")  # a catalogue name writes "x"
    if section.shape not in _PARAMETRIC or not dims or not named_by_size:
        return name
    unit = U.unit("small_length")

    def size(*keys) -> str:
        return "×".join(f"{dims[key] * unit.factor:.4g}" for key in keys)

    tail = name.rsplit(" ", 1)[-1] if section.shape in ("rhs", "chs") else ""
    words = {
        "rolled_i": lambda: f"rolled I {size('h', 'b', 'tw', 'tf')} {unit.label}, r {size('r')} {unit.label}",
        "welded_i": lambda: f"welded I {size('h', 'b', 'tw', 'tf')} {unit.label}",
        "rhs": lambda: f"{name.split(' ', 1)[0]} {size('h', 'b', 't')} {unit.label} {tail}",
        "chs": lambda: f"CHS {size('D', 't')} {unit.label} {tail}",
        "rectangle": lambda: f"rectangle {size('b', 'h')} {unit.label}",
        "round": lambda: f"round {size('D')} {unit.label}",
    }
    return words[section.shape]()
