"""Posts and their footings as finite-element parts.

``add_post`` puts the post and footing of one anchor (``parts.anchor.add_anchor``
adds its guys and brace) of a scenario into a fem model and returns a
handle with the node ids the line attaches to and the groups that belong to
each part (used by checks and by the slack budget, which re-solves with a
part made rigid).
"""
from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from spanstay.fem import BeamSection, LinearLaw, Model
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.spec import AnchorSpec, GroundSpec, PostSpec

#: stiffness multiplier that stands for "rigid" in the slack budget (a part made 100x
#: stiffer keeps 1 % of its give; larger factors spoil the conditioning of laminated posts)
RIGID = 100.0
#: softwood E/G (Swedish Wood, Design of Timber Structures, Vol. 1; references.md)
E_OVER_G = 16.0
#: beam elements per metre of post above grade
ELEMENTS_PER_METRE = 4


@dataclass
class BuiltAnchor:
    """An anchor inside a model.

    Attributes
    ----------
    attach
        height above grade -> node id where something attaches (line, guy).
    groups
        part name ("post", "soil", "fasteners", "guy", "root") -> group names.
    footing
        The placed footing handle (models.parts.footing.PlacedFooting) or None.
    laminated
        The laminated post handle (models.parts.laminated.LaminatedPost) or None.
    """

    spec: AnchorSpec
    grade_node: int
    top_node: int
    attach: dict[float, int]
    groups: dict[str, list[str]] = field(default_factory=dict)
    footing: object | None = None
    laminated: object | None = None
    post_section: dict | None = None
    guy_ground_nodes: list[int] = field(default_factory=list)
    guys: list = field(default_factory=list)      # models.parts.guys.BuiltGuy handles
    brace: object | None = None                   # models.parts.braces.BuiltKicker / BuiltHBrace

    def node_at(self, height: float) -> int:
        for h, n in self.attach.items():
            if abs(h - height) < 1e-6:
                return n
        raise KeyError(height)


def _material(post: PostSpec, where: str):
    """(E, G, reference design values or None) of a sawn or round post."""
    from spanstay.models.catalogs import lumber

    ov = post.overrides
    if post.kind == "round":
        ref = lumber.pole_values(post.species or "southern pine", where) if post.species else None
    else:
        size = post.section.nominal if post.section and post.section.nominal else None
        ref = lumber.design_values(post.species, post.grade, size, where) if post.species else None
    E = ov.E or (ref.E if ref else None)
    if E is None:
        raise InputError("give a species and grade from the lumber catalog or a modulus E", where)
    G = ov.shear_modulus or E / E_OVER_G
    return E, G, ref


def _heights(spec: AnchorSpec, extra: list[float], top: float) -> np.ndarray:
    """Node heights of a post: regular spacing plus every attachment height."""
    n = max(4, int(np.ceil(top * ELEMENTS_PER_METRE)))
    hs = np.concatenate([np.linspace(0.0, top, n + 1), np.asarray(extra, float)])
    hs = np.unique(np.round(hs, 9))
    return hs


def _across(pull: np.ndarray) -> np.ndarray:
    """Plan unit vector across the pull (local y of the post)."""
    p = np.array([pull[0], pull[1], 0.0])
    if np.linalg.norm(p) < 1e-12:
        p = np.array([1.0, 0.0, 0.0])
    p /= np.linalg.norm(p)
    return np.array([-p[1], p[0], 0.0])


def _solid_post(model: Model, spec: AnchorSpec, base: np.ndarray, heights: np.ndarray,
                pull: np.ndarray, stiffen: float, name: str):
    """Beam line of a sawn or round post; returns (node ids, section info)."""
    post = spec.post
    where = f"anchor '{spec.name}'.post"
    E, G, ref = _material(post, where)
    E, G = E * stiffen, G * stiffen
    xyz = np.repeat(base[None, :], heights.size, axis=0)
    xyz[:, 2] += heights
    nodes = model.add_nodes(xyz)
    mid = 0.5 * (heights[:-1] + heights[1:])
    if post.kind == "round":
        d = post.base_diameter + (post.top_diameter - post.base_diameter) * mid / post.height
        r = 0.5 * d
        area, inertia = np.pi * r**2, np.pi * r**4 / 4.0
        section = BeamSection(E, G, area, inertia, inertia, 2 * inertia, 0.9 * area, 0.9 * area)
        info = {"shape": "round", "diameter": d, "E": E / stiffen, "ref": ref}
    else:
        sec = post.section
        section = BeamSection.rectangle(E, G, width_y=sec.width, depth_z=sec.depth)
        info = {"shape": "rectangle", "width": sec.width, "depth": sec.depth, "E": E / stiffen,
                "ref": ref}
    model.add_beams(nodes[:-1], nodes[1:], section, orientation=_across(pull), name=name)
    return nodes, info


def _stiffened_design(design, factor: float):
    from dataclasses import replace
    plies = tuple(replace(p, E=p.E * factor) for p in design.plies)
    return replace(design, plies=plies)


def _stiffen_links(model: Model, group_name: str, factor: float) -> None:
    g = model.group(group_name)
    g.k[:, 1:3] *= factor  # slip along the joint (across, along the post); contact stays


def _post_width(spec: AnchorSpec) -> float:
    along, across = spec.post.outline
    return max(along, across)


def _add_footing(model: Model, built: BuiltAnchor, spec: AnchorSpec, ground: GroundSpec,
                 rigid: frozenset[str], pull: np.ndarray) -> None:
    fs = spec.footing
    where = f"anchor '{spec.name}'.footing"
    node = built.grade_node
    if fs is None or fs.kind == "fixed" or "soil" in rigid:
        if fs is not None and fs.kind == "fixed" and fs.base_spring and "soil" not in rigid:
            model.fix(node, "xyz")
            model.fix(node, "rz")
            for d in ("rx", "ry"):
                model.add_springs(node, d, LinearLaw(fs.base_spring), name=f"{spec.name}.base_{d}")
            built.groups["soil"] = [f"{spec.name}.base_rx", f"{spec.name}.base_ry"]
        else:
            model.fix(node, "all")
        return
    from spanstay.models.parts.footing import Footing, add_footing, concrete_pier_section
    from spanstay.models.catalogs.soil import profile_from_specs

    layers = fs.soil if fs.soil is not None else ground.soil
    if not layers:
        raise InputError("an embedded footing or pier needs soil layers ([[ground.soil]] or "
                         "footing.soil)", where)
    profile = profile_from_specs(list(layers), ground.water_table, where=f"{where}.soil")
    post_width = _post_width(spec)
    if fs.kind == "pier":
        footing = Footing(depth=fs.depth, width=fs.pier_diameter,
                          section=concrete_pier_section(fs.pier_diameter,
                                                        fs.concrete_strength), kind="pier",
                          post_width=post_width, orientation=tuple(_across(pull)), where=where)
    else:
        info = built.post_section or {}
        E = info.get("E", 10e9)
        along, across = spec.post.outline
        if spec.post.kind == "round":
            section = BeamSection.circle(E, E / E_OVER_G, spec.post.base_diameter)
        else:
            section = BeamSection.rectangle(E, E / E_OVER_G, across, along)
        footing = Footing(depth=fs.depth, width=min(along, across) if spec.post.kind != "round"
                          else spec.post.base_diameter, section=section, kind="direct",
                          orientation=tuple(_across(pull)), where=where)
    placed = add_footing(model, node, footing, profile, name=f"{spec.name}.footing")
    built.footing = placed
    built.groups["soil"] = list(placed.spring_groups) + list(placed.extra_groups)
    built.groups["footing_member"] = [placed.member_group]


def add_post(model: Model, spec: AnchorSpec, ground: GroundSpec, attach_heights: list[float],
               pull: np.ndarray, rigid: frozenset[str] = frozenset(),
               slip: str = "service") -> BuiltAnchor:
    """Add a post and its footing (no guys, no brace) to ``model``.

    Parameters
    ----------
    attach_heights
        Heights above grade where lines attach (guy heights are added here).
    pull
        Plan direction of the resultant line pull (sets the post's axes and
        the lamination stack direction).
    rigid
        Parts to make (nearly) rigid: any of "post", "fasteners", "soil", "guy".
    slip
        Fastener slip modulus of laminated posts: "service" (K_ser, for
        deflections and the ride) or "ultimate" (K_u = 2/3 K_ser, EC5 2.2.2,
        for strength checks).
    """
    where = f"anchor '{spec.name}'"
    base = np.array([spec.x, spec.y, spec.grade])
    heights_needed = sorted(set(list(attach_heights) + [g.attach_height for g in spec.guys]))
    groups: dict[str, list[str]] = {}
    if spec.kind == "tree":
        raise InputError("a tree is not a post; build it with parts.tree.add_tree", where)
    post = spec.post
    top = post.height
    for h in heights_needed:
        if h > top + 1e-9:
            raise InputError(f"attachment at {h:.3f} m is above the post top ({top:.3f} m)", where)
    stiffen = RIGID if "post" in rigid else 1.0
    lam = None
    if post.kind == "laminated":
        from spanstay.models.parts.laminated import add_laminated_post, design_from_post
        design = design_from_post(post, f"{where}.post")
        if stiffen != 1.0:
            design = _stiffened_design(design, stiffen)
        slip_scale = RIGID if "fasteners" in rigid else 1.0
        lam = add_laminated_post(model, base, design, top, heights=heights_needed + [top],
                                 pull=pull, slip=slip, name=f"{spec.name}.post")
        if slip_scale != 1.0:
            _stiffen_links(model, lam.mesh.link_group, slip_scale)
        grade_node = lam.base_node
        attach = {h: lam.node_at(h) for h in heights_needed}
        top_node = lam.node_at(top)
        groups["post"] = list(lam.mesh.beam_groups)
        groups["fasteners"] = [lam.mesh.link_group]
        info = {"shape": "laminated", "E": design.plies[0].E}
    else:
        hs = _heights(spec, heights_needed, top)
        nodes, info = _solid_post(model, spec, base, hs, pull, stiffen, f"{spec.name}.post")
        grade_node = int(nodes[0])
        attach = {h: int(nodes[np.argmin(np.abs(hs - h))]) for h in heights_needed}
        top_node = int(nodes[-1])
        groups["post"] = [f"{spec.name}.post"]
    built = BuiltAnchor(spec, grade_node, top_node, attach, groups, laminated=lam,
                        post_section=info)
    _add_footing(model, built, spec, ground, rigid, pull)
    return built
