"""The names of the routes of the member check and of their governing terms (no other import: the words of
the capacity and the routes' own module both use them)."""

from __future__ import annotations

__all__ = ["TERMS", "governing_text", "route_name", "route_setting"]

#: The routes' names; the ``{annex}`` and ``{method}`` come from the case's check settings.
_NAMES = {
    "second-order": "second order + cross-section",
    "en-member": "EN 1993-1-1 equivalent member (Annex {annex})",
    "aisc": "AISC 360-16 ({method})",
}

#: The governing terms' names, by the engine's code.
TERMS = {
    "eq-6.61": "eq. (6.61)",
    "eq-6.62": "eq. (6.62)",
    "H1-1a": "H1-1a",
    "H1-1b": "H1-1b",
    "cross-section": "cross-section",
    "shear": "shear",
    "out-of-plane": "out-of-plane buckling",
    "out-of-plane-buckling": "out-of-plane buckling",
    "flexural-buckling-y": "flexural buckling, major axis",
    "flexural-buckling-z": "flexural buckling, minor axis",
    "flexural-buckling": "flexural buckling",
    "biaxial": "biaxial cross-section",
    "elastic-buckling": "elastic buckling",
    "class-4": "class 4 section",
    "compression": "compression alone",
    "E3": "§E3 compression",
}


def route_setting(result, name: str, default: str) -> str:
    """One of the case's check settings (``annex``, ``aisc_method``), or `default` when it has none."""
    settings = getattr(getattr(result, "case", None), "check", None)
    value = getattr(settings, name, None)
    return value if isinstance(value, str) and value else default


def route_name(route, result=None) -> str:
    """A route's name, e.g. ``"EN 1993-1-1 equivalent member (Annex B)"``; `route` a code or a RouteCheck."""
    code = getattr(route, "route", route)
    template = _NAMES.get(code, code)
    return template.format(
        annex=route_setting(result, "annex", "B"), method=route_setting(result, "aisc_method", "LRFD")
    )


def governing_text(code: str) -> str:
    """A governing term's name, e.g. ``"eq. (6.62)"``; an unknown code with its hyphens as spaces."""
    if not code:
        return ""
    return TERMS.get(code, code.replace("-", " "))
