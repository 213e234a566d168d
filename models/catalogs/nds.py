"""NDS (ANSI/AWC National Design Specification) allowable-stress adjustments.

Allowable stress design: adjusted value = reference value x factors. Every
factor used is returned as a :class:`Factor` so reports can list them. Clause
numbers refer to NDS 2018; tabulated factors are from memory unless stated.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from spanstay.models.common.errors import InputError
from spanstay.models.catalogs.lumber import INCH, PSI, DesignValues, DressedSize

PROPS = ("Fb", "Ft", "Fv", "Fc", "Fc_perp", "E", "Emin")


@dataclass(frozen=True)
class Factor:
    """One adjustment factor: symbol, value, the design values it multiplies, why."""

    symbol: str
    name: str
    value: float
    applies_to: tuple[str, ...]
    note: str = ""


# NDS 2.3.2 / Table 2.3.2 (from memory). Applies to Fb, Ft, Fv, Fc (not Fc_perp, E, Emin).
LOAD_DURATION = {
    "permanent": 0.9,
    "ten years": 1.0,       # occupancy live load ("normal")
    "two months": 1.15,     # snow
    "seven days": 1.25,     # construction
    "ten minutes": 1.6,     # wind, earthquake
    "impact": 2.0,
}


def load_duration_factor(duration: str, where: str | None = None) -> Factor:
    """CD for a named load duration (NDS Table 2.3.2, from memory)."""
    key = str(duration).strip().lower()
    if key not in LOAD_DURATION:
        raise InputError(f"load duration {duration!r} unknown; expected one of "
                         + ", ".join(LOAD_DURATION), where)
    return Factor("CD", "load duration", LOAD_DURATION[key], ("Fb", "Ft", "Fv", "Fc"),
                  f"{key} (NDS Table 2.3.2, from memory)")


def wet_service_factors(ref: DesignValues, CF_Fb: float = 1.0, CF_Fc: float = 1.0) -> list[Factor]:
    """CM for moisture content above 19 % in service.

    Dimension lumber (NDS Supplement Tables 4A/4B footnotes, from memory):
    Fb 0.85 (1.0 when Fb CF <= 1150 psi), Ft 1.0, Fv 0.97, Fc_perp 0.67,
    Fc 0.8 (1.0 when Fc CF <= 750 psi), E and Emin 0.9. Posts and timbers
    (Table 4D): Fc_perp 0.67, Fc 0.91, others 1.0. Southern pine timbers are
    tabulated for wet service already; round poles/piles: 1.0 (NDS 6.3).
    """
    src = "NDS Supplement wet service factor (from memory)"
    if ref.size_class == "pole":
        return [Factor("CM", "wet service", 1.0, PROPS, "round poles/piles: 1.0 (NDS 6.3)")]
    if ref.size_class == "timbers":
        if ref.species == "southern pine":
            return [Factor("CM", "wet service", 1.0, PROPS,
                           "southern pine timbers tabulated for wet use")]
        return [Factor("CM", "wet service", 0.67, ("Fc_perp",), src),
                Factor("CM", "wet service", 0.91, ("Fc",), src)]
    fb = 1.0 if ref.Fb * CF_Fb <= 1150 * PSI else 0.85
    fc = 1.0 if ref.Fc * CF_Fc <= 750 * PSI else 0.8
    return [Factor("CM", "wet service", fb, ("Fb",), src),
            Factor("CM", "wet service", 0.97, ("Fv",), src),
            Factor("CM", "wet service", 0.67, ("Fc_perp",), src),
            Factor("CM", "wet service", fc, ("Fc",), src),
            Factor("CM", "wet service", 0.9, ("E", "Emin"), src)]


# NDS Supplement Table 4A size factor CF (from memory): nominal width ->
# (Fb for 2-3 in thick, Fb for 4 in thick, Ft, Fc).
_CF_TABLE_4A = {
    2: (1.5, 1.5, 1.5, 1.15), 3: (1.5, 1.5, 1.5, 1.15), 4: (1.5, 1.5, 1.5, 1.15),
    5: (1.4, 1.4, 1.4, 1.1), 6: (1.3, 1.3, 1.3, 1.1), 8: (1.2, 1.3, 1.2, 1.05),
    10: (1.1, 1.2, 1.1, 1.0), 12: (1.0, 1.1, 1.0, 1.0), 14: (0.9, 1.0, 0.9, 0.9),
}


def size_factors(ref: DesignValues, size: DressedSize | None) -> list[Factor]:
    """CF for the member size.

    Dimension lumber: NDS Supplement Table 4A (from memory); southern pine
    (Table 4B) has the size effect in its tabulated values except 4 in thick
    8 in and wider (Fb x 1.1) and wider than 12 in (Fb, Ft, Fc x 0.9).
    Timbers: CF = (12/d)^(1/9) on Fb for depth d > 12 in (NDS 4.3.6.2).
    """
    if size is None or ref.size_class == "pole":
        return [Factor("CF", "size", 1.0, ("Fb", "Ft", "Fc"), "not applied")]
    wn = size.nominal_width or max(2, round(size.width / INCH + 0.5))
    tn = size.nominal_thickness or round(size.thickness / INCH + 0.5)
    if ref.size_class == "timbers":
        d = size.width / INCH
        cf = (12.0 / d) ** (1.0 / 9.0) if d > 12.0 else 1.0
        return [Factor("CF", "size", cf, ("Fb",), "(12/d)^(1/9) for d > 12 in (NDS 4.3.6.2)")]
    if ref.size_factor_included:
        fb = 1.1 if (tn >= 4 and wn >= 8) else 1.0
        other = 0.9 if wn > 12 else 1.0
        note = "southern pine: size effect in tabulated values (NDS Supplement Table 4B, from memory)"
        return [Factor("CF", "size", fb * other, ("Fb",), note),
                Factor("CF", "size", other, ("Ft", "Fc"), note)]
    row = _CF_TABLE_4A[min(max(k for k in _CF_TABLE_4A if k <= max(wn, 2)), 14)]
    fb = row[1] if tn >= 4 else row[0]
    note = f"NDS Supplement Table 4A, {tn}x{wn} nominal (from memory)"
    return [Factor("CF", "size", fb, ("Fb",), note), Factor("CF", "size", row[2], ("Ft",), note),
            Factor("CF", "size", row[3], ("Fc",), note)]


def flat_use_factor(ref: DesignValues, size: DressedSize | None) -> Factor:
    """Cfu for dimension lumber bent flatwise (about its weak axis).

    NDS Supplement Table 4A (from memory): 2-3 in thick: 1.0 for widths 2-3 in,
    1.1 for 4-5 in, 1.15 for 6-8 in, 1.2 for 10 in and wider; 4 in thick: 1.0,
    1.05, 1.05, 1.1.
    """
    if size is None or ref.size_class != "dimension":
        return Factor("Cfu", "flat use", 1.0, ("Fb",), "not dimension lumber")
    wn = size.nominal_width or round(size.width / INCH + 0.5)
    tn = size.nominal_thickness or round(size.thickness / INCH + 0.5)
    thin = tn < 4
    if wn <= 3:
        v = 1.0
    elif wn <= 5:
        v = 1.1 if thin else (1.0 if wn == 4 else 1.05)
    elif wn <= 8:
        v = 1.15 if thin else 1.05
    else:
        v = 1.2 if thin else 1.1
    return Factor("Cfu", "flat use", v, ("Fb",), "NDS Supplement Table 4A (from memory)")


#: NDS 2018 Table 6.3.5 condition treatment factor Cct of round timber piles (from memory)
CONDITION_TREATMENT = {"untreated": 1.0, "air-dried": 0.95, "kiln-dried": 0.90,
                       "boulton": 0.95, "steamed": 0.80, "steamed-marine": 0.74}
#: conditioning taken when the scenario does not say: the lowest land value, steaming
#: (southern pine piles are commonly steam conditioned; our judgement, on the safe side)
DEFAULT_CONDITIONING = "steamed"
POLE_SIZE_REFERENCE = 13.5 * INCH  # NDS 6.3.8 (from memory)


def pole_factors(diameter: float | None, conditioning: str | None) -> list[Factor]:
    """Cct (NDS 6.3.5) on Fb, Fv, Fc and the size factor CF = (13.5 in / d)^(1/9) on Fb for a
    round pole over 13.5 in at the section checked (NDS 6.3.8), both from memory."""
    key = conditioning or DEFAULT_CONDITIONING
    if key not in CONDITION_TREATMENT:
        raise InputError(f"conditioning {conditioning!r} unknown; expected one of "
                         + ", ".join(CONDITION_TREATMENT))
    note = f"{key}{'' if conditioning else ' (not given: the safe-side default)'}, NDS Table 6.3.5"
    out = [Factor("Cct", "condition treatment", CONDITION_TREATMENT[key], ("Fb", "Fv", "Fc"),
                  note + " (from memory)")]
    if diameter is not None and diameter > POLE_SIZE_REFERENCE:
        out.append(Factor("CF", "size (round pole)", (POLE_SIZE_REFERENCE / diameter) ** (1 / 9),
                          ("Fb",), "d > 13.5 in, NDS 6.3.8 (from memory)"))
    return out


def incising_factor(incised: bool) -> list[Factor]:
    """Ci for incised dimension lumber (NDS 4.3.8, from memory): 0.95 on E, Emin; 0.8 on Fb, Ft, Fc, Fv."""
    if not incised:
        return [Factor("Ci", "incising", 1.0, PROPS, "not incised")]
    src = "NDS Table 4.3.8 (from memory)"
    return [Factor("Ci", "incising", 0.95, ("E", "Emin"), src),
            Factor("Ci", "incising", 0.8, ("Fb", "Ft", "Fc", "Fv"), src)]


def repetitive_member_factor() -> Factor:
    """Cr is not used: posts and plies here are not repetitive members sharing load."""
    return Factor("Cr", "repetitive member", 1.0, ("Fb",),
                  "off: a post is not one of three or more members at 24 in spacing (NDS 4.3.9)")


@dataclass(frozen=True)
class AdjustedValues:
    """Adjusted allowable values (Pa) and the factors that made them.

    ``Fb_star`` is Fb' before the beam stability factor CL and ``Fc_star``
    is Fc' before the column stability factor CP; apply those with
    :func:`beam_stability_factor` and :func:`column_stability_factor`.
    """

    reference: DesignValues
    factors: tuple[Factor, ...]
    values: dict[str, float] = field(default_factory=dict)

    def __getitem__(self, prop: str) -> float:
        return self.values[prop]

    def product(self, prop: str, exclude: tuple[str, ...] = ()) -> float:
        """Product of the factors applying to ``prop``, skipping some symbols."""
        p = 1.0
        for f in self.factors:
            if prop in f.applies_to and f.symbol not in exclude:
                p *= f.value
        return p

    def rows(self) -> list[dict]:
        """Factor table for reports: symbol, name, value, applies_to, note."""
        return [dict(symbol=f.symbol, name=f.name, value=f.value,
                     applies_to=list(f.applies_to), note=f.note) for f in self.factors]


def adjusted_values(ref: DesignValues, size: DressedSize | None = None, *,
                    duration: str = "ten minutes", wet: bool = False,
                    incised: bool = False, flatwise: bool = False,
                    pole_diameter: float | None = None,
                    conditioning: str | None = None) -> AdjustedValues:
    """Apply CD, CM, CF, Cfu, Ci and Cr (off) to reference values (ASD).

    Parameters
    ----------
    ref
        Reference design values from :mod:`models.catalogs.lumber`.
    size
        Member size, for CF and Cfu.
    duration
        Load duration key of :data:`LOAD_DURATION`; a rider's pull is short,
        default "ten minutes" (user may choose another).
    wet
        In-service moisture above 19 % (ground contact posts: usually True).
    incised
        Preservative-treated incised lumber.
    flatwise
        Bending about the weak axis (dimension lumber flat-use factor).
    pole_diameter, conditioning
        Round poles (reference ``size_class`` "pole"): the largest diameter checked and
        the conditioning before treatment, for Cct and the pole size factor
        (:func:`pole_factors`).
    """
    cf = size_factors(ref, size)
    cf_fb = math.prod(f.value for f in cf if "Fb" in f.applies_to)
    cf_fc = math.prod(f.value for f in cf if "Fc" in f.applies_to)
    factors: list[Factor] = [load_duration_factor(duration)]
    if wet:
        factors += wet_service_factors(ref, cf_fb, cf_fc)
    else:
        factors.append(Factor("CM", "wet service", 1.0, PROPS, "dry service"))
    factors += cf
    if flatwise:
        factors.append(flat_use_factor(ref, size))
    if ref.size_class == "pole":
        factors += pole_factors(pole_diameter, conditioning)
    factors += incising_factor(incised)
    factors.append(repetitive_member_factor())
    adj = AdjustedValues(ref, tuple(factors))
    for p in PROPS:
        adj.values[p] = getattr(ref, p) * adj.product(p)
    adj.values["Fb_star"] = adj.values["Fb"]
    adj.values["Fc_star"] = adj.values["Fc"]
    return adj


# ------------------------------------------------------------------ stability
# NDS Table 3.3.3 effective length le for bending members, lu/d < 7 and >= 7.
_LE_BENDING = {
    "cantilever point load": ((1.87, 0.0), (1.44, 3.0)),
    "cantilever uniform": ((1.33, 0.0), (0.90, 3.0)),
    "simple span point load": ((1.80, 0.0), (1.37, 3.0)),
    "simple span uniform": ((2.06, 0.0), (1.63, 3.0)),
}


def bending_effective_length(lu: float, d: float, case: str = "cantilever point load") -> float:
    """Effective unbraced length le for beam stability (NDS Table 3.3.3, from memory).

    ``le = a lu + b d`` with (a, b) depending on the loading and on lu/d < 7.
    Unknown case: the table's "any" row (2.06 lu; 1.63 lu + 3 d; 1.84 lu for lu/d > 14.3).
    """
    r = lu / d
    if case not in _LE_BENDING:
        if r < 7:
            return 2.06 * lu
        return 1.63 * lu + 3 * d if r <= 14.3 else 1.84 * lu
    a, b = _LE_BENDING[case][0 if r < 7 else 1]
    return a * lu + b * d


def _stability(ratio: float, c: float) -> float:
    """Smaller root of c x^2 - (1 + ratio) x + ratio = 0 (the NDS stability curve)."""
    h = (1.0 + ratio) / (2.0 * c)
    return h - math.sqrt(max(h * h - ratio / c, 0.0))


def beam_stability_factor(Fb_star: float, Emin_adj: float, le: float, d: float, b: float) -> Factor:
    """CL (NDS 3.3.3): RB = sqrt(le d / b^2), FbE = 1.20 Emin'/RB^2.

    ``d`` is the depth in the plane of bending and ``b`` the breadth; when
    d <= b the member cannot buckle laterally and CL = 1.
    """
    if d <= b:
        return Factor("CL", "beam stability", 1.0, ("Fb",), "d <= b: no lateral buckling (NDS 4.4.1)")
    RB = math.sqrt(le * d / b**2)
    FbE = 1.20 * Emin_adj / RB**2
    note = f"RB = {RB:.1f}, FbE = {FbE / PSI:.0f} psi (NDS 3.3.3)"
    if RB > 50:
        note += "; RB exceeds 50, not permitted (NDS 3.3.3.7)"
    return Factor("CL", "beam stability", _stability(FbE / Fb_star, 0.95), ("Fb",), note)


def column_buckling_stress(Emin_adj: float, le_over_d: float) -> float:
    """FcE = 0.822 Emin' / (le/d)^2 (NDS 3.7.1)."""
    return 0.822 * Emin_adj / le_over_d**2


def column_stability_factor(Fc_star: float, Emin_adj: float, le_over_d: float,
                            c: float = 0.8, Kf: float = 1.0) -> Factor:
    """CP (NDS 3.7.1): CP = (1+a)/(2c) - sqrt(((1+a)/(2c))^2 - a/c), a = FcE/Fc*.

    ``c`` is 0.8 for sawn lumber, 0.85 round poles, 0.9 glulam. ``Kf``
    (NDS 15.3) is 0.6 for nailed and 0.75 for bolted built-up columns buckling
    about the axis parallel to the ply faces, 1.0 otherwise.
    """
    FcE = column_buckling_stress(Emin_adj, le_over_d)
    note = f"le/d = {le_over_d:.1f}, FcE = {FcE / PSI:.0f} psi, c = {c} (NDS 3.7.1)"
    if Kf != 1.0:
        note += f", Kf = {Kf} (NDS 15.3)"
    if le_over_d > 50:
        note += "; le/d exceeds 50, not permitted (NDS 3.7.1.4)"
    return Factor("CP", "column stability", Kf * _stability(FcE / Fc_star, c), ("Fc",), note)


# ---------------------------------------------------------------- interaction
@dataclass(frozen=True)
class Interaction:
    """Combined-stress check: ``value`` <= 1 passes; ``terms`` for the report."""

    value: float | np.ndarray
    terms: dict
    clause: str

    @property
    def ok(self) -> bool:
        return bool(np.all(np.asarray(self.value) <= 1.0))


def bending_compression(fc, fb1, fb2, Fc_adj: float, Fb1_adj: float, Fb2_adj: float,
                        FcE1: float, FcE2: float, FbE: float = math.inf) -> Interaction:
    """NDS 3.9.2 (Eq. 3.9-3), compression with bending about both axes.

    (fc/Fc')^2 + fb1/(Fb1'(1 - fc/FcE1)) + fb2/(Fb2'(1 - fc/FcE2 - (fb1/FbE)^2)) <= 1,
    with axis 1 the edgewise (strong) and 2 the flatwise axis; fc < FcE1,
    fc < FcE2 and fb1 < FbE are required, otherwise the value is infinite.
    Stresses are magnitudes (Pa), scalars or arrays. Fc' includes CP.
    """
    fc, fb1, fb2 = (np.abs(np.asarray(v, float)) for v in (fc, fb1, fb2))
    t0 = (fc / Fc_adj) ** 2
    d1 = 1.0 - fc / FcE1
    d2 = 1.0 - fc / FcE2 - (fb1 / FbE) ** 2
    with np.errstate(divide="ignore", invalid="ignore"):
        t1 = np.where(d1 > 0, fb1 / (Fb1_adj * d1), np.inf)
        t2 = np.where(d2 > 0, fb2 / (Fb2_adj * d2), np.inf)
    value = t0 + t1 + t2
    if value.ndim == 0:
        value, t0, t1, t2 = float(value), float(t0), float(t1), float(t2)
    return Interaction(value, {"axial": t0, "bending 1": t1, "bending 2": t2}, "NDS 3.9.2")


def bending_tension(ft: float, fb: float, Ft_adj: float, Fb_star: float,
                    Fb_star2: float | None = None) -> Interaction:
    """NDS 3.9.1: ft/Ft' + fb/Fb* <= 1 and (fb - ft)/Fb** <= 1.

    ``Fb_star`` is Fb' without CL; ``Fb_star2`` is Fb' without CV (defaults to
    ``Fb_star``). ``fb`` is the total bending stress magnitude at the fibre.
    """
    ft, fb = abs(ft), abs(fb)
    a = ft / Ft_adj + fb / Fb_star if Ft_adj > 0 else math.inf
    b = max(fb - ft, 0.0) / (Fb_star2 if Fb_star2 is not None else Fb_star)
    return Interaction(max(a, b), {"tension + bending": a, "net compression": b}, "NDS 3.9.1")
