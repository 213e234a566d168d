"""Matlock (1970) soft clay, static, between the points test_soil_matlock.py checks: the
cube-root branch holds all the way to y = 8 y50 (p/p_u = 0.5 (y/y50)^(1/3) reaches 1
exactly there, so the curve is continuous), at another clay and width.

Source: Matlock, H. (1970), OTC 1204; worked here: y/y50 = 3, 5, 7: p/p_u = 0.7211,
0.8550, 0.9565.
"""
import numpy as np
import pytest

from spanstay.models.parts.py_curves import MatlockClayCurve, matlock_ultimate

C, D, EPS50, GAMMA = 35e3, 0.45, 0.01, 9e3


def test_cube_root_branch_runs_to_eight_y50():
    z = np.full(5, 0.8)
    curve = MatlockClayCurve(z, D, 0.25, C, EPS50, GAMMA * z)
    y50 = 2.5 * EPS50 * D                      # 0.01125 m
    pu = matlock_ultimate(C, 0.8, D, GAMMA * 0.8)
    ratio = np.array([3.0, 5.0, 7.0, 7.999, 8.0])
    np.testing.assert_allclose(curve.resistance(ratio * y50) / pu,
                               [0.7211, 0.8550, 0.9565, 0.99998, 1.0], atol=5e-5)
    # springs: tributary length times p
    np.testing.assert_allclose(curve.force(ratio * y50), 0.25 * curve.resistance(ratio * y50))
