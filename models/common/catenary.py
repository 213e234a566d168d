"""Elastic catenary of a cable between two points (Irvine, Cable Structures, 1981).

Coordinates: x horizontal from the start support, z measured DOWN from the
start support. H is the horizontal tension, V the upward vertical reaction at
the start, w the weight per unstressed length, L0 the unstressed length, s
the unstressed arc coordinate from the start.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from scipy.optimize import brentq, fsolve


@dataclass(frozen=True)
class Catenary:
    """An elastic catenary solved for its end reactions."""

    H: float
    V: float
    w: float
    EA: float
    L0: float

    def x(self, s):
        """Horizontal coordinate at unstressed arc coordinate ``s``."""
        H, V, w, EA = self.H, self.V, self.w, self.EA
        s = np.asarray(s, float)
        return H * s / EA + H / w * (np.arcsinh(V / H) - np.arcsinh((V - w * s) / H))

    def z_down(self, s):
        """Depth below the start support at ``s`` (positive down)."""
        H, V, w, EA = self.H, self.V, self.w, self.EA
        s = np.asarray(s, float)
        return (w * s / EA) * (V / w - s / 2.0) + H / w * (
            np.sqrt(1.0 + (V / H) ** 2) - np.sqrt(1.0 + ((V - w * s) / H) ** 2))

    def tension(self, s):
        """Cable tension at ``s``."""
        return np.hypot(self.H, self.V - self.w * np.asarray(s, float))

    @property
    def end_tensions(self) -> tuple[float, float]:
        """Tension at the start and at the end."""
        return float(self.tension(0.0)), float(self.tension(self.L0))


def solve_catenary(span: float, drop: float, L0: float, w: float, EA: float) -> Catenary:
    """Reactions of an elastic catenary of unstressed length ``L0``.

    Parameters
    ----------
    span
        Horizontal distance between supports (m, > 0).
    drop
        How far the end support lies BELOW the start support (m; negative if above).
    """
    chord = np.hypot(span, drop)
    weight = w * L0

    def eqs(p):  # unknowns log(H / weight) and V / weight, both of order one
        H, V = weight * np.exp(p[0]), weight * p[1]
        c = Catenary(H, V, w, EA, L0)
        return [c.x(L0) / span - 1.0, (c.z_down(L0) - drop) / chord]

    # start: parabolic estimate of H from the sag of the slack length
    slack = max(L0 - chord, 1e-6 * chord)
    sag = np.sqrt(3.0 * chord * slack / 8.0)
    H0 = max(w * span**2 / (8.0 * sag), 1e-6 * EA) if L0 > chord else w * span**2 / (8.0 * 1e-3 * chord)
    V0 = w * L0 / 2.0 + H0 * drop / span
    sol, info, ier, msg = fsolve(eqs, [np.log(H0 / weight), V0 / weight], full_output=True, xtol=1e-13)
    if np.max(np.abs(eqs(sol))) > 1e-9:  # (fsolve may say 'no progress' at round-off)
        # taut cable: start from the straight-bar estimate
        H1 = max(EA * max(chord / L0 - 1.0, 1e-9) * span / chord, 1e-9 * weight)
        sol, info, ier, msg = fsolve(eqs, [np.log(H1 / weight), 0.5 + H1 * drop / (span * weight)],
                                     full_output=True, xtol=1e-13)
    if np.max(np.abs(eqs(sol))) > 1e-8:
        raise ValueError(f"elastic catenary did not solve: {msg}")
    return Catenary(float(weight * np.exp(sol[0])), float(weight * sol[1]), w, EA, L0)


def midspan_sag(c: Catenary, span: float, drop: float) -> float:
    """Vertical distance from the chord down to the cable at mid-span."""
    s_mid = brentq(lambda s: c.x(s) - 0.5 * span, 0.0, c.L0)
    return float(c.z_down(s_mid) - 0.5 * drop)


def length_for_sag(span: float, drop: float, sag: float, w: float, EA: float) -> float:
    """Unstressed length whose catenary sags ``sag`` at mid-span."""
    chord = np.hypot(span, drop)
    lo, hi = chord * (1.0 - 0.02), chord * 2.0
    return brentq(lambda L: midspan_sag(solve_catenary(span, drop, L, w, EA), span, drop) - sag,
                  lo, hi, xtol=1e-12 * chord)


def length_for_tension(span: float, drop: float, tension: float, w: float, EA: float) -> float:
    """Unstressed length whose larger end tension equals ``tension``."""
    chord = np.hypot(span, drop)

    def f(L):
        return max(solve_catenary(span, drop, L, w, EA).end_tensions) - tension

    lo = chord * (1.0 - 0.5 * tension / EA) * (1 - 1e-3)
    hi = chord * 1.5
    return brentq(f, lo, hi, xtol=1e-12 * chord)


def chain_points(span: float, drop: float, L0: float, w: float, EA: float, n: int) -> np.ndarray:
    """Equilibrium of the same cable as a chain of ``n`` straight elastic segments.

    Each segment has unstressed length L0 / n and half of its weight lumped at
    each end, as the finite-element cable carries it. The chain is solved
    exactly (segment forces from statics, lengths from Hooke's law, end
    position matched by fsolve on H and the first segment's vertical force),
    starting from the continuous catenary. Nodes on the continuous curve would
    have chords a little shorter than the stretched segments, and a lightly
    tensioned cable would start slack.

    Returns
    -------
    (n + 1, 2) array of (x, z up) from the start support.
    """
    c = solve_catenary(span, drop, L0, w, EA)
    lo = L0 / n
    p = w * lo
    j = np.arange(n)

    def points(params):
        H, v0 = np.exp(params[0]), params[1]
        v = v0 + j * p
        t = np.hypot(H, v)
        seg = lo * (1.0 + t / EA)
        steps = np.column_stack([H / t * seg, v / t * seg])
        return np.vstack([[0.0, 0.0], np.cumsum(steps, axis=0)])

    def eqs(params):
        end = points(params)[-1]
        return [(end[0] - span) / span, (end[1] + drop) / span]

    v0 = -(c.V - 0.5 * p)
    sol = fsolve(eqs, [np.log(c.H), v0], xtol=1e-14, full_output=True)[0]  # judged on the residual
    if np.max(np.abs(eqs(sol))) > 1e-10:
        raise ValueError("the segmented cable did not solve")
    return points(sol)
