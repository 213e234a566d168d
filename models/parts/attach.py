"""Where hardware meets a post: the axis node nearest a height and the face point.

Guys, kicker struts, rails and brace wires bear on a post's face, not on its
axis. ``axis_node`` finds the post-axis node nearest a height (with the
vertical remainder, which a rigid arm bridges) and ``face_offset`` the plan
vector from the axis to the face in a given direction.
"""
from __future__ import annotations

import numpy as np

from spanstay.fem import Model


def plan_unit(direction) -> np.ndarray:
    """Horizontal unit vector of ``direction`` (3,) (its z part dropped)."""
    d = np.array([direction[0], direction[1], 0.0], float)
    n = np.linalg.norm(d)
    if n < 1e-12:
        raise ValueError("a plan direction needs a horizontal part")
    return d / n


def unit_from_degrees(angle_deg: float) -> np.ndarray:
    """Plan unit vector at ``angle_deg`` from +x."""
    a = np.radians(angle_deg)
    return np.array([np.cos(a), np.sin(a), 0.0])


def _axis_candidates(model: Model, built) -> np.ndarray:
    """Node ids on the post axis: attachment, grade and top nodes, and every node
    of a solid post's beam line."""
    ids = set(built.attach.values()) | {built.grade_node, built.top_node}
    if built.laminated is None:
        for name in built.groups.get("post", [])[:1]:
            ids |= set(np.unique(model.group(name).conn).tolist())
    base = model.coords[built.grade_node]
    ids_arr = np.array(sorted(ids))
    xy = model.coords[ids_arr, :2] - base[:2]
    return ids_arr[np.linalg.norm(xy, axis=1) < 1e-9]


#: a laminated post gets its own axis node tied to the plies when no axis node is this close
LAMINATED_TIE_GAP = 0.05


def axis_node(model: Model, built, height: float) -> tuple[int, float]:
    """The post-axis node nearest ``height`` above grade, and ``height`` minus its height.

    A laminated post has axis nodes only at its attachment heights; where none
    is within LAMINATED_TIE_GAP, a new axis node is tied to the plies at the
    nearest ply level (as the post's own attachment nodes are).
    """
    ids = _axis_candidates(model, built)
    z = model.coords[ids, 2] - model.coords[built.grade_node, 2]
    k = int(np.argmin(np.abs(z - height)))
    if built.laminated is not None and abs(z[k] - height) > LAMINATED_TIE_GAP:
        return _tie_to_plies(model, built, height)
    return int(ids[k]), float(height - z[k])


def _tie_to_plies(model: Model, built, height: float) -> tuple[int, float]:
    """A new axis node at the ply level nearest ``height``, tied to every ply like the
    laminated post's attachment nodes (stiff across, the fastener slip along the post)."""
    lam = built.laminated
    mesh, design = lam.mesh, lam.design
    j = int(np.argmin(np.abs(mesh.levels - height)))
    level = float(mesh.levels[j])
    node = model.add_node(model.coords[built.grade_node] + level * mesh.axis)
    n = design.n
    k_v = design.slip_modulus(mesh.slip)
    kr_soft = 1e-3 * min(p.E * p.size.I_weak for p in design.plies) / design.spacing
    kc = mesh.k_contact
    axes = np.stack([mesh.stack, mesh.across, mesh.axis])
    offsets = np.outer(design.offsets, mesh.stack)
    name = f"{lam.name}.tie{len([g for g in model.groups if g.name.startswith(lam.name + '.tie')])}"
    model.add_links(np.full(n, node), mesh.ply_nodes[:, j], (kc, kc, k_v, kr_soft, kr_soft, kr_soft),
                    offsets, 0.0, axes, name=name)
    built.attach[round(level, 9)] = node
    built.groups.setdefault("fasteners", []).append(name)
    return node, float(height - level)


def face_offset(model: Model, built, height: float, direction) -> np.ndarray:
    """Plan vector from the post axis to its face, facing ``direction``.

    Round posts and trees use the (tapered) radius at ``height``; sawn and
    laminated posts the rectangle of their section in the post's own axes.
    """
    d = plan_unit(direction)
    spec = built.spec
    if spec.kind == "tree":
        tree = spec.tree
        slope = (tree.diameter_at_attachment - tree.diameter_at_grade) / tree.attachment_height
        return 0.5 * max(tree.diameter_at_grade + slope * height, 0.05) * d
    post = spec.post
    if post.kind == "round":
        dia = post.base_diameter + (post.top_diameter - post.base_diameter) * height / post.height
        return 0.5 * dia * d
    frame = model.group(built.groups["post"][0]).frame0[0]
    local_y, local_z = frame[:, 1], frame[:, 2]
    if post.kind == "sawn":
        half_y, half_z = 0.5 * post.section.width, 0.5 * post.section.depth
    else:  # laminated: plies stack along the ply beams' local y
        half_y, half_z = 0.5 * post.plies * post.ply.depth, 0.5 * post.ply.width
    cy, cz = abs(float(d @ local_y)), abs(float(d @ local_z))
    reach = min(half_y / cy if cy > 1e-12 else np.inf, half_z / cz if cz > 1e-12 else np.inf)
    return reach * d


def perpendicular_axes(along) -> np.ndarray:
    """(3, 3) rows: unit ``along``, a horizontal unit across it, and their cross product.

    For a vertical ``along`` the second row is +x turned to be perpendicular.
    """
    a = np.asarray(along, float)
    a = a / np.linalg.norm(a)
    across = np.cross([0.0, 0.0, 1.0], a)
    if np.linalg.norm(across) < 1e-9:
        across = np.array([0.0, 1.0, 0.0])
    across /= np.linalg.norm(across)
    return np.stack([a, across, np.cross(a, across)])
