"""The footing's ultimate lateral capacity against the design shear at grade.

The embedded part, on the same p-y curves as the run (static or cyclic per layer), is
pushed by displacement control with the load at the height e = M / V of the design
moment and shear at grade (models.analysis.capacity.pushover) until the load stops
growing or the ground-line rotation reaches 0.1 rad. The soil springs act on the
horizontal displacement vector, so the capacity is the same in every plan direction and
the push along x stands for the direction of the pull. The check is V <= H_u / FoS with
FoS the scenario's ``settings.soil_factor_of_safety`` (default 2.5, our judgement).

A pushover rather than Broms (1964): it uses the layered soil and the curves of the run,
and holds for short and long members alike; Broms' closed forms check it in the tests.
"""
from __future__ import annotations

import math

from spanstay.fem.errors import FemError
from spanstay.models.checks.check import Check

#: height bins of the cached pushovers (m): stations whose e falls in one bin share one,
#: pushed at the bin's top
LOAD_HEIGHT_BIN = 0.05


def lateral_capacity_check(anchor, shear: float, moment: float, p_ratio: float,
                           factor_of_safety: float, cache: dict) -> Check:
    """Design shear at grade against the pushover ultimate / factor of safety."""
    from spanstay.models.analysis.capacity import pushover
    from spanstay.models.parts.footing_case import FootingCase

    placed = anchor.footing
    name = anchor.spec.name
    e = max(moment / shear, 0.0) if shear > 0 else 0.0
    # the bin's upper height: a load applied higher finds less capacity (safe side)
    key = ("lateral capacity", name, math.ceil(e / LOAD_HEIGHT_BIN - 1e-9))
    if key not in cache:
        height = LOAD_HEIGHT_BIN * key[2]
        case = FootingCase(placed.footing, placed.profile, max(shear, 1.0), height,
                           post_section=placed.footing.section)
        try:
            push = pushover(case)
            cache[key] = (push.ultimate, push.limit, height)
        except FemError as exc:
            cache[key] = (0.0, f"no equilibrium even at the first step ({exc})", height)
    ultimate, limit, height = cache[key]
    loading = sorted({lay.loading for lay in placed.profile.layers
                      if lay.top < placed.footing.depth})
    return Check(f"anchor.{name}.footing.lateral_capacity", "footing", name,
                 "design shear at grade against the soil's ultimate lateral load / "
                 f"{factor_of_safety:g}", shear, ultimate / factor_of_safety, "force",
                 source="pushover of the embedded part on the run's p-y curves ("
                        + " and ".join(loading) + "), load at e = M/V; factor of safety "
                        f"{factor_of_safety:g} (settings.soil_factor_of_safety; default 2.5, "
                        "our judgement)",
                 note=f"ultimate lateral load {ultimate:.4g} N at e = {height:.3g} m ({limit}); "
                      f"largest p/p_u in this state {p_ratio:.2f}")
