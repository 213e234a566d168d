"""Reading posts, lumber sections, ply fasteners and footings of an anchor."""
from __future__ import annotations

import math
import re
from typing import Any

from models.errors import InputError
from models.scenario_ground import read_layers
from models.scenario_reader import Table
from models.spec import FastenerSpec, FootingSpec, MaterialOverrides, PostSpec, SectionSpec
from models.units import parse_quantity

INCH = 0.0254
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
             *OVERRIDE_KEYS)
FASTENER_KEYS = ("kind", "diameter", "length", "spacing", "rows", "staggered",
                 "slip_modulus")
FOOTING_KEYS = ("kind", "depth", "pier_diameter", "backfill", "base_spring", "soil",
                "slab_at_grade", "double_lateral_bearing")
_NOMINAL_RE = re.compile(r"^\s*(\d+)\s*[xX×]\s*(\d+)\s*$")
_NOMINALS = (1, 2, 3, 4, 5, 6, 8, 10, 12, 14, 16)


def dressed_size(thickness: int, width: int) -> tuple[float, float]:
    """Dry dressed size in inches of nominal lumber (thickness <= width).

    American Softwood Lumber Standard PS 20: boards (1 in) dress to 3/4 in;
    dimension lumber (2-4 in thick) loses 1/2 in up to 6 in and 3/4 in from
    8 in; timbers (5 in and thicker) lose 1/2 in each way.
    """
    if thickness >= 5:
        return thickness - 0.5, width - 0.5
    t = 0.75 if thickness == 1 else thickness - 0.5
    w = (0.75 if width == 1 else width - 0.5) if width <= 6 else width - 0.75
    return t, w


def read_nominal(value: Any, where: str) -> tuple[float, float]:
    """Dressed size in metres of a nominal ``"AxB"``, in the order written."""
    m = _NOMINAL_RE.match(value) if isinstance(value, str) else None
    if not m or int(m.group(1)) not in _NOMINALS or int(m.group(2)) not in _NOMINALS:
        raise InputError(f'expected a nominal lumber size like "2x6" or "6x6" (inches, '
                         f"from {', '.join(map(str, _NOMINALS))}), got {value!r}", where)
    a, b = int(m.group(1)), int(m.group(2))
    small, large = dressed_size(min(a, b), max(a, b))
    return (small, large) if a <= b else (large, small)


def read_section(value: Any, where: str) -> SectionSpec:
    """A member section: nominal ``"4x4"`` (width x depth) or ``{width, depth}``."""
    if isinstance(value, str):
        width, depth = read_nominal(value, where)
        return SectionSpec(value.strip(), width * INCH, depth * INCH)
    table = Table(value, where, ("width", "depth"))
    return SectionSpec(None, table.quantity("width", "length", positive=True),
                       table.quantity("depth", "length", positive=True))


def read_fastener(table: Table) -> FastenerSpec:
    """The fasteners joining laminated plies."""
    return FastenerSpec(
        kind=table.text("kind", choices=FASTENER_KINDS),
        diameter=table.quantity("diameter", "length", positive=True),
        length=table.quantity("length", "length", positive=True),
        spacing=table.quantity("spacing", "length", positive=True),
        rows=table.integer("rows", 1, minimum=1, maximum=20),
        staggered=table.flag("staggered", False),
        slip_modulus=table.quantity("slip_modulus", "force per length", None, positive=True))


def _read_ply(value: Any, where: str) -> SectionSpec:
    """A ply: nominal ``"2x6"`` or ``{thickness, width}``; depth is the thickness."""
    if isinstance(value, str):
        a, b = read_nominal(value, where)
        return SectionSpec(value.strip(), max(a, b) * INCH, min(a, b) * INCH)
    table = Table(value, where, ("thickness", "width"))
    return SectionSpec(None, table.quantity("width", "length", positive=True),
                       table.quantity("thickness", "length", positive=True))


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


def read_post(table: Table) -> PostSpec:
    """A post table (``anchor.post`` or ``anchor.brace.second_post``)."""
    kind = table.text("kind", "sawn", POST_KINDS)
    shape_keys = {"sawn": ("nominal", "width", "depth"),
                  "round": ("diameter", "top_diameter", "base_diameter"),
                  "laminated": ("plies", "ply", "stack", "fastener")}
    for other, keys in shape_keys.items():
        if other != kind:
            table.forbid(keys, f"to a {kind} post")
    overrides = MaterialOverrides(**{
        key: table.quantity(key, dim, None, positive=True)
        for key, dim in OVERRIDE_KEYS.items()})
    common = dict(kind=kind, height=table.quantity("height", "length", positive=True),
                  species=table.text("species", None), grade=table.text("grade", None),
                  overrides=overrides)
    if kind == "sawn":
        if table.one_of(("nominal", "width"), required=True) == "nominal":
            table.forbid(("depth",), 'with "nominal" (give width and depth instead)')
            section = read_section(table.raw("nominal"), table.where("nominal"))
        else:
            section = SectionSpec(None, table.quantity("width", "length", positive=True),
                                  table.quantity("depth", "length", positive=True))
        return PostSpec(section=section, **common)
    if kind == "round":
        if table.one_of(("diameter", "top_diameter")) == "diameter":
            table.forbid(("base_diameter",), 'with "diameter" (give top_diameter and '
                         "base_diameter for a tapered post)")
            top = base = table.quantity("diameter", "length", positive=True)
        else:
            top = table.quantity("top_diameter", "length", positive=True)
            base = table.quantity("base_diameter", "length", positive=True)
            if base < top:
                raise InputError("a tapered post is thicker at the base: base_diameter "
                                 f"{table.raw('base_diameter')!r} is less than top_diameter "
                                 f"{table.raw('top_diameter')!r}", table.where("base_diameter"))
        return PostSpec(top_diameter=top, base_diameter=base, **common)
    plies = table.integer("plies", minimum=2, maximum=12)
    ply = _read_ply(table.raw("ply", expected='a nominal size like "2x6"'), table.where("ply"))
    stack, angle = _read_stack(table)
    fastener = read_fastener(table.table("fastener", FASTENER_KEYS, required=True))
    return PostSpec(plies=plies, ply=ply, stack=stack, stack_angle_deg=angle,
                    fastener=fastener, **common)


def read_footing(table: Table) -> FootingSpec:
    """A footing table (``anchor.footing`` or ``anchor.brace.second_footing``)."""
    kind = table.text("kind", choices=FOOTING_KINDS)
    if kind == "fixed":
        table.forbid(("depth", "pier_diameter", "backfill", "soil", "slab_at_grade",
                      "double_lateral_bearing"), "to a fixed footing")
        return FootingSpec(kind=kind, depth=0.0, pier_diameter=None, backfill=None,
                           base_spring=table.quantity("base_spring", "rotational stiffness",
                                                      None, positive=True),
                           soil=None, slab_at_grade=False, double_lateral_bearing=False)
    table.forbid(("base_spring",), f"to an {kind} footing (the soil is modelled)"
                 if kind == "embedded" else "to a pier footing (the soil is modelled)")
    if kind == "embedded":
        table.forbid(("pier_diameter",), "to an embedded footing (use kind = \"pier\")")
        pier, backfill = None, table.text("backfill", "native", BACKFILLS)
    else:
        table.forbid(("backfill",), "to a pier footing (the pier is concrete)")
        pier, backfill = table.quantity("pier_diameter", "length", positive=True), "concrete"
    soil = read_layers(table, "soil") if table.has("soil") else None
    return FootingSpec(kind=kind, depth=table.quantity("depth", "length", positive=True),
                       pier_diameter=pier, backfill=backfill, base_spring=None, soil=soil,
                       slab_at_grade=table.flag("slab_at_grade", False),
                       double_lateral_bearing=table.flag("double_lateral_bearing", False))
