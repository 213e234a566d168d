"""Newton iteration of one load increment.

Work is spent only where it changes the answer:

- Factorisations are kept (modified Newton). Refresh rule: a factorisation
  made in this increment makes the next correction too when REUSE_SAFETY
  times its last residual ratio times the current residual meets the force
  test (it is predicted to finish the increment); a reused step whose ratio
  exceeds REFRESH_RATIO ends the reuse. At the start of an increment the last
  factorisation (of this or an earlier solve of the model; never one from a
  failed try) makes the first correction, and the tangent is refreshed after
  it. A step with a kept factorisation that raises the residual is undone.
  Every other correction refreshes the tangent at the current iterate.
- Convergence: the force test ``|r| <= max(force_tol * max(|f_ext|, |f_int|),
  floor)`` (full-length vectors) with the round-off floor ``FLOOR_FACTOR * eps *
  |diag(K) * s|`` (s: 1 rad for rotations, the longest element chord at the
  node for translations; diag(K) of the last factorised tangent) - the force
  that round-off of a unit rotation or of a chord produces, so a tiny load
  on a stiff part still converges; plus the displacement test on the last
  correction or, when the force test passes first, on the correction the
  kept factorisation gives by back-substitution (no new factorisation, and
  the state is kept as it is).
- Globalisation: the full step is always tried and kept while the residual
  falls or the energy along the step falls (trapezoid estimate
  -(s0 + s1) / 2 with s = direction . residual); only when both rise is the
  step shortened (regula falsi on s, at most five trials, the best kept).
  Ordinary Newton progress in which the residual norm rises for many
  iterations (a cable taking a large point load) is never cut.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .errors import ModelError
from .rotation import expmap

#: a kept factorisation is reused when this x its last residual ratio x the current
#: residual meets the force test (the next step's ratio is about twice the last one
#: after a fresh tangent; the factor covers that with a margin)
REUSE_SAFETY = 4.0
#: a step made with a kept factorisation whose residual ratio exceeds this refreshes it
REFRESH_RATIO = 0.1
#: round-off floor of the residual, in units of eps |diag(K) s| (see the module text)
FLOOR_FACTOR = 4.0
#: A Newton correction this small relative to the displacements (and in radians) is at
#: the round-off of the arithmetic: no further iteration can lower the residual.
ROUNDOFF_STEP = 64 * np.finfo(float).eps
#: Such a state is accepted when its residual is within this factor of force_tol.
ROUNDOFF_ACCEPT = 1e3


@dataclass
class Counters:
    """Work done by one solve, failed increments included."""

    iterations: int = 0
    failed_iterations: int = 0
    factorisations: int = 0
    residual_evaluations: int = 0


@dataclass
class Kept:
    """The factorisation kept between corrections, increments and solves of a model."""

    factor: object = None
    rate: float = 1.0        # residual ratio of the last step made with it
    floor: float = 0.0       # round-off floor of the residual from its tangent's diagonal


class Fail(Exception):
    """An increment did not converge (the solver cuts it)."""

    def __init__(self, reason, history, r_full):
        self.reason, self.history, self.r_full = reason, history, r_full


def norm(a: np.ndarray) -> float:
    """Euclidean norm without BLAS (a threaded dot started threads for every call)."""
    flat = np.ascontiguousarray(a).reshape(-1)
    return float(np.sqrt(np.einsum("i,i->", flat, flat)))


def _dot(a: np.ndarray, b: np.ndarray) -> float:
    """a . b without BLAS (see :func:`norm`)."""
    return float(np.einsum("i,i->", a, b))


def apply_increment(state, delta_full: np.ndarray, alpha: float):
    """A copy of ``state`` moved by ``alpha`` times the full-length correction."""
    new = state.copy()
    d = alpha * delta_full.reshape(-1, 6)
    new.translation += d[:, :3]
    spin = d[:, 3:]
    moving = np.any(spin != 0.0, axis=1)
    if np.any(moving):
        new.rotation[moving] = expmap(spin[moving]) @ new.rotation[moving]
    return new


class Increment:
    """Newton iteration to equilibrium under one external load vector."""

    def __init__(self, ctx, f_ext: np.ndarray, opts, counters: Counters, kept: Kept,
                 check_pivots: bool) -> None:
        self.ctx, self.f_ext, self.opts = ctx, f_ext, opts
        self.counters, self.kept, self.check_pivots = counters, kept, check_pivots
        self.asm = ctx.asm
        self.f_ext_norm = norm(f_ext)

    # -- pieces -------------------------------------------------------------
    def residual(self, state):
        """(evaluations, full residual, free residual norm, reference force)."""
        self.counters.residual_evaluations += 1
        evals = self.ctx.evaluate(state, False)
        f_int = self.asm.internal(evals)
        r_full = self.f_ext - f_int
        ref = max(self.f_ext_norm, norm(f_int), 1e-30)
        return evals, r_full, norm(r_full[self.asm.free]), ref

    def refresh(self, state, history, r_full, at_start: bool) -> None:
        """Tangent at ``state``, factorised and kept. The first factorisation of a solve,
        when made at the start of an increment, checks its pivots for a mechanism."""
        k = self.asm.tangent(self.ctx.evaluate(state, "difference" if self.opts.difference_tangents
                                               else True))
        check = self.check_pivots and at_start
        try:
            factor = self.ctx.linear.factorise(k, check)
        except ModelError as err:
            if check or not hasattr(err, "where"):
                raise
            # the model had stiffness at the start; an iterate that lost it (a spring past
            # its capacity, a gap opened) is a convergence failure, not bad input
            raise Fail(f"the tangent stiffness vanished at {err.where}", history, r_full) from None
        self.check_pivots = False
        self.counters.factorisations += 1
        floor = FLOOR_FACTOR * np.finfo(float).eps * norm(np.abs(k.diagonal()) * self.asm.length_scale)
        self.kept.factor, self.kept.rate, self.kept.floor = factor, 1.0, floor

    def correction(self, r_full) -> np.ndarray:
        delta = self.kept.factor.solve(r_full[self.asm.free])
        out = np.zeros(self.asm.n_full)
        out[self.asm.free] = delta
        return out

    def step(self, state, delta_full, r_full, rn0, history):
        """Full step, shortened only when both the residual and the energy rise."""
        free = self.asm.free
        d_free = delta_full[free]
        s0 = _dot(d_free, r_full[free])
        best = None
        alpha = 1.0
        for _ in range(6 if self.opts.line_search else 1):
            trial = apply_increment(state, delta_full, alpha)
            evals, r_new, rn, ref = self.residual(trial)
            if not np.isfinite(rn):
                rn = np.inf
            if best is None or rn < best[0]:
                best = (rn, alpha, trial, evals, r_new, ref)
            if not np.isfinite(rn):
                alpha *= 0.5
                continue
            s1 = _dot(d_free, r_new[free]) / alpha
            energy_falls = s0 > 0.0 and s1 > -s0
            # no energy to judge by (an indefinite tangent): keep the step unless stalled
            no_energy_but_moving = s0 <= 0.0 and not _stalled(history)
            if rn <= rn0 or energy_falls or no_energy_but_moving or not self.opts.line_search:
                return rn, alpha, trial, evals, r_new, ref
            # regula falsi for the zero of s along the step, kept inside [0.1, 0.5] alpha
            guess = s0 / (s0 - s1) if s0 > 0.0 and s1 < 0.0 else 0.5
            alpha *= float(np.clip(guess, 0.1, 0.5))
        return best

    # -- the iteration ------------------------------------------------------
    def run(self, state):
        opts, kept = self.opts, self.kept
        history: list[float] = []
        evals, r_full, rn, ref = self.residual(state)
        last_disp_ok = at_roundoff = False
        fresh_in_increment = False
        tried_carried = kept.factor is None
        for it in range(opts.max_iterations + 1):
            rel = rn / ref
            history.append(rel)
            if not np.isfinite(rel):
                raise Fail("the residual is not finite", history, r_full)
            target = max(opts.force_tol * ref, kept.floor)
            force_ok = rn <= target
            if force_ok and last_disp_ok:
                return state, history, evals, r_full
            if at_roundoff and rel <= ROUNDOFF_ACCEPT * opts.force_tol:
                return state, history, evals, r_full
            if it == 0 and rel <= opts.force_tol * 1e-2:
                return state, history, evals, r_full
            delta_full = None
            if force_ok and kept.factor is not None:
                # the final check: the kept factorisation's correction, by back-substitution
                delta_full = self.correction(r_full)
                if _small(delta_full, state, opts.disp_tol):
                    return state, history, evals, r_full
            if it == opts.max_iterations:
                break
            reuse = kept.factor is not None and (
                not tried_carried
                or (fresh_in_increment and REUSE_SAFETY * kept.rate * rn <= target))
            reuse = reuse and opts.reuse_factorisation
            if not reuse:
                self.refresh(state, history, r_full, it == 0)
                fresh_in_increment, delta_full = True, None
            tried_carried = True
            if delta_full is None:
                delta_full = self.correction(r_full)
            if not np.all(np.isfinite(delta_full)):
                raise Fail("the linear solve gave non-finite corrections", history, r_full)
            self.counters.iterations += 1
            rn_new, alpha, trial, evals_new, r_new, ref_new = self.step(state, delta_full, r_full, rn,
                                                                        history)
            ratio = rn_new / max(rn, 1e-300)
            kept.rate = ratio
            if reuse and ratio >= 1.0:
                # a kept factorisation that raised the residual: undo the step, refresh next
                fresh_in_increment = False
                continue
            if reuse and ratio > REFRESH_RATIO:
                fresh_in_increment = False   # contraction poor: the next correction refreshes
            state, evals, r_full, rn, ref = trial, evals_new, r_new, rn_new, ref_new
            u_norm = norm(state.translation) + 1e-12
            d = delta_full.reshape(-1, 6)
            d_norm = alpha * norm(d[:, :3])
            last_disp_ok = d_norm <= opts.disp_tol * u_norm or d_norm < 1e-14
            at_roundoff = d_norm <= ROUNDOFF_STEP * u_norm and alpha * norm(d[:, 3:]) <= ROUNDOFF_STEP
        raise Fail(f"not converged in {opts.max_iterations} iterations", history, r_full)


def _small(delta_full: np.ndarray, state, disp_tol: float) -> bool:
    """The displacement test on a correction that was not applied."""
    d = delta_full.reshape(-1, 6)
    d_norm = norm(d[:, :3])
    return d_norm <= disp_tol * (norm(state.translation) + 1e-12) or d_norm < 1e-14


def _stalled(history: list[float]) -> bool:
    """True when the residual has not fallen over the last two iterations."""
    return len(history) >= 4 and history[-1] >= 0.5 * history[-3]
