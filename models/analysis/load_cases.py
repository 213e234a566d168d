"""Load cases as values: what each pass of a run loads, at what temperature, on which
structure. :func:`load_cases` is the one place the list a scenario needs is built.

A pass is described by an immutable :class:`LoadCase` and run by
:func:`spanstay.models.analysis.run_case.run_case`, which leaves the shared structure
unchanged, so cases can be added as values and run side by side.
"""
from __future__ import annotations

from dataclasses import dataclass

from spanstay.models.scenario.spec import Scenario

#: where a stuck or waiting rider is held: half the cable's unstressed length
MID_SPAN = 0.5
#: a hot pass is run when the hottest temperature of use is this far above installation (K)
HOT_MARGIN = 0.05

#: what a case is for: "ride" (speeds, slack budget, the heavy rider's states),
#: "strength" (structural checks), "clearance" (the feet over the ground when hot),
#: "arrest" (the emergency arrest, checked against ultimate capacities)
PURPOSES = ("ride", "strength", "clearance", "arrest")
#: fastener slip of laminated posts: K_ser for the ride, K_u = 2/3 K_ser for strength
SLIP_STATES = ("service", "ultimate")


@dataclass(frozen=True)
class PointLoad:
    """An extra load on an anchor at a height above its grade (N, global x, y, z)."""

    anchor: str
    height: float
    force: tuple[float, float, float]


@dataclass(frozen=True)
class LoadCase:
    """One pass of the rider along one line.

    Attributes
    ----------
    name
        Pass label in every output ("ride_light", "design", "design-<line>", ...).
    purpose
        One of :data:`PURPOSES`.
    line
        Name of the line the rider loads.
    rider_weight
        Rider weight before any factor (N).
    rider_factor
        Dynamic factor on the rider weight (1 for a static pass).
    temperature
        Cable temperature (K); the cut lengths are those of the installed state.
    slip
        One of :data:`SLIP_STATES`.
    stations
        Number of rider stations between the ride's start and stop offsets.
    keep_states
        Keep every station's full state (for checks, VTK output and plots).
    extra_loads
        Loads added to the rider at every station.
    push
        Horizontal force on the rider along the line toward its end anchor (N):
        the stop force of a brake or end stop acting on the trolley.
    at_end
        One station only, at the ride's stop offset (the stop cases).
    stretch
        Constructional stretch of the ridden line's rope, bedded in: a strain
        added to its unstressed length before the rider (0: as installed).
    fixed
        Loads that stay put on the ridden cable while the rider moves:
        (fraction of the cable's unstressed length, load in N), e.g. a rider
        stuck at mid-span.
    """

    name: str
    purpose: str
    line: str
    rider_weight: float
    rider_factor: float
    temperature: float
    slip: str
    stations: int
    keep_states: bool = False
    extra_loads: tuple[PointLoad, ...] = ()
    push: float = 0.0
    at_end: bool = False
    fixed: tuple[tuple[float, float], ...] = ()
    stretch: float = 0.0

    def __post_init__(self) -> None:
        if self.purpose not in PURPOSES:
            raise ValueError(f"load case {self.name}: purpose {self.purpose!r} not in {PURPOSES}")
        if self.slip not in SLIP_STATES:
            raise ValueError(f"load case {self.name}: slip {self.slip!r} not in {SLIP_STATES}")

    @property
    def rider_load(self) -> float:
        """The vertical load the rider puts on the line (N)."""
        return self.rider_weight * self.rider_factor


def temperature_range(scenario: Scenario) -> tuple[float, float]:
    """(coldest, hottest) temperature of use, the installation temperature included (K)."""
    settings = scenario.settings
    temps = list(settings.use_temperatures) + [settings.install_temperature]
    return min(temps), max(temps)


def other_lines(scenario: Scenario) -> list[str]:
    """Names of the lines other than the one the rider's table names."""
    return [line.name for line in scenario.lines if line.name != scenario.rider.line]


def needs_ultimate_slip(scenario: Scenario) -> bool:
    """True when some post is laminated (its strength passes use K_u)."""
    return any(a.post is not None and a.post.kind == "laminated" for a in scenario.anchors)


def load_cases(scenario: Scenario, stations: int | None = None) -> tuple[LoadCase, ...]:
    """Every pass a run of ``scenario`` makes, in order.

    - ride_light, ride_heavy: the lightest and heaviest rider, static, at the
      installation temperature, fastener slip K_ser (the ride and its speeds);
    - hot: the heaviest rider, static, at the hottest temperature of use (feet
      clearance), when that is above installation;
    - bedded: the same after the rope's constructional stretch has bedded in
      and before it is re-tensioned ([ride] bedding_in_stretch; feet clearance);
    - design: the heaviest rider times the dynamic factor at the coldest
      temperature (the tightest line), laminated posts with K_u (EC5 2.2.2);
    - design-<line>: the same on every other line, so the anchors it shares are
      checked under its pull too;
    - two_riders: a second rider ([ride] second_rider) stopped at mid-span, static,
      while the heaviest rides the line times the dynamic factor (left out when
      [ride] says single_rider);
    - rescue: the heaviest rider stuck at mid-span and a rescuer ([ride] rescuer)
      travelling the line to them, both times [ride] rescue_factor (left out when
      [ride] says the rescue is from the ground).
    """
    rider = scenario.rider
    if rider is None:
        raise ValueError("a scenario without a rider has no load cases")
    count = int(stations or rider.stations)
    t_inst = scenario.settings.install_temperature
    t_cold, t_hot = temperature_range(scenario)
    design_slip = "ultimate" if needs_ultimate_slip(scenario) else "service"
    cases = [
        LoadCase("ride_light", "ride", rider.line, rider.lightest, 1.0, t_inst, "service", count),
        LoadCase("ride_heavy", "ride", rider.line, rider.heaviest, 1.0, t_inst, "service", count,
                 keep_states=True),
    ]
    if t_hot > t_inst + HOT_MARGIN:
        cases.append(LoadCase("hot", "clearance", rider.line, rider.heaviest, 1.0, t_hot,
                              "service", count))
    if scenario.ride.bedding_in_stretch > 0.0:
        cases.append(LoadCase("bedded", "clearance", rider.line, rider.heaviest, 1.0,
                              max(t_hot, t_inst), "service", count,
                              stretch=scenario.ride.bedding_in_stretch))
    for name in [rider.line] + other_lines(scenario):
        label = "design" if name == rider.line else f"design-{name}"
        cases.append(LoadCase(label, "strength", name, rider.heaviest, rider.dynamic_factor,
                              t_cold, design_slip, count, keep_states=True))
    ride, factor = scenario.ride, rider.dynamic_factor
    if not ride.single_rider:
        cases.append(LoadCase("two_riders", "strength", rider.line, rider.heaviest, factor, t_cold,
                              design_slip, count, keep_states=True,
                              fixed=((MID_SPAN, ride.second_rider_or(rider)),)))
    if ride.rescue_on_line:
        cases.append(LoadCase("rescue", "strength", rider.line, ride.rescuer, ride.rescue_factor,
                              t_cold, design_slip, count, keep_states=True,
                              fixed=((MID_SPAN, rider.heaviest * ride.rescue_factor),)))
    return tuple(cases)


def stop_cases(scenario: Scenario, stop_force: float | None,
               arrest_force: float | None) -> tuple[LoadCase, ...]:
    """The stop and the emergency arrest, each one station at the ride's end.

    - stop: the heaviest rider's static weight and the brake's peak stop force
      (from :func:`spanstay.models.analysis.brake.stop`, the largest over the
      riders) toward the end anchor, at the coldest temperature, as a strength
      case (the usual factors of safety);
    - arrest: the brake missed, the rider stopped by the end stop, checked
      against ultimate capacities.

    The force enters the cable at the rider (toward the end) when the device acts
    on the cable, else it pulls the end anchor toward the start at the line's
    height (a brake line tied off to it).
    ``None`` leaves a case out (no brake force, no end stop, or no arrival).
    """
    rider = scenario.rider
    if rider is None:
        raise ValueError("a scenario without a rider has no load cases")
    t_cold, _ = temperature_range(scenario)
    slip = "ultimate" if needs_ultimate_slip(scenario) else "service"
    cases = []
    for name, purpose, force, device in (("stop", "strength", stop_force, scenario.ride.brake),
                                         ("arrest", "arrest", arrest_force,
                                          scenario.ride.end_stop)):
        if force is None:
            continue
        on_cable = device is None or device.acts_on == "cable"
        extra = () if on_cable else (end_anchor_pull(scenario, float(force)),)
        cases.append(LoadCase(name, purpose, rider.line, rider.heaviest, 1.0, t_cold, slip, 1,
                              keep_states=True, extra_loads=extra,
                              push=float(force) if on_cable else 0.0, at_end=True))
    return tuple(cases)


def end_anchor_pull(scenario: Scenario, force: float) -> PointLoad:
    """The stop force on the ridden line's end anchor, toward the start anchor in plan,
    at the line's end height."""
    line = scenario.line(scenario.rider.line)
    start, end = scenario.anchor(line.start), scenario.anchor(line.end)
    dx, dy = start.x - end.x, start.y - end.y
    norm = (dx * dx + dy * dy) ** 0.5
    return PointLoad(end.name, line.end_height, (force * dx / norm, force * dy / norm, 0.0))
