"""End bearing and uplift of a footing: statics of a pier and side friction by hand.

Sources:
- Vertical equilibrium of a pier held at its toe (statics): the toe reaction equals the
  vertical load at grade; the load down the footing is P + pier weight + post weight,
  against presumptive bearing x base area + side friction / factor of safety.
- IBC Table 1806.2 presumptive vertical pressure: sand 2,000 psf, clay 1,500 psf.
- Side friction, integrated by hand: sand f = (1 - sin phi) gamma z tan(phi) (Jaky K0,
  delta = phi for concrete cast against soil), clay f = alpha c with API RP 2A
  alpha = 0.5 psi^-0.5 for psi = c / sigma'_v <= 1 (from memory).
"""
import math
from types import SimpleNamespace as NS

import numpy as np
import pytest

from spanstay.fem import solve
from spanstay.models.catalogs.ibc_embedment import PSF
from spanstay.models.catalogs.soil import SoilLayer, SoilProfile
from spanstay.models.checks.vertical import (CONCRETE_UNIT_WEIGHT, TIMBER_DENSITY_UPPER,
                                             side_friction, vertical_checks)
from spanstay.models.parts.footing import Footing, concrete_pier_section
from spanstay.models.parts.footing_case import FootingCase, build_case_model

D, L = 0.6, 2.0
GAMMA, PHI = 18e3, 32.0
SAND = SoilProfile((SoilLayer(0.0, 3.0, "sand", GAMMA, friction_angle_deg=PHI, k_initial=30e6,
                              ibc_class="sand"),))


def _run(vertical: float):
    footing = Footing(L, D, concrete_pier_section(D), kind="pier", elements=20)
    m, placed, node = build_case_model(FootingCase(footing, SAND, 1.0, 1.0,
                                                   post_section=concrete_pier_section(0.25)))
    m.add_load(node, [0, 0, vertical, 0, 0, 0])
    state = solve(m, factor=1.0, steps=1)
    post = NS(kind="round", height=3.0, top_diameter=0.25, base_diameter=0.25,
              outline=(0.25, 0.25))
    anchor = NS(footing=placed, spec=NS(name="p", post=post,
                                        footing=NS(kind="pier", pier_diameter=D, depth=L)))
    system = NS(scenario=NS(settings=NS(uplift_factor_of_safety=2.0)))
    return {c.id.rsplit(".", 1)[1]: c for c in vertical_checks(system, anchor, state, {})}


def _sand_friction():
    # friction from 1.5 D = 0.9 m to 2.0 m: pi D (1 - sin phi) tan phi gamma (L^2 - z0^2) / 2
    z0, ph = 1.5 * D, math.radians(PHI)
    return math.pi * D * (1 - math.sin(ph)) * math.tan(ph) * GAMMA * (L**2 - z0**2) / 2


def test_pier_bearing_by_statics():
    p = 40e3
    checks = _run(-p)
    area = math.pi * D**2 / 4
    pier = CONCRETE_UNIT_WEIGHT * area * L
    post = TIMBER_DENSITY_UPPER * 9.80665 * math.pi * 0.25**2 / 4 * 3.0
    bearing = checks["end_bearing"]
    assert bearing.demand == pytest.approx(p + pier + post, rel=1e-6)
    # 2000 psf x 0.283 m^2 = 27.1 kN, + 8.2 kN / 2 of friction
    assert bearing.capacity == pytest.approx(2000 * PSF * area + _sand_friction() / 2, rel=1e-3)
    assert not bearing.passed  # about 54 kN down against 31 kN
    assert checks["uplift"].demand == 0.0


def test_pier_uplift_by_statics_and_hand_friction():
    pull = 30e3
    checks = _run(+pull)
    up = checks["uplift"]
    assert up.demand == pytest.approx(pull, rel=1e-6)
    qs = _sand_friction()
    pier = CONCRETE_UNIT_WEIGHT * math.pi * D**2 / 4 * L
    assert up.capacity == pytest.approx(pier + qs / 2.0, rel=1e-3)
    assert not up.passed  # 30 kN against about 13.3 kN + 4.1 kN


def test_clay_side_friction_alpha_method_by_hand():
    c, gamma = 20e3, 17e3
    clay = SoilProfile((SoilLayer(0.0, 5.0, "clay", gamma, undrained_shear_strength=c,
                                  eps50=0.01),))
    z0, depth, width = 0.45, 4.0, 0.3
    # psi = c / (gamma z) <= 1 below z = c / gamma = 1.18 m, where f = 0.5 sqrt(c gamma z),
    # integral 0.5 sqrt(c gamma) (2/3) z^1.5; alpha reaches its cap 1 at gamma z = 4 c
    z1 = min(4 * c / gamma, depth)
    lower = 0.5 * math.sqrt(c * gamma) * (2 / 3) * (depth**1.5 - max(z0, c / gamma)**1.5)
    # between z0 and c/gamma psi > 1: alpha = 0.5 psi^-0.25 (< 1 since psi > 1/16)
    zz = np.linspace(z0, c / gamma, 20001)
    mid = 0.5 * (zz[1:] + zz[:-1])
    upper = np.sum(0.5 * (c / (gamma * mid)) ** -0.25 * c * np.diff(zz))
    # alpha capped at 1 where 0.5 psi^-0.5 > 1, i.e. psi < 1/4: z > 4 c / gamma
    cap_corr = 0.0
    if z1 < depth:
        cap_corr = (0.5 * math.sqrt(c * gamma) * (2 / 3) * (depth**1.5 - z1**1.5)
                    - c * (depth - z1))
    expected = math.pi * width * (upper + lower - cap_corr)
    got = side_friction(clay, depth, width, math.pi * width, cast=True, points=4000)
    assert got == pytest.approx(expected, rel=2e-3)
