"""Pushover of short rigid piles in sand with elastic-plastic springs.

Sources:
- Broms, B. B. (1964), Lateral resistance of piles in cohesionless soils, J. Soil Mech.
  Found. Div. ASCE 90 (SM3): short free-head pile, passive pressure 3 Kp gamma z D on
  the front face over the whole embedment and the back reaction as a point force at
  the toe: H_u = 0.5 gamma D L^3 Kp / (e + L). The FE model is set up with the same
  assumptions: springs on the front face only (one-sided), capped at 3 Kp gamma z D,
  and a stiff shear spring at the toe standing for the point reaction.
- Rigid pile with the same ultimate pressure on both faces (front above the point of
  rotation, back below it): horizontal and moment equilibrium solved with scipy brentq.
  Broms' lumped toe reaction overstates this by about 40 % for e/L near 0.7
  (see the numbers in the test).
"""
import numpy as np
import pytest
from scipy.optimize import brentq

from spanstay.fem import BeamSection
from spanstay.models.parts.footing import Footing
from spanstay.models.parts.footing_case import FootingCase
from spanstay.models.analysis.capacity import broms_sand_short_free_head, pushover, rigid_limit_load
from spanstay.models.catalogs.soil import SoilLayer, SoilProfile

GAMMA, PHI, D, L, E_LOAD = 18e3, 30.0, 0.3, 1.5, 1.0
RIGID = BeamSection.circle(200e9, 80e9, D)  # EI = 8e7 N m^2: L/T about 0.9, rigid
SAND = SoilProfile((SoilLayer(0.0, 3.0, "sand", GAMMA, friction_angle_deg=PHI,
                              k_initial=100e6),))


def case(**kw):
    footing = Footing(L, D, RIGID, py_model="elastic_plastic", elements=30,
                      base_shear_stiffness=kw.pop("base", 0.0))
    return FootingCase(footing, SAND, load=5e3, load_height=E_LOAD, **kw)


def test_broms_short_pile_front_face_and_toe_reaction():
    # Closed form: 0.5 x 18000 x 0.3 x 1.5^3 x 3 / 2.5 = 10,935 N.
    expected = broms_sand_short_free_head(GAMMA, D, L, E_LOAD, PHI)
    assert expected == pytest.approx(10_935, rel=1e-6)
    push = pushover(case(one_sided=1, base=1e10))
    assert push.ultimate == pytest.approx(expected, rel=0.05)
    assert push.limit in ("plateau", "rotation limit")
    # the curve rises monotonically to the plateau and the service ratio is reported
    assert np.all(np.diff(push.load) > -1e-6 * push.ultimate)
    assert push.ratio == pytest.approx(push.ultimate / 5e3)
    # at the limit the front springs are at p_u down to near the toe
    r = push.response
    assert np.mean(r.ratio[(r.depth > 0.05) & (r.depth < 0.9 * L)] > 0.999) == 1.0


def test_rigid_pile_both_faces_matches_statics():
    q = 3 * np.tan(np.radians(45 + PHI / 2)) ** 2 * GAMMA * D  # p_u = q z

    def moment(zr):  # moments about grade, load H = q (2 zr^2 - L^2)/2 at height e
        H = q * (2 * zr**2 - L**2) / 2
        return H * E_LOAD + q * zr**3 / 3 - q * (L**3 - zr**3) / 3

    zr = brentq(moment, L / np.sqrt(2) * (1 + 1e-9), L)
    expected = q * (2 * zr**2 - L**2) / 2
    # the ratio to Broms is about 0.70 for e/L = 2/3 (0.78 at e = 0: zr = L / 2^(1/3))
    assert expected / broms_sand_short_free_head(GAMMA, D, L, E_LOAD, PHI) == pytest.approx(
        0.70, abs=0.01)
    push = pushover(case())
    assert push.ultimate == pytest.approx(expected, rel=0.03)
    assert push.response.rotation_point_depth == pytest.approx(zr, rel=0.03)


def test_rigid_limit_load_matches_statics_and_bounds_the_push():
    q = 3 * np.tan(np.radians(45 + PHI / 2)) ** 2 * GAMMA * D
    z = np.linspace(0, L, 31)
    bound = rigid_limit_load(z, q * z, E_LOAD)

    def moment(zr):  # as in test_rigid_pile_both_faces_matches_statics
        H = q * (2 * zr**2 - L**2) / 2
        return H * E_LOAD + q * zr**3 / 3 - q * (L**3 - zr**3) / 3

    zr = brentq(moment, L / np.sqrt(2) * (1 + 1e-9), L)
    assert bound == pytest.approx(q * (2 * zr**2 - L**2) / 2, rel=1e-3)
