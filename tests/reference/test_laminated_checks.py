"""Laminated post checks against hand calculations with the NDS equations."""
import math

import pytest

from spanstay.fem import Model, solve
from spanstay.models.catalogs.fasteners import LBF, nail
from spanstay.models.parts.laminated import add_laminated_post, laminated_design
from spanstay.models.checks.laminated import check_laminated
from spanstay.models.parts.laminated_results import laminated_results
from spanstay.models.catalogs.lumber import INCH, PSI


def _side_by_side_post(P):
    L = 2.5
    d = laminated_design("2x8", 2, "douglas fir-larch", "No. 2", nail("16d"), 0.15, L, rows=2,
                         stack_angle_deg=90.0)
    m = Model(gravity=(0.0, 0.0, 0.0))
    post = add_laminated_post(m, (0, 0, 0), d, L, heights=[L], weight=False)
    m.fix(post.base_node, "all")
    m.add_load(post.node_at(L), [P, 0, 0, 0, 0, 0])
    st = solve(m)
    return post, laminated_results(post, st)


def test_ply_bending_check_by_hand():
    # Two DF-L No. 2 2x8 plies side by side, cantilever L = 2.5 m, tip pull P = 1000 N:
    # each ply carries M = P L / 2 = 1250 N m about its strong axis (beam theory).
    # fb = M / (t w^2 / 6) = 1250 / (0.0381 * 0.18415^2 / 6) = 5.8049e6 Pa = 841.93 psi.
    # Fb' (NDS, hand): Fb 900 x CD 1.0 x CM 1.0 (Fb CF = 1080 <= 1150 psi) x CF 1.2 = 1080 psi;
    # CL (NDS 3.3.3): lu/d = 13.6 >= 7 -> le = 1.44 lu + 3 d = 4.1525 m = 163.48 in,
    # d = 7.25 in, b = 2 x 1.5 = 3.0 in, RB^2 = 163.48 * 7.25 / 9 = 131.69,
    # Emin' = 580,000 x 0.9 (wet) = 522,000 psi, FbE = 1.2 Emin'/RB^2 = 4756.6 psi,
    # a = FbE/Fb* = 4.4043, CL = (1+a)/1.9 - sqrt(((1+a)/1.9)^2 - a/0.95) = 0.98580;
    # Ply strength (no stability): fb / Fb* = 841.93 / 1080 = 0.77957.
    # Post stability (NDS 3.9.2, fc = 0): fb / (Fb* CL) = 841.93 / 1064.66 = 0.79080.
    post, res = _side_by_side_post(1000.0)
    checks = check_laminated(post, res)
    ply = [c for c in checks if c.part == "ply 1" and c.check.startswith("strength")][0]
    assert ply.height == pytest.approx(0.0)
    assert ply.demand == pytest.approx(841.93 / 1080, rel=5e-3)
    stab = [c for c in checks if c.part == "post"][0]
    assert stab.demand == pytest.approx(841.93 / (1080 * 0.98580), rel=5e-3)
    symbols = {f["symbol"] for f in ply.factors} | {f["symbol"] for f in stab.factors}
    assert {"CD", "CM", "CF", "CL", "CP", "Cfu", "Ci", "Cr"} <= symbols
    assert ply.passes


def test_fastener_check_capacity_by_hand():
    # 16d common nail, DF-L (G = 0.50), 1-1/2 in plies: NDS mode IV
    # Z = 0.162^2 / 2.2 * sqrt(2 * 4636 * 90000 / 6) = 140.7 lb; wet service CM = 0.7
    # (NDS Table 11.3.3, from memory); CD = 1.0: Z' = 98.5 lb = 438.1 N
    post, res = _side_by_side_post(1000.0)
    fast = [c for c in check_laminated(post, res) if c.part.startswith("fasteners")]
    assert len(fast) == 1
    fe = 16600 * 0.5**1.84
    z = 0.162**2 / 2.2 * math.sqrt(2 * fe * 90000 / 6) * 0.7 * LBF
    assert fast[0].capacity == pytest.approx(z, rel=1e-6)
    # side by side: the fasteners carry next to nothing (beam theory: no slip)
    assert fast[0].demand < 1e-3 * fast[0].capacity


def test_built_up_column_stability_by_hand():
    # Three hem-fir No. 2 2x6 plies nailed across, axial load only, le = 1.5 m (59.055 in).
    # Fc* = 1300 x CF 1.1 x CM 0.8 (wet, Fc CF > 750 psi) = 1144 psi; Emin' = 470,000 x 0.9
    # = 423,000 psi (NDS Supplement Table 4A, from memory). Across the plies (d2 = 4.5 in,
    # NDS 15.3 Kf = 0.6 nailed): le/d = 13.123, FcE = 0.822 Emin'/(le/d)^2 = 2019.0 psi,
    # a = 1.7649, CP = 0.6 [(1+a)/1.6 - sqrt(((1+a)/1.6)^2 - a/0.8)] = 0.50690;
    # along the plies (d1 = 5.5 in): CP = 0.90531 > 0.50690. Fc' = 579.9 psi.
    # P = 300 psi x 24.75 in^2: NDS 3.9.2 with no bending = (300 / 579.9)^2 = 0.26763.
    L = 3.0
    d = laminated_design("2x6", 3, "hem-fir", "No. 2", nail("16d"), 0.15, L, rows=2)
    m = Model(gravity=(0.0, 0.0, 0.0))
    post = add_laminated_post(m, (0, 0, 0), d, L, heights=[L], weight=False)
    m.fix(post.base_node, "all")
    P = 300 * PSI * 24.75 * INCH**2
    m.add_load(post.node_at(L), [0, 0, -P, 0, 0, 0])
    res = laminated_results(post, solve(m))
    checks = check_laminated(post, res, le=1.5)
    stab = [c for c in checks if c.part == "post"][0]
    assert stab.demand == pytest.approx(0.26763, rel=2e-3)
    cp = [f for f in stab.factors if f["symbol"] == "CP"][0]
    assert cp["value"] == pytest.approx(0.50690, rel=1e-3)
    # each ply alone, strength only: (fc / Fc*)^2 = (300 / 1144)^2 = 0.068769
    ply = [c for c in checks if c.part == "ply 2" and c.check.startswith("strength")][0]
    assert ply.demand == pytest.approx(0.068769, rel=2e-3)


def test_built_up_column_default_length_is_ke_2_1_times_the_post():
    # The same three hem-fir No. 2 2x6 plies as above, 1.2 m tall, fixed at the base and
    # free at the top: le = Ke L with Ke = 2.1 (NDS Appendix G, from memory) = 2.52 m
    # = 99.213 in. Across the plies (4.5 in, Kf 0.6): le/d = 22.047, FcE = 715.33 psi,
    # a = 0.62528, CP = 0.6 [1.01580 - sqrt(1.01580^2 - 0.78160)] = 0.6 x 0.51555
    # = 0.30933; along (5.5 in): le/d = 18.039, CP = 0.66695 (larger). Fc' = 353.87 psi.
    # P = 150 psi x 24.75 in^2: NDS 3.9.2 with no bending = (150 / 353.87)^2 = 0.17967.
    L = 1.2
    d = laminated_design("2x6", 3, "hem-fir", "No. 2", nail("16d"), 0.15, L, rows=2)
    m = Model(gravity=(0.0, 0.0, 0.0))
    post = add_laminated_post(m, (0, 0, 0), d, L, heights=[L], weight=False)
    m.fix(post.base_node, "all")
    m.add_load(post.node_at(L), [0, 0, -150 * PSI * 24.75 * INCH**2, 0, 0, 0])
    res = laminated_results(post, solve(m))
    stab = [c for c in check_laminated(post, res) if c.part == "post"][0]
    cp = [f for f in stab.factors if f["symbol"] == "CP"][0]
    assert cp["value"] == pytest.approx(0.30933, rel=1e-3)
    assert stab.demand == pytest.approx(0.17967, rel=2e-3)


def test_ply_shear_is_three_halves_v_over_a():
    # side by side, tip pull 1000 N: each ply carries V = 500 N (beam theory, equal plies);
    # NDS 3.4.2: fv = 1.5 V / (t w) = 1.5 x 500 / (0.0381 x 0.18415) = 106.90 kPa;
    # Fv' = Fv CD CM = 180 psi x 1.0 x 0.97 (wet, NDS Supplement Table 4A, from memory)
    post, res = _side_by_side_post(1000.0)
    shear = [c for c in check_laminated(post, res) if c.part == "ply 1" and c.check == "shear"][0]
    assert shear.demand == pytest.approx(1.5 * 500 / (0.0381 * 0.18415), rel=1e-2)
    assert shear.capacity == pytest.approx(180 * 0.97 * PSI, rel=1e-9)


def test_built_up_column_buckling_along_the_plies_governs_for_narrow_plies():
    # Four hem-fir No. 2 2x4 plies nailed across (stack 6 in deep, plies 3.5 in wide),
    # 1.2 m, Ke 2.1: le = 99.213 in. Fc* = 1300 x CF 1.15 x CM 0.8 = 1196 psi, Emin' =
    # 423,000 psi (NDS Supplement Table 4A, from memory). Along the plies (3.5 in, no Kf):
    # le/d = 28.347, FcE = 432.73 psi, a = 0.36181, CP = 0.85113 - 0.52169 = 0.32944;
    # across (6 in, Kf 0.6): le/d = 16.535, CP = 0.6 x 0.71176 = 0.42706 (larger).
    # Fc' = 394.01 psi; P = 100 psi x 21 in^2: (100 / 394.01)^2 = 0.064415 (NDS 3.9.2).
    L = 1.2
    d = laminated_design("2x4", 4, "hem-fir", "No. 2", nail("16d"), 0.15, L, rows=2)
    m = Model(gravity=(0.0, 0.0, 0.0))
    post = add_laminated_post(m, (0, 0, 0), d, L, heights=[L], weight=False)
    m.fix(post.base_node, "all")
    m.add_load(post.node_at(L), [0, 0, -100 * PSI * 21.0 * INCH**2, 0, 0, 0])
    res = laminated_results(post, solve(m))
    stab = [c for c in check_laminated(post, res) if c.part == "post"][0]
    cp = [f for f in stab.factors if f["symbol"] == "CP"][0]
    assert cp["value"] == pytest.approx(0.32944, rel=1e-3)
    assert stab.demand == pytest.approx(0.064415, rel=2e-3)
