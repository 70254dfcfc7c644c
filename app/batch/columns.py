"""The tables of ``strutscope batch``: the input columns, the results layout, errors and the summary."""

from __future__ import annotations

import os
import re
from dataclasses import dataclass, field

#: The results table written into the output folder.
RESULTS_FILE = "results.csv"

#: Tables with more rows than this are shared out across processes when more than one worker is allowed;
#: below it, starting the processes costs more than it saves.
PARALLEL_MIN_ROWS = 50

# Unit factors of the input columns, SI engineering units to SI base units (the columns' names state them).
_KILO = 1e3  # kN -> N, kN/m -> N/m, kN·m² -> N·m²
_MILLI = 1e-3  # mm -> m

_ID_PATTERN = re.compile(r"[A-Za-z0-9][A-Za-z0-9._-]{0,63}")
_NUMBER = r"[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?"
_POINT_LOAD = re.compile(rf"\s*({_NUMBER})\s*@\s*({_NUMBER})\s*")
_SPAN_BOW = re.compile(r"\s*L\s*/\s*(" + _NUMBER + r")\s*", re.IGNORECASE)
_MM_BOW = re.compile(rf"\s*({_NUMBER})\s*mm\s*", re.IGNORECASE)
_PRESET_BOWS = ("en1993-table-5.1", "en1993-eq-5.9", "aisc-l/1000")


def _file_mode() -> int:
    # Temporary files are created readable by the owner only; the finished files get the usual permissions.
    mask = os.umask(0)
    os.umask(mask)
    return 0o666 & ~mask


@dataclass(frozen=True, kw_only=True)
class Column:
    """One column of the members table.

    Attributes
    ----------
    name : str
        The header, as written in the table (matched ignoring case and surrounding spaces).
    required : bool
        Whether the header must be present (its cells must then be filled in too).
    description : str
        What goes in a cell, with its unit and default.
    """

    name: str
    required: bool
    description: str


#: The columns of the members table, in the order the README lists them.
COLUMNS: tuple[Column, ...] = (
    Column(
        name="id",
        required=True,
        description="The member's identifier: letters, digits, '.', '_' and '-', up to 64 characters, "
        "unique in the table (it names the calc sheet <id>.pdf).",
    ),
    Column(name="length_m", required=True, description="Length L [m], 0.001 to 1000."),
    Column(
        name="left",
        required=True,
        description="Support at x = 0 (the bottom of a vertical member): pinned, fixed, free or guided.",
    ),
    Column(name="right", required=True, description="Support at x = L: pinned, fixed, free or guided."),
    Column(
        name="section",
        required=False,
        description="A catalogue section such as 'HEB 200', 'IPE 300', 'W10x49', 'SHS 100x100x5' or "
        "'TIMBER 45x195' (case- and space-insensitive). Empty: give EI_kNm2.",
    ),
    Column(
        name="material",
        required=False,
        description="A catalogued material: S235, S275, S355, S460, ASTM A992, ASTM A36, ASTM A500 Gr. C "
        "rectangular or round, C24, GL24h or EN AW-6082 T6. Empty: give EI_kNm2 (no member check).",
    ),
    Column(
        name="EI_kNm2",
        required=False,
        description="Bending stiffness EI [kN·m²], > 0; overrides the section and material when given.",
    ),
    Column(name="axis", required=False, description="Axis of bending: major or minor. Empty: major."),
    Column(
        name="axial_kN",
        required=False,
        description="Axial force P [kN], compression positive, tension negative. Empty: 0.",
    ),
    Column(
        name="udl_kN_per_m",
        required=False,
        description="Uniform transverse load q over the whole length [kN/m]. Empty: none.",
    ),
    Column(
        name="point_loads",
        required=False,
        description="Transverse point loads as force@position in kN@m, separated by ';': "
        "'7@2.0;3.5@4'. Empty: none.",
    ),
    Column(
        name="bow",
        required=False,
        description="Initial bow: none; a code preset en1993-table-5.1, en1993-eq-5.9 or aisc-l/1000, the "
        "EN 1993-1-1 ones optionally with a buckling curve after a colon (en1993-table-5.1:c; "
        "otherwise the curve follows from the section and material); L/n such as L/300; or an "
        "amplitude such as 12mm (a half sine wave). Empty: none.",
    ),
    Column(
        name="check_method", required=False, description="Member check: elastic or plastic. Empty: elastic."
    ),
    Column(
        name="deflection_limit", required=False, description="n of the deflection limit span/n. Empty: 250."
    ),
    Column(
        name="Lcr_out_m",
        required=False,
        description="Out-of-plane buckling length L_cr [m] (flexural buckling about the other axis, EN "
        "1993-1-1 §6.3.1). Empty: the member length, or twice it where an end is free to translate.",
    ),
    Column(
        name="out_of_plane",
        required=False,
        description="restrained when out-of-plane buckling is prevented (no check about the other axis; bent "
        "about the major axis, held along its length: no torsional buckling check either). Empty: checked.",
    ),
    # Issue 14: bending about the other axis as well (the case file's ``second_plane``). A row with any of
    # these cells filled is a two-plane member; its supports must then be given (they are rarely the first
    # plane's: a wall or a rail often braces one plane only, so none is assumed).
    Column(
        name="second_left",
        required=False,
        description="Support at x = 0 in the second plane (bending about the other axis): pinned, fixed, "
        "free or guided. Required when any second_ column is filled; empty everywhere: one plane.",
    ),
    Column(
        name="second_right",
        required=False,
        description="Support at x = L in the second plane: pinned, fixed, free or guided.",
    ),
    Column(
        name="second_udl_kN_per_m",
        required=False,
        description="Uniform load q in the second plane over the whole length [kN/m]. Empty: none.",
    ),
    Column(
        name="second_point_loads",
        required=False,
        description="Point loads in the second plane, kN@m separated by ';' as in point_loads. Empty: none.",
    ),
    Column(
        name="second_bow",
        required=False,
        description="Initial bow in the second plane, the forms of bow. Empty: EN 1993-1-1 Table 5.1 about "
        "the other axis with a steel section and material, else none.",
    ),
    Column(
        name="second_EI_kNm2",
        required=False,
        description="Bending stiffness about the other axis [kN·m²]; given exactly when EI_kNm2 is given.",
    ),
    Column(
        name="combination_rule",
        required=False,
        description="With per-action columns (axial_<A>_kN, udl_<A>_kN_per_m, point_loads_<A>; <A> starts "
        "with G, Q, S, W or T for permanent, imposed, snow, wind, temperature): en1990-6.10 (default), "
        "en1990-6.10ab or asce7-2.3.",
    ),
    # Issue 16: restraints, steps in EI and an elastic foundation along the member (app/batch/inner.py holds
    # the cell syntax; its SYNTAX is the description's source).
    Column(
        name="restraints",
        required=False,
        description="Supports, springs and hinges inside the member: "
        "x:pinned|guided|fixed|kt=<kN/m>|kr=<kN·m/rad>|hinge|twist|kphi=<kN·m/rad>[,...]"
        "[@first|@second|@both] separated by ';' (x in m; twist: the twist φ held, kphi: a torsional "
        "spring, for lateral-torsional buckling only), e.g. '2.0:pinned,twist;4.0:kt=5000'. Empty: none.",
    ),
    Column(
        name="steps",
        required=False,
        description="Steps in the bending stiffness, x:EI=<kN·m²> separated by ';' (x in m, increasing; a "
        "row with EI_kNm2 and no section), e.g. '3.0:EI=2100'. Empty: none.",
    ),
    Column(
        name="foundation",
        required=False,
        description="Elastic (Winkler) foundation ranges, start-end:k=<kN/m²>[@plane] separated by ';' "
        "(start, end in m), e.g. '0-6:k=5000'. Empty: none.",
    ),
    Column(name="comment", required=False, description="Free text, not read (it goes into the case title)."),
)

#: The columns that make a row a two-plane member.
SECOND_PLANE_COLUMNS = tuple(column.name for column in COLUMNS if column.name.startswith("second_"))

_BY_KEY = {column.name.lower(): column for column in COLUMNS}
_REQUIRED = tuple(column.name for column in COLUMNS if column.required)

# The results table's columns; the unit-bearing ones get their unit suffix from the units system.
_RESULT_LAYOUT: tuple[tuple[str, str | None], ...] = (
    ("id", None),
    ("row", None),
    ("status", None),
    ("field", None),
    ("message", None),
    ("stability", None),
    ("Pcr1", "force"),
    ("alpha_cr", None),
    ("M_max", "moment"),
    ("x_M", "length"),
    ("V_max", "force"),
    ("x_V", "length"),
    ("w_max", "small_length"),
    ("x_w", "length"),
    ("amplification_moment", None),
    ("utilization", None),
    # Stop 33: whether ``utilization`` is a code check (app.batch.headline): "code check", or "elastic bound
    # only, not a code check (<material kind>)" for a member of a material whose code is not checked (timber,
    # aluminium, custom), whose utilisation a code's check can exceed; "" without a utilisation.
    ("utilization_basis", None),
    ("deflection_utilization", None),
    # What produces ``utilization``: "<headline route>: <its governing term>", e.g. "en-member: eq. (6.62)"
    # (stop 33; it was the second-order route's check kind, which another route may exceed).
    ("governing_check", None),
    # The second-order route's flexural buckling check about the other axis alone (EN 1993-1-1 §6.3.1,
    # N/N_b,Rd); neither the headline nor necessarily its governing term.
    ("out_of_plane_utilization", None),
    ("section_class", None),
    ("capacity", "force"),
    ("capacity_check", None),
    ("cautions", None),
    # Issue 14: the routes side by side (utilisation and governing term of each), the route giving the
    # headline ``utilization``, and the second bending plane's first critical load and largest |M|.
    ("headline_route", None),
    ("utilization_second_order", None),
    ("governing_second_order", None),
    ("utilization_en_member", None),
    ("governing_en_member", None),
    ("utilization_aisc", None),
    ("governing_aisc", None),
    ("second_plane_Pcr1", "force"),
    ("second_plane_M_max", "moment"),
    ("second_plane_V_max", "force"),
    ("second_plane_w_max", "small_length"),
    # Issue 17: a row with per-action columns, solved per combination: its rule, and the combination giving
    # the headline utilisation and the one giving the deflection check.
    ("combination_rule", None),
    ("strength_combination", None),
    ("deflection_combination", None),
    # Issue 15: lateral-torsional buckling about the major axis (empty without a member check; ``ltb`` says
    # "not checked: <reason code>" when the check could not be made).
    ("ltb", None),
    ("M_cr", "moment"),
    ("M_cr_tabulated", "moment"),
    ("lambda_LT", None),
    ("chi_LT", None),
    ("utilization_ltb", None),
    # Issue 16: the reactions of the restraints inside the member, as the supports exert them on the member
    # (force positive up as drawn, against + w; couple anticlockwise positive as drawn): the largest force
    # and where, and every restraint's force and couple (app.report.inner_reactions_cell).
    ("R_inner_max", "force"),
    ("x_R_inner", "length"),
    ("inner_reactions", None),
    # Stop 38 (an independent audit): with load cases the capacity is the lowest of the ultimate
    # combinations, named here; each value column is the largest over the ultimate combinations
    # (app.batch.enveloped), and ``from_combinations`` names the combination of every column that is not
    # the headline's (``M_max=U2;utilization_second_order=U1``).
    ("capacity_combination", None),
    ("from_combinations", None),
)

#: The routes with result columns, in the order of the layout (engine.design.routes.ROUTES).
ROUTE_COLUMNS = ("second-order", "en-member", "aisc")
_SUFFIXES = {
    "si": {"force": "kN", "moment": "kNm", "length": "m", "small_length": "mm"},
    "us": {"force": "kip", "moment": "kip_ft", "length": "ft", "small_length": "in"},
}


def result_columns(units: str = "si") -> tuple[str, ...]:
    """Return the header of the results table for a units system.

    Parameters
    ----------
    units : str
        ``"si"`` (kN, kN·m, m, mm) or ``"us"`` (kip, kip·ft, ft, in).

    Returns
    -------
    tuple of str
        ``id, row, status, field, message, stability, Pcr1_kN, alpha_cr, M_max_kNm, x_M_m, V_max_kN, x_V_m,
        w_max_mm, x_w_m, amplification_moment, utilization, utilization_basis, deflection_utilization,
        governing_check,
        out_of_plane_utilization, section_class, capacity_kN, capacity_check, cautions, headline_route,
        utilization_second_order, governing_second_order, utilization_en_member, governing_en_member,
        utilization_aisc, governing_aisc, second_plane_Pcr1_kN, second_plane_M_max_kNm, second_plane_V_max_kN,
        second_plane_w_max_mm, combination_rule, strength_combination, deflection_combination, ltb, M_cr_kNm,
        M_cr_tabulated_kNm, lambda_LT, chi_LT, utilization_ltb, R_inner_max_kN, x_R_inner_m,
        inner_reactions, capacity_combination, from_combinations`` in SI.
        ``utilization``
        is strength and stability, the worst route counted; ``utilization_basis`` says whether it is a code
        check (``"code check"``) or, for a material whose code is not checked, an ``"elastic bound only, not
        a code check (<kind>)"`` that a code's check can exceed (``"not a code check (<danger caution>)"``
        for a steel the code check here does not cover); ``governing_check`` names the route and the
        term that give it (``"en-member: eq. (6.62)"``); ``out_of_plane_utilization`` is the second-order
        route's buckling check about the other axis alone; ``deflection_utilization`` the separate service
        check (loads as given, no bow; in a two-plane case the larger of both planes).
    """
    suffixes = _SUFFIXES[units]
    return tuple(name if kind is None else f"{name}_{suffixes[kind]}" for name, kind in _RESULT_LAYOUT)


class TableError(Exception):
    """The members table cannot be used at all (unreadable, or unknown or missing columns)."""


class RowError(Exception):
    """One row cannot be solved.

    Parameters
    ----------
    column : str
        The column at fault ("" when it is the row as a whole).
    message : str
        What is wrong, naming the value received and what is allowed.
    """

    def __init__(self, column: str, message: str, identifier: str = "") -> None:
        super().__init__(message)
        self.column = column
        self.identifier = identifier

    def __reduce__(self):
        # Rows found bad while reading travel to the worker processes; keep every field through pickling.
        return type(self), (self.column, str(self), self.identifier)


@dataclass(kw_only=True)
class BatchSummary:
    """What a batch run did.

    Attributes
    ----------
    results : str
        Path of the results table written.
    members : int
        Rows read (blank rows are skipped and not counted).
    solved : int
        Rows solved (status ``ok``).
    errors : list of tuple
        ``(row, id, column, message)`` of the first rows with status ``error`` (at most
        ``error_limit``); ``error_count`` has them all.
    error_count : int
    failing : int
        Solved members with a utilisation above 1 or a danger caution.
    beyond_critical : int
        Solved members at or above their first critical load (``stability`` unstable or critical, utilisation
        inf): the command line exits with 1 for them even without ``--strict``.
    workers : int
        Processes used (1: solved in this process).
    pdfs : int
        Calc sheets written.
    stale : list of str
        Calc sheets of the previous run into the folder that this run did not write, removed.
    by_stability : dict
        Solved rows counted by their ``stability`` cell (``stable``, ``unstable``, ``critical``, ...).
    highest : list of tuple
        ``(utilisation, row, id)`` of the solved rows with the highest utilisation that is a code check
        (``utilization_basis`` ``code check``), highest first (at most :data:`app.batch.summary.HIGHEST`; a
        member at or above its critical load counts as ``inf``).
    not_code_checks : list of tuple
        ``(utilisation, row, id, basis)`` of the solved rows whose utilisation is not a code check (an elastic
        bound: timber, aluminium, a custom material), the highest first (at most
        :data:`app.batch.summary.HIGHEST`), kept apart from ``highest``; ``not_code_check_count`` counts them
        all.
    not_code_check_count : int
    retried : list of str
        What the executor had to do again (a lost worker's chunk sent again), one line each.
    executor : str
        ``local``, or where the Dask cluster's scheduler is (``workers`` is then 0).
    danger : list of tuple
        ``(row, id, caution code)`` of the first :data:`app.batch.summary.HIGHEST` solved rows whose
        utilisation is at most 1 but which fail by a danger caution (its first code); ``danger_count`` counts
        them all (they are among ``failing``).
    danger_count : int
    with_combinations : int
        Solved rows with load cases (their ``combination_rule`` cell filled): their scope caution is the one
        of a case with load cases, which names the combination factors as recalled values.
    """

    results: str
    members: int = 0
    solved: int = 0
    errors: list = field(default_factory=list)
    error_count: int = 0
    failing: int = 0
    beyond_critical: int = 0
    workers: int = 1
    pdfs: int = 0
    stale: list = field(default_factory=list)
    by_stability: dict = field(default_factory=dict)
    highest: list = field(default_factory=list)
    not_code_checks: list = field(default_factory=list)
    not_code_check_count: int = 0
    retried: list = field(default_factory=list)
    executor: str = "local"
    with_combinations: int = 0
    danger: list = field(default_factory=list)
    danger_count: int = 0
