"""Solution state: displacements, rotations, applied loads and results."""
from __future__ import annotations

from dataclasses import dataclass, field
from types import SimpleNamespace
from typing import Callable

import numpy as np

from .rotation import logmap


@dataclass
class State:
    """Equilibrium state of a model.

    Attributes
    ----------
    translation
        (n, 3) nodal displacements (m).
    rotation
        (n, 3, 3) nodal rotation matrices.
    applied
        Full-length external load vector in equilibrium (N, N m).
    prescribed
        Full-length prescribed displacement values in force.
    iterations
        Newton iterations of each accepted increment of the last solve.
    history
        Relative residual norms of every iteration of the last solve.
    newton_iterations
        Newton corrections made by the last solve, those of failed increments included.
    failed_iterations
        Of those, the ones made in increments that failed and were cut.
    factorisations
        Tangent factorisations made by the last solve.
    residual_evaluations
        Internal-force evaluations of the last solve (line-search trials included).
    """

    translation: np.ndarray
    rotation: np.ndarray
    applied: np.ndarray
    prescribed: np.ndarray
    iterations: list[int] = field(default_factory=list)
    history: list[list[float]] = field(default_factory=list)
    newton_iterations: int = 0
    failed_iterations: int = 0
    factorisations: int = 0
    residual_evaluations: int = 0
    _results: dict = field(default_factory=dict, repr=False)
    _pending_groups: Callable[[], dict] | None = field(default=None, repr=False)

    @staticmethod
    def initial(n_nodes: int) -> "State":
        """The undeformed, unloaded state."""
        return State(np.zeros((n_nodes, 3)), np.tile(np.eye(3), (n_nodes, 1, 1)),
                     np.zeros(6 * n_nodes), np.zeros(6 * n_nodes))

    def __getstate__(self) -> dict:
        """Pickles (states sent back from worker processes) carry the element results
        computed, not the closure that would compute them."""
        if self._pending_groups is not None:
            self._results["groups"] = self._pending_groups()
            self._pending_groups = None
        return dict(self.__dict__)

    def copy(self) -> "State":
        return State(self.translation.copy(), self.rotation.copy(), self.applied.copy(),
                     self.prescribed.copy(), list(self.iterations), [list(h) for h in self.history],
                     self.newton_iterations, self.failed_iterations, self.factorisations,
                     self.residual_evaluations)

    @property
    def u(self) -> np.ndarray:
        """(n, 6) displacements and rotation vectors."""
        return np.concatenate([self.translation, logmap(self.rotation)], axis=1)

    @property
    def reactions(self) -> np.ndarray:
        """(n, 6) forces and moments from the ground: supports plus springs."""
        return self._results["reactions"]

    @property
    def residual(self) -> np.ndarray:
        """(n, 6) unbalanced force at free DOFs (small at equilibrium)."""
        return self._results["residual"]

    def group(self, name: str) -> SimpleNamespace:
        """Results of element group ``name`` (e.g. .end_forces, .tension, .force)."""
        if self._pending_groups is not None:   # element results are computed on first use
            self._results["groups"] = self._pending_groups()
            self._pending_groups = None
        try:
            return SimpleNamespace(**self._results["groups"][name])
        except KeyError:
            known = ", ".join(self._results.get("groups", {}))
            raise KeyError(f"no results for group '{name}' (have: {known})") from None

    def positions(self, coords: np.ndarray) -> np.ndarray:
        """(n, 3) deformed coordinates."""
        return coords + self.translation
