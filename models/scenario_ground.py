"""Reading ``[ground]``: the ground profile under the line and the soil layers."""
from __future__ import annotations

import math
from typing import Any

from models.errors import InputError
from models.scenario_reader import Table
from models.spec import GroundSpec, SoilLayerSpec
from models.units import parse_quantity

SOIL_KINDS = ("sand", "clay", "modulus")
#: Soil classes of IBC 2021 Table 1806.2 (our short names for its rows).
IBC_CLASSES = ("crystalline-bedrock", "sedimentary-rock", "sandy-gravel", "sand", "clay")
LAYER_KEYS = ("top", "bottom", "kind", "unit_weight", "friction_angle", "k_initial",
              "undrained_shear_strength", "eps50", "modulus_constant", "modulus_gradient",
              "ibc_class")
GROUND_KEYS = ("profile", "soil", "preset", "water_table")
_KIND_KEYS = {
    "sand": ("unit_weight", "friction_angle", "k_initial"),
    "clay": ("unit_weight", "undrained_shear_strength", "eps50"),
    "modulus": ("unit_weight", "modulus_constant", "modulus_gradient"),
}
_TOUCH = 1e-6  # m: layer faces closer than this are taken as touching


def read_layer(table: Table) -> SoilLayerSpec:
    """One ``[[...soil]]`` layer table."""
    kind = table.text("kind", choices=SOIL_KINDS)
    others = set(LAYER_KEYS[3:-1]) - set(_KIND_KEYS[kind])
    table.forbid(sorted(others), f"to a {kind} layer")
    top = table.quantity("top", "length", minimum=0.0)
    bottom = table.quantity("bottom", "length", math.inf)
    if bottom <= top:
        raise InputError(f"must be deeper than the layer top ({table.raw('top')!r}), got "
                         f"{table.raw('bottom')!r}", table.where("bottom"))
    values: dict[str, Any] = {}
    if kind == "sand":
        values["unit_weight"] = table.quantity("unit_weight", "unit weight", positive=True)
        values["friction_angle_deg"] = math.degrees(table.quantity(
            "friction_angle", "angle", minimum=math.radians(20), maximum=math.radians(45)))
        values["k_initial"] = table.quantity("k_initial", "force per volume", None,
                                             positive=True)
    elif kind == "clay":
        values["unit_weight"] = table.quantity("unit_weight", "unit weight", positive=True)
        values["undrained_shear_strength"] = table.quantity(
            "undrained_shear_strength", "pressure", positive=True)
        values["eps50"] = table.number("eps50", None, positive=True, maximum=0.1)
    else:
        values["unit_weight"] = table.quantity("unit_weight", "unit weight", None,
                                               positive=True)
        if not (table.has("modulus_constant") or table.has("modulus_gradient")):
            raise InputError('give "modulus_constant", "modulus_gradient" or both',
                             table.path)
        values["modulus_constant"] = table.quantity("modulus_constant", "pressure", None,
                                                    minimum=0.0)
        values["modulus_gradient"] = table.quantity("modulus_gradient", "force per volume",
                                                    None, minimum=0.0)
        if not (values["modulus_constant"] or values["modulus_gradient"]):
            raise InputError("the layer has no stiffness: modulus_constant and "
                             "modulus_gradient are both zero", table.path)
    ibc = table.text("ibc_class", None, IBC_CLASSES)
    return SoilLayerSpec(top=top, bottom=bottom, kind=kind, ibc_class=ibc, **values)


def read_layers(parent: Table, key: str) -> tuple[SoilLayerSpec, ...]:
    """The layer array ``key`` of ``parent``, checked to run from grade down without
    gaps or overlaps."""
    layers = []
    items = parent.array(key)
    for i, data in enumerate(items):
        table = Table(data, f"{parent.where(key)}[{i + 1}]", LAYER_KEYS)
        if i < len(items) - 1 and not table.has("bottom"):
            raise InputError('missing required key "bottom" (only the last layer may '
                             "leave it out)", table.where("bottom"))
        layer = read_layer(table)
        if i == 0 and layer.top > _TOUCH:
            raise InputError(f"the first layer must start at grade (top = \"0 ft\"), got "
                             f"{table.raw('top')!r}", table.where("top"))
        if i > 0:
            above = layers[-1]
            if layer.top < above.bottom - _TOUCH:
                raise InputError(f"top {table.raw('top')!r} overlaps the layer above, "
                                 f"which ends at {above.bottom:g} m; list layers from "
                                 "grade down, each starting where the last ends",
                                 table.where("top"))
            if layer.top > above.bottom + _TOUCH:
                raise InputError(f"top {table.raw('top')!r} leaves a gap below the layer "
                                 f"above, which ends at {above.bottom:g} m",
                                 table.where("top"))
        layers.append(layer)
    return tuple(layers)


def read_ground(data: Any) -> tuple[GroundSpec, bool]:
    """Read ``[ground]``.

    Returns
    -------
    (GroundSpec, profile_given)
        When no profile is given the profile is empty here; the scenario reader
        fills in a straight line between the ridden line's anchors.
    """
    table = Table(data if data is not None else {}, "ground", GROUND_KEYS)
    table.one_of(("preset", "soil"), required=False)
    profile = []
    points = table.array("profile")
    for i, point in enumerate(points):
        where = f"{table.where('profile')}[{i + 1}]"
        if not isinstance(point, list) or len(point) != 2:
            raise InputError(f'expected a [distance, elevation] pair like ["0 ft", '
                             f'"100 ft"], got {point!r}', where)
        distance = parse_quantity(point[0], "length", where)
        elevation = parse_quantity(point[1], "length", where)
        if profile and distance <= profile[-1][0]:
            raise InputError("profile distances must increase from one point to the next",
                             where)
        profile.append((distance, elevation))
    if len(profile) == 1:
        raise InputError("a profile needs at least two points", table.where("profile"))
    soil = read_layers(table, "soil")
    preset = table.text("preset", None)
    water = table.quantity("water_table", "length", None, minimum=0.0)
    return GroundSpec(profile=tuple(profile), soil=soil, preset=preset,
                      water_table=water), bool(profile)
