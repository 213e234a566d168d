"""Reading a pier's concrete: ``concrete_strength`` and the ``reinforcement`` table.

Bar sizes: ASTM A615 inch-pound bars #3 to #11, nominal diameter and area (from
memory). Defaults: cover 3 in, concrete cast against and permanently exposed to earth
(ACI 318-19 Table 20.5.1.3.1, from memory); yield strength 60 ksi (Grade 60).
"""
from __future__ import annotations

import math

from spanstay.models.common.errors import InputError
from spanstay.models.scenario.reader import Table
from spanstay.models.scenario.spec import PierReinforcement

IN = 0.0254
#: bar -> (nominal diameter in, area in^2), ASTM A615 (from memory)
BARS = {"#3": (0.375, 0.11), "#4": (0.500, 0.20), "#5": (0.625, 0.31), "#6": (0.750, 0.44),
        "#7": (0.875, 0.60), "#8": (1.000, 0.79), "#9": (1.128, 1.00), "#10": (1.270, 1.27),
        "#11": (1.410, 1.56)}
REINFORCEMENT_KEYS = ("bars", "bar", "bar_diameter", "cover", "yield_strength")
DEFAULT_COVER = 3 * IN
DEFAULT_YIELD = 413.7e6  # Pa, 60 ksi
DEFAULT_CONCRETE_STRENGTH = 20.68e6  # Pa, 3000 psi: a common pier mix (our default)


def read_concrete_strength(table: Table) -> float:
    """f'c of a pier, Pa (2500 to 10000 psi)."""
    return table.quantity("concrete_strength", "pressure", DEFAULT_CONCRETE_STRENGTH,
                          minimum=17.2e6, maximum=69e6)


def read_reinforcement(table: Table | None, pier_diameter: float) -> PierReinforcement | None:
    """The ``reinforcement`` table of a pier footing, or None (plain concrete)."""
    if table is None:
        return None
    bars = table.integer("bars", minimum=4, maximum=40)
    key = table.one_of(("bar", "bar_diameter"))
    if key == "bar":
        name = table.text("bar", choices=tuple(BARS))
        d_in, a_in2 = BARS[name]
        d, area = d_in * IN, a_in2 * IN**2
    else:
        d = table.quantity("bar_diameter", "length", positive=True, maximum=0.06)
        area = math.pi * d * d / 4.0
    cover = table.quantity("cover", "length", DEFAULT_COVER, minimum=0.0, maximum=0.3)
    fy = table.quantity("yield_strength", "pressure", DEFAULT_YIELD, minimum=200e6,
                        maximum=700e6)
    if 2.0 * (cover + d) >= pier_diameter:
        raise InputError(f"the bars and their cover ({cover + d:.3g} m each side) leave no "
                         f"core in a {pier_diameter:.3g} m pier", table.where("cover"))
    return PierReinforcement(bars, d, area, cover, fy)
