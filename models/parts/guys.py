"""Guys: tension-only wires from a post's face down to ground anchors.

Each guy is one cable segment (weightless, tension-only, so a guy on the
unloaded side goes slack and carries nothing) from an eye node on the post
face to a ground-anchor node:

- the eye is tied to the post-axis node at the attach height by a link whose
  rigid arm reaches from the axis to the face facing the ground anchor (the
  eye bolt or the wrap), stiff in translation and free in rotation;
- the ground anchor is fixed, or joined to a fixed ground point by a link
  with the anchor's pull-out stiffness (screw anchor, deadman: a user value)
  along the guy and, as a stated simplification, the same stiffness across it;
- the guy's unstressed length gives the stated pretension with the anchor
  and the eye in series and the post undeformed; :func:`tune_pretension`
  corrects the lengths for a deforming post once the model is solved.

Slack guys and ground anchors pulled past their capacity are findings of
:mod:`models.checks.anchors`, never errors.
"""
from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from spanstay.fem import Model, State, solve
from spanstay.models.parts.post import RIGID
from spanstay.models.common.errors import InputError
from spanstay.models.parts.attach import axis_node, face_offset, perpendicular_axes
from spanstay.models.scenario.spec import AnchorSpec, GuySpec

#: the eye hardware is taken as rigid: its link is this many times stiffer than the guy
EYE_STIFFNESS_RATIO = 1.0e3


@dataclass
class BuiltGuy:
    """A guy in a model.

    Attributes
    ----------
    cable
        Cable group name (one segment).
    eye_node, ground_node
        The guy's ends: on the post face, at the ground anchor.
    support_node
        Fixed point behind an elastic ground anchor (None when fixed).
    direction
        Unit vector from the ground anchor up to the eye (undeformed).
    """

    spec: GuySpec
    where: str
    cable: str
    post_node: int
    eye_node: int
    ground_node: int
    support_node: int | None
    direction: np.ndarray
    chord: float
    EA: float
    groups: list[str]
    cable_group: object = field(default=None, repr=False)  # the fem CableGroup

    @property
    def L0(self) -> float:
        """Unstressed length now in the model, m."""
        return float(self.cable_group.L0[0])


@dataclass(frozen=True)
class GuyState:
    """A guy's response in one state: tension (N), slack flag, anchor movement (m)
    along the guy toward the post, and the eye's displacement (m)."""

    tension: float
    slack: bool
    anchor_movement: float
    eye_displacement: np.ndarray


def _check(spec: AnchorSpec, guy: GuySpec, where: str, face: float) -> None:
    post = spec.post
    if post is not None and guy.attach_height > post.height + 1e-9:
        raise InputError(f"the guy is attached {guy.attach_height:.3g} m "
                         f"up, above the top of the post ({post.height:.3g} m)",
                         f"{where}.attach_height")
    gx, gy, _ = guy.ground_point
    reach = float(np.hypot(gx - spec.x, gy - spec.y))
    if reach <= max(face, 0.05):
        raise InputError(f"the guy's ground anchor is at the post's own "
                         f"base ({reach:.3g} m from its centre); move it out, typically about as "
                         "far as the guy's attach height", where)


def add_guy(model: Model, post_node: int, guy: GuySpec, *, offset=(0.0, 0.0, 0.0),
            name: str = "guy", where: str = "guy", rigid: bool = False) -> BuiltGuy:
    """Add one guy from ``post_node`` (arm ``offset`` to the eye) to its ground anchor.

    Parameters
    ----------
    offset
        Rigid arm from the post node to the eye (face offset plus any vertical
        remainder), m.
    rigid
        Slack budget: EA x RIGID and the ground anchor fixed.
    """
    offset = np.asarray(offset, float)
    eye_xyz = model.coords[post_node] + offset
    ground_xyz = np.asarray(guy.ground_point, float)
    chord_vec = eye_xyz - ground_xyz
    chord = float(np.linalg.norm(chord_vec))
    if chord < 1e-6:
        raise InputError("the guy's ground anchor is at its attachment point", where)
    e = chord_vec / chord
    ea = guy.rope.EA * (RIGID if rigid else 1.0)
    # from the rope's own EA even when the guy is made rigid: a link 1e7 times the guy
    # would leave only round-off in the residual
    k_eye = EYE_STIFFNESS_RATIO * guy.rope.EA / chord
    eye = model.add_node(eye_xyz)
    groups = [f"{name}.eye"]
    model.add_links([post_node], [eye], (k_eye, k_eye, k_eye, 0.0, 0.0, 0.0), offset, 0.0,
                    name=f"{name}.eye")
    ground = model.add_node(ground_xyz)
    support = None
    flexible = 1.0 / k_eye
    if guy.anchor_fixed or guy.anchor_stiffness is None or rigid:
        model.fix(ground, "xyz")
    else:
        support = model.add_node(ground_xyz)
        model.fix(support, "all")
        k = guy.anchor_stiffness
        model.add_links([support], [ground], (k, k, k, 0.0, 0.0, 0.0), 0.0, 0.0,
                        perpendicular_axes(e), name=f"{name}.ground")
        groups.append(f"{name}.ground")
        flexible += 1.0 / k
    t0 = guy.pretension
    l0 = (chord - t0 * flexible) / (1.0 + t0 / ea)
    group = model.add_cables([ground], [eye], ea, l0, weight=0.0, name=name)
    groups.insert(0, name)
    return BuiltGuy(guy, where, name, post_node, eye, ground, support, e, chord, ea, groups, group)


def add_guys(model: Model, built, spec: AnchorSpec, rigid: frozenset[str]) -> list:
    """Add every guy of ``spec`` to the built post ``built`` (a BuiltAnchor).

    Records the cable groups and their elastic ground-anchor links (names
    ending ".ground") under ``built.groups["guy"]``, the eye links under
    ``built.groups["guy_eye"]``, the anchor nodes in ``built.guy_ground_nodes``
    and the handles in ``built.guys``.
    """
    out = []
    names: list[str] = []
    eyes: list[str] = []
    for i, guy in enumerate(spec.guys):
        where = f"anchor '{spec.name}'.guy[{i + 1}]"
        plan = np.asarray(guy.ground_point[:2], float) - np.array([spec.x, spec.y])
        direction = np.array([plan[0], plan[1], 0.0])
        face = np.zeros(3)
        if np.linalg.norm(direction) > 1e-9:
            face = face_offset(model, built, guy.attach_height, direction)
        _check(spec, guy, where, float(np.linalg.norm(face)))
        node, dz = axis_node(model, built, guy.attach_height)
        arm = face + np.array([0.0, 0.0, dz])
        g = add_guy(model, node, guy, offset=arm, name=f"{spec.name}.guy{i + 1}", where=where,
                    rigid="guy" in rigid)
        out.append(g)
        names += [n for n in g.groups if not n.endswith(".eye")]
        eyes += [n for n in g.groups if n.endswith(".eye")]
        built.guy_ground_nodes.append(g.ground_node)
    if out:
        built.groups["guy"] = names       # cables and their ".ground" anchor links
        built.groups["guy_eye"] = eyes    # eye links on the post face (rigid hardware)
    built.guys = out
    return out


def guy_state(model: Model, state: State, guy: BuiltGuy) -> GuyState:
    """Tension, slack flag and movements of ``guy`` in ``state``."""
    tension = float(state.group(guy.cable).tension[0])
    move = float(state.translation[guy.ground_node] @ guy.direction)
    return GuyState(tension, tension <= 0.0, move, state.translation[guy.eye_node].copy())


def pretension_targets(built) -> list[tuple[str, float]]:
    """(cable group, stated pretension N) of every pretensioned guy and brace wire of a
    BuiltAnchor, for :func:`tune_pretension`."""
    out = [(g.cable, g.spec.pretension) for g in built.guys if g.spec.pretension > 0]
    brace = getattr(built, "brace", None)
    wire = getattr(brace, "diagonal", None)
    t0 = getattr(getattr(built.spec, "brace", None), "diagonal_pretension", None)
    if wire is not None and t0:
        out.append((wire, t0))
    return out


def tune_pretension(model: Model, targets: list[tuple[str, float]], state: State | None = None,
                    iterations: int = 10, rtol: float = 1e-3) -> State:
    """Re-cut one-segment wires so each carries its stated pretension in the solved model.

    ``targets`` pairs a cable group (one segment: a guy, a brace diagonal) with
    its pretension (N); see :func:`pretension_targets`. Secant steps on the
    unstressed lengths, all wires at once, under the model's current loads
    (call it on the installed state). Returns the final state.
    """
    targets = [(name, t) for name, t in targets if t > 0]
    state = solve(model) if state is None else state
    if not targets:
        return state
    groups = [model.group(name) for name, _ in targets]
    target = np.array([t for _, t in targets])
    ea = np.array([float(g.EA[0]) for g in groups])

    def tensions(st):
        return np.array([float(st.group(name).tension[0]) for name, _ in targets])

    L_a = np.array([float(g.L0[0]) for g in groups])
    t_a = tensions(state)
    if np.all(np.abs(t_a - target) <= rtol * target):
        return state
    L_b = L_a * (1.0 - (target - t_a) / ea)  # first step: each wire alone, EA / L0
    for _ in range(iterations):
        for g, L in zip(groups, L_b):
            g.L0[:] = L
        state = solve(model, state=state)
        t_b = tensions(state)
        if np.all(np.abs(t_b - target) <= rtol * target):
            break
        dL = L_b - L_a
        slope = np.where(np.abs(dL) > 0, (t_b - t_a) / np.where(dL != 0, dL, 1.0), 0.0)
        slope = np.where(slope < 0, slope, -ea / L_b)  # tension falls as the wire lengthens
        L_a, t_a, L_b = L_b, t_b, L_b + (target - t_b) / slope
    return state
