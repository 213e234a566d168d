"""Slack budget: how much of the loaded sag each part of the system adds.

At the governing station (largest sag of the heaviest rider, static, at the
installation temperature) the structure is re-solved with one part at a time
made (nearly) rigid; that part's share is the sag it removes. The geometric
share is the sag with every part rigid (rigid anchors, inextensible cable).
What the shares do not add up to is reported as the interaction of the parts.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from fem import solve
from fem.errors import FemError
from models.installed import install
from models.stations import place_rider, record

#: part name -> label in the table
PART_LABELS = {
    "cable": "cable stretch",
    "post": "post bending",
    "fasteners": "fastener slip",
    "soil": "footing rotation in the soil",
    "guy": "guy stretch",
    "brace": "brace and rail give",
}


@dataclass
class SlackBudget:
    """Shares of the loaded sag at one station (m)."""

    station: int
    along: float
    loaded_sag: float
    geometry: float
    shares: dict[str, float]
    interaction: float
    notes: list[str]

    def to_dict(self) -> dict:
        return {"pass": "ride_heavy", "station": self.station, "along": self.along,
                "loaded_sag": self.loaded_sag,
                "shares": {"geometry (rigid anchors, inextensible cable)": self.geometry,
                           **{PART_LABELS[k]: v for k, v in self.shares.items()},
                           "interaction of the parts": self.interaction},
                "notes": self.notes}


def parts_present(system) -> list[str]:
    """Parts of the system that can give: always the cable, then what the anchors have."""
    present = ["cable"]
    for part in ("post", "fasteners", "soil", "guy", "brace"):
        if any(a.groups.get(part) for a in system.anchors.values()):
            present.append(part)
    return present


def _sag_with(result, rigid: frozenset[str], s: float, weight: float) -> float:
    system, state, _ = install(result.scenario, rigid=rigid, lengths=result.lengths)
    line = system.lines[result.scenario.rider.line]
    warm = place_rider(system, line, state, s, weight)
    state = solve(system.model, state=warm, steps=4)
    return record(system, state, line).sag


def slack_budget(result) -> SlackBudget | None:
    """Split the heaviest rider's largest loaded sag into the parts' shares."""
    heavy = result.passes["ride_heavy"]
    if not heavy.stations:
        return None
    sags = np.array([st.sag for st in heavy.stations])
    k = int(np.argmax(sags))
    st = heavy.stations[k]
    parts = parts_present(result.system)
    notes = []
    try:
        geometry = _sag_with(result, frozenset(parts), st.s, heavy.weight)
        shares = {}
        for part in parts:
            shares[part] = st.sag - _sag_with(result, frozenset({part}), st.s, heavy.weight)
    except FemError as exc:
        notes.append(f"a re-solve with a rigid part failed: {exc}")
        return SlackBudget(k, st.along, st.sag, float("nan"), {}, float("nan"), notes)
    interaction = st.sag - geometry - sum(shares.values())
    notes.append("each share is the sag removed by making that part alone rigid "
                 "(stiffness x 100, so each share is 99 % of the full one); the geometric share has every part rigid")
    return SlackBudget(k, st.along, st.sag, geometry, shares, interaction, notes)
