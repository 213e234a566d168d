"""The ``[ride]`` table: the ride's limits and its brake, every default with its source.

Keys of ``[ride]``: ``arrival_speed_limit``, ``min_feet_clearance``,
``hang_distance`` (the rider's hang range, ``["3 ft", "5 ft"]``),
``max_deceleration`` (a number of g), and the sub-tables ``brake`` and
``end_stop`` (the stop that arrests a rider who misses the brake).
"""
from __future__ import annotations

import math
from typing import Any

from spanstay.models.common.errors import InputError
from spanstay.models.common.units import STANDARD_GRAVITY
from spanstay.models.scenario import limits
from spanstay.models.scenario.reader import Table, read_quantity
from spanstay.models.scenario.ride_spec import (DEFAULT_BEDDING_IN_STRETCH, DEFAULT_DROP_HEIGHT,
                                                DEFAULT_RIDE_WIND)
from spanstay.models.scenario.spec import (DEFAULT_MAX_DECELERATION, DEFAULT_MIN_FEET_CLEARANCE,
                                           DEFAULT_RESCUE_FACTOR, DEFAULT_RESCUER,
                                           SPRING_ARRIVAL_LIMIT, WALKING_PACE, BrakeSpec,
                                           RideLimits)

RIDE_KEYS = ("arrival_speed_limit", "min_feet_clearance", "hang_distance", "max_deceleration",
             "brake", "end_stop", "single_rider", "second_rider", "rescuer", "rescue_factor",
             "rescue_on_line", "bedding_in_stretch", "drop_height", "head_wind",
             "tail_wind")
BRAKE_KEYS = ("kind", "stroke", "stiffness", "curve", "rated_speed", "rated_energy",
              "peak_force", "acts_on")
ACTS_ON = ("cable", "end-anchor")
BRAKE_KINDS = ("none", "spring", "bungee", "gravity", "rated")
END_STOP_KINDS = ("spring", "bungee")
#: longest stroke of a stop block or brake, m (a judgement)
STROKE_MAX = 50.0

_LAW_KEYS = ("stroke", "stiffness", "curve")
_RATED_KEYS = ("rated_speed", "rated_energy", "peak_force")


def read_ride(table: Table | None) -> RideLimits:
    """The ride's limits from ``[ride]`` (None: every default), each with its source."""
    table = table or Table({}, "ride", RIDE_KEYS)
    sources: dict[str, str] = {}
    brake_table = table.table("brake", BRAKE_KEYS)
    brake = read_brake(brake_table, BRAKE_KINDS) if brake_table else BrakeSpec("none")
    sources["brake"] = "given" if brake_table else "our judgement: no brake unless one is given"
    stop_table = table.table("end_stop", BRAKE_KEYS)
    end_stop = read_brake(stop_table, END_STOP_KINDS) if stop_table else None
    if table.has("arrival_speed_limit"):
        arrival = table.quantity("arrival_speed_limit", "speed", positive=True,
                                 maximum=limits.START_SPEED_MAX)
        sources["arrival_speed_limit"] = "given"
    else:
        arrival, sources["arrival_speed_limit"] = default_arrival_limit(brake)
    clearance = table.quantity("min_feet_clearance", "length", DEFAULT_MIN_FEET_CLEARANCE,
                               minimum=0.0, maximum=limits.HANG_DISTANCE_MAX)
    sources["min_feet_clearance"] = ("given" if table.has("min_feet_clearance")
                                     else "our judgement")
    hang = None
    if table.has("hang_distance"):
        low, high = table.quantities("hang_distance", "length", 2)
        for i, value in enumerate((low, high)):
            if not 0.0 <= value <= limits.HANG_DISTANCE_MAX:
                raise InputError(f"must be between 0 and {limits.HANG_DISTANCE_MAX:g} m",
                                 f"{table.where('hang_distance')}[{i + 1}]")
        if high < low:
            raise InputError("give the shortest hang distance first, then the longest",
                             table.where("hang_distance"))
        hang = (low, high)
        sources["hang_distance"] = "given"
    else:
        sources["hang_distance"] = "the rider's hang_distance"
    decel_g = table.number("max_deceleration", DEFAULT_MAX_DECELERATION / STANDARD_GRAVITY,
                           positive=True, maximum=20.0)
    sources["max_deceleration"] = ("given (in g)" if table.has("max_deceleration")
                                   else "our judgement (2 g)")
    single = table.flag("single_rider", False)
    second = table.quantity("second_rider", "weight", None, positive=True,
                            maximum=limits.RIDER_WEIGHT_MAX)
    if single and second is not None:
        raise InputError("a single-rider line has no second rider: give one or the other",
                         table.where("second_rider"))
    rescuer = table.quantity("rescuer", "weight", DEFAULT_RESCUER, positive=True,
                             maximum=limits.RIDER_WEIGHT_MAX)
    sources["single_rider"] = ("given" if table.has("single_rider") else
                               "our judgement: a second rider may be sent before the first is off")
    sources["second_rider"] = "given" if second is not None else "the heaviest rider"
    sources["rescuer"] = "given" if table.has("rescuer") else "our judgement (250 lbf with kit)"
    rescue_factor = table.number("rescue_factor", DEFAULT_RESCUE_FACTOR, minimum=1.0, maximum=5.0)
    sources["rescue_factor"] = ("given" if table.has("rescue_factor") else
                                "our judgement: a slow, controlled move")
    on_line = table.flag("rescue_on_line", True)
    sources["rescue_on_line"] = ("given" if table.has("rescue_on_line") else
                                 "our judgement: a stuck rider is reached along the line")
    if not on_line:
        table.forbid(("rescuer", "rescue_factor"), "when the rescue is from the ground")
    stretch = table.number("bedding_in_stretch", DEFAULT_BEDDING_IN_STRETCH, minimum=0.0,
                           maximum=0.02)
    sources["bedding_in_stretch"] = ("given" if table.has("bedding_in_stretch") else
                                     "from memory, common practice for stranded steel rope "
                                     "(0.25 %); give the rope maker's figure")
    drop = table.quantity("drop_height", "length", DEFAULT_DROP_HEIGHT, minimum=0.0,
                          maximum=5.0)
    sources["drop_height"] = "given" if table.has("drop_height") else "our judgement"
    winds = {}
    for key in ("head_wind", "tail_wind"):
        winds[key] = table.quantity(key, "speed", DEFAULT_RIDE_WIND, minimum=0.0, maximum=40.0)
        sources[key] = ("given" if table.has(key) else
                        "our judgement: a breezy day; close the line in stronger wind")
    return RideLimits(arrival_speed_limit=arrival, bedding_in_stretch=stretch, drop_height=drop,
                      **winds, min_feet_clearance=clearance,
                      hang_distance=hang, max_deceleration=decel_g * STANDARD_GRAVITY,
                      brake=brake, end_stop=end_stop, single_rider=single, second_rider=second,
                      rescuer=rescuer, rescue_factor=rescue_factor, rescue_on_line=on_line,
                      sources=tuple(sources.items()))


def default_arrival_limit(brake: BrakeSpec) -> tuple[float, str]:
    """The arrival speed limit a brake of this kind gets when none is given, and why."""
    if brake.kind == "rated":
        assert brake.rated_speed is not None
        return brake.rated_speed, "the brake maker's rated speed"
    if brake.kind in ("spring", "bungee"):
        return SPRING_ARRIVAL_LIMIT, ("our judgement: faster than this a stop block is not "
                                      "enough, use a brake rated by its maker")
    what = "no brake" if brake.kind == "none" else "a gravity (uphill) end"
    return WALKING_PACE, (f"our judgement: with {what} the rider must arrive at walking "
                          "pace")


def read_brake(table: Table, kinds: tuple[str, ...]) -> BrakeSpec:
    """A brake or end stop table; the keys its kind needs, and only those."""
    kind = table.text("kind", choices=kinds)
    if kind in ("none", "gravity"):
        table.forbid(_LAW_KEYS + _RATED_KEYS + ("acts_on",), f'to a brake of kind "{kind}"')
        return BrakeSpec(kind)
    stroke = table.quantity("stroke", "length", positive=True, maximum=STROKE_MAX)
    acts_on = table.text("acts_on", "cable", ACTS_ON)
    if kind == "rated":
        table.forbid(("stiffness", "curve"), 'to a brake of kind "rated" (give its peak_force)')
        return BrakeSpec(kind, stroke=stroke,
                         rated_speed=table.quantity("rated_speed", "speed", positive=True,
                                                    maximum=limits.START_SPEED_MAX),
                         rated_energy=table.quantity("rated_energy", "energy", positive=True),
                         peak_force=table.quantity("peak_force", "force", positive=True),
                         acts_on=acts_on)
    table.forbid(_RATED_KEYS, f'to a stop of kind "{kind}" (its force-stroke law sets them)')
    which = table.one_of(("stiffness", "curve"))
    if which == "stiffness":
        return BrakeSpec(kind, stroke=stroke, acts_on=acts_on,
                         stiffness=table.quantity("stiffness", "force per length", positive=True))
    return BrakeSpec(kind, stroke=stroke, curve=read_curve(table, stroke), acts_on=acts_on)


def read_curve(table: Table, stroke: float) -> tuple[tuple[float, float], ...]:
    """(stroke, force) points: strokes rising from above 0 to at least the stroke
    available, forces not falling (the law starts at (0, 0))."""
    where = table.where("curve")
    raw: Any = table.raw("curve")
    if not isinstance(raw, list) or len(raw) < 1:
        raise InputError('expected an array of [stroke, force] pairs, e.g. '
                         '[["1 ft", "100 lbf"], ["3 ft", "400 lbf"]]', where)
    points = [(0.0, 0.0)]
    for i, pair in enumerate(raw):
        here = f"{where}[{i + 1}]"
        if not isinstance(pair, list) or len(pair) != 2:
            raise InputError('expected a [stroke, force] pair, e.g. ["1 ft", "100 lbf"]', here)
        x = read_quantity(pair[0], "length", f"{here}[1]", positive=True)
        f = read_quantity(pair[1], "force", f"{here}[2]", positive=True)
        if x <= points[-1][0] or f < points[-1][1] or not math.isfinite(x + f):
            raise InputError("strokes must rise and forces must not fall from one point to "
                             "the next", here)
        points.append((x, f))
    if points[-1][0] < stroke * (1.0 - 1e-9):
        raise InputError(f"the curve ends at {points[-1][0]:.3g} m, short of the stroke "
                         f"available ({stroke:.3g} m): give it to the full stroke", where)
    return tuple(points)
