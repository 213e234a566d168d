"""Node-to-ground springs, one DOF each, linear or nonlinear, optionally one-sided."""
from __future__ import annotations

from typing import Protocol

import numpy as np

from .checks import as_array
from .errors import ModelError
from .group import DOF_NAMES, ElementGroup, Evaluation
from .rotation import logmap


class SpringLaw(Protocol):
    """Force-displacement law evaluated for every spring of a group at once."""

    def force(self, u: np.ndarray) -> np.ndarray:
        """Spring force (resisting, same sign as ``u``) for displacements ``u``."""

    def stiffness(self, u: np.ndarray) -> np.ndarray:
        """d force / d u at ``u``."""


class LinearLaw:
    """Linear spring: force = k u (k scalar or one value per spring)."""

    def __init__(self, k) -> None:
        self.k = np.asarray(k, dtype=float)
        bad = ~np.isfinite(self.k) | (self.k < 0)
        if np.any(bad):
            i = int(np.argmax(bad.ravel()))
            where = f" (spring {i})" if self.k.ndim else ""
            raise ModelError(f"linear spring stiffness must be finite and non-negative, "
                             f"got {self.k.ravel()[i]}{where}")

    def force(self, u: np.ndarray) -> np.ndarray:
        return self.k * u

    def stiffness(self, u: np.ndarray) -> np.ndarray:
        return np.broadcast_to(self.k, u.shape).astype(float)


class SpringGroup(ElementGroup):
    """Springs from nodes to the ground, each acting on one DOF.

    ``one_sided`` = +1 resists only positive displacement, -1 only negative,
    0 both. For rotational DOFs the displacement is the component of the
    node's rotation vector.
    """

    kind = "spring"
    #: the force it carries comes from the ground: it counts in the reactions
    to_ground = True

    def __init__(self, name: str, nodes: np.ndarray, dof, law: SpringLaw, one_sided=0) -> None:
        self.name = name
        self.conn = nodes.reshape(-1, 1)
        ns = self.conn.shape[0]
        dof_arr = np.broadcast_to(np.asarray(dof), (ns,)).astype(np.int64)
        if np.any((dof_arr < 0) | (dof_arr > 5)):
            raise ModelError(f"spring group '{name}': DOF must be 0..5 (ux..rz), got {dof}")
        self.dof = dof_arr.copy()
        self.law = law
        self.side = as_array("one_sided", one_sided, (ns,), f"spring group '{name}'", per_element=True)
        if np.any(~np.isin(self.side, (-1.0, 0.0, 1.0))):
            raise ModelError(f"spring group '{name}': one_sided must be -1, 0 or +1")
        for attr in ("force", "stiffness"):
            if not callable(getattr(law, attr, None)):
                raise ModelError(f"spring group '{name}': the law needs a {attr}(u) method")

    def global_dofs(self) -> np.ndarray:
        return (self.conn[:, 0] * 6 + self.dof)[:, None]

    def displacement(self, rot: np.ndarray, disp: np.ndarray) -> np.ndarray:
        """Displacement of each spring's DOF (rotation-vector component for rotations)."""
        n = self.conn[:, 0]
        u = disp[n, np.minimum(self.dof, 5)].copy()
        rotational = self.dof >= 3
        if np.any(rotational):
            u[rotational] = logmap(rot[n[rotational]])[np.arange(rotational.sum()), self.dof[rotational] - 3]
        return u

    def _active(self, u):
        return (self.side == 0) | (self.side * u > 0)

    def _bearing(self, u):
        """Where the tangent is taken from the resisting branch: active springs and
        closed gaps (u = 0). The force is zero at u = 0 either way; taking the stiff
        branch there lets a structure resting on one-sided springs start from rest."""
        return (self.side == 0) | (self.side * u >= 0)

    def evaluate(self, x, rot, disp, tangent=True) -> Evaluation:
        u = self.displacement(rot, disp)
        active = self._active(u)
        f = np.where(active, self.law.force(u), 0.0)
        results = lambda: {"displacement": u, "force": f}  # noqa: E731
        if not tangent:
            return Evaluation(f[:, None], None, results)
        k = np.where(self._bearing(u), self.law.stiffness(u), 0.0)
        return Evaluation(f[:, None], k[:, None, None], results)

    def results(self, x, rot, disp) -> dict[str, np.ndarray]:
        u = self.displacement(rot, disp)
        return {"displacement": u, "force": np.where(self._active(u), self.law.force(u), 0.0)}

    def label(self, i: int) -> str:
        return f"spring '{self.name}'[{i}] at node {int(self.conn[i, 0])} {DOF_NAMES[self.dof[i]]}"


def check_law(group: SpringGroup, law: SpringLaw) -> None:
    """Evaluate a law once at zero to catch shape and value errors early."""
    size = group.size
    for what in ("force", "stiffness"):
        try:
            val = np.asarray(getattr(law, what)(np.zeros(size)), dtype=float)
        except Exception as exc:  # a user-supplied law: report any failure as bad input
            raise ModelError(f"spring group '{group.name}': law.{what}(0) failed: {exc}") from None
        if val.shape not in ((size,), ()):
            raise ModelError(f"spring group '{group.name}': law.{what} returned shape {val.shape}, "
                             f"expected ({size},)")
        val = np.broadcast_to(val, (size,))
        bad = ~np.isfinite(val) | ((val < 0) if what == "stiffness" else False)
        if np.any(bad):
            i = int(np.argmax(bad))
            need = "finite and non-negative" if what == "stiffness" else "finite"
            raise ModelError(f"{group.label(i)}: {what} at zero displacement must be {need}, got {val[i]}")
