"""Checks of the ride itself: the lightest rider arrives, the arrival speed, the feet
clear the ground. Each is made only from complete passes; what could not be computed
is listed as not checked, with the reason."""
from __future__ import annotations

import math

from spanstay.models.checks.check import Check
from spanstay.models.checks.verdict import NotChecked

from spanstay.models.scenario.spec import DEFAULT_MIN_FEET_CLEARANCE, WALKING_PACE

#: smallest clearance of the rider's feet over the ground (default of [ride]; our judgement)
MIN_CLEARANCE = DEFAULT_MIN_FEET_CLEARANCE
#: largest arrival speed with no brake: walking pace (default of [ride]; our judgement)
MAX_ARRIVAL_SPEED = WALKING_PACE


def _stopped(result, name: str) -> str | None:
    """Why pass ``name`` gives no ride result, or None when it is complete."""
    p = result.passes.get(name)
    if p is None:
        return None
    if not p.complete:
        return f"not computed, because pass '{name}' stopped early (no equilibrium)"
    if len(p.stations) < 2:
        return f"not computed, because pass '{name}' has fewer than two stations"
    return None


def ride_checks(result, min_clearance: float | None = None,
                max_arrival_speed: float | None = None
                ) -> tuple[list[Check], list[NotChecked]]:
    """The ride checks that could be made, and the ride items that could not.

    The limits are the scenario's ``[ride]`` values (with their sources) unless given.
    """
    limits = result.scenario.ride
    speed_source = (f"[ride] arrival_speed_limit: {limits.source('arrival_speed_limit')} "
                    f"(brake: {limits.brake.kind})")
    clear_source = f"[ride] min_feet_clearance: {limits.source('min_feet_clearance')}"
    if max_arrival_speed is None:
        max_arrival_speed = limits.arrival_speed_limit
    if min_clearance is None:
        min_clearance = limits.min_feet_clearance
    out: list[Check] = []
    missing: list[NotChecked] = []
    line = result.scenario.rider.line
    light = result.rides.get("lightest")
    why_light, why_heavy = _stopped(result, "ride_light"), _stopped(result, "ride_heavy")
    if light is not None and why_light is None:
        end = float(light.distance[-1])
        reached = end if light.reaches_end else float(light.stop_distance)
        out.append(Check(
            id="ride.lightest.arrives", part="ride", where=line,
            description="lightest rider reaches the far end", demand=end,
            capacity=max(reached, 1e-9), kind="length",
            governing={"pass": "ride_light", "rider_weight": result.passes["ride_light"].weight,
                       "station": None, "along": reached},
            source="energy: gravity, rolling resistance and air drag",
            note="" if light.reaches_end else f"stops {reached:.2f} m along the line"))
    else:
        missing.append(NotChecked("ride", "the lightest rider reaching the far end",
                                  why_light or "not computed"))
    heavy = result.rides.get("heaviest")
    if heavy is not None and why_heavy is None and why_light is None:
        fast = [r for r in (heavy, light) if r is not None and r.reaches_end]
        if fast:
            worst = max(fast, key=lambda r: r.arrival_speed)
            out.append(Check(
                id="ride.arrival_speed", part="ride", where=line,
                description="arrival speed at the far end", demand=float(worst.arrival_speed),
                capacity=max_arrival_speed, kind="speed",
                governing={"pass": "ride_heavy" if worst is heavy else "ride_light",
                           "rider_weight": None, "station": None,
                           "along": float(worst.distance[-1])},
                source=speed_source))
        else:
            missing.append(NotChecked("ride", "the arrival speed",
                                      "no rider reaches the far end (see the arrival check)"))
    else:
        missing.append(NotChecked("ride", "the arrival speed",
                                  why_heavy or why_light or "not computed"))
    why_hot = (_stopped(result, "hot") or _stopped(result, "bedded")
               or _stopped(result, "design"))
    if result.clearance is not None and why_heavy is None and why_hot is None:
        c = result.clearance
        out.append(Check(
            id="ride.clearance", part="ride", where=line,
            description="rider's feet clear the ground", demand=min_clearance,
            capacity=c.minimum, kind="length",
            utilization=min_clearance / c.minimum if c.minimum > 0 else math.inf,
            governing={"pass": result.clearance_pass or "ride_heavy",
                       "rider_weight": result.passes[result.clearance_pass or "ride_heavy"].weight,
                       "station": None, "along": c.minimum_distance},
            source=clear_source + " (heaviest rider as installed, on the hottest day, after "
                                  "bedding-in and bouncing (design pass); longest hang)",
            note=f"smallest clearance {c.minimum:.2f} m"))
    else:
        missing.append(NotChecked("ride", "the feet clearance over the ground",
                                  why_heavy or why_hot or "not computed"))
    return out, missing


def case_policy_not_checked(scenario) -> list[NotChecked]:
    """The load cases the scenario's [ride] settings leave out, each with its reason."""
    out = []
    if scenario.ride.single_rider:
        out.append(NotChecked("line", "two riders on the line at once",
                              "the scenario says the line is single-rider ([ride] single_rider): "
                              "keep to one rider at a time"))
    if not scenario.ride.rescue_on_line:
        out.append(NotChecked("line", "a rescuer on the line with a stuck rider",
                              "the scenario says rescue is from the ground ([ride] "
                              "rescue_on_line = false): plan and equip that rescue"))
    return out
