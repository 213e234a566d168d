"""Store the examples' key results (a script, not a test): tensions and sags per station
of every pass, every check's demand and utilization, the ride speeds.

    python3 benchmarks/store_example_values.py [--stations 6] [--out FILE]

tests/models/test_results_unchanged.py compares a fresh run against the stored file,
so a change meant to leave results alone (a faster solver) is held to 1e-6. When a
change is meant to alter results (a new soil model), re-store and say so in the commit.
"""
from __future__ import annotations

import argparse
import json
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEFAULT_OUT = ROOT / "tests" / "reference" / "data" / "example_values.json"


def key_values(path: Path, stations: int) -> dict:
    """The numbers of one example that must not move when results are meant to stay."""
    import spanstay

    r = spanstay.analyse(spanstay.load(path), stations=stations, slack_budget=False, workers=1)
    return {
        "passes": {name: {"tension_max": [s.tension_max for s in p.stations],
                          "sag": [s.sag for s in p.stations]}
                   for name, p in r.passes.items()},
        "checks": {c.id: {"demand": c.demand, "utilization": c.utilization}
                   for c in r.checks},
        "rides": {k: {"top_speed": v.top_speed, "arrival_speed": v.arrival_speed}
                  for k, v in r.rides.items()},
    }


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--stations", type=int, default=6)
    parser.add_argument("--out", type=Path, default=DEFAULT_OUT)
    args = parser.parse_args()
    data = {"stations": args.stations,
            "examples": {p.name: key_values(p, args.stations)
                         for p in sorted((ROOT / "examples").glob("*.toml"))}}
    args.out.write_text(json.dumps(data, indent=1, allow_nan=False) + "\n")
    print(f"wrote {args.out}")


if __name__ == "__main__":
    main()
