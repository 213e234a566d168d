"""Benchmark of the main job (a script, not a test): prints figures, asserts nothing.

For each example scenario: the wall time of `analyse` (installed state, every
rider pass, slack budget, checks) at 100 stations, split by phase, the Newton
iterations per station, and the time to write the results folder; then the
start-up time of `spanstay --help` (interpreter included). The issue's
targets: a whole run under 2 s, `--help` under 0.5 s.

    python3 benchmarks/run_benchmark.py [--stations N] [scenario.toml ...]
"""
from __future__ import annotations

import argparse
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def bench(path: Path, stations: int) -> None:
    import spanstay.models.analysis.run as run
    import spanstay.models.analysis.slack_budget as slack
    import spanstay.models.api as api
    from spanstay.models.outputs.results_folder import write_results
    from spanstay.models.scenario.read import load_scenario

    scenario = load_scenario(path)
    phases: dict[str, float] = {}

    def timed(name, fn):
        def wrapper(*args, **kwargs):
            t0 = time.perf_counter()
            try:
                return fn(*args, **kwargs)
            finally:
                phases[name] = phases.get(name, 0.0) + time.perf_counter() - t0
        return wrapper

    original = (run.install, run.run_cases, slack.slack_budget, api.run_verdict)
    run.install, run.run_cases = timed("install", run.install), timed("passes", run.run_cases)
    slack.slack_budget = timed("slack budget", slack.slack_budget)
    api.run_verdict = timed("checks", api.run_verdict)
    try:
        t0 = time.perf_counter()
        result = api.analyse(scenario, stations=stations)
        total = time.perf_counter() - t0
    finally:
        run.install, run.run_cases, slack.slack_budget, api.run_verdict = original
    iterations = [sum(s.iterations) for p in result.passes.values() for s in p.states]
    with tempfile.TemporaryDirectory() as tmp:
        t0 = time.perf_counter()
        write_results(result, Path(tmp) / "out", str(path), "us")
        write = time.perf_counter() - t0
    solved = sum(len(p.stations) for p in result.passes.values())
    print(f"{path.name}: {result.system.model.n_nodes} nodes, {len(result.passes)} passes, "
          f"{solved} stations solved")
    print(f"  analyse {total:6.2f} s  ({total / max(solved, 1) * 1e3:.1f} ms per station)")
    for name, seconds in phases.items():
        print(f"    {name:<13} {seconds:6.2f} s")
    if iterations:
        print(f"  Newton iterations per kept station: mean {sum(iterations) / len(iterations):.2f}, "
              f"max {max(iterations)}")
    print(f"  write results {write:6.2f} s")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("scenarios", nargs="*", type=Path)
    parser.add_argument("--stations", type=int, default=100)
    args = parser.parse_args()
    paths = args.scenarios or sorted((ROOT / "examples").glob("*.toml"))
    for path in paths:
        bench(path, args.stations)
    t0 = time.perf_counter()
    subprocess.run([sys.executable, "-c", "from spanstay.models.cli import main; main()", "--help"], check=True,
                   stdout=subprocess.DEVNULL, cwd=ROOT)
    print(f"spanstay --help (with interpreter start): {time.perf_counter() - t0:.2f} s")


if __name__ == "__main__":
    main()
