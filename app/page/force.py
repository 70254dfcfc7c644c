"""The axial-force control: a slider scaled to Pcr1 with fine control near it, an exact entry, and a readout
of N, N/Pcr1, α_cr and the status.

The slider's track is not linear in N. Its value is a position from 0 to 1, and the force is a piecewise
linear function of it (:data:`KNOTS`, in units of Pcr1): half the track covers 0.9 to 1.02·Pcr1, so near the
critical load a pixel is nine times finer than on a linear track from −Pcr1 to 1.25·Pcr1 (on a 500 px track,
1.6 kN instead of 15 kN on the demo case, whose Pcr1 is 3279 kN). The exact entry beside it takes any force.
"""

from __future__ import annotations

import math

import numpy as np
import panel as pn
import param

from app.page.fields import ErrorPanes, rounded, si_value
from app.page.number_text import NumberText, Unread, same_value
from app.page.style import SECOND, WIDGET_CSS, esc, html_pane
from app.page.words import ratio_text
from app.state import MemberState
from app.state_actions import shown_result
from app.units import units
from engine.cautions import NEAR_CRITICAL_RATIO

__all__ = ["KNOTS", "ForceControl"]

#: (slider position, N/Pcr1) of the slider's scale; the ends move out to a force beyond them.
KNOTS = ((0.0, -1.0), (0.2, 0.5), (0.35, 0.9), (0.85, 1.02), (1.0, 1.25))
#: Slider positions per unit of the track: finer than a pixel of any screen.
_STEPS = 4000

_BADGES = {
    "stable": "stable",
    "unstable": "unstable",
    "critical": "critical",
    "near": "near Pcr1",
    "other-axis": "buckles about the other axis",
}


_STYLE = {"other-axis": "unstable"}  # drawn as a member without equilibrium


def _other_critical(result) -> float:
    """The first critical load [N] of the axis not drawn: the second plane's, or the out-of-plane check's
    N_cr (inf where neither is known)."""
    second = getattr(result, "second_plane", None)
    if second is not None:
        return float(second.critical_loads[0])
    check = getattr(result, "check", None)
    out = getattr(check, "out_of_plane", None)
    n_cr = getattr(out, "N_cr", None)
    return float(n_cr) if n_cr is not None else math.inf


class ForceControl(pn.viewable.Viewer):
    """The axial force N: slider, exact entry and readout, bound to the state's ``axial_force``."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")
    pcr1 = param.Number(
        default=None, allow_None=True, doc="The first critical load [N] the slider is scaled to."
    )

    def __init__(self, state: MemberState, errors: ErrorPanes, beside=None, **params) -> None:
        super().__init__(state=state, **params)
        self.slider = pn.widgets.FloatSlider(
            label="Axial force N",
            start=0.0,
            end=1.0,
            step=1.0 / _STEPS,
            value=0.0,
            show_value=False,
            sizing_mode="stretch_width",
            min_width=170,
            bar_color=SECOND,
            margin=(2, 12, 0, 10),
            stylesheets=[WIDGET_CSS],
        )
        self.slider.param.watch(self._slid, "value")
        self.slider.param.watch(self._released, "value_throttled")
        self.entry = NumberText(
            label="N", value=None, width=98, stylesheets=[WIDGET_CSS], margin=(2, 4, 0, 4)
        )
        self.entry.param.watch(self._typed, "value")
        self.readout = html_pane(width=250, margin=(2, 2, 0, 4))
        self.error = errors.pane("axial_force")
        self.panel = pn.Column(
            pn.Row(
                self.slider,
                self.entry,
                pn.Column(self.readout, *([beside] if beside is not None else []), margin=0, width=256),
                sizing_mode="stretch_width",
                margin=0,
            ),
            self.error,
            sizing_mode="stretch_width",
            margin=(4, 0, 0, 0),
        )
        state.param.watch(lambda *_: self.show(), ["result", "units", "combination_choice"])
        self._shown_html: str | None = None  # the readout undimmed (:meth:`_dim` dims it while refused)
        state.param.watch(lambda *_: self._dim(), ["errors"])  # never re-places the widgets: no input is lost
        self.show()

    def __panel__(self):
        return self.panel

    # ------------------------------------------------------------------ the slider's scale

    def _knots(self, force: float | None = None) -> tuple[np.ndarray, np.ndarray]:
        positions, ratios = (np.array(column, dtype=float) for column in zip(*KNOTS, strict=True))
        if force is not None and self.pcr1:
            ratio = force / self.pcr1
            ratios[0], ratios[-1] = min(ratios[0], ratio), max(ratios[-1], ratio)
        return positions, ratios

    def force_at(self, position: float) -> float:
        """The axial force [N] at a slider position (0 to 1)."""
        positions, ratios = self._knots(self.state.axial_force)
        return float(np.interp(position, positions, ratios)) * self.pcr1

    def position_of(self, force: float) -> float:
        """The slider position (0 to 1) of an axial force [N]."""
        positions, ratios = self._knots(force)
        return float(np.interp(force / self.pcr1, ratios, positions))

    def slide_to(self, force: float) -> None:
        """Move the slider to `force` [N], as a drag would (the force lands on the nearest slider step)."""
        self.slider.value = round(self.position_of(force) * _STEPS) / _STEPS

    # ------------------------------------------------------------------ widget → state

    def _slid(self, event) -> None:
        if not self.pcr1 or event.new is None:
            return
        if self.state.axial_force is not None and self.position_of(self.state.axial_force) == event.new:
            return  # the slider shows the state's force already
        self.state.axial_force = self.force_at(event.new)

    def _released(self, event) -> None:
        # The browser sends the released value with the last drag value, in either order: the force is taken
        # from the released value itself, so that the link never holds the step before the last one.
        self._slid(event)
        self.state.settle()

    def _typed(self, event) -> None:
        if same_value(event.new, self._shown(self.state.axial_force)):
            return
        self.state.axial_force = si_value(event.new, units(self.state.units).force)
        self.state.settle()

    def _shown(self, force):
        if force is None or isinstance(force, Unread):
            return force
        return rounded(units(self.state.units).force.from_si(force))

    # ------------------------------------------------------------------ state → widgets

    def scale(self, pcr1: float) -> None:
        """Scale the slider to a first critical load [N] (before the first result, from Pcr1 alone)."""
        if math.isfinite(pcr1) and pcr1 > 0:
            self.pcr1 = pcr1
            self._place(self.state.axial_force)

    def _place(self, force) -> None:
        if force is None or not math.isfinite(force) or not self.pcr1:
            return
        position = self.position_of(force)
        if not math.isclose(self.slider.value, position, abs_tol=0.5 / _STEPS):
            self.slider.value = position
        shown = self._shown(force)
        if not same_value(self.entry.value, shown):
            self.entry.value = shown

    def show(self) -> None:
        """Show the result's force (the combination shown, with load cases), N/Pcr1, α_cr and status."""
        result = shown_result(self.state)
        U = units(self.state.units)
        self.slider.label = f"Axial force N [{U.label('force')}]"
        self.entry.label = f"N [{U.label('force')}]"
        if result is None:
            return
        pcr1 = float(result.critical_loads[0])
        if getattr(result, "second_plane", None) is not None:  # two planes: the lower one buckles first, and
            pcr1 = min(pcr1, _other_critical(result))  # α_cr is that plane's: N/Pcr1 and the track follow it
        P = float(result.axial_force)
        self.pcr1 = pcr1
        # Served, a result can arrive after the slider has moved on (solves run off the event loop): the
        # widgets then keep the newer force rather than jump back.
        if self.state.axial_force is None or self.state.axial_force == P:
            self._place(P)
        ratio = P / pcr1
        kind = "compression" if P > 0 else "tension" if P < 0 else "no axial force"
        status = result.status
        if status == "stable" and ratio >= NEAR_CRITICAL_RATIO:
            status = "near"
        if status == "stable" and P > 0.0 and P >= _other_critical(result):
            status = (
                "other-axis"  # in equilibrium in the plane drawn, but past the other axis's buckling load
            )
        alpha = "∞" if math.isinf(result.alpha_cr) else ratio_text(result.alpha_cr)
        # The status badge speaks of equilibrium; a member that is in equilibrium but fails its check must not
        # read as safe beside it, so a second flag says so (the values table gives the governing check).
        # The headline (the worst enabled route), not the member check alone: eq. (6.62) of the en-member
        # route or a term of the second-order route may fail where the member check passes.
        headline = result.utilization
        fails = headline is not None and headline > 1
        flag = " <span class='ss-flag ss-fails'>fails check</span>" if fails else ""
        style = _STYLE.get(status, status)
        # The badges wrap onto a line of their own where N and both do not fit the readout's width (a long
        # badge ran under the right-hand column and hid the flag); no figure is split from its name.
        self._shown_html = (
            f"<div class='ss-readout ss-force'><b>{esc(U.show('force', P, digits=5))}</b> "
            f"<span class='ss-badge ss-{style}'>{_BADGES.get(status, status)}</span>{flag}<br>"
            f"<span class='ss-nowrap'>{kind}</span> · "
            f"<span class='ss-nowrap'>N/Pcr1 <b>{ratio:.3f}</b></span> · "
            f"<span class='ss-nowrap'>α<sub>cr</sub> <b>{esc(alpha)}</b></span></div>"
        )
        self._dim()

    def _dim(self) -> None:
        """The readout, dimmed while the inputs are refused (the last valid case's N and status)."""
        text = self._shown_html
        if text is None:
            return
        if self.state.errors:
            text = f"<div class='ss-stale-values'>{text}</div>"
        if self.readout.object != text:
            self.readout.object = text
