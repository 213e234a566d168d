"""Code checks of a laminated post: ply stresses (NDS) and fastener forces.

Ply checks use the extreme-fibre stresses from the model in the NDS
combined-stress equations with adjusted allowable values; every factor is
listed with the check. Fastener checks compare the largest force per
fastener with the adjusted lateral design value Z'.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from models.fasteners import lateral_factors
from models.laminated import LaminatedPost
from models.laminated_results import LaminatedResults
from models.nds import (Factor, adjusted_values, beam_stability_factor, bending_compression,
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
    """Ply stress, ply shear and fastener checks of a laminated post.

    Parameters
    ----------
    post, res
        The post and its results for one solved state.
    le
        Effective column length (m) for CP, FcE and CL; default Ke L with
        Ke = 2.1 (NDS Appendix G, cantilever) and L the post length.
    duration
        NDS load duration (:data:`models.nds.LOAD_DURATION`), default
        "ten years" (normal, CD = 1.0).
    wet
        Wet service (outdoor posts): default True.
    incised
        Incised preservative-treated lumber.

    Notes
    -----
    The moments come from a second-order (P-delta) analysis and NDS 3.9.2
    amplifies them again: conservative. Biaxial tension plus bending uses
    ft/Ft' + fb1/Fb1* + fb2/Fb2' (common practice extension of NDS 3.9.1).
    """
    d = post.design
    L = post.length
    le_note = "" if le is not None else " (Ke 2.1 x post length, NDS Appendix G)"
    le = KE_CANTILEVER * L if le is None else float(le)
    le_note = f"le = {le:.3g} m{le_note}"
    checks: list[LaminatedCheck] = []
    depth_stack = float(d.thicknesses.sum())
    for i, ply in enumerate(d.plies):
        edge = adjusted_values(ply.values, ply.size, duration=duration, wet=wet, incised=incised)
        flat = adjusted_values(ply.values, ply.size, duration=duration, wet=wet, incised=incised,
                               flatwise=True)
        Emin = edge["Emin"]
        kf = KF_BUILT_UP.get(d.fastener.kind, 0.6)
        cp_edge = column_stability_factor(edge["Fc_star"], Emin, le / ply.width, c=0.8)
        cp_stack = column_stability_factor(edge["Fc_star"], Emin, le / depth_stack, c=0.8, Kf=kf)
        cp = min(cp_edge, cp_stack, key=lambda f: f.value)
        le_b = bending_effective_length(L, ply.width, "cantilever point load")
        cl = beam_stability_factor(edge["Fb_star"], Emin, le_b, ply.width, depth_stack)
        Fc = edge["Fc_star"] * cp.value
        Fb1 = edge["Fb_star"] * cl.value
        Fb2 = flat["Fb"]
        FcE1 = column_buckling_stress(Emin, le / ply.width)
        FcE2 = column_buckling_stress(Emin, le / depth_stack)
        FbE = 1.20 * Emin / (le_b * ply.width / depth_stack**2) if ply.width > depth_stack else np.inf
        A = ply.area
        N = res.N[i].ravel()
        fb1 = np.abs(res.M_edge[i].ravel()) / (ply.thickness * ply.width**2 / 6)
        fb2 = np.abs(res.M_flat[i].ravel()) / (ply.width * ply.thickness**2 / 6)
        comp = bending_compression(np.maximum(-N, 0.0) / A, fb1, fb2, Fc, Fb1, Fb2,
                                   FcE1, FcE2, FbE).value
        ft = np.maximum(N, 0.0) / A
        fb = fb1 + fb2
        tens = np.maximum(ft / edge["Ft"] + fb1 / edge["Fb_star"] + fb2 / Fb2,
                          (fb1 / Fb1 + fb2 / Fb2) * np.maximum(fb - ft, 0.0) / np.maximum(fb, 1e-300))
        values = np.where(N < 0, comp, tens)
        k = int(np.argmax(values))
        factors = list(edge.factors) + [Factor("Cfu", "flat use", flat.product("Fb") /
                                               edge.product("Fb"), ("Fb flatwise",),
                                               "NDS Supplement Table 4A (from memory)"), cp, cl]
        checks.append(LaminatedCheck(
            f"ply {i + 1}", "axial + bending, both axes", float(values[k]), 1.0, "-",
            float(res.heights[i].ravel()[k]),
            "NDS 3.9.2" if N[k] < 0 else "NDS 3.9.1", _rows(factors),
            f"{le_note}; N = {N[k]:.4g} N, fb edge {fb1[k]:.4g} Pa, fb flat {fb2[k]:.4g} Pa; "
            "second-order moments amplified again (conservative)"))
        fv = 1.5 * np.maximum(np.abs(res.V_flat[i]), np.abs(res.V_edge[i])).ravel() / A
        k = int(np.argmax(fv))
        checks.append(LaminatedCheck(
            f"ply {i + 1}", "shear", float(fv[k]), float(edge["Fv"]), "Pa",
            float(res.heights[i].ravel()[k]), "NDS 3.4.2 (fv = 1.5 V / A)",
            _rows(f for f in edge.factors if "Fv" in f.applies_to)))
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
