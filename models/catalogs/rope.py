"""Wire-rope catalog (catalogs/data/rope.toml); scenario rope entries are read by
:mod:`spanstay.models.scenario.rope_entry`.

A scenario names a rope three ways::

    rope = "7x19-galv-1/4"                                   # catalog entry
    rope = { catalog = "7x19-galv-1/4", EA = "300000 lbf" }  # entry, overridden
    rope = { diameter = "1/4 in", breaking_strength = "7000 lbf",
             weight_per_length = "0.11 lbf/ft", EA = "356000 lbf" }  # all inline
"""
from __future__ import annotations

import tomllib
from dataclasses import dataclass
from functools import lru_cache
from importlib import resources
from spanstay.models.common.errors import InputError, did_you_mean
from spanstay.models.common.units import parse_quantity

#: Rope fields that carry units, with their dimension.
QUANTITY_FIELDS = {
    "diameter": "length",
    "breaking_strength": "force",
    "weight_per_length": "weight per length",
    "EA": "force",
    "alpha": "per temperature",
}


@dataclass(frozen=True)
class RopeSpec:
    """A wire rope, from the catalog with any field overridden in the scenario."""

    name: str                  # catalog name, or "inline"
    diameter: float            # m, nominal
    construction: str          # e.g. "7x19 galvanized aircraft cable"
    breaking_strength: float   # N, minimum breaking strength
    weight_per_length: float   # N/m
    EA: float                  # N, effective axial stiffness of the rope
    alpha: float               # 1/K, coefficient of thermal expansion
    source: str                # where each value comes from ("from memory" if so)


@lru_cache(maxsize=1)
def catalog() -> dict[str, RopeSpec]:
    """All catalog ropes by name, SI."""
    text = resources.files("spanstay.models.catalogs").joinpath("data/rope.toml").read_text("utf-8")
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
    text = resources.files("spanstay.models.catalogs").joinpath("data/rope.toml").read_text("utf-8")
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
