"""The ride in a steady wind along the line: a head wind (does the lightest rider still
arrive?) and a tail wind (how fast they arrive, and so how hard the stop is).

The model is that of :mod:`spanstay.models.analysis.ride` with the air drag taken on
the rider's speed relative to the air: on each straight segment of the ride profile
(path angle theta, positive uphill)

    d(v^2/2)/ds = -g sin(theta) - Crr g cos(theta) - (rho CdA / 2m) (v - w)|v - w|

with ``w`` the wind speed along the direction of travel (positive: a tail wind), and
at each turn of the profile the centripetal friction factor ``exp(-2 Crr dtheta)``
on ``v^2/2``. The equation is no longer linear in ``v^2/2``, so each segment is
integrated numerically (scipy solve_ivp, tight tolerances), stopping where the rider
comes to rest. Gusts, cross winds and the rider's swing are not modelled.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from scipy.integrate import solve_ivp

from spanstay.models.common.units import STANDARD_GRAVITY


@dataclass(frozen=True)
class WindRide:
    """One rider's ride in one wind (SI)."""

    wind: float                   # m/s along the travel, + tail, - head
    reaches_end: bool
    arrival_speed: float | None   # m/s at the last profile point
    stop_distance: float | None   # m, horizontal, where the rider comes to rest


def ride_in_wind(distance, elevation, mass: float, wind: float, *, rolling_resistance=0.0,
                 drag_area=0.0, air_density=1.225, start_speed=0.0,
                 gravity=STANDARD_GRAVITY) -> WindRide:
    """The ride along a profile of horizontal ``distance`` and ``elevation`` points."""
    d = np.asarray(distance, float)
    z = np.asarray(elevation, float)
    m = float(mass)
    c = float(air_density) * float(drag_area) / (2.0 * m)
    crr, g, w = float(rolling_resistance), float(gravity), float(wind)
    dx, dz = np.diff(d), np.diff(z)
    length = np.hypot(dx, dz)
    theta = np.arctan2(dz, dx)
    energy = 0.5 * float(start_speed) ** 2

    def rate(_s, e, sin_t, cos_t):
        v = np.sqrt(max(2.0 * e[0], 0.0))
        rel = v - w
        return [-g * sin_t - crr * g * cos_t - c * rel * abs(rel)]

    def at_rest(_s, e, *_args):
        return e[0] - 1e-12
    at_rest.terminal, at_rest.direction = True, -1

    for i in range(length.size):
        if i > 0:
            energy *= np.exp(-2.0 * crr * abs(theta[i] - theta[i - 1]))
        sin_t, cos_t = np.sin(theta[i]), np.cos(theta[i])
        if energy <= 1e-12 and rate(0.0, [0.0], sin_t, cos_t)[0] <= 0.0:
            return WindRide(w, False, None, float(d[i]))
        sol = solve_ivp(rate, (0.0, float(length[i])), [max(energy, 1e-12)],
                        args=(sin_t, cos_t), events=at_rest, rtol=1e-10, atol=1e-12,
                        max_step=max(float(length[i]) / 4.0, 1e-3))
        if sol.status == 1:  # came to rest inside the segment
            s_stop = float(sol.t_events[0][0])
            return WindRide(w, False, None, float(d[i] + dx[i] * s_stop / length[i]))
        energy = float(sol.y[0, -1])
    return WindRide(w, True, float(np.sqrt(2.0 * max(energy, 0.0))), None)
