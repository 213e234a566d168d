"""Clearance of the rider's feet over the ground along the ride profile."""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from spanstay.models.analysis.ride import as_profile, check_nonnegative
from spanstay.models.common.errors import InputError


@dataclass(frozen=True)
class Clearance:
    """Clearance of the rider's feet over the ground.

    Attributes
    ----------
    distance
        Horizontal distance of every ride-profile point, m.
    clearance
        Feet-over-ground clearance at every ride-profile point, m (negative
        means the feet are below ground).
    minimum
        Smallest clearance anywhere along the ride (between points included), m.
    minimum_distance
        Horizontal distance where the smallest clearance occurs, m.
    feet_elevation, ground_elevation
        Elevations of the feet and of the ground at that place, m.
    """

    distance: NDArray[np.float64]
    clearance: NDArray[np.float64]
    minimum: float
    minimum_distance: float
    feet_elevation: float
    ground_elevation: float


def feet_clearance(
    distance: ArrayLike,
    elevation: ArrayLike,
    hang: float,
    ground_distance: ArrayLike,
    ground_elevation: ArrayLike,
) -> Clearance:
    """Smallest clearance of the rider's feet over the ground along the ride.

    The feet hang a fixed vertical distance below the attachment point; feet
    and ground are both piecewise linear in horizontal distance, so the
    smallest clearance is found exactly at a break point of either.

    Parameters
    ----------
    distance, elevation
        Ride profile: horizontal distance along the line and elevation of the
        attachment point, m.
    hang
        Vertical distance from the cable (attachment point) to the feet, m.
    ground_distance, ground_elevation
        Ground profile under the line, m; must cover the whole ride.

    Returns
    -------
    Clearance
        Clearance at every profile point and the smallest clearance, with where.

    Raises
    ------
    InputError
        On malformed profiles, a negative hang, or ground that does not cover
        the ride.
    """
    d, z = as_profile(distance, elevation, "ride profile")
    gd, gz = as_profile(ground_distance, ground_elevation, "ground")
    h = check_nonnegative(hang, "hang", "m")
    tol = 1e-9 * max(1.0, abs(d[0]), abs(d[-1]))
    if gd[0] > d[0] + tol or gd[-1] < d[-1] - tol:
        raise InputError(
            f"ground profile covers {gd[0]:g} m to {gd[-1]:g} m but the ride runs "
            f"from {d[0]:g} m to {d[-1]:g} m; expected ground under the whole ride",
            where="ground",
        )
    inside = gd[(gd > d[0]) & (gd < d[-1])]
    where = np.union1d(d, inside)
    feet = np.interp(where, d, z) - h
    ground = np.interp(where, gd, gz)
    gap = feet - ground
    k = int(np.argmin(gap))
    return Clearance(
        distance=d,
        clearance=z - h - np.interp(d, gd, gz),
        minimum=float(gap[k]),
        minimum_distance=float(where[k]),
        feet_elevation=float(feet[k]),
        ground_elevation=float(ground[k]),
    )
