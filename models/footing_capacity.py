"""Lateral capacity of footings: Broms (1964) closed forms for short rigid piles.

All SI: loads N, lengths m, unit weights N/m^3, strengths Pa. ``e`` is the
height of the lateral load above grade; ``L`` the embedded length.
"""
from __future__ import annotations

import numpy as np

from models.py_curves import passive_coefficient


def broms_sand_short_free_head(unit_weight, width, embedment, load_height,
                               friction_angle_deg) -> np.ndarray:
    """Broms (1964) short free-head pile in cohesionless soil, ultimate lateral load, N.

    Passive pressure 3 Kp gamma z D over the embedment, the back reaction
    lumped at the toe; moments about the toe give
    H_u = 0.5 gamma D L^3 Kp / (e + L).
    """
    g, D, L, e = (np.asarray(v, float) for v in (unit_weight, width, embedment, load_height))
    return 0.5 * g * D * L**3 * passive_coefficient(friction_angle_deg) / (e + L)


def broms_clay_short_free_head(shear_strength, width, embedment, load_height) -> np.ndarray:
    """Broms (1964) short free-head pile in cohesive soil, ultimate lateral load, N.

    No resistance over the top 1.5 D, then 9 c D. With f = H/(9 c D) to the
    point of zero shear and g the rest of the embedment (L = 1.5 D + f + g),
    H (e + 1.5 D + f/2) = 2.25 c D g^2, whose positive root is
    H_u = 9 c D [sqrt((2 e' + L')^2 + L'^2) - (2 e' + L')], e' = e + 1.5 D,
    L' = L - 1.5 D (zero when L' <= 0).
    """
    c, D, L, e = (np.asarray(v, float) for v in (shear_strength, width, embedment, load_height))
    q = 9.0 * c * D
    ep = e + 1.5 * D
    lp = np.maximum(L - 1.5 * D, 0.0)
    s = 2.0 * ep + lp
    return q * lp * lp / (np.sqrt(s * s + lp * lp) + s)  # same root, no cancellation
