"""Finite rotations: rotation vectors, matrices and their tangent maps.

All functions are vectorised over leading axes. The spin convention is the
spatial (left) one: a rotation increment ``w`` updates ``R <- exp(w) R``.
"""
from __future__ import annotations

import numpy as np


def cross3(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Cross product of (..., 3) arrays (np.cross without its axis handling cost)."""
    out = np.empty(np.broadcast_shapes(a.shape, b.shape))
    out[..., 0] = a[..., 1] * b[..., 2] - a[..., 2] * b[..., 1]
    out[..., 1] = a[..., 2] * b[..., 0] - a[..., 0] * b[..., 2]
    out[..., 2] = a[..., 0] * b[..., 1] - a[..., 1] * b[..., 0]
    return out


def skew(v: np.ndarray) -> np.ndarray:
    """Skew matrix S(v) with S(v) a = v x a, shape (..., 3, 3)."""
    v = np.asarray(v, dtype=float)
    s = np.zeros(v.shape[:-1] + (3, 3))
    s[..., 0, 1], s[..., 0, 2] = -v[..., 2], v[..., 1]
    s[..., 1, 0], s[..., 1, 2] = v[..., 2], -v[..., 0]
    s[..., 2, 0], s[..., 2, 1] = -v[..., 1], v[..., 0]
    return s


def expmap(theta: np.ndarray) -> np.ndarray:
    """Rotation matrix of rotation vector ``theta`` (Rodrigues), (..., 3, 3)."""
    theta = np.asarray(theta, dtype=float)
    t2 = np.einsum("...i,...i->...", theta, theta)
    t = np.sqrt(t2)
    small = t < 1e-4
    ts = np.where(small, 1.0, t)
    a = np.where(small, 1.0 - t2 / 6.0 + t2 * t2 / 120.0, np.sin(ts) / ts)
    b = np.where(small, 0.5 - t2 / 24.0 + t2 * t2 / 720.0, (1.0 - np.cos(ts)) / ts**2)
    s = skew(theta)
    eye = np.broadcast_to(np.eye(3), s.shape)
    return eye + a[..., None, None] * s + b[..., None, None] * (s @ s)


def logmap(rot: np.ndarray) -> np.ndarray:
    """Rotation vector of rotation matrix ``rot`` (via the unit quaternion).

    Robust for every angle up to pi.
    """
    r = np.asarray(rot, dtype=float)
    tr = r[..., 0, 0] + r[..., 1, 1] + r[..., 2, 2]
    # Shepperd's method: pick the largest of w, x, y, z for stability.
    cand = np.stack([tr, r[..., 0, 0], r[..., 1, 1], r[..., 2, 2]], axis=-1)
    k = np.argmax(cand, axis=-1)
    q = np.empty(r.shape[:-2] + (4,))
    # k == 0
    w = np.sqrt(np.maximum(1.0 + tr, 1e-300)) * 0.5
    qa = np.stack([w, (r[..., 2, 1] - r[..., 1, 2]) / (4 * w),
                   (r[..., 0, 2] - r[..., 2, 0]) / (4 * w),
                   (r[..., 1, 0] - r[..., 0, 1]) / (4 * w)], axis=-1)
    q[...] = qa
    for i, (a, b, c) in enumerate(((0, 1, 2), (1, 2, 0), (2, 0, 1)), start=1):
        sel = k == i
        if not np.any(sel):
            continue
        rs = r[sel]
        x = np.sqrt(np.maximum(1.0 + rs[:, a, a] - rs[:, b, b] - rs[:, c, c], 1e-300)) * 0.5
        qq = np.empty((rs.shape[0], 4))
        qq[:, 0] = (rs[:, c, b] - rs[:, b, c]) / (4 * x)
        qq[:, 1 + a] = x
        qq[:, 1 + b] = (rs[:, b, a] + rs[:, a, b]) / (4 * x)
        qq[:, 1 + c] = (rs[:, c, a] + rs[:, a, c]) / (4 * x)
        q[sel] = qq
    q *= np.where(q[..., :1] < 0, -1.0, 1.0)  # w >= 0: angle in [0, pi]
    vec = q[..., 1:]
    vn = np.linalg.norm(vec, axis=-1)
    angle = 2.0 * np.arctan2(vn, q[..., 0])
    scale = np.where(vn < 1e-12, 2.0 / np.maximum(q[..., 0], 1e-300), angle / np.where(vn < 1e-12, 1.0, vn))
    return vec * scale[..., None]


def tangent_inverse(theta: np.ndarray) -> np.ndarray:
    """Inverse tangent operator: d(theta) = T^-1(theta) w for a left spin w.

    T^-1 = I - S/2 + eta S^2 with eta = (1 - (t/2) cot(t/2)) / t^2.
    """
    theta = np.asarray(theta, dtype=float)
    t2 = np.einsum("...i,...i->...", theta, theta)
    t = np.sqrt(t2)
    small = t < 1e-3
    ts = np.where(small, 1.0, t)
    eta = np.where(small, 1.0 / 12.0 + t2 / 720.0,
                   (1.0 - 0.5 * ts / np.tan(0.5 * ts)) / ts**2)
    s = skew(theta)
    eye = np.broadcast_to(np.eye(3), s.shape)
    return eye - 0.5 * s + eta[..., None, None] * (s @ s)


def logmap_moderate(rot: np.ndarray) -> np.ndarray:
    """Rotation vector of rotation matrices whose angles stay well below pi.

    Cheaper than :func:`logmap` (no branch on the largest quaternion part):
    theta = atan2(|a|, (tr - 1) / 2) a / |a| with a the axial vector of the
    skew part. Exact for angles up to about 3 rad; used for the small local
    rotations of corotational elements, with :func:`logmap` taking over for
    any larger angle.
    """
    r = np.asarray(rot, dtype=float)
    a = 0.5 * np.stack([r[..., 2, 1] - r[..., 1, 2], r[..., 0, 2] - r[..., 2, 0],
                        r[..., 1, 0] - r[..., 0, 1]], axis=-1)
    s = np.sqrt(np.einsum("...i,...i->...", a, a))
    c = 0.5 * (r[..., 0, 0] + r[..., 1, 1] + r[..., 2, 2] - 1.0)
    angle = np.arctan2(s, c)
    small = s < 1e-8
    scale = np.where(small, 1.0 + angle**2 / 6.0, angle / np.where(small, 1.0, s))
    out = a * scale[..., None]
    big = angle > 3.0
    if np.any(big):
        out[big] = logmap(r[big])
    return out
