"""Hang a cable line between its anchors and report the installed state.

Usage: python examples/hang_line.py SCENARIO.toml [--units us|si]

Reads and checks the scenario, finds the installed state of every line with
the posts, nails and footings deforming (form-finding from the elastic
catenary), then reports sag, end tensions, anchor movement and soil
utilisation. This is the part of `spanstay run` that has landed so far.
"""
from __future__ import annotations

import sys

import numpy as np




def main(argv: list[str]) -> int:
    from models.cautions import CAUTION_TEXT
    from models.errors import InputError
    from models.footing import footing_response
    from models.installed import end_tensions, install, measured_sag
    from models.scenario import load_scenario
    from models.units import show

    if not argv:
        print(__doc__)
        return 2
    units = "si" if "--units" in argv and argv[argv.index("--units") + 1] == "si" else "us"
    try:
        scenario = load_scenario(argv[0])
        system, state, lengths = install(scenario)
    except InputError as exc:
        print(f"spanstay: error: {exc}", file=sys.stderr)
        return 2
    print(f"{scenario.project.name}: installed state ({system.model.n_nodes} nodes)")
    for name, line in system.lines.items():
        t0, t1 = end_tensions(system, state, line)
        print(f"  line '{name}': unstressed length {show(lengths[name], 'length', units)}, "
              f"mid-span sag {show(measured_sag(system, state, line), 'length', units)}, "
              f"end tensions {show(t0, 'force', units)} / {show(t1, 'force', units)}")
    for name, anchor in system.anchors.items():
        top = state.translation[anchor.top_node]
        text = f"  anchor '{name}': top moves {show(float(np.linalg.norm(top[:2])), 'length', units)}"
        if anchor.footing is not None:
            line = next(iter(system.lines.values()))
            resp = footing_response(anchor.footing, system.model, state,
                                    (line.end_xyz - line.start_xyz)[:2])
            text += (f", ground-line rotation {np.degrees(abs(resp.ground_rotation)):.3f} deg, "
                     f"largest soil p/p_u {resp.max_ratio:.2f}")
        print(text)
    print()
    print("CAUTION: " + CAUTION_TEXT)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
