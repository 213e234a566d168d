"""Checks of a footing in the soil: ground-line tilt, ground-line motion for doubled bearing,
IBC 2021 embedment depth, the ultimate lateral capacity (pushover,
:mod:`models.checks.lateral_capacity`). The soil reaction against its p-y limit (p/p_u)
is reported in that check's note: the curves cap each reaction at its limit, so the
ratio cannot exceed 1 and is not a check of its own (:func:`soil_limit_ratio`)."""
from __future__ import annotations

import math
from dataclasses import replace

import numpy as np

from spanstay.fem import State
from spanstay.models.checks.check import Check
from spanstay.models.parts.system import System

#: Ground-line tilt limit, rad: 1 degree, a judgement of ours (a post leaning more
#: than this is visibly out of plumb and its footing is yielding).
TILT_LIMIT = math.radians(1.0)
#: Horizontal motion at grade accepted by IBC 2021 §1806.3.4 for doubled lateral bearing.
IBC_DOUBLED_MOTION = 0.5 * 0.0254
#: p/p_u from which the soil at a depth is counted as at its limit (reported in notes)
SOIL_AT_LIMIT = 0.95


def _tilt(state: State, node: int) -> float:
    """Angle between the deformed and the original vertical at ``node``, rad."""
    return float(np.arccos(np.clip(state.rotation[node][2, 2], -1.0, 1.0)))


def _ground_actions(system: System, placed, state: State) -> tuple[float, float, float, float]:
    """Horizontal shear and moment (resultants) just above grade, the largest p/p_u, and
    the embedded length where the soil is at its limit (p/p_u >= SOIL_AT_LIMIT)."""
    from spanstay.models.parts.footing import footing_response

    vx = footing_response(placed, system.model, state, (1.0, 0.0))
    vy = footing_response(placed, system.model, state, (0.0, 1.0))
    # shear just above grade: the member's shear below the grade node plus that node's soil
    # spring (the moment is continuous through it)
    trib0 = float(placed.curves.tributary[placed.spring_node == 0].sum())
    V = float(np.hypot(vx.shear[0] + vx.p[0] * trib0, vy.shear[0] + vy.p[0] * trib0))
    M = float(np.hypot(vx.moment[0], vy.moment[0]))
    trib = np.bincount(placed.spring_node, weights=placed.curves.tributary,
                       minlength=placed.nodes.size)
    at_limit = float(trib[vx.ratio >= SOIL_AT_LIMIT].sum())
    return V, M, max(vx.max_ratio, vy.max_ratio), at_limit


def has_soil_limit(placed) -> bool:
    """True when some p-y curve of the footing has an ultimate resistance (not all linear)."""
    pu = np.asarray(placed.curves.p_ultimate, float)
    return bool(np.any(np.isfinite(pu) & (pu > 0)))


def _ibc_footing(anchor):
    """The footing as IBC Eq. 18-1 sees it: b = diameter, or diagonal of a square (the
    square on the smaller side of a rectangular post, a judgement)."""
    placed = anchor.footing
    fs = anchor.spec.footing
    footing = placed.footing
    if fs.kind == "embedded" and anchor.spec.post.kind != "round":
        return replace(footing, shape="square", width=min(anchor.spec.post.outline))
    return replace(footing, shape="round")


def soil_checks(system: System, anchor, state: State, cache: dict | None = None) -> list[Check]:
    """Soil utilization, ground-line tilt and motion, and IBC embedment of one anchor."""
    from spanstay.models.common.errors import InputError
    from spanstay.models.parts.footing import ibc_check

    spec = anchor.spec
    name = spec.name
    out: list[Check] = []
    if not anchor.groups.get("soil") or spec.kind == "tree":
        return out
    tilt = _tilt(state, anchor.grade_node)
    out.append(Check(f"anchor.{name}.footing.tilt", "footing", name,
                     "tilt of the post at the ground line", tilt, TILT_LIMIT, "angle",
                     source="limit 1 degree: a judgement of ours",
                     note="total tilt from plumb, installed pull included"))
    placed = anchor.footing
    if placed is None:
        return out
    fs = spec.footing
    from spanstay.models.checks.vertical import vertical_checks
    cache = {} if cache is None else cache
    out += vertical_checks(system, anchor, state, cache)
    if fs.kind == "pier":
        from spanstay.models.checks.concrete import pier_checks
        out += pier_checks(system, anchor, state, cache)
    V, M, ratio, _ = _ground_actions(system, placed, state)
    if has_soil_limit(placed) and V > 1.0:
        from spanstay.models.checks.lateral_capacity import lateral_capacity_check
        out.append(lateral_capacity_check(anchor, V, M, ratio,
                                          float(system.scenario.settings.soil_factor_of_safety),
                                          cache))
    if fs.double_lateral_bearing:
        move = float(np.hypot(*state.translation[anchor.grade_node][:2]))
        out.append(Check(f"anchor.{name}.footing.ground_motion", "footing", name,
                         "horizontal motion at grade (condition of doubled lateral bearing)",
                         move, IBC_DOUBLED_MOTION, "length",
                         source="IBC 2021 §1806.3.4 (1/2 inch at the ground surface)"))
    key = ("ibc", name)
    if key not in cache:
        cache[key] = _ibc_footing(anchor)
    if V > 1.0:
        try:
            ibc = ibc_check(cache[key], placed.profile, V, M / V,
                            constrained=fs.slab_at_grade, doubled=fs.double_lateral_bearing)
        except InputError:
            return out  # a layer without its IBC class: see unchecked_parts
        out.append(Check(f"anchor.{name}.footing.embedment", "footing", name,
                         "embedment depth against the code's required depth",
                         ibc.required_depth, ibc.actual_depth, "length",
                         source=ibc.equation + (", doubled bearing (§1806.3.4)" if ibc.doubled
                                                else "") + f", Table 1806.2 class {ibc.ibc_class}",
                         note=f"P = {V:.4g} N (shear at grade) at h = {M / V:.3g} m (moment / "
                              f"shear at grade, equal to the pull's height for one line); "
                              f"b = {_b(cache[key]):.3g} m; S = {ibc.bearing:.4g} Pa"))
    return out


def _b(footing) -> float:
    from spanstay.models.catalogs.ibc_embedment import round_or_square_width
    return float(round_or_square_width(footing.width, footing.shape))


def soil_limit_ratio(system: System, anchor, states) -> tuple[float, float]:
    """Largest p/p_u over ``states`` and the embedded length at the limit there (m)."""
    worst, length = 0.0, 0.0
    for state in states:
        _, _, ratio, at_limit = _ground_actions(system, anchor.footing, state)
        if ratio > worst:
            worst, length = ratio, at_limit
    return worst, length
