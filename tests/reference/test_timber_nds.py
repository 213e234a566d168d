"""NDS adjustment factors and stability equations against hand calculations."""

import numpy as np
import pytest

from spanstay.models.catalogs.lumber import PSI, design_values, parse_size
from spanstay.models.catalogs.nds import (adjusted_values, beam_stability_factor, bending_compression,
                        bending_effective_length, column_stability_factor)


def test_column_stability_hand_calculation():
    # Hand calculation, NDS 3.7.1, DF-L No. 2 4x4, le = 96 in, normal duration, dry:
    # Fc* = Fc CD CF = 1350 * 1.0 * 1.15 = 1552.5 psi (Table 4A, CF = 1.15 for 4 in wide, from memory)
    # Emin' = 580,000 psi; le/d = 96/3.5 = 27.43; FcE = 0.822 * 580000 / 27.43^2 = 633.7 psi
    # a = FcE/Fc* = 0.40818; (1+a)/(2c) = 0.88011 with c = 0.8
    # CP = 0.88011 - sqrt(0.88011^2 - 0.40818/0.8) = 0.88011 - 0.51416 = 0.36595
    size = parse_size("4x4")
    adj = adjusted_values(design_values("DF-L", "No. 2", size), size, duration="ten years")
    assert adj["Fc_star"] / PSI == pytest.approx(1552.5, rel=1e-9)
    assert adj["Emin"] / PSI == pytest.approx(580000, rel=1e-9)
    cp = column_stability_factor(adj["Fc_star"], adj["Emin"], 96 / 3.5, c=0.8)
    assert cp.value == pytest.approx(0.36595, rel=5e-4)
    # independently: CP is the smaller root of c x^2 - (1 + a) x + a = 0 (NDS 3.7.1 derivation)
    a = 0.822 * 580000 / (96 / 3.5) ** 2 / 1552.5
    roots = np.roots([0.8, -(1 + a), a])
    assert cp.value == pytest.approx(min(roots.real), rel=1e-10)


def test_column_stability_limits():
    # short column: CP -> 1; very slender: CP -> FcE/Fc* (Euler governs), c irrelevant
    assert column_stability_factor(1e7, 4e9, 0.5).value == pytest.approx(1.0, abs=2e-3)
    cp = column_stability_factor(1e7, 4e9, 50)
    fce = 0.822 * 4e9 / 50**2
    assert cp.value == pytest.approx(fce / 1e7, rel=0.15)
    assert cp.value < fce / 1e7


def test_factor_list_and_wet_service():
    # Southern pine No. 2 2x12 (Table 4B, from memory / references.md): Fb 750 psi,
    # E 1,400,000, Emin 510,000; CF 1.0 (size effect included); wet: CM(Fb) = 1.0
    # because Fb CF = 750 <= 1150 psi; CM(E) = 0.9; CD 1.6 (ten minutes) on Fb only.
    size = parse_size("2x12")
    ref = design_values("southern pine", "#2", size)
    assert (ref.Fb / PSI, ref.E / PSI, ref.Emin / PSI) == pytest.approx((750, 1.4e6, 5.1e5))
    adj = adjusted_values(ref, size, duration="ten minutes", wet=True)
    assert adj["Fb"] / PSI == pytest.approx(750 * 1.6, rel=1e-12)
    assert adj["E"] / PSI == pytest.approx(1.4e6 * 0.9, rel=1e-12)
    assert adj["Fc_perp"] / PSI == pytest.approx(565 * 0.67, rel=1e-12)
    symbols = {r["symbol"] for r in adj.rows()}
    assert {"CD", "CM", "CF", "Ci", "Cr"} <= symbols
    # DF-L No. 2 2x12 (references.md): Fb 900 psi, CF 1.0 at 12 in width
    ref = design_values("douglas fir-larch", "No. 2", size)
    adj = adjusted_values(ref, size, duration="ten years")
    assert adj["Fb"] / PSI == pytest.approx(900, rel=1e-12)


def test_beam_stability_hand_calculation():
    # NDS 3.3.3, 2x8 cantilever 60 in long, tip load: lu/d = 60/7.25 = 8.28 >= 7,
    # le = 1.44 lu + 3 d = 86.4 + 21.75 = 108.15 in (Table 3.3.3, from memory)
    # RB = sqrt(le d / b^2) = sqrt(108.15*7.25/2.25) = 18.668; FbE = 1.2*580000/RB^2 = 1997.2 psi
    # Fb* = 900*1.2 = 1080 psi; a = 1.8493; (1+a)/1.9 = 1.49963
    # CL = 1.49963 - sqrt(1.49963^2 - 1.8493/0.95) = 1.49963 - 0.55012 = 0.94951
    le = bending_effective_length(60.0, 7.25, "cantilever point load")
    assert le == pytest.approx(108.15)
    cl = beam_stability_factor(1080 * PSI, 580000 * PSI, le * 0.0254, 7.25 * 0.0254, 1.5 * 0.0254)
    assert cl.value == pytest.approx(0.9495, rel=1e-3)


def test_bending_compression_interaction_by_hand():
    # NDS 3.9.2 Eq. 3.9-3: fc = 300, Fc' = 800, fb1 = 600, Fb1' = 1200, FcE1 = 1500,
    # fb2 = 0: (300/800)^2 + 600/(1200 (1 - 0.2)) = 0.140625 + 0.625 = 0.765625
    r = bending_compression(300, 600, 0, 800, 1200, 1000, 1500, 2000)
    assert r.value == pytest.approx(0.765625, rel=1e-12)
    assert r.ok
    # axial stress above the Euler stress: unstable
    assert not bending_compression(1600, 600, 0, 800, 1200, 1000, 1500, 2000).ok
