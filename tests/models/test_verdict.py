"""The verdict is earned: a pass that stops early is a finding and feeds no check or ride
figure; what is not checked is listed; placeholders are refused or set aside; the exit
status tells a script which of pass, fail and incomplete it got."""
from __future__ import annotations

import json
import tomllib
from pathlib import Path

import pytest
from click.testing import CliRunner

import spanstay
from spanstay.models.checks.check import Check
from spanstay.models.checks.verdict import EXIT_CODES, Incomplete, NotChecked, Verdict
from spanstay.models.cli import main

ROOT = Path(__file__).resolve().parents[2]
EXAMPLE = ROOT / "examples" / "orchard-family-line.toml"
TREE = ROOT / "models" / "scenario" / "layouts" / "tree.toml"
LBF = 4.4482216152605  # N per lbf (NIST SP 811)


def _example(heaviest: str, pier_depth: str | None = None) -> dict:
    data = tomllib.loads(EXAMPLE.read_text("utf-8"))
    data["rider"]["heaviest"] = heaviest
    if pier_depth is not None:  # shallower, narrower piers: the footings give way sooner
        for anchor in data["anchor"]:
            anchor["footing"]["depth"] = pier_depth
            anchor["footing"]["pier_diameter"] = "24 in"
    return data


@pytest.fixture(scope="module")
def design_gives_way():
    """2,200 lbf x 1.5 on 6 ft piers: the rides hold, the design pass finds no equilibrium
    early on."""
    return spanstay.analyse(_example("2200 lbf", "6 ft"), stations=4, slack_budget=False)


@pytest.fixture(scope="module")
def heavy_ride_gives_way():
    """2,200 lbf on 4 ft piers: even the static heavy rider finds no equilibrium."""
    return spanstay.analyse(_example("2200 lbf", "4 ft"), stations=4, slack_budget=True)


def test_a_stopped_design_pass_is_a_finding_and_feeds_no_check(design_gives_way):
    r = design_gives_way
    assert not r.passes["design"].complete
    v = r.verdict
    assert v.status == "incomplete" and v.exit_code == 4
    (inc,) = [i for i in v.incomplete if i.pass_name == "design"]
    # the weight that gave way is the scenario's heaviest rider x its dynamic factor
    factor = tomllib.loads(EXAMPLE.read_text("utf-8"))["settings"]["dynamic_factor"]
    assert inc.rider_weight == pytest.approx(2200 * LBF * factor, rel=1e-12)
    assert inc.stations_solved < inc.stations and "anchor" in inc.gave_way
    assert not [c for c in v.checks if (c.governing or {}).get("pass") == "design"]
    assert any("structural check under pass 'design'" in n.what for n in v.not_checked)
    assert v.counts_line().startswith("ANALYSIS INCOMPLETE")


def test_rides_from_a_stopped_pass_are_not_computed(heavy_ride_gives_way):
    r = heavy_ride_gives_way
    assert not r.passes["ride_heavy"].complete
    assert "heaviest" not in r.rides and r.clearance is None and r.slack is None
    ids = {c.id for c in r.verdict.checks}
    assert "ride.arrival_speed" not in ids and "ride.clearance" not in ids
    reasons = {n.what: n.reason for n in r.verdict.not_checked}
    assert "ride_heavy" in reasons["the arrival speed"]
    assert "stopped early" in reasons["the feet clearance over the ground"]


def _write_toml(path: Path, data: dict) -> None:
    """A tiny TOML writer for the test's own scenario (strings, numbers, tables, arrays)."""
    def value(v):
        if isinstance(v, str):
            return json.dumps(v)
        if isinstance(v, bool):
            return "true" if v else "false"
        if isinstance(v, (int, float)):
            return repr(v)
        if isinstance(v, list):
            return "[" + ", ".join(value(x) for x in v) + "]"
        if isinstance(v, dict):
            return "{ " + ", ".join(f"{k} = {value(x)}" for k, x in v.items()) + " }"
        raise TypeError(v)
    out = []
    for key, v in data.items():
        if isinstance(v, dict):
            out.append(f"[{key}]")
            out += [f"{k} = {value(x)}" for k, x in v.items()]
        elif isinstance(v, list) and v and isinstance(v[0], dict):
            for item in v:
                out.append(f"[[{key}]]")
                out += [f"{k} = {value(x)}" for k, x in item.items()]
        else:
            out.insert(0, f"{key} = {value(v)}")
    path.write_text("\n".join(out) + "\n", encoding="utf-8")


def test_cli_exit_status_is_4_when_incomplete_and_the_finding_comes_first(tmp_path):
    scenario = tmp_path / "heavy.toml"
    _write_toml(scenario, _example("2200 lbf", "6 ft"))
    run = CliRunner().invoke(main, ["run", str(scenario), "--stations", "3",
                                    "--out", str(tmp_path / "out")])
    assert run.exit_code == EXIT_CODES["incomplete"] == 4, run.output
    lines = [line for line in run.output.splitlines() if line.strip()]
    first_finding = next(i for i, line in enumerate(lines) if line.startswith("  "))
    assert lines[first_finding].lstrip().startswith("ANALYSIS INCOMPLETE: pass '")
    summary = json.loads((tmp_path / "out" / "summary.json").read_text())
    assert summary["verdict"]["status"] == "incomplete"
    assert "design" in {i["pass_name"] for i in summary["verdict"]["incomplete"]}
    report = (tmp_path / "out" / "report.html").read_text()
    assert report.index("ANALYSIS INCOMPLETE") < report.index("<h2>Checks</h2>")


def test_a_layer_without_ibc_class_lists_the_embedment_check_as_not_checked():
    data = _example("220 lbf")
    # the same medium dense sand as the preset, given value by value without its IBC class
    data["ground"]["soil"][0] = {"kind": "sand", "top": "0 ft", "bottom": "5 ft",
                                 "unit_weight": "18500 N/m^3", "friction_angle": "33 deg",
                                 "k_initial": "24430239 N/m^3"}
    r = spanstay.analyse(data, stations=3, slack_budget=False)
    assert not [c for c in r.verdict.checks if c.id.endswith("footing.embedment")]
    ibc = [n for n in r.verdict.not_checked if n.what.startswith("IBC 2021 embedment")]
    assert {n.part for n in ibc} == {"anchor 'orchard-pole'", "anchor 'meadow-pole'"}
    assert "ibc_class" in ibc[0].reason


def test_the_soil_limit_ratio_is_reported_not_checked(design_gives_way):
    ids = {c.id for c in design_gives_way.verdict.checks}
    assert not [i for i in ids if i.endswith("soil.pressure")]


def test_starter_placeholders_are_refused_then_set_aside_when_accepted():
    data = tomllib.loads(TREE.read_text("utf-8"))
    with pytest.raises(spanstay.InputError) as err:
        spanstay.analyse(data, stations=3, slack_budget=False)
    assert "root_plate" in (err.value.where or "") and "placeholder" in str(err.value)
    tree = next(a for a in data["anchor"] if a.get("kind") == "tree")["tree"]
    for key in ("root_plate_stiffness", "root_plate_capacity"):
        tree[key]["accepted"] = True
    r = spanstay.analyse(data, stations=3, slack_budget=False)
    assert not [c for c in r.verdict.checks if "root_plate" in c.id]   # never a pass
    whats = " | ".join(n.sentence() for n in r.verdict.not_checked)
    assert "root plate capacity" in whats and "root_plate_stiffness" in whats
    # given as assessed values, the root plate is checked again
    for key in ("root_plate_stiffness", "root_plate_capacity"):
        tree[key] = tree[key]["placeholder"]
    r = spanstay.analyse(data, stations=3, slack_budget=False)
    assert [c for c in r.verdict.checks if "root_plate" in c.id]


def _check(u: float) -> Check:
    return Check("x", "p", "w", "d", u, 1.0, "ratio")


@pytest.mark.parametrize("utils, incomplete, status, code", [
    ([0.5, 0.99], False, "pass", 0),
    ([0.5, 1.01], False, "fail", 3),
    ([0.5], True, "incomplete", 4),
    ([1.5], True, "incomplete", 4),   # incomplete outranks a failure: nothing is earned
])
def test_verdict_status_and_counts(utils, incomplete, status, code):
    inc = [Incomplete("design", "strength", 1.0, 2.0, 1.0, 1, 4, "x", "r")] if incomplete else []
    v = Verdict([_check(u) for u in utils], inc, [NotChecked("a", "b", "c")])
    assert (v.status, v.exit_code) == (status, code)
    failed = sum(u > 1.0 for u in utils)
    assert f"{len(utils) - failed} checks pass, {failed} fail, 1 not checked" in v.counts_line()
