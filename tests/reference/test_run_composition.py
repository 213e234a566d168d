"""What each pass of a run loads, at what temperature, with which slip state, on which
line; and hand calculations through a whole run where each of those changes the answer.

Part 1 pins :func:`load_cases` pass by pass against the scenario's own inputs, read
here from the scenario text with our own unit arithmetic (not from the reader's SI
values). Part 2 runs :func:`analyse` on a line between two nearly rigid posts with a
cable of negligible weight, and checks every station of every pass against a two-leg
elastic string solved here with scipy (statics at the rider plus Hooke's law on each
leg, the free lengths grown by alpha dT): the design pass must sit at the coldest
temperature with the heaviest rider times the dynamic factor, the ride passes at the
installation temperature with the bare weights, the hot pass at the hottest. Part 3
reads the EN 1995-1-1 slip modulus of a nailed laminated post out of the built model
(K_ser for the ride, K_u for strength) and shows the design pass slips more.
"""
from __future__ import annotations

import math
from pathlib import Path

import numpy as np
import pytest
from scipy.optimize import fsolve

from spanstay.models.analysis.load_cases import load_cases
from spanstay.models.analysis.run import analyse, structures
from spanstay.models.analysis.run_case import run_case
from spanstay.models.checks.line import line_checks
from spanstay.models.parts.laminated_results import laminated_results
from spanstay.models.scenario.read import load_scenario, read_scenario

LBF = 4.4482216152605      # N (NIST SP 811)
FT = 0.3048                # m
G0 = 9.80665               # m/s^2, standard gravity (CGPM 1901)
ZERO_C = 273.15            # K
#: thermal expansion of steel wire rope, 6.5e-6 per degF (from memory, the rope
#: catalog's value; handbooks give 11-13e-6 per K for carbon steel)
ALPHA = 6.5e-6 * 1.8       # per K

SPAN_FT, DROP_FT = 90.0, 3.0
EA = 3.0e6                 # N, given in the scenario
T_INSTALL_C, T_COLD_C, T_HOT_C = 15.0, -15.0, 40.0
LIGHT_LBF, HEAVY_LBF, FACTOR = 100.0, 300.0, 1.7
EFFICIENCY = 0.7


def rigid_data(use=(f"{T_COLD_C} degC", f"{T_HOT_C} degC"), second_line=False) -> dict:
    chord = math.hypot(SPAN_FT, DROP_FT)
    post = {"kind": "sawn", "height": "12 ft", "nominal": "8x8", "species": "southern pine",
            "grade": "No. 2", "E": "1e3 GPa"}  # about 100 x wood: posts that hardly bend
    rope = {"catalog": "7x19-galv-3/8", "EA": f"{EA} N", "weight_per_length": "0.002 lbf/ft"}
    data = {
        "project": {"name": "composition check"},
        "settings": {"install_temperature": f"{T_INSTALL_C} degC",
                     "use_temperatures": list(use), "dynamic_factor": FACTOR},
        "line": [{"name": "main", "from": "a", "to": "b", "from_height": "10 ft",
                  "to_height": "10 ft", "rope": rope, "unstressed_length": f"{chord + 0.5} ft",
                  "termination_efficiency": EFFICIENCY, "segments": 30}],
        "rider": {"lightest": f"{LIGHT_LBF} lbf", "heaviest": f"{HEAVY_LBF} lbf",
                  "hang_distance": "4 ft", "stations": 3},
        "ground": {"profile": [["0 ft", "0 ft"], [f"{SPAN_FT} ft", f"{-DROP_FT} ft"]]},
        "anchor": [{"name": "a", "position": ["0 ft", "0 ft"], "grade": "0 ft", "post": post,
                    "footing": {"kind": "fixed"}},
                   {"name": "b", "position": [f"{SPAN_FT} ft", "0 ft"],
                    "grade": f"{-DROP_FT} ft", "post": post, "footing": {"kind": "fixed"}}],
    }
    if second_line:
        data["anchor"].append({"name": "c", "position": [f"{SPAN_FT} ft", f"{SPAN_FT} ft"],
                               "grade": f"{-DROP_FT} ft", "post": post,
                               "footing": {"kind": "fixed"}})
        data["line"].append({"name": "side", "from": "b", "to": "c", "from_height": "10 ft",
                             "to_height": "10 ft", "rope": rope, "sag": "3 ft", "segments": 20})
    return data


LAYOUT = Path(__file__).resolve().parents[2] / "models" / "scenario" / "layouts" / "two-posts.toml"


# ------------------------------------------------------------- part 1: the passes
def by_name(cases):
    return {c.name: c for c in cases}


def test_each_pass_has_its_temperature_rider_factor_slip_and_line():
    cases = by_name(load_cases(read_scenario(rigid_data(second_line=True))))
    assert list(cases) == ["ride_light", "ride_heavy", "hot", "bedded", "design", "design-side",
                           "two_riders", "rescue"]
    t_inst, t_cold, t_hot = (T_INSTALL_C + ZERO_C, T_COLD_C + ZERO_C, T_HOT_C + ZERO_C)
    light, heavy = LIGHT_LBF * LBF, HEAVY_LBF * LBF
    expected = {  # (purpose, line, weight, factor, temperature, slip)
        "ride_light": ("ride", "main", light, 1.0, t_inst, "service"),
        "ride_heavy": ("ride", "main", heavy, 1.0, t_inst, "service"),
        "hot": ("clearance", "main", heavy, 1.0, t_hot, "service"),
        # the design pass: coldest temperature (the tightest line), dynamic factor
        "design": ("strength", "main", heavy, FACTOR, t_cold, "service"),
        "design-side": ("strength", "side", heavy, FACTOR, t_cold, "service"),
        # no [ride] table: bedding-in (0.25 %) on the hottest day, a second rider of the
        # heaviest weight held at mid-span, a 250 lbf rescuer times 1.25 (our judgements)
        "bedded": ("clearance", "main", heavy, 1.0, t_hot, "service"),
        "two_riders": ("strength", "main", heavy, FACTOR, t_cold, "service"),
        "rescue": ("strength", "main", 250 * LBF, 1.25, t_cold, "service"),
    }
    for name, (purpose, line, weight, factor, temp, slip) in expected.items():
        c = cases[name]
        assert (c.purpose, c.line, c.slip) == (purpose, line, slip), name
        assert c.rider_weight == pytest.approx(weight, rel=1e-12), name
        assert c.rider_factor == pytest.approx(factor, rel=1e-12), name
        assert c.rider_load == pytest.approx(weight * factor, rel=1e-12), name
        assert c.temperature == pytest.approx(temp, abs=1e-9), name
        assert c.stations == 3
    assert cases["ride_heavy"].keep_states and cases["design"].keep_states
    assert cases["bedded"].stretch == pytest.approx(0.0025)
    assert cases["two_riders"].fixed == ((0.5, pytest.approx(heavy, rel=1e-12)),)
    assert cases["rescue"].fixed == ((0.5, pytest.approx(heavy * 1.25, rel=1e-12)),)


def test_installation_counts_among_the_temperatures_of_use():
    # all temperatures of use warmer than installation: the coldest is the installation
    # temperature; none warmer: no hot pass
    warm = by_name(load_cases(read_scenario(rigid_data(use=("25 degC", "30 degC")))))
    assert warm["design"].temperature == pytest.approx(T_INSTALL_C + ZERO_C, abs=1e-9)
    assert warm["hot"].temperature == pytest.approx(30.0 + ZERO_C, abs=1e-9)
    cold = by_name(load_cases(read_scenario(rigid_data(use=("-5 degC", "10 degC")))))
    assert "hot" not in cold
    assert cold["design"].temperature == pytest.approx(-5.0 + ZERO_C, abs=1e-9)


def test_laminated_posts_take_ultimate_slip_in_strength_passes_only():
    # EN 1995-1-1 2.2.2 / 7.1: K_u for the ultimate limit state, K_ser for serviceability
    cases = by_name(load_cases(load_scenario(LAYOUT)))
    assert cases["design"].slip == "ultimate"
    for name in ("ride_light", "ride_heavy", "hot"):
        assert cases[name].slip == "service", name
    # the layout's own values: 245 lbf heaviest, dynamic factor 1.5, coldest 20 degF
    assert cases["design"].rider_load == pytest.approx(245 * LBF * 1.5, rel=1e-9)
    assert cases["design"].temperature == pytest.approx((20 - 32) / 1.8 + ZERO_C, abs=1e-9)


# ---------------------------------------------------- part 2: through a run, by hand
def string_solution(a, b, s, L0, EA, W):
    """Rider point and leg tensions of a weightless elastic string (x along, z up)."""
    def residual(p):
        f = np.array([0.0, -W])
        for end, free in ((a, s), (b, L0 - s)):
            d = end - p
            length = np.linalg.norm(d)
            f += max(EA * (length - free) / free, 0.0) * d / length
        return f / W
    # start from the apex of the triangle of the legs s, L0 - s stretched 0.2 % (both taut)
    c = np.linalg.norm(b - a)
    u = (b - a) / c
    l1, l2 = 1.002 * s, 1.002 * (L0 - s)
    x = (c * c + l1 * l1 - l2 * l2) / (2 * c)
    guess = a + x * u + math.sqrt(max(l1 * l1 - x * x, 0.0)) * np.array([u[1], -u[0]])
    p = fsolve(residual, guess, xtol=1e-13)
    assert np.max(np.abs(residual(p))) < 1e-9
    tensions = [EA * (np.linalg.norm(e - p) - f) / f for e, f in ((a, s), (b, L0 - s))]
    return p, tensions


@pytest.fixture(scope="module")
def rigid_run():
    return analyse(read_scenario(rigid_data()), slack_budget=False, workers=1)


def hand_pass(result, label, temperature_c, weight_n):
    """Hand rider point and tensions at every station of a pass, and the run's own."""
    system = result.system
    line = system.lines["main"]
    grow = 1.0 + ALPHA * (temperature_c - T_INSTALL_C)
    out = []
    for st in result.passes[label].stations:
        ends = []
        for name, h in (("a", line.spec.start_height), ("b", line.spec.end_height)):
            node = system.anchors[name].node_at(h)
            ends.append((system.model.coords[node] + st.anchor_disp[name])[[0, 2]])
        p, (t1, t2) = string_solution(ends[0], ends[1], st.s * grow, line.L0 * grow, EA,
                                      weight_n)
        out.append((st, p, t1, t2))
    return out


PASSES = [("ride_light", T_INSTALL_C, LIGHT_LBF), ("ride_heavy", T_INSTALL_C, HEAVY_LBF),
          ("hot", T_HOT_C, HEAVY_LBF), ("design", T_COLD_C, HEAVY_LBF * FACTOR)]


@pytest.mark.parametrize("label,temperature_c,weight_lbf", PASSES)
def test_every_pass_matches_the_elastic_string_at_its_temperature_and_load(
        rigid_run, label, temperature_c, weight_lbf):
    p_run = rigid_run.passes[label]
    assert p_run.complete and len(p_run.stations) == 3
    for st, p, t1, t2 in hand_pass(rigid_run, label, temperature_c, weight_lbf * LBF):
        # rider point to 2 mm, leg tensions to 0.3 % (a cable of 0.002 lbf/ft, not none)
        assert st.rider[0] == pytest.approx(p[0], abs=2e-3), label
        assert st.rider[2] == pytest.approx(p[1], abs=2e-3), label
        assert st.tension_start == pytest.approx(t1, rel=3e-3), label
        assert st.tension_end == pytest.approx(t2, rel=3e-3), label


def test_colder_is_tighter_and_each_input_moves_the_answer(rigid_run):
    # the same hand solution with the wrong temperature, the wrong rider or the wrong
    # factor is far outside the tolerance above: each input changes the design tension
    design = rigid_run.passes["design"]
    k = 1  # mid-span station
    t_run = design.stations[k].tension_start
    right = hand_pass(rigid_run, "design", T_COLD_C, HEAVY_LBF * FACTOR * LBF)[k][2]
    at_install = hand_pass(rigid_run, "design", T_INSTALL_C, HEAVY_LBF * FACTOR * LBF)[k][2]
    no_factor = hand_pass(rigid_run, "design", T_COLD_C, HEAVY_LBF * LBF)[k][2]
    assert t_run == pytest.approx(right, rel=3e-3)
    assert at_install < right * (1 - 0.01)          # colder = tighter, by more than 1 %
    assert no_factor < right * (1 - 0.2)
    # the run's own design and heavy-ride passes differ the same way
    heavy = rigid_run.passes["ride_heavy"].stations[k].tension_start
    assert t_run > heavy * 1.5


def test_termination_check_uses_the_lines_efficiency(rigid_run):
    # capacity = minimum breaking strength x termination efficiency / factor of safety;
    # 3/8 in 7x19 galvanized 14,400 lb (FAA AC 43.13-1B Table 7-3), factor 5 (common
    # practice), efficiency 0.7 as the scenario gives it
    system = rigid_run.system
    state = rigid_run.passes["design"].states[1]
    checks = {c.id: c for c in line_checks(system, state, system.lines["main"])}
    assert checks["line.main.tension"].capacity == pytest.approx(14400 * LBF / 5, rel=1e-9)
    for end in ("a", "b"):
        c = checks[f"line.main.termination.{end}"]
        assert c.capacity == pytest.approx(14400 * LBF * EFFICIENCY / 5, rel=1e-9)
    t = state.group("line.main").tension
    assert checks["line.main.termination.a"].demand == pytest.approx(t[0], rel=1e-12)
    assert checks["line.main.termination.b"].demand == pytest.approx(t[-1], rel=1e-12)
    assert checks["line.main.tension"].demand == pytest.approx(t.max(), rel=1e-12)


# ------------------------------------------------ part 3: K_ser and K_u in the model
@pytest.fixture(scope="module")
def laminated():
    # the two-post starter's nailed launch post, here without the guys (the post alone
    # takes the line, so its plies slip more)
    import tomllib

    data = tomllib.loads(LAYOUT.read_text(encoding="utf-8"))
    for anchor in data["anchor"]:
        anchor.pop("guy", None)
    sc = read_scenario(data)
    return sc, structures(sc)


def test_model_joints_carry_the_ec5_nail_slip_modulus(laminated):
    # EN 1995-1-1 Table 7.1, nails without pre-drilling: K_ser = rho_m^1.5 d^0.8 / 30 N/mm
    # (rho_m kg/m^3, d mm); 7.1(3): K_u = 2/3 K_ser. The layout's 0.148 in nails in
    # southern pine, rho_m = 610 kg/m^3 (Wood Handbook G12 0.54 x 1.12 as the catalog,
    # from memory).
    _, built = laminated
    d_mm = 0.148 * 25.4
    k_ser = 610**1.5 * d_mm**0.8 / 30.0 * 1000.0   # N/m per fastener and shear plane
    for slip, k_hand in (("service", k_ser), ("ultimate", 2.0 / 3.0 * k_ser)):
        k = built[slip].system.model.group("launch.post.joints").k[:, 1]
        per_level = k[k > 0] / k_hand
        # every fastener level holds a whole number of fasteners of the hand modulus
        assert per_level.min() == pytest.approx(1.0, rel=1e-6), slip
        assert np.allclose(per_level, np.round(per_level), rtol=1e-6), slip


def test_design_pass_slips_more_than_the_same_pass_with_k_ser(laminated):
    # Partial interaction (Newmark, Siess & Viest 1951): slip = shear flow / k; a softer
    # connection (K_u = 2/3 K_ser) slips more, by less than 3/2 because the shear flow
    # falls as composite action is lost. The design pass on the K_ser structure is the
    # comparison.
    sc, built = laminated
    case = by_name(load_cases(sc, stations=3))["design"]
    from spanstay.models.analysis.run_case import station_coordinates
    service = built["service"]
    s = station_coordinates(service.system, service.installed, "main", sc.rider.start_offset,
                            sc.rider.stop_offset, 3)[[0]]
    slips = {}
    for slip in ("service", "ultimate"):
        p = run_case(built[slip], case, s)
        assert p.complete
        lam = built[slip].system.anchors["launch"].laminated
        res = laminated_results(lam, p.states[0])
        slips[slip] = max(float(np.abs(a).max()) for a in res.slip_along)
    ratio = slips["ultimate"] / slips["service"]
    assert 1.1 < ratio < 1.5


def test_strength_structure_keeps_the_cable_cut_for_the_service_one(laminated):
    # one cable is cut and hung: the K_u structure carries the same unstressed lengths
    # (cable and guys) as the K_ser one it was installed from, not a re-cut of its own
    _, built = laminated
    service, ultimate = built["service"].system.model, built["ultimate"].system.model
    for name in ("line.main",) + tuple(g.cable for a in built["service"].system.anchors.values()
                                       for g in a.guys):
        np.testing.assert_array_equal(ultimate.group(name).L0, service.group(name).L0)
    # and the two installed states differ (the laminated post is softer with K_u)
    top = built["service"].system.anchors["launch"].top_node
    assert not np.allclose(built["ultimate"].installed.translation[top],
                           built["service"].installed.translation[top], rtol=1e-6, atol=0)
