"""Lateral soil springs act on the horizontal displacement vector: the same footing pulled
at 45 degrees in plan and along x gives the same response in nonlinear soil, and a whole
scenario turned in plan gives the same results.

References:
- Isotropy in plan: a homogeneous soil has no preferred horizontal direction, so the
  response of a vertical footing to a load of given size cannot depend on the load's
  plan direction (rotational symmetry; the reference solution is the same footing loaded
  along x, where the x-only springs of the hand methods are exact).
- The spring tangent against scipy's numerical derivative of its force
  (scipy.optimize.approx_fprime, forward differences).
"""
import math
import tomllib
from pathlib import Path

import numpy as np
import pytest
from scipy.optimize import approx_fprime

import spanstay
from spanstay.fem import solve
from spanstay.fem.planar_spring import PlanarSpringGroup
from spanstay.models.catalogs.soil import SoilLayer, SoilProfile, preset_layer
from spanstay.models.parts.footing import Footing, concrete_pier_section, footing_response
from spanstay.models.parts.footing_case import FootingCase, build_case_model
from spanstay.models.parts.py_curves import curves_for_profile

ROOT = Path(__file__).resolve().parents[2]
SAND = SoilProfile((preset_layer("medium_dense_sand", 0.0, 4.0),))
CLAY = SoilProfile((SoilLayer(0.0, 4.0, "clay", 17e3, undrained_shear_strength=30e3,
                              eps50=0.01),))


def _solve_at(profile, angle_deg: float, load: float, loading: str = "static"):
    footing = Footing(1.8, 0.6, concrete_pier_section(0.6), kind="pier", elements=30)
    profile = SoilProfile(tuple(SoilLayer.from_spec(lay, loading=loading)
                                for lay in profile.layers))
    case = FootingCase(footing, profile, load, load_height=1.5,
                       post_section=concrete_pier_section(0.3))
    m, placed, node = build_case_model(case)
    a = math.radians(angle_deg)
    m.add_load(node, [load * math.cos(a), load * math.sin(a), 0, 0, 0, 0])
    state = solve(m, factor=1.0, steps=8)
    # statics: the ground's reactions (toe support and soil springs) balance the load
    total = state.reactions[:, :3].sum(axis=0)
    assert total[:2] == pytest.approx([-load * math.cos(a), -load * math.sin(a)],
                                      abs=1e-6 * load)
    resp = footing_response(placed, m, state, (math.cos(a), math.sin(a)))
    return resp, float(np.hypot(*state.translation[node][:2]))


# loads about 70 % of each footing's pushover ultimate (25, 14, 18 and 15 kN)
@pytest.mark.parametrize("profile,load,loading", [(SAND, 17e3, "static"), (SAND, 10e3, "cyclic"),
                                                  (CLAY, 13e3, "static"), (CLAY, 10e3, "cyclic")])
def test_45_degree_pull_equals_the_same_pull_along_x(profile, load, loading):
    along_x, top_x = _solve_at(profile, 0.0, load, loading)
    turned, top_45 = _solve_at(profile, 45.0, load, loading)
    # the soil is well into its nonlinear range (else the test would prove nothing)
    assert along_x.max_ratio > 0.5
    # isotropy in plan (module docstring): same response to 0.5 %
    assert turned.ground_displacement == pytest.approx(along_x.ground_displacement, rel=5e-3)
    assert turned.ground_rotation == pytest.approx(along_x.ground_rotation, rel=5e-3)
    assert turned.max_ratio == pytest.approx(along_x.max_ratio, rel=5e-3)
    assert turned.max_moment == pytest.approx(along_x.max_moment, rel=5e-3)
    assert top_45 == pytest.approx(top_x, rel=5e-3)


def test_planar_tangent_is_the_derivative_of_its_force():
    curves = curves_for_profile(SAND, np.array([0.3, 0.9, 1.5]), 0.5, 0.2)
    group = PlanarSpringGroup("soil", np.arange(3), curves)
    disp0 = np.zeros((3, 6))
    disp0[:, :2] = [[0.004, -0.002], [-0.01, 0.03], [0.0007, 0.0001]]
    x, rot = np.zeros((3, 3)), np.repeat(np.eye(3)[None], 3, axis=0)
    k = group.evaluate(x, rot, disp0).tangent
    for i in range(3):
        for j in range(2):
            def fj(u2, i=i, j=j):
                d = disp0.copy()
                d[i, :2] = u2
                return group.evaluate(x, rot, d, tangent=False).force[i, j]
            # scipy's forward difference of the force (module docstring)
            num = approx_fprime(disp0[i, :2], fj, 1e-9)
            assert k[i, j] == pytest.approx(num, rel=1e-4, abs=1e-3 * np.abs(k[i]).max())


def _turned(data: dict, angle_deg: float) -> dict:
    """The scenario turned about the origin in plan: positions and plan directions."""
    from spanstay.models.common.units import parse_quantity

    a = math.radians(angle_deg)
    for anchor in data["anchor"]:
        x, y = (parse_quantity(v, "length", "test") for v in anchor["position"])
        anchor["position"] = [f"{x * math.cos(a) - y * math.sin(a)!r} m",
                              f"{x * math.sin(a) + y * math.cos(a)!r} m"]
        for table in anchor.get("guy", []) + [anchor.get("brace", {})]:
            if "direction" in table:
                turned = math.degrees(parse_quantity(table["direction"], "angle", "test"))
                table["direction"] = f"{turned + angle_deg!r} deg"
    return data


@pytest.mark.parametrize("example", ["orchard-family-line.toml", "guyed-post.toml"])
def test_a_scenario_turned_in_plan_changes_nothing_but_coordinates(example):
    text = (ROOT / "examples" / example).read_text("utf-8")
    data = tomllib.loads(text)
    base = spanstay.analyse(tomllib.loads(text), stations=4, slack_budget=False, workers=1)
    turned = spanstay.analyse(_turned(data, 45.0), stations=4, slack_budget=False, workers=1)
    for name, p in base.passes.items():
        q = turned.passes[name]
        assert [s.tension_max for s in q.stations] == pytest.approx(
            [s.tension_max for s in p.stations], rel=5e-3)
        assert [s.sag for s in q.stations] == pytest.approx([s.sag for s in p.stations], rel=5e-3)
    ub = {c.id: c.utilization for c in base.checks}
    ut = {c.id: c.utilization for c in turned.checks}
    assert ut.keys() == ub.keys()
    for key, value in ub.items():
        assert ut[key] == pytest.approx(value, rel=5e-3, abs=1e-6), key
