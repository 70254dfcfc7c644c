"""Exports of one solved case, shared by the page and the command line: a figure, PNG, CSV, a PDF calc sheet
and the case file.

Every function here is a pure function of an engine :class:`engine.Result` (what ``engine.solve(case)``
returns) and does no mechanics: each number shown is a value the result holds, converted to display units
with :mod:`app.units`. Figures use matplotlib's object API only (``matplotlib.figure.Figure``; never pyplot,
which keeps global state), so the functions are safe to call from a server handling several sessions.

At a critical load the engine's response values are +inf: they are shown as "unbounded", left out of the
plots and written as ``inf`` in the CSV.
"""

from __future__ import annotations

import datetime as _datetime
import functools
import io
import math
from importlib import metadata

import numpy as np
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.backends.backend_pdf import PdfPages
from matplotlib.figure import Figure
from matplotlib.font_manager import FontProperties
from matplotlib.lines import Line2D
from matplotlib.patches import Polygon, Rectangle
from matplotlib.textpath import TextToPath
from matplotlib.ticker import MaxNLocator

from app.fonts import drawable, families
from app.safe_text import csv_comment, csv_writer
from app.units import KINDS, UNIT_SYSTEMS, Units, format_number
from app.units import units as _units_of

__all__ = [
    "A4_LANDSCAPE",
    "A4_PORTRAIT",
    "calc_sheet_figures",
    "case_json",
    "csv_text",
    "pdf_bytes",
    "png_bytes",
    "result_figure",
]

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

_SYSTEM_NAMES = {"si": "SI (kN, m, mm, kN·m)", "us": "US customary (kip, ft, in, kip·ft)"}

_REFERENCES = (
    "S. P. Timoshenko and J. M. Gere, Theory of Elastic Stability, 2nd ed., McGraw-Hill, 1961, ch. 1 "
    "(beam-columns) and ch. 2 (elastic buckling of bars).",
    "E. C. Pestel and F. A. Leckie, Matrix Methods in Elastomechanics, McGraw-Hill, 1963 "
    "(field-matrix method).",
    "W. H. Wittrick and F. W. Williams, A general algorithm for computing natural frequencies of elastic "
    "structures, Q. J. Mech. Appl. Math. 24 (1971) 263–284 (counting the critical loads).",
    "EN 1993-1-1:2005, Eurocode 3, Part 1-1: §5.2.1 (α_cr), §5.2.2(7)a (bow in a second-order analysis, then "
    "cross-section checks), Table 5.1 (initial bow e0/L), §6.2 (cross-section resistance). Clause numbers "
    "from memory.",
    "AISC 360-16, Specification for Structural Steel Buildings, Appendix 8 (B1, C_m) and Commentary "
    "Table C-A-8.1 (ψ). Clause numbers from memory.",
)

_METHOD = (
    "The governing equation EI w'''' + P w'' = q(x) − P w0''(x) is solved in closed form on every segment "
    "between load positions and the segments are joined by the end conditions, continuity and the jumps at "
    "point loads and couples (field-matrix method, solved as one global system): no mesh, no iteration. "
    "The elastic critical loads are the roots of the member's exact characteristic equation, none missed "
    "(Wittrick–Williams count). The first-order solution is the same case with P = 0. With a section and "
    "material, the cross-section is checked at every station with the second-order forces, the route of "
    "EN 1993-1-1 §5.2.2(7)a with the initial bow in the analysis."
)

_DEFINITIONS_TEXT = (
    "Definitions: moment amplification = max|M_II| / max|M_I + N·w0| (the reference holds the bow's moment, "
    "as the deflection's holds w0); AISC B1 is compared on the member without its bow. A preset bow with "
    "automatic direction is solved both ways and the worse kept; with a free or guided end it follows the "
    "first mode, plus the sway of EN 1993-1-1 eq. (5.5). Utilisation = strength and stability; deflection = "
    "a separate service check on the loads as given, without the bow."
)

# How the resistance side is defined (issue 12), printed under the method on the calc sheet.
_RESISTANCE_DEFINITIONS = (
    "Eq. (5.9) bow: first mode of amplitude e0·N_cr/(EI·|η''|max), checked by N/(N_Rk/γ_M1) + "
    "M/(M_Rk/γ_M1) ≤ 1 (reaches χ·A·f_y/γ_M1). Out of plane: N/N_b,Rd, eq. (6.47). Class by Table 5.2; "
    "class 4 or N ≥ Pcr1: no valid result, utilisation unbounded (fails). α_cr limit 10 (elastic analysis)."
)

_FALLBACK_CAUTION = (
    "Elastic analysis of one member in one plane. Not a full code check: lateral-torsional buckling, "
    "biaxial bending and the interaction of EN 1993-1-1 eqs. (6.61)/(6.62), class 4 sections, "
    "connections and load combinations are not checked. Check the results against your local codes "
    "and have them reviewed by a licensed engineer."
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


# --------------------------------------------------------------------------------------------------------
# Words and numbers from the result.


def _finite(value) -> bool:
    return value is not None and math.isfinite(float(value))


def _ratio(value, decimals: int = 3) -> str:
    if value is None:
        return "n/a"
    if not math.isfinite(float(value)):
        return format_number(value)
    return f"{float(value):.{decimals}f}"


def _percent(value) -> str:
    if not _finite(value):
        return format_number(value)
    return f"{float(value):+.1%}"


def _scientific(value) -> str:
    if not _finite(value):
        return format_number(value)
    return f"{float(value):.1e}"


def _general_caution(result) -> str:
    for caution in result.cautions:
        if caution.code == "scope":
            return caution.message
    # The first-order result carries no cautions; the exports carry the caution whatever they are given.
    return _FALLBACK_CAUTION


def _title(result) -> str:
    title = _one_line(getattr(result.case, "title", "") or "")
    return title or "(untitled case)"


def _support_text(end, U: Units, sep: str = ", ") -> str:
    if end.name is not None:
        return end.name
    parts = []
    for part, kind, symbol in (
        ("translation", "translational_spring", "k_t"),
        ("rotation", "rotational_spring", "k_r"),
    ):
        value = getattr(end, part)
        if isinstance(value, str):
            parts.append(f"{part} {value}")
        else:
            parts.append(f"{part} spring {symbol} = {U.show(kind, value)}")
    return sep.join(parts)


def _load_text(load, length: float, U: Units) -> str:
    kind = getattr(load, "type", type(load).__name__)
    if kind == "uniform":
        a, b = load.span(length)
        return (
            f"uniform q = {U.show('line_load', load.q)} "
            f"from x = {U.show('length', a)} to {U.show('length', b)}"
        )
    if kind == "linear":
        a, b = load.span(length)
        return (
            f"linear q = {U.show('line_load', load.q_start)} to {U.show('line_load', load.q_end)} "
            f"from x = {U.show('length', a)} to {U.show('length', b)}"
        )
    if kind == "point":
        # F, as conventions.md names a point load, so that P stays the axial force.
        return f"point load F = {U.show('force', load.P)} at x = {U.show('length', load.x)}"
    if kind == "couple":
        return f"couple C = {U.show('moment', load.C)} at x = {U.show('length', load.x)}"
    return repr(load)


def _axial_text(force: float, U: Units) -> str:
    # Five figures, as for the critical loads, so that P and Pcr1 compare at a glance.
    if force > 0:
        return f"{U.show('force', force, 5)} compression"
    if force < 0:
        return f"{U.show('force', -force, 5)} tension"
    return "none"


def _load_ratio(result) -> str:
    """P/Pcr1, the reciprocal of alpha_cr, in words."""
    pcr1 = float(result.critical_loads[0])
    if result.axial_force == 0 or not _finite(pcr1) or pcr1 <= 0:
        return ""
    return f"P/Pcr1 = {result.axial_force / pcr1:.3f}"


def _bow_text(result, U: Units) -> str:
    bow = result.bow
    if bow is not None:
        label = bow.label
        if U.system != "si":
            # The engine words its label in mm; show the amplitude in the display unit instead.
            engine_text = f"{abs(bow.amplitude) * 1e3:.2f} mm"
            label = label.replace(engine_text, U.show("small_length", abs(bow.amplitude)))
        return label + (" (against the loads)" if bow.opposes_load else "")
    imperfection = result.case.imperfection
    if imperfection.shape == "none" or imperfection.amplitude == 0:
        return "none"
    return f"{imperfection.shape}, amplitude {U.show('small_length', imperfection.amplitude)}"


def _status_text(result, U: Units) -> str:
    """The status and the engine's message, which quotes its numbers in SI units."""
    if not result.message:
        return result.status
    note = "" if U.system == "si" else " [the engine's words, in SI units]"
    return f"{result.status}: {_one_line(result.message)}{note}"


def _has_bow(result) -> bool:
    bow = np.asarray(result.initial_bow, dtype=float)
    return bool(np.any(bow != 0))


def _stiffness_text(result, U: Units) -> str:
    text = f"EI = {U.show('stiffness', result.EI)}"
    factor = getattr(result.case, "stiffness_factor", 1.0)
    if factor != 1.0:
        text += f" (stiffness factor {factor:g} applied)"
    return text


def _section_text(result, U: Units) -> str | None:
    section = result.section
    if section is None:
        return None
    return (
        f"{section.name}, {section.axis} axis: A = {U.show('area', section.A)}, "
        f"I = {U.show('second_moment', section.I)}"
    )


def _material_text(result, U: Units) -> str | None:
    material = result.material
    if material is None:
        return None
    return f"{material.name}: E = {U.show('stress', material.E, 5)}, fy = {U.show('stress', material.fy)}"


def _peak_text(peak, kind: str, U: Units) -> str:
    if not _finite(peak.value):
        return format_number(peak.value)
    return f"{U.show(kind, peak.value)} at x = {U.show('length', peak.x)}"


def _governing_rows(result):
    """(label, field, kind) of the governing values shown everywhere."""
    rows = [("largest |w|", "deflection", "small_length")]
    if _has_bow(result):
        rows.append(("largest |w + w0|", "total_offset", "small_length"))
    rows += [("largest |M|", "moment", "moment"), ("largest |V|", "shear", "force")]
    return rows


def _pcr_text(result, U: Units, n: int = 1) -> str:
    return U.show("force", float(result.critical_loads[n - 1]), 5)


def _alpha_text(result) -> str:
    if result.axial_force > 0:
        return _ratio(result.alpha_cr)
    return "∞ (no compression)"


def _utilisation_text(result, U: Units) -> str | None:
    check = result.check
    if check is not None:
        where = f" at x = {U.show('length', check.x)}" if _finite(check.x) else ""
        fails = " fails" if math.isinf(check.utilization) else ""
        return f"{_ratio(check.utilization)}{fails} ({check.kind}{where})"
    if result.utilization is not None:
        return _ratio(result.utilization)
    return None


# --------------------------------------------------------------------------------------------------------
# Text layout: greedy wrapping by measured widths, used by the figure's title block and the calc sheet.


class _Measure:
    """Widths of text in points, per word, in the export font (widths scale with the font size)."""

    _REFERENCE_SIZE = 10.0

    def __init__(self) -> None:
        self._path = TextToPath()
        # DejaVu Sans, then installed fonts for other scripts (app.fonts): measured as they are drawn.
        self._props = {
            weight: FontProperties(family=families(), size=self._REFERENCE_SIZE, weight=weight)
            for weight in ("normal", "bold")
        }
        self._cache: dict = {}

    def width(self, text: str, size: float, weight: str = "normal") -> float:
        key = (text, weight)
        width = self._cache.get(key)
        if width is None:
            width = self._path.get_text_width_height_descent(text, self._props[weight], ismath=False)[0]
            self._cache[key] = width
        return width * size / self._REFERENCE_SIZE

    def wrap(self, text: str, width_pt: float, size: float, weight: str = "normal") -> list[str]:
        """Split `text` into lines no wider than `width_pt` [pt].

        A line never breaks around ``=`` or between a number and its unit ("x = 2.961 m" stays whole), unless
        such a group is itself wider than a line.
        """
        groups = []
        for group in _glued(text.split()):
            if len(group) > 1 and self.width(" ".join(group), size, weight) > width_pt:
                groups.extend([word] for word in group)
            else:
                groups.append(group)
        # A word wider than a line (a long title without spaces) is broken between characters.
        groups = [
            [piece]
            for group in groups
            for piece in (
                self._pieces(group[0], width_pt, size, weight) if len(group) == 1 else [" ".join(group)]
            )
        ]
        if not groups:
            return [""]
        words = [" ".join(group) for group in groups]
        space = self.width(" ", size, weight)
        lines, line, used = [], [words[0]], self.width(words[0], size, weight)
        for word in words[1:]:
            w = self.width(word, size, weight)
            if used + space + w <= width_pt:
                line.append(word)
                used += space + w
            else:
                lines.append(" ".join(line))
                line, used = [word], w
        lines.append(" ".join(line))
        return lines

    def _pieces(self, word: str, width_pt: float, size: float, weight: str) -> list[str]:
        """`word` in pieces no wider than `width_pt` (one piece when it fits)."""
        if self.width(word, size, weight) <= width_pt:
            return [word]
        # Hinting at screen resolutions widens a run of glyphs by up to about 4 % (digits in bold at 100 dpi,
        # measured with the Agg renderer): a line cut between characters has no space to absorb it.
        width_pt *= 0.95
        pieces, piece = [], ""
        for char in word:
            if piece and self.width(piece + char, size, weight) > width_pt:
                pieces.append(piece)
                piece = ""
            piece += char
        return pieces + [piece]

    def shorten(self, line: str, width_pt: float, size: float, weight: str = "normal") -> str:
        """`line` cut to end with an ellipsis within `width_pt`."""
        while line and self.width(line + "…", size, weight) > width_pt:
            line = line[:-1]
        return line.rstrip() + "…"


@functools.cache
def _unit_words() -> frozenset:
    """Every unit label of every units system."""
    return frozenset(_units_of(system).label(kind) for system in UNIT_SYSTEMS for kind in KINDS)


def _glued(words: list[str]) -> list[list[str]]:
    """Group `words` that must stay on one line: ``a = b`` and a number with its unit."""
    groups: list[list[str]] = []
    for word in words:
        core = word.rstrip(",;:.)")
        if groups and (word == "=" or groups[-1][-1] == "=" or core in _unit_words()):
            groups[-1].append(word)
        else:
            groups.append([word])
    return groups


class _Flow:
    """Places lines of text top-down in a rectangle of a figure (inches from the figure's lower left).

    With ``draw=False`` it only measures, so a caller can find the font size at which a block fits.
    """

    # Kerning and hinting make a line slightly wider than the sum of its words; keep a margin.
    _SAFETY = 0.97

    def __init__(self, fig, measure: _Measure, *, left, right, top, bottom, size, draw=True, new_page=None):
        self.fig, self.measure = fig, measure
        self.left, self.right, self.top, self.bottom = left, right, top, bottom
        self.size, self.draw, self.new_page = size, draw, new_page
        self.y = top
        self.pages = 1
        self.overflow = False

    @property
    def width(self) -> float:
        return self.right - self.left

    def _line_height(self, size: float) -> float:
        return size * 1.3 / 72

    def _room(self, height: float) -> None:
        if self.y - height >= self.bottom:
            return
        if self.new_page is not None:
            self.pages += 1
            if self.draw:
                self.fig = self.new_page()
            self.y = self.top
        else:
            self.overflow = True

    def _put(self, x, text, size, weight, color, ha="left") -> None:
        if self.draw:
            w, h = self.fig.get_size_inches()
            self.fig.text(
                x / w,
                self.y / h,
                text,
                fontsize=size,
                fontweight=weight,
                color=color,
                ha=ha,
                va="top",
                family=families(),
                parse_math=False,
            )

    def space(self, points: float) -> None:
        self.y -= points / 72

    def para(
        self, text, *, scale=1.0, weight="normal", color=_INK, indent=0.0, hanging=0.0, keep=1, max_lines=None
    ) -> None:
        """A wrapped paragraph; `hanging` indents the lines after the first [in]; beyond `max_lines` lines
        the last one shown ends with an ellipsis."""
        size = self.size * scale
        step = self._line_height(size)
        width_pt = (self.width - indent) * 72 * self._SAFETY
        text = drawable(text)  # characters no export font has become '?' (app.fonts)
        first, *rest = self.measure.wrap(text, width_pt, size, weight) if text else [""]
        rest = self.measure.wrap(" ".join(rest), width_pt - hanging * 72, size, weight) if rest else []
        lines = [(indent, first)] + [(indent + hanging, line) for line in rest]
        if max_lines is not None and len(lines) > max_lines:
            x, last = lines[max_lines - 1]
            room = width_pt - (x - indent) * 72
            lines = lines[: max_lines - 1] + [(x, self.measure.shorten(last, room, size, weight))]
        self._room(step * min(keep, len(lines)))
        for x, line in lines:
            self._room(step)
            self._put(self.left + x, line, size, weight, color)
            self.y -= step

    def heading(self, text, *, scale=1.15) -> None:
        size = self.size * scale
        self._room(self._line_height(size) * 3)  # never a heading alone at the foot of a page
        self.space(size * 0.5)
        self.para(text, scale=scale, weight="bold")
        self.space(size * 0.15)

    def row(self, cells, widths, *, scale=1.0, weight="normal", color=_INK, indent=0.0) -> None:
        """One table row: `cells` wrapped in columns of `widths` [in] (None: the rest of the line)."""
        size = self.size * scale
        step = self._line_height(size)
        x = self.left + indent
        columns = []
        for cell, width in zip(cells, widths, strict=True):
            width = (self.right - x) if width is None else width
            columns.append(
                (x, self.measure.wrap(drawable(cell), (width - 0.06) * 72 * self._SAFETY, size, weight))
            )
            x += width
        lines = max(len(text) for _, text in columns)
        self._room(step * lines)
        for i in range(lines):
            for x, text in columns:
                if i < len(text):
                    self._put(x, text[i], size, weight, color)
            self.y -= step

    def rule(self, color=_LIGHT) -> None:
        if self.draw:
            w, h = self.fig.get_size_inches()
            self.fig.add_artist(
                Line2D(
                    [self.left / w, self.right / w],
                    [self.y / h, self.y / h],
                    color=color,
                    lw=0.6,
                    transform=self.fig.transFigure,
                )
            )
        self.space(3)


def _fit(render, sizes) -> float:
    """The largest font size in `sizes` at which ``render(size=, draw=False)`` fits (else the smallest).

    `render` returns how far its text ran past the bottom of its box [in]; zero or less fits.
    """
    for size in sizes:
        if render(size=size, draw=False) <= 0:
            return size
    return sizes[-1]


# --------------------------------------------------------------------------------------------------------
# The figure.


class _Scale:
    """Converts lengths in inches into data units of one axes (the sketch is drawn in inches on the page)."""

    def __init__(self, ax):
        fig_w, fig_h = ax.figure.get_size_inches()
        box = ax.get_position()
        x0, x1 = ax.get_xlim()
        y0, y1 = ax.get_ylim()
        self.x = (x1 - x0) / (box.width * fig_w)
        self.y = (y1 - y0) / (box.height * fig_h)

    def dx(self, inches: float) -> float:
        return inches * self.x

    def dy(self, inches: float) -> float:
        return inches * self.y


def _hatch(ax, s, x0, x1, y0, y1, *, direction):
    """Short diagonal ticks behind a ground or wall line from (x0, y0) to (x1, y1)."""
    n = 6
    for t in np.linspace(0.0, 1.0, n):
        x, y = x0 + t * (x1 - x0), y0 + t * (y1 - y0)
        if direction == "down":
            ax.plot([x, x - s.dx(0.07)], [y, y - s.dy(0.09)], color=_INK, lw=0.7)
        else:  # "left" or "right" of a wall
            sign = -1 if direction == "left" else 1
            ax.plot([x, x + sign * s.dx(0.09)], [y, y - s.dy(0.07)], color=_INK, lw=0.7)


def _zigzag(ax, s, x, y_top, y_bottom):
    n = 7
    ys = np.linspace(y_top, y_bottom, 2 * n + 1)
    xs = np.full_like(ys, x)
    xs[1:-1:2] += s.dx(0.06)
    xs[2:-1:2] -= s.dx(0.06)
    xs[1] = x + s.dx(0.03)
    ax.plot(xs, ys, color=_INK, lw=0.9)


def _coil(ax, s, x, y, outward):
    """A rotational spring: a spiral of 1.6 turns around the end."""
    theta = np.linspace(0.0, 1.6 * 2 * np.pi, 120)
    r = 0.03 + 0.11 * theta / theta[-1]
    ax.plot(x + outward * s.dx(r * np.cos(theta)), y + s.dy(r * np.sin(theta)), color=_INK, lw=0.9)


def _draw_support(ax, s, end, xe, outward, U: Units):
    """Draw one end's restraint with strutscope's own simple symbols; return its label."""
    translation, rotation = end.translation, end.rotation
    label = _support_text(end, U, sep="\n")
    if rotation == "fixed":
        if translation == "fixed":
            wall = xe
        else:  # guided: the end plate rides on two rollers against the wall
            wall = xe + outward * s.dx(0.13)
            ax.plot([xe, xe], [-s.dy(0.17), s.dy(0.17)], color=_INK, lw=1.6)
            for yy in (-0.09, 0.09):
                cx = xe + outward * s.dx(0.065)
                t = np.linspace(0, 2 * np.pi, 40)
                ax.plot(cx + s.dx(0.05 * np.cos(t)), s.dy(yy) + s.dy(0.05 * np.sin(t)), color=_INK, lw=0.8)
        ax.plot([wall, wall], [-s.dy(0.24), s.dy(0.24)], color=_INK, lw=1.3)
        _hatch(ax, s, wall, wall, s.dy(0.24), -s.dy(0.24), direction="left" if outward < 0 else "right")
        if not isinstance(translation, str):
            _zigzag(ax, s, xe, 0.0, -s.dy(0.42))
            ax.plot([xe - s.dx(0.1), xe + s.dx(0.1)], [-s.dy(0.42)] * 2, color=_INK, lw=1.0)
            _hatch(ax, s, xe - s.dx(0.1), xe + s.dx(0.1), -s.dy(0.42), -s.dy(0.42), direction="down")
        return label
    if translation == "fixed":
        depth, half = s.dy(0.22), s.dx(0.12)
        ax.add_patch(
            Polygon(
                [[xe, 0.0], [xe - half, -depth], [xe + half, -depth]],
                closed=True,
                fc="white",
                ec=_INK,
                lw=0.9,
                zorder=3,
            )
        )
        ax.plot([xe - 1.5 * half, xe + 1.5 * half], [-depth] * 2, color=_INK, lw=1.0)
        _hatch(ax, s, xe - 1.5 * half, xe + 1.5 * half, -depth, -depth, direction="down")
    elif not isinstance(translation, str):
        _zigzag(ax, s, xe, 0.0, -s.dy(0.42))
        ax.plot([xe - s.dx(0.1), xe + s.dx(0.1)], [-s.dy(0.42)] * 2, color=_INK, lw=1.0)
        _hatch(ax, s, xe - s.dx(0.1), xe + s.dx(0.1), -s.dy(0.42), -s.dy(0.42), direction="down")
    if not isinstance(rotation, str):
        _coil(ax, s, xe, 0.0, outward)
    elif translation != "free":
        t = np.linspace(0, 2 * np.pi, 40)  # the hinge
        ax.fill(xe + s.dx(0.035 * np.cos(t)), s.dy(0.035 * np.sin(t)), fc="white", ec=_INK, lw=0.8, zorder=4)
    return label


def _arrow(ax, x0, y0, x1, y1, *, color=_INK, lw=0.9, head=6):
    ax.annotate(
        "",
        xy=(x1, y1),
        xytext=(x0, y0),
        arrowprops=dict(
            arrowstyle=f"-|>,head_length={head / 10:.2f},head_width={head / 20:.2f}",
            color=color,
            lw=lw,
            shrinkA=0,
            shrinkB=0,
        ),
    )


def _draw_loads(ax, s, result, U: Units, L_si: float):
    case = result.case
    f = U.length.factor
    distributed = [load for load in case.loads if load.type in ("uniform", "linear")]
    q_max = 0.0
    for load in distributed:
        values = (load.q,) if load.type == "uniform" else (load.q_start, load.q_end)
        q_max = max(q_max, *(abs(v) for v in values))
    base, band = 0.10, 0.62  # sketch units; the member is at 0, the point loads reach 1.0
    tier = band / max(len(distributed), 1)
    for i, load in enumerate(distributed):
        a, b = load.span(L_si)
        xs = np.linspace(a, b, 60)
        if load.type == "uniform":
            q = np.full_like(xs, load.q)
        else:
            q = load.q_start + (load.q_end - load.q_start) * (xs - a) / (b - a)
        y0 = base + i * tier
        height = 0.85 * tier * np.abs(q) / q_max if q_max > 0 else np.zeros_like(xs)
        top = y0 + height
        ax.fill_between(xs * f, y0, top, color=_FILL, lw=0, alpha=0.7)
        ax.plot(xs * f, top, color=_INK, lw=0.8)
        count = max(3, int(round(12 * (b - a) / L_si)) + 1)
        for xa in np.linspace(a, b, count):
            qa = np.interp(xa, xs, q)
            ya = y0 + (0.85 * tier * abs(qa) / q_max if q_max > 0 else 0.0)
            if ya - y0 < 0.02:
                continue
            if qa > 0:
                _arrow(ax, xa * f, ya, xa * f, y0, lw=0.6, head=4)
            else:
                _arrow(ax, xa * f, y0, xa * f, ya, lw=0.6, head=4)
        if load.type == "uniform":
            text = f"q = {U.show('line_load', load.q)}"
        else:
            text = f"q = {U.show('line_load', load.q_start)} to {U.show('line_load', load.q_end)}"
        ax.text(
            0.5 * (a + b) * f,
            y0 + 0.85 * tier + 0.02,
            text,
            ha="center",
            va="bottom",
            fontsize=6.5,
            color=_INK,
            parse_math=False,
            bbox=dict(fc="white", ec="none", alpha=0.75, pad=0.3),
        )
    for load in case.loads:
        # Labels near an end lean inward, clear of the axial-force label beyond the end.
        where = load.x / L_si if load.type in ("point", "couple") else 0.5
        ha = "left" if where < 0.12 else ("right" if where > 0.88 else "center")
        if load.type == "point":
            xp = load.x * f
            if load.P >= 0:
                _arrow(ax, xp, 0.95, xp, 0.02, lw=1.2, head=7)
            else:
                _arrow(ax, xp, 0.02, xp, 0.95, lw=1.2, head=7)
            xt = xp + {"left": -s.dx(0.05), "right": s.dx(0.05), "center": 0.0}[ha]
            ax.text(
                xt,
                0.98,
                f"F = {U.show('force', load.P)}",
                ha=ha,
                va="bottom",
                fontsize=6.5,
                color=_INK,
                parse_math=False,
            )
        elif load.type == "couple":
            xc = load.x * f
            # A positive couple makes M jump up by C (conventions.md); with + load drawn downward that is a
            # clockwise couple in this sketch.
            clockwise = load.C >= 0
            if clockwise:
                theta = np.linspace(np.radians(160), np.radians(-110), 80)
            else:
                theta = np.linspace(np.radians(20), np.radians(290), 80)
            r = 0.16
            xs = xc + s.dx(r * np.cos(theta))
            ys = s.dy(r * np.sin(theta))
            ax.plot(xs[:-1], ys[:-1], color=_INK, lw=1.1)
            _arrow(ax, xs[-4], ys[-4], xs[-1], ys[-1], lw=1.1, head=6)
            ax.text(
                xc,
                s.dy(r) + 0.04,
                f"C = {U.show('moment', load.C)}",
                ha=ha,
                va="bottom",
                fontsize=6.5,
                color=_INK,
                parse_math=False,
            )


def _draw_sketch(ax, result, U: Units):
    """The member to scale along x: supports, loads, the axial force and the initial bow (exaggerated)."""
    case = result.case
    L_si = float(case.length)
    L = U.length.from_si(L_si)
    ax.set_ylim(-1.25, 1.3)
    ax.axis("off")
    s = _Scale(ax)
    ax.plot([0, L], [0, 0], color=_INK, lw=2.6, solid_capstyle="butt", zorder=2)

    left_label = _draw_support(ax, s, case.left, 0.0, -1, U)
    right_label = _draw_support(ax, s, case.right, L, +1, U)
    for xe, label, ha in ((0.0, left_label, "left"), (L, right_label, "right")):
        ax.text(xe, -s.dy(0.50), label, ha=ha, va="top", fontsize=6.5, color=_INK, parse_math=False)

    _draw_loads(ax, s, result, U, L_si)

    P = float(result.axial_force)
    if P != 0:
        walls = case.left.rotation == "fixed", case.right.rotation == "fixed"
        gap = (0.36 if walls[0] else 0.12), (0.36 if walls[1] else 0.12)
        length = 0.42
        ends = [(0.0, -1, gap[0]), (L, +1, gap[1])]
        if walls[0] != walls[1]:
            # The wall takes the axial force itself: draw it at the other end only.
            ends = [ends[1]] if walls[0] else [ends[0]]
        for xe, outward, g in ends:
            near, far = xe + outward * s.dx(g), xe + outward * s.dx(g + length)
            if P > 0:
                _arrow(ax, far, 0.0, near, 0.0, lw=1.6, head=8)
            else:
                _arrow(ax, near, 0.0, far, 0.0, lw=1.6, head=8)
        label_x = L + s.dx(gap[1]) if (L, +1, gap[1]) in ends else -s.dx(gap[0] + length)
        sense = "compression" if P > 0 else "tension"
        ax.text(
            label_x,
            s.dy(0.09),
            f"P = {U.show('force', abs(P), 5)}\n{sense}",
            ha="left",
            va="bottom",
            fontsize=6.8,
            color=_INK,
            parse_math=False,
            linespacing=1.1,
        )

    if _has_bow(result):
        bow = np.asarray(result.initial_bow, dtype=float)
        largest = float(np.max(np.abs(bow)))
        scale = 0.38 / largest
        x = U.length.from_si(np.asarray(result.x, dtype=float))
        ax.plot(x, -bow * scale, color=_ACCENT, lw=1.0, ls=(0, (5, 3)), zorder=1)
        i = int(np.argmax(np.abs(bow)))
        where = x[i] / L if L > 0 else 0.5
        ha = "left" if where < 0.3 else ("right" if where > 0.7 else "center")
        xt = x[i] + (s.dx(0.35) if ha == "left" else (-s.dx(0.35) if ha == "right" else 0.0))
        ax.text(
            xt,
            -bow[i] * scale - np.sign(bow[i]) * 0.05,
            f"initial bow w0, largest {U.show('small_length', largest)} (drawn exaggerated)",
            ha=ha,
            va="top" if bow[i] > 0 else "bottom",
            fontsize=6.5,
            color=_ACCENT,
            parse_math=False,
        )

    if result.status != "stable":
        ax.text(
            ax.get_xlim()[1],
            1.28,
            f"{result.status}: P at or above Pcr1, a state the member never reaches",
            ha="right",
            va="top",
            fontsize=7,
            color=_DANGER,
            fontweight="bold",
            parse_math=False,
        )

    # Dimension line: the sketch is to scale along the member.
    y_dim = -1.05
    ax.plot([0, L], [y_dim, y_dim], color=_GREY, lw=0.6)
    for xe in (0.0, L):
        ax.plot([xe, xe], [y_dim - 0.06, y_dim + 0.06], color=_GREY, lw=0.6)
    ax.text(
        L / 2,
        y_dim + 0.03,
        f"L = {U.show('length', L_si)}",
        ha="center",
        va="bottom",
        fontsize=6.8,
        color=_GREY,
        parse_math=False,
    )
    ax.text(
        ax.get_xlim()[0],
        1.28,
        "Member (to scale along x; + load and + w point down here)",
        ha="left",
        va="top",
        fontsize=7,
        color=_GREY,
        parse_math=False,
    )


def _finite_array(values) -> np.ndarray | None:
    array = np.asarray(values, dtype=float)
    return array if np.all(np.isfinite(array)) else None


def _mark_peak(ax, peak, kind, U: Units, *, color, first, inverted, length, outer):
    if not _finite(peak.value):
        return
    xd = U.length.from_si(peak.x)
    yd = U.convert(kind, peak.value)
    ax.plot(
        [xd],
        [yd],
        ls="none",
        marker="o",
        ms=4.2,
        mfc="white" if first else color,
        mec=color,
        mew=1.0,
        zorder=6,
    )
    # The larger of the two peaks is labelled away from zero, the other on the side of zero.
    outward = 1.0 if yd >= 0 else -1.0
    if not outer:
        outward = -outward
    if inverted:
        outward = -outward
    left = xd <= 0.5 * length
    text = ("first order " if first else "") + f"{U.show(kind, peak.value)} at x = {U.show('length', peak.x)}"
    ax.annotate(
        text,
        (xd, yd),
        xytext=(5 if left else -5, 6 * outward),
        textcoords="offset points",
        ha="left" if left else "right",
        va="bottom" if outward > 0 else "top",
        fontsize=6.6,
        color=color,
        parse_math=False,
        zorder=7,
        bbox=dict(fc="white", ec="none", alpha=0.8, pad=0.2),
    )


def _limits(ax, arrays, *, inverted=False):
    values = [a for a in arrays if a is not None]
    lo = min([0.0] + [float(np.min(a)) for a in values])
    hi = max([0.0] + [float(np.max(a)) for a in values])
    span = hi - lo
    if span <= 0:
        span = 1.0
    lo, hi = lo - 0.32 * span, hi + 0.32 * span
    ax.set_ylim((hi, lo) if inverted else (lo, hi))


def _unbounded_note(ax, text):
    ax.text(
        0.5,
        0.5,
        text,
        transform=ax.transAxes,
        ha="center",
        va="center",
        fontsize=7.5,
        color=_DANGER,
        parse_math=False,
        bbox=dict(fc="white", ec=_DANGER, lw=0.6, pad=3),
    )


def _diagram(ax, result, U: Units, specs, *, kind, ylabel, inverted=False, fill=False):
    """One diagram: `specs` lists (second-order array, first-order array, colour, second peak, first peak)."""
    x = U.length.from_si(np.asarray(result.x, dtype=float))
    length = U.length.from_si(float(result.case.length))
    ax.axhline(0.0, color=_LIGHT, lw=0.7, zorder=1)
    plotted, skipped = [], False
    for second, first, color, peak2, peak1 in specs:
        second = _finite_array(U.convert(kind, np.asarray(second, dtype=float)))
        first = None if first is None else _finite_array(U.convert(kind, np.asarray(first, dtype=float)))
        if second is not None:
            if fill:
                ax.fill_between(x, 0.0, second, color=_FILL, alpha=0.55, lw=0, zorder=1)
            ax.plot(x, second, color=color, lw=1.4, zorder=3)
            plotted.append(second)
        else:
            skipped = True
        if first is not None:
            ax.plot(x, first, color=color, lw=1.0, ls=(0, (4, 2.5)), zorder=2)
            plotted.append(first)
        both = second is not None and first is not None and peak2 is not None and peak1 is not None
        second_outer = not both or peak2.magnitude >= peak1.magnitude
        if second is not None and peak2 is not None:
            _mark_peak(
                ax,
                peak2,
                kind,
                U,
                color=color,
                first=False,
                inverted=inverted,
                length=length,
                outer=second_outer,
            )
        if first is not None and peak1 is not None:
            _mark_peak(
                ax,
                peak1,
                kind,
                U,
                color=color,
                first=True,
                inverted=inverted,
                length=length,
                outer=not second_outer,
            )
    _limits(ax, plotted, inverted=inverted)
    if skipped:
        _unbounded_note(ax, "second order unbounded: the axial force is at a critical load (not plotted)")
    ax.set_ylabel(ylabel, fontsize=7.5, color=_INK)
    ax.grid(True, color=_GRID, lw=0.5)
    ax.tick_params(labelsize=7, colors=_INK, length=2.5)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)
    for side in ("left", "bottom"):
        ax.spines[side].set_color(_GREY)


def _title_block(fig, result, U: Units, date: str, *, left, right, top, bottom):
    """The figure's title block in a frame; returns nothing (the font shrinks until it fits)."""
    measure = _Measure()
    first = result.first_order

    def render(size, draw, detail=True):
        flow = _Flow(
            fig,
            measure,
            left=left + 0.12,
            right=right - 0.12,
            top=top - 0.12,
            bottom=bottom + 0.1,
            size=size,
            draw=draw,
        )
        flow.para(_title(result), scale=1.35, weight="bold", max_lines=3)
        flow.para("strutscope · exact second-order analysis of one member", scale=0.9, color=_GREY)
        flow.para(f"Date: {date} · units: {_SYSTEM_NAMES.get(U.system, U.system)}", scale=0.9, color=_GREY)
        flow.heading("Inputs")
        case = result.case
        flow.para(f"Length L = {U.show('length', case.length)}")
        flow.para(f"Supports: left {_support_text(case.left, U)}; right {_support_text(case.right, U)}")
        section = _section_text(result, U)
        if section:
            flow.para(f"Section: {section}", hanging=0.15)
        material = _material_text(result, U)
        if material:
            flow.para(f"Material: {material}", hanging=0.15)
        flow.para(_stiffness_text(result, U))
        ratio = _load_ratio(result)
        flow.para(f"Axial force P = {_axial_text(result.axial_force, U)}" + (f", {ratio}" if ratio else ""))
        loads = "; ".join(_load_text(load, case.length, U) for load in case.loads) or "none"
        flow.para(f"Transverse loads: {loads}", hanging=0.15)
        flow.para(f"Initial bow: {_bow_text(result, U)}", hanging=0.15)
        flow.heading("Governing values")
        if first is not None:
            flow.para("second order; first order (P = 0) in brackets", scale=0.9, color=_GREY)
        for label, field, kind in _governing_rows(result):
            peak = getattr(result.governing, field)
            text = f"{label}: {_peak_text(peak, kind, U)}"
            if first is not None:
                text += f"  ({U.show(kind, getattr(first.governing, field).value)})"
            flow.para(text, hanging=0.15)
        flow.para(
            f"Pcr1 = {_pcr_text(result, U)}, K = {_ratio(result.buckling.effective_length_factor)}, "
            f"α_cr = {_alpha_text(result)}"
        )
        amplification = result.amplification
        flow.para(
            f"Amplification, exact: moment {_ratio(amplification.moment)} (over M_I + N·w0), "
            f"deflection {_ratio(amplification.deflection)}",
            hanging=0.15,
        )
        utilisation = _utilisation_text(result, U)
        if utilisation:
            flow.para(f"Utilisation: {utilisation}", hanging=0.15)
        danger = result.status != "stable"
        flow.para(
            f"Status: {_status_text(result, U) if danger else result.status}",
            weight="bold" if danger else "normal",
            color=_DANGER if danger else _INK,
            hanging=0.15,
        )
        # The status already says the axial force is at or beyond a critical load.
        said = ("scope", "at-critical-load", "beyond-critical-load")
        shown = [c for c in result.cautions if c.code not in said]
        if not detail:
            shown = [c for c in shown if c.level == "danger"]
        if shown:
            flow.heading("Cautions", scale=1.0)
        for caution in shown:
            danger = caution.level == "danger"
            flow.para(
                f"{caution.level}: {caution.message}",
                scale=0.92,
                color=_DANGER if danger else _INK,
                hanging=0.15,
            )
        others = sum(1 for c in result.cautions if c.code != "scope") - len(shown)
        if not detail and others:
            flow.para(
                f"{others} further caution{'s' if others > 1 else ''}: see the calculation sheet.",
                color=_GREY,
            )
        flow.heading("Caution", scale=1.0)
        flow.para(_general_caution(result), weight="bold")
        return flow.bottom - flow.y if not flow.overflow else 1.0

    detail = True
    size = _fit(lambda size, draw: render(size, draw, True), (7.8, 7.4, 7.0, 6.6))
    if render(size, False, True) > 0:
        detail = False  # too many cautions to list: count them instead
        size = _fit(lambda size, draw: render(size, draw, False), (7.8, 7.4, 7.0, 6.6, 6.2, 5.8, 5.4))
    render(size, True, detail)
    w, h = fig.get_size_inches()
    fig.add_artist(
        Rectangle(
            (left / w, bottom / h),
            (right - left) / w,
            (top - bottom) / h,
            fill=False,
            ec=_GREY,
            lw=0.8,
            transform=fig.transFigure,
        )
    )


def result_figure(result, *, units="si", date=None) -> Figure:
    """Return one print-quality figure of `result` on an A4 landscape sheet (11.69 × 8.27 in).

    From the top: a sketch of the member to scale along x (supports, loads, axial force, the initial bow
    dashed and exaggerated), then the deflection w and the total offset w + w0 [small length unit], the
    bending moment M and the shear force V on a shared x axis, first order (P = 0) dashed and second order
    solid, with the peaks marked and labelled with value and position. A title block on the right gives the
    case title, the date, the key inputs, the governing values and the general caution.

    Parameters
    ----------
    result : engine.Result
        What ``engine.solve(case)`` returned.
    units : str or Units
        ``"si"`` or ``"us"`` (see :func:`app.units.units`).
    date : None, datetime.date or str
        Printed in the title block; today when None.

    Returns
    -------
    matplotlib.figure.Figure
        Made with the object API (no pyplot), with an Agg canvas attached.
    """
    U = _units(units)
    date_text = _date_text(date)
    fig = Figure(figsize=A4_LANDSCAPE)
    FigureCanvasAgg(fig)
    fig_w, fig_h = A4_LANDSCAPE
    plot_left, plot_right = 0.075, 0.655
    grid = fig.add_gridspec(
        4,
        1,
        left=plot_left,
        right=plot_right,
        top=0.92,
        bottom=0.075,
        height_ratios=(1.35, 1.0, 1.0, 1.0),
        hspace=0.14,
    )
    sketch = fig.add_subplot(grid[0])
    axes = [fig.add_subplot(grid[i], sharex=sketch) for i in (1, 2, 3)]

    L = U.length.from_si(float(result.case.length))
    width_in = (plot_right - plot_left) * fig_w
    pad = 0.8 * L / max(width_in - 1.6, 1.0)  # 0.8 in each side for the supports and axial-force arrows
    sketch.set_xlim(-pad, L + pad)
    _draw_sketch(sketch, result, U)

    first = result.first_order
    fo = (lambda name: None) if first is None else (lambda name: getattr(first, name))
    fog = (lambda name: None) if first is None else (lambda name: getattr(first.governing, name))
    g = result.governing
    sl = U.label("small_length")
    specs = [(result.deflection, fo("deflection"), _INK, g.deflection, fog("deflection"))]
    ylabel = f"deflection w [{sl}]\n(+ downward)"
    if _has_bow(result):
        specs.append((result.total_offset, fo("total_offset"), _ACCENT, g.total_offset, fog("total_offset")))
        ylabel = f"w, w + w0 [{sl}]\n(+ downward)"
    deflection_ax, moment_ax, shear_ax = axes
    _diagram(deflection_ax, result, U, specs, kind="small_length", ylabel=ylabel, inverted=True)
    if _has_bow(result):
        x = U.length.from_si(np.asarray(result.x, dtype=float))
        deflection_ax.plot(
            x,
            U.convert("small_length", np.asarray(result.initial_bow, dtype=float)),
            color=_ACCENT,
            lw=0.8,
            ls=(0, (1, 2)),
            zorder=2,
        )
    _diagram(
        moment_ax,
        result,
        U,
        [(result.moment, fo("moment"), _INK, g.moment, fog("moment"))],
        kind="moment",
        ylabel=f"bending moment M\n[{U.label('moment')}]",
        fill=True,
    )
    _diagram(
        shear_ax,
        result,
        U,
        [(result.shear, fo("shear"), _INK, g.shear, fog("shear"))],
        kind="force",
        ylabel=f"shear force V\n[{U.label('force')}]",
        fill=True,
    )
    for ax in axes[:-1]:
        ax.tick_params(labelbottom=False)
    shear_ax.set_xlabel(f"x [{U.label('length')}] from the left end", fontsize=7.5, color=_INK)
    shear_ax.set_xlim(-pad, L + pad)
    ticks = MaxNLocator(nbins=10, steps=(1, 2, 2.5, 5, 10)).tick_values(0.0, L)
    shear_ax.set_xticks([t for t in ticks if -1e-9 * L <= t <= L * (1 + 1e-9)])

    handles = [
        Line2D([], [], color=_INK, lw=1.4, label=f"second order (P = {_axial_text(result.axial_force, U)})"),
        Line2D([], [], color=_INK, lw=1.0, ls=(0, (4, 2.5)), label="first order (P = 0)"),
    ]
    if _has_bow(result):
        handles += [
            Line2D([], [], color=_ACCENT, lw=1.4, label="total offset w + w0"),
            Line2D([], [], color=_ACCENT, lw=0.8, ls=(0, (1, 2)), label="initial bow w0"),
        ]
    handles += [
        Line2D([], [], ls="none", marker="o", ms=4.2, color=_INK, label="peak, second order"),
        Line2D([], [], ls="none", marker="o", ms=4.2, mfc="white", color=_INK, label="peak, first order"),
    ]
    fig.legend(
        handles=handles,
        loc="lower left",
        bbox_to_anchor=(plot_left, 0.93),
        ncol=3,
        fontsize=6.6,
        frameon=False,
        handlelength=2.4,
        columnspacing=1.2,
        borderaxespad=0.0,
    )

    _title_block(
        fig,
        result,
        U,
        date_text,
        left=0.685 * fig_w,
        right=0.985 * fig_w,
        top=0.975 * fig_h,
        bottom=0.03 * fig_h,
    )
    return fig


def png_bytes(result, *, units="si", dpi=150, date=None) -> bytes:
    """Return :func:`result_figure` as PNG bytes: A4 landscape at `dpi`, 1754 × 1240 px at 150 dpi.

    Parameters
    ----------
    result : engine.Result
    units : str or Units
    dpi : float
        Dots per inch, 30 to 600.
    date : None, datetime.date or str
        As for :func:`result_figure`.

    Returns
    -------
    bytes
        The PNG file; its pixel size is A4 (297 mm × 210 mm) at `dpi`, rounded to whole pixels.
    """
    dpi = _dpi(dpi)
    fig = result_figure(result, units=units, date=date)
    # Agg truncates width × dpi to whole pixels; size the sheet so that it rounds instead.
    pixels = [round(side * dpi) for side in A4_LANDSCAPE]
    fig.set_size_inches([(p + 0.25) / dpi for p in pixels])
    buffer = io.BytesIO()
    fig.savefig(buffer, format="png", dpi=dpi, metadata={"Software": f"strutscope {_version()}"})
    return buffer.getvalue()


# --------------------------------------------------------------------------------------------------------
# CSV.


def _csv_columns(result, U: Units):
    """(header, SI array, unit kind or None) for every CSV column."""
    first = result.first_order
    sl, rot, mom, frc = (U.label(k) for k in ("small_length", "rotation", "moment", "force"))
    columns = [
        (f"x [{U.label('length')}]", result.x, "length"),
        (f"w [{sl}]", result.deflection, "small_length"),
    ]
    if first is not None:
        columns.append((f"w1 [{sl}]", first.deflection, "small_length"))
    columns += [
        (f"w0 [{sl}]", result.initial_bow, "small_length"),
        (f"w+w0 [{sl}]", result.total_offset, "small_length"),
    ]
    if first is not None:
        columns.append((f"w1+w0 [{sl}]", first.total_offset, "small_length"))
    for name, field, kind, unit in (
        ("rotation", "rotation", "rotation", rot),
        ("M", "moment", "moment", mom),
        ("V", "shear", "force", frc),
        ("T", "transverse_force", "force", frc),
    ):
        columns.append((f"{name} [{unit}]", getattr(result, field), kind))
        if first is not None:
            columns.append((f"{name}1 [{unit}]", getattr(first, field), kind))
    check = result.check
    if check is not None:
        columns += [
            ("utilisation [-]", check.stations, None),
            ("utilisation axial+bending [-]", check.axial_bending, None),
            ("utilisation shear [-]", check.shear, None),
        ]
    elif result.utilization is not None:
        # At a critical load the engine gives no check along the member, only the governing utilisation
        # (+inf), which then holds at every station.
        columns.append(("utilisation [-]", np.full(len(result.x), float(result.utilization)), None))
    return columns


def _number_text(value: float) -> str:
    # repr is the shortest text that reads back as the same float: full precision, no noise digits.
    return repr(float(value))


def _amplification_comments(result) -> list:
    """The CSV's comment lines for the exact amplifications, each with its definition."""
    from engine.results import AMPLIFICATION_DEFINITIONS as words

    amp = result.amplification
    lines = []
    for key in ("moment", "moment_first_order", "moment_bow_free", "deflection"):
        value = getattr(amp, key)
        if value is not None:
            lines.append(f"amplification {key} [-]: {_number_text(value)} ({words[key]})")
    return lines


def csv_text(result, *, units="si") -> str:
    """Return the stations of `result` as CSV text, one row per station, with units in the header.

    Leading comment lines (starting with ``"# "``) give the title, the units, the axial force, Pcr1, the
    status and the general caution. Columns: ``x``, ``w``, ``w1`` (the subscript 1 marks first order, P = 0),
    ``w0``, ``w+w0``, ``w1+w0``, ``rotation``, ``rotation1``, ``M``, ``M1``, ``V``, ``V1``, ``T``, ``T1``, and
    the utilisations when the result has a member check. Where a point load or couple acts, its station
    appears twice (the values either side). Unbounded values (at a critical load) are written ``inf``.

    Parameters
    ----------
    result : engine.Result
    units : str or Units

    Returns
    -------
    str
        CSV text with ``\\n`` line ends, numbers at full precision (Python ``repr``).
    """
    U = _units(units)
    columns = _csv_columns(result, U)
    out = io.StringIO()
    pcr1 = float(result.critical_loads[0])
    comments = [
        "strutscope: exact second-order analysis of one member",
        f"title: {_title(result)}",
        f"units: {_SYSTEM_NAMES.get(U.system, U.system)}",
        f"axial force [{U.label('force')}]: {_number_text(U.convert('force', result.axial_force))} "
        "(compression positive)",
        f"Pcr1 [{U.label('force')}]: {_number_text(U.convert('force', pcr1))}",
        f"status: {_status_text(result, U)}",
        *(
            [
                f"utilisation [-]: {_number_text(result.utilization)} (strength and stability; "
                "the deflection check is apart)"
            ]
            if result.utilization is not None
            else []
        ),
        *(
            [
                f"deflection utilisation [-]: {_number_text(result.service.utilization)} (service check: "
                f"{result.service.basis})"
            ]
            if result.service is not None
            else []
        ),
        *_amplification_comments(result),
        *(
            [f"bow direction: {result.bow.direction_governing}"]
            if result.bow is not None and result.bow.direction_governing
            else []
        ),
        "columns ending in 1 are first order (P = 0) at the same stations; a station at a point load or "
        "couple appears twice; inf marks a value that is unbounded at a critical load",
        f"caution: {_general_caution(result)}",
    ]
    for line in comments:
        out.write(csv_comment(line) + "\n")
    writer = csv_writer(out, lineterminator="\n")
    writer.writerow([header for header, _, _ in columns])
    data = []
    for _, values, kind in columns:
        values = np.asarray(values, dtype=float)
        data.append(values if kind is None else U.convert(kind, values))
    for row in zip(*data, strict=True):
        writer.writerow([_number_text(v) for v in row])
    return out.getvalue()


# --------------------------------------------------------------------------------------------------------
# The calc sheet.


def _version() -> str:
    try:
        return metadata.version("strutscope")
    except metadata.PackageNotFoundError:
        return "(not installed)"


def _sheet(flow: _Flow, result, U: Units, *, date: str, prepared_by: str, checked_by: str) -> None:
    """Write the calc sheet's text into `flow`."""
    case = result.case
    first = result.first_order
    label_w = 1.75  # [in] width of the label column

    flow.para(_title(result), scale=1.45, weight="bold", max_lines=3)
    flow.para(
        "Exact second-order (P-delta) analysis of one member under axial force and bending, by "
        f"strutscope {_version()}",
        scale=0.9,
        color=_GREY,
    )
    flow.space(4)
    flow.rule()
    third = flow.width / 3
    flow.row(
        [
            f"Date: {date}",
            f"Prepared by: {prepared_by or '________________'}",
            f"Checked by: {checked_by or '________________'}",
        ],
        [third, third, None],
    )
    flow.row(
        [
            f"Units: {_SYSTEM_NAMES.get(U.system, U.system)}",
            "Signature: ________________",
            "Signature: ________________",
        ],
        [third, third, None],
        color=_GREY,
    )
    flow.rule()

    def item(label, value, **kw):
        flow.row([label, value], [label_w, None], **kw)

    flow.heading("1  Inputs")
    item("Length", f"L = {U.show('length', case.length)}")
    item("Support, left end (x = 0)", _support_text(case.left, U))
    item("Support, right end (x = L)", _support_text(case.right, U))
    section = _section_text(result, U)
    if section:
        item("Section", section)
    material = _material_text(result, U)
    if material:
        item("Material", material)
        if result.material.source:
            item("", f"source: {result.material.source}", scale=0.85, color=_GREY)
    item("Bending stiffness", _stiffness_text(result, U))
    item("Axial force", _axial_text(result.axial_force, U) + " (constant along the member)")
    if case.loads:
        for i, load in enumerate(case.loads):
            item("Transverse loads" if i == 0 else "", _load_text(load, case.length, U))
    else:
        item("Transverse loads", "none")
    item("Initial bow", _bow_text(result, U))
    bow = result.bow
    if bow is not None and bow.source:
        item("", f"source: {bow.source}", scale=0.85, color=_GREY)
    if bow is not None and bow.curve_reason:
        item("", f"buckling curve: {bow.curve_reason}", scale=0.85, color=_GREY)
    if bow is not None and bow.sway_source:
        item("", f"sway: {bow.sway_source}", scale=0.85, color=_GREY)
    if bow is not None and bow.direction_governing:
        item(
            "Bow direction",
            f"{bow.direction}, the worse of both directions solved"
            if bow.automatic
            else bow.direction_governing,
        )
    if result.check is not None:
        settings = result.check.settings
        item(
            "Member check",
            f"{settings.method}, γ_M0 = {settings.gamma_M0:g}, "
            f"γ_M1 = {settings.gamma_M1:g}, "
            f"deflection limit span/{settings.deflection_limit:g}",
        )
    item("Stations", f"{len(result.x)} (uniform grid, load positions and the exact peaks)")

    flow.heading("2  Method and references")
    flow.para(_METHOD)
    flow.para(_RESISTANCE_DEFINITIONS, scale=0.92)
    flow.space(2)
    flow.para(_DEFINITIONS_TEXT, scale=0.9)
    flow.space(2)
    for n, reference in enumerate(_REFERENCES, start=1):
        flow.para(f"[{n}]  {reference}", scale=0.9, hanging=0.3)

    flow.heading("3  Results")
    status = _status_text(result, U)
    danger = result.status != "stable"
    item("Status", status, weight="bold" if danger else "normal", color=_DANGER if danger else _INK)
    shown = range(1, min(3, len(result.critical_loads)) + 1)
    pcr = ", ".join(f"Pcr{n} = {_pcr_text(result, U, n)}" for n in shown)
    item("Elastic critical loads", pcr)
    ratio = _load_ratio(result)
    item(
        "",
        f"effective length factor K = {_ratio(result.buckling.effective_length_factor)}; "
        f"α_cr = Pcr1/P = {_alpha_text(result)}" + (f"; {ratio}" if ratio else ""),
    )
    flow.space(3)
    widths = [1.75, 1.4, 0.95, 1.4, None]
    flow.row(
        ["Governing value", "second order", "at x", "first order (P = 0)", "at x"], widths, weight="bold"
    )
    rows = _governing_rows(result) + [("largest |T|", "transverse_force", "force")]
    for label, field, kind in rows:
        peak = getattr(result.governing, field)
        cells = [label, U.show(kind, peak.value), U.show("length", peak.x) if _finite(peak.value) else "–"]
        if first is not None:
            fp = getattr(first.governing, field)
            cells += [U.show(kind, fp.value), U.show("length", fp.x)]
        else:
            cells += ["n/a", ""]
        flow.row(cells, widths)
    flow.space(3)
    reactions = result.reactions
    item(
        "Reactions (support side)",
        f"left T = {U.show('force', reactions.left_T)}, M = {U.show('moment', reactions.left_M)}; "
        f"right T = {U.show('force', reactions.right_T)}, M = {U.show('moment', reactions.right_M)}",
    )
    item(
        "",
        "T(0) − T(L) = total transverse load; the left support pushes the member by −T(0), the right by "
        "+T(L), along +w",
        scale=0.85,
        color=_GREY,
    )
    amplification = result.amplification
    from engine.results import AMPLIFICATION_DEFINITIONS as words

    free = (
        ""
        if amplification.moment_bow_free is None
        else f"; {_ratio(amplification.moment_bow_free)} without the bow"
    )
    item(
        "Amplification, exact",
        f"moment {_ratio(amplification.moment)} over M_I + N·w0 "
        f"({_ratio(amplification.moment_first_order)} over M_I alone{free}); "
        f"deflection {_ratio(amplification.deflection)} ({words['deflection']})",
    )
    if amplification.approximations:
        for approximation in amplification.approximations:
            against = "exact, no bow" if approximation.compared_with == "moment_bow_free" else "exact"
            item(
                "",
                f"{approximation.name} = {_ratio(approximation.value)}, error "
                f"{_percent(approximation.error)} against {against}; {approximation.source}",
                scale=0.92,
            )
    else:
        item("", "no approximations (none applies at or above Pcr1)", scale=0.92, color=_GREY)
    equilibrium = result.equilibrium
    if equilibrium is None:
        item("Equilibrium residuals", "n/a (no equilibrium state at a critical load)")
    else:
        item(
            "Equilibrium residuals",
            f"transverse {_scientific(equilibrium.transverse)}, moment "
            f"{_scientific(equilibrium.moment)} (relative)",
        )

    flow.heading("4  Member check (second-order forces)")
    check = result.check
    if check is None:
        if result.utilization is not None:
            item("Utilisation", _ratio(result.utilization))
        else:
            flow.para("No section and material given: no member check.", color=_GREY)
    else:
        item("Utilisation", _utilisation_text(result, U), weight="bold")
        item("", f"source: {check.source}", scale=0.85, color=_GREY)
        item("Strength alone", f"{_ratio(check.strength_utilization)} ({check.strength_kind})")
        out = check.out_of_plane
        if out is not None and out.checked:
            item(
                "Out of plane",
                f"N/N_b,Rd = {_ratio(out.utilization)} about the {out.axis} axis: "
                f"L_cr = {U.show('length', out.buckling_length)}, "
                f"N_cr = {U.show('force', out.N_cr)}, lambda_bar = {out.lambda_bar:.3f}, "
                f"curve {out.curve}, chi = {out.chi:.3f}, N_b,Rd = chi·A·f_y/γ_M1 = "
                f"{U.show('force', out.N_b_Rd)} (EN 1993-1-1 §6.3.1)",
            )
        elif out is not None:
            item("Out of plane", f"not checked: {out.reason}")
        if check.section_class is not None:
            item("Section", f"{check.section_class.describe()}, EN 1993-1-1 Table 5.2")
        service = result.service
        if service is not None:
            allowed = U.show("small_length", service.allowed)
            shown = U.show("small_length", abs(service.deflection))
            item(
                "Deflection (service)",
                f"max|w| = {shown} against span/{service.limit:g} = {allowed} "
                f"({_ratio(service.utilization)}); loads as given, no bow",
            )
        resistances = check.resistances or {}
        parts = []
        for key, kind in (("N_Rd", "force"), ("M_Rd", "moment"), ("V_Rd", "force")):
            if resistances.get(key) is not None:
                parts.append(f"{key} = {U.show(kind, resistances[key])}")
        if parts:
            item("Resistances", ", ".join(parts))
        for note in check.notes:
            item("", note, scale=0.92)

    flow.heading("5  Cautions")
    if U.system != "si":
        flow.para("The engine words its cautions in SI units.", scale=0.9, color=_GREY)
    cautions = list(result.cautions) or []
    if not any(c.code == "scope" for c in cautions):
        flow.para(f"[info] {_general_caution(result)}", hanging=0.2)
    for caution in cautions:
        danger = caution.level == "danger"
        flow.para(
            f"[{caution.level}] {caution.message} ({caution.source})",
            hanging=0.2,
            color=_DANGER if danger else _INK,
            weight="bold" if danger else "normal",
        )


def pdf_bytes(result, *, units="si", prepared_by="", checked_by="", date=None) -> bytes:
    """Return a calc sheet of `result` as PDF bytes: A4 portrait text, then the figure on A4 landscape.

    Page 1 has the header (title, date, prepared-by and checked-by block), the inputs, the method and its
    references, the results (critical loads, governing values, reactions, amplification and the
    approximations, equilibrium residuals), the member check and every caution of the result. Page 2 is
    :func:`result_figure`. The text is real PDF text, so it can be searched and copied.

    Parameters
    ----------
    result : engine.Result
    units : str or Units
    prepared_by, checked_by : str
        Names or initials for the header; a blank line to sign on when empty.
    date : None, datetime.date or str
        Printed in the header and the figure; today when None.

    Returns
    -------
    bytes
        The PDF file (no creation date in its metadata, so the same inputs give the same bytes).
    """
    pages = calc_sheet_figures(result, units=units, prepared_by=prepared_by, checked_by=checked_by, date=date)
    buffer = io.BytesIO()
    metadata_ = {
        "Title": _title(result),
        "Subject": "strutscope calculation sheet",
        "Creator": "strutscope",
        "CreationDate": None,
    }
    prepared_by = _name("prepared_by", prepared_by)
    if prepared_by:
        metadata_["Author"] = prepared_by
    with PdfPages(buffer, metadata=metadata_) as pdf:
        for fig in pages:
            pdf.savefig(fig)
    return buffer.getvalue()


def calc_sheet_figures(result, *, units="si", prepared_by="", checked_by="", date=None) -> list[Figure]:
    """The pages of :func:`pdf_bytes` as matplotlib figures (text pages, then :func:`result_figure`)."""
    U = _units(units)
    date_text = _date_text(date)
    prepared_by = _name("prepared_by", prepared_by)
    checked_by = _name("checked_by", checked_by)
    measure = _Measure()
    width, height = A4_PORTRAIT
    margin = 16 / 25.4

    def render(size, draw):
        pages = []

        def new_page():
            fig = Figure(figsize=A4_PORTRAIT)
            pages.append(fig)
            return fig

        flow = _Flow(
            new_page() if draw else None,
            measure,
            left=margin,
            right=width - margin,
            top=height - margin - 0.2,
            bottom=margin + 0.25,
            size=size,
            draw=draw,
            new_page=new_page,
        )
        _sheet(flow, result, U, date=date_text, prepared_by=prepared_by, checked_by=checked_by)
        return flow.pages, pages

    size = 8.2
    for size in (8.2, 7.8, 7.4, 7.0, 6.6):
        if render(size, False)[0] == 1:
            break
    count, pages = render(size, True)
    total = count + 1
    for number, fig in enumerate(pages, start=1):
        _sheet_frame(fig, number, total, margin)
    figure = result_figure(result, units=U, date=date_text)
    figure.text(
        0.985,
        0.008,
        f"page {total} of {total}",
        ha="right",
        va="bottom",
        fontsize=6.5,
        color=_GREY,
        family=_FONT,
        parse_math=False,
    )
    return pages + [figure]


def _sheet_frame(fig, number: int, total: int, margin: float) -> None:
    """Running header and footer of a calc-sheet page."""
    w, h = fig.get_size_inches()
    top = (h - margin + 0.05) / h
    fig.text(
        margin / w,
        top,
        "strutscope · calculation sheet",
        ha="left",
        va="bottom",
        fontsize=7.5,
        color=_GREY,
        family=_FONT,
        parse_math=False,
    )
    fig.text(
        1 - margin / w,
        top,
        f"page {number} of {total}",
        ha="right",
        va="bottom",
        fontsize=7.5,
        color=_GREY,
        family=_FONT,
        parse_math=False,
    )
    fig.add_artist(
        Line2D(
            [margin / w, 1 - margin / w], [top - 0.004] * 2, color=_LIGHT, lw=0.6, transform=fig.transFigure
        )
    )
    fig.text(
        margin / w,
        (margin - 0.05) / h,
        "Elastic analysis of one member; not a full code check — see "
        "the cautions. Check against your local codes and have it reviewed by a licensed engineer.",
        ha="left",
        va="top",
        fontsize=6.5,
        color=_GREY,
        family=_FONT,
        parse_math=False,
    )


def case_json(case) -> str:
    """Return the case file of `case` (JSON, schema 1, SI units): ``case.to_json()``."""
    return case.to_json()
