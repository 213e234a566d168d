"""Wire-rope catalog (models/data/rope.toml) and rope entries in a scenario.

A scenario names a rope three ways::

    rope = "7x19-galv-1/4"                                   # catalog entry
    rope = { catalog = "7x19-galv-1/4", EA = "300000 lbf" }  # entry, overridden
    rope = { diameter = "1/4 in", breaking_strength = "7000 lbf",
             weight_per_length = "0.11 lbf/ft", EA = "356000 lbf" }  # all inline
"""
from __future__ import annotations

import dataclasses
import tomllib
from functools import lru_cache
from importlib import resources
from typing import Any

from models.errors import InputError
from models.scenario_reader import Table, did_you_mean
from models.spec import RopeSpec
from models.units import parse_quantity

#: Rope fields that carry units, with their dimension.
QUANTITY_FIELDS = {
    "diameter": "length",
    "breaking_strength": "force",
    "weight_per_length": "weight per length",
    "EA": "force",
    "alpha": "per temperature",
}
_REQUIRED_INLINE = ("diameter", "breaking_strength", "weight_per_length", "EA")


@lru_cache(maxsize=1)
def catalog() -> dict[str, RopeSpec]:
    """All catalog ropes by name, SI."""
    text = resources.files("models").joinpath("data/rope.toml").read_text("utf-8")
    data = tomllib.loads(text)
    defaults = data["defaults"]
    alpha = parse_quantity(defaults["alpha"], "per temperature", "rope.toml defaults")
    ropes: dict[str, RopeSpec] = {}
    for entry in data["rope"]:
        where = f'rope.toml "{entry["name"]}"'
        values = {key: parse_quantity(entry[key], dim, f"{where}.{key}")
                  for key, dim in QUANTITY_FIELDS.items() if key in entry}
        ropes[entry["name"]] = RopeSpec(
            name=entry["name"], construction=entry["construction"],
            alpha=values.pop("alpha", alpha),
            source=f'{entry["source"]}; {defaults["alpha_source"]}', **values)
    return ropes


def default_alpha() -> float:
    """Thermal expansion coefficient of steel rope, 1/K, when none is given."""
    text = resources.files("models").joinpath("data/rope.toml").read_text("utf-8")
    return parse_quantity(tomllib.loads(text)["defaults"]["alpha"], "per temperature")


def rope_names() -> list[str]:
    """Catalog rope names, in catalog order."""
    return list(catalog())


def find_rope(name: str, where: str | None = None) -> RopeSpec:
    """The catalog rope called ``name``; InputError with a suggestion if unknown."""
    ropes = catalog()
    if name not in ropes:
        raise InputError(f'no rope "{name}" in the catalog{did_you_mean(name, ropes)}',
                         where)
    return ropes[name]


def read_rope(value: Any, where: str) -> RopeSpec:
    """Read a scenario rope entry (a catalog name or an inline table) into SI.

    Parameters
    ----------
    value
        The value of a ``rope`` key as parsed from TOML.
    where
        Key path of that key.
    """
    if isinstance(value, str):
        return find_rope(value, where)
    if not isinstance(value, dict):
        raise InputError(f'expected a catalog rope name (e.g. "{rope_names()[0]}") or an '
                         f"inline table, got {value!r}", where)
    table = Table(value, where, ("catalog", "construction", *QUANTITY_FIELDS))
    overrides: dict[str, Any] = {key: table.quantity(key, dim, positive=key != "alpha")
                                 for key, dim in QUANTITY_FIELDS.items() if table.has(key)}
    if table.has("construction"):
        overrides["construction"] = table.text("construction")
    if table.has("catalog"):
        base = find_rope(table.text("catalog"), table.where("catalog"))
        if not overrides:
            return base
        changed = ", ".join(sorted(overrides))
        return dataclasses.replace(base, **overrides,
                                   source=f"{base.source}; overridden in scenario: {changed}")
    for key in _REQUIRED_INLINE:
        table.quantity(key, QUANTITY_FIELDS[key])  # raises the missing-key error
    alpha = overrides.pop("alpha", default_alpha())
    return RopeSpec(name="inline", construction=overrides.pop("construction", "wire rope"),
                    alpha=alpha, source="given in scenario", **overrides)
