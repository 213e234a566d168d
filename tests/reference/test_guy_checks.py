"""Guy checks: rope capacity, ground-anchor pull, slack and pull-out findings.

Sources: FAA AC 43.13-1B Table 7-3 (7x19 galvanized 1/4 in, 7,000 lb minimum
breaking strength; references.md); factor of safety 5 on breaking strength
(common practice); termination efficiency 0.8 for clipped ends (from memory);
statics for the guy forces (see test_guy_statics).
"""
import numpy as np
import pytest

from spanstay.fem import solve
from spanstay.models.checks.anchors import guy_checks, rope_capacity
from spanstay.models.parts.guys import add_guy
from tests.reference.test_guy_statics import guy_spec, pinned_post

LBF = 4.4482216152605


def test_rope_capacity_of_quarter_inch_aircraft_cable():
    assert rope_capacity(7000 * LBF, 0.8, 5.0) == pytest.approx(1120 * LBF, rel=1e-12)


def test_guy_checks_report_tension_pull_out_and_slack_as_findings():
    # Two opposed guys at the top of a pinned post, P toward the front guy: the front
    # goes slack, the back carries P / cos(alpha) (statics) and its ground anchor,
    # rated below that, is reported pulled out: findings, no error.
    H, b, P = 3.0, 2.5, 4000.0
    m, nodes = pinned_post(H)
    top = int(nodes[-1])
    back = add_guy(m, top, guy_spec((-b, 0, 0), H, pretension=200.0, stiffness=2e6,
                                    capacity=4000.0), name="back")
    front = add_guy(m, top, guy_spec((b, 0, 0), H, pretension=200.0), name="front")
    m.add_load(top, [P, 0, 0])
    st = solve(m, steps=4)
    checks = guy_checks("yard", [back, front], m, st, factor_of_safety=5.0)
    by = {(c.part, c.check): c for c in checks}
    T = P * np.hypot(H, b) / b
    rope = by[("guy 1", "tension vs rope strength")]
    assert rope.demand == pytest.approx(T, rel=1e-2)  # the guy turns as it stretches 9 mm
    assert rope.capacity == pytest.approx(1120 * LBF, rel=1e-6)  # catalog MBS, 0.8, FoS 5
    assert rope.utilization == pytest.approx(rope.demand / (1120 * LBF), rel=1e-9)
    pull = by[("guy 1 ground anchor", "pull along the guy vs capacity")]
    assert pull.demand == rope.demand and not pull.passes
    assert pull.finding.startswith("pulled out")
    slack = by[("guy 2", "tension vs rope strength")]
    assert slack.demand == 0.0 and slack.passes and slack.finding.startswith("slack")
