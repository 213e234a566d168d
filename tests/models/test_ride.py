"""Ride module behaviour: inputs, result bookkeeping, path-distance input."""
from __future__ import annotations

import numpy as np
import pytest
from scipy.integrate import quad

from spanstay.models.common.errors import InputError
from spanstay.models.analysis.clearance import feet_clearance
from spanstay.models.analysis.ride import ride_speed

G = 9.80665
X = np.linspace(0.0, 60.0, 61)
Z = 8.0 - 0.25 * X + 0.0025 * X**2


def test_path_distance_input_gives_the_same_ride() -> None:
    # Arclength of a polyline is the sum of segment lengths (plane geometry).
    s = np.concatenate(([0.0], np.cumsum(np.hypot(np.diff(X), np.diff(Z)))))
    kw = dict(rolling_resistance=0.02, drag_area=0.5, start_speed=0.8)
    a = ride_speed(X, Z, 70.0, **kw)
    b = ride_speed(s, Z, 70.0, distance_kind="path", **kw)
    np.testing.assert_allclose(b.speed, a.speed, rtol=1e-10, equal_nan=True)
    np.testing.assert_allclose(b.distance, X, atol=1e-9)
    np.testing.assert_allclose(a.path, s, rtol=1e-12)


def test_time_is_the_integral_of_ds_over_v_on_a_frictionless_polyline() -> None:
    # t = integral ds / v with v from energy conservation along each straight
    # segment (calculus; scipy quad as the independent integrator).
    r = ride_speed(X, Z, 70.0, start_speed=1.0)
    total = 0.0
    for i in range(X.size - 1):
        seg = np.hypot(X[i + 1] - X[i], Z[i + 1] - Z[i])
        slope = (Z[i + 1] - Z[i]) / seg
        total += quad(lambda u: 1.0 / np.sqrt(1.0 + 2.0 * G * (Z[0] - Z[i] - slope * u)),
                      0.0, seg)[0]
    assert r.arrival_time == pytest.approx(total, rel=1e-8)
    assert np.all(np.diff(r.time) > 0.0)


def test_unreached_points_are_nan_and_stop_fields_set() -> None:
    r = ride_speed(X, Z, 70.0, rolling_resistance=0.12)
    assert not r.reaches_end
    assert r.arrival_speed is None and r.arrival_time is None
    reached = np.isfinite(r.speed)
    assert np.all(X[reached] <= r.stop_distance) and np.all(X[~reached] > r.stop_distance)
    assert np.all(np.isnan(r.time[~reached]))
    assert r.stop_time > np.nanmax(r.time)
    # The stop point lies on the profile (linear between points).
    assert r.stop_elevation == pytest.approx(np.interp(r.stop_distance, X, Z))


def test_top_speed_is_the_largest_reported_speed() -> None:
    r = ride_speed(X, Z, 90.0, rolling_resistance=0.01, drag_area=0.4, start_speed=2.0)
    assert r.top_speed == np.nanmax(r.speed)
    assert r.top_speed_distance == X[r.top_speed_index]


@pytest.mark.parametrize(
    ("kwargs", "where"),
    [
        ({"mass": 0.0}, "rider mass"),
        ({"mass": -70.0}, "rider mass"),
        ({"rolling_resistance": -0.01}, "rolling resistance"),
        ({"drag_area": float("nan")}, "drag area"),
        ({"start_speed": -1.0}, "start speed"),
    ],
)
def test_bad_parameters_raise_input_error(kwargs: dict, where: str) -> None:
    args = {"mass": 70.0} | kwargs
    mass = args.pop("mass")
    with pytest.raises(InputError) as err:
        ride_speed(X, Z, mass, **args)
    assert err.value.where == where


def test_bad_profiles_raise_input_error() -> None:
    with pytest.raises(InputError, match="one elevation per distance"):
        ride_speed(X, Z[:-1], 70.0)
    with pytest.raises(InputError, match="increase strictly"):
        ride_speed(X[::-1], Z, 70.0)
    with pytest.raises(InputError, match="at least 2"):
        ride_speed([0.0], [1.0], 70.0)
    with pytest.raises(InputError, match="exceeds the path length"):
        ride_speed([0.0, 1.0], [0.0, 2.0], 70.0, distance_kind="path")


def test_clearance_needs_ground_under_the_whole_ride() -> None:
    with pytest.raises(InputError) as err:
        feet_clearance(X, Z, 1.5, [5.0, 60.0], [0.0, 0.0])
    assert err.value.where == "ground"
    with pytest.raises(InputError) as err:
        feet_clearance(X, Z, -1.0, [0.0, 60.0], [0.0, 0.0])
    assert err.value.where == "hang"
