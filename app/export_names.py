"""File names of the exports, and the case file as it is saved."""

from __future__ import annotations

import json
import re
import unicodedata

from app.units import format_number, units

__all__ = ["case_json", "export_filename"]

_MAX_SLUG = 48  # characters of the title kept in a file name


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


def export_filename(title: str, axial_force: float, extension: str, system: str = "si") -> str:
    """The file name of an export: ``strutscope-<title>_N<axial force><unit>.<extension>``.

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

    >>> export_filename("Invented example: façade wind post", 350e3, "pdf")
    'strutscope-invented-example-facade-wind-post_N350kN.pdf'
    >>> export_filename("Stütze", -1.2e4, "csv", "us")
    'strutscope-stutze_N-2.70kip.csv'
    """
    U = units(system)
    force = format_number(U.convert("force", float(axial_force)), 3)
    return f"strutscope-{_slug(title or '')}_N{force}{U.label('force')}.{extension}"


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
