"""Vertical checks of a footing: end bearing and uplift.

A stated simple model: the toe is held vertically in the model (settlement is not
modelled), and the vertical reaction found there is checked afterwards.

- Bearing: toe reaction + weight of the pier + weight of the post against the IBC
  Table 1806.2 presumptive vertical pressure of the layer at the toe x the base area,
  plus the side friction below / ``settings.uplift_factor_of_safety`` (the same
  friction and factor as for uplift). The post's weight uses
  800 kg/m^3 (wet treated timber, an upper value from memory); a pier's, normalweight
  concrete 23.6 kN/m^3 (150 pcf, common practice).
- Uplift: the pull out of the ground (downward toe reaction) against the pier's weight
  plus side friction / ``settings.uplift_factor_of_safety`` (default 2, our judgement).
  The post's own weight is left out (on the safe side). Side friction over the
  embedded length below 1.5 widths (the soil near grade is pushed away by the lateral
  load: our judgement): sand f = K0 sigma'_v tan(delta), K0 = 1 - sin(phi) (Jaky),
  delta = phi for concrete cast against soil and 2/3 phi for a post in backfill
  (common practice, from memory); clay f = alpha c_u with API RP 2A
  alpha = 0.5 psi^-0.5 (psi <= 1), 0.5 psi^-0.25 (psi > 1), alpha <= 1, psi = c_u / sigma'_v
  (from memory).
"""
from __future__ import annotations

import math

import numpy as np

from spanstay.fem import State
from spanstay.models.checks.check import Check

CONCRETE_UNIT_WEIGHT = 23.6e3  # N/m^3, 150 pcf normalweight concrete (common practice)
TIMBER_DENSITY_UPPER = 800.0   # kg/m^3, wet treated timber, an upper value (from memory)
G = 9.80665
#: side friction is not counted over this many widths below grade (our judgement)
FRICTION_FREE_WIDTHS = 1.5


def side_friction(profile, depth: float, width: float, perimeter: float, cast: bool,
                  points: int = 400) -> float:
    """Ultimate side friction of an embedded length (N), see the module docstring."""
    top = min(FRICTION_FREE_WIDTHS * width, depth)
    if depth - top <= 0:
        return 0.0
    z = np.linspace(top, depth, points)
    zm = 0.5 * (z[1:] + z[:-1])
    sv = profile.vertical_effective_stress(zm)
    phi = profile.layer_values("friction_angle_deg", zm)
    cu = profile.layer_values("undrained_shear_strength", zm)
    kinds = profile.kinds_at(zm)
    f = np.zeros_like(zm)
    use_clay = np.isfinite(cu) & ((kinds == "clay") | ~np.isfinite(phi))
    use_sand = np.isfinite(phi) & ~use_clay
    ph = np.radians(np.where(use_sand, phi, 0.0))
    delta = ph if cast else 2.0 / 3.0 * ph
    f = np.where(use_sand, (1.0 - np.sin(ph)) * sv * np.tan(delta), f)
    psi = np.where(use_clay, cu, 1.0) / np.maximum(sv, 1.0)
    alpha = np.minimum(np.where(psi <= 1.0, 0.5 * psi**-0.5, 0.5 * psi**-0.25), 1.0)
    f = np.where(use_clay, alpha * np.where(use_clay, cu, 0.0), f)
    return float(perimeter * np.sum(f * np.diff(z)))


def _geometry(anchor) -> tuple[float, float, float, bool]:
    """Base area (m^2), perimeter (m), width (m) and whether the footing is cast concrete."""
    fs = anchor.spec.footing
    post = anchor.spec.post
    if fs.kind == "pier":
        d = fs.pier_diameter
        return math.pi * d * d / 4.0, math.pi * d, d, True
    if post.kind == "round":
        d = post.base_diameter
        return math.pi * d * d / 4.0, math.pi * d, d, False
    a, b = post.outline
    return a * b, 2.0 * (a + b), min(a, b), False


def _post_weight(anchor) -> float:
    """Weight of the post above and below grade at the upper timber density, N."""
    post = anchor.spec.post
    length = post.height + (anchor.spec.footing.depth if anchor.spec.footing.kind != "pier"
                            else 0.0)
    if post.kind == "round":
        d = 0.5 * (post.top_diameter + post.base_diameter)
        area = math.pi * d * d / 4.0
    else:
        a, b = post.outline
        area = a * b
    return TIMBER_DENSITY_UPPER * G * area * length


def vertical_checks(system, anchor, state: State, cache: dict) -> list[Check]:
    """End bearing and uplift of the footing of one anchor in one state."""
    from spanstay.models.catalogs.ibc_soil_table import SOURCE, vertical_bearing

    placed = anchor.footing
    spec = anchor.spec
    name = spec.name
    key = ("vertical", name)
    if key not in cache:
        area, perimeter, width, cast = _geometry(anchor)
        depth = placed.footing.depth
        pier = (CONCRETE_UNIT_WEIGHT * area * depth) if spec.footing.kind == "pier" else 0.0
        friction = side_friction(placed.profile, depth, width, perimeter, cast)
        toe_layer = placed.profile.layers[int(placed.profile.layer_at(depth))]
        cache[key] = (area, pier, _post_weight(anchor), friction, toe_layer.ibc_class)
    area, pier, post_w, friction, ibc = cache[key]
    fos = float(system.scenario.settings.uplift_factor_of_safety)
    r = float(state.reactions[placed.toe_node, 2])  # upward on the footing: it bears
    out = []
    if ibc is not None:
        load = max(r + pier + post_w, 0.0)
        q = vertical_bearing(ibc)
        out.append(Check(f"anchor.{name}.footing.end_bearing", "footing", name,
                         "load down the footing against presumptive end bearing x base area + "
                         f"side friction / {fos:g}", load, q * area + friction / fos,
                         "force",
                         source=f"{SOURCE}, class {ibc} at the toe; side friction as for "
                                f"uplift, factor of safety {fos:g} "
                                "(settings.uplift_factor_of_safety)",
                         note=f"toe reaction {r:.4g} N + pier {pier:.4g} N + post {post_w:.4g} N; "
                              f"end bearing {q * area:.4g} N on {area:.4g} m^2 "
                              f"(pressure {load / area:.4g} Pa if the toe carried it all), side "
                              f"friction {friction:.4g} N"))
    pull = max(-r, 0.0)
    out.append(Check(f"anchor.{name}.footing.uplift", "footing", name,
                     "pull out of the ground against the pier's weight + side friction / "
                     f"{fos:g}", pull, pier + friction / fos, "force",
                     source="own weight + side friction (K0 tan delta sigma'_v in sand, API "
                            "alpha c_u in clay, from memory); factor of safety "
                            f"{fos:g} on friction (settings.uplift_factor_of_safety; default 2, "
                            "our judgement)",
                     note=f"toe reaction {r:.4g} N; pier weight {pier:.4g} N; ultimate side "
                          f"friction {friction:.4g} N",
                     ))
    return out
