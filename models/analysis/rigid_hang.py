"""The loaded hang of an inextensible cable between rigid supports, solved exactly.

A cable of unstressed length L and weight w per length hangs between two fixed points
(horizontal span a, rise h from the first to the second) and carries a point load W at
arc length s from the first. With the horizontal tension H and the vertical component
V(p) of the tension at arc length p (V = V_0 + w p, and W more past the load), the
cable's shape is the pair of catenaries x(p) = (H / w) asinh(V / H) and
z(p) = (1 / w) sqrt(H^2 + V^2), each measured from p = 0 (Irvine, Cable Structures,
1981, §1.2, from memory). The two end conditions x(L) = a and z(L) = h fix H and V_0;
they are solved with scipy.optimize.root from the parabolic estimate.

This is the "geometry" row of the slack budget: no part of the system gives, the cable
does not stretch; what the parts add is measured from it.
"""
from __future__ import annotations

import math

import numpy as np
from scipy.optimize import root


def _ends(H: float, v0: float, w: float, L: float, s: float, W: float) -> tuple[float, ...]:
    def piece(va: float, vb: float) -> tuple[float, float]:
        return (H / w * (math.asinh(vb / H) - math.asinh(va / H)),
                (math.hypot(H, vb) - math.hypot(H, va)) / w)

    x1, z1 = piece(v0, v0 + w * s)
    x2, z2 = piece(v0 + w * s + W, v0 + w * L + W)
    return x1, z1, x1 + x2, z1 + z2


def rigid_hang(span: float, rise: float, length: float, weight: float, s: float,
               load: float) -> tuple[float, float]:
    """(horizontal distance, sag below the chord) of the load point, m.

    Raises ValueError when the cable is not longer than the chord or no hang is found.
    """
    chord = math.hypot(span, rise)
    if length <= chord * (1 + 1e-12):
        raise ValueError(f"an inextensible cable of {length:.4g} m cannot hang over a "
                         f"{chord:.4g} m chord")
    w = max(float(weight), 1e-6 * max(load, 1.0) / length)  # round-off: H / w stays moderate
    total = w * length + load
    # parabolic estimate: sag d of an equivalent uniform load from the length excess
    d = math.sqrt(max(3.0 * span * (length - chord) / 8.0, 1e-12))
    h0 = total * span / (8.0 * d)

    def resid(u):
        H = math.exp(u[0])
        _, _, x, z = _ends(H, u[1] * total, w, length, s, load)
        return [x / span - 1.0, (z - rise) / span]

    guess = [math.log(h0), (h0 * rise / span - 0.5 * total) / total]
    sol = root(resid, guess, method="hybr", options={"xtol": 1e-13})
    if max(abs(r) for r in resid(sol.x)) > 1e-9:
        raise ValueError(f"no inextensible hang found ({sol.message})")
    H = math.exp(sol.x[0])
    x1, z1, _, _ = _ends(H, sol.x[1] * total, w, length, s, load)
    return x1, rise * x1 / span - z1
