"""Soil description: layers from the ground surface down, water table, presets.

Depths are positive downward from the ground surface, in metres. All values SI.
A layer is one of three kinds:

- ``"sand"``: friction angle, unit weight, initial subgrade modulus ``k_initial``
  (API RP 2A: the p-y initial slope is ``k_initial * z``).
- ``"clay"``: undrained shear strength, unit weight, strain at half strength
  ``eps50`` (Matlock 1970 soft clay).
- ``"modulus"``: a user-given p-y slope ``modulus_constant + modulus_gradient * z``
  (z below the ground surface), for users who have a soils report. A friction
  angle or an undrained strength given on such a layer caps it at the matching
  ultimate resistance; without either it stays linear.

``unit_weight`` is the total unit weight; below the water table the effective
unit weight ``unit_weight - WATER_UNIT_WEIGHT`` is used for the overburden.
"""
from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from typing import Any, Mapping

import numpy as np

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.ibc_embedment import ibc_class_key

WATER_UNIT_WEIGHT = 9810.0  # N/m^3, fresh water (rho g)
KINDS = ("sand", "clay", "modulus")
LOADINGS = ("static", "cyclic")
FRICTION_ANGLE_RANGE_DEG = (20.0, 45.0)
_DEPTH_TOL = 1e-6  # m, tolerance for layer contacts


@dataclass(frozen=True)
class SoilLayer:
    """One soil layer between two depths below grade.

    Parameters
    ----------
    top, bottom
        Depths of the layer faces below the ground surface, m.
    kind
        ``"sand"``, ``"clay"`` or ``"modulus"``.
    unit_weight
        Total unit weight, N/m^3.
    friction_angle_deg
        Internal friction angle, degrees (sand; optional cap for ``modulus``).
    k_initial
        API initial modulus of subgrade reaction, N/m^3 (sand).
    undrained_shear_strength
        Undrained shear strength c_u, Pa (clay; optional cap for ``modulus``).
    eps50
        Strain at half the peak deviator stress, dimensionless (clay).
    modulus_constant
        Constant part of the p-y slope, Pa (force per length per displacement).
    modulus_gradient
        Increase of the p-y slope with depth, N/m^3 (n_h).
    ibc_class
        IBC Table 1806.2 class key (see ``models.catalogs.ibc_embedment``) for the code
        check; ``None`` when unknown.
    loading
        ``"static"`` or ``"cyclic"`` p-y curves for this layer (API sand A = 0.9,
        Matlock 1970 cyclic clay). Static here; the scenario's default is cyclic
        (``models.scenario.spec.DEFAULT_SOIL_LOADING``).
    matlock_J
        Matlock's empirical J (0.5 soft clay, 0.25 stiff clay).
    """

    top: float
    bottom: float
    kind: str
    unit_weight: float
    friction_angle_deg: float | None = None
    k_initial: float | None = None
    undrained_shear_strength: float | None = None
    eps50: float | None = None
    modulus_constant: float | None = None
    modulus_gradient: float | None = None
    ibc_class: str | None = None
    loading: str = "static"
    matlock_J: float = 0.5

    @classmethod
    def from_spec(cls, spec: Any, **overrides: Any) -> "SoilLayer":
        """Build from any object or mapping with the same field names.

        ``models.scenario.spec.SoilLayerSpec`` uses these names, so
        ``SoilLayer.from_spec(layer_spec)`` is enough; missing optional fields
        default to ``None``. ``overrides`` replace single fields.
        """
        values: dict[str, Any] = {}
        for f in dataclasses.fields(cls):
            if isinstance(spec, Mapping):
                if f.name in spec:
                    values[f.name] = spec[f.name]
            elif getattr(spec, f.name, None) is not None:
                values[f.name] = getattr(spec, f.name)
        values.update(overrides)
        return cls(**values)

    @property
    def thickness(self) -> float:
        """Layer thickness, m."""
        return self.bottom - self.top

    def validate(self, where: str = "soil.layer") -> None:
        """Raise InputError naming the first bad value of this layer."""
        if self.loading not in LOADINGS:
            raise InputError(f"loading {self.loading!r} is not known; expected 'static' or "
                             "'cyclic'", where=f"{where}.loading")
        if not (np.isfinite(self.matlock_J) and 0.0 < self.matlock_J <= 1.0):
            raise InputError(f"matlock_J {self.matlock_J} must be between 0 and 1",
                             where=f"{where}.matlock_J")
        if self.kind not in KINDS:
            raise InputError(
                f"soil kind {self.kind!r} is not known; expected one of {', '.join(KINDS)}",
                where=f"{where}.kind")
        if not (np.isfinite(self.top) and np.isfinite(self.bottom)) or self.top < 0:
            raise InputError(f"layer top {self.top} m must be a depth at or below grade (>= 0)",
                             where=f"{where}.top")
        if self.bottom <= self.top:
            raise InputError(
                f"layer bottom {self.bottom} m must be deeper than its top {self.top} m",
                where=f"{where}.bottom")
        _positive(self.unit_weight, "unit weight", "N/m^3", f"{where}.unit_weight")
        if self.kind == "sand":
            _required(self.friction_angle_deg, "a sand layer needs a friction angle",
                      f"{where}.friction_angle_deg")
            _required(self.k_initial, "a sand layer needs an initial subgrade modulus k",
                      f"{where}.k_initial")
            _positive(self.k_initial, "initial subgrade modulus", "N/m^3", f"{where}.k_initial")
        elif self.kind == "clay":
            _required(self.undrained_shear_strength,
                      "a clay layer needs an undrained shear strength",
                      f"{where}.undrained_shear_strength")
            _required(self.eps50, "a clay layer needs eps50 (strain at half strength)",
                      f"{where}.eps50")
            if not 0.0 < self.eps50 < 0.2:
                raise InputError(f"eps50 {self.eps50} is outside the expected range 0 to 0.2",
                                 where=f"{where}.eps50")
        else:
            c = self.modulus_constant or 0.0
            g = self.modulus_gradient or 0.0
            if c < 0 or g < 0 or not (np.isfinite(c) and np.isfinite(g)) or c + g <= 0:
                raise InputError(
                    "a modulus layer needs modulus_constant >= 0 and modulus_gradient >= 0, "
                    f"not both zero (got {c} Pa and {g} N/m^3)",
                    where=f"{where}.modulus_constant")
        if self.friction_angle_deg is not None:
            lo, hi = FRICTION_ANGLE_RANGE_DEG
            if not lo <= self.friction_angle_deg <= hi:
                raise InputError(
                    f"friction angle {self.friction_angle_deg} deg is outside {lo:g}-{hi:g} deg",
                    where=f"{where}.friction_angle_deg")
        if self.undrained_shear_strength is not None:
            _positive(self.undrained_shear_strength, "undrained shear strength", "Pa",
                      f"{where}.undrained_shear_strength")
        if self.ibc_class is not None:
            try:
                ibc_class_key(self.ibc_class)
            except InputError as err:
                raise InputError(str(err), where=f"{where}.ibc_class") from None


def _required(value: float | None, message: str, where: str) -> None:
    if value is None:
        raise InputError(message, where=where)


def _positive(value: float | None, name: str, unit: str, where: str) -> None:
    if value is None or not np.isfinite(value) or value <= 0:
        raise InputError(f"{name} {value} {unit} must be a positive number", where=where)


@dataclass(frozen=True)
class SoilProfile:
    """Soil layers from the ground surface down, and an optional water table.

    Parameters
    ----------
    layers
        Layers in order; the first starts at depth 0, each next one starts
        where the previous one ends.
    water_table
        Depth of the water table below grade, m, or ``None`` (dry).
    where
        Key path used in error messages, e.g. ``"ground"``.
    """

    layers: tuple[SoilLayer, ...]
    water_table: float | None = None
    where: str = "soil"

    def __post_init__(self) -> None:
        object.__setattr__(self, "layers", tuple(self.layers))
        self.validate()

    def validate(self) -> None:
        """Raise InputError for layers out of order, overlapping or with bad values."""
        if not self.layers:
            raise InputError("at least one soil layer is needed", where=f"{self.where}.layer")
        for i, layer in enumerate(self.layers):
            layer.validate(f"{self.where}.layer[{i}]")
        first = self.layers[0]
        if abs(first.top) > _DEPTH_TOL:
            raise InputError(f"the first layer must start at the ground surface (top 0 m), "
                             f"not at {first.top} m", where=f"{self.where}.layer[0].top")
        for i in range(1, len(self.layers)):
            prev, layer = self.layers[i - 1], self.layers[i]
            if layer.top <= prev.top:
                raise InputError(
                    f"layers out of order: top {layer.top} m is not below the top of the "
                    f"layer above ({prev.top} m); list layers from the surface down",
                    where=f"{self.where}.layer[{i}].top")
        for i in range(1, len(self.layers)):
            prev, layer = self.layers[i - 1], self.layers[i]
            if layer.top < prev.bottom - _DEPTH_TOL:
                raise InputError(
                    f"layer top {layer.top} m overlaps the layer above (it ends at "
                    f"{prev.bottom} m)", where=f"{self.where}.layer[{i}].top")
            if layer.top > prev.bottom + _DEPTH_TOL:
                raise InputError(
                    f"gap between layers: top {layer.top} m but the layer above ends at "
                    f"{prev.bottom} m", where=f"{self.where}.layer[{i}].top")
        if self.water_table is not None:
            if not np.isfinite(self.water_table) or self.water_table < 0:
                raise InputError(f"water table depth {self.water_table} m must be >= 0",
                                 where=f"{self.where}.water_table")
            for i, layer in enumerate(self.layers):
                if layer.bottom > self.water_table and layer.unit_weight <= WATER_UNIT_WEIGHT:
                    raise InputError(
                        f"unit weight {layer.unit_weight} N/m^3 is not more than water's "
                        f"({WATER_UNIT_WEIGHT} N/m^3), so the layer below the water table "
                        "would weigh nothing", where=f"{self.where}.layer[{i}].unit_weight")

    @property
    def bottom(self) -> float:
        """Depth of the bottom of the described soil, m."""
        return self.layers[-1].bottom

    def layer_at(self, depth: np.ndarray | float, where: str | None = None) -> np.ndarray:
        """Index of the layer holding each depth (vectorised).

        A depth on a contact belongs to the layer below it; the bottom of the
        last layer belongs to the last layer. Raises InputError for depths
        above grade or below the described soil.
        """
        z = np.asarray(depth, dtype=float)
        if np.any(z < -_DEPTH_TOL) or np.any(z > self.bottom + _DEPTH_TOL):
            worst = float(z.max()) if np.any(z > self.bottom + _DEPTH_TOL) else float(z.min())
            raise InputError(
                f"depth {worst:.3f} m is outside the described soil (0 to {self.bottom:.3f} m)",
                where=where or f"{self.where}.layer")
        tops = np.array([layer.top for layer in self.layers])
        idx = np.searchsorted(tops, z + _DEPTH_TOL, side="right") - 1
        return np.clip(idx, 0, len(self.layers) - 1)

    def layer_values(self, name: str, depth: np.ndarray | float) -> np.ndarray:
        """Field ``name`` of the layer at each depth, as floats (None -> nan)."""
        idx = self.layer_at(depth)
        table = np.array([np.nan if getattr(layer, name) is None else getattr(layer, name)
                          for layer in self.layers], dtype=float)
        return table[idx]

    def kinds_at(self, depth: np.ndarray | float) -> np.ndarray:
        """Kind string of the layer at each depth."""
        return np.array([layer.kind for layer in self.layers])[self.layer_at(depth)]

    def vertical_effective_stress(self, depth: np.ndarray | float) -> np.ndarray:
        """Vertical effective stress sigma'_v(z), Pa (vectorised, exact for the layering).

        sigma'_v is piecewise linear between layer contacts and the water
        table, so it is interpolated exactly between those break points.
        """
        z = np.asarray(depth, dtype=float)
        self.layer_at(z)  # range check
        breaks = {0.0, self.bottom, *(layer.bottom for layer in self.layers)}
        if self.water_table is not None and self.water_table < self.bottom:
            breaks.add(self.water_table)
        zb = np.array(sorted(breaks))
        mid = 0.5 * (zb[:-1] + zb[1:])
        gamma = self.layer_values("unit_weight", mid)
        if self.water_table is not None:
            gamma = np.where(mid > self.water_table, gamma - WATER_UNIT_WEIGHT, gamma)
        stress = np.concatenate([[0.0], np.cumsum(gamma * np.diff(zb))])
        return np.interp(z, zb, stress)


def profile_from_specs(layer_specs: list[Any], water_table: float | None = None,
                       where: str = "soil") -> SoilProfile:
    """Build and validate a SoilProfile from layer specs (see ``SoilLayer.from_spec``)."""
    return SoilProfile(tuple(SoilLayer.from_spec(s) for s in layer_specs), water_table, where)


# --- presets --------------------------------------------------------------------------
# Typical values for common soil classes. k_initial for sands: Reese, Cox & Koop
# (1974) recommended values, 25 / 90 / 225 lb/in^3 for loose / medium / dense sand
# above the water table (from memory; 1 lb/in^3 = 271.447 kN/m^3). Friction angles and
# unit weights: typical textbook ranges (from memory, e.g. Das, Principles of
# Foundation Engineering, tables of typical values). eps50 for clays: Reese & Van Impe
# recommendations by strength range, 0.02 for c_u < 24 kPa and 0.005 for
# c_u 96-192 kPa (from memory). IBC class: IBC 2021 Table 1806.2 by soil group.
LB_PER_IN3 = 271_447.1  # N/m^3

PRESETS: dict[str, dict[str, Any]] = {
    "loose_sand": dict(
        kind="sand", unit_weight=17.5e3, friction_angle_deg=29.0, k_initial=25 * LB_PER_IN3,
        ibc_class="sand",
        source="from memory: typical loose sand; k after Reese, Cox & Koop (1974)"),
    "medium_dense_sand": dict(
        kind="sand", unit_weight=18.5e3, friction_angle_deg=33.0, k_initial=90 * LB_PER_IN3,
        ibc_class="sand",
        source="from memory: typical medium dense sand; k after Reese, Cox & Koop (1974)"),
    "dense_sand": dict(
        kind="sand", unit_weight=20.0e3, friction_angle_deg=38.0, k_initial=225 * LB_PER_IN3,
        ibc_class="sand",
        source="from memory: typical dense sand; k after Reese, Cox & Koop (1974); IBC "
               "Table 1806.2 class 4 (sand, SW/SP): a sand is not the code's gravel class "
               "unless a soils report says GW/GP"),
    "soft_clay": dict(
        kind="clay", unit_weight=16.5e3, undrained_shear_strength=20e3, eps50=0.02,
        ibc_class="clay",
        source="from memory: soft clay c_u 12-24 kPa, eps50 0.02 (Matlock 1970 range)"),
    "stiff_clay": dict(
        kind="clay", unit_weight=19.0e3, undrained_shear_strength=50e3, eps50=0.007,
        matlock_J=0.25, ibc_class="clay",
        source="from memory: stiff clay c_u 48-96 kPa, taken at the low end 50 kPa; eps50 "
               "0.007 for that range (Reese & Van Impe); J = 0.25 as usual for stiff clay "
               "(Matlock 1970); the soft-clay curve shape (Matlock 1970), common practice "
               "for a simple check"),
}

#: Former preset names still read, mapped to their present names.
PRESET_ALIASES = {"dense_sand_gravel": "dense_sand"}


def preset_layer(name: str, top: float, bottom: float, **overrides: Any) -> SoilLayer:
    """A SoilLayer from a named preset between two depths; any field may be overridden.

    Raises InputError for an unknown preset name.
    """
    name = PRESET_ALIASES.get(name, name)
    if name not in PRESETS:
        raise InputError(f"soil preset {name!r} is not known; expected one of "
                         f"{', '.join(PRESETS)}", where="soil.preset")
    values = {k: v for k, v in PRESETS[name].items() if k != "source"}
    values.update(overrides)
    return SoilLayer(top=top, bottom=bottom, **values)
