"""Checks of guys, braces and trees, and how an anchor shares the line's pull.

Each check is demand against capacity (SI) with its source. A guy gone slack,
a ground anchor pulled past its capacity, a kicker block lifting, or a brace
wire gone slack are findings in the checks (``finding`` is set), never
errors.

- Guy and brace wire: tension <= MBS x termination efficiency / factor of
  safety (MBS from the rope catalog; factor of safety 5: common practice).
- Ground anchor: pull along the guy <= the user's capacity (taken as the
  allowable pull; use the maker's rating with its own factor).
- Strut and rail: NDS 3.7.1 column stability (Fc' = Fc* CP, Ke = 1.0 for a
  member pinned at both ends, NDS Appendix G, from memory; buckling about
  the least dimension), or NDS 3.8 tension (Ft') when the member pulls.
- Strut ends: bearing at an angle to grain on the post face and on the foot
  block, NDS 3.10.3 (Hankinson formula, from memory):
  F_theta = Fc* Fc_perp' / (Fc* sin^2 theta + Fc_perp' cos^2 theta).
- Block on soil: vertical pressure <= IBC 2021 Table 1806.2 presumptive
  allowable foundation pressure of the top soil layer (from memory).
- Tree: root-plate moment <= the user's root-plate capacity (not checked
  without an assessed one); stem compression at grade (bending + axial)
  against the species' green compression parallel to grain / the tree factor
  of safety (a mean clear-wood strength, not a design value); the tree cautions.
- Timber members take the load duration of the state checked (see
  :mod:`models.checks.check`), like the posts.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from spanstay.fem import Model, State
from spanstay.models.analysis.anchor_shares import reaction_shares
from spanstay.models.checks.check import RIDER_DURATION
from spanstay.models.parts.braces import BuiltHBrace, BuiltKicker, BuiltMember, member_axial_force
from spanstay.models.parts.guys import BuiltGuy, guy_state
from spanstay.models.catalogs.ibc_embedment import PSF, ibc_class_key
from spanstay.models.scenario.spec import (DEFAULT_FACTOR_OF_SAFETY,
                                           DEFAULT_SLIDING_FACTOR_OF_SAFETY,
                                           DEFAULT_TERMINATION_EFFICIENCY)

#: IBC 2021 Table 1806.2, presumptive allowable foundation pressure, psf (from memory)
IBC_ALLOWABLE_BEARING_PSF = {
    "crystalline_bedrock": 12000.0,
    "sedimentary_rock": 4000.0,
    "gravel": 3000.0,
    "sand": 2000.0,
    "clay": 1500.0,
}
#: NDS Appendix G buckling length coefficient, pinned-pinned (from memory)
KE_PINNED = 1.0
#: NDS 3.7.1 column curve parameter for sawn lumber
C_SAWN = 0.8
ROPE_SOURCE = ("rope catalog minimum breaking strength x termination efficiency / factor of "
               "safety (factor of safety on breaking strength: common practice)")


@dataclass(frozen=True)
class AnchorCheck:
    """One check: demand against capacity (SI); utilization = demand / capacity.

    ``finding`` names a condition to act on that is not a member failure
    ("slack", "pulled out", "uplift"); ``factors`` lists NDS factors used.
    """

    anchor: str
    part: str
    check: str
    demand: float
    capacity: float
    unit: str
    source: str
    note: str = ""
    finding: str = ""
    factors: tuple[dict, ...] = ()

    @property
    def utilization(self) -> float:
        if self.capacity > 0:
            return self.demand / self.capacity
        return 0.0 if self.demand <= 0 else math.inf

    @property
    def passes(self) -> bool:
        return self.utilization <= 1.0


@dataclass
class AnchorReport:
    """All checks of one anchor in one state, its top displacement and load shares."""

    anchor: str
    checks: list[AnchorCheck]
    top_displacement: np.ndarray
    shares: dict[str, np.ndarray]
    cautions: tuple[str, ...] = ()
    notes: list[str] = field(default_factory=list)

    @property
    def findings(self) -> list[AnchorCheck]:
        return [c for c in self.checks if c.finding]


def rope_capacity(breaking_strength: float, efficiency: float, factor_of_safety: float) -> float:
    """Allowable tension of a rope: MBS x termination efficiency / factor of safety."""
    return breaking_strength * efficiency / factor_of_safety


def guy_checks(anchor: str, guys: list[BuiltGuy], model: Model, state: State,
               factor_of_safety: float = DEFAULT_FACTOR_OF_SAFETY) -> list[AnchorCheck]:
    """Rope tension and ground-anchor pull of each guy; slack and pull-out as findings."""
    out = []
    for i, g in enumerate(guys):
        gs = guy_state(model, state, g)
        spec = g.spec
        part = f"guy {i + 1}"
        cap = rope_capacity(spec.rope.breaking_strength, spec.termination_efficiency,
                            factor_of_safety)
        out.append(AnchorCheck(
            anchor, part, "tension vs rope strength", gs.tension, cap, "N", ROPE_SOURCE,
            note=f"{spec.rope.name}, efficiency {spec.termination_efficiency:g}, "
                 f"factor of safety {factor_of_safety:g}",
            finding="slack: the guy carries nothing" if gs.slack else ""))
        if spec.anchor_capacity is not None:
            pulled = gs.tension > spec.anchor_capacity
            out.append(AnchorCheck(
                anchor, f"{part} ground anchor", "pull along the guy vs capacity", gs.tension,
                spec.anchor_capacity, "N", "user's ground-anchor capacity (taken as allowable)",
                note=f"anchor moved {gs.anchor_movement * 1000:.1f} mm toward the post",
                finding="pulled out: pull exceeds the anchor's capacity" if pulled else ""))
    return out


def _adjusted(species: str, grade: str | None, section, wet: bool, where: str,
              duration: str = RIDER_DURATION):
    from spanstay.models.catalogs import lumber
    from spanstay.models.catalogs.nds import adjusted_values

    size = (lumber.parse_size(section.nominal, where) if section.nominal
            else lumber.custom_size(section.width, section.depth))
    ref = lumber.design_values(species, grade or "No. 2", size, where)
    return adjusted_values(ref, size, duration=duration, wet=wet), size


def _rows(factors) -> tuple[dict, ...]:
    return tuple(dict(symbol=f.symbol, name=f.name, value=f.value, applies_to=list(f.applies_to),
                      note=f.note) for f in factors)


def member_checks(anchor: str, part: str, member: BuiltMember, state: State,
                  wet: bool = True, duration: str = RIDER_DURATION) -> list[AnchorCheck]:
    """Column (NDS 3.7.1, CP) or tension (NDS 3.8) check of a pinned timber member."""
    from spanstay.models.catalogs.nds import column_stability_factor

    n = float(np.min(member_axial_force(state, member)))  # most compressive
    sec = member.section
    area = sec.width * sec.depth
    adj, _ = _adjusted(member.species, member.grade, sec, wet, part, duration)
    if n < 0:
        d = min(sec.width, sec.depth)
        le_d = KE_PINNED * member.length / d
        cp = column_stability_factor(adj["Fc_star"], adj["Emin"], le_d, c=C_SAWN)
        fc_adj = adj["Fc_star"] * cp.value
        return [AnchorCheck(anchor, part, "compression with column stability", -n / area, fc_adj,
                            "Pa", "NDS 3.7.1 (CP), Ke = 1.0 pinned-pinned (NDS Appendix G, "
                            "from memory)", note=f"axial force {-n:.0f} N compression, "
                            f"le/d = {le_d:.1f}", factors=tuple(adj.rows()) + _rows([cp]))]
    n_max = float(np.max(member_axial_force(state, member)))
    return [AnchorCheck(anchor, part, "tension", n_max / area, adj["Ft"], "Pa", "NDS 3.8.1",
                        note=f"axial force {n_max:.0f} N tension", factors=tuple(adj.rows()))]


def hankinson(fc_star: float, fc_perp: float, theta: float) -> float:
    """Bearing strength at angle ``theta`` (rad) to grain (NDS 3.10.3, from memory)."""
    s, c = math.sin(theta), math.cos(theta)
    return fc_star * fc_perp / (fc_star * s * s + fc_perp * c * c)


def _bearing(anchor: str, part: str, force: float, area: float, fc_star: float, fc_perp: float,
             theta: float, what: str) -> AnchorCheck:
    cap = hankinson(fc_star, fc_perp, theta)
    return AnchorCheck(anchor, part, f"bearing at {math.degrees(theta):.0f} deg to grain on {what}",
                       max(force, 0.0) / area, cap, "Pa",
                       "NDS 3.10.3 Hankinson formula (from memory)",
                       note="contact area taken as the strut's cross-section")


def top_soil_class(ground) -> str | None:
    """IBC Table 1806.2 class of the top soil layer of a GroundSpec (None if not given)."""
    from spanstay.models.catalogs.soil import profile_from_specs

    if not ground.soil:
        return None
    return profile_from_specs(list(ground.soil[:1])).layers[0].ibc_class


def allowable_soil_bearing(ibc_class: str | None) -> tuple[float, str]:
    """IBC Table 1806.2 presumptive allowable foundation pressure (Pa) and a note."""
    if ibc_class is None:
        return (IBC_ALLOWABLE_BEARING_PSF["clay"] * PSF,
                "no IBC class given for the top soil layer: the lowest class (clay, 1500 psf) used")
    key = ibc_class_key(ibc_class)
    return IBC_ALLOWABLE_BEARING_PSF[key] * PSF, f"IBC class {key}"


def kicker_checks(anchor: str, kicker: BuiltKicker, built, model: Model, state: State,
                  top_soil_class: str | None = None, wet: bool = True,
                  sliding_factor_of_safety: float = DEFAULT_SLIDING_FACTOR_OF_SAFETY,
                  duration: str = RIDER_DURATION) -> list[AnchorCheck]:
    """Strut column check, end bearing on the post and on the block, block on soil and
    its sliding (:mod:`models.checks.sliding`)."""
    strut = kicker.strut
    out = member_checks(anchor, "kicker strut", strut, state, wet, duration)
    compression = -float(np.min(member_axial_force(state, strut)))
    sec = strut.section
    area = sec.width * sec.depth
    rise = abs(float(strut.axis[2]))
    incline = math.asin(min(rise, 1.0))  # strut angle from horizontal
    adj, _ = _adjusted(strut.species, strut.grade, sec, wet, "kicker", duration)
    # foot block: same wood as the strut, grain horizontal along the brace
    out.append(_bearing(anchor, "kicker foot block", compression, area, adj["Fc_star"],
                        adj["Fc_perp"], incline, "the block"))
    ref = (built.post_section or {}).get("ref")
    if ref is not None:
        from spanstay.models.catalogs.nds import adjusted_values
        padj = adjusted_values(ref, None, duration=duration, wet=wet)
        out.append(_bearing(anchor, "post at the kicker", compression, area, padj["Fc_star"],
                            padj["Fc_perp"], math.pi / 2 - incline, "the post face"))
    if kicker.block_area is not None:
        up = _block_vertical(model, state, kicker)
        q_allow, note = allowable_soil_bearing(top_soil_class)
        out.append(AnchorCheck(anchor, "kicker block on soil", "bearing pressure",
                               max(up, 0.0) / kicker.block_area, q_allow, "Pa",
                               "IBC 2021 Table 1806.2 allowable foundation pressure (from memory)",
                               note=note,
                               finding="uplift: the strut lifts its block; hold it down"
                               if up < 0 else ""))
        from spanstay.models.checks.sliding import block_sliding, resultant
        brace = built.spec.brace
        h, down = resultant(state.reactions[kicker.block_node, :3])
        demand, cap, note = block_sliding(h, down, kicker.block_area, brace.block_width,
                                          brace.block_depth, top_soil_class,
                                          brace.block_friction, sliding_factor_of_safety)
        out.append(AnchorCheck(anchor, "kicker block on soil", "sliding", demand, cap, "N",
                               "base friction + passive pressure (IBC 2021 Table 1806.2, "
                               "§1806.3.1, from memory) / factor of safety", note=note,
                               finding="sliding: the block slides; embed it or hold it"
                               if demand > cap else ""))
    return out


def _block_vertical(model: Model, state: State, kicker: BuiltKicker) -> float:
    """Upward force of the soil on the foot block (N; negative: the block lifts)."""
    return float(state.reactions[kicker.block_node, 2])


def h_brace_checks(anchor: str, brace: BuiltHBrace, state: State,
                   factor_of_safety: float = DEFAULT_FACTOR_OF_SAFETY,
                   efficiency: float = DEFAULT_TERMINATION_EFFICIENCY,
                   breaking_strength: float | None = None, rope_name: str = "",
                   wet: bool = True, duration: str = RIDER_DURATION) -> list[AnchorCheck]:
    """Rail (column or tension) and diagonal wire (rope strength; slack as a finding)."""
    out = member_checks(anchor, "H-brace rail", brace.rail, state, wet, duration)
    t = float(state.group(brace.diagonal).tension[0])
    if breaking_strength is not None:
        out.append(AnchorCheck(
            anchor, "H-brace diagonal", "tension vs rope strength", t,
            rope_capacity(breaking_strength, efficiency, factor_of_safety), "N", ROPE_SOURCE,
            note=f"{rope_name}, efficiency {efficiency:g}, factor of safety {factor_of_safety:g}",
            finding="slack: the diagonal carries nothing; the brace does not work"
            if t <= 0 else ""))
    return out


def tree_checks(anchor: str, built, model: Model, state: State,
                tree_factor_of_safety: float = 3.0) -> list[AnchorCheck]:
    """Root-plate moment against the user's capacity; stem compression at grade against
    green compression parallel to grain / factor of safety."""
    from spanstay.models.catalogs import lumber
    from spanstay.models.parts.tree import stem_diameter

    spec = built.spec
    tree = spec.tree
    out = []
    m = state.reactions[built.grade_node, 3:5]
    moment = float(np.hypot(*m))
    if tree.root_plate_capacity is not None:
        out.append(AnchorCheck(anchor, "root plate", "overturning moment vs capacity", moment,
                               tree.root_plate_capacity, "N m",
                               "user's root-plate capacity (from an arborist's assessment)"))
    if tree.species is not None:
        green = lumber.green_wood(tree.species)
        d = float(stem_diameter(spec, 0.0))
        axial = max(float(state.reactions[built.grade_node, 2]), 0.0)
        stress = moment / (math.pi * d**3 / 32.0) + axial / (math.pi * d * d / 4.0)
        out.append(AnchorCheck(anchor, "stem at grade",
                               "compression (bending + axial) vs green Fc / factor of safety",
                               stress, green.Fc / tree_factor_of_safety, "Pa",
                               green.source + "; factor of safety "
                               f"{tree_factor_of_safety:g} (settings.tree_factor_of_safety; "
                               "default 3, our judgement)",
                               note="green wood fails first by crushing on the compression "
                                    "face, so compression parallel to grain governs (green "
                                    f"MOR {green.MOR / 1e6:.3g} MPa is higher); a mean "
                                    "clear-wood strength: decay and defects lower it"))
    return out


def check_anchor(model: Model, built, state: State,
                 factor_of_safety: float = DEFAULT_FACTOR_OF_SAFETY,
                 top_soil_class: str | None = None, settings=None,
                 duration: str = RIDER_DURATION) -> AnchorReport:
    """Every guy, brace and tree check of one anchor, its top displacement and shares."""
    from spanstay.models.common.cautions import TREE_CAUTIONS

    name = built.spec.name
    checks: list[AnchorCheck] = []
    cautions: tuple[str, ...] = ()
    if built.guys:
        checks += guy_checks(name, built.guys, model, state, factor_of_safety)
    b = built.brace
    if isinstance(b, BuiltKicker):
        checks += kicker_checks(name, b, built, model, state, top_soil_class,
                                sliding_factor_of_safety=getattr(
                                    settings, "sliding_factor_of_safety",
                                    DEFAULT_SLIDING_FACTOR_OF_SAFETY), duration=duration)
    elif isinstance(b, BuiltHBrace):
        rope = built.spec.brace.diagonal_rope
        checks += h_brace_checks(name, b, state, factor_of_safety,
                                 breaking_strength=rope.breaking_strength, rope_name=rope.name,
                                 duration=duration)
    if built.spec.kind == "tree":
        checks += tree_checks(name, built, model, state,
                              float(getattr(settings, "tree_factor_of_safety", 3.0)))
        cautions = TREE_CAUTIONS
    top = state.translation[built.top_node].copy()
    return AnchorReport(name, checks, top, reaction_shares(model, built, state), cautions)
