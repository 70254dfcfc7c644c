"""The reader of a custom section spec: properties given directly, all about the chosen axis.

``{"shape": "custom", "A": ..., "I": ..., "W_el": ..., "W_pl": ...}`` with the optional keys ``A_v``,
``depth``, ``width``, ``t_max``, ``doubly_symmetric``, ``open_section``, ``It`` (St Venant torsion constant
[m⁴], > 0), ``Iw`` (warping constant [m⁶], >= 0), ``Iz`` (second moment about the minor axis [m⁴],
0 < Iz <= I) and ``ltb_curve`` (the lateral-torsional buckling curve of EN 1993-1-1 Table 6.4, ``"a"`` to
``"d"``; default ``"d"``, the table's row for other cross-sections).

The lateral-torsional buckling check runs for a custom section bent about its major axis that gives ``It``,
``Iw``, ``Iz`` and ``doubly_symmetric: true`` (and ``depth`` when the loads act away from the shear centre);
:data:`LTB_KEYS` lists them and :func:`missing_for_ltb` names those a section lacks.

:func:`custom_fields` checks each value, naming the
field, and returns the keyword arguments of :class:`engine.sections.Section` but its axis;
:func:`engine.sections.section_from_spec` has already checked the keys.
"""

from __future__ import annotations

import math
from collections.abc import Mapping

from engine.errors import CaseError
from engine.torsion import TorsionProperties
from engine.validate import choice, dimension, flag, real, show

__all__ = ["LTB_CURVES", "LTB_KEYS", "custom_fields", "missing_for_ltb"]

#: The keys a custom section needs for the lateral-torsional buckling check (``depth`` only when the loads
#: act away from the shear centre).
LTB_KEYS = ("Iz", "It", "Iw", "doubly_symmetric")
#: The curves a custom section may name (EN 1993-1-1 Table 6.4's).
LTB_CURVES = ("a", "b", "c", "d")

# Dimensions above this are almost surely millimetres typed as metres; the message says so.
_MAX_DIMENSION = 10.0  # [m]


def custom_fields(path: str, spec: Mapping) -> dict:
    """The checked fields of a custom section (every :class:`engine.sections.Section` field but ``axis``).

    Raises
    ------
    CaseError
        For a value that is not a finite number > 0 (``Iw``: >= 0; a length: <= 10 m) or a flag that is not
        a boolean, naming the field, e.g. ``section.It: -1.0 m⁴ must be > 0 m⁴``.
    """
    values = {
        key: dimension(f"{path}.{key}", spec[key], unit)
        for key, unit in (("A", "m²"), ("I", "m⁴"), ("W_el", "m³"), ("W_pl", "m³"))
    }
    A_v = dimension(f"{path}.A_v", spec["A_v"], "m²") if "A_v" in spec else values["A"]
    extents = {
        key: dimension(f"{path}.{key}", spec[key], "m", maximum=_MAX_DIMENSION)
        for key in ("depth", "width", "t_max")
        if key in spec
    }
    doubly_symmetric = flag(f"{path}.doubly_symmetric", spec.get("doubly_symmetric", False))
    # Unknown means lateral-torsional buckling may matter: the cautious reading.
    open_section = flag(f"{path}.open_section", spec.get("open_section", True))
    I_t = real(f"{path}.It", spec["It"], "m⁴", minimum=0.0, minimum_exclusive=True) if "It" in spec else None
    I_w = real(f"{path}.Iw", spec["Iw"], "m⁶", minimum=0.0) if "Iw" in spec else None
    I_z = None
    if "Iz" in spec:
        I_z = real(f"{path}.Iz", spec["Iz"], "m⁴", minimum=0.0, minimum_exclusive=True)
        if I_z > values["I"] * (1.0 + 1e-9):
            raise CaseError(
                f"{path}.Iz: {show(spec['Iz'])} m⁴ is not allowed; it must be > 0 and <= I = "
                f"{values['I']:.6g} m⁴ "
                "(the minor axis's second moment cannot exceed the major axis's; give I about the major axis)"
            )
    curve = (
        choice(f"{path}.ltb_curve", spec["ltb_curve"], LTB_CURVES, "a buckling curve")
        if "ltb_curve" in spec
        else None
    )
    given = [name for name, value in (("It", I_t), ("Iw", I_w)) if value is not None]
    torsion = TorsionProperties(
        I_t=I_t,
        I_w=I_w,
        shear_centre_at_centroid=True if doubly_symmetric else None,
        source=f"{' and '.join(given)} given in the case" if given else "not given in the case (unknown)",
    )
    return {
        "name": "custom",
        "shape": "custom",
        "manufacture": "custom",
        "A": values["A"],
        "I": values["I"],
        "W_el": values["W_el"],
        "W_pl": values["W_pl"],
        "i": math.sqrt(values["I"] / values["A"]),
        "A_v": A_v,
        "depth": extents.get("depth"),
        "width": extents.get("width"),
        "t_max": extents.get("t_max"),
        "doubly_symmetric": doubly_symmetric,
        "open_section": open_section,
        "h_over_b": None,
        "interaction_a": None,
        "dimensions": extents,
        "source": "properties given in the case, taken as about the chosen axis",
        "torsion": torsion,
        "I_minor": I_z,
        "ltb_curve": curve,
    }


def missing_for_ltb(section, load_height: bool) -> tuple[str, ...]:
    """The custom-section keys the lateral-torsional buckling check lacks (of :data:`LTB_KEYS`, and ``depth``
    when ``load_height``: the loads act away from the shear centre), in that order; () when none."""
    missing = []
    if section.I_minor is None:
        missing.append("Iz")
    if section.torsion.I_t is None:
        missing.append("It")
    if section.torsion.I_w is None:
        missing.append("Iw")
    if not section.doubly_symmetric:
        missing.append("doubly_symmetric")
    if load_height and section.depth is None:
        missing.append("depth")
    return tuple(missing)
