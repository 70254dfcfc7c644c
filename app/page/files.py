"""The files of the page: the exports (figure PNG, stations CSV, calc sheet PDF, case JSON), a copy of the
page's link, and the upload of a case file.

Exports never show a case other than the one on screen: while an input is refused, the export buttons are
disabled and say why (the last valid result would otherwise be exported with nothing to say so), and so are
they while a solve of the inputs on screen is under way (served pages, ``MemberState.solving``); with load
cases they hold the combination shown (:func:`app.state_actions.view_result`), saying when it is not the
governing one.
"""

from __future__ import annotations

import io
import logging
import urllib.parse

import panel as pn
import param

from app.export_names import case_json, export_filename
from app.intake import clean_text
from app.page.fields import field_words
from app.page.style import UPLOAD_LIMIT, WIDGET_CSS, download, esc, html_pane
from app.state import MemberState
from app.state_actions import ENVELOPE, link_choice, shown_combination, view_result

__all__ = ["FilesView"]

_log = logging.getLogger(__name__)

# Copies the page's address with the case on screen (kept by the server in a hidden field, the axial force
# included even before the slider is released) to the clipboard; where the browser refuses the clipboard (a
# page not served from this computer), the address is shown in a prompt to copy.
_COPY_LINK = """
const url = window.location.origin + window.location.pathname + '?' + query.value;
const done = () => { button.label = 'Link copied'; setTimeout(() => { button.label = 'Copy link'; }, 2500); };
if (navigator.clipboard && window.isSecureContext) {
  navigator.clipboard.writeText(url).then(done, () => window.prompt('Copy this link', url));
} else {
  window.prompt('Copy this link', url);
}
"""


class FilesView(pn.viewable.Viewer):
    """The export buttons, the copy-link button and the case-file upload."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, signatures=lambda: ("", ""), **params) -> None:
        super().__init__(state=state, **params)
        self._signatures = signatures
        self.png_button = download(self.png, "png", "Figure PNG", 100)
        self.csv_button = download(self.csv, "csv", "Stations CSV", 110)
        self.pdf_button = download(self.pdf, "pdf", "Calc sheet PDF", 122)
        self.json_button = download(self.json, "json", "Case JSON", 96)
        self.buttons = (self.png_button, self.csv_button, self.pdf_button, self.json_button)
        self.copy_button = pn.widgets.Button(
            label="Copy link",
            color="light",
            width=90,
            margin=(10, 3),
            stylesheets=[WIDGET_CSS],
            description="copy the address of this page: it reopens the case on screen",
        )
        self.query = pn.widgets.TextInput(value="", visible=False)
        self.copy_button.js_on_click(args={"button": self.copy_button, "query": self.query}, code=_COPY_LINK)
        self.upload = pn.widgets.FileInput(
            accept=".json,application/json",
            width=280,
            margin=(6, 4, 2, 6),
            stylesheets=[WIDGET_CSS],
            description="open a case file (JSON, at most 1 MB); it replaces every input",
        )
        self.upload.param.watch(self._uploaded, "value")
        self.upload_message = html_pane(margin=(0, 5, 2, 5))
        self.blocked = html_pane(visible=False, margin=(0, 8, 2, 8))
        self.panel = pn.Row(*self.buttons, self.copy_button, self.query, margin=0)
        self.case_file = pn.Column(
            html_pane("<div class='ss-heading'>Open a case file (JSON)</div>", margin=(4, 5, 0, 5)),
            self.upload,
            self.upload_message,
            margin=(0, 0, 6, 0),
            styles={"border-bottom": "1px solid #e4e7e1"},
            sizing_mode="stretch_width",
        )
        state.param.watch(
            lambda *_: self.draw(), ["result", "errors", "units", "combination_choice", "solving"]
        )
        state.param.watch(
            lambda *_: self.write_query(), ["result", "errors", "units", "link", "combination_choice"]
        )
        self.write_query()
        self.draw()

    def __panel__(self):
        return self.panel

    # ------------------------------------------------------------------ exports

    def png(self) -> io.BytesIO:
        """The figure of the result on screen, as PNG."""
        from app.exports import png_bytes

        return io.BytesIO(png_bytes(view_result(self.state), units=self.state.units))

    def csv(self) -> io.StringIO:
        """The stations of the result on screen, as CSV."""
        from app.exports import csv_text

        state = self.state
        return io.StringIO(csv_text(view_result(state), units=state.units, capacity=state.capacity))

    def pdf(self) -> io.BytesIO:
        """The calc sheet of the result on screen, as PDF."""
        from app.exports import pdf_bytes

        prepared, checked = self._signatures()
        result = view_result(self.state)
        return io.BytesIO(
            pdf_bytes(
                result,
                units=self.state.units,
                prepared_by=prepared,
                checked_by=checked,
                capacity=self.state.capacity,
            )
        )

    def json(self) -> io.StringIO:
        """The case on screen, as a case file (with its load cases, when it has them)."""
        result = self.state.result
        actions = getattr(result, "actions", None)  # result.case is then one combination's plain case
        return io.StringIO(case_json(result.case if actions is None else actions.case))

    def refused(self) -> str:
        """The page's name of the refused input, or '' when every input is accepted."""
        errors = self.state.errors
        if not errors:
            return ""
        path = next(iter(errors))
        return "the case" if path in ("case", "schema", "stations") else field_words(path)

    def draw(self) -> None:
        """Name the files after the title; disable the exports, saying why, while an input is refused."""
        result = self.state.result
        if result is not None:
            case, system = view_result(self.state).case, self.state.units
            for widget, extension in zip(self.buttons, ("png", "csv", "pdf", "json"), strict=True):
                widget.filename = export_filename(
                    case.title, case.axial_force, extension, system, shown_combination(self.state)
                )
        refused = self.refused()
        # while a solve of the inputs on screen is under way the result is the previous inputs' (an audit
        # exported a 6 m member after the length read 4 m): the files wait for it
        solving = bool(getattr(self.state, "solving", False)) and not refused
        for widget in self.buttons:
            widget.disabled = bool(refused) or result is None or solving
            widget.description = (
                f"not available: {refused} is not accepted, so the result on screen is the last valid case"
                if refused
                else "not available while the case on screen is being solved"
                if solving
                else None
            )
        held = shown_combination(self.state)
        envelope = getattr(self.state, "combination_choice", "") == ENVELOPE and bool(held)
        if refused:
            self.blocked.object = (
                f"<div class='ss-error ss-blocked'>Exports are disabled until {esc(refused)} is accepted: "
                "they would hold the last valid case, not the inputs on screen.</div>"
            )
        elif envelope:  # the values beside the band are the governing combination's: the exports hold those
            self.blocked.object = (
                "<div class='ss-note'>The envelope band is drawn on screen only: the exports hold "
                f"combination {esc(held)}, the governing one whose values are shown, and list every "
                "combination's result.</div>"
            )
        else:
            self.blocked.object = ""
        self.blocked.visible = bool(refused) or envelope
        if not self.state.errors and "ss-error" in self.upload_message.object:
            self.upload_message.object = ""  # a later edit succeeded: the upload's refusal is history

    def write_query(self) -> None:
        """The query of a link to the case on screen (``case`` as JSON and ``units``), for the copy button."""
        try:
            query = {"case": self.state.link_now(), "units": self.state.units}
        except (ValueError, TypeError):
            return  # a value JSON cannot hold is refused beside its input; the last link stays
        choice = link_choice(self.state)
        if choice:  # the combination shown reopens with the link
            query["shown"] = choice
        text = urllib.parse.urlencode(query)
        if self.query.value != text:
            self.query.value = text

    # ------------------------------------------------------------------ upload

    def _uploaded(self, event) -> None:
        """Load an uploaded case file whole, or refuse it whole with a message naming what was wrong.

        The server log gets one line per refusal, naming its kind only (never the file's contents).
        """
        from app.intake import IntakeError, case_from_bytes

        data, filename = event.new, self.upload.filename or "the file"
        if data is None:
            return
        name = clean_text(str(filename))
        kind = ""
        if not name.lower().endswith(".json"):
            message, kind = f"upload: {name} is not a .json case file", "name"
        elif len(data) > UPLOAD_LIMIT:
            message = f"upload: {name} is {len(data) / 1e6:.1f} MB; a case file may be at most 1 MB"
            kind = "size"
        else:
            try:
                case = case_from_bytes(data, f"upload: {name}")
            except IntakeError as error:
                message, kind = str(error), error.kind
            except Exception as error:  # noqa: BLE001 - never a traceback: say it, keep the case
                message, kind = f"upload: {name} could not be read ({type(error).__name__})", "error"
        if kind:
            _log.warning("strutscope: an upload was refused (%s)", kind)
            self.upload_message.object = f"<div class='ss-error'>{esc(message)}</div>"
            return
        before = self.state.case_mapping()
        try:
            self.state.load_case(case)
        except Exception as error:  # noqa: BLE001 - never half applied: put the previous case back
            _log.warning("strutscope: an upload was refused (%s while loading)", type(error).__name__)
            self.state.load_mapping(before)
            message = f"upload: {name} could not be loaded ({type(error).__name__}); the previous case stays"
            self.upload_message.object = f"<div class='ss-error'>{esc(message)}</div>"
            return
        self.upload_message.object = f"<div class='ss-note'>loaded {esc(name)}</div>"
