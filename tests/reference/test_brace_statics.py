"""Kicker-braced posts and H-braces checked against statics.

Sources: statics (equilibrium of forces and moments; a weightless member
pinned at both ends and loaded only there is a two-force member, its force
along the line joining the pins). With pinned joints an H-brace's diagonal
carries the horizontal pull over the cosine of its angle,
T = P / cos(theta), when the rail and wire meet the post axes; here they meet
the post faces, so the exact planar statics with those points is solved too.

Posts stand on "fixed" footings with a weak rotational base spring (1 kN m/rad:
the base moment stays below 0.1 % of the line's moment), i.e. pinned bases.
"""
import numpy as np
import pytest

from spanstay.fem import Model, solve
from spanstay.models.parts.anchor import add_anchor
from spanstay.models.parts.braces import member_axial_force
from spanstay.models.scenario.spec import AnchorSpec, BraceSpec, FootingSpec, GroundSpec, PostSpec, SectionSpec
from spanstay.models.catalogs.rope import find_rope

IN = 0.0254
SIX = SectionSpec("6x6", 5.5 * IN, 5.5 * IN)   # PS 20 dressed size (references.md)
FOUR = SectionSpec("4x4", 3.5 * IN, 3.5 * IN)
PINNED = FootingSpec(kind="fixed", depth=0.0, pier_diameter=None, backfill=None,
                     base_spring=1.0e3, soil=None, slab_at_grade=False,
                     double_lateral_bearing=False)
GROUND = GroundSpec(profile=(), soil=())


def post(height):
    return PostSpec(kind="sawn", height=height, species="southern pine", grade="No. 2",
                    section=SIX)


def anchor(height, brace):
    return AnchorSpec(name="A", kind="post", x=0.0, y=0.0, grade=0.0, post=post(height),
                      footing=PINNED, guys=(), brace=brace, tree=None)


def moment_y(point, force):
    """y-component of point x force (moment about the origin, x-z plane)."""
    return point[2] * force[0] - point[0] * force[2]


def test_kicker_strut_force_from_statics():
    # Post 3 m, line pull P at the top toward +x, kicker from 2 m up on the post face
    # to a foot 1.5 m out (fixed foot). Moments about the base pin:
    #   P H + (p_top x C u)_y = 0, u the unit vector from the foot up to the strut top.
    H, a, b, P = 3.0, 2.0, 1.5, 1000.0
    brace = BraceSpec(kind="kicker", direction_deg=None, attach_height=a, foot_distance=b,
                      member=FOUR, species="southern pine", grade="No. 2")
    m = Model()
    built = add_anchor(m, anchor(H, brace), GROUND, [H], np.array([1.0, 0, 0]))
    top = built.node_at(H)
    m.add_load(top, [P, 0, 0])
    st = solve(m, steps=2)
    strut = built.brace.strut
    p_top, foot = strut.end1_point, strut.end2_point
    assert p_top[0] == pytest.approx(0.5 * SIX.depth)  # on the face toward the foot
    u = (p_top - foot) / np.linalg.norm(p_top - foot)
    C = -moment_y([0, 0, H], [P, 0, 0]) / moment_y(p_top, u)  # force on the post = C u
    assert C > 0  # the strut pushes: compression
    N = member_axial_force(st, strut)
    np.testing.assert_allclose(-N, C, rtol=3e-3)
    # the foot takes the strut force: its reaction is -C u... from the ground: +C u
    np.testing.assert_allclose(st.reactions[built.brace.block_node, :3], C * u,
                               rtol=3e-3, atol=1e-3 * P)
    # without the face offset the classic result P H / (a cos(alpha)) is within 5 %
    cos_a = b / np.hypot(a, b)
    assert C == pytest.approx(P * H / (a * cos_a), rel=0.05)


def h_brace(rail_height=1.5, distance=2.4, pretension=200.0):
    return BraceSpec(kind="h-brace", direction_deg=None, species="southern pine",
                     grade="No. 2", second_post=post(rail_height + 0.3), second_footing=PINNED,
                     distance=distance, rail_height=rail_height, rail=FOUR,
                     diagonal_rope=find_rope("7x19-galv-1/4"), diagonal_pretension=pretension)


def test_h_brace_diagonal_carries_pull_over_cosine():
    # Main post A at x = 0 pulled toward +x at the rail height r; second post B at
    # x = -d; rail between the facing faces; diagonal from A's face at r to B's face
    # at grade. Unknowns: rail force R (tension +) and wire tension T.
    # Moments about A's base pin and about B's base pin (statics) give two equations.
    r, d, P = 1.5, 2.4, 1200.0
    m = Model()
    built = add_anchor(m, anchor(r + 0.3, h_brace(r, d)), GROUND, [r], np.array([1.0, 0, 0]))
    hb = built.brace
    assert hb.diagonal_from == "main"
    m.add_load(built.node_at(r), [P, 0, 0])
    st = solve(m, steps=2)
    w = SIX.depth
    pA = np.array([-w / 2, 0, r])          # rail end and wire top on A's face toward B
    pB = np.array([-d + w / 2, 0, r])      # rail end on B's face toward A
    qB = np.array([-d + w / 2, 0, 0.0])    # wire bottom on B's face at grade
    baseB = np.array([-d, 0, 0.0])
    np.testing.assert_allclose(hb.diagonal_top, pA, atol=1e-9)
    np.testing.assert_allclose(hb.diagonal_bottom, qB, atol=1e-9)
    u = (qB - pA) / np.linalg.norm(qB - pA)          # wire force on A is T u, on B is -T u
    ex = np.array([1.0, 0, 0])
    # A: P at (0, r) + rail R (-ex) at pA + T u at pA  -> moment about A's base = 0
    # B: rail R (+ex) at pB + T (-u) at qB             -> moment about B's base = 0
    A = np.array([[moment_y(pA, -ex), moment_y(pA, u)],
                  [moment_y(pB - baseB, ex), moment_y(qB - baseB, -u)]])
    rhs = -np.array([moment_y([0, 0, r], P * ex), 0.0])
    R, T = np.linalg.solve(A, rhs)
    assert st.group(hb.diagonal).tension[0] == pytest.approx(T, rel=3e-3)
    np.testing.assert_allclose(member_axial_force(st, hb.rail), R, atol=3e-3 * P)
    # P / cos(theta) with theta the angle between the post axes (d apart, r high): within
    # 5 %; the faces (w = 0.14 m) shift the wire's ends and the rail takes a little
    theta = np.arctan2(r, d)
    assert T == pytest.approx(P / np.cos(theta), rel=0.05)
    assert hb.diagonal_angle == pytest.approx(np.arctan2(r, d - w))
