"""Corotational shear-deformable (Timoshenko) 3D beam.

The element's rigid motion is followed by a frame attached to the chord and
to the mean of the nodal triads; in that frame the beam is a linear
Timoshenko element (Przemieniecki's stiffness). The internal force vector is
exact for this kinematics (Battini-Pacoste style transformation); the tangent
is its closed-form derivative (:mod:`fem.beam_tangent`), evaluated for all
elements at once, with the difference tangent kept as a test oracle.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .checks import as_array, positive
from .errors import ModelError
from .group import FORWARD_STEP, ElementGroup, Evaluation, all_dofs, central_difference_tangent
from .beam_tangent import corotational_tangent
from .rotation import cross3, logmap_moderate, tangent_inverse


@dataclass
class BeamSection:
    """Section and material of a beam (scalars or one value per element).

    Parameters
    ----------
    E, G
        Young's and shear moduli (Pa).
    A
        Area (m^2).
    Iy, Iz
        Second moments about local y and z (m^4).
    J
        Torsion constant (m^4).
    Asy, Asz
        Shear areas for shear along local y and z (m^2); ``None`` means
        shear-rigid (Euler-Bernoulli).
    weight
        Self-weight per unit length (N/m), lumped at the nodes.
    """

    E: float | np.ndarray
    G: float | np.ndarray
    A: float | np.ndarray
    Iy: float | np.ndarray
    Iz: float | np.ndarray
    J: float | np.ndarray
    Asy: float | np.ndarray | None = None
    Asz: float | np.ndarray | None = None
    weight: float | np.ndarray = 0.0

    @staticmethod
    def rectangle(E: float, G: float, width_y: float, depth_z: float, weight: float = 0.0) -> "BeamSection":
        """Solid rectangle, ``width_y`` along local y and ``depth_z`` along local z."""
        b, h = width_y, depth_z
        a, c = max(b, h), min(b, h)
        j = a * c**3 * (1.0 / 3.0 - 0.21 * c / a * (1.0 - c**4 / (12.0 * a**4)))  # Roark Table 10.7
        area = b * h
        return BeamSection(E, G, area, b * h**3 / 12.0, h * b**3 / 12.0, j,
                           5.0 / 6.0 * area, 5.0 / 6.0 * area, weight)

    @staticmethod
    def circle(E: float, G: float, diameter: float, weight: float = 0.0) -> "BeamSection":
        """Solid circle of the given diameter (shear area 0.9 A)."""
        r = 0.5 * diameter
        area = np.pi * r**2
        i = np.pi * r**4 / 4.0
        return BeamSection(E, G, area, i, i, 2.0 * i, 0.9 * area, 0.9 * area, weight)


def local_stiffness(L, E, G, A, Iy, Iz, J, Asy, Asz) -> np.ndarray:
    """(ne, 12, 12) linear Timoshenko stiffness in local axes.

    DOF order per node: u, v, w, rx, ry, rz.
    """
    ne = L.shape[0]
    k = np.zeros((ne, 12, 12))
    ea, gj = E * A / L, G * J / L
    for i, j, s in ((0, 0, 1), (6, 6, 1), (0, 6, -1), (6, 0, -1)):
        k[:, i, j] = s * ea
    for i, j, s in ((3, 3, 1), (9, 9, 1), (3, 9, -1), (9, 3, -1)):
        k[:, i, j] = s * gj
    for inertia, shear_area, dofs, sign in ((Iz, Asy, (1, 5, 7, 11), 1.0),
                                            (Iy, Asz, (2, 4, 8, 10), -1.0)):
        ei = E * inertia
        phi = np.zeros_like(L) if shear_area is None else 12.0 * ei / (G * shear_area * L**2)
        a = 12.0 * ei / (L**3 * (1 + phi))
        b = sign * 6.0 * ei / (L**2 * (1 + phi))
        c = (4.0 + phi) * ei / (L * (1 + phi))
        d = (2.0 - phi) * ei / (L * (1 + phi))
        block = np.array([[a, b, -a, b], [b, c, -b, d], [-a, -b, a, -b], [b, d, -b, c]])
        block = np.moveaxis(block, -1, 0)
        idx = np.array(dofs)
        k[:, idx[:, None], idx[None, :]] = block
    return k


class BeamGroup(ElementGroup):
    """A group of corotational Timoshenko beams."""

    kind = "beam"
    merge_fields = ("conn", "frame0", "L0", "k_local", "chord0", "weight")

    def __init__(self, name: str, conn: np.ndarray, coords: np.ndarray,
                 section: BeamSection, orientation) -> None:
        self.name = name
        self.conn = conn
        ne = conn.shape[0]
        what = f"beam group '{name}'"
        vals = {}
        for key in ("E", "G", "A", "Iy", "Iz", "J"):
            vals[key] = as_array(key, getattr(section, key), (ne,), what, per_element=True)
            positive(key, vals[key], what)
        for key in ("Asy", "Asz"):
            v = getattr(section, key)
            if v is None:
                vals[key] = None
            else:
                vals[key] = as_array(key, v, (ne,), what, per_element=True)
                positive(key, vals[key], what)
        self.weight = as_array("weight", section.weight, (ne,), what, per_element=True)
        positive("weight", self.weight, what, allow_zero=True)
        self.section = vals
        x1, x2 = coords[conn[:, 0]], coords[conn[:, 1]]
        chord = x2 - x1
        self.L0 = np.linalg.norm(chord, axis=1)
        short = self.L0 <= 1e-9 * max(1.0, float(np.max(np.abs(coords))))
        if np.any(short):
            i = int(np.argmax(short))
            raise ModelError(f"{what} element {i}: zero length (nodes {conn[i, 0]} and {conn[i, 1]} coincide)")
        self.chord0 = chord
        e1 = chord / self.L0[:, None]
        ov = as_array("orientation", orientation, (ne, 3), what, per_element=True)
        zero = np.linalg.norm(ov, axis=1) == 0.0
        if np.any(zero):
            i = int(np.argmax(zero))
            raise ModelError(f"{what} element {i}: orientation vector is zero; give a vector across "
                             f"the beam for local y")
        e3 = cross3(e1, ov)
        n3 = np.linalg.norm(e3, axis=1)
        bad = n3 <= 1e-6 * np.linalg.norm(ov, axis=1)
        if np.any(bad):
            i = int(np.argmax(bad))
            raise ModelError(f"{what} element {i}: orientation vector {ov[i].tolist()} is parallel "
                             f"to the beam axis; give a vector across the beam for local y")
        e3 /= n3[:, None]
        e2 = cross3(e3, e1)
        self.frame0 = np.stack([e1, e2, e3], axis=2)  # columns are local axes
        self.k_local = local_stiffness(self.L0, **vals)

    def global_dofs(self) -> np.ndarray:
        return all_dofs(self.conn)

    # -- kinematics ---------------------------------------------------
    @staticmethod
    def _core(u1, u2, r1, r2, frame0, L0, k_local, chord0, keep: dict | None = None):
        """Forces (n, 12) and local section quantities for a batch of elements.

        ``u1``, ``u2`` are the end displacements; the chord is the initial
        chord plus their difference and the elongation is formed without
        subtracting two nearly equal lengths, so stiff members keep a residual
        near round-off of the load rather than of the coordinates. When
        ``keep`` is a dict, the intermediate kinematic quantities the
        closed-form tangent needs are stored in it.
        """
        du = u2 - u1
        d = chord0 + du
        ln = np.linalg.norm(d, axis=1)
        elong = (2.0 * np.einsum("ni,ni->n", chord0, du) + np.einsum("ni,ni->n", du, du)) / (ln + L0)
        e1 = d / ln[:, None]
        t12 = np.stack([r1, r2]) @ frame0            # both end triads, (2, n, 3, 3)
        q1, q2 = t12[0, :, :, 1], t12[1, :, :, 1]
        q = 0.5 * (q1 + q2)
        e3 = cross3(e1, q)
        e3 /= np.sqrt(np.einsum("ni,ni->n", e3, e3))[:, None]
        e2 = cross3(e3, e1)
        rr = np.stack([e1, e2, e3], axis=2)
        rrt = np.transpose(rr, (0, 2, 1))
        th = logmap_moderate(rrt @ t12)              # (2, n, 3) local end rotations
        th1, th2 = th[0], th[1]
        dl = np.zeros((u1.shape[0], 12))
        dl[:, 3:6], dl[:, 6], dl[:, 9:12] = th1, elong, th2
        reps = u1.shape[0] // k_local.shape[0]  # a batch of stacked copies shares k_local
        if reps == 1:
            fl = (k_local @ dl[:, :, None])[:, :, 0]
        else:
            fl = np.einsum("nij,rnj->rni", k_local, dl.reshape(reps, -1, 12)).reshape(-1, 12)
        n_ax = fl[:, 6]
        m12 = np.stack([fl[:, 3:6], fl[:, 9:12]])    # (2, n, 3) end moments
        # spin of the rigid frame, local components, as rows over the 12 DOFs
        ql1 = np.einsum("ni,ni->n", q, e1)
        ql2 = np.einsum("ni,ni->n", q, e2)
        wr = np.zeros((u1.shape[0], 3, 12))
        e2l, e3l = e2 / ln[:, None], e3 / ln[:, None]
        wr[:, 2, 0:3], wr[:, 2, 6:9] = -e2l, e2l
        wr[:, 1, 0:3], wr[:, 1, 6:9] = e3l, -e3l
        wr[:, 0, :] = (ql1 / ql2)[:, None] * wr[:, 1, :]
        c12 = cross3(t12[:, :, :, 1], e3[None]) / (2.0 * ql2[None, :, None])
        wr[:, 0, 3:6] += c12[0]
        wr[:, 0, 9:12] += c12[1]
        f = np.zeros((u1.shape[0], 12))
        f[:, 0:3], f[:, 6:9] = -n_ax[:, None] * e1, n_ax[:, None] * e1
        # f += B_i^T m_i with B_i = T^-1(th_i) (V_i - W_r): first y_i = T^-T m_i
        inv_t = tangent_inverse(th)                  # (2, n, 3, 3)
        y12 = (np.swapaxes(inv_t, -1, -2) @ m12[..., None])[..., 0]
        y1, y2 = y12[0], y12[1]
        m1, m2 = m12[0], m12[1]
        f -= ((y1 + y2)[:, None, :] @ wr)[:, 0]
        ry = (rr[None] @ y12[..., None])[..., 0]
        f[:, 3:6] += ry[0]
        f[:, 9:12] += ry[1]
        inv_t1, inv_t2 = inv_t[0], inv_t[1]
        if keep is not None:
            keep.update(e1=e1, e2=e2, e3=e3, rr=rr, ln=ln, q=q, q1=q1, q2=q2, ql1=ql1, ql2=ql2,
                        wr=wr, th1=th1, th2=th2, m1=m1, m2=m2, n_ax=n_ax, y1=y1, y2=y2,
                        inv_t1=inv_t1, inv_t2=inv_t2)
        return f, fl, dl

    def _state(self, disp, rot):
        c = self.conn
        return disp[c[:, 0], :3], disp[c[:, 1], :3], rot[c[:, 0]], rot[c[:, 1]]

    def evaluate(self, x, rot, disp, tangent: bool | str = True) -> Evaluation:
        """Forces, and with ``tangent`` the closed-form consistent tangent
        (``tangent="difference"``: the one-sided difference tangent, a test oracle)."""
        u1, u2, r1, r2 = self._state(disp, rot)
        kin: dict | None = {} if tangent is True else None
        f, fl, _ = self._core(u1, u2, r1, r2, self.frame0, self.L0, self.k_local, self.chord0, kin)
        results = lambda: _end_forces(fl)  # noqa: E731
        if not tangent:
            return Evaluation(f, None, results)
        if kin is not None:
            return Evaluation(f, corotational_tangent(kin, self.k_local, kin["inv_t1"], kin["inv_t2"]),
                              results)

        def force_fn(a1, a2, b1, b2, reps):
            return self._core(a1, a2, b1, b2, np.tile(self.frame0, (reps, 1, 1)), np.tile(self.L0, reps),
                              self.k_local, np.tile(self.chord0, (reps, 1)))[0]

        k = central_difference_tangent(force_fn, u1, u2, r1, r2, steps_t=FORWARD_STEP * self.L0,
                                       steps_r=np.full(self.size, FORWARD_STEP),
                                       translation_invariant=True, base=f)
        return Evaluation(f, k, results)

    def external(self, gravity: np.ndarray) -> np.ndarray | None:
        if not np.any(self.weight):
            return None
        ext = np.zeros((self.size, 12))
        half = 0.5 * self.weight * self.L0
        ext[:, 0:3] = half[:, None] * gravity[None, :]
        ext[:, 6:9] = half[:, None] * gravity[None, :]
        return ext

    def results(self, x, rot, disp) -> dict[str, np.ndarray]:
        u1, u2, r1, r2 = self._state(disp, rot)
        _, fl, _ = self._core(u1, u2, r1, r2, self.frame0, self.L0, self.k_local, self.chord0)
        return _end_forces(fl)


def _end_forces(fl: np.ndarray) -> dict[str, np.ndarray]:
    """Section forces, N positive in tension: end 1 = -f_local[0:6], end 2 = +f_local[6:12]."""
    return {"end_forces": np.stack([-fl[:, 0:6], fl[:, 6:12]], axis=1)}
