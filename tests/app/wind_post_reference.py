"""Closed-form reference values for the page's start demo (the invented wind post with load cases G and W,
``assets/demo_wind_post_actions.json``), computed here without the engine so that the start page's numbers
are checked against an outside method, not re-recorded.

Sources:
- the pinned–pinned beam-column under axial compression N with a uniform load and a point load, exact
  second-order moments (Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed., §§1.9–1.11, from memory):
  uniform q: M(x) = q/k² · [cos k(x − L/2) / cos(kL/2) − 1]; point Q at a:
  M(x) = Q sin k(L − a) sin kx / (k sin kL) for x ≤ a, Q sin ka sin k(L − x) / (k sin kL) beyond; k² = N/EI;
- a sine bow e0·sin(πx/L) under N adds N·e0·sin(πx/L)/(1 − N/N_cr), N_cr = π²EI/L² (Euler; same book, §2.1);
- the deflection without a bow from M = M_I + N·w (equilibrium of the deflected member), so w = (M − M_I)/N;
- HEB 200: I_y = 5696 cm⁴ (steel producers' section tables, from memory); E = 210 000 MPa (EN 1993-1-1
  §3.2.6);
- the bow of curve b for an elastic analysis, e0 = L/250 (EN 1993-1-1 Table 5.1; HEB 200 about y–y is
  curve b by Table 6.2, h/b = 1.0 ≤ 1.2, t_f = 15 mm ≤ 100 mm, from memory);
- the combinations (EN 1990 eq. (6.10) with Table A1.2(B) γ_G,sup 1.35, γ_Q 1.5; eq. (6.14b) with every factor
  1; recommended values, from memory): U2 = 1.35 G + 1.5 W, S2 = G + W.
"""

from __future__ import annotations

import numpy as np

E = 210e9  # Pa
I_Y = 5696e-8  # m⁴
L = 6.0  # m, the demo's span
G = {"N": 240e3, "P": 1.5e3, "a": 2.2, "q": 0.0}  # the demo's permanent action (compression positive)
W = {"N": -20e3, "P": 0.0, "a": 2.2, "q": 1.7e3}  # the demo's wind action (uplift tension)


def combined(factor_g: float, factor_w: float) -> dict:
    """The summed action `factor_g`·G + `factor_w`·W."""
    return {key: factor_g * G[key] + factor_w * W[key] for key in ("N", "P", "q")} | {"a": G["a"]}


def _moments(action: dict, e0: float, x: np.ndarray) -> tuple:
    """Second-order moment of the loads, first-order moment, and the bow's moment (sagging positive)."""
    N, q, Q, a = action["N"], action["q"], action["P"], action["a"]
    k = np.sqrt(N / (E * I_Y))
    M_q = q / k**2 * (np.cos(k * (x - L / 2)) / np.cos(k * L / 2) - 1)
    M_Q = np.where(x <= a, Q * np.sin(k * (L - a)) * np.sin(k * x), Q * np.sin(k * a) * np.sin(k * (L - x)))
    M_Q = M_Q / (k * np.sin(k * L))
    M_first = q * x * (L - x) / 2 + np.where(x <= a, Q * (L - a) * x / L, Q * a * (L - x) / L)
    M_bow = N * e0 * np.sin(np.pi * x / L) / (1 - N / euler_load())
    return M_q + M_Q, M_first, M_bow


def euler_load() -> float:
    """N_cr = π²EI/L² [N]."""
    return np.pi**2 * E * I_Y / L**2


def max_moment(action: dict, e0: float = L / 250) -> float:
    """max|M| [N·m] with the bow laid whichever way is worse (the engine's direction "load")."""
    x = np.linspace(0.0, L, 60001)
    M, _, M_bow = _moments(action, e0, x)
    return float(max(np.abs(M + M_bow).max(), np.abs(M - M_bow).max()))


def max_deflection(action: dict) -> float:
    """max|w| [m] without a bow (a service combination)."""
    x = np.linspace(0.0, L, 60001)
    M, M_first, _ = _moments(action, 0.0, x)
    return float(np.abs((M - M_first) / action["N"]).max())
