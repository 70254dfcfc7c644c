"""The result figure (PNG, and the last page of the calc sheet)."""

from __future__ import annotations

import io

import numpy as np
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure
from matplotlib.lines import Line2D
from matplotlib.patches import Rectangle
from matplotlib.ticker import MaxNLocator

from app.exports.layout import _fit, _Flow, _Measure
from app.exports.ltb_mode import draw_ltb_mode, has_ltb_mode
from app.exports.sketch_draw import _draw_sketch
from app.exports.style import (
    _ACCENT,
    _DANGER,
    _FILL,
    _GREY,
    _GRID,
    _INK,
    _LIGHT,
    A4_LANDSCAPE,
    A4_PORTRAIT,
    _date_text,
    _dpi,
    _title,
    _units,
    _version,
)
from app.fonts import drawable, families
from app.report import (
    alpha_text,
    axial_text,
    bow_text,
    caution_text,
    finite,
    general_caution,
    governing_rows,
    has_bow,
    load_ratio_text,
    load_text,
    material_text,
    peak_text,
    ratio,
    section_text,
    status_text,
    stiffness_text,
    support_text,
    system_name,
)
from app.report.combinations import shown_line, utilisation_line
from app.report.ltb import ltb_words
from app.report.routes import pcr1_planes_text, plane_axes, plane_name
from app.sketch import MOMENT_POSITIVE_DOWN, PAD_INCHES
from app.units import Units


def _finite_array(values) -> np.ndarray | None:
    array = np.asarray(values, dtype=float)
    return array if np.all(np.isfinite(array)) else None


def _mark_peak(ax, peak, kind, U: Units, *, color, first, inverted, length, outer):
    if not finite(peak.value):
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
    return ax.annotate(
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


_STEP = 8.0  # [pt] how far a label moves to clear another


def _overlaps(box, others) -> bool:
    return any(box.overlaps(other) for other in others)


def _separate(ax, labels) -> None:
    """Move peak labels apart so that none covers another: further out, then to the other side of its point.

    Each label keeps its point; the first position of the list below that overlaps no label placed before
    it and stays inside the axes is taken (the preferred one when all collide).
    """
    labels = [label for label in labels if label is not None]
    if len(labels) < 2:
        return
    renderer = ax.figure.canvas.get_renderer()
    frame = ax.get_window_extent(renderer)
    placed = []
    for label in labels:
        dx, dy = label.xyann
        ha, va = label.get_ha(), label.get_va()
        side = 1.0 if dy > 0 else -1.0
        flip = {"bottom": "top", "top": "bottom"}[va]
        other_ha = {"left": "right", "right": "left"}[ha]
        candidates = [(dx, dy + side * _STEP * k, ha, va) for k in range(6)]
        candidates += [(dx, -dy - side * _STEP * k, ha, flip) for k in range(6)]
        candidates += [(-dx, dy + side * _STEP * k, other_ha, va) for k in range(6)]
        chosen = candidates[0]
        for candidate in candidates:
            label.xyann = candidate[:2]
            label.set_ha(candidate[2])
            label.set_va(candidate[3])
            box = label.get_window_extent(renderer).expanded(1.04, 1.1)
            inside = frame.y0 <= box.y0 and box.y1 <= frame.y1 and frame.x0 <= box.x0 and box.x1 <= frame.x1
            if inside and not _overlaps(box, placed):
                chosen = candidate
                break
        label.xyann = chosen[:2]
        label.set_ha(chosen[2])
        label.set_va(chosen[3])
        placed.append(label.get_window_extent(renderer))


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
    plotted, skipped, labels = [], False, []
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
            labels.append(
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
            )
        if first is not None and peak1 is not None:
            labels.append(
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
            )
    _limits(ax, plotted, inverted=inverted)
    _separate(ax, labels)
    if skipped:
        _unbounded_note(ax, "second order unbounded: the axial force is at a critical load (not plotted)")
    ax.set_ylabel(ylabel, fontsize=7.5, color=_INK)
    ax.grid(True, color=_GRID, lw=0.5)
    ax.tick_params(labelsize=7, colors=_INK, length=2.5)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)
    for side in ("left", "bottom"):
        ax.spines[side].set_color(_GREY)


def _pcr_text(result, U: Units, n: int = 1) -> str:
    return U.show("force", float(result.critical_loads[n - 1]), 5)


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
        combination, other = shown_line(result)
        if other:  # a combination other than the governing one, as on the page when it was chosen
            flow.para(combination, weight="bold", color=_DANGER, hanging=0.15)
        flow.para("strutscope · exact second-order analysis of one member", scale=0.9, color=_GREY)
        flow.para(f"Date: {date} · units: {system_name(U)}", scale=0.9, color=_GREY)
        flow.heading("Inputs")
        case = result.case
        flow.para(f"Length L = {U.show('length', case.length)}")
        flow.para(f"Supports: left {support_text(case.left, U)}; right {support_text(case.right, U)}")
        section = section_text(result, U)
        if section:
            flow.para(f"Section: {section}", hanging=0.15)
        material = material_text(result, U)
        if material:
            flow.para(f"Material: {material}", hanging=0.15)
        flow.para(stiffness_text(result, U))
        load_ratio = load_ratio_text(result)
        flow.para(
            f"Axial force N = {axial_text(result.axial_force, U)}" + (f", {load_ratio}" if load_ratio else "")
        )
        loads = "; ".join(load_text(load, case.length, U) for load in case.loads) or "none"
        flow.para(f"Transverse loads: {loads}", hanging=0.15)
        flow.para(f"Initial bow: {bow_text(result, U)}", hanging=0.15)
        flow.heading("Governing values")
        if first is not None:
            flow.para("second order; first order (N = 0) in brackets", scale=0.9, color=_GREY)
        for label, field, kind in governing_rows(result):
            peak = getattr(result.governing, field)
            text = f"{label}: {peak_text(peak, kind, U)}"
            if first is not None:
                text += f"  ({U.show(kind, getattr(first.governing, field).value)})"
            flow.para(text, hanging=0.15)
        flow.para(
            f"Pcr1 = {pcr1_planes_text(result, U)}, K = {ratio(result.buckling.effective_length_factor)}, "
            f"α_cr = {alpha_text(result)}"
        )
        amplification = result.amplification
        flow.para(
            f"Amplification, exact: moment {ratio(amplification.moment)} (over M_I + N·w0), "
            f"deflection {ratio(amplification.deflection)}",
            hanging=0.15,
        )
        utilisation = utilisation_line(result, U)
        if utilisation:
            flow.para(utilisation, hanging=0.15)
        danger = result.status != "stable"
        flow.para(
            f"Status: {status_text(result, U) if danger else result.status}",
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
                f"{caution.level}: {caution_text(caution, U)}",
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
        flow.para(general_caution(result), weight="bold")
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
    bending moment M and the shear force V on a shared x axis, first order (N = 0) dashed and second order
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
    second = getattr(result, "second_plane", None)
    mode = has_ltb_mode(result)
    bottom = 0.33 if mode else 0.075  # the lateral-torsional buckling mode's panel goes below the diagrams
    if second is None:
        _plots(fig, result, U, left=0.075, right=0.655, top=0.92, bottom=bottom, legend_columns=3)
    else:  # both planes side by side, each with its own sketch (its supports and loads) and diagrams
        for plane, axis, left, right in zip(
            (result, second), plane_axes(result), (0.075, 0.40), (0.315, 0.64), strict=True
        ):
            _plots(fig, plane, U, left=left, right=right, top=0.84, bottom=bottom, legend_columns=1)
            fig.text(
                left, 0.965, f"bending about the {plane_name(axis)}", fontsize=8, weight="bold", color=_INK
            )
    if mode:
        _mode_panel(fig, result, U, left=0.075, right=0.655 if second is None else 0.64)
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


#: The title of the PNG's panel with the first lateral-torsional buckling mode (before "at M_cr = ...").
MODE_TITLE = "Lateral-torsional buckling, first mode"


def _mode_panel(fig, result, U: Units, *, left: float, right: float) -> None:
    """The first lateral-torsional buckling mode below the diagrams, across their width; in a one-plane case
    its x axis lines up with theirs (the same padding each side)."""
    fig_w, _ = fig.get_size_inches()
    ax = fig.add_axes((left, 0.075, right - left, 0.17))
    L = U.length.from_si(float(result.case.length))
    pad = _pad(L, (right - left) * fig_w)
    draw_ltb_mode(ax, result, U, size=7.5, xlim=(-pad, L + pad))
    ax.set_xlabel(f"x [{U.label('length')}] from the left end", fontsize=7.5, color=_INK)
    ax.set_ylabel("v, φ\n(each largest |value| 1)", fontsize=7.5, color=_INK)
    M_cr = ltb_words(result, U).text("M_cr")
    ax.set_title(f"{MODE_TITLE} at M_cr = {M_cr}", fontsize=8, color=_INK, loc="left")


def _pad(L: float, width_in: float) -> float:
    """The room [display length] each side of a member of length `L` drawn `width_in` inches wide: PAD_INCHES
    for the supports and the axial-force arrows."""
    return PAD_INCHES * L / max(width_in - 2 * PAD_INCHES, 1.0)


def sheet_figure(result, *, units="si", plane: str = "first") -> Figure:
    """The calc sheet's figure page: the sketch and the diagrams of :func:`result_figure` on A4 portrait.

    The calc sheet keeps one orientation, and its text pages already give the inputs, the governing values
    and the cautions, so this page has no title block of its own (only a heading naming the case). A member
    bent in both planes gets one page per plane: ``plane="second"`` draws ``result.second_plane``.
    """
    U = _units(units)
    fig = Figure(figsize=A4_PORTRAIT)
    FigureCanvasAgg(fig)
    shown = result
    title = f"Figures: {_title(result)}"
    second = getattr(result, "second_plane", None)
    if second is not None:
        axes = plane_axes(result)
        shown = second if plane == "second" else result
        axis = axes[1] if plane == "second" else axes[0]
        title = f"Figures, bending about the {plane_name(axis)}: {_title(result)}"
    _plots(fig, shown, U, left=0.14, right=0.94, top=0.86, bottom=0.07, legend_columns=2)
    page_heading(fig, title)
    return fig


def page_heading(fig, title: str) -> None:
    """The bold heading of a calc-sheet figure page (A4 portrait), shortened to the page's width."""
    width_pt = (0.94 - 0.14) * A4_PORTRAIT[0] * 72
    heading = _Measure().shorten(drawable(title), width_pt, 9, "bold")
    fig.text(
        0.14,
        0.935,
        heading,
        ha="left",
        va="bottom",
        fontsize=9,
        weight="bold",
        color=_INK,
        family=families(),
        parse_math=False,
    )


def _plots(fig, result, U: Units, *, left, right, top, bottom, legend_columns) -> None:
    """The sketch and the three diagrams on a shared x axis, and their legend above them."""
    fig_w, _ = fig.get_size_inches()
    plot_left, plot_right = left, right
    grid = fig.add_gridspec(
        4,
        1,
        left=plot_left,
        right=plot_right,
        top=top,
        bottom=bottom,
        height_ratios=(1.35, 1.0, 1.0, 1.0),
        hspace=0.14,
    )
    sketch = fig.add_subplot(grid[0])
    axes = [fig.add_subplot(grid[i], sharex=sketch) for i in (1, 2, 3)]

    L = U.length.from_si(float(result.case.length))
    pad = _pad(L, (plot_right - plot_left) * fig_w)
    sketch.set_xlim(-pad, L + pad)
    _draw_sketch(sketch, result, U)

    first = result.first_order
    fo = (lambda name: None) if first is None else (lambda name: getattr(first, name))
    fog = (lambda name: None) if first is None else (lambda name: getattr(first.governing, name))
    g = result.governing
    sl = U.label("small_length")
    specs = [(result.deflection, fo("deflection"), _INK, g.deflection, fog("deflection"))]
    ylabel = f"deflection w [{sl}]\n(+ downward)"
    if has_bow(result):
        specs.append((result.total_offset, fo("total_offset"), _ACCENT, g.total_offset, fog("total_offset")))
        ylabel = f"w, w + w0 [{sl}]\n(+ downward)"
    deflection_ax, moment_ax, shear_ax = axes
    _diagram(deflection_ax, result, U, specs, kind="small_length", ylabel=ylabel, inverted=True)
    if has_bow(result):
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
        ylabel=f"bending moment M\n[{U.label('moment')}]"
        + ("\n(+ downward)" if MOMENT_POSITIVE_DOWN else ""),
        inverted=MOMENT_POSITIVE_DOWN,
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
        Line2D([], [], color=_INK, lw=1.4, label=f"second order (N = {axial_text(result.axial_force, U)})"),
        Line2D([], [], color=_INK, lw=1.0, ls=(0, (4, 2.5)), label="first order (N = 0)"),
    ]
    if has_bow(result):
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
        bbox_to_anchor=(plot_left, top + 0.01),
        ncol=legend_columns,
        fontsize=6.6,
        frameon=False,
        handlelength=2.4,
        columnspacing=1.2,
        borderaxespad=0.0,
    )


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
