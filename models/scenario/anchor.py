"""Reading ``[[anchor]]`` tables: position, post or tree, footing, guys, brace."""
from __future__ import annotations

import math
from typing import Any

from spanstay.models.catalogs import lumber
from spanstay.models.common.errors import InputError
from spanstay.models.scenario import limits
from spanstay.models.scenario.rope_entry import read_rope
from spanstay.models.scenario.post import (FOOTING_KEYS, POST_KEYS, read_footing, read_post,
                                  read_section)
from spanstay.models.scenario.reader import REQUIRED, Table
from spanstay.models.scenario.spec import (DEFAULT_TERMINATION_EFFICIENCY, AnchorSpec, BraceSpec, GuySpec,
                         PostSpec, SectionSpec, TreeSpec)

ANCHOR_KINDS = ("post", "tree")
ANCHOR_KEYS = ("name", "kind", "position", "grade", "post", "footing", "guy", "brace", "tree")
GUY_KEYS = ("attach_height", "direction", "distance", "ground_point", "ground_elevation",
            "rope", "pretension", "ground_anchor", "termination_efficiency")
GROUND_ANCHOR_KEYS = ("stiffness", "capacity")
BRACE_KINDS = ("kicker", "h-brace")
BRACE_KEYS = ("kind", "direction", "attach_height", "foot_distance", "member", "species",
              "grade", "block_width", "block_length", "second_post", "second_footing",
              "distance", "rail_height", "rail", "diagonal_rope", "diagonal_pretension",
              "block_depth", "block_friction")
TREE_KEYS = ("diameter_at_grade", "diameter_at_attachment", "attachment_height", "E_green",
             "root_plate_stiffness", "root_plate_capacity", "species")
_KICKER_ONLY = ("attach_height", "foot_distance", "member", "block_width",
                "block_length", "block_depth", "block_friction")
_H_ONLY = ("second_post", "second_footing", "distance", "rail_height", "rail",
           "diagonal_rope", "diagonal_pretension")


def anchor_path(index: int, data: Any) -> str:
    """``anchor[2] "upper"`` (arrays counted from 1)."""
    name = data.get("name") if isinstance(data, dict) else None
    return f'anchor[{index + 1}] "{name}"' if isinstance(name, str) else f"anchor[{index + 1}]"


def _check_plan(table: Table, key: str, x: float, y: float) -> None:
    """Plan coordinates within PLAN_MAX of the origin."""
    for i, value in enumerate((x, y)):
        if abs(value) > limits.PLAN_MAX:
            raise InputError(f"{table.raw(key)[i]!r} is outside the plan area spanstay "
                             f"accepts (within {limits.PLAN_MAX:g} m, "
                             f"{limits.PLAN_MAX / 0.3048:.0f} ft, of the origin)",
                             f"{table.where(key)}[{i + 1}]")


def _direction(table: Table, key: str) -> float | None:
    """A plan direction (angle from +x) in degrees, or None."""
    if not table.has(key):
        return None
    return math.degrees(table.quantity(key, "angle"))


def read_guy(table: Table, x: float, y: float, grade: float) -> GuySpec:
    """A ``[[anchor.guy]]`` table; the post stands at (x, y) on ``grade``."""
    if table.one_of(("direction", "ground_point")) == "direction":
        direction = table.quantity("direction", "angle")
        distance = table.quantity("distance", "length", positive=True,
                                  maximum=limits.GUY_DISTANCE_MAX)
        gx, gy = x + distance * math.cos(direction), y + distance * math.sin(direction)
    else:
        table.forbid(("distance",), 'with "ground_point" (it fixes the distance)')
        gx, gy = table.quantities("ground_point", "length", 2)
        _check_plan(table, "ground_point", gx, gy)
    gz = table.quantity("ground_elevation", "length", grade)
    ground = table.raw("ground_anchor", expected='"fixed" or a table with stiffness '
                       "and capacity")
    where = table.where("ground_anchor")
    if isinstance(ground, str):
        if ground != "fixed":
            raise InputError(f'expected "fixed" or a table {{ stiffness = "...", capacity '
                             f'= "..." }}, got {ground!r}', where)
        fixed, stiffness, capacity = True, None, None
    else:
        sub = Table(ground, where, GROUND_ANCHOR_KEYS)
        fixed = False
        stiffness = sub.quantity("stiffness", "force per length", positive=True)
        capacity = sub.quantity("capacity", "force", None, positive=True)
    return GuySpec(
        attach_height=table.quantity("attach_height", "length", positive=True,
                                     maximum=limits.POST_HEIGHT[1]),
        ground_point=(gx, gy, gz),
        direction_deg=math.degrees(math.atan2(gy - y, gx - x)),
        rope=read_rope(table.raw("rope", expected='a rope name, e.g. "7x19-galv-1/4"'),
                       table.where("rope")),
        pretension=table.quantity("pretension", "force", minimum=0.0),
        anchor_fixed=fixed, anchor_stiffness=stiffness, anchor_capacity=capacity,
        termination_efficiency=table.number("termination_efficiency",
                                            DEFAULT_TERMINATION_EFFICIENCY,
                                            positive=True, maximum=1.0))


def _wood(table: Table, post: PostSpec, section: SectionSpec) -> tuple[str, str]:
    """Species and grade of a brace member (default: the post's), checked in the
    lumber catalog for that section."""
    species = table.text("species", post.species)
    grade = table.text("grade", post.grade or "No. 2")
    key = next((k for k in ("species", "grade") if table.has(k)), None)
    where = table.where(key) if key else table.path
    size = (lumber.parse_size(section.nominal, where) if section.nominal
            else lumber.custom_size(section.width, section.depth))
    values = lumber.design_values(species, grade, size, where)
    return values.species, values.grade


def read_brace(table: Table, post: PostSpec) -> BraceSpec:
    """An ``anchor.brace`` table: a kicker or an H-brace on ``post``.

    The member (kicker) or rail (H-brace) takes ``species`` and ``grade``,
    by default those of the post.
    """
    kind = table.text("kind", choices=BRACE_KINDS)
    table.forbid(_H_ONLY if kind == "kicker" else _KICKER_ONLY, f"to a {kind} brace")
    direction = _direction(table, "direction")
    if kind == "kicker":
        if table.has("block_width") != table.has("block_length"):
            missing = "block_length" if table.has("block_width") else "block_width"
            raise InputError(f'give "{missing}" too (the bearing block needs both sizes)',
                             table.where(missing))
        member = read_section(table.raw("member", expected='a nominal size like "4x4"'),
                              table.where("member"))
        species, grade = _wood(table, post, member)
        return BraceSpec(
            kind=kind, direction_deg=direction,
            attach_height=table.quantity("attach_height", "length", positive=True,
                                         maximum=limits.POST_HEIGHT[1]),
            foot_distance=table.quantity("foot_distance", "length", positive=True,
                                         maximum=limits.POST_HEIGHT[1]),
            member=member, species=species, grade=grade,
            block_width=table.quantity("block_width", "length", None, positive=True,
                                       maximum=limits.POST_SIZE_MAX),
            block_length=table.quantity("block_length", "length", None, positive=True,
                                        maximum=limits.POST_SIZE_MAX),
            block_depth=table.quantity("block_depth", "length", 0.0, minimum=0.0,
                                       maximum=limits.POST_SIZE_MAX),
            block_friction=table.number("block_friction", None, positive=True, maximum=1.0))
    second = read_post(table.table("second_post", POST_KEYS, required=True))
    footing_table = table.table("second_footing", FOOTING_KEYS)
    rail = read_section(table.raw("rail", expected='a nominal size like "4x4"'),
                        table.where("rail"))
    species, grade = _wood(table, post, rail)
    return BraceSpec(
        kind=kind, direction_deg=direction, second_post=second,
        second_footing=read_footing(footing_table) if footing_table else None,
        distance=table.quantity("distance", "length", positive=True,
                                maximum=limits.GUY_DISTANCE_MAX),
        rail_height=table.quantity("rail_height", "length", positive=True,
                                   maximum=limits.POST_HEIGHT[1]),
        rail=rail, species=species, grade=grade,
        diagonal_rope=read_rope(table.raw("diagonal_rope", expected="a rope name"),
                                table.where("diagonal_rope")),
        diagonal_pretension=table.quantity("diagonal_pretension", "force", minimum=0.0))


def read_tree(table: Table) -> TreeSpec:
    """An ``anchor.tree`` table. ``E_green`` defaults to the green modulus of
    ``species`` in the lumber catalog's tree list."""
    species = table.text("species", None)
    if species is not None:
        green = lumber.green_wood(species, table.where("species"))
        species, modulus = green.species, green.E
    else:
        modulus = REQUIRED
    return TreeSpec(
        diameter_at_grade=table.quantity("diameter_at_grade", "length", positive=True,
                                         maximum=limits.TREE_SIZE_MAX),
        diameter_at_attachment=table.quantity("diameter_at_attachment", "length",
                                              positive=True, maximum=limits.TREE_SIZE_MAX),
        attachment_height=table.quantity("attachment_height", "length", positive=True,
                                         maximum=limits.ATTACH_HEIGHT_MAX),
        E_green=table.quantity("E_green", "pressure", modulus, positive=True),
        root_plate_stiffness=table.quantity("root_plate_stiffness", "rotational stiffness",
                                            positive=True),
        root_plate_capacity=table.quantity("root_plate_capacity", "moment", None,
                                           positive=True),
        species=species)


def read_anchor(index: int, data: Any) -> AnchorSpec:
    """The ``index``-th (from 0) ``[[anchor]]`` table."""
    table = Table(data, anchor_path(index, data), ANCHOR_KEYS)
    name = table.text("name")
    if not name.strip():
        raise InputError("an anchor name cannot be empty", table.where("name"))
    kind = table.text("kind", "post", ANCHOR_KINDS)
    x, y = table.quantities("position", "length", 2)
    _check_plan(table, "position", x, y)
    grade = table.quantity("grade", "length", 0.0)
    if kind == "tree":
        table.forbid(("post", "footing", "brace", "guy"), "to a tree anchor")
        tree = read_tree(table.table("tree", TREE_KEYS, required=True))
        return AnchorSpec(name=name, kind=kind, x=x, y=y, grade=grade, post=None,
                          footing=None, guys=(), brace=None, tree=tree)
    table.forbid(("tree",), "to a post anchor (set kind = \"tree\")")
    post = read_post(table.table("post", POST_KEYS, required=True))
    footing = read_footing(table.table("footing", FOOTING_KEYS, required=True))
    guys = tuple(read_guy(Table(g, f"{table.where('guy')}[{i + 1}]", GUY_KEYS), x, y, grade)
                 for i, g in enumerate(table.array("guy")))
    brace_table = table.table("brace", BRACE_KEYS)
    brace = read_brace(brace_table, post) if brace_table else None
    return AnchorSpec(name=name, kind=kind, x=x, y=y, grade=grade, post=post,
                      footing=footing, guys=guys, brace=brace, tree=None)
