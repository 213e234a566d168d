"""Bedding-in: the rope's constructional stretch lowers the line until it is
re-tensioned; the feet clearance is checked after bedding-in and in the design
(bouncing) case as well as under the static heaviest rider."""
from __future__ import annotations

import tomllib
from pathlib import Path

import numpy as np
import pytest

import spanstay
from spanstay.models.analysis.load_cases import load_cases
from spanstay.models.analysis.installed import measured_sag

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "orchard-family-line.toml"


def scenario(**ride):
    d = tomllib.loads(EXAMPLE.read_text())
    d["ride"].update(ride)
    return spanstay.load(d)


@pytest.fixture(scope="module")
def run():
    return spanstay.analyse(scenario(bedding_in_stretch="0.3 %"), stations=6,
                            slack_budget=False, workers=1)


def test_bedded_in_sag_follows_the_parabolic_cable_length(run):
    # Shallow cable (Irvine, Cable Structures, 1981, from memory; any cable handbook):
    # length L = S + 8 d^2 / (3 S) over a chord S, so a length gain dL makes the sag
    # d1 = sqrt(d0^2 + 3 S dL / 8).
    p = run.passes["bedded"]
    line = run.system.lines["family"]
    d0 = measured_sag(run.system, run.installed, line)
    pos = run.system.model.coords[line.nodes[[0, -1]]] + run.installed.translation[line.nodes[[0, -1]]]
    chord = float(np.linalg.norm(pos[1] - pos[0]))
    d_l = 0.003 * run.lengths["family"]
    assert p.unloaded_sag == pytest.approx(np.sqrt(d0 ** 2 + 3 * chord * d_l / 8), rel=0.03)


def test_clearance_is_the_least_of_every_clearance_pass(run):
    # by hand: feet = rider point - longest hang; ground linear between profile points
    sc = run.scenario
    gd, gz = np.array(sc.ground.profile).T
    hang = max(sc.ride.hang_distance[1], sc.rider.hang_distance)
    least = {}
    for label in ("ride_heavy", "hot", "bedded", "design"):
        st = run.passes[label].stations
        along = np.array([s.along for s in st])
        feet = np.array([s.rider[2] for s in st]) - hang
        least[label] = float(np.min(feet - np.interp(along, gd, gz)))
    check = next(c for c in run.checks if c.id == "ride.clearance")
    worst = min(least, key=least.get)
    assert check.governing["pass"] == run.clearance_pass
    assert check.capacity <= least[worst] + 1e-9
    assert check.capacity == pytest.approx(least[worst], abs=0.05)
    assert least["bedded"] < least["hot"]     # the stretched line hangs lower


def test_no_stretch_no_bedded_case_and_the_take_up_is_reported(run, tmp_path):
    names = [c.name for c in load_cases(scenario(bedding_in_stretch=0), 4)]
    assert "bedded" not in names
    from spanstay.models.outputs.terminal import summary_lines
    text = "\n".join(summary_lines(run, tmp_path, "si"))
    take_up = 0.003 * run.lengths["family"]
    assert f"take up {take_up * 1000:.0f} mm" in text or f"take up {take_up:.3g} m" in text
