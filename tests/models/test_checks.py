"""Behaviour of models.checks.structural: bookkeeping over stations, ids, JSON, the anchor-check hook."""
import json
import math

import numpy as np
import pytest

from spanstay.models.checks.soil import soil_limit_ratio
from spanstay.models.checks.structural import Check, state_checks, structural_checks, unchecked_parts
from spanstay.models.parts.footing import footing_response
from spanstay.models.analysis.installed import install
from spanstay.models.scenario.read import read_scenario
from spanstay.models.analysis.stations import run_pass

LBF = 4.4482216152605  # N

LAMINATED = {"kind": "laminated", "height": "3 m", "plies": 3, "ply": "2x8", "stack": "across",
             "species": "southern pine", "grade": "No. 2",
             "fastener": {"kind": "nail", "diameter": "0.148 in", "length": "3.5 in",
                          "spacing": "6 in", "rows": 2, "staggered": True}}
SAND = {"kind": "sand", "top": "0 m", "bottom": "4 m", "unit_weight": "18 kN/m**3",
        "friction_angle": "36 deg", "k_initial": "60 pci", "ibc_class": "sand"}


def scenario(post_a, footing_a, guys=()):
    return read_scenario({
        "settings": {"install_temperature": "15 degC"},
        "line": [{"name": "main", "from": "a", "to": "b", "from_height": "3 m",
                  "to_height": "3 m", "rope": "7x19-galv-3/8", "sag": "0.6 m", "segments": 12}],
        "rider": {"lightest": "30 kg", "heaviest": "70 kg", "hang_distance": "1.5 m"},
        "ground": {"profile": [["0 m", "0 m"], ["20 m", "0 m"]], "soil": [SAND]},
        "anchor": [
            {"name": "a", "position": ["0 m", "0 m"], "post": post_a, "footing": footing_a,
             "guy": list(guys)},
            {"name": "b", "position": ["20 m", "0 m"],
             "post": {"kind": "sawn", "height": "3 m", "nominal": "8x8",
                      "species": "douglas fir-larch", "grade": "No. 1"},
             "footing": {"kind": "fixed"}}]})


def design_pass(sc, count=3, weight=700.0):
    system, installed, _ = install(sc)
    line = system.lines["main"]
    p = run_pass(system, installed, line, np.linspace(2.0, line.L0 - 2.0, count), weight,
                 "design", 288.15, keep_states=True)
    assert len(p.states) == count
    return system, installed, p


def test_check_derives_utilization_and_writes_json_without_nan():
    c = Check("x.y", "part", "here", "d", 2.0, 4.0, "force")
    assert c.utilization == 0.5 and c.passed
    bad = Check("x.z", "part", "here", "d", 1.0, 0.0, "force")
    assert math.isinf(bad.utilization) and not bad.passed
    text = json.dumps([c.to_dict(), bad.to_dict()], allow_nan=False)
    back = json.loads(text)
    assert back[1]["utilization"] is None and back[1]["passed"] is False
    assert set(back[0]) == {"id", "part", "where", "description", "demand", "capacity", "kind",
                            "utilization", "passed", "governing", "source", "note"}


@pytest.fixture(scope="module")
def embedded():
    sc = scenario({"kind": "sawn", "height": "3 m", "nominal": "6x6",
                   "species": "douglas fir-larch", "grade": "No. 1"},
                  {"kind": "embedded", "depth": "1.8 m"})
    system, installed, p = design_pass(sc)
    return system, installed, p, structural_checks(system, p)


def test_worst_station_is_kept_for_each_check(embedded):
    system, _, p, checks = embedded
    by_id = {c.id: c for c in checks}
    assert len(by_id) == len(checks)
    t = [float(np.max(s.group("line.main").tension)) for s in p.states]
    c = by_id["line.main.tension"]
    assert c.demand == pytest.approx(max(t), rel=1e-12)
    k = int(np.argmax(t))
    assert c.governing == {"pass": "design", "rider_weight": 700.0, "station": k,
                           "along": pytest.approx(p.stations[k].along)}


def test_soil_ratio_and_tilt_are_the_footing_response(embedded):
    system, _, p, checks = embedded
    by_id = {c.id: c for c in checks}
    placed = system.anchors["a"].footing
    ratios, rotations = [], []
    for s in p.states:
        r = footing_response(placed, system.model, s, (1.0, 0.0))
        ratios.append(r.max_ratio)
        rotations.append(abs(r.ground_rotation))
    # p/p_u cannot exceed 1 (the curves cap p at p_u): reported, never a pass/fail check
    assert "anchor.a.soil.pressure" not in by_id
    ratio, _ = soil_limit_ratio(system, system.anchors["a"], p.states)
    assert ratio == pytest.approx(max(ratios), rel=1e-12)
    # in-plane loading: the tilt from plumb is the footing's ground-line rotation
    assert by_id["anchor.a.footing.tilt"].demand == pytest.approx(max(rotations), rel=1e-6)
    assert by_id["anchor.a.footing.tilt"].capacity == pytest.approx(math.radians(1.0))


def test_installed_state_is_checked_with_permanent_duration(embedded):
    system, installed, p, checks = embedded
    with_installed = {c.id: c for c in structural_checks(system, p, installed=installed)}
    for c in checks:
        assert with_installed[c.id].utilization >= c.utilization - 1e-12
    only = {c.id: c for c in state_checks(system, installed, {"pass": "installed"}, "permanent")}
    # NDS Table 2.3.2: CD 0.9 on Fv (from memory); DF-L No. 1 timbers Fv 170 psi, CM 1.0
    # (NDS Supplement Table 4D, from memory)
    assert only["anchor.a.post.shear"].capacity == pytest.approx(170 * 0.9 * 6894.757, rel=1e-5)


def test_laminated_post_checks_come_from_check_laminated():
    from spanstay.models.checks.laminated import check_laminated
    from spanstay.models.parts.laminated_results import laminated_results

    system, _, p = design_pass(scenario(LAMINATED, {"kind": "fixed"}), count=2, weight=500.0)
    by_id = {c.id: c for c in structural_checks(system, p)}
    for key in ("anchor.a.post.ply1.stress", "anchor.a.post.ply3.shear",
                "anchor.a.post.stability", "anchor.a.fasteners.plies1-2.force"):
        assert key in by_id
    c = by_id["anchor.a.fasteners.plies1-2.force"]
    lam = system.anchors["a"].laminated
    state = p.states[c.governing["station"]]
    ref = {x.part: x for x in check_laminated(lam, laminated_results(lam, state))
           if x.part.startswith("fasteners")}
    assert c.demand == pytest.approx(ref["fasteners, plies 1-2"].demand, rel=1e-12)
    assert c.capacity == pytest.approx(ref["fasteners, plies 1-2"].capacity, rel=1e-12)
    assert c.kind == "force"


def test_guy_checks_come_through_the_anchor_checks_hook():
    guy = {"attach_height": "2.9 m", "direction": "180 deg", "distance": "3 m",
           "rope": "7x19-galv-5/16", "pretension": "500 N",
           "ground_anchor": {"stiffness": "2 MN/m", "capacity": "20 kN"}}
    sc = scenario({"kind": "sawn", "height": "3 m", "nominal": "6x6",
                   "species": "douglas fir-larch", "grade": "No. 1"}, {"kind": "fixed"}, [guy])
    system, installed, _ = install(sc)
    by_id = {c.id: c for c in state_checks(system, installed, {"pass": "installed"})}
    tension = [c for k, c in by_id.items() if k.startswith("anchor.a.guy_1.tension")]
    assert len(tension) == 1
    # FAA AC 43.13-1B Table 7-3: 5/16 in 7x19, 9,800 lb; efficiency 0.8 (default, from
    # memory); factor of safety 5 (common practice)
    assert tension[0].capacity == pytest.approx(9800 * LBF * 0.8 / 5, rel=1e-9)
    assert tension[0].demand == pytest.approx(installed.group("a.guy1").tension[0], rel=1e-12)
    pull = [c for k, c in by_id.items() if k.startswith("anchor.a.guy_1_ground_anchor")]
    assert len(pull) == 1 and pull[0].capacity == pytest.approx(20e3)


def test_unchecked_parts_name_piers_and_missing_ibc_classes(embedded):
    system, _, _, _ = embedded
    notes = [n.sentence() for n in unchecked_parts(system)]
    assert any("torsion" in n for n in notes)
    assert not any("IBC" in n for n in notes)   # every layer has its class here
