"""Results of a laminated post: ply forces and stresses, fastener slip and force,
and the effective bending stiffness found from the model itself."""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from spanstay.fem import Model, SolverOptions, solve
from spanstay.models.parts.laminated import LaminatedDesign, LaminatedPost, PlyMesh, add_laminated_post


@dataclass
class LaminatedResults:
    """Per-ply section forces and stresses, per-joint fastener results (SI).

    Ply arrays are (n_ply, n_elements, 2): both ends of every ply element,
    ``heights`` their distance from the base. N is positive in tension;
    "flat" is bending across the joints (about the ply's weak axis), "edge"
    along them (strong axis). ``sigma_max``/``sigma_min`` are the extreme-fibre
    stresses N/A +- |M_edge|/S_edge +- |M_flat|/S_flat.
    Fastener arrays are (n_joint, n_levels) at ``fastener_heights``; slip and
    row force are in the joint plane (along the post, across the width);
    ``force_per_fastener`` is the in-plane magnitude divided by the fasteners
    at that level.
    """

    heights: np.ndarray
    N: np.ndarray
    V_flat: np.ndarray
    V_edge: np.ndarray
    M_flat: np.ndarray
    M_edge: np.ndarray
    sigma_max: np.ndarray
    sigma_min: np.ndarray
    fastener_heights: np.ndarray
    fasteners: np.ndarray
    slip_along: np.ndarray
    slip_across: np.ndarray
    row_force_along: np.ndarray
    row_force_across: np.ndarray
    force_per_fastener: np.ndarray

    def summary(self) -> dict:
        """Worst values for reports (SI)."""
        return {
            "max_ply_tension_stress": float(self.sigma_max.max()),
            "max_ply_compression_stress": float(-self.sigma_min.min()),
            "max_slip": float(np.hypot(self.slip_along, self.slip_across).max(initial=0.0)),
            "max_force_per_fastener": float(self.force_per_fastener.max(initial=0.0)),
        }


def laminated_results(post: LaminatedPost | PlyMesh, state) -> LaminatedResults:
    """Extract ply and fastener results of a solved state."""
    mesh = post.mesh if isinstance(post, LaminatedPost) else post
    d = mesh.design
    lev = mesh.levels
    ends = np.stack([lev[:-1], lev[1:]], axis=1)
    forces = np.array([state.group(g).end_forces for g in mesh.beam_groups])  # (np, ne, 2, 6)
    N, Vy, Vz, My, Mz = (forces[..., k] for k in (0, 1, 2, 4, 5))
    t = d.thicknesses[:, None, None]
    w = np.array([p.width for p in d.plies])[:, None, None]
    A = t * w
    s_flat, s_edge = w * t**2 / 6, t * w**2 / 6
    bend = np.abs(My) / s_edge + np.abs(Mz) / s_flat
    links = state.group(mesh.link_group)
    n_lev = len(lev)
    has = mesh.fasteners > 0
    slip = links.slip.reshape(d.n - 1, n_lev, 3)[:, has]
    force = links.force.reshape(d.n - 1, n_lev, 3)[:, has]
    count = mesh.fasteners[has]
    per = np.hypot(force[..., 1], force[..., 2]) / count[None, :]
    return LaminatedResults(np.broadcast_to(ends, N.shape).copy(), N, Vy, Vz, Mz, My,
                            N / A + bend, N / A - bend, lev[has], count,
                            slip[..., 2], slip[..., 1], force[..., 2], force[..., 1], per)


@dataclass(frozen=True)
class EffectiveStiffness:
    """Bending stiffness of a laminated cantilever from the model (N m^2).

    ``EI_stack`` bends across the joints (fasteners slip), ``EI_side`` along
    them (plies side by side). ``EI_none``/``EI_full`` are the stack-direction
    bounds: no connection and a glued section; ``composite_factor`` places
    ``EI_stack`` between them (0 none, 1 full).
    """

    EI_stack: float
    EI_side: float
    EI_none: float
    EI_full: float
    length: float
    slip: str

    @property
    def composite_factor(self) -> float:
        span = self.EI_full - self.EI_none
        return (self.EI_stack - self.EI_none) / span if span > 0 else 1.0


def _tip_deflection(design: LaminatedDesign, length: float, slip: str, direction: str) -> float:
    m = Model(gravity=(0.0, 0.0, 0.0))
    post = add_laminated_post(m, (0.0, 0.0, 0.0), design, length, pull=(1.0, 0.0, 0.0),
                              slip=slip, shear=False, weight=False, name="probe")
    m.fix(post.base_node, "all")
    mesh = post.mesh
    vec = mesh.stack if direction == "stack" else mesh.across
    EI_guess = design.EI_stack(True) if direction == "stack" else design.EI_side()
    # tip deflection ~ L/300: geometric nonlinearity changes EI by ~1e-5, and the load
    # stays well above the round-off of stiff links
    P = 3.0 * EI_guess * (length / 300.0) / length**3
    if direction == "stack":
        share = np.full(design.n, 1.0 / design.n)
    else:
        ei = np.array([p.E * p.size.I_strong for p in design.plies])
        share = ei / ei.sum()
    for i in range(design.n):
        m.add_load(int(mesh.ply_nodes[i, -1]), np.r_[P * share[i] * vec, 0, 0, 0])
    st = solve(m, options=SolverOptions(force_tol=1e-7))
    tip = st.u[mesh.ply_nodes[:, -1], :3] @ vec
    return P * length**3 / (3.0 * float(np.mean(tip)))


def effective_stiffness(design: LaminatedDesign, length: float,
                        slip: str = "service") -> EffectiveStiffness:
    """Effective EI about both axes of a cantilever of ``length`` with a tip load.

    Solves the laminated model (shear-rigid plies, base tied and fixed) for a
    small tip load in each direction and returns P L^3 / (3 tip deflection).
    """
    return EffectiveStiffness(_tip_deflection(design, length, slip, "stack"),
                              _tip_deflection(design, length, slip, "side"),
                              design.EI_stack(False), design.EI_stack(True), float(length), slip)
