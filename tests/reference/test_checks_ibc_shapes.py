"""IBC 2021 embedment through the footing check for a rectangular post (b: the diagonal of
the square on its smaller side, a judgement the check states) and for a post with a slab
at grade (constrained, Eq. 18-2), against the equations solved here.

IBC 2021 §1807.3.2.1, Eq. 18-1 (non-constrained): d = 0.5 A {1 + [1 + 4.36 h / A]^(1/2)},
A = 2.34 P / (S1 b), S1 at d/3; §1807.3.2.2, Eq. 18-2 (constrained): d^2 = 4.25 P h /
(S3 b), S3 at d. Lateral bearing from Table 1806.2 per foot of depth (sand, SP: 150 psf/ft),
at most 12 ft; b is the diameter of a round post or the diagonal of a square one.
"""
import math

import numpy as np
import pytest
from scipy.optimize import brentq

from spanstay.models.analysis.installed import install
from spanstay.models.analysis.stations import run_pass
from spanstay.models.checks.structural import structural_checks
from spanstay.models.scenario.read import read_scenario
from tests.reference.test_checks_ibc import grade_pull

FT, INCH, LBF = 0.3048, 0.0254, 4.4482216152605
HEIGHT, DEPTH = 3.0, 1.6
SAND = {"kind": "sand", "top": "0 m", "bottom": "4 m", "unit_weight": "18 kN/m**3",
        "friction_angle": "36 deg", "k_initial": "60 pci", "ibc_class": "SP"}


def solve(nominal, slab):
    sc = read_scenario({
        "settings": {"install_temperature": "15 degC"},
        "line": [{"name": "main", "from": "a", "to": "b", "from_height": f"{HEIGHT} m",
                  "to_height": f"{HEIGHT} m", "rope": "7x19-galv-3/8", "sag": "0.6 m",
                  "segments": 16}],
        "rider": {"lightest": "30 kg", "heaviest": "70 kg", "hang_distance": "1.5 m"},
        "ground": {"profile": [["0 m", "0 m"], ["20 m", "0 m"]], "soil": [SAND]},
        "anchor": [
            {"name": "a", "position": ["0 m", "0 m"],
             "post": {"kind": "sawn", "height": f"{HEIGHT} m", "nominal": nominal,
                      "species": "douglas fir-larch", "grade": "No. 1"},
             "footing": {"kind": "embedded", "depth": f"{DEPTH} m", "slab_at_grade": slab}},
            {"name": "b", "position": ["20 m", "0 m"],
             "post": {"kind": "sawn", "height": f"{HEIGHT} m", "nominal": "8x8",
                      "species": "douglas fir-larch", "grade": "No. 1"},
             "footing": {"kind": "fixed"}}]})
    system, installed, _ = install(sc)
    line = system.lines["main"]
    stations = np.linspace(2.0, line.L0 - 2.0, 3)
    design = run_pass(system, installed, line, stations, 700.0, "design", 288.15,
                      keep_states=True)
    return system, design, {c.id: c for c in structural_checks(system, design)}


def eq_18_1(P, h, b):
    def f(d):
        a = 2.34 * P / (150.0 * min(d, 12.0) / 3.0 * b)
        return d - 0.5 * a * (1.0 + math.sqrt(1.0 + 4.36 * h / a))
    return brentq(f, 1e-3, 200.0, xtol=1e-12)


def eq_18_2(P, h, b):
    return brentq(lambda d: d * d - 4.25 * P * h / (150.0 * min(d, 12.0) * b), 1e-3, 200.0,
                  xtol=1e-12)


@pytest.mark.parametrize("nominal,slab,side_in", [("4x6", False, 3.5), ("6x6", True, 5.5)])
def test_required_depth_by_hand(nominal, slab, side_in):
    system, design, checks = solve(nominal, slab)
    b = math.sqrt(2.0) * side_in / 12.0       # ft: diagonal of the square on the smaller side
    equation = eq_18_2 if slab else eq_18_1
    hand = []
    for st, state in zip(design.stations, design.states):
        P, M = grade_pull(system, state, st.s)
        hand.append(equation(P / LBF, M / P / FT, b) * FT)
    check = checks["anchor.a.footing.embedment"]
    assert check.demand == pytest.approx(max(hand), rel=5e-3)
    assert ("18-2" in check.source) == slab and ("18-1" in check.source) == (not slab)
    assert f"b = {b * FT:.3g} m" in check.note
