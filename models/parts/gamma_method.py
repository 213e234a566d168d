"""Eurocode 5 Annex B gamma method for mechanically jointed beams (2 or 3 plies).

EN 1995-1-1 Annex B: gamma_i = [1 + pi^2 E_i A_i s_i / (K_i l^2)]^-1 for the
outer members (i = 1, 3), gamma_2 = 1;
a_2 = [gamma_1 E_1 A_1 (h_1 + h_2) - gamma_3 E_3 A_3 (h_2 + h_3)] / (2 sum gamma_i E_i A_i),
a_1 = (h_1 + h_2)/2 - a_2, a_3 = (h_2 + h_3)/2 + a_2;
(EI)_ef = sum(E_i I_i + gamma_i E_i A_i a_i^2).
Exact for a simply supported beam under a sinusoidal load of span l; for a
cantilever take l = 2 L (common practice). Here the joint stiffness is given
per unit length, k_i = K_i / s_i (N/m per m).
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from spanstay.models.common.errors import InputError


@dataclass(frozen=True)
class GammaResult:
    """Effective stiffness and its parts (SI)."""

    EI_ef: float
    gamma: tuple[float, ...]
    a: tuple[float, ...]           # signed offsets of ply centroids from the neutral axis
    EI_none: float                 # no connection: sum of ply E I
    EI_full: float                 # rigid connection: full section

    @property
    def composite_factor(self) -> float:
        """Where EI_ef sits between no connection (0) and full composite (1)."""
        span = self.EI_full - self.EI_none
        return (self.EI_ef - self.EI_none) / span if span > 0 else 1.0


def gamma_factor(EA: float, k: float, span: float) -> float:
    """gamma = 1 / (1 + pi^2 E A / (k l^2)); k slip modulus per unit length (N/m^2)."""
    if k <= 0:
        return 0.0
    if math.isinf(k):
        return 1.0
    return 1.0 / (1.0 + math.pi**2 * EA / (k * span**2))


def _geometry(E, A, h, g):
    """Neutral-axis offsets a_i (positive toward ply 1) per Annex B."""
    gEA = g * E * A
    if len(E) == 2:
        # two members: ply 2 is the reference member (gamma_2 = 1)
        a2 = gEA[0] * (h[0] + h[1]) / (2 * gEA.sum())
        return np.array([(h[0] + h[1]) / 2 - a2, -a2])
    a2 = (gEA[0] * (h[0] + h[1]) - gEA[2] * (h[1] + h[2])) / (2 * gEA.sum())
    return np.array([(h[0] + h[1]) / 2 - a2, -a2, -((h[1] + h[2]) / 2 + a2)])


def effective_stiffness(E, A, I, h, k_joints, span: float) -> GammaResult:
    """(EI)_ef of 2 or 3 plies stacked in the bending plane.

    Parameters
    ----------
    E, A, I, h
        Per ply, in stacking order: modulus (Pa), area (m^2), own second
        moment about its centroid (m^4), depth in the stacking direction (m).
    k_joints
        Slip modulus per unit length of each joint (N/m^2), one per joint
        (ply 1-2, ply 2-3): fasteners per row x K / spacing. 0 = no
        connection, inf = rigid.
    span
        l of Annex B (m).
    """
    E, A, I, h = (np.asarray(v, float) for v in (E, A, I, h))
    n = len(E)
    if n not in (2, 3) or not (len(A) == len(I) == len(h) == n):
        raise InputError(f"the gamma method covers 2 or 3 plies, got {n}")
    k = list(np.atleast_1d(np.asarray(k_joints, float)))
    if len(k) != n - 1:
        raise InputError(f"{n} plies need {n - 1} joint stiffness value(s), got {len(k)}")
    if n == 2:
        g = np.array([gamma_factor(E[0] * A[0], k[0], span), 1.0])
    else:
        g = np.array([gamma_factor(E[0] * A[0], k[0], span), 1.0,
                      gamma_factor(E[2] * A[2], k[1], span)])
    a = _geometry(E, A, h, g)
    EI_ef = float(np.sum(E * I + g * E * A * a**2))
    a_full = _geometry(E, A, h, np.ones(n))
    EI_full = float(np.sum(E * I + E * A * a_full**2))
    return GammaResult(EI_ef, tuple(g), tuple(a), float(np.sum(E * I)), EI_full)


def ply_stresses(res: GammaResult, E, h, M: float) -> tuple[np.ndarray, np.ndarray]:
    """Annex B (B.7), (B.8): centroid stress gamma_i E_i a_i M/(EI)_ef and bending
    stress 0.5 E_i h_i M/(EI)_ef per ply (Pa; sign of the centroid term follows a_i)."""
    E, h = np.asarray(E, float), np.asarray(h, float)
    sig = np.asarray(res.gamma) * E * np.asarray(res.a) * M / res.EI_ef
    sig_m = 0.5 * E * h * M / res.EI_ef
    return sig, sig_m


def joint_shear_flow(res: GammaResult, E, A, V: float) -> np.ndarray:
    """Shear flow carried by the fasteners of each joint, N/m (Annex B (B.10) divided by s).

    q_i = gamma_i E_i A_i |a_i| V / (EI)_ef for the outer ply i of each joint.
    """
    E, A = np.asarray(E, float), np.asarray(A, float)
    g, a = np.asarray(res.gamma), np.asarray(res.a)
    outer = [0] if len(E) == 2 else [0, 2]
    return np.array([g[i] * E[i] * A[i] * abs(a[i]) * V / res.EI_ef for i in outer])
