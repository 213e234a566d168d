"""The stop and the emergency arrest as load cases solved with the whole structure;
a line that would hurt someone at the stop fails; the outputs show the brake."""
from __future__ import annotations

import tomllib
from pathlib import Path

import numpy as np
import pytest

import spanstay
from spanstay.models.outputs.terminal import summary_lines

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "orchard-family-line.toml"
G = 9.80665


def scenario(ride):
    d = tomllib.loads(EXAMPLE.read_text())
    d.pop("ride", None)
    if ride is not None:
        d["ride"] = ride
    return spanstay.load(d)


@pytest.fixture(scope="module")
def bumper():
    # a 0.1 m rubber bumper as the only brake (invented): hurts the rider
    return spanstay.analyse(scenario({
        "brake": {"kind": "spring", "stiffness": "300 kN/m", "stroke": "0.1 m"}}),
        stations=6, slack_budget=False, workers=1)


@pytest.fixture(scope="module")
def block():
    # a stop block on a short stiff spring (invented): the structure holds, the rider
    # is stopped at about 5 g (heaviest) and 9 g (lightest)
    return spanstay.analyse(scenario({
        "brake": {"kind": "spring", "stiffness": "10 kN/m", "stroke": "0.6 m"},
        "end_stop": {"kind": "spring", "stiffness": "60 kN/m", "stroke": "0.3 m",
                     "acts_on": "end-anchor"}}), stations=6, slack_budget=False, workers=1)


@pytest.fixture(scope="module")
def no_ride_table():
    return spanstay.analyse(scenario(None), stations=6, slack_budget=False, workers=1)


def by_id(result):
    return {c.id: c for c in result.checks}


def test_a_bumper_stop_never_passes(bumper):
    checks = by_id(bumper)
    decel = checks["ride.stop.deceleration"]
    assert not decel.passed
    assert bumper.verdict.status != "pass" and bumper.verdict.exit_code != 0
    # independent closed form, mass on a linear spring: a_peak = v sqrt(k / m)
    worst = max(bumper.stops.brake, key=lambda s: s.deceleration)
    assert decel.demand == pytest.approx(worst.speed * np.sqrt(300e3 / worst.mass), rel=1e-9)
    assert decel.demand / G > 20


def test_a_short_stop_block_fails_at_the_stop(block):
    checks = by_id(block)
    assert block.verdict.status == "fail" and not block.verdict.incomplete
    decel = checks["ride.stop.deceleration"]
    assert not decel.passed and decel.capacity == pytest.approx(2 * G)
    # m v^2 / 2 = k x^2 / 2 (work-energy theorem): stroke of the heaviest rider
    heavy = next(s for s in block.stops.brake if s.rider == "heaviest")
    assert checks["ride.stop.stroke"].demand == pytest.approx(
        heavy.speed * np.sqrt(heavy.mass / 10e3), rel=1e-9)


def test_the_stop_force_is_in_equilibrium_at_the_rider(block):
    # Statics of the rider node (Newton's first law): the two cable segments at the
    # rider balance the stop force along the line and the rider's weight.
    bumper = block
    p = bumper.passes["stop"]
    assert p.complete and len(p.stations) == 1
    system = bumper.design_system
    line = system.lines["family"]
    state = p.states[0]
    pos = system.model.coords[line.nodes] + state.translation[line.nodes]
    t = state.group(line.group).tension
    k = line.k
    back, ahead = pos[k - 1] - pos[k], pos[k + 1] - pos[k]
    force = t[k - 1] * back / np.linalg.norm(back) + t[k] * ahead / np.linalg.norm(ahead)
    e = (line.end_xyz - line.start_xyz)[:2]
    e = e / np.linalg.norm(e)
    push = bumper.stops.stop_force
    assert force[:2] @ e == pytest.approx(-push, rel=2e-3)
    assert p.weight == pytest.approx(bumper.scenario.rider.heaviest)


def test_the_arrest_is_checked_against_breaking_strength(block):
    bumper = block
    checks = by_id(bumper)
    rope = bumper.scenario.lines[0].rope
    arrest = checks["arrest.line.family.tension"]
    assert arrest.capacity == pytest.approx(rope.breaking_strength)  # no factor of safety
    term = checks["arrest.line.family.termination.meadow-pole"]
    assert term.capacity == pytest.approx(rope.breaking_strength * 0.8)
    assert "arrest" in bumper.passes and bumper.passes["arrest"].complete
    arrest_stroke = checks["ride.arrest.stroke"]
    heavy = next(s for s in bumper.stops.arrest if s.rider == "heaviest")
    assert arrest_stroke.demand == pytest.approx(heavy.speed * np.sqrt(heavy.mass / 60e3))
    assert checks["arrest.anchor.meadow-pole.footing.rotation"].capacity == pytest.approx(0.1)
    # the soil's ultimate lateral load with no factor of safety (the design pass has 2.5)
    lateral = checks.get("arrest.anchor.meadow-pole.footing.lateral_capacity")
    if lateral is not None:
        assert lateral.description.endswith("/ 1")
    from spanstay.models.checks.arrest import SAFETY_FACTORS, ultimate_system
    settings = ultimate_system(bumper.design_system).scenario.settings
    assert all(getattr(settings, k) == 1.0 for k in SAFETY_FACTORS if hasattr(settings, k))
    assert bumper.design_system.scenario.settings.factor_of_safety == 5.0  # left as it was


def test_no_brake_means_walking_pace_and_the_arrest_is_not_checked(no_ride_table):
    checks = by_id(no_ride_table)
    arrival = checks["ride.arrival_speed"]
    assert arrival.capacity == pytest.approx(1.5) and not arrival.passed
    assert "walking pace" in arrival.source
    what = [n.what for n in no_ride_table.verdict.not_checked]
    assert any("emergency arrest" in w for w in what)
    assert any("stop force" in w for w in what)
    assert "stop" not in no_ride_table.passes


def test_outputs_show_the_brake_and_its_sources(block, no_ride_table, tmp_path):
    bumper = block
    text = "\n".join(summary_lines(no_ride_table, tmp_path, "us"))
    assert "brake: none (our judgement: no brake unless one is given)" in text
    assert "walking pace" in text
    text = "\n".join(summary_lines(bumper, tmp_path, "si"))
    assert "stop, heaviest rider" in text and "arrest, heaviest rider" in text
    data = spanstay.results(bumper)
    assert data["stops"]["stop_force"] == pytest.approx(bumper.stops.stop_force)
    assert data["ride_limits"]["settings"]["brake"]["kind"] == "spring"
    assert any("brake: spring" in t for t in data["ride_limits"]["text"])


def test_a_sagging_line_keeps_the_trolley_on_and_reports_its_sag_ratio(no_ride_table, tmp_path):
    checks = by_id(no_ride_table)
    for key in ("lightest", "heaviest"):
        c = checks[f"ride.lift_off.{key}"]
        # on a sagging line the curvature presses the trolley on: N >= m g cos(theta)
        assert c.passed and c.capacity > 0.9
    data = spanstay.results(no_ride_table)
    # the loaded sag ratio by hand: largest sag of the heaviest rider over the plan span
    a, b = no_ride_table.scenario.anchors
    span = float(np.hypot(b.x - a.x, b.y - a.y))
    ratio = max(data["passes"]["ride_heavy"]["sag"]) / span
    assert data["ride_limits"]["loaded_sag_ratio"] == pytest.approx(ratio, rel=1e-9)
    text = "\n".join(summary_lines(no_ride_table, tmp_path, "us"))
    assert f"loaded sag ratio {100 * ratio:.1f} %" in text


def test_the_dynamic_factor_basis_is_computed_and_shown(no_ride_table, tmp_path):
    from spanstay.models.analysis.drop import peak_factor

    drops = {d.where: d for d in no_ride_table.drops}
    assert set(drops) == {"launch", "mid-span"}
    for d in drops.values():
        # the law rises and the factors come from it (energy balance on the same law)
        assert np.all(np.diff(d.law_force) > 0) and np.all(np.diff(d.law_drop) > 0)
        assert d.drop_factor == pytest.approx(peak_factor(d.law_force, d.law_drop, d.weight, 0.3))
        assert d.drop_factor > d.bounce_factor >= 2.0 - 1e-6   # the cable stiffens
    data = spanstay.results(no_ride_table)
    assert len(data["dynamic_basis"]["computed"]) == 2
    text = "\n".join(summary_lines(no_ride_table, tmp_path, "us"))
    assert "dynamic factor used 1.5; WARNING" in text


def test_the_stop_uses_the_tail_wind_arrival(block):
    # the tail wind speeds the arrival (drag on the relative air speed is smaller), and
    # the stop is worked out from that faster arrival
    for s in block.stops.brake:
        still = block.rides[s.rider].arrival_speed
        tail = block.wind_rides["tail"][s.rider].arrival_speed
        assert tail > still and s.speed == pytest.approx(tail)
        assert block.wind_rides["head"][s.rider].arrival_speed < still
    checks = by_id(block)
    assert checks["ride.tail_wind.arrival_speed"].demand == pytest.approx(
        max(r.arrival_speed for r in block.wind_rides["tail"].values()))
    assert any("wind and ice loads" in n.what for n in block.verdict.not_checked)


def test_the_stop_pass_is_checked_with_the_strength_passes(block):
    # the stop's state is checked like every strength pass: the verdict keeps, per
    # check, the worst of them, so it is never below the stop's own
    from spanstay.models.checks.structural import structural_checks

    own = {c.id: c for c in structural_checks(block.design_system, block.passes["stop"])}
    merged = by_id(block)
    assert own
    for cid, c in own.items():
        assert merged[cid].utilization >= c.utilization - 1e-12
    start = own["line.family.termination.orchard-pole"]
    assert start.demand == pytest.approx(block.passes["stop"].stations[0].tension_start)
