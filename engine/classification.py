r"""Cross-section classification of steel I/H and hollow sections, EN 1993-1-1:2005 §5.5 and Table 5.2.

The limits of Table 5.2 (all from memory; check them against a copy before quoting them), with
:math:`\varepsilon = \sqrt{235/f_y}` (:math:`f_y` in N/mm²):

============================================  =================  =================  =================
part                                          class 1            class 2            class 3
============================================  =================  =================  =================
internal part in compression, c/t             33 ε               38 ε               42 ε
internal part in bending, c/t                 72 ε               83 ε               124 ε
outstand flange in compression, c/t           9 ε                10 ε               14 ε
circular hollow section, d/t                  50 ε²              70 ε²              90 ε²
============================================  =================  =================  =================

A part beyond its class 3 limit is class 4; the section takes the class of its worst part.

For a part in bending and compression Table 5.2 gives, with α the compressed fraction of c in the plastic
stress distribution and ψ the ratio of the end stresses in the elastic one (from memory):

- class 1: c/t ≤ 396ε/(13α − 1) when α > 0.5, 36ε/α otherwise; class 2: 456ε/(13α − 1), 41.5ε/α;
- class 3: c/t ≤ 42ε/(0.67 + 0.33ψ) when ψ > −1.

How the stresses are taken (strutscope's choice; written down in DEVELOPERS.md):

- the web of an I/H bent about its major axis (and the walls of a hollow section that lie in the plane of
  bending) under an axial compression N is classified **in bending and compression** when N is given: the web
  carries N and the flanges are at ±f_y, the plastic distribution at which the section reaches the reduced
  plastic moment M_N,Rd the check compares M_Ed with, so α = ½(1 + N/(n c t f_y)) ≤ 1 with n the number of
  webs (common practice for rolled and welded I/H and for RHS; from memory). The class 3 limit is taken at
  ψ = 1 (42ε, the pure-compression limit and the strictest of the ψ family): the moment varies along the
  member and vanishes near a pinned end, where the web is in uniform compression. Without N given, the
  pure-compression limits are used (α = 1). Without compression these parts are classified in pure bending
  (the 72ε/83ε/124ε limits), which is conservative under tension;
- wherever a section is class 4 **in uniform compression**, its resistance to N uses the effective area
  :func:`effective_area` (EN 1993-1-5 §4.4), even where the web is class 1 to 3 in bending and compression:
  the axial force and the buckling resistance are then never taken on more area than the code allows in pure
  compression (conservative; DEVELOPERS.md, decisions log);
- the flanges (the outstands of an I/H, the walls of a hollow section perpendicular to the plane of bending)
  are always classified in uniform compression: one of them is compressed by the bending;
- the web of an I/H bent about its minor axis lies on the neutral axis: it is classified in compression when
  there is an axial compression (in bending and compression, as above, when the member also bends about its
  major axis, ``web_bent``), and left out otherwise;
- the flat width is c = h − 2t_f − 2r (web) and (b − t_w − 2r)/2 (outstand) for rolled I/H, c = h − 2t_f and
  (b − t_w)/2 for welded ones (the welds left out, conservative), and c = side − 3t for every hollow section
  (common practice for the flat of hot-finished corners, conservative for cold-formed ones; from memory);
- solid rectangles and rounds do not buckle locally (class 1, common practice, no source); custom sections and
  materials other than steel are not classified.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

__all__ = [
    "LIMITS",
    "WEB_SHEAR_LIMIT",
    "Part",
    "SectionClass",
    "area_in_compression",
    "classify",
    "classify_at",
    "combined_limits",
    "compression_area",
    "effective_area",
    "effective_modulus",
    "elastic_modulus",
    "epsilon",
    "eq_5_9_modulus",
    "shear_web",
    "web_shear_slenderness",
    "worse_class",
]

#: Table 5.2 limits for classes 1, 2, 3 (from memory): c/t in units of ε, or d/t in units of ε² for a CHS.
LIMITS = {
    "internal compression": (33.0, 38.0, 42.0),
    "internal bending": (72.0, 83.0, 124.0),
    "outstand compression": (9.0, 10.0, 14.0),
    "chs": (50.0, 70.0, 90.0),
}

SOURCE = "EN 1993-1-1:2005 §5.5.2 and Table 5.2 (limits from memory)"


@dataclass(frozen=True, kw_only=True)
class Part:
    """One plate (or the whole tube) of the section, classified.

    Attributes
    ----------
    name : str
        e.g. ``"web"``, ``"flange outstand"``, ``"wall"``.
    stress : str
        The row of Table 5.2 used (a key of :data:`LIMITS`).
    ratio : float
        c/t (d/t for a CHS) [-].
    limits : tuple of float
        The class 1, 2 and 3 limits of the ratio [-] (ε or ε² applied).
    klass : int
        1 to 4.
    alpha : float or None
        α of Table 5.2 for a part in bending and compression [-], None for the other rows.
    """

    name: str
    stress: str
    ratio: float
    limits: tuple
    klass: int
    alpha: float | None = None


@dataclass(frozen=True, kw_only=True)
class SectionClass:
    """The section's class and how it was found.

    Attributes
    ----------
    klass : int
        1 to 4, the worst part's class.
    parts : tuple of Part
    epsilon : float
        :math:`\\sqrt{235/f_y}` [-].
    basis : str
        The stress distribution assumed, in words.
    source : str
    A_eff : float or None
        The effective area in uniform compression [m²] (:func:`effective_area`) of a section classified under
        compression that is class 4 in uniform compression; None otherwise (the gross area counts).
    area : float or None
        The gross area A [m²] beside ``A_eff``.
    bending_class : int or None
        Beside ``A_eff`` or class 4: the section's class in pure bending about its axis; None otherwise.
    W_eff : float or None
        Of a class 4 section: its effective elastic modulus about its axis [m³] (W_el when it is class 1 to 3
        in bending alone, else :func:`effective_modulus`), None where it is not computed here.
    moduli : tuple or None
        Set by :func:`worse_class`: each view's W_eff (None: W_el), in the order of the views given.
    """

    klass: int
    parts: tuple
    epsilon: float
    basis: str
    source: str = SOURCE
    A_eff: float | None = None
    area: float | None = None
    bending_class: int | None = None
    W_eff: float | None = None
    moduli: tuple | None = None

    @property
    def effective(self) -> bool:
        """Class 4 with its effective properties known (A_eff under compression, W_eff): checked by
        EN 1993-1-1 §6.2.9.3 eq. (6.44) with A_eff and W_eff (e_N = 0: the sections classified here are doubly
        symmetric), and by the class 3 rules of the equivalent member with them."""
        return self.klass == 4 and self.W_eff is not None

    @property
    def governing(self) -> Part | None:
        """The part with the worst class (the first such one), or None for a solid section."""
        return max(self.parts, key=lambda p: p.klass) if self.parts else None

    def describe(self) -> str:
        """One line, e.g. ``class 1 (web c/t = 14.9 <= 26.8)``."""
        part = self.governing
        if part is None:
            return f"class {self.klass} ({self.basis})"
        bound = part.limits[min(part.klass, 3) - 1]
        sign = "<=" if part.klass < 4 else ">"
        what = "d/t" if part.stress == "chs" else "c/t"
        alpha = "" if part.alpha is None else f", α = {part.alpha:.2f}"
        text = f"class {self.klass} ({part.name} {what} = {part.ratio:.1f} {sign} {bound:.1f}{alpha})"
        if self.A_eff is not None and self.area:
            text += f"; class 4 in uniform compression: N on A_eff = {self.A_eff / self.area:.3f}·A"
        return text


def epsilon(fy: float) -> float:
    r""":math:`\varepsilon = \sqrt{235/f_y}` with :math:`f_y` in Pa, EN 1993-1-1:2005 Table 5.2 (from memory).

    Examples
    --------
    >>> round(epsilon(355e6), 4)
    0.8136
    """
    return math.sqrt(235e6 / fy)


def _part(name: str, stress: str, ratio: float, eps: float, limits=None, alpha=None) -> Part:
    if limits is None:
        factor = eps * eps if stress == "chs" else eps
        limits = tuple(value * factor for value in LIMITS[stress])
    klass = next((k + 1 for k, limit in enumerate(limits) if ratio <= limit * (1 + 1e-12)), 4)
    return Part(name=name, stress=stress, ratio=ratio, limits=limits, klass=klass, alpha=alpha)


#: The row of Table 5.2 for an internal part in bending and compression.
COMBINED = "internal bending and compression"


def combined_limits(alpha: float, eps: float) -> tuple:
    """The class 1, 2 and 3 limits of c/t of an internal part in bending and compression, Table 5.2 (from
    memory): 396ε/(13α − 1) and 456ε/(13α − 1) for α > 0.5 (36ε/α and 41.5ε/α otherwise), and the class 3
    limit at ψ = 1, 42ε (the module's notes say why).

    >>> [round(v, 3) for v in combined_limits(0.5, 1.0)]  # pure bending's class 1 and 2 limits
    [72.0, 83.0, 42.0]
    >>> [round(v, 3) for v in combined_limits(1.0, 1.0)]  # pure compression's
    [33.0, 38.0, 42.0]
    """
    if alpha > 0.5:
        first, second = 396.0 / (13.0 * alpha - 1.0), 456.0 / (13.0 * alpha - 1.0)
    else:
        first, second = 36.0 / alpha, 41.5 / alpha
    return (first * eps, second * eps, LIMITS["internal compression"][2] * eps)


def _web(name, ratio, flat, t, webs, eps, fy, axial_force):
    """A web in bending and compression: α = ½(1 + N/(webs·c·t·f_y)) ≤ 1 (the web carries N)."""
    alpha = min(1.0, 0.5 * (1.0 + axial_force / (webs * flat * t * fy)))
    return _part(name, COMBINED, ratio, eps, combined_limits(alpha, eps), alpha)


def _i_flats(dims: dict, shape: str) -> tuple[float, float]:
    """(web c, outstand c) [m] of an I/H: h − 2t_f − 2r and (b − t_w − 2r)/2, the root radius left out of a
    welded one (the module's notes)."""
    r = dims.get("r", 0.0) if shape == "rolled_i" else 0.0
    return dims["h"] - 2 * dims["tf"] - 2 * r, (dims["b"] - dims["tw"] - 2 * r) / 2


def _rhs_flats(dims: dict, axis: str) -> tuple[float, float, float]:
    """(c of the walls in the plane of bending, c of the walls across it, t) [m] of an RHS: c = side − 3t."""
    t = dims["t"]
    in_plane, across = (dims["h"], dims["b"]) if axis == "major" else (dims["b"], dims["h"])
    return in_plane - 3 * t, across - 3 * t, t


def _rho_internal(ratio: float, eps: float) -> float:
    """ρ of an internal part in uniform compression (ψ = 1, k_σ = 4), EN 1993-1-5 §4.4(2) (from memory)."""
    lam = ratio / (28.4 * eps * 2.0)
    return 1.0 if lam <= 0.673 else min(1.0, (lam - 0.22) / (lam * lam))


def _rho_outstand(ratio: float, eps: float, k_sigma: float = 0.43) -> float:
    """ρ of an outstand, EN 1993-1-5 §4.4(2) (from memory): k_σ = 0.43 in uniform compression."""
    lam = ratio / (28.4 * eps * math.sqrt(k_sigma))
    return 1.0 if lam <= 0.748 else min(1.0, (lam - 0.188) / (lam * lam))


def effective_area(section, material) -> float | None:
    """The area that resists an axial compression [m²]: the gross area A, or, for a steel I/H or RHS that is
    class 4 in uniform compression (Table 5.2), the effective area of EN 1993-1-5 §4.4 (from memory):

    .. math:: A_{eff} = A - \\sum (1 - \\rho)\\, c\\, t

    over the plates, with ρ = (λ̄_p − 0.22)/λ̄_p² for internal parts (k_σ = 4) and (λ̄_p − 0.188)/λ̄_p² for
    outstands (k_σ = 0.43), λ̄_p = (c/t)/(28.4 ε √k_σ), ρ ≤ 1 (b̄ = c, the flat width of this module). The
    section is doubly symmetric, so the effective area has no shift of its centroid (e_N = 0). None for a
    class 4 CHS (its effective area is outside EN 1993-1-5) or a section not classified here.

    >>> from engine.materials import material_from_spec
    >>> from engine.sections import section_from_spec
    >>> ipe = section_from_spec({"name": "IPE 300"}, "major")
    >>> round(effective_area(ipe, material_from_spec({"name": "S355"}, 0.0107)) / ipe.A, 4)
    0.9792
    """
    found = _classify(section, material, True, None, None)
    if found is None:
        return None
    if found.klass < 4 or not found.parts:
        return section.A
    eps, area = found.epsilon, section.A
    if section.shape in ("rolled_i", "welded_i"):
        tw, tf = section.dimensions["tw"], section.dimensions["tf"]
        web, outstand = _i_flats(section.dimensions, section.shape)
        area -= (1.0 - _rho_internal(web / tw, eps)) * web * tw
        area -= 4.0 * (1.0 - _rho_outstand(outstand / tf, eps)) * outstand * tf
    elif section.shape == "rhs":
        *flats, t = _rhs_flats(section.dimensions, section.axis)
        for flat in flats:
            area -= 2.0 * (1.0 - _rho_internal(flat / t, eps)) * flat * t
    else:
        return None
    return area


def area_in_compression(section, material) -> float:
    """The area that resists a compression [m²]: :func:`effective_area`, or the gross area where that is not
    computed (a section not classified here, a class 4 CHS)."""
    area = effective_area(section, material)
    return section.A if area is None else area


def compression_area(section, section_class, axial_force: float) -> float:
    """The area of the section's resistance to ``axial_force`` [N] (compression positive): the effective area
    in uniform compression where ``section_class`` holds one and N is a compression, else the gross area."""
    if axial_force > 0.0 and section_class is not None and section_class.A_eff is not None:
        return section_class.A_eff
    return section.A


def classify(section, material, *, compression: bool, axial_force=None, web_bent=None) -> SectionClass | None:
    """The class of ``section`` of ``material`` by EN 1993-1-1 Table 5.2, or None where it does not apply.

    Parameters
    ----------
    section : Section
        About the axis of bending (``section.axis``).
    material : Material
        Only steel is classified.
    compression : bool
        Whether the member carries an axial compression (see the module's notes on the stresses assumed).
    axial_force : float or None
        The compression N [N]: webs are then classified in bending and compression (α from N); None: in
        uniform compression.
    web_bent : bool or None
        Whether the member bends about the major axis of an I/H, so that its web is in bending and compression
        and not in uniform compression; None: when ``section`` is about its major axis.

    Returns
    -------
    SectionClass or None
        None for a custom section, a section without its dimensions, or a material other than steel.
        Under compression it holds the effective area where the section is class 4 in uniform compression.
    """
    found = _classify(section, material, compression, axial_force, web_bent)
    if found is None:
        return None
    updates = {}
    if compression:
        area = effective_area(section, material)
        if area is not None and area < section.A:
            updates.update(A_eff=area, area=section.A)
    if updates or found.klass == 4:
        bending = _classify(section, material, False, None, None)
        updates["bending_class"] = bending.klass
        if found.klass == 4 and (not compression or "A_eff" in updates):
            W = section.W_el if bending.klass <= 3 else effective_modulus(section, material, bending)
            updates["W_eff"] = W
    return dataclasses.replace(found, **updates) if updates else found


def classify_at(section, material, N: float, web_bent=None) -> SectionClass | None:
    """:func:`classify` at the axial force N [N] (compression positive): under compression the webs in bending
    and compression with α from N, otherwise in pure bending."""
    compressed = N > 0.0
    return classify(
        section, material, compression=compressed, axial_force=N if compressed else None, web_bent=web_bent
    )


def effective_modulus(section, material, bending=None) -> float | None:
    """The effective elastic modulus W_eff [m³] about the section's axis of a section that is class 4 in
    bending alone, EN 1993-1-5 §4.3–4.4 (from memory), with the plates' ρ on the gross section's stresses
    (§4.4(3)): the strips a plate loses are taken out, the neutral axis moves towards the tension side by
    e = ΔA z_s/(A − ΔA) (z_s the lost strips' centroid), and W_eff = W_eff,min = I_eff over the distance from
    that axis to the farther extreme fibre of the effective section:

    - an **RHS** whose compression wall is class 4: ρ of an internal part in uniform compression
      (:func:`effective_area`), the strip (1 − ρ)c of its flat c = side − 3t taken out at mid-width;
    - an **I/H about its major axis** whose compression flange is class 4: ρ of an outstand in uniform
      compression (k_σ = 0.43), the strip (1 − ρ)c of each of its two outstands taken out at the tip;
    - an **I/H about its minor axis** whose flange outstands are class 4 in uniform compression: the
      compressed outstands (one each side of the web, top and bottom flange) carry the stress of bending
      about the minor axis, largest at the free edge and ψ = (t_w/2 + r)/(b/2) at the flat's root (r = 0 for a
      welded one), so k_σ = 0.57 − 0.21ψ + 0.07ψ² (EN 1993-1-5 Table 4.2, the outstand with the largest
      compression at its free edge, 1 ≥ ψ ≥ 0: b_eff = ρc next to the web; from memory); the strip
      (1 − ρ)c is taken out at the tip.

    The webs (the side walls of an RHS, the web of an I/H bent about its major axis) then take their own
    effective width (Table 4.1) at the ψ of the section with the flange strips out and the webs whole
    (§4.4(3)), once, without iterating: a web class 4 in bending alone, or one made slender by the moved axis,
    loses the hole between b_e1 and b_e2 (:func:`_web_hole`). None for a class 4 CHS and any other shape.
    ``bending``: the section's pure-bending class, if known.
    """
    if bending is None:
        bending = _classify(section, material, False, None, None)
    if bending is None:
        return None
    if bending.klass <= 3:
        return section.W_el
    shape, dims, eps = section.shape, section.dimensions, bending.epsilon
    if shape == "rhs":
        side, flat, t = _rhs_flats(dims, section.axis)  # side: the side walls' (webs') flat
        lost = (1.0 - _rho_internal(flat / t, eps)) * flat * t
        in_plane = side + 3.0 * t
        where = (0.5 * (in_plane - t), t * t / 12.0, 0.5 * in_plane, 0.5 * in_plane)
        return _shifted(section, bending, lost, where, (side, t, 2))
    if shape not in ("rolled_i", "welded_i"):
        return None
    web, outstand = _i_flats(dims, shape)
    tw, tf = dims["tw"], dims["tf"]
    if section.axis == "major":
        strip = (1.0 - _rho_outstand(outstand / tf, eps)) * outstand
        lost = 2.0 * strip * tf  # both outstands of the compression flange
        where = (0.5 * (dims["h"] - tf), tf * tf / 12.0, 0.5 * dims["h"], 0.5 * dims["h"])
        return _shifted(section, bending, lost, where, (web, tw, 1))
    tip = 0.5 * dims["b"]
    psi = (tip - outstand) / tip  # the flat's root over its free edge, stresses of the gross section
    k_sigma = 0.57 - 0.21 * psi + 0.07 * psi * psi
    strip = (1.0 - _rho_outstand(outstand / tf, eps, k_sigma)) * outstand
    lost = 2.0 * strip * tf  # the compressed outstands of both flanges
    return _shifted(section, bending, lost, (tip - 0.5 * strip, strip * strip / 12.0, tip - strip, tip))


def _shifted(section, bending, lost, where, web=None) -> float:
    """W_eff,min [m³] once the strips of area ``lost`` [m²] are taken out; ``where`` = (z_s, own, top,
    half): their centroid's distance from the gross centroid towards the compression side [m], their second
    moment per unit area about their own centroid [m²], the effective section's extreme fibre on the
    compression side and the gross section's on the tension side, from the gross centroid [m]: the modulus is
    I_eff over the farther of the two from the moved neutral axis. ``web`` = (flat, t, count): the webs in the
    plane of bending (flat symmetric about the gross centroid), whose effective width (:func:`_web_hole`)
    takes ψ from the section with those strips out and the webs whole (EN 1993-1-5 §4.4(3), from memory)."""
    z_s, own, top, half = where
    holes = z_h = own_h = 0.0
    if web is not None:
        flat, t, count = web
        e = lost * z_s / (section.A - lost)  # the axis with the strips out and the webs whole
        hole, z_h, own_h = _web_hole(flat, t, bending.epsilon, -(0.5 * flat - e) / (0.5 * flat + e))
        holes = count * hole
    kept = section.A - lost - holes
    e = (lost * z_s + holes * z_h) / kept
    inertia = section.I - lost * (z_s * z_s + own) - holes * (z_h * z_h + own_h) - kept * e * e
    return inertia / max(top + e, half - e)


def _k_internal(psi: float) -> float:
    """k_σ of an internal part at the stress ratio ψ, EN 1993-1-5 Table 4.1 (from memory)."""
    if psi >= 1.0:
        return 4.0
    if psi >= 0.0:
        return 8.2 / (1.05 + psi)
    if psi > -1.0:
        return 7.81 - 6.29 * psi + 9.78 * psi * psi
    return 5.98 * (1.0 - psi) ** 2


def _web_hole(flat: float, t: float, eps: float, psi: float) -> tuple[float, float, float]:
    """(area [m²], centroid [m] from the flat's middle towards its compressed end, second moment per unit area
    about its own centroid [m²]) of the part an internal plate loses at the stress ratio ψ (its compressed
    end at +flat/2), EN 1993-1-5 §4.4(2) eq. (4.2) and Table 4.1 (from memory): λ̄_p = (c/t)/(28.4ε√k_σ),
    ρ = (λ̄_p − 0.055(3 + ψ))/λ̄_p² ≤ 1 above λ̄_p = 0.5 + √(0.085 − 0.055ψ); b_eff = ρ b_c with b_c = c/(1 − ψ)
    for ψ < 0 (b_e1 = 0.4 b_eff at the compressed end, b_e2 = 0.6 b_eff next to the neutral axis), else
    b_eff = ρc with b_e1 = 2b_eff/(5 − ψ); the hole b_c − b_eff lies between b_e1 and b_e2."""
    lam = flat / t / (28.4 * eps * math.sqrt(_k_internal(psi)))
    if lam <= 0.5 + math.sqrt(0.085 - 0.055 * psi):
        return 0.0, 0.0, 0.0
    rho = min(1.0, (lam - 0.055 * (3.0 + psi)) / (lam * lam))
    compressed = flat / (1.0 - psi) if psi < 0.0 else flat
    kept = rho * compressed
    first = 0.4 * kept if psi < 0.0 else 2.0 * kept / (5.0 - psi)
    hole = compressed - kept
    return hole * t, 0.5 * flat - first - 0.5 * hole, hole * hole / 12.0


def elastic_modulus(section, section_class, view=None) -> float:
    """The elastic modulus of the check [m³]: the class's W_eff where it has one (``view``: the index of the
    view in :attr:`SectionClass.moduli`, for a class merged by :func:`worse_class`), else W_el."""
    if section_class is None:
        return section.W_el
    merged = view is not None and section_class.moduli is not None
    W = section_class.moduli[view] if merged else section_class.W_eff
    return section.W_el if W is None else W


def _classify(section, material, compression, axial_force, web_bent) -> SectionClass | None:
    if material is None or section is None or material.kind != "steel":
        return None
    eps = epsilon(material.fy)
    shape, dims = section.shape, dict(section.dimensions or {})
    combined = compression and axial_force is not None and axial_force > 0.0
    if web_bent is None:
        web_bent = section.axis == "major"
    web_stress = "internal compression" if compression else "internal bending"
    basis = (
        "webs taken in pure compression under axial compression (conservative)"
        if compression
        else "webs taken in pure bending without axial compression"
    )
    if combined:
        basis = "webs in bending and compression, α from N; class 3 limit at ψ = 1 (conservative)"
    parts = []
    try:
        if shape in ("rolled_i", "welded_i"):
            tw, tf = dims["tw"], dims["tf"]
            flat, outstand = _i_flats(dims, shape)
            web = flat / tw
            if combined and web_bent:
                parts.append(_web("web", web, flat, tw, 1, eps, material.fy, axial_force))
            elif section.axis == "major":
                parts.append(_part("web", web_stress, web, eps))
            elif compression:
                parts.append(_part("web", "internal compression", web, eps))
            parts.append(_part("flange outstand", "outstand compression", outstand / tf, eps))
        elif shape == "rhs":
            flat, across, t = _rhs_flats(dims, section.axis)
            if combined:
                parts.append(_web("side wall (web)", flat / t, flat, t, 2, eps, material.fy, axial_force))
            else:
                parts.append(_part("side wall (web)", web_stress, flat / t, eps))
            parts.append(_part("compression wall (flange)", "internal compression", across / t, eps))
        elif shape == "chs":
            parts.append(_part("tube", "chs", dims["D"] / dims["t"], eps))
            basis = "d/t limit, the same for compression and bending"
        elif shape in ("rectangle", "round"):
            return SectionClass(
                klass=1,
                parts=(),
                epsilon=eps,
                basis="solid section: no local buckling (common practice, no source)",
            )
        else:
            return None
    except KeyError:
        return None
    return SectionClass(klass=max(p.klass for p in parts), parts=tuple(parts), epsilon=eps, basis=basis)


def eq_5_9_modulus(section, material, method: str) -> float:
    """The section modulus of M_Rk in eq. (5.10) and in the linear check of the eq. (5.9) route.

    W_el for the elastic check; for the plastic check W_pl of a class 1 or 2 section and W_el of any other
    (class 3 or 4, unclassified, or a shape the plastic check does not cover), EN 1993-1-1 §6.2.9 (from
    memory). The class is the one under axial compression.
    """
    if method != "plastic" or section.shape not in ("rolled_i", "welded_i", "rhs", "chs", "rectangle"):
        return section.W_el
    found = classify(section, material, compression=True)
    return section.W_pl if found is not None and found.klass <= 2 else elastic_modulus(section, found)


#: h_w/t_w above which a web without intermediate stiffeners must be checked for shear buckling, 72ε/η:
#: EN 1993-1-1:2005 §6.2.6(6) and EN 1993-1-5 §5.1(2) (from memory), with η = 1.2 (recommended up to S460;
#: some national annexes and higher grades take 1.0, i.e. 72ε): 60ε, the lower limit, so that no web that
#: needs the check under either value goes unwarned (a decision, DEVELOPERS.md decisions log, stop 34).
WEB_SHEAR_ETA = 1.2
WEB_SHEAR_LIMIT = 72.0 / WEB_SHEAR_ETA


def web_shear_slenderness(section, material, axis: str) -> tuple[float, float] | None:
    """(h_w/t_w, the limit 72ε/η with η = 1.2, :data:`WEB_SHEAR_LIMIT`) of the web that carries the shear of
    bending about ``axis``: an I/H's web (h_w = h − 2t_f) or an RHS's two side walls (h_w = h − 2t) in
    major-axis bending, the RHS's other walls in minor-axis bending. None for other shapes, minor-axis
    bending of an I/H (its flanges carry the shear) or a material other than steel.

    >>> from engine.materials import material_from_spec
    >>> from engine.sections import section_from_spec
    >>> plates = {"shape": "welded_i", "h": 1.0, "b": 0.3, "tw": 0.008, "tf": 0.02}
    >>> welded = section_from_spec(plates, "major")
    >>> ratio, limit = web_shear_slenderness(welded, material_from_spec({"name": "S355"}, 0.02), "major")
    >>> round(ratio, 1), round(limit, 1)
    (120.0, 49.5)
    """
    if section is None or material is None or material.kind != "steel":
        return None
    found = shear_web(section, axis)
    if found is None:
        return None
    web, thickness, _ = found
    return web / thickness, WEB_SHEAR_LIMIT * epsilon(material.fy)


def shear_web(section, axis: str) -> tuple[float, float, int] | None:
    """(h_w [m], t_w [m], how many) of the web(s) carrying the shear of bending about ``axis``: an I/H's web
    in major-axis bending, an RHS's two walls parallel to the shear; None for any other shape or axis."""
    if section.shape in ("rolled_i", "welded_i") and axis == "major":
        dims = section.dimensions
        return dims["h"] - 2.0 * dims["tf"], dims["tw"], 1
    if section.shape == "rhs":
        dims = section.dimensions
        side = dims["h"] if axis == "major" else dims["b"]
        return side - 2.0 * dims["t"], dims["t"], 2
    return None


def worse_class(classes) -> SectionClass:
    """The worse of the classes of one section about its two axes (non-empty), with each view's W_eff in
    ``moduli`` (read them with :func:`elastic_modulus` and the view's index). A class 4 section is checked
    with effective properties (:attr:`SectionClass.effective`) only when every class 4 view has its W_eff."""
    worst = max(classes, key=lambda c: c.klass)
    moduli = tuple(c.W_eff if c.klass == 4 else None for c in classes)
    lacking = any(c.klass == 4 and c.W_eff is None for c in classes)
    return dataclasses.replace(worst, moduli=moduli, W_eff=None if lacking else worst.W_eff)
