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
from spanstay.models.parts.laminated_design import (GRAVITY, LaminatedDesign, Ply, RIGID_R, RIGID_T, STIFF_FACTOR, design_from_post, laminated_design, make_fastener)

__all__ = ['GRAVITY', 'LaminatedDesign', 'Ply', 'RIGID_R', 'RIGID_T', 'STIFF_FACTOR', 'design_from_post', 'laminated_design', 'make_fastener', 'PlyMesh', 'LaminatedPost', 'build_plies', 'add_laminated_post', 'stacking_direction']


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
