"""The ride's limits, brake, stops and temperatures of use as lines of text, each default
with its source (shared by the terminal summary and the report)."""
from __future__ import annotations

from spanstay.models.common.units import STANDARD_GRAVITY, show


def brake_words(brake, units: str) -> str:
    """A brake or end stop in a phrase."""
    if brake.kind == "none":
        return "none"
    if brake.kind == "gravity":
        return "gravity (the line ends uphill)"
    where = "on the cable" if brake.acts_on == "cable" else "tied off to the end anchor"
    if brake.kind == "rated":
        return (f"rated by its maker: {show(brake.rated_speed, 'speed', units)}, "
                f"{show(brake.rated_energy, 'energy', units)}, peak force "
                f"{show(brake.peak_force, 'force', units)}, stroke "
                f"{show(brake.stroke, 'length', units)}, {where}")
    law = (f"stiffness {show(brake.stiffness, 'stiffness', units)}" if brake.stiffness is not None
           else f"a force-stroke curve of {len(brake.curve) - 1} points")
    return f"{brake.kind}, {law}, stroke {show(brake.stroke, 'length', units)}, {where}"


def ride_limit_lines(scenario, units: str) -> list[str]:
    """The [ride] settings in force, each with where it comes from."""
    r = scenario.ride
    hang = (f"{show(r.hang_distance[0], 'length', units)} to "
            f"{show(r.hang_distance[1], 'length', units)}" if r.hang_distance is not None
            else show(scenario.rider.hang_distance, "length", units))
    s = scenario.settings
    temps = ", ".join(show(t, "temperature", units) for t in s.use_temperatures)
    t_src = ("default: installation +/- 25 K (our judgement), no use_temperatures given"
             if s.use_temperatures_default else "given")
    lines = [
        f"brake: {brake_words(r.brake, units)} ({r.source('brake')})",
        f"end stop (brake missed): "
        + (brake_words(r.end_stop, units) + " (given)" if r.end_stop is not None else "none given"),
        f"arrival speed limit {show(r.arrival_speed_limit, 'speed', units)} "
        f"({r.source('arrival_speed_limit')})",
        f"largest deceleration at the stop {r.max_deceleration / STANDARD_GRAVITY:.2g} g "
        f"({r.source('max_deceleration')})",
        f"smallest feet clearance {show(r.min_feet_clearance, 'length', units)} "
        f"({r.source('min_feet_clearance')})",
        f"hang distance {hang} ({r.source('hang_distance')}; the longest is used for the feet "
        "clearance)",
        f"temperatures of use {temps} ({t_src})",
        f"wind on the ride: head {show(r.head_wind, 'speed', units)} "
        f"({r.source('head_wind')}), tail {show(r.tail_wind, 'speed', units)} "
        f"({r.source('tail_wind')})",
        f"a rider's drop onto the line {show(r.drop_height, 'length', units)} "
        f"({r.source('drop_height')})",
        f"constructional stretch of the ridden rope once bedded in "
        f"{100 * r.bedding_in_stretch:.3g} % ({r.source('bedding_in_stretch')})",
        ("two riders: not checked, the line is single-rider (given)" if r.single_rider else
         f"two riders: a second rider of {show(r.second_rider_or(scenario.rider), 'force', units)}"
         f" stopped at mid-span (static) while the heaviest rides times the dynamic factor "
         f"({r.source('second_rider')}; "
         f"{r.source('single_rider')})"),
        (f"rescue: a rescuer of {show(r.rescuer, 'force', units)} travels to the heaviest "
         f"rider stuck at mid-span ({r.source('rescuer')}); both times {r.rescue_factor:g} "
         f"({r.source('rescue_factor')})" if r.rescue_on_line else
         "rescue: from the ground, not on the line (given): no rescue load case"),
    ]
    return lines


def stop_lines(stops, units: str) -> list[str]:
    """Each rider's stop by the brake and by the end stop."""
    if stops is None:
        return []
    out = []
    for label, items in (("stop", stops.brake), ("arrest", stops.arrest)):
        for s in items:
            out.append(f"{label}, {s.rider} rider at {show(s.speed, 'speed', units)}: peak force "
                       f"{show(s.peak_force, 'force', units)}, deceleration "
                       f"{s.deceleration / STANDARD_GRAVITY:.2f} g, stroke "
                       f"{show(s.stroke_used, 'length', units)} of "
                       f"{show(s.stroke_available, 'length', units)}"
                       + (" (BOTTOMS OUT)" if s.bottoms_out else ""))
    for what, why in stops.why_not.items():
        out.append(f"{what}: not computed: {why}")
    return out


def bedding_lines(result, units: str) -> list[str]:
    """Sag and clearance after bedding-in, and the take-up that restores the installed sag."""
    p = result.passes.get("bedded")
    if p is None:
        return []
    if not p.complete:
        return ["after bedding-in: not computed, because pass 'bedded' stopped early"]
    sc = result.scenario
    name = sc.rider.line
    take_up = sc.ride.bedding_in_stretch * result.lengths[name]
    out = [f"after bedding-in (before re-tensioning): sag {show(p.unloaded_sag, 'length', units)}"
           f" without a rider, {show(max(s.sag for s in p.stations), 'length', units)} under the "
           f"heaviest rider on the hottest day"]
    c = result.clearances.get("bedded")
    if c is not None:
        out[-1] += f", smallest feet clearance {show(c.minimum, 'length', units)}"
    out.append(f"re-tensioning after bedding-in: take up {show(take_up, 'length', units)} of "
               f"cable ({100 * sc.ride.bedding_in_stretch:.3g} % of its unstressed length) to "
               "restore the installed sag; inspect and re-tension after the first rides")
    return out


def dynamic_lines(result, units: str) -> list[str]:
    """The dynamic factor chosen beside the ones the line's force-sag law gives, with a
    warning when the chosen one is below."""
    rider = result.scenario.rider
    out = []
    for d in getattr(result, "drops", []):
        out.append(f"dynamic factor basis at the {d.where} ({show(d.along, 'length', units)}): "
                   f"a drop of {show(d.drop_height, 'length', units)} gives "
                   f"{d.drop_factor:.2f}, a bounce (weight applied suddenly) {d.bounce_factor:.2f}"
                   " (energy balance on the loaded line's force-sag law, work-energy theorem)")
    if getattr(result, "drop_why", ""):
        out.append(f"dynamic factor basis: not computed: {result.drop_why}")
    worst = max((max(d.drop_factor, d.bounce_factor) for d in getattr(result, "drops", [])),
                default=None)
    if worst is not None:
        out.append(f"dynamic factor used {rider.dynamic_factor:g}"
                   + (f"; WARNING: below the computed {worst:.2f}: raise it, or justify it"
                      if rider.dynamic_factor < worst else
                      f", not below the computed {worst:.2f}"))
    return out


def stop_pass_lines(result, units: str) -> list[str]:
    """The line's end tensions and the end anchor's movement in the stop and arrest passes."""
    out = []
    line = result.scenario.line(result.scenario.rider.line)
    for name in ("stop", "arrest"):
        p = result.passes.get(name)
        if p is None or not p.complete or not p.stations:
            continue
        st = p.stations[0]
        move = float((st.anchor_disp.get(line.end, [0.0, 0.0, 0.0])[0] ** 2
                      + st.anchor_disp.get(line.end, [0.0, 0.0, 0.0])[1] ** 2) ** 0.5)
        out.append(f"{name} pass: line tension {show(st.tension_start, 'force', units)} at "
                   f"'{line.start}', {show(st.tension_end, 'force', units)} at '{line.end}' "
                   f"(largest {show(st.tension_max, 'force', units)}); the end anchor moves "
                   f"{show(move, 'length', units)} at the line")
    return out


def loaded_lines(result, units: str) -> list[str]:
    """The loaded sag ratio and where each rider's trolley presses least on the cable."""
    from spanstay.models.checks.lift_off import loaded_sag_ratio

    out = stop_pass_lines(result, units) + dynamic_lines(result, units) + bedding_lines(result, units)
    for wind, riders in (getattr(result, "wind_rides", {}) or {}).items():
        for key, r in riders.items():
            out.append(f"ride in the {wind} wind, {key} rider: "
                       + (f"arrives at {show(r.arrival_speed, 'speed', units)}" if r.reaches_end
                          else f"STOPS {show(r.stop_distance, 'length', units)} along the line"))
    ratio = loaded_sag_ratio(result)
    if ratio is not None:
        out.append(f"loaded sag ratio {100 * ratio[0]:.1f} % (largest sag under the heaviest "
                   f"rider {show(ratio[1], 'length', units)} over the span)")
    for key, ride in result.rides.items():
        out.append(f"trolley, {key} rider: least normal force {ride.min_normal_ratio:.2f} x the "
                   f"weight at {show(ride.min_normal_distance, 'length', units)}"
                   + (" (LIFTS OFF)" if ride.lifts_off else ""))
    if result.clearance is not None and result.clearance_pass:
        out.append(f"smallest feet clearance in pass '{result.clearance_pass}' (passes checked: "
                   "ride_heavy, hot, bedded, design)")
    return out
