"""The ranges spanstay accepts for scenario values, and the counts it will build.

Two layers of limits. :data:`MAGNITUDE` bounds every quantity of a dimension
(a catch-all far outside anything a cable ride or a guyed post holds: it stops
typing slips such as "1e30 ft" before they reach the solver). The named limits
below are tighter, for keys where an absurd value would still pass the
catch-all; each is a judgement of ours, generous for backyard and camp rides,
guyed poles and fence assemblies, not a code limit. Counts derived from input
(fastener levels, footing elements) are bounded so a run cannot exhaust memory.
"""
from __future__ import annotations

#: dimension -> (smallest value a key that must be positive may take, largest
#: magnitude any value may take), SI. A judgement: several orders of magnitude
#: beyond the trade's values on both sides.
MAGNITUDE: dict[str, tuple[float, float]] = {
    "length": (1e-4, 1e4),                  # 0.1 mm to 10 km
    "area": (1e-8, 1e3),
    "force": (1e-3, 1e9),
    "weight": (1e-3, 1e9),
    "pressure": (1e-3, 1e13),
    "force per length": (1e-6, 1e13),
    "weight per length": (1e-6, 1e5),
    "unit weight": (1.0, 1e6),
    "force per volume": (1.0, 1e12),
    "moment": (1e-3, 1e11),
    "rotational stiffness": (1e-3, 1e14),
    "speed": (1e-6, 100.0),
    "density": (1e-3, 1e5),
    "temperature": (1.0, 1e4),
    "temperature difference": (1e-6, 1e3),
    "per temperature": (1e-9, 1e-2),
    "angle": (1e-9, 6.2832),                # one full turn either way
    "energy": (1e-3, 1e9),
}

#: post height above grade, m: 1 ft to about 130 ft (a judgement)
POST_HEIGHT = (0.3, 40.0)
#: attachment heights of lines on posts or trees, m (about 200 ft; a judgement)
ATTACH_HEIGHT_MAX = 60.0
#: post and tree sizes (diameters, widths, depths), m: up to about 6.5 ft
POST_SIZE_MAX = 2.0
TREE_SIZE_MAX = 5.0
#: footing depth below grade and pier diameter, m (a judgement)
FOOTING_DEPTH_MAX = 30.0
PIER_DIAMETER_MAX = 5.0
#: deepest soil layer bottom, m
SOIL_DEPTH_MAX = 100.0
#: plan coordinates of anchors and guy ground points, m (within 5 km of the origin)
PLAN_MAX = 5000.0
#: a line's span between its anchors in plan, m (about 6,500 ft)
SPAN_MAX = 2000.0
#: rider weight, N (about 2,250 lbf: a judgement; tandem riders with gear fit well inside)
RIDER_WEIGHT_MAX = 1e4
#: rider's hang distance, cable to feet, m
HANG_DISTANCE_MAX = 20.0
#: start speed of the rider, m/s (about 67 mph)
START_SPEED_MAX = 30.0
#: rider drag area Cd*A, m^2
DRAG_AREA_MAX = 10.0
#: guy ground anchor distance from the post, m
GUY_DISTANCE_MAX = 300.0
#: fastener diameter and length, m
FASTENER_DIAMETER_MAX = 0.1
FASTENER_LENGTH_MAX = 1.0
#: smallest fastener spacing along a laminated post, m (1/4 in)
FASTENER_SPACING_MIN = 0.00635
#: most fastener levels along one laminated post (spacing and height set them)
FASTENER_LEVELS_MAX = 1000
#: most beam elements along one embedded footing (depth over the soil's
#: characteristic length sets them)
FOOTING_ELEMENTS_MAX = 1000
#: rider stations along the line (as the run command's --stations)
STATIONS_MAX = 2000
