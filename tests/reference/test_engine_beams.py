"""The corotational Timoshenko beam against published beam and column results.

Sources (see shared references.md):
- Roark's Formulas for Stress and Strain, Table 8.1 case 1a (cantilever, tip load)
  and case 3a (cantilever, end moment); Timoshenko beam theory for the shear term.
- Timoshenko & Gere, Theory of Elastic Stability: beam-column amplification,
  Euler load of a cantilever, and the elastica of a buckled cantilever (Sec. 2.7).
- Exact elastica under an end moment: a circle of radius E I / M.
"""
from __future__ import annotations

import numpy as np
import pytest
from scipy.optimize import brentq
from scipy.special import ellipk
from scipy.spatial.transform import Rotation

import spanstay.fem as fem
from test_engine_balance import assert_balance, nodal_loads, tight

E = 10e9           # Pa, a softwood-like modulus
G = E / 16.0       # softwood E/G about 16 (Swedish Wood, Design of Timber Structures, Vol. 1)
B, H = 0.10, 0.20  # m: width along local y, depth along local z
L = 2.0            # m


def cantilever(n: int, section: fem.BeamSection, length: float = L):
    """Cantilever along +x fixed at x = 0; local y = global y, local z = global z."""
    m = fem.Model()
    ids = m.add_nodes(np.c_[np.linspace(0.0, length, n + 1), np.zeros(n + 1), np.zeros(n + 1)])
    m.add_beams(ids[:-1], ids[1:], section, orientation=(0.0, 1.0, 0.0))
    m.fix(ids[0])
    return m, ids


@pytest.mark.parametrize("axis", [1, 2])
def test_cantilever_tip_load_with_shear(axis):
    # Roark Table 8.1 case 1a: d = P L^3 / (3 E I), tip slope P L^2 / (2 E I);
    # Timoshenko beam theory adds P L / (G A_s), A_s = 5/6 A for a rectangle.
    # Short deep member (L/h = 10, E/G = 16): the shear term is about 5% of the total
    # for bending about the strong axis, 1% about the weak axis.
    sec = fem.BeamSection.rectangle(E, G, B, H)
    m, ids = cantilever(20, sec)
    P = 1000.0
    load = np.zeros(6)
    load[axis] = -P
    m.add_load(ids[-1], load)
    s = fem.solve(m, options=tight())
    inertia = H * B**3 / 12 if axis == 1 else B * H**3 / 12  # bending about z for a y load
    a_s = 5.0 / 6.0 * B * H
    bending = P * L**3 / (3 * E * inertia)
    shear = P * L / (G * a_s)
    assert shear > 0.01 * bending
    assert -s.u[-1, axis] == pytest.approx(bending + shear, rel=1e-4)
    rot_axis = 5 if axis == 1 else 4
    assert abs(s.u[-1, rot_axis]) == pytest.approx(P * L**2 / (2 * E * inertia), rel=1e-4)
    # Root section: shear P and moment P L (statics).
    root = s.group("beams").end_forces[0, 0]
    v_idx, m_idx = (1, 5) if axis == 1 else (2, 4)
    assert abs(root[v_idx]) == pytest.approx(P, rel=1e-6)
    assert abs(root[m_idx]) == pytest.approx(P * L, rel=1e-4)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], load)]))


@pytest.mark.parametrize("tension", [0.0, 50e3])
def test_cantilever_shear_rigid_with_axial_tension(tension):
    # Shear-rigid section (A_s = None): Roark 1a without the shear term, d = P L^3 / (3 E I).
    # With an axial tension T the beam stiffens: d = P (u - tanh u) / (T k), k = sqrt(T/EI),
    # u = k L (Timoshenko & Gere's beam-column result with the sign of the axial force
    # reversed, tan -> tanh; tends to P L^3 / (3 E I) as T -> 0).
    inertia = B * H**3 / 12
    sec = fem.BeamSection(E, G, B * H, inertia, H * B**3 / 12, 1e-5)
    m, ids = cantilever(20, sec)
    P = 800.0
    load = [tension, 0, -P, 0, 0, 0]
    m.add_load(ids[-1], load)
    s = fem.solve(m, options=tight())
    if tension == 0.0:
        d = P * L**3 / (3 * E * inertia)
    else:
        k = np.sqrt(tension / (E * inertia))
        d = P * (k * L - np.tanh(k * L)) / (tension * k)
        assert d < 0.9 * P * L**3 / (3 * E * inertia)
        assert s.group("beams").end_forces[0, 0, 0] == pytest.approx(tension, rel=1e-5)  # statics
    assert -s.u[-1, 2] == pytest.approx(d, rel=2e-3)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], load)]))


COLUMN_L, COLUMN_B = 4.0, 0.1  # a slender square post, L / b = 40


def test_axial_stretch_hooke():
    # Hooke's law: a bar under axial tension T stretches T L / (E A).
    sec = fem.BeamSection.rectangle(E, G, B, H)
    m, ids = cantilever(4, sec)
    T = 5e4
    m.add_load(ids[-1], [T, 0, 0])
    s = fem.solve(m, options=tight())
    assert s.u[-1, 0] == pytest.approx(T * L / (E * B * H), rel=1e-6)
    assert np.abs(s.u[:, 1:]).max() < 1e-12
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], [T, 0, 0])]))


def _beam_column(P_over_Pcr: float, n: int = 20, H_over_P: float = 1e-3):
    """Shear-rigid slender cantilever, axial dead load P (along -x) and lateral H (+z).

    Slender, so that the axial shortening (P / EA about 1e-4 at P_cr), which the
    inextensible formulas leave out, stays small.
    """
    b = COLUMN_B
    inertia = b**4 / 12
    sec = fem.BeamSection(E, G, b * b, inertia, inertia, 1e-5)  # A_s None: shear-rigid
    p_cr = np.pi**2 * E * inertia / (4 * COLUMN_L**2)  # Timoshenko & Gere: cantilever Euler load
    P = P_over_Pcr * p_cr
    m, ids = cantilever(n, sec, COLUMN_L)
    load = [-P, 0, H_over_P * P, 0, 0, 0]
    m.add_load(ids[-1], load)
    return m, ids, P, load, inertia, p_cr


@pytest.mark.parametrize("ratio", [0.5, 0.9])
def test_beam_column_amplification(ratio):
    # Timoshenko & Gere: cantilever with axial compression P and lateral tip load H:
    # d = H (tan u - u) / (P k), k = sqrt(P / E I), u = k L.
    m, ids, P, load, inertia, _ = _beam_column(ratio)
    s = fem.solve(m, steps=2, options=tight())
    k = np.sqrt(P / (E * inertia))
    u = k * COLUMN_L
    d = load[2] * (np.tan(u) - u) / (P * k)
    assert s.u[-1, 2] == pytest.approx(d, rel=0.01)
    # the amplification over the first-order deflection grows towards 1/(1 - P/Pcr)
    first_order = load[2] * COLUMN_L**3 / (3 * E * inertia)
    assert s.u[-1, 2] / first_order > 1.0 / (1.0 - ratio) * 0.95
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], load)]))


def test_euler_buckling_post_critical_elastica():
    # Timoshenko & Gere Sec. 2.7 (elastica of a cantilever buckled by a dead load P):
    # k L = K(p), p = sin(alpha / 2), tip deflection delta = 2 p / k, alpha the tip angle.
    # Below P_cr = pi^2 E I / (4 L^2) a tiny imperfection load gives a tiny deflection;
    # above it the deflection is of the order of the length.
    # Load control finds the unstable, nearly straight branch when it steps across P_cr,
    # so the post is first pushed over by a lateral load of 5% of P, which is then
    # reduced to the tiny imperfection 1e-5 P with P held.
    m, ids, P, load, inertia, p_cr = _beam_column(0.97, n=24, H_over_P=1e-5)
    s = fem.solve(m, steps=2)
    assert s.u[-1, 2] < 1e-3 * COLUMN_L  # still nearly straight just below P_cr
    P = 1.15 * p_cr
    m.set_load(ids[-1], [-P, 0, 0.05 * P, 0, 0, 0])
    s = fem.solve(m, steps=4)
    load = [-P, 0, 1e-5 * P, 0, 0, 0]
    m.set_load(ids[-1], load)
    s = fem.solve(m, state=s)
    k = np.sqrt(P / (E * inertia))
    p = np.sqrt(brentq(lambda mm: ellipk(mm) - k * COLUMN_L, 1e-12, 0.99))
    delta = 2.0 * p / k
    assert delta > 0.5 * COLUMN_L
    assert s.u[-1, 2] == pytest.approx(delta, rel=0.01)
    tip_angle = 2.0 * np.arcsin(p)
    assert abs(s.u[-1, 4]) == pytest.approx(tip_angle, rel=0.01)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], load)]))


@pytest.mark.parametrize("turns, steps", [(0.25, 2), (1.0, 8)])
def test_end_moment_bends_into_a_circle(turns, steps):
    # Exact elastica: a cantilever under an end moment M bends into a circle of radius
    # R = E I / M; the tip is at (R sin(L/R), R (1 - cos(L/R))) and turns through L/R.
    # M = 2 pi E I / L closes the circle; a quarter of it gives a quarter turn.
    sec = fem.BeamSection.rectangle(E, G, B, H)
    inertia = B * H**3 / 12
    m, ids = cantilever(32, sec)
    M = turns * 2.0 * np.pi * E * inertia / L
    load = [0, 0, 0, 0, -M, 0]  # -My bends the free end towards +z
    m.add_load(ids[-1], load)
    s = fem.solve(m, steps=steps, options=tight())
    R = E * inertia / M
    tip = s.positions(m.coords)[-1]
    expected = np.array([R * np.sin(L / R), 0.0, R * (1.0 - np.cos(L / R))])
    assert np.linalg.norm(tip - expected) <= 0.005 * L
    if turns < 1.0:
        assert tip[0] == pytest.approx(expected[0], rel=0.005)
        assert tip[2] == pytest.approx(expected[2], rel=0.005)
        assert -s.u[-1, 4] == pytest.approx(L / R, rel=0.005)  # quarter turn, rotation vector
    else:
        # full turn: the tip triad is back to the identity
        assert np.abs(s.rotation[-1] - np.eye(3)).max() < 0.01
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], load)]))


def test_rotated_problem_gives_rotated_answer():
    # Frame invariance (any mechanics text): rotating the whole problem, geometry,
    # orientation vector and loads, by Q rotates the displacements and reactions by Q and
    # leaves the section forces unchanged. Large rotation (about 0.5 rad) and biaxial
    # bending with torsion, so the corotational kinematics are exercised in 3D.
    sec = fem.BeamSection.rectangle(E, G, B, H)
    n = 12
    load = np.array([-2e4, 6e4, -9e4, 3e4, 0.0, 0.0])

    def run(q: np.ndarray):
        m = fem.Model()
        x = np.c_[np.linspace(0.0, L, n + 1), np.zeros(n + 1), np.zeros(n + 1)]
        ids = m.add_nodes(x @ q.T)
        m.add_beams(ids[:-1], ids[1:], sec, orientation=q @ np.array([0.0, 1.0, 0.0]))
        m.fix(ids[0])
        vec = np.r_[q @ load[:3], q @ load[3:]]
        m.add_load(ids[-1], vec)
        s = fem.solve(m, steps=3, options=tight())
        assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], vec)]))
        return s

    q = Rotation.from_euler("zyx", [37.0, -23.0, 61.0], degrees=True).as_matrix()
    a, b = run(np.eye(3)), run(q)
    assert np.abs(a.u[-1, 3:]).max() > 0.3  # large rotation
    scale = np.abs(a.translation).max()
    assert np.abs(b.translation - a.translation @ q.T).max() <= 1e-7 * scale
    assert np.abs(b.rotation - q @ a.rotation @ q.T).max() <= 1e-7
    ra, rb = a.reactions[0], b.reactions[0]
    assert np.abs(rb[:3] - q @ ra[:3]).max() <= 1e-7 * np.abs(ra[:3]).max()
    assert np.abs(rb[3:] - q @ ra[3:]).max() <= 1e-7 * np.abs(ra[3:]).max()
    fa, fb = a.group("beams").end_forces, b.group("beams").end_forces
    assert np.abs(fb - fa).max() <= 1e-6 * np.abs(fa).max()
