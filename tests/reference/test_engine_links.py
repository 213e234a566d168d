"""Two-node links with rigid offsets against springs, series springs and statics.

Sources: Hooke's law per local direction (a link between coincident nodes is six
uncoupled springs in its own axes); springs in series with a cantilever (Roark's
Formulas, Table 8.1 case 1a, plus the Timoshenko shear term); Roark Table 8.1
case 3a (cantilever under an end moment: slope M L / E I, deflection M L^2 / 2 E I)
for the moment P e that a rigid offset e carries into a post.
"""
from __future__ import annotations

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

import spanstay.fem as fem
from test_engine_balance import assert_balance, nodal_loads, tight

E, G = 10e9, 10e9 / 16


def test_link_between_coincident_nodes_is_six_springs_in_its_axes():
    # Hooke's law in the link's local axes A (rows): u = A^T K^-1 A F, theta = A^T Kr^-1 A M.
    # Placed far from the origin so that coordinates of 1e3 m must not cost digits.
    k = np.array([2e6, 5e5, 8e6, 3e4, 7e4, 1e5])
    axes = Rotation.from_euler("xyz", [20.0, -35.0, 50.0], degrees=True).as_matrix().T
    m = fem.Model()
    a, b = m.add_nodes([[1000.0, -700.0, 50.0], [1000.0, -700.0, 50.0]])
    m.add_links([a], [b], k, axes=axes)
    m.fix(a)
    load = np.array([300.0, -500.0, 200.0, 4.0, -2.0, 6.0])
    m.add_load(b, load)
    s = fem.solve(m, options=tight())
    u_expected = axes.T @ ((axes @ load[:3]) / k[:3])
    th_expected = axes.T @ ((axes @ load[3:]) / k[3:])
    assert s.u[b, :3] == pytest.approx(u_expected, rel=1e-9, abs=1e-12)
    assert s.u[b, 3:] == pytest.approx(th_expected, rel=1e-6, abs=1e-12)
    res = s.group("links")
    assert res.force[0] == pytest.approx(axes @ load[:3], rel=1e-9, abs=1e-9)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(b, load)]))


def test_link_in_series_with_cantilever():
    # Springs in series: the load point moves by the cantilever tip deflection
    # P L^3 / (3 E I) + P L / (G A_s) (Roark 1a + Timoshenko) plus the link's P / k.
    L, P, kz = 2.0, 1500.0, 2e5
    sec = fem.BeamSection.rectangle(E, G, 0.1, 0.2)
    m = fem.Model()
    ids = m.add_nodes(np.c_[np.linspace(0, L, 11), np.zeros(11), np.zeros(11)])
    m.add_beams(ids[:-1], ids[1:], sec, orientation=(0, 1, 0))
    m.fix(ids[0])
    hang = m.add_node([L, 0, 0])
    m.add_links([ids[-1]], [hang], [1e9, 1e9, kz, 1e6, 1e6, 1e6])
    m.add_load(hang, [0, 0, -P])
    s = fem.solve(m, options=tight())
    beam_tip = P * L**3 / (3 * E * 0.1 * 0.2**3 / 12) + P * L / (G * 5 / 6 * 0.02)
    assert -s.u[ids[-1], 2] == pytest.approx(beam_tip, rel=1e-3)
    assert -s.u[hang, 2] == pytest.approx(beam_tip + P / kz, rel=1e-3)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(hang, [0, 0, -P])]))


@pytest.mark.parametrize("e", [0.08, 0.15])
def test_offset_link_carries_moment_P_e_into_post(e):
    # A vertical cantilever post with a bracket: a link whose node-1 end has a rigid arm
    # e off the post axis; a vertical load P at the bracket puts the moment P e into the
    # post top (statics), so the top turns by P e L / (E I) and moves sideways by
    # P e L^2 / (2 E I) (Roark 8.1 case 3a). P is far below the buckling load of the post.
    L, P = 3.0, 200.0
    b = 0.15
    inertia = b**4 / 12
    sec = fem.BeamSection.rectangle(E, G, b, b)
    m = fem.Model()
    post = m.add_nodes(np.c_[np.zeros(13), np.zeros(13), np.linspace(0, L, 13)])
    m.add_beams(post[:-1], post[1:], sec, orientation=(0, 1, 0))
    m.fix(post[0])
    bracket = m.add_node([e, 0, L])
    stiff = [1e10, 1e10, 1e10, 1e8, 1e8, 1e8]
    m.add_links([post[-1]], [bracket], stiff, offset1=[e, 0.0, 0.0])
    load = [0, 0, -P]
    m.add_load(bracket, load)
    s = fem.solve(m, options=tight())
    M = P * e
    assert P < 0.01 * np.pi**2 * E * inertia / (4 * L**2)
    assert abs(s.u[post[-1], 4]) == pytest.approx(M * L / (E * inertia), rel=5e-3)
    assert abs(s.u[post[-1], 0]) == pytest.approx(M * L**2 / (2 * E * inertia), rel=5e-3)
    assert abs(s.reactions[post[0], 4]) == pytest.approx(M, rel=5e-3)
    assert s.group("links").force[0, 2] == pytest.approx(-P, rel=1e-6)  # the link carries P
    assert_balance(m, s, nodal_loads(m.n_nodes, [(bracket, load)]))
