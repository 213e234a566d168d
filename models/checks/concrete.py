"""Flexure and shear of a round concrete pier (ACI 318-19), with the user's reinforcement.

Demand: the largest bending moment and shear along the pier in the run's states (the
resultant of both plan directions) times ``settings.concrete_load_factor`` (default
1.6, the live-load factor of ASCE 7 strength combinations: the line's pull is taken as
live load). All formulas from memory; psi units inside the code's equations.

- Plain concrete (ACI 318-19 Chapter 14): for a member cast against soil the overall
  size is taken 2 in less (§14.5.1.7); M_n = 5 lambda sqrt(f'c) S_m (§14.5.2.1,
  tension governing), V_n = (4/3) lambda sqrt(f'c) b_w h (§14.5.5.1) with b_w h taken
  as the reduced circle's area (our judgement for a round section); phi = 0.60
  (Table 21.2.1). Over capacity: "plain concrete pier over capacity: reinforce".
- Reinforced (Chapter 22): §22.2 strain compatibility, eps_cu = 0.003, the 0.85 f'c
  block over beta1 c (§22.2.2.4.3), bars elastic-plastic at f_y, no axial load (on the
  safe side for a pier in compression); phi from Table 21.2.2 by the extreme bar's
  strain (0.65 to 0.90). Shear: V_c = 8 lambda_s (rho_w)^(1/3) sqrt(f'c) b_w d, at most
  5 sqrt(f'c) b_w d (Table 22.5.5.1(c), members without stirrups), b_w = D and
  d = 0.8 D for a round section (§22.5.2.2), phi = 0.75.
"""
from __future__ import annotations

import math

import numpy as np

from spanstay.models.checks.check import Check

PSI = 6894.757
IN = 0.0254
LBF = 4.4482216152605
EPS_CU = 0.003
PHI_PLAIN = 0.60
PHI_SHEAR = 0.75
PLAIN_CAST_AGAINST_SOIL = 2 * IN  # §14.5.1.7


def beta1(fc: float) -> float:
    """ACI 318-19 Table 22.2.2.4.3: 0.85 to 4000 psi, less 0.05 per 1000 psi, >= 0.65."""
    f = fc / PSI
    return float(min(0.85, max(0.65, 0.85 - 0.05 * (f - 4000.0) / 1000.0)))


def plain_strength(diameter: float, fc: float) -> tuple[float, float]:
    """(phi M_n N m, phi V_n N) of a plain round pier cast against soil."""
    h = diameter - PLAIN_CAST_AGAINST_SOIL
    sm = math.pi * h**3 / 32.0
    root = math.sqrt(fc / PSI) * PSI  # sqrt(f'c) in psi, as a stress in Pa
    mn = 5.0 * root * sm
    vn = 4.0 / 3.0 * root * math.pi * h * h / 4.0
    return PHI_PLAIN * mn, PHI_PLAIN * vn


def _segment(r: float, a: float) -> tuple[float, float]:
    """Area of a circular segment of depth a and the distance of its centroid from the
    circle's centre."""
    a = min(max(a, 0.0), 2.0 * r)
    if a <= 0.0:
        return 0.0, 0.0
    half = math.sqrt(max(2.0 * r * a - a * a, 0.0))
    area = r * r * math.acos((r - a) / r) - (r - a) * half
    if area <= 0.0:
        return 0.0, 0.0
    return area, 2.0 * half**3 / (3.0 * area)


def reinforced_flexure(diameter: float, fc: float, bars: int, bar_area: float,
                       bar_circle: float, fy: float, es: float = 200e9
                       ) -> tuple[float, float, float]:
    """(phi M_n N m, M_n, phi) of a round section, pure bending (ACI 318-19 §22.2)."""
    r = diameter / 2.0
    angles = 2.0 * math.pi * np.arange(bars) / bars
    depth = r - bar_circle * np.cos(angles)  # from the compression face
    b1 = beta1(fc)

    def forces(c: float):
        strain = EPS_CU * (c - depth) / c
        stress = np.clip(es * strain, -fy, fy)
        a = b1 * c
        area, ybar = _segment(r, a)
        in_block = depth < a
        steel = bar_area * (stress - np.where(in_block, 0.85 * fc, 0.0))
        return 0.85 * fc * area, ybar, steel, strain

    def net(c: float) -> float:
        cc, _, steel, _ = forces(c)
        return cc + float(steel.sum())

    lo, hi = 1e-6 * diameter, diameter
    for _ in range(100):  # net(c) rises with c: bisection on the neutral axis
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if net(mid) < 0 else (lo, mid)
    c = 0.5 * (lo + hi)
    cc, ybar, steel, strain = forces(c)
    mn = cc * ybar + float(np.sum(steel * (r - depth)))
    eps_t = -float(strain.min())
    ey = fy / es
    phi = 0.65 + 0.25 * (eps_t - ey) / 0.003
    return min(max(phi, 0.65), 0.90) * mn, mn, min(max(phi, 0.65), 0.90)


def reinforced_shear(diameter: float, fc: float, steel_area: float) -> float:
    """phi V_c of a round section without stirrups (Table 22.5.5.1(c)), N."""
    bw, d = diameter, 0.8 * diameter
    rho = min(steel_area / (bw * d), 1.0)
    size = min(math.sqrt(2.0 / (1.0 + d / IN / 10.0)), 1.0)
    root = math.sqrt(fc / PSI) * PSI
    vc = min(8.0 * size * rho ** (1.0 / 3.0) * root * bw * d, 5.0 * root * bw * d)
    return PHI_SHEAR * vc


def pier_actions(system, anchor, state) -> tuple[float, float]:
    """Largest bending moment (N m) and shear (N) along the pier, both plan directions."""
    from spanstay.models.parts.footing import footing_response

    placed = anchor.footing
    vx = footing_response(placed, system.model, state, (1.0, 0.0))
    vy = footing_response(placed, system.model, state, (0.0, 1.0))
    return (float(np.max(np.hypot(vx.moment, vy.moment))),
            float(np.max(np.hypot(vx.shear, vy.shear))))


def pier_checks(system, anchor, state, cache: dict) -> list[Check]:
    """Flexure and shear of a concrete pier in one state."""
    fs = anchor.spec.footing
    name = anchor.spec.name
    factor = float(getattr(system.scenario.settings, "concrete_load_factor", 1.6))
    key = ("pier strength", name)
    if key not in cache:
        d, fc, bars = fs.pier_diameter, fs.concrete_strength, fs.reinforcement
        if bars is None:
            phi_m, phi_v = plain_strength(d, fc)
            how = (f"plain concrete, ACI 318-19 Chapter 14 (§14.5.2.1, §14.5.5.1, h = D - 2 in "
                   f"cast against soil, phi 0.60; from memory); f'c {fc / PSI:.0f} psi")
        else:
            circle = d / 2.0 - bars.cover - bars.bar_diameter / 2.0
            phi_m, _, phi = reinforced_flexure(d, fc, bars.bars, bars.bar_area, circle,
                                               bars.yield_strength)
            phi_v = reinforced_shear(d, fc, bars.bars * bars.bar_area)
            how = (f"reinforced, ACI 318-19 §22.2 and Table 22.5.5.1(c) (from memory): "
                   f"{bars.bars} bars of {bars.bar_diameter / IN:.3g} in, f_y "
                   f"{bars.yield_strength / PSI / 1000:.0f} ksi, phi {phi:.2f}; f'c "
                   f"{fc / PSI:.0f} psi")
        cache[key] = (phi_m, phi_v, how)
    phi_m, phi_v, how = cache[key]
    m, v = pier_actions(system, anchor, state)
    plain = fs.reinforcement is None
    over = "plain concrete pier over capacity: reinforce" if plain else "reinforce more"
    load = (f"load factor {factor:g} on the run's actions (settings.concrete_load_factor; "
            "ASCE 7 live load)")
    return [
        Check(f"anchor.{name}.pier.flexure", "pier", name,
              f"bending moment x {factor:g} in the concrete pier against phi M_n", factor * m, phi_m,
              "moment", source=how, note=("finding: " + over + "; " if factor * m > phi_m
                                          else "") + load),
        Check(f"anchor.{name}.pier.shear", "pier", name,
              f"shear x {factor:g} in the concrete pier against phi V_n", factor * v, phi_v,
              "force", source=how, note=load),
    ]
