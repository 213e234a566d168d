"""The public Python API: the README's example runs as written, from a folder that has
its own models.py and fem.py; load cases are values that leave the structure unchanged."""
from __future__ import annotations

import copy
import re
import shutil
import subprocess
import sys
import tomllib
from pathlib import Path

import numpy as np
import pytest

import spanstay
from spanstay.models.analysis.load_cases import load_cases
from spanstay.models.analysis.run import structures
from spanstay.models.analysis.run_case import run_case, station_coordinates

ROOT = Path(__file__).resolve().parents[2]
EXAMPLE = ROOT / "examples" / "orchard-family-line.toml"
LBF = 4.4482216152605  # N per lbf (NIST SP 811)


def _f_to_k(f: float) -> float:
    return (f - 32.0) * 5.0 / 9.0 + 273.15


def readme_example() -> str:
    text = (ROOT / "README.md").read_text("utf-8")
    m = re.search(r"<!-- api-example -->\s*```python\n(.*?)```", text, re.S)
    assert m, "README.md has no python block after <!-- api-example -->"
    return m.group(1)


def test_readme_example_runs_beside_a_users_own_models_and_fem(tmp_path):
    (tmp_path / "examples").mkdir()
    shutil.copy(EXAMPLE, tmp_path / "examples" / EXAMPLE.name)
    for name in ("models.py", "fem.py"):  # a user's own modules that must not be picked
        (tmp_path / name).write_text("raise ImportError('the user\\'s own module was imported')\n")
    run = subprocess.run([sys.executable, "-c", readme_example()], cwd=tmp_path,
                         capture_output=True, text=True, timeout=600)
    assert run.returncode == 0, run.stderr[-2000:]
    assert (tmp_path / "orchard_results" / "summary.json").is_file()
    m = re.search(r"(\d+) checks", run.stdout)
    assert m and int(m.group(1)) > 10, run.stdout


@pytest.fixture(scope="module")
def example():
    return spanstay.load(EXAMPLE)


def test_a_dict_loads_as_the_same_scenario_as_its_file(example):
    data = tomllib.loads(EXAMPLE.read_text("utf-8"))
    assert spanstay.load(data) == example


def test_load_cases_carry_the_scenario_values(example):
    # the scenario file's own numbers, converted by hand (1 lbf = 4.4482216152605 N)
    raw = tomllib.loads(EXAMPLE.read_text("utf-8"))
    heaviest = float(raw["rider"]["heaviest"].split()[0]) * LBF
    lightest = float(raw["rider"]["lightest"].split()[0]) * LBF
    temps = [float(t.split()[0]) for t in raw["settings"]["use_temperatures"]]
    install = float(raw["settings"]["install_temperature"].split()[0])
    factor = raw["settings"]["dynamic_factor"]
    cases = {c.name: c for c in load_cases(example, stations=7)}
    # the example's [ride] says single-rider: no two-rider case, the rescue stays
    assert set(cases) == {"ride_light", "ride_heavy", "hot", "bedded", "design", "rescue"}
    assert cases["ride_light"].rider_load == pytest.approx(lightest, rel=1e-12)
    assert cases["ride_heavy"].rider_load == pytest.approx(heaviest, rel=1e-12)
    assert cases["ride_heavy"].temperature == pytest.approx(_f_to_k(install), abs=1e-9)
    assert cases["hot"].temperature == pytest.approx(_f_to_k(max(temps)), abs=1e-9)
    assert cases["design"].temperature == pytest.approx(_f_to_k(min(temps)), abs=1e-9)
    assert cases["design"].rider_load == pytest.approx(heaviest * factor, rel=1e-12)
    assert all(c.stations == 7 for c in cases.values())


def _model_snapshot(system) -> dict:
    m = system.model
    out = {"loads": m.loads}
    for name, line in system.lines.items():
        g = m.group(line.group)
        out[name] = (g.L0.copy(), np.array(g.dT, float).copy())
    return out


def test_running_a_case_leaves_the_shared_structure_unchanged(example):
    built = structures(example)
    service = built["service"]
    before = _model_snapshot(service.system)
    coords_before = service.system.model.coords.copy()
    case = next(c for c in load_cases(example, stations=3) if c.name == "hot")
    s = station_coordinates(service.system, service.installed, case.line, 2.0, 2.0, 3)
    first = run_case(service, case, s)
    after = _model_snapshot(service.system)
    assert after["loads"] == before["loads"]
    for name in service.system.lines:
        np.testing.assert_array_equal(after[name][0], before[name][0])
        np.testing.assert_array_equal(after[name][1], before[name][1])
    np.testing.assert_array_equal(service.system.model.coords, coords_before)
    # and a second run of the same value gives the same answer (no state carried over)
    again = run_case(service, copy.deepcopy(case), s)
    assert [st.tension_max for st in again.stations] == [st.tension_max for st in first.stations]
    assert len(first.stations) == 3 and first.failed_at is None
