"""Slack budget: how much of the loaded sag each part of the system adds.

At the governing station (largest sag of the heaviest rider, static, at the
installation temperature) the structure is re-solved with parts made (nearly)
rigid. The geometric share is the sag of the inextensible cable of the same
cut length between rigid supports, solved exactly
(:mod:`models.analysis.rigid_hang`); then the parts are given back their
flexibility one after another, from the cable outward (cable, post, fasteners,
soil, guys, braces), each re-solve keeping the parts not yet released 100 times
stiffer, and each part's share is the sag it adds. The shares add
up to the loaded sag exactly. Sag grows roughly as the square root of the
slack fed into the line, so a part's share depends on what was released
before it; the order is stated with the table.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from spanstay.fem import solve
from spanstay.fem.errors import FemError
from spanstay.models.common.errors import InputError
from spanstay.models.analysis.installed import install
from spanstay.models.analysis.stations import place_rider, record

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
    notes: list[str]

    def to_dict(self) -> dict:
        return {"pass": "ride_heavy", "station": self.station, "along": self.along,
                "loaded_sag": self.loaded_sag,
                "shares": {"geometry (rigid anchors, inextensible cable)": self.geometry,
                           **{PART_LABELS[k]: v for k, v in self.shares.items()}},
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
    sags = []
    try:
        sags.append(_geometry(result, st.s, heavy.weight))
        for i in range(1, len(parts)):
            sags.append(_sag_with(result, frozenset(parts[i:]), st.s, heavy.weight))
    except (FemError, InputError, ValueError) as exc:
        notes.append(f"a re-solve with rigid parts failed: {exc}")
        return SlackBudget(k, st.along, st.sag, float("nan"), {}, notes)
    sags.append(st.sag)
    shares = {part: sags[i + 1] - sags[i] for i, part in enumerate(parts)}
    notes.append("geometry: the inextensible cable between rigid supports, solved exactly; "
                 "parts not yet released made stiffer by 100 (each keeps 1 % of its give), "
                 "released in the order " + ", ".join(PART_LABELS[p] for p in parts))
    negative = [PART_LABELS[p] for p, v in shares.items() if v < 0]
    if negative:
        notes.append("a negative share (" + ", ".join(negative) + ") means that releasing "
                     "the part made the loaded sag smaller: the parts interact (a post that "
                     "leans toward the line under the installed pull can stand back up under "
                     "the rider), and each share depends on what was released before it")
    return SlackBudget(k, st.along, st.sag, sags[0], shares, notes)


def _geometry(result, s: float, weight: float) -> float:
    """Sag of the inextensible cable of the installed cut length between the rigid
    attachment points, with the rider at arc length ``s`` (exact)."""
    from spanstay.models.analysis.rigid_hang import rigid_hang

    spec = result.scenario.line(result.scenario.rider.line)
    line = result.system.lines[spec.name]
    d = line.end_xyz - line.start_xyz
    span = float(np.hypot(d[0], d[1]))
    _, sag = rigid_hang(span, float(d[2]), float(line.L0), spec.rope.weight_per_length, s,
                        weight)
    return sag
