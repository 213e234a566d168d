"""The examples' results stay what they were when stored (tests/reference/data/
example_values.json, written by benchmarks/store_example_values.py before the engine's
speed work): tensions and sags at every station of every pass, every check's demand and
utilization, the ride speeds, to 1e-6 relative (the speed issue's tolerance)."""
from __future__ import annotations

import json
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
STORED = json.loads((ROOT / "tests" / "reference" / "data" / "example_values.json").read_text())
RTOL = 1e-6


def _close(a, b, path: str, bad: list[str]) -> None:
    if isinstance(a, dict):
        if set(a) != set(b):
            bad.append(f"{path}: keys {sorted(set(a) ^ set(b))}")
        for k in set(a) & set(b):
            _close(a[k], b[k], f"{path}.{k}", bad)
    elif isinstance(a, list):
        if len(a) != len(b):
            bad.append(f"{path}: length {len(a)} vs {len(b)}")
        for i, (x, y) in enumerate(zip(a, b)):
            _close(x, y, f"{path}[{i}]", bad)
    elif a is None or b is None:
        if a is not b:
            bad.append(f"{path}: {a} vs {b}")
    elif abs(a - b) > RTOL * max(abs(a), abs(b), 1e-9):
        bad.append(f"{path}: {a!r} vs {b!r}")


@pytest.mark.parametrize("name", sorted(STORED["examples"]))
def test_example_results_are_as_stored(name):
    import importlib.util

    spec = importlib.util.spec_from_file_location("store", ROOT / "benchmarks" / "store_example_values.py")
    store = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(store)
    fresh = json.loads(json.dumps(store.key_values(ROOT / "examples" / name, STORED["stations"])))
    bad: list[str] = []
    _close(STORED["examples"][name], fresh, name, bad)
    assert bad == []
