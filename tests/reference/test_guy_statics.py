"""Guys checked against statics and Hooke's law.

Sources: statics (equilibrium of forces and moments, Newton's laws); Hooke's
law for the stretch of a straight cable, T L / (E A) (references.md, Cables);
springs in series (the guy and its ground anchor carry the same force, so
their flexibilities add). Tolerances allow for the geometric nonlinearity of
the solved model (displacements are ~1e-3 of the lengths) and for the eye
link, taken as 1000 times stiffer than the guy.
"""
import numpy as np
import pytest

from spanstay.fem import BeamSection, Model, solve
from spanstay.models.parts.guys import add_guy, guy_state, tune_pretension
from spanstay.models.catalogs.rope import find_rope
from spanstay.models.scenario.spec import GuySpec

ROPE = find_rope("7x19-galv-1/4")
POST = BeamSection.rectangle(11e9, 11e9 / 16, 0.14, 0.14)  # a 6x6 timber post


def guy_spec(ground, height, pretension=0.0, stiffness=None, capacity=None):
    return GuySpec(attach_height=height, ground_point=tuple(ground), direction_deg=0.0, rope=ROPE,
                   pretension=pretension, anchor_fixed=stiffness is None,
                   anchor_stiffness=stiffness, anchor_capacity=capacity,
                   termination_efficiency=0.8)


def pinned_post(height, n=6, section=POST):
    """A vertical post hinged at its base about y (x-z plane frame)."""
    m = Model()
    nodes = m.add_nodes(np.column_stack([np.zeros(n + 1), np.zeros(n + 1),
                                         np.linspace(0, height, n + 1)]))
    m.add_beams(nodes[:-1], nodes[1:], section, orientation=(0, 1, 0), name="post")
    m.fix(int(nodes[0]), ["ux", "uy", "uz", "rx", "rz"])
    return m, nodes


def test_one_guy_tension_from_moment_equilibrium():
    # Line at the top (3 m), guy at 2.4 m to a ground anchor 2 m behind: moments about
    # the base pin give T cos(alpha) a = P H (statics).
    H, a, b, P = 3.0, 2.4, 2.0, 2000.0
    m, nodes = pinned_post(H, n=5)  # node every 0.6 m: one at 2.4 m
    guy_node = int(nodes[4])
    # a small pretension keeps the guy taut at the start (a pinned post on a slack guy is a
    # mechanism); one guy on a pinned post is statically determinate, so it drops out
    g = add_guy(m, guy_node, guy_spec((-b, 0.0, 0.0), a, pretension=50.0), name="guy")
    m.add_load(int(nodes[-1]), [P, 0, 0])
    st = solve(m, steps=2)
    cos_a = b / np.hypot(a, b)
    T = P * H / (a * cos_a)
    assert guy_state(m, st, g).tension == pytest.approx(T, rel=3e-3)
    # base pin: horizontal reaction P - T cos(alpha) (statics; a difference of two large
    # forces, so compared to P: the guy's angle turns ~2e-3 rad as it stretches)
    assert st.reactions[int(nodes[0]), 0] == pytest.approx(-(P - T * cos_a), abs=1e-2 * P)


def test_elastic_guy_top_displacement_springs_in_series():
    # Guy and line at the top: the post is a two-force member. The guy (EA/L) and its
    # ground anchor (k) are springs in series: stretch T (L/EA + 1/k) along the guy;
    # the top moves u with u . e = that stretch (e from anchor to top), and the post
    # shortens by N H / (E A_post), N = T sin(alpha). A pretension T0 keeps the guy taut
    # at the start; the stretch from the undeformed chord is then (T - T0)(L/EA + 1/k).
    H, b, P, k, T0 = 3.0, 2.5, 1500.0, 1.5e6, 50.0
    m, nodes = pinned_post(H)
    top = int(nodes[-1])
    g = add_guy(m, top, guy_spec((-b, 0.0, 0.0), H, pretension=T0, stiffness=k), name="guy")
    m.add_load(top, [P, 0, 0])
    st = solve(m, steps=2)
    L = np.hypot(H, b)
    cos_a, sin_a = b / L, H / L
    T = P / cos_a
    assert guy_state(m, st, g).tension == pytest.approx(T, rel=2e-3)
    u_z = -T * sin_a * H / (POST.E * POST.A)
    stretch = (T - T0) * (L / ROPE.EA + 1.0 / k)
    u_x = (stretch - u_z * sin_a) / cos_a
    assert st.translation[top, 0] == pytest.approx(u_x, rel=1e-2)
    assert guy_state(m, st, g).anchor_movement == pytest.approx(T / k, rel=1e-2)


def test_guy_on_the_slack_side_carries_nothing():
    # Two guys, front (on the line side) and back; pretension T0 each. Rigid-post
    # statics: the front guy goes slack once P > 2 T0 cos(alpha); then the back guy
    # alone carries P / cos(alpha) and the front exactly nothing.
    H, b, T0 = 3.0, 2.5, 300.0
    m, nodes = pinned_post(H)
    top = int(nodes[-1])
    back = add_guy(m, top, guy_spec((-b, 0, 0), H, pretension=T0), name="back")
    front = add_guy(m, top, guy_spec((b, 0, 0), H, pretension=T0), name="front")
    cos_a = b / np.hypot(H, b)
    st0 = solve(m)
    # pretension held (the post shortens a little: within 1 %)
    for g in (back, front):
        assert guy_state(m, st0, g).tension == pytest.approx(T0, rel=1e-2)
    P = 4.0 * T0 * cos_a
    m.add_load(top, [P, 0, 0])
    st = solve(m, steps=4)
    assert guy_state(m, st, front).slack
    assert guy_state(m, st, front).tension == 0.0
    assert guy_state(m, st, back).tension == pytest.approx(P / cos_a, rel=2e-3)


def test_guy_on_the_post_face_moves_the_base_moment():
    # A cantilever post fixed at its base with the guy's eye on its face (half the post
    # depth out toward the anchor). Statics: the base moment balances the line load and
    # the guy force applied at the eye, not at the axis.
    H, b, P = 3.0, 2.5, 1500.0
    m = Model()
    nodes = m.add_nodes(np.column_stack([np.zeros(7), np.zeros(7), np.linspace(0, H, 7)]))
    m.add_beams(nodes[:-1], nodes[1:], POST, orientation=(0, 1, 0), name="post")
    m.fix(int(nodes[0]), "all")
    top = int(nodes[-1])
    face = np.array([-0.07, 0.0, 0.0])
    g = add_guy(m, top, guy_spec((-b, 0, 0), H, pretension=500.0), offset=face, name="guy")
    m.add_load(top, [P, 0, 0])
    st = solve(m, steps=2)
    x = m.coords + st.translation
    T = guy_state(m, st, g).tension
    e = x[g.ground_node] - x[g.eye_node]
    F_guy = T * e / np.linalg.norm(e)
    r0 = x[int(nodes[0])]
    M_loads = np.cross(x[top] - r0, [P, 0, 0]) + np.cross(x[g.eye_node] - r0, F_guy)
    assert st.reactions[int(nodes[0]), 3:] == pytest.approx(-M_loads, abs=1e-3 * P * H)
    # the offset matters: the vertical part of the guy force times 0.07 m
    assert abs(F_guy[2] * 0.07) > 20 * 1e-3 * P * H


def test_line_pulling_at_an_angle_in_plan_three_dimensional_equilibrium():
    # A post on a ball joint (twist held) with two guys splayed behind it and a line
    # pulling at 25 deg in plan and 8 deg down. Statics at the top node: the line
    # force, the two guy tensions along their chords and the post's axial force
    # balance (3 equations, 3 unknowns), solved with numpy. Then every reaction
    # (base, ground anchors) balances the applied load in force and moment.
    H, R = 4.0, 3.5
    m = Model()
    nodes = m.add_nodes(np.column_stack([np.zeros(9), np.zeros(9), np.linspace(0, H, 9)]))
    m.add_beams(nodes[:-1], nodes[1:], POST, orientation=(0, 1, 0), name="post")
    base, top = int(nodes[0]), int(nodes[-1])
    m.fix(base, ["ux", "uy", "uz", "rz"])
    guys = []
    for i, ang in enumerate((150.0, 215.0)):
        a = np.radians(ang)
        ground = (R * np.cos(a), R * np.sin(a), -0.3)
        guys.append(add_guy(m, top, guy_spec(ground, H, pretension=50.0, stiffness=3e6),
                            name=f"guy{i}"))
    az, dip = np.radians(25.0), np.radians(-8.0)
    P = 2500.0 * np.array([np.cos(dip) * np.cos(az), np.cos(dip) * np.sin(az), np.sin(dip)])
    m.add_load(top, P)
    st = solve(m, steps=2)
    top_xyz = m.coords[top]
    cols = [(np.asarray(g.spec.ground_point) - top_xyz) / np.linalg.norm(
        np.asarray(g.spec.ground_point) - top_xyz) for g in guys]
    cols.append(np.array([0.0, 0.0, -1.0]))  # post compression pushes the top up: -N ez
    A = np.column_stack(cols)
    T1, T2, N = np.linalg.solve(A, -P)
    assert N < 0  # the post is in compression
    got = [guy_state(m, st, g).tension for g in guys]
    np.testing.assert_allclose(got, [T1, T2], rtol=5e-3)
    # global balance of all reactions (supports and ground anchors) with the load
    x = m.coords + st.translation
    r = st.reactions
    np.testing.assert_allclose(r[:, :3].sum(axis=0) + P, 0.0, atol=1e-6 * 2500.0)
    moment = np.cross(x, r[:, :3]).sum(axis=0) + r[:, 3:].sum(axis=0) + np.cross(x[top], P)
    np.testing.assert_allclose(moment, 0.0, atol=1e-6 * 2500.0 * H)


def test_tuned_guy_lengths_give_the_stated_pretension_on_a_flexible_post():
    # A slender cantilever post bends under the guy's pretension, which slackens the
    # guy; re-cutting the guy restores the stated pretension (the design input).
    H, b, T0 = 3.0, 2.0, 800.0
    slender = BeamSection.rectangle(9e9, 9e9 / 16, 0.09, 0.09)
    m = Model()
    nodes = m.add_nodes(np.column_stack([np.zeros(7), np.zeros(7), np.linspace(0, H, 7)]))
    m.add_beams(nodes[:-1], nodes[1:], slender, orientation=(0, 1, 0), name="post")
    m.fix(int(nodes[0]), "all")
    g = add_guy(m, int(nodes[-1]), guy_spec((-b, 0, 0), H, pretension=T0, stiffness=1e6),
                name="guy")
    st = solve(m)
    assert guy_state(m, st, g).tension < 0.9 * T0  # the post gave way
    st = tune_pretension(m, [(g.cable, T0)], st)
    assert guy_state(m, st, g).tension == pytest.approx(T0, rel=1e-3)


def test_guyed_anchor_shares_an_angled_pull_between_guys_and_footing():
    # A 6x6 post fixed at grade with two guys on its faces and a line pulling at 30 deg in
    # plan: every reaction balances the pull in force and moment (statics), and the
    # guys' share plus the footing's share is the whole pull.
    from dataclasses import replace

    from spanstay.models.analysis.anchor_shares import reaction_shares
    from spanstay.models.parts.anchor import add_anchor
    from spanstay.models.scenario.spec import FootingSpec
    from tests.reference.test_brace_statics import GROUND, anchor

    fixed = FootingSpec(kind="fixed", depth=0.0, pier_diameter=None, backfill=None,
                        base_spring=None, soil=None, slab_at_grade=False,
                        double_lateral_bearing=False)
    H = 3.2
    guys = tuple(guy_spec((3.0 * np.cos(np.radians(a)), 3.0 * np.sin(np.radians(a)), 0.0), 3.0,
                          pretension=400.0, stiffness=2e6) for a in (160.0, 220.0))
    spec = replace(anchor(H, None), footing=fixed, guys=guys)
    m = Model()
    pull = np.array([np.cos(np.radians(30.0)), np.sin(np.radians(30.0)), 0.0])
    built = add_anchor(m, spec, GROUND, [H], pull)
    P = 2000.0 * pull + np.array([0.0, 0.0, -300.0])
    top = built.node_at(H)
    m.add_load(top, P)
    st = solve(m, steps=2)
    x = m.coords + st.translation
    r = st.reactions
    np.testing.assert_allclose(r[:, :3].sum(axis=0), -P, atol=1e-6 * 2000.0)
    moment = np.cross(x, r[:, :3]).sum(axis=0) + r[:, 3:].sum(axis=0) + np.cross(x[top], P)
    np.testing.assert_allclose(moment, 0.0, atol=1e-6 * 2000.0 * H)
    shares = reaction_shares(m, built, st)
    np.testing.assert_allclose(shares["guys"] + shares["footing"], -P, atol=1e-6 * 2000.0)
    assert np.all(shares["brace"] == 0.0)
    # each guy's ground reaction lies along its chord and equals its tension
    for g in built.guys:
        rg = r[g.ground_node, :3] + (r[g.support_node, :3] if g.support_node is not None else 0)
        assert np.linalg.norm(rg) == pytest.approx(guy_state(m, st, g).tension, rel=1e-3)
