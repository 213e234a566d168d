"""A living tree as an anchor: a tapered, round, green-wood member on a root plate.

The stem is a beam line from grade up to the highest attachment, its diameter
tapering linearly from ``diameter_at_grade`` to ``diameter_at_attachment``
(measured at ``attachment_height``), with the green modulus ``E_green`` (from
the lumber catalog's tree list or the user) and G = E/16. At grade the stem
stands on the root plate: held in translation and twist, with the
rotational stiffness the user gives about both horizontal axes. A tree
without a root-plate stiffness is an input error: there is no defensible
default.

Trees need an arborist's assessment, and hardware must not girdle the tree:
see :data:`spanstay.models.common.cautions.TREE_CAUTIONS`.
"""
from __future__ import annotations

import numpy as np

from spanstay.fem import BeamSection, LinearLaw, Model
from spanstay.models.common.errors import InputError
from spanstay.models.scenario.spec import AnchorSpec

#: smallest stem diameter used where the taper runs out above the attachment, m
MIN_DIAMETER = 0.05


def stem_diameter(spec: AnchorSpec, height) -> np.ndarray:
    """Stem diameter (m) at ``height`` above grade, by the linear taper."""
    tree = spec.tree
    slope = (tree.diameter_at_attachment - tree.diameter_at_grade) / tree.attachment_height
    return np.maximum(tree.diameter_at_grade + slope * np.asarray(height, float), MIN_DIAMETER)


def add_tree(model: Model, spec: AnchorSpec, base: np.ndarray, heights: list[float],
             pull: np.ndarray, rigid: frozenset[str]):
    """Add the tree of ``spec`` standing at ``base``; returns a BuiltAnchor.

    ``heights`` are the attachment heights that need a node; ``rigid`` may
    hold "post" (stem E x RIGID) and "soil" (root plate clamped).
    """
    from spanstay.models.parts.post import E_OVER_G, RIGID, BuiltAnchor, _across, _heights

    tree = spec.tree
    where = f"anchor '{spec.name}'.tree"
    if tree is None:
        raise InputError(f"anchor '{spec.name}' is a tree but has no [anchor.tree] table", where)
    k_root = tree.root_plate_stiffness
    if k_root is None or not np.isfinite(k_root) or k_root <= 0:
        raise InputError("a tree needs a root-plate rotational stiffness "
                         '(root_plate_stiffness, e.g. "2e7 lbf*ft/rad") from an assessment of '
                         "the tree", f"{where}.root_plate_stiffness")
    top = max(list(heights) + [tree.attachment_height])
    hs = _heights(spec, heights, top)
    xyz = np.repeat(base[None, :], hs.size, axis=0)
    xyz[:, 2] += hs
    nodes = model.add_nodes(xyz)
    d = stem_diameter(spec, 0.5 * (hs[:-1] + hs[1:]))
    E = tree.E_green * (RIGID if "post" in rigid else 1.0)
    r = 0.5 * d
    area, inertia = np.pi * r**2, np.pi * r**4 / 4.0
    section = BeamSection(E, E / E_OVER_G, area, inertia, inertia, 2 * inertia, 0.9 * area,
                          0.9 * area)
    model.add_beams(nodes[:-1], nodes[1:], section, orientation=_across(pull),
                    name=f"{spec.name}.post")
    base_node = int(nodes[0])
    model.fix(base_node, "xyz")
    model.fix(base_node, "rz")
    groups = {"post": [f"{spec.name}.post"]}
    if "soil" in rigid:
        model.fix(base_node, "rxyz")
    else:
        for dname in ("rx", "ry"):
            model.add_springs(base_node, dname, LinearLaw(k_root), name=f"{spec.name}.root_{dname}")
        groups["soil"] = [f"{spec.name}.root_rx", f"{spec.name}.root_ry"]
    attach = {h: int(nodes[np.argmin(np.abs(hs - h))]) for h in heights}
    return BuiltAnchor(spec, base_node, int(nodes[-1]), attach, groups,
                       post_section={"shape": "round", "diameter": d, "E": tree.E_green,
                                     "ref": None})
