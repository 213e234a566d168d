"""API RP 2GEO / RP 2A sand: the factor A on the ultimate resistance, through the
p-y springs a soil profile gives a footing (a second test, other depths and widths than
test_soil_api_sand.py): A = max(3 - 0.8 z/D, 0.9) for static loading, A = 0.9 cyclic;
p = A p_u tanh(k z y / (A p_u))."""
from __future__ import annotations

import numpy as np
import pytest

from spanstay.models.catalogs.soil import SoilLayer, SoilProfile
from spanstay.models.parts.py_curves import api_sand_ultimate, curves_for_profile

PHI, GAMMA, K, D = 35.0, 19e3, 30e6, 0.4   # invented medium dense sand, 0.4 m pier


def profile():
    return SoilProfile((SoilLayer(0.0, 6.0, "sand", GAMMA, friction_angle_deg=PHI, k_initial=K),))


# worked by hand: z = 0.2 m: 3 - 0.8 x 0.5 = 2.6; z = 0.8 m: 3 - 1.6 = 1.4;
# z = 1.05 m: 3 - 2.1 = 0.9 (the two rules meet at z/D = 2.625); z = 2 m: 0.9
Z = np.array([0.2, 0.8, 1.05, 2.0])
A_STATIC = np.array([2.6, 1.4, 0.9, 0.9])


@pytest.mark.parametrize("cyclic,factor", [(False, A_STATIC), (True, np.full(4, 0.9))])
def test_profile_springs_carry_the_api_factor(cyclic, factor):
    curves = curves_for_profile(profile(), Z, D, 0.25, cyclic=cyclic)
    pu = api_sand_ultimate(PHI, Z, D, GAMMA * Z)
    # far out on the curve the spring holds A p_u per length (times its tributary length)
    np.testing.assert_allclose(curves.resistance(np.full(4, 5.0)), factor * pu, rtol=1e-9)
    np.testing.assert_allclose(curves.force(np.full(4, 5.0)), 0.25 * factor * pu, rtol=1e-9)
    # part way along: the tanh with the same A in both places
    y = np.array([0.002, 0.005, 0.01, 0.02])
    hand = factor * pu * np.tanh(K * Z * y / (factor * pu))
    np.testing.assert_allclose(curves.resistance(y), hand, rtol=1e-9)
    # the initial slope k z does not depend on A
    np.testing.assert_allclose(curves.resistance_tangent(np.zeros(4)), K * Z, rtol=1e-9)
