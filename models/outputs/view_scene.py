"""Geometry of the 3D view as plain arrays: members as prisms, ropes, ground, rider.

Everything here is numpy; ``models.outputs.view`` turns it into pyvista meshes.
Posts, plies and footings are prisms with their true section (rectangle or
round); ropes are thin round prisms with a visible minimum radius. Members
move by the exaggerated displacement; ropes keep their true shape and only
follow their (exaggerated) ends, so an exaggeration never turns the loaded
sag into nonsense.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from spanstay.models.outputs.view_data import MEMBER_KINDS, Results, Station, cell_frames, part_cells

#: sides of a round prism
ROUND_SIDES = 14
#: rope radius drawn at least this fraction of the model's size
ROPE_MIN_RADIUS = 0.0022
#: plies are drawn this much thinner than they are so the joints show
PLY_GAP = 0.10


@dataclass
class Prisms:
    """Closed prisms: points, a pyvista-style face array, and the cell each face shows."""

    points: np.ndarray
    faces: np.ndarray
    face_cell: np.ndarray


def _section_ring(shape: str, width: float, depth: float, sides: int) -> np.ndarray:
    """(m, 2) section outline in local (y, z)."""
    if shape == "round":
        t = np.linspace(0.0, 2 * np.pi, sides, endpoint=False)
        return 0.5 * np.c_[width * np.cos(t), depth * np.sin(t)]
    w, d = 0.5 * width, 0.5 * depth
    return np.array([[-w, -d], [w, -d], [w, d], [-w, d]])


def prisms(p1: np.ndarray, p2: np.ndarray, ey: np.ndarray, ez: np.ndarray, ring: np.ndarray,
           cells: np.ndarray) -> Prisms:
    """One closed prism per element from ``p1`` to ``p2`` with section ``ring``."""
    ne, m = p1.shape[0], ring.shape[0]
    off = ring[None, :, 0, None] * ey[:, None, :] + ring[None, :, 1, None] * ez[:, None, :]
    pts = np.stack([p1[:, None, :] + off, p2[:, None, :] + off], axis=1)  # (ne, 2, m, 3)
    base = (np.arange(ne) * 2 * m)[:, None]
    j = np.arange(m)[None, :]
    jn = (j + 1) % m
    quads = np.stack([np.full((ne, m), 4), base + j, base + jn, base + m + jn, base + m + j], -1)
    cap0 = np.c_[np.full(ne, m), base + j[:, ::-1]]
    cap1 = np.c_[np.full(ne, m), base + m + j]
    faces = np.concatenate([quads.reshape(ne, -1), cap0, cap1], axis=1).ravel()
    return Prisms(pts.reshape(-1, 3), faces, np.repeat(cells, m + 2))


def join(items: list[Prisms]) -> Prisms:
    """Prisms of several parts as one set."""
    items = [p for p in items if p.face_cell.size]
    if not items:
        return Prisms(np.zeros((0, 3)), np.zeros(0, int), np.zeros(0, int))
    pts, faces, cells, shift = [], [], [], 0
    for p in items:
        f = p.faces.copy()
        i = 0
        while i < f.size:  # shift point ids (face arrays are [n, ids..., n, ids...])
            n = f[i]
            f[i + 1:i + 1 + n] += shift
            i += n + 1
        pts.append(p.points)
        faces.append(f)
        cells.append(p.face_cell)
        shift += p.points.shape[0]
    return Prisms(np.concatenate(pts), np.concatenate(faces), np.concatenate(cells))


def model_size(results: Results, st: Station) -> float:
    """Largest extent of the undeformed model, m."""
    ext = st.points.max(axis=0) - st.points.min(axis=0)
    return float(max(ext.max(), 1.0))


def auto_exaggeration(results: Results, stations: list[Station]) -> float:
    """A round factor that makes the largest member movement about 4 % of the model size."""
    members = [int(p["group_index"]) for p in results.parts if p.get("kind") in MEMBER_KINDS]
    top = 0.0
    for st in stations:
        nodes = np.unique(st.conn[np.isin(st.group, members)])
        if nodes.size:
            top = max(top, float(np.max(np.linalg.norm(st.displacement[nodes], axis=1))))
    if top <= 0:
        return 1.0
    raw = 0.04 * model_size(results, stations[0]) / top
    if raw <= 1.0:
        return 1.0
    mag = 10 ** np.floor(np.log10(raw))
    for step in (5, 2, 1):
        if step * mag <= raw:
            return float(min(step * mag, 1000.0))
    return 1.0


def _chains(conn: np.ndarray) -> list[np.ndarray]:
    """Node chains (ordered) of a set of two-node cells forming open polylines."""
    chains = []
    nxt: dict[int, list[int]] = {}
    for a, b in conn:
        nxt.setdefault(int(a), []).append(int(b))
        nxt.setdefault(int(b), []).append(int(a))
    seen: set[int] = set()
    ends = [n for n, v in nxt.items() if len(v) == 1]
    for start in ends + list(nxt):
        if start in seen:
            continue
        chain, prev, cur = [start], None, start
        seen.add(start)
        while True:
            options = [n for n in nxt[cur] if n != prev and n not in seen]
            if not options:
                break
            prev, cur = cur, options[0]
            chain.append(cur)
            seen.add(cur)
        chains.append(np.array(chain))
    return chains


def _similarity(a0, b0, a1, b1):
    """(scale, rotation) taking segment a0-b0 onto a1-b1 (rotation about their normal)."""
    u, w = b0 - a0, b1 - a1
    scale = np.linalg.norm(w) / np.linalg.norm(u)
    u, w = u / np.linalg.norm(u), w / np.linalg.norm(w)
    axis = np.cross(u, w)
    sin, cos = np.linalg.norm(axis), float(u @ w)
    if sin < 1e-14:
        return scale, np.eye(3)
    k = axis / sin
    kx = np.array([[0, -k[2], k[1]], [k[2], 0, -k[0]], [-k[1], k[0], 0]])
    return scale, np.eye(3) + sin * kx + (1 - cos) * kx @ kx  # Rodrigues


def deformed(results: Results, st: Station, factor: float) -> np.ndarray:
    """Node positions drawn: exaggerated for members, true shape for ropes.

    Each rope keeps its loaded shape: it is mapped by the similarity that
    takes its true ends onto its drawn (exaggerated) ends.
    """
    pos = st.points + factor * st.displacement
    if factor == 1.0:
        return pos
    true = st.points + st.displacement
    rope_groups = [int(p["group_index"]) for p in results.parts if p.get("kind") not in MEMBER_KINDS]
    for gi in rope_groups:
        for chain in _chains(st.conn[st.group == gi]):
            a0, b0 = true[chain[0]], true[chain[-1]]
            a1, b1 = pos[chain[0]], pos[chain[-1]]
            if np.linalg.norm(b0 - a0) <= 0 or np.linalg.norm(b1 - a1) <= 0:
                continue
            scale, rot = _similarity(a0, b0, a1, b1)
            inner = chain[1:-1]
            pos[inner] = a1 + scale * (true[inner] - a0) @ rot.T
    return pos


def ply_sizes(results: Results, st: Station) -> dict[str, tuple[float, float]]:
    """(size along local y, size along local z) of each ply.

    Plies of one post touch across the stack, so the centre spacing of
    neighbouring plies along local y is the ply thickness; the part's two
    dimensions are taken in the order that agrees with it.
    """
    cells = part_cells(results, st)
    plies = [p for p in results.parts if p.get("kind") == "ply" and p["name"] in cells]
    base = {p["name"]: st.points[st.conn[cells[p["name"]][0], 0]] for p in plies}
    out = {}
    for p in plies:
        w = float(p.get("width") or 0.05)
        d = float(p.get("depth") or w)
        ly = np.asarray(p.get("local_y") or [0.0, 1.0, 0.0], float)
        ly = ly / max(np.linalg.norm(ly), 1e-12)
        gaps = [abs(float((base[q["name"]] - base[p["name"]]) @ ly)) for q in plies
                if q is not p and np.linalg.norm(base[q["name"]] - base[p["name"]]) < 4 * max(w, d)]
        gaps = [g for g in gaps if g > 1e-6]
        if gaps and abs(min(gaps) - d) < abs(min(gaps) - w):
            w, d = d, w
        out[p["name"]] = (w, d)
    return out


def member_prisms(results: Results, st: Station, pos: np.ndarray) -> Prisms:
    """Prisms of every post, ply, pier, embedded part, brace and tree."""
    out = []
    plies = ply_sizes(results, st)
    for part in results.parts:
        if part.get("kind") not in MEMBER_KINDS:
            continue
        idx = part_cells(results, st).get(part["name"])
        if idx is None:
            continue
        c = st.conn[idx]
        ly = np.tile(np.asarray(part.get("local_y") or [0.0, 1.0, 0.0], float), (idx.size, 1))
        _, ey, ez = cell_frames(pos, c, ly)
        if part.get("shape") == "round":
            d = float(part.get("diameter") or part.get("width") or 0.1)
            ring = _section_ring("round", d, d, ROUND_SIDES)
        else:
            w = float(part.get("width") or part.get("diameter") or 0.1)
            dd = float(part.get("depth") or w)
            if part["name"] in plies:
                w, dd = plies[part["name"]]
                w *= 1.0 - PLY_GAP
            ring = _section_ring("rectangle", w, dd, 4)
        out.append(prisms(pos[c[:, 0]], pos[c[:, 1]], ey, ez, ring, idx))
    return join(out)


def rope_prisms(results: Results, st: Station, pos: np.ndarray) -> Prisms:
    """Thin round prisms along cables and guys."""
    size = model_size(results, st)
    out = []
    for part in results.parts:
        if part.get("kind") in MEMBER_KINDS:
            continue
        idx = part_cells(results, st).get(part["name"])
        if idx is None:
            continue
        c = st.conn[idx]
        d = max(float(part.get("diameter") or 0.0), 2 * ROPE_MIN_RADIUS * size)
        _, ey, ez = cell_frames(pos, c, np.tile([0.0, 0.0, 1.0], (idx.size, 1)))
        out.append(prisms(pos[c[:, 0]], pos[c[:, 1]], ey, ez, _section_ring("round", d, d, 8), idx))
    return join(out)


def ground_strip(results: Results, st: Station) -> tuple[np.ndarray, np.ndarray] | None:
    """Ground surface along the first line: (points (2, n, 3) across x along, None)."""
    model = results.summary.get("model", {})
    prof = model.get("ground_profile")
    a, b = model.get("line_start_xyz"), model.get("line_end_xyz")
    if not prof or a is None or b is None:
        return None
    prof = np.asarray(prof, float)
    a, b = np.asarray(a, float), np.asarray(b, float)
    d = (b - a)[:2]
    span = float(np.linalg.norm(d))
    if span <= 0:
        return None
    d /= span
    across = np.array([-d[1], d[0]])
    half = max(2.0, 0.12 * span)
    ext = 0.06 * span
    s = np.r_[min(prof[0, 0], 0.0) - ext, prof[:, 0], max(prof[-1, 0], span) + ext]
    z = np.r_[prof[0, 1], prof[:, 1], prof[-1, 1]]
    xy = a[:2] + s[:, None] * d
    rows = [np.c_[xy + k * half * across, z] for k in (-1.0, 1.0)]
    return np.stack(rows), s


def rider_points(results: Results, pos: np.ndarray) -> list[tuple[np.ndarray, np.ndarray, str]]:
    """(trolley point, feet point, line name) of the rider on the ridden line."""
    lines = results.summary.get("model", {}).get("lines", {}) or {}
    hang = float(results.summary.get("model", {}).get("hang_distance") or 0.0)
    name = results.rider_line()
    rec = lines.get(name) or {}
    node = rec.get("rider_node")
    if node is None or not 0 <= int(node) < pos.shape[0]:
        return []
    p = pos[int(node)]
    return [(p, p - np.array([0.0, 0.0, hang]), name)]
