"""Load stepping around the Newton iteration of :mod:`fem.newton`."""
from __future__ import annotations

from dataclasses import dataclass
from typing import Callable

import numpy as np

from .assembly import Assembler
from .errors import ConvergenceError, ImbalanceSite, ModelError
from .group import DOF_NAMES, MergedUnit
from .linear import TIMINGS, LinearSolver, Timings
from .newton import Counters, Fail, Increment, Kept
from .rotation import expmap
from .state import State

__all__ = ["SolverOptions", "TIMINGS", "Timings", "solve"]


@dataclass
class SolverOptions:
    """Tolerances and limits of :func:`solve`.

    force_tol: residual norm relative to the applied-load (or internal-force) norm,
        never below the round-off floor of the model (see :mod:`fem.newton`).
    disp_tol: correction norm relative to the displacement norm.
    line_search: shorten a step when both its residual and its energy rise.
    reuse_factorisation: keep factorisations across iterations, increments and solves
        while they contract well (modified Newton, refresh rule in :mod:`fem.newton`).
    linear_solver: "auto" (banded Cholesky where it fits, else SuperLU), "banded"
        (banded whenever symmetric and positive definite) or "superlu".
    difference_tangents: element tangents by one-sided differences (a check).
    """

    force_tol: float = 1e-8
    disp_tol: float = 1e-7
    max_iterations: int = 25
    min_increment: float = 1e-5
    grow: float = 1.5
    line_search: bool = True
    reuse_factorisation: bool = True
    linear_solver: str = "auto"
    difference_tangents: bool = False


class _Context:
    """What the Newton iteration needs of a model, built once per model layout."""

    def __init__(self, model) -> None:
        self.model = model
        self.asm = Assembler(model)
        self.coords = model.coords
        self.kept = Kept()
        self._solvers: dict[str, LinearSolver] = {}
        self.linear: LinearSolver | None = None

    def use(self, method: str) -> None:
        if method not in ("auto", "banded", "superlu"):
            raise ModelError(f"solve: linear_solver must be auto, banded or superlu, got {method!r}")
        if method not in self._solvers:
            self._solvers[method] = LinearSolver(self.asm, method)
        if self.linear is not self._solvers[method]:
            self.kept = Kept()
        self.linear = self._solvers[method]

    def evaluate(self, state: State, tangent):
        x = self.coords + state.translation
        disp = np.zeros((x.shape[0], 6))
        disp[:, :3] = state.translation
        return [g.evaluate(x, state.rotation, disp, tangent) for g in self.asm.units]


def _context(model) -> _Context:
    sig = (model.n_nodes, tuple(id(g) for g in model.groups), tuple(sorted(model.fixed)))
    cached = getattr(model, "_solver_context", None)
    if cached is not None and cached[0] == sig:
        cached[1].asm.check_loads()
        return cached[1]
    ctx = _Context(model)
    model._solver_context = (sig, ctx)
    return ctx


def _sites(asm, r_full, count=3) -> list[ImbalanceSite]:
    r_free = np.zeros_like(r_full)
    r_free[asm.free] = r_full[asm.free]
    worst = np.argsort(-np.abs(r_free))[:count]
    return [ImbalanceSite(int(k // 6), DOF_NAMES[k % 6], float(r_full[k]), asm.elements_at(int(k // 6)))
            for k in worst if r_free[k] != 0.0]


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
    ctx = _context(model)
    ctx.use(opts.linear_solver)
    asm = ctx.asm
    asm.refresh()
    if not opts.reuse_factorisation:
        ctx.kept = Kept()
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
    counters = Counters()
    first_factorisation = True   # the first fresh factorisation of a solve checks its pivots
    while t < 1.0 - 1e-12:
        step += 1
        dt = min(dt, 1.0 - t)
        t_new = t + dt
        trial = state.copy()
        p_new = p0 + t_new * (p1 - p0)
        _set_prescribed(trial, fixed, p_new - trial.prescribed)
        trial.prescribed = p_new
        f_ext = f0 + t_new * (f1 - f0)
        made = counters.iterations
        try:
            trial, history, evals, r_full = Increment(ctx, f_ext, opts, counters, ctx.kept,
                                                      first_factorisation).run(trial)
        except Fail as fail:
            counters.failed_iterations += counters.iterations - made
            ctx.kept = Kept()   # a factorisation from a failed attempt is not carried on
            first_factorisation = first_factorisation and counters.factorisations == 0
            if dt <= opts.min_increment:
                raise ConvergenceError(fail.reason, step, t_new, fail.history,
                                       _sites(asm, fail.r_full)) from None
            dt *= 0.5
            continue
        first_factorisation = first_factorisation and counters.factorisations == 0
        trial.applied = f_ext
        state = trial
        state.iterations.append(len(history) - 1)
        state.history.append(history)
        t = t_new
        if progress is not None:
            progress(t)
        if len(history) <= 6:
            dt = min(dt * opts.grow, dt_max)
    state.newton_iterations = counters.iterations
    state.failed_iterations = counters.failed_iterations
    state.factorisations = counters.factorisations
    state.residual_evaluations = counters.residual_evaluations
    _fill_results(ctx, state, evals, r_full)
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


def _fill_results(ctx: _Context, state: State, evals, r_full: np.ndarray) -> None:
    """Reactions and residual now, group results on first use: both from the final
    evaluation of the state (later edits of the model do not reach them)."""
    asm = ctx.asm
    reactions = np.zeros(asm.n_full)
    reactions[asm.fixed_mask] = -r_full[asm.fixed_mask]
    for unit, gd, ev in zip(asm.units, asm.group_dofs, evals):
        if getattr(unit, "to_ground", False):
            reactions -= np.bincount(gd.ravel(), weights=ev.force.ravel(), minlength=asm.n_full)
    resid = np.zeros(asm.n_full)
    resid[asm.free] = r_full[asm.free]
    units = list(zip(asm.units, evals))
    snapshots = {id(u): [g.snapshot() for g in (u.groups if isinstance(u, MergedUnit) else [u])]
                 for u, ev in units if ev.results is None}
    translation, rotation = state.translation.copy(), state.rotation.copy()

    def group_results() -> dict:
        out = {}
        for unit, ev in units:
            members = unit.groups if isinstance(unit, MergedUnit) else [unit]
            if ev.results is None:   # a group that does not hand its results over
                x = ctx.coords + translation
                disp = np.zeros((x.shape[0], 6))
                disp[:, :3] = translation
                parts = [g.results(x, rotation, disp) for g in snapshots[id(unit)]]
            elif isinstance(unit, MergedUnit):
                parts = unit.split_results(ev.results())
            else:
                parts = [ev.results()]
            out.update({g.name: part for g, part in zip(members, parts)})
        return out

    state._results = {"reactions": reactions.reshape(-1, 6), "residual": resid.reshape(-1, 6)}
    state._pending_groups = group_results
