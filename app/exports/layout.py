"""Text layout for the figure's title block and the calc sheet: greedy wrapping by measured widths."""

from __future__ import annotations

import functools

from matplotlib.font_manager import FontProperties
from matplotlib.lines import Line2D
from matplotlib.textpath import TextToPath

from app.exports.style import _INK, _LIGHT
from app.fonts import drawable, families
from app.units import KINDS, UNIT_SYSTEMS
from app.units import units as _units_of

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
