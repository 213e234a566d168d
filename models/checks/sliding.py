"""Sliding of a kicker's foot block on the soil.

Resistance (allowable, IBC 2021 §1806.3.1 lets lateral bearing and sliding combine,
from memory): base friction, the user's ``block_friction`` x the strut's downward push,
or the IBC Table 1806.2 presumptive sliding resistance of the top soil class
(coefficient x dead load; class 5 cohesion 130 psf x area, at most half the dead load),
plus the passive resistance of a block set ``block_depth`` into the ground: the Table
1806.2 lateral bearing (psf per foot of depth) over the embedded face of width
``block_width``, 0.5 S d^2 b. The block's own weight is left out (on the safe side).
Check: horizontal push <= resistance / ``settings.sliding_factor_of_safety`` (default
1.5, common practice for sliding).
"""
from __future__ import annotations

import math

from spanstay.models.catalogs.ibc_embedment import (IBC_LATERAL_BEARING_PSF_PER_FT, PSF_PER_FT,
                                                    ibc_class_key)
from spanstay.models.catalogs.ibc_soil_table import SOURCE, sliding_resistance


def block_sliding(horizontal: float, down: float, area: float, width: float, depth: float,
                  soil_class: str | None, friction: float | None,
                  factor_of_safety: float) -> tuple[float, float, str]:
    """(demand N, allowable resistance N, note) of a block pushed sideways."""
    key = ibc_class_key(soil_class) if soil_class is not None else "clay"
    if friction is not None:
        base, how = friction * max(down, 0.0), f"friction {friction:g} (user) x {down:.4g} N"
    else:
        base = sliding_resistance(key, down, area)
        how = f"{SOURCE} sliding resistance, class {key}, under {down:.4g} N"
    passive = 0.5 * IBC_LATERAL_BEARING_PSF_PER_FT[key] * PSF_PER_FT * depth**2 * width
    note = (f"{how}: {base:.4g} N; passive on {depth:.3g} m of embedded face {passive:.4g} N; "
            f"factor of safety {factor_of_safety:g} (settings.sliding_factor_of_safety)")
    if soil_class is None:
        note += "; no IBC class for the top layer: the lowest (clay) used"
    return max(horizontal, 0.0), (base + passive) / factor_of_safety, note


def resultant(reactions) -> tuple[float, float]:
    """Horizontal size and downward push of a block's support reaction (N)."""
    return float(math.hypot(reactions[0], reactions[1])), float(reactions[2])
