"""The exports' shared look, fixed texts and argument checks."""

from __future__ import annotations

import datetime as _datetime
import math
from importlib import metadata

from app.units import Units
from app.units import units as _units_of
from engine.codes import alpha_cr_limit

#: A4 (ISO 216: 210 mm × 297 mm) in inches, landscape and portrait (width, height).
A4_LANDSCAPE = (297 / 25.4, 210 / 25.4)
A4_PORTRAIT = (210 / 25.4, 297 / 25.4)

_DPI_RANGE = (30, 600)

# strutscope's own neutral look: black and greys for print, one muted slate blue for the total offset w + w0
# and a brick red kept for danger-level text only.
_INK = "#1e1e1e"
_GREY = "#6e6e6e"
_LIGHT = "#b4b4b4"
_FILL = "#dcdcdc"
_GRID = "#e6e6e6"
_ACCENT = "#3c6482"
_DANGER = "#9a2f22"
_FONT = "DejaVu Sans"  # shipped with matplotlib, so every export looks the same on every machine


_REFERENCES = (
    "S. P. Timoshenko and J. M. Gere, Theory of Elastic Stability, 2nd ed., McGraw-Hill, 1961, ch. 1 "
    "(beam-columns) and ch. 2 (elastic buckling of bars).",
    "E. C. Pestel and F. A. Leckie, Matrix Methods in Elastomechanics, McGraw-Hill, 1963 "
    "(field-matrix method).",
    "W. H. Wittrick and F. W. Williams, A general algorithm for computing natural frequencies of elastic "
    "structures, Q. J. Mech. Appl. Math. 24 (1971) 263–284 (counting the critical loads).",
    "EN 1993-1-1:2005, Eurocode 3, Part 1-1: §5.2.1 (α_cr), §5.2.2(7)a (bow in a second-order analysis, then "
    "cross-section checks), Table 5.1 (initial bow e0/L), §6.2 (cross-section resistance).",
    "AISC 360-16, Specification for Structural Steel Buildings, Appendix 8 (B1, C_m) and Commentary "
    "Table C-A-8.1 (ψ).",
)

_METHOD = (
    "The governing equation EI w'''' + N w'' = q(x) − N w0''(x) is solved in closed form on every segment "
    "between load positions and the segments are joined by the end conditions, continuity and the jumps at "
    "point loads and couples (field-matrix method, solved as one global system): no mesh, no iteration. "
    "The elastic critical loads are the roots of the member's exact characteristic equation, none missed "
    "(Wittrick–Williams count). The first-order solution is the same case with N = 0. With a section and "
    "material, the cross-section is checked at every station with the second-order forces, the route of "
    "EN 1993-1-1 §5.2.2(7)a with the initial bow in the analysis."
)

_DEFINITIONS_TEXT = (
    "Definitions: moment amplification = max|M_II| / max|M_I + N·w0| (the reference holds the bow's moment, "
    "as the deflection's holds w0); AISC B1 is compared on the member without its bow. A preset bow with "
    "automatic direction is solved both ways and the worse kept; with a free or guided end it follows the "
    "first mode, plus the sway of EN 1993-1-1 eq. (5.5). Utilisation = strength and stability; deflection = "
    "a separate service check without the bow, on the loads as given or, with load cases, on the governing "
    "service combination."
)

# How the resistance side is defined (issue 12), printed under the method on the calc sheet.
_RESISTANCE_DEFINITIONS = (
    "Eq. (5.9) bow: first mode of amplitude e0·N_cr/(EI·|η''|max), checked by N/(N_Rk/γ_M1) + "
    "M/(M_Rk/γ_M1) ≤ 1 (reaches χ·A·f_y/γ_M1). Out of plane: N/N_b,Rd, eq. (6.47). Class by Table 5.2; "
    "class 4: effective properties of EN 1993-1-5 §4.3–4.4 where they are computed (I and box sections), "
    "else no valid result; N ≥ Pcr1: no valid result; either unbounded (fails). "
    f"α_cr limit {alpha_cr_limit():g} (elastic analysis)."
)

# --------------------------------------------------------------------------------------------------------
# Arguments.


def _units(value) -> Units:
    return _units_of(value)


def _dpi(dpi) -> float:
    low, high = _DPI_RANGE
    if isinstance(dpi, bool) or not isinstance(dpi, (int, float)) or not math.isfinite(dpi):
        raise ValueError(f"dpi: {dpi!r} must be a number from {low} to {high}")
    if not low <= dpi <= high:
        raise ValueError(f"dpi: {dpi!r} is outside the allowed range {low} to {high}")
    return float(dpi)


def _date_text(date) -> str:
    if date is None:
        return _datetime.date.today().isoformat()
    if isinstance(date, _datetime.datetime):
        return date.date().isoformat()
    if isinstance(date, _datetime.date):
        return date.isoformat()
    if isinstance(date, str):
        return _one_line(date)
    raise ValueError(f"date: {date!r} must be None (today), a datetime.date or text")


def _name(field: str, value) -> str:
    if not isinstance(value, str):
        raise ValueError(f"{field}: {value!r} must be text (a name or initials), or empty")
    return _one_line(value)


def _one_line(text: str) -> str:
    return " ".join(str(text).split())


def _title(result) -> str:
    title = _one_line(getattr(result.case, "title", "") or "")
    return title or "(untitled case)"


def _version() -> str:
    try:
        return metadata.version("strutscope")
    except metadata.PackageNotFoundError:
        return "(not installed)"
