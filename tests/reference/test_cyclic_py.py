"""Cyclic p-y curves against their published formulas.

Sources:
- Matlock, H. (1970), Correlations for design of laterally loaded piles in soft clay,
  OTC 1204 (also API RP 2A / 2GEO, from memory): static p = 0.5 p_u (y/y50)^(1/3) to
  8 y50; cyclic the same cube root up to 0.72 p_u at 3 y50, and above the transition
  depth z_r = 6 c D / (gamma' D + J c) falling linearly to 0.72 p_u z/z_r at 15 y50;
  p_u = min((3 + gamma' z / c + J z / D) c D, 9 c D), y50 = 2.5 eps50 D.
- API RP 2A sand (cyclic): p = A p_u tanh(k z y / (A p_u)) with A = 0.9.
"""
import numpy as np
import pytest
from scipy.optimize import approx_fprime

from spanstay.models.parts.py_curves import APISandCurve, MatlockClayCurve

C, EPS50, D, GAMMA, J = 25e3, 0.01, 0.6, 8e3, 0.5


def test_matlock_cyclic_points_by_hand():
    # hand working: y50 = 2.5 x 0.01 x 0.6 = 0.015 m; z_r = 6 x 25e3 x 0.6 /
    # (8e3 x 0.6 + 0.5 x 25e3) = 90e3 / 17.3e3 = 5.2023 m
    z = np.array([1.0, 8.0])
    sv = GAMMA * z
    curve = MatlockClayCurve(z, D, 1.0, C, EPS50, sv, J=J, cyclic=True)
    assert curve.transition_depth[0] == pytest.approx(5.2023, rel=1e-4)
    # p_u at 1 m: (3 + 8e3/25e3 + 0.5/0.6) x 25e3 x 0.6 = 4.1533 x 15e3 = 62,300 N/m;
    # at 8 m: the 9 c D cap, 135,000 N/m
    pu = np.array([62_300.0, 135_000.0])
    y50 = 0.015
    at = lambda y: curve.resistance(np.full(2, y))  # noqa: E731
    assert at(y50) == pytest.approx(0.5 * pu, rel=1e-4)
    assert at(3 * y50) == pytest.approx(0.72 * pu, rel=1e-4)
    # shallow spring falls to 0.72 p_u z / z_r at 15 y50; the deep one stays at 0.72 p_u
    assert at(15 * y50)[0] == pytest.approx(0.72 * pu[0] * 1.0 / 5.2023, rel=1e-4)
    assert at(40 * y50) == pytest.approx([0.72 * pu[0] / 5.2023, 0.72 * pu[1]], rel=1e-4)
    # half way down the falling branch (9 y50) the resistance is the mean of its ends
    assert at(9 * y50)[0] == pytest.approx(0.5 * (0.72 * pu[0] + 0.72 * pu[0] / 5.2023), rel=1e-4)
    assert curve.p_ultimate == pytest.approx(0.72 * pu, rel=1e-4)
    # static curve: p_u from 8 y50
    static = MatlockClayCurve(z, D, 1.0, C, EPS50, sv, J=J)
    assert static.resistance(np.full(2, 8 * y50)) == pytest.approx(pu, rel=1e-4)


def test_cyclic_tangents_are_the_derivatives():
    z = np.array([1.0, 1.0, 1.0, 8.0])
    curve = MatlockClayCurve(z, D, 1.0, C, EPS50, GAMMA * z, J=J, cyclic=True)
    ys = np.array([0.5, 2.0, 9.0, 2.0]) * 0.015  # rising, cube root, falling, deep rising
    k = curve.stiffness(ys)
    for i, y in enumerate(ys):  # scipy forward differences of the force
        num = approx_fprime(np.array([y]), lambda v, i=i: curve.force(np.full(4, v[0]))[i],
                            1e-9)[0]
        assert k[i] == pytest.approx(num, rel=1e-4)
    assert k[2] < 0  # the falling branch softens


def test_api_sand_cyclic_takes_a_equal_0_9():
    z = np.array([0.5, 3.0])
    static = APISandCurve(z, 0.5, 1.0, 33.0, 24e6, 18e3 * z)
    cyclic = APISandCurve(z, 0.5, 1.0, 33.0, 24e6, 18e3 * z, cyclic=True)
    # A static = max(3 - 0.8 z/D, 0.9): 2.2 at 0.5 m, 0.9 at 3 m; cyclic 0.9 everywhere
    assert static.factor_a == pytest.approx([2.2, 0.9])
    assert cyclic.p_ultimate == pytest.approx(0.9 * static.api_p_u)
    assert cyclic.resistance(np.full(2, 1.0)) == pytest.approx(0.9 * static.api_p_u, rel=1e-6)
