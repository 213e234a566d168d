"""Property: whatever a user's edit does to a scenario, `spanstay validate` answers
with "valid" (exit 0) or one message naming a key (exit 2), never a traceback.

Hypothesis mutates the shipped scenarios (examples/*.toml and the starter
layouts): keys dropped or misspelt, types changed, quantities given the wrong
dimension, nan/inf/huge/tiny/negative numbers, anchor names broken. The
command is run as the user runs it (click's CliRunner on the CLI). 150 examples
in CI; SPANSTAY_FUZZ_EXAMPLES=1000 runs more (add -s to see the tally).
"""
from __future__ import annotations

import json
import math
import os
import re
import time
import tomllib
from pathlib import Path

import pytest
from click.testing import CliRunner
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from spanstay.models.cli import main

ROOT = Path(__file__).resolve().parents[2]
FILES = sorted((ROOT / "examples").glob("*.toml")) + sorted(
    (ROOT / "models" / "scenario" / "layouts").glob("*.toml"))
SCENARIOS = {p.name: tomllib.loads(p.read_text(encoding="utf-8")) for p in FILES}
EXAMPLES = int(os.environ.get("SPANSTAY_FUZZ_EXAMPLES", "150"))
#: a refusal starts with the key path it concerns, e.g. `anchor[1] "pole".guy[2].rope`
_SEGMENT = r"""(?:\.[^\s:"']+|\[\d+\]| "[^"]*"| '[^']*')"""
KEY_PATH = re.compile(rf"^spanstay: error: [A-Za-z_][\w\-]*{_SEGMENT}*: ")
#: wording of the engine or of scipy that must never reach the user on its own
ENGINE_WORDS = ("f(a) and f(b)", "[Errno", "Traceback", "must be positive, got -")
TALLY: list[tuple[int, float]] = []

NUMBERS = ["nan", "inf", "-inf", "1e400", "1e30", "1e-30", "-5", "0", "1e-6", "3 3"]
NUMBER_RE = re.compile(r"^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?")


def _toml_value(value) -> str:
    """An inline TOML value (tables inline, so one line per top-level key)."""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int):
        return str(value)
    if isinstance(value, float):
        return "nan" if math.isnan(value) else ("inf" if value > 0 else "-inf") \
            if math.isinf(value) else repr(value)
    if isinstance(value, str):
        return json.dumps(value)
    if isinstance(value, list):
        return "[" + ", ".join(_toml_value(v) for v in value) + "]"
    return "{" + ", ".join(f"{json.dumps(k)} = {_toml_value(v)}" for k, v in value.items()) + "}"


def _to_toml(data: dict) -> str:
    return "\n".join(f"{json.dumps(k)} = {_toml_value(v)}" for k, v in data.items()) + "\n"


def _paths(node, prefix=()):
    """Every (container path, key or index) in the parsed scenario."""
    items = node.items() if isinstance(node, dict) else enumerate(node)
    for key, value in items:
        yield prefix + (key,)
        if isinstance(value, (dict, list)):
            yield from _paths(value, prefix + (key,))


def _mutate(data, path, op: str, pick: str):
    parent = data
    for key in path[:-1]:
        parent = parent[key]
    key = path[-1]
    value = parent[key]
    if op == "drop":
        del parent[key]
    elif op == "misspell" and isinstance(parent, dict):
        parent[key + pick[:1] if pick else key[:-1] or "x"] = parent.pop(key)
    elif op == "type":
        parent[key] = {"int": 7, "bool": True, "list": [1, "a"], "table": {"a": 1},
                       "text": "abc"}.get(pick, 7.5)
    elif op == "dimension" and isinstance(value, str):
        parent[key] = {"int": "12 lbf", "bool": "12 ft", "list": "3 psi", "table": "12"}.get(
            pick, "60 degF")
    elif op == "number" and isinstance(value, str) and NUMBER_RE.match(value):
        parent[key] = NUMBER_RE.sub(pick, value, count=1)
    elif op == "number" and isinstance(value, (int, float)) and not isinstance(value, bool):
        parent[key] = {"nan": math.nan, "inf": math.inf, "-inf": -math.inf}.get(
            pick, -1 if pick == "-5" else 10**400 if pick == "1e400" else 1e300)
    elif op == "reference" and isinstance(value, str):
        parent[key] = value + "-nowhere"
    else:  # the operation does not fit this value: drop it instead
        del parent[key]


MUTATION = st.tuples(st.integers(0, 10**6), st.sampled_from(
    ["drop", "misspell", "type", "dimension", "number", "number", "reference"]),
    st.sampled_from(NUMBERS + ["int", "bool", "list", "table", "text", ""]))


@pytest.fixture(scope="module", autouse=True)
def _report():
    yield
    if TALLY and "SPANSTAY_FUZZ_EXAMPLES" in os.environ:
        accepted = sum(code == 0 for code, _ in TALLY)
        print(f"\nfuzz: {len(TALLY)} runs, {accepted} accepted, "
              f"{sum(code == 2 for code, _ in TALLY)} refused, "
              f"{sum(code not in (0, 2) for code, _ in TALLY)} other; "
              f"slowest {max(t for _, t in TALLY):.2f} s")


@settings(max_examples=EXAMPLES, deadline=10_000, derandomize=EXAMPLES <= 150,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.function_scoped_fixture])
@given(name=st.sampled_from(sorted(SCENARIOS)), mutations=st.lists(MUTATION, min_size=1,
                                                                    max_size=3))
def test_validate_answers_every_edit_with_a_key(tmp_path_factory, name, mutations):
    data = json.loads(json.dumps(SCENARIOS[name]))  # a deep copy (TOML data is JSON-safe)
    for index, op, pick in mutations:
        paths = list(_paths(data))
        if not paths:
            break
        _mutate(data, paths[index % len(paths)], op, pick)
    path = tmp_path_factory.mktemp("fuzz") / name
    path.write_text(_to_toml(data), encoding="utf-8")
    start = time.perf_counter()
    result = CliRunner().invoke(main, ["validate", str(path)])
    TALLY.append((result.exit_code, time.perf_counter() - start))
    assert result.exit_code in (0, 2), (result.output, repr(result.exception))
    if result.exit_code == 2:
        message = result.output.strip().splitlines()[-1]
        assert KEY_PATH.match(message), message
        assert not any(word in message for word in ENGINE_WORDS), message
    else:
        assert result.output.rstrip().endswith("valid"), result.output
