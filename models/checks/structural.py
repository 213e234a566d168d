"""Structural checks of a solved design pass: demand, capacity, utilization.

``structural_checks(system, design)`` evaluates every part of the structure
in every station state of the design pass (heaviest rider x dynamic factor,
coldest temperature) and keeps, for each check, the worst station:

- cable: largest segment tension against breaking strength / factor of safety;
- end terminations: end tension against breaking strength x efficiency / FoS;
- sawn and round posts: NDS combined stresses (3.9.1, 3.9.2) and shear above
  grade, and in the embedded length of a post set straight in the soil;
- laminated posts: :func:`models.checks.laminated.check_laminated`;
- soil: largest p/p_u, ground-line tilt, IBC 2021 Eq. 18-1 (18-2) embedment,
  ground-line motion when IBC §1806.3.4 doubling is used;
- anchor deflection at the line attachment;
- guys, braces and trees: :mod:`models.checks.anchors` (guy and brace-wire
  tension, ground-anchor pull, struts, rails, bearing, root plate, stem).

Load duration (NDS 2.3.2): the rider's pull lasts seconds per ride but recurs
thousands of times over the life of a line; its accumulated duration is not
known, so it is taken as normal ("ten years", CD = 1.0), a judgement that is
on the safe side of "ten minutes" (1.6) and of "impact" (2.0), which would
also count the dynamic factor twice. The installed pull (pretension and self
weight) is permanent: when the installed state is given it is checked with
CD = 0.9.
"""
from __future__ import annotations

import math
import re
from dataclasses import asdict, dataclass, field, replace

import numpy as np

from spanstay.fem import State
from spanstay.models.catalogs import lumber
from spanstay.models.catalogs.nds import (AdjustedValues, adjusted_values, beam_stability_factor,
                        bending_effective_length, column_buckling_stress,
                        column_stability_factor)
from spanstay.models.common.json_safe import json_safe
from spanstay.models.scenario.spec import DEFAULT_FACTOR_OF_SAFETY
from spanstay.models.parts.system import System

#: NDS load duration of the rider's pull (see the module docstring): a judgement.
RIDER_DURATION = "ten years"
#: NDS load duration of the installed (pretension, self-weight) state.
PERMANENT_DURATION = "permanent"
#: Ground-line tilt limit, rad: 1 degree, a judgement of ours (a post leaning more
#: than this is visibly out of plumb and its footing is yielding).
TILT_LIMIT = math.radians(1.0)
#: Horizontal motion at grade accepted by IBC 2021 §1806.3.4 for doubled lateral bearing.
IBC_DOUBLED_MOTION = 0.5 * 0.0254
#: p/p_u from which the soil at a depth is counted as at its limit (reported in notes)
SOIL_AT_LIMIT = 0.95
#: Line attachment deflection limit as a fraction of its height above grade: a judgement.
DEFLECTION_RATIO = 40.0
#: NDS Appendix G buckling length coefficient, post fixed at the base and free at the
#: top (from memory); conservative for guyed posts.
KE_CANTILEVER = 2.1
#: Net axial tension below this fraction of Fc' is taken as round-off where no Ft is
#: tabulated (round poles).
NO_FT_TOLERANCE = 1e-6
#: Stand-in Ft'/Fb' for round poles, which have no tabulated Ft: a judgement of ours, below
#: the ratio of the tabulated values of No. 2 sawn lumber (about 0.6).
POLE_FT_OVER_FB = 0.5


@dataclass
class Check:
    """One check of one part. SI units; ``kind`` says which quantity.

    ``governing`` names the state that gives the largest utilization:
    pass label, rider weight (N), station index, horizontal distance along the
    line (m).
    """

    id: str
    part: str
    where: str
    description: str
    demand: float
    capacity: float
    kind: str
    utilization: float | None = None
    passed: bool | None = None
    governing: dict = field(default_factory=dict)
    source: str = ""
    note: str = ""

    def __post_init__(self) -> None:
        self.demand, self.capacity = float(self.demand), float(self.capacity)
        if self.utilization is None:
            self.utilization = (self.demand / self.capacity if self.capacity > 0
                                else (0.0 if self.demand <= 0 else math.inf))
        if self.passed is None:
            self.passed = bool(self.utilization <= 1.0)

    def to_dict(self) -> dict:
        """Plain JSON-ready dict; NaN and infinities become None."""
        return json_safe(asdict(self))


# ----------------------------------------------------------------------------- driver
def structural_checks(system: System, design, installed: State | None = None) -> list[Check]:
    """Every structural check over the stations of ``design``, worst station kept.

    Parameters
    ----------
    system
        The built system the pass was solved on.
    design
        A :class:`models.analysis.stations.Pass` with ``states`` kept for every station
        (heaviest rider x dynamic factor, coldest temperature).
    installed
        Optional installed state (no rider): timber is then also checked
        under the permanent pull with CD = 0.9.

    Returns
    -------
    list[Check]
        One per check id, in a stable order.
    """
    cases = []
    for i, (state, st) in enumerate(zip(design.states, design.stations)):
        gov = {"pass": design.label, "rider_weight": float(design.weight), "station": i,
               "along": float(st.along)}
        cases.append((state, gov, RIDER_DURATION))
    if installed is not None:
        cases.append((installed, {"pass": "installed", "rider_weight": 0.0, "station": None,
                                  "along": None}, PERMANENT_DURATION))
    worst: dict[str, Check] = {}
    cache: dict = {}
    for state, gov, duration in cases:
        for check in state_checks(system, state, gov, duration, cache):
            old = worst.get(check.id)
            if old is None or _worse(check, old):
                worst[check.id] = check
    return list(worst.values())


def _worse(new: Check, old: Check) -> bool:
    return (new.utilization if math.isfinite(new.utilization) else 1e300) > \
        (old.utilization if math.isfinite(old.utilization) else 1e300)


def state_checks(system: System, state: State, governing: dict, duration: str = RIDER_DURATION,
                 cache: dict | None = None) -> list[Check]:
    """All checks of one solved state (``governing`` is copied into each)."""
    cache = {} if cache is None else cache
    out: list[Check] = []
    for bl in system.lines.values():
        out += line_checks(system, state, bl)
    for anchor in system.anchors.values():
        out += anchor_part_checks(system, state, anchor, duration, cache)
        second = getattr(getattr(anchor, "brace", None), "second", None)
        if second is not None:  # an H-brace's second post: its own post and footing checks
            out += anchor_part_checks(system, state, second, duration, cache)
    out += extra_anchor_checks(system, state)
    for c in out:
        c.governing = dict(governing)
    return out


def extra_anchor_checks(system: System, state: State) -> list[Check]:
    """Guy, brace and tree checks of every anchor, from :mod:`models.checks.anchors`.

    Each ``AnchorCheck`` becomes a :class:`Check` with id
    ``anchor.<name>.<part>.<check>`` (lower case, words joined by "_"); a
    finding (slack guy, pulled-out ground anchor, lifting block) is put in
    front of the note.
    """
    from spanstay.models.checks.anchors import check_anchor, top_soil_class

    fos = float(system.scenario.settings.factor_of_safety)
    soil = top_soil_class(system.scenario.ground)
    out = []
    for anchor in system.anchors.values():
        report = check_anchor(system.model, anchor, state, fos, soil)
        for c in report.checks:
            note = "; ".join(t for t in (f"finding: {c.finding}" if c.finding else "", c.note) if t)
            out.append(Check(f"anchor.{c.anchor}.{_slug(c.part)}.{_slug(c.check)}", c.part,
                             c.anchor, f"{c.part}: {c.check}", c.demand, c.capacity,
                             _KINDS.get(c.unit, c.unit), source=c.source, note=note))
    return out


#: units of models.checks.anchors -> Check kinds
_KINDS = {"N": "force", "Pa": "stress", "m": "length", "rad": "angle", "-": "ratio",
          "N m": "moment"}


def _slug(text: str) -> str:
    return re.sub(r"[^a-z0-9]+", "_", str(text).lower()).strip("_")


# ------------------------------------------------------------------------------ line
def _fos(system: System) -> tuple[float, str]:
    fos = float(system.scenario.settings.factor_of_safety)
    if fos == DEFAULT_FACTOR_OF_SAFETY:
        return fos, ("factor of safety 5 on breaking strength for life-safety rope "
                     "(common practice)")
    return fos, "factor of safety on breaking strength: a design input (settings)"


def line_checks(system: System, state: State, bl) -> list[Check]:
    """Cable tension and both end terminations of one line."""
    spec = bl.spec
    rope = spec.rope
    fos, fos_src = _fos(system)
    t = np.asarray(state.group(bl.group).tension, float)
    k = int(np.argmax(t))
    name = spec.name
    out = [Check(f"line.{name}.tension", "cable", name,
                 f"largest cable tension against breaking strength / {fos:g}",
                 float(t[k]), rope.breaking_strength / fos, "force",
                 source=f"{fos_src}; breaking strength: {rope.source}",
                 note=f"{rope.name}, segment {k + 1} of {t.size}")]
    eff = float(spec.termination_efficiency)
    for anchor, value in ((spec.start, t[0]), (spec.end, t[-1])):
        out.append(Check(
            f"line.{name}.termination.{anchor}", "termination", f"{name} at {anchor}",
            f"end tension against breaking strength x efficiency {eff:g} / {fos:g}",
            float(value), rope.breaking_strength * eff / fos, "force",
            source=f"{fos_src}; termination efficiency: design input (default 0.8, from "
                   "memory, clipped ends)",
            note="use the termination maker's rated efficiency"))
    return out


# ---------------------------------------------------------------------------- anchors
def anchor_part_checks(system: System, state: State, anchor, duration: str = RIDER_DURATION,
                       cache: dict | None = None) -> list[Check]:
    """Post, soil and deflection checks of one anchor in one state (guys, braces and
    trees: :func:`extra_anchor_checks`)."""
    cache = {} if cache is None else cache
    spec = anchor.spec
    out: list[Check] = []
    if spec.kind == "post":
        if anchor.laminated is not None:
            out += laminated_post_checks(anchor, state, duration)
        else:
            out += solid_post_checks(system, anchor, state, duration, cache)
        if (spec.footing is not None and spec.footing.kind == "embedded"
                and anchor.laminated is not None):
            out += _embedded_laminated(system, anchor, state, duration, cache)
    out += soil_checks(system, anchor, state, cache)
    out += deflection_checks(system, anchor, state)
    return out


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


def _adjusted(ref, size, duration: str, flatwise: bool = False) -> AdjustedValues:
    """NDS adjusted values of an outdoor post: wet service (CM), CD, CF (and Cfu)."""
    return adjusted_values(ref, size, duration=duration, wet=True, flatwise=flatwise)


def _ends(model, group: str, state: State, base_z: float):
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


def _combined(f_axial, fb1, fb2, Fc, Fb1, Fb2, Ft, Fb1_star, FcE1, FcE2, FbE):
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
    edge = _adjusted(ref, size, duration)
    flat = _adjusted(ref, size, duration, flatwise=True)
    Emin = edge["Emin"]
    parts = [(anchor.groups["post"][0], True)]
    if spec.footing is not None and spec.footing.kind == "embedded":
        parts.append((anchor.groups["footing_member"][0], False))
    values, shears, heights = [], [], []
    factors, extra_note = None, ""
    for group, above in parts:
        forces, h = _ends(model, group, state, spec.grade)
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
            val = _combined(fa, fb, 0.0 * fb, Fc, edge["Fb"], edge["Fb"], Ft, edge["Fb"],
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
            val = _combined(fa, fb1, fb2, edge["Fc_star"] * (cp.value if cp else 1.0),
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
                     f"'{duration}' (a judgement, see models.checks.structural)",
              note=f"at {hh[k]:+.2f} m from grade (negative: embedded); {le_note}; wet service; "
                   f"{factor_note}; {ref.source}"),
        Check(f"anchor.{name}.post.shear", "post", name,
              f"{shape}: shear stress against Fv'", float(fv[j]), float(edge["Fv"]), "stress",
              source="NDS 2018 3.4.2 (fv = 1.5 V/A rectangle, 4/3 V/A circle)",
              note=f"at {hh[j]:+.2f} m from grade; Fv' = Fv x CD x CM; {ref.source}"),
    ]


def _embedded_laminated(system: System, anchor, state: State, duration: str,
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
    forces, h = _ends(system.model, anchor.groups["footing_member"][0], state, spec.grade)
    A = n * t * w
    s_stack = n * w * t**2 / 6.0   # bending across the stack, no composite action
    s_side = n * t * w**2 / 6.0    # plies side by side, each about its strong axis
    # the embedded member's local z lies along the pull (depth "along" of the outline)
    s_y, s_z = (s_stack, s_side) if stack_along else (s_side, s_stack)
    fb_y, fb_z = np.abs(forces[..., 4]) / s_y, np.abs(forces[..., 5]) / s_z
    fb_flat, fb_edge = (fb_y, fb_z) if stack_along else (fb_z, fb_y)
    edge = _adjusted(ply.values, ply.size, duration)
    flat = _adjusted(ply.values, ply.size, duration, flatwise=True)
    val = _combined(forces[..., 0] / A, fb_edge, fb_flat, edge["Fc_star"], edge["Fb"], flat["Fb"],
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
    from spanstay.models.checks.laminated import check_laminated
    from spanstay.models.parts.laminated_results import laminated_results

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


# ------------------------------------------------------------------------------- soil
def _tilt(state: State, node: int) -> float:
    """Angle between the deformed and the original vertical at ``node``, rad."""
    return float(np.arccos(np.clip(state.rotation[node][2, 2], -1.0, 1.0)))


def _ground_actions(system: System, placed, state: State) -> tuple[float, float, float, float]:
    """Horizontal shear and moment (resultants) just above grade, the largest p/p_u, and
    the embedded length where the soil is at its limit (p/p_u >= SOIL_AT_LIMIT)."""
    from spanstay.models.parts.footing import footing_response

    vx = footing_response(placed, system.model, state, (1.0, 0.0))
    vy = footing_response(placed, system.model, state, (0.0, 1.0))
    # shear just above grade: the member's shear below the grade node plus that node's soil
    # spring (the moment is continuous through it)
    trib0 = float(placed.curves.tributary[placed.spring_node == 0].sum())
    V = float(np.hypot(vx.shear[0] + vx.p[0] * trib0, vy.shear[0] + vy.p[0] * trib0))
    M = float(np.hypot(vx.moment[0], vy.moment[0]))
    trib = np.bincount(placed.spring_node, weights=placed.curves.tributary,
                       minlength=placed.nodes.size)
    at_limit = float(trib[vx.ratio >= SOIL_AT_LIMIT].sum())
    return V, M, max(vx.max_ratio, vy.max_ratio), at_limit


def _has_soil_limit(placed) -> bool:
    """True when some p-y curve of the footing has an ultimate resistance (not all linear)."""
    pu = np.asarray(placed.curves.p_ultimate, float)
    return bool(np.any(np.isfinite(pu) & (pu > 0)))


def _ibc_footing(anchor):
    """The footing as IBC Eq. 18-1 sees it: b = diameter, or diagonal of a square (the
    square on the smaller side of a rectangular post, a judgement)."""
    placed = anchor.footing
    fs = anchor.spec.footing
    footing = placed.footing
    if fs.kind == "embedded" and anchor.spec.post.kind != "round":
        return replace(footing, shape="square", width=min(anchor.spec.post.outline))
    return replace(footing, shape="round")


def soil_checks(system: System, anchor, state: State, cache: dict | None = None) -> list[Check]:
    """Soil utilization, ground-line tilt and motion, and IBC embedment of one anchor."""
    from spanstay.models.common.errors import InputError
    from spanstay.models.parts.footing import ibc_check

    spec = anchor.spec
    name = spec.name
    out: list[Check] = []
    if not anchor.groups.get("soil") or spec.kind == "tree":
        return out
    tilt = _tilt(state, anchor.grade_node)
    out.append(Check(f"anchor.{name}.footing.tilt", "footing", name,
                     "tilt of the post at the ground line", tilt, TILT_LIMIT, "angle",
                     source="limit 1 degree: a judgement of ours",
                     note="total tilt from plumb, installed pull included"))
    placed = anchor.footing
    if placed is None:
        return out
    fs = spec.footing
    V, M, ratio, at_limit = _ground_actions(system, placed, state)
    if _has_soil_limit(placed):
        out.append(Check(f"anchor.{name}.soil.pressure", "soil", name,
                         "largest soil reaction against its p-y limit (p / p_u)", ratio, 1.0,
                         "ratio",
                         source="p-y curves: API RP 2A sand, Matlock (1970) clay",
                         note=f"soil at its limit (p/p_u >= {SOIL_AT_LIMIT:g}) over "
                              f"{at_limit:.2f} m "
                              f"of the {placed.footing.depth:.2f} m embedment; API sand curves "
                              "approach their limit without reaching it, so a ratio near 1 is "
                              "soil yielding near grade: see the tilt and IBC checks for "
                              "the footing's margin"))
    if fs.double_lateral_bearing:
        move = float(np.hypot(*state.translation[anchor.grade_node][:2]))
        out.append(Check(f"anchor.{name}.footing.ground_motion", "footing", name,
                         "horizontal motion at grade (condition of doubled lateral bearing)",
                         move, IBC_DOUBLED_MOTION, "length",
                         source="IBC 2021 §1806.3.4 (1/2 inch at the ground surface)"))
    cache = {} if cache is None else cache
    key = ("ibc", name)
    if key not in cache:
        cache[key] = _ibc_footing(anchor)
    if V > 1.0:
        try:
            ibc = ibc_check(cache[key], placed.profile, V, M / V,
                            constrained=fs.slab_at_grade, doubled=fs.double_lateral_bearing)
        except InputError:
            return out  # a layer without its IBC class: see unchecked_parts
        out.append(Check(f"anchor.{name}.footing.embedment", "footing", name,
                         "embedment depth against the code's required depth",
                         ibc.required_depth, ibc.actual_depth, "length",
                         source=ibc.equation + (", doubled bearing (§1806.3.4)" if ibc.doubled
                                                else "") + f", Table 1806.2 class {ibc.ibc_class}",
                         note=f"P = {V:.4g} N (shear at grade) at h = {M / V:.3g} m (moment / "
                              f"shear at grade, equal to the pull's height for one line); "
                              f"b = {_b(cache[key]):.3g} m; S = {ibc.bearing:.4g} Pa"))
    return out


def _b(footing) -> float:
    from spanstay.models.catalogs.ibc_embedment import round_or_square_width
    return float(round_or_square_width(footing.width, footing.shape))


# ------------------------------------------------------------------------- deflection
def deflection_checks(system: System, anchor, state: State) -> list[Check]:
    """Horizontal displacement of the highest line attachment against height / 40."""
    name = anchor.spec.name
    heights = [bl.spec.start_height if bl.spec.start == name else bl.spec.end_height
               for bl in system.lines.values() if name in (bl.spec.start, bl.spec.end)]
    if not heights:
        return []
    h = max(heights)
    node = anchor.node_at(h)
    move = float(np.hypot(*state.translation[node][:2]))
    return [Check(f"anchor.{name}.deflection", "anchor", name,
                  f"horizontal deflection of the line attachment ({h:.2f} m up)",
                  move, h / DEFLECTION_RATIO, "length",
                  source=f"limit height / {DEFLECTION_RATIO:g}: a judgement of ours",
                  note="total from the unloaded position, installed pull included")]


# ---------------------------------------------------------------------------- gaps
def unchecked_parts(system: System) -> list[str]:
    """Plain statements of what ``structural_checks`` does not check in this system."""
    out = []
    for anchor in system.anchors.values():
        spec = anchor.spec
        name = spec.name
        if spec.kind == "tree":
            out.append(f"anchor '{name}': a living tree; only its root plate (against a given "
                       "capacity) and stem stress (against green MOR) are checked: have an "
                       "arborist assess it")
            continue
        if spec.post.kind != "laminated" and (anchor.post_section or {}).get("ref") is None:
            out.append(f"anchor '{name}': post stresses not checked (no species and grade)")
        if spec.footing is not None and spec.footing.kind == "pier":
            out.append(f"anchor '{name}': the concrete pier itself (reinforcement, bearing of "
                       "the post in the pier) is not checked")
        if anchor.footing is not None and not _has_soil_limit(anchor.footing):
            out.append(f"anchor '{name}': soil utilization not checked (linear modulus soil has "
                       "no ultimate resistance); the tilt and IBC checks still apply")
        if anchor.footing is not None:
            layers = anchor.footing.profile.layers
            if any(l.ibc_class is None for l in layers if l.top < anchor.footing.footing.depth):
                out.append(f"anchor '{name}': IBC embedment not checked (give ibc_class for "
                           "every soil layer the footing passes through)")
    out.append("torsion in posts and bearing of hardware on the wood are not checked")
    return out
