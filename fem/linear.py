"""Linear solves of the tangent system: banded Cholesky where it fits, SuperLU otherwise.

The equations are reordered once per assembler by reverse Cuthill-McKee
(scipy.sparse.csgraph). While the tangent is symmetric (to SYMMETRY_TOL), its
banded form is narrow enough (BANDED_WORK) and LAPACK's dpbtrf finds it
positive definite, the symmetric part is factorised as a band; anything else,
and every mechanism diagnosis, goes to SuperLU with COLAMD ordering. A solve
with the symmetric part of a slightly non-symmetric tangent is a quasi-Newton
step; the solver judges convergence on the true residual either way.
"""
from __future__ import annotations

import time
from dataclasses import dataclass

import numpy as np
import scipy.sparse as sp
import scipy.sparse.linalg as spla
from scipy.linalg import lapack
from scipy.sparse.csgraph import reverse_cuthill_mckee

from .blas_threads import one_thread
from .errors import ModelError
from .group import DOF_NAMES

#: A pivot this small relative to the largest entry of its column marks a DOF that
#: nothing restrains (a mechanism). Checked on the first factorisation of a solve.
MECHANISM_PIVOT = 1e-13
#: largest |K - K^T| relative to the largest |K| for which the band solver is used
SYMMETRY_TOL = 1e-6
#: the band is used when n (bandwidth + 1)^2, its factorisation work, is at most this
#: many times the stored entries of the tangent (SuperLU's fill on such orderings)
BANDED_WORK = 200.0


@dataclass
class Timings:
    """Wall time spent in factorisation + solve, and factorisations made."""

    linear_algebra: float = 0.0
    factorisations: int = 0


TIMINGS = Timings()


def mechanism_error(asm, free_idx: np.ndarray, detail: str) -> ModelError:
    """A ModelError naming the DOFs of a mechanism (free equation indices)."""
    names = [f"node {asm.free[i] // 6} {DOF_NAMES[asm.free[i] % 6]}" for i in free_idx[:3]]
    more = f" and {free_idx.size - 3} more" if free_idx.size > 3 else ""
    node = int(asm.free[free_idx[0]] // 6)
    err = ModelError(f"the model is a mechanism: nothing restrains {', '.join(names)}{more} "
                     f"({detail}); add a support, spring or element there. Elements at node {node}: "
                     f"{', '.join(asm.elements_at(node)) or 'none'}")
    err.where = f"{', '.join(names)}{more}"
    return err


def _small_pivots(k_csc, lu) -> np.ndarray:
    """Free equation indices whose pivot is negligible against their column, worst first."""
    colmax = np.asarray(abs(k_csc).max(axis=0).todense()).ravel()
    pivots = np.abs(lu.U.diagonal())[lu.perm_c]
    ratio = pivots / np.maximum(colmax, 1e-300)
    bad = np.flatnonzero(ratio < MECHANISM_PIVOT)
    return bad[np.argsort(ratio[bad])]


class _Banded:
    """A banded Cholesky factor in the reordered equations."""

    kind = "banded"

    def __init__(self, chol: np.ndarray, perm: np.ndarray) -> None:
        self.chol, self.perm = chol, perm

    def solve(self, r: np.ndarray) -> np.ndarray:
        t0 = time.perf_counter()
        with one_thread():
            x, info = lapack.dpbtrs(self.chol, r[self.perm], lower=0)
        out = np.empty_like(x)
        out[self.perm] = x
        TIMINGS.linear_algebra += time.perf_counter() - t0
        return out


class _Sparse:
    """A SuperLU factor."""

    kind = "superlu"

    def __init__(self, lu) -> None:
        self.lu = lu

    def solve(self, r: np.ndarray) -> np.ndarray:
        t0 = time.perf_counter()
        out = self.lu.solve(r)
        TIMINGS.linear_algebra += time.perf_counter() - t0
        return out


class LinearSolver:
    """Factorises tangents of one assembler's pattern (ordering found once)."""

    def __init__(self, asm, method: str = "auto") -> None:
        self.asm = asm
        n = asm.n_eq
        indptr, indices = asm.pattern()
        rows = np.repeat(np.arange(n, dtype=np.int64), np.diff(indptr))
        indices = indices.astype(np.int64)
        pattern = sp.csr_matrix((np.ones(indices.size), indices, indptr), shape=(n, n))
        self.transpose_slot = _transpose_slots(rows, indices, n)
        self.perm = reverse_cuthill_mckee(pattern, symmetric_mode=True).astype(np.int64) if n else \
            np.zeros(0, dtype=np.int64)
        inv = np.empty(n, dtype=np.int64)
        inv[self.perm] = np.arange(n)
        pi, pj = inv[rows], inv[indices]
        lo, hi = np.minimum(pi, pj), np.maximum(pi, pj)
        self.bandwidth = int((hi - lo).max()) if n else 0
        u = self.bandwidth
        self._band_slot = (u + lo - hi) * n + hi
        self._band_weight = np.where(pi == pj, 1.0, 0.5)   # average of K_ij and K_ji
        fits = n * (u + 1.0) ** 2 <= BANDED_WORK * max(indices.size, 1)
        self.use_band = method == "banded" or (method == "auto" and fits)
        self.kinds: dict[str, int] = {"banded": 0, "superlu": 0}

    def factorise(self, k: sp.csr_matrix, check_pivots: bool = False):
        """A factor with ``.solve(r)``; raises ModelError for a mechanism."""
        t0 = time.perf_counter()
        TIMINGS.factorisations += 1
        try:
            if self.use_band:
                band = self._try_band(k, check_pivots)
                if band is not None:
                    self.kinds["banded"] += 1
                    return band
            self.kinds["superlu"] += 1
            return self._superlu(k, check_pivots)
        finally:
            TIMINGS.linear_algebra += time.perf_counter() - t0

    def _try_band(self, k, check_pivots: bool):
        data = k.data
        scale = float(np.abs(data).max(initial=0.0))
        if scale == 0.0 or np.abs(data - data[self.transpose_slot]).max() > SYMMETRY_TOL * scale:
            return None
        n, u = k.shape[0], self.bandwidth
        ab = np.bincount(self._band_slot, weights=data * self._band_weight,
                         minlength=(u + 1) * n).reshape(u + 1, n)
        with one_thread():
            chol, info = lapack.dpbtrf(ab, lower=0)
        if info != 0:
            return None   # not positive definite: SuperLU decides (and names a mechanism)
        if check_pivots:
            diag = np.abs(k.diagonal())[self.perm]
            if np.any(chol[u] ** 2 < MECHANISM_PIVOT * np.maximum(diag, 1e-300)):
                return None
        return _Banded(chol, self.perm)

    def _superlu(self, k, check_pivots: bool):
        asm = self.asm
        diag = k.diagonal()
        zero = np.flatnonzero(np.abs(diag) <= 1e-300)
        if zero.size:
            raise mechanism_error(asm, zero, "no stiffness at all")
        k_csc = k.tocsc()
        try:
            lu = spla.splu(k_csc, permc_spec="COLAMD")
        except RuntimeError:
            # exactly singular: factor with a tiny shift to find the DOFs that carry it
            shift = 1e-15 * float(np.abs(diag).max())
            try:
                lu_s = spla.splu((k + shift * sp.identity(k.shape[0], format="csr")).tocsc(),
                                 permc_spec="COLAMD")
                bad = _small_pivots(k_csc, lu_s)
            except RuntimeError:
                bad = np.zeros(0, dtype=np.int64)
            raise mechanism_error(asm, bad if bad.size else np.argsort(np.abs(diag))[:1],
                                  "the stiffness matrix is singular") from None
        if check_pivots:
            bad = _small_pivots(k_csc, lu)
            if bad.size:
                raise mechanism_error(asm, bad, "the stiffness matrix is singular")
        return _Sparse(lu)


def _transpose_slots(rows: np.ndarray, cols: np.ndarray, n: int) -> np.ndarray:
    """For each stored entry (i, j) of a structurally symmetric CSR pattern, the slot of (j, i)."""
    rows, cols = rows.astype(np.int64), cols.astype(np.int64)
    keys = rows * max(n, 1) + cols
    order = np.argsort(keys)
    t_keys = cols * max(n, 1) + rows
    return order[np.searchsorted(keys[order], t_keys)]
