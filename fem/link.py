"""Two-node connector with rigid offsets and a stiffness per local direction.

Each end has a rigid arm (offset) from its node to a connection point; linear
springs along the link's local axes join the two points (translations) and
the two nodes' rotations. Local axes follow node 1's rotation. Used for
fasteners between plies or a guy attached to the face of a post.
"""
from __future__ import annotations

import numpy as np

from .checks import as_array, positive
from .errors import ModelError
from .group import FORWARD_STEP, ElementGroup, Evaluation, all_dofs, central_difference_tangent
from .rotation import cross3, skew, tangent_inverse
from .rotation import logmap_moderate as logmap  # exact; cheaper while angles stay below 3 rad


class LinkGroup(ElementGroup):
    """A group of two-node links.

    Parameters
    ----------
    stiffness
        (ne, 6) or (6,): kx, ky, kz (N/m) and krx, kry, krz (N m/rad) in local axes.
    offset1, offset2
        (ne, 3) rigid arms from node 1 / node 2 to their connection points (m).
    axes
        (ne, 3, 3) or (3, 3): rows are the local x, y, z directions (global).
    """

    kind = "link"
    merge_fields = ("conn", "k", "o1", "o2", "axes", "gap0", "chord0", "length_scale")

    def __init__(self, name: str, conn: np.ndarray, coords: np.ndarray, stiffness,
                 offset1=0.0, offset2=0.0, axes=np.eye(3)) -> None:
        self.name = name
        self.conn = conn
        ne = conn.shape[0]
        what = f"link group '{name}'"
        self.k = as_array("stiffness", stiffness, (ne, 6), what, per_element=True)
        positive("stiffness", self.k.min(axis=1), what, allow_zero=True)
        self.o1 = as_array("offset1", offset1, (ne, 3), what, per_element=True)
        self.o2 = as_array("offset2", offset2, (ne, 3), what, per_element=True)
        a = as_array("axes", axes, (ne, 3, 3), what, per_element=True)
        norms = np.linalg.norm(a, axis=2)
        if np.any(norms < 1e-12):
            raise ModelError(f"{what}: an axis vector has zero length")
        a = a / norms[:, :, None]
        ortho = np.abs(a @ np.transpose(a, (0, 2, 1)) - np.eye(3)).max(axis=(1, 2))
        if np.any(ortho > 1e-6):
            i = int(np.argmax(ortho))
            raise ModelError(f"{what} element {i}: local axes must be mutually perpendicular")
        self.axes = a
        self.chord0 = coords[conn[:, 1]] - coords[conn[:, 0]]
        self.gap0 = self.chord0 + self.o2 - self.o1
        if np.any(conn[:, 0] == conn[:, 1]):
            i = int(np.argmax(conn[:, 0] == conn[:, 1]))
            raise ModelError(f"{what} element {i}: both ends on node {conn[i, 0]}")
        scale = max(1e-3, float(np.max(np.linalg.norm(coords, axis=1), initial=1.0)) * 1e-3)
        self.length_scale = np.full(ne, scale)  # per element, for the difference steps

    def global_dofs(self) -> np.ndarray:
        return all_dofs(self.conn)

    def stiffened(self) -> np.ndarray:
        m = np.zeros((self.size, 12), dtype=bool)
        trans = np.any(self.k[:, :3] > 0, axis=1)
        rot = np.any(self.k[:, 3:] > 0, axis=1)
        m[:, 0:3] = trans[:, None]
        m[:, 6:9] = trans[:, None]
        arm1 = (np.linalg.norm(self.o1, axis=1) > 0) | (np.linalg.norm(self.gap0, axis=1) > 0)
        arm2 = np.linalg.norm(self.o2, axis=1) > 0
        m[:, 3:6] = (rot | (arm1 & trans))[:, None]
        m[:, 9:12] = (rot | (arm2 & trans))[:, None]
        return m

    def _forces(self, u1, u2, r1, r2, axes, o1, o2, gap0, k, chord0):
        """Forces for end displacements u1, u2 (the chord is formed from the initial
        chord plus u2 - u1, so coincident nodes far from the origin keep their digits)."""
        a1 = np.einsum("nij,nj->ni", r1, o1)
        a2 = np.einsum("nij,nj->ni", r2, o2)
        gap = chord0 + (u2 - u1) + a2 - a1
        r1t = np.transpose(r1, (0, 2, 1))
        slip = np.einsum("nij,nj->ni", axes, np.einsum("nij,nj->ni", r1t, gap) - gap0)
        phi = np.einsum("nij,nj->ni", axes, logmap(r1t @ r2))
        f_loc = k[:, :3] * slip
        m_loc = k[:, 3:] * phi
        to_global = r1 @ np.transpose(axes, (0, 2, 1))
        f = np.einsum("nij,nj->ni", to_global, f_loc)
        m = np.einsum("nij,nj->ni", to_global, m_loc)
        out = np.empty((u1.shape[0], 12))
        out[:, 0:3] = -f
        out[:, 3:6] = -m - cross3(a1, f) - cross3(gap, f)
        out[:, 6:9] = f
        out[:, 9:12] = m + cross3(a2, f)
        return out, slip, phi, f_loc, m_loc

    def _tangent(self, u1, u2, r1, r2, f_out):
        """(ne, 12, 12) closed-form tangent of :meth:`_forces` (product rule on its
        formulas; left spins dR = S(dw) R, d(R^T) g = R^T S(g) dw, d log(R1^T R2) =
        T_s^-1(phi) R1^T (dw2 - dw1) as in Battini & Pacoste 2002)."""
        axes, o1, o2, k = self.axes, self.o1, self.o2, self.k
        n = u1.shape[0]
        a1 = np.einsum("nij,nj->ni", r1, o1)
        a2 = np.einsum("nij,nj->ni", r2, o2)
        gap = self.chord0 + (u2 - u1) + a2 - a1
        r1t = np.transpose(r1, (0, 2, 1))
        psi = logmap(r1t @ r2)
        f, m = f_out[:, 6:9], f_out[:, 9:12] - cross3(a2, f_out[:, 6:9])
        zero = np.zeros((n, 3, 3))
        eye = np.broadcast_to(np.eye(3), (n, 3, 3))
        d_a1 = np.concatenate([zero, -skew(a1), zero, zero], axis=2)
        d_a2 = np.concatenate([zero, zero, zero, -skew(a2)], axis=2)
        d_gap = np.concatenate([-eye, zero, eye, zero], axis=2) + d_a2 - d_a1
        d_w1 = np.concatenate([zero, eye, zero, zero], axis=2)
        to_global = r1 @ np.transpose(axes, (0, 2, 1))
        to_local = np.transpose(to_global, (0, 2, 1))
        d_slip = to_local @ (d_gap + skew(gap) @ d_w1)
        d_phi = axes @ tangent_inverse(psi) @ r1t @ np.concatenate([zero, -eye, zero, eye], axis=2)
        d_f = -skew(f) @ d_w1 + to_global @ (k[:, :3, None] * d_slip)
        d_m = -skew(m) @ d_w1 + to_global @ (k[:, 3:, None] * d_phi)
        kt = np.empty((n, 12, 12))
        kt[:, 0:3] = -d_f
        kt[:, 3:6] = (-d_m + skew(f) @ d_a1 - skew(a1) @ d_f + skew(f) @ d_gap - skew(gap) @ d_f)
        kt[:, 6:9] = d_f
        kt[:, 9:12] = d_m - skew(f) @ d_a2 + skew(a2) @ d_f
        return kt

    def _state(self, disp, rot):
        c = self.conn
        return disp[c[:, 0], :3], disp[c[:, 1], :3], rot[c[:, 0]], rot[c[:, 1]]

    def _consts(self, reps=1):
        if reps == 1:
            return self.axes, self.o1, self.o2, self.gap0, self.k, self.chord0
        return (np.tile(self.axes, (reps, 1, 1)), np.tile(self.o1, (reps, 1)),
                np.tile(self.o2, (reps, 1)), np.tile(self.gap0, (reps, 1)), np.tile(self.k, (reps, 1)),
                np.tile(self.chord0, (reps, 1)))

    def evaluate(self, x, rot, disp, tangent: bool | str = True) -> Evaluation:
        """Forces, and with ``tangent`` the closed-form tangent (``"difference"``: the
        one-sided difference tangent, kept as a test oracle)."""
        u1, u2, r1, r2 = self._state(disp, rot)
        f, slip, phi, f_loc, m_loc = self._forces(u1, u2, r1, r2, *self._consts())
        results = lambda: {"slip": slip, "rotation": phi, "force": f_loc, "moment": m_loc}  # noqa: E731
        if not tangent:
            return Evaluation(f, None, results)
        if tangent is True:
            return Evaluation(f, self._tangent(u1, u2, r1, r2, f), results)

        def force_fn(a, b, c, d, reps):
            return self._forces(a, b, c, d, *self._consts(reps))[0]

        k = central_difference_tangent(force_fn, u1, u2, r1, r2,
                                       steps_t=FORWARD_STEP * self.length_scale,
                                       steps_r=np.full(self.size, FORWARD_STEP),
                                       translation_invariant=True, base=f)
        return Evaluation(f, k, results)

    def results(self, x, rot, disp) -> dict[str, np.ndarray]:
        u1, u2, r1, r2 = self._state(disp, rot)
        _, slip, phi, f_loc, m_loc = self._forces(u1, u2, r1, r2, *self._consts())
        return {"slip": slip, "rotation": phi, "force": f_loc, "moment": m_loc}
