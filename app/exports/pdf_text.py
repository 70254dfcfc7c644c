"""The calc sheet's text as a PDF reader extracts it: each glyph stands for its own character.

A symbol such as λ̄ is two characters (λ and a combining macron, U+0304) that no font draws as one glyph:
matplotlib shapes them into one cluster of two glyphs and records each glyph as standing for the whole
cluster, so a reader extracting the text gets "λ̄λ̄". :func:`glyphs_own_characters` makes the PDF record a
glyph of such a cluster as the one character of the cluster that the font draws with that glyph (λ for the
letter, U+0304 for the macron), so the text reads λ̄ once; what is drawn is unchanged. A glyph that stands
for several characters together (a ligature) keeps the whole cluster.

It reaches into matplotlib's PDF writer (the file's character tracker, which is not public API): when a
later matplotlib has no such tracker the PDF is written as matplotlib writes it, and the export tests,
which read the text back, say so.
"""

from __future__ import annotations

__all__ = ["glyphs_own_characters", "own_characters"]


def own_characters(font, chars, glyph):
    """The characters that `glyph` of `font` stands for within the cluster `chars`.

    The one character of `chars` that the font's character map draws with `glyph`; `chars` unchanged when
    it is one character (or a character code), or when no character or more than one is drawn with it.
    """
    if not isinstance(chars, str) or len(chars) < 2:
        return chars
    own = {char for char in chars if font.get_char_index(ord(char)) == glyph}
    return own.pop() if len(own) == 1 else chars


def glyphs_own_characters(pdf) -> None:
    """Make the PDF of `pdf` (a ``matplotlib.backends.backend_pdf.PdfPages``) record each glyph of a
    multi-glyph cluster as its own character (see the module's docstring); a no-op where matplotlib's
    writer has no character tracker."""
    ensure = getattr(pdf, "_ensure_file", None)
    tracker = getattr(ensure(), "_character_tracker", None) if callable(ensure) else None
    track = getattr(tracker, "track_glyph", None)
    if not callable(track):
        return

    def track_glyph(font, chars, glyph, *args, **kwargs):
        return track(font, own_characters(font, chars, glyph), glyph, *args, **kwargs)

    tracker.track_glyph = track_glyph
