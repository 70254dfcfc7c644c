"""The engine's messages as the page shows them: the field in the page's words, the values in its units.

The engine names a field by its case-file path (``loads[1].x``) and writes SI base units (N, N/m, N·m, N·m²,
Pa, m², m⁴); :func:`shown_message` names the field as the page labels it ("Load 2, position") and writes every
quantity in the page's display unit of that field (kN, kN/m, kN·m, MPa, cm⁴, mm for a section's
dimensions; kip, kip/ft, ksi, in in US units), so that a message never shows a unit the page does not use.
An emptied field reads "… is empty", and a text that is not a number is quoted as typed
(:mod:`app.page.number_text`), with the engine's allowed range (:mod:`app.page.words` words both).
"""

from __future__ import annotations

import re
from collections.abc import Mapping

from app.page.number_text import Unread
from app.page.style import DIMENSION_LABELS
from app.page.words import empty_field_text, unread_field_text
from app.report import quoted_text
from app.units import Unit, format_number, units

__all__ = ["INNER_ROWS", "field_words", "page_message", "shown_message", "state_message", "unread_texts"]

# The page's names of the case's fields, for the engine's messages (which name the case file's paths).
_FIELD_WORDS = {
    "title": "Case title",
    "length": "Span L",
    "axial_force": "Axial force N",
    "EI": "EI",
    "stiffness_factor": "Factor on EI",
    "axis": "Bending axis",
    "supports.left": "Left end",
    "supports.right": "Right end",
    "supports.left.translation": "Left end, k_t",
    "supports.left.rotation": "Left end, k_r",
    "supports.right.translation": "Right end, k_t",
    "supports.right.rotation": "Right end, k_r",
    "supports": "Supports",
    "section": "Section",
    "material": "Material",
    "material.fy": "Material, f_y",
    "imperfection": "Initial bow",
    "imperfection.amplitude": "Initial bow, amplitude a",
    "imperfection.ratio": "Initial bow, n of span/n",
    "check": "Check",
    "check.gamma_M0": "γ_M0",
    "check.gamma_M1": "γ_M1",
    "check.deflection_limit": "Deflection limit n (span/n)",
    "out_of_plane": "Out of plane",
    "out_of_plane.buckling_length": "Out-of-plane L_cr",
    "loads": "Loads",
    "second_plane": "Second plane",
    "second_plane.supports.left": "Second plane, left end",
    "second_plane.supports.right": "Second plane, right end",
    "second_plane.loads": "Second plane, loads",
    "restraints": "Restraints",
    "steps": "Steps in EI",
    "foundation": "Foundation",
}
_LOAD_FIELD_WORDS = {
    "x": "position",
    "P": "force F",
    "C": "couple C",
    "q": "q",
    "q_start": "q start",
    "q_end": "q end",
    "start": "from",
    "end": "to",
    "type": "type",
}
_LOAD_PATH = re.compile(r"^(?:second_plane\.)?loads\[(\d+)\](?:\.(\w+))?$")
#: A row of the member's inside (engine issue 16): ``restraints[0].x``, ``steps[1].EI``, ``foundation[0].k``.
_INNER_PATH = re.compile(r"^(restraints|steps|foundation)\[(\d+)\](?:\.(\w+)(?:\.[\w.\[\]]+)?)?$")
#: The page's name of a row of each list (its heading, and its messages).
INNER_ROWS = {"restraints": "Restraint", "steps": "Step", "foundation": "Foundation"}
_INNER_FIELD_WORDS = {
    "x": "at x",
    "translation": "translation",
    "rotation": "rotation",
    "hinge": "hinge",
    "plane": "plane",
    "EI": "EI",
    "section": "section",
    "start": "from",
    "end": "to",
    "k": "modulus k",
}
#: A load case's field (issue 17): ``actions[1].axial_force``, ``actions[0].loads[2].x``.
_ACTION_PATH = re.compile(r"^actions\[(\d+)\](?:\.(second_plane\.)?loads\[(\d+)\])?(?:\.(\w+))?$")


def field_words(path: str) -> str:
    """The page's name for a field path of the engine: ``loads[1].x`` is "Load 2, position"."""
    match = _ACTION_PATH.match(path)
    if match:
        words = f"Load case {int(match.group(1)) + 1}"
        if match.group(3) is not None:
            plane = "second-plane load" if match.group(2) else "load"
            words += f", {plane} {int(match.group(3)) + 1}"
        key = match.group(4)
        return words if key is None else f"{words}, {_LOAD_FIELD_WORDS.get(key, key.replace('_', ' '))}"
    match = _INNER_PATH.match(path)
    if match:
        words = f"{INNER_ROWS[match.group(1)]} {int(match.group(2)) + 1}"
        key = match.group(3)
        return words if key is None else f"{words}, {_INNER_FIELD_WORDS.get(key, key)}"
    match = _LOAD_PATH.match(path)
    if match:
        plane = "Second plane, load" if path.startswith("second_plane.") else "Load"
        words = f"{plane} {int(match.group(1)) + 1}"
        key = match.group(2)
        return words if key is None else f"{words}, {_LOAD_FIELD_WORDS.get(key, key)}"
    if path in _FIELD_WORDS:
        return _FIELD_WORDS[path]
    head, _, rest = path.partition(".")
    if head == "section" and rest in DIMENSION_LABELS:
        return f"Section, {DIMENSION_LABELS[rest]}"
    # The longest named field the path lies in: "second_plane.supports.left.translation" is in "Second
    # plane, left end".
    named = [key for key in _FIELD_WORDS if path.startswith(key + ".")]
    if named:
        key = max(named, key=len)
        return f"{_FIELD_WORDS[key]}, {path[len(key) + 1 :].replace('_', ' ').replace('.', ', ')}"
    return path


def _message_path(message: str) -> str | None:
    """The field path a message of the engine starts with; None for a message about the whole case."""
    head, sep, _ = message.partition(":")
    head = head.strip()
    if not sep or " " in head or head in ("case", "upload", "link"):
        return None
    return head


def page_message(message: str) -> str:
    """The engine's message with its field path replaced by the page's name for the field."""
    path = _message_path(message)
    if path is None:
        return message
    return f"{field_words(path)}:{message.partition(':')[2]}"


# ------------------------------------------------------------------ the engine's SI units → the page's

#: The engine's SI units in its messages and the kind of quantity the page shows each as (:mod:`app.units`);
#: "m" and "N/m" depend on the field (:func:`_kind_of`).
_ENGINE_KINDS = {
    "N·m/rad": "rotational_spring",
    "N·m²": "stiffness",
    "N·m": "moment",
    "N/m²": "foundation_modulus",
    "N/m": "line_load",
    "N": "force",
    "Pa": "stress",
    "m⁶": "warping",
    "m⁴": "second_moment",
    "m³": "section_modulus",
    "m²": "area",
    "m": "length",
}
_UNIT = "|".join(re.escape(unit) for unit in _ENGINE_KINDS)  # longest first: N·m/rad before N·m before N
_NUMBER = r"-?(?:\d+(?:\.\d+)?(?:e[+-]?\d+)?|inf|nan)"
#: A quantity in an engine unit: "1e+33 N", "-1.0 m", "inf N/m".
_QUANTITY = re.compile(rf"(?<![\w.])({_NUMBER}) ({_UNIT})(?![\w²³⁴⁶·/])")
#: A range whose unit is written once, after its upper end: "between -1e+12 and 1e+12 N", "0 to 6 m" (the
#: engine's units, and the SI display units of a text quoted from a table, which US units convert too).
_RANGE = re.compile(
    rf"(?<![\w.])({_NUMBER})( and (?:[<>]=? )?| to )({_NUMBER}) ({_UNIT}|mm|MPa|kN·m|kN)(?![\w²³⁴⁶·/])"
)
#: The engine's hint for a case file, wrong on the page, whose section fields take mm or in.
_METRES_HINT = re.compile(r" \(dimensions are in metres[^)]*\)")
#: Fields in the page's small length unit (mm, in): a section's dimensions and the bow's amplitude.
_SMALL = re.compile(r"(?:^|\.)(?:section\.(?:h|b|tw|tf|r|t|D|depth)|imperfection\.amplitude)$")
#: Fields whose N/m is a support's translational spring, not a line load.
_SPRING = re.compile(r"(?:supports\.(?:left|right)|restraints\[\d+\])\.translation$")


def _kind_of(unit: str, path: str) -> str:
    if unit == "m" and _SMALL.search(path):
        return "small_length"
    if unit == "N/m" and _SPRING.search(path):
        return "translational_spring"
    return _ENGINE_KINDS[unit]


def _display_unit(U, kind: str) -> Unit:
    if kind == "section_modulus":  # cm³ or in³, as the custom section's fields
        return Unit(label="cm³" if U.system == "si" else "in³", factor=U.area.factor**1.5)
    return U.unit(kind)


def _quantity_text(value: str, unit: Unit) -> str:
    """A quantity of a message in a display unit; a small one to four figures, never rounded to 0."""
    if value in ("inf", "-inf", "nan"):
        return f"{value} {unit.label}"
    shown = float(value) * unit.factor
    if shown != 0.0 and abs(shown) < 1e-3:
        return f"{shown:.4g} {unit.label}"
    return f"{format_number(shown)} {unit.label}"


def _in_page_units(text: str, path: str, U) -> str:
    """`text` (after the engine's field path) with every quantity in an engine unit in the page's unit.

    A quantity already in the page's unit (SI metres of a span) is left as the engine wrote it.
    """

    def shown_unit(engine_unit: str) -> Unit | None:
        unit = _display_unit(U, _kind_of(engine_unit, path))
        return None if unit.label == engine_unit and unit.factor == 1.0 else unit

    def convert(match: re.Match) -> str:
        unit = shown_unit(match.group(2))
        return match.group(0) if unit is None else _quantity_text(match.group(1), unit)

    def convert_range(match: re.Match) -> str:
        low, between, high, label = match.groups()
        if label not in _ENGINE_KINDS:  # a display unit: quoted_text converts each end in US units
            return match.group(0) if U.system == "si" else f"{low} {label}{between}{high} {label}"
        unit = shown_unit(label)
        if unit is None:
            return match.group(0)
        return f"{_quantity_text(low, unit)}{between}{_quantity_text(high, unit)}"

    text = _RANGE.sub(convert_range, text)
    text = _QUANTITY.sub(convert, text)
    if _SMALL.search(path):
        text = _METRES_HINT.sub("", text)
    return text


# ------------------------------------------------------------------ empty fields and text not read

#: What the engine says of an emptied number field (None, or a key left out of a load or a section).
_EMPTY = re.compile(
    r"^ (?:None (?:is not (?:a number|allowed); )?(?P<allowed>.*)|required key is missing.*)$"
)
#: What the engine says of a number field holding text that is not a number (NaN to the engine).
_UNREAD = re.compile(r"^ nan(?: (?!is\b|must\b)\S+)? (?:is not finite; )?(?P<allowed>.*)$")
#: Number fields whose key a load or a section leaves out when emptied ("required key is missing").
_NUMBER_KEY = re.compile(r"(?:^|\.)(?:x|P|C|q|q_start|q_end|EI|k|h|b|tw|tf|r|t|D|A|I|W_el|W_pl)$")
#: The engine's allowed values in the page's words: "it must be a finite number > 0" is "enter a number > 0".
_ALLOWED = re.compile(r"^(?:it )?must be (?:a (?:finite )?number|finite and)(?P<range> .*?)?$")
_UNITS_ONLY = re.compile(r"^ \[[^\]]*\]$")


def _allowed_words(allowed: str) -> str:
    """The engine's allowed values as the page asks for them ("enter a number > 0 and <= 1")."""
    match = _ALLOWED.match(allowed)
    if allowed.startswith("must be a number, a name"):
        return "enter a number"  # a material's value: the page's field takes a number only
    if allowed and match is None:
        return allowed if allowed.startswith("it ") else f"it {allowed}"
    limits = (match.group("range") or "") if match else ""
    return f"enter a number{'' if _UNITS_ONLY.match(limits) else limits}"  # "[m]": no range to give


def shown_message(message: str, system: str, typed: Mapping[str, str] | None = None) -> str:
    """The engine's message as the page shows it: the page's name for the field, every quantity in the page's
    unit of that field (both unit systems), "… is empty" for an emptied field and, for a text that is not a
    number, the text as typed (`typed`: field path to text, from :func:`unread_texts`).

    A range's unit is written after both ends first, so that its lower end is converted too (">= 0.001 and
    <= 1000 m" is never shown as ">= 0.001 and <= 3281 ft").
    """
    U = units(system)
    path = _message_path(message)
    if path is None:
        return quoted_text(message, U)
    words = field_words(path)
    rest = _in_page_units(message.partition(":")[2], path, U)
    empty, unread = _EMPTY.match(rest), _UNREAD.match(rest)
    if empty is not None and empty.group("allowed") is None and not _NUMBER_KEY.search(path):
        empty = None  # a key left out of a case file that is not a number field: the engine's words
    if empty is not None:
        text = empty_field_text(words, _allowed_words(empty.group("allowed") or ""))
    elif unread is not None:
        typed = typed or {}
        said = typed.get(path, next(iter(typed.values())) if len(typed) == 1 else None)
        text = unread_field_text(words, said, _allowed_words(unread.group("allowed")))
    else:
        text = f"{words}:{rest}"
    return quoted_text(text, U)


def unread_texts(state) -> dict[str, str]:
    """The texts typed into the state's number fields that are not numbers, by the engine's field path."""
    found: dict[str, str] = {}

    def walk(value, path: str) -> None:
        if isinstance(value, Unread):
            found[path] = value.text
        elif isinstance(value, Mapping):
            for key, item in value.items():
                walk(item, f"{path}.{key}" if path else str(key))
        elif isinstance(value, list):
            for index, item in enumerate(value):
                walk(item, f"{path}[{index}]")

    try:
        mapping = state.case_mapping()
    except Exception:  # noqa: BLE001 - the message is then worded without the text
        return found
    walk({**mapping, "axial_force": state.axial_force}, "")
    return found


def state_message(state, message: str) -> str:
    """The engine's message on `state`'s inputs as the page shows it (see :func:`shown_message`)."""
    typed = unread_texts(state) if " nan" in message else None
    return shown_message(message, state.units, typed)
