"""Trolley lift-off as a check and the loaded sag ratio: the normal force on a crest
against the closed form of circular motion, and a sagging line that keeps it on."""
from __future__ import annotations

from types import SimpleNamespace

import numpy as np
import pytest

from spanstay.models.analysis.ride import ride_speed
from spanstay.models.checks.lift_off import lift_off_checks

G = 9.80665


def crest_result(radius: float, start_speed: float):
    # a circular crest of the given radius, no friction or drag
    theta = np.linspace(-0.2, 0.2, 401)
    x, z = radius * np.sin(theta), radius * (np.cos(theta) - 1.0)
    ride = ride_speed(x - x[0], z, 100.0, rolling_resistance=0.0, drag_area=0.0,
                      start_speed=start_speed)
    p = SimpleNamespace(complete=True, weight=100.0 * G, stations=[])
    result = SimpleNamespace(scenario=SimpleNamespace(rider=SimpleNamespace(line="l")),
                             rides={"lightest": ride, "heaviest": ride},
                             passes={"ride_light": p, "ride_heavy": p})
    return result, ride, theta, z




@pytest.mark.parametrize("radius, v0, passes", [(20.0, 3.0, True), (5.0, 8.0, False)])
def test_lift_off_on_a_crest_against_circular_motion(radius, v0, passes):
    # Circular motion (Newton's second law on the path) with energy conservation:
    # N / (m g) = cos(theta) - v^2 / (g R), v^2 = v0^2 + 2 g (z0 - z); least over the crest
    result, ride, theta, z = crest_result(radius, v0)
    v2 = v0 ** 2 + 2.0 * G * (z[0] - z)
    expected = float(np.min(np.cos(theta[1:-1]) - v2[1:-1] / (G * radius)))
    checks, missing = lift_off_checks(result)
    assert not missing
    c = checks[0]
    assert c.capacity == pytest.approx(expected, abs=0.01)
    assert c.passed is passes and (c.utilization > 1.0) is (not passes)
