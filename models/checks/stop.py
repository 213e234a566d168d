"""Checks of the stop at the end of the ride: the rider's deceleration against the
limit, the stroke used against the stroke available, a rated brake's energy and
speed; the end stop's stroke in an emergency arrest. The stop's loads on the
structure are the strength pass "stop" (checked with every other strength pass),
the arrest's the pass "arrest" (:mod:`spanstay.models.checks.arrest`)."""
from __future__ import annotations

from spanstay.models.analysis.brake import StopResult
from spanstay.models.checks.check import Check
from spanstay.models.checks.verdict import NotChecked

_ENERGY_SOURCE = ("energy balance m v^2 / 2 = integral of the force-stroke law over the stroke "
                  "(work-energy theorem); gravity and rolling resistance at the end left out")


def _gov(s: StopResult, pass_name: str) -> dict:
    return {"pass": pass_name, "rider_weight": None, "station": None, "along": None,
            "rider": s.rider}


def _worst(stops: list[StopResult], key) -> StopResult:
    return max(stops, key=key)


def stop_checks(result) -> tuple[list[Check], list[NotChecked]]:
    """The stop and arrest checks that could be made, and what could not."""
    limits = result.scenario.ride
    stops = result.stops
    line = result.scenario.rider.line
    out: list[Check] = []
    missing: list[NotChecked] = []
    if stops is None:
        reason = "not computed"
        return out, [NotChecked("ride", "the stop at the end", reason),
                     NotChecked("ride", "the emergency arrest", reason)]
    brake = limits.brake
    if stops.brake:
        s = _worst(stops.brake, lambda r: r.deceleration)
        out.append(Check(
            "ride.stop.deceleration", "brake", line,
            f"rider's peak deceleration at the stop ({brake.kind} brake)",
            s.deceleration, limits.max_deceleration, "acceleration", governing=_gov(s, "stop"),
            source=f"{_ENERGY_SOURCE}; limit: [ride] max_deceleration, "
                   f"{limits.source('max_deceleration')}",
            note=f"{s.rider} rider arriving at {s.speed:.2f} m/s, peak stop force "
                 f"{s.peak_force:.0f} N; law: {s.law}"))
        s = _worst(stops.brake, lambda r: r.stroke_used)
        out.append(Check(
            "ride.stop.stroke", "brake", line, "stroke the stop uses against the stroke available",
            s.stroke_used, s.stroke_available, "length", governing=_gov(s, "stop"),
            source=_ENERGY_SOURCE if brake.kind != "rated" else
            "at the maker's peak force throughout (E / F_peak, the least stroke it can use)",
            note=("BOTTOMS OUT: the stroke is too short for the rider's energy; the stop force "
                  "is then higher than computed" if s.bottoms_out else "")))
        if brake.kind == "rated":
            s = _worst(stops.brake, lambda r: r.energy)
            out.append(Check(
                "ride.brake.rated_energy", "brake", line, "arrival energy against the brake's "
                "rated energy", s.energy, brake.rated_energy, "energy", governing=_gov(s, "stop"),
                source="the brake maker's rating (given)"))
            s = _worst(stops.brake, lambda r: r.speed)
            out.append(Check(
                "ride.brake.rated_speed", "brake", line, "arrival speed against the brake's "
                "rated speed", s.speed, brake.rated_speed, "speed", governing=_gov(s, "stop"),
                source="the brake maker's rating (given)"))
    else:
        missing.append(NotChecked("ride", "a stop force at the end",
                                  stops.why_not.get("stop", "not computed")))
    if stops.arrest:
        s = _worst(stops.arrest, lambda r: r.stroke_used)
        out.append(Check(
            "ride.arrest.stroke", "end stop", line,
            "stroke the end stop uses when the brake is missed, against its stroke",
            s.stroke_used, s.stroke_available, "length", governing=_gov(s, "arrest"),
            source=_ENERGY_SOURCE,
            note=(f"peak arrest force {s.peak_force:.0f} N, deceleration "
                  f"{s.deceleration / 9.80665:.1f} g (an emergency: the structure is checked "
                  "against ultimate capacities)"
                  + ("; BOTTOMS OUT: the force is higher than computed" if s.bottoms_out
                     else ""))))
    else:
        missing.append(NotChecked("ride", "the emergency arrest (brake missed)",
                                  stops.why_not.get("arrest", "not computed")))
    return out, missing
