"""The page's load cases (``actions``) and combinations (issue 17): inputs, the combination shown, the slider.

:class:`ActionInputs` is the part of :class:`app.state_inputs.MemberInputs` that holds a case's load cases, in
SI like every input: each action as its case-file mapping (name, category, own axial force, transverse loads),
the combination rule, and the other keys of the file's ``combinations`` kept as they came. With at least one
action the case's own loads and axial force are not written (the engine requires them empty and 0).

What the page shows of the solved combinations is not part of the case:

- ``combination_choice``: ``""`` (the governing ultimate combination, the headline), ``"envelope"`` (the
  headline's diagrams with the envelope band of every combination), or a combination's name;
- the axial-force slider shows the chosen combination's N. Moving it sets one load factor λ on every action
  (:attr:`ActionInputs.scale_mode`): ``"axial"`` multiplies the actions' axial forces only, ``"factor"`` their
  axial forces and their transverse loads, so the chosen combination (and every other, alike) is scaled. The
  link and the saved file hold the actions as solved (λ applied), so a link reopens what is on screen.

Nothing here does mechanics: the engine combines, solves and envelopes.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Mapping
from typing import Any

import param

# The categories the page offers and the rules: the schema's lists, which the tests compare with the engine's.
from app.schema_actions import ACTION_CATEGORIES, COMBINATION_RULES

__all__ = [
    "ACTION_CATEGORIES",
    "ACTION_INPUTS",
    "COMBINATION_RULES",
    "ENVELOPE",
    "SCALE_MODES",
    "ActionInputs",
    "ActionsBehaviour",
    "actions_mapping",
    "actions_values",
    "chosen_item",
    "link_choice",
    "default_action",
    "force_refusal",
    "scale_for",
    "scale_sentence",
    "scaled_action",
    "shown_combination",
    "shown_result",
    "view_result",
]

#: What the axial-force slider scales with load cases: the actions' N only, or the whole combination.
SCALE_MODES = ("axial", "factor")
#: The choice of the combination picker that draws the envelope band.
ENVELOPE = "envelope"
#: The load fields a load factor multiplies (the magnitudes; positions stay).
_MAGNITUDES = ("q", "q_start", "q_end", "P", "C")

#: The inputs held here (the state watches them as it watches every other input).
ACTION_INPUTS = ("actions", "combination_rule", "combinations_extra", "scale_mode")


def default_action(existing) -> dict:
    """A new load case: the next free name (Q1, Q2, ...), imposed, N = 0, one uniform load of 1 kN/m."""
    names = {str(action.get("name")) for action in existing if isinstance(action, Mapping)}
    index = 1
    while f"Q{index}" in names:
        index += 1
    return {
        "name": f"Q{index}",
        "category": "imposed",
        "axial_force": 0.0,
        "loads": [{"type": "uniform", "q": 1.0e3}],
    }


def scaled_action(action: Mapping, factor: float, mode: str) -> dict:
    """`action` with its axial force (and, in mode ``"factor"``, its load magnitudes) times `factor`.

    A value that is not a number is kept as it is, for the engine to name.
    """
    data = dict(action)
    if factor == 1.0:
        return data

    def times(value):
        return value * factor if isinstance(value, (int, float)) and not isinstance(value, bool) else value

    if "axial_force" in data:
        data["axial_force"] = times(data["axial_force"])

    def scaled_loads(loads):
        return [
            {key: times(value) if key in _MAGNITUDES else value for key, value in load.items()}
            if isinstance(load, Mapping)
            else load
            for load in loads
        ]

    if mode == "factor" and isinstance(data.get("loads"), list):
        data["loads"] = scaled_loads(data["loads"])
    plane = data.get("second_plane")  # the action's loads in the second plane, scaled alike
    if mode == "factor" and isinstance(plane, Mapping) and isinstance(plane.get("loads"), list):
        data["second_plane"] = {**plane, "loads": scaled_loads(plane["loads"])}
    return data


class ActionInputs(param.Parameterized):
    """The load cases and the combination settings (SI; validated by the engine when solved)."""

    actions = param.List(
        default=[],
        item_type=dict,
        doc="Load cases in the case-file form (SI): name, category, axial_force [N] (compression positive), "
        "loads (as the case's loads). Empty: a plain case with its own loads and axial force.",
    )
    combination_rule = param.Selector(
        objects=list(COMBINATION_RULES),
        default="en1990-6.10",
        doc="How the load cases are combined: EN 1990 eq. (6.10), eqs. (6.10a)/(6.10b), ASCE 7 §2.3 or the "
        "user's table.",
    )
    combinations_extra = param.Dict(
        default={},
        doc="The other keys of a loaded file's 'combinations' (service, table, service_bow), kept.",
    )
    scale_mode = param.Selector(
        objects=list(SCALE_MODES),
        default="axial",
        doc="What the axial-force slider scales with load cases: 'axial' the axial forces only, 'factor' the "
        "whole combination (loads and axial forces) by one load factor.",
    )
    combination_choice = param.String(
        default="",
        doc="The combination shown: '' the governing one (the headline), 'envelope', or a name.",
    )

    #: The load factor λ on every action (set by the slider; 1 as loaded) and the one the link carries.
    action_scale = 1.0
    settled_scale = 1.0

    # ------------------------------------------------------------------ editing the load cases

    def add_action(self) -> None:
        """Append a load case with default values."""
        self.actions = [*self.actions, default_action(self.actions)]

    def remove_action(self, index: int) -> None:
        """Remove load case `index` (0-based); the last one removed makes the case plain again."""
        self.actions = [action for i, action in enumerate(self.actions) if i != index]

    def set_action(self, index: int, **fields: Any) -> None:
        """Change fields of load case `index` (name, category, axial_force [N], loads)."""
        rows = [dict(action) for action in self.actions]
        rows[index].update(fields)
        self.actions = rows

    def set_action_load(self, index: int, load: int, **fields: Any) -> None:
        """Change fields of load `load` of load case `index` (a field set to None is removed)."""
        rows = [dict(action) for action in self.actions]
        loads = [dict(item) for item in rows[index].get("loads", [])]
        for key, value in fields.items():
            if value is None:
                loads[load].pop(key, None)
            else:
                loads[load][key] = value
        rows[index]["loads"] = loads
        self.actions = rows


class ActionsBehaviour:
    """What :class:`app.state.MemberState` does with load cases: the slider's load factor, the shown one."""

    _mirroring = False
    #: λ of the result on screen, and of the cases sent to be solved (served, a result arrives later).
    result_scale = 1.0
    _case_scales: dict | None = None

    def _remember_scale(self, case) -> None:
        scales = self._case_scales if self._case_scales is not None else {}
        if len(scales) >= 8:
            scales.pop(next(iter(scales)))
        scales[case] = self.action_scale
        self._case_scales = scales

    def _scale_of(self, case) -> float:
        return (self._case_scales or {}).get(case, self.action_scale)

    def _scale_from_force(self) -> bool:
        """The slider moved with load cases: set λ so the shown combination has the new N; True to solve."""
        if self._mirroring:
            return False
        shown = shown_result(self)
        if shown is not None and self.axial_force == float(shown.axial_force):
            if not self.errors:
                return False
            # The force on screen typed again after a refused one: the refusal goes, at the λ on screen.
            self.action_scale = self.result_scale
            return True
        scale, message = scale_for(self, self.axial_force)
        actions = getattr(self.result, "actions", None)
        if scale is not None and self.combination_choice == "" and actions is not None and actions.headline:
            # The force typed (or dragged to) is the governing combination's now; another combination may
            # govern at the new force, and the box would then show that one's N, not the number typed
            # (found by a new user: 3279.4 kN typed read 3614.03, and 294 typed back never restored the
            # design case). The combination is named instead, so the box keeps what was typed and typing
            # back restores it.
            self.combination_choice = actions.headline
        if scale is None:
            if message:
                self._failed_at = self._refresh_id = self._refresh_id + 1
                self._fail(message)
            return False
        self.action_scale = scale
        return True

    def _mirror_force(self, result, choice=None) -> None:
        """Put the shown combination's axial force into ``axial_force`` without solving again."""
        item = chosen_item(result, self.combination_choice if choice is None else choice)
        force = float((item.result if item is not None else result).axial_force)
        if force != self.axial_force:
            self._mirroring = True
            try:
                self.axial_force = force
            finally:
                self._mirroring = False
        if self.settled_scale == self.action_scale:
            self._settled_axial_force = force

    def show_combination(self, choice: str) -> None:
        """Show combination `choice` ('' the governing one, 'envelope', or a name); the slider follows it."""
        if self.result is not None and self.actions:
            self._mirror_force(self.result, choice)
            if set(self.errors) == {"axial_force"}:
                # the refused force is replaced by the shown combination's, of the result on screen: the
                # refusal goes (an audit found the page kept "not accepted" and the exports disabled)
                with param.edit_constant(self):
                    self.errors = {}
        self.combination_choice = choice


def actions_mapping(inputs, scale: float | None = None) -> dict:
    """The case-file keys of the load cases, with λ (`scale`, the inputs' own when None) applied."""
    if not inputs.actions:
        return {}
    factor = inputs.action_scale if scale is None else scale
    combos = {"rule": inputs.combination_rule, **inputs.combinations_extra}
    return {
        "actions": [scaled_action(action, factor, inputs.scale_mode) for action in inputs.actions],
        "combinations": combos,
        "loads": [],
        "axial_force": 0.0,
    }


def actions_values(mapping: Mapping) -> dict:
    """The inputs held here for a case-file mapping (the inverse of :func:`actions_mapping` at λ = 1)."""
    actions = mapping.get("actions")
    if not isinstance(actions, list):
        return {"actions": [], "combinations_extra": {}, "combination_rule": "en1990-6.10"}
    combos = dict(mapping.get("combinations") or {})
    rule = combos.pop("rule", "en1990-6.10")
    return {
        "actions": [dict(action) if isinstance(action, Mapping) else action for action in actions],
        "combination_rule": rule,
        "combinations_extra": combos,
    }


def chosen_item(result, choice: str):
    """The solved combination shown (an ``engine.envelope.CombinationResult``), or None for the headline.

    ``""``, ``"envelope"`` and a name that the result does not hold (the rule changed) give None.
    """
    actions = getattr(result, "actions", None)
    if actions is None or not choice or choice == ENVELOPE:
        return None
    for item in actions.combinations:
        if item.name == choice:
            return item
    return None


def shown_result(state):
    """The result the diagrams and the force readout show: the chosen combination's, else the state's."""
    result = state.result
    item = chosen_item(result, getattr(state, "combination_choice", ""))
    return result if item is None else item.result


def link_choice(state) -> str:
    """The combination shown, for the page's address ('' for the governing one or a name the result does
    not hold)."""
    choice = getattr(state, "combination_choice", "")
    if choice == ENVELOPE or chosen_item(state.result, choice) is not None:
        return choice
    return ""


#: The deflection cautions: the governing service combination's, whichever combination is shown.
_DEFLECTION_CODES = ("deflection", "deflection-basis")
#: The cautions a service combination does not show: the bow's (it is solved without one by design) and the
#: member check's (strength is checked on the ultimate combinations; its check is not shown).
_NOT_OF_SERVICE = (
    "bow-below-code",
    "no-bow",
    "bow-opposes-load",
    "bow-shape",
    "overstressed",
    "out-of-plane-checked",
    "out-of-plane-buckling",
    "out-of-plane-not-checked",
    "out-of-plane-length",
    "section-class",
    "section-class-4",
    "section-class-4-effective",
    "section-effective-area",
    "web-shear-buckling",
    "not-a-code-check",
    "check-note",
    "routes-disagree",
    "route-not-applied",
    "headline-fallback",
    "buckling-interaction-counted",
    "out-of-plane-interaction-not-counted",
    "lateral-torsional-interaction-not-counted",
    "lateral-torsional-buckling",
    "chi-LT-1",
    "LTB-not-checked",
)
_SEVERITY = {"danger": 0, "warning": 1, "info": 2}


def _shown_cautions(result, item) -> tuple:
    """The cautions of combination `item` shown: the governing result's general caution and deflection
    cautions (the governing service combination's, named), then the combination's own others."""
    drop = {"scope", *_DEFLECTION_CODES}
    if item.combination.state == "service":
        drop.update(_NOT_OF_SERVICE)
    kept = [c for c in result.cautions if c.code == "scope"]
    kept += [c for c in item.result.cautions if c.code not in drop]
    kept += [c for c in result.cautions if c.code in _DEFLECTION_CODES]
    return tuple(sorted(kept, key=lambda c: _SEVERITY.get(c.level, 3)))  # stable: the general one leads


def view_result(state):
    """The result the page's values, cautions, sketch and exports show: the state's (the governing
    combination's, with the case's load cases), or the chosen combination's, so that an export holds what is
    on screen. The envelope and the governing combination by name give the state's.

    A chosen combination's result carries the case's load cases, the governing result's general caution and
    its deflection check and cautions (the deflection check is the governing service combination's, whichever
    combination is shown: an ultimate combination's own deflection is never shown as one). A service
    combination's carries no member check, routes or LTB check (strength is checked on the ultimate
    combinations, :func:`app.report.combinations.not_governing_note`) and none of the bow's cautions (it is
    solved without a bow by design)."""
    result = state.result
    item = chosen_item(result, getattr(state, "combination_choice", ""))
    if item is None or item.name == result.actions.headline:
        return result
    shown = item.result
    if item.combination.state == "service" and result.utilization is not None:
        shown = dataclasses.replace(shown, check=None, utilization=None, routes=(), ltb=None)
    if shown.second_plane is not None and result.second_plane is not None:  # each plane's deflection check
        second = dataclasses.replace(shown.second_plane, service=result.second_plane.service)
        shown = dataclasses.replace(shown, second_plane=second)
    return dataclasses.replace(
        shown, actions=result.actions, service=result.service, cautions=_shown_cautions(result, item)
    )


def shown_combination(state) -> str:
    """The combination the exports hold, for their file names (:func:`app.export_names.export_filename`):
    the name of the combination :func:`view_result` gives (the chosen one, or the governing one, also while
    the envelope is shown: its band is drawn on screen only, and an export named "envelope" held the
    governing combination); ``""`` for a case without load cases."""
    result = state.result
    actions = getattr(result, "actions", None)
    if actions is None:
        return ""
    choice = getattr(state, "combination_choice", "")
    item = chosen_item(result, choice)  # the envelope's band is on screen only: the exports hold the headline
    return item.name if item is not None else (actions.headline or "")


def scale_sentence(state) -> str:
    """What the axial-force slider does now, in words (empty for a case without load cases)."""
    if not state.actions:
        return ""
    result = state.result
    actions = getattr(result, "actions", None)
    item = chosen_item(result, state.combination_choice)
    name = item.name if item is not None else (actions.headline if actions is not None else "")
    name = name or "the shown combination"
    factor = f"λ = {state.action_scale:.3g}"
    if state.scale_mode == "factor":
        what = (
            f"The slider sets N of combination {name} by one load factor {factor} on every load case's loads "
            "and axial force"
        )
    else:
        what = (
            f"The slider sets N of combination {name} by one factor {factor} on every load case's axial "
            "force alone (the transverse loads stay as given)"
        )
    return (
        what + "; every combination gets the same λ, so the envelope and the governing combinations follow."
    )


def scale_for(state, force) -> tuple[float | None, str]:
    """The load factor λ that makes the shown combination's axial force `force` [N], or (None, message)."""
    result = shown_result(state)
    if result is None:
        return None, ""
    refused = force_refusal(force)
    if refused:
        return None, refused
    current = float(result.axial_force)
    if current == 0.0:
        return None, (
            "axial_force: the shown combination has no axial force (N = 0), so the slider has nothing to "
            "scale; pick another combination, or give a load case an axial force"
        )
    # Served, the result can lag the slider (solves run off the event loop): λ is taken from the result's own
    # λ, never from the λ of a solve still running, so that steps do not compound.
    scale = getattr(state, "result_scale", state.action_scale) * force / current
    if not scale > 0.0:
        return None, (
            f"axial_force: N = {force:g} N would need the load factor λ = {scale:.3g} on the load cases; the "
            "slider scales them by λ > 0 only (λ <= 0 would remove or reverse them): keep N on the side of "
            f"the shown combination's {current:g} N"
        )
    return scale, ""


def force_refusal(force) -> str:
    """The engine's message on an axial force [N] typed with load cases, as it names a case's own (empty, not
    a number, beyond its bounds), or an empty string when the engine takes it. The engine checks it on a
    plain case of its own (about 0.1 ms), so its bounds and words are never copied here."""
    import engine

    probe = {"schema": 1, "length": 1.0, "EI": 1.0, "supports": {"left": "pinned", "right": "pinned"}}
    try:
        engine.Case.from_dict({**probe, "axial_force": force})
    except engine.CaseError as error:
        return str(error)
    return ""
