"""DOF numbering and sparse assembly with a pattern built once."""
from __future__ import annotations

import numpy as np
import scipy.sparse as sp

from .errors import ModelError
from .group import DOF_NAMES, MergedUnit, evaluation_units


class Assembler:
    """Numbers the active DOFs of a model and assembles forces and tangents.

    A DOF is active when some element or spring stiffens it or it carries a
    load; rotations at nodes that only cables meet are therefore dropped and
    such nodes carry three DOFs. Fixed and prescribed DOFs are kept out of
    the equations.
    """

    def __init__(self, model) -> None:
        self.model = model
        n = model.n_nodes
        self.n_full = 6 * n
        stiff = np.zeros(self.n_full, dtype=bool)
        self.group_dofs = []
        #: what the solver evaluates: the model's groups, those of one kind batched
        self.units = evaluation_units(model.groups)
        for g in self.units:
            gd = g.global_dofs()
            self.group_dofs.append(gd)
            stiff[gd[g.stiffened()]] = True
        self.active = stiff
        self.check_loads()
        for key, val in model.fixed.items():
            if not stiff[key] and val != 0.0:
                raise ModelError(f"prescribed value on node {key // 6} {DOF_NAMES[key % 6]}, which no "
                                 f"element or spring connects")
        fixed = np.zeros(self.n_full, dtype=bool)
        fixed[list(model.fixed)] = True
        self.fixed_mask = fixed & stiff
        free = stiff & ~fixed
        self.free = np.flatnonzero(free)
        self.eq = np.full(self.n_full, -1, dtype=np.int64)
        self.eq[self.free] = np.arange(self.free.size)
        self.n_eq = int(self.free.size)
        self._build_pattern()
        self.length_scale = self._length_scale()
        self._all_dofs = np.concatenate([gd.ravel() for gd in self.group_dofs]) if self.group_dofs \
            else np.zeros(0, dtype=np.int64)
        self.merged = [u for u in self.units if isinstance(u, MergedUnit)]

    def check_loads(self) -> None:
        """Raise for a nodal load on a DOF that nothing resists (loads may change between solves)."""
        for key, val in self.model.loads.items():
            if not self.active[key] and val != 0.0:
                raise ModelError(f"load on node {key // 6} {DOF_NAMES[key % 6]}, which no element "
                                 f"or spring resists")

    def refresh(self) -> None:
        """Once per solve: batches regather member arrays that were replaced."""
        for unit in self.merged:
            unit.refresh()

    def pattern(self) -> tuple[np.ndarray, np.ndarray]:
        """(indptr, indices) of the free-free tangent's CSR pattern."""
        return self._indptr, self._indices

    def _length_scale(self) -> np.ndarray:
        """Per free equation: 1 for a rotation, the longest element chord at the node for a
        translation (1 m where no element with a chord meets it)."""
        node_len = np.zeros(self.model.n_nodes)
        for g in self.model.groups:
            chord = getattr(g, "chord0", None)
            if chord is None or g.conn.shape[1] != 2:
                continue
            length = np.linalg.norm(chord, axis=1)
            np.maximum.at(node_len, g.conn[:, 0], length)
            np.maximum.at(node_len, g.conn[:, 1], length)
        node_len[node_len == 0.0] = 1.0
        per_dof = np.repeat(node_len, 6)
        per_dof[np.arange(self.n_full) % 6 >= 3] = 1.0
        return per_dof[self.free]

    def _build_pattern(self) -> None:
        rows, cols, self._entry_masks = [], [], []
        for gd in self.group_dofs:
            e = self.eq[gd]  # (ne, nde)
            r = np.repeat(e[:, :, None], e.shape[1], axis=2)
            c = np.repeat(e[:, None, :], e.shape[1], axis=1)
            mask = (r >= 0) & (c >= 0)
            self._entry_masks.append(mask)
            rows.append(r[mask])
            cols.append(c[mask])
        #: flat positions of the kept entries of each group's tangent (None: all of them)
        self._entry_take = [None if m.all() else np.flatnonzero(m.ravel()) for m in self._entry_masks]
        rows = np.concatenate(rows) if rows else np.zeros(0, dtype=np.int64)
        cols = np.concatenate(cols) if cols else np.zeros(0, dtype=np.int64)
        keys = rows * max(self.n_eq, 1) + cols
        uniq, self._slot = np.unique(keys, return_inverse=True)
        r_u, c_u = np.divmod(uniq, max(self.n_eq, 1))
        self._indices = c_u.astype(np.int32)
        self._indptr = np.concatenate([[0], np.cumsum(np.bincount(r_u, minlength=self.n_eq))]).astype(np.int32)
        self.nnz = int(uniq.size)

    def internal(self, evaluations) -> np.ndarray:
        """Full-length internal force vector from the groups' evaluations."""
        if not evaluations:
            return np.zeros(self.n_full)
        forces = np.concatenate([ev.force.reshape(-1) for ev in evaluations])
        return np.bincount(self._all_dofs, weights=forces, minlength=self.n_full)

    def tangent(self, evaluations) -> sp.csr_matrix:
        """Free-free tangent matrix (CSR) from the groups' evaluations."""
        vals = [ev.tangent.reshape(-1) if take is None else ev.tangent.reshape(-1)[take]
                for ev, take in zip(evaluations, self._entry_take)]
        data = np.bincount(self._slot, weights=np.concatenate(vals) if vals else None,
                           minlength=self.nnz)
        return sp.csr_matrix((data, self._indices, self._indptr), shape=(self.n_eq, self.n_eq))

    def external(self, factor: float = 1.0) -> np.ndarray:
        """Full-length reference external load vector (nodal loads + self-weights) times factor."""
        f = np.zeros(self.n_full)
        for key, val in self.model.loads.items():
            f[key] += val
        g = self.model.gravity
        for gd, grp in zip(self.group_dofs, self.units):
            ext = grp.external(g)
            if ext is not None:
                f += np.bincount(gd.ravel(), weights=ext.ravel(), minlength=self.n_full)
        return factor * f

    def prescribed(self, factor: float = 1.0) -> np.ndarray:
        """Full-length vector of prescribed displacement values times factor."""
        p = np.zeros(self.n_full)
        for key, val in self.model.fixed.items():
            p[key] = val
        return factor * p

    def elements_at(self, node: int) -> list[str]:
        """Labels of the elements that meet at ``node`` (for messages)."""
        out = []
        for g in self.model.groups:
            hits = np.flatnonzero(np.any(g.conn == node, axis=1))
            out += [g.label(int(i)) for i in hits[:3]]
        return out[:6]
