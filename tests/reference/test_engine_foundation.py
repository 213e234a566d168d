"""Node-to-ground springs: beams on elastic foundations, nonlinear and one-sided springs.

Sources (see shared references.md):
- Hetenyi, Beams on Elastic Foundation (1946): semi-infinite beam, end shear P:
  y(0) = 2 P beta / k; end moment M0: y(0) = 2 M0 beta^2 / k, slope 4 M0 beta^3 / k,
  beta = (k / 4 E I)^(1/4) (from memory), and independently scipy's solve_bvp of
  E I y'''' + k y = 0 (and E I y'''' + p(y) = 0 for a nonlinear foundation).
- Rigid footing on a tensionless foundation, load outside the middle third: contact
  length 3 (L/2 - e), peak pressure 2 P / (3 (L/2 - e)) (statics of a triangular
  pressure block; foundation engineering texts, "middle-third rule").
- Springs in parallel (Hooke's law); closed-form inverse of a tanh spring law.
"""
from __future__ import annotations

import numpy as np
import pytest
from scipy.integrate import solve_bvp

import spanstay.fem as fem
from test_engine_balance import assert_balance, nodal_loads, tight

E = 10e9
EI_SECTION = fem.BeamSection(E, E / 16, 0.04, 0.2**4 / 12, 0.2**4 / 12, 2e-4)  # shear-rigid 0.2 m square
EI = E * 0.2**4 / 12


def winkler_beam(length: float, n: int, k_line: float, law=None, section=EI_SECTION):
    """Beam along x on springs (uz) of k_line N/m per metre, lumped to the nodes."""
    m = fem.Model()
    x = np.linspace(0.0, length, n + 1)
    ids = m.add_nodes(np.c_[x, np.zeros_like(x), np.zeros_like(x)])
    m.add_beams(ids[:-1], ids[1:], section, orientation=(0, 1, 0))
    trib = np.full(n + 1, length / n)
    trib[[0, -1]] *= 0.5
    m.add_springs(ids, "uz", law(trib) if law else fem.LinearLaw(k_line * trib))
    m.fix(ids, ["uy", "rx", "rz"])  # bending in the x-z plane only
    m.fix(ids[-1], "ux")
    return m, ids, x


def bvp_end_loaded(length: float, P: float, M: float, p_of_w, dp_dw=None):
    """solve_bvp of EI w'''' + p(w) = 0 with EI w'''(0) = P, EI w''(0) = M, free far end.

    P is the end force along +z, M the end moment about +y (the rotation about +y is -w').
    Returns the solution object (y = [w, w', w'', w''']).
    """
    def rhs(x, y):
        return np.vstack([y[1], y[2], y[3], -p_of_w(y[0]) / EI])

    def bc(ya, yb):
        return np.array([EI * ya[3] - P, EI * ya[2] - M, yb[2], yb[3]])

    x = np.linspace(0.0, length, 401)
    sol = solve_bvp(rhs, bc, x, np.zeros((4, x.size)), tol=1e-8, max_nodes=100000)
    assert sol.success, sol.message
    return sol


@pytest.mark.parametrize("P, M", [(5e3, 0.0), (0.0, 8e3)])
def test_beam_on_winkler_springs_vs_hetenyi(P, M):
    k = 5e6  # N/m per metre of beam (subgrade modulus times width)
    beta = (k / (4 * EI)) ** 0.25
    length = 8.0 / beta  # beta L = 8: semi-infinite for practical purposes
    m, ids, x = winkler_beam(length, 100, k)
    load = [0, 0, P, 0, M, 0]
    m.add_load(ids[0], load)
    s = fem.solve(m, options=tight())
    w0, slope0 = s.u[0, 2], -s.u[0, 4]  # rotation about +y is -w'
    if M == 0.0:
        assert w0 == pytest.approx(2 * P * beta / k, rel=0.02)              # Hetenyi
    else:
        assert abs(w0) == pytest.approx(2 * M * beta**2 / k, rel=0.02)     # Hetenyi
        assert abs(slope0) == pytest.approx(4 * M * beta**3 / k, rel=0.02)
    sol = bvp_end_loaded(length, P, M, lambda w: k * w)
    w_bvp = sol.sol(x)[0]
    scale = np.abs(w_bvp).max()
    assert np.abs(s.u[:, 2] - w_bvp).max() <= 0.005 * scale             # solve_bvp, whole line
    assert slope0 == pytest.approx(sol.sol(0.0)[1], rel=0.005)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[0], load)]))


class TanhLaw:
    """p = p_u tanh(k u / p_u): the shape of the API sand p-y curve; one value per spring."""

    def __init__(self, k, p_u) -> None:
        self.k, self.p_u = np.asarray(k, float), np.asarray(p_u, float)

    def force(self, u):
        return self.p_u * np.tanh(self.k * u / self.p_u)

    def stiffness(self, u):
        return self.k / np.cosh(self.k * u / self.p_u) ** 2


def test_nonlinear_spring_closed_form_and_quadratic_convergence():
    # p = p_u tanh(k u / p_u) under a load P < p_u: u = (p_u / k) atanh(P / p_u) exactly.
    k, p_u, P = 2e6, 1e4, 8e3
    m = fem.Model()
    node = m.add_node([0, 0, 0])
    m.add_springs([node], "ux", TanhLaw(k, p_u))
    m.add_load(node, [P, 0, 0])
    s = fem.solve(m, options=tight())
    assert s.u[node, 0] == pytest.approx(p_u / k * np.arctanh(P / p_u), rel=1e-10)
    assert s.group("springs").force[0] == pytest.approx(P, rel=1e-10)
    # consistent tangent: quadratic convergence r_{k+1} <= C r_k^2 once r_k is small
    h = s.history[0]
    pairs = [(a, b) for a, b in zip(h[:-1], h[1:]) if a < 0.1 and b > 1e-13]
    assert pairs
    assert all(b <= 10.0 * a * a for a, b in pairs), h
    assert_balance(m, s, nodal_loads(m.n_nodes, [(node, [P, 0, 0])]))


def test_beam_on_nonlinear_springs_vs_solve_bvp():
    # A pile-like beam on tanh springs loaded at its end far into the nonlinear range,
    # against solve_bvp of E I w'''' + p(w) = 0 with the same law per unit length.
    k, p_u = 5e6, 2e4          # N/m per m and N/m
    beta = (k / (4 * EI)) ** 0.25
    length, P = 8.0 / beta, 2.5e4
    m, ids, x = winkler_beam(length, 120, k, law=lambda trib: TanhLaw(k * trib, p_u * trib))
    m.add_load(ids[0], [0, 0, P])
    s = fem.solve(m, steps=2, options=tight())
    sol = bvp_end_loaded(length, P, 0.0, lambda w: p_u * np.tanh(k * w / p_u))
    w_bvp = sol.sol(x)[0]
    assert k * w_bvp[0] > 2.0 * p_u                    # well past the linear range
    assert s.u[0, 2] == pytest.approx(w_bvp[0], rel=0.01)
    assert np.abs(s.u[:, 2] - w_bvp).max() <= 0.01 * w_bvp[0]
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[0], [0, 0, P])]))


@pytest.mark.parametrize("sign", [+1.0, -1.0])
def test_one_sided_spring(sign):
    # A node on a two-sided spring k1 and a spring k2 that resists only positive
    # displacement. Pulled +: springs in parallel, u = P / (k1 + k2); pushed -: only k1.
    k1, k2, P = 1e5, 3e5, 600.0
    m = fem.Model()
    node = m.add_node([0, 0, 0])
    m.add_springs([node], "uy", fem.LinearLaw(k1), name="both")
    m.add_springs([node], "uy", fem.LinearLaw(k2), one_sided=+1, name="plus")
    m.add_load(node, [0, sign * P, 0])
    s = fem.solve(m, options=tight())
    if sign > 0:
        assert s.u[node, 1] == pytest.approx(P / (k1 + k2), rel=1e-12)
        assert s.group("plus").force[0] == pytest.approx(k2 * P / (k1 + k2), rel=1e-12)
    else:
        assert s.u[node, 1] == pytest.approx(-P / k1, rel=1e-12)
        assert s.group("plus").force[0] == 0.0
    assert_balance(m, s, nodal_loads(m.n_nodes, [(node, [0, sign * P, 0])]))


def test_rigid_footing_on_tensionless_springs_lifts_off():
    # A stiff beam (beta L = 0.6, rigid for practical purposes) on compression-only
    # springs, loaded outside its middle third (e > L/6): it lifts off and bears on a
    # triangle of length 3 (L/2 - e) with peak pressure 2 P / (3 (L/2 - e)).
    # (Much stiffer beams or finer meshes put the round-off of the beam's rotations,
    # about 1e-16 rad times 6 E I / h^2, above the default residual tolerance.)
    length, n, k, P = 3.0, 40, 2e7, 9e4
    ei = k * length**4 / (4 * 0.6**4)
    stiff = fem.BeamSection(ei / 1e-3, ei / 1e-3 / 2.5, 0.1, 1e-3, 1e-3, 1e-3)
    e = 0.3 * length
    m = fem.Model()
    x = np.linspace(-length / 2, length / 2, n + 1)
    ids = m.add_nodes(np.c_[x, np.zeros_like(x), np.zeros_like(x)])
    m.add_beams(ids[:-1], ids[1:], stiff, orientation=(0, 1, 0))
    h = length / n
    trib = np.full(n + 1, h)
    trib[[0, -1]] *= 0.5
    m.add_springs(ids, "uz", fem.LinearLaw(k * trib), one_sided=-1)
    m.fix(ids, ["uy", "rx", "rz"])
    m.fix(ids[n // 2], "ux")
    node = int(np.argmin(np.abs(x - e)))
    assert x[node] == pytest.approx(e)
    m.add_load(ids[node], [0, 0, -P])
    s = fem.solve(m)
    w = s.u[:, 2]
    assert np.any(w > 0.0) and np.any(w < 0.0)        # lifted off at the far end
    assert np.all(s.group("springs").force <= 0.0)    # no spring pulls the beam down
    # contact length: where the (nearly straight) beam line crosses zero
    slope = (w[-1] - w[0]) / length
    x0 = x[0] - w[0] / slope
    assert x[-1] - x0 == pytest.approx(3 * (length / 2 - e), rel=0.01)
    q = -s.group("springs").force / trib              # bearing pressure per metre
    assert q.max() == pytest.approx(2 * P / (3 * (length / 2 - e)), rel=0.01)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[node], [0, 0, -P])]))


def test_rotational_spring_at_cantilever_base():
    # Cantilever on a rotational base spring k_r: superposition of Roark Table 8.1 case 1a,
    # the Timoshenko shear term and the rigid rotation P L / k_r of the whole member.
    L, P, k_r = 3.0, 2e3, 4e6
    sec = fem.BeamSection.rectangle(E, E / 16, 0.1, 0.2)
    m = fem.Model()
    ids = m.add_nodes(np.c_[np.linspace(0, L, 16), np.zeros(16), np.zeros(16)])
    m.add_beams(ids[:-1], ids[1:], sec, orientation=(0, 1, 0))
    m.fix(ids[0], ["ux", "uy", "uz", "rx", "rz"])
    m.add_springs([ids[0]], "ry", fem.LinearLaw(k_r))
    m.add_load(ids[-1], [0, 0, -P])
    s = fem.solve(m, options=tight())
    inertia = 0.1 * 0.2**3 / 12
    d = P * L**3 / (3 * E * inertia) + P * L / (E / 16 * 5 / 6 * 0.02) + P * L * L / k_r
    assert -s.u[-1, 2] == pytest.approx(d, rel=1e-3)
    assert abs(s.group("springs").force[0]) == pytest.approx(P * L, rel=1e-3)  # statics
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], [0, 0, -P])]))
