"""The exact inextensible hang behind the slack budget's geometry row.

Sources:
- Weightless cable with a point load: two straight sides of lengths s and L - s between
  the supports (the triangle whose apex is the intersection of two circles).
- Cable under its own weight alone, level span: the catenary z = c cosh(x / c) with
  L = 2 c sinh(a / (2 c)) (solved with scipy brentq) and mid-span sag
  c (cosh(a / (2 c)) - 1) (Irvine, Cable Structures, 1981, from memory).
"""
import math

import pytest
from scipy.optimize import brentq

from spanstay.models.analysis.rigid_hang import rigid_hang


@pytest.mark.parametrize("rise", [0.0, 1.5, -2.0])
def test_weightless_cable_with_a_point_load_is_a_triangle(rise):
    a, L, s = 20.0, 20.6, 7.0
    x, sag = rigid_hang(a, rise, L, 0.0, s, 1500.0)
    # apex: |p| = s, |p - (a, rise)| = L - s
    d = math.hypot(a, rise)
    along = (s**2 - (L - s) ** 2 + d**2) / (2 * d)
    off = math.sqrt(s**2 - along**2)
    ex, ez = a / d, rise / d
    px, pz = along * ex + off * ez, along * ez - off * ex  # the apex below the chord
    assert x == pytest.approx(px, rel=1e-5)
    assert sag == pytest.approx(rise * px / a - pz, rel=1e-5)


def test_cable_under_its_own_weight_is_the_catenary():
    a, L = 30.0, 30.4
    c = brentq(lambda c: 2 * c * math.sinh(a / (2 * c)) - L, 1.0, 1e4)
    x, sag = rigid_hang(a, 0.0, L, 4.0, L / 2, 0.0)
    assert x == pytest.approx(a / 2, rel=1e-9)
    assert sag == pytest.approx(c * (math.cosh(a / (2 * c)) - 1), rel=1e-7)


def test_a_cable_not_longer_than_its_chord_is_refused():
    with pytest.raises(ValueError):
        rigid_hang(10.0, 0.0, 10.0, 1.0, 5.0, 100.0)
