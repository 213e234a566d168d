"""Every check of a run: the structural checks of each strength pass (the worst of each
check over them) and the checks of the ride."""
from __future__ import annotations

from spanstay.models.checks.ride import MAX_ARRIVAL_SPEED, MIN_CLEARANCE, ride_checks
from spanstay.models.checks.structural import Check, structural_checks


def _util(check: Check) -> float:
    u = check.utilization
    return -1.0 if u is None else float(u)


def run_checks(result) -> list[Check]:
    """The checks of an analysed run (``spanstay.models.analysis.run.RunResult``)."""
    worst: dict[str, Check] = {}
    for case in result.cases:
        p = result.passes[case.name]
        if case.purpose != "strength" or not p.states:
            continue
        for c in structural_checks(result.design_system or result.system, p,
                                   installed=result.design_installed or result.installed):
            old = worst.get(c.id)
            if old is None or _util(c) > _util(old):
                worst[c.id] = c
    return list(worst.values()) + ride_checks(result, MIN_CLEARANCE, MAX_ARRIVAL_SPEED)
