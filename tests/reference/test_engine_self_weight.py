"""Self-weight of beams and cables, and the cable's tangent.

- A horizontal cantilever under its own weight w: the support holds w L and the moment
  w L^2 / 2 (statics); the tip sags w L^4 / (8 E I) (Roark, Table 8.1 case 2a).
- A taut cable element's stiffness is the derivative of its end forces: EA / lf along
  the chord and T / l across it (the geometric stiffness of a string, e.g. Crisfield
  1991 vol. 1 ch. 3); checked against central differences of the force.
"""
import numpy as np
import pytest

from spanstay.fem import Model, solve
from spanstay.fem.beam import BeamSection
from spanstay.fem.cable import CableGroup

E, G = 10e9, 0.6e9


def test_cantilever_under_its_own_weight():
    L, n, w = 3.0, 24, 250.0      # m, elements, N/m
    m = Model()                   # gravity along -z
    ids = m.add_nodes(np.c_[np.linspace(0, L, n + 1), np.zeros(n + 1), np.zeros(n + 1)])
    sec = BeamSection.rectangle(E, G, 0.1, 0.2, weight=w)
    sec.Asy = sec.Asz = None      # shear-rigid, as Roark's formula
    m.add_beams(ids[:-1], ids[1:], sec, orientation=[0, 1, 0], name="bar")
    m.fix(ids[0], "all")
    s = solve(m, steps=1)
    assert s.reactions[ids[0], 2] == pytest.approx(w * L, rel=1e-9)
    assert abs(s.reactions[ids[0], 4]) == pytest.approx(w * L**2 / 2, rel=1e-3)
    EI = E * 0.1 * 0.2**3 / 12
    assert -s.u[ids[-1], 2] == pytest.approx(w * L**4 / (8 * EI), rel=1e-2)


def test_cable_weight_hangs_half_on_each_end():
    m = Model()
    a, b = m.add_nodes([[0.0, 0.0, 0.0], [10.0, 0.0, 0.0]])
    mid = m.add_node([5.0, 0.0, -0.5])
    m.add_cables([a, mid], [mid, b], 1e7, [5.02, 5.02], weight=20.0, name="c")
    m.fix([a, b], ["ux", "uy", "uz"])
    m.fix(mid, "uy")
    s = solve(m, steps=2)
    total = 20.0 * 2 * 5.02     # weight per unstressed length x length
    assert s.reactions[a, 2] + s.reactions[b, 2] == pytest.approx(total, rel=1e-6)


@pytest.mark.parametrize("stretch", [1.01, 1.002])
def test_cable_tangent_is_the_derivative_of_its_force(stretch):
    coords = np.array([[0.0, 0.0, 0.0], [3.0, 1.0, -0.5]])
    chord = float(np.linalg.norm(coords[1] - coords[0]))
    g = CableGroup("c", np.array([[0, 1]]), coords, 2e6, chord / stretch)
    disp = np.zeros((2, 6))
    disp[1, :3] = [0.02, -0.03, 0.01]
    rot = np.broadcast_to(np.eye(3), (2, 3, 3)).copy()
    ev = g.evaluate(coords + disp[:, :3], rot, disp)
    h = 1e-7
    k_fd = np.zeros((6, 6))
    for j in range(6):
        node, comp = divmod(j, 3)
        dp, dm = disp.copy(), disp.copy()
        dp[node, comp] += h
        dm[node, comp] -= h
        fp = g.evaluate(coords + dp[:, :3], rot, dp, tangent=False).force[0]
        fm = g.evaluate(coords + dm[:, :3], rot, dm, tangent=False).force[0]
        k_fd[:, j] = (fp - fm) / (2 * h)
    np.testing.assert_allclose(ev.tangent[0], k_fd, rtol=1e-6, atol=1e-6 * np.abs(k_fd).max())
