"""Broms (1964) short free-head piles: closed forms against direct statics.

Sources: Broms, B. B. (1964), Lateral resistance of piles in cohesionless soils,
and ... in cohesive soils, J. Soil Mech. Found. Div. ASCE 90 (SM3, SM2).
Sand: pressure 3 Kp gamma z D, back reaction lumped at the toe,
H_u = 0.5 gamma D L^3 Kp / (e + L). Clay: no resistance over 1.5 D, then 9 c D
acting forward down to the point of rotation and backward below it.
"""
import pytest
from scipy.integrate import quad
from scipy.optimize import fsolve

from spanstay.models.analysis.capacity import broms_clay_short_free_head, broms_sand_short_free_head
from spanstay.models.parts.py_curves import broms_sand_ultimate


def test_sand_hand_value():
    # gamma = 18 kN/m^3, D = 0.3 m, L = 1.5 m, e = 1.0 m, phi = 30 (Kp = 3), by hand:
    # H_u = 0.5 x 18000 x 0.3 x 1.5^3 x 3 / (1.0 + 1.5) = 27,337.5 / 2.5 = 10,935 N.
    assert broms_sand_short_free_head(18e3, 0.3, 1.5, 1.0, 30.0) == pytest.approx(10_935, rel=1e-6)


@pytest.mark.parametrize("phi, L, e", [(30.0, 1.5, 1.0), (36.0, 2.0, 3.0)])
def test_sand_matches_moment_about_toe(phi, L, e):
    # Moment about the toe of the ultimate pressure 3 Kp gamma z D (scipy quad) balances
    # H (e + L).
    gamma, D = 18e3, 0.3
    m, _ = quad(lambda z: broms_sand_ultimate(phi, D, gamma * z) * (L - z), 0, L)
    assert broms_sand_short_free_head(gamma, D, L, e, phi) == pytest.approx(m / (e + L), rel=1e-9)


@pytest.mark.parametrize("L, e", [(2.0, 0.5), (3.0, 2.0)])
def test_clay_matches_rigid_pile_statics(L, e):
    # Rigid pile, load H at height e above grade; unknowns H and x, the depth of the
    # point of rotation below 1.5 D; q = 9 c D, L' = L - 1.5 D.
    # Horizontal forces: H - q x + q (L' - x) = 0.
    # Moments about the ground line (positive in the sense of H e):
    # H e + q x (1.5 D + x/2) - q (L' - x)(1.5 D + x + (L' - x)/2) = 0.
    c, D = 30e3, 0.3
    q, lp, z0 = 9 * c * D, L - 1.5 * D, 1.5 * D

    def eqs(v):
        H, x = v
        front = q * x                  # resists H, acts at depth z0 + x/2
        back = q * (lp - x)            # pushes with H, acts at depth z0 + x + (lp - x)/2
        return [H - front + back,
                H * e + front * (z0 + x / 2) - back * (z0 + x + (lp - x) / 2)]

    H, x = fsolve(eqs, [0.3 * q * lp, 0.7 * lp], xtol=1e-12)
    assert broms_clay_short_free_head(c, D, L, e) == pytest.approx(H, rel=1e-8)
