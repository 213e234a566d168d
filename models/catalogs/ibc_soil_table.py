"""IBC Table 1806.2 presumptive load-bearing values per class of material.

Values (psf, and the sliding coefficient) as printed in IBC 2012 Table 1806.2 (checked
against a reproduction of that table); the 2018 and 2021 editions carry the same
numbers (from memory). Class keys are those of ``models.catalogs.ibc_embedment``.

- Vertical foundation pressure, psf (allowable).
- Lateral sliding resistance: a coefficient of friction multiplied by the dead load
  (classes 1 to 4), or a cohesion in psf multiplied by the contact area (class 5),
  the latter not more than one half of the dead load (§1806.3.2).
The lateral bearing pressure (psf per foot of depth) is
``ibc_embedment.IBC_LATERAL_BEARING_PSF_PER_FT``.
"""
from __future__ import annotations

from spanstay.models.catalogs.ibc_embedment import PSF, ibc_class_key

SOURCE = "IBC Table 1806.2 (2012; 2018 and 2021 the same, from memory)"

#: vertical foundation pressure, psf
VERTICAL_BEARING_PSF = {
    "crystalline_bedrock": 12000.0,
    "sedimentary_rock": 4000.0,
    "gravel": 3000.0,
    "sand": 2000.0,
    "clay": 1500.0,
}
#: lateral sliding resistance, coefficient of friction (times the dead load)
SLIDING_FRICTION = {
    "crystalline_bedrock": 0.70,
    "sedimentary_rock": 0.35,
    "gravel": 0.35,
    "sand": 0.25,
}
#: lateral sliding resistance, cohesion, psf (times the contact area), class 5 only
SLIDING_COHESION_PSF = {"clay": 130.0}
#: §1806.3.2: cohesion-based sliding resistance not over this fraction of the dead load
COHESION_LIMIT_OF_DEAD_LOAD = 0.5


def vertical_bearing(ibc_class: str) -> float:
    """Presumptive allowable vertical foundation pressure, Pa."""
    return VERTICAL_BEARING_PSF[ibc_class_key(ibc_class)] * PSF


def sliding_resistance(ibc_class: str, dead_load: float, area: float) -> float:
    """Presumptive allowable sliding resistance of a base on the class, N.

    Friction classes: coefficient x dead load; class 5 (clay): 130 psf x area, not over
    one half of the dead load (§1806.3.2). Nothing under no dead load.
    """
    key = ibc_class_key(ibc_class)
    w = max(float(dead_load), 0.0)
    if key in SLIDING_FRICTION:
        return SLIDING_FRICTION[key] * w
    return min(SLIDING_COHESION_PSF[key] * PSF * area, COHESION_LIMIT_OF_DEAD_LOAD * w)
