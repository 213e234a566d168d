"""The riders' arrival at the end of the ride: each rider's stop by the brake, and the
emergency arrest by the end stop when the brake is missed, from the arrival speeds of
the ride passes (:mod:`spanstay.models.analysis.brake` does the energy balance)."""
from __future__ import annotations

from dataclasses import dataclass, field

from spanstay.models.analysis.brake import StopResult, stop
from spanstay.models.common.units import STANDARD_GRAVITY
from spanstay.models.scenario.spec import Scenario

#: the ride passes whose arrival speeds the stops use, by rider
RIDE_PASSES = {"lightest": "ride_light", "heaviest": "ride_heavy"}


@dataclass
class Stops:
    """Every rider's stop by the brake and by the end stop (SI).

    ``why_not`` says, per item ("stop", "arrest"), why it was not computed.
    """

    brake: list[StopResult] = field(default_factory=list)
    arrest: list[StopResult] = field(default_factory=list)
    why_not: dict[str, str] = field(default_factory=dict)

    @property
    def stop_force(self) -> float | None:
        """The largest stop force of the brake over the riders (None: none)."""
        return max((s.peak_force for s in self.brake), default=None)

    @property
    def arrest_force(self) -> float | None:
        """The largest force of the end stop over the riders (None: none)."""
        return max((s.peak_force for s in self.arrest), default=None)

    def to_dict(self) -> dict:
        return {"brake": [s.to_dict() for s in self.brake],
                "arrest": [s.to_dict() for s in self.arrest],
                "stop_force": self.stop_force, "arrest_force": self.arrest_force,
                "why_not": dict(self.why_not)}


def arrival_stops(scenario: Scenario, rides: dict,
                  tail_wind_speeds: dict[str, float] | None = None) -> Stops:
    """The stops of every rider whose ride pass is complete and who arrives.

    The rider's mass is its weight over standard gravity; the arrival speed is
    the faster of its ride at the ride's stop offset (``rides``: rider key ->
    :class:`spanstay.models.analysis.ride.RideResult`) and its arrival in the tail
    wind (``tail_wind_speeds``: rider key -> m/s).
    """
    tail = tail_wind_speeds or {}
    rider, limits = scenario.rider, scenario.ride
    out = Stops()
    weights = {"lightest": rider.lightest, "heaviest": rider.heaviest}
    arriving = [(key, rides[key]) for key in RIDE_PASSES if key in rides]
    if len(arriving) < len(RIDE_PASSES):
        reason = "not computed, because a ride pass stopped early (no arrival speed)"
        out.why_not = {"stop": reason, "arrest": reason}
        return out
    arriving = [(k, r) for k, r in arriving if r.reaches_end]
    if not arriving:
        out.why_not = {"stop": "no rider reaches the far end",
                       "arrest": "no rider reaches the far end"}
        return out
    for key, ride in arriving:
        mass = weights[key] / STANDARD_GRAVITY
        speed = max(float(ride.arrival_speed), float(tail.get(key, 0.0)))
        s = stop(limits.brake, mass, speed, key)
        if s is not None:
            out.brake.append(s)
        if limits.end_stop is not None:
            out.arrest.append(stop(limits.end_stop, mass, speed, key))
    if not out.brake:
        out.why_not["stop"] = (f"the brake is '{limits.brake.kind}': no stop force beyond the "
                               "rider's weight (the design case carries that)")
    if limits.end_stop is None:
        out.why_not["arrest"] = ("no [ride.end_stop] given: give the end stop that catches a "
                                 "rider who misses the brake (its stiffness and stroke)")
    return out
