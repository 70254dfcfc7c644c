r"""The elastic critical moment :math:`M_{cr}` of lateral-torsional buckling, by a finite-element solution of
Vlasov's equations for a doubly symmetric member (issue 15, groundwork).

Sources: S. P. Timoshenko and J. M. Gere, *Theory of Elastic Stability*, 2nd ed., 1961, ch. 6 (the
equations of lateral buckling and the closed form for uniform moment); N. S. Trahair, *Flexural-Torsional
Buckling of Structures*, 1993, ch. 6 and 7 (the energy equation below, load height). Section and equation
numbers from memory.

**Energy.** Let :math:`v(x)` be the lateral (minor-axis) deflection of the shear centre and :math:`\varphi(x)`
the twist, :math:`M(x)` the major-axis moment, :math:`N` the axial force (compression positive),
:math:`i_0^2 = (I_y + I_z)/A` the polar radius of gyration about the shear centre (= the centroid for a
doubly symmetric section), and :math:`q_j`, :math:`F_k` transverse loads applied at a height :math:`a` from
the shear centre. The second variation of the total potential at the load factor :math:`\lambda` is

.. math::

    \delta^2\Pi = \tfrac12\int_0^L \left(EI_z v''^2 + GI_t\varphi'^2 + EI_w\varphi''^2\right)dx
      - \tfrac{\lambda}{2}\int_0^L \left(N v'^2 + N i_0^2\varphi'^2 - 2M\varphi v''
        + q\,a\,\varphi^2\right)dx - \tfrac{\lambda}{2}\sum_k F_k a_k \varphi(x_k)^2

[Trahair 1993, from memory; the coupling :math:`M\varphi v''` equals :math:`-(M\varphi)'v'` after integration
by parts because :math:`\varphi = 0` at both supports]. The load-height term comes from the drop
:math:`a(1-\cos\varphi) \approx a\varphi^2/2` of a load applied at :math:`a` from the shear centre on the side
the load comes from (**a > 0: towards the compression flange for a gravity-type load on the top flange**):
the load does work as the section twists, which lowers :math:`M_{cr}`; :math:`a < 0` (bottom flange) raises
it. The sign of the coupling term does not matter: the substitution :math:`v \to -v` reverses it and leaves
every other term, so reversing :math:`M` gives the same :math:`|M_{cr}|` [derived].

**Discretisation.** Hermite cubic elements for :math:`v` and :math:`\varphi` (nodal values :math:`v, v',
\varphi, \varphi'`), elastic stiffness :math:`K` in closed form and geometric stiffness :math:`G`
by 4-point Gauss quadrature (exact for :math:`M` linear and :math:`q` uniform within an element; :math:`M` is
interpolated linearly between the caller's samples). The eigenproblem :math:`K x = \lambda G x` is reduced
with the Cholesky factor of :math:`K` to a symmetric one and :math:`\lambda = 1/\mu_{max}` for the largest
positive eigenvalue :math:`\mu` (numpy.linalg.eigvalsh, :mod:`engine.design.mcr_fe`). With exact quadrature
this is a Rayleigh–Ritz solution, so every mesh gives an upper bound (the unsafe side) that converges as
:math:`h^4`; :func:`critical_moment` therefore meshes twice (n and 2n elements), extrapolates (Richardson,
rate 4) and returns the smaller of the extrapolated and the finer value, doubling n until the two agree within
``tolerance`` (0.1 %).
"""

from __future__ import annotations

import dataclasses
import functools
import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass

import numpy as np

from engine.design import mcr_fe
from engine.design.mcr_fe import _eigen, _eigenvector, _elements, _mesh, eigen_solution
from engine.validate import choice, positive, real

__all__ = ["LATERAL_ENDS", "WARPING_ENDS", "CriticalMoment", "HeldAxial", "critical_moment", "eigen_solution"]

#: End conditions for lateral bending: ``fork`` (v = 0, free to rotate about the minor axis), ``fixed``
#: (v = v' = 0); both hold the twist (φ = 0): a fork support. ``free``: nothing held (a cantilever's tip; the
#: other end must then be ``fixed``).
LATERAL_ENDS: tuple[str, ...] = ("fork", "fixed", "free")
#: End conditions for warping: ``free`` (φ' free) or ``fixed`` (φ' = 0).
WARPING_ENDS: tuple[str, ...] = ("free", "fixed")

_RATE = 4.0  # the eigenvalue error of Hermite cubics in a fourth-order problem goes as h^4 [derived]
_MAX_ELEMENTS = 512


@dataclass(frozen=True, kw_only=True)
class CriticalMoment:
    """The elastic lateral-torsional buckling solution.

    Attributes
    ----------
    alpha_cr : float
        Load factor [-] on the given moment diagram (and on N and the loads, when ``scale_axial``).
    M_cr : float
        ``alpha_cr * M_max`` [N·m]; 0 when the diagram is zero (buckling under N alone).
    M_max : float
        max |M| of the given diagram [N·m].
    elements : int
        Elements of the finer mesh used.
    alpha_meshes : tuple[float, ...]
        The load factor of each mesh tried (n, 2n, ...), for the record.
    extrapolated : bool
        True when ``alpha_cr`` is the Richardson value (False: a fixed mesh was asked for, or the finer value
        was smaller).
    x, v, v_slope, phi, phi_slope : numpy.ndarray
        The first mode at the nodes of the finer mesh, scaled so that the largest |φ| is 1 and positive
        (v in m per rad of twist).
    """

    alpha_cr: float
    M_cr: float
    M_max: float
    elements: int
    alpha_meshes: tuple[float, ...]
    extrapolated: bool
    x: np.ndarray
    v: np.ndarray
    v_slope: np.ndarray
    phi: np.ndarray
    phi_slope: np.ndarray


def _loads(loads: Sequence[Mapping] | None, length: float, height: float) -> tuple[list, list]:
    """Uniform loads as (q, start, end, a) and point loads as (F, x, a), magnitudes only (see the module)."""
    uniform, point = [], []
    for i, load in enumerate(loads or ()):
        path = f"loads[{i}]"
        if not isinstance(load, Mapping):
            raise ValueError(f"{path}: {load!r} is not a mapping; give {{'kind': 'uniform' | 'point', ...}}")
        kind = choice(f"{path}.kind", load.get("kind"), ("uniform", "point"))
        a = real(f"{path}.height", load.get("height", height), "m")
        if kind == "uniform":
            q = abs(real(f"{path}.q", load.get("q"), "N/m"))
            start = real(f"{path}.start", load.get("start", 0.0), "m", minimum=0.0, maximum=length)
            end = real(f"{path}.end", load.get("end", length), "m", minimum=start, maximum=length)
            uniform.append((q, start, end, a))
        else:
            force = abs(real(f"{path}.F", load.get("F"), "N"))
            x = real(f"{path}.x", load.get("x"), "m", minimum=0.0, maximum=length)
            point.append((force, x, a))
    return uniform, point


def _matrices(nodes, m_at, props, uniform, point, scale_axial):
    """Assembled K and G (all 4·(n+1) DOFs: v, v', φ, φ' per node)."""
    parts = _elements(nodes, m_at, props, uniform)
    every = np.arange(parts.size, dtype=np.int64)
    return _assembled(parts, nodes, _layout(parts, every), props, point, scale_axial)


def _layout(parts, free) -> dict:
    """Where the element blocks of ``parts`` land on the free DOFs ``free`` (cached per mesh and DOFs)."""
    return mcr_fe._layout(parts.kvv.shape[0], np.asarray(free, dtype=np.int64).tobytes())


def _assembled(parts, nodes, layout, props, point, scale_axial, springs=()):
    """K (with the restraints' ``springs``) and G on the DOFs of ``layout``."""
    N, i0_sq = props[3], props[4]
    K = mcr_fe._stiffness(parts, layout, N, i0_sq, scale_axial, springs)
    return K, mcr_fe._geometric(parts, layout, nodes, N, i0_sq, point, scale_axial)


@functools.lru_cache(maxsize=64)
def _free_dofs(nodes_count: int, lateral_ends, warping_ends, held_inside=()) -> np.ndarray:
    """The DOFs held neither by the end conditions nor by ``held_inside`` (cached; the array is read-only)."""
    held = set(held_inside)
    for end, node in (0, 0), (1, nodes_count - 1):
        if lateral_ends[end] == "free":  # a cantilever's tip: nothing held
            continue
        held.update({4 * node, 4 * node + 2})  # v = 0, φ = 0: a fork at each support
        if lateral_ends[end] == "fixed":
            held.add(4 * node + 1)
        if warping_ends[end] == "fixed":
            held.add(4 * node + 3)
    free = np.array([i for i in range(4 * nodes_count) if i not in held])
    free.flags.writeable = False
    return free


def clear_cache() -> None:
    """Forget the cached free DOFs (:func:`_free_dofs`), the meshes, and the mesh integrals and layouts
    (:mod:`engine.design.mcr_fe`)."""
    _free_dofs.cache_clear()
    mcr_fe._cached_mesh.cache_clear()
    mcr_fe._shape.cache_clear()
    mcr_fe._layout.cache_clear()
    mcr_fe._height.cache_clear()


def _restraints(restraints: Sequence[Mapping] | None, length: float) -> list:
    """Intermediate restraints as (x, {DOF offset: "fixed" or a stiffness}) (see :func:`critical_moment`)."""
    out = []
    for i, item in enumerate(restraints or ()):
        path = f"restraints[{i}]"
        if not isinstance(item, Mapping):
            raise ValueError(f"{path}: {item!r} is not a mapping; give {{'x': ..., 'lateral': ..., ...}}")
        x = real(f"{path}.x", item.get("x"), "m", minimum=0.0, minimum_exclusive=True, maximum=length)
        if x >= length:
            raise ValueError(
                f"{path}.x: {x!r} m must lie inside the member (0 to {length!r} m, ends excluded)"
            )
        held = {}
        for key, offset, unit in (
            ("lateral", 0, "N/m"),
            ("lateral_rotation", 1, "N·m/rad"),
            ("twist", 2, ""),
        ):
            value = item.get(key, "free")
            if value == "fixed":
                held[offset] = "fixed"
            elif value != "free":
                stiffness = real(f"{path}.{key}", value, unit, minimum=0.0)
                if stiffness > 0.0:
                    held[offset] = stiffness
        out.append((x, held))
    return out


def _held_inside(nodes, inside) -> tuple[tuple, tuple]:
    """The DOFs the intermediate restraints ``inside`` hold on this mesh, and their springs as (DOF, k)."""
    held, springs = [], []
    for x, dofs in inside:
        node = int(np.argmin(np.abs(nodes - x)))
        for offset, value in dofs.items():
            if value == "fixed":
                held.append(4 * node + offset)
            else:  # a spring at the shear centre: ½ k v² (or ½ k_r v'², ½ k_φ φ²) joins the strain energy
                springs.append((4 * node + offset, value))
    return tuple(held), tuple(springs)


def _reduced(nodes, m_at, props, uniform, point, scale_axial, lateral_ends, warping_ends, inside=()):
    """K and G on the free DOFs, and those DOFs."""
    parts = _elements(nodes, m_at, props, uniform)
    held, springs = _held_inside(nodes, inside)
    free = _free_dofs(nodes.size, lateral_ends, warping_ends, held)
    K, G = _assembled(parts, nodes, _layout(parts, free), props, point, scale_axial, springs)
    return K, G, free


def _mode(nodes, K, G, free, inv, lam) -> np.ndarray:
    """The mode (nodes, 4) of λ on the free DOFs ``free`` of K (``inv``: the inverse of its Cholesky factor,
    or the mode itself when 1-D; see ``mcr_fe._eigen``) and G: zeros when λ is not finite."""
    full = np.zeros(4 * nodes.size)
    if math.isfinite(lam):
        full[free] = _eigenvector(K, G, lam, inv)
    return full.reshape(-1, 4)


def critical_moment(
    x: Sequence[float] | np.ndarray,
    M: Sequence[float] | np.ndarray,
    *,
    EI_z: float,
    GI_t: float,
    EI_w: float,
    length: float,
    N: float = 0.0,
    i0_squared: float | None = None,
    load_height: float = 0.0,
    loads: Sequence[Mapping] | None = None,
    lateral_ends: tuple[str, str] = ("fork", "fork"),
    warping_ends: tuple[str, str] = ("free", "free"),
    elements: int | None = None,
    scale_axial: bool = True,
    tolerance: float = 1e-3,
    mesh_pair: int | None = None,
    V: Sequence[float] | np.ndarray | None = None,
    restraints: Sequence[Mapping] | None = None,
) -> CriticalMoment:
    r"""Elastic lateral-torsional buckling load factor of a doubly symmetric member (see the module).

    Parameters
    ----------
    x, M : array_like
        The major-axis moment diagram [m, N·m], sampled along the member (x ascending, covering [0, L]);
        linear between samples; a jump (a couple in the span) is an x given twice, and becomes a node.
        Its sign does not matter for :math:`|M_{cr}|`.
    EI_z, GI_t, EI_w : float
        Minor-axis bending [N·m²], St Venant torsion [N·m²] and warping [N·m⁴] stiffness. ``EI_w`` may be 0.
    length : float
        Member length [m] between the lateral supports.
    N : float
        Axial force [N], compression positive. ``i0_squared`` = (I_y + I_z)/A [m²] is then required.
    load_height, loads
        Transverse loads that enter through their height: mappings ``{"kind": "uniform", "q": q [N/m],
        "start", "end"}`` or ``{"kind": "point", "F": F [N], "x": x}``, each with an optional ``"height"``
        a [m] (default ``load_height``), measured from the shear centre, positive on the side the load
        comes from (top flange under gravity load: a > 0, destabilising). Give the loads that make ``M``
        (their magnitudes are used).
    lateral_ends, warping_ends : tuple[str, str]
        (left, right) of :data:`LATERAL_ENDS` and :data:`WARPING_ENDS`.
    elements : int, optional
        A fixed mesh (no extrapolation). By default 8, 16, ... until converged to ``tolerance``.
    V : array_like, optional
        dM/dx at the samples [N] (the shear): M is then interpolated by cubic Hermite pieces, exact for
        uniform and linear loads whatever the samples (else linear between them).
    mesh_pair : int, optional
        Solve n = ``mesh_pair`` and 2n elements and extrapolate, without the convergence loop: the mesh
        another solution converged with (``elements`` of its result), so that a family of solutions (the
        same member at several axial forces) varies smoothly.
    restraints : sequence of mappings, optional
        Intermediate restraints ``{"x": x, "lateral": ..., "lateral_rotation": ..., "twist": ...}`` at
        0 < x < L: ``lateral`` holds v at the shear centre (``"fixed"``: v = 0; a number: a spring k [N/m]),
        ``lateral_rotation`` v' (``"fixed"`` or k_r [N·m/rad]), ``twist`` φ (``"fixed"`` or a torsional spring
        k_φ [N·m/rad]); ``"free"`` (the default) leaves it. Each x becomes a node.
    scale_axial : bool
        True: N is scaled with the moment (α_cr of the whole load set; M → 0 gives α_cr·N → N_cr). False:
        N is held and only M and the loads are scaled.

    Examples
    --------
    >>> r = critical_moment([0, 5], [1e3, 1e3], EI_z=1e6, GI_t=1e5, EI_w=0.0, length=5.0)
    >>> round(r.M_cr / (math.pi / 5 * math.sqrt(1e6 * 1e5)), 4)  # Timoshenko & Gere ch. 6
    1.0
    """
    problem = _problem(
        x, M, EI_z, GI_t, EI_w, length, N, i0_squared, load_height, loads, lateral_ends, warping_ends, V
    )._held_by(restraints)
    M_max = problem.M_max

    def run(count, estimate=None):
        nodes = problem.mesh(count)
        K, G, free = problem.reduced(nodes, problem.props, scale_axial)
        lam, inv = _eigen(K, G, estimate)
        return nodes, lam, (K, G, free, inv)

    if elements is not None:
        count = int(elements)
        if count < 1 or count > _MAX_ELEMENTS:
            raise ValueError(f"elements: {elements!r} must be 1 to {_MAX_ELEMENTS}")
        nodes, lam, matrices = run(count)
        return _result(lam, M_max, nodes, _mode(nodes, *matrices, lam), count, (lam,), False)
    count = _first_count(mesh_pair)
    nodes, coarse, matrices = run(count)
    history = [coarse]
    while True:
        count *= 2
        nodes, fine, matrices = run(count, coarse)
        history.append(fine)
        if not math.isfinite(fine) or mesh_pair is not None:
            break
        extrapolated = fine + (fine - coarse) / (2.0**_RATE - 1.0)
        if abs(fine - extrapolated) <= tolerance * abs(extrapolated) or count >= _MAX_ELEMENTS:
            break
        coarse = fine
    return _closing(history, nodes, matrices, count, M_max)


def _first_count(mesh_pair: int | None) -> int:
    count = 8 if mesh_pair is None else max(1, int(mesh_pair) // 2)
    if count * 2 > _MAX_ELEMENTS:
        raise ValueError(f"mesh_pair: {mesh_pair!r} must be 2 to {_MAX_ELEMENTS}")
    return count


def _closing(history, nodes, matrices, count, M_max) -> CriticalMoment:
    """The result from the load factors of the meshes tried (the last two: coarse, fine) and the finer mesh's
    reduced K, G, free DOFs and the inverse of K's Cholesky factor (or the mode): the Richardson value when it
    is below the finer one (see the module)."""
    fine = history[-1]
    mode = _mode(nodes, *matrices, fine)
    if not math.isfinite(fine):
        return _result(fine, M_max, nodes, mode, count, tuple(history), False)
    extrapolated = fine + (fine - history[-2]) / (2.0**_RATE - 1.0)
    if extrapolated <= fine:
        return _result(extrapolated, M_max, nodes, mode, count, tuple(history), True)
    return _result(fine, M_max, nodes, mode, count, tuple(history), False)


@dataclass(frozen=True)
class _Problem:
    """A validated :func:`critical_moment` problem, before any mesh."""

    length: float
    props: tuple
    uniform: list
    point: list
    m_at: object
    breaks: list
    M_max: float
    ends: tuple
    inside: list

    def mesh(self, count: int) -> np.ndarray:
        return _mesh(self.length, count, self.breaks)

    def reduced(self, nodes, props, scale_axial):
        args = (self.uniform, self.point, scale_axial, *self.ends, self.inside)
        return _reduced(nodes, self.m_at, props, *args)

    def _held_by(self, restraints) -> _Problem:
        """This problem with the intermediate ``restraints`` (as :func:`critical_moment` takes them)."""
        inside = _restraints(restraints, self.length)
        lateral = self.ends[0]
        if "free" in lateral and tuple(lateral) not in (("free", "fixed"), ("fixed", "free")):
            held = any(0 in dofs for _, dofs in inside)  # a lateral restraint inside: an overhang
            if tuple(lateral) not in (("free", "fork"), ("fork", "free")) or not held:
                raise ValueError(
                    f"lateral_ends: {tuple(lateral)!r} leaves the member free to swing laterally; a free end "
                    "needs the other end 'fixed' (a cantilever), or a fork there and a lateral restraint "
                    "inside the member (an overhang past a support)"
                )
        breaks = [*self.breaks, *(x for x, _ in inside)]
        return dataclasses.replace(self, breaks=breaks, inside=inside)


def _problem(
    x, M, EI_z, GI_t, EI_w, length, N, i0_squared, load_height, loads, lateral_ends, warping_ends, V
):
    """Check :func:`critical_moment`'s arguments and gather what every mesh needs."""
    L = positive("length", length, "m")
    props = (
        positive("EI_z", EI_z, "N·m²"),
        positive("GI_t", GI_t, "N·m²"),
        positive("EI_w", EI_w, "N·m⁴", allow_zero=True),
        real("N", N, "N"),
        0.0,
    )
    if props[3] != 0.0:
        if i0_squared is None:
            raise ValueError("i0_squared: needed when N is not 0; give (I_y + I_z)/A in m²")
        props = (*props[:4], positive("i0_squared", i0_squared, "m²"))
    for name, ends, allowed in (
        ("lateral_ends", lateral_ends, LATERAL_ENDS),
        ("warping_ends", warping_ends, WARPING_ENDS),
    ):
        if len(ends) != 2:
            raise ValueError(f"{name}: {ends!r} must be a (left, right) pair")
        for side, end in zip(("left", "right"), ends, strict=True):
            choice(f"{name}.{side}", end, allowed)
    xs = np.asarray(x, dtype=float)
    ms = np.asarray(M, dtype=float)
    if xs.ndim != 1 or xs.shape != ms.shape or xs.size < 2 or np.any(np.diff(xs) < 0):
        raise ValueError("x, M: give equal-length 1-D samples (at least 2) with x ascending")
    if not (np.all(np.isfinite(xs)) and np.all(np.isfinite(ms))):
        raise ValueError("x, M: samples must be finite")
    if xs[0] > 1e-9 * L or xs[-1] < L * (1 - 1e-9):
        raise ValueError(f"x: the samples must cover the member, 0 to {L!r} m; got {xs[0]!r} to {xs[-1]!r} m")
    uniform, point = _loads(loads, L, real("load_height", load_height, "m"))

    m_at = _moment_function(xs, ms, V)
    jumps = xs[1:][np.diff(xs) == 0]  # a couple in the span: a repeated x with two values of M
    breaks = [p[1] for p in point] + [u[1] for u in uniform] + [u[2] for u in uniform] + list(jumps)
    M_max = float(np.max(np.abs(ms)))
    # Without warping stiffness a warping restraint holds nothing: φ' = 0 would be a constraint the member
    # does not have (it raised M_cr by ~0.7 % in a cantilever with EI_w = 0), so it is dropped.
    warping = tuple(warping_ends) if props[2] > 0.0 else ("free", "free")
    return _Problem(L, props, uniform, point, m_at, breaks, M_max, (tuple(lateral_ends), warping), [])


def _moment_function(xs: np.ndarray, ms: np.ndarray, V):
    """M(x) from the samples: linear between them, or cubic Hermite pieces with the shear V = dM/dx."""
    if V is None:

        def m_at(points):
            return np.interp(points, xs, ms)

    else:
        vs = np.asarray(V, dtype=float)
        if vs.shape != xs.shape or not np.all(np.isfinite(vs)):
            raise ValueError("V: give finite samples, one per x")

        last = xs.size - 2

        def m_at(points):
            i = np.searchsorted(xs, points, side="right") - 1
            np.minimum(np.maximum(i, 0, out=i), last, out=i)
            i1 = i + 1
            x0 = xs[i]
            h = xs[i1] - x0
            inside = h > 0.0
            t = np.where(inside, (points - x0) / np.where(inside, h, 1.0), 0.0)
            t2, t3 = t**2, t**3
            cubic = 2 * t3 - 3 * t2  # h00 = 2t³ − 3t² + 1 and h01 = −2t³ + 3t², the same sums as written out
            h00, h10 = cubic + 1, t3 - 2 * t2 + t
            h01, h11 = -cubic, t3 - t2
            return h00 * ms[i] + h10 * h * vs[i] + h01 * ms[i1] + h11 * h * vs[i1]

    return m_at


class HeldAxial:
    """:func:`critical_moment` with N held (``scale_axial=False``) on the fixed pair of meshes
    ``mesh_pair``, at any axial force: one member and moment diagram at several N (the capacity's trials).

    The element integrals that depend neither on N nor on M are made once per mesh; each :meth:`at` makes
    the moment's coupling from the samples it is given, assembles K and G the same way and solves two
    eigenvalues and one mode. It equals ``critical_moment(x, M, N=N, mesh_pair=mesh_pair,
    scale_axial=False, ...)`` bit for bit (the same operations on the same numbers; the eigenvalue of a
    moment diagram far below M_cr is sensitive to the last bit of K, so an equal-to-rounding rearrangement
    would not do); ``tests/engine/test_mcr.py`` checks it.
    """

    def __init__(
        self,
        x,
        M,
        *,
        EI_z,
        GI_t,
        EI_w,
        length,
        i0_squared,
        mesh_pair,
        loads,
        lateral_ends,
        warping_ends,
        V,
        restraints=None,
    ):
        ends = (lateral_ends, warping_ends)
        problem = _problem(x, M, EI_z, GI_t, EI_w, length, 0.0, i0_squared, 0.0, loads, *ends, V)
        problem = problem._held_by(restraints)
        self._i0_squared = positive("i0_squared", i0_squared, "m²")
        count = _first_count(mesh_pair)
        self._count = 2 * count
        self._point = problem.point
        self._props = problem.props
        self._last = None  # (samples, each mesh's parts with their coupling): see _coupled
        self._jumps = _jumps(np.asarray(x, dtype=float))
        self._meshes = []
        for elements in (count, 2 * count):
            nodes = problem.mesh(elements)
            parts = _elements(nodes, problem.m_at, problem.props, problem.uniform)
            held, springs = _held_inside(nodes, problem.inside)
            layout = _layout(parts, _free_dofs(nodes.size, *problem.ends, held))
            self._meshes.append((nodes, parts, layout, springs))

    def at(self, N: float, x, M, V=None) -> CriticalMoment | None:
        """The solution at the held axial force N [N], compression positive, for the diagram sampled at
        ``x``, ``M`` (and ``V``) now; ValueError when N leaves no lateral stiffness (as
        :func:`critical_moment`); None when these samples would give other meshes (a jump elsewhere)."""
        N = real("N", N, "N")
        xs, ms = np.asarray(x, dtype=float), np.asarray(M, dtype=float)
        if _jumps(xs) != self._jumps:
            return None
        history, matrices = [], None
        for (nodes, _, layout, springs), now in zip(self._meshes, self._coupled(xs, ms, V), strict=True):
            props = (*self._props[:3], N, self._i0_squared)
            K, G = _assembled(now, nodes, layout, props, self._point, False, springs)
            lam, inv = _eigen(K, G, history[-1] if history else None)
            matrices = (K, G, layout["free"], inv)
            history.append(lam)
        M_max = float(np.max(np.abs(ms)))
        return _closing(history, self._meshes[-1][0], matrices, self._count, M_max)

    def _coupled(self, xs, ms, V) -> list:
        """Each mesh's element integrals with the moment's coupling of these samples (those of the last
        samples again when the samples are the same numbers: a member's trial forces share its diagram)."""
        key = (xs.tobytes(), ms.tobytes(), None if V is None else np.asarray(V, dtype=float).tobytes())
        last = self._last  # one read: another thread may replace it
        if last is None or last[0] != key:
            m_at = _moment_function(xs, ms, V)
            parts = []
            for _, mesh, _, _ in self._meshes:
                xg, w, n, d2 = mesh.quadrature
                parts.append(dataclasses.replace(mesh, gpv=-mcr_fe._integral(w, m_at(xg), n, d2)))
            last = self._last = (key, parts)
        return last[1]


def _jumps(xs: np.ndarray) -> list:
    """The x of each jump in the sampled diagram (an x given twice)."""
    return [float(b) for b in xs[1:][np.diff(xs) == 0]]


def _result(lam, M_max, nodes, mode, count, history, extrapolated) -> CriticalMoment:
    phi = mode[:, 2]
    peak = int(np.argmax(np.abs(phi))) if np.any(phi) else 0
    scale = 1.0 / phi[peak] if phi[peak] != 0 else 1.0
    mode = mode * scale
    return CriticalMoment(
        alpha_cr=lam,
        M_cr=lam * M_max if math.isfinite(lam) else math.inf,
        M_max=M_max,
        elements=count,
        alpha_meshes=history,
        extrapolated=extrapolated,
        x=np.array(nodes),  # its own copy: the mesh is cached and read-only
        v=mode[:, 0],
        v_slope=mode[:, 1],
        phi=mode[:, 2],
        phi_slope=mode[:, 3],
    )
