"""The analysis of a run: hang the line, run every load case, work out the ride and
the slack budget. The checks are :mod:`spanstay.models.checks`' job, writing the
results :mod:`spanstay.models.outputs`'."""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import Callable

import numpy as np

from spanstay.fem import State
from spanstay.models.analysis.installed import install
from spanstay.models.analysis.arrival import Stops, arrival_stops
from spanstay.models.analysis.load_cases import (LoadCase, load_cases, needs_ultimate_slip,
                                                 stop_cases)
from spanstay.models.analysis.clearance import Clearance, feet_clearance
from spanstay.models.analysis.ride import RideResult, ride_speed
from spanstay.models.analysis.parallel import default_workers, run_cases
from spanstay.models.analysis.run_case import Structure, station_coordinates
from spanstay.models.analysis.stations import Pass
from spanstay.models.common.errors import InputError
from spanstay.models.common.units import STANDARD_GRAVITY
from spanstay.models.parts.system import System
from spanstay.models.scenario.spec import Scenario


@dataclass
class RunResult:
    """Everything `spanstay run` computes (SI)."""

    scenario: Scenario
    system: System
    installed: State
    lengths: dict[str, float]
    stations_s: np.ndarray
    passes: dict[str, Pass]
    rides: dict[str, RideResult] = field(default_factory=dict)
    clearance: Clearance | None = None
    slack: object | None = None
    checks: list = field(default_factory=list)
    verdict: object | None = None           # spanstay.models.checks.verdict.Verdict
    design_system: System | None = None     # laminated posts with K_u (else the same system)
    design_installed: State | None = None
    cases: tuple[LoadCase, ...] = ()
    stops: Stops | None = None              # the brake's stop and the emergency arrest
    clearances: dict[str, Clearance] = field(default_factory=dict)  # per clearance pass
    clearance_pass: str = ""                # the pass that gives the smallest clearance
    drops: list = field(default_factory=list)  # analysis.drop.DropFactor: the factor's basis
    drop_why: str = ""                      # why a drop factor is missing
    wind_rides: dict = field(default_factory=dict)  # "head"/"tail" -> rider -> WindRide


def structures(scenario: Scenario) -> dict[str, Structure]:
    """The installed structure for each fastener slip state the load cases use.

    The strength structure (laminated posts with K_u) keeps the cut lengths of
    the service one: the cable and wires are cut once.
    """
    system, installed, lengths = install(scenario)
    out = {"service": Structure(system, installed, lengths)}
    if needs_ultimate_slip(scenario):
        u_system, u_installed, _ = install(scenario, lengths=lengths, slip="ultimate")
        out["ultimate"] = Structure(u_system, u_installed, lengths)
    else:
        out["ultimate"] = out["service"]
    return out


def analyse(scenario: Scenario, stations: int | None = None,
            progress: Callable[[str, int], None] | None = None,
            slack_budget: bool = True, workers: int | None = None) -> RunResult:
    """Run every load case of a scenario with a rider (no checks).

    ``progress(label, count)`` is called once per solved station. ``workers``
    processes run the cases side by side (default: one per case, at most the
    cores available; 1 runs them one after another here); the answers are the
    same either way.
    """
    rider = scenario.rider
    if rider is None:
        raise InputError("a [rider] table is needed to run the line", "rider")
    cases = load_cases(scenario, stations)
    built = structures(scenario)
    service = built["service"]
    coords: dict[str, np.ndarray] = {}
    for case in cases:
        if case.line not in coords:  # stations on the installed (service) shape
            coords[case.line] = station_coordinates(service.system, service.installed, case.line,
                                                    rider.start_offset, rider.stop_offset,
                                                    case.stations)
    n_workers = default_workers(len(cases)) if workers is None else int(workers)
    passes = run_cases(built, cases, coords, n_workers, progress)
    strength = built["ultimate"]
    result = RunResult(scenario, service.system, service.installed, service.lengths,
                       coords[rider.line], passes, design_system=strength.system,
                       design_installed=strength.installed, cases=cases)
    _ride(result)
    from spanstay.models.analysis.drop import drop_factors
    result.drops, result.drop_why = drop_factors(service, rider.line, coords[rider.line],
                                                 rider.heaviest, scenario.ride.drop_height)
    result.wind_rides = _wind_rides(result)
    tail = {k: r.arrival_speed for k, r in result.wind_rides.get("tail", {}).items()
            if r.reaches_end}
    result.stops = arrival_stops(scenario, result.rides, tail)
    more = stop_cases(scenario, result.stops.stop_force, result.stops.arrest_force)
    if more:  # one station each, at the ride's end: after the rides that give the speed
        end = {rider.line: coords[rider.line][-1:]}
        passes.update(run_cases(built, more, end, min(n_workers, len(more)), progress))
        result.cases = cases + more
    if slack_budget and passes["ride_heavy"].complete:
        from spanstay.models.analysis.slack_budget import slack_budget as budget
        result.slack = budget(result)
    return result


def pass_count(scenario: Scenario) -> int:
    """How many rider passes a run makes (for a progress bar; the stop and arrest
    passes, one station each, are not counted)."""
    return len(load_cases(scenario))


def _profile(p: Pass) -> tuple[np.ndarray, np.ndarray]:
    along = np.array([st.along for st in p.stations])
    z = np.array([st.rider[2] for st in p.stations])
    return along, z


def _rider_profiles(result: RunResult):
    """(rider key, along, z, mass) of the lightest and heaviest riders' complete passes."""
    for key, label in (("lightest", "ride_light"), ("heaviest", "ride_heavy")):
        p = result.passes[label]
        if p.complete and len(p.stations) >= 2:
            along, z = _profile(p)
            yield key, along, z, p.weight / STANDARD_GRAVITY


def _ride(result: RunResult) -> None:
    rider = result.scenario.rider
    ground = result.scenario.ground
    gd = np.array([g[0] for g in ground.profile])
    gz = np.array([g[1] for g in ground.profile])
    # ride results only from complete passes: a partial profile gives a wrong speed
    for key, along, z, mass in _rider_profiles(result):
        result.rides[key] = ride_speed(along, z, mass, rolling_resistance=rider.rolling_resistance,
                                       drag_area=rider.drag_area, start_speed=rider.start_speed,
                                       air_density=rider.air_density)
    worst = None
    for label in CLEARANCE_PASSES:
        p = result.passes.get(label)
        if p is None:
            continue
        if not p.complete or len(p.stations) < 2:
            result.clearance = None
            return
        along, z = _profile(p)
        c = feet_clearance(along, z, longest_hang(result.scenario), gd, gz)
        result.clearances[label] = c
        if worst is None or c.minimum < worst.minimum:
            worst, result.clearance_pass = c, label
    result.clearance = worst


def _wind_rides(result: RunResult) -> dict:
    """Each rider's ride in the head wind and the tail wind of [ride] (complete passes)."""
    from spanstay.models.analysis.ride_wind import ride_in_wind

    rider, limits = result.scenario.rider, result.scenario.ride
    out: dict = {"head": {}, "tail": {}}
    for key, along, z, mass in _rider_profiles(result):
        for name, wind in (("head", -limits.head_wind), ("tail", limits.tail_wind)):
            out[name][key] = ride_in_wind(along, z, mass, wind,
                                          rolling_resistance=rider.rolling_resistance,
                                          drag_area=rider.drag_area,
                                          air_density=rider.air_density,
                                          start_speed=rider.start_speed)
    return out


#: the passes whose feet clearance is checked: the heaviest rider as installed, on the
#: hottest day, after bedding-in, and bouncing (the design pass: times the dynamic factor)
CLEARANCE_PASSES = ("ride_heavy", "hot", "bedded", "design")


def longest_hang(scenario: Scenario) -> float:
    """The longest hang distance (cable to feet) of the ride's range, or the rider's."""
    hang = scenario.ride.hang_distance
    return scenario.rider.hang_distance if hang is None else max(hang[1],
                                                                  scenario.rider.hang_distance)
