"""Reading posts, lumber sections, ply fasteners and footings of an anchor."""
from __future__ import annotations

import math
import re
from dataclasses import replace
from typing import Any

from spanstay.models.catalogs import fasteners
from spanstay.models.catalogs import lumber
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.ground import read_layers
from spanstay.models.scenario.reader import Table
from spanstay.models.scenario.spec import FastenerSpec, FootingSpec, MaterialOverrides, PostSpec, SectionSpec
from spanstay.models.common.units import parse_quantity
from spanstay.models.scenario import limits

POST_KINDS = ("sawn", "round", "laminated")
STACKS = ("across", "side-by-side")
FASTENER_KINDS = ("nail", "screw", "bolt")
FOOTING_KINDS = ("fixed", "embedded", "pier")
BACKFILLS = ("native", "gravel")
#: User overrides of design values: key -> dimension.
OVERRIDE_KEYS = {"E": "pressure", "G": "pressure", "Emin": "pressure", "Fb": "pressure",
                 "Ft": "pressure", "Fv": "pressure", "Fc": "pressure", "Fc_perp": "pressure",
                 "density": "density"}
POST_KEYS = ("kind", "height", "species", "grade", "nominal", "width", "depth", "diameter",
             "top_diameter", "base_diameter", "plies", "ply", "stack", "fastener",
             "incised", "conditioning",
             *OVERRIDE_KEYS)
FASTENER_KEYS = ("kind", "size", "diameter", "length", "spacing", "rows", "staggered",
                 "predrilled", "slip_modulus")
FOOTING_KEYS = ("kind", "depth", "pier_diameter", "backfill", "base_spring", "soil",
                "slab_at_grade", "double_lateral_bearing", "concrete_strength", "reinforcement")


def read_nominal(value: Any, where: str) -> tuple[float, float]:
    """Dressed size in metres of a nominal ``"AxB"`` (PS 20, via the lumber
    catalog), in the order written."""
    if not isinstance(value, str):
        raise InputError(f'expected a nominal lumber size like "2x6", got {value!r}', where)
    size = lumber.parse_size(value, where)
    first, second = (int(n) for n in re.split(r"\s*[xX×]\s*", value.strip()))
    small, large = size.thickness, size.width
    return (small, large) if first <= second else (large, small)


def read_section(value: Any, where: str) -> SectionSpec:
    """A member section: nominal ``"4x4"`` (width x depth) or ``{width, depth}``."""
    if isinstance(value, str):
        width, depth = read_nominal(value, where)
        return SectionSpec(value.strip(), width, depth)
    table = Table(value, where, ("width", "depth"))
    return SectionSpec(None, _size(table, "width"), _size(table, "depth"))


def _size(table: Table, key: str, maximum: float = limits.POST_SIZE_MAX) -> float:
    """A member or post size (width, depth, diameter), m."""
    return table.quantity(key, "length", positive=True, maximum=maximum)


def read_fastener(table: Table) -> FastenerSpec:
    """The fasteners joining laminated plies.

    A nail may be named by ``size`` ("16d", "10d box") for its diameter and
    length; a screw by gauge (``size = "#10"``) with a ``length``; otherwise
    give ``diameter`` and ``length``.
    """
    kind = table.text("kind", choices=FASTENER_KINDS)
    predrilled = table.flag("predrilled", False)
    size = table.text("size", None)
    if size is not None:
        if kind == "bolt":
            raise InputError('a bolt has no "size"; give diameter and length',
                             table.where("size"))
        length = table.quantity("length", "length", None, positive=True,
                                maximum=limits.FASTENER_LENGTH_MAX)
        if kind == "nail":
            table.forbid(("diameter", "length"), 'with a nail "size" (the size sets them)')
        else:
            table.forbid(("diameter",), 'with a screw "size" (the gauge sets it)')
            if length is None:
                table.quantity("length", "length")  # raises the missing-key error
        made = fasteners.fastener(kind, size, length, predrilled, table.where("size"))
        diameter, length, name = made.diameter, made.length, made.name
    else:
        diameter = table.quantity("diameter", "length", positive=True,
                                  maximum=limits.FASTENER_DIAMETER_MAX)
        length = table.quantity("length", "length", positive=True,
                                maximum=limits.FASTENER_LENGTH_MAX)
        name = None
    return FastenerSpec(
        kind=kind, size=name, diameter=diameter, length=length,
        spacing=table.quantity("spacing", "length", minimum=limits.FASTENER_SPACING_MIN),
        rows=table.integer("rows", 1, minimum=1, maximum=20),
        staggered=table.flag("staggered", False), predrilled=predrilled or kind != "nail",
        slip_modulus=table.quantity("slip_modulus", "force per length", None, positive=True))


def _read_ply(value: Any, where: str) -> SectionSpec:
    """A ply: nominal ``"2x6"`` or ``{thickness, width}``; depth is the thickness."""
    if isinstance(value, str):
        a, b = read_nominal(value, where)
        return SectionSpec(value.strip(), max(a, b), min(a, b))
    table = Table(value, where, ("thickness", "width"))
    return SectionSpec(None, _size(table, "width"), _size(table, "thickness"))


def _read_stack(table: Table) -> tuple[str, float]:
    value = table.raw("stack", "across")
    if value in STACKS:
        return value, 0.0 if value == "across" else 90.0
    if isinstance(value, str) and not any(ch.isdigit() for ch in value):
        table.text("stack", choices=STACKS)  # raises with a suggestion
    angle = parse_quantity(value, "angle", table.where("stack"))
    if not 0.0 <= angle <= math.pi / 2 + 1e-12:
        raise InputError(f'must be "across", "side-by-side" or an angle from 0 to 90 deg, '
                         f"got {value!r}", table.where("stack"))
    return "angle", math.degrees(angle)


def _check_fastener_levels(table: Table, fastener: FastenerSpec, height: float) -> None:
    """Refuse a spacing that would put more than FASTENER_LEVELS_MAX levels on the post
    (staggered rows put a level every half spacing)."""
    step = fastener.spacing / 2 if fastener.staggered and fastener.rows > 1 else fastener.spacing
    levels = height / step
    if levels > limits.FASTENER_LEVELS_MAX:
        fewest = height / limits.FASTENER_LEVELS_MAX * (2 if step < fastener.spacing else 1)
        raise InputError(f"a spacing of {table.data['fastener']['spacing']!r} puts about "
                         f"{levels:.0f} fastener levels on a post {height:.3g} m tall; spanstay "
                         f"models at most {limits.FASTENER_LEVELS_MAX} (a spacing of at least "
                         f"{fewest * 1000:.3g} mm on this post)", table.where("fastener.spacing"))


def _check_wood(table: Table, post: PostSpec) -> PostSpec:
    """Look up species and grade in the lumber catalog (names normalised there)."""
    species = table.text("species")
    where = table.where("species")
    if post.kind == "round":
        table.forbid(("grade",), "to a round post (pole values depend on species only)")
        values = lumber.pole_values(species, where)
        return replace(post, species=values.species)
    grade = table.text("grade")
    section = post.section if post.kind == "sawn" else post.ply
    assert section is not None
    size = (lumber.parse_size(section.nominal, where) if section.nominal
            else lumber.custom_size(section.width, section.depth))
    values = lumber.design_values(species, grade, size, where)
    if post.fastener is not None:
        assert post.ply is not None
        f = post.fastener
        probe = fasteners.Fastener(f.kind, f.size or f"{f.kind}", f.diameter, f.length,
                                   f.predrilled, Fyb=0.0, source="")
        density = post.overrides.density or values.rho_mean
        fasteners.check_fits(probe, post.ply.depth, density, table.where("fastener"))
    return replace(post, species=values.species, grade=values.grade)


def read_post(table: Table) -> PostSpec:
    """A post table (``anchor.post`` or ``anchor.brace.second_post``).

    Species and grade are checked against the lumber catalog and stored under
    their catalog names.
    """
    kind = table.text("kind", "sawn", POST_KINDS)
    shape_keys = {"sawn": ("nominal", "width", "depth"),
                  "round": ("diameter", "top_diameter", "base_diameter"),
                  "laminated": ("plies", "ply", "stack", "fastener")}
    for other, keys in shape_keys.items():
        if other != kind:
            table.forbid(keys, f"to a {kind} post")
    overrides = MaterialOverrides(**{
        "shear_modulus" if key == "G" else key: table.quantity(key, dim, None, positive=True)
        for key, dim in OVERRIDE_KEYS.items()})
    height = table.quantity("height", "length", positive=True, minimum=limits.POST_HEIGHT[0],
                            maximum=limits.POST_HEIGHT[1])
    from spanstay.models.catalogs.nds import CONDITION_TREATMENT
    if kind != "round":
        table.forbid(("conditioning",), "to a sawn or laminated post (it is the NDS Cct of "
                     "round poles)")
    else:
        table.forbid(("incised",), "to a round pole (its treatment factor is conditioning)")
    common = dict(kind=kind, height=height,
                  species=None, grade=None, overrides=overrides,
                  incised=table.flag("incised", False),
                  conditioning=table.text("conditioning", None, tuple(CONDITION_TREATMENT)))
    if kind == "sawn":
        if table.one_of(("nominal", "width"), required=True) == "nominal":
            table.forbid(("depth",), 'with "nominal" (give width and depth instead)')
            section = read_section(table.raw("nominal"), table.where("nominal"))
        else:
            section = SectionSpec(None, _size(table, "width"), _size(table, "depth"))
        post = PostSpec(section=section, **common)
    elif kind == "round":
        if table.one_of(("diameter", "top_diameter")) == "diameter":
            table.forbid(("base_diameter",), 'with "diameter" (give top_diameter and '
                         "base_diameter for a tapered post)")
            top = base = _size(table, "diameter")
        else:
            top = _size(table, "top_diameter")
            base = _size(table, "base_diameter")
            if base < top:
                raise InputError("a tapered post is thicker at the base: base_diameter "
                                 f"{table.raw('base_diameter')!r} is less than top_diameter "
                                 f"{table.raw('top_diameter')!r}", table.where("base_diameter"))
        post = PostSpec(top_diameter=top, base_diameter=base, **common)
    else:
        plies = table.integer("plies", minimum=2, maximum=12)
        ply = _read_ply(table.raw("ply", expected='a nominal size like "2x6"'),
                        table.where("ply"))
        stack, angle = _read_stack(table)
        fastener = read_fastener(table.table("fastener", FASTENER_KEYS, required=True))
        _check_fastener_levels(table, fastener, height)
        post = PostSpec(plies=plies, ply=ply, stack=stack, stack_angle_deg=angle,
                        fastener=fastener, **common)
    return _check_wood(table, post)


def read_footing(table: Table) -> FootingSpec:
    """A footing table (``anchor.footing`` or ``anchor.brace.second_footing``)."""
    kind = table.text("kind", choices=FOOTING_KINDS)
    if kind == "fixed":
        table.forbid(("depth", "pier_diameter", "backfill", "soil", "slab_at_grade",
                      "double_lateral_bearing", "concrete_strength", "reinforcement"),
                     "to a fixed footing")
        return FootingSpec(kind=kind, depth=0.0, pier_diameter=None, backfill=None,
                           base_spring=table.quantity("base_spring", "rotational stiffness",
                                                      None, positive=True),
                           soil=None, slab_at_grade=False, double_lateral_bearing=False)
    table.forbid(("base_spring",), f"to an {kind} footing (the soil is modelled)"
                 if kind == "embedded" else "to a pier footing (the soil is modelled)")
    if kind == "embedded":
        table.forbid(("pier_diameter", "concrete_strength", "reinforcement"),
                     "to an embedded footing (use kind = \"pier\")")
        pier, backfill = None, table.text("backfill", "native", BACKFILLS)
    else:
        table.forbid(("backfill",), "to a pier footing (the pier is concrete)")
        pier = table.quantity("pier_diameter", "length", positive=True,
                              maximum=limits.PIER_DIAMETER_MAX)
        backfill = "concrete"
    soil = read_layers(table, "soil") if table.has("soil") else None
    concrete = {}
    if kind == "pier":
        from spanstay.models.scenario.pier_entry import (REINFORCEMENT_KEYS,
                                                         read_concrete_strength,
                                                         read_reinforcement)
        concrete = dict(concrete_strength=read_concrete_strength(table),
                        reinforcement=read_reinforcement(
                            table.table("reinforcement", REINFORCEMENT_KEYS), pier))
    return FootingSpec(**concrete,
                       kind=kind, depth=table.quantity("depth", "length", positive=True,
                                                       maximum=limits.FOOTING_DEPTH_MAX),
                       pier_diameter=pier, backfill=backfill, base_spring=None, soil=soil,
                       slab_at_grade=table.flag("slab_at_grade", False),
                       double_lateral_bearing=table.flag("double_lateral_bearing", False))
