"""API RP 2A sand p-y curve: coefficients, ultimate resistance, curve shape.

Sources: API RP 2A-WSD §6.8.6 (C1, C2, C3 and p_u; p = A p_u tanh(k z y / (A p_u)));
Reese, Cox & Koop (1974) wedge and flow expressions for the ultimate resistance,
from which API's coefficients are derived (expressions written out below from memory,
in their original form with tan(beta - phi), so they are an independent route).
"""
import numpy as np
import pytest

from spanstay.models.parts.py_curves import APISandCurve, api_sand_coefficients, api_sand_ultimate

K0 = 0.4


def reese_wedge(phi_deg, gamma, z, D):
    """Reese, Cox & Koop (1974) shallow wedge resistance p_st (from memory)."""
    phi = np.radians(phi_deg)
    a, b = phi / 2, np.radians(45) + phi / 2
    ka = np.tan(np.radians(45) - phi / 2) ** 2
    return gamma * z * (K0 * z * np.tan(phi) * np.sin(b) / (np.tan(b - phi) * np.cos(a))
                        + np.tan(b) / np.tan(b - phi) * (D + z * np.tan(b) * np.tan(a))
                        + K0 * z * np.tan(b) * (np.tan(phi) * np.sin(b) - np.tan(a))
                        - ka * D)


def reese_flow(phi_deg, gamma, z, D):
    """Reese, Cox & Koop (1974) deep flow-around resistance p_sd (from memory)."""
    phi = np.radians(phi_deg)
    b = np.radians(45) + phi / 2
    ka = np.tan(np.radians(45) - phi / 2) ** 2
    return (ka * D * gamma * z * (np.tan(b) ** 8 - 1)
            + K0 * D * gamma * z * np.tan(phi) * np.tan(b) ** 4)


@pytest.mark.parametrize("phi", [30.0, 36.0])
def test_coefficients_match_wedge_and_flow_expressions(phi):
    # p_st = (C1 z + C2 D) gamma z and p_sd = C3 D gamma z for any z, D.
    c1, c2, c3 = api_sand_coefficients(phi)
    gamma, D = 1.0, 1.0
    for z in (0.5, 2.0):
        # two depths separate C1 from C2
        assert (c1 * z + c2 * D) * gamma * z == pytest.approx(reese_wedge(phi, gamma, z, D),
                                                              rel=1e-10)
    assert c3 * D * gamma == pytest.approx(reese_flow(phi, gamma, 1.0, D), rel=1e-10)


def test_coefficients_closed_form_at_30_deg():
    # Hand evaluation of the API formulas at phi = 30: a = 15, b = 60 deg, Kp = 3, Ka = 1/3,
    # C1 = tan60 [3 tan15 + 0.4 (tan30 sin60 (1/cos15 + 1) - tan15)]
    #    = 1.7321 [0.80385 + 0.4 (0.5 x 2.03528 - 0.26795)] = 1.7321 x 1.10370 = 1.9117
    # C2 = 3 - 1/3 = 2.6667;  C3 = 9 (3 + 0.4 tan30) - 1/3 = 9 x 3.23094 - 0.33333 = 28.745
    c1, c2, c3 = api_sand_coefficients(30.0)
    assert c1 == pytest.approx(1.9117, abs=2e-4)
    assert c2 == pytest.approx(2.6667, abs=1e-4)
    assert c3 == pytest.approx(28.745, abs=2e-3)


@pytest.mark.parametrize("phi, chart", [(30.0, (1.9, 2.7, 29.0)), (35.0, (3.0, 3.4, 54.0)),
                                        (40.0, (4.6, 4.4, 104.0))])
def test_coefficients_near_api_chart(phi, chart):
    # API RP 2A Fig. 6.8.6-1 chart readings, from memory; within 10 %.
    got = api_sand_coefficients(phi)
    for g, c in zip(got, chart):
        assert g == pytest.approx(c, rel=0.10)


@pytest.mark.parametrize("phi", [30.0, 36.0])
def test_ultimate_resistance_shallow_and_deep(phi):
    # p_u = min(p_st, p_sd) (API RP 2A); gamma = 18 kN/m^3, D = 0.3 m.
    gamma, D = 18e3, 0.3
    z = np.array([0.5, 1.0, 3.0, 10.0, 20.0])
    expected = np.minimum(reese_wedge(phi, gamma, z, D), reese_flow(phi, gamma, z, D))
    got = api_sand_ultimate(phi, z, D, gamma * z)
    np.testing.assert_allclose(got, expected, rtol=1e-10)
    # deep values are governed by the flow expression, shallow by the wedge
    assert got[-1] == pytest.approx(reese_flow(phi, gamma, 20.0, D), rel=1e-10)
    assert got[0] == pytest.approx(reese_wedge(phi, gamma, 0.5, D), rel=1e-10)


def test_ultimate_resistance_hand_value():
    # phi = 30, gamma = 18 kN/m^3, D = 0.3 m, z = 1 m (hand):
    # (1.9117 x 1 + 2.6667 x 0.3) x 18000 x 1 = 48,811 N/m ; C3 D gamma z = 155,223 N/m.
    assert api_sand_ultimate(30.0, 1.0, 0.3, 18e3) == pytest.approx(48_811, rel=1e-4)


def test_tanh_curve_shape():
    # API RP 2A: p = A p_u tanh(k z y / (A p_u)); A = max(3 - 0.8 z/D, 0.9) static, 0.9 cyclic.
    phi, gamma, k, D = 32.0, 18e3, 24e6, 0.3
    z = np.array([0.3, 1.0, 2.0])
    trib = 0.1
    static = APISandCurve(z, D, trib, phi, k, gamma * z)
    cyclic = APISandCurve(z, D, trib, phi, k, gamma * z, cyclic=True)
    pu = api_sand_ultimate(phi, z, D, gamma * z)
    A = np.maximum(3 - 0.8 * z / D, 0.9)
    np.testing.assert_allclose(A, [2.2, 0.9, 0.9], atol=1e-12)  # hand: 3 - 0.8 x 0.3/0.3 = 2.2
    y = np.array([0.004, 0.01, -0.02])
    np.testing.assert_allclose(static.resistance(y), A * pu * np.tanh(k * z * y / (A * pu)),
                               rtol=1e-12)
    np.testing.assert_allclose(cyclic.resistance(y), 0.9 * pu * np.tanh(k * z * y / (0.9 * pu)),
                               rtol=1e-12)
    # initial slope k z, plateau A p_u, odd in y
    np.testing.assert_allclose(static.resistance_tangent(np.zeros(3)), k * z, rtol=1e-12)
    np.testing.assert_allclose(static.resistance(np.full(3, 10.0)), A * pu, rtol=1e-12)
    np.testing.assert_allclose(static.force(-y), -static.force(y), rtol=1e-12)
    np.testing.assert_allclose(static.force(y), trib * static.resistance(y), rtol=1e-12)
