"""Two riders on the line: the two-rider pass (one rider stopped at mid-span, the
heaviest riding past) against the statics of a loaded string solved independently
with scipy fsolve, and the vertical balance of the whole span."""
from __future__ import annotations

import tomllib
from pathlib import Path

import numpy as np
import pytest
from scipy.optimize import fsolve

import spanstay
from spanstay.models.analysis.load_cases import load_cases
from spanstay.models.analysis.run import structures
from spanstay.models.analysis.run_case import run_case, station_coordinates

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "orchard-family-line.toml"


@pytest.fixture(scope="module")
def two_riders():
    data = tomllib.loads(EXAMPLE.read_text())
    data["ride"]["single_rider"] = False
    data["ride"]["second_rider"] = "180 lbf"
    scenario = spanstay.load(data)
    case = next(c for c in load_cases(scenario, 5) if c.name == "two_riders")
    built = structures(scenario)[case.slip]
    r = scenario.rider
    coords = station_coordinates(built.system, built.installed, case.line, r.start_offset,
                                 r.stop_offset, case.stations)
    p = run_case(built, case, coords)
    assert p.complete
    return built.system, case, p


def _string_loads(line, case, s):
    """Nodal loads of the string: half of each segment's weight at its ends, the
    riding load at the rider's node, the stopped rider shared by the lever rule."""
    arc = line.arc_coordinates(s)
    n = arc.size
    loads = np.zeros(n)
    seg = line.segment_lengths(s) * line.spec.rope.weight_per_length
    loads[:-1] += 0.5 * seg
    loads[1:] += 0.5 * seg
    loads[line.k] += case.rider_load
    for fraction, weight in case.fixed:
        s2 = fraction * line.L0
        j = int(np.searchsorted(arc, s2)) - 1
        t = (s2 - arc[j]) / (arc[j + 1] - arc[j])
        loads[j] += (1 - t) * weight
        loads[j + 1] += t * weight
    return loads


def test_two_rider_states_match_an_independent_string_solved_by_fsolve(two_riders):
    # Statics of a string of elastic links carrying nodal loads (the classic discrete
    # cable: constant horizontal pull H, the vertical pull dropping by each load;
    # Hooke's law per link, stretched length L (1 + T / EA), L = L0 (1 + alpha dT)),
    # shot from the start end; scipy fsolve finds H and the start's vertical reaction V
    # that land the string on the far end.
    system, case, p = two_riders
    line = system.lines[case.line]
    group = system.model.group(line.group)
    d_t = case.temperature - system.scenario.settings.install_temperature  # the case's input
    for state, st in zip(p.states, p.stations):
        pos = system.model.coords[line.nodes] + state.translation[line.nodes]
        u, z = line.along(pos), pos[:, 2]
        L = line.segment_lengths(st.s) * (1 + group.alpha * d_t)
        EA = group.EA
        loads = _string_loads(line, case, st.s)
        drops = np.concatenate([[0.0], np.cumsum(loads[1:-1])])  # load above each link

        def shoot(hv):
            h, v = hv
            q = v - drops                      # vertical pull of each link, down-slope > 0
            t = np.hypot(h, q)
            stretched = L * (1 + t / EA)
            du, dz = stretched * h / t, -stretched * q / t
            return np.concatenate([[u[0]], u[0] + np.cumsum(du)]), \
                np.concatenate([[z[0]], z[0] + np.cumsum(dz)]), t

        def miss(hv):
            uu, zz, _ = shoot(hv)
            return [uu[-1] - u[-1], zz[-1] - z[-1]]

        hv, info, ier, msg = fsolve(miss, [2000.0, loads.sum() / 2], full_output=True,
                                    xtol=1e-13)
        assert ier == 1, msg
        uu, zz, t_string = shoot(hv)
        assert np.max(np.abs(zz - z)) < 2e-4 and np.max(np.abs(uu - u)) < 2e-4   # m
        tension = np.asarray(state.group(line.group).tension)
        assert tension == pytest.approx(t_string, rel=2e-3)


def test_the_span_carries_both_riders_and_its_weight(two_riders):
    # Vertical balance of the whole span (statics): the end links' vertical pulls
    # carry both riders' loads and the rope's weight.
    system, case, p = two_riders
    line = system.lines[case.line]
    w_rope = line.spec.rope.weight_per_length * line.L0
    total = case.rider_load + sum(w for _, w in case.fixed) + w_rope
    assert case.fixed[0][1] == pytest.approx(180 * 4.4482216152605)
    for state in p.states:
        pos = system.model.coords[line.nodes] + state.translation[line.nodes]
        t = np.asarray(state.group(line.group).tension)
        first, last = pos[1] - pos[0], pos[-2] - pos[-1]
        up = t[0] * first[2] / np.linalg.norm(first) + t[-1] * last[2] / np.linalg.norm(last)
        assert -up == pytest.approx(total, rel=2e-3)
