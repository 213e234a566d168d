"""Checks of the ride in wind: the lightest rider arrives against the head wind, and
the arrival speed in the tail wind is within the limit (the stop is computed from the
tail-wind arrival, :mod:`spanstay.models.analysis.arrival`). Wind and ice loads on the
line and the posts are not computed: they are listed as not checked."""
from __future__ import annotations

from spanstay.models.checks.check import Check
from spanstay.models.checks.verdict import NotChecked

_SOURCE = ("energy along the ride profile with drag on the speed relative to the air "
           "(analysis.ride_wind)")


def wind_checks(result) -> tuple[list[Check], list[NotChecked]]:
    """The head- and tail-wind ride checks that could be made, and what was not checked."""
    limits = result.scenario.ride
    line = result.scenario.rider.line
    winds = getattr(result, "wind_rides", {}) or {}
    out: list[Check] = []
    missing = [NotChecked("structure", "wind and ice loads on the line and the posts",
                          "spanstay does not compute them (no ASCE 7 wind or ice load is "
                          "applied): have them checked for your site, and close the line in "
                          "high wind or when iced")]
    head = winds.get("head", {})
    light = head.get("lightest")
    ride = result.rides.get("lightest")
    if light is not None and ride is not None:
        end = float(ride.distance[-1])
        reached = end if light.reaches_end else float(light.stop_distance)
        out.append(Check(
            "ride.head_wind.lightest_arrives", "ride", line,
            f"lightest rider reaches the far end against a {limits.head_wind:.2g} m/s head wind",
            end, max(reached, 1e-9), "length",
            governing={"pass": "ride_light", "rider_weight": result.passes["ride_light"].weight,
                       "station": None, "along": reached},
            source=f"{_SOURCE}; head wind: [ride] head_wind, {limits.source('head_wind')}",
            note="" if light.reaches_end else f"stops {reached:.2f} m along the line"))
    else:
        missing.append(NotChecked("ride", "the lightest rider arriving against the head wind",
                                  "not computed, because a ride pass stopped early"))
    tail = [r for r in winds.get("tail", {}).items() if r[1].reaches_end]
    if tail:
        key, worst = max(tail, key=lambda kv: kv[1].arrival_speed)
        out.append(Check(
            "ride.tail_wind.arrival_speed", "ride", line,
            f"arrival speed at the far end with a {limits.tail_wind:.2g} m/s tail wind",
            float(worst.arrival_speed), limits.arrival_speed_limit, "speed",
            governing={"pass": "ride_heavy" if key == "heaviest" else "ride_light",
                       "rider_weight": None, "station": None, "along": None},
            source=f"{_SOURCE}; tail wind: [ride] tail_wind, {limits.source('tail_wind')}; "
                   f"limit: [ride] arrival_speed_limit, {limits.source('arrival_speed_limit')}"))
    else:
        missing.append(NotChecked("ride", "the arrival speed in the tail wind",
                                  "not computed, because no complete ride reaches the far end"))
    return out, missing
