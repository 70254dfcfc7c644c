"""The member explorer page, as a package of small views bound to one :class:`app.state.MemberState`.

- :mod:`app.page.member`: :class:`MemberPage`, which composes the views;
- :mod:`app.page.inputs` and :mod:`app.page.loads`: the input tabs; :mod:`app.page.fields`: the one
  unit-aware number field and the panes of the engine's messages;
- :mod:`app.page.force`: the axial-force control;
- :mod:`app.page.diagrams` (with :mod:`app.page.sketch_view`), :mod:`app.page.amplification`,
  :mod:`app.page.modes`, :mod:`app.page.variants`: the centre tabs;
- :mod:`app.page.results`: the governing values and the cautions, worded by :mod:`app.page.words`;
- :mod:`app.page.files`: the exports, the copy of the link and the upload;
- :mod:`app.page.style`: colours, stylesheets and labels.

Widgets show display units (:mod:`app.units`); the state stays in SI. Every number shown comes from the
engine's result; the views only convert units, word text and draw.
"""

from app.page.member import MemberPage
from app.page.style import MAX_LOAD_ROWS, MAX_VARIANTS, UPLOAD_LIMIT, page_stylesheet

__all__ = ["MAX_LOAD_ROWS", "MAX_VARIANTS", "MemberPage", "UPLOAD_LIMIT", "page_stylesheet"]
