"""Footings in soil: an embedded post or a concrete pier on lateral p-y springs.

The embedded member is its own beam line from the ground-line node down to
the toe, meshed with nodes at every layer contact. Every embedded node gets a
planar soil spring (``fem.PlanarSpringGroup``: the p-y curve on the magnitude
of the horizontal displacement, the reaction along it, so the soil is
isotropic in plan and a pull in any direction meets the same soil) with its
tributary length;
where a node sits on a layer contact, each half of its tributary length gets
the curve of its own layer. The toe is held vertically and against twist;
optional linear base springs add shear and moment resistance at the toe.

Public:
- ``Footing``: the description (depth, width, member section, options).
- ``concrete_pier_section``: gross round concrete section for a pier.
- ``add_footing(model, grade_node, footing, profile)``: put a footing under a
  node of any model; returns a ``PlacedFooting`` handle.
- ``footing_response(placed, model, state, direction)``: ground-line
  displacement and rotation, point of rotation, p(z), p/p_u, moment, shear.
- ``ibc_check``: IBC 2021 embedment depth check of the footing.
- ``FootingCase``, ``build_case_model``: one footing with its post above
  grade, loaded laterally, as a model of its own (solved and pushed to its
  limit in ``models.analysis.capacity``).
"""
from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from spanstay.fem import BeamSection, LinearLaw, Model, State
from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.ibc_embedment import (IBC_LATERAL_BEARING_PSF_PER_FT, EmbedmentCheck,
                                  check_embedment, ibc_class_key, round_or_square_width)
from spanstay.models.parts.py_curves import CombinedCurves, curves_for_profile
from spanstay.models.catalogs.soil import SoilProfile


def concrete_pier_section(diameter: float, compressive_strength: float = 20.7e6) -> BeamSection:
    """Gross round section of a concrete pier (uncracked).

    E_c = 4700 sqrt(f'c [MPa]) MPa, normalweight concrete (ACI 318-19
    §19.2.2.1, from memory); G = E_c / (2 (1 + 0.2)).
    """
    e = 4700.0 * np.sqrt(compressive_strength / 1e6) * 1e6
    return BeamSection.circle(e, e / 2.4, diameter)


@dataclass(frozen=True)
class Footing:
    """A post embedded directly in soil, or a concrete pier under a post.

    Parameters
    ----------
    depth
        Embedded length below grade, m.
    width
        Width that bears on the soil, m: the post's face width (direct) or the
        pier diameter (pier).
    section
        Beam section of the embedded member (the post's own, or
        ``concrete_pier_section``).
    kind
        ``"direct"`` or ``"pier"``.
    post_width
        Width of the post standing on a pier, m (checked: a pier must not be
        narrower than its post).
    base_shear_stiffness, base_moment_stiffness
        Optional linear toe springs, N/m and N m/rad (0 = none).
    py_model
        ``"api"`` (API sand, Matlock clay) or ``"elastic_plastic"``.
    cyclic
        Cyclic API sand curves.
    elements
        Number of beam elements over the embedded length (at least one per
        layer crossed). 40 keeps results within 1 % of a mesh twice as fine.
    orientation
        Vector setting the local y axis of the embedded member.
    where
        Key path of the footing in the scenario, for error messages.
    shape
        ``"round"`` or ``"square"`` (IBC b: diameter, or diagonal of a square).
    """

    depth: float
    width: float
    section: BeamSection
    kind: str = "direct"
    post_width: float | None = None
    base_shear_stiffness: float = 0.0
    base_moment_stiffness: float = 0.0
    py_model: str = "api"
    cyclic: bool = False
    elements: int = 40
    orientation: tuple[float, float, float] = (0.0, 1.0, 0.0)
    where: str = "footing"
    shape: str = "round"

    def validate(self, profile: SoilProfile) -> None:
        """Raise InputError naming the first bad value (and the footing's key path)."""
        w = self.where
        if self.kind not in ("direct", "pier"):
            raise InputError(f"footing kind {self.kind!r} is not known; expected 'direct' or "
                             "'pier'", where=f"{w}.kind")
        for name in ("depth", "width"):
            value = getattr(self, name)
            if not np.isfinite(value) or value <= 0:
                raise InputError(f"{name} {value} m must be positive", where=f"{w}.{name}")
        if self.depth > profile.bottom + 1e-9:
            raise InputError(f"footing depth {self.depth:.3f} m is deeper than the described soil "
                             f"({profile.bottom:.3f} m); describe the soil down to the toe",
                             where=f"{w}.depth")
        if self.kind == "pier" and self.post_width is not None and self.post_width > self.width:
            raise InputError(f"pier diameter {self.width:.3f} m is narrower than its post "
                             f"({self.post_width:.3f} m)", where=f"{w}.width")
        if self.base_shear_stiffness < 0 or self.base_moment_stiffness < 0:
            raise InputError("base spring stiffnesses must be >= 0", where=f"{w}.base")
        if self.py_model not in ("api", "elastic_plastic"):
            raise InputError(f"p-y model {self.py_model!r} is not known; expected 'api' or "
                             "'elastic_plastic'", where=f"{w}.py_model")
        if self.shape not in ("round", "square"):
            raise InputError(f"footing shape {self.shape!r} is not known; expected 'round' or "
                             "'square'", where=f"{w}.shape")
        if int(self.elements) < 2:
            raise InputError(f"elements {self.elements} must be at least 2", where=f"{w}.elements")


def ibc_check(footing: Footing, profile: SoilProfile, load: float, load_height: float,
              constrained: bool = False, doubled: bool = False) -> EmbedmentCheck:
    """IBC 2021 embedment check of a footing (Eq. 18-1, or Eq. 18-2 if ``constrained``).

    The soil class is the weakest Table 1806.2 class among the layers the
    footing passes through; every such layer needs its ``ibc_class``.
    ``doubled`` applies §1806.3.4 (isolated poles, 1/2 inch motion acceptable).
    """
    footing.validate(profile)
    classes = []
    for i, layer in enumerate(profile.layers):
        if layer.top >= footing.depth:
            break
        if layer.ibc_class is None:
            raise InputError(f"the IBC embedment check needs the Table 1806.2 class of every "
                             f"layer the footing passes through; layer {i} has none",
                             where=f"{profile.where}.layer[{i}].ibc_class")
        classes.append(ibc_class_key(layer.ibc_class))
    weakest = min(classes, key=IBC_LATERAL_BEARING_PSF_PER_FT.__getitem__)
    b = float(round_or_square_width(footing.width, footing.shape))
    return check_embedment(load, load_height, b, footing.depth, weakest, constrained, doubled)


def soil_modulus(profile: SoilProfile, depth, width: float) -> np.ndarray:
    """Representative p-y slope E_s(z), N/m^2, for choosing the mesh.

    API sand: its initial slope k z; clay: the secant at y50, 0.5 p_u / y50;
    modulus layers: their own slope.
    """
    z = np.atleast_1d(np.asarray(depth, float))
    curves = curves_for_profile(profile, z, width, 1.0, "elastic_plastic")
    return curves.modulus_at_rest()


def characteristic_length(profile: SoilProfile, stiffness: float, width: float,
                          limit: float) -> float:
    """Length lambda with lambda^4 E_s(lambda) = EI (T of Matlock & Reese when E_s = n_h z).

    Bending of the embedded member dies out over a few lambda; returns
    ``limit`` when the member is shorter than lambda (it acts rigidly).
    """
    def excess(lam: float) -> float:
        return lam**4 * float(soil_modulus(profile, lam, width)[0]) - stiffness

    if excess(limit) <= 0:
        return limit
    lo, hi = 0.0, limit
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if excess(mid) < 0 else (lo, mid)
    return hi


ELEMENTS_PER_LENGTH = 8  # per characteristic length: halving the mesh then moves results < 1 %


def embedment_depths(footing: Footing, profile: SoilProfile) -> np.ndarray:
    """Node depths from grade (0) to the toe, with nodes at layer contacts and the water table.

    Element length is at most depth / elements and at most 1/8 of the
    characteristic length (``characteristic_length``), so long flexible
    piles are meshed as finely as their bending needs.
    """
    L = footing.depth
    ei = float(np.min(np.asarray(footing.section.E, float)
                      * np.minimum(footing.section.Iy, footing.section.Iz)))
    lam = characteristic_length(profile, ei, footing.width, L)
    from spanstay.models.scenario.limits import FOOTING_ELEMENTS_MAX

    needed = ELEMENTS_PER_LENGTH * L / lam
    if not np.isfinite(needed) or needed > FOOTING_ELEMENTS_MAX:
        raise InputError(f"meshing this footing ({L:.3g} m deep, bending dying out over "
                         f"{lam:.3g} m in this soil) would take more than "
                         f"{FOOTING_ELEMENTS_MAX} elements; check the depth, the soil "
                         "stiffness and the post size", f"{footing.where or 'footing'}.depth")
    count = max(int(footing.elements), int(np.ceil(needed)))
    breaks = {0.0, L, *(lay.bottom for lay in profile.layers if 0 < lay.bottom < L)}
    if profile.water_table is not None and 0 < profile.water_table < L:
        breaks.add(profile.water_table)
    zb = np.array(sorted(breaks))
    parts = [np.linspace(a, b, max(1, int(np.ceil(count * (b - a) / L - 1e-9))) + 1)[:-1]
             for a, b in zip(zb[:-1], zb[1:])]
    return np.concatenate(parts + [[L]])


@dataclass
class PlacedFooting:
    """A footing added to a model: node ids, group names and the p-y curves.

    ``spring_node`` gives, for each soil spring, the index (into ``nodes``) of
    its node; a node on a layer contact carries two springs.
    """

    footing: Footing
    profile: SoilProfile
    name: str
    nodes: np.ndarray
    depths: np.ndarray
    member_group: str
    spring_groups: tuple[str, ...]
    spring_node: np.ndarray
    curves: CombinedCurves
    grade_elevation: float = 0.0
    extra_groups: list[str] = field(default_factory=list)
    #: one planar spring group (True), or separate x and y groups (one-sided comparisons)
    planar: bool = True

    def spring_motion(self, state: State) -> tuple[np.ndarray, np.ndarray]:
        """(ns, 2) horizontal displacement and soil reaction force (N) of every spring."""
        if self.planar:
            g = state.group(self.spring_groups[0])
            return np.asarray(g.displacement), np.asarray(g.force)
        gx, gy = (state.group(n) for n in self.spring_groups)
        return (np.column_stack([gx.displacement, gy.displacement]),
                np.column_stack([gx.force, gy.force]))

    @property
    def grade_node(self) -> int:
        return int(self.nodes[0])

    @property
    def toe_node(self) -> int:
        return int(self.nodes[-1])


def _springs(depths: np.ndarray, profile: SoilProfile) -> tuple[np.ndarray, ...]:
    """Spring node index, depth, tributary length and layer (split on contacts)."""
    h = np.diff(depths)
    elem_layer = profile.layer_at(0.5 * (depths[:-1] + depths[1:]))
    n = depths.size
    # one entry per (node, adjacent element): half the element length each
    node = np.concatenate([np.arange(n - 1), np.arange(1, n)])
    trib = np.concatenate([0.5 * h, 0.5 * h])
    layer = np.concatenate([elem_layer, elem_layer])
    key = node * (len(profile.layers) + 1) + layer
    uniq, inv = np.unique(key, return_inverse=True)
    trib_sum = np.bincount(inv, weights=trib)
    s_node = uniq // (len(profile.layers) + 1)
    s_layer = uniq % (len(profile.layers) + 1)
    return s_node, depths[s_node], trib_sum, s_layer


def add_footing(model: Model, grade_node: int, footing: Footing, profile: SoilProfile,
                name: str = "footing", one_sided: int = 0) -> PlacedFooting:
    """Add a footing below ``grade_node`` (a node at the ground surface) of ``model``.

    Adds the embedded beam line straight down from the node, a planar soil
    spring at every embedded node, the toe supports (uz and twist fixed) and
    any base springs. Group names start with ``name``.

    Parameters
    ----------
    model
        The model to extend.
    grade_node
        Node at grade where the post meets the ground (or sits on the pier).
    footing, profile
        The footing and the soil it stands in (validated here).
    name
        Prefix of the new element groups; unique per footing in one model.
    one_sided
        0 (soil on both faces, planar springs). +1 uses separate x and y
        springs, the x springs resisting only +x motion (passive pressure on
        the front face only, as Broms' hand method assumes); for comparisons
        with hand methods along x.

    Returns
    -------
    PlacedFooting
        Handle for ``footing_response``.
    """
    footing.validate(profile)
    top = model.coords[int(grade_node)]
    depths = embedment_depths(footing, profile)
    below = np.repeat(top[None, :], depths.size - 1, axis=0)
    below[:, 2] -= depths[1:]
    nodes = np.concatenate([[int(grade_node)], model.add_nodes(below)])
    member = f"{name}.{'pier' if footing.kind == 'pier' else 'embedded'}"
    model.add_beams(nodes[:-1], nodes[1:], footing.section, orientation=footing.orientation,
                    name=member)
    s_node, s_depth, s_trib, s_layer = _springs(depths, profile)
    curves = curves_for_profile(profile, s_depth, footing.width, s_trib, footing.py_model,
                                footing.cyclic, layer=s_layer)
    if one_sided == 0:
        groups: tuple[str, ...] = (f"{name}.soil",)
        model.add_planar_springs(nodes[s_node], curves, name=groups[0])
    else:
        groups = (f"{name}.soil_x", f"{name}.soil_y")
        model.add_springs(nodes[s_node], "ux", curves, one_sided=one_sided, name=groups[0])
        model.add_springs(nodes[s_node], "uy", curves, name=groups[1])
    toe = int(nodes[-1])
    model.fix(toe, ["uz", "rz"])
    extra = []
    for value, dofs, tag in ((footing.base_shear_stiffness, ["ux", "uy"], "base_shear"),
                             (footing.base_moment_stiffness, ["rx", "ry"], "base_moment")):
        if value > 0:
            for d in dofs:
                model.add_springs(toe, d, LinearLaw(value), name=f"{name}.{tag}_{d}")
                extra.append(f"{name}.{tag}_{d}")
    return PlacedFooting(footing, profile, name, nodes, depths, member, groups, s_node, curves,
                         float(top[2]), extra, planar=one_sided == 0)


@dataclass
class FootingResponse:
    """Soil and member response of one footing along a lateral direction (SI).

    Arrays run over the embedded nodes from grade to the toe. Displacement,
    p and shear are positive along ``direction``; the rotation and the moment
    are positive when the top leans toward ``direction``. ``p_ultimate`` is
    the largest resistance of each node's p-y curve (A p_u for API sand, p_u
    otherwise; 0 for an uncapped modulus layer) and ``ratio`` = |p| / that
    limit (0 where there is none); moment and shear are taken just below
    each node. ``rotation_point_depth`` is nan when the member does not
    cross its original line.
    """

    depth: np.ndarray
    displacement: np.ndarray
    p: np.ndarray
    p_ultimate: np.ndarray
    ratio: np.ndarray
    moment: np.ndarray
    shear: np.ndarray
    ground_displacement: float
    ground_rotation: float
    rotation_point_depth: float

    @property
    def max_ratio(self) -> float:
        """Largest p/p_u along the embedment."""
        return float(np.max(self.ratio))

    @property
    def max_moment(self) -> float:
        """Largest bending moment magnitude along the embedment, N m."""
        return float(np.max(np.abs(self.moment)))


def footing_response(placed: PlacedFooting, model: Model, state: State,
                     direction=(1.0, 0.0)) -> FootingResponse:
    """Response of a placed footing in ``state``, projected on a plan ``direction``."""
    d2 = np.asarray(direction, float)
    d = np.array([d2[0], d2[1], 0.0]) / np.linalg.norm(d2)
    axis = np.cross([0.0, 0.0, 1.0], d)  # rotation axis that leans the top toward d
    u = state.u[placed.nodes]
    disp = u[:, :3] @ d
    uv, fv = placed.spring_motion(state)
    n = placed.nodes.size
    sn = placed.spring_node
    force = np.bincount(sn, weights=fv[:, 0] * d[0] + fv[:, 1] * d[1], minlength=n)
    trib = np.bincount(sn, weights=placed.curves.tributary, minlength=n)
    pu_x = np.where(np.isfinite(placed.curves.p_ultimate), placed.curves.p_ultimate, 0.0)
    p_ult = np.bincount(sn, weights=pu_x * placed.curves.tributary, minlength=n) / trib
    util = placed.curves.utilization(np.hypot(uv[:, 0], uv[:, 1]))
    ratio = np.zeros(n)
    np.maximum.at(ratio, sn, util)
    moment, shear = _member_actions(model.group(placed.member_group),
                                    state.group(placed.member_group).end_forces, d, axis)
    return FootingResponse(placed.depths.copy(), disp, force / trib, p_ult, ratio, moment, shear,
                           float(disp[0]), float(u[0, 3:] @ axis),
                           _first_zero(placed.depths, disp))


def _member_actions(group, ends: np.ndarray, d: np.ndarray, axis: np.ndarray):
    """Bending moment about ``axis`` and shear along ``d`` at every node of a beam line."""
    frame = group.frame0  # (ne, 3, 3), columns local x, y, z
    values = np.concatenate([ends[:, 0, :], ends[-1:, 1, :]])  # (n, 6) section forces
    frames = np.concatenate([frame, frame[-1:]])
    m_global = np.einsum("nij,nj->ni", frames, values[:, 3:])
    v_global = np.einsum("nij,nj->ni", frames[:, :, 1:], values[:, 1:3])
    # signs chosen so that M = +H e and V = +H just below grade for a load H toward d at
    # height e (checked against statics in the tests); values are those just below each node
    return -(m_global @ axis), -(v_global @ d)


def _first_zero(depth: np.ndarray, y: np.ndarray) -> float:
    """Depth of the first sign change of y below grade (linear interpolation), or nan."""
    s = np.sign(y)
    idx = np.flatnonzero(s[:-1] * s[1:] < 0)
    if idx.size == 0:
        return float("nan")
    i = idx[0]
    return float(depth[i] + (depth[i + 1] - depth[i]) * y[i] / (y[i] - y[i + 1]))
