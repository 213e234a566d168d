"""Concrete pier strength (ACI 318-19) by hand and by an independent fibre section.

Sources (ACI 318-19, from memory):
- §14.5.2.1 plain concrete M_n = 5 lambda sqrt(f'c) S_m, h taken 2 in less when cast
  against soil (§14.5.1.7), phi = 0.60 (Table 21.2.1); §14.5.5.1 V_n = 4/3 sqrt(f'c) b_w h.
- §22.2 strain compatibility with the 0.85 f'c rectangular block over beta1 c
  (Table 22.2.2.4.3: beta1 = 0.85 to 4000 psi), eps_cu = 0.003, phi by Table 21.2.2.
- Table 22.5.5.1(c): V_c = 8 lambda_s rho_w^(1/3) sqrt(f'c) b_w d; §22.5.2.2 round
  sections b_w = D, d = 0.8 D.
The fibre section is a grid of concrete cells (block stress where the cell lies within
beta1 c of the compression face) and the bars, its neutral axis found with scipy brentq.
"""
import math

import numpy as np
import pytest
from scipy.optimize import brentq

from spanstay.models.checks.concrete import (beta1, plain_strength, reinforced_flexure,
                                             reinforced_shear)

PSI, IN, LBF = 6894.757, 0.0254, 4.4482216152605
LBF_FT = LBF * 0.3048


def test_plain_pier_by_hand():
    # D = 24 in, f'c = 3000 psi: h = 22 in, S_m = pi 22^3 / 32 = 1045.4 in^3,
    # M_n = 5 x 54.772 x 1045.4 = 286,300 lbf in; phi M_n = 171,780 lbf in = 14,315 lbf ft
    phi_m, phi_v = plain_strength(24 * IN, 3000 * PSI)
    assert phi_m / LBF_FT == pytest.approx(14_315, rel=1e-3)
    # V_n = 4/3 x 54.772 x (pi 22^2 / 4 = 380.13 in^2) = 27,762 lbf; phi V_n = 16,657 lbf
    assert phi_v / LBF == pytest.approx(16_657, rel=1e-3)


def _fibre_moment(D, fc, n, ab, rs, fy, es=200e9, cells=400):
    r = D / 2
    y = np.linspace(-r, r, cells + 1)
    y = 0.5 * (y[1:] + y[:-1])
    Y, X = np.meshgrid(y, y)
    inside = X**2 + Y**2 <= r * r
    dA = (D / cells) ** 2
    depth_c = (r - Y)[inside]  # depth of each cell below the compression face
    ang = 2 * np.pi * np.arange(n) / n
    dbar = r - rs * np.cos(ang)
    b1 = 0.85 if fc <= 4000 * PSI else beta1(fc)

    def parts(c):
        conc = np.where(depth_c <= b1 * c, 0.85 * fc, 0.0)
        fs = np.clip(es * 0.003 * (c - dbar) / c, -fy, fy) - np.where(dbar <= b1 * c, 0.85 * fc, 0)
        return conc, fs

    def net(c):
        conc, fs = parts(c)
        return conc.sum() * dA + (fs * ab).sum()

    c = brentq(net, 1e-4 * D, D)
    conc, fs = parts(c)
    return float((conc * (r - depth_c)).sum() * dA + (fs * ab * (r - dbar)).sum())


def test_reinforced_round_pier_against_a_fibre_section():
    D, fc, fy = 24 * IN, 3000 * PSI, 60_000 * PSI
    ab = 0.31 * IN**2  # #5
    rs = D / 2 - 3 * IN - 0.3125 * IN
    phi_m, mn, phi = reinforced_flexure(D, fc, 6, ab, rs, fy)
    assert mn == pytest.approx(_fibre_moment(D, fc, 6, ab, rs, fy), rel=1e-2)
    assert phi == pytest.approx(0.90)  # lightly reinforced: tension-controlled
    # by hand: bars at depths 3.31, 7.66 (2), 16.34 (2), 20.69 in; the three far bars
    # yield, 3 x 0.31 x 60 = 55.8 kip, lever about 17.8 - 1.5 = 16.3 in: 909 kip in; the
    # two bars at 7.66 in are in tension too and add to it
    assert 909e3 < mn / (LBF * IN) < 1.3 * 909e3
    # shear without stirrups: b_w = 24 in, d = 19.2 in, rho = 1.86 / 460.8 = 0.00404,
    # lambda_s = sqrt(2 / 2.92) = 0.8276; V_c = 8 x 0.8276 x 0.1592 x 54.77 x 460.8 = 26,600
    # lbf; phi V_c = 19,950 lbf
    assert reinforced_shear(D, fc, 6 * ab) / LBF == pytest.approx(19_950, rel=3e-3)


def test_beta1_table():
    assert beta1(3000 * PSI) == pytest.approx(0.85)
    assert beta1(5000 * PSI) == pytest.approx(0.80)
    assert beta1(9000 * PSI) == pytest.approx(0.65)
    assert math.isfinite(beta1(4000 * PSI))


def test_pier_check_demand_by_statics():
    # a lateral load H at height e on a pier: the moment just below grade is H e
    # (statics) and the largest moment down the pier lies between H e and H (e + L);
    # the check multiplies it by the load factor (ASCE 7 live, 1.6)
    from types import SimpleNamespace as NS

    from spanstay.fem import solve
    from spanstay.models.catalogs.soil import SoilProfile, preset_layer
    from spanstay.models.checks.concrete import pier_checks
    from spanstay.models.parts.footing import Footing, concrete_pier_section
    from spanstay.models.parts.footing_case import FootingCase, build_case_model

    D, L, e, H = 0.6, 2.4, 1.5, 12e3
    soil = SoilProfile((preset_layer("medium_dense_sand", 0.0, 4.0),))
    footing = Footing(L, D, concrete_pier_section(D), kind="pier", elements=30)
    m, placed, node = build_case_model(FootingCase(footing, soil, H, e,
                                                   post_section=concrete_pier_section(0.3)))
    m.add_load(node, [H, 0, 0, 0, 0, 0])
    state = solve(m, factor=1.0, steps=4)
    anchor = NS(footing=placed, spec=NS(name="p", footing=NS(
        pier_diameter=D, concrete_strength=3000 * PSI, reinforcement=None)))
    system = NS(model=m, scenario=NS(settings=NS(concrete_load_factor=1.6)))
    flex, shear = pier_checks(system, anchor, state, {})
    assert H * e * 1.6 <= flex.demand * (1 + 1e-6) <= H * (e + L) * 1.6
    assert flex.capacity == pytest.approx(plain_strength(D, 3000 * PSI)[0])
    # at least 1.6 x 18 kN m against phi M_n = 18.4 kN m (by hand as above): it fails
    assert not flex.passed and "plain concrete pier over capacity: reinforce" in flex.note
    assert shear.demand >= H * 1.6 * (1 - 1e-6)  # the shear just below grade is H
