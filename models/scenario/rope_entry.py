"""A scenario's rope entry (catalog name, overridden entry, or inline table) in SI."""
from __future__ import annotations

import dataclasses
from typing import Any

from spanstay.models.catalogs.rope import (QUANTITY_FIELDS, RopeSpec, default_alpha, find_rope,
                                           rope_names)
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.reader import Table

_REQUIRED_INLINE = ("diameter", "breaking_strength", "weight_per_length", "EA")


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
