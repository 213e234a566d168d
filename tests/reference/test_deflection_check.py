"""The attachment deflection check for a line that does not run along x, and for a post
holding two lines at different heights (the limit: height of the highest line over 40,
a judgement of ours).

The post is a 4x8 Douglas fir-larch No. 2 clamped at grade, 3 m tall; its top moves as a
cantilever beam-column under the horizontal pull H and compression P of the cable
(Timoshenko & Gere, Theory of Elastic Stability: d = H (tan u - u) / (P k), k^2 = P / EI,
u = k L), plus shear H L / (G A_s) with E/G = 16 and A_s = 5/6 A (as test_checks_post).
"""
import math

import numpy as np
import pytest

from spanstay.models.analysis.installed import install
from spanstay.models.checks.deflection import deflection_checks
from spanstay.models.scenario.read import read_scenario

PSI, INCH = 6894.757293168361, 0.0254
HEIGHT, ANGLE = 3.0, math.radians(40.0)
SAWN = {"kind": "sawn", "height": f"{HEIGHT} m", "nominal": "4x8",
        "species": "douglas fir-larch", "grade": "No. 2"}
STIFF = {"kind": "sawn", "height": f"{HEIGHT} m", "nominal": "8x8",
         "species": "douglas fir-larch", "grade": "No. 1"}


def anchor(name, x, y, post):
    return {"name": name, "position": [f"{x} m", f"{y} m"], "post": post,
            "footing": {"kind": "fixed"}}


def line(name, a, b, h_a, h_b):
    return {"name": name, "from": a, "to": b, "from_height": f"{h_a} m", "to_height": f"{h_b} m",
            "rope": "7x19-galv-3/8", "tension": "3 kN", "segments": 12}


def test_deflection_of_a_line_at_40_degrees_in_plan_is_the_beam_column_value():
    far = (20 * math.cos(ANGLE), 20 * math.sin(ANGLE))
    sc = read_scenario({
        "settings": {"install_temperature": "15 degC"},
        "line": [line("main", "a", "b", HEIGHT, HEIGHT)],
        "rider": {"lightest": "30 kg", "heaviest": "80 kg", "hang_distance": "1.5 m"},
        "ground": {"profile": [["0 m", "0 m"], ["20 m", "0 m"]]},
        "anchor": [anchor("a", 0, 0, SAWN), anchor("b", *far, STIFF)]})
    system, state, _ = install(sc)
    (check,) = deflection_checks(system, system.anchors["a"], state)
    bl = system.lines["main"]
    pos = system.model.coords + state.translation
    e = (pos[bl.nodes[1]] - pos[bl.nodes[0]]) / np.linalg.norm(pos[bl.nodes[1]] - pos[bl.nodes[0]])
    force = state.group(bl.group).tension[0] * e
    force[2] -= 0.5 * bl.spec.rope.weight_per_length * bl.segment_lengths(None)[0]
    H, P = float(np.hypot(force[0], force[1])), -float(force[2])
    b, d = 3.5 * INCH, 7.25 * INCH
    EI = 1_600_000 * PSI * b * d**3 / 12      # NDS Supplement Table 4A, E (from memory)
    GA = 1_600_000 * PSI / 16 * 5 / 6 * b * d
    k = math.sqrt(P / EI)
    u = k * HEIGHT
    hand = H * (math.tan(u) - u) / (P * k) + H * HEIGHT / GA
    assert check.demand == pytest.approx(hand, rel=2e-2)
    assert check.capacity == pytest.approx(HEIGHT / 40, rel=1e-12)


def test_two_lines_take_the_limit_of_the_higher_attachment():
    sc = read_scenario({
        "settings": {"install_temperature": "15 degC"},
        "line": [line("upper", "a", "b", HEIGHT, HEIGHT), line("lower", "a", "c", 2.0, 2.0)],
        "rider": {"line": "upper", "lightest": "30 kg", "heaviest": "80 kg",
                  "hang_distance": "1.5 m"},
        "ground": {"profile": [["0 m", "0 m"], ["20 m", "0 m"]]},
        "anchor": [anchor("a", 0, 0, STIFF), anchor("b", 20, 0, STIFF),
                   anchor("c", -20, 0, STIFF)]})
    system, state, _ = install(sc)
    (check,) = deflection_checks(system, system.anchors["a"], state)
    assert check.capacity == pytest.approx(HEIGHT / 40, rel=1e-12)
    node = system.anchors["a"].node_at(HEIGHT)
    assert check.demand == pytest.approx(float(np.hypot(*state.translation[node][:2])), rel=1e-12)
    low = system.anchors["a"].node_at(2.0)
    assert abs(np.hypot(*state.translation[low][:2]) - check.demand) > 1e-3 * check.demand
