"""Sliding of a kicker's foot block: statics of the strut and IBC Table 1806.2 by hand.

Sources:
- A strut pinned at both ends is a two-force member: the push on its foot block acts
  along its axis, so the horizontal push is C cos(theta) and the downward push
  C sin(theta) (statics).
- IBC Table 1806.2 (2012, the same in 2018/2021 from memory): sliding coefficient 0.25
  for sand (class 4), 0.35 for gravel (class 3); class 5 clay 130 psf x contact area,
  limited to half the dead load (§1806.3.2); lateral bearing 150 psf/ft for sand.
"""
import tomllib
from pathlib import Path

import numpy as np
import pytest

import spanstay
from spanstay.models.catalogs.ibc_embedment import FT, LBF, PSF
from spanstay.models.checks.sliding import block_sliding, resultant

ROOT = Path(__file__).resolve().parents[2]


def test_block_sliding_by_hand():
    # sand, no user friction: 0.25 x 2000 lbf = 500 lbf; passive 0.5 x 150 psf/ft x (1 ft)^2
    # x 1 ft = 75 lbf; (500 + 75) / 1.5 = 383.3 lbf
    demand, cap, _ = block_sliding(450 * LBF, 2000 * LBF, 2 * FT**2, 1 * FT, 1 * FT, "sand",
                                   None, 1.5)
    assert cap == pytest.approx(575 / 1.5 * LBF, rel=1e-9)
    assert demand == pytest.approx(450 * LBF) and demand > cap  # it slides
    # user friction 0.6, no embedment: 0.6 x 2000 / 1.5 = 800 lbf
    _, cap, _ = block_sliding(450 * LBF, 2000 * LBF, 2 * FT**2, FT, 0.0, "sand", 0.6, 1.5)
    assert cap == pytest.approx(800 * LBF, rel=1e-9)
    # clay: 130 psf x 2 ft^2 = 260 lbf, under half of 2000 lbf: 260 / 1.5
    _, cap, _ = block_sliding(0.0, 2000 * LBF, 2 * FT**2, FT, 0.0, "clay", None, 1.5)
    assert cap == pytest.approx(260 / 1.5 * LBF, rel=1e-9)
    # ... and limited to half of a small dead load (300 lbf -> 150 lbf)
    _, cap, _ = block_sliding(0.0, 300 * LBF, 2 * FT**2, FT, 0.0, "clay", None, 1.0)
    assert cap == pytest.approx(150 * LBF, rel=1e-9)
    assert cap == pytest.approx(0.5 * 300 * LBF)
    # gravel 0.35 x 1000 lbf = 350 lbf
    _, cap, _ = block_sliding(0.0, 1000 * LBF, 1.0, FT, 0.0, "GW", None, 1.0)
    assert cap == pytest.approx(350 * LBF, rel=1e-9)
    assert PSF > 0


@pytest.mark.parametrize("deadman", [True, False])
def test_kicker_block_push_follows_the_strut_axis(deadman):
    data = tomllib.loads((ROOT / "examples" / "h-brace.toml").read_text("utf-8"))
    brace = data["anchor"][1]["brace"]
    if not deadman:  # the block on the surface
        del brace["block_depth"]
    data["ride"]["single_rider"] = True  # the design pass governs (no two-rider case)
    r = spanstay.analyse(data, stations=3, slack_budget=False, workers=1)
    from spanstay.models.parts.braces import member_axial_force

    system = r.design_system or r.system
    kicker = system.anchors["landing"].brace
    state = r.passes["design"].states[-1]
    c = -float(np.min(member_axial_force(state, kicker.strut)))
    theta = np.arcsin(abs(kicker.strut.axis[2]))
    h, down = resultant(state.reactions[kicker.block_node, :3])
    assert h == pytest.approx(c * np.cos(theta), rel=2e-3)
    assert down == pytest.approx(c * np.sin(theta), rel=2e-3)
    (check,) = [k for k in r.checks if k.id == "anchor.landing.kicker_block_on_soil.sliding"]
    # a two-force strut pushes down h tan(theta) with its push h: on sand (0.25, class 4)
    # the block holds (0.25 h tan(theta) + passive) / 1.5, the passive force of a 36 in
    # block 3 ft deep 0.5 x 150 psf/ft x (3 ft)^2 x 3 ft = 2,025 lbf
    passive = 2025 * LBF if deadman else 0.0
    hd = check.demand
    assert check.utilization == pytest.approx(
        hd / ((0.25 * hd * np.tan(theta) + passive) / 1.5), rel=2e-3)
    assert check.passed == deadman
