"""The footing's lateral capacity check against rigid-pier statics (scipy) and Broms.

Sources:
- Rigid short pier, ultimate soil pressure on the front face above the point of
  rotation z_r and on the back face below it: horizontal force and moment equilibrium
  (Broms 1964's two-face form without the lumped toe force), solved here with scipy
  brentq / quad for sand (p_u = 3 Kp gamma z D, Broms 1964) and for clay (Matlock 1970
  p_u = min((3 + gamma z / c + J z / D) c D, 9 c D)).
- The check is V <= H_u / FoS; FoS is the scenario's setting.
"""
from types import SimpleNamespace

import numpy as np
import pytest
from scipy.integrate import quad
from scipy.optimize import brentq

from spanstay.fem import BeamSection
from spanstay.models.checks.lateral_capacity import lateral_capacity_check
from spanstay.models.catalogs.soil import SoilLayer, SoilProfile
from spanstay.models.parts.footing import Footing
from spanstay.models.parts.footing_case import FootingCase, build_case_model

D, L, E = 0.6, 1.8, 1.0
RIGID = BeamSection.circle(200e9, 80e9, D)


def _anchor(profile):
    footing = Footing(L, D, RIGID, kind="pier", py_model="elastic_plastic", elements=30)
    _, placed, _ = build_case_model(FootingCase(footing, profile, 1.0))
    return SimpleNamespace(footing=placed, spec=SimpleNamespace(name="test"))


def _two_face_ultimate(p, e):
    """H with moment equilibrium about the load point for a rigid pier (scipy)."""
    def H(zr):
        return quad(p, 0, zr)[0] - quad(p, zr, L)[0]

    def moment(zr):  # about grade: H e + front moment - back moment = 0
        return H(zr) * e + quad(lambda z: p(z) * z, 0, zr)[0] - quad(lambda z: p(z) * z, zr, L)[0]

    zr = brentq(moment, 0.5 * L, L * (1 - 1e-9))
    return H(zr)


def test_sand_pier_capacity_is_rigid_statics_over_the_factor():
    gamma, phi = 18e3, 32.0
    sand = SoilProfile((SoilLayer(0.0, 3.0, "sand", gamma, friction_angle_deg=phi,
                                  k_initial=60e6),))
    kp = np.tan(np.radians(45 + phi / 2)) ** 2
    expected = _two_face_ultimate(lambda z: 3 * kp * gamma * z * D, E)
    check = lateral_capacity_check(_anchor(sand), 5e3, 5e3 * E, 0.5, 2.5, {})
    assert check.capacity * 2.5 == pytest.approx(expected, rel=0.03)
    assert check.passed == (5e3 <= expected / 2.5)
    # a design shear above H_u / FoS fails
    over = lateral_capacity_check(_anchor(sand), 1.1 * expected / 2.5, 1.1 * expected / 2.5 * E,
                                  0.9, 2.5, {})
    assert not over.passed and over.utilization == pytest.approx(1.1, rel=0.03)


def test_clay_pier_capacity_is_rigid_statics_and_scales_with_the_factor():
    gamma, c, J = 17e3, 30e3, 0.5
    clay = SoilProfile((SoilLayer(0.0, 3.0, "clay", gamma, undrained_shear_strength=c,
                                  eps50=0.01),))

    def pu(z):
        return min((3 + gamma * z / c + J * z / D) * c * D, 9 * c * D)

    expected = _two_face_ultimate(pu, E)
    a = lateral_capacity_check(_anchor(clay), 4e3, 4e3 * E, 0.5, 2.0, {})
    b = lateral_capacity_check(_anchor(clay), 4e3, 4e3 * E, 0.5, 3.0, {})
    # the push stops at 0.1 rad of ground-line rotation, where the springs next to the
    # point of rotation are still short of p_u: it approaches the statics from below
    assert a.capacity * 2.0 == pytest.approx(expected, rel=0.05)
    assert a.capacity * 2.0 <= expected
    assert b.capacity == pytest.approx(a.capacity * 2.0 / 3.0, rel=1e-9)
    assert "settings.soil_factor_of_safety" in a.source


def test_a_load_between_cached_heights_takes_the_capacity_of_the_higher_one():
    # rigid-pier statics (scipy, as above): the higher the load, the less the pier holds,
    # so a load at e = 1.01 m checked with the push at the bin's top (1.05 m) is on the
    # safe side of the statics at 1.01 m, and below the capacity at 1.00 m
    gamma, phi = 18e3, 32.0
    sand = SoilProfile((SoilLayer(0.0, 3.0, "sand", gamma, friction_angle_deg=phi,
                                  k_initial=60e6),))
    kp = np.tan(np.radians(45 + phi / 2)) ** 2

    def p(z):
        return 3 * kp * gamma * z * D

    at_101, at_105 = _two_face_ultimate(p, 1.01), _two_face_ultimate(p, 1.05)
    assert at_105 < at_101
    check = lateral_capacity_check(_anchor(sand), 5e3, 5e3 * 1.01, 0.5, 2.5, {})
    assert check.capacity * 2.5 == pytest.approx(at_105, rel=0.03)
    lower = lateral_capacity_check(_anchor(sand), 5e3, 5e3 * 1.0, 0.5, 2.5, {})
    assert check.capacity < lower.capacity
