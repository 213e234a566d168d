"""A basis for the dynamic factor: a rider dropping onto the line, and a bounce, by
energy balance on the loaded line's own force-sag law.

The law ``F(d)`` is the load at the rider's point against its drop below the
unloaded cable there, found by solving the whole structure for a rising load at a
fixed point (the launch station and mid-span). A rider of weight ``W`` falling a
height ``h`` before the line takes the load comes to rest, momentarily, where
``W (h + d) = integral_0^d F(s) ds`` (work-energy theorem, no losses: on the
safe side); the peak line load is ``F(d)`` and the factor ``F(d) / W``. The bounce is
the weight applied suddenly (``h = 0``): a factor 2 on a linear law (the classic
suddenly applied load), more on a stiffening cable (``F = k d^n`` gives ``n + 1``).
No energy is lost in the rider's body, harness or legs, so these are upper bounds.
Between and past the points the law is linear, carried on with its last slope.
"""
from __future__ import annotations

import copy
from dataclasses import dataclass

import numpy as np
from scipy.optimize import brentq

from spanstay.fem import solve
from spanstay.fem.errors import FemError
from spanstay.models.analysis.run_case import Structure
from spanstay.models.analysis.stations import STATION_OPTIONS, place_rider

#: the law's loads, as multiples of the heaviest rider's weight
LOAD_STEPS = (0.02, 0.25, 0.5, 1.0, 1.5, 2.0, 3.0, 4.0)


@dataclass(frozen=True)
class DropFactor:
    """The dynamic factors one point of the line gives (SI)."""

    where: str                 # "launch" | "mid-span"
    along: float               # m, horizontal distance of the point
    weight: float              # N, the heaviest rider
    drop_height: float         # m
    drop_factor: float         # peak load / weight, dropping from drop_height
    bounce_factor: float       # peak load / weight, the weight applied suddenly
    law_force: tuple[float, ...]   # N
    law_drop: tuple[float, ...]    # m


def _work(force: np.ndarray, drop: np.ndarray, d: float) -> float:
    """Work of the piecewise linear law from 0 to ``d`` (carried on past its end)."""
    f = np.concatenate([[0.0], force])
    x = np.concatenate([[0.0], drop])
    if d > x[-1]:
        slope = (f[-1] - f[-2]) / (x[-1] - x[-2])
        x = np.append(x, d)
        f = np.append(f, f[-1] + slope * (d - x[-2]))
    k = int(np.searchsorted(x, d))
    xs = np.append(x[:k], d)
    fs = np.append(f[:k], np.interp(d, x, f))
    return float(np.sum(0.5 * (fs[1:] + fs[:-1]) * np.diff(xs)))


def _force(force: np.ndarray, drop: np.ndarray, d: float) -> float:
    f, x = np.concatenate([[0.0], force]), np.concatenate([[0.0], drop])
    if d <= x[-1]:
        return float(np.interp(d, x, f))
    return float(f[-1] + (f[-1] - f[-2]) / (x[-1] - x[-2]) * (d - x[-1]))


def peak_factor(force, drop, weight: float, height: float) -> float:
    """Peak load over weight for ``weight`` falling ``height`` onto the law
    ``force(drop)`` (points after (0, 0), rising)."""
    force, drop = np.asarray(force, float), np.asarray(drop, float)
    balance = lambda d: _work(force, drop, d) - weight * (height + d)  # noqa: E731
    high = max(float(drop[-1]), 1e-6)
    while balance(high) < 0.0:
        high *= 2.0
        if high > 1e6:
            raise ValueError("the force-sag law never takes the energy")
    d = brentq(balance, 1e-12, high, xtol=1e-14)
    return _force(force, drop, d) / weight


def force_sag_law(structure: Structure, line_name: str, s: float, weight: float
                  ) -> tuple[np.ndarray, np.ndarray, float]:
    """(loads, drops below the lightly loaded cable, along) at arc coordinate ``s``,
    the structure solved for each of :data:`LOAD_STEPS` x ``weight`` in turn."""
    system = copy.deepcopy(structure.system)
    line = system.lines[line_name]
    state = structure.installed
    loads, z = [], []
    along = 0.0
    for step in LOAD_STEPS:
        warm = place_rider(system, line, state, s, step * weight)
        state = solve(system.model, state=warm, steps=2, options=STATION_OPTIONS)
        p = system.model.coords[line.rider_node] + state.translation[line.rider_node]
        loads.append(step * weight)
        z.append(float(p[2]))
        along = float(line.along(p))
    loads, z = np.array(loads), np.array(z)
    # the first, light load marks the unloaded cable; its own small drop is left out
    return loads[1:] - loads[0], z[0] - z[1:], along


def drop_factors(structure: Structure, line_name: str, stations_s: np.ndarray, weight: float,
                 height: float) -> tuple[list[DropFactor], str]:
    """The factors at the launch station and mid-span, and why any is missing."""
    out, why = [], ""
    for where, s in (("launch", float(stations_s[0])),
                     ("mid-span", float(stations_s[len(stations_s) // 2]))):
        try:
            force, drop, along = force_sag_law(structure, line_name, s, weight)
        except FemError as exc:
            why = f"no equilibrium for the force-sag law at the {where}: {str(exc)[:200]}"
            continue
        out.append(DropFactor(where, along, weight, height,
                              peak_factor(force, drop, weight, height),
                              peak_factor(force, drop, weight, 0.0),
                              tuple(map(float, force)), tuple(map(float, drop))))
    return out, why
