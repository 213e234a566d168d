"""Running one load case on an installed structure, leaving the structure unchanged."""
from __future__ import annotations

import copy
from dataclasses import dataclass
from typing import Callable

import numpy as np

from spanstay.fem import State, solve
from spanstay.fem.errors import FemError
from spanstay.models.analysis.installed import hang_between_ends, measured_sag
from spanstay.models.analysis.load_cases import LoadCase
from spanstay.models.analysis.stations import Pass, run_pass
from spanstay.models.common.errors import InputError
from spanstay.models.parts.system import System


@dataclass(frozen=True)
class Structure:
    """An installed structure: the built system, its installed state, its cut lengths."""

    system: System
    installed: State
    lengths: dict[str, float]


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


def at_temperature(system: System, installed: State, d_t: float) -> State:
    """Set every line's cable of ``system`` to a temperature change ``d_t`` and return
    the equilibrium there (``system`` is changed: call it on a copy).

    Each cable is re-hung as a segmented elastic chain of its new free length
    between where its ends are, then the whole structure is solved (a lightly
    tensioned cable that grows by its thermal strain would otherwise start
    slack).
    """
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


def _add_extra_loads(system: System, case: LoadCase) -> None:
    for load in case.extra_loads:
        anchor = system.anchors[load.anchor]
        system.model.add_load(anchor.node_at(load.height), list(load.force))


def run_case(structure: Structure, case: LoadCase, stations_s: np.ndarray,
             progress: Callable[[], None] | None = None) -> Pass:
    """Solve ``case`` at every arc coordinate of ``stations_s`` on a copy of the structure.

    The shared ``structure`` is never changed (unstressed lengths, temperatures
    and loads are set on a private copy), so cases are independent values.
    """
    system = copy.deepcopy(structure.system)
    d_t = case.temperature - system.scenario.settings.install_temperature
    start = at_temperature(system, structure.installed, d_t)
    if case.stretch:
        start = bedded_in(system, start, case.line, case.stretch)
    _add_extra_loads(system, case)
    result = run_pass(system, start, system.lines[case.line], stations_s, case.rider_load,
                      case.name, case.temperature, keep_states=case.keep_states,
                      progress=progress, push=case.push, fixed=case.fixed)
    if case.stretch:
        result.unloaded_sag = measured_sag(system, start, system.lines[case.line])
    return result


def bedded_in(system: System, state: State, line_name: str, stretch: float) -> State:
    """Lengthen the unstressed cable of ``line_name`` by the strain ``stretch`` (its
    constructional stretch once bedded in), re-hang it and return the equilibrium
    without a rider (``system`` is changed: call it on a copy)."""
    line = system.lines[line_name]
    line.L0 *= 1.0 + float(stretch)
    system.model.group(line.group).L0[:] = line.segment_lengths(None)
    state = hang_between_ends(system, state, line)
    try:
        return solve(system.model, state=state, steps=1)
    except FemError as exc:
        raise InputError(f"no equilibrium of the line after bedding-in ({100 * stretch:.2g} % "
                         f"stretch): {exc}", "ride.bedding_in_stretch") from None
