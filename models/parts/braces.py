"""Kicker struts and H-brace assemblies as fem parts.

Kicker: a timber strut from the post face down to a foot block. The strut is
a short beam line whose ends are pinned (hinge links: stiff in translation,
free to rotate in the brace's plane, stiff out of it and in twist). The
block is a node bearing on the soil through linear springs from a subgrade
modulus times the block's plan area (vertical, and as a stated
simplification the same horizontally), or fixed when no block is given (a
strut pinned to a rigid ground anchor).

H-brace: a second post at ``distance`` (its own footing: ``second_footing``
or the anchor's), a horizontal rail between the posts' facing faces at
``rail_height`` (pinned ends, common practice) and a diagonal tension wire,
pretensioned by its length, from the rail level of one post to the grade of
the other. The wire is put on the diagonal that lengthens when the line's
pull sways the frame (from the top of the post further along the pull to the
bottom of the other): the other diagonal would go slack.

Unless given, a kicker leans toward the line (its foot on the line side) and
an H-brace's second post stands behind the anchor, away from the line.
"""
from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from spanstay.fem import BeamSection, LinearLaw, Model
from spanstay.models.parts.post import E_OVER_G, RIGID
from spanstay.models.common.errors import InputError
from spanstay.models.parts.attach import axis_node, face_offset, perpendicular_axes, plan_unit, unit_from_degrees
from spanstay.models.scenario.spec import AnchorSpec, GroundSpec, SectionSpec

#: a pinned joint is taken as rigid except in its hinge rotation: its link is this many
#: times stiffer than the member (axially, and in bending for the restrained rotations)
PIN_STIFFNESS_RATIO = 1.0e3
#: beam elements per pinned member
MEMBER_ELEMENTS = 4
#: Vertical modulus of subgrade reaction under a kicker's foot block, N/m^3: 20 MN/m^3,
#: within Bowles' ranges (Foundation Analysis and Design, Table 9-1, from memory) for
#: medium-dense sand (10-80) and stiff clay (25-50). A judgement, not a site value: set
#: blocks on firm, undisturbed ground.
BLOCK_SUBGRADE_MODULUS = 20.0e6


@dataclass
class BuiltMember:
    """A pinned timber member (kicker strut or rail) in a model.

    ``nodes`` run from end 1 to end 2 along ``axis``; ``end1_support`` and
    ``end2_support`` are the nodes the pins join (post node, block node).
    """

    name: str
    nodes: np.ndarray
    links: str
    length: float
    axis: np.ndarray
    section: SectionSpec
    species: str | None
    grade: str | None
    E: float
    end1_support: int
    end2_support: int
    end1_point: np.ndarray
    end2_point: np.ndarray


@dataclass
class BuiltKicker:
    """A kicker brace: the strut (end 1 on the post, end 2 at the foot) and its block."""

    kind: str
    where: str
    strut: BuiltMember
    block_node: int
    block_groups: list[str]
    block_area: float | None
    direction: np.ndarray
    groups: list[str] = field(default_factory=list)


@dataclass
class BuiltHBrace:
    """An H-brace: the second post (a BuiltAnchor), the rail and the diagonal wire."""

    kind: str
    where: str
    second: object
    rail: BuiltMember
    diagonal: str
    diagonal_from: str            # "main" or "second": whose rail level the wire leaves
    diagonal_top: np.ndarray
    diagonal_bottom: np.ndarray
    diagonal_EA: float
    direction: np.ndarray
    groups: list[str] = field(default_factory=list)

    @property
    def diagonal_angle(self) -> float:
        """Angle of the diagonal from horizontal, rad (undeformed)."""
        d = self.diagonal_top - self.diagonal_bottom
        return float(np.arctan2(d[2], np.linalg.norm(d[:2])))


def timber_section(section: SectionSpec, species: str | None, grade: str | None,
                   where: str, stiffen: float = 1.0) -> tuple[BeamSection, float]:
    """Beam section of a sawn member from the lumber catalog; returns (section, E)."""
    from spanstay.models.catalogs import lumber

    size = (lumber.parse_size(section.nominal, where) if section.nominal
            else lumber.custom_size(section.width, section.depth))
    if species is None:
        raise InputError("give the brace member's species (or the post's)", where)
    ref = lumber.design_values(species, grade or "No. 2", size, where)
    E = ref.E * stiffen
    return BeamSection.rectangle(E, E / E_OVER_G, width_y=section.width,
                                 depth_z=section.depth), ref.E


def add_pinned_member(model: Model, node1: int, offset1, node2: int, offset2,
                      section: BeamSection, name: str, elements: int = MEMBER_ELEMENTS,
                      stiffen: float = 1.0):
    """A beam line between two points pinned to two nodes.

    The member runs from ``coords[node1] + offset1`` to ``coords[node2] +
    offset2``; each end is a hinge link from the supporting node (rigid arm
    = the offset) to the member's end node: stiff in translation, free to
    rotate about the horizontal axis across the member (the hinge), stiff in
    the other two rotations. Returns (member node ids, beam group name, link
    group name, length, unit axis). ``stiffen`` is the factor already applied to
    the section's moduli (slack budget): the pins keep the member's own stiffness
    times PIN_STIFFNESS_RATIO, so a rigid member does not leave round-off behind.
    """
    p1 = model.coords[node1] + np.asarray(offset1, float)
    p2 = model.coords[node2] + np.asarray(offset2, float)
    chord = p2 - p1
    length = float(np.linalg.norm(chord))
    axis = chord / length
    axes = perpendicular_axes(axis)
    t = np.linspace(0.0, 1.0, elements + 1)
    nodes = model.add_nodes(p1[None, :] + t[:, None] * chord[None, :])
    model.add_beams(nodes[:-1], nodes[1:], section, orientation=axes[1], name=name)
    E = float(np.max(section.E)) / stiffen
    G = float(np.max(section.G)) / stiffen
    k_t = PIN_STIFFNESS_RATIO * E * float(np.max(section.A)) / length
    k_r = PIN_STIFFNESS_RATIO * max(E * float(np.max(section.Iy)), E * float(np.max(section.Iz)),
                                    G * float(np.max(section.J))) / length
    k = (k_t, k_t, k_t, k_r, 0.0, k_r)
    model.add_links([node1, node2], [int(nodes[0]), int(nodes[-1])], k,
                    np.stack([np.asarray(offset1, float), np.asarray(offset2, float)]), 0.0,
                    axes, name=f"{name}.pins")
    return nodes, name, f"{name}.pins", length, axis


def _attach_arm(model: Model, built, height: float, toward) -> tuple[int, np.ndarray]:
    """Post-axis node nearest ``height`` and the rigid arm to the face facing ``toward``."""
    node, dz = axis_node(model, built, height)
    return node, face_offset(model, built, height, toward) + np.array([0.0, 0.0, dz])


def add_kicker(model: Model, built, spec: AnchorSpec, pull, rigid: frozenset[str]) -> BuiltKicker:
    """Add the kicker brace of ``spec`` to the built post ``built``."""
    brace = spec.brace
    where = f"anchor '{spec.name}'.brace"
    direction = (unit_from_degrees(brace.direction_deg) if brace.direction_deg is not None
                 else plan_unit(pull))
    post = spec.post
    if brace.attach_height > post.height + 1e-9:
        raise InputError(f"the kicker is attached {brace.attach_height:.3g} m"
                         f" up, above the top of the post ({post.height:.3g} m)",
                         f"{where}.attach_height")
    node, arm = _attach_arm(model, built, brace.attach_height, direction)
    face = float(np.linalg.norm(arm[:2]))
    if brace.foot_distance <= face + 0.05:
        raise InputError(f"the kicker's foot ({brace.foot_distance:.3g} m "
                         f"out) is within the post's outline ({face:.3g} m to its face): the strut "
                         "does not reach the ground clear of the post; give a foot_distance "
                         "that puts the foot out on the ground", f"{where}.foot_distance")
    stiffen = RIGID if "brace" in rigid else 1.0
    section, E = timber_section(brace.member, brace.species, brace.grade, f"{where}.member",
                                stiffen)
    foot = np.array([spec.x, spec.y, spec.grade]) + brace.foot_distance * direction
    block = model.add_node(foot)
    model.fix(block, "rxyz")
    name = f"{spec.name}.kicker"
    block_groups: list[str] = []
    area = None
    if brace.block_width is not None and brace.block_length is not None:
        area = brace.block_width * brace.block_length
    if area is None or "brace" in rigid:
        model.fix(block, "xyz")
    else:
        k = BLOCK_SUBGRADE_MODULUS * area
        for d in ("ux", "uy", "uz"):
            model.add_springs(block, d, LinearLaw(k), name=f"{name}.block_{d}")
            block_groups.append(f"{name}.block_{d}")
    nodes, gname, links, length, axis = add_pinned_member(model, node, arm, block, np.zeros(3),
                                                          section, name, stiffen=stiffen)
    strut = BuiltMember(gname, nodes, links, length, axis, brace.member, brace.species,
                        brace.grade, E, node, block, model.coords[node] + arm, foot)
    kicker = BuiltKicker("kicker", where, strut, block, block_groups, area, direction,
                         [gname, links] + block_groups)
    return kicker


def _add_wire(model: Model, node1: int, offset1, node2: int, offset2, EA: float,
              pretension: float, name: str, stiffen: float = 1.0) -> tuple[str, list[str]]:
    """A tension-only wire between two post points, each end on an eye link
    (``stiffen``: factor already in ``EA``; the eyes keep the rope's own)."""
    p1 = model.coords[node1] + offset1
    p2 = model.coords[node2] + offset2
    chord = float(np.linalg.norm(p2 - p1))
    k_eye = PIN_STIFFNESS_RATIO * EA / stiffen / chord
    e1, e2 = model.add_node(p1), model.add_node(p2)
    model.add_links([node1, node2], [e1, e2], (k_eye, k_eye, k_eye, 0.0, 0.0, 0.0),
                    np.stack([offset1, offset2]), 0.0, name=f"{name}.eyes")
    l0 = (chord - 2.0 * pretension / k_eye) / (1.0 + pretension / EA)
    model.add_cables([e1], [e2], EA, l0, weight=0.0, name=name)
    return name, [name, f"{name}.eyes"]


def add_h_brace(model: Model, built, spec: AnchorSpec, ground: GroundSpec, pull,
                rigid: frozenset[str], diagonal: str | None = None) -> BuiltHBrace:
    """Add the H-brace of ``spec`` (second post, rail, diagonal wire) to ``built``.

    ``diagonal`` forces the wire's upper end onto "main" or "second" (default:
    the post further along the line's pull, the diagonal that tightens).
    """
    from spanstay.models.parts.post import add_post

    brace = spec.brace
    where = f"anchor '{spec.name}'.brace"
    pull = plan_unit(pull)
    direction = (unit_from_degrees(brace.direction_deg) if brace.direction_deg is not None
                 else -pull)
    post = spec.post
    if brace.rail_height > min(post.height, brace.second_post.height) + 1e-9:
        raise InputError(f"the rail ({brace.rail_height:.3g} m up) is above "
                         "the top of the shorter post", f"{where}.rail_height")
    a_node, a_arm = _attach_arm(model, built, brace.rail_height, direction)
    second_spec = replace(spec, name=f"{spec.name}.brace-post",
                          x=spec.x + brace.distance * direction[0],
                          y=spec.y + brace.distance * direction[1],
                          post=brace.second_post, footing=brace.second_footing or spec.footing,
                          guys=(), brace=None)
    second = add_post(model, second_spec, ground, [brace.rail_height], -direction, rigid)
    b_node, b_arm = _attach_arm(model, second, brace.rail_height, -direction)
    clear = brace.distance - np.linalg.norm(a_arm[:2]) - np.linalg.norm(b_arm[:2])
    if clear <= 0.05:
        raise InputError(f"the second post ({brace.distance:.3g} m away) "
                         "overlaps the first; leave room for the rail between them",
                         f"{where}.distance")
    stiffen = RIGID if "brace" in rigid else 1.0
    section, E = timber_section(brace.rail, brace.species, brace.grade, f"{where}.rail", stiffen)
    name = f"{spec.name}.rail"
    nodes, gname, links, length, axis = add_pinned_member(model, a_node, a_arm, b_node, b_arm,
                                                          section, name, stiffen=stiffen)
    rail = BuiltMember(gname, nodes, links, length, axis, brace.rail, brace.species, brace.grade,
                       E, a_node, b_node, model.coords[a_node] + a_arm,
                       model.coords[b_node] + b_arm)
    if diagonal is None:
        diagonal = "main" if float(direction @ pull) <= 0.0 else "second"
    if diagonal not in ("main", "second"):
        raise ValueError(f"diagonal must be 'main' or 'second', got {diagonal!r}")
    a_low = face_offset(model, built, 0.0, direction)
    b_low = face_offset(model, second, 0.0, -direction)
    if diagonal == "main":
        top = (a_node, a_arm)
        bottom = (second.grade_node, b_low)
    else:
        top = (b_node, b_arm)
        bottom = (built.grade_node, a_low)
    rope = brace.diagonal_rope
    ea = rope.EA * stiffen
    wire, wire_groups = _add_wire(model, top[0], top[1], bottom[0], bottom[1], ea,
                                  brace.diagonal_pretension or 0.0, f"{spec.name}.diagonal",
                                  stiffen)
    h = BuiltHBrace("h-brace", where, second, rail, wire, diagonal,
                    model.coords[top[0]] + top[1], model.coords[bottom[0]] + bottom[1], ea,
                    direction, [gname, links] + wire_groups)
    for part in ("post", "soil", "footing_member", "fasteners"):
        if second.groups.get(part):
            built.groups.setdefault(part, []).extend(second.groups[part])
    return h


def add_brace(model: Model, built, spec: AnchorSpec, ground: GroundSpec, pull,
              rigid: frozenset[str] = frozenset()):
    """Add the brace of ``spec`` (kicker or H-brace) to ``built``; records
    ``built.brace`` and the groups under ``built.groups["brace"]``."""
    if spec.brace.kind == "kicker":
        brace = add_kicker(model, built, spec, pull, rigid)
    elif spec.brace.kind == "h-brace":
        brace = add_h_brace(model, built, spec, ground, pull, rigid)
    else:
        raise InputError(f"unknown brace kind {spec.brace.kind!r}; expected kicker or h-brace",
                         f"anchor '{spec.name}'.brace.kind")
    built.brace = brace
    built.groups.setdefault("brace", []).extend(brace.groups)
    return brace


def member_axial_force(state, member: BuiltMember) -> np.ndarray:
    """Axial force of each element of a member (N, positive in tension)."""
    ends = state.group(member.name).end_forces
    return 0.5 * (ends[:, 0, 0] + ends[:, 1, 0])
