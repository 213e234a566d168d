"""Laminated (built-up) timber posts with nail slip, built as fem beams and links.

Each ply is its own beam line at its own centroid. At every fastener level a
link joins each pair of neighbouring plies at their shared face (rigid
offsets from the two centroids): stiff normal to the joint, so the plies move
together across it, and the fasteners' slip modulus along it, so they slip.
Levels without fasteners (the ends, attachment heights) get a contact-only
link (stiff normal, no slip stiffness).

Directions: ``axis`` runs along the post, ``stack`` is the normal to the ply
faces (ply 0 is the furthest toward -stack), ``across`` = axis x stack lies
in the faces across the ply width. Ply beams have local y = stack, local z =
across, so their Mz bends the ply flatwise and My edgewise.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from spanstay.fem import BeamSection, Model
from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.fasteners import (Fastener, LateralValue, check_fits, joint_density, lateral_value,
                              nail_bending_yield, slip_modulus_ser)
from spanstay.models.catalogs.lumber import (INCH, PSI, DesignValues, DressedSize, custom_size, design_values,
                           parse_size)

#: Contact links across a joint have STIFF_FACTOR x E w s / t (E parallel to grain,
#: w ply width, s fastener spacing, t ply thickness): some 20 to 30 times the real
#: bearing stiffness across the grain (E perpendicular ~ E/20 to E/30, Wood Handbook,
#: from memory), so the plies move together; much stiffer springs only add round-off.
STIFF_FACTOR = 1.0
#: The base tie: translations RIGID_T x E A / h, rotations RIGID_R x E I / h of a ply's
#: shortest element h.
RIGID_T = 10.0
RIGID_R = 100.0
#: Softwood E/G (Swedish Wood, Design of Timber Structures, Vol. 1).
E_OVER_G = 16.0
GRAVITY = 9.80665


@dataclass(frozen=True)
class Ply:
    """One lamination: its size, reference design values and elastic moduli (SI)."""

    size: DressedSize
    values: DesignValues
    E: float
    G: float

    @property
    def thickness(self) -> float:
        return self.size.thickness

    @property
    def width(self) -> float:
        return self.size.width

    @property
    def area(self) -> float:
        return self.size.area


@dataclass(frozen=True)
class LaminatedDesign:
    """A laminated post section, resolved and checked (SI).

    ``rows`` lines of fasteners run along the post at ``spacing``; staggered
    rows alternate by half a spacing. Each joint between neighbouring plies
    has its own fasteners. ``K_ser`` is per fastener per shear plane (N/m);
    ``lateral`` holds the reference lateral value of each joint.
    """

    plies: tuple[Ply, ...]
    fastener: Fastener
    spacing: float
    rows: int
    staggered: bool
    rho_mean: float
    K_ser: float
    lateral: tuple[LateralValue, ...]
    stack_angle_deg: float = 0.0
    where: str | None = None

    @property
    def n(self) -> int:
        return len(self.plies)

    @property
    def K_u(self) -> float:
        """Ultimate slip modulus, 2/3 K_ser (EN 1995-1-1 2.2.2)."""
        return 2.0 / 3.0 * self.K_ser

    def slip_modulus(self, slip: str = "ultimate") -> float:
        """K per fastener per shear plane for ``slip`` = "service" or "ultimate"."""
        if slip not in ("service", "ultimate"):
            raise InputError(f'slip must be "service" or "ultimate", got {slip!r}', self.where)
        return self.K_ser if slip == "service" else self.K_u

    def k_per_length(self, slip: str = "ultimate") -> float:
        """Slip modulus of one joint per unit length, rows x K / spacing (N/m^2)."""
        return self.rows * self.slip_modulus(slip) / self.spacing

    @property
    def thicknesses(self) -> np.ndarray:
        return np.array([p.thickness for p in self.plies])

    @property
    def offsets(self) -> np.ndarray:
        """Ply centroid positions along ``stack`` from the middle of the stack (m)."""
        t = self.thicknesses
        return np.cumsum(t) - t / 2 - t.sum() / 2

    def EI_stack(self, composite: bool) -> float:
        """Bending across the joints: sum of ply E I (no connection) or full section."""
        E = np.array([p.E for p in self.plies])
        A = np.array([p.area for p in self.plies])
        I = np.array([p.size.I_weak for p in self.plies])
        if not composite:
            return float(np.sum(E * I))
        c = self.offsets
        zbar = np.sum(E * A * c) / np.sum(E * A)
        return float(np.sum(E * I + E * A * (c - zbar) ** 2))

    def EI_side(self) -> float:
        """Bending along the joints (plies side by side): sum of ply E I about their strong axes."""
        return float(sum(p.E * p.size.I_strong for p in self.plies))

    def fastener_levels(self, length: float) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """Fastener levels along a post of ``length``.

        Returns heights (m from the base), fasteners per level, and the mean
        position of that level's fasteners across the ply width (m). The
        first row sits half a spacing from the base (common practice).
        """
        w = min(p.width for p in self.plies)
        across = -w / 2 + w * (np.arange(self.rows) + 0.5) / self.rows
        if self.staggered and self.rows > 1:
            step = self.spacing / 2
            z = np.arange(step, length - 1e-9, step)
            sets = [across[0::2], across[1::2]]
            count = np.array([len(sets[k % 2]) for k in range(len(z))])
            pos = np.array([sets[k % 2].mean() for k in range(len(z))])
        else:
            z = np.arange(self.spacing / 2, length - 1e-9, self.spacing)
            count = np.full(len(z), self.rows)
            pos = np.full(len(z), across.mean())
        return z, count, pos


def make_fastener(kind: str, diameter: float, length: float, slip_modulus: float | None = None,
                  lateral_value: float | None = None, where: str | None = None) -> Fastener:
    """A fastener of given kind and size (m): Fyb by NDS diameter classes (from memory)."""
    if kind not in ("nail", "screw", "bolt"):
        raise InputError(f"fastener kind {kind!r} unknown; expected nail, screw or bolt", where)
    if not (diameter > 0 and length > 0):
        raise InputError(f"fastener diameter and length must be positive, got {diameter} m, "
                         f"{length} m", where)
    fyb = 45e3 * PSI if kind == "bolt" else nail_bending_yield(diameter / INCH)
    name = f"{diameter * 1000:.2f} mm {kind}"
    f = Fastener(kind, name, diameter, length, kind != "nail", fyb,
                 "user-given size; Fyb from NDS diameter classes (from memory)")
    return f.with_overrides(slip_modulus, lateral_value)


def laminated_design(ply: str | DressedSize, plies: int, species: str, grade: str,
                     fastener: Fastener, spacing: float, height: float, rows: int = 1,
                     staggered: bool = False, stack_angle_deg: float = 0.0,
                     overrides: dict[str, float] | None = None, G_shear: float | None = None,
                     where: str | None = None) -> LaminatedDesign:
    """Resolve and check a laminated post section.

    Parameters
    ----------
    ply
        Nominal size ("2x8") or a DressedSize; all plies alike.
    plies
        Number of plies (at least 2).
    species, grade
        Lumber catalog names (:mod:`models.catalogs.lumber`).
    fastener
        From :mod:`models.catalogs.fasteners` or :func:`make_fastener`.
    spacing
        Along the post, within one row (m). ``height`` is the post length it
        must fit in.
    overrides
        User design values (SI) replacing catalog ones, e.g. ``{"E": 11e9}``.
    G_shear
        Shear modulus (Pa); default E/16.

    Raises
    ------
    InputError
        Zero or one ply, a spacing longer than the post, a fastener too thick
        for the plies or too short to reach the next ply, an unknown species,
        grade or size; the message names the value and ``where``.
    """
    def at(key: str) -> str | None:
        return f"{where}.{key}" if where else key

    if not isinstance(plies, (int, np.integer)) or plies < 2:
        raise InputError(f"a laminated post needs at least 2 plies, got {plies!r}", at("plies"))
    size = parse_size(ply, at("ply")) if isinstance(ply, str) else ply
    values = design_values(species, grade, size, at("species"))
    if overrides:
        values = values.with_overrides(**{k: v for k, v in overrides.items() if v is not None})
    if not (spacing > 0):
        raise InputError(f"fastener spacing must be positive, got {spacing} m", at("fastener.spacing"))
    if spacing > height:
        raise InputError(f"fastener spacing {spacing:.4g} m is longer than the post "
                         f"({height:.4g} m); expected at most the post height",
                         at("fastener.spacing"))
    if rows < 1:
        raise InputError(f"fastener rows must be at least 1, got {rows}", at("fastener.rows"))
    G = G_shear if G_shear is not None else values.E / E_OVER_G
    ply_list = tuple(Ply(size, values, values.E, G) for _ in range(plies))
    rho = joint_density(values.rho_mean)
    check_fits(fastener, size.thickness, rho, at("fastener.diameter"))
    if fastener.kind != "bolt" and fastener.length < size.thickness:
        raise InputError(f"fastener length {fastener.length * 1000:.1f} mm is shorter than the "
                         f"{size.thickness * 1000:.1f} mm ply it must pass through",
                         at("fastener.length"))
    # each joint: the fastener enters through one ply (side member) into the next (main)
    lat = tuple(lateral_value(fastener, size.thickness, size.thickness, values.G, values.G,
                              at("fastener.length")) for _ in range(plies - 1))
    return LaminatedDesign(ply_list, fastener, float(spacing), int(rows), bool(staggered), rho,
                           slip_modulus_ser(fastener, rho), lat, float(stack_angle_deg), where)


def design_from_post(post, where: str | None = None) -> LaminatedDesign:
    """A :class:`LaminatedDesign` from a ``models.scenario.spec.PostSpec`` of kind "laminated"."""
    def at(key: str) -> str | None:
        return f"{where}.{key}" if where else key

    if post.species is None or post.grade is None:
        raise InputError("a laminated post needs a species and a grade from the lumber catalog",
                         at("species"))
    fs = post.fastener
    if fs is None:
        raise InputError("a laminated post needs a [fastener] table", at("fastener"))
    ply = post.ply
    size = parse_size(ply.nominal, at("ply")) if ply.nominal else custom_size(ply.depth, ply.width,
                                                                             where=at("ply"))
    f = make_fastener(fs.kind, fs.diameter, fs.length, fs.slip_modulus, where=at("fastener"))
    ov = post.overrides
    over = {k: getattr(ov, k) for k in ("E", "Emin", "Fb", "Ft", "Fv", "Fc", "Fc_perp")}
    over["rho_mean"] = ov.density
    return laminated_design(size, post.plies if post.plies is not None else 0, post.species,
                            post.grade, f, fs.spacing, post.height, fs.rows, fs.staggered,
                            post.stack_angle_deg or 0.0, over, ov.shear_modulus, where)


# ------------------------------------------------------------------ building
@dataclass
class PlyMesh:
    """What :func:`build_plies` added to the model.

    ``ply_nodes[i, j]`` is ply i's node at ``levels[j]`` (m from the origin
    along ``axis``). The link group ``link_group`` has one link per joint and
    level, joint-major: link ``k * n_levels + j`` joins plies k and k+1 at
    level j; ``fasteners[j]`` fasteners act there (0: contact only).
    """

    design: LaminatedDesign
    origin: np.ndarray
    axis: np.ndarray
    stack: np.ndarray
    across: np.ndarray
    levels: np.ndarray
    ply_nodes: np.ndarray
    fasteners: np.ndarray
    beam_groups: list[str]
    link_group: str
    slip: str
    k_contact: float
    k_row: np.ndarray = field(repr=False, default_factory=lambda: np.zeros(0))


def _unit(v, what: str) -> np.ndarray:
    v = np.asarray(v, float)
    n = np.linalg.norm(v)
    if not n > 0:
        raise InputError(f"{what} must be a non-zero vector, got {v.tolist()}")
    return v / n


def build_plies(model: Model, design: LaminatedDesign, origin, axis, stack, length: float, *,
                extra_levels=(), slip: str = "ultimate", shear: bool = True,
                weight: bool = True, name: str = "laminated") -> PlyMesh:
    """Add the plies and their joint links of a laminated member to ``model``.

    Parameters
    ----------
    origin
        Point on the member axis at its start (m); plies are centred on it.
    axis, stack
        Direction along the member and the normal to the ply faces (made
        perpendicular to ``axis``).
    length
        Member length (m).
    extra_levels
        Further distances from the origin that need nodes (attachments).
    slip
        "ultimate" (K_u, for strength checks) or "service" (K_ser).
    shear
        Timoshenko plies (True) or shear-rigid plies (False).
    """
    d = design
    ax = _unit(axis, "member axis")
    st = np.asarray(stack, float) - np.dot(stack, ax) * ax
    st = _unit(st, "stacking direction (across the member axis)")
    acr = np.cross(ax, st)
    zf, count, pos = d.fastener_levels(length)
    extra = np.asarray([h for h in extra_levels if 0.0 <= h <= length], float)
    levels = np.unique(np.round(np.concatenate([[0.0, length], zf, extra]), 9))
    fast = np.zeros(len(levels), int)
    across_pos = np.zeros(len(levels))
    idx = np.searchsorted(levels, np.round(zf, 9))
    fast[idx], across_pos[idx] = count, pos
    origin = np.asarray(origin, float)
    K = d.slip_modulus(slip)
    nodes, groups = [], []
    for i, (ply, c) in enumerate(zip(d.plies, d.offsets)):
        xyz = origin + c * st + levels[:, None] * ax
        ids = model.add_nodes(xyz)
        nodes.append(ids)
        sec = BeamSection.rectangle(ply.E, ply.G, ply.thickness, ply.width,
                                    ply.values.rho_mean * GRAVITY * ply.area if weight else 0.0)
        if not shear:
            sec.Asy = sec.Asz = None
        gname = f"{name}.ply{i}"
        model.add_beams(ids[:-1], ids[1:], sec, orientation=st, name=gname)
        groups.append(gname)
    nodes = np.array(nodes)
    E_mean = float(np.mean([p.E for p in d.plies]))
    w = min(p.width for p in d.plies)
    t_mean = float(np.mean(d.thicknesses))
    k_contact = STIFF_FACTOR * E_mean * w * d.spacing / t_mean
    k_row = fast * K
    n_lev = len(levels)
    n1, n2, k, o1, o2 = [], [], [], [], []
    for j in range(d.n - 1):
        n1.append(nodes[j]), n2.append(nodes[j + 1])
        kk = np.zeros((n_lev, 6))
        kk[:, 0], kk[:, 1], kk[:, 2] = k_contact, k_row, k_row
        k.append(kk)
        o1.append(np.outer(np.full(n_lev, d.thicknesses[j] / 2), st) + np.outer(across_pos, acr))
        o2.append(np.outer(np.full(n_lev, -d.thicknesses[j + 1] / 2), st) + np.outer(across_pos, acr))
    lname = f"{name}.joints"
    model.add_links(np.concatenate(n1), np.concatenate(n2), np.concatenate(k),
                    np.concatenate(o1), np.concatenate(o2), np.stack([st, acr, ax]), name=lname)
    return PlyMesh(d, origin, ax, st, acr, levels, nodes, fast, groups, lname, slip, k_contact,
                   k_row)


@dataclass
class LaminatedPost:
    """A laminated post in a model: its mesh, base node and attachment nodes.

    ``base_node`` sits on the post axis at the base and is tied rigidly to
    every ply's bottom end (the footing holds the plies together); give it
    supports or soil springs. ``attach[h]`` is an axis node at height ``h``
    (m above the base) tied to the plies there.
    """

    mesh: PlyMesh
    base_node: int
    attach: dict[float, int]
    length: float
    name: str

    @property
    def design(self) -> LaminatedDesign:
        return self.mesh.design

    def node_at(self, height: float) -> int:
        """The axis node at ``height`` (0 is the base)."""
        for h, n in self.attach.items():
            if abs(h - height) < 1e-6:
                return n
        raise KeyError(f"no attachment node at {height} m on {self.name} "
                       f"(have {sorted(self.attach)})")


def stacking_direction(pull, stack_angle_deg: float) -> np.ndarray:
    """Plan direction normal to the ply faces: the pull turned by the stack angle about z."""
    p = np.asarray(pull, float).copy()
    p[2] = 0.0
    p = _unit(p, "pull direction (in plan)")
    a = math.radians(stack_angle_deg)
    return np.array([p[0] * math.cos(a) - p[1] * math.sin(a),
                     p[0] * math.sin(a) + p[1] * math.cos(a), 0.0])


def add_laminated_post(model: Model, base_node_xyz, design: LaminatedDesign, length: float,
                       heights=(), *, pull=(1.0, 0.0, 0.0), slip: str = "ultimate",
                       attach_slip: float | None = None, shear: bool = True,
                       weight: bool = True, name: str = "post") -> LaminatedPost:
    """Add a vertical laminated post standing on ``base_node_xyz``.

    Parameters
    ----------
    model
        The fem model to add to.
    base_node_xyz
        Bottom of the post on its axis (m); the post rises ``length`` along +z.
    design
        From :func:`laminated_design` or :func:`design_from_post`.
    heights
        Heights above the base (m) that need an axis node: line and guy
        attachments, soil-spring levels. 0 returns the base node.
    pull
        Plan direction of the line's pull; the plies stack at
        ``design.stack_angle_deg`` from it (0: across the pull).
    slip
        "ultimate" (K_u, strength checks) or "service" (K_ser, deflections).
    attach_slip
        Stiffness (N/m) along the post between an attachment node and each
        ply, for the hardware (a through-bolt); default one fastener's slip
        modulus. Across the post the attachment is stiff.

    Returns
    -------
    LaminatedPost
        ``base_node`` and ``attach`` (height -> node id) for the line builder.
    """
    if not length > 0:
        raise InputError(f"post length must be positive, got {length} m", design.where)
    bad = [h for h in heights if not (0.0 <= h <= length + 1e-9)]
    if bad:
        raise InputError(f"attachment height(s) {bad} m lie outside the post (0 to {length:g} m)",
                         design.where)
    base = np.asarray(base_node_xyz, float)
    st = stacking_direction(pull, design.stack_angle_deg)
    mesh = build_plies(model, design, base, (0.0, 0.0, 1.0), st, length,
                       extra_levels=[h for h in heights if h > 0], slip=slip, shear=shear,
                       weight=weight, name=name)
    kc = mesh.k_contact
    h_min = float(np.min(np.diff(mesh.levels)))
    p0 = design.plies[0]
    kt_rigid = RIGID_T * p0.E * p0.area / h_min
    kr_rigid = RIGID_R * p0.E * p0.size.I_strong / h_min
    c = design.offsets
    axes = np.stack([mesh.stack, mesh.across, mesh.axis])
    base_node = model.add_node(base)
    n = design.n
    model.add_links(np.full(n, base_node), mesh.ply_nodes[:, 0],
                    (kt_rigid, kt_rigid, kt_rigid, kr_rigid, kr_rigid, kr_rigid),
                    np.outer(c, mesh.stack), 0.0, axes, name=f"{name}.base")
    attach = {0.0: base_node}
    up = sorted({round(float(h), 9) for h in heights if h > 0})
    if up:
        k_v = attach_slip if attach_slip is not None else design.slip_modulus(slip)
        if not k_v > 0:
            raise InputError(f"attach_slip must be positive, got {k_v}", design.where)
        kr_soft = 1e-3 * min(p.E * p.size.I_weak for p in design.plies) / design.spacing
        n1, n2, o1 = [], [], []
        for h in up:
            j = int(np.argmin(np.abs(mesh.levels - h)))
            node = model.add_node(base + np.array([0.0, 0.0, h]))
            attach[h] = node
            n1 += [node] * n
            n2 += list(mesh.ply_nodes[:, j])
            o1 += [ci * mesh.stack for ci in c]
        model.add_links(n1, n2, (kc, kc, k_v, kr_soft, kr_soft, kr_soft), np.array(o1), 0.0,
                        axes, name=f"{name}.attach")
    return LaminatedPost(mesh, base_node, attach, float(length), name)
