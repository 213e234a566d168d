"""Cross-checks between the parts of a scenario once each part has been read."""
from __future__ import annotations

import math

from spanstay.models.common.errors import InputError
from spanstay.models.scenario.limits import SPAN_MAX
from spanstay.models.scenario.line_shape import check_above_ground
from spanstay.models.scenario.spec import AnchorSpec, FootingSpec, LineSpec, PostSpec, Scenario, SoilLayerSpec

SAME_POINT = 0.01  # m: anchors closer than this in plan are taken as one point
PROFILE_SLACK = 0.05  # m: the ground profile may stop this short of the line's ends
MIN_RIDE = 1.0  # m: the offsets must leave at least this much ride (a judgement)


def plan_span(start: AnchorSpec, end: AnchorSpec) -> float:
    """Horizontal distance between two anchors, m."""
    return math.hypot(end.x - start.x, end.y - start.y)


def attachment(anchor: AnchorSpec, height: float) -> tuple[float, float, float]:
    """A point on an anchor ``height`` above its grade."""
    return anchor.x, anchor.y, anchor.grade + height


def chord_length(line: LineSpec, start: AnchorSpec, end: AnchorSpec) -> float:
    """Straight distance between a line's two attachment points, m."""
    a, b = attachment(start, line.start_height), attachment(end, line.end_height)
    return math.dist(a, b)


def _anchor_path(index: int, anchor: AnchorSpec) -> str:
    return f'anchor[{index + 1}] "{anchor.name}"'


def _line_path(index: int, line: LineSpec) -> str:
    return f'line[{index + 1}] "{line.name}"'


def _m(value: float) -> str:
    return f"{value:.3g} m ({value / 0.3048:.3g} ft)"


def check_scenario(scenario: Scenario) -> None:
    """Raise InputError for the first inconsistency between parts of ``scenario``."""
    _check_names(scenario)
    _check_positions(scenario)
    for i, anchor in enumerate(scenario.anchors):
        _check_anchor(_anchor_path(i, anchor), anchor, scenario)
    for i, line in enumerate(scenario.lines):
        _check_line(_line_path(i, line), line, scenario)
    _check_rider(scenario)
    for line in scenario.lines:
        check_above_ground(scenario, line)


def check_anchor_names(anchors: tuple[AnchorSpec, ...]) -> None:
    """Raise InputError if two anchors share a name."""
    seen: dict[str, int] = {}
    for i, anchor in enumerate(anchors):
        if anchor.name in seen:
            raise InputError(f'another anchor (anchor[{seen[anchor.name] + 1}]) is also '
                             f'called "{anchor.name}"; names must differ',
                             _anchor_path(i, anchor) + ".name")
        seen[anchor.name] = i


def _check_names(scenario: Scenario) -> None:
    check_anchor_names(scenario.anchors)
    lines: dict[str, int] = {}
    for i, line in enumerate(scenario.lines):
        if line.name in lines:
            raise InputError(f'another line (line[{lines[line.name] + 1}]) is also called '
                             f'"{line.name}"; names must differ', _line_path(i, line) + ".name")
        lines[line.name] = i


def _check_positions(scenario: Scenario) -> None:
    anchors = scenario.anchors
    for j, b in enumerate(anchors):
        for i, a in enumerate(anchors[:j]):
            if plan_span(a, b) < SAME_POINT:
                raise InputError(f"at the same point as {_anchor_path(i, a)}; anchors must "
                                 "stand apart", _anchor_path(j, b) + ".position")


def _soil_for(footing: FootingSpec, scenario: Scenario) -> tuple[SoilLayerSpec, ...]:
    return footing.soil if footing.soil is not None else scenario.ground.soil


def _check_footing(path: str, footing: FootingSpec, post: PostSpec,
                   scenario: Scenario) -> None:
    if footing.kind == "fixed":
        return
    if footing.kind == "pier":
        along, across = post.outline
        needed = math.hypot(along, across) if post.kind != "round" else along
        assert footing.pier_diameter is not None
        if footing.pier_diameter <= needed:
            what = "diameter" if post.kind == "round" else "diagonal"
            raise InputError(f"the pier ({_m(footing.pier_diameter)}) is narrower than "
                             f"the post it holds (post {what} {_m(needed)})",
                             path + ".pier_diameter")
    layers = _soil_for(footing, scenario)
    if not layers:
        raise InputError(f"an {footing.kind} footing needs soil: add [[ground.soil]] "
                         "layers (a preset may fill their values) or footing.soil layers",
                         path)
    deepest = layers[-1].bottom
    if footing.depth > deepest:
        raise InputError(f"the footing ({_m(footing.depth)} deep) goes deeper than the "
                         f"soil described (to {_m(deepest)}); describe the soil down to "
                         "at least the footing base", path + ".depth")


def _check_anchor(path: str, anchor: AnchorSpec, scenario: Scenario) -> None:
    if anchor.kind != "post":
        return
    post, footing = anchor.post, anchor.footing
    assert post is not None and footing is not None
    _check_footing(path + ".footing", footing, post, scenario)
    for k, guy in enumerate(anchor.guys):
        where = f"{path}.guy[{k + 1}]"
        if guy.attach_height > post.height:
            raise InputError(f"the guy is attached {_m(guy.attach_height)} up, above the "
                             f"top of the post ({_m(post.height)})", where + ".attach_height")
        gx, gy, gz = guy.ground_point
        top = anchor.grade + guy.attach_height
        if gz >= top:
            raise InputError(f"the guy's ground anchor (elevation {_m(gz)}) is not below "
                             f"where the guy meets the post (elevation {_m(top)}); a guy "
                             "runs down from the post to the ground", where + ".ground_elevation")
        reach = math.hypot(gx - anchor.x, gy - anchor.y)
        if reach < max(post.outline):
            raise InputError(f"the guy's ground anchor is at the post's own base "
                             f"({_m(reach)} from its centre); move it out, typically about "
                             "as far as the guy's attach height", where)
    brace = anchor.brace
    if brace is None:
        return
    if brace.kind == "kicker":
        assert brace.attach_height is not None
        if brace.attach_height > post.height:
            raise InputError(f"the kicker is attached {_m(brace.attach_height)} up, above "
                             f"the top of the post ({_m(post.height)})",
                             path + ".brace.attach_height")
        return
    assert brace.second_post is not None and brace.rail_height is not None
    lowest = min(post.height, brace.second_post.height)
    if brace.rail_height > lowest:
        raise InputError(f"the rail ({_m(brace.rail_height)} up) is above the top of "
                         f"the shorter post ({_m(lowest)})", path + ".brace.rail_height")
    second_footing = brace.second_footing or footing
    where = path + (".brace.second_footing" if brace.second_footing else ".footing")
    _check_footing(where, second_footing, brace.second_post, scenario)


def _check_line(path: str, line: LineSpec, scenario: Scenario) -> None:
    start, end = scenario.anchor(line.start), scenario.anchor(line.end)
    for anchor, height, key in ((start, line.start_height, "from_height"),
                                (end, line.end_height, "to_height")):
        if anchor.post is not None and height > anchor.post.height:
            raise InputError(f'attached {_m(height)} up, above the top of the post of '
                             f'anchor "{anchor.name}" ({_m(anchor.post.height)})',
                             f"{path}.{key}")
    span = plan_span(start, end)
    if span > SPAN_MAX:
        raise InputError(f"the line spans {_m(span)} in plan between anchors "
                         f'"{start.name}" and "{end.name}"; spanstay accepts spans up to '
                         f"{_m(SPAN_MAX)}", f"{path}.to")
    chord = chord_length(line, start, end)
    if line.unstressed_length is not None and line.unstressed_length <= chord:
        raise InputError(f"the unstressed length ({_m(line.unstressed_length)}) is not "
                         f"longer than the chord between the attachments ({_m(chord)}); "
                         'to pull the line taut, give "tension" instead',
                         path + ".unstressed_length")
    if line.sag is not None and line.sag >= chord / 2:
        raise InputError(f"a sag of {_m(line.sag)} is not less than half the chord "
                         f"({_m(chord)}); installed sag is usually a few percent of the span",
                         path + ".sag")


def _check_rider(scenario: Scenario) -> None:
    rider = scenario.rider
    line = scenario.line(rider.line) if rider else scenario.lines[0]
    start, end = scenario.anchor(line.start), scenario.anchor(line.end)
    if rider is not None:
        chord = chord_length(line, start, end)
        offsets = rider.start_offset + rider.stop_offset
        key = "rider.start_offset" if rider.start_offset >= chord else "rider.stop_offset"
        if offsets > chord - MIN_RIDE:
            raise InputError(f"start_offset and stop_offset together ({_m(offsets)}) "
                             f"leave no ride on a line {_m(chord)} long (at least "
                             f"{_m(MIN_RIDE)} must remain)", key)
    profile = scenario.ground.profile
    span = plan_span(start, end)
    if profile and (profile[0][0] > PROFILE_SLACK or profile[-1][0] < span - PROFILE_SLACK):
        raise InputError(f"the profile runs from {_m(profile[0][0])} to {_m(profile[-1][0])} "
                         f'but line "{line.name}" spans 0 to {_m(span)} in plan; '
                         "cover the whole span", "ground.profile")
