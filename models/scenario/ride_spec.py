"""The ride's limits and its brake as read from ``[ride]`` (part of the scenario
contract, :mod:`spanstay.models.scenario.spec`): frozen dataclasses, every number SI."""
from __future__ import annotations

from dataclasses import dataclass, field


@dataclass(frozen=True)
class BrakeSpec:
    """The brake at the end of the ride, or the end stop that arrests a rider who
    misses it. Fields not used by its kind are None.

    ``none``: no brake (the rider must arrive at walking pace). ``spring`` /
    ``bungee``: a stop block on the cable pushed along a spring or bungee, its
    force-stroke law a linear ``stiffness`` or a ``curve`` of (stroke, force)
    points from (0, 0), over the ``stroke`` available. ``gravity``: the line ends
    uphill and the climb stops the rider (no stop force beyond the weight).
    ``rated``: a brake rated by its maker for an arrival speed and an energy,
    with the maker's peak force and stroke. ``acts_on`` says where the stop force
    goes: ``cable`` (a block or spring on the cable: into the cable at the rider,
    toward the end) or ``end-anchor`` (a brake line tied off to the end anchor:
    pulling it toward the start at the line's height).
    """

    kind: str                                  # none | spring | bungee | gravity | rated
    stroke: float | None = None                # m available
    stiffness: float | None = None             # N/m (linear law)
    curve: tuple[tuple[float, float], ...] | None = None  # (m, N) points
    rated_speed: float | None = None           # m/s (rated)
    rated_energy: float | None = None          # J (rated)
    peak_force: float | None = None            # N (rated: the maker's peak stop force)
    acts_on: str = "cable"                     # cable | end-anchor


#: arrival speed when there is no brake: walking pace, m/s (our judgement)
WALKING_PACE = 1.5
#: arrival speed limit with a spring or bungee stop block, m/s (our judgement: a
#: faster arrival needs a brake rated by its maker)
SPRING_ARRIVAL_LIMIT = 6.0
#: smallest clearance of the rider's feet over the ground, m (our judgement)
DEFAULT_MIN_FEET_CLEARANCE = 0.15
#: largest deceleration of the rider at the stop, m/s^2: 2 g (our judgement; a
#: stop that pitches a rider harder than this hurts)
DEFAULT_MAX_DECELERATION = 2.0 * 9.80665


#: a rescuer with harness, trolley and rescue kit, N (250 lbf: our judgement)
DEFAULT_RESCUER = 250 * 4.4482216152605
#: dynamic factor of a rescue (our judgement: a slow, controlled move, less bounce
#: than a ride; the rider's own dynamic factor applies to riding)
DEFAULT_RESCUE_FACTOR = 1.25


#: constructional stretch of a new stranded steel rope once bedded in, as a strain:
#: 0.25 % (from memory, common practice for strand and wire-core ropes; fibre-core
#: ropes stretch more, pre-stretched ropes less: give the maker's figure)
DEFAULT_BEDDING_IN_STRETCH = 0.0025


#: how far a rider falls before the line takes their weight when sitting off the
#: platform (harness and lanyard slack), m: 0.3 m, our judgement
DEFAULT_DROP_HEIGHT = 0.3


#: the wind the line is ridden in, head and tail, m/s: 2.5 m/s (about 5.6 mph), our
#: judgement of a breezy day; close the line in stronger wind
DEFAULT_RIDE_WIND = 2.5


@dataclass(frozen=True)
class RideLimits:
    """The ride's limits and its brake (scenario table ``[ride]``), SI.

    ``sources`` holds, per key, "given" or where its default comes from.
    """

    arrival_speed_limit: float = WALKING_PACE
    min_feet_clearance: float = DEFAULT_MIN_FEET_CLEARANCE
    hang_distance: tuple[float, float] | None = None  # (shortest, longest) m; None: the rider's
    max_deceleration: float = DEFAULT_MAX_DECELERATION
    brake: BrakeSpec = field(default_factory=lambda: BrakeSpec("none"))
    end_stop: BrakeSpec | None = None
    single_rider: bool = False                 # True: no two-rider case
    second_rider: float | None = None          # N; None: the heaviest rider
    rescuer: float = DEFAULT_RESCUER            # N, rescuer with gear
    rescue_factor: float = DEFAULT_RESCUE_FACTOR  # on the rescuer's and stuck rider's weights
    rescue_on_line: bool = True                # False: rescue from the ground (no rescue case)
    bedding_in_stretch: float = DEFAULT_BEDDING_IN_STRETCH  # strain of the ridden rope
    drop_height: float = DEFAULT_DROP_HEIGHT   # m, a rider's fall before the line takes them
    head_wind: float = DEFAULT_RIDE_WIND       # m/s against the travel
    tail_wind: float = DEFAULT_RIDE_WIND       # m/s with the travel
    sources: tuple[tuple[str, str], ...] = ()

    def second_rider_or(self, rider) -> float:
        """The second rider's weight (N): as given, else the heaviest rider's
        (``rider``: the scenario's RiderSpec)."""
        return rider.heaviest if self.second_rider is None else self.second_rider

    def source(self, key: str) -> str:
        """Where the value of ``key`` comes from."""
        return dict(self.sources).get(key, "our judgement")
