"""Checks of the ride itself: arrival, arrival speed, feet clearance, equilibrium."""
from __future__ import annotations

import math

from spanstay.models.checks.structural import Check

#: smallest clearance of the rider's feet over the ground: a judgement of ours
MIN_CLEARANCE = 0.15
#: largest arrival speed at the far end: a judgement of ours for a line without a
#: braking system; set your own with the brake you use
MAX_ARRIVAL_SPEED = 5.0


def ride_checks(result, min_clearance: float, max_arrival_speed: float) -> list:
    """Findings about the ride, each as a check with demand, capacity and utilization."""
    out = []
    heavy = result.passes["ride_heavy"]
    for label, p in result.passes.items():
        if p.failed_at is not None:
            out.append(Check(
                id=f"structure.equilibrium.{label}", part="structure", where=label,
                description=f"equilibrium with the rider ({label}); capacity exceeded",
                demand=p.failed_at, capacity=p.stations[-1].s if p.stations else 0.0,
                kind="length", utilization=math.inf, passed=False,
                governing={"pass": label, "rider_weight": p.weight, "station": len(p.stations),
                           "along": p.stations[-1].along if p.stations else 0.0},
                source="finite-element equilibrium",
                note=f"no equilibrium {p.failed_at:.2f} m along the cable: {p.failure[:300]}"))
    light = result.rides.get("lightest")
    if light is not None:
        end = float(light.distance[-1])
        reached = end if light.reaches_end else float(light.stop_distance)
        out.append(Check(
            id="ride.lightest.arrives", part="ride", where=result.scenario.rider.line,
            description="lightest rider reaches the far end", demand=end,
            capacity=max(reached, 1e-9), kind="length",
            governing={"pass": "ride_light", "rider_weight": result.passes["ride_light"].weight,
                       "station": None, "along": reached},
            source="energy: gravity, rolling resistance and air drag",
            note="" if light.reaches_end else f"stops {reached:.2f} m along the line"))
    fast = [r for r in result.rides.values() if r.reaches_end]
    if fast:
        worst = max(fast, key=lambda r: r.arrival_speed)
        out.append(Check(
            id="ride.arrival_speed", part="ride", where=result.scenario.rider.line,
            description="arrival speed at the far end", demand=float(worst.arrival_speed),
            capacity=max_arrival_speed, kind="speed",
            governing={"pass": "ride_heavy" if worst is result.rides.get("heaviest") else "ride_light",
                       "rider_weight": None, "station": None, "along": float(worst.distance[-1])},
            source="a judgement of ours for a line without a brake; set your own with the brake you use"))
    if result.clearance is not None:
        c = result.clearance
        out.append(Check(
            id="ride.clearance", part="ride", where=result.scenario.rider.line,
            description="rider's feet clear the ground", demand=min_clearance,
            capacity=c.minimum, kind="length",
            utilization=min_clearance / c.minimum if c.minimum > 0 else math.inf,
            governing={"pass": "ride_heavy/hot", "rider_weight": heavy.weight, "station": None,
                       "along": c.minimum_distance},
            source="a judgement of ours (smallest clearance of the feet, heaviest rider, hottest day)",
            note=f"smallest clearance {c.minimum:.2f} m"))
    return out
