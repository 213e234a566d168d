"""Benchmark of the main job (a script, not a test): prints figures, asserts nothing.

For each example scenario at 100 stations (``--stations``):
- the whole `spanstay run` process (interpreter start, analysis, results folder),
  timed as a subprocess, with the default worker processes and with ``--workers 1``;
- in this process, serially: the analysis by phase (install, passes, slack budget,
  checks), the factorisation count and the time in linear algebra, Newton
  iterations per station (mean, max, distribution), and the results writing;
- the reference cost the speed issue measures against: 1,500 SuperLU factor+solves
  of that example's own installed tangent, and the ratio of the whole run to it.
Then the start-up time of `spanstay --help`.

    python3 benchmarks/run_benchmark.py [--stations N] [scenario.toml ...]
"""
from __future__ import annotations

import argparse
import collections
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))  # this checkout's spanstay first


def whole_run(path: Path, stations: int, workers: int | None) -> float:
    """Wall time of `python3 -m spanstay run` on ``path`` (results in a temporary folder)."""
    with tempfile.TemporaryDirectory() as tmp:
        cmd = [sys.executable, "-m", "spanstay", "run", str(path), "--stations", str(stations),
               "--out", str(Path(tmp) / "out")]
        if workers:
            cmd += ["--workers", str(workers)]
        t0 = time.perf_counter()
        subprocess.run(cmd, cwd=ROOT, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        return time.perf_counter() - t0


def reference_linear_algebra(result, count: int = 1500) -> tuple[float, int]:
    """Seconds for ``count`` SuperLU factor+solves of the installed tangent, and its size."""
    import numpy as np
    import scipy.sparse.linalg as sla

    from spanstay.fem.assembly import Assembler

    model, state = result.system.model, result.installed
    asm = Assembler(model)
    x = model.coords + state.translation
    disp = np.zeros((x.shape[0], 6))
    disp[:, :3] = state.translation
    k = asm.tangent([g.evaluate(x, state.rotation, disp, True) for g in asm.units]).tocsc()
    b = np.ones(k.shape[0])
    t0 = time.perf_counter()
    for _ in range(count):
        sla.splu(k).solve(b)
    return time.perf_counter() - t0, k.shape[0]


def bench(path: Path, stations: int) -> None:
    import spanstay.models.analysis.run as run
    import spanstay.models.analysis.slack_budget as slack
    import spanstay.models.api as api
    from spanstay.fem.solver import TIMINGS
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
    TIMINGS.linear_algebra, TIMINGS.factorisations = 0.0, 0
    try:
        t0 = time.perf_counter()
        result = api.analyse(scenario, stations=stations, workers=1)
        analysis = time.perf_counter() - t0
    finally:
        run.install, run.run_cases, slack.slack_budget, api.run_verdict = original
    linalg, factorisations = TIMINGS.linear_algebra, TIMINGS.factorisations
    per_station = [s.newton_iterations for p in result.passes.values() for s in p.stations]
    with tempfile.TemporaryDirectory() as tmp:
        t0 = time.perf_counter()
        write_results(result, Path(tmp) / "out", str(path), "us")
        write = time.perf_counter() - t0
    ref, n_eq = reference_linear_algebra(result)
    whole_default = whole_run(path, stations, None)
    whole_serial = whole_run(path, stations, 1)
    solved = len(per_station)
    print(f"{path.name}: {n_eq} equations, {len(result.passes)} passes, {solved} stations solved")
    print(f"  whole run (process)  {whole_default:6.2f} s default workers, "
          f"{whole_serial:6.2f} s --workers 1")
    print(f"  analysis (serial)    {analysis:6.2f} s ({analysis / max(solved, 1) * 1e3:.1f} ms "
          f"per station); linear algebra {linalg:.2f} s")
    for name, seconds in phases.items():
        print(f"    {name:<13} {seconds:6.2f} s")
    print(f"  factorisations       {factorisations} ({factorisations / max(solved, 1):.2f} per "
          "station, slack budget included)")
    if per_station:
        dist = collections.Counter(per_station)
        print(f"  Newton iterations per station: mean {sum(per_station) / solved:.2f}, max "
              f"{max(per_station)}; " + ", ".join(f"{k}: {v}" for k, v in sorted(dist.items())))
    print(f"  write results        {write:6.2f} s")
    print(f"  1,500 SuperLU factor+solves of the installed tangent: {ref:.2f} s; whole run / "
          f"that = {whole_serial / ref:.2f} (--workers 1), {whole_default / ref:.2f} (default)")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("scenarios", nargs="*", type=Path)
    parser.add_argument("--stations", type=int, default=100)
    args = parser.parse_args()
    paths = args.scenarios or sorted((ROOT / "examples").glob("*.toml"))
    for path in paths:
        bench(path, args.stations)
    t0 = time.perf_counter()
    subprocess.run([sys.executable, "-m", "spanstay", "--help"], check=True,
                   stdout=subprocess.DEVNULL, cwd=ROOT)
    print(f"spanstay --help (with interpreter start): {time.perf_counter() - t0:.2f} s")


if __name__ == "__main__":
    main()
