"""Matlock (1970) soft clay p-y curve, static loading.

Source: Matlock, H. (1970), Correlations for design of laterally loaded piles in
soft clay, OTC 1204: p/p_u = 0.5 (y/y50)^(1/3) up to y = 8 y50, then 1;
y50 = 2.5 eps50 D; p_u = min((3 + gamma' z/c + J z/D) c D, 9 c D), J = 0.5;
transition depth x_r = 6 D / (gamma' D / c + J) (from memory).
"""
import numpy as np
import pytest

from spanstay.models.parts.py_curves import MatlockClayCurve, matlock_ultimate

C, D, EPS50, GAMMA = 20e3, 0.3, 0.02, 8e3


def test_ultimate_resistance_points():
    # z = 0: 3 c D = 18,000 N/m. z = 1 m (hand): (3 + 8000/20000 + 0.5/0.3) c D
    # = 5.0667 x 6000 = 30,400 N/m. Below x_r = 6 x 0.3 / (8000 x 0.3/20000 + 0.5)
    # = 1.8/0.62 = 2.903 m: 9 c D = 54,000 N/m.
    xr = 6 * D / (GAMMA * D / C + 0.5)
    assert xr == pytest.approx(2.903, abs=1e-3)
    z = np.array([0.0, 1.0, xr, 5.0])
    pu = matlock_ultimate(C, z, D, GAMMA * z)
    np.testing.assert_allclose(pu, [18_000, 30_400, 54_000, 54_000], rtol=1e-4)


def test_curve_shape_points():
    # p/p_u at y/y50 = 0.125, 1, 2, 8, 20: 0.25, 0.5, 0.63, 1, 1 (Matlock 1970 static curve).
    z = np.full(5, 1.0)
    curve = MatlockClayCurve(z, D, 0.2, C, EPS50, GAMMA * z)
    y50 = 2.5 * EPS50 * D
    assert curve.y50[0] == pytest.approx(0.015)
    ratio = np.array([0.125, 1.0, 2.0, 8.0, 20.0])
    pu = matlock_ultimate(C, 1.0, D, GAMMA)
    np.testing.assert_allclose(curve.resistance(ratio * y50) / pu,
                               [0.25, 0.5, 0.5 * 2 ** (1 / 3), 1.0, 1.0], rtol=1e-12)
    np.testing.assert_allclose(curve.resistance(-ratio * y50), -curve.resistance(ratio * y50))
    # slope of the cube-root branch: p_u / (6 y50) (y/y50)^(-2/3); zero on the plateau
    np.testing.assert_allclose(curve.resistance_tangent(ratio * y50)[:3],
                               pu / (6 * y50) * ratio[:3] ** (-2 / 3), rtol=1e-12)
    assert curve.resistance_tangent(ratio * y50)[4] == 0.0
    # finite slope at y = 0 (secant below 1e-3 y50), force continuous there
    k0 = curve.resistance_tangent(np.zeros(5))[0]
    assert np.isfinite(k0) and k0 > 0
    yt = 1e-3 * y50
    assert k0 * yt == pytest.approx(0.5 * pu * (1e-3) ** (1 / 3), rel=1e-12)
