"""The loaded line against statics (issue: spanstay run, reference checks).

Rigid anchors (posts with a huge E, clamped at grade) and a cable of
negligible weight: the rider's point must sit where a two-segment elastic
string puts it (statics at the rider plus Hooke's law on each side, solved
here independently with scipy.optimize.fsolve), and
the sag follows the Pythagoras (triangle) construction of two
straight legs of the stretched lengths.
"""
import numpy as np
import pytest
from scipy.optimize import fsolve

from spanstay.fem import solve
from spanstay.models.analysis.installed import install
from spanstay.models.scenario.read import read_scenario
from spanstay.models.analysis.stations import place_rider, record

SPAN_FT, DROP_FT = 90.0, 3.0


def scenario(EA: str, extra_length_ft: float):
    chord = np.hypot(SPAN_FT, DROP_FT)
    post = {"kind": "sawn", "height": "12 ft", "nominal": "8x8", "species": "southern pine",
            "grade": "No. 2", "E": "1e3 GPa"}  # 100 x wood: posts that hardly bend
    data = {
        "project": {"name": "statics check"},
        "line": [{"name": "test", "from": "a", "to": "b", "from_height": "10 ft", "to_height": "10 ft",
                  "rope": {"catalog": "7x19-galv-3/8", "EA": EA, "weight_per_length": "0.02 lbf/ft"},
                  "unstressed_length": f"{chord + extra_length_ft} ft", "segments": 30}],
        "rider": {"lightest": "100 lbf", "heaviest": "200 lbf", "hang_distance": "4 ft"},
        "ground": {"profile": [["0 ft", "0 ft"], [f"{SPAN_FT} ft", f"{-DROP_FT} ft"]],
                   "soil": [{"preset": "stiff_clay", "top": "0 ft", "bottom": "20 ft"}]},
        "anchor": [{"name": "a", "position": ["0 ft", "0 ft"], "grade": "0 ft", "post": post,
                    "footing": {"kind": "fixed"}},
                   {"name": "b", "position": [f"{SPAN_FT} ft", "0 ft"], "grade": f"{-DROP_FT} ft",
                    "post": post, "footing": {"kind": "fixed"}}],
    }
    return read_scenario(data)


def loaded(sc, fraction: float, weight: float):
    system, state, lengths = install(sc)
    line = system.lines["test"]
    s = fraction * line.L0
    warm = place_rider(system, line, state, s, weight)
    state = solve(system.model, state=warm, steps=6)
    ends = system.model.coords[line.nodes[[0, -1]]] + state.translation[line.nodes[[0, -1]]]
    return system, state, line, s, ends


def string_solution(a, b, s, L0, EA, W):
    """Rider point of a weightless elastic string: statics + Hooke (x along, z up)."""
    def residual(p):
        f = np.array([0.0, -W])
        for end, free in ((a, s), (b, L0 - s)):
            d = end - p
            l = np.linalg.norm(d)
            f += max(EA * (l - free) / free, 0.0) * d / l
        return f / W
    guess = a + (b - a) * s / L0 - np.array([0.0, 0.05 * np.linalg.norm(b - a)])
    p = fsolve(residual, guess, xtol=1e-13)
    assert np.max(np.abs(residual(p))) < 1e-9
    tensions = [EA * (np.linalg.norm(e - p) - f) / f for e, f in ((a, s), (b, L0 - s))]
    return p, tensions


@pytest.mark.parametrize("fraction", [0.3, 0.5])
def test_rider_on_elastic_string_matches_statics(fraction):
    sc = scenario("3e6 N", 0.5)
    W = 9000.0
    system, state, line, s, ends = loaded(sc, fraction, W)
    a2, b2 = ends[0][[0, 2]], ends[1][[0, 2]]
    EA = sc.lines[0].rope.EA
    p, (t1, t2) = string_solution(a2, b2, s, line.L0, EA, W)
    rec = record(system, state, line)
    # position of the rider: statics + Hooke's law, to 1 mm; tensions (T = EA * stretch / L) to 0.2 %
    assert rec.rider[0] == pytest.approx(p[0], abs=1e-3)
    assert rec.rider[2] == pytest.approx(p[1], abs=1e-3)
    assert rec.tension_start == pytest.approx(t1, rel=2e-3)
    assert rec.tension_end == pytest.approx(t2, rel=2e-3)


def test_sag_with_stretch_is_the_pythagoras_triangle():
    # Geometry: the two legs are straight, each stretched by T L / EA (Hooke's law), so the
    # rider sits at the apex of the triangle with sides l1, l2 and the chord c; its
    # distance below the chord is the triangle's height 2 * area / c (Heron's formula).
    sc = scenario("3e6 N", 0.5)
    system, state, line, s, ends = loaded(sc, 0.5, 9000.0)
    rec = record(system, state, line)
    EA = sc.lines[0].rope.EA
    l1 = s * (1 + rec.tension_start / EA)
    l2 = (line.L0 - s) * (1 + rec.tension_end / EA)
    c = np.linalg.norm(ends[1] - ends[0])
    half = 0.5 * (l1 + l2 + c)
    height = 2 * np.sqrt(half * (half - l1) * (half - l2) * (half - c)) / c
    e = (ends[1] - ends[0]) / c
    offset = rec.rider - ends[0]
    d = np.linalg.norm(offset - (offset @ e) * e)
    assert d == pytest.approx(height, rel=2e-3)
    # and the stretch is not negligible here: the inextensible triangle is higher
    half0 = 0.5 * (s + line.L0 - s + c)
    height0 = 2 * np.sqrt(half0 * (half0 - s) * (half0 - line.L0 + s) * (half0 - c)) / c
    assert height > height0 * 1.01

