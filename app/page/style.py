"""The page's look and shared helpers: colours, stylesheets, the labels of choices, small formatters.

Every view of :mod:`app.page` takes its colours and stylesheets from here, so the page has one look.
"""

from __future__ import annotations

import html
import math

import numpy as np
import panel as pn

MAX_VARIANTS = 4
#: Load rows listed for editing at most: each row is a dozen widgets, and building hundreds of them held
#: the server for seconds (issue 11); further loads are analysed and drawn, and edited in the case file.
MAX_LOAD_ROWS = 12
ROWS_AT_ONCE = 2
#: Largest case file accepted for upload [bytes].
UPLOAD_LIMIT = 1_000_000

# Colours of our own: teal for second order, slate for first order, ochre for the bow, plum for T; the
# variants muted. Levels: brick red, amber, slate blue.
SECOND = "#0d6e7a"
FIRST = "#5b6670"
BOW = "#b07a1e"
TRANSVERSE = "#7a3b69"
MEMBER = "#14263a"
LOAD = "#a3261b"
VARIANT_COLOURS = ("#9c8fc4", "#d09a5a", "#86b08a", "#c98fa8")
VARIANT_LETTERS = "ABCD"
LEVEL_NAMES = {"danger": "Danger", "warning": "Warning", "info": "Note"}
SUPPORT_LABELS = {
    "pinned": "pinned",
    "fixed": "fixed",
    "free": "free",
    "guided": "guided",
    "elastic": "elastic (springs)",
}
SHAPE_LABELS = {
    "catalogue": "catalogue",
    "rolled_i": "rolled I",
    "welded_i": "welded I",
    "rhs": "RHS / SHS",
    "chs": "CHS",
    "rectangle": "solid rectangle",
    "round": "solid round",
    "custom": "custom properties",
}
DIMENSION_LABELS = {
    "h": "depth h",
    "b": "width b",
    "tw": "web t_w",
    "tf": "flange t_f",
    "r": "root r",
    "t": "wall t",
    "D": "diameter D",
    "A": "area A",
    "I": "I about axis",
    "W_el": "W_el",
    "W_pl": "W_pl",
    "A_v": "shear area A_v",
    "depth": "depth",
    "Iz": "I_z (minor)",
    "It": "I_t",
    "Iw": "I_w",
}
PRESET_LABELS = {
    "en1993-table-5.1": "EN 1993-1-1 Table 5.1, L/n by curve",
    "en1993-eq-5.9": "EN 1993-1-1 eq. (5.9), first-mode bow",
    "aisc-l/1000": "AISC 303-16: L/1000",
    "span": "span/n, n given",
}
BOW_SHAPE_LABELS = {
    "none": "none",
    "sine": "half sine",
    "parabola": "parabola",
    "sway": "sway (a·x/L)",
    "mode": "first buckling mode",
}
LOAD_LABELS = {"uniform": "uniform", "linear": "linear", "point": "point", "couple": "couple"}

CSS = """
:host { --ss-ink: #14263a; --ss-muted: #5b6670; --ss-rule: #d5d9d2; --ss-accent: #0d6e7a;
        font-family: "DejaVu Sans", "Segoe UI", "Helvetica Neue", Arial, sans-serif; color: var(--ss-ink); }
.ss-brand { font-size: 19px; font-weight: 700; letter-spacing: 0.02em; color: #ffffff; white-space: nowrap; }
.ss-brand span { font-weight: 400; color: #b9d4d8; font-size: 14px; margin-left: 8px; }
.ss-title { color: #e8eef0; font-size: 13px; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; }
.ss-heading { font-size: 13px; font-weight: 700; text-transform: uppercase; letter-spacing: 0.06em;
              color: var(--ss-muted); margin: 2px 0 2px 0; }
.ss-error { color: #a3261b; font-size: 12.5px; line-height: 1.3; background: #fbeceb;
            border-left: 3px solid #a3261b; padding: 3px 6px; margin: 0; }
.ss-note { color: var(--ss-muted); font-size: 12px; line-height: 1.3; }
.ss-readout { font-size: 13.5px; line-height: 1.45; white-space: nowrap; }
.ss-readout b { font-size: 15px; }
.ss-readout.ss-force { white-space: normal; }
.ss-readout .ss-nowrap { white-space: nowrap; }
.ss-badge { display: inline-block; padding: 1px 7px; border-radius: 3px; font-size: 12px; font-weight: 700;
            color: #fff; letter-spacing: 0.03em; white-space: nowrap; line-height: 1.35; }
.ss-flag { display: inline-block; padding: 1px 7px; border-radius: 3px; font-size: 12px; font-weight: 700;
           color: #fff; letter-spacing: 0.03em; white-space: nowrap; line-height: 1.35; }
.ss-stable { background: #2e6b3c; } .ss-unstable, .ss-critical, .ss-fails { background: #a3261b; }
.ss-stale, .ss-near { background: #8a5a00; }
.ss-stale-mark { font-size: 12px; font-weight: 700; color: #8a5a00; margin: 2px 3px; }
.ss-stale-values { opacity: 0.45; }
table.ss-values { border-collapse: collapse; width: 100%; table-layout: fixed; font-size: 12.5px;
                  line-height: 1.2; }
table.ss-values col.q { width: 34%; } table.ss-values col.v { width: 38%; }
table.ss-values col.f { width: 28%; }
table.ss-values th { text-align: left; font-weight: 700; color: var(--ss-muted); font-size: 12px;
                     text-transform: uppercase; letter-spacing: 0.04em; padding: 4px 3px 1px 3px;
                     border-bottom: 1px solid var(--ss-rule); }
table.ss-values td { padding: 1px 3px; vertical-align: top; overflow-wrap: anywhere; }
table.ss-values td.q { color: var(--ss-muted); }
table.ss-values td.v { font-weight: 600; }
table.ss-values td.f { color: var(--ss-muted); }
table.ss-values tr.danger td.v { color: #a3261b; }
table.ss-values tr.warn td.v { color: #8a5a00; }
table.ss-routes { border-collapse: collapse; width: 100%; table-layout: fixed; font-size: 12.5px;
                  line-height: 1.2; }
table.ss-routes col.q { width: 42%; } table.ss-routes col.v { width: 36%; }
table.ss-routes col.f { width: 22%; }
table.ss-routes td { padding: 1px 3px; vertical-align: top; overflow-wrap: anywhere; }
table.ss-routes td.q, table.ss-routes td.f { color: var(--ss-muted); }
table.ss-routes td.v { font-weight: 600; }
table.ss-routes tr.danger td.v { color: #a3261b; }
ul.ss-cautions { list-style: none; padding: 0; margin: 0; font-size: 12.5px; line-height: 1.3; }
ul.ss-cautions li { padding: 3px 4px 4px 7px; margin-bottom: 3px; border-left: 4px solid #35506b;
                    background: #f4f6f8; }
ul.ss-cautions li.danger { border-left-color: #a3261b; background: #fbeceb; }
ul.ss-cautions li.warning { border-left-color: #b77900; background: #fdf5e6; }
ul.ss-cautions .lvl { font-weight: 700; font-size: 12px; text-transform: uppercase; margin-right: 4px; }
ul.ss-cautions li.danger .lvl { color: #a3261b; } ul.ss-cautions li.warning .lvl { color: #8a5a00; }
ul.ss-cautions li.info .lvl { color: #35506b; }
ul.ss-cautions .src { display: block; color: var(--ss-muted); font-size: 12px; font-style: italic; }
ul.ss-cautions.general { border-top: 1px solid var(--ss-rule); padding-top: 4px; }
ul.ss-cautions.general li { border-left-color: #14263a; background: #e9edf1; margin: 0; font-size: 11.5px;
                            line-height: 1.25; padding: 2px 4px 3px 7px; }
.ss-key { font-size: 12.5px; color: var(--ss-ink); line-height: 1.35; }
.ss-key span { white-space: nowrap; }
.ss-key i { display: inline-block; width: 16px; height: 0; vertical-align: middle; margin: 0 3px 0 7px; }
table.ss-compare { border-collapse: collapse; font-size: 12.5px; }
table.ss-compare th, table.ss-compare td { padding: 3px 6px; border-bottom: 1px solid var(--ss-rule);
                                          text-align: right; white-space: nowrap; }
table.ss-compare tr.case td { white-space: normal; max-width: 92px; font-size: 12px; vertical-align: top; }
table.ss-compare th:first-child, table.ss-compare td:first-child { text-align: left; color: var(--ss-muted); }
table.ss-compare th { font-size: 12px; }
"""

#: A scrolling box of the right column (the values, the cautions): it takes a share of the column's height, at
#: least its minimum and at most its content's height (so the other box gets the rest); its lower edge fades
#: while more lies below, and the padding under the content keeps the last line clear of the fade.
SCROLL_BOX_CSS = """
:host { flex: 1 1 0px; max-height: max-content; padding-bottom: 14px; scroll-padding-bottom: 14px;
        box-sizing: border-box;
        -webkit-mask-image: linear-gradient(to bottom, #000 calc(100% - 14px), transparent);
        mask-image: linear-gradient(to bottom, #000 calc(100% - 14px), transparent); }
"""

WIDGET_CSS = """
:host { --font-size: 13.5px; font-size: 13.5px; }
label, .bk-input-group > label { font-size: 12.5px; color: #3c4750; }
input, select, .bk-input { font-size: 13.5px; }
"""

#: A number box's stylesheet: the widgets' font, with less room lost to padding, so that six figures in US
#: units with a sign ("-0.337213" kip/ft) show whole in the narrow load boxes.
NUMBER_CSS = (
    WIDGET_CSS
    + """
input, .bk-input { font-size: 13px; }
.bk-input { padding-left: 3px; padding-right: 3px; }
"""
)


# The document-level stylesheet (the page background and body font); components carry their own stylesheets,
# since Panel renders each in its own shadow root.
GLOBAL_CSS = """/* strutscope's own look: ink-blue header, white panels, a teal accent for second order.
   Sized for a 1280×720 projector: 14 px body text, nothing below 12 px. */
:root {
  --ss-ink: #14263a;
  --ss-paper: #f6f7f4;
  --ss-panel: #ffffff;
  --ss-rule: #d5d9d2;
  --ss-muted: #5b6670;
  --ss-accent: #0d6e7a;
  --ss-danger: #a3261b;
  --ss-warning: #8a5a00;
  --ss-info: #35506b;
}
html, body {
  background: var(--ss-paper);
  color: var(--ss-ink);
  font-family: "DejaVu Sans", "Segoe UI", "Helvetica Neue", Arial, sans-serif;
  font-size: 14px;
  margin: 0;
  overflow-x: auto;
}
"""


def page_stylesheet() -> str:
    """The page's document-level stylesheet (CSS text)."""
    return GLOBAL_CSS


def finite(values) -> np.ndarray:
    """A float array with every non-finite value (the engine's +inf at a critical load) made NaN."""
    array = np.array(values, dtype=float)
    array[~np.isfinite(array)] = np.nan
    return array


def nice(value: float) -> float:
    """The nearest 1, 2 or 5 times a power of ten at or above `value` (> 0): a slider step."""
    exponent = math.floor(math.log10(value))
    for mantissa in (1.0, 2.0, 5.0, 10.0):
        if mantissa * 10**exponent >= value * (1 - 1e-12):
            return mantissa * 10**exponent
    return 10.0 ** (exponent + 1)


def esc(text) -> str:
    return html.escape(str(text), quote=True)


def download(callback, suffix: str, label: str, width: int, margin=(10, 3)):
    """A download button of the page: the file strutscope-case.<suffix>, written by `callback` on click."""
    return pn.widgets.FileDownload(
        callback=callback,
        filename=f"strutscope-case.{suffix}",
        label=label,
        color="light",
        width=width,
        margin=margin,
        stylesheets=[WIDGET_CSS],
    )


def html_pane(text: str = "", **params) -> pn.pane.HTML:
    """An HTML pane with the page's stylesheet, stretched to its column's width unless told otherwise."""
    if "width" not in params:
        params.setdefault("sizing_mode", "stretch_width")
    return pn.pane.HTML(text, stylesheets=[CSS], **params)


def heading(text: str, **params) -> pn.pane.HTML:
    """A small upper-case heading of a group or panel."""
    params.setdefault("margin", (4, 4, 0, 4))
    return html_pane(f"<div class='ss-heading'>{esc(text)}</div>", **params)


def lean(*renderers) -> None:
    """Drop the glyph copies Bokeh makes for a selected-away or muted line: the page selects nothing (no
    selection tools) and mutes nothing, and each copy is a model the browser builds at start-up (issue 10)."""
    for renderer in renderers:
        renderer.nonselection_glyph = None
        renderer.muted_glyph = None


def lean_figure(fig) -> None:
    """:func:`lean` every glyph renderer of `fig`."""
    lean(*(r for r in fig.renderers if hasattr(r, "nonselection_glyph")))
