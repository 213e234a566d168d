"""The verdict of a run: the structural checks of each complete strength pass (the worst
of each check over them), the ride checks, what was not checked and why, and the passes
that stopped early."""
from __future__ import annotations

import re

from spanstay.models.checks.check import Check
from spanstay.models.checks.arrest import arrest_checks
from spanstay.models.checks.lift_off import lift_off_checks
from spanstay.models.checks.ride import case_policy_not_checked, ride_checks
from spanstay.models.checks.stop import stop_checks
from spanstay.models.checks.wind import wind_checks
from spanstay.models.checks.structural import structural_checks, unchecked_parts
from spanstay.models.checks.verdict import NotChecked, Verdict, incomplete_pass


def _util(check: Check) -> float:
    u = check.utilization
    return -1.0 if u is None else float(u)


def run_verdict(result) -> Verdict:
    """The verdict of an analysed run (``spanstay.models.analysis.run.RunResult``)."""
    system = result.design_system or result.system
    installed = result.design_installed or result.installed
    worst: dict[str, Check] = {}
    verdict = Verdict(checks=[])
    strength_states = []
    for case in result.cases:
        p = result.passes[case.name]
        if not p.complete:
            verdict.incomplete.append(incomplete_pass(system, case, p))
            if case.purpose in ("strength", "arrest"):
                verdict.not_checked.append(NotChecked(
                    "structure", f"every structural check under pass '{case.name}'",
                    f"not computed, because pass '{case.name}' stopped early after "
                    f"{len(p.stations)} of {case.stations} stations"))
            continue
        if case.purpose == "arrest" and p.states:
            verdict.checks += arrest_checks(system, p)
            continue
        if case.purpose != "strength" or not p.states:
            continue
        strength_states += p.states
        for c in structural_checks(system, p, installed=installed):
            old = worst.get(c.id)
            if old is None or _util(c) > _util(old):
                worst[c.id] = c
    ride, missing = ride_checks(result)
    stops, stop_missing = stop_checks(result)
    lift, lift_missing = lift_off_checks(result)
    wind, wind_missing = wind_checks(result)
    verdict.checks = list(worst.values()) + verdict.checks + ride + wind + lift + stops
    verdict.not_checked += (missing + wind_missing + lift_missing + stop_missing
                            + case_policy_not_checked(result.scenario)
                            + unchecked_parts(system, strength_states))
    _set_aside_placeholder_checks(result.scenario, verdict)
    return verdict


def _set_aside_placeholder_checks(scenario, verdict: Verdict) -> None:
    """A check against a placeholder capacity is never a pass: it moves to not checked;
    results that depend on another placeholder (a stiffness) are listed too."""
    for where, _ in scenario.placeholders:
        key = where.rsplit(".", 1)[-1]
        anchor = re.search(r'"([^"]+)"', where)
        if key.endswith("capacity") and anchor:
            part = key.removesuffix("_capacity")
            prefix = f"anchor.{anchor.group(1)}."
            hit = [c for c in verdict.checks if c.id.startswith(prefix) and part in c.id]
            verdict.checks = [c for c in verdict.checks if c not in hit]
            verdict.not_checked.append(NotChecked(
                f"anchor '{anchor.group(1)}'", key.replace("_", " "),
                f"{where} is an accepted placeholder, not an assessed value"
                + (f" (the check {hit[0].id} is set aside)" if hit else "")))
        else:
            verdict.not_checked.append(NotChecked(
                "scenario", f"results that depend on {where}",
                "the value is an accepted placeholder, not a property of the site"))


def run_checks(result) -> list[Check]:
    """The checks of an analysed run (those of :func:`run_verdict`)."""
    return run_verdict(result).checks
