"""Installed state: the line hung between its anchors under its own weight.

The unstressed length comes from the scenario (given directly, or found from
the installed sag or tension). Form-finding starts from the elastic catenary
between rigid supports, then solves the whole structure, and, when a sag or
tension was given, corrects the length by secant steps until the deforming
anchors give the stated value.
"""
from __future__ import annotations

import numpy as np

from fem import State, solve
from fem.errors import FemError
from models.catenary import length_for_sag, length_for_tension
from models.errors import InputError
from models.spec import LineSpec, Scenario
from models.system import BuiltLine, System, build_system

#: relative tolerance on the installed sag or tension found with deforming anchors
MATCH_TOL = 1e-4


def rigid_support_length(line: LineSpec, span: float, drop: float) -> float:
    """Unstressed length from the scenario, with rigid supports."""
    rope = line.rope
    if line.unstressed_length is not None:
        return line.unstressed_length
    if line.sag is not None:
        return length_for_sag(span, drop, line.sag, rope.weight_per_length, rope.EA)
    return length_for_tension(span, drop, line.tension, rope.weight_per_length, rope.EA)


def line_geometry(scenario: Scenario, line: LineSpec) -> tuple[float, float]:
    """Horizontal span and drop (start above end, m) between attachment points."""
    a, b = scenario.anchor(line.start), scenario.anchor(line.end)
    span = float(np.hypot(b.x - a.x, b.y - a.y))
    drop = (a.grade + line.start_height) - (b.grade + line.end_height)
    return span, drop


def measured_sag(system: System, state: State, line: BuiltLine) -> float:
    """Mid-span sag below the chord between the deformed attachment points."""
    pos = system.model.coords[line.nodes] + state.translation[line.nodes]
    along = line.along(pos)
    x_mid = 0.5 * (along[0] + along[-1])
    z_mid = np.interp(x_mid, along, pos[:, 2])
    chord = pos[0, 2] + (pos[-1, 2] - pos[0, 2]) * (x_mid - along[0]) / (along[-1] - along[0])
    return float(chord - z_mid)


def end_tensions(system: System, state: State, line: BuiltLine) -> tuple[float, float]:
    """Tension in the first and last segment."""
    t = state.group(line.group).tension
    return float(t[0]), float(t[-1])


def _target(line: LineSpec):
    if line.sag is not None:
        return line.sag, lambda sys_, st, bl: measured_sag(sys_, st, bl)
    if line.tension is not None:
        return line.tension, lambda sys_, st, bl: max(end_tensions(sys_, st, bl))
    return None, None


def hang_between_ends(system: System, state: State, line: BuiltLine) -> State:
    """A warm start with the cable re-hung, as a segmented elastic chain, between
    where its ends are now (its unstressed length may have changed: nodes left
    where they were would leave a lightly tensioned cable slack)."""
    from models.catenary import chain_points

    model = system.model
    nodes = line.nodes
    ends = model.coords[nodes[[0, -1]]] + state.translation[nodes[[0, -1]]]
    plan = (ends[1] - ends[0])[:2]
    span = float(np.linalg.norm(plan))
    rope = line.spec.rope
    ea = float(model.group(line.group).EA[0])
    group = model.group(line.group)
    length = float(group.free_length().sum())  # at the cable's temperature
    pts = chain_points(span, float(ends[0, 2] - ends[1, 2]), length, rope.weight_per_length, ea,
                       nodes.size - 1)
    plan = plan / span
    xyz = np.column_stack([ends[0, 0] + plan[0] * pts[:, 0], ends[0, 1] + plan[1] * pts[:, 0],
                           ends[0, 2] + pts[:, 1]])
    warm = state.copy()
    warm.translation[nodes[1:-1]] = xyz[1:-1] - model.coords[nodes[1:-1]]
    return warm


def solve_installed(system: System, state: State | None = None) -> State:
    """Equilibrium of the structure under self-weight and pretensions."""
    try:
        return solve(system.model, state=state, steps=1)
    except FemError as exc:
        raise InputError(f"the installed state has no equilibrium: {exc}", "line") from None


def install(scenario: Scenario, rigid: frozenset[str] = frozenset(),
            lengths: dict[str, float] | None = None,
            temperature: float | None = None) -> tuple[System, State, dict[str, float]]:
    """Build and solve the installed state.

    Returns the system, its state and each line's unstressed length. When
    ``lengths`` is given (re-solves of the slack budget, other temperatures)
    they are used as they are: the cable was cut to length once.
    """
    fixed_lengths = lengths is not None
    if lengths is None:
        lengths = {}
        for line in scenario.lines:
            span, drop = line_geometry(scenario, line)
            try:
                lengths[line.name] = rigid_support_length(line, span, drop)
            except ValueError as exc:
                raise InputError(f"cannot hang the line as given: {exc}", f"line '{line.name}'") from None
    system = build_system(scenario, lengths, rigid, temperature)
    state = solve_installed(system)
    if fixed_lengths:
        return system, state, dict(lengths)
    for line in scenario.lines:
        target, measure = _target(line)
        if target is None:
            continue
        bl = system.lines[line.name]
        group = system.model.group(bl.group)
        L_a, v_a = bl.L0, measure(system, state, bl)
        L_b = L_a * (1.0 + (1e-4 if line.sag is not None else -1e-5) * np.sign(target - v_a))
        for _ in range(12):
            group.L0[:] = L_b / group.L0.size
            bl.L0 = L_b
            state = solve_installed(system, hang_between_ends(system, state, bl))
            v_b = measure(system, state, bl)
            if abs(v_b - target) <= MATCH_TOL * abs(target):
                break
            if v_b == v_a:
                break
            L_a, v_a, L_b = L_b, v_b, L_b + (target - v_b) * (L_b - L_a) / (v_b - v_a)
        lengths[line.name] = bl.L0
    return system, state, lengths
