"""Strength checks of laminated posts use the ultimate slip modulus K_u = 2/3 K_ser
(EN 1995-1-1, 2.2.2); the ride and deflections use K_ser."""
from pathlib import Path

import numpy as np
import pytest

from spanstay.models.api import analyse
from spanstay.models.scenario.read import load_scenario

LAYOUT = Path(__file__).resolve().parents[2] / "models" / "scenario" / "layouts" / "two-posts.toml"


@pytest.fixture(scope="module")
def result():
    return analyse(load_scenario(LAYOUT), stations=3, slack_budget=False)


def test_design_pass_runs_on_posts_with_ultimate_slip(result):
    name = "launch.post.joints"
    k_ser = result.system.model.group(name).k
    k_u = result.design_system.model.group(name).k
    slip = k_ser[:, 1:3] > 0  # directions along the joint with fasteners
    assert np.any(slip)
    assert np.allclose(k_u[:, 1:3][slip] / k_ser[:, 1:3][slip], 2.0 / 3.0, rtol=1e-12)
    # across the joint the plies bear on each other the same in both
    assert np.allclose(k_u[:, 0], k_ser[:, 0])

