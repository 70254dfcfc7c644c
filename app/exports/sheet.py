"""The PDF calc sheet."""

from __future__ import annotations

import io
from importlib import metadata

from matplotlib import rc_context
from matplotlib.backends.backend_pdf import PdfPages
from matplotlib.figure import Figure
from matplotlib.lines import Line2D

from app.exports.figure import _pcr_text, sheet_figure
from app.exports.layout import _Flow, _Measure
from app.exports.pdf_text import glyphs_own_characters
from app.exports.sheet_ltb import ltb_items, ltb_mode_figure
from app.exports.sheet_restraints import inner_input_items, reaction_items
from app.exports.sheet_routes import combinations_items, routes_items, second_plane_items
from app.exports.style import (
    _DANGER,
    _DEFINITIONS_TEXT,
    _FONT,
    _GREY,
    _INK,
    _LIGHT,
    _METHOD,
    _REFERENCES,
    _RESISTANCE_DEFINITIONS,
    A4_PORTRAIT,
    _date_text,
    _name,
    _title,
    _units,
)
from app.report import (
    REACTIONS_NOTE,
    alpha_text,
    axial_text,
    bow_direction_text,
    bow_text,
    caution_text,
    finite,
    general_caution,
    governing_rows,
    headline_route,
    load_ratio_text,
    load_text,
    material_text,
    out_of_plane_text,
    percent,
    ratio,
    reaction_rows,
    scientific,
    section_text,
    service_text,
    source_text,
    status_text,
    stiffness_text,
    support_text,
    system_name,
    utilisation_text,
)
from app.report.capacity_words import capacity_line
from app.report.combinations import deflection_basis, second_plane_service, service_strength, shown_line
from app.units import Units

# --------------------------------------------------------------------------------------------------------
# The calc sheet.


def _version() -> str:
    try:
        return metadata.version("strutscope")
    except metadata.PackageNotFoundError:
        return "(not installed)"


def _sheet(
    flow: _Flow, result, U: Units, *, date: str, prepared_by: str, checked_by: str, capacity=None
) -> None:
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
            f"Units: {system_name(U)}",
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
    item("Support, left end (x = 0)", support_text(case.left, U))
    item("Support, right end (x = L)", support_text(case.right, U))
    section = section_text(result, U)
    if section:
        item("Section", section)
    material = material_text(result, U)
    if material:
        item("Material", material)
        if result.material.source:
            item("", f"source: {source_text(result.material.source, U)}", scale=0.85, color=_GREY)
    item("Bending stiffness", stiffness_text(result, U))
    item("Axial force", axial_text(result.axial_force, U) + " (constant along the member)")
    if case.loads:
        for i, load in enumerate(case.loads):
            item("Transverse loads" if i == 0 else "", load_text(load, case.length, U))
    else:
        item("Transverse loads", "none")
    inner_input_items(item, result, U)
    item("Initial bow", bow_text(result, U))
    bow = result.bow
    if bow is not None and bow.source:
        item("", f"source: {source_text(bow.source, U)}", scale=0.85, color=_GREY)
    if bow is not None and bow.curve_reason:
        item("", f"buckling curve: {source_text(bow.curve_reason, U)}", scale=0.85, color=_GREY)
    if bow is not None and bow.sway_source:
        item("", f"sway: {source_text(bow.sway_source, U)}", scale=0.85, color=_GREY)
    if bow is not None and bow.direction_governing:
        item(
            "Bow direction",
            f"{bow.direction}, the worse of both directions solved"
            if bow.automatic
            else bow_direction_text(bow, U),
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
    combination, other = shown_line(result)
    if combination:
        weight, color = ("bold", _DANGER) if other else ("normal", _INK)
        item("Combination", combination.removeprefix("Combination "), weight=weight, color=color)
    status = status_text(result, U)
    danger = result.status != "stable"
    item("Status", status, weight="bold" if danger else "normal", color=_DANGER if danger else _INK)
    shown = range(1, min(3, len(result.critical_loads)) + 1)
    pcr = ", ".join(f"Pcr{n} = {_pcr_text(result, U, n)}" for n in shown)
    item("Elastic critical loads", pcr)
    load_ratio = load_ratio_text(result)
    two = getattr(result, "second_plane", None) is not None  # α_cr is then the lower plane's, named
    item(
        "",
        f"effective length factor K = {ratio(result.buckling.effective_length_factor)}; "
        + ("α_cr = Pcr1/N of the plane that buckles first = " if two else "α_cr = Pcr1/N = ")
        + alpha_text(result)
        + (f"; {load_ratio}" if load_ratio else ""),
    )
    flow.space(3)
    widths = [1.75, 1.4, 0.95, 1.4, None]
    flow.row(
        ["Governing value", "second order", "at x", "first order (N = 0)", "at x"], widths, weight="bold"
    )
    rows = governing_rows(result) + [("largest |T|", "transverse_force", "force")]
    for label, field, kind in rows:
        peak = getattr(result.governing, field)
        cells = [label, U.show(kind, peak.value), U.show("length", peak.x) if finite(peak.value) else "–"]
        if first is not None:
            fp = getattr(first.governing, field)
            cells += [U.show(kind, fp.value), U.show("length", fp.x)]
        else:
            cells += ["n/a", ""]
        flow.row(cells, widths)
    flow.space(3)
    second_plane_items(item, result, U)
    if not reaction_items(item, result, U):
        item(
            "Support reactions",
            "; ".join(f"{end}: {force}, couple {couple}" for end, force, couple in reaction_rows(result, U)),
        )
        item("", REACTIONS_NOTE, scale=0.85, color=_GREY)
    amplification = result.amplification
    from engine.results import AMPLIFICATION_DEFINITIONS as words

    free = (
        ""
        if amplification.moment_bow_free is None
        else f"; {ratio(amplification.moment_bow_free)} without the bow"
    )
    item(
        "Amplification, exact",
        f"moment {ratio(amplification.moment)} over M_I + N·w0 "
        f"({ratio(amplification.moment_first_order)} over M_I alone{free}); "
        f"deflection {ratio(amplification.deflection)} ({words['deflection']})",
    )
    if amplification.approximations:
        for approximation in amplification.approximations:
            against = "exact, no bow" if approximation.compared_with == "moment_bow_free" else "exact"
            item(
                "",
                f"{approximation.name} = {ratio(approximation.value)}, error "
                f"{percent(approximation.error)} against {against}; {source_text(approximation.source, U)}",
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
            f"transverse {scientific(equilibrium.transverse)}, moment "
            f"{scientific(equilibrium.moment)} (relative)",
        )

    flow.heading("4  Member check (second-order forces)")
    check = result.check
    if check is None:
        if result.utilization is not None:
            item("Utilisation", ratio(result.utilization))
        elif service_strength(result):  # a service combination shown: strength is the ultimate combinations'
            item("Strength", service_strength(result))
            if result.service is not None:
                item("Deflection (service)", f"{service_text(result.service, U)}; {deflection_basis(result)}")
        else:
            flow.para("No section and material given: no member check.", color=_GREY)
            if result.service is not None:  # the deflection check needs neither
                item("Deflection (service)", f"{service_text(result.service, U)}; {deflection_basis(result)}")
    else:
        item("Utilisation", utilisation_text(result, U), weight="bold")
        # the source of what sets the headline: another route's where it governs (eq. (6.62) was followed by
        # the second-order check's source, found by a new user)
        top = headline_route(result)
        other = top is not None and top.route != "second-order" and top.source
        source = top.source if other else check.source
        item("", f"source: {source_text(source, U)}", scale=0.85, color=_GREY)
        if capacity is not None:  # asked for (`--capacity`, or the page's): the same case, a case-wide value
            item("Axial capacity", capacity_line(capacity, U, result))
        item("Strength alone", f"{ratio(check.strength_utilization)} ({check.strength_kind})")
        out = check.out_of_plane
        if out is not None and out.checked:
            item(
                "Out of plane",
                f"N/N_b,Rd = {ratio(out.utilization)} {out_of_plane_text(out, U)} (EN 1993-1-1 §6.3.1)",
            )
        elif out is not None:
            item("Out of plane", out_of_plane_text(out, U))
        if check.section_class is not None:
            item("Section", f"{check.section_class.describe()}, EN 1993-1-1 Table 5.2")
        service = result.service
        if service is not None:
            item("Deflection (service)", f"{service_text(service, U)}; {deflection_basis(result)}")
        second = second_plane_service(result)
        if second is not None:
            plane = second[0].removeprefix("second plane, ")  # the label column is narrow
            item("Deflection, plane 2", f"{plane}: {service_text(second[1], U)}; {second[2]}")
        resistances = check.resistances or {}
        parts = []
        for key, kind in (("N_Rd", "force"), ("M_Rd", "moment"), ("V_Rd", "force")):
            if resistances.get(key) is not None:
                parts.append(f"{key} = {U.show(kind, resistances[key])}")
        if parts:
            item("Resistances", ", ".join(parts))
        for note in check.notes:
            item("", note, scale=0.92)
    routes_items(item, flow, result, U)
    combinations_items(item, flow, result, U)
    ltb_items(item, flow, result, U)

    flow.heading("5  Cautions")
    cautions = list(result.cautions) or []
    if not any(c.code == "scope" for c in cautions):
        flow.para(f"[info] {general_caution(result)}", hanging=0.2)
    for caution in cautions:
        if caution.code == "out-of-plane-checked":  # section 4's "Out of plane" line states it
            continue
        danger = caution.level == "danger"
        flow.para(
            f"[{caution.level}] {caution_text(caution, U)} ({source_text(caution.source, U)})",
            hanging=0.2,
            color=_DANGER if danger else _INK,
            weight="bold" if danger else "normal",
        )


def pdf_bytes(result, *, units="si", prepared_by="", checked_by="", date=None, capacity=None) -> bytes:
    """Return a calc sheet of `result` as PDF bytes: A4 portrait throughout: text, then the figures.

    Page 1 has the header (title, date, prepared-by and checked-by block), the inputs, the method and its
    references, the results (critical loads, governing values, reactions, amplification and the
    approximations, equilibrium residuals), the member check and every caution of the result. Page 2 is
    :func:`app.exports.figure.sheet_figure` (the diagrams, no second title block). The text is real PDF text
    (TrueType fonts), so it can be searched and copied.

    Parameters
    ----------
    result : engine.Result
    units : str or Units
    prepared_by, checked_by : str
        Names or initials for the header; a blank line to sign on when empty.
    date : None, datetime.date or str
        Printed in the header and the figure; today when None.
    capacity : engine.Capacity or None
        The axial capacity of the same case (:func:`engine.capacity_of`), stated in the member check.

    Returns
    -------
    bytes
        The PDF file (no creation date in its metadata, so the same inputs give the same bytes).
    """
    pages = calc_sheet_figures(
        result, units=units, prepared_by=prepared_by, checked_by=checked_by, date=date, capacity=capacity
    )
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
    # TrueType (Type 42) embedding: Type 3 glyphs are drawings, which many readers cannot search or copy.
    with rc_context({"pdf.fonttype": 42}), PdfPages(buffer, metadata=metadata_) as pdf:
        glyphs_own_characters(pdf)  # λ̄ is extracted as λ̄, not λ̄λ̄ (app.exports.pdf_text)
        for fig in pages:
            pdf.savefig(fig)
    return buffer.getvalue()


def calc_sheet_figures(
    result, *, units="si", prepared_by="", checked_by="", date=None, capacity=None
) -> list[Figure]:
    """The pages of :func:`pdf_bytes` as matplotlib figures (text pages, then the figure page)."""
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
        _sheet(
            flow, result, U, date=date_text, prepared_by=prepared_by, checked_by=checked_by, capacity=capacity
        )
        return flow.pages, pages

    size = 8.2
    for size in (8.2, 7.8, 7.4, 7.0, 6.6):
        if render(size, False)[0] == 1:
            break
    count, pages = render(size, True)
    mode = ltb_mode_figure(result, U)  # after the text: the lateral-torsional buckling mode, if any
    if mode is not None:
        pages.append(mode)
        count += 1
    # one figure page per bending plane
    planes = ("first", "second") if getattr(result, "second_plane", None) is not None else ("first",)
    total = count + len(planes)
    for number, fig in enumerate(pages, start=1):
        _sheet_frame(fig, number, total, margin)
    for number, plane in enumerate(planes, start=count + 1):
        figure = sheet_figure(result, units=U, plane=plane)
        figure.text(
            0.985,
            0.008,
            f"page {number} of {total}",
            ha="right",
            va="bottom",
            fontsize=6.5,
            color=_GREY,
            family=_FONT,
            parse_math=False,
        )
        pages.append(figure)
    return pages


def _grey_text(fig, x: float, y: float, text: str, *, ha: str, va: str, size: float) -> None:
    fig.text(x, y, text, ha=ha, va=va, fontsize=size, color=_GREY, family=_FONT, parse_math=False)


def _sheet_frame(fig, number: int, total: int, margin: float) -> None:
    """Running header and footer of a calc-sheet page (the footer points to the general caution)."""
    w, h = fig.get_size_inches()
    top = (h - margin + 0.05) / h
    _grey_text(fig, margin / w, top, "strutscope · calculation sheet", ha="left", va="bottom", size=7.5)
    _grey_text(fig, 1 - margin / w, top, f"page {number} of {total}", ha="right", va="bottom", size=7.5)
    fig.add_artist(
        Line2D(
            [margin / w, 1 - margin / w], [top - 0.004] * 2, color=_LIGHT, lw=0.6, transform=fig.transFigure
        )
    )
    footer = "Elastic analysis of one member, not a full code check: see the caution in section 5."
    _grey_text(fig, margin / w, (margin - 0.05) / h, footer, ha="left", va="top", size=6.5)
