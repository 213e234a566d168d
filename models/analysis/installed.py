"""Installed state: the line hung between its anchors under its own weight.

The unstressed length comes from the scenario (given directly, or found from
the installed sag or tension). Form-finding starts from the elastic catenary
between rigid supports, then solves the whole structure, and, when a sag or
tension was given, corrects the length by secant steps until the deforming
anchors give the stated value.
"""
from __future__ import annotations

import numpy as np

from spanstay.fem import State, solve
from spanstay.fem.errors import FemError
from spanstay.models.analysis.failure_site import failure_parts
from spanstay.models.common.errors import InputError
from spanstay.models.scenario import line_shape
from spanstay.models.scenario.spec import LineSpec, Scenario
from spanstay.models.parts.guys import pretension_targets
from spanstay.models.parts.system import BuiltLine, System, build_system, chain_between

#: relative tolerance on the installed sag or tension found with deforming anchors
MATCH_TOL = 1e-4
#: rounds of guy and line matching on the finished structure, and the share of its stated
#: pretension a wire may miss when they stop (our judgement: far below what a tension
#: meter reads on site)
MATCH_ROUNDS = 15
WIRE_TOLERANCE = 2e-3


def line_geometry(scenario: Scenario, line: LineSpec) -> tuple[float, float]:
    """Horizontal span and drop (start above end, m) between attachment points."""
    return line_shape.span_and_drop(scenario, line)


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
    model = system.model
    nodes = line.nodes
    ends = model.coords[nodes[[0, -1]]] + state.translation[nodes[[0, -1]]]
    group = model.group(line.group)
    length = float(group.free_length().sum())  # at the cable's temperature
    xyz = chain_between(ends[0], ends[1], length, line.spec.rope.weight_per_length,
                        float(group.EA[0]), nodes.size - 1)
    warm = state.copy()
    warm.translation[nodes[1:-1]] = xyz[1:-1] - model.coords[nodes[1:-1]]
    return warm


def solve_installed(system: System, state: State | None = None) -> State:
    """Equilibrium of the structure under self-weight and pretensions."""
    try:
        return solve(system.model, state=state, steps=1)
    except FemError as exc:
        lines = ", ".join(f'line "{name}"' for name in system.lines)
        raise InputError(f"the installed state (self-weight and pretensions) has no "
                         f"equilibrium; largest imbalance in {failure_parts(system, exc)}. "
                         f"Check the sag or tension, the rope and the anchors. Engine: {exc}",
                         lines) from None


def install(scenario: Scenario, rigid: frozenset[str] = frozenset(),
            lengths: dict[str, float] | None = None,
            temperature: float | None = None,
            slip: str = "service") -> tuple[System, State, dict[str, float]]:
    """Build and solve the installed state.

    Returns the system, its state and the unstressed lengths: each line's
    (key: line name) and each pretensioned guy's or brace wire's (key:
    "wire:<group>"). When ``lengths`` is given (re-solves of the slack
    budget) they are used as they are: the cables were cut to length once.
    """
    fixed_lengths = lengths is not None
    if lengths is None:
        lengths = {}
        for line in scenario.lines:  # InputError naming the line's sag, tension or length
            lengths[line.name] = line_shape.rigid_support_length(scenario, line)
    system = build_system(scenario, lengths, rigid, temperature, slip)
    wires = _wire_targets(system)
    if fixed_lengths:
        for name, _ in wires:
            if f"wire:{name}" in lengths:
                system.model.group(name).L0[:] = lengths[f"wire:{name}"]
        return system, solve_installed(system), dict(lengths)
    state = solve_installed(system)
    # the line's sag or tension and the guys' pretensions are all stated on the
    # finished structure: match them in turn until both hold (the line is matched last,
    # so the rounds stop when the line's matching no longer moves the wires; on soft
    # anchors a plain round takes only about a quarter off the wires' excess, so every
    # third round jumps to the limit of the rounds by Aitken's delta-squared)
    seen: list[np.ndarray] = []   # the wires' unstressed lengths after each tuning
    for _ in range(MATCH_ROUNDS if wires else 1):
        if wires:
            state = _tune_wires(system, wires, state)
            seen.append(np.array([system.model.group(n).L0[0] for n, _ in wires]))
            if len(seen) % 3 == 0:   # Aitken's delta-squared on the last three rounds
                state = _extrapolate_wires(system, wires, seen[-3:], state)
        state = _match_lines(scenario, system, state)
        if _wires_hold(system, wires, state):
            break
    else:
        raise InputError(f"the guys' pretensions and the line's sag or tension cannot both be met "
                         f"on the finished structure ({MATCH_ROUNDS} rounds of matching); check "
                         f"the pretensions against the line's pull", _pretension_keys(system))
    for line in scenario.lines:
        lengths[line.name] = system.lines[line.name].L0
    for name, _ in wires:
        lengths[f"wire:{name}"] = float(system.model.group(name).L0[0])
    return system, state, lengths


def _extrapolate_wires(system: System, wires, last3: list[np.ndarray], state: State) -> State:
    """The wires' lengths moved to the limit of the rounds' linear convergence (Aitken's
    delta-squared, per wire); kept only where the three rounds converge monotonically."""
    x0, x1, x2 = last3
    d1, d2 = x1 - x0, x2 - x1
    den = d2 - d1
    ok = (np.abs(den) > 1e-15) & (d1 * d2 > 0) & (np.abs(d2) < np.abs(d1))
    if not np.any(ok):
        return state
    limit = np.where(ok, x2 - d2 * d2 / np.where(ok, den, 1.0), x2)
    for (name, _), length in zip(wires, limit):
        system.model.group(name).L0[:] = length
    return solve_installed(system, state)


def _wires_hold(system: System, wires, state: State) -> bool:
    """True when every pretensioned wire carries its stated pretension to WIRE_TOLERANCE."""
    return all(abs(float(state.group(name).tension[0]) - target) <= WIRE_TOLERANCE * target
               for name, target in wires)


def _pretension_keys(system: System) -> str:
    """The scenario keys of the pretensions stated on the system's anchors."""
    names = [n for n, a in system.anchors.items() if pretension_targets(a)]
    return ", ".join(f'anchor "{n}".guy pretension' for n in names) or "anchor"


def _wire_targets(system: System) -> list[tuple[str, float]]:
    """(cable group, pretension) of every pretensioned guy and brace wire."""
    return [t for anchor in system.anchors.values() for t in pretension_targets(anchor)]


def _tune_wires(system: System, wires, state: State) -> State:
    from spanstay.models.parts.guys import tune_pretension

    try:
        return tune_pretension(system.model, wires, state)
    except FemError as exc:
        raise InputError(f"the guys cannot be brought to their pretension; largest imbalance "
                         f"in {failure_parts(system, exc)}. Engine: {exc}",
                         _pretension_keys(system)) from None


def _match_lines(scenario: Scenario, system: System, state: State) -> State:
    """Secant steps on each line's unstressed length to meet its stated sag or tension."""
    for line in scenario.lines:
        target, measure = _target(line)
        if target is None:
            continue
        bl = system.lines[line.name]
        group = system.model.group(bl.group)
        L_a, v_a = bl.L0, measure(system, state, bl)
        if abs(v_a - target) <= MATCH_TOL * abs(target):
            continue
        L_b = L_a * (1.0 + (1e-4 if line.sag is not None else -1e-5) * np.sign(target - v_a))
        where = line_shape.line_key(scenario, line)
        for _ in range(12):
            if not np.isfinite(L_b) or L_b <= 0.0:
                raise InputError("the stated value cannot be met with these anchors deforming "
                                 "under the line (form finding found no cable length that "
                                 "gives it); give a value nearer the anchors' reach, or "
                                 "stiffer anchors", where)
            group.L0[:] = L_b / group.L0.size
            bl.L0 = L_b
            try:
                state = solve_installed(system, hang_between_ends(system, state, bl))
            except (InputError, ValueError) as exc:  # no equilibrium, or the chain did not hang
                raise InputError(f"the line cannot be hung to the stated value with these "
                                 f"anchors ({exc})", where) from None
            v_b = measure(system, state, bl)
            if abs(v_b - target) <= MATCH_TOL * abs(target):
                break
            if v_b == v_a:
                break
            L_a, v_a, L_b = L_b, v_b, L_b + (target - v_b) * (L_b - L_a) / (v_b - v_a)
    return state
