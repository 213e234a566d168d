"""Fasteners for built-up timber: nails, wood screws, bolts.

Sizes (SI), slip modulus per shear plane (Eurocode 5 Table 7.1) and a lateral
design value per shear plane from the NDS yield limit equations (NDS 12.3.1).
Users may give their own slip modulus or lateral value instead.
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass, replace

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.lumber import INCH, PSI
from spanstay.models.catalogs.nds import Factor, load_duration_factor

LBF = 4.4482216152605  # N per pound-force

# Common and box wire nails: pennyweight -> (length in, shank diameter in).
# ASTM F1667 / NDS Table L4 (from memory).
COMMON_NAILS = {
    "6d": (2.0, 0.113), "8d": (2.5, 0.131), "10d": (3.0, 0.148), "12d": (3.25, 0.148),
    "16d": (3.5, 0.162), "20d": (4.0, 0.192), "30d": (4.5, 0.207), "40d": (5.0, 0.225),
    "50d": (5.5, 0.244), "60d": (6.0, 0.263),
}
BOX_NAILS = {
    "6d": (2.0, 0.099), "8d": (2.5, 0.113), "10d": (3.0, 0.128), "12d": (3.25, 0.128),
    "16d": (3.5, 0.135), "20d": (4.0, 0.148),
}
NAIL_SOURCE = "ASTM F1667 / NDS Table L4 (from memory)"
# Wood screws: gauge -> shank diameter D = 0.060 + 0.013 N in (ASME B18.6.1, from memory).
SCREW_GAUGES = (6, 8, 10, 12, 14, 16, 18, 20, 24)


def nail_bending_yield(D_in: float) -> float:
    """Fyb (Pa) of nails and wood screws by diameter, NDS Table 12N footnote (from memory)."""
    for limit, fyb in ((0.099, 130e3), (0.142, 100e3), (0.177, 90e3), (0.236, 80e3),
                       (0.273, 70e3), (0.344, 60e3)):
        if D_in <= limit + 1e-9:
            return fyb * PSI
    return 45e3 * PSI


@dataclass(frozen=True)
class Fastener:
    """A dowel-type fastener (SI).

    Parameters
    ----------
    kind
        "nail", "screw" or "bolt".
    name
        Trade name, e.g. "16d common nail".
    diameter, length
        Shank diameter and length, m.
    predrilled
        Nails in pre-drilled holes count as predrilled; screws and bolts always do.
    Fyb
        Bending yield strength, Pa.
    slip_modulus
        User-given K_ser per shear plane, N/m (None: Eurocode 5 Table 7.1).
    lateral_value
        User-given reference lateral value Z per shear plane, N (None: NDS 12.3.1).
    """

    kind: str
    name: str
    diameter: float
    length: float
    predrilled: bool
    Fyb: float
    source: str
    slip_modulus: float | None = None
    lateral_value: float | None = None

    def with_overrides(self, slip_modulus: float | None = None,
                       lateral_value: float | None = None) -> "Fastener":
        """Copy with user-given slip modulus (N/m) and/or lateral value (N)."""
        for name, v in (("slip_modulus", slip_modulus), ("lateral_value", lateral_value)):
            if v is not None and not v > 0:
                raise InputError(f"fastener {name} must be positive, got {v}")
        return replace(self,
                       slip_modulus=slip_modulus if slip_modulus is not None else self.slip_modulus,
                       lateral_value=lateral_value if lateral_value is not None else self.lateral_value)


def nail(pennyweight: str, kind: str = "common", predrilled: bool = False,
         where: str | None = None) -> Fastener:
    """A common or box nail by pennyweight, e.g. ``nail("16d")``."""
    table = {"common": COMMON_NAILS, "box": BOX_NAILS}.get(kind)
    if table is None:
        raise InputError(f"nail kind {kind!r} unknown; expected 'common' or 'box'", where)
    pw = str(pennyweight).strip().lower().replace(" ", "")
    if pw not in table:
        raise InputError(f"{kind} nail {pennyweight!r} not in the catalog; known: "
                         + ", ".join(table), where)
    L, D = table[pw]
    return Fastener("nail", f"{pw} {kind} nail", D * INCH, L * INCH, predrilled,
                    nail_bending_yield(D), NAIL_SOURCE)


def wood_screw(gauge: int | str, length: float, where: str | None = None) -> Fastener:
    """A wood screw by gauge (``8`` or ``"#8"``) and length in metres."""
    g = str(gauge).strip().lstrip("#")
    if not g.isdigit() or int(g) not in SCREW_GAUGES:
        raise InputError(f"wood screw gauge {gauge!r} unknown; known: "
                         + ", ".join(f"#{n}" for n in SCREW_GAUGES), where)
    if not length > 0:
        raise InputError(f"screw length must be positive, got {length}", where)
    D = 0.060 + 0.013 * int(g)
    return Fastener("screw", f"#{g} wood screw", D * INCH, float(length), True,
                    nail_bending_yield(D), "ASME B18.6.1 shank diameter (from memory)")


def bolt(diameter: float, length: float, where: str | None = None) -> Fastener:
    """A bolt in a snug hole: diameter and length in metres; Fyb 45,000 psi (NDS, from memory)."""
    if not (diameter > 0 and length > 0):
        raise InputError(f"bolt diameter and length must be positive, got {diameter}, {length}", where)
    return Fastener("bolt", f"{diameter / INCH:.3g} in bolt", float(diameter), float(length), True,
                    45e3 * PSI, "user-given size; Fyb 45,000 psi (NDS Table 12A footnote, from memory)")


_SIZE = re.compile(r"^\s*(\d+d)\s*(common|box)?\s*(nail)?\s*$", re.I)


def fastener(kind: str, size: str | float, length: float | None = None,
             predrilled: bool = False, where: str | None = None) -> Fastener:
    """Dispatch by kind: ``fastener("nail", "16d")``, ``fastener("screw", "#10", 0.076)``,
    ``fastener("bolt", 0.0127, 0.1)``."""
    k = str(kind).strip().lower()
    if k in ("nail", "common nail", "box nail"):
        m = _SIZE.match(str(size))
        sub = (m.group(2) or "common").lower() if m else ("box" if "box" in k else "common")
        return nail(m.group(1) if m else str(size), sub, predrilled, where)
    if k in ("screw", "wood screw"):
        if length is None:
            raise InputError("a wood screw needs a length", where)
        return wood_screw(size, length, where)
    if k == "bolt":
        if length is None:
            raise InputError("a bolt needs a length", where)
        return bolt(float(size), length, where)
    raise InputError(f"fastener kind {kind!r} unknown; expected nail, screw or bolt", where)


# ------------------------------------------------------------------- slip
def joint_density(rho_mean_1: float, rho_mean_2: float | None = None) -> float:
    """Mean density of a joint of two members, sqrt(rho1 rho2) (EN 1995-1-1 7.1(2))."""
    return math.sqrt(rho_mean_1 * (rho_mean_2 if rho_mean_2 is not None else rho_mean_1))


def slip_modulus_ser(f: Fastener, rho_mean: float) -> float:
    """Serviceability slip modulus K_ser per shear plane per fastener, N/m.

    EN 1995-1-1 Table 7.1 (rho_m kg/m^3, d mm, result N/mm):
    nails without pre-drilling rho_m^1.5 d^0.8 / 30; nails with pre-drilling,
    screws, bolts and dowels rho_m^1.5 d / 23. A user-given value wins.
    Bolt-hole clearance adds slip not modelled here.
    """
    if f.slip_modulus is not None:
        return f.slip_modulus
    d_mm = f.diameter * 1000.0
    if f.kind == "nail" and not f.predrilled:
        k = rho_mean**1.5 * d_mm**0.8 / 30.0
    else:
        k = rho_mean**1.5 * d_mm / 23.0
    return k * 1000.0  # N/mm -> N/m


def slip_modulus_ult(f: Fastener, rho_mean: float) -> float:
    """Ultimate slip modulus K_u = 2/3 K_ser (EN 1995-1-1 2.2.2), N/m."""
    return 2.0 / 3.0 * slip_modulus_ser(f, rho_mean)


# --------------------------------------------------------------- minimum thickness
def check_fits(f: Fastener, ply_thickness: float, rho_mean: float, where: str | None = None) -> None:
    """Raise InputError when the fastener is too thick for the ply.

    Nails without pre-drilling: t >= max(7 d, (13 d - 30) rho / 400) mm
    (EN 1995-1-1 8.3.1.2(6), with the mean density: conservative). Others:
    d <= t / 2 (common practice).
    """
    d_mm, t_mm = f.diameter * 1000.0, ply_thickness * 1000.0
    if f.kind == "nail" and not f.predrilled:
        need = max(7 * d_mm, (13 * d_mm - 30) * rho_mean / 400.0)
        rule = "EN 1995-1-1 8.3.1.2: t >= max(7d, (13d - 30) rho/400)"
    else:
        need = 2 * d_mm
        rule = "common practice: d <= t/2"
    if t_mm < need:
        raise InputError(f"fastener {f.name} (d = {d_mm:.1f} mm) is too large for a "
                         f"{t_mm:.1f} mm ply; needs at least {need:.1f} mm ({rule})", where)


# --------------------------------------------------------------- lateral value
def dowel_bearing_strength(G: float, D: float, theta_deg: float = 0.0) -> float:
    """Fe (Pa), NDS 12.3.3 (from memory).

    D < 1/4 in: 16,600 G^1.84 psi at any angle; D >= 1/4 in: parallel
    11,200 G, perpendicular 6,100 G^1.45 / sqrt(D[in]), Hankinson between.
    """
    D_in = D / INCH
    if D_in < 0.25:
        return 16600.0 * G**1.84 * PSI
    par = 11200.0 * G
    perp = 6100.0 * G**1.45 / math.sqrt(D_in)
    t = math.radians(theta_deg)
    return par * perp / (par * math.sin(t) ** 2 + perp * math.cos(t) ** 2) * PSI


@dataclass(frozen=True)
class LateralValue:
    """Reference lateral value Z per shear plane (N) and its governing yield mode."""

    Z: float
    mode: str
    modes: dict[str, float]
    source: str


def yield_limit(D: float, ls: float, lm: float, Fes: float, Fem: float, Fyb: float,
                theta_deg: float = 0.0) -> LateralValue:
    """Single-shear reference lateral value, NDS 12.3.1 yield limit equations.

    D, ls, lm in m; Fes, Fem, Fyb in Pa. Returns the least of modes Im, Is,
    II, IIIm, IIIs and IV with the reduction term Rd of NDS Table 12.3.1B
    (from memory).
    """
    Re, Rt = Fem / Fes, lm / ls
    D_in = D / INCH
    if D_in < 0.17:
        rd = {m: 2.2 for m in ("Im", "Is", "II", "IIIm", "IIIs", "IV")}
    elif D_in < 0.25:
        kd = 10 * D_in + 0.5
        rd = {m: kd for m in ("Im", "Is", "II", "IIIm", "IIIs", "IV")}
    else:
        kt = 1 + 0.25 * (theta_deg / 90.0)
        rd = {"Im": 4 * kt, "Is": 4 * kt, "II": 3.6 * kt, "IIIm": 3.2 * kt, "IIIs": 3.2 * kt,
              "IV": 3.2 * kt}
    k1 = (math.sqrt(Re + 2 * Re**2 * (1 + Rt + Rt**2) + Rt**2 * Re**3) - Re * (1 + Rt)) / (1 + Re)
    k2 = -1 + math.sqrt(2 * (1 + Re) + 2 * Fyb * (1 + 2 * Re) * D**2 / (3 * Fem * lm**2))
    k3 = -1 + math.sqrt(2 * (1 + Re) / Re + 2 * Fyb * (2 + Re) * D**2 / (3 * Fem * ls**2))
    modes = {
        "Im": D * lm * Fem / rd["Im"],
        "Is": D * ls * Fes / rd["Is"],
        "II": k1 * D * ls * Fes / rd["II"],
        "IIIm": k2 * D * lm * Fem / ((1 + 2 * Re) * rd["IIIm"]),
        "IIIs": k3 * D * ls * Fem / ((2 + Re) * rd["IIIs"]),
        "IV": D**2 / rd["IV"] * math.sqrt(2 * Fem * Fyb / (3 * (1 + Re))),
    }
    mode = min(modes, key=modes.get)
    return LateralValue(modes[mode], mode, modes, "NDS 12.3.1 yield limit equations (from memory)")


def lateral_value(f: Fastener, side_thickness: float, main_thickness: float,
                  G_side: float, G_main: float | None = None,
                  where: str | None = None) -> LateralValue:
    """Reference lateral value per shear plane for a fastener joining two plies.

    The side member is the ply the fastener enters through; the dowel bearing
    length in the main member is min(length - side thickness, main thickness).
    Load parallel to grain (slip along a post). A user-given value wins.
    Nails and screws need a main-member penetration of at least 6 D (NDS 12.1.6/12.1.5).
    """
    if f.lateral_value is not None:
        return LateralValue(f.lateral_value, "user-given", {}, "user-given")
    G_main = G_side if G_main is None else G_main
    lm = min(f.length - side_thickness, main_thickness)
    if f.kind in ("nail", "screw") and lm < 6 * f.diameter - 1e-12:
        raise InputError(
            f"{f.name} ({f.length / INCH:.3g} in) penetrates only {max(lm, 0) / INCH:.2f} in into "
            f"the next ply; at least 6 D = {6 * f.diameter / INCH:.2f} in is needed (NDS 12.1.6)", where)
    Fes = dowel_bearing_strength(G_side, f.diameter)
    Fem = dowel_bearing_strength(G_main, f.diameter)
    return yield_limit(f.diameter, side_thickness, lm, Fes, Fem, f.Fyb)


def lateral_factors(duration: str = "ten minutes", wet: bool = False) -> list[Factor]:
    """Adjustment factors for dowel fasteners: CD and CM (NDS Table 11.3.3: 0.7 wet, from memory).

    Group action Cg and geometry factor C_delta are taken as 1.0, which
    assumes full end, edge distances and spacings.
    """
    cd = replace(load_duration_factor(duration), applies_to=("Z",))
    return [cd,
            Factor("CM", "wet service", 0.7 if wet else 1.0, ("Z",),
                   "NDS Table 11.3.3 (from memory)" if wet else "dry service"),
            Factor("Cg", "group action", 1.0, ("Z",), "taken as 1.0"),
            Factor("Cdelta", "geometry", 1.0, ("Z",), "full spacing and distances assumed")]
