"""The main job: hang the line, step the riders, work out the ride, the slack
budget and the checks. Writing the results is models.outputs.results_folder' job."""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import Callable

import numpy as np

from spanstay.fem import State, solve
from spanstay.fem.errors import FemError
from spanstay.models.common.errors import InputError
from spanstay.models.analysis.installed import install
from spanstay.models.analysis.ride import Clearance, RideResult, feet_clearance, ride_speed
from spanstay.models.scenario.spec import Scenario
from spanstay.models.analysis.stations import Pass, run_pass
from spanstay.models.parts.system import System
from spanstay.models.common.units import STANDARD_GRAVITY

#: smallest clearance of the rider's feet over the ground: a judgement of ours
MIN_CLEARANCE = 0.15
#: largest arrival speed at the far end: a judgement of ours for a line without a
#: braking system; set your own with the brake you use
MAX_ARRIVAL_SPEED = 5.0


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
    design_system: System | None = None     # laminated posts with K_u (else the same system)
    design_installed: State | None = None


def station_coordinates(system: System, state: State, line_name: str, start_offset: float,
                        stop_offset: float, count: int) -> np.ndarray:
    """Unstressed arc coordinates of ``count`` stations between the offsets.

    Offsets are horizontal distances from the start and end attachments,
    mapped to arc coordinates on the installed shape.
    """
    line = system.lines[line_name]
    pos = system.model.coords[line.nodes] + state.translation[line.nodes]
    along = line.along(pos)
    s_nodes = line.arc_coordinates(None)
    span = along[-1]
    if start_offset + stop_offset >= span:
        raise InputError(f"the ride's start and stop offsets ({start_offset:.2f} m + "
                         f"{stop_offset:.2f} m) leave no ride on a {span:.2f} m span", "rider")
    s0 = float(np.interp(start_offset, along, s_nodes))
    s1 = float(np.interp(span - stop_offset, along, s_nodes))
    return np.linspace(s0, s1, max(int(count), 2))


def _at_temperature(system: System, installed: State, d_t: float) -> State:
    """The installed state with every line's cable at a temperature change ``d_t``.

    Each cable is re-hung as a segmented elastic chain of its new free length
    between where its ends are, then the whole structure is solved (a lightly
    tensioned cable that grows by its thermal strain would otherwise start
    slack).
    """
    from spanstay.models.analysis.installed import hang_between_ends

    for line in system.lines.values():
        system.model.group(line.group).dT[:] = d_t
    if d_t == 0.0:
        return installed
    state = installed
    for line in system.lines.values():
        state = hang_between_ends(system, state, line)
    try:
        return solve(system.model, state=state, steps=1)
    except FemError as exc:
        raise InputError(f"no installed equilibrium at a temperature change of {d_t:+.1f} K: {exc}",
                         "settings.use_temperatures") from None


def analyse(scenario: Scenario, stations: int | None = None,
            progress: Callable[[str, int], None] | None = None,
            slack_budget: bool = True) -> RunResult:
    """Run the whole analysis of a scenario with a rider.

    ``progress(label, count)`` is called once per solved station.
    """
    rider = scenario.rider
    if rider is None:
        raise InputError("a [rider] table is needed to run the line", "rider")
    system, installed, lengths = install(scenario)
    count = stations or rider.stations
    s = station_coordinates(system, installed, rider.line, rider.start_offset, rider.stop_offset, count)
    line = system.lines[rider.line]
    t_inst = scenario.settings.install_temperature
    temps = list(scenario.settings.use_temperatures) + [t_inst]
    t_cold, t_hot = min(temps), max(temps)
    plan = [("ride_light", rider.lightest, t_inst, False),
            ("ride_heavy", rider.heaviest, t_inst, True)]
    if t_hot > t_inst + 0.05:
        plan.append(("hot", rider.heaviest, t_hot, False))
    passes: dict[str, Pass] = {}
    for label, weight, temp, keep in plan:
        start = _at_temperature(system, installed, temp - t_inst)
        tick = (lambda lab=label: progress(lab, 1)) if progress else None
        passes[label] = run_pass(system, start, line, s, weight, label, temp, keep_states=keep,
                                 progress=tick)
    _at_temperature(system, installed, 0.0)
    # strength: laminated posts with the ultimate slip modulus K_u (EC5 2.2.2), the same
    # cut cable and wire lengths; every line carries the heaviest rider in turn, so the
    # anchors a line shares are checked under its pull too
    design_system, design_installed = system, installed
    if any(a.post is not None and a.post.kind == "laminated" for a in scenario.anchors):
        design_system, design_installed, _ = install(scenario, lengths=lengths, slip="ultimate")
    design_start = _at_temperature(design_system, design_installed, t_cold - t_inst)
    for name in [rider.line] + other_lines(scenario):
        label = "design" if name == rider.line else f"design-{name}"
        s_line = s if name == rider.line else station_coordinates(
            system, installed, name, rider.start_offset, rider.stop_offset, count)
        tick = (lambda lab=label: progress(lab, 1)) if progress else None
        passes[label] = run_pass(design_system, design_start, design_system.lines[name], s_line,
                                 rider.heaviest * rider.dynamic_factor, label, t_cold,
                                 keep_states=True, progress=tick)
    _at_temperature(design_system, design_installed, 0.0)
    result = RunResult(scenario, system, installed, lengths, s, passes,
                       design_system=design_system, design_installed=design_installed)
    _ride(result)
    if slack_budget:
        from spanstay.models.analysis.slack_budget import slack_budget as budget
        result.slack = budget(result)
    result.checks = _checks(result)
    return result


def other_lines(scenario: Scenario) -> list[str]:
    """Names of the lines other than the one the rider's table names."""
    return [line.name for line in scenario.lines if line.name != scenario.rider.line]


def pass_count(scenario: Scenario) -> int:
    """How many rider passes a run makes (for a progress bar)."""
    settings = scenario.settings
    hot = max(settings.use_temperatures + (settings.install_temperature,)) > settings.install_temperature + 0.05
    return 3 + int(hot) + len(other_lines(scenario))


def _profile(p: Pass) -> tuple[np.ndarray, np.ndarray]:
    along = np.array([st.along for st in p.stations])
    z = np.array([st.rider[2] for st in p.stations])
    return along, z


def _ride(result: RunResult) -> None:
    rider = result.scenario.rider
    ground = result.scenario.ground
    gd = np.array([g[0] for g in ground.profile])
    gz = np.array([g[1] for g in ground.profile])
    for key, label in (("lightest", "ride_light"), ("heaviest", "ride_heavy")):
        p = result.passes[label]
        if len(p.stations) < 2:
            continue
        along, z = _profile(p)
        mass = p.weight / STANDARD_GRAVITY
        result.rides[key] = ride_speed(along, z, mass, rolling_resistance=rider.rolling_resistance,
                                       drag_area=rider.drag_area, start_speed=rider.start_speed,
                                       air_density=rider.air_density)
    worst = None
    for label in ("ride_heavy", "hot"):
        p = result.passes.get(label)
        if p is None or len(p.stations) < 2:
            continue
        along, z = _profile(p)
        c = feet_clearance(along, z, rider.hang_distance, gd, gz)
        if worst is None or c.minimum < worst.minimum:
            worst = c
    result.clearance = worst


def _util(check) -> float:
    u = check.utilization
    return -1.0 if u is None else float(u)


def _checks(result: RunResult) -> list:
    from spanstay.models.checks.structural import structural_checks
    from spanstay.models.checks.ride import ride_checks

    worst: dict[str, object] = {}
    for label, p in result.passes.items():
        if not label.startswith("design") or not p.states:
            continue
        for c in structural_checks(result.design_system or result.system, p,
                                   installed=result.design_installed or result.installed):
            old = worst.get(c.id)
            if old is None or _util(c) > _util(old):
                worst[c.id] = c
    return list(worst.values()) + ride_checks(result, MIN_CLEARANCE, MAX_ARRIVAL_SPEED)


def anchor_shares(result: RunResult) -> dict[str, dict]:
    """How the line's pull on each guyed or braced anchor divides between its guys,
    its brace and its footing (horizontal ground reactions) at the design pass's
    station of largest cable tension."""
    from spanstay.models.checks.anchors import reaction_shares

    design = result.passes["design"]
    if not design.states:
        return {}
    k = int(np.argmax([st.tension_max for st in design.stations]))
    out = {}
    for name, anchor in result.system.anchors.items():
        if not anchor.spec.guys and anchor.spec.brace is None:
            continue
        shares = reaction_shares(result.design_system.model, result.design_system.anchors[name],
                                 design.states[k])
        horizontal = {part: float(np.hypot(*v[:2])) for part, v in shares.items()}
        total = sum(horizontal.values()) or 1.0
        out[name] = {"station": k, "along": design.stations[k].along,
                     "horizontal": horizontal,
                     "fraction": {part: v / total for part, v in horizontal.items()}}
    return out
