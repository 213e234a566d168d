"""Two lines on a shared anchor: each line's heaviest rider is stepped in turn."""
import math

import numpy as np
import pytest

from spanstay.models.checks.structural import structural_checks
from spanstay.models.api import analyse
from spanstay.models.scenario.read import read_scenario

ANGLE = math.radians(35.0)  # plan angle of the second line from the first


def two_line_scenario():
    pole = {"kind": "round", "height": "14 ft", "top_diameter": "10 in", "base_diameter": "12 in",
            "species": "southern pine"}
    far = (80 + 60 * math.cos(ANGLE), 60 * math.sin(ANGLE))
    data = {
        "project": {"name": "two lines on one pole (test)"},
        "line": [{"name": "first", "from": "a", "to": "mid", "from_height": "12 ft", "to_height": "10 ft",
                  "rope": "7x19-galv-3/8", "sag": "1.5 ft", "segments": 16},
                 {"name": "second", "from": "mid", "to": "c", "from_height": "12 ft", "to_height": "9 ft",
                  "rope": "7x19-galv-3/8", "sag": "1.2 ft", "segments": 16}],
        "rider": {"line": "first", "lightest": "60 lbf", "heaviest": "200 lbf", "hang_distance": "4 ft"},
        "ground": {"profile": [["0 ft", "0 ft"], ["80 ft", "-2 ft"]],
                   "soil": [{"preset": "stiff_clay", "top": "0 ft", "bottom": "20 ft"}]},
        "anchor": [
            {"name": "a", "position": ["0 ft", "0 ft"], "grade": "0 ft", "post": pole,
             "footing": {"kind": "fixed"}},
            {"name": "mid", "position": ["80 ft", "0 ft"], "grade": "-2 ft", "post": pole,
             "footing": {"kind": "fixed"}},
            {"name": "c", "position": [f"{far[0]} ft", f"{far[1]} ft"], "grade": "-4 ft", "post": pole,
             "footing": {"kind": "fixed"}},
        ],
    }
    return read_scenario(data)


@pytest.fixture(scope="module")
def result():
    return analyse(two_line_scenario(), stations=5, slack_budget=False)


def test_second_line_gets_its_own_design_pass(result):
    p = result.passes["design-second"]
    assert len(p.stations) == 5 and p.failed_at is None
    # statics: with the rider on the second line the shared pole leans toward that
    # line's far end (the plan direction of its pull)
    pull = np.array([math.cos(ANGLE), math.sin(ANGLE)])
    with_rider = np.array([st.anchor_disp["mid"][:2] for st in p.stations])
    first = result.passes["design"]
    assert np.all(with_rider @ pull > np.array([st.anchor_disp["mid"][:2] for st in first.stations]) @ pull)


def test_shared_anchor_checks_keep_the_worse_line(result):
    per_pass = {label: {c.id: c for c in structural_checks(result.system, result.passes[label],
                                                            installed=result.installed)}
                for label in [c.name for c in result.cases if c.purpose == "strength"]}
    merged = {c.id: c for c in result.checks}
    compared = 0
    for cid in per_pass["design"]:
        if ".mid." not in cid or per_pass["design"][cid].utilization is None:
            continue
        compared += 1
        expected = max(per_pass[label][cid].utilization for label in per_pass if cid in per_pass[label])
        assert merged[cid].utilization == pytest.approx(expected, rel=1e-12)
    assert compared >= 3
