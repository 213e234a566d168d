"""Moving the rider along the line: one equilibrium per station, warm-started."""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import Callable

import numpy as np

from spanstay.fem import SolverOptions, State, solve
from spanstay.fem.errors import FemError

#: a station that still fails after its step is cut to 1/32 is taken as the limit of the
#: structure (capacity exceeded); cutting on to tiny steps only costs time
STATION_OPTIONS = SolverOptions(min_increment=1.0 / 32.0)
from spanstay.models.parts.system import BuiltLine, System


@dataclass
class StationResult:
    """What one station of a pass records (SI)."""

    s: float                       # unstressed arc coordinate of the rider
    along: float                   # horizontal distance from the start attachment
    rider: np.ndarray              # rider attachment point (deformed), xyz
    sag: float                     # rider below the undeformed chord
    tension_start: float
    tension_end: float
    tension_max: float
    anchor_disp: dict[str, np.ndarray]   # anchor -> displacement of its line attachment
    anchor_top: dict[str, np.ndarray]    # anchor -> displacement of the post top
    soil_ratio: dict[str, float]         # anchor -> largest p/p_u
    ground_rotation: dict[str, float]    # anchor -> ground-line rotation (rad)
    guy_tension: dict[str, float]        # guy group -> tension
    converged: bool = True
    message: str = ""
    newton_iterations: int = 0           # Newton corrections of this station's solve
    factorisations: int = 0              # tangent factorisations of this station's solve


@dataclass
class Pass:
    """The rider at every station for one weight and temperature."""

    label: str
    weight: float
    temperature: float
    stations: list[StationResult] = field(default_factory=list)
    states: list[State] = field(default_factory=list)
    failed_at: float | None = None
    failure: str = ""
    failed_groups: tuple[str, ...] = ()   # element groups around the largest imbalance
    unloaded_sag: float | None = None     # the line's sag before the rider (bedded-in cases)

    @property
    def complete(self) -> bool:
        """True when every station of the pass found equilibrium."""
        return self.failed_at is None


def place_rider(system: System, line: BuiltLine, state: State, s: float, weight: float,
                push: float = 0.0) -> State:
    """Move the rider node to arc coordinate ``s`` and return a warm start.

    The predictor keeps the strain of every segment: the rider point goes
    where the cable on each side keeps its previous chord-to-length ratio
    (two circles about the attachments, in the vertical plane of the line),
    and each side is mapped onto its new chord by a similarity (rotation and
    uniform scale), so its segments stretch as their unstressed lengths do. Moving nodes along the old polyline instead would cut across the
    rider's kink and leave segments slack, which Newton handles badly.

    ``push`` is a horizontal force on the rider toward the line's end (a stop).
    """
    model = system.model
    nodes, k = line.nodes, line.k
    old_len = line.arc_coordinates(line.rider_s)[k]
    pos = model.coords[nodes] + state.translation[nodes]
    a, b, p_old = pos[0], pos[-1], pos[k]
    r1 = np.linalg.norm(p_old - a) * s / old_len
    r2 = np.linalg.norm(b - p_old) * (line.L0 - s) / (line.L0 - old_len)
    d = np.linalg.norm(b - a)
    e = (b - a) / d
    down = np.array([0.0, 0.0, -1.0]) + e[2] * e  # -z without its part along e
    down /= np.linalg.norm(down)
    if r1 + r2 > d:
        along = (r1**2 - r2**2 + d**2) / (2.0 * d)
        p_new = a + along * e + np.sqrt(max(r1**2 - along**2, 0.0)) * down
    else:  # both sides must stretch to reach: share the stretch in proportion
        p_new = a + d * r1 / (r1 + r2) * e
    new = pos.copy()
    new[:k + 1] = _similar(pos[:k + 1], a, p_old, a, p_new)
    new[k:] = _similar(pos[k:], p_old, b, p_new, b)
    warm = state.copy()
    inner = nodes[1:-1]
    warm.translation[inner] = new[1:-1] - model.coords[inner]
    model.group(line.group).L0[:] = line.segment_lengths(s)
    line.rider_s = s
    model.set_load(line.rider_node, list(rider_vector(line, weight, push)))
    return warm


def rider_vector(line: BuiltLine, weight: float, push: float = 0.0) -> np.ndarray:
    """The rider's load: its weight down and ``push`` along the line toward its end."""
    plan = line.end_xyz[:2] - line.start_xyz[:2]
    ex, ey = push * plan / np.linalg.norm(plan)
    return np.array([float(ex), float(ey), -float(weight)])


def place_fixed(system: System, line: BuiltLine, fixed: tuple[tuple[float, float], ...],
                rider: np.ndarray, previous: list[int]) -> list[int]:
    """Put each fixed load ``(fraction of the unstressed length, weight)`` on the cable
    at that arc coordinate, shared between the two nodes around it by the lever rule;
    the loads of ``previous`` nodes are removed first. Returns the nodes loaded (other
    than the rider's, whose load ``rider`` is kept and added to)."""
    model = system.model
    for node in previous:
        model.set_load(node, [0.0, 0.0, 0.0])
    if not fixed:
        return []
    arc = line.arc_coordinates(line.rider_s)
    shares: dict[int, float] = {}
    for fraction, weight in fixed:
        s2 = float(fraction) * line.L0
        j = int(np.clip(np.searchsorted(arc, s2) - 1, 0, arc.size - 2))
        t = (s2 - arc[j]) / (arc[j + 1] - arc[j])
        for i, share in ((j, 1.0 - t), (j + 1, t)):
            if 0 < i < arc.size - 1:  # at an attachment the support takes it directly
                shares[i] = shares.get(i, 0.0) + share * float(weight)
    loaded = []
    for i, w in shares.items():
        node = int(line.nodes[i])
        if i == line.k:
            model.set_load(node, list(np.asarray(rider, float) + [0.0, 0.0, -w]))
        else:
            model.set_load(node, [0.0, 0.0, -w])
            loaded.append(node)
    return loaded


def _similar(points: np.ndarray, a0, b0, a1, b1) -> np.ndarray:
    """Map points by the similarity taking segment a0-b0 onto a1-b1."""
    from spanstay.fem.rotation import expmap

    u, w = b0 - a0, b1 - a1
    scale = np.linalg.norm(w) / np.linalg.norm(u)
    u, w = u / np.linalg.norm(u), w / np.linalg.norm(w)
    axis = np.cross(u, w)
    sin, cos = np.linalg.norm(axis), float(u @ w)
    rot = expmap(axis / sin * np.arctan2(sin, cos)) if sin > 1e-14 else np.eye(3)
    return a1 + scale * (points - a0) @ rot.T


def record(system: System, state: State, line: BuiltLine) -> StationResult:
    """Station quantities of a solved state."""
    from spanstay.models.parts.footing import footing_response

    model = system.model
    rider = model.coords[line.rider_node] + state.translation[line.rider_node]
    along = float(line.along(rider))
    t = state.group(line.group).tension
    disp, top, soil, rot, guys = {}, {}, {}, {}, {}
    for name, anchor in system.anchors.items():
        h = line.spec.start_height if name == line.spec.start else line.spec.end_height
        node = anchor.node_at(h) if name in (line.spec.start, line.spec.end) else anchor.top_node
        disp[name] = state.translation[node].copy()
        top[name] = state.translation[anchor.top_node].copy()
        if anchor.footing is not None:
            pull = line.end_xyz - line.start_xyz
            direction = pull[:2] if name == line.spec.end else -pull[:2]
            resp = footing_response(anchor.footing, model, state, direction)
            soil[name] = resp.max_ratio
            rot[name] = resp.ground_rotation
        for g in anchor.groups.get("guy", []):
            if not g.endswith(".ground"):
                guys[g] = float(state.group(g).tension[0])
    return StationResult(float(line.rider_s), along, rider, float(line.chord_z(along) - rider[2]),
                         float(t[0]), float(t[-1]), float(t.max()), disp, top, soil, rot, guys)


def run_pass(system: System, installed: State, line: BuiltLine, stations_s: np.ndarray,
             weight: float, label: str, temperature: float, keep_states: bool = False,
             progress: Callable[[], None] | None = None, push: float = 0.0,
             fixed: tuple[tuple[float, float], ...] = ()) -> Pass:
    """Solve the rider at every arc coordinate in ``stations_s`` (in order); ``push``
    is a horizontal force on the rider toward the line's end (a stop); ``fixed`` are
    loads that stay put on the cable (:func:`place_fixed`), e.g. a stuck rider."""
    result = Pass(label, weight, temperature)
    state = installed
    line.rider_s = None
    cable = system.model.group(line.group)
    cable.L0[:] = line.segment_lengths(None)  # the installed state's even division
    first = True
    held: list[int] = []
    for s in stations_s:
        warm = place_rider(system, line, state, float(s), weight, push)
        held = place_fixed(system, line, fixed, rider_vector(line, weight, push), held)
        try:
            state = solve(system.model, state=warm, steps=4 if first else 1,
                          options=STATION_OPTIONS)
        except FemError as exc:
            result.failed_at = float(s)
            result.failure = str(exc)
            sites = getattr(exc, "sites", None) or []
            result.failed_groups = tuple(dict.fromkeys(g for site in sites[:3]
                                                       for g in site.elements))
            break
        first = False
        station = record(system, state, line)
        station.newton_iterations = int(getattr(state, "newton_iterations", 0))
        station.factorisations = int(getattr(state, "factorisations", 0))
        result.stations.append(station)
        if keep_states:
            result.states.append(state)
        if progress is not None:
            progress()
    system.model.set_load(line.rider_node, [0.0, 0.0, 0.0])
    place_fixed(system, line, (), np.zeros(3), held)
    cable.L0[:] = line.segment_lengths(None)
    line.rider_s = None
    return result
