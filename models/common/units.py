"""Units at the edges: parse quantity strings to SI floats and show SI values back.

Inside spanstay every number is SI (m, N, Pa, K, kg, s, rad). pint is used only
here: to read the scenario's quantity strings and to format results in the
user's system (``us`` or ``si``).
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass
from functools import lru_cache
from typing import Any

from spanstay.models.common.errors import InputError

#: Standard acceleration of gravity, m/s^2 (exact by definition; NIST SP 811).
STANDARD_GRAVITY = 9.80665

# Units the trade uses that pint does not define (psi, ksi and kip exist).
_TRADE_UNITS = (
    "psf = pound_force / foot ** 2",
    "ksf = kip / foot ** 2",
    "pcf = pound_force / foot ** 3",
    "pci = pound_force / inch ** 3",
    "plf = pound_force / foot",
    "pli = pound_force / inch",
    "klf = kip / foot",
)


@lru_cache(maxsize=1)
def registry() -> Any:
    """The shared pint UnitRegistry with the trade units added (built on first use)."""
    import pint

    ureg = pint.UnitRegistry()
    for definition in _TRADE_UNITS:
        ureg.define(definition)
    return ureg


@dataclass(frozen=True)
class Dimension:
    """One kind of quantity the scenario file may contain."""

    words: str  # how the user reads it: "a length"
    si_unit: str  # pint unit of the SI float returned
    example: str  # a valid quantity string
    mass_unit: str | None = None  # accepted too, times standard gravity (weights)


#: Expected dimensions by name. A weight may be given as a mass ("250 lb"):
#: it is multiplied by standard gravity.
DIMENSIONS: dict[str, Dimension] = {
    "length": Dimension("a length", "m", "12 ft"),
    "area": Dimension("an area", "m**2", "5 ft**2"),
    "force": Dimension("a force", "N", "250 lbf"),
    "weight": Dimension("a weight (force, or mass times gravity)", "N", "250 lbf", "kg"),
    "pressure": Dimension("a pressure or stress", "Pa", "1200 psi"),
    "force per length": Dimension("a force per length", "N/m", "500 lbf/in"),
    "weight per length": Dimension(
        "a weight per length", "N/m", "0.11 lbf/ft", "kg/m"),
    "unit weight": Dimension("a unit weight (force per volume)", "N/m**3", "120 pcf",
                             "kg/m**3"),
    "force per volume": Dimension("a force per volume", "N/m**3", "40 pci"),
    "moment": Dimension("a moment (force times length)", "N*m", "2000 lbf*ft"),
    "rotational stiffness": Dimension(
        "a rotational stiffness (moment per radian)", "N*m/rad", "5e6 lbf*ft/rad"),
    "speed": Dimension("a speed", "m/s", "3 mph"),
    "density": Dimension("a density (mass per volume)", "kg/m**3", "1.2 kg/m**3"),
    "temperature": Dimension("a temperature", "K", "60 degF"),
    "temperature difference": Dimension("a temperature difference", "K", "40 delta_degF"),
    "per temperature": Dimension("a coefficient per degree", "1/K", "6.5e-6 / delta_degF"),
    "angle": Dimension("an angle", "rad", "30 deg"),
    "energy": Dimension("an energy (force times distance)", "J", "1500 ft*lbf"),
}

_OFFSET_NAMES = ("degF", "degC", "degree_Fahrenheit", "degree_Celsius", "fahrenheit",
                 "celsius", "°F", "°C")
_OFFSET_RE = re.compile(r"(?<![\w])(" + "|".join(map(re.escape, _OFFSET_NAMES)) + r")(?![\w])")
_NUMBER_UNIT_RE = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")
_MIXED_RE = re.compile(r"^\s*(\d+)[- ]+(\d+)\s*/\s*(\d+)\s*(.*?)\s*$")
# the one leading number of a quantity (a plain fraction "3/8" counts as one number)
_LEADING_RE = re.compile(r"^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?(?:\s*/\s*\d+\.?\d*)?")
_EXPONENT_RE = re.compile(r"(?:\*\*|\^)\s*\(?\s*[-+]?\s*\d+(?:\.\d+)?\s*\)?")
_LOOSE_NUMBER_RE = re.compile(r"(?<![A-Za-z_\d.])\.?\d")


def several_numbers(text: str) -> bool:
    """True when ``text`` sets numbers side by side, which pint would multiply
    (``"3 3 ft"`` = 9 ft, ``"3 ft 3 in"``). Mixed fractions (``"3-1/2 in"``,
    ``"3 1/2 in"``), plain fractions (``"3/8 in"``), exponents (``"ft**2"``) and
    numbers after an explicit operator (``"2.8 lbf / (100 ft)"``) are not."""
    if _MIXED_RE.match(text):
        return False
    lead = _LEADING_RE.match(text)
    if not lead:
        return False
    rest = _EXPONENT_RE.sub("", text[lead.end():])
    for number in _LOOSE_NUMBER_RE.finditer(rest):
        before = rest[:number.start()].rstrip()
        if not before or before[-1] not in "*/(":
            return True
    return False


def _delta(text: str) -> str:
    """Rewrite offset temperature units as differences (degF -> delta_degF)."""
    def repl(m: re.Match[str]) -> str:
        name = {"°F": "degF", "°C": "degC"}.get(m.group(1), m.group(1))
        return "delta_" + name
    return _OFFSET_RE.sub(repl, text)


def _pint_parse(text: str, dimension: str) -> Any:
    """Parse with pint; offset temperatures only as absolute temperatures."""
    ureg = registry()
    mixed = _MIXED_RE.match(text)
    if mixed:  # trade mixed numbers: "5-1/2 in", "1 1/2 in"
        whole, num, den, rest = mixed.groups()
        if int(den) == 0:
            raise ZeroDivisionError(text)
        text = f"{int(whole) + int(num) / int(den)!r} {rest}"
    if dimension == "temperature":
        m = _NUMBER_UNIT_RE.match(text)
        if m and _OFFSET_RE.fullmatch(m.group(2) or ""):
            unit = {"°F": "degF", "°C": "degC"}.get(m.group(2), m.group(2))
            return ureg.Quantity(float(m.group(1)), unit)
        return ureg.Quantity(text)
    return ureg.Quantity(_delta(text))


_OTHER_WORDS = {"kg": "a mass (write lbf rather than lb for a force)",
                "kg/m": "a mass per length", "s": "a time", "m**3": "a volume"}


def _describe(quantity: Any) -> str:
    """Name the dimension of a parsed quantity in words, for error messages."""
    words: dict[str, str] = {}
    for dim in DIMENSIONS.values():  # the first (plainest) name of each dimension
        if dim.si_unit != "rad":
            words.setdefault(dim.si_unit, dim.words)
    for unit, text in {**words, **_OTHER_WORDS}.items():
        if quantity.check(registry().get_dimensionality(unit)):
            return text
    if quantity.dimensionless:
        return "a plain number"
    return f"in {quantity.units}, another kind of quantity"


def parse_quantity(text: Any, expected_dimension: str, where: str | None = None) -> float:
    """Parse a quantity string with units into an SI float.

    Parameters
    ----------
    text
        The value as written in the file, e.g. ``"12 ft"`` or ``"150 lbf/ft**3"``.
    expected_dimension
        A key of :data:`DIMENSIONS` (``"length"``, ``"force"``, ``"pressure"``...).
    where
        Key path for error messages.

    Returns
    -------
    float
        The value in the SI unit of that dimension (m, N, Pa, N/m, K, rad...).
        Absolute temperatures ("60 degF") come back in kelvin; temperature
        differences (``"40 delta_degF"``, and ``"40 degF"`` where a difference is
        expected) come back as kelvin differences.

    Raises
    ------
    InputError
        A bare number, an unknown unit, or the wrong dimension.
    """
    dim = DIMENSIONS[expected_dimension]
    example = f'"{dim.example}"'
    if isinstance(text, bool) or not isinstance(text, (str, int, float)):
        raise InputError(f"expected {dim.words} written as a string with units, e.g. "
                         f"{example}; got {text!r}", where)
    if not isinstance(text, str):
        raise InputError(f"the number {text!r} has no units; {dim.words} needs units, "
                         f"e.g. {example}", where)
    result = _convert(text, expected_dimension)
    if isinstance(result, str):
        raise InputError(result, where)
    return result


class _Bad(Exception):
    """A message about a quantity string (raised inside :func:`_convert`)."""


@lru_cache(maxsize=4096)
def _convert(text: str, expected_dimension: str) -> float | str:
    """SI value of ``text``, or the message saying why it cannot be read (cached)."""
    try:
        return _convert_uncached(text, expected_dimension)
    except _Bad as bad:
        return str(bad)


def _convert_uncached(text: str, expected_dimension: str) -> float:
    dim = DIMENSIONS[expected_dimension]
    example = f'"{dim.example}"'
    if not text.strip():
        raise _Bad(f"empty value; expected {dim.words}, e.g. {example}")
    if several_numbers(text):
        raise _Bad(f"{text!r} holds more than one number; write one number and its units, "
                   f'e.g. {example} (mixed fractions such as "3-1/2 in" are fine)')
    import pint

    try:
        quantity = _pint_parse(text, expected_dimension)
    except pint.UndefinedUnitError as exc:
        names = exc.unit_names if isinstance(exc.unit_names, str) else ", ".join(exc.unit_names)
        raise _Bad(f"unknown unit '{names}' in {text!r}; expected "
                   f"{dim.words}, e.g. {example}") from None
    except Exception:  # pint's tokenizer raises a variety of errors on garbage
        raise _Bad(f"cannot read {text!r} as a quantity; expected {dim.words}, "
                   f"e.g. {example}") from None
    if not hasattr(quantity, "units"):
        quantity = registry().Quantity(quantity)
    if quantity.unitless:
        raise _Bad(f"{text!r} has no units; {dim.words} needs units, e.g. {example}")
    ureg = registry()
    if expected_dimension == "angle":
        if not quantity.dimensionless:
            raise _Bad(f"{text!r} is {_describe(quantity)}; expected {dim.words}, "
                             f"e.g. {example}")
        value = float(quantity.to("rad").magnitude)
    elif quantity.check(ureg.get_dimensionality(dim.si_unit)):
        if expected_dimension == "temperature" and "delta_" in str(quantity.units):
            raise _Bad(f"{text!r} is a temperature difference; expected a "
                             f"temperature, e.g. {example}")
        value = float(quantity.to(dim.si_unit).magnitude)
    elif dim.mass_unit and quantity.check(ureg.get_dimensionality(dim.mass_unit)):
        value = float(quantity.to(dim.mass_unit).magnitude) * STANDARD_GRAVITY
    else:
        hint = ""
        if "temperature" in expected_dimension:
            hint = " (write degF or degC for degrees; F and C alone are farad and coulomb)"
        raise _Bad(f"{text!r} is {_describe(quantity)}; expected {dim.words}, "
                   f"e.g. {example}{hint}")
    if not math.isfinite(value):
        raise _Bad(f"{text!r} is not a finite value")
    return value


def parse_ratio(value: Any, where: str | None = None) -> float:
    """Read a finite plain number or a percentage (``0.8``, ``"80 %"``) as a float."""
    if isinstance(value, bool):
        raise InputError(f"expected a number, got {value!r}", where)
    if isinstance(value, (int, float)):
        return _finite(float(value) if _fits_float(value) else math.inf, value, where)
    if isinstance(value, str):
        if several_numbers(value):
            raise InputError(f"{value!r} holds more than one number; expected one plain number "
                             "(e.g. 0.8 or \"80 %\")", where)
        try:
            quantity = registry().Quantity(value)
        except Exception:
            raise InputError(f"cannot read {value!r} as a number (e.g. 0.8 or \"80 %\")",
                             where) from None
        if hasattr(quantity, "dimensionless") and quantity.dimensionless:
            return _finite(float(quantity.to("dimensionless").magnitude), value, where)
        if isinstance(quantity, (int, float)):
            return _finite(float(quantity), value, where)
        raise InputError(f"{value!r} has units; expected a plain number (e.g. 0.8 or "
                         f"\"80 %\")", where)
    raise InputError(f"expected a number, got {value!r}", where)


def _fits_float(value: int | float) -> bool:
    try:
        float(value)
    except OverflowError:
        return False
    return True


def _finite(x: float, written: Any, where: str | None) -> float:
    """``x`` if finite; nan, inf and overflowing values ("1e400") are refused."""
    if not math.isfinite(x):
        shown = repr(written) if len(repr(written)) <= 40 else repr(written)[:37] + "..."
        raise InputError(f"expected a finite number, got {shown}", where)
    return x


# ---------------------------------------------------------------- display

#: kind -> ((US unit, US label), (SI unit, SI label)); SI values are converted
#: from the SI unit of the matching dimension.
DISPLAY: dict[str, tuple[str, tuple[str, str], tuple[str, str]]] = {
    "length": ("m", ("ft", "ft"), ("m", "m")),
    "size": ("m", ("inch", "in"), ("mm", "mm")),
    "area": ("m**2", ("ft**2", "ft²"), ("m**2", "m²")),
    "force": ("N", ("lbf", "lbf"), ("kN", "kN")),
    "pressure": ("Pa", ("psi", "psi"), ("MPa", "MPa")),
    "soil pressure": ("Pa", ("psf", "psf"), ("kPa", "kPa")),
    "force per length": ("N/m", ("plf", "lbf/ft"), ("N/m", "N/m")),
    "stiffness": ("N/m", ("lbf/inch", "lbf/in"), ("kN/m", "kN/m")),
    "unit weight": ("N/m**3", ("pcf", "pcf"), ("kN/m**3", "kN/m³")),
    "force per volume": ("N/m**3", ("pci", "pci"), ("MN/m**3", "MN/m³")),
    "moment": ("N*m", ("lbf*ft", "lbf·ft"), ("kN*m", "kN·m")),
    "rotational stiffness": ("N*m", ("lbf*ft", "lbf·ft/rad"), ("kN*m", "kN·m/rad")),
    "speed": ("m/s", ("mph", "mph"), ("m/s", "m/s")),
    "density": ("kg/m**3", ("lb/ft**3", "lb/ft³"), ("kg/m**3", "kg/m³")),
    "temperature": ("K", ("degF", "°F"), ("degC", "°C")),
    "temperature difference": ("K", ("delta_degF", "°F"), ("K", "K")),
    "angle": ("rad", ("deg", "°"), ("deg", "°")),
    "energy": ("J", ("ft*lbf", "ft·lbf"), ("kJ", "kJ")),
}

UNIT_SYSTEMS = ("us", "si")


def to_display(value: float, kind: str, system: str) -> tuple[float, str]:
    """Convert an SI value for display.

    Parameters
    ----------
    value
        SI value (m, N, Pa, K...).
    kind
        A key of :data:`DISPLAY` (``"length"``, ``"size"``, ``"force"``...).
    system
        ``"us"`` or ``"si"``.

    Returns
    -------
    (number, label)
    """
    si, us_pair, si_pair = DISPLAY[kind]
    unit, label = us_pair if system == "us" else si_pair
    if system not in UNIT_SYSTEMS:
        raise ValueError(f"unit system must be one of {UNIT_SYSTEMS}, got {system!r}")
    quantity = registry().Quantity(value, si)
    return float(quantity.to(unit).magnitude), label


def format_number(x: float, digits: int = 3) -> str:
    """Round to ``digits`` significant figures, plain notation with thousands commas."""
    if x == 0 or not math.isfinite(x):
        return f"{x:g}"
    exponent = math.floor(math.log10(abs(x)))
    if abs(round(x, digits - 1 - exponent)) >= 10.0 ** (exponent + 1):
        exponent += 1  # 9.9996 rounds up to 10.0
    if exponent >= 9 or exponent < -4:
        return f"{x:.{digits - 1}e}"
    places = digits - 1 - exponent
    return f"{round(x, places):,.{max(places, 0)}f}"


def show(value: float, kind: str, system: str, digits: int = 3) -> str:
    """Format an SI value in the user's system, e.g. ``show(3.6576, "length", "us")``
    -> ``"12.0 ft"``."""
    number, label = to_display(value, kind, system)
    sep = "" if label.startswith("°") else " "
    return f"{format_number(number, digits)}{sep}{label}"
