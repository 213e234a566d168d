"""The verdict of a run: what was checked, what failed, what was not checked and why, and
whether the analysis behind it was complete. A result from an incomplete pass is never
shown as a pass.

Exit status of ``spanstay run`` (see :data:`EXIT_CODES`): 0 when the analysis is
complete and every check passes, 3 when some check fails, 4 when some pass stopped
early (the analysis is incomplete, whatever the checks say); 2 stays bad input.
"""
from __future__ import annotations

from dataclasses import asdict, dataclass, field

from spanstay.models.analysis.failure_site import gave_way
from spanstay.models.checks.check import Check
from spanstay.models.common.json_safe import json_safe

#: exit status of ``spanstay run`` by verdict status
EXIT_CODES = {"pass": 0, "fail": 3, "incomplete": 4}

@dataclass(frozen=True)
class Incomplete:
    """A pass that stopped before its last station (SI)."""

    pass_name: str
    purpose: str
    rider_weight: float          # N, the load the rider put on the line
    at: float                    # m, unstressed arc coordinate where no equilibrium was found
    along: float | None          # m, horizontal distance of the last solved station
    stations_solved: int
    stations: int
    gave_way: str                # the parts around the largest imbalance, in words
    reason: str                  # the engine's message

    def sentence(self) -> str:
        """One line saying which pass stopped, where, at what weight and what gave way."""
        return (f"pass '{self.pass_name}' ({self.purpose}) stopped after "
                f"{self.stations_solved} of {self.stations} stations: no equilibrium with the "
                f"rider {self.at:.2f} m along the cable; largest imbalance in {self.gave_way}")


@dataclass(frozen=True)
class NotChecked:
    """Something the run did not check, with the reason."""

    part: str
    what: str
    reason: str

    def sentence(self) -> str:
        return f"{self.part}: {self.what} not checked: {self.reason}"


@dataclass
class Verdict:
    """Checks made, passes that stopped early and what was not checked."""

    checks: list[Check]
    incomplete: list[Incomplete] = field(default_factory=list)
    not_checked: list[NotChecked] = field(default_factory=list)

    @property
    def failed(self) -> list[Check]:
        return [c for c in self.checks if not c.passed]

    @property
    def status(self) -> str:
        """"incomplete" if a pass stopped early, else "fail" if a check fails, else "pass"."""
        if self.incomplete:
            return "incomplete"
        return "fail" if self.failed else "pass"

    @property
    def exit_code(self) -> int:
        return EXIT_CODES[self.status]

    def counts_line(self) -> str:
        """"N checks pass, M fail, K not checked" (and the incomplete passes, first)."""
        n_fail = len(self.failed)
        text = (f"{len(self.checks) - n_fail} checks pass, {n_fail} fail, "
                f"{len(self.not_checked)} not checked")
        if self.incomplete:
            text = (f"ANALYSIS INCOMPLETE ({len(self.incomplete)} pass"
                    f"{'es' if len(self.incomplete) > 1 else ''} stopped early): " + text)
        return text

    def to_dict(self) -> dict:
        return json_safe({"status": self.status, "exit_code": self.exit_code,
                          "line": self.counts_line(),
                          "passed": len(self.checks) - len(self.failed),
                          "failed": len(self.failed),
                          "not_checked_count": len(self.not_checked),
                          "incomplete": [asdict(i) for i in self.incomplete],
                          "not_checked": [asdict(n) for n in self.not_checked]})


def incomplete_pass(system, case, p) -> Incomplete:
    """The finding for a pass that stopped early."""
    return Incomplete(case.name, case.purpose, float(p.weight), float(p.failed_at),
                      float(p.stations[-1].along) if p.stations else None, len(p.stations),
                      int(case.stations), gave_way(system, p.failed_groups), p.failure[:400])
