"""Fonts for the exports: DejaVu Sans, then any installed font that covers other scripts, then '?'.

DejaVu Sans ships with matplotlib, so every export looks the same on every machine; it covers Latin, Greek
and Cyrillic and the symbols strutscope prints, but not CJK scripts or emoji. :func:`families` is the
fallback list matplotlib is given (DejaVu Sans first, then those of :data:`FALLBACK_FAMILIES` that are
installed, e.g. Debian's ``fonts-noto-cjk``); :func:`drawable` replaces every character no font in the list
covers with ``?``, so that matplotlib never warns of a missing glyph nor draws an empty box.
"""

from __future__ import annotations

import functools
import warnings

__all__ = ["FALLBACK_FAMILIES", "PRIMARY", "drawable", "families"]

#: The export font, shipped with matplotlib.
PRIMARY = "DejaVu Sans"

#: Fonts tried after DejaVu Sans when installed (CJK first, then wide-coverage and symbol fonts). Colour
#: emoji fonts are left out: matplotlib draws outlines only.
FALLBACK_FAMILIES = (
    "Noto Sans CJK JP",
    "Noto Sans CJK SC",
    "Noto Sans CJK TC",
    "Noto Sans CJK KR",
    "Source Han Sans",
    "WenQuanYi Zen Hei",
    "WenQuanYi Micro Hei",
    "Droid Sans Fallback",
    "Noto Sans",
    "Noto Sans Symbols",
    "Noto Sans Symbols2",
    "Noto Emoji",
    "Symbola",
)


@functools.cache
def _installed() -> tuple[tuple[str, frozenset], ...]:
    """(family, code points covered) of DejaVu Sans and of each installed fallback font."""
    from matplotlib import font_manager
    from matplotlib.ft2font import FT2Font

    found: list[tuple[str, str, frozenset]] = []
    for family in (PRIMARY, *FALLBACK_FAMILIES):
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            try:
                path = font_manager.findfont(
                    font_manager.FontProperties(family=family), fallback_to_default=False
                )
            except ValueError:  # not installed
                continue
        if any(path == seen for _, seen, _ in found):
            continue
        try:
            found.append((family, path, frozenset(FT2Font(path).get_charmap())))
        except (OSError, RuntimeError):
            continue
    return tuple((family, covered) for family, _, covered in found)


def families() -> list[str]:
    """The family list for matplotlib: DejaVu Sans, then the installed fallbacks."""
    return [family for family, _ in _installed()] or [PRIMARY]


def drawable(text: str) -> str:
    """`text` with every character that no export font covers replaced by ``?`` (spaces kept).

    >>> drawable("Post A, façade, α_cr ≤ 10")
    'Post A, façade, α_cr ≤ 10'
    """
    if text.isascii():
        return text
    fonts = _installed()
    return "".join(
        char if char.isspace() or any(ord(char) in covered for _, covered in fonts) else "?" for char in text
    )
