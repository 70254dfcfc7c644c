"""File names of the exports, and the case file as it is saved."""

from __future__ import annotations

import json
import re
import unicodedata

from app.units import format_number, units

__all__ = ["case_json", "export_filename"]

_MAX_SLUG = 48  # characters of the title kept in a file name
_MAX_TAG = 24  # characters of a combination's name kept (the engine's names have at most 24)


def _slug(title: str) -> str:
    """The title's letters and digits, lower case, runs of anything else as one "-".

    Accented Latin letters lose their accent (ç → c, é → e) so that the name travels through every file
    system and mail client; letters with no plain form (Greek, Cyrillic, CJK) are kept as they are.
    """
    letters = []
    for char in unicodedata.normalize("NFKC", title):
        plain = "".join(c for c in unicodedata.normalize("NFKD", char) if not unicodedata.combining(c))
        letters.append(plain if plain.isascii() and plain else char)
    text = "".join(letters).lower()
    slug = re.sub(r"[^\w]+|_+", "-", text).strip("-")[:_MAX_SLUG].strip("-")
    return slug or "case"


def _tag(combination: str) -> str:
    """A combination's name as it is written in a file name: ASCII letters (their case kept), digits and
    ``. + -``; a run of anything else as one "-" (the "_" that separates the name's fields included)."""
    tag = re.sub(r"[^A-Za-z0-9.+\-]+", "-", str(combination)).strip(".-")[:_MAX_TAG].strip(".-")
    return tag or "combination"


def export_filename(
    title: str, axial_force: float, extension: str, system: str = "si", combination: str = ""
) -> str:
    """The file name of an export: ``strutscope-<title>_N<axial force><unit>.<extension>``, and for a case
    with load cases ``strutscope-<title>_<combination>_N<axial force><unit>.<extension>``.

    Parameters
    ----------
    title : str
        The case title (its letters are kept, see :func:`_slug`).
    axial_force : float
        N [N, SI], compression positive; written in the display unit, a tension with its minus sign.
    extension : str
        ``"png"``, ``"csv"``, ``"pdf"`` or ``"json"``.
    system : str
        ``"si"`` or ``"us"``.
    combination : str
        The combination the export holds (``app.state_actions.shown_combination``): its name, ``"envelope"``,
        or ``""`` for a case without load cases (then the name has no such field). Two exports of one case
        then differ by more than N: U4's and the governing U2's are told apart by name.

    >>> export_filename("Invented example: façade wind post", 350e3, "pdf")
    'strutscope-invented-example-facade-wind-post_N350kN.pdf'
    >>> export_filename("Stütze", -1.2e4, "csv", "us")
    'strutscope-stutze_N-2.70kip.csv'
    >>> export_filename("Invented post", 210e3, "pdf", combination="U4")
    'strutscope-invented-post_U4_N210kN.pdf'
    """
    U = units(system)
    force = format_number(U.convert("force", float(axial_force)), 3)
    shown = f"_{_tag(combination)}" if combination else ""
    return f"strutscope-{_slug(title or '')}{shown}_N{force}{U.label('force')}.{extension}"


def case_json(case) -> str:
    """Return the case file of `case` (JSON, schema 1, SI units), as saved.

    ``case.to_json()``, except that a code preset's bow carries no ``amplitude``: the preset sets the size,
    and an amplitude beside it (written as 0 by the engine) would read as a second, contradicting value.
    """
    data = case.to_dict()
    imperfection = data.get("imperfection")
    if isinstance(imperfection, dict) and imperfection.get("preset") is not None:
        imperfection.pop("amplitude", None)
    return json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False)
