"""Embedment depth of posts and piers by the IBC 2021 formulas.

- §1807.3.2.1, Eq. 18-1 (non-constrained, no slab at grade):
  d = 0.5 A {1 + [1 + 4.36 h / A]^(1/2)},  A = 2.34 P / (S1 b),
  with S1 the allowable lateral bearing at d/3 below grade, d at most 12 ft
  for computing S1 (so S1 depends on d; solved exactly here).
- §1807.3.2.2, Eq. 18-2 (constrained at grade): d^2 = 4.25 P h / (S3 b),
  with S3 the allowable lateral bearing at depth d.
- Table 1806.2 allowable lateral bearing, psf per foot of depth below grade;
  §1806.3.3 lets it grow with depth up to 15 times the tabulated value (from
  memory); §1806.3.4 allows twice the tabulated value for isolated poles that
  can accept 1/2 inch of ground-line motion (an explicit option here).

The code's equations are dimensional (P lb, h and b and d ft, S psf). Inputs
and outputs here are SI; conversion happens inside.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from spanstay.models.common.errors import InputError

LBF = 4.4482216152605  # N
FT = 0.3048  # m
PSF = LBF / FT**2  # Pa
PSF_PER_FT = PSF / FT  # Pa/m

# IBC 2021 Table 1806.2, lateral bearing pressure, psf/ft below natural grade.
IBC_LATERAL_BEARING_PSF_PER_FT: dict[str, float] = {
    "crystalline_bedrock": 1200.0,
    "sedimentary_rock": 400.0,   # sedimentary and foliated rock
    "gravel": 200.0,             # sandy gravel and/or gravel (GW, GP)
    "sand": 150.0,               # sand, silty sand, clayey sand, silty gravel, clayey gravel
    "clay": 100.0,               # clay, sandy clay, silty clay, clayey silt, silt, sandy silt
}
_SOIL_GROUPS = {
    "gw": "gravel", "gp": "gravel",
    "sw": "sand", "sp": "sand", "sm": "sand", "sc": "sand", "gm": "sand", "gc": "sand",
    "cl": "clay", "ml": "clay", "mh": "clay", "ch": "clay",
}
MAX_DEPTH_FOR_S1_FT = 12.0   # §1807.3.2.1: d not over 12 ft for computing S1
DEPTH_INCREASE_CAP = 15.0    # §1806.3.3: at most 15 x tabulated value (from memory)


def ibc_class_key(name: str) -> str:
    """Normalise a Table 1806.2 class name or a soil group symbol (e.g. "SM") to a key."""
    key = str(name).strip().lower().replace(" ", "_").replace("-", "_")
    if key in IBC_LATERAL_BEARING_PSF_PER_FT:
        return key
    if key in _SOIL_GROUPS:
        return _SOIL_GROUPS[key]
    raise InputError(
        f"IBC soil class {name!r} is not known; expected one of "
        f"{', '.join(IBC_LATERAL_BEARING_PSF_PER_FT)} or a soil group symbol "
        f"({', '.join(s.upper() for s in _SOIL_GROUPS)})")


def lateral_bearing_per_depth(ibc_class: str, doubled: bool = False) -> float:
    """Allowable lateral bearing increase per depth, Pa/m (Table 1806.2, x2 if §1806.3.4)."""
    value = IBC_LATERAL_BEARING_PSF_PER_FT[ibc_class_key(ibc_class)] * PSF_PER_FT
    return 2.0 * value if doubled else value


def round_or_square_width(width: np.ndarray | float, shape: str = "round") -> np.ndarray:
    """The b of Eq. 18-1/18-2: diameter of a round post, diagonal of a square one, m."""
    if shape == "round":
        return np.asarray(width, dtype=float)
    if shape == "square":
        return np.sqrt(2.0) * np.asarray(width, dtype=float)
    raise InputError(f"footing shape {shape!r} is not known; expected 'round' or 'square'")


def _bearing_at(depth_ft: np.ndarray, per_ft_psf: np.ndarray) -> np.ndarray:
    """Allowable lateral bearing at a depth, psf, with the 15x cap."""
    return per_ft_psf * np.minimum(depth_ft, DEPTH_INCREASE_CAP)


def required_depth_nonconstrained(load: np.ndarray | float, height: np.ndarray | float,
                                  width: np.ndarray | float,
                                  bearing_per_depth: np.ndarray | float) -> np.ndarray:
    """Required embedment by IBC Eq. 18-1 with S1 taken at d/3 (solved exactly), m.

    Parameters
    ----------
    load
        Lateral load P, N (service level).
    height
        Height of P above grade h, m.
    width
        b, m: diameter, or diagonal of a square footing (``round_or_square_width``).
    bearing_per_depth
        Allowable lateral bearing per depth, Pa/m (``lateral_bearing_per_depth``).

    Notes
    -----
    With S1 = s d/3 (d <= 12 ft) Eq. 18-1 becomes the cubic
    d^3 - c d - 1.09 h c = 0, c = 7.02 P / (s b), which has one positive
    root; for roots above 12 ft S1 is frozen at s 12/3 and Eq. 18-1 is explicit.
    """
    P, h, b, s = np.broadcast_arrays(
        np.asarray(load, float) / LBF, np.asarray(height, float) / FT,
        np.asarray(width, float) / FT, np.asarray(bearing_per_depth, float) / PSF_PER_FT)
    if np.any(P < 0) or np.any(h < 0) or np.any(b <= 0) or np.any(s <= 0):
        raise InputError("IBC Eq. 18-1 needs P >= 0, h >= 0, b > 0 and a positive bearing value")
    c = 7.02 * P / (s * b)
    e = 1.09 * h * c
    d = _cubic_positive_root(c, e)
    s1_cap = _bearing_at(np.full_like(d, MAX_DEPTH_FOR_S1_FT / 3.0), s)
    d_capped = _eq_18_1(P, h, b, s1_cap)
    d = np.where(d > MAX_DEPTH_FOR_S1_FT, d_capped, d)
    return d * FT


def _eq_18_1(P: np.ndarray, h: np.ndarray, b: np.ndarray, s1: np.ndarray) -> np.ndarray:
    """IBC Eq. 18-1 in its own units (lb, ft, psf): d for a given S1."""
    A = 2.34 * P / (s1 * b)
    with np.errstate(divide="ignore", invalid="ignore"):
        d = 0.5 * A * (1.0 + np.sqrt(1.0 + 4.36 * h / A))
    return np.where(A > 0, d, 0.0)


def _cubic_positive_root(c: np.ndarray, e: np.ndarray) -> np.ndarray:
    """Positive root of d^3 - c d - e = 0 (c, e >= 0), vectorised Newton from above."""
    d = 1.0 + np.maximum(c, e)  # Cauchy bound: all roots are smaller in magnitude
    for _ in range(200):
        f = d**3 - c * d - e
        step = f / (3.0 * d**2 - c)
        d = d - step
        if np.all(np.abs(step) <= 1e-13 * np.maximum(d, 1.0)):
            break
    return np.where((c > 0) | (e > 0), d, 0.0)


def required_depth_constrained(load: np.ndarray | float, height: np.ndarray | float,
                               width: np.ndarray | float,
                               bearing_per_depth: np.ndarray | float) -> np.ndarray:
    """Required embedment by IBC Eq. 18-2 (slab or floor at grade), S3 at depth d, m.

    With S3 = s d (up to the 15x cap of §1806.3.3), d^3 = 4.25 P h / (s b).
    """
    P, h, b, s = np.broadcast_arrays(
        np.asarray(load, float) / LBF, np.asarray(height, float) / FT,
        np.asarray(width, float) / FT, np.asarray(bearing_per_depth, float) / PSF_PER_FT)
    if np.any(P < 0) or np.any(h < 0) or np.any(b <= 0) or np.any(s <= 0):
        raise InputError("IBC Eq. 18-2 needs P >= 0, h >= 0, b > 0 and a positive bearing value")
    d = np.cbrt(4.25 * P * h / (s * b))
    d_capped = np.sqrt(4.25 * P * h / (s * DEPTH_INCREASE_CAP * b))
    d = np.where(d > DEPTH_INCREASE_CAP, d_capped, d)
    return d * FT


@dataclass(frozen=True)
class EmbedmentCheck:
    """Outcome of the IBC embedment check for one footing (SI).

    ``bearing`` is S1 (at d/3, Eq. 18-1) or S3 (at d, Eq. 18-2) in Pa at the
    required depth; ``ratio`` = required / actual depth (<= 1 passes).
    """

    equation: str
    required_depth: float
    actual_depth: float
    bearing: float
    ibc_class: str
    doubled: bool

    @property
    def ratio(self) -> float:
        return self.required_depth / self.actual_depth

    @property
    def passes(self) -> bool:
        return self.required_depth <= self.actual_depth


def check_embedment(load: float, height: float, width: float, actual_depth: float,
                    ibc_class: str, constrained: bool = False,
                    doubled: bool = False) -> EmbedmentCheck:
    """IBC 2021 embedment check of one post or pier (SI in, SI out).

    Parameters
    ----------
    load, height, width
        P (N), its height above grade h (m), and b (m, diameter or diagonal).
    actual_depth
        Embedded depth of the footing, m.
    ibc_class
        Table 1806.2 class key or soil group symbol.
    constrained
        True when a slab or floor at grade restrains the post (Eq. 18-2).
    doubled
        Use twice the tabulated bearing (§1806.3.4, isolated poles that can
        accept 1/2 inch of motion at grade).
    """
    key = ibc_class_key(ibc_class)
    s = lateral_bearing_per_depth(key, doubled)
    if constrained:
        d = float(required_depth_constrained(load, height, width, s))
        bearing = s * min(d, DEPTH_INCREASE_CAP * FT)
        eq = "IBC 2021 Eq. 18-2 (constrained)"
    else:
        d = float(required_depth_nonconstrained(load, height, width, s))
        bearing = s * min(d, MAX_DEPTH_FOR_S1_FT * FT) / 3.0
        eq = "IBC 2021 Eq. 18-1 (non-constrained)"
    return EmbedmentCheck(eq, d, float(actual_depth), bearing, key, doubled)
