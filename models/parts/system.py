"""The whole structure of a scenario as one fem model: anchors and lines."""
from __future__ import annotations

from collections.abc import Iterator
from contextlib import contextmanager
from dataclasses import dataclass, field

import numpy as np

from spanstay.fem import Model
from spanstay.fem.errors import FemError
from spanstay.models.common.errors import InputError
from spanstay.models.parts.anchor import add_anchor
from spanstay.models.parts.post import RIGID, BuiltAnchor
from spanstay.models.common.catenary import chain_points
from spanstay.models.scenario.spec import LineSpec, Scenario


@dataclass
class BuiltLine:
    """A cable span in the model.

    The rider node ``nodes[k]`` is a cable node that moves along the cable:
    the ``k`` segments before it share the unstressed length ahead of the
    rider, the others the rest, so the rider's point along the line is exact
    at every station.
    """

    spec: LineSpec
    group: str
    nodes: np.ndarray
    k: int
    L0: float
    start_xyz: np.ndarray
    end_xyz: np.ndarray
    rider_s: float | None = None

    @property
    def rider_node(self) -> int:
        return int(self.nodes[self.k])

    def segment_lengths(self, s: float | None) -> np.ndarray:
        """Unstressed segment lengths with the rider node at arc coordinate ``s``."""
        n = self.nodes.size - 1
        if s is None:
            return np.full(n, self.L0 / n)
        return np.concatenate([np.full(self.k, s / self.k), np.full(n - self.k, (self.L0 - s) / (n - self.k))])

    def arc_coordinates(self, s: float | None) -> np.ndarray:
        """Unstressed arc coordinate of every cable node."""
        return np.concatenate([[0.0], np.cumsum(self.segment_lengths(s))])

    def chord_z(self, x_along: np.ndarray) -> np.ndarray:
        """Elevation of the straight chord between the undeformed attachments."""
        span = np.linalg.norm((self.end_xyz - self.start_xyz)[:2])
        return self.start_xyz[2] + (self.end_xyz[2] - self.start_xyz[2]) * np.asarray(x_along) / span

    def along(self, xyz: np.ndarray) -> np.ndarray:
        """Horizontal distance of points from the start attachment, along the line in plan."""
        d = (self.end_xyz - self.start_xyz)[:2]
        d = d / np.linalg.norm(d)
        return (np.asarray(xyz)[..., :2] - self.start_xyz[:2]) @ d


@dataclass
class System:
    """A scenario built into a fem model."""

    scenario: Scenario
    model: Model
    anchors: dict[str, BuiltAnchor]
    lines: dict[str, BuiltLine]
    rigid: frozenset[str] = field(default_factory=frozenset)


def _pulls(scenario: Scenario) -> dict[str, np.ndarray]:
    """Plan direction of the resultant line pull on each anchor."""
    out = {a.name: np.zeros(3) for a in scenario.anchors}
    for line in scenario.lines:
        a, b = scenario.anchor(line.start), scenario.anchor(line.end)
        d = np.array([b.x - a.x, b.y - a.y, 0.0])
        d /= np.linalg.norm(d)
        out[a.name] += d
        out[b.name] -= d
    for k, v in out.items():
        if np.linalg.norm(v) < 1e-9:
            out[k] = np.array([1.0, 0.0, 0.0])
        else:
            out[k] = v / np.linalg.norm(v)
    return out


def attach_heights(scenario: Scenario) -> dict[str, list[float]]:
    """Heights on each anchor where lines attach."""
    out: dict[str, list[float]] = {a.name: [] for a in scenario.anchors}
    for line in scenario.lines:
        out[line.start].append(line.start_height)
        out[line.end].append(line.end_height)
    return out


def build_system(scenario: Scenario, lengths: dict[str, float], rigid: frozenset[str] = frozenset(),
                 temperature: float | None = None, slip: str = "service") -> System:
    """Build the model with each line's unstressed length from ``lengths``.

    Cable nodes start on the equilibrium of the segmented elastic cable
    (from the elastic catenary) between the undeformed attachment points. ``rigid`` may hold "cable", "post", "fasteners",
    "soil", "guy". ``temperature`` (K) sets the cables' thermal strain against
    the installation temperature. ``slip`` selects the laminated posts'
    fastener slip modulus ("service" or "ultimate").
    """
    model = Model()
    pulls = _pulls(scenario)
    heights = attach_heights(scenario)
    anchors = {}
    for a in scenario.anchors:
        with _as_input_error(f'anchor "{a.name}"', "this anchor cannot be built"):
            anchors[a.name] = add_anchor(model, a, scenario.ground, heights[a.name],
                                         pulls[a.name], rigid, slip)
    lines = {}
    d_t = 0.0 if temperature is None else temperature - scenario.settings.install_temperature
    for line in scenario.lines:
        a, b = anchors[line.start], anchors[line.end]
        n1, n2 = a.node_at(line.start_height), b.node_at(line.end_height)
        p1, p2 = model.coords[n1], model.coords[n2]
        with _as_input_error(f'line "{line.name}"', "this line cannot be hung"):
            lines[line.name] = _add_line(model, line, n1, n2, p1, p2, lengths[line.name],
                                         rigid, d_t)
    return System(scenario, model, anchors, lines, rigid)


@contextmanager
def _as_input_error(where: str, what: str) -> Iterator[None]:
    """Engine or solver errors from building a part, as an InputError naming the part."""
    try:
        yield
    except InputError:
        raise
    except (FemError, ValueError, ArithmeticError) as exc:
        raise InputError(f"{what} as given ({exc}); check its sizes, heights and "
                         "positions", where) from None


def chain_between(p1: np.ndarray, p2: np.ndarray, length: float, weight: float, EA: float,
                  n: int) -> np.ndarray:
    """(n + 1, 3) equilibrium points of an n-segment elastic cable hung from p1 to p2
    (see :func:`models.common.catenary.chain_points`), in the vertical plane through both."""
    plan = (p2 - p1)[:2]
    span = float(np.linalg.norm(plan))
    pts = chain_points(span, float(p1[2] - p2[2]), length, weight, EA, n)
    plan = plan / span
    return np.column_stack([p1[0] + plan[0] * pts[:, 0], p1[1] + plan[1] * pts[:, 0],
                            p1[2] + pts[:, 1]])


def _add_line(model: Model, line: LineSpec, n1: int, n2: int, p1: np.ndarray, p2: np.ndarray,
              L0: float, rigid: frozenset[str], d_t: float) -> BuiltLine:
    rope = line.rope
    n = max(int(line.segments), 4)
    k = n // 2
    ea = rope.EA * (RIGID if "cable" in rigid else 1.0)
    ids = model.add_nodes(chain_between(p1, p2, L0, rope.weight_per_length, ea, n)[1:-1])
    nodes = np.concatenate([[n1], ids, [n2]])
    name = f"line.{line.name}"
    model.add_cables(nodes[:-1], nodes[1:], ea, np.full(n, L0 / n), weight=rope.weight_per_length,
                     alpha=rope.alpha, dT=d_t, name=name)
    return BuiltLine(line, name, nodes, k, L0, p1.copy(), p2.copy())
