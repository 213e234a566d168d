"""Checks of the emergency arrest: the brake missed, the end stop catches the rider.

An arrest is a rare, ultimate event, so the structure solved under it is checked
against ultimate capacities: every factor of safety and load factor of the
scenario's settings is taken as 1 (the line and its terminations against the rope's
breaking strength times the termination efficiency, guy and brace ropes likewise,
the soil's ultimate lateral load, uplift and sliding resistance, concrete piers
without the load factor); timber posts against NDS allowable stresses with
the "impact" load duration (CD = 2.0, NDS Table 2.3.2, from memory), which stays
on the safe side of a timber ultimate strength; each footing's ground-line
rotation against the rotation taken as failure of the soil in the footing
pushover (:data:`spanstay.models.analysis.capacity.ROTATION_LIMIT`). Deflection,
tilt and the IBC embedment (service limits) are not arrest checks. The footing
holding at all is shown by the arrest pass finding equilibrium (else it is
incomplete).
"""
from __future__ import annotations

import copy
import dataclasses

from spanstay.models.analysis.capacity import ROTATION_LIMIT
from spanstay.models.checks.check import Check
from spanstay.models.checks.line import line_checks
from spanstay.models.checks.structural import anchor_part_checks, extra_anchor_checks
from spanstay.models.parts.system import System

#: NDS load duration of an emergency arrest
ARREST_DURATION = "impact"
#: anchor checks that are service limits, not arrest checks
_SERVICE = (".deflection", ".footing.embedment", ".footing.ground_motion", ".footing.tilt")


def arrest_checks(system: System, arrest) -> list[Check]:
    """Every arrest check of the arrest pass (one station), ids prefixed ``arrest.``."""
    system = ultimate_system(system)
    state, station = arrest.states[0], arrest.stations[0]
    out: list[Check] = []
    for bl in system.lines.values():
        out += line_checks(system, state, bl, ultimate=True)
    for anchor in system.anchors.values():
        parts = anchor_part_checks(system, state, anchor, ARREST_DURATION)
        second = getattr(getattr(anchor, "brace", None), "second", None)
        if second is not None:
            parts += anchor_part_checks(system, state, second, ARREST_DURATION)
        out += [c for c in parts if not c.id.endswith(_SERVICE)]
    out += extra_anchor_checks(system, state, ARREST_DURATION, fos=1.0)
    for name, rotation in station.ground_rotation.items():
        out.append(Check(f"anchor.{name}.footing.rotation", "footing", name,
                         "ground-line rotation against the rotation taken as failure of the soil",
                         abs(float(rotation)), ROTATION_LIMIT, "angle",
                         source="footing pushover limit (about 6 deg): our judgement"))
    governing = {"pass": arrest.label, "rider_weight": float(arrest.weight), "station": 0,
                 "along": float(station.along)}
    for c in out:
        c.id = f"arrest.{c.id}"
        c.note = "; ".join(t for t in (c.note, "every factor of safety and load factor 1 "
                                       "(ultimate)") if t)
        c.description = f"emergency arrest (ultimate): {c.description}"
        c.governing = dict(governing)
    return out


#: the scenario settings that are factors of safety or load factors
SAFETY_FACTORS = ("factor_of_safety", "soil_factor_of_safety", "uplift_factor_of_safety",
                  "sliding_factor_of_safety", "tree_factor_of_safety", "concrete_load_factor")


def ultimate_system(system: System) -> System:
    """A shallow copy of ``system`` whose scenario has every safety and load factor 1."""
    settings = system.scenario.settings
    ones = {k: 1.0 for k in SAFETY_FACTORS if hasattr(settings, k)}
    out = copy.copy(system)
    out.scenario = dataclasses.replace(system.scenario,
                                       settings=dataclasses.replace(settings, **ones))
    return out
