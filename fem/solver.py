"""Newton-Raphson with line search and adaptive load increments."""
from __future__ import annotations

from dataclasses import dataclass
from typing import Callable

import numpy as np
import scipy.sparse as sp
import scipy.sparse.linalg as spla

from .assembly import Assembler
from .errors import ConvergenceError, ImbalanceSite, ModelError
from .group import DOF_NAMES
from .rotation import expmap
from .state import State


@dataclass
class SolverOptions:
    """Tolerances and limits of :func:`solve`.

    force_tol: residual norm relative to the applied-load (or reaction) norm.
    disp_tol: last correction norm relative to the displacement norm.
    A state whose Newton correction is at machine precision is also accepted
    when its residual is within ROUNDOFF_ACCEPT x force_tol (the round-off
    floor of stiff, finely meshed beams can lie above a very tight force_tol).
    """

    force_tol: float = 1e-8
    disp_tol: float = 1e-7
    max_iterations: int = 25
    min_increment: float = 1e-5
    grow: float = 1.5
    line_search: bool = True


#: A Newton correction this small relative to the displacements (and in radians) is at
#: the round-off of the arithmetic: no further iteration can lower the residual.
ROUNDOFF_STEP = 64 * np.finfo(float).eps
#: Such a state is accepted when its residual is within this factor of force_tol (the
#: rotations of stiff, finely meshed beams are only known to ~1e-16 rad, which times
#: 6 E I / h^2 can exceed a tight force tolerance).
ROUNDOFF_ACCEPT = 1e3


@dataclass
class Timings:
    """Wall time spent in sparse factorisation + solve, and calls made."""

    linear_algebra: float = 0.0
    factorisations: int = 0


TIMINGS = Timings()


def _assembler(model) -> Assembler:
    sig = (model.n_nodes, tuple(id(g) for g in model.groups), tuple(sorted(model.fixed)),
           tuple(sorted(k for k, v in model.loads.items() if v != 0.0)))
    cached = getattr(model, "_assembler", None)
    if cached is not None and cached[0] == sig:
        return cached[1]
    asm = Assembler(model)
    model._assembler = (sig, asm)
    return asm


def _norm(a: np.ndarray) -> float:
    """Euclidean norm of all entries, without BLAS.

    np.linalg.norm calls a threaded BLAS dot; on a loaded machine the thread
    start-up made a norm of 6e4 numbers take milliseconds (300 times longer).
    """
    a = np.asarray(a)
    if not a.flags.c_contiguous:
        a = np.ascontiguousarray(a)
    flat = a.reshape(-1)
    return float(np.sqrt(np.einsum("i,i->", flat, flat)))


def _evaluate(model, asm, coords, state, tangent):
    x = coords + state.translation
    disp = np.zeros((model.n_nodes, 6))
    disp[:, :3] = state.translation
    return [g.evaluate(x, state.rotation, disp, tangent) for g in asm.units]


def _apply_increment(state: State, asm: Assembler, delta_full: np.ndarray, alpha: float) -> State:
    new = state.copy()
    d = alpha * delta_full.reshape(-1, 6)
    new.translation += d[:, :3]
    spin = d[:, 3:]
    moving = np.any(spin != 0.0, axis=1)
    if np.any(moving):
        new.rotation[moving] = expmap(spin[moving]) @ new.rotation[moving]
    return new


#: A pivot this small relative to the largest entry of its column marks a DOF that
#: nothing restrains (a mechanism). Checked on the first factorisation of a solve.
MECHANISM_PIVOT = 1e-13


def _mechanism(asm: Assembler, free_idx: np.ndarray, detail: str) -> ModelError:
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


def _factorise(k, asm: Assembler, model, check_pivots: bool = False):
    import time
    t0 = time.perf_counter()
    diag = k.diagonal()
    zero = np.flatnonzero(np.abs(diag) <= 1e-300)
    if zero.size:
        TIMINGS.linear_algebra += time.perf_counter() - t0
        raise _mechanism(asm, zero, "no stiffness at all")
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
        raise _mechanism(asm, bad if bad.size else np.argsort(np.abs(diag))[:1],
                         "the stiffness matrix is singular") from None
    finally:
        TIMINGS.linear_algebra += time.perf_counter() - t0
        TIMINGS.factorisations += 1
    if check_pivots:
        bad = _small_pivots(k_csc, lu)
        if bad.size:
            raise _mechanism(asm, bad, "the stiffness matrix is singular")
    return lu


def _solve_linear(lu, r):
    import time
    t0 = time.perf_counter()
    out = lu.solve(r)
    TIMINGS.linear_algebra += time.perf_counter() - t0
    return out


def _residual(asm, evals, f_ext):
    f_int = asm.internal(evals)
    r_full = f_ext - f_int
    return r_full, f_int


def _sites(asm, r_full, count=3) -> list[ImbalanceSite]:
    r_free = np.zeros_like(r_full)
    r_free[asm.free] = r_full[asm.free]
    worst = np.argsort(-np.abs(r_free))[:count]
    return [ImbalanceSite(int(k // 6), DOF_NAMES[k % 6], float(r_full[k]), asm.elements_at(int(k // 6)))
            for k in worst if r_free[k] != 0.0]


def _newton(model, asm, coords, state, f_ext, opts, check_pivots=False):
    """Iterate to equilibrium under f_ext; return (state, history) or raise _Fail."""
    history: list[float] = []
    evals = _evaluate(model, asm, coords, state, False)
    r_full, f_int = _residual(asm, evals, f_ext)
    last_disp_ok = at_roundoff = False  # set by each correction
    for it in range(opts.max_iterations + 1):
        ref = max(_norm(f_ext), _norm(f_int), 1e-30)
        rel = float(_norm(r_full[asm.free]) / ref)
        history.append(rel)
        if not np.isfinite(rel):
            raise _Fail("the residual is not finite", history, r_full)
        if rel <= opts.force_tol and last_disp_ok:
            return state, history, evals
        if at_roundoff and rel <= ROUNDOFF_ACCEPT * opts.force_tol:
            return state, history, evals
        if it == 0 and rel <= opts.force_tol * 1e-2:
            return state, history, evals
        if it == opts.max_iterations:
            break
        # tangents only where a factorisation follows (not for the converged state or
        # rejected line-search trials): the beam tangent costs 18 force evaluations
        evals = _evaluate(model, asm, coords, state, True)
        k = asm.tangent(evals)
        first = check_pivots and it == 0
        try:
            lu = _factorise(k, asm, model, first)
        except ModelError as err:
            if first or not hasattr(err, "where"):
                raise
            # the model had stiffness at the start; an iterate that lost it (a spring
            # past its capacity, a gap opened) is a convergence failure, not bad input
            raise _Fail(f"the tangent stiffness vanished at {err.where}", history, r_full) from None
        delta = _solve_linear(lu, r_full[asm.free])
        if not np.all(np.isfinite(delta)):
            raise _Fail("the linear solve gave non-finite corrections", history, r_full)
        delta_full = np.zeros(asm.n_full)
        delta_full[asm.free] = delta
        alpha, state, evals, r_full, f_int = _line_search(model, asm, coords, state, delta_full,
                                                          f_ext, r_full[asm.free],
                                                          opts.line_search and _stalled(history))
        u_norm = _norm(state.translation) + 1e-12
        d_norm = alpha * _norm(delta_full.reshape(-1, 6)[:, :3])
        last_disp_ok = d_norm <= opts.disp_tol * u_norm or d_norm < 1e-14
        r_norm = alpha * _norm(delta_full.reshape(-1, 6)[:, 3:])
        at_roundoff = d_norm <= ROUNDOFF_STEP * u_norm and r_norm <= ROUNDOFF_STEP
    raise _Fail(f"not converged in {opts.max_iterations} iterations", history, r_full)


def _line_search(model, asm, coords, state, delta_full, f_ext, r0, active):
    """Step length along the Newton direction.

    The full Newton step is taken while Newton behaves: one good step can
    raise the residual for an iteration (the axial force of a stiff member
    after a bending step), so a residual test on every step would only slow
    it. When ``active`` (the residual has stopped falling), the step is
    halved until the residual norm drops below its start value (at most five
    times; the best trial is kept).
    """
    r0n = float(_norm(r0))
    best = None
    alpha = 1.0
    for _ in range(6 if active else 1):
        trial = _apply_increment(state, asm, delta_full, alpha)
        evals = _evaluate(model, asm, coords, trial, False)
        r_full, f_int = _residual(asm, evals, f_ext)
        rn = float(_norm(r_full[asm.free]))
        if not np.isfinite(rn):
            rn = np.inf
        if best is None or rn < best[0]:
            best = (rn, alpha, trial, evals, r_full, f_int)
        if rn < r0n:
            break
        alpha *= 0.5
    return best[1:]


def _stalled(history: list[float]) -> bool:
    """True when the residual has not fallen over the last two iterations."""
    return len(history) >= 4 and history[-1] >= 0.5 * history[-3]


class _Fail(Exception):
    def __init__(self, reason, history, r_full):
        self.reason, self.history, self.r_full = reason, history, r_full


def solve(model, state: State | None = None, factor: float = 1.0, steps: int = 1,
          options: SolverOptions | None = None,
          progress: Callable[[float], None] | None = None) -> State:
    """Find equilibrium of ``model`` under ``factor`` times its loads.

    The external loads and prescribed displacements are moved from those of
    ``state`` (zero for a fresh solve) to their new values in at least
    ``steps`` equal increments; an increment that fails is cut in half and
    later ones grow back (never beyond 1 / ``steps``).

    Returns
    -------
    State
        The equilibrium state with results filled in.

    Raises
    ------
    ConvergenceError
        When an increment smaller than ``options.min_increment`` still fails.
    ModelError
        When the model is invalid or a mechanism.
    """
    opts = options or SolverOptions()
    if not np.isfinite(factor):
        raise ModelError(f"solve: the load factor must be a finite number, got {factor}")
    if int(steps) < 1:
        raise ModelError(f"solve: steps must be at least 1, got {steps}")
    asm = _assembler(model)
    coords = model.coords
    if state is None:
        state = State.initial(model.n_nodes)
    elif state.translation.shape[0] != model.n_nodes:
        raise ModelError("the starting state belongs to a model with a different number of nodes")
    state = state.copy()
    state.iterations, state.history = [], []
    f0, f1 = state.applied.copy(), asm.external(factor)
    p0, p1 = state.prescribed.copy(), asm.prescribed(factor)
    t, dt, step = 0.0, 1.0 / max(int(steps), 1), 0
    dt_max = dt
    fixed = np.flatnonzero(asm.fixed_mask)
    while t < 1.0 - 1e-12:
        step += 1
        dt = min(dt, 1.0 - t)
        t_new = t + dt
        trial = state.copy()
        p_new = p0 + t_new * (p1 - p0)
        _set_prescribed(trial, fixed, p_new - trial.prescribed)
        trial.prescribed = p_new
        f_ext = f0 + t_new * (f1 - f0)
        try:
            trial, history, evals = _newton(model, asm, coords, trial, f_ext, opts, step == 1)
        except _Fail as fail:
            if dt <= opts.min_increment:
                raise ConvergenceError(fail.reason, step, t_new, fail.history,
                                       _sites(asm, fail.r_full)) from None
            dt *= 0.5
            continue
        trial.applied = f_ext
        state = trial
        state.iterations.append(len(history) - 1)
        state.history.append(history)
        t = t_new
        if progress is not None:
            progress(t)
        if len(history) <= 6:
            dt = min(dt * opts.grow, dt_max)
    _fill_results(model, asm, coords, state)
    return state


def _set_prescribed(state: State, fixed: np.ndarray, jump: np.ndarray) -> None:
    for k in fixed:
        j = jump[k]
        if j == 0.0:
            continue
        node, dof = divmod(int(k), 6)
        if dof < 3:
            state.translation[node, dof] += j
        else:
            spin = np.zeros(3)
            spin[dof - 3] = j
            state.rotation[node] = expmap(spin) @ state.rotation[node]


def _fill_results(model, asm, coords, state: State) -> None:
    evals = _evaluate(model, asm, coords, state, False)
    f_int = asm.internal(evals)
    r_full = state.applied - f_int
    reactions = np.zeros(asm.n_full)
    reactions[asm.fixed_mask] = -r_full[asm.fixed_mask]
    x = coords + state.translation
    disp = np.zeros((model.n_nodes, 6))
    disp[:, :3] = state.translation
    groups = {}
    for g in model.groups:
        res = g.results(x, state.rotation, disp)
        groups[g.name] = res
        if g.kind == "spring":
            reactions -= np.bincount(g.global_dofs().ravel(), weights=res["force"], minlength=asm.n_full)
    resid = np.zeros(asm.n_full)
    resid[asm.free] = r_full[asm.free]
    state._results = {"reactions": reactions.reshape(-1, 6), "residual": resid.reshape(-1, 6),
                      "groups": groups}
