"""Kicker and H-brace checks against hand calculations.

Sources: NDS 2018 3.7.1 column stability factor
CP = (1 + a)/(2c) - sqrt(((1 + a)/(2c))^2 - a/c), a = FcE/Fc*, FcE = 0.822 Emin'/(le/d)^2,
c = 0.8 sawn lumber; Ke = 1.0 pinned-pinned (NDS Appendix G, from memory);
Douglas fir-larch No. 2: Fc 1350 psi, Emin 580,000 psi (NDS Supplement, references.md);
CD = 1.0 for the rider's normal ("ten years") load, the rule of every timber part (NDS
Table 2.3.2, from memory); CF = 1.15 on Fc for a
4x4 (NDS Supplement Table 4A, from memory); 4x4 dressed 3.5 x 3.5 in (PS 20).
Hankinson formula (NDS 3.10.3, from memory). IBC 2021 Table 1806.2 presumptive
allowable foundation pressure, sand (SW, SP, SM, SC, GM, GC) 2000 psf (from memory).
Strut force from statics (test_brace_statics).
"""
import math

import numpy as np
import pytest

from spanstay.fem import Model, solve
from spanstay.models.checks.anchors import (allowable_soil_bearing, hankinson, kicker_checks,
                                  member_checks)
from spanstay.models.parts.anchor import add_anchor
from spanstay.models.scenario.spec import BraceSpec
from tests.reference.test_brace_statics import FOUR, GROUND, anchor

PSI = 6894.757293168
PSF = 47.88025898
IN = 0.0254


def kicker_model(P=3000.0, block=True):
    brace = BraceSpec(kind="kicker", direction_deg=None, attach_height=2.0, foot_distance=1.5,
                      member=FOUR, species="douglas fir-larch", grade="No. 2",
                      block_width=0.25 if block else None, block_length=0.5 if block else None)
    m = Model()
    built = add_anchor(m, anchor(3.0, brace), GROUND, [3.0], np.array([1.0, 0, 0]))
    m.add_load(built.node_at(3.0), [P, 0, 0])
    return m, built, solve(m, steps=2)


def test_strut_column_check_by_hand():
    m, built, st = kicker_model()
    strut = built.brace.strut
    (col,) = member_checks("A", "kicker strut", strut, st, wet=False)
    fc_star = 1350 * 1.0 * 1.15 * PSI
    le_d = strut.length / (3.5 * IN)
    fce = 0.822 * 580_000 * PSI / le_d**2
    a, c = fce / fc_star, 0.8
    cp = (1 + a) / (2 * c) - math.sqrt(((1 + a) / (2 * c)) ** 2 - a / c)
    assert col.capacity == pytest.approx(fc_star * cp, rel=1e-4)
    force = -float(np.mean(st.group(strut.name).end_forces[:, :, 0]))
    assert col.demand == pytest.approx(force / (3.5 * IN) ** 2, rel=1e-9)
    assert force > 0


def test_hankinson_limits_and_midpoint():
    fc, fp = 2000.0, 600.0
    assert hankinson(fc, fp, 0.0) == pytest.approx(fc)
    assert hankinson(fc, fp, math.pi / 2) == pytest.approx(fp)
    assert hankinson(fc, fp, math.pi / 4) == pytest.approx(2 * fc * fp / (fc + fp))


def test_block_on_soil_bearing_pressure_and_allowable():
    # The block carries the vertical part of the strut force (statics) over its area.
    m, built, st = kicker_model()
    checks = kicker_checks("A", built.brace, built, m, st, top_soil_class="SM")
    soil = [c for c in checks if c.part == "kicker block on soil"][0]
    strut = built.brace.strut
    C = -float(np.mean(st.group(strut.name).end_forces[:, :, 0]))
    rise = (strut.end1_point - strut.end2_point)[2] / strut.length
    assert soil.demand == pytest.approx(C * rise / (0.25 * 0.5), rel=3e-3)  # undeformed angle
    assert soil.capacity == pytest.approx(2000 * PSF, rel=1e-9)
    assert allowable_soil_bearing("clay")[0] == pytest.approx(1500 * PSF, rel=1e-9)
    bearing = [c for c in checks if c.part == "post at the kicker"]
    assert bearing and bearing[0].demand == pytest.approx(C / (3.5 * IN) ** 2, rel=1e-9)
