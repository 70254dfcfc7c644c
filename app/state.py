"""The page's state: one member's inputs in SI, turned into an engine case in one place, and the last good
result.

:class:`MemberState` is a :class:`param.Parameterized` with no GUI in it. Its inputs are the case's fields
in SI units (m, N, N·m, Pa), each with the soft bounds the page's widgets use and a doc string with its
unit. The engine validates every input: hard bounds are left to it on purpose (and an emptied number field
is None), so that a bad value (a negative length, a load beyond the member) reaches the engine and comes
back as its message naming the field, which the page shows next to that input. The inputs are kept as typed
whatever happens (no input is lost), and the outputs keep the last good solution until the inputs are valid
again.

:meth:`MemberState.case_mapping` is the one place that turns the inputs into a case-file mapping, and
:meth:`MemberState.to_case` into an :class:`engine.Case`; :func:`values_from_mapping` is its inverse, which
loads a case file, an upload or a link into the state with one ``param.update`` (one solve).

The outputs are constant parameters, set only here:

- ``result``: the last good :class:`engine.Result`;
- ``sweep``: :func:`engine.sweep` over the axial forces of the amplification chart, recomputed only when the
  case other than the axial force changes (dragging the axial force does not rerun it);
- ``approximation``: the engine's 1/(1 − N/Pcr1) approximation at axial forces below Pcr1, for the same
  chart;
- ``capacity``: :func:`engine.capacity` (axial mode, which does not depend on the axial force), with a
  section;
- ``errors``: the engine's message per field path (``"length"``, ``"loads[1].x"``, ``"supports.left"``, …);
- ``link``: the settled case as compact JSON, which the page mirrors into its URL. It changes when an input
  other than the axial force changes, and when :meth:`MemberState.settle` is called (the page calls it when
  the axial force slider is released or the number is typed), never while the axial force is being dragged.

Nothing here does mechanics: every number comes from the engine.
"""

from __future__ import annotations

import dataclasses
import json
import logging
from collections.abc import Mapping
from functools import partial
from typing import Any

import numpy as np
import param

from app.state_actions import ActionsBehaviour, actions_values
from app.state_bow import bow_values
from app.state_inputs import (
    BOW_PRESETS,
    BOW_SHAPES,
    INPUTS,
    LOAD_FIELDS,
    LOAD_TYPES,
    MANUFACTURED,
    NAMED_RESTRAINTS,
    OPTIONAL_SECTION_KEYS,
    RESTRAINTS,
    SECTION_DIMENSIONS,
    SECTION_PARAMS,
    SECTION_SHAPES,
    STIFFNESS_SOURCES,
    SUPPORT_FORMS,
    MemberInputs,
    custom_choice_values,
    default_load,
    load_magnitude,
)
from app.state_ltb import ltb_values
from app.state_plane import plane_values
from app.state_restraints import inner_values
from app.state_routes import RouteSweepOutputs
from app.work import chart_forces

__all__ = [
    "BOW_PRESETS",
    "BOW_SHAPES",
    "INPUTS",
    "LOAD_FIELDS",
    "LOAD_TYPES",
    "MemberState",
    "RESTRAINTS",
    "SECTION_DIMENSIONS",
    "SECTION_SHAPES",
    "STIFFNESS_SOURCES",
    "SUPPORT_FORMS",
    "chart_forces",
    "default_load",
    "solve_outcome",
    "values_from_mapping",
]

_log = logging.getLogger(__name__)


def _field_of(message: str) -> str:
    """The field path an engine message starts with (``loads[1].x: ...`` gives ``loads[1].x``)."""
    head, sep, _ = message.partition(":")
    if not sep or " " in head.strip():
        return "case"
    return head.strip()


class MemberState(ActionsBehaviour, RouteSweepOutputs, MemberInputs):
    """The inputs of one member (SI) and the engine's answers; one instance per browser session.

    Build it with no arguments for the plain invented demo case's inputs (assets/demo_wind_post.json;
    the served page starts on the demo with load cases, :mod:`app.serve`), or with :meth:`from_case`. Set
    inputs as parameters (one at a time, or several in one ``param.update``); every change solves once.
    """

    # ------------------------------------------------------------------ outputs (set only by this class)
    result = param.Parameter(default=None, constant=True, doc="The last good engine.Result.")
    sweep = param.Parameter(
        default=None,
        constant=True,
        doc="engine.sweep over the amplification chart's axial forces (case without N).",
    )
    approximation = param.Parameter(
        default=None, constant=True, doc="(axial forces [N], the engine's 1/(1 − N/Pcr1) values) below Pcr1."
    )
    capacity = param.Parameter(
        default=None,
        constant=True,
        doc="engine.capacity of the case (axial mode), or None without a section.",
    )
    capacity_note = param.String(default="", constant=True, doc="Why no capacity is given, when none is.")
    solving = param.Boolean(
        default=False, constant=True, doc="A solve of the inputs on screen is under way (served pages)."
    )
    notice = param.String(
        default="", constant=True, doc="A message about the link or the served case, shown above the plots."
    )
    chart_note = param.String(
        default="", constant=True, doc="Why the amplification chart is not shown (yet), when it is not."
    )
    errors = param.Dict(
        default={}, constant=True, doc="The engine's message per field path; empty when the inputs are valid."
    )
    link = param.Parameter(
        default="",
        doc="The settled case as compact JSON text (mirrored into the page's "
        "URL); a mapping set here (Panel's URL sync decodes the JSON) is "
        "read as the case too.",
    )

    #: Served pages solve off the event loop through an :class:`app.work.Runner`; None solves at once.
    _runner = None
    _refresh_id = 0
    _failed_at = 0
    _pending = -1

    def __init__(self, runner=None, solve_first: bool = False, **params: Any) -> None:
        super().__init__(**params)
        self._runner = runner
        # A served page's trusted start case is solved at once, while its page is built (start-up, issue 10);
        # its charts and every later solve go through the runner.
        self._solve_first = solve_first
        self._settled_axial_force = self.axial_force
        self._base_key: str | None = None
        self._base_case = None
        self._written_link = ""
        self.param.watch(self._inputs_changed, list(INPUTS))
        self.param.watch(self._link_changed, ["link"])
        self.param.watch(self._preset_changed, ["bow_preset"])
        self._refresh(full=True)
        self._write_link()

    @property
    def runner(self):
        """The :class:`app.work.Runner` a served page solves through, or None (everything solved at once)."""
        return self._runner

    @classmethod
    def from_case(cls, case, **params: Any) -> MemberState:
        """A state holding `case` (an :class:`engine.Case`), solved once."""
        return cls(**values_from_mapping(case.to_dict()), **params)

    def load_case(self, case) -> None:
        """Put `case` (an :class:`engine.Case`) into the inputs with one update, so it solves once."""
        self.load_mapping(case.to_dict())

    def load_mapping(self, mapping: Mapping) -> None:
        """Put a case-file mapping into the inputs with one update (the engine validates it as it solves)."""
        values = values_from_mapping(mapping)
        self._settled_axial_force = values.get("axial_force", self.axial_force)
        self.action_scale = self.settled_scale = 1.0  # a file's load cases are taken as they are
        self.param.update(**values)
        self._write_link()

    # ------------------------------------------------------------------ loads table

    def add_load(self, kind: str, *, field: str = "loads") -> None:
        """Append a load row of type `kind` with default values (`field` plane2_loads: the second plane)."""
        setattr(self, field, [*getattr(self, field), default_load(kind, self.length)])

    def remove_load(self, index: int, *, field: str = "loads") -> None:
        """Remove load row `index` (0-based)."""
        setattr(self, field, [load for i, load in enumerate(getattr(self, field)) if i != index])

    def set_load(self, index: int, *, field: str = "loads", **fields: Any) -> None:
        """Change fields of load row `index`; a field set to None is removed (start, end: the member's ends).

        A new ``type`` replaces the row with that type's defaults, keeping the magnitude and the position.
        """
        rows = [dict(load) for load in getattr(self, field)]
        row = rows[index]
        kind = fields.pop("type", row.get("type"))
        if kind != row.get("type"):
            new = default_load(kind, self.length, load_magnitude(row))
            for key in ("x", "start", "end"):
                if key in row and key in LOAD_FIELDS[kind]:
                    new[key] = row[key]
            if "x" in LOAD_FIELDS[kind] and "x" not in row and "start" in row:
                new["x"] = row["start"]
            row = new
        for key, value in fields.items():
            if value is None:
                row.pop(key, None)
            else:
                row[key] = value
        rows[index] = row
        setattr(self, field, rows)

    # ------------------------------------------------------------------ solving

    def settle(self) -> None:
        """Take the current axial force as settled: the link (and so the URL) now carries it."""
        self._settled_axial_force = self.axial_force
        self.settled_scale = self.action_scale
        self._write_link()

    def link_now(self) -> str:
        """The case on screen as link text (compact JSON), with the axial force as it is now, settled or not.

        Raises ``ValueError`` for a value JSON cannot hold (an infinite number typed).
        """
        return self._link_text(self.axial_force, self.action_scale)

    def _link_text(self, axial_force, scale=None) -> str:
        return json.dumps(
            self.case_mapping(axial_force=axial_force, action_scale=scale),
            separators=(",", ":"),
            ensure_ascii=False,
            allow_nan=False,
            sort_keys=True,
        )

    def _write_link(self) -> None:
        try:
            text = self._link_text(self._settled_axial_force, self.settled_scale)
        except (ValueError, TypeError):
            # A refused value (1e400 typed is infinite): the engine's message names it next to the input; the
            # link keeps the last case it could hold (issue 11: this logged a traceback with the whole case).
            return
        self._written_link = text
        if text != self.link:
            self.link = text

    def _link_changed(self, event) -> None:
        if event.new == self._written_link or not event.new:
            return
        # A link from the URL: restore its inputs even when they were invalid when it was made (the engine
        # then shows the same message again), so that no input is lost. A link that cannot be read at all
        # leaves the case as it was, and says why in the notice (issue 11: it silently opened the demo).
        from app.intake import IntakeError, case_from_link

        before = self.case_mapping()
        try:
            mapping = case_from_link(event.new, "link")
            self.load_mapping(mapping)
        except IntakeError as error:
            _log.warning("strutscope: a link was refused (%s)", error.kind)
            self._link_failed(str(error).split(": ", 1)[-1])
        except Exception as error:  # noqa: BLE001 - never half applied: put the previous case back
            _log.warning("strutscope: a link was refused (%s)", type(error).__name__)
            self.load_mapping(before)
            self._link_failed(f"it could not be read, {type(error).__name__}")

    def _link_failed(self, reason: str) -> None:
        # Served, a solve of the case kept may still be running: it must not clear this message.
        self._failed_at = self._refresh_id + 1
        self._fail(
            f"case: the link does not hold a case this page can read ({reason}); the page keeps the "
            "case it had"
        )

    def _notify(self, message: str) -> None:
        with param.edit_constant(self):
            self.notice = message

    def _preset_changed(self, event) -> None:
        # The eq. (5.9) bow has the shape of the first buckling mode, and a member bow is never a sway: pick
        # the shape that goes with the preset rather than show an error for the user's last choice.
        if event.new == "en1993-eq-5.9" and self.bow_shape not in ("none", "mode"):
            self.bow_shape = "mode"
        elif event.new != "span" and self.bow_shape == "sway":
            self.bow_shape = "sine"

    def _inputs_changed(self, *events) -> None:
        names = {event.name for event in events}
        only_axial = names <= {"axial_force"}
        if self.actions and only_axial and not self._scale_from_force():
            return
        # the slider in the "factor" mode scales every load of the combinations: the capacity and the charts
        # depend on them (an audit exported a capacity 12.5 % high at λ = 2)
        loads_moved = bool(self.actions) and self.scale_mode == "factor"
        self._refresh(full=not only_axial or loads_moved)
        if not only_axial:
            self._write_link()

    def _fail(self, message: str) -> None:
        with param.edit_constant(self):
            self.errors = {_field_of(message): message}

    def _refresh(self, full: bool) -> None:
        """Solve the current inputs; on bad input keep every output and record the engine's message.

        Served, with a runner (:mod:`app.work`), only the validation happens here: the solve runs off the
        event loop and :meth:`_solved` applies it when it is done.
        """
        import engine

        self._refresh_id += 1
        try:
            if full or self._base_case is None or self.actions:
                case = self.to_case()
            else:
                case = dataclasses.replace(self._base_case, axial_force=self.axial_force)
        except engine.CaseError as error:
            self._base_case = None  # the next change validates the whole case again
            self._failed_at = self._refresh_id
            self._fail(str(error))
            return
        except Exception as error:  # never a traceback on the page: say what failed, keep the last result
            self._base_case = None
            self._failed_at = self._refresh_id
            self._fail(_engine_failure(error))
            return
        if self.actions:
            self._remember_scale(case)
        if self._runner is None or self._solve_first:
            self._solve_first = False
            self._solved(case, full, *solve_outcome(case, self.stations))
            return
        self._base_case = case
        self._pending = self._refresh_id
        with param.edit_constant(self):
            self.solving = True  # the result is not yet the inputs on screen: exports wait (app.page.files)
        self._runner.solve(partial(_solve_job, self, case, self._refresh_id), full)

    def _solved(self, case, full: bool, result, message: str, refresh_id: int | None = None) -> None:
        """Apply a solve: its result, or its message with every output kept.

        Served, a solve can finish after a later input was refused: its result is then only the last good
        result (the refusal's message stays), and its failure is dropped.
        """
        if refresh_id is not None and refresh_id == self._pending:
            with param.edit_constant(self):
                self.solving = False
        if refresh_id is not None and refresh_id < self._failed_at:
            if result is not None:
                with param.edit_constant(self):
                    self.result = result
            return
        if result is None:
            self._base_case = None
            self._fail(message)
            return
        self._base_case = case
        outputs: dict[str, Any] = {"result": result, "errors": {}}
        if getattr(result, "actions", None) is not None:
            self.result_scale = self._scale_of(case)
            case = result.case  # the charts and the routes: the governing combination as a plain case
        if full:
            from app.work import chart_key, ultimate_texts  # with load cases: the lowest capacity of them

            key = chart_key(case, result)
            if key != self._base_key:
                self._base_key = key
                if self._runner is None:
                    outputs.update(self._chart_outputs(case, result))
                else:
                    # the old capacity belongs to the old case: never shown beside the new one
                    outputs.update(
                        sweep=None,
                        approximation=None,
                        chart_note="computing the chart …",
                        capacity=None,
                        capacity_note="computing …",
                    )
                    job = partial(_chart_job, self, case, key, result.critical_loads, ultimate_texts(result))
                    self._runner.chart(job)
        if self.actions:
            self._mirror_force(result)
        with param.edit_constant(self):
            self.param.update(**outputs)
        if full:
            self._routes_follow(case, result)

    def _charted(self, key: str, outputs: dict) -> None:
        """Apply chart outputs computed off the loop, unless the case has changed since."""
        if key != self._base_key:
            return
        with param.edit_constant(self):
            self.param.update(**outputs)

    def _chart_outputs(self, case, result) -> dict:
        """The sweep, the approximation curve and the capacity: they do not depend on the axial force."""
        import engine

        pcr = np.asarray(result.critical_loads, dtype=float)
        outputs: dict[str, Any] = {}
        try:
            sweep = engine.sweep(case, chart_forces(pcr))
            outputs["sweep"] = sweep
            # The engine's 1/(1 - N/Pcr1) at the same forces (NaN from Pcr1 on).
            outputs["approximation"] = (sweep.axial_force, sweep.simple_amplification)
        except Exception as error:  # the chart is secondary: keep the result, log one line without the case
            _log.error("strutscope: amplification sweep failed (%s)", type(error).__name__)
            outputs.update(
                sweep=None,
                approximation=None,
                chart_note=f"the amplification chart could not be computed ({type(error).__name__})",
            )
        else:
            outputs["chart_note"] = ""
        if case.section is not None and case.material is not None:
            try:
                outputs.update(capacity=engine.capacity_of(result), capacity_note="")
            except Exception as error:
                outputs.update(capacity=None, capacity_note=str(error))
        else:
            outputs.update(capacity=None, capacity_note="needs a section and a material")
        return outputs

    # ------------------------------------------------------------------ errors for the view

    def error_for(self, *prefixes: str) -> str:
        """The engine's message for a field path starting with any of `prefixes`, or an empty string."""
        for path, message in self.errors.items():
            for prefix in prefixes:
                if path == prefix or path.startswith(prefix + ".") or path.startswith(prefix + "["):
                    return message
        return ""


def solve_outcome(case, stations: int):
    """``(result, "")`` for `case`, or ``(None, message)`` when the engine refuses or fails."""
    import engine

    try:
        return engine.solve(case, stations=stations), ""
    except engine.CaseError as error:
        return None, str(error)
    except Exception as error:  # never a traceback on the page: say what failed, keep the last result
        return None, _engine_failure(error)


def _engine_failure(error: BaseException) -> str:
    """The page's words for an engine failure, and one log line without the case (issue 11)."""
    text = " ".join(str(error).split())
    text = text if len(text) <= 120 else text[:117] + "..."
    _log.error("strutscope: the engine could not solve a case (%s)", type(error).__name__)
    return f"case: the engine could not solve these inputs ({type(error).__name__}: {text})"


def _solve_job(state: MemberState, case, refresh_id: int, full: bool):
    """Off the event loop: solve `case` (a first solve of a big case in a worker, under the budget)."""
    from app import work

    if full and len(case.loads) > work.PROBE_LOADS:
        try:
            work.run_in_worker("probe", work.probe_solve, (case.to_json(), state.stations), work.SOLVE_BUDGET)
        except work.BudgetExceeded:
            _log.warning("strutscope: a case was refused: its solve took longer than %g s", work.SOLVE_BUDGET)
            message = (
                f"case: solving this case takes longer than the server's budget of {work.SOLVE_BUDGET:g} s "
                f"({len(case.loads)} loads); the previous result is kept"
            )
            return partial(state._solved, case, full, None, message, refresh_id)
        except Exception:  # noqa: BLE001 - the solve below reports the engine's own message
            pass
    return partial(state._solved, case, full, *solve_outcome(case, state.stations), refresh_id)


def _chart_job(state: MemberState, case, key: str, critical_loads, ultimate: tuple = ()):
    """Off the event loop: the chart outputs from the worker process, or a note when over the budget."""
    from app import work

    try:
        job = (case.to_json(), chart_forces(critical_loads), ultimate)
        outputs = work.run_in_worker("chart", work.chart_job, job, work.CHART_BUDGET)
    except work.BudgetExceeded:
        _log.warning("strutscope: a chart was not computed: over its budget of %g s", work.CHART_BUDGET)
        note = f"the amplification chart takes longer than the server's budget of {work.CHART_BUDGET:g} s"
        outputs = {"sweep": None, "approximation": None, "chart_note": note, "capacity": None}
        outputs["capacity_note"] = f"not computed: over the server's budget of {work.CHART_BUDGET:g} s"
    except Exception as error:  # noqa: BLE001 - the chart is secondary
        _log.error("strutscope: a chart was not computed (%s)", type(error).__name__)
        outputs = {
            "sweep": None,
            "approximation": None,
            "chart_note": f"the amplification chart could not be computed ({type(error).__name__})",
            "capacity": None,
            "capacity_note": f"not computed ({type(error).__name__})",
        }
    return partial(state._charted, key, outputs)


def _number_or(value: Any, default: float) -> Any:
    return value if isinstance(value, (int, float)) and not isinstance(value, bool) else default


def values_from_mapping(mapping: Mapping) -> dict:
    """The inputs of :class:`MemberState` for a case-file mapping (the inverse of ``case_mapping``).

    Keys the page has no input for are kept in ``section_extra`` and ``material_extra``, so a loaded case is
    written back as it came. Values are taken as they are; the engine validates them when the state solves.
    Raises ``TypeError`` or ``ValueError`` for a mapping whose values are of the wrong kind for an input.
    """
    values: dict[str, Any] = {}
    defaults = MemberInputs.param
    values["title"] = mapping.get("title", "")
    values["length"] = mapping.get("length", defaults.length.default)
    supports = mapping.get("supports", {})
    for side in ("left", "right"):
        data = supports.get(side, "pinned") if isinstance(supports, Mapping) else "pinned"
        if isinstance(data, str):
            values[f"{side}_end"] = data
            values[f"{side}_translation"], values[f"{side}_rotation"] = NAMED_RESTRAINTS.get(
                data, ("fixed", "free")
            )
        else:
            values[f"{side}_end"] = "elastic"
            for part, spring in (("translation", "k_t"), ("rotation", "k_r")):
                restraint = data.get(part, "fixed")
                if isinstance(restraint, str):
                    values[f"{side}_{part}"] = restraint
                else:
                    values[f"{side}_{part}"] = "spring"
                    values[f"{side}_{spring}"] = restraint
    has_section = "section" in mapping or "material" in mapping
    if "EI" in mapping:
        values["stiffness_from"] = "both" if has_section else "EI"
        values["EI"] = mapping["EI"]
    else:
        values["stiffness_from"] = "section"
    values["stiffness_factor"] = mapping.get("stiffness_factor", 1.0)
    values["axis"] = mapping.get("axis", "major")
    section = dict(mapping.get("section") or {})
    extra: dict[str, Any] = {}
    if "name" in section or not section:
        values["section_shape"] = "catalogue"
        values["section_name"] = section.pop("name", defaults.section_name.default)
        extra = section
    else:
        shape = section.pop("shape")
        values["section_shape"] = shape
        for key in SECTION_DIMENSIONS.get(shape, ()):
            if key in section:
                values[SECTION_PARAMS[key]] = section.pop(key)
            elif key in OPTIONAL_SECTION_KEYS:
                values[SECTION_PARAMS[key]] = None
        if shape == "custom":
            values.update(custom_choice_values(section))
        if shape in MANUFACTURED:
            values["section_manufacture"] = section.pop("manufacture", None)
        extra = section
    values["section_extra"] = extra
    material = dict(mapping.get("material") or {})
    if "E" in material or "fy" in material:
        values["material_from"] = "custom"
        values["material_E"] = material.pop("E", defaults.material_E.default)
        values["material_fy"] = material.pop("fy", defaults.material_fy.default)
        values["material_name"] = material.pop("name", "")
    else:
        values["material_from"] = "catalogue"
        values["material_name"] = material.pop("name", defaults.material_name.default)
    values["material_extra"] = material
    values["axial_force"] = mapping.get("axial_force", 0.0)
    values["loads"] = [dict(load) for load in mapping.get("loads", [])]
    values.update(bow_values(mapping))
    check = mapping.get("check") or {}
    values["check_method"] = check.get("method", "elastic")
    values["gamma_M0"] = _number_or(check.get("gamma_M0"), 1.0)
    values["gamma_M1"] = _number_or(check.get("gamma_M1"), 1.0)
    values["deflection_limit"] = _number_or(check.get("deflection_limit"), 250.0)
    out_of_plane = mapping.get("out_of_plane") or {}
    values["out_of_plane"] = "restrained" if out_of_plane.get("restrained") is True else "buckles"
    values["out_of_plane_length"] = out_of_plane.get("buckling_length")
    for more in (inner_values, plane_values, ltb_values, actions_values):
        values.update(more(mapping))
    return values
