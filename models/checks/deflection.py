"""Check of an anchor's deflection at its line attachment."""
from __future__ import annotations

import numpy as np

from spanstay.fem import State
from spanstay.models.checks.check import Check
from spanstay.models.parts.system import System

#: Line attachment deflection limit as a fraction of its height above grade: a judgement.
DEFLECTION_RATIO = 40.0


def deflection_checks(system: System, anchor, state: State) -> list[Check]:
    """Horizontal displacement of the highest line attachment against height / 40."""
    name = anchor.spec.name
    heights = [bl.spec.start_height if bl.spec.start == name else bl.spec.end_height
               for bl in system.lines.values() if name in (bl.spec.start, bl.spec.end)]
    if not heights:
        return []
    h = max(heights)
    node = anchor.node_at(h)
    move = float(np.hypot(*state.translation[node][:2]))
    return [Check(f"anchor.{name}.deflection", "anchor", name,
                  f"horizontal deflection of the line attachment ({h:.2f} m up)",
                  move, h / DEFLECTION_RATIO, "length",
                  source=f"limit height / {DEFLECTION_RATIO:g}: a judgement of ours",
                  note="total from the unloaded position, installed pull included")]
