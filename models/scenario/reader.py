"""Reading one TOML table with key paths, unit parsing, ranges and "did you mean".

Every error is an :class:`models.common.errors.InputError` whose ``where`` is the key
path in the file, e.g. ``anchor[2] "upper".post.height`` (arrays counted from 1).
"""
from __future__ import annotations

import math
from collections.abc import Iterable
from contextvars import ContextVar
from typing import Any

from spanstay.models.common.errors import InputError, did_you_mean
from spanstay.models.common.units import DIMENSIONS, parse_quantity, parse_ratio
from spanstay.models.scenario.limits import MAGNITUDE

REQUIRED: Any = object()  # marker: the key must be present

#: the placeholders met while reading one scenario: (key path, accepted)
PLACEHOLDERS: ContextVar[list[tuple[str, bool]] | None] = ContextVar("placeholders", default=None)


def _kind_of(value: Any) -> str:
    return {dict: "a table", list: "an array", str: "a string", bool: "true/false",
            int: "a number", float: "a number"}.get(type(value), type(value).__name__)


class Table:
    """A TOML table being read, with its key path and the keys it may hold.

    Parameters
    ----------
    data
        The parsed table.
    path
        Key path of the table ("" for the top level).
    allowed
        Keys this table may contain; any other key is an error with a
        "did you mean" suggestion.
    """

    def __init__(self, data: Any, path: str, allowed: Iterable[str]) -> None:
        if not isinstance(data, dict):
            raise InputError(f"expected a table, got {_kind_of(data)}", path or None)
        self.data = data
        self.path = path
        self.allowed = tuple(allowed)
        for key in data:
            if key not in self.allowed:
                raise InputError(f'unknown key "{key}"{did_you_mean(key, self.allowed)}',
                                 self.where(key))

    def where(self, key: str) -> str:
        """Key path of ``key`` in this table."""
        return f"{self.path}.{key}" if self.path else key

    def has(self, key: str) -> bool:
        return key in self.data

    def raw(self, key: str, default: Any = REQUIRED, expected: str = "a value") -> Any:
        """The value as written, or ``default``; a missing required key is an error."""
        if key in self.data:
            return self.data[key]
        if default is REQUIRED:
            raise InputError(f'missing required key "{key}" ({expected})',
                             self.where(key))
        return default

    def forbid(self, keys: Iterable[str], reason: str) -> None:
        """Reject keys that do not apply here (e.g. ``diameter`` on a sawn post)."""
        for key in keys:
            if key in self.data:
                raise InputError(f'"{key}" does not apply {reason}', self.where(key))

    def one_of(self, keys: Iterable[str], required: bool = True) -> str | None:
        """The single key of ``keys`` present; an error if several (or none, if required)."""
        keys = tuple(keys)
        present = [k for k in keys if k in self.data]
        names = ", ".join(f'"{k}"' for k in keys)
        if len(present) > 1:
            raise InputError(f"give only one of {names}; found "
                             + " and ".join(f'"{k}"' for k in present), self.where(present[1]))
        if not present:
            if required:
                raise InputError(f"give one of {names}", self.path or None)
            return None
        return present[0]

    def quantity(self, key: str, dimension: str, default: Any = REQUIRED, *,
                 positive: bool = False, minimum: float | None = None,
                 maximum: float | None = None) -> Any:
        """A quantity with units, in SI. Range limits are SI values."""
        dim = DIMENSIONS[dimension]
        value = self.raw(key, default, f'{dim.words}, e.g. "{dim.example}"')
        if key not in self.data:
            return value
        value = self._placeholder(key, value)
        si = parse_quantity(value, dimension, self.where(key))
        self._check_range(key, si, value, positive, minimum, maximum, dimension)
        check_magnitude(si, value, dimension, self.where(key), positive)
        return si

    def _placeholder(self, key: str, value: Any) -> Any:
        """The value inside ``{ placeholder = "...", accepted = true }`` (starters write
        values the user must replace so); recorded for the run to refuse or list."""
        if not isinstance(value, dict) or "placeholder" not in value:
            return value
        sub = Table(value, self.where(key), ("placeholder", "accepted"))
        accepted = sub.raw("accepted", False)
        if not isinstance(accepted, bool):
            raise InputError(f"expected true or false, got {accepted!r}", sub.where("accepted"))
        seen = PLACEHOLDERS.get()
        if seen is not None:
            seen.append((self.where(key), accepted))
        return sub.raw("placeholder")

    def number(self, key: str, default: Any = REQUIRED, *, positive: bool = False,
               minimum: float | None = None, maximum: float | None = None) -> Any:
        """A plain number (or a percentage string such as ``"80 %"``)."""
        value = self.raw(key, default, "a number")
        if key not in self.data:
            return value
        x = parse_ratio(value, self.where(key))
        self._check_range(key, x, value, positive, minimum, maximum, None)
        return x

    def integer(self, key: str, default: Any = REQUIRED, *, minimum: int = 1,
                maximum: int | None = None) -> Any:
        """A whole number within limits."""
        value = self.raw(key, default, "a whole number")
        if key not in self.data:
            return value
        if isinstance(value, bool) or not isinstance(value, int):
            raise InputError(f"expected a whole number, got {value!r}", self.where(key))
        if value < minimum or (maximum is not None and value > maximum):
            limit = f"at least {minimum}" + (f" and at most {maximum}" if maximum else "")
            raise InputError(f"must be {limit}, got {value}", self.where(key))
        return value

    def text(self, key: str, default: Any = REQUIRED,
             choices: Iterable[str] | None = None) -> Any:
        """A string, optionally one of ``choices``."""
        expected = "text" if choices is None else "one of " + ", ".join(
            f'"{c}"' for c in choices)
        value = self.raw(key, default, expected)
        if key not in self.data:
            return value
        if not isinstance(value, str):
            raise InputError(f"expected {expected}, got {_kind_of(value)} {value!r}",
                             self.where(key))
        if choices is not None and value not in choices:
            raise InputError(f'"{value}" is not known{did_you_mean(value, choices)}',
                             self.where(key))
        return value

    def flag(self, key: str, default: bool = False) -> bool:
        """A true/false value."""
        value = self.raw(key, default, "true or false")
        if not isinstance(value, bool):
            raise InputError(f"expected true or false, got {value!r}", self.where(key))
        return value

    def table(self, key: str, allowed: Iterable[str], required: bool = False) -> Table | None:
        """A sub-table, or None when absent and not required."""
        if key not in self.data:
            if required:
                raise InputError(f'missing required table "{key}"', self.where(key))
            return None
        return Table(self.data[key], self.where(key), allowed)

    def array(self, key: str, required: bool = False) -> list[Any]:
        """An array (a single table is taken as an array of one)."""
        if key not in self.data:
            if required:
                raise InputError(f'missing required key "{key}"', self.where(key))
            return []
        value = self.data[key]
        if isinstance(value, dict):
            return [value]
        if not isinstance(value, list):
            raise InputError(f"expected an array, got {_kind_of(value)}", self.where(key))
        return value

    def quantities(self, key: str, dimension: str, count: int,
                   default: Any = REQUIRED) -> Any:
        """A fixed-length array of quantities, e.g. a plan position ``["0 ft", "3 ft"]``."""
        value = self.raw(key, default, f"an array of {count} quantities")
        if key not in self.data:
            return value
        if not isinstance(value, list) or len(value) != count:
            dim = DIMENSIONS[dimension]
            sample = ", ".join([f'"{dim.example}"'] * count)
            raise InputError(f"expected an array of {count} values like [{sample}], "
                             f"got {value!r}", self.where(key))
        return tuple(read_quantity(v, dimension, f"{self.where(key)}[{i + 1}]")
                     for i, v in enumerate(value))

    def _check_range(self, key: str, si: float, written: Any, positive: bool,
                     minimum: float | None, maximum: float | None,
                     dimension: str | None) -> None:
        shown = f"{written!r}" if isinstance(written, str) else f"{written}"
        low = (f"at least {_limit(minimum, dimension)}" if minimum is not None
               else "greater than zero" if positive else None)
        high = f"at most {_limit(maximum, dimension)}" if maximum is not None else None
        expected = " and ".join(part for part in (low, high) if part)
        if positive and minimum is not None:
            expected = f"greater than zero ({expected})"
        too_low = (positive and not si > 0) or (minimum is not None and si < minimum)
        if too_low or (maximum is not None and si > maximum):
            raise InputError(f"must be {expected}, got {shown}", self.where(key))


def read_quantity(value: Any, dimension: str, where: str, positive: bool = False) -> float:
    """A quantity outside a table's keys (array items), SI, within :data:`MAGNITUDE`."""
    si = parse_quantity(value, dimension, where)
    check_magnitude(si, value, dimension, where, positive)
    return si


def check_magnitude(si: float, written: Any, dimension: str, where: str,
                    positive: bool = False) -> None:
    """Refuse a value outside the catch-all range of its dimension (:data:`MAGNITUDE`)."""
    smallest, largest = MAGNITUDE[dimension]
    if dimension == "temperature":
        low, high = smallest, largest
        bad = not low <= si <= high
    else:
        low, high = (smallest if positive else -largest), largest
        bad = abs(si) > largest or (positive and 0 < si < smallest)
    if bad:
        raise InputError(f"{written!r} is outside the range spanstay accepts for "
                         f"{DIMENSIONS[dimension].words} ({_limit(low, dimension)} to "
                         f"{_limit(high, dimension)})", where)


def _limit(value: float, dimension: str | None) -> str:
    if dimension == "angle":
        return f"{math.degrees(value):g} deg"
    if dimension is None:
        return f"{value:g}"
    unit = DIMENSIONS[dimension].si_unit
    if unit == "m":
        return f"{value:g} m ({value / 0.3048:.4g} ft)"
    if unit == "N" and abs(value) >= 1.0:
        return f"{value:g} N ({value / 4.4482216152605:.4g} lbf)"
    return f"{value:g} {unit}"
