"""The stop, rated-brake, arrest and wind checks on results made by hand, so each can be
seen to fail: energies and strokes from the work-energy theorem, speeds given."""
from __future__ import annotations

from types import SimpleNamespace

import numpy as np
import pytest

from spanstay.models.analysis.arrival import Stops
from spanstay.models.analysis.brake import stop
from spanstay.models.analysis.ride_wind import WindRide
from spanstay.models.checks.stop import stop_checks
from spanstay.models.checks.wind import wind_checks
from spanstay.models.scenario.spec import BrakeSpec, RideLimits


def result_with(brake, end_stop=None, speed=5.0, mass=100.0, **limits):
    ride = RideLimits(brake=brake, end_stop=end_stop, **limits)
    stops = Stops()
    s = stop(brake, mass, speed)
    if s is not None:
        stops.brake.append(s)
    if end_stop is not None:
        stops.arrest.append(stop(end_stop, mass, speed))
    return SimpleNamespace(scenario=SimpleNamespace(ride=ride, rider=SimpleNamespace(line="l")),
                           stops=stops)


def by_id(checks):
    return {c.id: c for c in checks}


@pytest.mark.parametrize("rated_energy, passes", [(2000.0, True), (1000.0, False)])
def test_a_rated_brake_is_held_to_its_rated_energy(rated_energy, passes):
    # kinetic energy m v^2 / 2 = 100 x 25 / 2 = 1250 J (work-energy theorem)
    brake = BrakeSpec("rated", stroke=5.0, rated_speed=8.0, rated_energy=rated_energy,
                      peak_force=600.0)
    c = by_id(stop_checks(result_with(brake))[0])["ride.brake.rated_energy"]
    assert c.demand == pytest.approx(1250.0) and c.passed is passes


def test_a_rated_brake_is_held_to_its_rated_speed():
    brake = BrakeSpec("rated", stroke=5.0, rated_speed=4.0, rated_energy=5e3, peak_force=600.0)
    c = by_id(stop_checks(result_with(brake))[0])["ride.brake.rated_speed"]
    assert c.demand == pytest.approx(5.0) and not c.passed


def test_an_end_stop_that_bottoms_out_fails_the_arrest():
    # linear end stop: needs x = v sqrt(m / k) = 5 sqrt(100 / 1e4) = 0.5 m, has 0.3 m
    brake = BrakeSpec("bungee", stroke=10.0, stiffness=200.0)
    end = BrakeSpec("spring", stroke=0.3, stiffness=1e4)
    checks, missing = stop_checks(result_with(brake, end))
    c = by_id(checks)["ride.arrest.stroke"]
    assert c.demand == pytest.approx(0.5) and not c.passed and "BOTTOMS OUT" in c.note
    assert not missing


def test_no_brake_lists_the_stop_force_as_not_checked():
    checks, missing = stop_checks(result_with(BrakeSpec("none")))
    assert checks == []
    assert {n.what for n in missing} == {"a stop force at the end",
                                         "the emergency arrest (brake missed)"}


def test_head_wind_stop_and_tail_wind_speed_fail_their_checks():
    limits = RideLimits(arrival_speed_limit=4.0)
    ride = SimpleNamespace(distance=np.array([0.0, 20.0]))
    result = SimpleNamespace(
        scenario=SimpleNamespace(ride=limits, rider=SimpleNamespace(line="l")),
        rides={"lightest": ride}, passes={"ride_light": SimpleNamespace(weight=300.0)},
        wind_rides={"head": {"lightest": WindRide(-2.5, False, None, 12.0)},
                    "tail": {"heaviest": WindRide(2.5, True, 4.6, None)}})
    checks, missing = wind_checks(result)
    c = by_id(checks)
    assert not c["ride.head_wind.lightest_arrives"].passed
    assert c["ride.head_wind.lightest_arrives"].utilization == pytest.approx(20.0 / 12.0)
    assert not c["ride.tail_wind.arrival_speed"].passed
    assert any("ASCE 7" in n.reason for n in missing)


def test_energies_show_in_both_unit_systems():
    # 1 ft*lbf = 1.3558179483314004 J (exact from the foot and the pound-force, NIST SP 811)
    from spanstay.models.common.units import show as terminal_show
    from spanstay.models.outputs.display_units import show as report_show

    j = 1000 * 1.3558179483314004
    assert report_show(j, "energy", "us") == "1,000 ft·lbf"
    assert report_show(j, "energy", "si") == "1.36 kJ"
    assert terminal_show(j, "energy", "us").startswith("1,000 ft")
