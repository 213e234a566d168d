"""Tension-only cable segments against exact string and catenary solutions.

Sources (see shared references.md):
- Weightless elastic string with a point load at mid-length: statics plus Hooke's law,
  2 T d / sqrt(a^2 + d^2) = W, T = EA (2 sqrt(a^2 + d^2) - L0) / L0, solved with brentq.
- Elastic catenary: Irvine, Cable Structures (1981), Sec. 2.2 (the span and rise
  equations, solved with fsolve; mid-span sag from the parametric solution with brentq).
- Hooke's law for the stretch of a straight cable; thermal strain alpha dT.
- Statics of a guyed mast (any statics text).
"""
from __future__ import annotations

import numpy as np
import pytest
from scipy.optimize import brentq, fsolve

import spanstay.fem as fem
from test_engine_balance import assert_balance, lumped_weight, nodal_loads, tight

EA = 3.5e6   # N, a 1/4 in class wire rope (order of magnitude; any value will do here)


# -- weightless string with a point load -----------------------------------------------------

@pytest.mark.parametrize("L0_over_span", [0.995, 1.01])
def test_midpoint_loaded_string_vs_brentq(L0_over_span):
    a, W, n_half = 10.0, 2000.0, 8
    L0 = L0_over_span * 2 * a
    # exact: 2 T d / sqrt(a^2 + d^2) = W with T = EA (2 sqrt(a^2 + d^2) - L0) / L0
    def imbalance(d):
        chord = np.sqrt(a * a + d * d)
        return 2.0 * EA * (2.0 * chord - L0) / L0 * d / chord - W
    d_exact = brentq(imbalance, 1e-9, 5.0, xtol=1e-15, rtol=1e-15)
    t_exact = EA * (2.0 * np.sqrt(a * a + d_exact**2) - L0) / L0

    # start taut: straight when pretensioned, else a V deeper than the inextensible one
    d0 = 0.0 if L0 < 2 * a else 1.05 * np.sqrt((L0 / 2) ** 2 - a * a)
    x = np.linspace(-a, a, 2 * n_half + 1)
    z = -d0 * (1.0 - np.abs(x) / a)
    m = fem.Model()
    ids = m.add_nodes(np.c_[x, np.zeros_like(x), z])
    m.add_cables(ids[:-1], ids[1:], EA, L0 / (2 * n_half))
    m.fix([ids[0], ids[-1]], "xyz")
    mid = ids[n_half]
    m.add_load(mid, [0, 0, -W])
    s = fem.solve(m, options=tight())
    assert -s.u[mid, 2] + d0 == pytest.approx(d_exact, rel=1e-9)
    assert s.group("cables").tension == pytest.approx(np.full(2 * n_half, t_exact), rel=1e-9)
    # small-angle statics: T = W / (2 sin theta)
    theta = np.arctan2(d_exact, a)
    assert t_exact == pytest.approx(W / (2 * np.sin(theta)), rel=1e-12)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(mid, [0, 0, -W])]))


# -- elastic catenary ------------------------------------------------------------------------

def irvine(span: float, drop: float, L0: float, ea: float, w: float):
    """Irvine's elastic catenary: H and V at the left end, and z(s) (down) along it.

    span = H L0/EA + (H/w)[asinh(V/H) - asinh((V - w L0)/H)]
    drop = (L0/EA)(V - w L0/2) + (H/w)[sqrt(1 + (V/H)^2) - sqrt(1 + ((V - w L0)/H)^2)]
    with the right support ``drop`` below the left one (z measured downward).
    """
    def x_of(s, H, V):
        return H * s / ea + H / w * (np.arcsinh(V / H) - np.arcsinh((V - w * s) / H))

    def z_of(s, H, V):
        return (s / ea) * (V - w * s / 2) + H / w * (np.sqrt(1 + (V / H) ** 2)
                                                     - np.sqrt(1 + ((V - w * s) / H) ** 2))

    def eqs(p):
        H, V = p
        return [x_of(L0, H, V) - span, z_of(L0, H, V) - drop]

    sag_guess = np.sqrt(3 * span * max(L0 - np.hypot(span, drop), 1e-3 * span) / 8)
    H0 = w * span**2 / (8 * sag_guess)
    H, V = fsolve(eqs, [H0, w * L0 / 2], xtol=1e-13)
    assert np.abs(eqs([H, V])).max() < 1e-10 * span, "fsolve did not solve Irvine's equations"
    s_mid = brentq(lambda s: x_of(s, H, V) - span / 2, 0.0, L0, xtol=1e-14)
    sag_mid = z_of(s_mid, H, V) - drop / 2  # below the chord at mid-span
    return H, V, sag_mid


def _catenary_model(span, drop, L0, w, n):
    """Cable of n segments started taut on a parabola 0.2% longer than L0."""
    u = np.linspace(0.0, 1.0, 4001)
    def shape(f):
        return np.c_[u * span, np.zeros_like(u), -drop * u - 4 * f * u * (1 - u)]
    def length(f):
        return np.sum(np.linalg.norm(np.diff(shape(f), axis=0), axis=1))
    f = brentq(lambda f: length(f) - 1.002 * L0, 1e-6, span)
    pts = shape(f)
    arc = np.r_[0.0, np.cumsum(np.linalg.norm(np.diff(pts, axis=0), axis=1))]
    at = np.linspace(0.0, arc[-1], n + 1)
    xyz = np.c_[np.interp(at, arc, pts[:, 0]), np.zeros(n + 1), np.interp(at, arc, pts[:, 2])]
    m = fem.Model()
    ids = m.add_nodes(xyz)
    m.add_cables(ids[:-1], ids[1:], EA, L0 / n, weight=w)
    m.fix([ids[0], ids[-1]], "xyz")
    return m, ids


@pytest.mark.parametrize("drop", [0.0, 4.0])
def test_self_weight_cable_vs_irvine_elastic_catenary(drop):
    # Irvine (1981): H, V and the mid-span sag of an elastic catenary; level span and a
    # span whose far support is 4 m lower. 60 segments with the weight lumped at nodes.
    span, w, n = 40.0, 15.0, 60   # w N/m of unstressed length (a heavy rope, to sag visibly)
    L0 = np.hypot(span, drop) * 1.004
    H, V, sag = irvine(span, drop, L0, EA, w)
    if drop == 0.0:
        assert V == pytest.approx(w * L0 / 2, rel=1e-10)  # symmetric: half the weight each end
    m, ids = _catenary_model(span, drop, L0, w, n)
    s = fem.solve(m, options=tight())
    assert s.group("cables").tension.min() > 0.0
    r = s.reactions
    assert -r[ids[0], 0] == pytest.approx(H, rel=5e-4)
    assert r[ids[-1], 0] == pytest.approx(H, rel=5e-4)
    assert r[ids[0], 2] == pytest.approx(V, rel=5e-4)
    xyz = s.positions(m.coords)
    z_mid = np.interp(span / 2, xyz[:, 0], xyz[:, 2])
    sag_fe = -drop / 2 - z_mid
    assert sag_fe == pytest.approx(sag, rel=5e-4)  # issue 2 asks 0.5%; lumping error is ~0.02%
    assert sag > 0.02 * span
    weight = lumped_weight(m.n_nodes, m.group("cables").conn, w, L0 / n)
    assert_balance(m, s, weight)


# -- tension only -----------------------------------------------------------------------------

@pytest.mark.parametrize("load", [1500.0, 6000.0])
def test_two_collinear_guys_one_goes_slack(load):
    # Hooke's law for two pretensioned cables pulling a node from opposite anchors,
    # spans l each side, unstressed length L0 < l each (pretension T0 = EA (l - L0)/L0).
    # Both taut: H = 2 EA u / L0, so u = H L0 / (2 EA) while u < l - L0.
    # Beyond that the unloaded side is slack and carries nothing: H = EA (l + u - L0) / L0.
    l, L0 = 5.0, 5.0 * (1 - 5e-4)
    t0 = EA * (l - L0) / L0
    m = fem.Model()
    a, mid, b = m.add_nodes([[-l, 0, 0], [0, 0, 0], [l, 0, 0]])
    m.add_cables([a, mid], [mid, b], EA, L0)
    m.fix([a, b], "xyz")
    m.add_load(mid, [load, 0, 0])
    s = fem.solve(m, options=tight())
    u_both = load * L0 / (2 * EA)
    if u_both < l - L0:
        expected = u_both
        assert load < 2 * t0
    else:
        expected = load * L0 / EA - (l - L0)
        assert load > 2 * t0
    assert s.u[mid, 0] == pytest.approx(expected, rel=1e-9)
    t = s.group("cables").tension
    if load > 2 * t0:
        assert t[1] == 0.0 and s.group("cables").slack[1]
        assert t[0] == pytest.approx(load, rel=1e-9)
        assert np.abs(s.reactions[b]).max() == 0.0  # the slack guy pulls nothing
    assert_balance(m, s, nodal_loads(m.n_nodes, [(mid, [load, 0, 0])]))


@pytest.mark.parametrize("push", [+1.0, -1.0])
def test_cable_in_parallel_with_spring_carries_no_compression(push):
    # A node held by a spring k and a cable of stiffness EA/L0 (unstressed, straight).
    # Pulled: springs in parallel, u = P / (k + EA/L0). Pushed towards the anchor: the
    # cable goes slack and carries nothing, u = -P / k.
    k, L0, P = 2e5, 2.0, 1000.0
    m = fem.Model()
    anchor, node = m.add_nodes([[0, 0, 0], [L0, 0, 0]])
    m.add_cables([anchor], [node], EA, L0)
    m.add_springs([node], "ux", fem.LinearLaw(k))
    m.fix(anchor, "xyz")
    m.fix(node, ["uy", "uz"])
    m.add_load(node, [push * P, 0, 0])
    s = fem.solve(m, options=tight())
    if push > 0:
        # exact Hooke: P = k u + EA u / L0
        u = s.u[node, 0]
        assert k * u + EA * u / L0 == pytest.approx(P, rel=1e-9)
    else:
        assert s.u[node, 0] == pytest.approx(-P / k, rel=1e-9)
        assert s.group("cables").tension[0] == 0.0
        assert s.group("springs").force[0] == pytest.approx(-P, rel=1e-9)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(node, [push * P, 0, 0])]))


def test_guyed_mast_leeward_guy_slack_by_statics():
    # A mast pinned at its base, held at the top by two pretensioned guys in the x-z plane
    # and a third far out along y. A large load +x at the top slackens the guy to +x,
    # which then carries nothing. Statics of the top joint at the deformed geometry
    # (three guys and the axial force of the pinned, unloaded-between-ends mast balance
    # the load) gives the guy tensions, solved here as a 3x3 linear system.
    h, d, Hload, t0 = 6.0, 4.0, 3000.0, 500.0
    sec = fem.BeamSection.circle(10e9, 10e9 / 16, 0.2)
    m = fem.Model()
    base = m.add_node([0, 0, 0])
    mast = m.add_nodes(np.c_[np.zeros(6), np.zeros(6), np.linspace(h / 6, h, 6)])
    top = mast[-1]
    anchors = m.add_nodes([[-d, 0, 0], [d, 0, 0], [0, 30.0, 0]])
    m.add_beams(np.r_[base, mast[:-1]], mast, sec, orientation=(0, 1, 0))
    lengths = np.linalg.norm(m.coords[anchors] - m.coords[top], axis=1)
    m.add_cables(anchors, [top] * 3, EA, lengths / (1 + t0 / EA))
    m.fix(base, ["ux", "uy", "uz", "rz"])
    m.fix(anchors, "xyz")
    m.add_load(top, [Hload, 0, 0])
    s = fem.solve(m, steps=2, options=tight())
    t = s.group("cables").tension
    assert t[1] == 0.0 and s.group("cables").slack[1]
    assert np.abs(s.reactions[anchors[1]]).max() == 0.0   # the slack guy pulls nothing
    xyz = s.positions(m.coords)
    unit = lambda v: v / np.linalg.norm(v)  # noqa: E731
    e_w, e_s = unit(xyz[anchors[0]] - xyz[top]), unit(xyz[anchors[2]] - xyz[top])
    e_m = unit(xyz[base] - xyz[top])  # a compressed mast pushes the top away from the base
    A = np.c_[e_w, e_s, -e_m]
    t_w, t_s, n_mast = np.linalg.solve(A, -np.array([Hload, 0.0, 0.0]))
    assert t[0] == pytest.approx(t_w, rel=1e-7)
    assert t[2] == pytest.approx(t_s, rel=1e-7)
    assert -s.group("beams").end_forces[-1, 1, 0] == pytest.approx(n_mast, rel=1e-6)
    assert_balance(m, s, nodal_loads(m.n_nodes, [(top, [Hload, 0, 0])]))


# -- Hooke and thermal strain ----------------------------------------------------------------

@pytest.mark.parametrize("dT", [0.0, -30.0, 20.0])
def test_straight_cable_stretch_and_temperature(dT):
    # Hooke's law plus thermal strain: a cable of unstressed length L0 (at the reference
    # temperature) pulled by T stretches to L0 (1 + alpha dT)(1 + T / EA);
    # alpha = 11.7e-6 per K for steel rope (from memory).
    alpha, L0, T = 11.7e-6, 12.0, 4000.0
    m = fem.Model()
    ids = m.add_nodes(np.c_[np.linspace(0, L0, 5), np.zeros(5), np.zeros(5)])
    m.add_cables(ids[:-1], ids[1:], EA, L0 / 4, alpha=alpha, dT=dT)
    m.fix(ids[0], "xyz")
    m.add_load(ids[-1], [T, 0, 0])
    s = fem.solve(m, options=tight())
    stretched = L0 * (1 + alpha * dT) * (1 + T / EA)
    assert s.positions(m.coords)[-1, 0] == pytest.approx(stretched, rel=1e-12)
    assert s.u[-1, 0] == pytest.approx(T * L0 / EA + alpha * dT * L0, rel=2e-3)  # small strains
    assert_balance(m, s, nodal_loads(m.n_nodes, [(ids[-1], [T, 0, 0])]))


def test_cooling_raises_tension_between_fixed_anchors():
    # Fixed anchors a span l apart: T = EA (l / (L0 (1 + alpha dT)) - 1) (Hooke + thermal
    # strain); cooling by 30 K adds about EA alpha 30 of tension. alpha from memory.
    alpha, l = 11.7e-6, 30.0
    L0 = l / (1 + 800.0 / EA)
    m = fem.Model()
    ids = m.add_nodes(np.c_[np.linspace(0, l, 7), np.zeros(7), np.zeros(7)])
    g = m.add_cables(ids[:-1], ids[1:], EA, L0 / 6, alpha=alpha)
    m.fix(ids[[0, -1]], "xyz")
    for dT in (0.0, -30.0):
        g.dT[:] = dT
        s = fem.solve(m, options=tight())
        expected = EA * (l / (L0 * (1 + alpha * dT)) - 1)
        assert s.group("cables").tension == pytest.approx(np.full(6, expected), rel=1e-9)
        assert -s.reactions[ids[0], 0] == pytest.approx(expected, rel=1e-9)
    assert expected - 800.0 == pytest.approx(EA * alpha * 30.0, rel=2e-3)
    # no applied load: the two anchor reactions cancel
    assert np.abs(s.reactions.sum(axis=0)).max() <= 1e-9 * expected
