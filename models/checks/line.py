"""Checks of a line: cable tension and both end terminations."""
from __future__ import annotations

import numpy as np

from spanstay.fem import State
from spanstay.models.checks.check import Check
from spanstay.models.parts.system import System
from spanstay.models.scenario.spec import DEFAULT_FACTOR_OF_SAFETY


def _fos(system: System) -> tuple[float, str]:
    fos = float(system.scenario.settings.factor_of_safety)
    if fos == DEFAULT_FACTOR_OF_SAFETY:
        return fos, ("factor of safety 5 on breaking strength for life-safety rope "
                     "(common practice)")
    return fos, "factor of safety on breaking strength: a design input (settings)"


def line_checks(system: System, state: State, bl,
                ultimate: bool = False) -> list[Check]:
    """Cable tension and both end terminations of one line (``ultimate``: against the
    breaking strength itself, no factor of safety, for an emergency arrest)."""
    spec = bl.spec
    rope = spec.rope
    fos, fos_src = (1.0, "ultimate: the breaking strength itself, no factor of safety "
                    "(an emergency arrest)") if ultimate else _fos(system)
    t = np.asarray(state.group(bl.group).tension, float)
    k = int(np.argmax(t))
    name = spec.name
    out = [Check(f"line.{name}.tension", "cable", name,
                 f"largest cable tension against breaking strength / {fos:g}",
                 float(t[k]), rope.breaking_strength / fos, "force",
                 source=f"{fos_src}; breaking strength: {rope.source}",
                 note=f"{rope.name}, segment {k + 1} of {t.size}")]
    eff = float(spec.termination_efficiency)
    for anchor, value in ((spec.start, t[0]), (spec.end, t[-1])):
        out.append(Check(
            f"line.{name}.termination.{anchor}", "termination", f"{name} at {anchor}",
            f"end tension against breaking strength x efficiency {eff:g} / {fos:g}",
            float(value), rope.breaking_strength * eff / fos, "force",
            source=f"{fos_src}; termination efficiency: design input (default 0.8, from "
                   "memory, clipped ends)",
            note="use the termination maker's rated efficiency"))
    return out


