"""Newton's work: honest counts, kept factorisations, the line search, the linear solvers,
and results that belong to the state they were solved for.

Every answer is checked against a closed form or an independent scipy solution:
- a saturating spring p = p_u tanh(k u / p_u) under P: u = (p_u / k) atanh(P / p_u);
- a cantilever under an end moment bends into a circle of radius R = E I / M (exact
  elastica); corotational elements keep their chords h and turn by h / R each, so the
  nodes lie on the circle of radius R' = h / (2 sin(h / 2R)) and the tip is at
  R' (sin(L/R), 0, 1 - cos(L/R)) (geometry of the regular polygon);
- a weightless elastic cable between level supports with a point load P at mid-span:
  2 T sin(a) = P with T = EA (L / L0 - 1), L = span / cos(a) (statics of the two
  straight halves), solved with scipy.optimize.brentq;
- a cable pulled by a prescribed end displacement d: T = EA d / L0 (Hooke).
"""
from __future__ import annotations

import numpy as np
import pytest
from scipy.optimize import brentq

import spanstay.fem as fem


class SaturatingLaw:
    def __init__(self, k: float, p_u: float) -> None:
        self.k, self.p_u = k, p_u

    def force(self, u):
        return self.p_u * np.tanh(self.k * u / self.p_u)

    def stiffness(self, u):
        return self.k * (1.0 - np.tanh(self.k * u / self.p_u) ** 2)


def test_counts_include_the_failed_tries():
    # 99.9 % of the capacity in one increment: Newton overshoots into the flat part and
    # the increment is cut; the failed corrections must be counted.
    k, p_u, load = 1e6, 1e3, 999.0
    m = fem.Model()
    node = m.add_node([0, 0, 0])
    m.add_springs([node], "ux", SaturatingLaw(k, p_u))
    m.add_load(node, [load, 0, 0])
    s = fem.solve(m, options=fem.SolverOptions(max_iterations=8))
    assert s.u[node, 0] == pytest.approx(p_u / k * np.arctanh(load / p_u), rel=1e-6)
    assert s.failed_iterations > 0
    assert s.newton_iterations == sum(s.iterations) + s.failed_iterations
    assert 1 <= s.factorisations <= s.newton_iterations
    assert s.residual_evaluations > s.newton_iterations


def _moment_cantilever():
    E, G, B, H, L = 10e9, 6e8, 0.1, 0.2, 2.0
    m = fem.Model()
    ids = m.add_nodes(np.c_[np.linspace(0.0, L, 17), np.zeros(17), np.zeros(17)])
    m.add_beams(ids[:-1], ids[1:], fem.BeamSection.rectangle(E, G, B, H), orientation=(0, 1, 0))
    m.fix(ids[0])
    M = 0.25 * 2 * np.pi * E * B * H**3 / 12 / L
    m.add_load(ids[-1], [0, 0, 0, 0, -M, 0])
    R = E * B * H**3 / 12 / M
    h = L / 16
    R_chord = h / (2 * np.sin(h / (2 * R)))
    return m, R_chord * np.array([np.sin(L / R), 0.0, 1 - np.cos(L / R)])


@pytest.mark.parametrize("options", [dict(), dict(reuse_factorisation=False), dict(linear_solver="superlu"),
                                     dict(linear_solver="banded"), dict(line_search=False),
                                     dict(difference_tangents=True)])
def test_every_newton_variant_reaches_the_exact_elastica(options):
    m, tip = _moment_cantilever()
    s = fem.solve(m, steps=2, options=fem.SolverOptions(**options))
    assert np.linalg.norm(s.positions(m.coords)[-1] - tip) <= 1e-6 * np.linalg.norm(tip)
    if options.get("reuse_factorisation", True):
        assert s.factorisations <= s.newton_iterations
    else:
        assert s.factorisations == s.newton_iterations


def test_kept_factorisation_carries_across_solves():
    # Moving a small load between solves of one model (as a rolling load does): later
    # solves start from the kept factorisation and need fewer new ones than corrections.
    m, _ = _moment_cantilever()
    tip = m.n_nodes - 1
    s = fem.solve(m, steps=2)
    made, factorised = 0, 0
    for fz in np.linspace(0.0, 50.0, 6)[1:]:
        m.set_load(tip, [0, 0, -fz, 0, -m.loads[tip * 6 + 4], 0])
        s = fem.solve(m, state=s)
        made, factorised = made + s.newton_iterations, factorised + s.factorisations
    assert factorised < made


def _point_loaded_cable(segments: int, P: float):
    span, EA, L0 = 30.0, 4e6, 30.0 * 1.001
    m = fem.Model()
    x = np.linspace(0.0, span, segments + 1)
    sag0 = 0.5 * np.sqrt(L0**2 - span**2) * (1 - np.abs(2 * x / span - 1))   # taut-free V shape
    ids = m.add_nodes(np.c_[x, np.zeros_like(x), -sag0])
    m.add_cables(ids[:-1], ids[1:], EA, np.full(segments, L0 / segments))
    m.fix([ids[0], ids[-1]], "xyz")
    m.fix(ids[1:-1], "uy")
    mid = ids[segments // 2]
    m.add_load(mid, [0, 0, -P])

    def balance(a):
        length = span / np.cos(a)
        return 2 * EA * (length / L0 - 1) * np.sin(a) - P

    a = brentq(balance, 1e-6, 1.0)
    return m, mid, 0.5 * span * np.tan(a)


def test_line_search_leaves_ordinary_progress_alone():
    # A slack-shaped cable taking a large point load: the residual rises for several
    # iterations of ordinary Newton progress. The line search must not cost iterations
    # there (no more than with it off) nor fail an increment; both reach the statics.
    out = []
    for line_search in (True, False):
        m, mid, sag = _point_loaded_cable(40, 5e3)
        s = fem.solve(m, options=fem.SolverOptions(line_search=line_search))
        assert -s.positions(m.coords)[mid, 2] == pytest.approx(sag, rel=1e-6)
        out.append((s.newton_iterations, s.failed_iterations))
    assert out[0][0] <= out[1][0] and out[0][1] == 0


def test_linear_solvers_agree_with_scipy_on_the_tangent():
    # One Newton correction from rest on a linear problem is K^-1 f: the banded and the
    # SuperLU paths against scipy.sparse.linalg.spsolve of the same assembled tangent.
    import scipy.sparse.linalg as spla

    from spanstay.fem.linear import LinearSolver

    m, _ = _moment_cantilever()
    s0 = fem.solve(m, factor=1e-9)
    ctx = m._solver_context[1]
    k = ctx.asm.tangent(ctx.evaluate(s0, True))
    rhs = np.random.default_rng(0).normal(size=k.shape[0])
    reference = spla.spsolve(k.tocsc(), rhs)
    for method in ("banded", "superlu"):
        lin = LinearSolver(ctx.asm, method)
        x = lin.factorise(k).solve(rhs)
        # tolerance: the condition number of this tangent (about 1e8) times 1e-14
        assert np.abs(x - reference).max() <= 1e-6 * np.abs(reference).max()
        assert lin.kinds[method] == 1


def test_results_stay_with_the_state_they_were_solved_for():
    # Group results are computed on first use; editing the model afterwards (a new
    # unstressed length, as a rolling load does between solves) must not reach them.
    EA, L0, d = 2e6, 4.0, 0.01
    m = fem.Model()
    a, b = m.add_nodes([[0, 0, 0], [L0, 0, 0]])
    cable = m.add_cables([a], [b], EA, L0)
    m.fix(a, "xyz")
    m.fix(b, ["uy", "uz"])
    m.prescribe(b, "ux", d)
    first = fem.solve(m)
    cable.L0[:] = 0.999 * L0
    second = fem.solve(m)
    assert first.group("cables").tension[0] == pytest.approx(EA * d / L0, rel=1e-9)
    L_new = 0.999 * L0
    assert second.group("cables").tension[0] == pytest.approx(EA * (L0 + d - L_new) / L_new, rel=1e-9)
