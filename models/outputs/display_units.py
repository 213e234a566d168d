"""Display units for the 3D view and the report: exact factors, no unit registry.

The view and the report must start fast, so they convert with the exact
definitions below instead of loading pint (models.common.units does the same job for
the scenario reader and the terminal summary).
"""
from __future__ import annotations

import math

# Exact by definition (international yard and pound agreement, 1959; lbf from
# the standard acceleration of gravity 9.80665 m/s^2).
FOOT = 0.3048
INCH = 0.0254
LBF = 4.4482216152605
MPH = 0.44704
PSI = LBF / INCH**2
PSF = LBF / FOOT**2

#: kind -> {"si": (SI value per display unit, label), "us": (...)}
_UNITS: dict[str, dict[str, tuple[float, str]]] = {
    "length": {"si": (1.0, "m"), "us": (FOOT, "ft")},
    "size": {"si": (1e-3, "mm"), "us": (INCH, "in")},
    "force": {"si": (1e3, "kN"), "us": (LBF, "lbf")},
    "moment": {"si": (1e3, "kN·m"), "us": (LBF * FOOT, "lbf·ft")},
    "stress": {"si": (1e6, "MPa"), "us": (PSI, "psi")},
    "soil pressure": {"si": (1e3, "kPa"), "us": (PSF, "psf")},
    "force per length": {"si": (1e3, "kN/m"), "us": (LBF / FOOT, "lbf/ft")},
    "stiffness": {"si": (1e3, "kN/m"), "us": (LBF / INCH, "lbf/in")},
    "unit weight": {"si": (1e3, "kN/m³"), "us": (LBF / FOOT**3, "pcf")},
    "force per volume": {"si": (1e6, "MN/m³"), "us": (LBF / INCH**3, "pci")},
    "rotational stiffness": {"si": (1e3, "kN·m/rad"), "us": (LBF * FOOT, "lbf·ft/rad")},
    "area": {"si": (1.0, "m²"), "us": (FOOT**2, "ft²")},
    "density": {"si": (1.0, "kg/m³"), "us": (0.45359237 / FOOT**3, "lb/ft³")},
    "speed": {"si": (1.0, "m/s"), "us": (MPH, "mph")},
    "angle": {"si": (math.pi / 180, "°"), "us": (math.pi / 180, "°")},
    "ratio": {"si": (1.0, ""), "us": (1.0, "")},
    "per kelvin": {"si": (1.0, "1/K"), "us": (1.8, "1/°F")},
    "energy": {"si": (1e3, "kJ"), "us": (LBF * FOOT, "ft·lbf")},
}


def unit_systems() -> tuple[str, ...]:
    return ("si", "us")


def scale(kind: str, units: str) -> tuple[float, str]:
    """(SI value of one display unit, label) of a quantity ``kind`` in ``units``."""
    if kind == "temperature":
        return (1.0, "°C") if units == "si" else (1.0, "°F")
    table = _UNITS.get(kind)
    if table is None:
        raise KeyError(f"no display unit for quantity '{kind}'")
    return table["us" if units == "us" else "si"]


def convert(value: float, kind: str, units: str) -> float:
    """An SI value in display units (temperatures from kelvin)."""
    if kind == "temperature":
        c = value - 273.15
        return c if units == "si" else c * 1.8 + 32.0
    factor, _ = scale(kind, units)
    return value / factor


def number(x: float | None, digits: int = 3) -> str:
    """Round to ``digits`` significant figures, thousands separated; '-' for none."""
    if not isinstance(x, (int, float)) or isinstance(x, bool) or not math.isfinite(x):
        return "–"
    if x == 0:
        return "0"
    exponent = math.floor(math.log10(abs(x)))
    if abs(round(x, digits - 1 - exponent)) >= 10.0 ** (exponent + 1):
        exponent += 1  # 9.9999 rounds up to 10.0
    places = max(digits - 1 - exponent, 0)
    if exponent >= 9 or exponent < -4:
        return f"{x:.{digits - 1}e}"
    return f"{round(x, places):,.{places}f}"


def show(value: float | None, kind: str, units: str, digits: int = 3) -> str:
    """``value`` (SI) as display text with its unit label, e.g. '12.0 ft'."""
    if value is None or not math.isfinite(float(value)):
        return "–"
    v = convert(float(value), kind, units)
    label = scale(kind, units)[1] if kind != "temperature" else ("°C" if units == "si" else "°F")
    if not label:
        return number(v, digits)
    sep = "" if label.startswith("°") else " "
    return f"{number(v, digits)}{sep}{label}"
