"""More anchor checks by hand: bearing of a kicker strut at its incline, a rectangular
strut buckling about its smaller side, and a tree's stem stress at grade.

Sources: NDS 2018 3.10.3 Hankinson formula F = Fc* Fc_perp' / (Fc* sin^2 t + Fc_perp'
cos^2 t), t the angle between the force and the grain (from memory); NDS 3.7.1 CP with
Ke = 1.0 pinned at both ends (Appendix G, from memory) about the least dimension;
Douglas fir-larch No. 2 (NDS Supplement Table 4A, from memory): Fc 1350 psi, Fc_perp
625 psi, Emin 580,000 psi; CF on Fc 1.15 (4x4) and 1.1 (4x6); CD 1.0 for the rider's pull (normal duration, the
project's one load-duration rule for every timber part), not on Fc_perp (NDS Table 4.3.1); wet service CM 0.8 on Fc, 0.67 on Fc_perp, 0.9 on Emin.
Stem stress M / (pi d^3 / 32) (beam theory) with the moment at grade by statics.
"""
import math

import numpy as np
import pytest

from spanstay.fem import Model, solve
from spanstay.models.checks.anchors import check_anchor, kicker_checks, member_checks
from spanstay.models.parts.anchor import add_anchor
from spanstay.models.scenario.spec import BraceSpec, SectionSpec
from tests.reference.test_brace_statics import FOUR, GROUND, anchor
from tests.models.test_tree_anchor import tree

PSI = 6894.757293168
IN = 0.0254


def kicker(member, P=3000.0):
    brace = BraceSpec(kind="kicker", direction_deg=None, attach_height=2.0, foot_distance=1.5,
                      member=member, species="douglas fir-larch", grade="No. 2",
                      block_width=0.25, block_length=0.5)
    m = Model()
    built = add_anchor(m, anchor(3.0, brace), GROUND, [3.0], np.array([1.0, 0, 0]))
    m.add_load(built.node_at(3.0), [P, 0, 0])
    return m, built, solve(m, steps=2)


def test_strut_bearing_on_the_block_at_the_struts_incline():
    m, built, st = kicker(FOUR)
    checks = kicker_checks("A", built.brace, built, m, st)
    block = [c for c in checks if c.part == "kicker foot block"][0]
    # strut from its foot 1.5 m out from the post's axis at grade to the face of the
    # 6x6 post (5.5 in) 2.0 m up: run 1.4302 m, 54.43 deg from the horizontal grain of
    # the block (sin^2 = 0.6616, cos^2 = 0.3384)
    t = math.atan2(2.0, 1.5 - 2.75 * IN)
    fc_star = 1350 * 1.0 * 1.15 * 0.8          # 1242.0 psi
    fc_perp = 625 * 0.67                       # 418.75 psi
    hand = fc_star * fc_perp / (fc_star * math.sin(t) ** 2 + fc_perp * math.cos(t) ** 2)
    assert hand == pytest.approx(539.8, abs=0.2)
    assert block.capacity == pytest.approx(hand * PSI, rel=2e-3)
    assert "54 deg" in block.check


def test_rectangular_strut_buckles_about_its_smaller_side():
    six = SectionSpec("4x6", 3.5 * IN, 5.5 * IN)
    m, built, st = kicker(six)
    strut = built.brace.strut
    (col,) = member_checks("A", "kicker strut", strut, st, wet=False)
    fc_star = 1350 * 1.0 * 1.1 * PSI            # dry: CF 1.1 for a 4x6, CD 1.0
    le_d = 1.0 * strut.length / (3.5 * IN)       # 2.4587 m / 3.5 in = 27.66
    fce = 0.822 * 580_000 * PSI / le_d**2
    a, c = fce / fc_star, 0.8
    cp = (1 + a) / (2 * c) - math.sqrt(((1 + a) / (2 * c)) ** 2 - a / c)
    assert col.capacity == pytest.approx(fc_star * cp, rel=1e-4)
    assert strut.length == pytest.approx(math.hypot(2.0, 1.5 - 2.75 * IN), rel=1e-9)


def test_tree_stem_stress_at_grade_is_the_moment_over_the_circles_modulus():
    k, P, h = 5e7, 4000.0, 4.0
    m = Model()
    built = add_anchor(m, tree(k, capacity=1e5), GROUND, [h], np.array([1.0, 0, 0]))
    m.add_load(built.node_at(h), [P, 0, 0])
    st = solve(m)
    rep = check_anchor(m, built, st)
    stem = [c for c in rep.checks if c.part == "stem at grade"][0]
    top = built.node_at(h)
    lean = float(st.translation[top, 0] - st.translation[built.grade_node, 0])
    moment = P * (h + float(st.translation[top, 2] - st.translation[built.grade_node, 2]))
    assert abs(lean) < 0.05 * h                  # a horizontal pull: no P-delta here
    # diameter at grade 0.6 m (the tree's input)
    assert stem.demand == pytest.approx(moment / (math.pi * 0.6**3 / 32), rel=2e-3)
