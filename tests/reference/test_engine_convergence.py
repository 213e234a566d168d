"""Newton-Raphson with consistent tangents converges quadratically on smooth problems.

Source: the local convergence theorem of Newton's method (e.g. Dennis & Schnabel,
Numerical Methods for Unconstrained Optimization and Nonlinear Equations, Thm. 5.2.1):
with an exact Jacobian, r_{k+1} <= C r_k^2 near the solution. The check uses the
iterations between the end of the pre-asymptotic phase (r_k < 5e-3) and the round-off
floor of the arithmetic (r_{k+1} > 100 times the smallest residual reached).
"""
from __future__ import annotations

import numpy as np

import spanstay.fem as fem
from test_engine_balance import assert_balance, lumped_weight, nodal_loads
from test_engine_beams import B, E, G, H, L, cantilever
from test_engine_cables import _catenary_model
from test_engine_foundation import EI, TanhLaw, winkler_beam

C_QUADRATIC = 50.0  # a linearly converging iteration with rate 0.1 fails this by orders


def assert_quadratic(history: list[list[float]]) -> None:
    checked = 0
    for h in history:
        floor = min(h)
        pairs = [(a, b) for a, b in zip(h[:-1], h[1:]) if a < 5e-3 and b > 100.0 * floor]
        for a, b in pairs:
            assert b <= C_QUADRATIC * a * a, f"not quadratic: {a:.3e} -> {b:.3e} in {h}"
        checked += len(pairs)
    assert checked >= len(history), f"too few asymptotic iterations to judge: {history}"


def deep() -> fem.SolverOptions:
    """Iterate down to the round-off floor so the asymptotic phase is visible."""
    return fem.SolverOptions(force_tol=1e-13, disp_tol=1e-13)


def test_quadratic_convergence_cable_catenary():
    L0 = np.hypot(40.0, 4.0) * 1.004
    m, _ = _catenary_model(40.0, 4.0, L0, 15.0, 60)
    s = fem.solve(m, options=deep())
    assert_quadratic(s.history)
    assert_balance(m, s, lumped_weight(m.n_nodes, m.group("cables").conn, 15.0, L0 / 60))


def test_quadratic_convergence_beam_large_rotation():
    sec = fem.BeamSection.rectangle(E, G, B, H)
    m, ids = cantilever(32, sec)
    load = [0, 0, 0, 0, -0.5 * np.pi * E * B * H**3 / 12 / L, 0]  # a quarter turn
    m.add_load(ids[-1], load)
    s = fem.solve(m, steps=2, options=deep())
    assert_quadratic(s.history)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], load)]))


def test_quadratic_convergence_beam_on_nonlinear_springs():
    k, p_u = 5e6, 2e4
    beta = (k / (4 * EI)) ** 0.25
    m, ids, _ = winkler_beam(8.0 / beta, 60, k, law=lambda trib: TanhLaw(k * trib, p_u * trib))
    m.add_load(ids[0], [0, 0, 2.5e4])
    s = fem.solve(m, steps=2, options=deep())
    assert_quadratic(s.history)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[0], [0, 0, 2.5e4])]))
