"""Lateral soil springs: p-y curves vectorised over many springs.

Each curve object describes ``n`` springs, one per embedded node, with its own
depth z (m below grade), width D (m) and tributary length L (m). ``p`` is the
soil resistance per unit length of pile (N/m) at lateral displacement ``y``
(m); a spring's force is ``L p(y)`` (N). All curves are odd in y (symmetric),
and ``stiffness`` is the exact derivative of ``force`` (consistent tangent).

The engine's spring group calls ``force(u)`` and ``stiffness(u)`` with one
displacement per spring; an optional index array ``i`` selects a subset.

Curves:
- ``APISandCurve``: API RP 2A sand, p = A p_u tanh(k z y / (A p_u)).
- ``MatlockClayCurve``: Matlock (1970) soft clay, static or cyclic, cube-root shape.
- ``ElasticPlasticCurve``: linear up to p_u, then flat.
- ``UserModulusCurve``: linear with slope E_s = const + gradient z, optionally capped.

In layered soil the overburden ``gamma z`` of the published formulas is the
vertical effective stress sigma'_v(z) (common practice); z stays the depth
below grade.
"""
from __future__ import annotations

import numpy as np

from spanstay.models.catalogs.soil import SoilProfile

K0_API = 0.4  # at-rest coefficient used by API RP 2A


def passive_coefficient(friction_angle_deg: np.ndarray | float) -> np.ndarray:
    """Rankine Kp = tan^2(45 + phi/2)."""
    return np.tan(np.radians(45.0 + 0.5 * np.asarray(friction_angle_deg, float))) ** 2


def api_sand_coefficients(friction_angle_deg: np.ndarray | float
                          ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """API RP 2A sand coefficients C1, C2, C3 for friction angle phi (degrees).

    C1 = tan(b)[Kp tan(a) + K0(tan(phi) sin(b)(1/cos(a) + 1) - tan(a))],
    C2 = Kp - Ka, C3 = Kp^2 (Kp + K0 tan(phi)) - Ka, a = phi/2, b = 45 + phi/2.
    """
    phi = np.radians(np.asarray(friction_angle_deg, float))
    a = 0.5 * phi
    b = np.pi / 4 + 0.5 * phi
    kp = np.tan(b) ** 2
    ka = np.tan(np.pi / 4 - 0.5 * phi) ** 2
    c1 = np.tan(b) * (kp * np.tan(a)
                      + K0_API * (np.tan(phi) * np.sin(b) * (1.0 / np.cos(a) + 1.0) - np.tan(a)))
    c2 = kp - ka
    c3 = kp**2 * (kp + K0_API * np.tan(phi)) - ka
    return c1, c2, c3


def api_sand_ultimate(friction_angle_deg, depth, width, vertical_stress) -> np.ndarray:
    """API RP 2A sand p_u = min((C1 z + C2 D) s'v, C3 D s'v), N/m (s'v = gamma z if uniform)."""
    c1, c2, c3 = api_sand_coefficients(friction_angle_deg)
    z, D, sv = (np.asarray(v, float) for v in (depth, width, vertical_stress))
    return np.minimum((c1 * z + c2 * D) * sv, c3 * D * sv)


def matlock_ultimate(shear_strength, depth, width, vertical_stress, J: float = 0.5
                     ) -> np.ndarray:
    """Matlock (1970) p_u = min((3 + s'v / c + J z / D) c D, 9 c D), N/m."""
    c, z, D, sv = (np.asarray(v, float) for v in (shear_strength, depth, width, vertical_stress))
    return np.minimum((3.0 + sv / c + J * z / D) * c * D, 9.0 * c * D)


def broms_sand_ultimate(friction_angle_deg, width, vertical_stress) -> np.ndarray:
    """Broms (1964) cohesionless ultimate resistance 3 Kp s'v D, N/m."""
    return 3.0 * passive_coefficient(friction_angle_deg) * np.asarray(vertical_stress, float) \
        * np.asarray(width, float)


class PYCurve:
    """Base of all p-y curves: per-spring geometry and the force/stiffness interface.

    Subclasses implement ``_branch(a, sel) -> (p, dp/dy)`` for a = |y| >= 0.
    ``p_ultimate`` (N/m, per spring) is the largest resistance the curve gives:
    A p_u for API sand, p_u for the others, ``inf`` for an uncapped modulus.
    """

    def __init__(self, depth, width, tributary) -> None:
        z, D, L = np.broadcast_arrays(np.atleast_1d(np.asarray(depth, float)),
                                      np.asarray(width, float), np.asarray(tributary, float))
        self.depth, self.width, self.tributary = z.copy(), D.copy(), L.copy()
        self.p_ultimate = np.full(self.n, np.inf)

    @property
    def n(self) -> int:
        """Number of springs."""
        return self.depth.size

    def _param(self, value) -> np.ndarray:
        """Broadcast a per-spring parameter to shape (n,)."""
        return np.broadcast_to(np.asarray(value, float), (self.n,)).copy()

    def _branch(self, a: np.ndarray, sel) -> tuple[np.ndarray, np.ndarray]:
        raise NotImplementedError

    @staticmethod
    def _sel(i):
        return slice(None) if i is None else np.asarray(i)

    def resistance(self, y: np.ndarray, i=None) -> np.ndarray:
        """Soil resistance per unit length p(y), N/m (opposes y: same sign as y here)."""
        y = np.asarray(y, float)
        p, _ = self._branch(np.abs(y), self._sel(i))
        return np.sign(y) * p

    def resistance_tangent(self, y: np.ndarray, i=None) -> np.ndarray:
        """dp/dy, N/m^2."""
        _, dp = self._branch(np.abs(np.asarray(y, float)), self._sel(i))
        return dp

    def force(self, y: np.ndarray, i=None) -> np.ndarray:
        """Spring force L p(y), N, one per spring (or per index in ``i``)."""
        return self.tributary[self._sel(i)] * self.resistance(y, i)

    def stiffness(self, y: np.ndarray, i=None) -> np.ndarray:
        """Spring tangent L dp/dy, N/m, consistent with ``force``."""
        return self.tributary[self._sel(i)] * self.resistance_tangent(y, i)

    def modulus_at_rest(self) -> np.ndarray:
        """Slope of p(y) near y = 0 (secant over a small displacement), N/m^2 per spring."""
        y = np.full(self.n, 1e-9) * np.maximum(self.width, 1e-3)
        return self.resistance(y) / y

    def utilization(self, y: np.ndarray, i=None) -> np.ndarray:
        """|p| / p_u at each spring (0 where p_u is unbounded or zero)."""
        p = np.abs(self.resistance(y, i))
        pu = self.p_ultimate[self._sel(i)]
        ok = np.isfinite(pu) & (pu > 0)
        return np.where(ok, p / np.where(ok, pu, 1.0), 0.0)


class APISandCurve(PYCurve):
    """API RP 2A sand: p = A p_u tanh(k z y / (A p_u)).

    Parameters
    ----------
    depth, width, tributary
        Per-spring z (m), D (m), L (m).
    friction_angle_deg, k_initial
        phi (degrees) and initial modulus k (N/m^3); initial slope k z.
    vertical_stress
        sigma'_v at each spring (Pa); ``unit_weight * depth`` for uniform soil.
    cyclic
        A = 0.9 (cyclic) instead of A = max(3 - 0.8 z/D, 0.9) (static).
    """

    def __init__(self, depth, width, tributary, friction_angle_deg, k_initial,
                 vertical_stress, cyclic: bool = False) -> None:
        super().__init__(depth, width, tributary)
        self.friction_angle_deg = self._param(friction_angle_deg)
        self.k_initial = self._param(k_initial)
        self.api_p_u = api_sand_ultimate(self.friction_angle_deg, self.depth, self.width,
                                         self._param(vertical_stress))
        self.factor_a = (np.full(self.n, 0.9) if cyclic
                         else np.maximum(3.0 - 0.8 * self.depth / self.width, 0.9))
        self.p_ultimate = self.factor_a * self.api_p_u
        self.initial_slope = self.k_initial * self.depth

    def _branch(self, a, sel):
        cap = self.p_ultimate[sel]
        kz = self.initial_slope[sel]
        live = cap > 0
        safe = np.where(live, cap, 1.0)
        t = np.tanh(kz * a / safe)
        p = np.where(live, cap * t, 0.0)
        dp = np.where(live, kz * (1.0 - t * t), 0.0)
        return p, dp


class MatlockClayCurve(PYCurve):
    """Matlock (1970) soft clay: p = 0.5 p_u (y/y50)^(1/3).

    Static: up to 8 y50, then p_u. Cyclic (Matlock 1970, also API RP 2GEO
    §8.5, from memory): the cube root is capped at 0.72 p_u and held to
    3 y50; below the transition depth z_r = 6 c D / (gamma' D + J c), where
    the wedge gives way to flow round the pile, the resistance then falls
    linearly to 0.72 p_u z/z_r at 15 y50 and stays there (gamma' = sigma'_v / z,
    the mean effective unit weight above the spring).

    y50 = 2.5 eps50 D. The cube root has an infinite slope at y = 0, which no
    Newton solver can use, so below ``linear_fraction * y50`` the curve
    follows its own secant (force stays continuous, slope finite).

    Parameters
    ----------
    depth, width, tributary
        Per-spring z (m), D (m), L (m).
    undrained_shear_strength, eps50
        c (Pa) and eps50.
    vertical_stress
        sigma'_v at each spring (Pa).
    J
        Matlock's J, 0.5 for soft clay (0.25 is usual for stiffer clay).
    cyclic
        Matlock's cyclic curve instead of the static one.
    """

    def __init__(self, depth, width, tributary, undrained_shear_strength, eps50,
                 vertical_stress, J: float = 0.5, linear_fraction: float = 1e-3,
                 cyclic: bool = False) -> None:
        super().__init__(depth, width, tributary)
        self.shear_strength = self._param(undrained_shear_strength)
        self.eps50 = self._param(eps50)
        self.y50 = 2.5 * self.eps50 * self.width
        sv = self._param(vertical_stress)
        J = self._param(J)
        self.matlock_p_u = matlock_ultimate(self.shear_strength, self.depth, self.width, sv, J)
        self.cyclic = bool(cyclic)
        gamma = np.where(self.depth > 0, sv / np.where(self.depth > 0, self.depth, 1.0), 0.0)
        self.transition_depth = 6.0 * self.shear_strength * self.width / (
            gamma * self.width + J * self.shear_strength)
        self.p_ultimate = (CYCLIC_CAP * self.matlock_p_u if self.cyclic
                           else self.matlock_p_u.copy())
        self.linear_fraction = float(linear_fraction)

    def _branch(self, a, sel):
        pu, y50 = self.matlock_p_u[sel], self.y50[sel]
        r = a / y50
        rt = self.linear_fraction
        k_lin = 0.5 * pu * rt ** (-2.0 / 3.0) / y50
        rr = np.maximum(r, rt)
        p_cube = 0.5 * pu * np.cbrt(rr)
        dp_cube = pu / (6.0 * y50) * rr ** (-2.0 / 3.0)
        if not self.cyclic:
            p = np.where(r < rt, k_lin * a, np.where(r < 8.0, p_cube, pu))
            dp = np.where(r < rt, k_lin, np.where(r < 8.0, dp_cube, 0.0))
            return p, dp
        cap = CYCLIC_CAP * pu
        shallow = np.minimum(self.depth[sel] / self.transition_depth[sel], 1.0)
        low = cap * shallow  # residual resistance above the transition depth
        slope = (low - cap) / (12.0 * y50)  # from 3 y50 to 15 y50
        falling = cap + slope * (r - 3.0) * y50
        p = np.where(r < rt, k_lin * a,
                     np.where(p_cube < cap, p_cube,
                              np.where(r < 3.0, cap, np.where(r < 15.0, falling, low))))
        dp = np.where(r < rt, k_lin,
                      np.where(p_cube < cap, dp_cube,
                               np.where(r < 3.0, 0.0, np.where(r < 15.0, slope, 0.0))))
        return p, dp


#: Matlock (1970) cyclic clay: largest resistance as a fraction of the static p_u
CYCLIC_CAP = 0.72


class ElasticPlasticCurve(PYCurve):
    """Linear elastic-perfectly plastic: p = clip(E_s y, -p_u, p_u).

    Parameters
    ----------
    depth, width, tributary
        Per-spring z (m), D (m), L (m).
    modulus
        Slope E_s = p / y per spring, N/m^2.
    p_ultimate
        Ultimate resistance per spring, N/m (``inf`` for no cap).
    """

    def __init__(self, depth, width, tributary, modulus, p_ultimate=np.inf) -> None:
        super().__init__(depth, width, tributary)
        self.modulus = self._param(modulus)
        self.p_ultimate = self._param(p_ultimate)

    def _branch(self, a, sel):
        es, pu = self.modulus[sel], self.p_ultimate[sel]
        elastic = es * a < pu
        p = np.where(elastic, es * a, pu)
        dp = np.where(elastic, es, 0.0)
        return p, dp


class UserModulusCurve(ElasticPlasticCurve):
    """User-given subgrade modulus E_s = constant + gradient z (N/m^2), optional cap p_u."""

    def __init__(self, depth, width, tributary, modulus_constant=0.0, modulus_gradient=0.0,
                 p_ultimate=np.inf) -> None:
        z = np.atleast_1d(np.asarray(depth, float))
        es = np.asarray(modulus_constant, float) + np.asarray(modulus_gradient, float) * z
        super().__init__(depth, width, tributary, es, p_ultimate)


class CombinedCurves(PYCurve):
    """Several curve objects acting as one spring group (e.g. sand over clay).

    Parameters
    ----------
    n
        Total number of springs.
    parts
        ``(indices, curve)`` pairs; ``curve`` covers the springs ``indices``
        (in that order) and the parts together cover 0..n-1 exactly once.
    """

    def __init__(self, n: int, parts: list[tuple[np.ndarray, PYCurve]]) -> None:
        self.parts = [(np.asarray(idx, int), curve) for idx, curve in parts]
        self._part_of = np.full(n, -1)
        self._local_of = np.full(n, -1)
        for k, (idx, curve) in enumerate(self.parts):
            if idx.size != curve.n:
                raise ValueError(f"part {k}: {idx.size} indices for {curve.n} springs")
            self._part_of[idx] = k
            self._local_of[idx] = np.arange(idx.size)
        if np.any(self._part_of < 0):
            raise ValueError("parts do not cover every spring")
        self.depth, self.width, self.tributary = (np.empty(n) for _ in range(3))
        self.p_ultimate = np.empty(n)
        for idx, curve in self.parts:
            self.depth[idx], self.width[idx] = curve.depth, curve.width
            self.tributary[idx], self.p_ultimate[idx] = curve.tributary, curve.p_ultimate

    def _branch(self, a, sel):
        glob = np.arange(self.n)[sel]
        p, dp = np.empty_like(a), np.empty_like(a)
        part = self._part_of[glob]
        for k, (_, curve) in enumerate(self.parts):  # loop over a few soil kinds only
            mask = part == k
            if np.any(mask):
                p[mask], dp[mask] = curve._branch(a[mask], self._local_of[glob[mask]])
        return p, dp


def curves_for_profile(profile: SoilProfile, depth, width, tributary,
                       model: str = "api", cyclic: bool = False,
                       layer: np.ndarray | None = None) -> CombinedCurves:
    """p-y springs for nodes at ``depth`` in a soil profile.

    Parameters
    ----------
    profile
        The soil.
    depth, width, tributary
        Per-spring z (m below grade), D (m) and L (m).
    model
        ``"api"``: API RP 2A for sand, Matlock (1970) for clay.
        ``"elastic_plastic"``: sand with slope k z capped at Broms' 3 Kp s'v D;
        clay with the Matlock secant at y50, 0.5 p_u / y50, capped at Matlock p_u.
        ``"modulus"`` layers are always linear with E_s = const + gradient z, capped
        by Broms (friction angle given) or Matlock (strength given) p_u if any.
    cyclic
        Cyclic curves in every layer (API sand A = 0.9, Matlock cyclic clay); a
        layer's own ``loading = "cyclic"`` does the same for that layer. The
        ``elastic_plastic`` model keeps the static limits (hand-method comparisons).
    layer
        Layer index of each spring; by default the layer at its depth. Give it
        for the half of a node's tributary length that lies in the layer above.
    """
    if model not in ("api", "elastic_plastic"):
        raise ValueError(f"p-y model {model!r}: expected 'api' or 'elastic_plastic'")
    z, D, L = (a.copy() for a in np.broadcast_arrays(
        np.atleast_1d(np.asarray(depth, float)), np.asarray(width, float),
        np.asarray(tributary, float)))
    layer = profile.layer_at(z) if layer is None else np.asarray(layer, int)
    sv = profile.vertical_effective_stress(z)
    parts: list[tuple[np.ndarray, PYCurve]] = []
    for j, soil in enumerate(profile.layers):
        idx = np.flatnonzero(layer == j)
        if idx.size == 0:
            continue
        args = (z[idx], D[idx], L[idx])
        if soil.kind == "sand" and model == "api":
            curve = APISandCurve(*args, soil.friction_angle_deg, soil.k_initial, sv[idx],
                                 cyclic or soil.loading == "cyclic")
        elif soil.kind == "sand":
            curve = ElasticPlasticCurve(*args, soil.k_initial * z[idx],
                                        broms_sand_ultimate(soil.friction_angle_deg, D[idx],
                                                            sv[idx]))
        elif soil.kind == "clay" and model == "api":
            curve = MatlockClayCurve(*args, soil.undrained_shear_strength, soil.eps50, sv[idx],
                                     J=soil.matlock_J, cyclic=cyclic or soil.loading == "cyclic")
        elif soil.kind == "clay":
            pu = matlock_ultimate(soil.undrained_shear_strength, z[idx], D[idx], sv[idx],
                                  soil.matlock_J)
            y50 = 2.5 * soil.eps50 * D[idx]
            curve = ElasticPlasticCurve(*args, 0.5 * pu / y50, pu)
        else:
            pu = np.full(idx.size, np.inf)
            if soil.friction_angle_deg is not None:
                pu = broms_sand_ultimate(soil.friction_angle_deg, D[idx], sv[idx])
            elif soil.undrained_shear_strength is not None:
                pu = matlock_ultimate(soil.undrained_shear_strength, z[idx], D[idx], sv[idx])
            curve = UserModulusCurve(*args, soil.modulus_constant or 0.0,
                                     soil.modulus_gradient or 0.0, pu)
        parts.append((idx, curve))
    return CombinedCurves(z.size, parts)
