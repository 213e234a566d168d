"""`spanstay run` end to end on an example, with summary.json checked by hand values."""
import csv
import json
import math
from pathlib import Path

import tomllib

import pytest
from click.testing import CliRunner

from spanstay.models.cli import main

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "orchard-family-line.toml"
LBF = 4.4482216152605  # N per lbf (NIST SP 811)
FT = 0.3048            # m per ft (exact)
SCENARIO = tomllib.loads(EXAMPLE.read_text())


def number(text, unit):
    """The number of the example's quantity string such as "1.1 ft" (unit checked)."""
    value, given = text.split()
    assert given == unit, text
    return float(value)


@pytest.fixture(scope="module")
def run_folder(tmp_path_factory):
    out = tmp_path_factory.mktemp("run") / "results"
    result = CliRunner().invoke(main, ["run", str(EXAMPLE), "--out", str(out), "--stations", "6",
                                       "--units", "si"])
    # exit status: 0 every check passes, 3 some fail, 4 incomplete (models/checks/verdict.py)
    summary = json.loads((out / "summary.json").read_text())
    any_failed = any(c["passed"] is False for c in summary["checks"])
    assert result.exit_code == (3 if any_failed else 0), result.output
    return out, result.output


def test_terminal_summary_has_checks_and_cautions(run_folder):
    _, text = run_folder
    assert "checks pass" in text
    assert "CAUTION: Results are for preliminary design only." in text
    assert "licensed" in text and "proof-load" in text


def test_summary_matches_hand_values(run_folder):
    out, _ = run_folder
    summary = json.loads((out / "summary.json").read_text())
    assert summary["cautions"]
    line = SCENARIO["line"][0]
    # the installed sag is the scenario's (form-finding with deforming anchors)
    sag = number(line["sag"], "ft") * FT
    assert summary["installed"]["lines"][line["name"]]["sag"] == pytest.approx(sag, rel=1e-3)
    # riders: the heaviest static, x the dynamic factor for the design pass (scenario values)
    heaviest = number(SCENARIO["rider"]["heaviest"], "lbf") * LBF
    factor = SCENARIO["settings"]["dynamic_factor"]
    assert summary["passes"]["ride_heavy"]["weight"] == pytest.approx(heaviest, rel=1e-9)
    assert summary["passes"]["design"]["weight"] == pytest.approx(factor * heaviest, rel=1e-9)
    for name, p in summary["passes"].items():  # the stop and the arrest: one station, at the end
        assert p["stations"] == (1 if name in ("stop", "arrest") else 6)
    # cable check capacity: 3/8 in 7x19 minimum breaking strength 14,400 lb
    # (FAA AC 43.13-1B Table 7-3) over a factor of safety of 5 (common practice)
    cable = [c for c in summary["checks"] if c["id"].endswith(".tension") and c["part"] == "cable"]
    assert cable, [c["id"] for c in summary["checks"]]
    assert cable[0]["capacity"] == pytest.approx(14400 * LBF / 5, rel=1e-6)
    # the design pass pulls harder than the static heavy pass (statics: more weight, colder)
    heavy = max(summary["passes"]["ride_heavy"]["tension_max"])
    design = max(summary["passes"]["design"]["tension_max"])
    assert design > heavy
    # energy: no rider arrives faster than a frictionless fall from the first station's
    # height to the last one's (v^2 = 2 g dh)
    for key, ride in summary["ride"].items():
        if key == "clearance":
            continue
        z = [p[2] for p in summary["passes"]["ride_heavy" if key == "heaviest" else "ride_light"]["rider_xyz"]]
        if ride["reaches_end"]:
            assert ride["arrival_speed"] <= math.sqrt(2 * 9.80665 * (z[0] - z[-1])) + 1e-9
    # slack budget: the shares add up to the loaded sag
    sb = summary["slack_budget"]
    assert sum(sb["shares"].values()) == pytest.approx(sb["loaded_sag"], rel=1e-9)


def test_files_in_the_results_folder(run_folder):
    out, _ = run_folder
    summary = json.loads((out / "summary.json").read_text())
    rows = list(csv.DictReader((out / "stations.csv").open()))
    assert len(rows) == sum(p["stations"] for p in summary["passes"].values())
    heavy = sorted((out / "vtk").glob("ride_heavy_*.vtu"))
    assert len(heavy) == summary["passes"]["ride_heavy"]["stations"]
    assert (out / "vtk" / "ride_heavy.pvd").read_text().count("<DataSet") == len(heavy)
    assert (out / "vtk" / "installed.vtu").exists()
    assert summary["soil_profiles"]
    for name in ("ride_profile", "speed", "tension"):
        assert (out / summary["plots"][name]).stat().st_size > 1000
    assert not any(".spanstay-" in p.name for p in out.parent.iterdir())  # no temporary left
    assert (out / ".spanstay-results.json").is_file()  # the marker of a results folder


def test_bad_scenario_exits_2_without_traceback(tmp_path):
    bad = tmp_path / "bad.toml"
    sag = SCENARIO["line"][0]["sag"]
    text = EXAMPLE.read_text()
    assert f'sag = "{sag}"' in text
    bad.write_text(text.replace(f'sag = "{sag}"', f'sag = "{sag.split()[0]}"'))
    out = tmp_path / "out"
    result = CliRunner().invoke(main, ["run", str(bad), "--out", str(out)])
    assert result.exit_code == 2
    assert "Traceback" not in result.output
    assert "line[1]" in result.output or "sag" in result.output
    assert not out.exists()
