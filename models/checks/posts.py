"""NDS checks of sawn and round posts: combined axial and bending stress (with column and
beam stability) and shear, above grade and in the embedded length."""
from __future__ import annotations

import math

import numpy as np

from spanstay.fem import State
from spanstay.models.catalogs import lumber
from spanstay.models.catalogs.nds import (AdjustedValues, adjusted_values, beam_stability_factor,
                                         bending_effective_length, column_buckling_stress,
                                         column_stability_factor)
from spanstay.models.checks.check import RIDER_DURATION, Check
from spanstay.models.parts.system import System

#: NDS Appendix G buckling length coefficient, post fixed at the base and free at the
#: top (from memory); conservative for guyed posts.
KE_CANTILEVER = 2.1
#: Net axial tension below this fraction of Fc' is taken as round-off where no Ft is
#: tabulated (round poles).
NO_FT_TOLERANCE = 1e-6
#: Stand-in Ft'/Fb' for round poles, which have no tabulated Ft: a judgement of ours, below
#: the ratio of the tabulated values of No. 2 sawn lumber (about 0.6).
POLE_FT_OVER_FB = 0.5


def _timber(anchor, cache: dict) -> tuple | None:
    """(reference values, size or None, shape) of a sawn or round post, or None."""
    key = ("timber", anchor.spec.name)
    if key in cache:
        return cache[key]
    post = anchor.spec.post
    info = anchor.post_section or {}
    ref = info.get("ref")
    out = None
    if ref is not None:
        ov = post.overrides
        vals = {n: getattr(ov, n) for n in lumber.STRESS_NAMES if getattr(ov, n) is not None}
        if vals:
            ref = ref.with_overrides(**vals)
        size = None
        if post.kind == "sawn":
            sec = post.section
            size = (lumber.parse_size(sec.nominal) if sec.nominal
                    else lumber.custom_size(sec.width, sec.depth))
        out = (ref, size, post.kind)
    cache[key] = out
    return out


def adjusted_outdoor(ref, size, duration: str, flatwise: bool = False, post=None
                     ) -> AdjustedValues:
    """NDS adjusted values of an outdoor post: wet service (CM), CD, CF (and Cfu); Ci of an
    incised post; Cct and the pole size factor of a round pole (its base diameter)."""
    extra = {}
    if post is not None:
        extra = dict(incised=bool(getattr(post, "incised", False)),
                     conditioning=getattr(post, "conditioning", None),
                     pole_diameter=getattr(post, "base_diameter", None))
    return adjusted_values(ref, size, duration=duration, wet=True, flatwise=flatwise, **extra)


def section_ends(model, group: str, state: State, base_z: float):
    """Section forces (ne, 2, 6) and heights (ne, 2) above grade of a beam group."""
    g = model.group(group)
    forces = np.asarray(state.group(group).end_forces, float)
    heights = model.coords[g.conn][:, :, 2] - base_z
    return forces, heights


def _rect_stresses(forces, b, d):
    """Axial (tension +), bending about local y (depth d along local z) and about local z,
    and largest shear stress of a b x d rectangle."""
    A = b * d
    N = forces[..., 0]
    fb_y = np.abs(forces[..., 4]) / (b * d**2 / 6.0)
    fb_z = np.abs(forces[..., 5]) / (d * b**2 / 6.0)
    fv = 1.5 * np.hypot(forces[..., 1], forces[..., 2]) / A  # at the centroid
    return N / A, fb_y, fb_z, fv


def combined_ratio(f_axial, fb1, fb2, Fc, Fb1, Fb2, Ft, Fb1_star, FcE1, FcE2, FbE):
    """NDS 3.9.2 in compression, 3.9.1 in tension; arrays of stresses (Pa)."""
    fc = np.maximum(-f_axial, 0.0)
    ft = np.maximum(f_axial, 0.0)
    with np.errstate(divide="ignore", invalid="ignore"):
        d1 = 1.0 - fc / FcE1
        d2 = 1.0 - fc / FcE2 - (fb1 / FbE) ** 2
        comp = ((fc / Fc) ** 2 + np.where(d1 > 0, fb1 / (Fb1 * d1), np.inf)
                + np.where(d2 > 0, fb2 / (Fb2 * d2), np.inf))
        # round poles have no tabulated Ft: a real net tension fails the check, round-off
        # (below NO_FT_TOLERANCE x Fc') is ignored
        a = (np.where(ft > 0, ft / Ft, 0.0) if Ft > 0
             else np.where(ft > NO_FT_TOLERANCE * Fc, np.inf, 0.0)) + fb1 / Fb1_star + fb2 / Fb2
        fb = fb1 + fb2
        b = (fb1 / Fb1 + fb2 / Fb2) * np.maximum(fb - ft, 0.0) / np.maximum(fb, 1e-300)
    tens = np.maximum(a, b)
    return np.where(f_axial < 0, comp, tens)


def solid_post_checks(system: System, anchor, state: State, duration: str = RIDER_DURATION,
                      cache: dict | None = None) -> list[Check]:
    """NDS combined stress and shear of a sawn or round post (above grade and, for a
    post set straight in the soil, below grade)."""
    cache = {} if cache is None else cache
    timber = _timber(anchor, cache)
    if timber is None:
        return []
    ref, size, kind = timber
    spec, post = anchor.spec, anchor.spec.post
    model = system.model
    info = anchor.post_section
    L = post.height
    le = KE_CANTILEVER * L
    edge = adjusted_outdoor(ref, size, duration, post=post)
    flat = adjusted_outdoor(ref, size, duration, flatwise=True, post=post)
    Emin = edge["Emin"]
    parts = [(anchor.groups["post"][0], True)]
    if spec.footing is not None and spec.footing.kind == "embedded":
        parts.append((anchor.groups["footing_member"][0], False))
    values, shears, heights = [], [], []
    factors, extra_note = None, ""
    for group, above in parts:
        forces, h = section_ends(model, group, state, spec.grade)
        if kind == "round":
            dia = (np.asarray(info["diameter"], float) if above
                   else np.full(forces.shape[0], post.base_diameter))[:, None]
            A = math.pi * dia**2 / 4.0
            fa = forces[..., 0] / A
            fb = np.hypot(forces[..., 4], forces[..., 5]) / (math.pi * dia**3 / 32.0)
            fv = 4.0 / 3.0 * np.hypot(forces[..., 1], forces[..., 2]) / A  # solid circle
            # NDS: a round column as the square of equal area (from memory), at the smallest
            # diameter of a tapered pole (on the safe side)
            d_eq = math.sqrt(math.pi) / 2.0 * float(np.min(dia))
            if above:
                cp = column_stability_factor(edge["Fc_star"], Emin, le / d_eq, c=0.85)
                FcE = column_buckling_stress(Emin, le / d_eq)
            else:
                cp, FcE = None, math.inf
            Fc = edge["Fc_star"] * (cp.value if cp else 1.0)
            Ft = edge["Ft"] if edge["Ft"] > 0 else POLE_FT_OVER_FB * edge["Fb"]
            val = combined_ratio(fa, fb, 0.0 * fb, Fc, edge["Fb"], edge["Fb"], Ft, edge["Fb"],
                            FcE, FcE, math.inf)
            if edge["Ft"] <= 0:
                extra_note = (f"; no Ft tabulated for poles: Ft' taken as {POLE_FT_OVER_FB:g} "
                              "Fb' (a judgement) where the pole is in net tension")
            if above:
                extra_note += (f"; le/d with d = {d_eq:.3g} m, the side of the square of equal "
                               "area at the smallest diameter")
            factors = list(edge.factors) + ([cp] if cp else [])
        else:
            b, d = post.section.width, post.section.depth
            fa, fb_y, fb_z, fv = _rect_stresses(forces, b, d)
            strong_y = d >= b
            fb1, fb2 = (fb_y, fb_z) if strong_y else (fb_z, fb_y)
            d1, d2 = (d, b) if strong_y else (b, d)
            Fb2 = flat["Fb"] if (ref.size_class == "dimension" and d1 > d2) else edge["Fb"]
            if above:
                cp = column_stability_factor(edge["Fc_star"], Emin, le / d2, c=0.8)
                le_b = bending_effective_length(L, d1, "cantilever point load")
                cl = beam_stability_factor(edge["Fb_star"], Emin, le_b, d1, d2)
                FcE1, FcE2 = (column_buckling_stress(Emin, le / d1),
                              column_buckling_stress(Emin, le / d2))
                FbE = 1.20 * Emin / (le_b * d1 / d2**2) if d1 > d2 else math.inf
                factors = list(edge.factors) + [cp, cl]
            else:
                cp = cl = None
                FcE1 = FcE2 = FbE = math.inf
            val = combined_ratio(fa, fb1, fb2, edge["Fc_star"] * (cp.value if cp else 1.0),
                            edge["Fb_star"] * (cl.value if cl else 1.0), Fb2, edge["Ft"],
                            edge["Fb_star"], FcE1, FcE2, FbE)
        values.append(val.ravel())
        shears.append(fv.ravel())
        heights.append(h.ravel())
    val, fv, hh = np.concatenate(values), np.concatenate(shears), np.concatenate(heights)
    k, j = int(np.argmax(val)), int(np.argmax(fv))
    name = spec.name
    shape = "round pole" if kind == "round" else f"{post.section.nominal or 'sawn'} post"
    le_note = f"le = {le:.3g} m (Ke {KE_CANTILEVER} x height, NDS Appendix G, from memory)"
    factor_note = "; ".join(f"{f.symbol} {f.value:.3g} on {'/'.join(f.applies_to)}"
                            for f in factors if f.value != 1.0)
    factor_note += "".join(f"; {f.symbol}: {f.note}" for f in factors
                           if f.symbol in ("CP", "CL") and f.value != 1.0) + extra_note
    return [
        Check(f"anchor.{name}.post.stress", "post", name,
              f"{shape}: combined axial and bending stress (NDS interaction)",
              float(val[k]), 1.0, "ratio",
              source="NDS 2018 3.9.1 (tension + bending), 3.9.2 (compression + bending), "
                     "3.7.1 (CP), 3.3.3 (CL); load duration "
                     f"'{duration}' (a judgement of ours)",
              note=f"at {hh[k]:+.2f} m from grade (negative: embedded); {le_note}; wet service; "
                   f"{factor_note}; {ref.source}"),
        Check(f"anchor.{name}.post.shear", "post", name,
              f"{shape}: shear stress against Fv'", float(fv[j]), float(edge["Fv"]), "stress",
              source="NDS 2018 3.4.2 (fv = 1.5 V/A rectangle, 4/3 V/A circle)",
              note=f"at {hh[j]:+.2f} m from grade; Fv' = Fv x CD x CM; {ref.source}"),
    ]
