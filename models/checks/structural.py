"""Structural checks of a solved design pass: demand, capacity, utilization.

``structural_checks(system, design)`` evaluates every part of the structure
in every station state of the design pass (heaviest rider x dynamic factor,
coldest temperature) and keeps, for each check, the worst station:

- cable: largest segment tension against breaking strength / factor of safety;
- end terminations: end tension against breaking strength x efficiency / FoS;
- sawn and round posts: NDS combined stresses (3.9.1, 3.9.2) and shear above
  grade, and in the embedded length of a post set straight in the soil;
- laminated posts: :mod:`spanstay.models.checks.laminated`;
- soil: largest p/p_u, ground-line tilt, IBC 2021 Eq. 18-1 (18-2) embedment,
  ground-line motion when IBC §1806.3.4 doubling is used;
- anchor deflection at the line attachment;
- guys, braces and trees: :mod:`models.checks.anchors` (guy and brace-wire
  tension, ground-anchor pull, struts, rails, bearing, root plate, stem).

Load durations: see :mod:`spanstay.models.checks.check`.
"""
from __future__ import annotations

import math

from spanstay.fem import State
from spanstay.models.checks.check import (PERMANENT_DURATION, RIDER_DURATION, UNIT_KINDS, Check,
                                          slug)
from spanstay.models.checks.deflection import deflection_checks
from spanstay.models.checks.laminated import embedded_laminated_checks, laminated_post_checks
from spanstay.models.checks.line import line_checks
from spanstay.models.checks.posts import solid_post_checks
from spanstay.models.checks.soil import has_soil_limit, soil_checks
from spanstay.models.checks.verdict import NotChecked
from spanstay.models.parts.system import System

__all__ = ["Check", "state_checks", "structural_checks", "unchecked_parts"]


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
    out += extra_anchor_checks(system, state, duration)
    for c in out:
        c.governing = dict(governing)
    return out


def extra_anchor_checks(system: System, state: State, duration: str = RIDER_DURATION,
                        fos: float | None = None) -> list[Check]:
    """Guy, brace and tree checks of every anchor, from :mod:`models.checks.anchors`.

    Each ``AnchorCheck`` becomes a :class:`Check` with id
    ``anchor.<name>.<part>.<check>`` (lower case, words joined by "_"); a
    finding (slack guy, pulled-out ground anchor, lifting block) is put in
    front of the note. ``fos`` replaces the scenario's factor of safety on ropes
    (the emergency arrest checks them against their breaking strength).
    """
    from spanstay.models.checks.anchors import check_anchor, top_soil_class

    fos = float(system.scenario.settings.factor_of_safety if fos is None else fos)
    soil = top_soil_class(system.scenario.ground)
    out = []
    for anchor in system.anchors.values():
        report = check_anchor(system.model, anchor, state, fos, soil,
                              settings=system.scenario.settings, duration=duration)
        for c in report.checks:
            note = "; ".join(t for t in (f"finding: {c.finding}" if c.finding else "", c.note) if t)
            out.append(Check(f"anchor.{c.anchor}.{slug(c.part)}.{slug(c.check)}", c.part,
                             c.anchor, f"{c.part}: {c.check}", c.demand, c.capacity,
                             UNIT_KINDS.get(c.unit, c.unit), source=c.source, note=note))
    return out


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
            out += embedded_laminated_checks(system, anchor, state, duration, cache)
    out += soil_checks(system, anchor, state, cache)
    out += deflection_checks(system, anchor, state)
    return out


def _anchors_and_second_posts(system: System) -> list:
    """Every anchor, each followed by its H-brace's second post (which has its own footing)."""
    out = []
    for anchor in system.anchors.values():
        out.append(anchor)
        second = getattr(getattr(anchor, "brace", None), "second", None)
        if second is not None:
            out.append(second)
    return out


def unchecked_parts(system: System, states=()) -> list[NotChecked]:
    """What ``structural_checks`` does not check in this system, each with its reason.

    ``states`` (the strength pass's station states) give the largest soil reaction
    against its p-y limit, reported with the soil's capacity item.
    """
    out: list[NotChecked] = []
    for anchor in _anchors_and_second_posts(system):
        spec = anchor.spec
        name = f"anchor '{spec.name}'"
        brace = getattr(anchor, "brace", None)
        if getattr(brace, "kind", None) == "kicker" and brace.block_area is None:
            out.append(NotChecked(name, "the kicker foot's bearing and sliding on the soil",
                                  "no block_width and block_length given: the foot is held "
                                  "rigidly in the model"))
        if spec.kind == "tree":
            tree = spec.tree
            if tree is None or tree.root_plate_capacity is None:
                out.append(NotChecked(name, "the root plate's overturning capacity",
                                      "no assessed root_plate_capacity given: have an arborist "
                                      "assess the tree and give it"))
            out.append(NotChecked(name, "the living tree as a whole (decay, species, health)",
                                  "only the root plate (against the given capacity) and the stem "
                                  "compression (against green Fc / factor of safety) are "
                                  "checked: have an arborist assess it"))
            continue
        if spec.post.kind != "laminated" and (anchor.post_section or {}).get("ref") is None:
            out.append(NotChecked(name, "post stresses", "no species and grade given"))
        if spec.footing is not None and spec.footing.kind == "pier":
            out.append(NotChecked(name, "the post's bearing and embedment in its concrete pier, "
                                        "and the pier's bar development",
                                  "spanstay checks the pier's flexure and shear only"))
        if anchor.footing is not None:
            if not has_soil_limit(anchor.footing):
                out.append(NotChecked(name, "soil utilization and the soil's ultimate lateral "
                                      "capacity", "a linear-modulus soil has no ultimate "
                                      "resistance; the tilt and IBC checks still apply"))
            out.append(NotChecked(name, "settlement of the footing",
                                  "the footing toe is held vertically in the model; its "
                                  "reaction is checked for end bearing and uplift"))
            toe = anchor.footing.profile.layer_at(anchor.footing.footing.depth)
            if anchor.footing.profile.layers[int(toe)].ibc_class is None:
                out.append(NotChecked(name, "end bearing under the toe",
                                      "the soil layer at the toe has no ibc_class (give its "
                                      "Table 1806.2 class)"))
            layers = anchor.footing.profile.layers
            if any(lay.ibc_class is None for lay in layers if lay.top < anchor.footing.footing.depth):
                out.append(NotChecked(name, "IBC 2021 embedment depth (Eq. 18-1/18-2)",
                                      "a soil layer the footing passes through has no ibc_class "
                                      "(give the Table 1806.2 class of every such layer)"))
    out.append(NotChecked("posts", "torsion", "spanstay does not check torsion in posts"))
    out.append(NotChecked("hardware", "bearing of hardware (eye bolts, plates) on the wood and "
                          "the hardware's own rating", "use the maker's ratings; not modelled"))
    return out
