"""Read a scenario file (TOML) into a checked :class:`models.scenario.spec.Scenario`, SI inside.

Top-level tables: ``[project]``, ``[settings]``, ``[[line]]``, ``[rider]``,
``[ground]``, ``[[anchor]]`` (with ``post``, ``footing``, ``guy``, ``brace`` or
``tree``). Quantities are strings with units. The first problem found raises
:class:`models.common.errors.InputError` with the key path, e.g.
``anchor[2] "upper".post.height`` (arrays counted from 1).
"""
from __future__ import annotations

import dataclasses

import tomllib
from pathlib import Path
from typing import Any

from spanstay.models.common.errors import InputError
from spanstay.models.scenario.rope_entry import read_rope
from spanstay.models.scenario.anchor import read_anchor
from spanstay.models.scenario.geometry import check_anchor_names, check_scenario, plan_span
from spanstay.models.scenario.ground import read_ground
from spanstay.models.common.errors import did_you_mean
from spanstay.models.scenario.reader import PLACEHOLDERS, Table
from spanstay.models.scenario.ride_table import RIDE_KEYS, read_ride
from spanstay.models.scenario.spec import (DEFAULT_AIR_DENSITY, DEFAULT_DRAG_AREA, DEFAULT_DYNAMIC_FACTOR,
                         DEFAULT_END_OFFSET, DEFAULT_FACTOR_OF_SAFETY,
                         DEFAULT_INSTALL_TEMPERATURE, DEFAULT_ROLLING_RESISTANCE,
                         DEFAULT_SEGMENTS, DEFAULT_STATIONS, DEFAULT_TEMPERATURE_SWING,
                         DEFAULT_TERMINATION_EFFICIENCY,
                         AnchorSpec, GroundSpec, LineSpec, ProjectSpec, RiderSpec, Scenario,
                         Settings)
from spanstay.models.common.units import parse_quantity
from spanstay.models.scenario.safety_settings import GROUND_SAFETY_KEYS, ground_safety
from spanstay.models.scenario import limits

TOP_KEYS = ("project", "settings", "line", "rider", "ground", "anchor", "ride")
PROJECT_KEYS = ("name", "notes")
SETTINGS_KEYS = ("factor_of_safety", "dynamic_factor", "install_temperature",
                 "use_temperatures", "stations", "units", *GROUND_SAFETY_KEYS)
LINE_KEYS = ("name", "from", "to", "from_height", "to_height", "rope", "sag", "tension",
             "unstressed_length", "termination_efficiency", "segments")
RIDER_KEYS = ("line", "lightest", "heaviest", "hang_distance", "dynamic_factor",
              "rolling_resistance", "drag_area", "air_density", "start_speed", "stations",
              "start_offset", "stop_offset")
_COLDEST, _HOTTEST = 200.0, 340.0  # K: about -100 degF and 150 degF


def load_scenario(path: str | Path) -> Scenario:
    """Read and check a scenario file.

    Parameters
    ----------
    path
        A TOML scenario file.

    Returns
    -------
    Scenario
        Every value SI, every rope resolved, every cross-check passed.

    Raises
    ------
    InputError
        The first problem found, with its key path.
    """
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8-sig")  # a byte-order mark is fine
    except FileNotFoundError:
        raise InputError(f"no such scenario file: {path}") from None
    except (OSError, UnicodeDecodeError) as exc:
        raise InputError(f"cannot read scenario file {path}: {exc}") from None
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError(f"{path.name} is not valid TOML: {exc}") from None
    return read_scenario(data, default_name=path.stem)


def read_scenario(data: dict[str, Any], default_name: str = "scenario") -> Scenario:
    """Check an already parsed scenario (a dict as from :func:`tomllib.loads`)."""
    seen: list[tuple[str, bool]] = []
    token = PLACEHOLDERS.set(seen)
    try:
        scenario = _read(data, default_name)
    finally:
        PLACEHOLDERS.reset(token)
    return dataclasses.replace(scenario, placeholders=tuple(seen))


def _read(data: dict[str, Any], default_name: str) -> Scenario:
    top = Table(data, "", TOP_KEYS)
    project = _read_project(top.table("project", PROJECT_KEYS), default_name)
    settings = _read_settings(top.table("settings", SETTINGS_KEYS))
    anchor_items = top.array("anchor", required=True)
    if len(anchor_items) < 2:
        raise InputError("a scenario needs at least two [[anchor]] tables", "anchor")
    anchors = tuple(read_anchor(i, a) for i, a in enumerate(anchor_items))
    check_anchor_names(anchors)
    by_name = {a.name: a for a in anchors}
    line_items = top.array("line", required=True)
    if not line_items:
        raise InputError("a scenario needs at least one [[line]] table", "line")
    lines = tuple(_read_line(i, item, by_name) for i, item in enumerate(line_items))
    rider_table = top.table("rider", RIDER_KEYS)
    rider = _read_rider(rider_table, settings, lines) if rider_table else None
    ground, profile_given = read_ground(top.raw("ground", None))
    if not profile_given:
        ground = _straight_profile(ground, rider.line if rider else lines[0].name,
                                   lines, by_name)
    ride = read_ride(top.table("ride", RIDE_KEYS))
    scenario = Scenario(project=project, settings=settings, lines=lines, rider=rider,
                        ground=ground, anchors=anchors, ride=ride)
    check_scenario(scenario)
    return scenario


def line_path(index: int, data: Any) -> str:
    """``line[1] "main"`` (arrays counted from 1)."""
    name = data.get("name") if isinstance(data, dict) else None
    return f'line[{index + 1}] "{name}"' if isinstance(name, str) else f"line[{index + 1}]"


def _read_project(table: Table | None, default_name: str) -> ProjectSpec:
    if table is None:
        return ProjectSpec(name=default_name, notes="")
    return ProjectSpec(name=table.text("name", default_name), notes=table.text("notes", ""))


def _read_settings(table: Table | None) -> Settings:
    table = table or Table({}, "settings", SETTINGS_KEYS)
    install = table.quantity("install_temperature", "temperature",
                             DEFAULT_INSTALL_TEMPERATURE)
    if not _COLDEST <= install <= _HOTTEST:
        raise InputError(f"{table.raw('install_temperature')!r} is outside the range "
                         "spanstay accepts (-100 degF to 150 degF)",
                         table.where("install_temperature"))
    use = []
    for i, value in enumerate(table.array("use_temperatures")):
        where = f"settings.use_temperatures[{i + 1}]"
        kelvin = parse_quantity(value, "temperature", where)
        if not _COLDEST <= kelvin <= _HOTTEST:
            raise InputError(f"{value!r} is outside the range spanstay accepts "
                             "(-100 degF to 150 degF)", where)
        use.append(kelvin)
    return Settings(
        factor_of_safety=table.number("factor_of_safety", DEFAULT_FACTOR_OF_SAFETY,
                                      minimum=1.0),
        dynamic_factor=table.number("dynamic_factor", DEFAULT_DYNAMIC_FACTOR, minimum=1.0,
                                    maximum=5.0),
        install_temperature=install,
        use_temperatures=tuple(use) or (install - DEFAULT_TEMPERATURE_SWING,
                                         install + DEFAULT_TEMPERATURE_SWING),
        use_temperatures_default=not use,
        stations=table.integer("stations", DEFAULT_STATIONS, minimum=2,
                               maximum=limits.STATIONS_MAX),
        units=table.text("units", "us", ("us", "si")),
        **ground_safety(table))


def _read_line(index: int, data: Any, anchors: dict[str, AnchorSpec]) -> LineSpec:
    table = Table(data, line_path(index, data), LINE_KEYS)
    name = table.text("name", f"line-{index + 1}")
    ends = []
    for key in ("from", "to"):
        anchor = table.text(key)
        if anchor not in anchors:
            raise InputError(f'no anchor named "{anchor}"{did_you_mean(anchor, anchors)}',
                             table.where(key))
        ends.append(anchor)
    if ends[0] == ends[1]:
        raise InputError(f'the line starts and ends on the same anchor "{ends[0]}"',
                         table.where("to"))
    table.one_of(("sag", "tension", "unstressed_length"))
    return LineSpec(
        name=name, start=ends[0], end=ends[1],
        start_height=table.quantity("from_height", "length", positive=True,
                                    maximum=limits.ATTACH_HEIGHT_MAX),
        end_height=table.quantity("to_height", "length", positive=True,
                                  maximum=limits.ATTACH_HEIGHT_MAX),
        rope=read_rope(table.raw("rope", expected='a rope name, e.g. "7x19-galv-1/4"'),
                       table.where("rope")),
        sag=table.quantity("sag", "length", None, positive=True),
        tension=table.quantity("tension", "force", None, positive=True),
        unstressed_length=table.quantity("unstressed_length", "length", None, positive=True),
        termination_efficiency=table.number("termination_efficiency",
                                            DEFAULT_TERMINATION_EFFICIENCY, positive=True,
                                            maximum=1.0),
        segments=table.integer("segments", DEFAULT_SEGMENTS, minimum=2, maximum=2000))


def _read_rider(table: Table, settings: Settings, lines: tuple[LineSpec, ...]) -> RiderSpec:
    names = [line.name for line in lines]
    line = table.text("line", names[0], names)
    lightest = table.quantity("lightest", "weight", positive=True,
                              maximum=limits.RIDER_WEIGHT_MAX)
    heaviest = table.quantity("heaviest", "weight", positive=True,
                              maximum=limits.RIDER_WEIGHT_MAX)
    if heaviest < lightest:
        raise InputError(f"the heaviest rider ({table.raw('heaviest')!r}) is lighter than "
                         f"the lightest ({table.raw('lightest')!r})", table.where("heaviest"))
    return RiderSpec(
        line=line, lightest=lightest, heaviest=heaviest,
        hang_distance=table.quantity("hang_distance", "length", minimum=0.0,
                                     maximum=limits.HANG_DISTANCE_MAX),
        dynamic_factor=table.number("dynamic_factor", settings.dynamic_factor, minimum=1.0,
                                    maximum=5.0),
        rolling_resistance=table.number("rolling_resistance", DEFAULT_ROLLING_RESISTANCE,
                                        minimum=0.0, maximum=0.5),
        drag_area=table.quantity("drag_area", "area", DEFAULT_DRAG_AREA, minimum=0.0,
                                 maximum=limits.DRAG_AREA_MAX),
        air_density=table.quantity("air_density", "density", DEFAULT_AIR_DENSITY,
                                   positive=True, maximum=2.0),
        start_speed=table.quantity("start_speed", "speed", 0.0, minimum=0.0,
                                   maximum=limits.START_SPEED_MAX),
        stations=table.integer("stations", settings.stations, minimum=2,
                               maximum=limits.STATIONS_MAX),
        start_offset=table.quantity("start_offset", "length", DEFAULT_END_OFFSET,
                                    minimum=0.0),
        stop_offset=table.quantity("stop_offset", "length", DEFAULT_END_OFFSET, minimum=0.0))


def _straight_profile(ground: GroundSpec, line_name: str, lines: tuple[LineSpec, ...],
                      anchors: dict[str, AnchorSpec]) -> GroundSpec:
    """Ground straight between the grades of the ridden line's anchors."""
    line = next(item for item in lines if item.name == line_name)
    start, end = anchors[line.start], anchors[line.end]
    span = plan_span(start, end)
    return GroundSpec(profile=((0.0, start.grade), (span, end.grade)), soil=ground.soil,
                      water_table=ground.water_table)
