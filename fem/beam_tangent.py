"""Closed-form consistent tangent of the corotational beam of :mod:`fem.beam`.

The internal force is f = B_a^T N + sum_i G_i^T y_i with the rigid-frame
transformation of Battini & Pacoste (2002, "Co-rotational beam elements with
warping effects in instability problems", CMAME 191, cited from memory: G_i = R_r^T E_i - W_r,
local rotations theta_i = log(R_r^T R_i R_0), B_i = T_s^-1(theta_i) G_i,
y_i = T_s^-T(theta_i) m_i). Its exact derivative is written here term by term
(product rule), all elements at once:

    K = B^T K_l B                                   material
      + N dB_a                                      axial force turning with the chord
      + sum_i E_i^T (-S(R_r y_i)) Omega             rotation of the frame carrying y_i
      + sum_i (E_i^T R_r - W_r^T) H_i B_i           derivative of T_s^-T(theta) m at fixed m
      - d(W_r^T v) at fixed v = y_1 + y_2           the frame's own spin map varying

where Omega = R_r W_r is the global spin of the frame per DOF and
H_i = d(T_s^-T(theta) m_i)/d theta. Checked against the difference tangent
(tests/fem/test_fem_tangents.py).
"""
from __future__ import annotations

import numpy as np

from .rotation import cross3, skew


#: local deformations that carry stiffness: end rotations and the elongation
_CARRYING = np.array([3, 4, 5, 6, 9, 10, 11])


def _eta_mu(theta: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """eta(t) = (1 - (t/2) cot(t/2)) / t^2 and mu = (d eta / d t) / t, with t = |theta|.

    Series below t = 0.05 (eta = 1/12 + t^2/720 + t^4/30240, mu = 1/360 + t^2/7560
    + t^4/201600, from (x/2) cot(x/2) = 1 - x^2/12 - x^4/720 - x^6/30240 - ...).
    """
    t2 = np.einsum("ni,ni->n", theta, theta)
    t = np.sqrt(t2)
    small = t < 0.05
    ts = np.where(small, 1.0, t)
    half = 0.5 * ts
    c = half / np.tan(half)
    dc = 0.5 / np.tan(half) - 0.25 * ts / np.sin(half) ** 2
    eta = np.where(small, 1.0 / 12.0 + t2 / 720.0 + t2 * t2 / 30240.0, (1.0 - c) / ts**2)
    mu = np.where(small, 1.0 / 360.0 + t2 / 7560.0 + t2 * t2 / 201600.0,
                  -dc / ts**3 - 2.0 * (1.0 - c) / ts**4)
    return eta, mu, t2


def inverse_tangent_transpose_derivative(theta: np.ndarray, m: np.ndarray) -> np.ndarray:
    """(n, 3, 3) derivative of T_s^-T(theta) m with respect to theta at fixed m.

    T_s^-T m = m + theta x m / 2 + eta (theta (theta . m) - t^2 m).
    """
    eta, mu, t2 = _eta_mu(theta)
    tm = np.einsum("ni,ni->n", theta, m)
    eye = np.eye(3)[None]
    h = -0.5 * skew(m)
    h += eta[:, None, None] * (tm[:, None, None] * eye + theta[:, :, None] * m[:, None, :]
                               - 2.0 * m[:, :, None] * theta[:, None, :])
    w = theta * tm[:, None] - t2[:, None] * m
    h += mu[:, None, None] * w[:, :, None] * theta[:, None, :]
    return h


def _rows(a: np.ndarray, b: np.ndarray, c: np.ndarray, d: np.ndarray) -> np.ndarray:
    """(n, 12) row from four (n, 3) blocks."""
    return np.concatenate([a, b, c, d], axis=1)


def corotational_tangent(kin: dict, k_local: np.ndarray, inv_t1: np.ndarray,
                         inv_t2: np.ndarray) -> np.ndarray:
    """(n, 12, 12) consistent tangent from the kinematics kept by ``BeamGroup._core``.

    ``inv_t1``, ``inv_t2`` are T_s^-1 of the two local rotation vectors.
    """
    e1, e2, e3, rr, ln = kin["e1"], kin["e2"], kin["e3"], kin["rr"], kin["ln"]
    q, q1, q2, ql1, ql2, wr = kin["q"], kin["q1"], kin["q2"], kin["ql1"], kin["ql2"], kin["wr"]
    n = e1.shape[0]
    zero = np.zeros((n, 3, 3))
    eye = np.broadcast_to(np.eye(3), (n, 3, 3))
    # derivatives of the frame quantities, (n, 3, 12) or (n, 12)
    d_ln = _rows(-e1, zero[:, 0], e1, zero[:, 0])
    proj = (eye - e1[:, :, None] * e1[:, None, :]) / ln[:, None, None]
    d_e1 = np.concatenate([-proj, zero, proj, zero], axis=2)
    omega = rr @ wr
    d_e2 = -skew(e2) @ omega
    d_e3 = -skew(e3) @ omega
    d_q1 = np.concatenate([zero, -skew(q1), zero, zero], axis=2)
    d_q2 = np.concatenate([zero, zero, zero, -skew(q2)], axis=2)
    d_q = 0.5 * (d_q1 + d_q2)
    d_ql1 = (q[:, None, :] @ d_e1 + e1[:, None, :] @ d_q)[:, 0]
    d_ql2 = (q[:, None, :] @ d_e2 + e2[:, None, :] @ d_q)[:, 0]
    # B: rows of d(local deformations) per DOF
    sel1 = np.concatenate([zero, np.transpose(rr, (0, 2, 1)), zero, zero], axis=2)
    sel2 = np.concatenate([zero, zero, zero, np.transpose(rr, (0, 2, 1))], axis=2)
    g1, g2 = sel1 - wr, sel2 - wr
    b1, b2 = inv_t1 @ g1, inv_t2 @ g2
    # only theta_1, the elongation and theta_2 carry stiffness: a 7-row B
    b7 = np.concatenate([b1, d_ln[:, None, :], b2], axis=1)
    k7 = k_local[:, _CARRYING][:, :, _CARRYING]
    k = np.transpose(b7, (0, 2, 1)) @ (k7 @ b7)
    # axial force turning with the chord
    n_ax = kin["n_ax"][:, None, None]
    k[:, 0:3] -= n_ax * d_e1
    k[:, 6:9] += n_ax * d_e1
    # y_i carried by the frame, and the derivative of T_s^-T at fixed moments
    y1, y2 = kin["y1"], kin["y2"]
    h1 = inverse_tangent_transpose_derivative(kin["th1"], kin["m1"]) @ b1
    h2 = inverse_tangent_transpose_derivative(kin["th2"], kin["m2"]) @ b2
    k[:, 3:6] += -skew((rr @ y1[:, :, None])[:, :, 0]) @ omega + rr @ h1
    k[:, 9:12] += -skew((rr @ y2[:, :, None])[:, :, 0]) @ omega + rr @ h2
    k -= np.transpose(wr, (0, 2, 1)) @ (h1 + h2)
    # the spin map W_r itself varying, contracted with v = y_1 + y_2
    v = y1 + y2
    d_e2_l = d_e2 / ln[:, None, None] - e2[:, :, None] * d_ln[:, None, :] / ln[:, None, None] ** 2
    d_e3_l = d_e3 / ln[:, None, None] - e3[:, :, None] * d_ln[:, None, :] / ln[:, None, None] ** 2
    vx, vy, vz = v[:, 0, None, None], v[:, 1, None, None], v[:, 2, None, None]
    ratio = ql1 / ql2
    d_ratio = d_ql1 / ql2[:, None] - (ql1 / ql2**2)[:, None] * d_ql2
    # sum over the rows x, y, z of v_k dW_k: chord terms at the translations, the ratio
    # ql1 / ql2 of row x varying, and row x's rotation blocks
    chord = (vy + vx * ratio[:, None, None]) * d_e3_l - vz * d_e2_l
    k[:, 0:3] -= chord
    k[:, 6:9] += chord
    k -= vx * wr[:, 1, :, None] * d_ratio[:, None, :]
    for node, qi, d_qi in ((1, q1, d_q1), (3, q2, d_q2)):
        c = cross3(qi, e3)
        d_c = -skew(e3) @ d_qi + skew(qi) @ d_e3
        blk = d_c / (2.0 * ql2[:, None, None]) - c[:, :, None] * d_ql2[:, None, :] / (
            2.0 * ql2[:, None, None] ** 2)
        k[:, 3 * node:3 * node + 3] -= vx * blk
    return k
