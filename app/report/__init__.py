"""One wording of a result in the chosen display units: command line, exports, batch and page.

The public API (every function takes SI values or engine objects and a :class:`app.units.Units`):

- numbers: :func:`ratio`, :func:`utilisation`, :func:`percent`, :func:`scientific`, :func:`position`,
  :func:`csv_number`,
  :func:`format_number` (in :mod:`app.report.numbers`);
- the case: :func:`support_text`, :func:`load_text`, :func:`axial_text`, :func:`bow_text`,
  :func:`bow_direction_text`, :func:`section_text`, :func:`material_text`, :func:`stiffness_text`;
- the result: :func:`status_text` (:func:`status_message` without the status word),
  :func:`governing_rows`, :func:`peak_text`, :func:`reaction_rows` (with
  :data:`REACTIONS_NOTE`), :func:`alpha_text`, :func:`load_ratio_text`, :func:`utilisation_text`,
  :func:`out_of_plane_text`, :func:`service_text`, :func:`capacity_text`;
- cautions: :func:`caution_text` (a caution in the display units), :func:`general_caution`,
  :func:`source_text` (a source without strutscope's reliability flags, for the calc sheet),
  :func:`quoted_text` (quantities quoted from an SI source, in the display units);
- routes and planes (in :mod:`app.report.routes`): :func:`route_rows`, :func:`route_name`,
  :func:`headline_route`, :func:`headline_text`, :func:`governing_text`, :func:`facts_text`,
  :func:`plane_name`, :func:`plane_axes`, :func:`second_plane_rows`;
- the printed summary: :func:`format_summary`.
"""

from app.report.capacity_words import capacity_combination_text, capacity_text
from app.report.numbers import (
    csv_number,
    finite,
    format_number,
    percent,
    position,
    ratio,
    scientific,
    utilisation,
)
from app.report.routes import (
    facts_text,
    governing_text,
    headline_route,
    headline_text,
    plane_axes,
    plane_name,
    route_name,
    route_rows,
    second_plane_rows,
)
from app.report.summary import format_summary
from app.report.words import (
    REACTIONS_NOTE,
    SYMBOLS,
    alpha_text,
    axial_text,
    bow_direction_text,
    bow_text,
    caution_text,
    general_caution,
    governing_rows,
    has_bow,
    load_ratio_text,
    load_text,
    lower_plane,
    material_text,
    out_of_plane_text,
    peak_text,
    quoted_text,
    reaction_rows,
    section_text,
    service_text,
    source_text,
    status_message,
    status_text,
    stiffness_text,
    support_text,
    system_name,
    utilisation_text,
)

__all__ = [
    "second_plane_rows",
    "route_rows",
    "route_name",
    "plane_name",
    "plane_axes",
    "headline_text",
    "headline_route",
    "governing_text",
    "facts_text",
    "REACTIONS_NOTE",
    "SYMBOLS",
    "alpha_text",
    "lower_plane",
    "axial_text",
    "bow_direction_text",
    "bow_text",
    "capacity_combination_text",
    "capacity_text",
    "caution_text",
    "csv_number",
    "finite",
    "format_number",
    "format_summary",
    "general_caution",
    "governing_rows",
    "has_bow",
    "load_ratio_text",
    "load_text",
    "material_text",
    "out_of_plane_text",
    "peak_text",
    "percent",
    "position",
    "ratio",
    "reaction_rows",
    "scientific",
    "section_text",
    "service_text",
    "quoted_text",
    "source_text",
    "stiffness_text",
    "status_message",
    "status_text",
    "support_text",
    "system_name",
    "utilisation",
    "utilisation_text",
]
