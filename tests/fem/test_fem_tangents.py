"""Closed-form tangents of the beam and the link against the derivative of their forces.

Reference: the definition of the derivative, evaluated by central differences of the
element force (error O(h^2) ~ 1e-10 relative with h = 1e-5, far below the 1e-6
tolerance) in fem.group.central_difference_tangent. The closed forms follow Battini &
Pacoste (2002), CMAME 191 (cited from memory), for the corotational frame and the
rotation-vector maps.
"""
from __future__ import annotations

import numpy as np
import pytest

import spanstay.fem as fem
import spanstay.fem.beam_tangent as bt
from spanstay.fem.group import central_difference_tangent
from spanstay.fem.rotation import expmap

H_DIFF = 1e-5
TOL = 1e-6


def _beam_case(seed: int, spin: float, shift: float):
    rng = np.random.default_rng(seed)
    n = 6
    m = fem.Model()
    ids = m.add_nodes(rng.normal(size=(n + 1, 3)) * 2.0)
    group = m.add_beams(ids[:-1], ids[1:], fem.BeamSection.rectangle(10e9, 6e8, 0.1, 0.2),
                        orientation=rng.normal(size=3))
    rot = expmap(rng.normal(size=(n + 1, 3)) * spin)
    disp = np.zeros((n + 1, 6))
    disp[:, :3] = rng.normal(size=(n + 1, 3)) * shift
    return group, rot, disp


def _beam_difference(group, rot, disp):
    u1, u2, r1, r2 = group._state(disp, rot)

    def force(a1, a2, b1, b2, reps):
        return group._core(a1, a2, b1, b2, np.tile(group.frame0, (reps, 1, 1)), np.tile(group.L0, reps),
                           group.k_local, np.tile(group.chord0, (reps, 1)))[0]

    return central_difference_tangent(force, u1, u2, r1, r2, steps_t=H_DIFF * group.L0,
                                      steps_r=np.full(group.size, H_DIFF), translation_invariant=True)


def _relative(a: np.ndarray, b: np.ndarray) -> np.ndarray:
    return np.abs(a - b).max(axis=(1, 2)) / np.abs(b).max(axis=(1, 2))


@pytest.mark.parametrize("spin, shift", [(0.4, 0.1), (1e-4, 1e-3), (1.0, 0.3)])
def test_beam_tangent_matches_the_derivative_of_the_force(spin, shift):
    group, rot, disp = _beam_case(1, spin, shift)
    closed = group.evaluate(None, rot, disp, True).tangent
    oracle = _beam_difference(group, rot, disp)
    assert _relative(closed, oracle).max() < TOL
    # the geometric part alone (the material part B^T K B removed from both), which the
    # large axial stiffness would otherwise hide
    kin: dict = {}
    u1, u2, r1, r2 = group._state(disp, rot)
    group._core(u1, u2, r1, r2, group.frame0, group.L0, group.k_local, group.chord0, kin)
    for key in ("n_ax", "y1", "y2", "m1", "m2"):
        kin[key] = np.zeros_like(kin[key])
    material = bt.corotational_tangent(kin, group.k_local, kin["inv_t1"], kin["inv_t2"])
    geometric_oracle = oracle - material
    assert np.abs(geometric_oracle).max() > 1e-6 * np.abs(oracle).max()   # there is one to check
    assert _relative(closed - material, geometric_oracle).max() < TOL


def test_beam_difference_tangent_kept_as_option():
    group, rot, disp = _beam_case(3, 0.4, 0.1)
    closed = group.evaluate(None, rot, disp, True).tangent
    one_sided = group.evaluate(None, rot, disp, "difference").tangent
    assert _relative(one_sided, closed).max() < 1e-5   # one-sided steps of 1.5e-8: ~1e-7 error


def test_eta_and_mu_series_join_the_closed_forms():
    # eta = (1 - (t/2) cot(t/2)) / t^2 and mu = eta'(t) / t: the series below t = 0.05
    # against the closed form just above it, and mu against a difference of eta.
    t = np.array([[0.0499999, 0.0, 0.0], [0.0500001, 0.0, 0.0], [0.7, 0.0, 0.0]])
    eta, mu, _ = bt._eta_mu(t)
    assert eta[0] == pytest.approx(eta[1], rel=1e-9) and mu[0] == pytest.approx(mu[1], rel=1e-6)
    h = 1e-5
    e_plus, _, _ = bt._eta_mu(t[2:] + [h, 0, 0])
    e_minus, _, _ = bt._eta_mu(t[2:] - [h, 0, 0])
    assert mu[2] == pytest.approx((e_plus[0] - e_minus[0]) / (2 * h) / 0.7, rel=1e-7)
    assert eta[2] == pytest.approx((1 - 0.35 / np.tan(0.35)) / 0.49, rel=1e-14)


def test_link_tangent_matches_the_derivative_of_the_force():
    rng = np.random.default_rng(2)
    n = 5
    m = fem.Model()
    a = m.add_nodes(rng.normal(size=(n, 3)))
    b = m.add_nodes(rng.normal(size=(n, 3)))
    group = m.add_links(a, b, rng.uniform(1e3, 1e5, size=(n, 6)), offset1=rng.normal(size=(n, 3)) * 0.1,
                        offset2=rng.normal(size=(n, 3)) * 0.1, axes=expmap(rng.normal(size=(n, 3))))
    rot = expmap(rng.normal(size=(m.n_nodes, 3)) * 0.3)
    disp = np.zeros((m.n_nodes, 6))
    disp[:, :3] = rng.normal(size=(m.n_nodes, 3)) * 0.05
    closed = group.evaluate(None, rot, disp, True).tangent
    u1, u2, r1, r2 = group._state(disp, rot)

    def force(p1, p2, q1, q2, reps):
        return group._forces(p1, p2, q1, q2, *group._consts(reps))[0]

    oracle = central_difference_tangent(force, u1, u2, r1, r2, steps_t=np.full(n, H_DIFF),
                                        steps_r=np.full(n, H_DIFF), translation_invariant=True)
    assert _relative(closed, oracle).max() < TOL
