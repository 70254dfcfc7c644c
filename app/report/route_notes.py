"""Notes on a route that app.report words from the case's check settings and the route's own facts.

The engine's note codes (:data:`app.report.route_names.NOTES`) say what a route does not cover; these say how
a setting of the case reaches a route, where the engine gives the facts but no note of its own. Each output
shows them with the route's own notes (``route_rows``' ``setting_notes``).
"""

from __future__ import annotations

from app.report.route_names import route_setting

__all__ = ["SETTING_NOTES", "setting_note_codes", "setting_notes"]

#: The notes worded here: code → (level, words). The clause: EN 1993-1-1:2005 §6.3.3 with Table 6.7 (W_pl
#: for class 1 and 2, W_el for class 3, W_eff for class 4; from memory: the outputs name sources unflagged).
SETTING_NOTES = {
    "en-member-resistance-by-class": (
        "info",
        "the equivalent-member route takes the resistance of the section class (class {klass}: plastic, "
        "N_Rk = A·f_y, M_Rk = W_pl·f_y; EN 1993-1-1 §6.3.3, Table 6.7) whatever the cross-section check "
        "setting: the elastic setting applies to the second-order route's cross-section check",
    ),
}


def setting_note_codes(result, route) -> tuple[str, ...]:
    """The codes of :data:`SETTING_NOTES` that hold for `route` (an engine RouteCheck) of `result`.

    ``en-member-resistance-by-class``: the case asks for the elastic cross-section check and the
    equivalent-member route was made on a class 1 or 2 section (its fact ``section_class``), whose plastic
    resistance it takes, as the code's route does whatever the setting.
    """
    if getattr(route, "route", "") != "en-member" or getattr(route, "utilization", None) is None:
        return ()
    klass = (getattr(route, "facts", None) or {}).get("section_class")
    elastic = route_setting(result, "method", "elastic") == "elastic"
    if elastic and isinstance(klass, int) and not isinstance(klass, bool) and klass <= 2:
        return ("en-member-resistance-by-class",)
    return ()


def setting_notes(result, route) -> tuple[tuple[str, str], ...]:
    """(level, words) of each note of :func:`setting_note_codes`, as :func:`app.report.routes.note_text`
    words the engine's notes."""
    klass = (getattr(route, "facts", None) or {}).get("section_class")
    notes = []
    for code in setting_note_codes(result, route):
        level, words = SETTING_NOTES[code]
        notes.append((level, words.format(klass=klass)))
    return tuple(notes)
