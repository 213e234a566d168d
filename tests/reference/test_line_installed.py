"""Installed state of a line against the elastic catenary (Irvine, Cable Structures, 1981).

With the anchors made rigid, the finite-element installed state must match
the elastic catenary between the attachment points, solved independently
here with scipy (fsolve on Irvine's span and drop equations).
"""
from pathlib import Path

import numpy as np
import pytest
from scipy.optimize import fsolve

from spanstay.models.common.catenary import midspan_sag, solve_catenary
from spanstay.models.analysis.installed import end_tensions, install, measured_sag
from spanstay.models.scenario.read import load_scenario

LAYOUT = Path(__file__).resolve().parents[2] / "models" / "scenario" / "layouts" / "two-posts.toml"


def irvine_reactions(span, drop, L0, w, EA):
    """H and V of an elastic catenary, Irvine's equations solved with fsolve (z down).

    Unknowns log(H) and V, started from the parabola's H = w l^2 / (8 d) with the
    sag d of the slack length (small-sag theory), so fsolve stays on H > 0.
    """
    chord = np.hypot(span, drop)
    sag = np.sqrt(3 * chord * max(L0 - chord, 1e-6 * chord) / 8)

    def eqs(p):
        H, V = np.exp(p[0]), p[1]
        x = H * L0 / EA + H / w * (np.arcsinh(V / H) - np.arcsinh((V - w * L0) / H))
        z = L0 / EA * (V - w * L0 / 2) + H / w * (np.sqrt(1 + (V / H) ** 2)
                                                   - np.sqrt(1 + ((V - w * L0) / H) ** 2))
        return [x - span, z - drop]
    p = fsolve(eqs, [np.log(w * span**2 / (8 * sag)), w * L0 / 2], xtol=1e-13)
    assert np.max(np.abs(eqs(p))) < 1e-8
    return np.exp(p[0]), p[1]


@pytest.fixture(scope="module")
def rigid_install():
    scenario = load_scenario(LAYOUT)
    return scenario, install(scenario, rigid=frozenset({"post", "fasteners", "soil"}))


def test_catenary_module_matches_irvine():
    # An inclined span; the module's solution against Irvine's equations solved here.
    span, drop, L0, w, EA = 40.0, 3.0, 40.25, 3.3, 3.3e6
    H, V = irvine_reactions(span, drop, L0, w, EA)
    c = solve_catenary(span, drop, L0, w, EA)
    assert c.H == pytest.approx(H, rel=1e-8)
    assert c.V == pytest.approx(V, rel=1e-8)


def test_rigid_anchor_installed_state_is_the_elastic_catenary(rigid_install):
    scenario, (system, state, lengths) = rigid_install
    line = scenario.lines[0]
    bl = system.lines[line.name]
    # the catenary between the attachment points where they ended up (the
    # "rigid" anchors still move a fraction of a millimetre)
    ends = system.model.coords[bl.nodes[[0, -1]]] + state.translation[bl.nodes[[0, -1]]]
    span = float(np.hypot(*(ends[1] - ends[0])[:2]))
    drop = float(ends[0, 2] - ends[1, 2])
    rope = line.rope
    # the sag asked for is met by the finite-element state
    assert measured_sag(system, state, bl) == pytest.approx(line.sag, rel=1e-3)
    # Irvine: end tensions of the catenary of the same unstressed length; 0.5 %
    H, V = irvine_reactions(span, drop, lengths[line.name], rope.weight_per_length, rope.EA)
    t_start = np.hypot(H, V)
    t_end = np.hypot(H, V - rope.weight_per_length * lengths[line.name])
    fe_start, fe_end = end_tensions(system, state, bl)
    assert fe_start == pytest.approx(t_start, rel=5e-3)
    assert fe_end == pytest.approx(t_end, rel=5e-3)
    # and the catenary's own mid-span sag equals the one asked for
    c = solve_catenary(span, drop, lengths[line.name], rope.weight_per_length, rope.EA)
    assert midspan_sag(c, span, drop) == pytest.approx(line.sag, rel=5e-3)


def test_deforming_anchors_need_a_shorter_cable_for_the_same_sag():
    # Statics: posts and footings that lean toward the line give back length,
    # so matching the stated sag takes a shorter unstressed cable than with rigid anchors.
    scenario = load_scenario(LAYOUT)
    _, _, rigid_lengths = install(scenario, rigid=frozenset({"post", "fasteners", "soil"}))
    system, state, lengths = install(scenario)
    name = scenario.lines[0].name
    assert measured_sag(system, state, system.lines[name]) == pytest.approx(scenario.lines[0].sag, rel=1e-3)
    assert lengths[name] < rigid_lengths[name]
