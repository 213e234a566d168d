"""The scenario as read and checked: frozen dataclasses, every number SI.

This is the contract between the scenario reader (models.scenario.read) and the rest
of the program. Units: m, N, Pa, N/m, N/m^3, K, kg/m^3, m/s, N*m/rad. Angles
are radians unless the field name ends in ``_deg``. Heights are measured up
from the anchor's grade; depths down from grade; positions are plan
coordinates (x along the first line, y across it) and elevations share one
vertical datum.
"""
from __future__ import annotations

from dataclasses import dataclass, field

from spanstay.models.catalogs.rope import RopeSpec
from spanstay.models.scenario.ride_spec import (DEFAULT_MAX_DECELERATION, DEFAULT_MIN_FEET_CLEARANCE,
                                                DEFAULT_RESCUE_FACTOR, DEFAULT_RESCUER,
                                                SPRING_ARRIVAL_LIMIT, WALKING_PACE, BrakeSpec,
                                                RideLimits)

# the rope a scenario names is a catalog entry; the ride's limits live in ride_spec
__all__ = ["RopeSpec", "BrakeSpec", "RideLimits", "WALKING_PACE", "SPRING_ARRIVAL_LIMIT",
           "DEFAULT_MIN_FEET_CLEARANCE", "DEFAULT_MAX_DECELERATION", "DEFAULT_RESCUER",
           "DEFAULT_RESCUE_FACTOR"]


@dataclass(frozen=True)
class MaterialOverrides:
    """User values replacing the species/grade catalog (None: use the catalog).

    The scenario key for ``shear_modulus`` is ``G`` (a stress, e.g. "100000 psi");
    it is not the NDS specific gravity.
    """

    E: float | None = None        # Pa, modulus of elasticity
    shear_modulus: float | None = None  # Pa (scenario key "G")
    Emin: float | None = None     # Pa, stability modulus
    Fb: float | None = None       # Pa, bending
    Ft: float | None = None       # Pa, tension parallel to grain
    Fv: float | None = None       # Pa, shear
    Fc: float | None = None       # Pa, compression parallel to grain
    Fc_perp: float | None = None  # Pa, compression perpendicular to grain
    density: float | None = None  # kg/m^3


@dataclass(frozen=True)
class SectionSpec:
    """A rectangular sawn section. ``depth`` lies in the plane of the pull."""

    nominal: str | None  # e.g. "2x6" (None when given by width and depth)
    width: float         # m, across the plane of bending
    depth: float         # m, in the plane of bending


@dataclass(frozen=True)
class FastenerSpec:
    """Fasteners joining the plies of a laminated post."""

    kind: str                   # "nail" | "screw" | "bolt"
    size: str | None            # catalog name, e.g. "16d common nail"; None if by dimensions
    diameter: float             # m
    length: float               # m
    spacing: float              # m, along the post, within one row
    rows: int                   # rows across the ply face
    staggered: bool             # rows offset by half a spacing
    predrilled: bool            # always True for screws and bolts
    slip_modulus: float | None  # N/m per fastener per shear plane; None: from the fastener


@dataclass(frozen=True)
class PostSpec:
    """A post. Fields not used by its kind are None.

    ``sawn``: ``section``. ``round``: ``top_diameter`` and ``base_diameter``
    (equal if not tapered). ``laminated``: ``plies`` of ``ply`` section, stacked
    one after another in the ``stack`` direction, joined by ``fastener``.
    ``stack_angle_deg`` is the plan angle between the line pull and the
    stacking direction (the normal to the ply faces): ``"across"`` = 0 (the
    pull bends the stack so the fasteners carry shear between plies),
    ``"side-by-side"`` = 90 (plies bend side by side, each about its own axis).
    """

    kind: str                        # "sawn" | "round" | "laminated"
    height: float                    # m above grade
    species: str | None              # lumber catalog name (models.catalogs.lumber), checked
    grade: str | None                # lumber catalog grade; None for round posts
    section: SectionSpec | None = None
    top_diameter: float | None = None
    base_diameter: float | None = None
    plies: int | None = None
    ply: SectionSpec | None = None   # width = ply face width, depth = ply thickness
    stack: str | None = None         # "across" | "side-by-side" | "angle"
    stack_angle_deg: float | None = None
    fastener: FastenerSpec | None = None
    overrides: MaterialOverrides = field(default_factory=MaterialOverrides)
    incised: bool = False            # preservative-treated incised sawn lumber (NDS Ci)
    conditioning: str | None = None  # round pole conditioning before treatment (NDS Cct)

    @property
    def outline(self) -> tuple[float, float]:
        """Overall plan size at the base (along the pull, across it), m."""
        if self.kind == "round":
            assert self.base_diameter is not None
            return self.base_diameter, self.base_diameter
        if self.kind == "sawn":
            assert self.section is not None
            return self.section.depth, self.section.width
        assert self.ply is not None and self.plies is not None
        stack = self.plies * self.ply.depth
        return (stack, self.ply.width) if self.stack_angle_deg == 0 else (self.ply.width, stack)


@dataclass(frozen=True)
class SoilLayerSpec:
    """One soil layer between two depths below grade.

    ``sand``: ``unit_weight``, ``friction_angle_deg``, optional ``k_initial``
    (API initial modulus of subgrade reaction). ``clay``: ``unit_weight``,
    ``undrained_shear_strength``, optional ``eps50``. ``modulus``: linear
    springs from ``modulus_constant`` (Pa, p/y) and ``modulus_gradient``
    (N/m^3, n_h: p/y grows by n_h per metre of depth). ``ibc_class`` names the
    IBC Table 1806.2 class for the code embedment check.
    """

    top: float                                # m below grade
    bottom: float                             # m below grade
    kind: str                                 # "sand" | "clay" | "modulus"
    unit_weight: float | None = None          # N/m^3 (total)
    friction_angle_deg: float | None = None
    k_initial: float | None = None            # N/m^3
    undrained_shear_strength: float | None = None  # Pa
    eps50: float | None = None
    modulus_constant: float | None = None     # Pa
    modulus_gradient: float | None = None     # N/m^3
    ibc_class: str | None = None              # key of models.catalogs.ibc_embedment
    preset: str | None = None                 # models.catalogs.soil preset the values came from
    loading: str = "cyclic"                   # "static" | "cyclic" p-y curves (DEFAULT_SOIL_LOADING)
    matlock_J: float | None = None            # Matlock's J (clay); None: 0.5


@dataclass(frozen=True)
class GroundSpec:
    """The ground under the line and the soil the anchors stand in."""

    profile: tuple[tuple[float, float], ...]  # (horizontal distance along the rider's
                                              # line from its start anchor, elevation), m
    soil: tuple[SoilLayerSpec, ...]           # layers from grade down, in order
    water_table: float | None = None          # m below grade


@dataclass(frozen=True)
class FootingSpec:
    """How a post meets the ground.

    ``fixed``: clamped at grade (optionally a rotational ``base_spring``).
    ``embedded``: post set ``depth`` into the soil, backfilled.
    ``pier``: post in a concrete pier of ``pier_diameter`` to ``depth``.
    """

    kind: str                        # "fixed" | "embedded" | "pier"
    depth: float                     # m below grade (0 for fixed)
    pier_diameter: float | None      # m
    backfill: str | None             # "native" | "gravel" | "concrete" (pier)
    base_spring: float | None        # N*m/rad, for kind fixed; None: rigid
    soil: tuple[SoilLayerSpec, ...] | None  # overrides [ground] soil for this footing
    slab_at_grade: bool              # constrained at grade (IBC 1807.3.2.2)
    double_lateral_bearing: bool     # IBC 1806.3.4 isolated-pole doubling
    concrete_strength: float = 20.68e6  # Pa, f'c of a pier (3000 psi unless given)
    reinforcement: "PierReinforcement | None" = None  # None: plain concrete pier


@dataclass(frozen=True)
class PierReinforcement:
    """Longitudinal bars of a round pier, equally spaced on one circle."""

    bars: int                        # number of bars
    bar_diameter: float              # m
    bar_area: float                  # m^2 per bar
    cover: float                     # m, clear cover to the bars (ties left out)
    yield_strength: float            # Pa


@dataclass(frozen=True)
class GuySpec:
    """A guy wire from a post down to a ground anchor."""

    attach_height: float              # m above the post's grade
    ground_point: tuple[float, float, float]  # m, ground anchor x, y, elevation
    direction_deg: float              # plan direction post -> ground anchor, from +x
    rope: RopeSpec
    pretension: float                 # N
    anchor_fixed: bool                # ground anchor rigid
    anchor_stiffness: float | None    # N/m along the guy; None when fixed
    anchor_capacity: float | None     # N; None: not checked
    termination_efficiency: float


@dataclass(frozen=True)
class BraceSpec:
    """A kicker brace or an H-brace assembly on a post.

    ``direction_deg`` is the plan direction from the post to the kicker foot or
    to the second post; None means along the line (kicker: toward the line;
    H-brace: away from the line).
    """

    kind: str                                 # "kicker" | "h-brace"
    direction_deg: float | None
    # kicker
    attach_height: float | None = None        # m above grade on the post
    foot_distance: float | None = None        # m, horizontal post -> foot
    member: SectionSpec | None = None
    species: str | None = None                # of the kicker member or the H-brace
    grade: str | None = None                  # rail (default: the post's)
    block_width: float | None = None          # m, bearing block at the foot
    block_length: float | None = None         # m
    block_depth: float = 0.0                  # m, block face embedded below grade (passive)
    block_friction: float | None = None       # base friction coefficient; None: IBC Table 1806.2
    # h-brace
    second_post: PostSpec | None = None
    second_footing: FootingSpec | None = None  # None: same as the anchor's footing
    distance: float | None = None             # m, post to second post
    rail_height: float | None = None          # m above grade
    rail: SectionSpec | None = None
    diagonal_rope: RopeSpec | None = None
    diagonal_pretension: float | None = None  # N


@dataclass(frozen=True)
class TreeSpec:
    """A living tree used as an anchor."""

    diameter_at_grade: float         # m
    diameter_at_attachment: float    # m
    attachment_height: float         # m, where diameter_at_attachment was measured
    E_green: float                   # Pa
    root_plate_stiffness: float      # N*m/rad
    root_plate_capacity: float | None  # N*m; None: not checked
    species: str | None


@dataclass(frozen=True)
class AnchorSpec:
    """An anchor: a post (with footing, guys, brace) or a tree."""

    name: str
    kind: str                        # "post" | "tree"
    x: float                         # m, plan
    y: float                         # m, plan
    grade: float                     # m, ground elevation at the anchor
    post: PostSpec | None            # kind post
    footing: FootingSpec | None      # kind post
    guys: tuple[GuySpec, ...]
    brace: BraceSpec | None
    tree: TreeSpec | None            # kind tree


@dataclass(frozen=True)
class LineSpec:
    """One cable span between two anchors. Exactly one of ``sag``, ``tension``,
    ``unstressed_length`` is set (the others are None)."""

    name: str
    start: str                       # anchor name
    end: str                         # anchor name
    start_height: float              # m above the start anchor's grade
    end_height: float                # m above the end anchor's grade
    rope: RopeSpec
    sag: float | None                # m, unloaded mid-span sag below the chord, installed
    tension: float | None            # N, installed
    unstressed_length: float | None  # m
    termination_efficiency: float
    segments: int


@dataclass(frozen=True)
class RiderSpec:
    """The rider, trolley and harness, and how the ride is stepped."""

    line: str                        # name of the line ridden
    lightest: float                  # N
    heaviest: float                  # N
    hang_distance: float             # m, cable to feet
    dynamic_factor: float
    rolling_resistance: float        # trolley rolling-resistance coefficient
    drag_area: float                 # m^2, Cd * A
    air_density: float               # kg/m^3
    start_speed: float               # m/s
    stations: int
    start_offset: float              # m along the line from its start anchor
    stop_offset: float               # m back from its end anchor


@dataclass(frozen=True)
class Settings:
    """Design settings."""

    factor_of_safety: float          # on rope breaking strength
    dynamic_factor: float            # default for the rider
    install_temperature: float       # K
    use_temperatures: tuple[float, ...]  # K, temperatures the line is checked at
    stations: int                    # default number of rider stations
    units: str                       # "us" | "si" display preference
    #: True when use_temperatures was not given and the default range is used
    use_temperatures_default: bool = False
    soil_factor_of_safety: float = 2.5     # on a footing's ultimate lateral load (see defaults)
    uplift_factor_of_safety: float = 2.0   # on a footing's uplift resistance
    sliding_factor_of_safety: float = 1.5  # on a block's sliding resistance
    tree_factor_of_safety: float = 3.0     # on a tree stem's green strength
    concrete_load_factor: float = 1.6      # on a pier's actions for ACI strength design


@dataclass(frozen=True)
class ProjectSpec:
    """Who and what the scenario is for."""

    name: str
    notes: str


@dataclass(frozen=True)
class Scenario:
    """A whole scenario file, read and checked."""

    project: ProjectSpec
    settings: Settings
    lines: tuple[LineSpec, ...]
    rider: RiderSpec | None
    ground: GroundSpec
    anchors: tuple[AnchorSpec, ...]
    #: values written as { placeholder = "...", accepted = true|false }: (key path, accepted)
    placeholders: tuple[tuple[str, bool], ...] = ()
    #: the ride's limits and brake ([ride]); defaults when the table is absent
    ride: RideLimits = field(default_factory=RideLimits)

    def anchor(self, name: str) -> AnchorSpec:
        """The anchor with this name (KeyError if none)."""
        for anchor in self.anchors:
            if anchor.name == name:
                return anchor
        raise KeyError(name)

    def line(self, name: str) -> LineSpec:
        """The line with this name (KeyError if none)."""
        for line in self.lines:
            if line.name == name:
                return line
        raise KeyError(name)


# ---------------------------------------------------------------- defaults
# Used by the reader where the scenario leaves a value out; each says where it
# comes from.

#: On rope breaking strength: common practice for life-safety rope.
DEFAULT_FACTOR_OF_SAFETY = 5.0
#: Multiplies the rider's weight: a judgement of ours, not from a standard
#: (bouncing, a rider dropping onto the line from a low platform). A design input.
DEFAULT_DYNAMIC_FACTOR = 1.5
#: Strength of an end termination as a fraction of the rope's: from memory,
#: common practice for clipped terminations (swaged sleeves rate higher).
DEFAULT_TERMINATION_EFFICIENCY = 0.8
#: Installation temperature, 15 degC: a judgement (typical mild day).
DEFAULT_INSTALL_TEMPERATURE = 288.15
#: Rider stations along the line.
DEFAULT_STATIONS = 100
#: Cable elements per span.
DEFAULT_SEGMENTS = 40
#: Air density, kg/m^3: ISO 2533 standard atmosphere at sea level.
DEFAULT_AIR_DENSITY = 1.225
#: Rider drag area Cd*A, m^2: from memory, an adult seated in a harness.
DEFAULT_DRAG_AREA = 0.5
#: Trolley rolling-resistance coefficient on wire rope: from memory.
DEFAULT_ROLLING_RESISTANCE = 0.02
#: Ride starts/stops this far from the terminations, m: a judgement (the
#: trolley cannot reach the termination hardware).
DEFAULT_END_OFFSET = 1.0
#: Temperature range of use when none is given: installation +/- 25 K (our
#: judgement: a season's swing about a mild installation day).
DEFAULT_TEMPERATURE_SWING = 25.0
#: p-y curves of every soil layer unless the layer says ``loading = "static"``: cyclic
#: (API RP 2A / 2GEO sand A = 0.9; Matlock 1970 cyclic clay). A rider's pull is applied
#: and released thousands of times over a line's life, which is the repeated loading the
#: cyclic curves were fitted to; the static curves would overstate the soil's limit
#: (by 1.5 to 3 times near grade in sand). Our judgement, on the safe side.
DEFAULT_SOIL_LOADING = "cyclic"
#: On a footing's ultimate lateral load (pushover): our judgement, in the 2 to 3 range
#: usual for the geotechnical capacity of laterally loaded piles and poles.
DEFAULT_SOIL_FACTOR_OF_SAFETY = 2.5
#: On a footing's uplift resistance (own weight plus side friction): our judgement
#: (2 is usual for pile uplift with side friction from soil parameters, common practice).
DEFAULT_UPLIFT_FACTOR_OF_SAFETY = 2.0
#: On a block's sliding resistance (friction plus passive pressure): common practice for
#: sliding of foundations and retaining walls (IBC 2021 §1807.2.3 asks 1.5 for walls).
DEFAULT_SLIDING_FACTOR_OF_SAFETY = 1.5
#: On a tree stem's green compression strength parallel to grain (a mean clear-wood
#: value): our judgement, for the unknown decay and defects of a living stem.
DEFAULT_TREE_FACTOR_OF_SAFETY = 3.0
#: On a concrete pier's moment and shear for ACI 318 strength design: the live-load
#: factor of the ASCE 7 strength combinations (1.2 D + 1.6 L), the line's pull taken as
#: live load.
DEFAULT_CONCRETE_LOAD_FACTOR = 1.6
