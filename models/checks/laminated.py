"""Code checks of a laminated post: ply stresses (NDS) and fastener forces.

Ply checks use the extreme-fibre stresses from the model in the NDS
combined-stress equations with adjusted allowable values; every factor is
listed with the check. Fastener checks compare the largest force per
fastener with the adjusted lateral design value Z'.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

import math

from spanstay.fem import State
from spanstay.models.catalogs.fasteners import lateral_factors
from spanstay.models.checks.check import RIDER_DURATION, Check
from spanstay.models.checks.posts import adjusted_outdoor, combined_ratio, section_ends
from spanstay.models.parts.laminated import LaminatedPost
from spanstay.models.parts.laminated_results import LaminatedResults, laminated_results
from spanstay.models.catalogs.nds import (Factor, adjusted_values, beam_stability_factor, bending_compression,
                        bending_effective_length, column_buckling_stress,
                        column_stability_factor)

#: NDS Appendix G, recommended buckling length coefficient Ke for a post fixed at the
#: base and free at the top (from memory).
KE_CANTILEVER = 2.1
#: NDS 15.3.2: Kf for built-up columns buckling across the ply faces (from memory).
KF_BUILT_UP = {"nail": 0.6, "screw": 0.6, "bolt": 0.75}


@dataclass(frozen=True)
class LaminatedCheck:
    """One check: demand against capacity (SI), utilization = demand / capacity.

    For combined-stress checks demand is the interaction value and capacity 1.
    ``factors`` lists the adjustment factors used (symbol, name, value, applies_to, note).
    """

    part: str
    check: str
    demand: float
    capacity: float
    unit: str
    height: float
    clause: str
    factors: tuple[dict, ...]
    note: str = ""

    @property
    def utilization(self) -> float:
        return self.demand / self.capacity if self.capacity > 0 else float("inf")

    @property
    def passes(self) -> bool:
        return self.utilization <= 1.0


def _rows(factors) -> tuple[dict, ...]:
    return tuple(dict(symbol=f.symbol, name=f.name, value=f.value, applies_to=list(f.applies_to),
                      note=f.note) for f in factors)


def check_laminated(post: LaminatedPost, res: LaminatedResults, *, le: float | None = None,
                    duration: str = "ten years", wet: bool = True,
                    incised: bool = False) -> list[LaminatedCheck]:
    """Ply strength, post stability, ply shear and fastener checks of a laminated post.

    Parameters
    ----------
    post, res
        The post and its results for one solved state.
    le
        Effective column length (m) for CP, FcE and CL; default Ke L with
        Ke = 2.1 (NDS Appendix G, cantilever) and L the post length.
    duration
        NDS load duration (:data:`models.catalogs.nds.LOAD_DURATION`), default
        "ten years" (normal, CD = 1.0).
    wet
        Wet service (outdoor posts): default True.
    incised
        Incised preservative-treated lumber.

    Notes
    -----
    Ply strength (each ply, each level): its own axial stress (including the
    couple force of composite action) with its bending stresses, NDS 3.9.1 in
    net tension, NDS 3.9.2 without stability terms (CP = CL = 1) in
    compression. Post stability (each level): NDS 3.9.2 for the built-up
    column with the post's mean axial stress, CP with Kf (NDS 15.3) across
    the ply faces, the worst bending stress along the joints (edgewise) and
    across them (couple part of the ply stress plus flatwise bending,
    compared with Fb without Cfu). The moments come from a second-order
    analysis and NDS 3.9.2 amplifies them again: conservative.
    """
    d = post.design
    L = post.length
    le_note = "" if le is not None else " (Ke 2.1 x post length, NDS Appendix G)"
    le = KE_CANTILEVER * L if le is None else float(le)
    le_note = f"le = {le:.3g} m{le_note}"
    checks: list[LaminatedCheck] = []
    A = np.array([p.area for p in d.plies])[:, None, None]
    t = d.thicknesses[:, None, None]
    w = np.array([p.width for p in d.plies])[:, None, None]
    sig_n = res.N / A                                  # ply axial stress, tension +
    fb_edge = np.abs(res.M_edge) / (t * w**2 / 6)
    fb_flat = np.abs(res.M_flat) / (w * t**2 / 6)
    edge_adj, flat_adj = [], []
    for i, ply in enumerate(d.plies):
        edge = adjusted_values(ply.values, ply.size, duration=duration, wet=wet, incised=incised)
        flat = adjusted_values(ply.values, ply.size, duration=duration, wet=wet, incised=incised,
                               flatwise=True)
        edge_adj.append(edge)
        flat_adj.append(flat)
        cfu = Factor("Cfu", "flat use", flat.product("Fb") / edge.product("Fb"),
                     ("Fb flatwise",), "NDS Supplement Table 4A (from memory)")
        Fb1, Fb2 = edge["Fb_star"], flat["Fb"]
        comp = bending_compression(np.maximum(-sig_n[i], 0.0), fb_edge[i], fb_flat[i],
                                   edge["Fc_star"], Fb1, Fb2, np.inf, np.inf).value
        ft = np.maximum(sig_n[i], 0.0)
        fb = fb_edge[i] + fb_flat[i]
        tens = np.maximum(ft / edge["Ft"] + fb_edge[i] / Fb1 + fb_flat[i] / Fb2,
                          (fb_edge[i] / Fb1 + fb_flat[i] / Fb2) * np.maximum(fb - ft, 0.0)
                          / np.maximum(fb, 1e-300))
        values = np.where(sig_n[i] < 0, comp, tens).ravel()
        k = int(np.argmax(values))
        n_k = float(res.N[i].ravel()[k])
        checks.append(LaminatedCheck(
            f"ply {i + 1}", "strength: axial + bending", float(values[k]), 1.0, "-",
            float(res.heights[i].ravel()[k]), "NDS 3.9.2" if n_k < 0 else "NDS 3.9.1",
            _rows(list(edge.factors) + [cfu]),
            f"N = {n_k:.4g} N, fb edge {fb_edge[i].ravel()[k]:.4g} Pa, "
            f"fb flat {fb_flat[i].ravel()[k]:.4g} Pa"))
        fv = 1.5 * np.maximum(np.abs(res.V_flat[i]), np.abs(res.V_edge[i])).ravel() / ply.area
        k = int(np.argmax(fv))
        checks.append(LaminatedCheck(
            f"ply {i + 1}", "shear", float(fv[k]), float(edge["Fv"]), "Pa",
            float(res.heights[i].ravel()[k]), "NDS 3.4.2 (fv = 1.5 V / A)",
            _rows(f for f in edge.factors if "Fv" in f.applies_to)))
    checks.append(_stability(post, res, sig_n, fb_edge, fb_flat, edge_adj, le, le_note))
    lf = lateral_factors(duration, wet)
    adj = float(np.prod([f.value for f in lf]))
    for j in range(d.n - 1):
        force = res.force_per_fastener[j]
        k = int(np.argmax(force)) if force.size else 0
        Z = d.lateral[j]
        checks.append(LaminatedCheck(
            f"fasteners, plies {j + 1}-{j + 2}", "lateral force per fastener",
            float(force[k]) if force.size else 0.0, Z.Z * adj, "N",
            float(res.fastener_heights[k]) if force.size else 0.0,
            Z.source, _rows(lf),
            f"{d.fastener.name}, governing yield mode {Z.mode}, Z = {Z.Z:.4g} N; "
            f"slip {res.slip_along[j][k] * 1000 if force.size else 0.0:.3g} mm along the post"))
    return checks


def _stability(post, res, sig_n, fb_edge, fb_flat, edge_adj, le, le_note) -> LaminatedCheck:
    """NDS 3.9.2 for the whole built-up post at every level (weakest ply values)."""
    d = post.design
    A = np.array([p.area for p in d.plies])[:, None, None]
    depth_stack = float(d.thicknesses.sum())
    w = min(p.width for p in d.plies)
    mean = res.N.sum(axis=0) / A.sum()                             # post mean axial stress
    fc = np.maximum(-mean, 0.0)                                    # post axial compression
    f_side = fb_edge.max(axis=0)
    f_stack = (np.abs(sig_n - mean[None]) + fb_flat).max(axis=0)   # couple + flatwise bending
    i = int(np.argmin([e["Fc_star"] for e in edge_adj]))
    e = edge_adj[i]
    Emin = min(a["Emin"] for a in edge_adj)
    Fb_star = min(a["Fb_star"] for a in edge_adj)
    kf = KF_BUILT_UP.get(d.fastener.kind, 0.6)
    cp_side = column_stability_factor(e["Fc_star"], Emin, le / w, c=0.8)
    cp_stack = column_stability_factor(e["Fc_star"], Emin, le / depth_stack, c=0.8, Kf=kf)
    cp = min(cp_side, cp_stack, key=lambda f: f.value)
    if w >= depth_stack:
        le_b = bending_effective_length(post.length, w, "cantilever point load")
        cl = beam_stability_factor(Fb_star, Emin, le_b, w, depth_stack)
        FbE = 1.20 * Emin / (le_b * w / depth_stack**2) if w > depth_stack else np.inf
    else:
        cl = beam_stability_factor(Fb_star, Emin, 1.0, w, depth_stack)   # d <= b: CL = 1
        FbE = np.inf
    FcE1 = column_buckling_stress(Emin, le / w)
    FcE2 = column_buckling_stress(Emin, le / depth_stack)
    val = bending_compression(fc, f_side, f_stack, e["Fc_star"] * cp.value, Fb_star * cl.value,
                              Fb_star, FcE1, FcE2, FbE).value.ravel()
    k = int(np.argmax(val))
    return LaminatedCheck(
        "post", "stability: axial + bending (built-up column)", float(val[k]), 1.0, "-",
        float(res.heights[0].ravel()[k]), "NDS 3.9.2, 3.7.1, 15.3", _rows(list(e.factors) + [cp, cl]),
        f"{le_note}; fc = {fc.ravel()[k]:.4g} Pa, fb along joints {f_side.ravel()[k]:.4g} Pa, "
        f"fb across joints {f_stack.ravel()[k]:.4g} Pa (Fb without Cfu); "
        "second-order moments amplified again (conservative)")


def embedded_laminated_checks(system, anchor, state: State, duration: str,
                        cache: dict) -> list[Check]:
    """Embedded length of a laminated post set straight in the soil.

    The model carries it as one solid section; the check takes the plies as
    unconnected below grade (each ply bends about its own axis across the
    stack), the safe side of the composite action the fasteners give.
    """
    lam = anchor.laminated
    design = lam.design
    spec = anchor.spec
    ply = design.plies[0]
    n, t, w = design.n, ply.thickness, ply.width
    stack_along = design.stack_angle_deg == 0
    forces, h = section_ends(system.model, anchor.groups["footing_member"][0], state, spec.grade)
    A = n * t * w
    s_stack = n * w * t**2 / 6.0   # bending across the stack, no composite action
    s_side = n * t * w**2 / 6.0    # plies side by side, each about its strong axis
    # the embedded member's local z lies along the pull (depth "along" of the outline)
    s_y, s_z = (s_stack, s_side) if stack_along else (s_side, s_stack)
    fb_y, fb_z = np.abs(forces[..., 4]) / s_y, np.abs(forces[..., 5]) / s_z
    fb_flat, fb_edge = (fb_y, fb_z) if stack_along else (fb_z, fb_y)
    edge = adjusted_outdoor(ply.values, ply.size, duration)
    flat = adjusted_outdoor(ply.values, ply.size, duration, flatwise=True)
    val = combined_ratio(forces[..., 0] / A, fb_edge, fb_flat, edge["Fc_star"], edge["Fb"], flat["Fb"],
                    edge["Ft"], edge["Fb"], math.inf, math.inf, math.inf).ravel()
    k = int(np.argmax(val))
    return [Check(f"anchor.{spec.name}.post.embedded.stress", "post", spec.name,
                  "laminated post below grade: combined stress, plies taken as unconnected",
                  float(val[k]), 1.0, "ratio",
                  source=f"NDS 2018 3.9.1, 3.9.2 (no buckling in the soil); load duration "
                         f"'{duration}'",
                  note=f"at {h.ravel()[k]:+.2f} m from grade; the model has the embedded "
                       "length as one solid section; this check ignores the fasteners "
                       "(conservative)")]


def laminated_post_checks(anchor, state: State, duration: str = RIDER_DURATION) -> list[Check]:
    """Ply stresses, shear, built-up stability and fastener forces of a laminated post."""
    lam = anchor.laminated
    name = anchor.spec.name
    res = laminated_results(lam, state)
    out = []
    for c in check_laminated(lam, res, duration=duration, wet=True):
        part = c.part.replace(" ", "")
        if c.part.startswith("fasteners"):
            cid = f"anchor.{name}.{part.replace(',', '.')}.force"
            part_name, kind = "fasteners", "force"
        elif c.part == "post":
            cid, part_name, kind = f"anchor.{name}.post.stability", "post", "ratio"
        elif c.check == "shear":
            cid, part_name, kind = f"anchor.{name}.post.{part}.shear", "post", "stress"
        else:
            cid, part_name, kind = f"anchor.{name}.post.{part}.stress", "post", "ratio"
        factor_note = "; ".join(f"{f['symbol']} {f['value']:.3g}" for f in c.factors
                                if f["value"] != 1.0)
        out.append(Check(cid, part_name, name, f"laminated post, {c.part}: {c.check}",
                         c.demand, c.capacity, kind,
                         source=f"{c.clause}; load duration '{duration}'",
                         note=f"at {c.height:.2f} m above grade; {c.note}; "
                              f"{factor_note}".strip("; ")))
    return out
