"""Tension-only two-node cable segment with unstressed length.

Strain is measured on the unstressed length at the working temperature,
L0 (1 + alpha dT). A segment shorter than that carries nothing; its tangent
keeps a small regularising stiffness so Newton stays solvable while the
residual stays exact.
"""
from __future__ import annotations

import numpy as np

from .checks import as_array, positive
from .errors import ModelError
from .group import ElementGroup, Evaluation, translation_dofs

#: tangent stiffness kept in slack or straight segments, relative to EA / L0
SLACK_REGULARISATION = 1e-6


class CableGroup(ElementGroup):
    """A group of tension-only cable segments.

    Attributes ``EA``, ``L0``, ``weight``, ``alpha``, ``dT`` are arrays (one
    value per segment) that may be edited between solves (e.g. to move a
    loaded point along the cable or to change the temperature).
    """

    kind = "cable"
    merge_fields = ("conn", "EA", "L0", "weight", "alpha", "dT", "chord0")

    def __init__(self, name: str, conn: np.ndarray, coords: np.ndarray, EA, L0,
                 weight=0.0, alpha=0.0, dT=0.0) -> None:
        self.name = name
        self.conn = conn
        ne = conn.shape[0]
        what = f"cable group '{name}'"
        self.EA = as_array("EA", EA, (ne,), what, per_element=True)
        positive("EA", self.EA, what)
        self.L0 = as_array("L0", L0, (ne,), what, per_element=True)
        positive("unstressed length L0", self.L0, what)
        self.weight = as_array("weight", weight, (ne,), what, per_element=True)
        positive("weight", self.weight, what, allow_zero=True)
        self.alpha = as_array("alpha", alpha, (ne,), what, per_element=True)
        self.dT = as_array("dT", dT, (ne,), what, per_element=True)
        self.chord0 = coords[conn[:, 1]] - coords[conn[:, 0]]
        chord = np.linalg.norm(self.chord0, axis=1)
        short = chord <= 1e-12 * max(1.0, float(np.max(np.abs(coords))))
        if np.any(short):
            i = int(np.argmax(short))
            raise ModelError(f"{what} element {i}: zero length (nodes {conn[i, 0]} and {conn[i, 1]} coincide)")

    def global_dofs(self) -> np.ndarray:
        return translation_dofs(self.conn)

    def free_length(self) -> np.ndarray:
        """Unstressed length at the working temperature."""
        return self.L0 * (1.0 + self.alpha * self.dT)

    def _geometry(self, x):
        d = x[self.conn[:, 1]] - x[self.conn[:, 0]]
        length = np.linalg.norm(d, axis=1)
        return d / length[:, None], length

    def _geometry_disp(self, disp):
        """Unit chord and length from the initial chord plus the relative displacement
        (no loss of digits to large coordinates)."""
        d = self.chord0 + (disp[self.conn[:, 1], :3] - disp[self.conn[:, 0], :3])
        length = np.linalg.norm(d, axis=1)
        return d / length[:, None], length

    def tension(self, x) -> np.ndarray:
        """Tension of every segment (zero when slack)."""
        _, length = self._geometry(x)
        lf = self.free_length()
        return np.maximum(self.EA * (length - lf) / lf, 0.0)

    def evaluate(self, x, rot, disp, tangent=True) -> Evaluation:
        e, length = self._geometry_disp(disp)
        lf = self.free_length()
        t = np.maximum(self.EA * (length - lf) / lf, 0.0)
        f = np.concatenate([-t[:, None] * e, t[:, None] * e], axis=1)
        results = lambda: {"tension": t, "length": length, "slack": t <= 0.0}  # noqa: E731
        if not tangent:
            return Evaluation(f, None, results)
        k_reg = SLACK_REGULARISATION * self.EA / lf
        k_ax = np.where(length > lf, self.EA / lf, k_reg)
        k_tr = np.maximum(t, k_reg * length) / length
        ee = np.einsum("ni,nj->nij", e, e)
        k3 = k_ax[:, None, None] * ee + k_tr[:, None, None] * (np.eye(3)[None] - ee)
        k = np.empty((self.size, 6, 6))
        k[:, :3, :3], k[:, 3:, 3:] = k3, k3
        k[:, :3, 3:], k[:, 3:, :3] = -k3, -k3
        return Evaluation(f, k, results)

    def external(self, gravity: np.ndarray) -> np.ndarray | None:
        if not np.any(self.weight):
            return None
        half = 0.5 * self.weight * self.L0
        g = half[:, None] * gravity[None, :]
        return np.concatenate([g, g], axis=1)

    def results(self, x, rot, disp) -> dict[str, np.ndarray]:
        _, length = self._geometry_disp(disp)
        lf = self.free_length()
        tension = np.maximum(self.EA * (length - lf) / lf, 0.0)
        return {"tension": tension, "length": length, "slack": tension <= 0.0}
