"""The ride: rider speed along the loaded path and feet clearance over the ground.

Model (what is and is not included)
-----------------------------------
The rider's attachment point is taken to follow the *ride profile*, the
quasi-static path of the loaded point found from the station solutions. Along
that path, with arclength ``s`` and the path angle ``theta`` (positive uphill):

    d(v^2/2)/ds = -g sin(theta) - Crr N/m - (rho CdA / 2m) v^2
    N/m         =  g cos(theta) + v^2 kappa

``kappa`` is the signed curvature of the path (positive where the path is
concave up, as in a sagging line), so the centripetal term presses the trolley
harder onto the cable in the sag. The equation is linear in ``E = v^2/2``.

The profile is piecewise linear between the given points. On each straight
segment the coefficients are constant and the equation is solved exactly.
The turn at each interior point is treated as a short arc with the same turn
angle, across which gravity does nothing and the centripetal friction
multiplies ``E`` by ``exp(-2 Crr dtheta)`` (classic result for a body sliding
round a curve with friction). Half of that factor is applied when reporting
the speed at the point itself (a symmetric split), which makes the scheme
second-order accurate for a smooth path.

Not modelled: swing of the rider, the cable's own motion under the moving load,
wind, and bearing break-away friction. If the centripetal term would make the
normal force negative (the trolley lifting off the cable) the result says so
and the speed past that point is not reliable.

Units are SI throughout.
"""
from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from spanstay.models.common.errors import InputError

STANDARD_GRAVITY = 9.80665
"""Standard acceleration of gravity, m/s^2 (CGPM 1901, exact by definition)."""

SEA_LEVEL_AIR_DENSITY = 1.225
"""Air density at sea level, 15 degC, kg/m^3 (ISO 2533 standard atmosphere)."""

_NEARLY_NO_DRAG = 1e-7  # b*L below this: drag changes a segment time by < 1e-7


@dataclass(frozen=True)
class RideResult:
    """Speed of one rider along the ride profile.

    Attributes
    ----------
    distance, path, elevation
        Horizontal distance along the line (counted from the first point when
        the input was given as path distance), arclength along the path from
        the start, and elevation of every profile point, m.
    speed
        Speed at every profile point, m/s; NaN at points the rider never reaches.
    time
        Time at which the rider passes every profile point, s; NaN if not reached.
    reaches_end
        Whether the rider reaches the last profile point.
    arrival_speed, arrival_time
        Speed (m/s) and time (s) at the last point, or None if it is not reached.
    top_speed, top_speed_distance, top_speed_index
        Highest speed at a profile point, m/s, and where it occurs.
    stop_distance, stop_path, stop_elevation, stop_time
        Where and when the rider comes to rest short of the end (horizontal
        distance, arclength, elevation, time), or None if the rider arrives.
        What happens after (rolling back) is not followed.
    min_normal_ratio, min_normal_distance
        Smallest normal force on the trolley as a fraction of the rider's
        weight over the reached points, and where.
    lifts_off
        True if that normal force turns negative (trolley lifting off the cable);
        the speeds past ``min_normal_distance`` are then not reliable.
    """

    distance: NDArray[np.float64]
    path: NDArray[np.float64]
    elevation: NDArray[np.float64]
    speed: NDArray[np.float64]
    time: NDArray[np.float64]
    reaches_end: bool
    arrival_speed: float | None
    arrival_time: float | None
    top_speed: float
    top_speed_distance: float
    top_speed_index: int
    stop_distance: float | None
    stop_path: float | None
    stop_elevation: float | None
    stop_time: float | None
    min_normal_ratio: float
    min_normal_distance: float
    lifts_off: bool


def as_profile(
    distance: ArrayLike, elevation: ArrayLike, name: str
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    d = np.asarray(distance, dtype=float).ravel()
    z = np.asarray(elevation, dtype=float).ravel()
    if d.size != z.size:
        raise InputError(
            f"distance has {d.size} values but elevation has {z.size}; "
            "expected one elevation per distance",
            where=name,
        )
    if d.size < 2:
        raise InputError(f"needs at least 2 points, got {d.size}", where=name)
    if not (np.all(np.isfinite(d)) and np.all(np.isfinite(z))):
        raise InputError("contains a non-finite value (nan or inf)", where=name)
    if np.any(np.diff(d) <= 0.0):
        raise InputError(
            "distances must increase strictly from one point to the next", where=name
        )
    return d, z


def check_nonnegative(value: float, name: str, unit: str) -> float:
    v = float(value)
    if not np.isfinite(v) or v < 0.0:
        raise InputError(f"must be a finite value >= 0 {unit}, got {value!r}", where=name)
    return v


def _relative_expm1(x: NDArray[np.float64]) -> NDArray[np.float64]:
    """(1 - exp(-x)) / x, equal to 1 at x = 0, accurate for small x."""
    out = np.ones_like(x)
    big = x > 1e-12
    out[big] = -np.expm1(-x[big]) / x[big]
    return out


def _segment_time(
    length: NDArray[np.float64],
    v_start: NDArray[np.float64],
    v_end: NDArray[np.float64],
    a: NDArray[np.float64],
    b: NDArray[np.float64],
) -> NDArray[np.float64]:
    """Travel time over straight segments where dE/ds = a - b E exactly.

    Closed forms of t = integral ds / v, written to stay accurate near v = 0,
    near terminal speed and for vanishing drag. ``v_end`` may be 0 (a stop).
    """
    t = np.empty_like(length)
    no_drag = b * length < _NEARLY_NO_DRAG
    # Uniform acceleration: v is linear in time, so t = 2 L / (v0 + v1).
    t[no_drag] = 2.0 * length[no_drag] / (v_start[no_drag] + v_end[no_drag])
    dr = ~no_drag
    if np.any(dr):
        L, v0, v1, aa, bb = length[dr], v_start[dr], v_end[dr], a[dr], b[dr]
        vt2 = 2.0 * aa / bb  # signed square of terminal speed
        scale = 1e-12 * np.maximum(v0 * v0, v1 * v1)
        td = np.empty_like(L)
        up = vt2 > scale  # approaching a real terminal speed
        dn = vt2 < 0.0  # decelerating (atan2 form stays accurate as vt2 -> 0)
        zero = ~(up | dn)  # 0 <= vt2 <= scale: effectively no driving force
        if np.any(up):
            vt = np.sqrt(vt2[up])
            td[up] = L[up] / vt + 2.0 / (bb[up] * vt) * np.log(
                (vt + v1[up]) / (vt + v0[up])
            )
        if np.any(dn):
            c = np.sqrt(-vt2[dn])
            td[dn] = 2.0 / (bb[dn] * c) * np.arctan2(
                c * (v0[dn] - v1[dn]), c * c + v0[dn] * v1[dn]
            )
        if np.any(zero):
            td[zero] = 2.0 * (v0[zero] - v1[zero]) / (bb[zero] * v0[zero] * v1[zero])
        t[dr] = td
    return t


def ride_speed(
    distance: ArrayLike,
    elevation: ArrayLike,
    mass: float,
    *,
    rolling_resistance: float = 0.0,
    drag_area: float = 0.0,
    start_speed: float = 0.0,
    air_density: float = SEA_LEVEL_AIR_DENSITY,
    gravity: float = STANDARD_GRAVITY,
    centripetal: bool = True,
    distance_kind: Literal["horizontal", "path"] = "horizontal",
) -> RideResult:
    """Speed of a rider along the ride profile, from the first point to the last.

    Parameters
    ----------
    distance
        Distance of each profile point from the start, m, strictly increasing:
        horizontal distance along the line (``distance_kind="horizontal"``) or
        arclength along the path (``distance_kind="path"``).
    elevation
        Elevation of the rider's attachment point at each profile point, m.
    mass
        Rider mass with trolley and harness, kg (weight / g).
    rolling_resistance
        Rolling resistance coefficient of the trolley, Crr (force / normal force).
    drag_area
        Drag coefficient times frontal area of the rider, CdA, m^2.
    start_speed
        Speed at the first profile point, m/s.
    air_density
        Air density rho, kg/m^3.
    gravity
        Acceleration of gravity, m/s^2.
    centripetal
        Include the centripetal part of the normal force (v^2 times curvature)
        in the rolling resistance.
    distance_kind
        Whether ``distance`` is horizontal or measured along the path.

    Returns
    -------
    RideResult
        Speed and time at every point, arrival, top speed, stop point if any.

    Raises
    ------
    InputError
        On a malformed profile or a negative or non-finite parameter.
    """
    d, z = as_profile(distance, elevation, "ride profile")
    m = float(mass)
    if not np.isfinite(m) or m <= 0.0:
        raise InputError(f"must be a finite mass > 0 kg, got {mass!r}", where="rider mass")
    crr = check_nonnegative(rolling_resistance, "rolling resistance", "")
    cda = check_nonnegative(drag_area, "drag area", "m^2")
    v_first = check_nonnegative(start_speed, "start speed", "m/s")
    rho = check_nonnegative(air_density, "air density", "kg/m^3")
    g = check_nonnegative(gravity, "gravity", "m/s^2")

    dd, dz = np.diff(d), np.diff(z)
    if distance_kind == "horizontal":
        dx = dd
        seg = np.hypot(dx, dz)
    elif distance_kind == "path":
        if np.any(np.abs(dz) > dd * (1.0 + 1e-12)):
            raise InputError(
                "a rise between two points exceeds the path length between them",
                where="ride profile",
            )
        seg = dd
        dx = np.sqrt(np.maximum(dd * dd - dz * dz, 0.0))
    else:
        raise InputError(
            f"distance_kind must be 'horizontal' or 'path', got {distance_kind!r}",
            where="ride profile",
        )
    path = np.concatenate(([0.0], np.cumsum(seg)))
    horizontal = d if distance_kind == "horizontal" else np.concatenate(([0.0], np.cumsum(dx)))
    sin_t, cos_t = dz / seg, dx / seg
    theta = np.arctan2(dz, dx)
    turn = np.diff(theta)  # at interior points, > 0 where concave up
    vertex_loss = np.exp(-2.0 * crr * turn) if centripetal else np.ones_like(turn)

    # dE/ds = a - b E on every segment (vectorised coefficients).
    a = -g * (sin_t + crr * cos_t)
    b = np.full_like(seg, rho * cda / m)
    bl = b * seg
    decay, gain = np.exp(-bl), a * seg * _relative_expm1(bl)

    n = d.size
    e_start = np.empty(n - 1)  # E at the start of each segment (after the turn)
    e_end = np.empty(n - 1)
    e = 0.5 * v_first * v_first
    stop_seg, stop_len = -1, 0.0
    for j in range(n - 1):  # scalar recursion; all per-segment work is vectorised
        if j > 0:
            e *= vertex_loss[j - 1]
        e_start[j] = e
        aj = float(a[j])
        if e <= 0.0 and aj <= 0.0:  # at rest with nothing pulling it on
            stop_seg, stop_len = j, 0.0
            break
        if aj < 0.0:  # net resistance: E falls to zero after s_stop
            s_stop = np.log1p(e * b[j] / -aj) / b[j] if b[j] > 0.0 else e / -aj
            if s_stop < seg[j]:
                stop_seg, stop_len = j, float(s_stop)
                break
        e = max(decay[j] * e + gain[j], 0.0)
        e_end[j] = e

    done = n - 1 if stop_seg < 0 else stop_seg  # segments fully travelled
    energy = np.full(n, np.nan)
    energy[0] = e_start[0]
    energy[1 : done + 1] = e_end[:done]
    interior = np.arange(1, min(done + 1, n - 1))
    energy[interior] *= np.sqrt(vertex_loss[interior - 1])
    speed = np.sqrt(2.0 * energy)

    v_in = np.sqrt(2.0 * e_start[:done])
    v_out = np.sqrt(2.0 * e_end[:done])
    seg_time = _segment_time(seg[:done], v_in, v_out, a[:done], b[:done])
    time = np.full(n, np.nan)
    time[: done + 1] = np.concatenate(([0.0], np.cumsum(seg_time)))

    reached = np.isfinite(speed)
    k_top = int(np.nanargmax(speed))

    # Normal force per unit weight at reached points (curvature from the turns).
    cos_pt = np.empty(n)
    cos_pt[0], cos_pt[-1] = cos_t[0], cos_t[-1]
    cos_pt[1:-1] = np.cos(0.5 * (theta[:-1] + theta[1:]))
    kappa = np.zeros(n)
    if centripetal and n > 2:
        kappa[1:-1] = turn / (0.5 * (seg[:-1] + seg[1:]))
        kappa[0], kappa[-1] = kappa[1], kappa[-2]  # end points: nearest turn
    normal = cos_pt + (speed * speed * kappa / g if g > 0 else 0.0)
    normal = np.where(reached, normal, np.nan)
    k_n = int(np.nanargmin(normal))

    stop: dict[str, float | None] = dict.fromkeys(("d", "s", "z", "t"))
    if stop_seg >= 0:
        j, f = stop_seg, stop_len / seg[stop_seg]
        t_stop = 0.0
        if stop_len > 0.0:
            t_stop = float(_segment_time(
                np.array([stop_len]), np.array([np.sqrt(2.0 * e_start[j])]),
                np.zeros(1), a[j : j + 1], b[j : j + 1],
            )[0])
        stop = {
            "d": float(horizontal[j] + f * dx[j]),
            "s": float(path[j] + stop_len),
            "z": float(z[j] + f * dz[j]),
            "t": float(time[j] + t_stop),
        }
    reaches_end = stop_seg < 0
    return RideResult(
        distance=horizontal,
        path=path,
        elevation=z,
        speed=speed,
        time=time,
        reaches_end=reaches_end,
        arrival_speed=float(speed[-1]) if reaches_end else None,
        arrival_time=float(time[-1]) if reaches_end else None,
        top_speed=float(speed[k_top]),
        top_speed_distance=float(horizontal[k_top]),
        top_speed_index=k_top,
        stop_distance=stop["d"],
        stop_path=stop["s"],
        stop_elevation=stop["z"],
        stop_time=stop["t"],
        min_normal_ratio=float(normal[k_n]),
        min_normal_distance=float(horizontal[k_n]),
        lifts_off=bool(normal[k_n] < 0.0),
    )
