"""The corotational beam in torsion and its internal force as an energy gradient.

- St Venant torsion (Timoshenko & Goodier, Theory of Elasticity, ch. 10): a
  cantilever under a tip torque T twists by T L / (G J) whatever its orientation in
  space; the rectangle's J = beta a b^3 with beta = 0.229 for a/b = 2 (their table,
  from memory) and a circle's J = pi d^4 / 32.
- Hyperelasticity of the element (Crisfield 1997, vol. 2, ch. 17; Battini & Pacoste
  2002): the internal force is the gradient of the strain energy
  1/2 dl . (k dl) of the local deformations dl with respect to the end
  translations and left spins, so a central difference of that energy at a bent
  and twisted configuration must give the element's force (the torsional part of
  the frame's spin included).
"""
from __future__ import annotations

import math

import numpy as np
import pytest

from spanstay.fem import Model, solve
from spanstay.fem.beam import BeamGroup, BeamSection
from spanstay.fem.rotation import expmap

E, G = 11e9, 0.7e9


def test_rectangle_and_circle_torsion_constants():
    # Timoshenko & Goodier table: a/b = 2, beta = 0.229 (from memory); a/b = 1, 0.141
    rect = BeamSection.rectangle(E, G, 0.1, 0.2)
    assert rect.J == pytest.approx(0.229 * 0.2 * 0.1**3, rel=3e-3)
    square = BeamSection.rectangle(E, G, 0.15, 0.15)
    assert square.J == pytest.approx(0.141 * 0.15**4, rel=3e-3)
    circle = BeamSection.circle(E, G, 0.2)
    assert circle.J == pytest.approx(math.pi * 0.2**4 / 32, rel=1e-12)


@pytest.mark.parametrize("axis", [(1.0, 0.0, 0.0), (0.3, -0.5, 0.81)])
def test_tip_torque_twists_a_cantilever_by_tl_over_gj(axis):
    L, T, n = 2.0, 900.0, 8
    e = np.asarray(axis) / np.linalg.norm(axis)
    m = Model(gravity=(0.0, 0.0, 0.0))
    ids = m.add_nodes(np.outer(np.linspace(0.0, L, n + 1), e))
    across = np.cross(e, [0.0, 0.0, 1.0]) if abs(e[2]) < 0.9 else np.array([1.0, 0.0, 0.0])
    sec = BeamSection.rectangle(E, G, 0.1, 0.2)
    m.add_beams(ids[:-1], ids[1:], sec, orientation=across, name="bar")
    m.fix(ids[0], "all")
    m.add_load(ids[-1], [0.0, 0.0, 0.0, *(T * e)])
    s = solve(m, steps=2)
    twist = np.linalg.norm(s.rotation[ids[-1]] - np.eye(3), ord=2)
    # rotation by phi about e: |R - I|_2 = 2 sin(phi / 2)
    phi = 2 * math.asin(twist / 2)
    assert phi == pytest.approx(T * L / (G * sec.J), rel=1e-6)
    assert np.abs(s.u[ids, :3]).max() < 1e-9 * L   # the bar stays where it is


def _element(L=1.3):
    coords = np.array([[0.0, 0.0, 0.0], [L, 0.2, -0.1]])
    sec = BeamSection.rectangle(E, G, 0.09, 0.19)
    return BeamGroup("b", np.array([[0, 1]]), coords, sec, orientation=[[0.1, 1.0, 0.2]])


def _energy(g, u1, u2, r1, r2):
    _, _, dl = BeamGroup._core(u1, u2, r1, r2, g.frame0, g.L0, g.k_local, g.chord0)
    return 0.5 * float(dl[0] @ g.k_local[0] @ dl[0])


@pytest.mark.parametrize("w1,w2", [((0.3, -0.4, 0.5), (-0.2, 0.6, 0.35)),
                                   ((0.05, 0.7, -0.2), (0.6, -0.1, 0.45))])
def test_internal_force_is_the_gradient_of_the_strain_energy(w1, w2):
    g = _element()
    u1 = np.array([[0.01, -0.02, 0.015]])
    u2 = np.array([[-0.03, 0.05, 0.04]])
    r1, r2 = expmap(np.array([w1])), expmap(np.array([w2]))
    f, _, dl = BeamGroup._core(u1, u2, r1, r2, g.frame0, g.L0, g.k_local, g.chord0)
    assert abs(dl[0, 3]) > 0.05 and abs(dl[0, 9]) > 0.05     # real twist at both ends
    h = 1e-6
    grad = np.zeros(12)
    for i in range(3):
        d = np.zeros((1, 3))
        d[0, i] = h
        grad[i] = (_energy(g, u1 + d, u2, r1, r2) - _energy(g, u1 - d, u2, r1, r2)) / (2 * h)
        grad[6 + i] = (_energy(g, u1, u2 + d, r1, r2) - _energy(g, u1, u2 - d, r1, r2)) / (2 * h)
        grad[3 + i] = (_energy(g, u1, u2, expmap(d) @ r1, r2)
                       - _energy(g, u1, u2, expmap(-d) @ r1, r2)) / (2 * h)
        grad[9 + i] = (_energy(g, u1, u2, r1, expmap(d) @ r2)
                       - _energy(g, u1, u2, r1, expmap(-d) @ r2)) / (2 * h)
    np.testing.assert_allclose(f[0], grad, rtol=1e-5, atol=1e-6 * np.abs(grad).max())
