"""Variants: results kept to compare with the current one, each with a name the user can edit.

A variant's name defaults to what differs from the variant kept before it (the section, the supports, N or
the bow); the first one is named by its axial force. Up to :data:`MAX_VARIANTS` are kept; the oldest goes
first. The keep button sits beside the axial force, so it can be pressed from every tab.
"""

from __future__ import annotations

import panel as pn
import param

from app.page.style import MAX_VARIANTS, VARIANT_LETTERS, WIDGET_CSS, esc, html_pane
from app.page.words import ratio_text, symbols
from app.report.section_names import section_name
from app.state import MemberState
from app.state_actions import view_result
from app.units import units

__all__ = ["VariantsView", "describe"]


def describe(result, U) -> dict[str, str]:
    """The parts of a result's case that name a variant: section, material, supports, loads, N and bow."""
    case = result.case
    stiffness = f"EI {U.show('stiffness', result.EI)}"
    section = section_name(result.section, U) if result.section is not None else stiffness
    bow = result.bow.label if result.bow is not None else case.imperfection.shape
    if result.bow is None and case.imperfection.shape != "none":
        bow = f"{case.imperfection.shape}, a = {U.show('small_length', case.imperfection.amplitude)}"
    loads = ", ".join(_load_words(load, U) for load in case.loads) or "none"
    return {
        "section": section,
        "material": result.material.name if result.material is not None else "—",
        "supports": f"{case.left.name or 'elastic'}–{case.right.name or 'elastic'}",
        "loads": loads,
        "N": f"N {U.show('force', result.axial_force)}",
        "bow": f"bow {bow}",
    }


def _load_words(load, U) -> str:
    if load.type == "uniform":
        return f"q {U.show('line_load', load.q)}"
    if load.type == "linear":
        return f"q {U.show('line_load', load.q_start)}→{U.show('line_load', load.q_end)}"
    if load.type == "point":
        return f"F {U.show('force', load.P)} at {U.show('length', load.x)}"
    return f"C {U.show('moment', load.C)} at {U.show('length', load.x)}"


def default_name(result, before, U) -> str:
    """What differs from the variant kept `before` (section, supports, N, bow); N alone for the first."""
    parts = describe(result, U)
    if before is None:
        return parts["N"]
    previous = describe(before, U)
    differs = [parts[key] for key in ("section", "supports", "N", "bow") if parts[key] != previous[key]]
    return ", ".join(differs) or parts["N"]


class VariantsView(pn.viewable.Viewer):
    """The kept variants: their names (editable) and the comparison table; ``kept`` is what is overlaid."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")
    kept = param.List(default=[], doc="The variants: dicts with 'letter', 'name' and 'result'.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.keep_button = pn.widgets.Button(
            label=self._keep_label(),
            color="default",
            width=170,
            height=28,
            margin=(2, 4, 0, 4),
            stylesheets=[WIDGET_CSS],
            description="keep the current result to compare (up to four, overlaid on the diagrams)",
        )
        self.keep_button.on_click(lambda *_: self.keep())
        self.clear_button = pn.widgets.Button(
            label="Clear variants", color="default", width=120, stylesheets=[WIDGET_CSS]
        )
        self.clear_button.on_click(lambda *_: self.clear())
        self.names = [
            pn.widgets.TextInput(
                label=f"Name of variant {letter}",
                width=200,
                max_length=80,
                visible=False,
                stylesheets=[WIDGET_CSS],
            )
            for letter in VARIANT_LETTERS
        ]
        for index, widget in enumerate(self.names):
            widget.param.watch(lambda event, index=index: self.rename(index, event.new), "value")
        self.table = html_pane(margin=(4, 8))
        self.panel = pn.Column(
            pn.Row(self.clear_button, margin=(4, 4)),
            pn.FlexBox(*self.names, margin=(0, 4)),
            self.table,
            name="Variants",
            sizing_mode="stretch_width",
            margin=0,
            scroll=True,
        )
        state.param.watch(lambda *_: self.draw(), ["result", "units", "combination_choice"])
        self.param.watch(lambda *_: self.draw(), ["kept"])
        self.draw()

    def __panel__(self):
        return self.panel

    def _keep_label(self) -> str:
        return f"Keep as variant ({len(self.kept)}/{MAX_VARIANTS})"

    def keep(self) -> None:
        """Keep the result on screen as a variant (at most four; the oldest goes first): with load cases the
        combination shown, not the governing one (an audit kept U2 while U3 was on screen)."""
        result = view_result(self.state) if self.state.result is not None else None
        if result is None:
            return
        kept = list(self.kept)
        if len(kept) >= MAX_VARIANTS:
            kept.pop(0)
        used = {v["letter"] for v in kept}
        letter = next(ch for ch in VARIANT_LETTERS if ch not in used)
        U = units(self.state.units)
        name = default_name(result, kept[-1]["result"] if kept else None, U)
        kept.append({"letter": letter, "name": f"{letter}: {name}", "result": result})
        self.kept = kept

    def rename(self, index: int, name: str) -> None:
        """Give variant `index` (0-based, in the order kept) a new name."""
        if index < len(self.kept) and name and name != self.kept[index]["name"]:
            kept = list(self.kept)
            kept[index] = {**kept[index], "name": name}
            self.kept = kept

    def clear(self) -> None:
        """Forget every variant."""
        self.kept = []

    def draw(self) -> None:
        """The names' fields, the keep button's count and the comparison table."""
        self.keep_button.label = self._keep_label()
        for index, widget in enumerate(self.names):
            if index < len(self.kept):
                widget.label = f"Name of variant {VARIANT_LETTERS[index]}"
                if widget.value != self.kept[index]["name"]:
                    widget.value = self.kept[index]["name"]
                widget.visible = True
            else:
                widget.visible = False
        shown = view_result(self.state) if self.state.result is not None else None
        self.table.object = comparison_table(shown, self.kept, units(self.state.units))


def comparison_table(current, variants, U) -> str:
    """The variants beside the current result (HTML): what each case is, and its governing values."""
    if not variants:
        return (
            "<div class='ss-note'>No variants yet. Press <b>Keep as variant</b> (beside the axial force) to "
            "keep the current case; up to four are overlaid, muted, on the diagrams and compared here.</div>"
        )
    if current is None:
        return ""
    columns = [("current", current)] + [(v["name"], v["result"]) for v in variants]

    def cells(fn):
        return "".join(f"<td>{fn(r)}</td>" for _, r in columns)

    def part(key):
        return lambda r: esc(describe(r, U)[key].removeprefix("bow ").removeprefix("N "))

    def peak(field, kind):
        return lambda r: esc(U.show(kind, getattr(r.governing, field).magnitude))

    rows = [
        ("section", part("section")),
        ("material", part("material")),
        ("supports", part("supports")),
        ("loads", part("loads")),
        ("bow", part("bow")),
        ("length L", lambda r: esc(U.show("length", r.case.length))),
        ("axial force N", lambda r: esc(U.show("force", r.axial_force))),
        ("Pcr1", lambda r: esc(U.show("force", r.critical_loads[0]))),
        (symbols("alpha_cr"), lambda r: esc(ratio_text(r.alpha_cr))),
        ("max |w + w0|", peak("total_offset", "small_length")),
        ("max |M|", peak("moment", "moment")),
        ("max |V|", peak("shear", "force")),
        ("moment amplification", lambda r: esc(ratio_text(r.amplification.moment))),
        ("utilisation", lambda r: esc(ratio_text(r.utilization) if r.utilization is not None else "n/a")),
        ("status", lambda r: esc(r.status)),
    ]
    head = "".join(f"<th>{esc(name)}</th>" for name, _ in columns)
    words = ("section", "material", "supports", "loads", "bow")
    body = "".join(
        f"<tr{' class=case' if name in words else ''}><td>{name}</td>{cells(fn)}</tr>" for name, fn in rows
    )
    return f"<table class='ss-compare'><tr><th></th>{head}</tr>{body}</table>"
