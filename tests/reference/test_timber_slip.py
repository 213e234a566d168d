"""Eurocode 5 slip modulus (EN 1995-1-1 Table 7.1 and 2.2.2) and NDS fastener values."""
import math

import pytest

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.fasteners import (LBF, bolt, check_fits, fastener, joint_density, lateral_value,
                              nail, slip_modulus_ser, slip_modulus_ult, wood_screw)
from spanstay.models.catalogs.lumber import INCH


def test_nail_without_predrilling_table_7_1():
    # EN 1995-1-1 Table 7.1: K_ser = rho_m^1.5 d^0.8 / 30 N/mm. Hand value for
    # rho_m = 500 kg/m^3, 16d common nail d = 0.162 in = 4.1148 mm:
    # 500^1.5 = 11180.34; 4.1148^0.8 = 3.1011; K = 11180.34 * 3.1011 / 30 = 1155.7 N/mm
    f = nail("16d")
    assert f.diameter == pytest.approx(0.162 * INCH)   # ASTM F1667 (from memory)
    k = slip_modulus_ser(f, 500.0)
    assert k / 1000 == pytest.approx(11180.34 * 4.1148**0.8 / 30, rel=1e-4)
    assert k / 1000 == pytest.approx(1155.7, rel=2e-3)


def test_predrilled_screw_and_bolt_table_7_1():
    # EN 1995-1-1 Table 7.1: K_ser = rho_m^1.5 d / 23 N/mm.
    # 1/2 in bolt, d = 12.7 mm, rho_m = 450: 450^1.5 = 9545.94; K = 9545.94*12.7/23 = 5271 N/mm
    b = bolt(0.5 * INCH, 5 * INCH)
    assert slip_modulus_ser(b, 450.0) / 1000 == pytest.approx(5271.0, rel=1e-3)
    # #10 wood screw: D = 0.060 + 0.013*10 = 0.190 in (ASME B18.6.1, from memory)
    s = wood_screw("#10", 3 * INCH)
    assert s.diameter == pytest.approx(0.190 * INCH)
    assert slip_modulus_ser(s, 450.0) / 1000 == pytest.approx(9545.94 * 4.826 / 23, rel=1e-4)
    # predrilled nail uses the same line of the table
    n = nail("10d", predrilled=True)
    assert slip_modulus_ser(n, 450.0) / 1000 == pytest.approx(9545.94 * 0.148 * 25.4 / 23, rel=1e-4)


def test_ultimate_is_two_thirds_and_joint_density():
    # EN 1995-1-1 2.2.2(1): K_u = 2/3 K_ser; 7.1(2): rho_m = sqrt(rho_1 rho_2)
    f = nail("8d")
    assert slip_modulus_ult(f, 420.0) == pytest.approx(2 / 3 * slip_modulus_ser(f, 420.0))
    assert joint_density(400.0, 625.0) == pytest.approx(500.0)


def test_user_slip_modulus_wins():
    f = nail("16d").with_overrides(slip_modulus=2.0e6)
    assert slip_modulus_ser(f, 500.0) == 2.0e6
    with pytest.raises(InputError):
        nail("16d").with_overrides(slip_modulus=-1.0)


@pytest.mark.parametrize("pw,G,z_lb", [
    ("16d", 0.50, 141),  # NDS Table 12N, 1-1/2 in side member, DF-L (from memory)
    ("16d", 0.55, 154),  # NDS Table 12N, 1-1/2 in side member, southern pine (from memory)
    ("10d", 0.50, 118),  # NDS Table 12N, 1-1/2 in side member, DF-L (from memory)
])
def test_nail_lateral_value_matches_nds_table(pw, G, z_lb):
    f = nail(pw)
    z = lateral_value(f, 1.5 * INCH, 1.5 * INCH, G)
    assert z.Z / LBF == pytest.approx(z_lb, rel=0.02)
    assert z.mode == "IV"


def test_lateral_value_mode_iv_by_hand():
    # NDS 12.3.1 Eq. mode IV: Z = D^2/Rd sqrt(2 Fem Fyb / (3 (1 + Re))), Rd = 2.2 (D < 0.17 in),
    # Fe = 16600 G^1.84 psi, Fyb = 90 ksi (D = 0.162 in). G = 0.5 -> Fe = 4636 psi:
    # Z = 0.162^2/2.2 * sqrt(2*4636*90000/6) = 140.7 lb
    fe = 16600 * 0.5**1.84
    z_hand = 0.162**2 / 2.2 * math.sqrt(2 * fe * 90000 / 6)
    assert z_hand == pytest.approx(140.7, abs=0.2)
    z = lateral_value(nail("16d"), 1.5 * INCH, 1.5 * INCH, 0.5).Z / LBF
    assert z == pytest.approx(z_hand, rel=1e-6)


def test_short_penetration_and_oversize_fastener_are_input_errors():
    with pytest.raises(InputError, match="6 D"):
        lateral_value(nail("6d"), 1.5 * INCH, 1.5 * INCH, 0.5)  # 0.5 in into the main ply
    # EN 1995-1-1 8.3.1.2: t >= 7 d for nails without pre-drilling: 60d (6.68 mm) needs 46.8 mm
    with pytest.raises(InputError, match="too large"):
        check_fits(nail("60d"), 1.5 * INCH, 450.0, where="anchor[2].post.fasteners")
    check_fits(nail("16d"), 1.5 * INCH, 450.0)  # 7 d = 28.8 mm < 38.1 mm
    with pytest.raises(InputError, match="known"):
        fastener("nail", "17d")
    with pytest.raises(InputError, match="#10"):
        wood_screw("#11", 0.05)
