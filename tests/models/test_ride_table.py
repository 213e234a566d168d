"""The [ride] table: limits and brake are the user's, every default has its source;
bad input names its key; the default temperature range of use."""
from __future__ import annotations

import tomllib
from pathlib import Path

import pytest

from spanstay.models.analysis.load_cases import load_cases
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.read import read_scenario

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "orchard-family-line.toml"
G = 9.80665
FT, INCH, LBF, MPH = 0.3048, 0.0254, 4.4482216152605, 0.44704  # NIST SP 811 exact factors


def data(ride=None):
    d = tomllib.loads(EXAMPLE.read_text())
    d.pop("ride", None)
    if ride is not None:
        d["ride"] = ride
    return d


def fails(d, where, words):
    with pytest.raises(InputError) as info:
        read_scenario(d)
    assert info.value.where == where
    assert words in str(info.value)


def test_without_a_ride_table_there_is_no_brake_and_walking_pace():
    r = read_scenario(data()).ride
    assert r.brake.kind == "none" and r.end_stop is None
    assert r.arrival_speed_limit == pytest.approx(1.5)   # walking pace: our judgement
    assert "walking pace" in r.source("arrival_speed_limit")
    assert r.min_feet_clearance == pytest.approx(0.15) and r.source("min_feet_clearance") == "our judgement"
    assert r.max_deceleration == pytest.approx(2 * G) and "our judgement" in r.source("max_deceleration")


def test_given_values_are_read_in_si_and_marked_given():
    r = read_scenario(data({"arrival_speed_limit": "12 mph", "min_feet_clearance": "8 in",
                            "hang_distance": ["3 ft", "5 ft"], "max_deceleration": 1.5,
                            "brake": {"kind": "bungee", "stiffness": "20 lbf/ft",
                                      "stroke": "15 ft"}})).ride
    assert r.arrival_speed_limit == pytest.approx(12 * MPH)
    assert r.min_feet_clearance == pytest.approx(8 * INCH)
    assert r.hang_distance == pytest.approx((3 * FT, 5 * FT))
    assert r.max_deceleration == pytest.approx(1.5 * G)
    assert r.brake.stiffness == pytest.approx(20 * LBF / FT) and r.brake.stroke == pytest.approx(15 * FT)
    assert r.brake.acts_on == "cable"
    assert {r.source(k) for k in ("arrival_speed_limit", "min_feet_clearance", "hang_distance",
                                  "brake")} == {"given"}


def test_the_arrival_limit_follows_the_brake_kind():
    spring = read_scenario(data({"brake": {"kind": "spring", "stiffness": "500 lbf/ft",
                                           "stroke": "2 ft"}})).ride
    assert spring.arrival_speed_limit == pytest.approx(6.0)
    assert "our judgement" in spring.source("arrival_speed_limit")
    rated = read_scenario(data({"brake": {"kind": "rated", "rated_speed": "25 mph",
                                          "rated_energy": "3000 ft*lbf",
                                          "peak_force": "400 lbf", "stroke": "20 ft"}})).ride
    assert rated.arrival_speed_limit == pytest.approx(25 * MPH)
    assert rated.brake.rated_energy == pytest.approx(3000 * FT * LBF)
    gravity = read_scenario(data({"brake": {"kind": "gravity"}})).ride
    assert gravity.arrival_speed_limit == pytest.approx(1.5)


def test_a_curve_law_is_read_from_zero():
    r = read_scenario(data({"brake": {"kind": "bungee", "stroke": "2 m", "curve": [
        ["1 m", "100 N"], ["2 m", "300 N"]]}})).ride
    assert r.brake.curve == ((0.0, 0.0), (1.0, 100.0), (2.0, 300.0))


@pytest.mark.parametrize("ride, where, words", [
    ({"brake": {"kind": "magnet"}}, "ride.brake.kind", "not known"),
    ({"brake": {"kind": "spring", "stroke": "1 m"}}, "ride.brake", "give one of"),
    ({"brake": {"kind": "spring", "stroke": "1 m", "stiffness": "1 N/m", "peak_force": "1 N"}},
     "ride.brake.peak_force", "does not apply"),
    ({"brake": {"kind": "gravity", "stroke": "1 m"}}, "ride.brake.stroke", "does not apply"),
    ({"brake": {"kind": "bungee", "stroke": "3 m", "curve": [["1 m", "100 N"]]}},
     "ride.brake.curve", "short of the stroke"),
    ({"brake": {"kind": "bungee", "stroke": "2 m", "curve": [["1 m", "100 N"], ["2 m", "50 N"]]}},
     "ride.brake.curve[2]", "must not fall"),
    ({"brake": {"kind": "rated", "stroke": "3 m", "rated_speed": "5 m/s", "peak_force": "1 kN"}},
     "ride.brake.rated_energy", "missing"),
    ({"end_stop": {"kind": "none"}}, "ride.end_stop.kind", "not known"),
    ({"hang_distance": ["5 ft", "3 ft"]}, "ride.hang_distance", "shortest"),
    ({"max_deceleration": 0}, "ride.max_deceleration", "greater than zero"),
    ({"brake": {"kind": "spring", "stroke": "1 m", "stiffness": "1 N/m", "acts_on": "tree"}},
     "ride.brake.acts_on", "not known"),
    ({"arival_speed_limit": "3 m/s"}, "ride.arival_speed_limit", "did you mean"),
])
def test_bad_ride_input_names_its_key(ride, where, words):
    fails(data(ride), where, words)


def test_no_range_of_use_means_installation_plus_minus_25_k():
    d = data()
    del d["settings"]["use_temperatures"]
    s = read_scenario(d)
    t = s.settings.install_temperature
    assert s.settings.use_temperatures_default
    cases = {c.name: c for c in load_cases(s, 4)}
    # the design case at the coldest, the clearance case at the hottest of the stated range
    assert cases["design"].temperature == pytest.approx(t - 25.0)
    assert cases["hot"].temperature == pytest.approx(t + 25.0)
    given = read_scenario(data())
    assert not given.settings.use_temperatures_default


def test_two_riders_and_rescue_are_on_unless_the_user_says_otherwise():
    s = read_scenario(data())
    names = [c.name for c in load_cases(s, 4)]
    assert "two_riders" in names and "rescue" in names
    cases = {c.name: c for c in load_cases(s, 4)}
    heavy, factor = s.rider.heaviest, s.rider.dynamic_factor
    # a second rider of the heaviest weight stopped (static) at mid-span; the rescuer
    # (250 lbf, our judgement) and the stuck rider times the rescue factor 1.25
    assert cases["two_riders"].fixed == ((0.5, pytest.approx(heavy)),)
    assert cases["two_riders"].rider_load == pytest.approx(heavy * factor)
    assert cases["rescue"].rider_load == pytest.approx(250 * LBF * 1.25)
    assert cases["rescue"].fixed == ((0.5, pytest.approx(heavy * 1.25)),)
    off = read_scenario(data({"single_rider": True, "rescue_on_line": False}))
    names = [c.name for c in load_cases(off, 4)]
    assert "two_riders" not in names and "rescue" not in names
    from spanstay.models.checks.ride import case_policy_not_checked
    what = [n.what for n in case_policy_not_checked(off)]
    assert what == ["two riders on the line at once", "a rescuer on the line with a stuck rider"]


@pytest.mark.parametrize("ride, where", [
    ({"single_rider": True, "second_rider": "200 lbf"}, "ride.second_rider"),
    ({"rescue_on_line": False, "rescuer": "200 lbf"}, "ride.rescuer"),
    ({"rescue_factor": 0.5}, "ride.rescue_factor"),
    ({"single_rider": "yes"}, "ride.single_rider"),
])
def test_bad_rider_policy_names_its_key(ride, where):
    with pytest.raises(InputError) as info:
        read_scenario(data(ride))
    assert info.value.where == where


def test_ride_winds_default_and_given():
    r = read_scenario(data()).ride
    assert r.head_wind == pytest.approx(2.5) and r.tail_wind == pytest.approx(2.5)
    assert "our judgement" in r.source("head_wind")
    r = read_scenario(data({"head_wind": "10 mph", "tail_wind": "0 mph"})).ride
    assert r.head_wind == pytest.approx(10 * MPH) and r.tail_wind == 0.0
    fails(data({"tail_wind": "-3 mph"}), "ride.tail_wind", "at least")
