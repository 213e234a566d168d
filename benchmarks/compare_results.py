"""Compare two results folders' summary.json number by number (a script, not a test).

Used when a change must leave results as they were (a restructuring, a speed-up):
run the examples before and after, then

    python3 benchmarks/compare_results.py BEFORE_DIR AFTER_DIR [--rtol 1e-9]

prints the largest relative difference per example and every value beyond the
tolerance (paths like passes.design.tension_max[3]); exits 1 if any.
"""
from __future__ import annotations

import argparse
import json
import math
import sys
from pathlib import Path

SKIP = {"spanstay", "scenario_file", "plots", "vtk"}  # version, paths, file names


def _walk(a, b, path: str, out: list[tuple[str, float, object, object]]) -> None:
    if isinstance(a, dict) and isinstance(b, dict):
        for k in sorted(set(a) | set(b)):
            if path == "" and k in SKIP:
                continue
            if k not in a or k not in b:
                out.append((f"{path}.{k}", math.inf, a.get(k), b.get(k)))
                continue
            _walk(a[k], b[k], f"{path}.{k}" if path else k, out)
    elif isinstance(a, list) and isinstance(b, list):
        if len(a) != len(b):
            out.append((f"{path} (length)", math.inf, len(a), len(b)))
            return
        for i, (x, y) in enumerate(zip(a, b)):
            _walk(x, y, f"{path}[{i}]", out)
    elif isinstance(a, (int, float)) and isinstance(b, (int, float)) and not isinstance(a, bool):
        scale = max(abs(a), abs(b), 1e-12)
        out.append((path, abs(a - b) / scale if a != b else 0.0, a, b))
    elif a != b:
        out.append((path, math.inf, a, b))


def compare(before: Path, after: Path) -> list[tuple[str, float, object, object]]:
    """Every number of two summary.json files with its relative difference."""
    a = json.loads((before / "summary.json").read_text())
    b = json.loads((after / "summary.json").read_text())
    out: list[tuple[str, float, object, object]] = []
    _walk(a, b, "", out)
    return out


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("before", type=Path)
    parser.add_argument("after", type=Path)
    parser.add_argument("--rtol", type=float, default=1e-9)
    args = parser.parse_args()
    pairs = [(args.before, args.after)]
    if not (args.before / "summary.json").exists():  # folders of results folders
        pairs = [(d, args.after / d.name) for d in sorted(args.before.iterdir()) if d.is_dir()]
    bad = 0
    for b, a in pairs:
        diffs = compare(b, a)
        worst = max(diffs, key=lambda d: d[1]) if diffs else ("", 0.0, None, None)
        print(f"{b.name}: {len(diffs)} values, largest relative difference {worst[1]:.3g} "
              f"at {worst[0]}")
        for path, rel, x, y in diffs:
            if rel > args.rtol:
                bad += 1
                print(f"  {path}: {x!r} -> {y!r} ({rel:.3g})")
    sys.exit(1 if bad else 0)


if __name__ == "__main__":
    main()
