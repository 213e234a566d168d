"""The ride checks from ride results worked by energy: a frictionless trolley from rest
reaches speed sqrt(2 g dz) (Galileo), and stops where the profile climbs back to its
starting height; the feet clear a flat ground by the profile's low point less the hang.
The limits are given here (0.15 m of clearance, 5 m/s arrival: our judgements)."""
from __future__ import annotations

from types import SimpleNamespace

import numpy as np
import pytest

from spanstay.models.analysis.clearance import feet_clearance
from spanstay.models.analysis.ride import ride_speed
from spanstay.models.checks.ride import ride_checks

G0 = 9.80665
X = np.linspace(0.0, 60.0, 121)


def result(z_light, z_heavy, hang, ground_z=0.0):
    light, heavy = ride_speed(X, z_light, 40.0), ride_speed(X, z_heavy, 100.0)
    gd, gz = np.array([-5.0, 65.0]), np.array([ground_z, ground_z])
    worst = min((feet_clearance(X, z, hang, gd, gz) for z in (z_light, z_heavy)),
                key=lambda c: c.minimum)
    done = SimpleNamespace(complete=True, stations=[0, 1, 2], weight=1000.0)
    limits = SimpleNamespace(arrival_speed_limit=5.0, min_feet_clearance=0.15,
                             brake=SimpleNamespace(kind="none"),
                             source=lambda key: "our judgement")
    return SimpleNamespace(scenario=SimpleNamespace(rider=SimpleNamespace(line="main"),
                                                    ride=limits),
                           rides={"lightest": light, "heaviest": heavy},
                           passes={"ride_light": done, "ride_heavy": done},
                           clearance=worst, clearance_pass="ride_heavy")


def checks_of(res):
    out, missing = ride_checks(res)
    return {c.id: c for c in out}, missing


def test_fastest_arrival_governs_and_equals_the_energy_speed():
    # light rider's profile falls 2.2 m to the end, the heavy one's 1.0 m
    z_light = 6.0 - 2.2 * X / 60.0
    z_heavy = 6.0 - 1.0 * X / 60.0
    checks, missing = checks_of(result(z_light, z_heavy, 1.5))
    assert not missing
    arrive = checks["ride.arrival_speed"]
    assert arrive.demand == pytest.approx(np.sqrt(2 * G0 * 2.2), rel=2e-3)   # 6.57 m/s
    assert arrive.capacity == 5.0 and not arrive.passed
    assert arrive.governing["pass"] == "ride_light"
    assert checks["ride.lightest.arrives"].passed


def test_a_rider_who_stops_short_fails_the_arrival_check_where_energy_runs_out():
    # down and up again past the start's height: z = 6 - 0.1 x + 0.002 x^2 is back at 6 m
    # at x = 50 m, so the lightest rider stops there, 10 m short of the end
    z = 6.0 - 0.1 * X + 0.002 * X**2
    checks, _ = checks_of(result(z, z, 1.5))
    arrives = checks["ride.lightest.arrives"]
    assert arrives.demand == pytest.approx(60.0)
    assert arrives.capacity == pytest.approx(50.0, abs=0.5)
    assert not arrives.passed and arrives.utilization == pytest.approx(1.2, abs=0.015)


@pytest.mark.parametrize("hang,passes", [(4.0, True), (4.9, False)])
def test_clearance_utilization_is_the_limit_over_the_least_clearance(hang, passes):
    # lowest point of the profile z = 6 - 0.2 x + 0.002 x^2: x = 50 m, z = 1 m; flat
    # ground at -4 m, so the feet clear it by 5 m less the hang
    z = 6.0 - 0.2 * X + 0.002 * X**2
    checks, _ = checks_of(result(z, z, hang, ground_z=-4.0))
    c = checks["ride.clearance"]
    least = 1.0 - hang + 4.0                 # 1.0 m, or 0.1 m
    assert c.capacity == pytest.approx(least, abs=1e-3)
    assert c.demand == 0.15
    assert c.utilization == pytest.approx(0.15 / least, rel=1e-2)
    assert c.passed == passes
