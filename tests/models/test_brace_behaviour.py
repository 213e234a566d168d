"""H-brace and kicker behaviour: the wire on the wrong diagonal goes slack, parts are
recorded for the slack budget, and "rigid" parts stiffen the anchor.

Source: statics of a braced frame (common practice for H-braces: the wire runs from
the top of the post the pull moves toward to the bottom of the other, so the sway
the pull causes stretches it; the other diagonal shortens and loses its tension).
"""
from dataclasses import replace

import numpy as np
import pytest

from spanstay.fem import Model, solve
from spanstay.models.checks.anchors import h_brace_checks
from spanstay.models.parts.anchor import add_anchor
from spanstay.models.parts.braces import add_h_brace, member_axial_force
from spanstay.models.parts.guys import tune_pretension
from spanstay.models.scenario.spec import BraceSpec, FootingSpec, GroundSpec
from tests.reference.test_brace_statics import FOUR, anchor, h_brace

FIXED = FootingSpec(kind="fixed", depth=0.0, pier_diameter=None, backfill=None,
                    base_spring=None, soil=None, slab_at_grade=False,
                    double_lateral_bearing=False)
GROUND = GroundSpec(profile=(), soil=())
PULL = np.array([1.0, 0.0, 0.0])


def h_frame(diagonal, P, T0=400.0):
    spec = replace(anchor(1.8, None), footing=FIXED)
    brace = replace(h_brace(1.5, 2.4, T0), second_footing=FIXED)
    m = Model()
    built = add_anchor(m, spec, GROUND, [1.5], PULL)
    hb = add_h_brace(m, built, replace(spec, brace=brace), GROUND, PULL, frozenset(),
                     diagonal=diagonal)
    # the wire is tightened to T0 on the standing frame (re-cut for the frame's give)
    st0 = tune_pretension(m, [(hb.diagonal, T0)])
    m.add_load(built.node_at(1.5), [P, 0, 0])
    st = solve(m, state=st0, steps=3)
    return hb, st0, st


def test_wire_on_the_wrong_diagonal_goes_slack():
    T0, P = 400.0, 3000.0
    wrong, st0, st = h_frame("second", P, T0)
    assert st0.group(wrong.diagonal).tension[0] == pytest.approx(T0, rel=0.02)
    assert st.group(wrong.diagonal).tension[0] == 0.0
    checks = h_brace_checks("A", wrong, st, breaking_strength=31e3, rope_name="test")
    diag = [c for c in checks if c.part == "H-brace diagonal"][0]
    assert diag.finding.startswith("slack")
    right, _, st_r = h_frame("main", P, T0)
    t_right = st_r.group(right.diagonal).tension[0]
    assert t_right > T0 + 0.3 * P  # the right wire picks up a good part of the pull
    # and it holds the post better: the rail end on A moves less
    assert (st_r.translation[right.rail.end1_support, 0]
            < 0.7 * st.translation[wrong.rail.end1_support, 0])


def test_parts_are_recorded_for_the_slack_budget_and_rigid_brace_stiffens():
    brace = BraceSpec(kind="kicker", direction_deg=None, attach_height=1.8, foot_distance=1.2,
                      member=FOUR, species="southern pine", grade="No. 2",
                      block_width=0.2, block_length=0.4)
    spec = replace(anchor(2.7, brace), footing=FIXED)
    tops = []
    for rigid in (frozenset(), frozenset({"brace"})):
        m = Model()
        built = add_anchor(m, spec, GROUND, [2.7], PULL, rigid)
        assert set(built.groups["brace"]) >= {"A.kicker", "A.kicker.pins"}
        if not rigid:
            assert {"A.kicker.block_ux", "A.kicker.block_uz"} <= set(built.groups["brace"])
        else:
            assert not any("block" in g for g in built.groups["brace"])
        m.add_load(built.node_at(2.7), [1500.0, 0, 0])
        st = solve(m, steps=2)
        assert member_axial_force(st, built.brace.strut).max() < 0  # compression
        tops.append(st.translation[built.top_node, 0])
    assert 0 < tops[1] < 0.8 * tops[0]


def test_kicker_on_a_laminated_post_is_tied_to_the_plies_and_follows_statics():
    # A nailed 3-ply post has axis nodes only at its attachments: the kicker gets its own
    # axis node tied to the plies. On a (nearly) pinned base the strut force follows the
    # same moment equilibrium as for a solid post (statics, see test_brace_statics).
    import tomllib
    from importlib import resources

    from spanstay.models.scenario.read import read_scenario
    from spanstay.models.parts.system import attach_heights
    from tests.reference.test_brace_statics import moment_y

    data = tomllib.loads(resources.files("spanstay.models.scenario").joinpath("layouts/two-posts.toml")
                         .read_text("utf-8"))
    launch = data["anchor"][0]
    launch.pop("guy", None)  # a kicker-braced post alone
    launch["footing"] = {"kind": "fixed", "base_spring": "1000 N*m/rad"}
    launch["brace"] = {"kind": "kicker", "attach_height": "7.3 ft", "foot_distance": "5 ft",
                       "member": "4x4"}
    scenario = read_scenario(data)
    spec = scenario.anchor("launch")
    H = scenario.lines[0].start_height
    m = Model()
    built = add_anchor(m, spec, scenario.ground, attach_heights(scenario)["launch"], PULL)
    assert any(g.endswith(".tie0") for g in built.groups["fasteners"])
    P = 2000.0
    m.add_load(built.node_at(H), [P, 0, 0])
    st = solve(m, steps=2)
    strut = built.brace.strut
    assert strut.end1_point[2] == pytest.approx(7.3 * 0.3048, abs=1e-9)
    p_top, foot = strut.end1_point, strut.end2_point
    u = (p_top - foot) / np.linalg.norm(p_top - foot)
    C = -moment_y([0, 0, H], [P, 0, 0]) / moment_y(p_top, u)
    # the plies' own weight acts on the axis: it adds no moment about the base pin
    np.testing.assert_allclose(-member_axial_force(st, strut), C, rtol=1e-2)
