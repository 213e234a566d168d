"""One check of one part: demand, capacity, utilization, where it governs and its source;
and the NDS load durations the timber checks use.

Load duration (NDS 2.3.2): the rider's pull lasts seconds per ride but recurs
thousands of times over the life of a line; its accumulated duration is not
known, so it is taken as normal ("ten years", CD = 1.0), a judgement that is
on the safe side of "ten minutes" (1.6) and of "impact" (2.0), which would
also count the dynamic factor twice. The installed pull (pretension and self
weight) is permanent: when the installed state is given it is checked with
CD = 0.9. The same rule holds for every timber part: posts, plies and fasteners,
kicker struts, H-brace rails and their bearing.
"""
from __future__ import annotations

import math
import re
from dataclasses import asdict, dataclass, field

from spanstay.models.common.json_safe import json_safe

#: NDS load duration of the rider's pull (see the module docstring): a judgement.
RIDER_DURATION = "ten years"
#: NDS load duration of the installed (pretension, self-weight) state.
PERMANENT_DURATION = "permanent"


@dataclass
class Check:
    """One check of one part. SI units; ``kind`` says which quantity.

    ``governing`` names the state that gives the largest utilization:
    pass label, rider weight (N), station index, horizontal distance along the
    line (m).
    """

    id: str
    part: str
    where: str
    description: str
    demand: float
    capacity: float
    kind: str
    utilization: float | None = None
    passed: bool | None = None
    governing: dict = field(default_factory=dict)
    source: str = ""
    note: str = ""

    def __post_init__(self) -> None:
        self.demand, self.capacity = float(self.demand), float(self.capacity)
        if self.utilization is None:
            self.utilization = (self.demand / self.capacity if self.capacity > 0
                                else (0.0 if self.demand <= 0 else math.inf))
        if self.passed is None:
            self.passed = bool(self.utilization <= 1.0)

    def to_dict(self) -> dict:
        """Plain JSON-ready dict; NaN and infinities become None."""
        return json_safe(asdict(self))


#: units of models.checks.anchors -> Check kinds
UNIT_KINDS = {"N": "force", "Pa": "stress", "m": "length", "rad": "angle", "-": "ratio",
          "N m": "moment"}


def slug(text: str) -> str:
    return re.sub(r"[^a-z0-9]+", "_", str(text).lower()).strip("_")
