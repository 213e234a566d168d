"""The trolley stays on the cable: the least normal force of the trolley on the cable
over the ride (gravity's part g cos(theta) plus the centripetal part v^2 kappa, from
:func:`spanstay.models.analysis.ride.ride_speed`), for each rider whose ride pass is
complete. Past a crest (kappa < 0) a fast rider can lift the trolley off the cable."""
from __future__ import annotations

from spanstay.models.checks.check import Check
from spanstay.models.checks.verdict import NotChecked

_PASSES = {"lightest": "ride_light", "heaviest": "ride_heavy"}


def lift_off_checks(result) -> tuple[list[Check], list[NotChecked]]:
    """One check per rider: the weight's share lost to lift, against all of it.

    Utilization is ``1 - N_min / (m g)``: 0 on a straight level path, above 1 when
    the normal force turns negative (the trolley lifts off).
    """
    out: list[Check] = []
    missing: list[NotChecked] = []
    line = result.scenario.rider.line
    for key, label in _PASSES.items():
        ride = result.rides.get(key)
        p = result.passes.get(label)
        if ride is None or p is None or not p.complete:
            missing.append(NotChecked("ride", f"trolley lift-off ({key} rider)",
                                      f"not computed, because pass '{label}' did not complete"))
            continue
        ratio = float(ride.min_normal_ratio)
        out.append(Check(
            f"ride.lift_off.{key}", "trolley", line,
            f"trolley stays on the cable ({key} rider): least normal force over the weight",
            demand=0.0, capacity=ratio, kind="ratio", utilization=max(1.0 - ratio, 0.0),
            passed=ratio > 0.0,
            governing={"pass": label, "rider_weight": float(p.weight), "station": None,
                       "along": float(ride.min_normal_distance)},
            source="normal force g cos(theta) + v^2 kappa along the ride profile (circular "
                   "motion on the path; see analysis.ride)",
            note=(f"least normal force {ratio:.2f} x the weight at "
                  f"{ride.min_normal_distance:.2f} m" + ("; LIFTS OFF there: the speeds past "
                                                         "it are not reliable" if ride.lifts_off
                                                         else ""))))
    return out, missing


def loaded_sag_ratio(result) -> tuple[float, float] | None:
    """(largest sag under the heaviest rider / span, that sag in m) from the static
    heaviest pass, or None when it did not complete."""
    p = result.passes.get("ride_heavy")
    if p is None or not p.complete or not p.stations:
        return None
    line = result.system.lines[result.scenario.rider.line]
    span = float(line.along(line.end_xyz))
    sag = max(s.sag for s in p.stations)
    return sag / span, sag
