"""Planar node-to-ground springs: one law on the magnitude of a node's horizontal
displacement, the force along that displacement (direction-free in plan)."""
from __future__ import annotations

import numpy as np

from .errors import ModelError
from .group import ElementGroup, Evaluation
from .spring import SpringLaw

#: below this horizontal displacement (m) the spring acts with its initial slope in
#: every direction (the direction of a zero vector is undefined)
_AT_REST = 1e-14


class PlanarSpringGroup(ElementGroup):
    """Springs acting on (ux, uy) of each node as one vector.

    With a = |(ux, uy)| and n = (ux, uy) / a, the force is F(a) n and the
    tangent F'(a) n n^T + F(a)/a (I - n n^T) (exact derivative), so the
    response does not depend on the direction of motion in plan. ``law`` is
    any :class:`fem.spring.SpringLaw` (force and stiffness of a >= 0).
    """

    kind = "planar spring"
    #: the force it carries comes from the ground: it counts in the reactions
    to_ground = True

    def __init__(self, name: str, nodes: np.ndarray, law: SpringLaw) -> None:
        self.name = name
        self.conn = np.asarray(nodes, dtype=np.int64).reshape(-1, 1)
        for attr in ("force", "stiffness"):
            if not callable(getattr(law, attr, None)):
                raise ModelError(f"planar spring group '{name}': the law needs a {attr}(u) method")
        self.law = law

    def global_dofs(self) -> np.ndarray:
        return self.conn[:, 0, None] * 6 + np.arange(2)[None, :]

    def _parts(self, disp: np.ndarray):
        u = disp[self.conn[:, 0], :2]
        a = np.hypot(u[:, 0], u[:, 1])
        rest = a < _AT_REST
        n = np.where(rest[:, None], 0.0, u / np.where(rest, 1.0, a)[:, None])
        return u, a, rest, n

    def evaluate(self, x, rot, disp, tangent=True) -> Evaluation:
        u, a, rest, n = self._parts(disp)
        f_mag = np.asarray(self.law.force(a), float)
        f = f_mag[:, None] * n
        results = lambda: {"displacement": u, "force": f, "magnitude": a,  # noqa: E731
                           "force_magnitude": f_mag}
        if not tangent:
            return Evaluation(f, None, results)
        k_t = np.asarray(self.law.stiffness(a), float)
        secant = np.where(rest, k_t, f_mag / np.where(rest, 1.0, a))
        nn = n[:, :, None] * n[:, None, :]
        k = k_t[:, None, None] * nn + secant[:, None, None] * (np.eye(2)[None] - nn)
        return Evaluation(f, k, results)

    def results(self, x, rot, disp) -> dict[str, np.ndarray]:
        return self.evaluate(x, rot, disp, tangent=False).results()

    def label(self, i: int) -> str:
        return f"planar spring '{self.name}'[{i}] at node {int(self.conn[i, 0])} (ux, uy)"
