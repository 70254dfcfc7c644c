"""The calc sheet's second plane and routes of the member check (issue 14), worded by :mod:`app.report`."""

from __future__ import annotations

from app.exports.style import _DANGER, _GREY, _INK
from app.report import routes
from app.report.combinations import metadata_rows
from app.report.words import bow_text, load_text, source_text, support_text
from app.units import Units


def second_plane_items(item, result, U: Units) -> None:
    """The second plane's critical load and governing values, under the first plane's (nothing for one)."""
    rows = routes.second_plane_rows(result, U)
    if not rows:
        return
    own, other = routes.plane_axes(result)
    item(
        "Second plane",
        f"bending about the {routes.plane_name(other)}; the values above: {routes.plane_name(own)}",
    )
    second = result.second_plane
    case = second.case
    item("", f"supports: left {support_text(case.left, U)}; right {support_text(case.right, U)}", scale=0.92)
    for load in case.loads:
        item("", load_text(load, case.length, U), scale=0.92)
    item("", f"initial bow: {bow_text(second, U)}", scale=0.92)
    for label, text in rows:
        item("", f"{label}: {text}", scale=0.92)


def settings_text(result) -> str:
    """The route settings: which routes count, the Annex and the AISC method."""
    settings = getattr(result.case, "check", None)
    enabled = getattr(settings, "routes", None)
    names = [routes.route_name(code, result) for code in (enabled or ())]
    counts = "; ".join(names) if names else "the default routes"
    return f"routes counted: {counts}"


def routes_items(item, flow, result, U: Units) -> None:
    """Each route: utilisation, governing term, the key facts, notes and the source; then the headline."""
    rows = routes.route_rows(result, U)
    if not rows:
        return
    flow.space(3)
    item("Routes", "each a published way of checking the member; the headline is the worst enabled one")
    item("", settings_text(result), scale=0.85, color=_GREY)
    for row in rows:
        status = {"headline": "headline", "counts": "enabled", "for comparison": "for comparison"}[
            row["status"]
        ]
        term = f", {row['governing']}" if row["governing"] and not row["term_in_words"] else ""
        danger = row["danger"]
        item(
            row["name"],
            f"{row['utilisation']}{term} ({status})",
            weight="bold" if row["status"] == "headline" else "normal",
            color=_DANGER if danger else _INK,
        )
        if row["reason"]:
            item("", f"not applied: {row['reason']}", scale=0.92)
        if row["facts"]:
            item("", row["facts"], scale=0.92)
        for level, words in row["notes"] + row["setting_notes"]:
            item("", f"[{level}] {words}", scale=0.92, color=_DANGER if level == "danger" else _INK)
        if row["source"]:
            item("", f"source: {source_text(row['source'], U)}", scale=0.85, color=_GREY)
    headline = routes.headline_text(result)
    if headline:
        item("Headline utilisation", headline, weight="bold")


def combinations_items(item, flow, result, U: Units) -> None:
    """A case with load cases: the actions, each combination and the governing combination of each check."""
    actions = getattr(result, "actions", None)
    if actions is None:
        return
    flow.space(3)
    item("Load combinations", "each solved exactly as its own case (its N, its loads, the code bow)")
    for key, value, note in metadata_rows(actions, result, U):
        bold = key == "combination shown" or key.startswith("governing: strength")
        item(
            key[:1].upper() + key[1:],
            f"{value}" + (f" ({note})" if note else ""),
            scale=0.92,
            weight="bold" if bold else "normal",
        )
