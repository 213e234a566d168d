"""Embedded members on linear springs: Hetenyi and Matlock & Reese, and mesh halving.

Sources:
- Hetenyi, M. (1946), Beams on Elastic Foundation: semi-infinite beam, end shear P:
  y(0) = 2 P beta / k, slope 2 P beta^2 / k; end moment M0: y(0) = 2 M0 beta^2 / k,
  slope 4 M0 beta^3 / k; beta = (k / 4 E I)^(1/4) (from memory).
- Matlock & Reese (1960), long pile with k = n_h z, T = (E I / n_h)^(1/5):
  y(0) = 2.435 P T^3/EI + 1.623 M T^2/EI, slope 1.623 P T^2/EI + 1.750 M T/EI
  (coefficients from memory).
Both are also checked against scipy's solve_bvp on E I y'''' + k(z) y = 0 for the
same finite length with free ends.
"""
import numpy as np
import pytest
from scipy.integrate import solve_bvp

from spanstay.fem import BeamSection, solve
from spanstay.models.parts.footing import Footing, footing_response
from spanstay.models.parts.footing_case import FootingCase, build_case_model
from spanstay.models.catalogs.soil import SoilLayer, SoilProfile

EI = 2.0e6  # N m^2
SECTION = BeamSection(200e9, 80e9, 0.01, EI / 200e9, EI / 200e9, 2 * EI / 200e9)  # no shear def.
LENGTH = 10.0


def fe_head(profile, P=0.0, M=0.0, elements=40):
    """FE ground-line displacement and rotation of a free-head pile (P at grade, M as couple)."""
    case = FootingCase(Footing(LENGTH, 0.3, SECTION, elements=elements), profile, load=1.0)
    m, placed, node = build_case_model(case)
    m.add_load(node, [P, 0, 0, 0, M, 0])  # My > 0 leans the top toward +x
    st = solve(m, factor=1.0, steps=1)
    r = footing_response(placed, m, st)
    return r.ground_displacement, r.ground_rotation


def bvp_head(k_of_z, P=0.0, M=0.0):
    """solve_bvp: EI y'''' = -k(z) y on 0 < z < L (z down); free head with shear P and
    moment M, free toe. Returns |y(0)|, |y'(0)| (magnitudes: one load at a time)."""
    def f(z, s):
        return np.vstack([s[1], s[2], s[3], -k_of_z(z) * s[0] / EI])

    def bc(a, b):
        return np.array([EI * a[2] - M, EI * a[3] - P, b[2], b[3]])

    z = np.linspace(0, LENGTH, 400)
    sol = solve_bvp(f, bc, z, np.zeros((4, z.size)), tol=1e-8, max_nodes=100000)
    assert sol.success
    return abs(sol.sol(0.0)[0]), abs(sol.sol(0.0)[1])


def constant_profile(k):
    return SoilProfile((SoilLayer(0, 20, "modulus", 18e3, modulus_constant=k),))


def linear_profile(nh):
    return SoilProfile((SoilLayer(0, 20, "modulus", 18e3, modulus_gradient=nh),))


def test_hetenyi_semi_infinite_beam():
    k = 4.0e6  # N/m^2 ; beta = (4e6 / 8e6)^(1/4) = 0.8409 1/m ; beta L = 8.4 (long)
    beta = (k / (4 * EI)) ** 0.25
    P, M = 1.0e4, 5.0e3
    y, th = fe_head(constant_profile(k), P=P)
    assert y == pytest.approx(2 * P * beta / k, rel=0.01)
    assert th == pytest.approx(2 * P * beta**2 / k, rel=0.01)
    yb, thb = bvp_head(lambda z: k + 0 * z, P=P)
    assert y == pytest.approx(yb, rel=0.01) and th == pytest.approx(thb, rel=0.01)
    y, th = fe_head(constant_profile(k), M=M)
    assert y == pytest.approx(2 * M * beta**2 / k, rel=0.01)
    assert th == pytest.approx(4 * M * beta**3 / k, rel=0.01)


def test_matlock_reese_long_pile():
    nh = 5.0e6  # N/m^3 ; T = (2e6/5e6)^(1/5) = 0.833 m ; L = 12 T (long)
    T = (EI / nh) ** 0.2
    P, M = 1.0e4, 8.0e3
    y, th = fe_head(linear_profile(nh), P=P)
    assert y == pytest.approx(2.435 * P * T**3 / EI, rel=0.03)
    assert th == pytest.approx(1.623 * P * T**2 / EI, rel=0.03)
    yb, thb = bvp_head(lambda z: nh * z, P=P)
    assert y == pytest.approx(yb, rel=0.01) and th == pytest.approx(thb, rel=0.01)
    y, th = fe_head(linear_profile(nh), M=M)
    assert y == pytest.approx(1.623 * M * T**2 / EI, rel=0.03)
    assert th == pytest.approx(1.750 * M * T / EI, rel=0.03)
    yb, thb = bvp_head(lambda z: nh * z, M=M)
    assert y == pytest.approx(yb, rel=0.01) and th == pytest.approx(thb, rel=0.01)


def test_mesh_halving_long_pile():
    # Default mesh against one at least twice as fine: ground-line values move less than 1 %.
    prof = linear_profile(5.0e6)
    y1, t1 = fe_head(prof, P=1e4, M=8e3, elements=40)
    y2, t2 = fe_head(prof, P=1e4, M=8e3, elements=200)  # 200 > 2 x the 96 chosen by T/8
    assert y1 == pytest.approx(y2, rel=0.01) and t1 == pytest.approx(t2, rel=0.01)
