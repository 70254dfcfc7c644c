"""Elastic critical moment problems for the equality guard of engine.design.mcr's speed work; the recorder.

``cases()`` draws a fixed set (seed 27) of invented members (stiffnesses about those of rolled I sections over
6 m, κ from 0 to 3) under uniform moment, end moments, a UDL with its load height, a point load with its
height and a cantilever's UDL, with and without intermediate restraints (fixed and springs), warping fixed
or free, N scaled with the moment or held up to 0.97 N_cr,z, the convergence loop, a fixed mesh or a given
mesh pair. ``record(module)`` solves each with ``module.critical_moment`` and returns what the test compares.

``python3 -m tests.support.mcr_cases OLD_MCR_PY OUT_JSON`` records with the module file given (the code
before the speed work: ``git show be758ea:engine/design/mcr.py``); the recording lives in
``tests/engine/data/mcr_recorded.json``.
"""

from __future__ import annotations

import importlib.util
import json
import math
import sys

import numpy as np

L = 6.0
SEED = 27
COUNT = 96
STRIDE = 2  # the mode is recorded at every STRIDE-th node


def _restraints(rng) -> list:
    first = {"x": round(float(rng.uniform(0.5, 5.5)), 3)}
    first["lateral"] = ["fixed", 1.0e5, 1.0e6][int(rng.integers(3))]
    first["twist"] = ["free", "fixed", 1.0e5][int(rng.integers(3))]
    out = [first]
    if rng.uniform() < 0.4:
        out.append({"x": round(float(rng.uniform(0.5, 5.5)), 3), "lateral_rotation": 1.0e5})
    return out


def cases() -> list[tuple[str, dict]]:
    """(name, keyword arguments of critical_moment) for each problem."""
    rng = np.random.default_rng(SEED)
    out = []
    kinds = ("uniform", "end moments", "udl", "point", "udl restrained", "cantilever")
    for k in range(COUNT):
        kind = kinds[k % len(kinds)]
        EI_z = float(10 ** rng.uniform(5.5, 7.0))
        GI_t = float(10 ** rng.uniform(4.0, 5.5))
        kappa = [0.0, 0.3, 1.0, 3.0][int(rng.integers(4))]
        EI_w = (kappa * L) ** 2 * GI_t / math.pi**2
        n_z = math.pi**2 * EI_z / L**2
        x = np.linspace(0.0, L, 41)
        kw = {"EI_z": EI_z, "GI_t": GI_t, "EI_w": EI_w, "length": L}
        if kind == "uniform":
            m = np.full_like(x, 1.0e4)
        elif kind == "end moments":
            psi = float(rng.uniform(-1.0, 1.0))
            m = 1.0e4 * (1.0 + (psi - 1.0) * x / L)
        elif kind in ("udl", "udl restrained"):
            m, kw["V"] = 5.0e3 * x * (L - x), 1.0e4 * (L / 2 - x)
            kw["loads"] = [{"kind": "uniform", "q": 1.0e4, "height": float(rng.uniform(-0.2, 0.2))}]
        elif kind == "point":
            a = round(float(rng.uniform(1.0, 5.0)), 3)
            x = np.sort(np.append(x, a))
            m = np.where(x < a, 2.0e4 * (L - a) / L * x, 2.0e4 * a / L * (L - x))
            kw["loads"] = [{"kind": "point", "F": 2.0e4, "x": a, "height": float(rng.uniform(-0.2, 0.2))}]
        else:  # cantilever fixed at the left, UDL
            m, kw["V"] = -5.0e3 * (L - x) ** 2, 1.0e4 * (L - x)
            kw["loads"] = [{"kind": "uniform", "q": 1.0e4, "height": float(rng.uniform(-0.2, 0.2))}]
            kw["lateral_ends"], kw["warping_ends"] = ("fixed", "free"), ("fixed", "free")
            n_z /= 4.0  # a cantilever's Euler load: effective length 2L
        if kind != "cantilever" and rng.uniform() < 0.4:
            kw["warping_ends"] = [("fixed", "free"), ("fixed", "fixed")][int(rng.integers(2))]
        if kind == "udl restrained" or (kind in ("end moments", "udl") and rng.uniform() < 0.4):
            kw["restraints"] = _restraints(rng)
        kw["N"] = [0.0, 0.3, 0.9, 0.97][int(rng.integers(4))] * n_z
        kw["i0_squared"] = float(rng.uniform(0.005, 0.05))
        kw["scale_axial"] = bool(rng.uniform() < 0.5)
        mesh = int(rng.integers(6))
        if mesh == 0:
            kw["elements"] = 12
        elif mesh == 1:
            kw["mesh_pair"] = 20
        out.append((f"{k:02d} {kind}", {"x": x, "M": m, **kw}))
    return out


def _plain(value):
    if isinstance(value, np.ndarray):
        return [float(v) for v in value]
    if isinstance(value, tuple):
        return [_plain(v) for v in value]
    return value


def record(module) -> dict:
    """What each case gives with ``module`` (an engine.design.mcr): the load factors and the mode's v and φ
    at every STRIDE-th node, or the error's text."""
    out = {}
    for name, kw in cases():
        try:
            r = module.critical_moment(**kw)
        except ValueError as error:
            out[name] = {"error": str(error)}
            continue
        out[name] = {
            "alpha_cr": float(r.alpha_cr),
            "alpha_meshes": [float(a) for a in r.alpha_meshes],
            "elements": int(r.elements),
            "extrapolated": bool(r.extrapolated),
            "v": _plain(r.v[::STRIDE]),
            "phi": _plain(r.phi[::STRIDE]),
        }
    return out


def main(argv: list[str]) -> None:
    path, target = argv
    spec = importlib.util.spec_from_file_location("mcr_recorded_module", path)
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module
    spec.loader.exec_module(module)
    with open(target, "w", encoding="utf-8") as stream:
        json.dump(record(module), stream, indent=0)
        stream.write("\n")


if __name__ == "__main__":
    main(sys.argv[1:])
