"""Reading ``[ground]``: the ground profile under the line and the soil layers."""
from __future__ import annotations

import math
from typing import Any

from spanstay.models.catalogs import soil
from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.ibc_embedment import ibc_class_key
from spanstay.models.scenario.limits import SOIL_DEPTH_MAX
from spanstay.models.scenario.reader import REQUIRED, Table, read_quantity
from spanstay.models.scenario.spec import DEFAULT_SOIL_LOADING, GroundSpec, SoilLayerSpec

SOIL_KINDS = soil.KINDS
LAYER_KEYS = ("top", "bottom", "preset", "kind", "unit_weight", "friction_angle",
              "k_initial", "undrained_shear_strength", "eps50", "modulus_constant",
              "modulus_gradient", "ibc_class", "loading", "matlock_J")
GROUND_KEYS = ("profile", "soil", "water_table")
#: Keys each kind of layer may hold (a modulus layer may be capped by a
#: friction angle or an undrained strength).
_KIND_KEYS = {
    "sand": ("unit_weight", "friction_angle", "k_initial"),
    "clay": ("unit_weight", "undrained_shear_strength", "eps50"),
    "modulus": ("unit_weight", "modulus_constant", "modulus_gradient", "friction_angle",
                "undrained_shear_strength"),
}
_MATERIAL_KEYS = ("unit_weight", "friction_angle", "k_initial", "undrained_shear_strength",
                  "eps50", "modulus_constant", "modulus_gradient")
_TOUCH = 1e-6  # m: layer faces closer than this are taken as touching


def read_layer(table: Table) -> SoilLayerSpec:
    """One ``[[...soil]]`` layer table; a ``preset`` fills values not given."""
    preset = table.text("preset", None, (*soil.PRESETS, *soil.PRESET_ALIASES))
    preset = soil.PRESET_ALIASES.get(preset, preset)
    base = {k: v for k, v in soil.PRESETS[preset].items()} if preset else {}
    kind = table.text("kind", base.get("kind", REQUIRED), SOIL_KINDS)
    if preset and kind != base["kind"]:
        raise InputError(f'the preset "{preset}" is a {base["kind"]} layer; leave "kind" '
                         "out or pick another preset", table.where("kind"))
    table.forbid([k for k in _MATERIAL_KEYS if k not in _KIND_KEYS[kind]],
                 f"to a {kind} layer")
    top = table.quantity("top", "length", minimum=0.0)
    bottom = table.quantity("bottom", "length", maximum=SOIL_DEPTH_MAX)
    if bottom <= top:
        raise InputError(f"must be deeper than the layer top ({table.raw('top')!r}), got "
                         f"{table.raw('bottom')!r}", table.where("bottom"))

    def need(field: str) -> Any:
        return base.get(field, REQUIRED)

    values: dict[str, Any] = {
        "unit_weight": table.quantity("unit_weight", "unit weight", need("unit_weight"),
                                      positive=True)}
    if table.has("friction_angle"):
        values["friction_angle_deg"] = math.degrees(table.quantity(
            "friction_angle", "angle", minimum=math.radians(soil.FRICTION_ANGLE_RANGE_DEG[0]),
            maximum=math.radians(soil.FRICTION_ANGLE_RANGE_DEG[1])))
    elif kind == "sand":
        if need("friction_angle_deg") is REQUIRED:
            table.quantity("friction_angle", "angle")  # raises the missing-key error
        values["friction_angle_deg"] = base["friction_angle_deg"]
    if kind == "sand":
        values["k_initial"] = table.quantity("k_initial", "force per volume",
                                             need("k_initial"), positive=True)
    strength_default = need("undrained_shear_strength") if kind == "clay" else None
    values["undrained_shear_strength"] = table.quantity(
        "undrained_shear_strength", "pressure", strength_default, positive=True)
    if kind == "clay":
        values["eps50"] = table.number("eps50", need("eps50"), positive=True, maximum=0.2)
    if kind == "modulus":
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
    values["loading"] = table.text("loading", DEFAULT_SOIL_LOADING, soil.LOADINGS)
    if kind == "clay":
        values["matlock_J"] = table.number("matlock_J", base.get("matlock_J", 0.5),
                                           positive=True, maximum=1.0)
    else:
        table.forbid(["matlock_J"], f"to a {kind} layer (it is Matlock's clay factor)")
    ibc = table.text("ibc_class", base.get("ibc_class"))
    if ibc is not None:
        ibc = _ibc_key(ibc, table.where("ibc_class"))
    return SoilLayerSpec(top=top, bottom=bottom, kind=kind, ibc_class=ibc, preset=preset,
                         **values)


def _ibc_key(name: str, where: str) -> str:
    try:
        return ibc_class_key(name)
    except InputError as exc:
        raise InputError(str(exc), where) from None


def read_layers(parent: Table, key: str,
                water_table: float | None = None) -> tuple[SoilLayerSpec, ...]:
    """The layer array ``key`` of ``parent``, checked to run from grade down without
    gaps or overlaps (and accepted by :class:`models.catalogs.soil.SoilProfile`)."""
    layers = []
    items = parent.array(key)
    for i, data in enumerate(items):
        table = Table(data, f"{parent.where(key)}[{i + 1}]", LAYER_KEYS)
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
    if layers:  # the soil module's own checks, so a valid file also builds there
        soil.profile_from_specs(layers, water_table, where=parent.where(key))
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
    profile = []
    points = table.array("profile")
    for i, point in enumerate(points):
        where = f"{table.where('profile')}[{i + 1}]"
        if not isinstance(point, list) or len(point) != 2:
            raise InputError(f'expected a [distance, elevation] pair like ["0 ft", '
                             f'"100 ft"], got {point!r}', where)
        distance = read_quantity(point[0], "length", f"{where}[1]")
        elevation = read_quantity(point[1], "length", f"{where}[2]")
        if profile and distance <= profile[-1][0]:
            raise InputError("profile distances must increase from one point to the next",
                             where)
        profile.append((distance, elevation))
    if len(profile) == 1:
        raise InputError("a profile needs at least two points", table.where("profile"))
    water = table.quantity("water_table", "length", None, minimum=0.0, maximum=SOIL_DEPTH_MAX)
    layers = read_layers(table, "soil", water)
    return GroundSpec(profile=tuple(profile), soil=layers, water_table=water), bool(profile)
