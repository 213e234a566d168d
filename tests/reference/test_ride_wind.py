"""The ride in a wind (spanstay.models.analysis.ride_wind) against the closed form of
drag on the relative air speed on a constant slope, and against the still-air ride."""
from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.optimize import brentq

from spanstay.models.analysis.ride import ride_speed
from spanstay.models.analysis.ride_wind import ride_in_wind

G = 9.80665


def closed_form_speed(length, slope, crr, c, v0, w):
    # v dv/ds = A - c u^2, u = v - w > 0, A = g sin(descent) - Crr g cos(descent):
    # s(u) = [-(1/2c) ln(A - c u^2) + w / sqrt(A c) artanh(u sqrt(c / A))] from u0 to u
    # (integral tables, e.g. Gradshteyn & Ryzhik 2.141; drag on the relative air speed,
    # Hoerner, Fluid-Dynamic Drag)
    a = G * math.sin(slope) - crr * G * math.cos(slope)

    def s_of(u):
        return -math.log(a - c * u * u) / (2 * c) + w / math.sqrt(a * c) * math.atanh(
            u * math.sqrt(c / a))

    u0 = v0 - w
    u_t = math.sqrt(a / c)
    u = brentq(lambda x: s_of(x) - s_of(u0) - length, u0, u_t * (1 - 1e-15))
    return u + w


@pytest.mark.parametrize("wind", [-4.0, -1.5, 0.0, 1.0])
def test_a_constant_slope_in_wind_matches_the_closed_form(wind):
    slope, length, mass, crr, cda, rho, v0 = math.radians(8.0), 40.0, 60.0, 0.02, 0.5, 1.2, 2.5
    c = rho * cda / (2 * mass)
    x = np.linspace(0.0, length * math.cos(slope), 9)
    z = -x * math.tan(slope)
    r = ride_in_wind(x, z, mass, wind, rolling_resistance=crr, drag_area=cda,
                     air_density=rho, start_speed=v0)
    assert r.reaches_end
    assert r.arrival_speed == pytest.approx(closed_form_speed(length, slope, crr, c, v0, wind),
                                            rel=1e-6)


def test_in_still_air_it_is_the_ride_of_the_ride_module():
    # the same profile with a sag and turns: the still-air ride (closed forms per
    # segment) and the integrated one agree
    x = np.linspace(0.0, 30.0, 31)
    z = 0.004 * (x - 18.0) ** 2 - 1.3 - 0.05 * x
    kw = dict(rolling_resistance=0.03, drag_area=0.45, air_density=1.225, start_speed=0.5)
    still = ride_speed(x, z, 40.0, **kw)
    wind = ride_in_wind(x, z, 40.0, 0.0, **kw)
    assert wind.reaches_end is still.reaches_end
    if still.reaches_end:
        assert wind.arrival_speed == pytest.approx(still.arrival_speed, rel=1e-3)
    else:
        assert wind.stop_distance == pytest.approx(still.stop_distance, abs=0.05)


def test_a_strong_head_wind_stops_a_light_rider_short():
    # energy: with a head wind w the drag is at least c w^2 everywhere, so on a slope whose
    # drive A is below it the rider slows from the start and stops
    slope, mass, cda = math.radians(3.0), 25.0, 0.5
    a = G * math.sin(slope)
    w = -1.5 * math.sqrt(a / (1.225 * cda / (2 * mass)))
    x = np.linspace(0.0, 30.0, 7)
    r = ride_in_wind(x, -x * math.tan(slope), mass, w, drag_area=cda, start_speed=1.0)
    assert not r.reaches_end and 0.0 < r.stop_distance < 30.0
