"""Lateral capacity of footings: pushover, the service-load analysis, Broms (1964).

- ``pushover(case)`` / ``pushover_model(model, node, placed, ...)``: push a
  footing's load point (or a node above a footing placed in any model)
  sideways by displacement control until the load stops growing (plateau),
  equilibrium is lost, or the ground-line rotation passes its limit; gives
  the load-displacement curve and the ultimate lateral load.
- ``analyse_footing(case)``: the footing under its service load; a load it
  cannot carry is reported as "capacity exceeded" with the load reached
  (from the pushover), not raised.
- Broms (1964) closed forms for short free-head piles, for comparison.

All SI: loads N, lengths m, unit weights N/m^3, strengths Pa. ``e`` is the
height of the lateral load above grade; ``L`` the embedded length.
"""
from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from spanstay.fem import Model, SolverOptions, State, solve
from spanstay.fem.errors import FemError
from spanstay.models.parts.footing import FootingResponse, PlacedFooting, footing_response
from spanstay.models.parts.footing_case import FootingCase, build_case_model
from spanstay.models.parts.py_curves import passive_coefficient

CAPACITY_EXCEEDED = "capacity exceeded"
_QUICK = SolverOptions(max_iterations=10, min_increment=0.05)  # give up early, then push
ROTATION_LIMIT = 0.1  # rad, ground-line rotation taken as failure of the soil (about 6 deg)


@dataclass
class PushoverResult:
    """Load-displacement curve of a footing pushed to its limit.

    Attributes
    ----------
    displacement
        Lateral displacement of the load point at each point of the curve, m.
    load
        Lateral load at each point, N.
    ground_displacement, ground_rotation
        Ground-line displacement (m) and rotation (rad) at each point.
    ultimate
        Largest load carried, N (at the rotation limit if that comes first).
    limit
        Why the push stopped: "plateau", "rotation limit", "no equilibrium"
        or "displacement limit".
    service_load
        The case's service load, N; ``ratio`` = ultimate / service_load.
    response
        Footing response at the highest load within the limits (point ``best``).
    states
        Engine state at each point (``None`` at an unloaded start).
    """

    displacement: np.ndarray
    load: np.ndarray
    ground_displacement: np.ndarray
    ground_rotation: np.ndarray
    ultimate: float
    limit: str
    service_load: float
    response: FootingResponse
    states: list = field(repr=False, default_factory=list)
    best: int = -1

    @property
    def state(self) -> State:
        """Engine state at the point of ``response`` (highest load within the limits)."""
        return self.states[self.best]

    @property
    def ratio(self) -> float:
        """Ultimate over service load (inf for zero service load)."""
        return self.ultimate / self.service_load if self.service_load > 0 else float("inf")


def rigid_limit_load(depth: np.ndarray, p_limit: np.ndarray, load_height: float) -> float:
    """Lateral load at which a rigid member mobilises ``p_limit`` on both faces, N.

    The front face resists above the point of rotation z_r and the back face
    below it; z_r follows from moment equilibrium about the load. With
    ``p_limit`` the largest resistance of each curve this bounds the pushover
    result from above (a flexible member mobilises less within the rotation
    limit).

    Parameters
    ----------
    depth, p_limit
        Depths (m, increasing) and limit resistance per length (N/m) there.
    load_height
        Height of the load above grade, m.
    """
    z = np.linspace(depth[0], depth[-1], 2001)
    p = np.interp(z, depth, p_limit)
    dz = np.diff(z)
    f = np.concatenate([[0.0], np.cumsum(0.5 * (p[1:] + p[:-1]) * dz)])        # force above z
    pz = p * z
    mz = np.concatenate([[0.0], np.cumsum(0.5 * (pz[1:] + pz[:-1]) * dz)])      # its moment
    H = f - (f[-1] - f)
    resid = H * load_height + mz - (mz[-1] - mz)  # moments about grade, candidates z_r = z
    i = np.flatnonzero((resid[:-1] < 0) & (resid[1:] >= 0))
    if i.size == 0:
        return float(max(H[-1], 0.0))
    k = i[0]
    w = -resid[k] / (resid[k + 1] - resid[k])
    return float(H[k] + w * (H[k + 1] - H[k]))


def pushover(case: FootingCase, rotation_limit: float = ROTATION_LIMIT, points: int = 24,
             plateau: float = 0.005) -> PushoverResult:
    """Push a footing's load point in +x by displacement control to its limit.

    The load point goes out to ``rotation_limit * (e + L)`` at most; see
    ``pushover_model`` for the steps and the stopping rules.
    """
    m, placed, node = build_case_model(case)
    u_max = rotation_limit * (case.load_height + case.footing.depth)
    return pushover_model(m, node, placed, u_max, "ux", rotation_limit=rotation_limit,
                          points=points, plateau=plateau, service_load=case.load)


def pushover_model(model: Model, node: int, placed: PlacedFooting, u_max: float,
                   dof: str = "ux", state: State | None = None,
                   rotation_limit: float = ROTATION_LIMIT, points: int = 24,
                   plateau: float = 0.005, service_load: float = 0.0) -> PushoverResult:
    """Push ``node`` of any model along ``dof`` ("ux" or "uy") and watch one footing.

    The node's displacement is prescribed (on top of ``state``, e.g. an
    installed state) in steps growing geometrically from ``u_max``/500 to
    ``u_max``; the load is the reaction there. A step that finds no
    equilibrium is halved up to four times. The push stops when the load
    grows by less than ``plateau`` (relative) over a step while the tangent
    has dropped below 1 % of the initial one ("plateau"), when the footing's
    ground-line rotation passes ``rotation_limit`` ("rotation limit": the load
    there is interpolated), when no equilibrium is found ("no equilibrium"),
    or at ``u_max`` ("displacement limit"). The model keeps the prescribed
    displacement afterwards.
    """
    k = {"ux": 0, "uy": 1}[dof]
    direction = (1.0, 0.0) if k == 0 else (0.0, 1.0)
    u0 = 0.0 if state is None else float(state.translation[node, k])
    targets = list(u0 + u_max * np.geomspace(2e-3, 1.0, points))
    us, loads, ug, rg, states = [u0], [0.0], [0.0], [0.0], [state]
    if state is not None:
        first = footing_response(placed, model, state, direction)
        loads[0], ug[0], rg[0] = (float(state.reactions[node, k]), first.ground_displacement,
                                  first.ground_rotation)
    limit, halvings = "displacement limit", 0
    while targets:
        u = targets[0]
        model.prescribe(node, dof, u)
        try:
            trial = solve(model, state=state, factor=1.0, steps=1)
        except FemError:
            if halvings >= 4:
                limit = "no equilibrium"
                break
            halvings += 1
            targets.insert(0, 0.5 * (us[-1] + u))
            continue
        halvings = 0
        targets.pop(0)
        state = trial
        resp = footing_response(placed, model, state, direction)
        us.append(u)
        loads.append(float(state.reactions[node, k]))
        ug.append(resp.ground_displacement)
        rg.append(resp.ground_rotation)
        states.append(state)
        if abs(rg[-1]) > rotation_limit:
            limit = "rotation limit"
            break
        k0 = (loads[1] - loads[0]) / (us[1] - us[0])
        slope = (loads[-1] - loads[-2]) / (us[-1] - us[-2])
        if len(loads) > 3 and slope < 0.01 * k0 and loads[-1] - loads[-2] < plateau * loads[-1]:
            limit = "plateau"
            break
    us, loads, ug, rg = (np.array(v) for v in (us, loads, ug, rg))
    within = len(loads) - 1 if limit == "rotation limit" else len(loads)
    best = int(np.argmax(loads[:within]))
    ultimate = float(loads[best])
    if limit == "rotation limit":  # interpolate the load where the rotation reaches the limit
        r0, r1 = abs(rg[-2]), abs(rg[-1])
        w = (rotation_limit - r0) / (r1 - r0)
        ultimate = max(ultimate, float(loads[-2] + w * (loads[-1] - loads[-2])))
    if states[best] is None:
        raise FemError("pushover: no equilibrium even at the first, smallest displacement")
    return PushoverResult(us, loads, ug, rg, ultimate, limit, service_load,
                          footing_response(placed, model, states[best], direction), states, best)


@dataclass
class FootingResult:
    """Outcome of ``analyse_footing``.

    ``status`` is "ok" or "capacity exceeded"; ``load_reached`` is the full
    load when ok, else the ultimate load from the pushover (with its curve in
    ``pushover``). ``response`` is the footing response at ``load_reached``.
    """

    status: str
    load: float
    load_reached: float
    response: FootingResponse
    state: State = field(repr=False)
    pushover: PushoverResult | None = None


def analyse_footing(case: FootingCase, load: float | None = None, steps: int = 4,
                    rotation_limit: float = ROTATION_LIMIT) -> FootingResult:
    """Solve one footing under lateral load H (default the case's service load).

    Equilibrium with a ground-line rotation within ``rotation_limit`` gives
    status "ok". Otherwise the footing is pushed to its limit and the result
    says "capacity exceeded" with the load reached; nothing is raised for a
    footing that is too weak (engine errors about a bad model still are).
    """
    H = case.load if load is None else float(load)
    m, placed, node = build_case_model(case)
    m.add_load(node, [H, 0.0, 0.0, 0.0, 0.0, 0.0])
    c = placed.curves
    bound = np.inf
    if case.one_sided == 0 and not case.footing.base_shear_stiffness \
            and not case.footing.base_moment_stiffness and np.all(np.isfinite(c.p_ultimate)):
        p_lim = np.bincount(placed.spring_node, weights=c.p_ultimate * c.tributary) \
            / np.bincount(placed.spring_node, weights=c.tributary)
        bound = rigid_limit_load(placed.depths, p_lim, case.load_height)
    if H <= bound:  # above the rigid-member bound no equilibrium can exist: skip to the push
        try:
            state = solve(m, factor=1.0, steps=steps, options=_QUICK)
            resp = footing_response(placed, m, state)
            if abs(resp.ground_rotation) <= rotation_limit:
                return FootingResult("ok", H, H, resp, state)
        except FemError:  # no equilibrium (or a singular tangent on the way): find the limit
            pass
    push = pushover(case, rotation_limit=rotation_limit)
    if push.ultimate >= H:  # load control lost its way but the footing does carry H
        i = int(np.argmax(push.load >= H))
        try:
            state = solve(m, state=push.states[i], factor=1.0, steps=1)
            return FootingResult("ok", H, H, footing_response(placed, m, state), state, push)
        except FemError:
            pass
    return FootingResult(CAPACITY_EXCEEDED, H, min(push.ultimate, H), push.response, push.state,
                         push)


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
