"""The dynamic factor's basis: energy balance of a falling rider on a force-sag law
(spanstay.models.analysis.drop.peak_factor) against closed forms and an independent
elastic string solved with scipy."""
from __future__ import annotations

import math
from types import SimpleNamespace

import numpy as np
import pytest
from scipy.integrate import quad
from scipy.optimize import brentq

from spanstay.models.analysis.drop import peak_factor


@pytest.mark.parametrize("k, w, h", [(2000.0, 1000.0, 0.0), (2000.0, 1000.0, 0.3),
                                     (500.0, 800.0, 1.0)])
def test_a_weight_falling_on_a_linear_spring(k, w, h):
    # Falling weight on a spring (Timoshenko, Strength of Materials, impact; from
    # memory): d_max = d_st (1 + sqrt(1 + 2 h / d_st)), d_st = W / k; factor 2 at h = 0.
    d = np.linspace(0.05, 2.0, 40)
    d_st = w / k
    assert peak_factor(k * d, d, w, h) == pytest.approx(1 + math.sqrt(1 + 2 * h / d_st), rel=1e-9)


@pytest.mark.parametrize("n", [2.0, 3.0])
def test_a_stiffening_law_takes_a_sudden_weight_harder(n):
    # Energy balance on F = c d^n (work-energy theorem): W d = c d^(n+1) / (n+1), so the
    # peak force is (n + 1) W; sampled finely, the piecewise linear law comes close.
    c, w = 3000.0, 700.0
    d = np.linspace(1e-3, 2.0, 4000)
    assert peak_factor(c * d ** n, d, w, 0.0) == pytest.approx(n + 1, rel=2e-3)


@pytest.mark.parametrize("h", [0.0, 0.3, 0.8])
def test_the_drop_on_an_independent_elastic_string(h):
    # Weightless elastic string, point load at mid-span between level supports 2a
    # apart (statics of the two legs plus Hooke's law for their stretch):
    # F(d) = 2 T d / sqrt(a^2 + d^2), T = EA (2 sqrt(a^2 + d^2) - L0) / L0, measured
    # from the unloaded string's own sag. The drop solved independently: quad for the
    # work of F, brentq for W (h + d) = work.
    a, ea, w = 10.0, 3.3e6, 1000.0
    l0 = 2 * a * (1 - 1e-4)                      # a little pretension

    def force(y):
        r = math.hypot(a, y)
        return 2 * max(ea * (2 * r - l0) / l0, 0.0) * y / r

    d = brentq(lambda y: quad(force, 0, y, limit=200)[0] - w * (h + y), 1e-6, 5.0, xtol=1e-13)
    expected = force(d) / w
    grid = np.linspace(1e-3, 3.0, 3000)
    law = np.array([force(y) for y in grid])
    assert peak_factor(law, grid, w, h) == pytest.approx(expected, rel=2e-3)


def test_the_warning_comes_when_the_chosen_factor_is_below():
    from spanstay.models.analysis.drop import DropFactor
    from spanstay.models.outputs.ride_limits_text import dynamic_lines

    drop = DropFactor("mid-span", 10.0, 1000.0, 0.3, 2.6, 2.2, (), ())
    for used, warned in ((1.5, True), (3.0, False)):
        result = SimpleNamespace(scenario=SimpleNamespace(rider=SimpleNamespace(dynamic_factor=used)),
                                 drops=[drop], drop_why="")
        text = "\n".join(dynamic_lines(result, "si"))
        assert ("WARNING" in text) is warned
        assert "2.60" in text
