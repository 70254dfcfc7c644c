"""Exports of one solved case, shared by the page and the command line: a figure, PNG, CSV, a PDF calc sheet
and the case file.

Every function here is a pure function of an engine :class:`engine.Result` (what ``engine.solve(case)``
returns) and does no mechanics: each number shown is a value the result holds, worded in the display units by
:mod:`app.report`. Figures use matplotlib's object API only (``matplotlib.figure.Figure``; never pyplot,
which keeps global state), so the functions are safe to call from a server handling several sessions.

At a critical load the engine's response values are +inf: they are shown as "unbounded", left out of the
plots and written as ``inf`` in the CSV.

Modules: :mod:`~app.exports.style` (look, fixed texts, argument checks), :mod:`~app.exports.layout` (text
wrapping), :mod:`~app.exports.sketch_draw` (the member sketch in matplotlib, from :mod:`app.sketch`),
:mod:`~app.exports.figure` (the figure and PNG), :mod:`~app.exports.table` (CSV), :mod:`~app.exports.sheet`
(the PDF calc sheet), :mod:`~app.exports.names` (file names and the case file).
"""

from app.export_names import case_json, export_filename
from app.exports.figure import png_bytes, result_figure
from app.exports.sheet import calc_sheet_figures, pdf_bytes
from app.exports.style import A4_LANDSCAPE, A4_PORTRAIT
from app.exports.table import csv_text

__all__ = [
    "A4_LANDSCAPE",
    "A4_PORTRAIT",
    "calc_sheet_figures",
    "case_json",
    "csv_text",
    "export_filename",
    "pdf_bytes",
    "png_bytes",
    "result_figure",
]
