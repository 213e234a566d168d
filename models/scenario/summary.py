"""A short text summary of a scenario as read, in the user's units (``validate``)."""
from __future__ import annotations

import math

from spanstay.models.common.cautions import CAUTION_TEXT as CAUTIONS
from spanstay.models.scenario.geometry import chord_length, plan_span
from spanstay.models.scenario.spec import AnchorSpec, FootingSpec, LineSpec, PostSpec, Scenario
from spanstay.models.common.units import show


def _post(post: PostSpec, units: str) -> str:
    wood = " ".join(x for x in (post.species, post.grade) if x)
    if post.kind == "sawn":
        assert post.section is not None
        size = post.section.nominal or (f"{show(post.section.width, 'size', units)} x "
                                        f"{show(post.section.depth, 'size', units)}")
        shape = f"sawn {size}"
    elif post.kind == "round":
        assert post.top_diameter is not None and post.base_diameter is not None
        shape = f"round {show(post.base_diameter, 'size', units)} at grade"
        if not math.isclose(post.top_diameter, post.base_diameter):
            shape += f", {show(post.top_diameter, 'size', units)} at top"
    else:
        assert post.ply is not None and post.fastener is not None
        ply = post.ply.nominal or (f"{show(post.ply.depth, 'size', units)} x "
                                   f"{show(post.ply.width, 'size', units)}")
        stack = post.stack if post.stack != "angle" else f"at {post.stack_angle_deg:g}°"
        fastener = post.fastener.size or f"{show(post.fastener.diameter, 'size', units)} " \
                                          f"{post.fastener.kind}"
        shape = (f"laminated {post.plies} x {ply} stacked {stack}, {fastener}s at "
                 f"{show(post.fastener.spacing, 'size', units)}")
    return f"{shape}, {wood}, {show(post.height, 'length', units)} above grade"


def _footing(footing: FootingSpec, units: str) -> str:
    if footing.kind == "fixed":
        return "fixed at grade" + (" on a rotational spring" if footing.base_spring else "")
    text = f"{footing.kind} {show(footing.depth, 'length', units)} deep"
    if footing.pier_diameter is not None:
        text += f", {show(footing.pier_diameter, 'size', units)} diameter"
    elif footing.backfill:
        text += f", {footing.backfill} backfill"
    return text


def _anchor(anchor: AnchorSpec, units: str) -> list[str]:
    at = (f"at x {show(anchor.x, 'length', units)}, y {show(anchor.y, 'length', units)}, "
          f"grade {show(anchor.grade, 'length', units)}")
    if anchor.tree is not None:
        tree = anchor.tree
        return [f"  {anchor.name}: tree {tree.species or ''} "
                f"{show(tree.diameter_at_grade, 'size', units)} at grade; {at}"]
    assert anchor.post is not None and anchor.footing is not None
    lines = [f"  {anchor.name}: {_post(anchor.post, units)}; {_footing(anchor.footing, units)}; "
             f"{at}"]
    for guy in anchor.guys:
        end = "fixed" if guy.anchor_fixed else "on a spring"
        lines.append(f"    guy from {show(guy.attach_height, 'length', units)} toward "
                     f"{guy.direction_deg % 360:.0f}°, {guy.rope.name}, pretension "
                     f"{show(guy.pretension, 'force', units)}, ground anchor {end}")
    if anchor.brace is not None:
        brace = anchor.brace
        if brace.kind == "kicker":
            assert brace.member is not None and brace.attach_height is not None
            lines.append(f"    kicker {brace.member.nominal or 'member'} from "
                         f"{show(brace.attach_height, 'length', units)} up")
        else:
            assert brace.distance is not None and brace.diagonal_rope is not None
            lines.append(f"    H-brace to a second post {show(brace.distance, 'length', units)}"
                         f" away, diagonal {brace.diagonal_rope.name}")
    return lines


def _line(line: LineSpec, scenario: Scenario, units: str) -> list[str]:
    start, end = scenario.anchor(line.start), scenario.anchor(line.end)
    chord = chord_length(line, start, end)
    if line.sag is not None:
        installed = f"sag {show(line.sag, 'length', units)}"
    elif line.tension is not None:
        installed = f"tension {show(line.tension, 'force', units)}"
    else:
        assert line.unstressed_length is not None
        installed = f"unstressed length {show(line.unstressed_length, 'length', units, 5)}"
    rope = line.rope
    return [f"  {line.name}: {line.start} -> {line.end}, span "
            f"{show(plan_span(start, end), 'length', units)}, chord "
            f"{show(chord, 'length', units, 4)}, installed {installed}",
            f"    rope {rope.name} ({rope.construction}), breaking strength "
            f"{show(rope.breaking_strength, 'force', units)}, termination efficiency "
            f"{line.termination_efficiency:.0%}"]


def summary_text(scenario: Scenario, units: str) -> str:
    """What was read, in ``units`` ("us" or "si"), ending with the cautions."""
    s = scenario.settings
    out = [f"{scenario.project.name}"]
    if scenario.project.notes:
        out.append(f"  {scenario.project.notes}")
    out.append(f"anchors ({len(scenario.anchors)}):")
    for anchor in scenario.anchors:
        out += _anchor(anchor, units)
    out.append(f"lines ({len(scenario.lines)}):")
    for line in scenario.lines:
        out += _line(line, scenario, units)
    if scenario.rider is not None:
        r = scenario.rider
        out.append(f"rider on {r.line}: {show(r.lightest, 'force', units)} to "
                   f"{show(r.heaviest, 'force', units)}, dynamic factor {r.dynamic_factor:g}, "
                   f"feet {show(r.hang_distance, 'length', units)} below the cable, "
                   f"{r.stations} stations")
        ride = scenario.ride
        out.append(f"ride: brake {ride.brake.kind}, end stop "
                   f"{ride.end_stop.kind if ride.end_stop else 'none'}, arrival speed limit "
                   f"{show(ride.arrival_speed_limit, 'speed', units)} "
                   f"({ride.source('arrival_speed_limit')})")
    ground = scenario.ground
    soil = ", ".join(f"{layer.kind} ({layer.loading} p-y)" for layer in ground.soil) \
        or "none described"
    depth = (f" to {show(ground.soil[-1].bottom, 'length', units)}" if ground.soil else "")
    out.append(f"ground: {len(ground.profile)} profile points; soil: {soil}{depth}")
    temps = ", ".join(show(t, "temperature", units) for t in s.use_temperatures)
    out.append(f"settings: factor of safety {s.factor_of_safety:g}, installed at "
               f"{show(s.install_temperature, 'temperature', units)}, used at {temps}"
               + (" (default: installation +/- 25 K, our judgement)"
                  if s.use_temperatures_default else ""))
    out.append(f"ground factors of safety: soil lateral {s.soil_factor_of_safety:g}, uplift "
               f"{s.uplift_factor_of_safety:g}, sliding {s.sliding_factor_of_safety:g}, tree "
               f"stem {s.tree_factor_of_safety:g}; concrete load factor "
               f"{s.concrete_load_factor:g}")
    out.append(f"caution: {CAUTIONS}")
    return "\n".join(out)
