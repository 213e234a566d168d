"""p-y curve objects: consistent tangents, symmetry, subsets, layered profiles."""
import numpy as np
import pytest

from spanstay.models.parts.py_curves import (APISandCurve, CombinedCurves, ElasticPlasticCurve,
                              MatlockClayCurve, UserModulusCurve, broms_sand_ultimate,
                              curves_for_profile, matlock_ultimate)
from spanstay.models.catalogs.soil import SoilLayer, SoilProfile, preset_layer

Z = np.array([0.1, 0.5, 1.0, 2.0])


def curves():
    return [
        APISandCurve(Z, 0.3, 0.25, 33.0, 24e6, 18e3 * Z),
        APISandCurve(Z, 0.3, 0.25, 33.0, 24e6, 18e3 * Z, cyclic=True),
        MatlockClayCurve(Z, 0.3, 0.25, 20e3, 0.02, 7e3 * Z),
        ElasticPlasticCurve(Z, 0.3, 0.25, 5e6 * Z + 1e5, 2e4 * Z),
        UserModulusCurve(Z, 0.3, 0.25, 1e6, 4e6),
    ]


@pytest.mark.parametrize("k", range(5))
def test_tangent_matches_central_difference(k):
    # Away from kinks the stiffness is the derivative of the force (checked numerically).
    curve = curves()[k]
    for y in (np.array([1e-3, -2e-3, 5e-3, 2e-2]), np.array([-7e-4, 3e-3, -1.1e-2, 4e-2])):
        h = 1e-8
        fd = (curve.force(y + h) - curve.force(y - h)) / (2 * h)
        scale = np.max(np.abs(curve.stiffness(np.zeros(4) + 1e-6)))
        np.testing.assert_allclose(curve.stiffness(y), fd, rtol=1e-5, atol=1e-6 * scale)


@pytest.mark.parametrize("k", range(5))
def test_odd_and_subset(k):
    curve = curves()[k]
    y = np.array([1e-3, -2e-3, 5e-3, 2e-2])
    np.testing.assert_allclose(curve.force(-y), -curve.force(y))
    np.testing.assert_allclose(curve.stiffness(-y), curve.stiffness(y))
    i = np.array([3, 1])
    np.testing.assert_allclose(curve.force(y[i], i), curve.force(y)[i])
    np.testing.assert_allclose(curve.stiffness(y[i], i), curve.stiffness(y)[i])


def test_elastic_plastic_caps():
    c = ElasticPlasticCurve([1.0, 1.0], 0.3, 0.5, 1e6, 1e4)
    np.testing.assert_allclose(c.resistance(np.array([0.005, -0.02])), [5e3, -1e4])
    np.testing.assert_allclose(c.stiffness(np.array([0.005, -0.02])), [5e5, 0.0])
    np.testing.assert_allclose(c.utilization(np.array([0.005, -0.02])), [0.5, 1.0])


def test_profile_curves_pick_the_layer_model():
    profile = SoilProfile((
        preset_layer("medium_dense_sand", 0, 1.0),
        preset_layer("soft_clay", 1.0, 2.0),
        SoilLayer(2.0, 3.0, "modulus", 18e3, modulus_constant=2e6, modulus_gradient=1e6,
                  friction_angle_deg=30.0),
    ), water_table=1.5)
    z = np.array([0.5, 1.5, 2.5])
    sv = profile.vertical_effective_stress(z)
    api = curves_for_profile(profile, z, 0.3, 0.2)
    y = np.array([0.002, -0.004, 0.001])
    sand = APISandCurve(0.5, 0.3, 0.2, 33.0, preset_layer("medium_dense_sand", 0, 1).k_initial,
                        sv[0])
    clay = MatlockClayCurve(1.5, 0.3, 0.2, 20e3, 0.02, sv[1])
    np.testing.assert_allclose(api.force(y)[0], sand.force(y[:1])[0])
    np.testing.assert_allclose(api.force(y)[1], clay.force(y[1:2])[0])
    assert api.force(y)[2] == pytest.approx(0.2 * (2e6 + 1e6 * 2.5) * 0.001)
    assert api.p_ultimate[2] == pytest.approx(broms_sand_ultimate(30.0, 0.3, sv[2]))
    ep = curves_for_profile(profile, z, 0.3, 0.2, model="elastic_plastic")
    assert ep.p_ultimate[0] == pytest.approx(broms_sand_ultimate(33.0, 0.3, sv[0]))
    assert ep.p_ultimate[1] == pytest.approx(matlock_ultimate(20e3, 1.5, 0.3, sv[1]))
    i = np.array([2, 0])
    np.testing.assert_allclose(api.stiffness(y[i], i), api.stiffness(y)[i])


def test_combined_must_cover_all():
    part = ElasticPlasticCurve([1.0], 0.3, 0.5, 1e6)
    with pytest.raises(ValueError):
        CombinedCurves(2, [(np.array([0]), part)])
