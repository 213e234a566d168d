"""The installed line between rigid supports, as the scenario states it, and its sanity.

The unstressed length of each line follows from its stated sag, tension or
length on the elastic catenary between rigid supports (Irvine, Cable
Structures, 1981; :mod:`spanstay.models.common.catenary`). The same curve shows
whether the cable, before any rider, hangs into the ground. Failures of the
solvers are reported as input errors naming the line's key, in plain words.
"""
from __future__ import annotations

import numpy as np

from spanstay.models.common.catenary import (Catenary, length_for_sag, length_for_tension,
                                             solve_catenary)
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.spec import LineSpec, Scenario

#: points along the cable where its height above the ground is checked
GROUND_SAMPLES = 201


def line_key(scenario: Scenario, line: LineSpec) -> str:
    """Key path of the value that sets the line's shape, e.g. ``line[1] "family".sag``."""
    index = scenario.lines.index(line)
    field = ("sag" if line.sag is not None else "tension" if line.tension is not None
             else "unstressed_length")
    return f'line[{index + 1}] "{line.name}".{field}'


def span_and_drop(scenario: Scenario, line: LineSpec) -> tuple[float, float]:
    """Horizontal span and drop (start attachment above the end one, m)."""
    a, b = scenario.anchor(line.start), scenario.anchor(line.end)
    span = float(np.hypot(b.x - a.x, b.y - a.y))
    drop = (a.grade + line.start_height) - (b.grade + line.end_height)
    return span, drop


def rigid_support_length(scenario: Scenario, line: LineSpec) -> float:
    """Unstressed length (m) that gives the line's stated sag or tension between
    rigid supports (or the stated length itself).

    Raises
    ------
    InputError
        The stated value cannot be met by this rope on this span, naming the key.
    """
    if line.unstressed_length is not None:
        return line.unstressed_length
    span, drop = span_and_drop(scenario, line)
    rope, where = line.rope, line_key(scenario, line)
    if line.tension is not None and line.tension >= rope.breaking_strength:
        raise InputError(f"an installed tension of {line.tension:.4g} N is not below the "
                         f"rope's breaking strength ({rope.breaking_strength:.4g} N)", where)
    try:
        if line.sag is not None:
            length = length_for_sag(span, drop, line.sag, rope.weight_per_length, rope.EA)
        else:
            length = length_for_tension(span, drop, line.tension, rope.weight_per_length,
                                        rope.EA)
    except (ValueError, ArithmeticError, FloatingPointError):
        if line.sag is not None:
            raise InputError(f"no cable of this rope hangs with a mid-span sag of "
                             f"{line.sag:.4g} m on a {span:.4g} m span; give another sag, "
                             "or a tension", where) from None
        raise InputError(f"no cable of this rope hangs between these attachments with an "
                         f"end tension of {line.tension:.4g} N (too low for the rope's own "
                         "weight over this span, or beyond its stretch); give another "
                         "tension, or a sag", where) from None
    if not np.isfinite(length) or length <= 0:
        raise InputError("the line cannot be hung as stated; give another value", where)
    return float(length)


def installed_curve(scenario: Scenario, line: LineSpec) -> Catenary:
    """The rigid-support catenary of the line as stated."""
    span, drop = span_and_drop(scenario, line)
    length = rigid_support_length(scenario, line)
    try:
        return solve_catenary(span, drop, length, line.rope.weight_per_length, line.rope.EA)
    except (ValueError, ArithmeticError, FloatingPointError):
        raise InputError("the line cannot be hung between its attachments as stated; "
                         "check the length, sag or tension and the attachment heights",
                         line_key(scenario, line)) from None


def _ground_under(scenario: Scenario, line: LineSpec, x: np.ndarray) -> np.ndarray:
    """Ground elevation under the line at horizontal distance ``x`` from its start.

    The ground profile belongs to the ridden line; under other lines the ground
    is taken straight between their anchors' grades.
    """
    a, b = scenario.anchor(line.start), scenario.anchor(line.end)
    ridden = scenario.rider.line if scenario.rider else scenario.lines[0].name
    profile = scenario.ground.profile
    if line.name == ridden and profile:
        distance, elevation = zip(*profile)
        return np.interp(x, distance, elevation)
    span = max(float(np.hypot(b.x - a.x, b.y - a.y)), 1e-9)
    return a.grade + (b.grade - a.grade) * x / span


def check_above_ground(scenario: Scenario, line: LineSpec) -> None:
    """Refuse a line whose installed cable (rigid supports, no rider) touches the ground."""
    curve = installed_curve(scenario, line)
    start = scenario.anchor(line.start)
    s = np.linspace(0.0, curve.L0, GROUND_SAMPLES)
    with np.errstate(all="ignore"):
        x, z = curve.x(s), start.grade + line.start_height - curve.z_down(s)
    if not (np.all(np.isfinite(x)) and np.all(np.isfinite(z))):
        raise InputError("the line cannot be hung between its attachments as stated",
                         line_key(scenario, line))
    gap = z - _ground_under(scenario, line, x)
    k = int(np.argmin(gap))
    if gap[k] <= 0.0:
        raise InputError(
            f"the installed cable, before any rider, hangs {-gap[k]:.3g} m "
            f"({-gap[k] / 0.3048:.3g} ft) into the ground {x[k]:.3g} m from anchor "
            f'"{line.start}"; give less sag (more tension, a shorter length), raise the '
            "attachments, or correct the ground profile", line_key(scenario, line))
