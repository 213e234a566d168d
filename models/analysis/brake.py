"""The stop at the end of the ride: peak stop force, stroke and deceleration by energy
balance on the brake's force-stroke law.

The rider of mass ``m`` arrives at speed ``v``; the brake's law ``F(x)`` takes the
kinetic energy over its stroke, ``m v^2 / 2 = integral_0^x F(s) ds`` (work-energy
theorem), which gives the stroke used ``x`` and the peak force ``F(x)`` for a law
that does not fall. The rider's deceleration at the peak is ``F(x) / m``. Gravity
along the last metre and rolling resistance are left out (they would only help),
so the force is on the safe side. A stroke too short for the energy "bottoms out":
the law is carried on past the stroke with its last slope to show the stroke that
was needed, and the force the block would then reach is a lower bound (a hard
stop takes the rest).

A maker's rated brake is taken at its rated peak force; the stroke it needs at
that force (``E / F_peak``) is the least it could use.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from scipy.optimize import brentq

from spanstay.models.scenario.spec import BrakeSpec


@dataclass(frozen=True)
class StopResult:
    """One rider stopped by one brake (SI)."""

    rider: str                 # "lightest" | "heaviest"
    mass: float                # kg
    speed: float               # m/s on arrival
    energy: float              # J, m v^2 / 2
    stroke_used: float         # m (needed, when it bottoms out)
    stroke_available: float    # m
    peak_force: float          # N, along the line
    deceleration: float        # m/s^2, peak force / mass
    bottoms_out: bool          # the stroke is too short for the energy
    law: str                   # the force-stroke law in words

    def to_dict(self) -> dict:
        from dataclasses import asdict
        return asdict(self)


def law_points(brake: BrakeSpec) -> np.ndarray:
    """A curve law's (stroke, force) points from (0, 0)."""
    pts = np.asarray(brake.curve, float)
    if pts.shape[0] < 2:
        raise ValueError("a force-stroke curve needs at least one point after (0, 0)")
    return pts


def law_force(brake: BrakeSpec, x: float) -> float:
    """The stop force at stroke ``x`` (the last segment carried on past the curve)."""
    if brake.stiffness is not None:
        return float(brake.stiffness * x)
    pts = law_points(brake)
    if x <= pts[-1, 0]:
        return float(np.interp(x, pts[:, 0], pts[:, 1]))
    slope = (pts[-1, 1] - pts[-2, 1]) / (pts[-1, 0] - pts[-2, 0])
    return float(pts[-1, 1] + slope * (x - pts[-1, 0]))


def law_energy(brake: BrakeSpec, x: float) -> float:
    """The work the law takes over strokes 0 to ``x``: exact for a linear spring
    (k x^2 / 2) and for a piecewise linear curve (trapezoids)."""
    if brake.stiffness is not None:
        return 0.5 * float(brake.stiffness) * x * x
    pts = law_points(brake)
    xs, fs = pts[:, 0], pts[:, 1]
    k = int(np.count_nonzero(xs < x)) - 1 if x > 0 else 0   # last point before x
    work = float(np.sum(0.5 * (fs[1:k + 1] + fs[:k]) * np.diff(xs[:k + 1])))
    return work + 0.5 * (fs[k] + law_force(brake, x)) * (x - xs[k])


def law_words(brake: BrakeSpec) -> str:
    """The law as a phrase for the output."""
    if brake.kind == "rated":
        return "the maker's rated peak force"
    if brake.stiffness is not None:
        return f"linear, {brake.stiffness:.4g} N/m over {brake.stroke:.3g} m"
    return f"the given curve of {len(brake.curve) - 1} points over {brake.stroke:.3g} m"


def stop(brake: BrakeSpec, mass: float, speed: float, rider: str = "heaviest") -> StopResult | None:
    """The stop of a rider of ``mass`` arriving at ``speed`` (None: no stop force,
    for no brake or a gravity end)."""
    if brake.kind in ("none", "gravity"):
        return None
    energy = 0.5 * mass * speed * speed
    stroke = float(brake.stroke)
    if brake.kind == "rated":
        force = float(brake.peak_force)
        used = energy / force
        return StopResult(rider, mass, speed, energy, used, stroke, force, force / mass,
                          bool(used > stroke), law_words(brake))
    capacity = law_energy(brake, stroke)
    if energy <= 0.0:
        used = 0.0
    elif energy <= capacity:
        used = brentq(lambda x: law_energy(brake, x) - energy, 0.0, stroke, xtol=1e-12)
    else:  # bottoms out: the stroke the law carried on would have needed
        high = 2.0 * stroke
        while law_energy(brake, high) < energy:
            high *= 2.0
        used = brentq(lambda x: law_energy(brake, x) - energy, stroke, high, xtol=1e-12)
    force = law_force(brake, used)
    return StopResult(rider, mass, speed, energy, float(used), stroke, force, force / mass,
                      bool(energy > capacity), law_words(brake))
